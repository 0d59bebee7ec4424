/**
 * A haemoglobin written without its unit in a note that writes haemoglobin in mmol/L elsewhere
 * (`labs hb 8.4 mmol/L`, later `labs hb 8.1`). A bare Hb is read in g/dL, the default; where the
 * note's laboratory reports mmol/L, 8.1 is more likely 8.1 mmol/L (13.1 g/dL) than a fall to
 * 8.1 g/dL. The value is read as written (g/dL), and the finding says so with both readings.
 */
import type { StatedValue, Timepoint } from '../analysis/model';
import { displayUnit } from '../analysis/read-value';
import { convert, HB_MMOL_PER_L, unitById } from '../fields/units';
import { within } from '../analysis/bounds';
import { rangeBetween, toRange } from '../syntax/tree';
import { formatNumber } from '../util/format';
import { defineCheck } from './check';

/**
 * Whether a timepoint states an Hb, asked of its values in force (a lookup in the fields it
 * measures) rather than by reading every value it states: most timepoints state none, and the
 * check runs over the whole note. An Hb is a measurement (its sections measure), in force only
 * where it is stated, so one is stated exactly where the value in force is from here.
 */
function statesHb(tp: Timepoint): boolean {
  return tp.values.originOf('hb') === 'here';
}

const HB_MMOL = unitById(HB_MMOL_PER_L)!;
const G_PER_DL = unitById('g/dL')!;

export const bareHbBesideMmolCheck = defineCheck({
  code: 'PN319',
  alias: 'bare-hb-in-mmol-note',
  title: 'Hb without a unit in a note that writes Hb in mmol/L',
  severity: 'warning',
  tags: ['units', 'plausibility'],
  doc: {
    fires: 'A haemoglobin is written without a unit (`labs hb 8.1`) in a note that writes haemoglobin in mmol/L elsewhere (`labs hb 8.4 mmol/L`), and the number would be an ordinary Hb in mmol/L too. A bare Hb is read in g/dL, so 8.1 is taken as 8.1 g/dL, where the note\'s laboratory may have meant 8.1 mmol/L (13.1 g/dL).',
    example: '@ 08:00\nlabs hb 8.4 mmol/L\n@ 12:00\nlabs hb 8.1',
    fix: 'Write the unit the laboratory reported: `labs hb 8.1 mmol/L`, or `labs hb 8.1 g/dL` if it is g/dL. The quick fixes add either.',
  },
  source: 'haemoglobin is reported in g/dL, g/L or mmol/L (subunit basis, 1 mmol/L = 1.61145 g/dL: the factor 0.62063 mmol/L per g/dL read in its table 1 at pmc.ncbi.nlm.nih.gov/articles/PMC3934467, the molar mass 16,114.5 g/mol a quarter of the tetramer\'s 64,458, read in the oxygen delivery model of Bretherick and Baillie, baillielab/oxygen_delivery) by different laboratories; reading a number in another lab\'s unit is a transcription error (common practice, no source)',
  run(ctx) {
    const timepoints = ctx.analysis.timeline.timepoints;
    // The first Hb written in mmol/L; most notes have none, and then nothing more is looked at.
    let inMmol: StatedValue | null = null;
    for (let t = 0; t < timepoints.length && inMmol === null; t++) {
      if (!statesHb(timepoints[t]!)) continue;
      const stated = timepoints[t]!.stated;
      for (let i = 0; i < stated.length; i++) {
        const s = stated[i]!;
        if (s.fieldId === 'hb' && s.readUnit === HB_MMOL_PER_L && !s.unitImplied) { inMmol = s; break; }
      }
    }
    if (inMmol === null) return;
    const soft = inMmol.field.soft;
    for (let t = 0; t < timepoints.length; t++) {
      if (!statesHb(timepoints[t]!)) continue;
      const stated = timepoints[t]!.stated;
      for (let i = 0; i < stated.length; i++) {
        const s = stated[i]!;
        if (s.fieldId !== 'hb' || !s.unitImplied || s.unitDoubt !== null || s.readUnit !== 'g/dL' || s.value === null) continue;
        const value = s.item.value;
        if (!value || value.kind !== 'number') continue;
        const written = s.item.number;
        const asMmol = written === null ? null : convert(written, HB_MMOL, G_PER_DL);
        // Only where the number is an ordinary Hb in mmol/L too: otherwise there is nothing to mistake.
        if (asMmol === null || !within(asMmol, soft)) continue;
        const at = rangeBetween(s.line, value.span.end, s.line, value.span.end);
        ctx.report({
          range: toRange(s.line, s.item.span),
          message: `Hb ${value.text} has no unit and is read as ${formatNumber(s.value, 1)} g/dL, but this note writes Hb in mmol/L (line ${inMmol.line + 1}), where it would be ${formatNumber(asMmol, 1)} g/dL. Write the unit.`,
          fixes: [
            { title: `Mark as ${displayUnit(HB_MMOL_PER_L)}`, edits: [{ range: at, newText: ` ${displayUnit(HB_MMOL_PER_L)}` }] },
            { title: 'Mark as g/dL', edits: [{ range: at, newText: ' g/dL' }] },
          ],
          related: [{ range: toRange(inMmol.line, inMmol.item.span), message: 'Hb written in mmol/L' }],
        });
      }
    }
  },
});
