/**
 * The legend `pneumark show` ends with: each short name of a derived value and each mark that
 * the output above it used, once, with what it means — what the editor's hovers tell, for a
 * reader at a terminal. Names, units and formulas come from the derived-value registry (never a
 * list kept here); entries follow the registry's order, then the marks in a fixed order, so the
 * legend of a note is always the same.
 */
import { shortAsName, type DerivedDefinition } from '../core/derive/context';
import { DERIVED } from '../core/derive/registry';
import { isGasPressureValue } from '../core/derive/model';
import type { Paint } from './colour';

/** The marks `show` writes beside values, lines and findings, in the order the legend lists them. */
export const MARKS = ['carried', 'estimate', 'not-used', 'measured', 'unit-doubt', 'unreadable-line', 'start', 'change', 'finding'] as const;
export type Mark = (typeof MARKS)[number];

/** Each mark as it looks in the output, and what it means. */
const MARK_TEXT: Readonly<Record<Mark, readonly [string, string]>> = {
  carried: ['*', 'a derived value computed with a value carried from an earlier timepoint; on a change line, a setting carried in or a ratio computed with one'],
  estimate: ['est.', 'a derived value that is an estimate by a rough rule'],
  'not-used': ['(not used)', 'left out of every calculation; the finding under the line it was written on says why'],
  measured: ['(measured)', 'a value that is a setting under other modes, measured here (a tidal volume under PS, PC or NIV): in force at its timepoint only, not carried'],
  'unit-doubt': ['… ?', 'a bare number whose unit is in doubt, as written; (if unit: …) is its value if meant in that unit'],
  'unreadable-line': ['? …', 'a line Pneumark could not read as a section line; the finding under it says why'],
  start: ['@ (start)', 'a timepoint without a time: what was measured before the note\'s first @ line'],
  change: ['change', 'at an arterial gas, each value against the previous arterial gas: its difference (of the numbers as shown) and what it was; PaO2, PaCO2 and pH only where stated at both gases\' own timepoints, never a carried one; P/F and the settings (FiO2, O2 flow, PEEP, IPAP, EPAP, CPAP) as in force at each gas, and the oxygen device where it changed (* where a setting was carried); FiO2 est, a cannula\'s or simple mask\'s FiO2 estimated from its flow where none is stated, room air 0.21'],
  finding: ['PNnnn (l:c)', 'a finding\'s check code and its line:column; `pneumark docs` explains every code'],
};

/**
 * Whether the registry's name says no more than the short one: it is the short name spelt out
 * (`Δ ratio`, `Delta ratio`) or only adds "ratio", "index" or "gradient" to it (`P/F ratio`).
 */
function namesOnlyTheShort(def: DerivedDefinition): boolean {
  const short = shortAsName(def.short).replace(/^Δ/, 'Delta');
  return def.label === short || /^(.+) (?:ratio|index|gradient)$/.exec(def.label)?.[1] === short;
}

export class Legend {
  /** The derived values named above (by id), and whether one was shown with kPa first. */
  private readonly derived = new Map<string, boolean>();
  private readonly marks = new Set<Mark>();

  /** A derived value shown (or named as missing); `kpa` when its gas pressure was shown in kPa first. */
  value(id: string, kpa: boolean): void {
    this.derived.set(id, (this.derived.get(id) ?? false) || kpa);
  }

  mark(mark: Mark): void {
    this.marks.add(mark);
  }

  /** The legend's lines: a heading, then one line per entry; none when nothing above needs one. */
  lines(p: Paint): string[] {
    const entries: [string, string][] = [];
    for (const def of DERIVED) {
      const kpa = this.derived.get(def.id);
      if (kpa === undefined) continue;
      entries.push([shortAsName(def.short), meaning(def, kpa)]);
    }
    for (const mark of MARKS) if (this.marks.has(mark)) entries.push([...MARK_TEXT[mark]]);
    if (entries.length === 0) return [];
    const width = Math.max(...entries.map(([name]) => name.length));
    return ['', p.bold('legend'), ...entries.map(([name, text]) => `  ${name.padEnd(width)}  ${p.dim(text)}`)];
  }
}

/** `P/F ratio (PaO2 ÷ FiO2), in mmHg`: the registry's name, its formula where the name only repeats the short one, and the unit as shown. */
function meaning(def: DerivedDefinition, kpa: boolean): string {
  const formula = namesOnlyTheShort(def) ? ` (${def.shownFormula})` : '';
  const unit = def.unit === '' ? '' : `, in ${isGasPressureValue(def) && kpa ? 'kPa (mmHg)' : def.unit}`;
  return `${def.label}${formula}${unit}`;
}
