/**
 * Inlay hints: at the end of a line's content (before a trailing comment), the few derived
 * values that matter for that line, compact: `P/F 178 · A–a 24 (≤ 20)` after a gas (in a note
 * whose gas unit is kPa, gas pressures in kPa first: `P/F 23.7 kPa (178) · A–a 3.2 kPa (24), ≤ 2.7`),
 * `ΔP 17 · VT 6.7 mL/kg · Cstat 25` after a vent line with a plateau, `PB 628 mmHg` after a
 * place line with an altitude, `FiO2 ≈ 0.33 (est.)` after a low-flow oxygen line, and a short
 * acid–base reading (`consistent with resp. acidosis, acute`, made from the reading's typed finding). A value that uses an input carried forward from
 * an earlier timepoint ends with `*`; its tooltip names the carried inputs. A value a finding
 * withholds (P/F where PN401 says the PaO2 cannot be) is named where it would have been:
 * `P/F, A–a withheld (PN401)`, with the reason in the tooltip.
 *
 * One hint per line and category, in the order of HINT_CATEGORIES; a later hint at the same
 * position starts with `· ` so that the hints read as one list. To show one more value, add a
 * row to HINT_PICKS.
 */
import type { Timepoint } from '../analysis/model';
import type { NoteResult } from '../check-note';
import { besideCaveat, isGasPressureValue, withheldText, type AcidBaseFinding, type DerivedValue, type Interpretation, type NotApplicable, type Term, type TimepointDerivation } from '../derive/model';
import type { AcidBaseDisorder, MetabolicAcidosisKind, RespiratoryChronicity } from '../physiology';
import { kpaFirstCompact, kpaNumber } from '../present';
import { formatNumber } from '../util/format';
import { pushAll } from '../util/lists';
import { type Steps } from '../util/steps';
import { derivedBody, derivedInKpa, termText } from './derived-hover';
import { gasChangeParagraph } from './gas-change-hover';
import { contentEnd, statesHeaderValues, lineAt } from './locate';
import { cautionLine, escapeMarkdown, paragraphs } from './markdown';
import { describeInputOrigin } from '../derive/context';
import { derivationOf, derivedAt, derivedDef, derivedValueOf } from '../derive/registry';
import { START_NOT_IN_NOTE } from '../derive/high-flow';
import { HINT_CATEGORIES, type HintCategory, type InlayHintInfo, type LineSpan } from './types';

export interface HintOptions {
  readonly categories: ReadonlySet<HintCategory>;
}

/** Marks a value that uses an input carried forward from an earlier timepoint. */
export const CARRIED_MARK = '*';

interface Pick {
  readonly id: string;
  /**
   * The compact text; `n` is the number (with the carried mark when it applies), for a gas
   * pressure where the gas unit is kPa `23.7 kPa (178)` (then `kpa` is true).
   */
  readonly text: (n: string, d: DerivedValue, all: readonly DerivedValue[], kpa: boolean) => string | null;
  /** The line the hint goes after, when not the derived value's own line. */
  readonly line?: (d: DerivedValue) => number | null;
  /** Whether `n` carries the unit in an mmHg note too (`PB 628 mmHg`; `P/F 178` has none). */
  readonly unit?: boolean;
}

/** The values shown, by category, in display order. */
export const HINT_PICKS: Readonly<Record<HintCategory, readonly Pick[]>> = {
  oxygenation: [
    { id: 'fio2_estimated', text: (n) => `FiO2 ≈ ${n} (est.)` },
    { id: 'pf_ratio', text: (n) => `P/F ${n}` },
    { id: 'pf_ratio_altitude_adjusted', text: (n) => `P/F adj. ${n}` },
    {
      id: 'aa_gradient',
      text: (n, _d, all, kpa) => {
        const upper = all.find((v) => v.id === 'aa_gradient_upper_normal');
        if (!upper) return `A–a ${n}`;
        // In kPa the parentheses hold the mmHg number, so the upper normal follows a comma.
        return kpa ? `A–a ${n}, ≤ ${kpaNumber(upper.value)}` : `A–a ${n} (≤ ${formatNumber(upper.value, upper.decimals)})`;
      },
    },
    { id: 'sf_ratio', text: (n) => `S/F ${n}` },
    { id: 'rox_index', text: (n) => `ROX ${n}` },
  ],
  'acid-base': [
    { id: 'anion_gap_albumin_corrected', text: (n) => `AG ${n} (corr.)` },
    { id: 'anion_gap', text: (n, _d, all) => (all.some((v) => v.id === 'anion_gap_albumin_corrected') ? null : `AG ${n}`) },
  ],
  mechanics: [
    { id: 'driving_pressure', text: (n) => `ΔP ${n}` },
    { id: 'vt_per_kg_pbw', text: (n) => `VT ${n} mL/kg` },
    { id: 'compliance_static', text: (n) => `Cstat ${n}` },
    { id: 'paco2_etco2_difference', text: (n) => `PaCO2–EtCO2 ${n}` },
  ],
  atmosphere: [
    // After the place line that gives the altitude, also in the header (a stated pressure needs no hint).
    { id: 'barometric', text: (n) => `PB ${n}`, line: altitudeLine, unit: true },
  ],
  transport: [
    { id: 'cao2', text: (n) => `CaO2 ${n}` },
    { id: 'do2', text: (n) => `DO2 ${n}` },
    // After the vitals line of the blood pressure; its own unit, as no gas pressure is in mmHg there.
    { id: 'mean_arterial_pressure', text: (n) => `MAP ≈ ${n}`, unit: true },
  ],
};

/** Whether the header's estimated pressure already has its hint. */
function shownOnHeader(shown: ReadonlySet<string>, result: NoteResult): boolean {
  return result.analysis.timeline.header.some((s) => s.fieldId === 'altitude' && shown.has(`${s.line}:barometric`));
}

/** The line of the altitude a barometric pressure was estimated from (stated here or in the header). */
function altitudeLine(d: DerivedValue): number | null {
  const input = d.inputs[0];
  if (input?.fieldId !== 'altitude') return null;
  return input.origin.kind === 'here' || input.origin.kind === 'header' ? input.origin.line : null;
}

/** Derived ids shown in the tooltip of the acid–base reading, when present on its line. */
const ACID_BASE_DETAIL = ['paco2_expected', 'hco3_expected_acute', 'hco3_expected_chronic'];

/** Id listed for the acid–base reading in `derivedIds`. */
export const ACID_BASE_READING_ID = 'interpretation:acid-base';

interface Entry {
  readonly label: string;
  readonly values: readonly DerivedValue[];
  /** Values a finding withholds, named where they would have been. */
  readonly withheld: readonly NotApplicable[];
  readonly reading: Interpretation | null;
  readonly derivation: TimepointDerivation;
  /** The timepoint whose gas unit the tooltip follows (on a header line, as the header shows it). */
  readonly timepoint: Timepoint;
}

/**
 * `inlayHints` in steps (see util/steps.ts): the lines asked for cut where a timepoint starts, a
 * step for every TIMEPOINTS_PER_HINT_STEP timepoints. Each timepoint's hints are on its own lines
 * (or the header's, in the first piece), so the pieces' hints, one after another, are those of
 * the whole range at once.
 */
export function* inlayHintSteps(result: NoteResult, lines: LineSpan, options: HintOptions): Steps<InlayHintInfo[]> {
  const timepoints = result.analysis.timeline.timepoints;
  let next = 0;
  while (next < timepoints.length && timepoints[next]!.startLine <= lines.start) next++;
  const hints: InlayHintInfo[] = [];
  for (let from = lines.start; from <= lines.end;) {
    next += TIMEPOINTS_PER_HINT_STEP;
    const to = Math.max(from, Math.min(lines.end, next < timepoints.length ? timepoints[next]!.startLine - 1 : lines.end));
    pushAll(hints, inlayHints(result, { start: from, end: to }, options));
    from = to + 1;
    if (from <= lines.end) yield;
  }
  return hints;
}

const TIMEPOINTS_PER_HINT_STEP = 8;

export function inlayHints(result: NoteResult, lines: LineSpan, options: HintOptions): InlayHintInfo[] {
  const byLine = new Map<number, Map<HintCategory, Entry[]>>();
  const add = (line: number, category: HintCategory, entry: Entry) => {
    const cats = byLine.get(line) ?? new Map<HintCategory, Entry[]>();
    byLine.set(line, cats);
    const list = cats.get(category) ?? [];
    cats.set(category, list);
    list.push(entry);
  };
  /** `line:id` of values already shown (a header altitude's pressure is derived at every timepoint). */
  const shown = new Set<string>();
  const inRange = (line: number | null): line is number => line !== null && line >= lines.start && line <= lines.end;

  const timepoints = result.analysis.timeline.timepoints;
  /** Per value id, the first timepoint whose value says a caveat said once a note (`SAID_ONCE`). */
  const firstSaid = new Map<string, number>();
  const headerInRange = lines.start < (timepoints[0]?.startLine ?? Number.POSITIVE_INFINITY);
  // Only timepoints whose lines meet the range are derived; the others can only give the header's
  // place hint (a pressure estimated from a header altitude, shown once on the header's line).
  const headerAltitude = headerInRange && result.analysis.timeline.header.some((s) => s.fieldId === 'altitude');
  for (const tp of timepoints) {
    const outside = tp.endLine < lines.start || tp.startLine > lines.end;
    if (outside && (!headerAltitude || shownOnHeader(shown, result))) continue;
    let derivation: TimepointDerivation;
    let all: readonly DerivedValue[];
    if (outside) {
      const barometric = derivedAt(tp, result.settings, 'barometric');
      if (!barometric) continue;
      all = [barometric];
      derivation = derivationOf(tp.index, all);
    } else {
      derivation = result.analysis.derivation(tp.index);
      all = derivation.derived;
    }
    for (const category of HINT_CATEGORIES) {
      if (!options.categories.has(category)) continue;
      if (category === 'acid-base' && !outside) {
        for (const reading of derivation.interpretations) {
          if (reading.acidBase === null || !reading.notable || !inRange(reading.line)) continue;
          const label = acidBaseLabel(reading.acidBase);
          if (!label) continue;
          const detail = all.filter((d) => ACID_BASE_DETAIL.includes(d.id) && d.line === reading.line);
          add(reading.line, category, { label, values: detail, withheld: NONE_WITHHELD, reading, derivation, timepoint: tp });
        }
      }
      for (const pick of HINT_PICKS[category]) {
        for (const d of all) {
          if (d.id !== pick.id) continue;
          const line = pick.line ? pick.line(d) : d.line;
          if (!inRange(line) || shown.has(`${line}:${d.id}`)) continue;
          const shownAt = statesHeaderValues(result, line) ? asOnHeader(tp, result.analysis.timeline.headerGasUnit) : tp;
          const kpa = derivedInKpa(d, shownAt);
          // In a note whose gas unit is kPa, a pressure shown in mmHg (its gas was written in mmHg) says so.
          const mmhgInKpaNote = !kpa && isGasPressureValue(d) && shownAt.gasUnit === 'kPa';
          const n = `${hintNumber(d, kpa, pick.unit === true || mmhgInKpaNote)}${d.usesCarried ? CARRIED_MARK : ''}`;
          const text = pick.text(n, d, all.filter((v) => v.line === d.line), kpa);
          if (!text) continue;
          const label = besideCaveat(text, saysCaveatHere(result, d, tp, firstSaid) ? d : NO_CAVEAT);
          shown.add(`${line}:${d.id}`);
          add(line, category, { label, values: [d], withheld: NONE_WITHHELD, reading: null, derivation, timepoint: shownAt });
        }
      }
      if (!outside) addWithheld(derivation, category, inRange, shown, (line, entry) => add(line, category, { ...entry, timepoint: tp }));
    }
  }

  const hints: InlayHintInfo[] = [];
  for (const line of [...byLine.keys()].sort((a, b) => a - b)) {
    const node = lineAt(result, line);
    if (!node) continue;
    const position = { line, character: contentEnd(node) };
    const cats = byLine.get(line)!;
    let first = true;
    for (const category of HINT_CATEGORIES) {
      const entries = cats.get(category);
      if (!entries || entries.length === 0) continue;
      const label = entries.map((e) => e.label).join(' · ');
      hints.push(new Hint(
        result,
        position,
        first ? label : `· ${label}`,
        entries,
        category,
        entries.flatMap((e) => (e.reading ? [ACID_BASE_READING_ID, ...e.values.map((v) => v.id)] : [...e.values.map((v) => v.id), ...e.withheld.map((n) => n.id)])),
      ));
      first = false;
    }
  }
  return hints;
}

const NONE_WITHHELD: readonly NotApplicable[] = [];

/**
 * Caveats said beside a value in the inlay hints once a note: on the first timepoint whose value
 * has it, not on every later one. The start of high flow not in the note (derive/high-flow.ts) is
 * of the whole run from the note's first timepoint, and the same at each of its ROX indexes:
 * repeated on every hint of a long note it is noise once read. Every hover (the hint's tooltip
 * too), `show` and the JSON still say it with each value, with why and how to write the start.
 */
const SAID_ONCE: ReadonlySet<string> = new Set([START_NOT_IN_NOTE]);

/** No caveat: the hint of a value whose caveat was said at an earlier timepoint. */
const NO_CAVEAT = { caveat: null } as const;

/**
 * Whether the inlay hint of `d` at timepoint `tp` says its caveat: always, but for a caveat said
 * once a note (`SAID_ONCE`), which only the first timepoint whose value has it says. Found by
 * deriving only that value at the timepoints before it (from the first, until one has it), once
 * per value id and request (`first`): no hint range skips it, so a hint says the same whether its
 * request covers the first one or not.
 */
function saysCaveatHere(result: NoteResult, d: DerivedValue, tp: Timepoint, first: Map<string, number>): boolean {
  if (d.caveat === null || !SAID_ONCE.has(d.caveat)) return true;
  let at = first.get(d.id);
  if (at === undefined) {
    at = tp.index;
    for (let i = 0; i < tp.index; i++) {
      if (derivedValueOf(result.analysis.derivation(i), d.id)?.caveat === d.caveat) {
        at = i;
        break;
      }
    }
    first.set(d.id, at);
  }
  return at >= tp.index;
}

/**
 * The values of a category's picks that a finding withholds at this timepoint, one entry per line
 * and finding: `P/F, A–a withheld (PN401)`, where the values would have been.
 */
function addWithheld(
  derivation: TimepointDerivation,
  category: HintCategory,
  inRange: (line: number | null) => line is number,
  shown: Set<string>,
  add: (line: number, entry: Omit<Entry, 'timepoint'>) => void,
): void {
  const groups = new Map<string, NotApplicable[]>();
  for (const pick of HINT_PICKS[category]) {
    for (const n of derivation.notApplicable) {
      if (n.id !== pick.id || n.withheldBy === null || !inRange(n.line) || shown.has(`${n.line}:${n.id}`)) continue;
      shown.add(`${n.line}:${n.id}`);
      const key = `${n.line}:${n.withheldBy}`;
      const list = groups.get(key);
      if (list) list.push(n);
      else groups.set(key, [n]);
    }
  }
  for (const list of groups.values()) {
    const first = list[0]!;
    const names = list.map((n) => derivedDef(n.id)?.short ?? n.label).join(', ');
    add(first.line!, { label: `${names} withheld (${first.withheldBy})`, values: [], withheld: list, reading: null, derivation });
  }
}

/**
 * The timepoint as a header line shows it: a value derived there but shown on a header line (a
 * pressure estimated from the header's altitude) follows the header's gas unit, as the header's
 * own values do (`headerShowsKpa`); it differs from the timepoint's only where the first
 * timepoint has a `units gas` line of its own.
 */
function asOnHeader(tp: Timepoint, headerGasUnit: Timepoint['gasUnit']): Timepoint {
  return tp.shownGasUnit === headerGasUnit ? tp : { ...tp, gasUnit: headerGasUnit, shownGasUnit: headerGasUnit };
}

/** `178`, `628 mmHg` (with `unit`), or for a gas pressure in kPa `23.7 kPa (178)`. */
function hintNumber(d: DerivedValue, kpa: boolean, unit: boolean): string {
  if (kpa) return kpaFirstCompact(d.value, d.decimals);
  const number = formatNumber(d.value, d.decimals);
  return unit && d.unit ? `${number} ${d.unit}` : number;
}

/** A hint whose tooltip is written when first read (clients that resolve tooltips read few). */
class Hint implements InlayHintInfo {
  readonly paddingLeft = true;
  readonly #entries: readonly Entry[];
  readonly #result: NoteResult;
  #tooltip: string | null = null;

  constructor(
    result: NoteResult,
    readonly position: InlayHintInfo['position'],
    readonly label: string,
    entries: readonly Entry[],
    readonly category: HintCategory,
    readonly derivedIds: string[],
  ) {
    this.#entries = entries;
    this.#result = result;
  }

  get tooltipMarkdown(): string {
    return (this.#tooltip ??= tooltip(this.#entries, this.#result));
  }
}

function tooltip(entries: readonly Entry[], result: NoteResult): string {
  const parts: string[] = [];
  for (const e of entries) {
    if (e.reading) parts.push(`**Acid–base reading**: ${escapeMarkdown(e.reading.text)}`);
    for (const n of e.withheld) parts.push(`**${escapeMarkdown(n.label)}**: withheld, as ${escapeMarkdown(withheldText(n))}.`);
    for (const d of e.values) {
      const carried = carriedInputs(d, e.derivation);
      const mark = carried.length > 0
        ? `${escapeMarkdown(CARRIED_MARK)} ${escapeMarkdown(d.short)} uses ${carried.length === 1 ? 'a value' : 'values'} carried forward from an earlier timepoint:\n${carried.map((t) => `- ${escapeMarkdown(termText(t, e.timepoint))} — ${escapeMarkdown(describeInputOrigin(t.origin))}`).join('\n')}`
        : null;
      // Under the P/F ratio, its change since the previous arterial gas (worked out when the tooltip is read).
      const change = d.id === 'pf_ratio' ? gasChangeParagraph(result, e.derivation.timepoint) : null;
      parts.push(paragraphs([derivedBody(d, { carriedSentence: mark === null, timepoint: e.timepoint }), mark, change]));
    }
  }
  return paragraphs([parts.join('\n\n---\n\n'), cautionLine()]);
}

/** The carried-forward inputs behind a derived value, also through other derived values. */
export function carriedInputs(d: DerivedValue, derivation: TimepointDerivation): Term[] {
  const out: Term[] = [];
  const seen = new Set<string>();
  const visit = (value: DerivedValue, depth: number) => {
    if (depth > 8) return;
    for (const t of value.inputs) {
      if (t.origin.kind === 'carried') {
        const key = `${t.fieldId ?? t.name}@${t.origin.line}`;
        if (!seen.has(key)) {
          seen.add(key);
          out.push(t);
        }
      } else if (t.origin.kind === 'derived') {
        const id = t.origin.id;
        const inner = derivation.derived.find((v) => v.id === id);
        if (inner?.usesCarried) visit(inner, depth + 1);
      }
    }
  };
  visit(d, 0);
  return out;
}

// ── compact acid–base reading ───────────────────────────────────────────

/** Each disorder as the label names it. */
const DISORDER_LABEL: Readonly<Record<AcidBaseDisorder, string>> = {
  'metabolic-acidosis': 'met. acidosis',
  'metabolic-alkalosis': 'met. alkalosis',
  'respiratory-acidosis': 'resp. acidosis',
  'respiratory-alkalosis': 'resp. alkalosis',
};

/** The anion gap of the metabolic acidosis the label names: `, high AG`. */
const ANION_GAP_LABEL: Readonly<Record<MetabolicAcidosisKind, string>> = {
  'high-anion-gap': ', high AG',
  'normal-anion-gap': ', normal AG',
  'mixed-anion-gap': ', mixed AG',
};

/** The timing of a respiratory disorder as the label names it; none where the reading cannot tell. */
const PHASE_LABEL: Readonly<Record<RespiratoryChronicity, string>> = {
  acute: ', acute',
  chronic: ', chronic',
  intermediate: '',
  'acute-or-chronic': '',
};

/**
 * A compact form of an acid–base reading, made from what the reading decided (its typed finding,
 * not its words), saying as the reading does that the gas is consistent with what it names:
 * `consistent with resp. acidosis, acute`, `consistent with met. acidosis, high AG + resp.
 * acidosis?` (a `?` for the disorder a response outside its expected range points to), `normal pH;
 * consistent with met. acidosis + met. alkalosis`, `acid–base unclear`.
 * Null for a gas not read (PN402).
 */
export function acidBaseLabel(finding: AcidBaseFinding): string | null {
  const primary = finding.primary;
  let label: string;
  switch (primary) {
    case 'not-read': return null;
    case 'normal': label = NORMAL_PH; break;
    case 'undetermined': label = UNCLEAR; break;
    case 'mixed-acidosis': label = `mixed acidosis${anionGapLabel(finding)}`; break;
    case 'mixed-alkalosis': label = `mixed alkalosis${anionGapLabel(finding)}`; break;
    default: {
      label = `${DISORDER_LABEL[primary]}${finding.phase === null ? '' : PHASE_LABEL[finding.phase]}${finding.fullyCompensated ? ', compensated' : ''}${anionGapLabel(finding)}`;
      // An HCO3 between the acute and the chronic range: evolving, or acute on chronic.
      if (finding.phase === 'intermediate') label += ', acute on chronic?';
    }
  }
  const extra: string[] = [];
  for (let i = 0; i < finding.added.length; i++) extra.push(DISORDER_LABEL[finding.added[i]!]);
  const suspected = finding.suspected;
  if (suspected !== null) extra.push(suspected === 'metabolic-disorder' ? 'met. disorder?' : `${DISORDER_LABEL[suspected]}?`);
  // An interpretation, never a diagnosis stated bare: what the label names is "consistent with"
  // it, as the tooltip says in full. A normal pH and an unreadable gas name no disorder.
  if (label === NORMAL_PH || label === UNCLEAR) return extra.length === 0 ? label : `${label}; consistent with ${extra.join(' + ')}`;
  return `consistent with ${[label, ...extra].join(' + ')}`;
}

function anionGapLabel(finding: AcidBaseFinding): string {
  return finding.anionGap === null ? '' : ANION_GAP_LABEL[finding.anionGap];
}

const NORMAL_PH = 'normal pH';
const UNCLEAR = 'acid–base unclear';
