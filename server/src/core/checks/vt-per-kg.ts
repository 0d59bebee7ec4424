/**
 * A tidal volume written per kg of predicted body weight (`vt 6 mL/kg`): the timeline reads it in mL
 * from the PBW in force (analysis/per-kg-volume.ts). This check says why one was not read (no height
 * or sex, a child, an impossible number: `vt 450 mL/kg`, a volume in mL?) and when one read is below
 * the lung-protective range (above it is PN403's, from the VT/PBW derived from it).
 */
import { fieldById } from '../fields/registry';
import { SOURCES } from '../physiology';
import { PER_KG_ADULT_FROM_YEARS, PER_KG_PBW, pbwFrom, VT_PER_KG_HARD_MAX, VT_PER_KG_USUAL } from '../analysis/per-kg-volume';
import type { StatedValue } from '../analysis/model';
import { toRange } from '../syntax/tree';
import { formatAgeYears, formatShort } from '../util/format';
import { defineCheck, type TimepointContext } from './check';
import { inHfov } from './oscillation';
import type { Fix } from '../types';

/** The largest tidal volume in mL the field takes (its hard maximum in the field registry): a per-kg number above it is no volume in mL either. */
const VT_HARD_MAX_ML = fieldById('vt')?.hard?.max ?? Infinity;

export const tidalVolumePerKg = defineCheck({
  code: 'PN325',
  alias: 'tidal-volume-per-kg',
  title: 'Tidal volume per kg of predicted body weight not read or unusual',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: `A tidal volume is written per kg of predicted body weight (\`vt 6 mL/kg\`) and is not read in mL: the patient values in force where it is written give no PBW (no height or no sex on a patient line, an age below ${PER_KG_ADULT_FROM_YEARS} years, for which the ARDS Network equation was not made, or a height it gives no weight for), or the number is impossible per kg (0 or less, above ${VT_PER_KG_HARD_MAX} mL/kg: \`vt 450 mL/kg\` is likely a volume in mL). Such a value is shown as written and not used in calculations. Also where one read in mL is below the lung-protective ${VT_PER_KG_USUAL.min}–${VT_PER_KG_USUAL.max} mL/kg (not in HFOV, which moves 1–3 mL/kg a breath); above ${VT_PER_KG_USUAL.max} mL/kg PN403 reports it (not under NIV or CPAP).`,
    example: 'patient sex female\n@ 08:00\nvent mode VC, vt 6 mL/kg, rate 16',
    fix: 'Add the height and sex on a patient line (before the vent line), or write the tidal volume in mL. For an impossible number, a quick fix writes `mL` where the number is a possible tidal volume in mL. Nothing is invented: no height or sex is offered.',
  },
  source: `${SOURCES['ardsnet-2000']} The ${VT_PER_KG_HARD_MAX} mL/kg hard bound, twice the largest of the traditional tidal volumes of 10 to 15 mL per kg that its abstract gives, is common practice, no source`,
  runTimepoint(ctx) {
    const stated = ctx.timepoint.stated;
    for (let i = 0; i < stated.length; i++) {
      const s = stated[i]!;
      if (s.readUnit === PER_KG_PBW && s.fieldId === 'vt') visit(ctx, s);
    }
  },
});

function visit(ctx: TimepointContext, s: StatedValue): void {
  const perKg = s.item.number;
  const value = s.item.value;
  if (perKg === null || !value) return;
  const range = toRange(s.line, value.span);
  const written = `Tidal volume ${value.text} mL/kg`;
  if (s.usable) {
    if (perKg >= VT_PER_KG_USUAL.min || inHfov(ctx)) return;
    ctx.report({ range, message: `${written} of predicted body weight is below the lung-protective ${VT_PER_KG_USUAL.min}–${VT_PER_KG_USUAL.max} mL/kg: check the transcription.` });
    return;
  }
  if (!(perKg > 0) || perKg > VT_PER_KG_HARD_MAX) {
    const unit = s.item.unit;
    const asMl = perKg > VT_PER_KG_HARD_MAX && perKg <= VT_HARD_MAX_ML && unit !== null;
    const fixes: Fix[] = asMl ? [{ title: `Write ${value.text} mL`, edits: [{ range: toRange(s.line, unit.span), newText: 'mL' }] }] : [];
    const bound = perKg > 0 ? `at most ${VT_PER_KG_HARD_MAX} mL/kg` : 'above 0 mL/kg';
    ctx.report({
      range,
      message: `${written} is impossible per kg of predicted body weight (${bound})${asMl ? `: a volume in mL (${value.text} mL)?` : '.'} It is not used in calculations.`,
      ...(fixes.length > 0 ? { fixes } : {}),
    });
    return;
  }
  ctx.report({ range, message: `${written} is per kg of predicted body weight, which ${missingPbw(ctx)}; it is not used in calculations until then (or write it in mL).` });
}

/** What keeps the predicted body weight from being worked out, as the end of a sentence. */
function missingPbw(ctx: TimepointContext): string {
  const values = ctx.timepoint.values;
  const height = values.numberOf('height');
  const sex = values.wordOf('sex');
  const age = values.numberOf('age');
  const lacking: string[] = [];
  if (height === null) lacking.push('height');
  if (sex !== 'male' && sex !== 'female') lacking.push('sex');
  if (lacking.length > 0) return `needs the ${lacking.join(' and ')} on a patient line`;
  if (age !== null && age < PER_KG_ADULT_FROM_YEARS) {
    return `is not worked out at age ${formatAgeYears(age)} y: the ARDS Network equation is for adults (${PER_KG_ADULT_FROM_YEARS} years or more)`;
  }
  if (pbwFrom(height, sex, age) === null) return `the ARDS Network equation does not give for a height of ${formatShort(height!, 0)} cm`;
  return 'needs the height and sex stated before the vent line';
}

