/** Derived values, missing inputs and interpretations under a timepoint. */
import type { Timepoint } from '../core/analysis/model';
import { withheldText, type TimepointDerivation } from '../core/derive/model';
import { derivedDef } from '../core/derive/registry';
import { showsKpa } from '../core/present';
import { wordList } from '../core/util/format';
import { kpaText, numberText } from '../core/service/derived-hover';
import type { Paint } from './colour';

/** Where the timepoint's gas unit is kPa, gas pressures in kPa first: `P/F 28.2 kPa (212 mmHg)`. */
export function renderDerived(tp: Timepoint, d: TimepointDerivation | undefined, p: Paint): string[] {
  if (!d) return [];
  const lines: string[] = [];
  const kpa = showsKpa(tp);
  const shown = d.derived.filter((v) => v.id !== 'barometric' || v.inputs[0]?.origin.kind !== 'default');
  if (shown.length > 0) {
    const parts = shown.map((v) => {
      const number = numberText(v);
      // An estimate says so once: in its short name (`FiO2 est`) or by a mark after it.
      const marks = `${v.estimate && !/\best\b/.test(v.short) ? ' est.' : ''}${v.usesCarried ? '*' : ''}`;
      if (v.unit === 'mmHg' && kpa) {
        return `${v.short} ${p.bold(kpaText(v))} kPa (${number} mmHg)${marks}`;
      }
      return `${v.short} ${p.bold(number)}${v.unit ? ` ${v.unit}` : ''}${marks}`;
    });
    lines.push(`  ${p.green('derived'.padEnd(8))} ${parts.join(p.dim(' · '))}`);
    if (shown.some((v) => v.usesCarried)) lines.push(`  ${' '.repeat(8)} ${p.dim('* uses a value carried from an earlier timepoint')}`);
  }
  // Values a finding withholds, named where they would have been, one line per reason.
  const withheld = new Map<string, string[]>();
  for (const n of d.notApplicable) {
    if (n.withheldBy === null) continue;
    const why = withheldText(n);
    const name = derivedDef(n.id)?.short ?? n.label;
    const list = withheld.get(why);
    if (list) list.push(name);
    else withheld.set(why, [name]);
  }
  for (const [why, names] of withheld) lines.push(`  ${p.yellow('withheld'.padEnd(8))} ${names.join(p.dim(' · '))}: ${why}`);
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
