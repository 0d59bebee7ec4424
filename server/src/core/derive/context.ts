/**
 * The per-timepoint context derived-value definitions compute in: the usable values in force,
 * other derived values (computed once, on demand), the settings, and the rules for inputs that
 * several formulas share (FiO2, barometric pressure, respiratory rate).
 */
import type { InputValue, Timepoint, ValuesInForce } from '../analysis/model';
import type { SectionId } from '../fields/sections';
import { fieldById } from '../fields/registry';
import { measuredByMode } from '../fields/modes';
import { displayUnit } from '../analysis/read-value';
import { endExpiratoryField, givesNoSetPressure, givesPressure, noninvasiveSupport, supportOfPressure, type NoninvasiveSupport } from '../analysis/noninvasive-support';
import type { Settings } from '../settings';
import { formatNumber, formatShort, wordList } from '../util/format';
import { PER_KG_PBW } from '../analysis/per-kg-volume';
import { describeOrigin, kpaResolutionMmhg } from '../present';
import type { DerivedCategory, DerivedValue, InputOrigin, MissingValue, NotApplicable, Term } from './model';
import { NONE } from '../util/lists';
import { reproducingSubstitution, termWithExtra } from './reproduce';
import { MODES_WITH_BACKUP_RATE, MODES_WITH_SET_BREATHS, OSCILLATION_MODE } from '../physiology/mechanics';
import { keptFor, SmallStore, type Kept } from '../util/small-store';
import type { HighFlowHours } from './high-flow';

export type { Term } from './model';

/** No timeline: the hours of high flow are unknown. */
const NO_HIGH_FLOW_HOURS = (): HighFlowHours | null => null;

export interface ValueExtras {
  readonly range?: { low: number; high: number } | undefined;
  readonly notes?: readonly string[] | undefined;
  /** See `DerivedValue.caveat`. */
  readonly caveat?: string | undefined;
  readonly estimate?: boolean | undefined;
  readonly formula?: string | undefined;
  /**
   * Decimals for this value instead of the definition's: more where the value (or a range's ends)
   * would otherwise round onto the other side of what it is shown beside (an expected PaCO2 of
   * 21.6–25.6 mmHg beside a PaCO2 of 26 shows so, not as 22–26).
   */
  readonly decimals?: number | undefined;
  /**
   * Decimals of a gas pressure's range in kPa, where shown in kPa first, instead of the unit's one
   * (`KPA_DECIMALS`): the ends of an expected PaCO2 keep a PaCO2 written in kPa on the side the
   * classification puts it (`GasWords.rangeDecimals`).
   */
  readonly kpaDecimals?: number | undefined;
  /**
   * The end of the range that the measured value it is read against is on at the resolution that
   * value was written with (`sideOf` gives 0): shown in mmHg rounded away from the range's middle
   * (`formatOutward`), as the value's own mmHg may be just beyond it (a PaCO2 written in kPa).
   */
  readonly outwardEnd?: 'low' | 'high' | undefined;
}

const NO_EXTRAS: ValueExtras = {};

/** Extras giving only the decimals: one shared object per number of decimals (values shown beside a limit). */
const WITH_DECIMALS: readonly ValueExtras[] = Array.from({ length: 9 }, (_, d) => Object.freeze({ decimals: d }));

/** The age from which rules made in adults are applied: see physiology/adults.ts. */
export { ADULT_FROM_YEARS } from '../physiology/adults';

export function withDecimals(decimals: number | undefined): ValueExtras {
  if (decimals === undefined) return NO_EXTRAS;
  return WITH_DECIMALS[decimals] ?? { decimals };
}

/**
 * The oxygen flow of a room-air line, when one above zero is written (`oxygen room air 2`); null
 * otherwise. Room air is no added oxygen, so such a line gives no FiO2 (and PN310 reports it).
 * Read without building the values.
 */
export function flowOnRoomAir(values: ValuesInForce): number | null {
  const flow = values.numberOf('o2_flow');
  if (flow === null || !(flow > 0)) return null;
  return values.wordOf('device') === 'room air' ? flow : null;
}

/** The FiO2 of air (common practice; 0.2093 in some texts). */
export const ROOM_AIR_FIO2 = 0.21;

/**
 * Whether an FiO2 is one of an oxygen line whose device is room air, and above 0.21 (beyond
 * rounding): `oxygen room air, fio2 0.4`. Room air is an FiO2 of 0.21, so the device or the FiO2 is
 * wrong (PN316), and neither is used: the FiO2 written would read a patient on air as on oxygen,
 * and 0.21 would pass over an FiO2 that may be the true one.
 */
export function isRoomAirContradiction(fio2: InputValue, values: ValuesInForce): boolean {
  const stated = fio2.stated;
  if (stated.section !== 'oxygen' || !stated.usable || stated.value === null || !(stated.value > ROOM_AIR_FIO2 + 1e-9)) return false;
  return values.wordOf('device') === 'room air';
}

/**
 * The FiO2 the calculations use, as a plain number (what `DerivationContext.fio2` gives as a term):
 * the FiO2 in force (a sampling FiO2 on the gas line, else the ventilator's, else the oxygen
 * line's), else 0.21 when the device is room air; null when none is, on a room-air line with an
 * oxygen flow (PN310) or with an FiO2 above 0.21 (PN316). Estimates are never used.
 */
export function fio2InForce(values: ValuesInForce): number | null {
  const fio2 = values.get('fio2');
  if (fio2 && fio2.stated.usable && fio2.stated.value !== null) return isRoomAirContradiction(fio2, values) ? null : fio2.stated.value;
  const device = values.get('device');
  return device && device.stated.usable && device.stated.word === 'room air' && flowOnRoomAir(values) === null ? ROOM_AIR_FIO2 : null;
}

export type Outcome =
  // The extras by reference: most values give none or one shared object (no copy per value).
  | { readonly kind: 'value'; readonly value: number; readonly terms: readonly Term[]; readonly extras: ValueExtras }
  | { readonly kind: 'missing'; readonly needs: readonly string[] }
  | { readonly kind: 'na'; readonly reason: string; readonly withheldBy?: string; readonly explained?: boolean };

export interface DerivedDef {
  readonly id: string;
  readonly label: string;
  readonly short: string;
  readonly unit: string;
  readonly decimals: number;
  readonly category: DerivedCategory;
  /** Formula template: input names in braces, e.g. `{PaO2} ÷ {FiO2}`. */
  readonly formula: string;
  /** Other forms of the formula a value may be worked out with, shown beside the default in the docs (plateau − total PEEP). */
  readonly otherFormulas?: readonly string[];
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

/** Formula templates shown without braces, by template (templates are few: one or two per definition). */
const shownFormulas = new Map<string, string>();

/** A formula template without its braces: `{PaO2} ÷ {FiO2}` → `PaO2 ÷ FiO2`. */
export function shownFormula(template: string): string {
  if (template.indexOf('{') < 0) return template;
  const known = shownFormulas.get(template);
  if (known !== undefined) return known;
  const shown = template.split('{').join('').split('}').join('');
  if (shownFormulas.size < 1000) shownFormulas.set(template, shown);
  return shown;
}

/** The registry as the context reads it: definitions in order, and each id's position. */
export interface DerivedTable {
  readonly list: readonly DerivedDefinition[];
  readonly slots: ReadonlyMap<string, number>;
}

/** A usable word value in force (`DeriveContext.word`), and the value it is the word of. */
export interface WordInForce {
  readonly word: string;
  readonly input: InputValue;
}

type Evaluated = DerivedValue | MissingValue | NotApplicable | null;

/** Marks a slot that is being computed (guards against a cycle). */
const IN_PROGRESS = 0;

/**
 * What a context has read of one field: its value in force and the term formulas read it as. The
 * records of a context form a list (newest first), searched as a `SmallStore` is: a gas reads
 * about a dozen fields, and one record each costs less than a store growing through its tables.
 */
class FieldRead {
  /** The term last read (several formulas read one input under one name). */
  term: Term | null = null;
  /** What `word` gives for this field, once asked (undefined until then): a gas asks for the mode and the device a dozen times. */
  word: WordInForce | null | undefined = undefined;

  constructor(
    readonly id: string,
    /** The value in force (null: none). */
    readonly input: InputValue | null,
    readonly next: FieldRead | null,
  ) {}
}

export class DeriveContext {
  /** Results by slot: undefined until computed. Arrays, not maps: a big note has tens of thousands of contexts. */
  private results: (Evaluated | typeof IN_PROGRESS | undefined)[] | null = null;
  /** The first value kept by `memo` (the acid–base classification, the only one today), then a store for more. */
  private firstKept: Kept<unknown, DeriveContext> | null = null;
  private firstValue: unknown = undefined;
  private memos: SmallStore<Kept<unknown, DeriveContext>, unknown> | null = null;
  /** The fields read so far, newest first. */
  private reads: FieldRead | null = null;
  /** The FiO2 room air gives when no FiO2 is stated (null: not room air); undefined until asked. */
  private airFio2: Term | null | undefined = undefined;

  constructor(
    readonly timepoint: Timepoint,
    readonly settings: Settings,
    private readonly table: DerivedTable,
    /** The hours of high flow at this timepoint, which only the timeline knows (`highFlowHoursAt`); null without one. */
    readonly highFlowHours: () => HighFlowHours | null = NO_HIGH_FLOW_HOURS,
  ) {}

  /** A value computed once per timepoint and shared by several definitions (e.g. the acid–base classification). */
  memo<T>(kept: Kept<T, DeriveContext>): T {
    if (this.firstKept === kept) return this.firstValue as T;
    if (this.firstKept !== null || this.memos !== null) return keptFor((this.memos ??= new SmallStore()), kept, this);
    const value = kept.compute(this);
    // Another value kept while this one was computed took the first place: this one goes to the store.
    if (this.firstKept === null) {
      this.firstKept = kept;
      this.firstValue = value;
    } else (this.memos ??= new SmallStore()).set(kept, value);
    return value;
  }

  /** The record of what was read of a field, made (and the value read) on first use. */
  private read(id: string): FieldRead {
    return this.readAlready(id) ?? (this.reads = new FieldRead(id, this.timepoint.values.get(id) ?? null, this.reads));
  }

  /** The record of a field already read, or null. */
  private readAlready(id: string): FieldRead | null {
    let r = this.reads;
    while (r !== null && r.id !== id) r = r.next;
    return r;
  }

  /** The value in force for a field, read once per context. */
  input(id: string): InputValue | null {
    return this.read(id).input;
  }

  /** A usable stated value in force, as a formula input. */
  field(id: string, name?: string): Term | null {
    const r = this.read(id);
    const input = r.input;
    if (!input || !input.stated.usable || input.stated.value === null) return null;
    // Several formulas read the same input under the same name: one term object serves them.
    const known = r.term;
    if (known && (name === undefined ? known.name === defaultTermName(id) : known.name === name)) return known;
    return (r.term = termOf(input, name));
  }

  /**
   * The last usable value of a field stated at this timepoint on a line of `section` (the Hb of
   * the arterial gas line where a labs line states one too), as a formula input; null when none.
   * A new term each time: for the few formulas that choose among the lines of a timepoint.
   */
  fieldOn(id: string, section: SectionId, name?: string): Term | null {
    const stated = this.timepoint.stated;
    for (let i = stated.length - 1; i >= 0; i--) {
      const s = stated[i]!;
      if (s.fieldId !== id || s.section !== section || !s.hereOnly) continue;
      if (!s.usable || s.value === null) return null;
      return termOf({ stated: s, origin: { kind: 'here', line: s.line, span: s.item.span } }, name);
    }
    return null;
  }

  /**
   * The number of a usable stated value in force, where only the number is wanted (no term is
   * made): null when `field` would give none.
   */
  number(id: string): number | null {
    const r = this.readAlready(id);
    // Not read yet: asked of the values in force without building the value (nor a record).
    if (r === null) return this.timepoint.values.numberOf(id);
    return r.input && r.input.stated.usable ? r.input.stated.value : null;
  }

  /**
   * How far (mmHg) a gas pressure in force can be from what it stands for when it was written in
   * kPa: half a unit of its last written decimal, one decimal at least (6.7 kPa stands for
   * 6.65–6.75 kPa, ± 0.375 mmHg). 0 for a pressure written in mmHg, which thresholds in mmHg take
   * as it is. Thresholds are compared with it (`sideOf`), so that a value in kPa is on the same
   * side of a threshold as the mmHg value it is written for: 8.0 kPa as 60 mmHg, 6.7 kPa as 50.
   */
  writtenResolutionMmhg(id: string): number {
    const input = this.input(id);
    return input ? kpaResolutionMmhg(input.stated) : 0;
  }

  /** A word value in force (device, mode, sex); one object per field and context. */
  word(id: string): WordInForce | null {
    const r = this.read(id);
    if (r.word !== undefined) return r.word;
    const input = r.input;
    return (r.word = !input || !input.stated.usable || input.stated.word === null ? null : { word: input.stated.word, input });
  }

  /** Whether a field is stated at this timepoint (not carried). */
  statedHere(id: string): boolean {
    const r = this.readAlready(id);
    // A field not read is asked of the values in force without building the value, and without a
    // record: most are asked about once (the anchors of one definition, the fields stated here).
    if (r === null) return this.timepoint.values.originOf(id) === 'here';
    return r.input !== null && r.input.origin.kind === 'here';
  }

  /** Another derived value, computed once; null when it cannot be computed here. */
  derived(id: string, name?: string): Term | null {
    const d = this.evaluate(id);
    return d instanceof ComputedValue ? d.asTerm(name ?? d.short) : null;
  }

  /**
   * For a value computed from another one that a finding withholds (a CaO2 from a PaO2 PN401 says
   * cannot be, a P/F adjusted for altitude from such a P/F): withheld too, for the same reason.
   */
  withheldFrom(id: string): Outcome | null {
    const r = this.evaluate(id);
    return r !== null && 'withheldBy' in r && r.withheldBy !== null ? { kind: 'na', reason: r.reason, withheldBy: r.withheldBy } : null;
  }

  derivedValue(id: string): DerivedValue | null {
    const r = this.evaluate(id);
    return r instanceof ComputedValue ? r : null;
  }

  evaluate(id: string): Evaluated {
    const slot = this.table.slots.get(id);
    return slot === undefined ? null : this.evaluateSlot(slot);
  }

  /** The definition at `slot` of the registry, computed once. */
  evaluateSlot(slot: number): Evaluated {
    // Made on the first evaluation: many timepoints derive nothing (a line of vital signs).
    const results = (this.results ??= new Array<Evaluated | typeof IN_PROGRESS | undefined>(this.table.list.length));
    const known = results[slot];
    if (known !== undefined) return known === IN_PROGRESS ? null : known;
    results[slot] = IN_PROGRESS;
    const result = evaluateDef(this.table.list[slot]!, this);
    results[slot] = result;
    return result;
  }

  /**
   * FiO2 in force: a sampling FiO2 on the gas line, else the ventilator's or the oxygen line's,
   * else 0.21 when the device is room air. Estimates from low-flow devices are never used.
   */
  fio2(): Term | null {
    const stated = this.field('fio2', 'FiO2');
    // An FiO2 above 0.21 on a room-air line (PN316): neither it nor the 0.21 of air is used.
    // The device is asked of this context first (read once for every formula of the gas).
    if (stated) return this.word('device')?.word === 'room air' && isRoomAirContradiction(this.input('fio2')!, this.timepoint.values) ? null : stated;
    // Several formulas of a gas read the FiO2: the room-air term is worked out once.
    if (this.airFio2 === undefined) this.airFio2 = this.roomAirFio2();
    return this.airFio2;
  }

  private roomAirFio2(): Term | null {
    const device = this.word('device');
    // Room air with an oxygen flow (PN310) says oxygen is given, through a device not named.
    if (device?.word === 'room air' && flowOnRoomAir(this.timepoint.values) === null) {
      return { name: 'FiO2', value: 0.21, unit: '', decimals: 2, origin: device.input.origin, note: 'room air' };
    }
    return null;
  }

  /** What to add to get FiO2 (a low-flow device needs a stated FiO2). */
  fio2Need(): string {
    // An FiO2 is written but kept out of calculations (impossible, or its unit in doubt): mend that one.
    const unusable = this.unusableNeed('fio2');
    if (unusable !== null) return unusable;
    const written = this.input('fio2');
    const device = this.word('device');
    if (device?.word === 'room air' && flowOnRoomAir(this.timepoint.values) !== null) return 'the oxygen device (room air takes no oxygen flow)';
    if (written && device?.word === 'room air' && isRoomAirContradiction(written, this.timepoint.values)) return 'the oxygen device, or an FiO2 of 0.21 (room air is no added oxygen)';
    if (device && (device.word === 'cannula' || device.word === 'mask')) return `fio2 (a ${device.word}'s FiO2 is only an estimate)`;
    // An oxygen line is there, without its FiO2 (`oxygen venturi 8`): the FiO2 goes on that line.
    if (device && device.word !== 'room air') return `fio2 (on the ${device.word} line)`;
    // On a ventilator (a vent line ends the oxygen line before it), the FiO2 goes on the vent line.
    if (!device && VENT_SETTINGS.some((id) => this.timepoint.values.originOf(id) !== null)) return 'fio2 (on the vent line)';
    // An oxygen line without a device (`oxygen flow 2`): there is one, and the FiO2 goes on it.
    if (!device && OXYGEN_SETTINGS.some((id) => this.timepoint.values.originOf(id) !== null)) return 'fio2 (on the oxygen line)';
    return 'fio2 (or an oxygen line)';
  }

  /**
   * Total respiratory rate: measured (vitals) at this timepoint, else the set ventilator rate. A
   * set rate of 0 is no rate of breathing (in a spontaneous mode the patient sets the rate; in a
   * mode with mandatory breaths it is a mistake, PN312): null then, never a minute ventilation of 0.
   * Nor is the rate set in pressure support or CPAP, a backup rate (`MODES_WITH_BACKUP_RATE`): null
   * there, so a measured rate is asked for.
   */
  respiratoryRate(): Term | null {
    const measured = this.field('rr', 'RR');
    if (measured) return measured;
    const set = this.field('vent_rate', 'RR (set)');
    if (set === null || !(set.value > 0)) return null;
    const mode = this.word('mode');
    return mode !== null && MODES_WITH_BACKUP_RATE.has(mode.word) ? null : set;
  }

  /**
   * What to add for the rate `respiratoryRate` reads, where it has none: a usable one in place of a
   * measured rate, or of a set rate it would read (not a backup rate), written but not used; else `rr`.
   */
  rateNeed(): string {
    const measured = this.unusableNeed('rr');
    if (measured !== null) return measured;
    const mode = this.word('mode');
    return (mode !== null && MODES_WITH_BACKUP_RATE.has(mode.word) ? null : this.unusableNeed('vent_rate')) ?? 'rr';
  }

  /**
   * Where `respiratoryRate()` has no rate because the set rate is 0 in a mode that delivers
   * mandatory breaths (PN312): the outcome of a value computed from the rate, withheld; else null.
   */
  zeroSetRate(): Outcome | null {
    if (this.timepoint.values.numberOf('vent_rate') !== 0) return null;
    const mode = this.word('mode');
    return mode !== null && MODES_WITH_SET_BREATHS.has(mode.word) ? ZERO_SET_RATE : null;
  }

  /**
   * Where the mode in force is HFOV: the outcome of a value computed from the set rate as a rate
   * of breaths (minute ventilation VT × rate, mechanical power, the ventilatory ratio), which an
   * oscillator's frequency is not; else null.
   */
  oscillation(): Outcome | null {
    return this.word('mode')?.word === OSCILLATION_MODE ? IN_HFOV : null;
  }

  /**
   * Where the mode in force is HFOV: the outcome of a value computed from the pressures or the
   * volume of a conventional breath (plateau or peak − PEEP: driving pressure, static and dynamic
   * compliance), which an oscillator does not deliver; else null.
   */
  oscillationBreath(): Outcome | null {
    return this.word('mode')?.word === OSCILLATION_MODE ? NO_BREATH_IN_HFOV : null;
  }

  /**
   * PEEP in force: the ventilator's, else the end-expiratory pressure of the oxygen line its device
   * gives (`endExpiratoryField`: the CPAP level under `cpap`, else the EPAP, else the CPAP level);
   * none the device does not give (`oxygen mask, epap 6`, `oxygen cpap ipap 14, epap 6`: PN318).
   */
  peepLike(): Term | null {
    const peep = this.field('peep', 'PEEP');
    if (peep) return peep;
    const values = this.timepoint.values;
    // Most timepoints have neither: asked without building a value.
    if (values.numberOf('epap') === null && values.numberOf('cpap_level') === null) return null;
    const id = endExpiratoryField(this.word('device')?.word ?? null, values);
    return id === null ? null : this.field(id, id === 'epap' ? 'EPAP' : 'CPAP');
  }

  /** Whether a vent line was read at this timepoint (any of its values, usable or not). */
  ventLineHere(): boolean {
    const stated = this.timepoint.stated;
    for (let i = 0; i < stated.length; i++) if (stated[i]!.section === 'vent') return true;
    return false;
  }

  /** The non-invasive support of the oxygen line in force (`noninvasiveSupport`), or null. */
  noninvasiveSupport(): NoninvasiveSupport | null {
    return noninvasiveSupport(this.word('device')?.word ?? null, this.timepoint.values);
  }

  /**
   * What to add for the end-expiratory pressure `peepLike` reads, where none is in force: beside a
   * device that does not give the EPAP or the CPAP level written there (PN318), a device that does;
   * under NIV or CPAP of an oxygen line, the EPAP or the CPAP level on that line (a `peep` would go
   * on a vent line, and a vent line with a setting ends the support); else `peep`.
   */
  peepNeed(): string {
    const peep = this.unusableNeed('peep');
    if (peep !== null) return peep;
    const device = this.word('device');
    const pressure = device === null ? null : this.input('epap') ?? this.input('cpap_level');
    if (device !== null && pressure !== null && pressure.stated.value !== 0 && !givesPressure(device.word, pressure.stated.fieldId)) {
      const written = pressure.stated.fieldId === 'epap' ? 'epap' : 'CPAP level';
      const given = givesNoSetPressure(device.word) ? 'no set airway pressure' : `no ${pressure.stated.fieldId === 'epap' ? 'EPAP' : 'CPAP level'}`;
      return `a device that gives the ${written} on line ${pressure.stated.line + 1} (${supportOfPressure(pressure.stated.fieldId)}: ${device.word} gives ${given}, see PN318)`;
    }
    const support = this.noninvasiveSupport();
    if (support === null) return 'peep';
    return this.unusableNeed(support === 'niv' ? 'epap' : 'cpap_level') ?? END_EXPIRATORY_NEED[support];
  }

  value(value: number | null, terms: readonly (Term | null)[], extra: ValueExtras = NO_EXTRAS): Outcome {
    if (value === null || !Number.isFinite(value)) return NOT_IN_DOMAIN;
    return { kind: 'value', value, terms: withoutNulls(terms), extras: extra };
  }

  /**
   * Whether the breaths in force measure field `id` rather than set it, though a setting by default
   * (fields/modes.ts: a tidal volume under PS, or with no mode under NIV or CPAP of an oxygen line).
   */
  measuredByMode(id: string): boolean {
    const field = fieldById(id);
    if (field === undefined) return false;
    const mode = this.word('mode')?.word ?? null;
    return measuredByMode(field, mode, mode === null ? this.noninvasiveSupport() : null);
  }

  /**
   * What to add for field `id` where it is missing: its key; where the mode in force measures it
   * (`measuredByMode`) the measured value at this timepoint, since one of an earlier timepoint is
   * not carried (`add the measured vt at this timepoint`).
   */
  need(id: string): string {
    const unusable = this.unusableNeed(id);
    if (unusable !== null) return unusable;
    const key = fieldById(id)?.aliases[0] ?? id;
    return this.measuredByMode(id) ? `the measured ${key} at this timepoint` : key;
  }

  /**
   * What to add for an input read from the fields `ids` (the first usable one of them): where the
   * value in force for one of them was written (here, carried or in the header) but is kept out of
   * calculations, a usable one in its place (`unusableNeed`); else `key`, what to add where nothing
   * was written.
   */
  needFor(ids: string | readonly string[], key: string): string {
    if (typeof ids === 'string') return this.unusableNeed(ids) ?? key;
    for (const id of ids) {
      const unusable = this.unusableNeed(id);
      if (unusable !== null) return unusable;
    }
    return key;
  }

  /**
   * Where the value in force for field `id` was written but is not used (a bare gas pressure doubted
   * as the other unit, a unit the field does not take, an impossible value): `a usable pco2 (the one
   * on line 3 is not used: see PN204)`, with its field's key (`keyOf`), so that a user
   * who wrote it is not told to add it; null where none is in force, or the one in force is usable.
   */
  unusableNeed(id: string): string | null {
    const input = this.input(id);
    if (input === null || input.stated.usable) return null;
    const stated = input.stated;
    const why = stated.unitDoubt !== null ? 'PN204' : 'its finding';
    return `a usable ${keyOf(stated)} (the one on line ${stated.line + 1} is not used: see ${why})`;
  }

  /** What to add to get another derived value (its own missing inputs), for messages. */
  lacking(id: string): readonly string[] {
    const r = this.evaluate(id);
    if (r && 'needs' in r) return r.needs;
    const slot = this.table.slots.get(id);
    return [slot === undefined ? id : this.table.list[slot]!.short];
  }

  /**
   * Names what is missing: pairs of [term, what to add] (a key, or the keys another derived value
   * lacks). Each key is named once: the delta ratio lacks the anion gap's na, cl and hco3 and an
   * hco3 of its own, and asks for hco3 once.
   */
  missing(...pairs: readonly (readonly [unknown, string | readonly string[]])[]): Outcome {
    const needs: string[] = [];
    for (const [term, what] of pairs) {
      if (term !== null && term !== undefined) continue;
      for (const key of typeof what === 'string' ? [what] : what) if (!needs.includes(key)) needs.push(key);
    }
    return { kind: 'missing', needs };
  }
}

/** The terms given, without the missing ones: the same list when none is missing (the usual case). */
function withoutNulls(terms: readonly (Term | null)[]): readonly Term[] {
  if (!terms.includes(null)) return terms as readonly Term[];
  const kept: Term[] = [];
  for (const t of terms) if (t !== null) kept.push(t);
  return kept;
}

/**
 * The key to write a stated value's field with: its canonical key, which every section the field
 * is stated in takes (`pco2` on abg and vbg lines alike, though each line's is its own field).
 */
function keyOf(stated: InputValue['stated']): string {
  return stated.field.aliases[0] ?? stated.field.id;
}

function defaultTermName(fieldId: string): string {
  const field = fieldById(fieldId);
  return field?.short ?? field?.aliases[0] ?? fieldId;
}

function termOf(input: InputValue, name?: string): Term {
  // The value knows its field (the registry's row): no lookup by id.
  const field = input.stated.field;
  const fieldId = field.id;
  const unit = input.stated.unit === null || input.stated.unit === 'fraction' || input.stated.unit === 'ph' ? '' : displayUnit(input.stated.unit);
  if (input.stated.readUnit === PER_KG_PBW) return perKgTerm(input, name, unit);
  return {
    name: name ?? field.short ?? field.aliases[0] ?? fieldId,
    value: input.stated.value ?? NaN,
    unit,
    decimals: field.decimals,
    origin: input.origin,
    fieldId,
  };
}

/**
 * The term of a tidal volume written per kg of PBW and read in mL (`vt 6 mL/kg`): its note says so,
 * `6 mL/kg × PBW 70.6 kg` (ARDS Network 2000 equation, the timeline's `PerKgVolume`).
 */
function perKgTerm(input: InputValue, name: string | undefined, unit: string): Term {
  const field = input.stated.field;
  const perKg = input.stated.item.number ?? NaN;
  const value = input.stated.value ?? NaN;
  return {
    name: name ?? field.short ?? field.aliases[0] ?? field.id,
    value,
    unit,
    decimals: field.decimals,
    origin: input.origin,
    fieldId: field.id,
    note: `${input.stated.item.value?.text ?? formatShort(perKg)} mL/kg × PBW ${formatNumber(value / perKg, 1)} kg, ARDS Network 2000 equation`,
  };
}

function anchorLine(def: DerivedDef, c: DeriveContext): number | null {
  for (const id of def.anchors) {
    // Asked first without building the value: most anchors are not stated here.
    if (!c.statedHere(id)) continue;
    const v = c.input(id);
    if (v && v.origin.kind === 'here') return v.origin.line;
  }
  return null;
}

function usesCarried(terms: readonly Term[], c: DeriveContext): boolean {
  for (const t of terms) {
    if (t.origin.kind === 'carried') return true;
    if (t.origin.kind === 'derived' && c.derivedValue(t.origin.id)?.usesCarried) return true;
  }
  return false;
}

/** Settings that only a vent line states: one in force means the patient is on the ventilator. */
const VENT_SETTINGS: readonly string[] = ['mode', 'vt', 'vent_rate', 'peep', 'pressure_support', 'amplitude'];
/** Settings of an oxygen line besides its device and FiO2: one in force means an oxygen line is. */
const OXYGEN_SETTINGS: readonly string[] = ['o2_flow', 'ipap', 'epap', 'cpap_level'];

/** The key of the end-expiratory pressure, with its line, under each non-invasive support (`peepNeed`). */
const END_EXPIRATORY_NEED: Readonly<Record<NoninvasiveSupport, string>> = { niv: 'epap (on the oxygen line)', cpap: 'level (on the oxygen line)' };

const NOT_IN_DOMAIN: Outcome = { kind: 'na', reason: 'the inputs are outside the range where the formula holds' };
const IN_HFOV: Outcome = { kind: 'na', reason: 'not worked out in HFOV: its rate is an oscillation frequency, and tidal volume × rate is not its ventilation' };
const NO_BREATH_IN_HFOV: Outcome = { kind: 'na', reason: 'not worked out in HFOV: an oscillator gives no conventional breath with an end-inspiratory plateau or peak, so a plateau or peak less PEEP is no pressure that moved the tidal volume' };
const ZERO_SET_RATE: Outcome = { kind: 'na', reason: 'the set rate is 0 in a mode that delivers mandatory breaths, and no rate is measured (see PN312)', withheldBy: 'PN312' };



function evaluateDef(def: DerivedDefinition, c: DeriveContext): DerivedValue | MissingValue | NotApplicable | null {
  let outcome: Outcome;
  try {
    outcome = def.compute(c);
  } catch {
    outcome = { kind: 'na', reason: 'could not be computed' };
  }
  if (outcome.kind === 'missing' && outcome.needs.length === 0) return null;
  // Found after computing: the anchors the formula read are answered from what it read.
  const line = anchorLine(def, c);
  if (outcome.kind === 'missing') return new Missing(def, outcome.needs, line);
  if (outcome.kind === 'na') return { id: def.id, label: def.label, reason: outcome.reason, line, withheldBy: outcome.withheldBy ?? null, explained: outcome.explained ?? false };
  return new ComputedValue(def, outcome, usesCarried(outcome.terms, c), line);
}

type ValueOutcome = Extract<Outcome, { kind: 'value' }>;

/**
 * A derived value's short name as a sentence names it: `A–a normal`, not the `A–a normal ≤` that a
 * number follows in a list of values (`add age to get A–a normal`).
 */
export function shortAsName(short: string): string {
  return short.endsWith(' ≤') ? short.slice(0, -2) : short;
}

/**
 * A derived value that cannot be computed here, and what to add to get it. Its message is built
 * on first read: most are asked for by another value or a reading (the anion gap by every gas)
 * and never shown.
 */
class Missing implements MissingValue {
  readonly id: string;
  readonly label: string;
  readonly needs: readonly string[];
  readonly line: number | null;
  readonly #short: string;
  #message: string | null = null;

  constructor(def: DerivedDefinition, needs: readonly string[], line: number | null) {
    this.id = def.id;
    this.label = def.label;
    this.needs = needs;
    this.line = line;
    this.#short = shortAsName(def.short);
  }

  get message(): string {
    return (this.#message ??= `add ${wordList(this.needs)} to get ${this.#short}`);
  }

  /** As JSON, the message is written as a field was (a getter is not an own property). */
  toJSON(): MissingValue {
    return { id: this.id, label: this.label, needs: this.needs, message: this.message, line: this.line };
  }
}

/**
 * A computed derived value. The formula with its numbers put in is built on first read: most
 * values are never hovered, and a big note has tens of thousands of them.
 */
class ComputedValue implements DerivedValue {
  readonly id: string;
  readonly label: string;
  readonly short: string;
  readonly category: DerivedCategory;
  readonly value: number;
  readonly unit: string;
  readonly decimals: number;
  readonly range: { readonly low: number; readonly high: number } | null;
  readonly formula: string;
  readonly inputs: readonly Term[];
  readonly source: string;
  readonly estimate: boolean;
  readonly notes: readonly string[];
  readonly caveat: string | null;
  readonly usesCarried: boolean;
  readonly line: number | null;
  readonly template: string;
  /** See `ValueExtras.kpaDecimals`; null: the unit's own. */
  readonly kpaDecimals: number | null;
  /** See `ValueExtras.outwardEnd`; null: both ends rounded as usual. */
  readonly outwardEnd: 'low' | 'high' | null;
  // ES private fields: not own properties, so comparing two values ignores whether they were built.
  #shown: string | null = null;
  /** The term other formulas read this value as (most read it under one name, several times a gas). */
  #term: Term | null = null;

  constructor(def: DerivedDefinition, outcome: ValueOutcome, carried: boolean, line: number | null) {
    const extras = outcome.extras;
    this.id = def.id;
    this.label = def.label;
    this.short = def.short;
    this.category = def.category;
    this.value = outcome.value;
    this.unit = def.unit;
    this.decimals = extras.decimals ?? def.decimals;
    this.range = extras.range ?? null;
    this.formula = extras.formula ? shownFormula(extras.formula) : def.shownFormula;
    this.inputs = outcome.terms;
    this.source = def.source;
    this.estimate = extras.estimate ?? false;
    this.notes = extras.notes ?? NONE;
    this.caveat = extras.caveat ?? null;
    this.usesCarried = carried;
    this.line = line;
    this.template = extras.formula ?? def.formula;
    this.kpaDecimals = extras.kpaDecimals ?? null;
    this.outwardEnd = extras.outwardEnd ?? null;
  }

  /** This value as an input of another formula, under `name`. */
  asTerm(name: string): Term {
    const known = this.#term;
    if (known !== null && known.name === name) return known;
    return (this.#term = { name, value: this.value, unit: this.unit, decimals: this.decimals, origin: known?.origin ?? { kind: 'derived', id: this.id } });
  }

  get substituted(): string {
    if (this.#shown === null) {
      const range = this.range;
      const result = range ? `${formatNumber(range.low, this.decimals)}–${formatNumber(range.high, this.decimals)}` : formatNumber(this.value, this.decimals);
      const left = reproducingSubstitution(this.template, this.inputs, substitute, termShownWith, result, this.decimals);
      this.#shown = `${left} = ${result}${this.unit ? ` ${this.unit}` : ''}`;
    }
    return this.#shown;
  }
}

/** A term's number with `extra` decimals more where it needs them (see reproduce.ts). */
function termShownWith(t: Term, extra: number): string {
  return termWithExtra(t.value, t.decimals, extra);
}

/** A term's number as a formula shows it. */
function termNumber(t: Term): string {
  return formatNumber(t.value, t.decimals);
}

/** Puts each term's value (as `show` writes it) in place of `{name}` in a formula template. */
export function substitute(template: string, terms: readonly Term[], show: (t: Term) => string = termNumber): string {
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
    out += term ? show(term) : name;
    i = close + 1;
  }
  return out;
}

export function describeInputOrigin(origin: InputOrigin): string {
  return origin.kind === 'derived' ? `computed (${origin.id})` : describeOrigin(origin);
}
