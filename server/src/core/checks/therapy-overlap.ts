/**
 * An oxygen line and a vent line at one timepoint. Each ends the other's therapy (format rule):
 * the later line is in force, and the settings of the earlier one are neither used there nor
 * carried. A note that says so in silence leaves the writer asking for an FiO2 they wrote
 * (`oxygen mask, fio2 0.5` then `vent mode VC, …` asks for the FiO2 on the vent line).
 */
import type { StatedValue } from '../analysis/model';
import { formatStated, shortOf } from '../present';
import { toRange, type LineNode } from '../syntax/tree';
import { wordList } from '../util/format';
import { defineCheck } from './check';

type Therapy = 'oxygen' | 'vent';

const OTHER: Readonly<Record<Therapy, Therapy>> = { oxygen: 'vent', vent: 'oxygen' };

/**
 * A setting the line holds: values measured on the ventilator (a plateau; under NIV or CPAP, a tidal
 * volume on a vent line of readings) are not settings, and belong to their timepoint only.
 */
function isSetting(s: StatedValue): boolean {
  return (s.section === 'oxygen' || s.section === 'vent') && !s.hereOnly;
}

/** `device (mask) and FiO2 0.50`: the settings of one line, as a message names them. */
function settingsText(stated: readonly StatedValue[]): string {
  return wordList(stated.map((s) => (s.fieldId === 'device' ? `device (${formatStated(s)})` : `${shortOf(s.fieldId)} ${formatStated(s)}`)));
}

function sectionSpan(node: LineNode | undefined): { start: number; end: number } {
  return node?.kind === 'section' ? node.sectionToken.span : { start: 0, end: node?.text.length ?? 0 };
}

export const therapyOverlap = defineCheck({
  code: 'PN311',
  alias: 'oxygen-and-vent-together',
  title: 'Oxygen line and vent line at one timepoint',
  severity: 'warning',
  tags: ['timeline'],
  doc: {
    fires: 'One timepoint holds an oxygen line and a vent line. Each ends the other\'s therapy, so the later line is in force there and the settings of the earlier one are not used (nor carried to later timepoints). The earlier line is reported, with the later one as related information. A vent line of measured values only (`vent plateau 24`; under NIV or CPAP also an exhaled tidal volume, `vent vt 480, peak 16`) holds no settings: it is never reported, and it ends no oxygen line.',
    example: '@ 08:00\noxygen mask, fio2 0.5\nvent mode VC, vt 450 mL, rate 14, peep 5',
    fix: 'If the therapy changed during this timepoint, give the change a timepoint of its own (a new `@` line). If the FiO2 belongs to the ventilator, write it on the vent line and remove the oxygen line.',
  },
  source: 'format rule (grammar/README.md: an oxygen line ends ventilation, a vent line with a setting ends oxygen-line therapy)',
  runTimepoint(ctx) {
    const stated = ctx.timepoint.stated;
    // The last line of each therapy at this timepoint that ends the other: a vent line of readings
    // only (`vent peak 15`) starts no ventilation, and ends no oxygen line.
    let lastOxygen = -1;
    let lastVent = -1;
    for (const s of stated) {
      if (!isSetting(s)) continue;
      if (s.section === 'oxygen') lastOxygen = Math.max(lastOxygen, s.line);
      else lastVent = Math.max(lastVent, s.line);
    }
    if (lastOxygen < 0 || lastVent < 0) return;
    const lines = ctx.analysis.tree.lines;
    const reported = new Set<number>();
    for (const s of stated) {
      if (!isSetting(s) || reported.has(s.line)) continue;
      const therapy = s.section as Therapy;
      const ender = therapy === 'oxygen' ? lastVent : lastOxygen;
      if (ender < s.line) continue;
      reported.add(s.line);
      const lost = stated.filter((t) => t.line === s.line && isSetting(t));
      const other = OTHER[therapy];
      const hint = therapy === 'oxygen' && lost.some((t) => t.fieldId === 'fio2')
        ? ' If the FiO2 is the ventilator\'s, write it on the vent line.'
        : '';
      ctx.report({
        range: toRange(s.line, sectionSpan(lines[s.line])),
        message: `This ${therapy} line is ended by the ${other} line below it (line ${ender + 1}) at the same timepoint, so its ${settingsText(lost)} ${lost.length === 1 ? 'is' : 'are'} neither used at this timepoint nor carried. If the therapy changed during this timepoint, give the change a timepoint of its own.${hint}`,
        related: [{ range: toRange(ender, sectionSpan(lines[ender])), message: `this ${other} line ends the ${therapy} line above it` }],
      });
    }
  },
});
