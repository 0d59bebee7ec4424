/**
 * A gas or a reading read on a setting carried from long before (PN326). A setting carries forward until the
 * note states it again (format rule): right for a note written in one sitting, but a P/F worked out
 * on an FiO2 written a day and a half earlier, or a compliance on a tidal volume set two days
 * before, is only as current as that line. One finding per timepoint, on the line that asks for
 * them (`askingLine`), naming the settings older than `carriedSettingHours`, their values,
 * when and where they were written, and how long before; the values themselves are left as the
 * format reads them. No fix: only the writer knows the settings the gas was drawn on.
 */
import type { InputValue, Timepoint } from '../analysis/model';
import type { DerivedValue, TimepointDerivation } from '../derive/model';
import { DEVICE_SETTING_FIELDS } from '../analysis/noninvasive-support';
import { computedValueOf } from '../derive/registry';
import { fieldById } from '../fields/registry';
import { carriedFromText, carriedMinutes, formatStated, timeText, type CarriedOrigin } from '../present';
import { toRange, type LineNode } from '../syntax/tree';
import { wordList } from '../util/format';
import { defineCheck } from './check';

/**
 * The settings a gas's oxygenation values rest on: the FiO2 (or the oxygen device and flow it is
 * read from), the end-expiratory pressure (PEEP, or EPAP or CPAP on an oxygen line) and the mean
 * airway pressure an oscillator sets; and those the mechanics and ventilation values rest on: the
 * set tidal volume and rate (VE, the ventilatory ratio, the compliances, mechanical power). A value
 * carried is a setting under the mode in force: what the mode measures (a tidal volume under PS,
 * fields/modes.ts) is of its timepoint only and never carried, so it is never named here.
 */
const WATCHED: readonly string[] = ['fio2', 'device', 'o2_flow', 'peep', 'epap', 'cpap_level', 'mean_airway_pressure', 'vt', 'vent_rate'];

/** A setting in force here, carried from more than the limit before. */
interface OldSetting {
  readonly id: string;
  readonly input: InputValue;
  readonly origin: CarriedOrigin;
  readonly minutes: number;
}

/** The watched settings carried here from more than `limitMinutes` before; none where a time is unknown. */
function oldSettings(tp: Timepoint, limitMinutes: number): OldSetting[] {
  const out: OldSetting[] = [];
  for (const id of WATCHED) {
    // Asked without building the value: most settings are stated where they are used, or nowhere.
    if (tp.values.originOf(id) !== 'carried') continue;
    const input = tp.values.get(id);
    if (!input || input.origin.kind !== 'carried') continue;
    const minutes = carriedMinutes(input.origin);
    if (minutes !== null && minutes > limitMinutes && !(id === 'device' && deviceRestated(tp, limitMinutes))) out.push({ id, input, origin: input.origin, minutes });
  }
  return out;
}

/**
 * Whether the oxygen device carried here was written about within the limit: an oxygen line that
 * names no device restated a setting of it here, or at a timepoint carried from within the limit
 * (the timeline's update of the therapy in force). Such a line is read as that device's settings,
 * so it says the device was still in use when it was written: the device is then no older than
 * the line, and only the settings it did not restate are as old as their own lines.
 */
function deviceRestated(tp: Timepoint, limitMinutes: number): boolean {
  for (const id of DEVICE_SETTING_FIELDS) {
    const input = tp.values.heldSetting(id);
    if (!input || input.stated.section !== 'oxygen') continue;
    if (input.origin.kind === 'here') return true;
    const minutes = input.origin.kind === 'carried' ? carriedMinutes(input.origin) : null;
    if (minutes !== null && minutes <= limitMinutes) return true;
  }
  return false;
}

/**
 * Whether a derived value rests on one of `old`, directly or through other derived values. An input
 * is matched by where it was written, not by its field: the FiO2 of a room-air device is the
 * device's value.
 */
function restsOn(d: DerivedValue, derivation: TimepointDerivation, old: readonly OldSetting[], depth = 0): boolean {
  if (depth > 8) return false;
  for (const t of d.inputs) {
    const o = t.origin;
    if (o.kind === 'carried' && old.some((x) => x.origin.line === o.line && x.origin.span.start === o.span.start)) return true;
    if (o.kind === 'derived') {
      const id = o.id;
      // Reported here or only inside this one (the VE of a ventilatory ratio at a gas with no VE input stated).
      const inner = computedValueOf(derivation, id);
      if (inner?.usesCarried && restsOn(inner, derivation, old, depth + 1)) return true;
    }
  }
  return false;
}

/** `46 h`, `12 h 1 min`, `50 min`. */
function durationText(minutes: number): string {
  const whole = Math.round(minutes);
  const h = Math.floor(whole / 60);
  const m = whole % 60;
  if (h === 0) return `${m} min`;
  return m === 0 ? `${h} h` : `${h} h ${m} min`;
}

function sectionSpan(node: LineNode | undefined): { start: number; end: number } {
  return node?.kind === 'section' ? node.sectionToken.span : { start: 0, end: node?.text.length ?? 0 };
}

/**
 * The line that asks for the old settings: of the lines here whose stated values the derived values
 * and readings combine with them (`lines`, each value's anchor), the gas's (its PaO2 or SpO2) where
 * it is one of them, else the first in the note (a plateau's, where compliance rests on an old
 * tidal volume and the gas's P/F on an FiO2 written here).
 */
function askingLine(tp: Timepoint, lines: readonly (number | null)[]): number | null {
  let first: number | null = null;
  for (const line of lines) if (line !== null && line >= tp.startLine && line <= tp.endLine && (first === null || line < first)) first = line;
  if (first === null) return null;
  for (const id of ['pao2', 'spo2']) {
    if (tp.values.originOf(id) !== 'here') continue;
    const v = tp.values.get(id);
    if (v && lines.includes(v.stated.line)) return v.stated.line;
  }
  return first;
}

/** `FiO2`, `PEEP`, and for a field without a short name its label in lower case (`mean airway pressure`, `oxygen device`). */
function settingName(id: string): string {
  const f = fieldById(id);
  return f?.short ?? f?.label.toLowerCase() ?? id;
}

export const oldSettingCarried = defineCheck({
  code: 'PN326',
  alias: 'old-setting-carried',
  title: 'Values resting on a setting carried from long before',
  severity: 'warning',
  tags: ['timeline'],
  doc: {
    fires: 'The derived values or readings of a timepoint rest on a setting written at a timepoint more than `carriedSettingHours` hours earlier (12 h by default) and carried forward since: those of a gas (P/F, A–a gradient, a/A, oxygenation index, S/F, the Berlin oxygenation band, …) on an FiO2, PEEP, EPAP, CPAP level, oxygen device or flow, or mean airway pressure; and the mechanics and ventilation values (minute ventilation, the ventilatory ratio, the compliances, mechanical power) on a set tidal volume or set rate, or a PEEP. A tidal volume the mode in force measures (under PS, PC, NIV) is never carried, so it is never named. One finding per timepoint, naming each such setting, its value, the day, time and line it was written on, and how long before, on the line whose values they are combined with: the gas line where the gas rests on them, else the first such line (the plateau of a compliance). Not reported where a time is unknown (a note without times, a day without a time of day), for a value of the header, or where the setting was written again (also with the same value) within the limit. A warning, like PN324: the numbers may rest on a setting the gas or the reading was not taken on.',
    example: '@ day 1 08:00\nvent mode VC, vt 450, rate 14, peep 5, fio2 0.4\n@ day 3 10:00\nvent peep 5, fio2 0.4\nvent plateau 18\nvitals rr 16',
    fix: 'If the settings still held when the gas was drawn or the reading taken, write them again at its timepoint (`vent peep 8, fio2 0.5`, `vent vt 450, rate 14`); if they had changed, write the ones in force then. Where a note is meant to carry settings for longer, raise `carriedSettingHours`, or switch the check off.',
  },
  source: 'format rule (grammar/README.md: carry-forward); the 12 h limit, about a shift, is common practice, no source',
  runTimepoint(ctx) {
    const tp = ctx.timepoint;
    if (tp.time.minutes === null) return;
    const old = oldSettings(tp, ctx.settings.carriedSettingHours * 60);
    if (old.length === 0) return;
    const ids = new Set(old.map((o) => o.id));
    const derivation = ctx.derivation;
    const resting = derivation.derived.filter((d) => d.usesCarried && restsOn(d, derivation, old));
    const restingIds = new Set(resting.map((d) => d.id));
    const readings = derivation.interpretations.filter((r) => r.basis.some((b) => ids.has(b) || restingIds.has(b)));
    if (resting.length === 0 && readings.length === 0) return;
    // Only the settings something here rests on are named.
    const used = old.filter((o) => readings.some((r) => r.basis.includes(o.id)) || resting.some((d) => restsOn(d, derivation, [o])));
    if (used.length === 0) return;
    const line = askingLine(tp, [...readings.map((r) => r.line), ...resting.map((d) => d.line)]);
    if (line === null) return;
    // Grouped by the line they were written on, in the order of the lines.
    const groups = new Map<number, OldSetting[]>();
    for (const o of [...used].sort((a, b) => a.origin.line - b.origin.line)) {
      const group = groups.get(o.origin.line);
      if (group) group.push(o);
      else groups.set(o.origin.line, [o]);
    }
    const stated = [...groups.values()].map((g) => {
      const first = g[0]!;
      const when = timeText(first.origin.fromTime) ?? first.origin.timepointLabel;
      return `${wordList(g.map((o) => `${settingName(o.id)} ${formatStated(o.input.stated)}`))}, stated at ${when} (line ${first.origin.line + 1}), ${durationText(first.minutes)} before this timepoint`;
    });
    const what = resting.length > 0
      ? wordList([...resting.map((d) => d.short), ...(readings.length > 0 ? ['the readings'] : [])])
      : 'The readings';
    const one = used.length === 1;
    const verb = resting.length + (readings.length > 0 ? 1 : 0) > 1 || (resting.length === 0 && readings.length > 0) ? 'rest' : 'rests';
    ctx.report({
      range: toRange(line, sectionSpan(ctx.analysis.tree.lines[line])),
      message: `${what} here ${verb} on ${stated.join('; ')}: check that ${one ? 'it' : 'they'} still held at this timepoint, and write ${one ? 'it' : 'them'} here if so, or the ${one ? 'one' : 'ones'} that did.`,
      related: [...groups.values()].map((g) => {
        const start = Math.min(...g.map((o) => o.origin.span.start));
        const end = Math.max(...g.map((o) => o.origin.span.end));
        return { range: toRange(g[0]!.origin.line, { start, end }), message: `${wordList(g.map((o) => settingName(o.id)))} ${carriedFromText(g[0]!.origin, 'here')}` };
      }),
    });
  },
});
