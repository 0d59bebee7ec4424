/**
 * Series over time for a trend view and a status line: per timepoint, the stated and derived
 * values worth plotting, each with its unit, and which of them used a carried-forward input.
 *
 * Values carry their unit so that a view plots them as given and does no conversion of its own:
 * gas pressures (PaO2, PaCO2) and P/F in the unit the note writes its gases in (`trendGasUnit`),
 * FiO2 as a percentage beside SpO2, airway pressures in cmH2O, compliance in mL/cmH2O.
 */
import type { StatedValue, Timepoint } from './analysis/model';
import type { NoteResult } from './check-note';
import type { TimepointDerivation } from './derive/model';
import { derivedValueOf } from './derive/registry';
import { percentFromFraction } from './physiology/units';
import { gasPressureText, kpaFirstCompact, kpaFromMmhg, showsKpa, statedInKpa } from './present';
import { formatNumber } from './util/format';
import { ITEMS_PER_STEP, runSteps, type Steps } from './util/steps';

export const TREND_FIELDS = ['pao2', 'paco2', 'ph', 'spo2', 'fio2', 'peep'] as const;
export const TREND_DERIVED = ['pf_ratio', 'driving_pressure', 'compliance_static'] as const;
export type TrendKey = (typeof TREND_FIELDS)[number] | (typeof TREND_DERIVED)[number];

/** The gas pressures whose units decide the unit of a trend's gas pressures (see `trendGasUnit`). */
const GAS_FIELDS = ['pao2', 'paco2'] as const;

export type TrendGasUnit = Timepoint['gasUnit'];
export type TrendUnit = TrendGasUnit | 'pH' | '%' | 'cmH2O' | 'mL/cmH2O';

/** A plotted value in the unit it is plotted in. */
export interface TrendValue {
  readonly value: number;
  readonly unit: TrendUnit;
}

export interface TrendPointData {
  readonly timepoint: number;
  readonly label: string;
  readonly line: number;
  readonly minutes: number | null;
  readonly values: Partial<Record<TrendKey, TrendValue>>;
  readonly carried: TrendKey[];
}

/**
 * The points of a timepoint, kept per timepoint object and gas unit: a trend view refreshes after
 * every edit, and an edit keeps the timepoints it does not touch (they are immutable, and a change
 * of settings makes new ones), so only the changed timepoints are derived again — and all of them
 * the first time the note's gases go over to the other unit, which few edits do.
 */
const pointsByTimepoint: Readonly<Record<TrendGasUnit, WeakMap<Timepoint, TrendPointData>>> = { mmHg: new WeakMap(), kPa: new WeakMap() };

export function trendPoints(result: NoteResult): TrendPointData[] {
  return runSteps(trendPointSteps(result));
}

/**
 * `trendPoints` in steps (see util/steps.ts): yielding after every ITEMS_PER_STEP timepoints
 * derived afresh (a point kept from an earlier analysis costs nothing), and once after the gas
 * unit is worked out.
 */
export function* trendPointSteps(result: NoteResult): Steps<TrendPointData[]> {
  const { timeline } = result.analysis;
  const gasUnit = yield* trendGasUnitSteps(result);
  const kept = pointsByTimepoint[gasUnit];
  const timepoints = timeline.timepoints;
  const points: TrendPointData[] = [];
  let derived = 0;
  for (let i = 0; i < timepoints.length; i++) {
    const tp = timepoints[i]!;
    const known = kept.get(tp);
    if (known) { points.push(known); continue; }
    if (derived > 0 && derived % ITEMS_PER_STEP === 0) yield;
    derived++;
    const point = trendPoint(tp, result.analysis.derivation(i), gasUnit);
    kept.set(tp, point);
    points.push(point);
  }
  return points;
}

/**
 * The unit a trend gives gas pressures and P/F in: the unit the note writes its gases in. Each
 * PaO2 and PaCO2 the trend plots counts for the unit it was read in (the unit written after it,
 * else the gas unit in force: `units gas` or the gasUnit setting); the unit of most of them wins,
 * and a tie goes to the unit of the one written last. A note without a gas to plot gives the gas
 * unit in force at its last timepoint, or its header's. One unit for the whole note, so that one
 * axis holds every point.
 */
export function trendGasUnit(result: NoteResult): TrendGasUnit {
  return runSteps(trendGasUnitSteps(result));
}

/** `trendGasUnit` in steps, yielding after every ITEMS_PER_STEP timepoints (see util/steps.ts). */
function* trendGasUnitSteps(result: NoteResult): Steps<TrendGasUnit> {
  const { timepoints, headerGasUnit } = result.analysis.timeline;
  let kpa = 0;
  let mmhg = 0;
  let last: TrendGasUnit | null = null;
  for (let i = 0; i < timepoints.length; i++) {
    if (i > 0 && i % ITEMS_PER_STEP === 0) yield;
    const gases = gasesOf(timepoints[i]!);
    kpa += gases.kpa;
    mmhg += gases.mmhg;
    last = gases.last ?? last;
  }
  if (kpa !== mmhg) return kpa > mmhg ? 'kPa' : 'mmHg';
  return last ?? timepoints.at(-1)?.gasUnit ?? headerGasUnit;
}

/** The units a timepoint's plotted gas pressures were read in: how many in each, and the unit of the one written last. */
interface GasesRead {
  readonly kpa: number;
  readonly mmhg: number;
  readonly last: TrendGasUnit | null;
}

const NO_GASES: GasesRead = Object.freeze({ kpa: 0, mmhg: 0, last: null });

/** Kept per timepoint object, as the points are: a refresh after an edit reads only the changed timepoints again. */
const gasesByTimepoint = new WeakMap<Timepoint, GasesRead>();

function gasesOf(tp: Timepoint): GasesRead {
  const known = gasesByTimepoint.get(tp);
  if (known) return known;
  let kpa = 0;
  let mmhg = 0;
  let last: StatedValue | null = null;
  for (const id of GAS_FIELDS) {
    const v = tp.values.get(id);
    if (!v || plottedNumber(v.stated) === null) continue;
    const unit = v.stated.readUnit;
    if (unit === 'kPa') kpa++;
    else if (unit === 'mmHg') mmhg++;
    else continue;
    if (!last || v.stated.line > last.line || (v.stated.line === last.line && v.stated.item.span.start > last.item.span.start)) last = v.stated;
  }
  const gases: GasesRead = last ? { kpa, mmhg, last: last.readUnit === 'kPa' ? 'kPa' : 'mmHg' } : NO_GASES;
  gasesByTimepoint.set(tp, gases);
  return gases;
}

/** The number of a stated value a trend plots: usable, with a number; else null. */
function plottedNumber(s: StatedValue): number | null {
  return s.usable ? s.value : null;
}

function trendPoint(tp: Timepoint, derivation: TimepointDerivation, gasUnit: TrendGasUnit): TrendPointData {
  const values: Partial<Record<TrendKey, TrendValue>> = {};
  const carried: TrendKey[] = [];
  for (const id of TREND_FIELDS) {
    const v = tp.values.get(id);
    // Measurements are plotted where stated; settings (FiO2, PEEP) also where carried.
    const number = v ? plottedNumber(v.stated) : null;
    if (!v || number === null) continue;
    const shown = inTrendUnit(number, v.stated.unit, gasUnit);
    if (!shown) continue;
    values[id] = shown;
    if (v.origin.kind === 'carried' || v.origin.kind === 'header') carried.push(id);
  }
  for (const id of TREND_DERIVED) {
    // Only the plotted values are derived (see derivedValueOf).
    const d = derivedValueOf(derivation, id);
    if (!d) continue;
    const shown = inTrendUnit(d.value, d.unit, gasUnit);
    if (!shown) continue;
    values[id] = shown;
    if (d.usesCarried) carried.push(id);
  }
  return { timepoint: tp.index, label: tp.label, line: tp.line ?? tp.startLine, minutes: tp.time.minutes, values, carried };
}

/**
 * A value in the core's unit (`unit`: mmHg, a fraction, ...) as a trend plots it: a gas pressure
 * (and P/F, mmHg per fraction) in `gasUnit`, converted as hints and hovers convert it
 * (`kpaFromMmhg`, so that the numbers agree); a fraction as a percentage. Null for a unit a trend
 * does not plot.
 */
function inTrendUnit(value: number, unit: string | null, gasUnit: TrendGasUnit): TrendValue | null {
  switch (unit) {
    case 'mmHg': return gasUnit === 'kPa' ? { value: kpaFromMmhg(value), unit: 'kPa' } : { value, unit: 'mmHg' };
    case 'fraction': {
      const percent = percentFromFraction(value);
      return percent === null ? null : { value: percent, unit: '%' };
    }
    case '%sat': return { value, unit: '%' };
    case 'ph': return { value, unit: 'pH' };
    case 'cmH2O': return { value, unit: 'cmH2O' };
    case 'mL/cmH2O': return { value, unit: 'mL/cmH2O' };
    default: return null;
  }
}

/**
 * Key figures of the timepoint that holds a line, for a status bar, each with its unit:
 * `P/F 147 mmHg · pH 7.31 · PaCO2 47 mmHg · SpO2 91 % · ΔP 14 cmH2O`. Where the gas unit in force
 * is kPa, gas pressures are in kPa (PaCO2 as the note wrote it) and P/F gives mmHg in parentheses,
 * as the inlay hints do: `P/F 19.6 kPa (147) · pH 7.31 · PaCO2 6.3 kPa`. The tooltip spells each
 * figure out on a line of its own (kPa with mmHg), then the notable readings and the caution.
 */
export function timepointSummary(result: NoteResult, line: number): { label: string; text: string; tooltip: string } | null {
  const { timeline } = result.analysis;
  const tp = timeline.timepoints.find((t) => line >= t.startLine && line <= t.endLine);
  if (!tp) return null;
  const d = result.analysis.derivation(tp.index);
  // `parts`: the status bar's compact figures; `figures`: the same in full, a line each, for the tooltip.
  const parts: string[] = [];
  const figures: string[] = [];
  const kpa = showsKpa(tp);
  const pf = derivedValueOf(d, 'pf_ratio');
  if (pf) {
    parts.push(`P/F ${kpa ? kpaFirstCompact(pf.value, 0) : `${formatNumber(pf.value, 0)} mmHg`}`);
    figures.push(`P/F ${gasPressureText(pf.value, 0, kpa)}`);
  }
  const show = (id: string, name: string, decimals: number, unit = '') => {
    const v = tp.values.get(id);
    if (!v?.stated.usable || v.stated.value === null || v.origin.kind !== 'here') return;
    const inKpa = kpa ? statedInKpa(v.stated) : null;
    const mmHg = `${formatNumber(v.stated.value, decimals)}${unit}`;
    parts.push(`${name} ${inKpa ?? mmHg}`);
    figures.push(`${name} ${inKpa ? `${inKpa} (${mmHg})` : mmHg}`);
  };
  show('ph', 'pH', 2);
  show('paco2', 'PaCO2', 0, ' mmHg');
  show('pao2', 'PaO2', 0, ' mmHg');
  show('spo2', 'SpO2', 0, ' %');
  const dp = derivedValueOf(d, 'driving_pressure');
  if (dp) {
    parts.push(`ΔP ${formatNumber(dp.value, 0)} cmH2O`);
    figures.push(`Driving pressure ${formatNumber(dp.value, 0)} cmH2O`);
  }
  const readings = (d?.interpretations ?? []).filter((i) => i.notable).map((i) => i.text);
  return {
    label: tp.label,
    text: parts.length > 0 ? parts.join(' · ') : tp.label,
    tooltip: [`${tp.label}`, ...figures, ...readings, 'Decision support only — defer to local protocols and licensed practice.'].join('\n'),
  };
}
