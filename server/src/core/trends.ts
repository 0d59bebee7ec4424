/**
 * Series over time for a trend view and a status line: per timepoint, the stated and derived
 * values worth plotting, and which of them used a carried-forward input.
 */
import type { Timepoint } from './analysis/model';
import type { NoteResult } from './check-note';
import type { TimepointDerivation } from './derive/model';
import { derivedValueOf } from './derive/registry';
import { kpaFirstCompact, showsKpa, statedInKpa } from './present';
import { formatNumber } from './util/format';

export const TREND_FIELDS = ['pao2', 'paco2', 'ph', 'spo2', 'fio2', 'peep'] as const;
export const TREND_DERIVED = ['pf_ratio', 'driving_pressure', 'compliance_static'] as const;
export type TrendKey = (typeof TREND_FIELDS)[number] | (typeof TREND_DERIVED)[number];

export interface TrendPointData {
  readonly timepoint: number;
  readonly label: string;
  readonly line: number;
  readonly minutes: number | null;
  readonly values: Partial<Record<TrendKey, number>>;
  readonly carried: TrendKey[];
}

/**
 * The points of a timepoint, kept per timepoint object: a trend view refreshes after every edit,
 * and an edit keeps the timepoints it does not touch (they are immutable, and a change of
 * settings makes new ones), so only the changed timepoints are derived again.
 */
const pointsByTimepoint = new WeakMap<Timepoint, TrendPointData>();

export function trendPoints(result: NoteResult): TrendPointData[] {
  const { timeline } = result.analysis;
  return timeline.timepoints.map((tp, i) => {
    const known = pointsByTimepoint.get(tp);
    if (known) return known;
    const point = trendPoint(tp, result.analysis.derivation(i));
    pointsByTimepoint.set(tp, point);
    return point;
  });
}

function trendPoint(tp: Timepoint, derivation: TimepointDerivation): TrendPointData {
  const values: Partial<Record<TrendKey, number>> = {};
  const carried: TrendKey[] = [];
  for (const id of TREND_FIELDS) {
    const v = tp.values.get(id);
    // Measurements are plotted where stated; settings (FiO2, PEEP) also where carried.
    if (!v || !v.stated.usable || v.stated.value === null) continue;
    values[id] = v.stated.value;
    if (v.origin.kind === 'carried' || v.origin.kind === 'header') carried.push(id);
  }
  for (const id of TREND_DERIVED) {
    // Only the plotted values are derived (see derivedValueOf).
    const d = derivedValueOf(derivation, id);
    if (!d) continue;
    values[id] = d.value;
    if (d.usesCarried) carried.push(id);
  }
  return { timepoint: tp.index, label: tp.label, line: tp.line ?? tp.startLine, minutes: tp.time.minutes, values, carried };
}

/**
 * Key figures of the timepoint that holds a line, for a status bar: `P/F 147 · pH 7.31 · PaCO2 47`.
 * Where the gas unit in force is kPa, gas pressures say their unit, in kPa (PaCO2 as the note wrote
 * it), and P/F gives mmHg in parentheses: `P/F 19.6 kPa (147) · pH 7.31 · PaCO2 6.3 kPa`.
 */
export function timepointSummary(result: NoteResult, line: number): { label: string; text: string; tooltip: string } | null {
  const { timeline } = result.analysis;
  const tp = timeline.timepoints.find((t) => line >= t.startLine && line <= t.endLine);
  if (!tp) return null;
  const d = result.analysis.derivation(tp.index);
  const parts: string[] = [];
  const kpa = showsKpa(tp);
  const pf = derivedValueOf(d, 'pf_ratio');
  if (pf) parts.push(`P/F ${kpa ? kpaFirstCompact(pf.value, 0) : formatNumber(pf.value, 0)}`);
  const show = (id: string, name: string, decimals: number, unit = '') => {
    const v = tp.values.get(id);
    if (!v?.stated.usable || v.stated.value === null || v.origin.kind !== 'here') return;
    const inKpa = kpa ? statedInKpa(v.stated) : null;
    parts.push(inKpa ? `${name} ${inKpa}` : `${name} ${formatNumber(v.stated.value, decimals)}${unit}`);
  };
  show('ph', 'pH', 2);
  show('paco2', 'PaCO2', 0);
  show('pao2', 'PaO2', 0);
  show('spo2', 'SpO2', 0, '%');
  const dp = derivedValueOf(d, 'driving_pressure');
  if (dp) parts.push(`ΔP ${formatNumber(dp.value, 0)}`);
  const readings = (d?.interpretations ?? []).filter((i) => i.notable).map((i) => i.text);
  return {
    label: tp.label,
    text: parts.length > 0 ? parts.join(' · ') : tp.label,
    tooltip: [`${tp.label}`, ...readings, 'Decision support only — defer to local protocols and licensed practice.'].join('\n'),
  };
}
