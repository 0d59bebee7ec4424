/**
 * Builds the timeline: groups lines into timepoints, reads every stated value, and works out
 * which values are in force at each timepoint — stated there, carried forward from an
 * earlier timepoint (settings), or from the note's header (patient, place, units).
 *
 * Carry rules: patient and place values carry until restated (a `place` line replaces the
 * whole place); an `oxygen` line replaces the previous oxygen line and ends ventilation;
 * a `vent` line ends oxygen-line therapy and updates the ventilator settings it restates,
 * keeping the rest; measurements (vitals, gases, labs) never carry.
 */
import { fieldById } from '../fields/registry';
import { sectionById, type SectionId } from '../fields/sections';
import type { Settings } from '../settings';
import type { LineNode, NoteTree, SectionLine, TimepointLine } from '../syntax/tree';
import { barometricFromAltitude } from './ambient';
import type { InputValue, Origin, StatedValue, Timepoint, TimepointTime } from './model';
import type { ReadIssue } from './read-issues';
import { readItem } from './read-value';

interface Held {
  readonly stated: StatedValue;
  /** Timepoint index where it was stated; -1 for the header. */
  readonly timepoint: number;
}

interface CarryState {
  patient: Map<string, Held>;
  place: Map<string, Held>;
  oxygen: Map<string, Held>;
  vent: Map<string, Held>;
  gasUnit: Held | null;
}

export interface Timeline {
  readonly timepoints: readonly Timepoint[];
  readonly readIssues: readonly ReadIssue[];
  /** Values stated in the header (before the first timepoint). */
  readonly header: readonly StatedValue[];
}

interface Builder {
  index: number;
  line: number | null;
  label: string;
  startLine: number;
  endLine: number;
  time: TimepointTime;
  stated: StatedValue[];
}

export function buildTimeline(tree: NoteTree, settings: Settings): Timeline {
  const readIssues: ReadIssue[] = [];
  const header: StatedValue[] = [];
  const timepoints: Timepoint[] = [];
  const state: CarryState = { patient: new Map(), place: new Map(), oxygen: new Map(), vent: new Map(), gasUnit: null };
  let current: Builder | null = null;
  let lastTime: TimepointTime = { day: null, minutes: null };
  const labels: string[] = [];

  const finish = (endLine: number): void => {
    if (!current) return;
    current.endLine = endLine;
    timepoints.push(freeze(current, state, labels, settings));
    current = null;
  };

  for (const node of tree.lines) {
    if (node.kind === 'timepoint') {
      finish(node.line - 1);
      const index: number = timepoints.length;
      const time = timeOf(node, lastTime, index === 0);
      if (time.minutes !== null || time.day !== null) lastTime = time;
      current = { index, line: node.line, label: labelOf(node), startLine: node.line, endLine: node.line, time, stated: [] };
      labels[index] = current.label;
      continue;
    }
    if (node.kind !== 'section') continue;
    const kind = sectionById(node.section).kind;
    if (kind === 'prose') continue;
    const inHeader = current === null && kind === 'header';
    if (!inHeader && current === null) {
      current = { index: 0, line: null, label: 'start', startLine: firstContentLine(tree), endLine: node.line, time: { day: null, minutes: null }, stated: [] };
      labels[0] = 'start';
    }
    const tpIndex = current ? current.index : -1;
    const stated = readLine(node, state, settings, readIssues);
    if (inHeader) header.push(...stated);
    else current!.stated.push(...stated);
    apply(node.section, stated, tpIndex, state, current?.stated ?? header, readIssues);
  }
  finish(tree.lines.length - 1);
  return { timepoints, readIssues, header };
}

function firstContentLine(tree: NoteTree): number {
  const first = tree.lines.find((l) => l.kind === 'section' || l.kind === 'unknown');
  return first?.line ?? 0;
}

function labelOf(node: TimepointLine): string {
  if (node.label) return node.label.text;
  if (node.time) return node.time.text;
  return `line ${node.line + 1}`;
}

function timeOf(node: TimepointLine, last: TimepointTime, isFirst: boolean): TimepointTime {
  const t = node.time;
  if (!t) return { day: null, minutes: null };
  if (t.kind === 'offset') {
    const base = last.minutes ?? (isFirst ? 0 : null);
    if (base === null || t.minutes === null) return { day: null, minutes: null };
    const minutes = base + t.minutes;
    return { day: Math.floor(minutes / 1440) + 1, minutes };
  }
  if (t.kind === 'day') return { day: t.day, minutes: t.day === null ? null : (t.day - 1) * 1440 };
  // clock
  if (t.minutes === null) return { day: null, minutes: null };
  let day = t.day ?? last.day ?? 1;
  if (t.day === null && last.minutes !== null && (day - 1) * 1440 + t.minutes < last.minutes) day += 1; // past midnight
  return { day, minutes: (day - 1) * 1440 + t.minutes };
}

function readLine(node: SectionLine, state: CarryState, settings: Settings, issues: ReadIssue[]): StatedValue[] {
  const gasUnit = (state.gasUnit?.stated.word as 'mmHg' | 'kPa' | undefined) ?? settings.gasUnit;
  const barometricMmhg = barometricInForce(state.place, settings);
  const out: StatedValue[] = [];
  for (const item of node.items) {
    const { stated, issues: found } = readItem(item, node.section, node.line, { gasUnit, barometricMmhg });
    issues.push(...found);
    if (stated) out.push(stated);
  }
  return out;
}

export function barometricInForce(place: ReadonlyMap<string, { stated: StatedValue }>, settings: Settings): number | null {
  const pb = place.get('barometric')?.stated;
  if (pb?.usable && pb.value !== null) return pb.value;
  const alt = place.get('altitude')?.stated;
  if (alt?.usable && alt.value !== null) return barometricFromAltitude(alt.value, settings.barometricModel);
  return null;
}

function apply(section: SectionId, stated: readonly StatedValue[], tp: number, state: CarryState, sameTimepoint: readonly StatedValue[], issues: ReadIssue[]): void {
  // Duplicates within one timepoint and section: the later value wins, the earlier is named.
  for (const s of stated) {
    const earlier = sameTimepoint.find((o) => o !== s && o.fieldId === s.fieldId && o.line <= s.line && o.section === section && (o.line < s.line || o.item.span.start < s.item.span.start));
    if (earlier) {
      issues.push({
        check: 'duplicate-key',
        line: s.line,
        span: s.item.key?.span ?? s.item.span,
        message: `${s.item.keyName} is stated twice at this timepoint; the later value is used.`,
        fixes: [],
        related: [{ line: earlier.line, span: earlier.item.span, message: 'first stated here' }],
      });
    }
  }
  const hold = (map: Map<string, Held>) => {
    for (const s of stated) if (!fieldById(s.fieldId)?.reading) map.set(s.fieldId, { stated: s, timepoint: tp });
  };
  switch (section) {
    case 'patient': hold(state.patient); break;
    case 'place': if (stated.length > 0) { state.place = new Map(); hold(state.place); } break;
    case 'units': { const g = stated.find((s) => s.fieldId === 'gas_unit'); if (g?.word) state.gasUnit = { stated: g, timepoint: tp }; break; }
    case 'oxygen': state.oxygen = new Map(); state.vent = new Map(); hold(state.oxygen); break;
    case 'vent': {
      state.oxygen = new Map();
      // A new mode starts a new set of settings; PEEP and FiO2 carry across it.
      const mode = stated.find((s) => s.fieldId === 'mode');
      const before = state.vent.get('mode')?.stated.word;
      if (mode?.word && before && mode.word !== before) {
        for (const id of [...state.vent.keys()]) if (id !== 'peep' && id !== 'fio2') state.vent.delete(id);
      }
      hold(state.vent);
      break;
    }
    default: break;
  }
}

function freeze(b: Builder, state: CarryState, labels: readonly string[], settings: Settings): Timepoint {
  const values = new Map<string, InputValue>();
  const put = (held: Held) => values.set(held.stated.fieldId, { stated: held.stated, origin: originOf(held, b.index, labels) });
  for (const map of [state.patient, state.place, state.oxygen, state.vent]) for (const held of map.values()) put(held);
  // Measurements and device readings stated here (the last of a field wins).
  for (const s of b.stated) {
    if (sectionById(s.section).kind === 'measure' || fieldById(s.fieldId)?.reading) values.set(s.fieldId, { stated: s, origin: { kind: 'here', line: s.line, span: s.item.span } });
  }
  return { index: b.index, line: b.line, label: b.label, startLine: b.startLine, endLine: b.endLine, time: b.time, stated: b.stated, values, barometricMmhg: barometricInForce(state.place, settings) };
}

function originOf(held: Held, tp: number, labels: readonly string[]): Origin {
  const { line } = held.stated;
  const span = held.stated.item.span;
  if (held.timepoint === tp) return { kind: 'here', line, span };
  if (held.timepoint < 0) return { kind: 'header', line, span };
  return { kind: 'carried', line, span, timepoint: held.timepoint, timepointLabel: labels[held.timepoint] ?? '' };
}
