/**
 * The per-timepoint context derived-value definitions compute in: the usable values in force,
 * other derived values (computed once, on demand), the settings, and the rules for inputs that
 * several formulas share (FiO2, barometric pressure, respiratory rate).
 */
import type { InputValue, Timepoint } from '../analysis/model';
import { fieldById } from '../fields/registry';
import { displayUnit } from '../analysis/read-value';
import type { Settings } from '../settings';
import { formatNumber } from '../util/format';
import { describeOrigin } from '../present';
import type { DerivedCategory, DerivedValue, InputOrigin, MissingValue, NotApplicable, Term } from './model';

export type { Term } from './model';

export interface ValueExtras {
  readonly range?: { low: number; high: number } | undefined;
  readonly notes?: readonly string[] | undefined;
  readonly estimate?: boolean | undefined;
  readonly formula?: string | undefined;
}

const NO_EXTRAS: ValueExtras = {};

export type Outcome =
  | ({ readonly kind: 'value'; readonly value: number; readonly terms: readonly Term[] } & ValueExtras)
  | { readonly kind: 'missing'; readonly needs: readonly string[] }
  | { readonly kind: 'na'; readonly reason: string };

export interface DerivedDef {
  readonly id: string;
  readonly label: string;
  readonly short: string;
  readonly unit: string;
  readonly decimals: number;
  readonly category: DerivedCategory;
  /** Formula template: input names in braces, e.g. `{PaO2} ÷ {FiO2}`. */
  readonly formula: string;
  readonly source: string;
  /**
   * Field ids whose presence at this timepoint makes the value expected: when none is stated
   * here, a missing input is not worth mentioning. The first one stated gives the hint's line.
   */
  readonly anchors: readonly string[];
  readonly compute: (c: DeriveContext) => Outcome;
}

/** A definition with its formula already shown without braces (computed once, not per value). */
export interface DerivedDefinition extends DerivedDef {
  readonly shownFormula: string;
}

export function defineDerived(def: DerivedDef): DerivedDefinition {
  return { ...def, shownFormula: shownFormula(def.formula) };
}

/** A formula template without its braces: `{PaO2} ÷ {FiO2}` → `PaO2 ÷ FiO2`. */
function shownFormula(template: string): string {
  return template.indexOf('{') < 0 ? template : template.split('{').join('').split('}').join('');
}

export class DeriveContext {
  private readonly cache = new Map<string, DerivedValue | MissingValue | NotApplicable | null>();
  private readonly memos = new Map<string, unknown>();

  constructor(
    readonly timepoint: Timepoint,
    readonly settings: Settings,
    private readonly defs: ReadonlyMap<string, DerivedDefinition>,
  ) {}

  /** A value computed once per timepoint and shared by several definitions (e.g. the acid–base classification). */
  memo<T>(key: string, compute: () => T): T {
    if (this.memos.has(key)) return this.memos.get(key) as T;
    const value = compute();
    this.memos.set(key, value);
    return value;
  }

  /** A usable stated value in force, as a formula input. */
  field(id: string, name?: string): Term | null {
    const input = this.timepoint.values.get(id);
    if (!input || !input.stated.usable || input.stated.value === null) return null;
    return termOf(input, name);
  }

  /** A word value in force (device, mode, sex). */
  word(id: string): { word: string; input: InputValue } | null {
    const input = this.timepoint.values.get(id);
    if (!input || !input.stated.usable || input.stated.word === null) return null;
    return { word: input.stated.word, input };
  }

  /** Whether a field is stated at this timepoint (not carried). */
  statedHere(id: string): boolean {
    const v = this.timepoint.values.get(id);
    return v !== undefined && v.origin.kind === 'here';
  }

  /** Another derived value, computed once; null when it cannot be computed here. */
  derived(id: string, name?: string): Term | null {
    const d = this.derivedValue(id);
    if (!d) return null;
    return { name: name ?? d.short, value: d.value, unit: d.unit, decimals: d.decimals, origin: { kind: 'derived', id } };
  }

  derivedValue(id: string): DerivedValue | null {
    const r = this.evaluate(id);
    return r && 'value' in r ? r : null;
  }

  evaluate(id: string): DerivedValue | MissingValue | NotApplicable | null {
    if (this.cache.has(id)) return this.cache.get(id) ?? null;
    const def = this.defs.get(id);
    if (!def) return null;
    this.cache.set(id, null); // guards against a cycle
    const result = evaluateDef(def, this);
    this.cache.set(id, result);
    return result;
  }

  /**
   * FiO2 in force: a sampling FiO2 on the gas line, else the ventilator's or the oxygen line's,
   * else 0.21 when the device is room air. Estimates from low-flow devices are never used.
   */
  fio2(): Term | null {
    const stated = this.field('fio2', 'FiO2');
    if (stated) return stated;
    const device = this.word('device');
    if (device?.word === 'room air') {
      return { name: 'FiO2', value: 0.21, unit: '', decimals: 2, origin: device.input.origin, note: 'room air' };
    }
    return null;
  }

  /** What to add to get FiO2 (a low-flow device needs a stated FiO2). */
  fio2Need(): string {
    const device = this.word('device');
    if (device && (device.word === 'cannula' || device.word === 'mask')) return `fio2 (a ${device.word}'s FiO2 is only an estimate)`;
    return 'fio2 (or an oxygen line)';
  }

  /** Total respiratory rate: measured (vitals) at this timepoint, else the set ventilator rate. */
  respiratoryRate(): Term | null {
    return this.field('rr', 'RR') ?? this.field('vent_rate', 'RR (set)');
  }

  /** PEEP in force: the ventilator's, else EPAP (NIV), else the CPAP level. */
  peepLike(): Term | null {
    return this.field('peep', 'PEEP') ?? this.field('epap', 'EPAP') ?? this.field('cpap_level', 'CPAP');
  }

  value(value: number | null, terms: readonly (Term | null)[], extra: ValueExtras = NO_EXTRAS): Outcome {
    if (value === null || !Number.isFinite(value)) return NOT_IN_DOMAIN;
    const kept: Term[] = [];
    for (const t of terms) if (t !== null) kept.push(t);
    return { kind: 'value', value, terms: kept, range: extra.range, notes: extra.notes, estimate: extra.estimate, formula: extra.formula };
  }

  /** What to add to get another derived value (its own missing inputs), for messages. */
  lacking(id: string): string {
    const r = this.evaluate(id);
    if (r && 'needs' in r) return r.needs.join(' and ');
    return this.defs.get(id)?.short ?? id;
  }

  /** Names what is missing: pairs of [term, key to add]. */
  missing(...pairs: readonly (readonly [unknown, string])[]): Outcome {
    return { kind: 'missing', needs: pairs.filter(([t]) => t === null || t === undefined).map(([, key]) => key) };
  }
}

function termOf(input: InputValue, name?: string): Term {
  const field = fieldById(input.stated.fieldId);
  const unit = input.stated.unit === null || input.stated.unit === 'fraction' || input.stated.unit === 'ph' ? '' : displayUnit(input.stated.unit);
  return {
    name: name ?? field?.short ?? field?.aliases[0] ?? input.stated.fieldId,
    value: input.stated.value ?? NaN,
    unit,
    decimals: field?.decimals ?? 1,
    origin: input.origin,
    fieldId: input.stated.fieldId,
  };
}

function anchorLine(def: DerivedDef, c: DeriveContext): number | null {
  for (const id of def.anchors) {
    const v = c.timepoint.values.get(id);
    if (v && v.origin.kind === 'here') return v.origin.line;
  }
  return null;
}

function usesCarried(terms: readonly Term[], c: DeriveContext): boolean {
  return terms.some((t) => {
    if (t.origin.kind === 'carried') return true;
    if (t.origin.kind === 'derived') return c.derivedValue(t.origin.id)?.usesCarried ?? false;
    return false;
  });
}

const NOT_IN_DOMAIN: Outcome = { kind: 'na', reason: 'the inputs are outside the range where the formula holds' };



function evaluateDef(def: DerivedDefinition, c: DeriveContext): DerivedValue | MissingValue | NotApplicable | null {
  const line = anchorLine(def, c);
  let outcome: Outcome;
  try {
    outcome = def.compute(c);
  } catch {
    outcome = { kind: 'na', reason: 'could not be computed' };
  }
  if (outcome.kind === 'missing') {
    if (outcome.needs.length === 0) return null;
    return { id: def.id, label: def.label, needs: outcome.needs, message: `add ${outcome.needs.join(' and ')} to get ${def.short}`, line };
  }
  if (outcome.kind === 'na') return { id: def.id, label: def.label, reason: outcome.reason, line };
  const formula = outcome.formula ?? def.formula;
  const shown = formatNumber(outcome.value, def.decimals);
  const range = outcome.range ?? null;
  const result = range ? `${formatNumber(range.low, def.decimals)}–${formatNumber(range.high, def.decimals)}` : shown;
  return {
    id: def.id,
    label: def.label,
    short: def.short,
    category: def.category,
    value: outcome.value,
    unit: def.unit,
    decimals: def.decimals,
    range,
    formula: outcome.formula ? shownFormula(outcome.formula) : def.shownFormula,
    substituted: `${substitute(formula, outcome.terms)} = ${result}${def.unit ? ` ${def.unit}` : ''}`,
    inputs: outcome.terms,
    source: def.source,
    estimate: outcome.estimate ?? false,
    notes: outcome.notes ?? [],
    usesCarried: usesCarried(outcome.terms, c),
    line,
  };
}

/** Puts each term's value in place of `{name}` in a formula template. */
export function substitute(template: string, terms: readonly Term[]): string {
  let out = '';
  let i = 0;
  while (i < template.length) {
    const open = template.indexOf('{', i);
    if (open < 0) { out += template.slice(i); break; }
    const close = template.indexOf('}', open);
    if (close < 0) { out += template.slice(i); break; }
    out += template.slice(i, open);
    const name = template.slice(open + 1, close);
    const term = terms.find((t) => t.name === name);
    out += term ? formatNumber(term.value, term.decimals) : name;
    i = close + 1;
  }
  return out;
}

export function describeInputOrigin(origin: InputOrigin): string {
  return origin.kind === 'derived' ? `computed (${origin.id})` : describeOrigin(origin);
}
