/** Derived values, the change since the previous arterial gas, missing inputs and interpretations under a timepoint. */
import { changeUsesCarried, gasChangeText, type GasChange } from '../core/gas-change';
import type { Timepoint } from '../core/analysis/model';
import { besideCaveat, isGasPressureValue, type TimepointDerivation } from '../core/derive/model';
import { derivedDef, withheldByReason } from '../core/derive/registry';
import { hbSourceOf } from '../core/derive/oxygen-transport';
import { showsKpa } from '../core/present';
import { wordList } from '../core/util/format';
import { kpaText, numberText } from '../core/service/derived-hover';
import type { Paint } from './colour';
import type { Legend } from './render-legend';
import { visible } from './visible';

/**
 * Where the timepoint's gas unit is kPa, gas pressures in kPa first: `P/F 28.2 kPa (212 mmHg)`.
 * The short names and marks written are noted in `legend`, which explains them once at the end.
 */
export function renderDerived(tp: Timepoint, d: TimepointDerivation | undefined, p: Paint, legend: Legend, change: GasChange | null = null): string[] {
  if (!d) return [];
  const lines: string[] = [];
  const changeLine = () => {
    const text = gasChangeText(change);
    if (text === null) return;
    legend.mark('change');
    if (changeUsesCarried(change!)) legend.mark('carried');
    lines.push(`  ${p.green('change'.padEnd(8))} ${visible(text)}`);
  };
  const kpa = showsKpa(tp);
  const shown = d.derived.filter((v) => v.id !== 'barometric' || v.inputs[0]?.origin.kind !== 'default');
  if (shown.length > 0) {
    const parts = shown.map((v) => {
      const number = numberText(v);
      legend.value(v.id, kpa);
      // An estimate says so once: in its short name (`FiO2 est`) or by a mark after it.
      const estimateMark = v.estimate && !/\best\b/.test(v.short);
      if (estimateMark) legend.mark('estimate');
      if (v.usesCarried) legend.mark('carried');
      const marks = besideCaveat(`${estimateMark ? ' est.' : ''}${v.usesCarried ? '*' : ''}`, v);
      if (isGasPressureValue(v) && kpa) {
        return `${v.short} ${p.bold(kpaText(v))} kPa (${number} mmHg)${marks}`;
      }
      // The oxygen content says whose Hb it used (the gas line's, a labs line's).
      const hb = v.id === 'cao2' ? hbSourceOf(v, tp) : null;
      return `${v.short} ${p.bold(number)}${v.unit ? ` ${v.unit}` : ''}${marks}${hb ? ` (Hb of ${hb})` : ''}`;
    });
    lines.push(`  ${p.green('derived'.padEnd(8))} ${parts.join(p.dim(' · '))}`);
  }
  // The change since the previous arterial gas, under the derived values.
  changeLine();
  for (const m of d.missing) legend.value(m.id, kpa);
  // Values a finding withholds, named where they would have been, one line per reason.
  for (const n of d.notApplicable) if (n.withheldBy !== null) legend.value(n.id, kpa);
  const withheld = withheldByReason(d.notApplicable);
  for (const [why, names] of withheld) lines.push(`  ${p.yellow('withheld'.padEnd(8))} ${names.join(p.dim(' · '))}: ${why}`);
  // Values whose formula does not hold for the treatment in force, though their inputs are here: why.
  for (const n of d.notApplicable) {
    if (n.explained !== true || n.withheldBy !== null) continue;
    legend.value(n.id, kpa);
    lines.push(`  ${p.dim('n/a'.padEnd(8))} ${derivedDef(n.id)?.short ?? n.label}: ${n.reason}`);
  }
  for (const [needs, what] of groupMissing(d)) lines.push(`  ${p.dim('missing'.padEnd(8))} ${p.dim(`add ${needs} to get ${what.join(', ')}`)}`);
  for (const i of d.interpretations) lines.push(`  ${p.cyan('reading'.padEnd(8))} ${i.text}`);
  return lines;
}

/** Missing values grouped by what to add: one line per distinct need. */
export function groupMissing(d: TimepointDerivation): Map<string, string[]> {
  const groups = new Map<string, string[]>();
  for (const m of d.missing) {
    const key = wordList(m.needs);
    const list = groups.get(key) ?? [];
    list.push(m.message.slice(m.message.lastIndexOf(' to get ') + 8));
    groups.set(key, list);
  }
  return groups;
}
