/**
 * The change since the previous arterial gas, for a reader at the bedside: for a timepoint with an
 * arterial gas (a PaO2, a PaCO2 or a pH stated there), the nearest earlier timepoint with one, and
 * for PaO2, PaCO2, pH, the P/F ratio and the settings of each gas (its FiO2, oxygen flow, PEEP, and
 * the IPAP, EPAP or CPAP level of non-invasive support), the earlier value and the difference, with
 * the time between the two where both times are known; and the oxygen device, where it changed.
 *
 * The gas values (PaO2, PaCO2, pH) are compared only where stated at each gas's own timepoint: a
 * carried value is no new measurement. The settings each gas was taken on (FiO2, PEEP) are those in
 * force there, stated or carried from an earlier timepoint, and the P/F ratio is the one computed
 * there from a PaO2 stated there: a setting that was not restated is still the one the patient was on, and a ratio computed
 * with it is the ratio the reader sees beside the gas. Such a value is marked `carried` (`*`, as a
 * derived value computed with a carried value is in `pneumark show`).
 *
 * The pressures compared are those the device in force gives (`noninvasiveSupport`: the IPAP and
 * EPAP of NIV, the level of CPAP; one it does not give, PN318, is used nowhere and compared neither).
 * Where no FiO2 is in force, the FiO2 compared is room air's 0.21 under a room-air line, or a
 * cannula's or a simple mask's estimate from its flow (the rule of `fio2_estimated`), marked as an
 * estimate (`FiO2 est up 0.08 (was 0.29 est)`): never used for the P/F ratio, only compared. Arithmetic and description
 * only ("up", "down", "unchanged"): no word judges a change, as no published threshold is applied.
 *
 * Worked out only when asked (a hover, `pneumark show`): checking a note never computes it.
 * Gas pressures and P/F are given in the unit the note writes its gases in (`trendGasUnit`), as
 * the trend view gives them, so that a change and the trend agree.
 */
import type { Timepoint } from './analysis/model';
import type { NoteResult } from './check-note';
import { derivedValueOf } from './derive/registry';
import { fieldById } from './fields/registry';
import { deviceInForce, noninvasiveSupport, supportOfPressure } from './analysis/noninvasive-support';
import { fio2EstimateLowFlow } from './physiology/oxygen-transport';
import { fio2InForce } from './derive/context';
import { deviceShown, KPA_DECIMALS, kpaFromMmhg, timeText } from './present';
import { trendGasUnit, type TrendGasUnit } from './trends';
import { formatNumber } from './util/format';

/** What is compared, in the order it is listed. */
export const CHANGE_KEYS = ['pao2', 'paco2', 'ph', 'pf_ratio', 'fio2', 'o2_flow', 'peep', 'ipap', 'epap', 'cpap_level'] as const;
export type ChangeKey = (typeof CHANGE_KEYS)[number];

/** The gas values whose statement at a timepoint makes it an arterial gas timepoint. */
const GAS_KEYS = ['pao2', 'paco2', 'ph'] as const;

export type ChangeUnit = TrendGasUnit | 'pH' | 'fraction' | 'cmH2O' | 'L/min';

/** The keys compared as they were before the settings: the gas values and the ratio. */
const GAS_VALUE_KEYS: ReadonlySet<ChangeKey> = new Set(['pao2', 'paco2', 'ph', 'pf_ratio']);

/** One value at both gases, in the unit it is shown in (`unit`), with the decimals it is shown with. */
export interface ValueChange {
  readonly key: ChangeKey;
  /** The short name a reader knows it by: `PaO2`, `P/F`, `FiO2`. */
  readonly name: string;
  readonly earlier: number;
  readonly later: number;
  /** `later − earlier` of the two numbers as shown (each rounded to `decimals`), so that the difference agrees with what is read. */
  readonly difference: number;
  readonly unit: ChangeUnit;
  readonly decimals: number;
  /** Whether either value was carried from an earlier timepoint, or computed with one (a P/F ratio with a carried FiO2). */
  readonly carried: boolean;
  /** Whether the earlier value is an FiO2 estimated from a low-flow device's flow (only an FiO2 may be). */
  readonly earlierEstimated: boolean;
  /** Whether the later value is such an estimate. */
  readonly laterEstimated: boolean;
  /**
   * Whether the two values are an oxygen flow given by two different devices (a cannula's 4 L/min,
   * a mask's 10): each is said, with no up or down, as a flow is no measure of support from one
   * device to another.
   */
  readonly otherDevice: boolean;
}

/** The oxygen device in force at both gases (canonical device words), where it changed. */
export interface DeviceChange {
  readonly earlier: string;
  readonly later: string;
  /** Whether either device was carried from an earlier timepoint. */
  readonly carried: boolean;
}

/** The change at one arterial gas timepoint since the previous one. */
export interface GasChange {
  /** The timepoint of the later gas (0-based, as `Timepoint.index`). */
  readonly timepoint: number;
  /** The earlier gas's timepoint: its index (0-based), label and time as written for people (`day 2 02:00`), null when unknown. */
  readonly from: { readonly timepoint: number; readonly label: string; readonly time: string | null };
  /** Minutes from the earlier gas to this one; null where either time is unknown. */
  readonly minutesBetween: number | null;
  /** The values at both gases (gas values stated there; settings and P/F in force there), in `CHANGE_KEYS` order; may be empty. */
  readonly changes: readonly ValueChange[];
  /** The oxygen device, where one is in force at both gases and it differs; else null. */
  readonly device: DeviceChange | null;
}

/** Whether any value of the change, or its device, was carried or computed with a carried value (`*`). */
export function changeUsesCarried(change: GasChange): boolean {
  return change.device?.carried === true || change.changes.some((c) => c.carried);
}

/** Whether a PaO2, a PaCO2 or a pH is stated, usable, at the timepoint. */
export function hasArterialGas(tp: Timepoint): boolean {
  for (const id of GAS_KEYS) if (statedHere(tp, id) !== null) return true;
  return false;
}

/**
 * The change at timepoint `index` since the nearest earlier arterial gas; null where the
 * timepoint has no arterial gas or no earlier timepoint has one.
 */
export function changeSincePreviousGas(result: NoteResult, index: number): GasChange | null {
  const timepoints = result.analysis.timeline.timepoints;
  const tp = timepoints[index];
  if (!tp || !hasArterialGas(tp)) return null;
  let earlier: Timepoint | null = null;
  for (let i = index - 1; i >= 0; i--) {
    if (hasArterialGas(timepoints[i]!)) { earlier = timepoints[i]!; break; }
  }
  if (earlier === null) return null;
  const gasUnit = gasUnitOf(result);
  const device = deviceChange(earlier, tp);
  const changes: ValueChange[] = [];
  for (const key of CHANGE_KEYS) {
    const before = valueAt(result, earlier, key, gasUnit);
    const after = valueAt(result, tp, key, gasUnit);
    if (before === null || after === null) continue;
    const difference = roundTo(roundTo(after.value, after.decimals) - roundTo(before.value, after.decimals), after.decimals);
    changes.push({ key, name: NAMES[key], earlier: before.value, later: after.value, difference, unit: after.unit, decimals: after.decimals, carried: before.carried || after.carried, earlierEstimated: before.estimated, laterEstimated: after.estimated, otherDevice: key === 'o2_flow' && device !== null });
  }
  const minutesBetween = tp.time.minutes !== null && earlier.time.minutes !== null ? tp.time.minutes - earlier.time.minutes : null;
  return { timepoint: tp.index, from: { timepoint: earlier.index, label: earlier.label, time: timeText(earlier.time) }, minutesBetween, changes, device };
}

/** The device of the oxygen line in force (stated or carried, not the header's), with whether it was carried. */
function deviceAt(tp: Timepoint): { readonly word: string; readonly carried: boolean } | null {
  const carried = carriedIfInForce(tp, 'device');
  if (carried === null) return null;
  const word = deviceInForce(tp.values);
  return word === null ? null : { word, carried };
}

/** Whether the value of `id` in force at this timepoint was carried in (false: stated there); null when none is, or when it comes from the header. */
function carriedIfInForce(tp: Timepoint, id: string): boolean | null {
  const origin = tp.values.originOf(id);
  return origin === 'here' ? false : origin === 'carried' ? true : null;
}

function deviceChange(earlier: Timepoint, later: Timepoint): DeviceChange | null {
  const before = deviceAt(earlier);
  const after = deviceAt(later);
  if (before === null || after === null || before.word === after.word) return null;
  return { earlier: before.word, later: after.word, carried: before.carried || after.carried };
}

/**
 * `trendGasUnit`, kept per timeline (each analysis makes a new one): a tooltip of every P/F hint of
 * a long note asks for it, and working it out reads every timepoint.
 */
const gasUnitByTimeline = new WeakMap<NoteResult['analysis']['timeline'], TrendGasUnit>();

function gasUnitOf(result: NoteResult): TrendGasUnit {
  const timeline = result.analysis.timeline;
  let unit = gasUnitByTimeline.get(timeline);
  if (unit === undefined) {
    unit = trendGasUnit(result);
    gasUnitByTimeline.set(timeline, unit);
  }
  return unit;
}

const NAMES: Readonly<Record<ChangeKey, string>> = { pao2: 'PaO2', paco2: 'PaCO2', ph: 'pH', pf_ratio: 'P/F', fio2: 'FiO2', o2_flow: 'O2 flow', peep: 'PEEP', ipap: 'IPAP', epap: 'EPAP', cpap_level: 'CPAP' };

/** The number of a field stated at this timepoint (canonical unit), usable; null when none or when the value in force was carried or came from the header. */
function statedHere(tp: Timepoint, id: string): number | null {
  return tp.values.originOf(id) === 'here' ? tp.values.numberOf(id) : null;
}

interface Shown {
  readonly value: number;
  readonly unit: ChangeUnit;
  readonly decimals: number;
  readonly carried: boolean;
  readonly estimated: boolean;
}

/** The number of a setting in force at this timepoint (canonical unit), stated there or carried in; null when none is, or when it comes from the header. */
function inForce(tp: Timepoint, id: string): { readonly value: number; readonly carried: boolean } | null {
  const carried = carriedIfInForce(tp, id);
  if (carried === null) return null;
  const value = tp.values.numberOf(id);
  return value === null ? null : { value, carried };
}

function valueAt(result: NoteResult, tp: Timepoint, key: ChangeKey, gasUnit: TrendGasUnit): Shown | null {
  if (key === 'pf_ratio') {
    const pf = derivedValueOf(result.analysis.derivation(tp.index), 'pf_ratio');
    // The ratio computed here from a PaO2 measured here (never an older PaO2 carried in), marked
    // where it used a carried setting (a FiO2 by default, room air, is none).
    if (!pf || statedHere(tp, 'pao2') === null) return null;
    return gasPressure(pf.value, pf.decimals, gasUnit, pf.usesCarried);
  }
  const decimals = fieldById(key)?.decimals ?? 0;
  if (key === 'fio2') return fio2At(tp, decimals);
  if (key === 'o2_flow' || key === 'peep') {
    const setting = inForce(tp, key);
    if (setting === null) return null;
    return { value: setting.value, unit: key === 'o2_flow' ? 'L/min' : 'cmH2O', decimals, carried: setting.carried, estimated: false };
  }
  if (key === 'ipap' || key === 'epap' || key === 'cpap_level') {
    // Only a pressure the device in force gives (PN318 reports one it does not, and nothing uses it).
    const values = tp.values;
    const support = noninvasiveSupport(deviceInForce(values), { has: (id) => values.numberOf(id) !== null });
    if (support === null || supportOfPressure(key) !== support) return null;
    const setting = inForce(tp, key);
    return setting === null ? null : { value: setting.value, unit: 'cmH2O', decimals, carried: setting.carried, estimated: false };
  }
  const value = statedHere(tp, key);
  if (value === null) return null;
  return key === 'ph' ? { value, unit: 'pH', decimals, carried: false, estimated: false } : gasPressure(value, decimals, gasUnit, false);
}

/**
 * The FiO2 at a gas: the one in force (stated or carried); else under a room-air line 0.21; else a
 * cannula's or a simple mask's estimate from its flow in force (`fio2EstimateLowFlow`, the rule of
 * `fio2_estimated`), marked as an estimate; null when none of these is.
 */
function fio2At(tp: Timepoint, decimals: number): Shown | null {
  const setting = inForce(tp, 'fio2');
  if (setting !== null) return { value: setting.value, unit: 'fraction', decimals, carried: setting.carried, estimated: false };
  const device = deviceAt(tp);
  if (device === null) return null;
  if (device.word === 'room air') {
    // 0.21 as the calculations take it: none on a room-air line with an oxygen flow (PN310).
    const air = fio2InForce(tp.values);
    return air === null ? null : { value: air, unit: 'fraction', decimals, carried: device.carried, estimated: false };
  }
  if (device.word !== 'cannula' && device.word !== 'mask') return null;
  const flow = inForce(tp, 'o2_flow');
  const estimate = flow === null ? null : fio2EstimateLowFlow(device.word, flow.value);
  if (estimate === null) return null;
  return { value: estimate, unit: 'fraction', decimals: ESTIMATE_DECIMALS, carried: device.carried || flow!.carried, estimated: true };
}

/** The decimals an FiO2 estimate is shown with (`fio2_estimated`'s). */
const ESTIMATE_DECIMALS = 2;

function gasPressure(mmHg: number, decimals: number, gasUnit: TrendGasUnit, carried: boolean): Shown {
  return gasUnit === 'kPa' ? { value: kpaFromMmhg(mmHg), unit: 'kPa', decimals: KPA_DECIMALS, carried, estimated: false } : { value: mmHg, unit: 'mmHg', decimals, carried, estimated: false };
}

function roundTo(value: number, decimals: number): number {
  const scale = 10 ** decimals;
  return Math.round(value * scale) / scale;
}

// ── words ───────────────────────────────────────────────────────────────

/**
 * `PaO2 down 6 mmHg (was 88)`, `pH up 0.02 (was 7.31)`, `PEEP unchanged (8 cmH2O)`; with a `*` at
 * the end where a value was carried or computed with one (`FiO2 unchanged (0.60)*`). An FiO2
 * estimated from a low-flow device says so: `FiO2 est` where the later one is, `est` after the
 * earlier number where it is (`FiO2 up 0.06 (was 0.29 est)`). A flow from another device is
 * given as it is, with no up or down: `O2 flow 10.0 L/min (was 4.0)`.
 */
export function valueChangeText(c: ValueChange): string {
  const unit = c.unit === 'pH' || c.unit === 'fraction' ? '' : ` ${c.unit}`;
  const earlier = `${formatNumber(c.earlier, c.decimals)}${c.earlierEstimated ? ' est' : ''}`;
  const name = c.laterEstimated ? `${c.name} est` : c.name;
  const mark = c.carried ? '*' : '';
  if (c.otherDevice) return `${name} ${formatNumber(c.later, c.decimals)}${unit} (was ${earlier})${mark}`;
  if (c.difference === 0) return `${name} unchanged (${c.earlierEstimated ? `${formatNumber(c.earlier, c.decimals)}${unit} est` : `${earlier}${unit}`})${mark}`;
  return `${name} ${c.difference > 0 ? 'up' : 'down'} ${formatNumber(Math.abs(c.difference), c.decimals)}${unit} (was ${earlier})${mark}`;
}

/** `device now mask (was cannula)`, with a `*` where either device was carried in. */
export function deviceChangeText(d: DeviceChange): string {
  return `device now ${deviceShown(d.later)} (was ${deviceShown(d.earlier)})${d.carried ? '*' : ''}`;
}

/** `timepoint 2 (PEEP raised, day 2 02:00)`: the earlier gas's timepoint, counted from 1, with its label and time where the note gives them. */
export function fromText(change: GasChange): string {
  const { label, time } = change.from;
  // A timepoint without a label is labelled by its time as written (`day 1 08:00`): said once.
  const sameAsTime = time !== null && (label === time || time.endsWith(` ${label}`));
  const details = [sameAsTime ? '' : label, time].filter((t): t is string => t !== null && t !== '');
  return `timepoint ${change.from.timepoint + 1}${details.length > 0 ? ` (${details.join(', ')})` : ''}`;
}

/** `6 h 30 min earlier`, `45 min earlier`; where the note's times go back, `40 min later in time`; null when unknown. */
export function betweenText(change: GasChange): string | null {
  const m = change.minutesBetween;
  if (m === null || !Number.isFinite(m)) return null;
  if (m === 0) return 'at the same time';
  const whole = Math.round(Math.abs(m));
  const hours = Math.floor(whole / 60);
  const minutes = whole % 60;
  const span = hours === 0 ? `${minutes} min` : minutes === 0 ? `${hours} h` : `${hours} h ${minutes} min`;
  return m > 0 ? `${span} earlier` : `${span} later in time (the note's times go back)`;
}

/**
 * The change in one line of plain text: `from timepoint 2 (PEEP raised, day 2 02:00), 6 h
 * earlier: PaO2 down 6 mmHg (was 88) · pH up 0.02 (was 7.31)`; null when nothing is compared.
 * The label is the note's own text: escape it for where it is shown.
 */
export function gasChangeText(change: GasChange | null): string | null {
  if (change === null || (change.changes.length === 0 && change.device === null)) return null;
  const between = betweenText(change);
  // The gas values and P/F, then the device where it changed, then the settings.
  const parts: string[] = [];
  for (const c of change.changes) if (GAS_VALUE_KEYS.has(c.key)) parts.push(valueChangeText(c));
  if (change.device !== null) parts.push(deviceChangeText(change.device));
  for (const c of change.changes) if (!GAS_VALUE_KEYS.has(c.key)) parts.push(valueChangeText(c));
  return `from ${fromText(change)}${between !== null ? `, ${between}` : ''}: ${parts.join(' · ')}`;
}
