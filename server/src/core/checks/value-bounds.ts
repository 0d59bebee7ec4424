/**
 * Impossible and unusual values: every stated number against its field's hard and soft
 * bounds (field registry). Saturations above 100 % and FiO2 outside 0.21–1.0 have checks
 * of their own and are left to them.
 */
import { childUsualBounds, isChildAge, softBoundsAt, unitsWithin, within, withinAsWritten } from '../analysis/bounds';
import type { StatedValue } from '../analysis/model';
import { PER_KG_PBW } from '../analysis/per-kg-volume';
import type { Bounds, FieldDef } from '../fields/registry';
import { displayUnit, isReversedRange, isSaturationFraction, unitInSentence } from '../analysis/read-value';
import { decimalsFor, readUnitName, writtenDecimals } from '../present';
import { convert, unitById, type UnitDef } from '../fields/units';
import { toRange } from '../syntax/tree';
import { formatAgainst, formatNumber, formatShort } from '../util/format';
import { derivedValueOf } from '../derive/registry';
import { defineCheck, type CheckContext, type CheckDef, type TimepointContext } from './check';
import { inHfov } from './oscillation';
import type { Fix } from '../types';

const OWN_CHECKS = new Set(['fio2']);
const SATURATIONS = new Set(['spo2', 'sao2', 'svo2']);

/**
 * Runs a per-value test over the header (note scope) and over each timepoint's stated values
 * (timepoint scope, with the barometric pressure in force there when the test reads it).
 */
function valueCheck(test: (ctx: CheckContext, stated: StatedValue, barometricMmhg: number | null, at: TimepointContext | null) => void, readsPressure = true): Pick<CheckDef, 'run' | 'runTimepoint'> {
  return {
    run(ctx) {
      for (const stated of ctx.analysis.timeline.header) test(ctx, stated, null, null);
    },
    runTimepoint(ctx) {
      // Read once: a number read from an object for each call would be boxed for each call. A
      // test that does not read it is passed null: no boxed number per check and timepoint.
      const barometricMmhg = readsPressure ? ctx.timepoint.barometricMmhg : null;
      for (const stated of ctx.timepoint.stated) test(ctx, stated, barometricMmhg, ctx);
    },
  };
}

/**
 * The usual bounds of a stated value: its field's soft bounds at the barometric pressure in force,
 * and for a tidal volume at a timepoint, at the patient's body size there (see `softBoundsAt`); for
 * a patient under ADULT_FROM_YEARS (`ageYears`, the age in force), a child's (`childUsualBounds`).
 */
function usualBounds(field: FieldDef, barometricMmhg: number | null, at: TimepointContext | null, ageYears: number | null = null): Bounds | undefined {
  const bodyKg = field.id === 'vt' && at !== null ? bodySizeKg(at) : null;
  const adult = softBoundsAt(field, barometricMmhg, bodyKg);
  // A child's: the adult usual minimum of a body size, the inspiratory flow and a tidal volume with
  // no body size in force is no child's (`childUsualBounds`).
  const bounds = isChildAge(ageYears) ? childUsualBounds(field, adult, bodyKg, ageYears!) : adult;
  // High-frequency oscillation moves 1–3 mL/kg a breath, below any usual minimum of conventional
  // breaths (common practice, no source): there a tidal volume keeps only its usual maximum.
  if (field.id === 'vt' && at !== null && bounds?.min !== undefined && inHfov(at)) {
    return bounds.max === undefined ? {} : { max: bounds.max };
  }
  // An oscillator's rate is its frequency, 3–15 Hz, far above any rate of conventional breaths.
  if (field.id === 'vent_rate' && at !== null && inHfov(at)) return HFOV_USUAL_RATE_PER_MIN;
  return bounds;
}

/**
 * The age in force (years; the header's at note scope; null: none), as the timeline read the lines
 * with it (`Timepoint.ageYears`, `Timeline.headerAgeYears`): under ADULT_FROM_YEARS the usual
 * minimum of height and weight, an adult's (120 cm, 25 kg), is not applied, and a height's is the
 * floor of the age (`childHeightMinCm`); the inspiratory flow's is a child's, and a tidal volume with no body size
 * in force has none (`childUsualBounds`); the usual maximum still is.
 */
function ageAt(ctx: CheckContext, at: TimepointContext | null): number | null {
  return at !== null ? at.timepoint.ageYears : ctx.analysis.timeline.headerAgeYears;
}

/**
 * The usual set rate in HFOV, /min: an oscillation frequency of 3 to 15 Hz (180–900 /min; 3 to 10 Hz
 * in adults read, December 2026: see the `vent_rate` field's bounds source; up to 15 Hz in infants from
 * memory), in place of the usual maximum of 60 /min of conventional breaths.
 */
export const HFOV_USUAL_RATE_PER_MIN: Bounds = { min: 180, max: 900 };

const HZ = unitById('Hz')!;
const PER_MIN = unitById('/min')!;


/**
 * For an unusual set rate: in HFOV, a number written bare or in /min that is a usual frequency
 * in Hz (`rate 5`, meant as 5 Hz) is offered Hz; outside HFOV, a rate written in Hz is said to be
 * usual there (the mode may be missing or mistyped). `slip` says whether the number may be a rate
 * of breaths written in Hz by a slip (`rate 14 Hz`, meant as 14 /min): only a whole number, as
 * conventional rates are set in whole breaths a minute (common practice, no source); `rate 1.004 Hz`
 * is a frequency, and 1.004 /min no rate of breaths.
 */
function rateHint(s: StatedValue, at: TimepointContext | null): { text: string; fix: Fix | null; slip?: boolean } | null {
  if (s.fieldId !== 'vent_rate' || at === null) return null;
  const written = s.item.number;
  const value = s.item.value;
  if (inHfov(at)) {
    const inHz = written === null ? null : convert(written, HZ, PER_MIN);
    if (s.readUnit !== '/min' || inHz === null || !value || !within(inHz, HFOV_USUAL_RATE_PER_MIN)) return null;
    const unitToken = s.item.unit;
    const edit = unitToken ? { range: toRange(s.line, unitToken.span), newText: 'Hz' } : { range: toRange(s.line, { start: value.span.end, end: value.span.end }), newText: ' Hz' };
    return { text: ` In HFOV the rate is a frequency: ${value.text} Hz would be usual.`, fix: { title: `Write ${value.text} Hz`, edits: [edit] } };
  }
  if (s.readUnit !== 'Hz') return null;
  const mode = at.timepoint.values.wordOf('mode');
  return { text: ` A rate in Hz is usual in HFOV; the mode in force here is ${mode === null ? 'not stated' : mode}.`, fix: null, slip: written !== null && Number.isInteger(written) };
}

/**
 * The body size a tidal volume is measured against: the smaller of the weight and the predicted
 * body weight in force (the smaller gives the lower usual minimum, so an obese patient's weight
 * does not make a lung-protective volume unusual); null when neither is known.
 */
function bodySizeKg(at: TimepointContext): number | null {
  const weight = at.timepoint.values.numberOf('weight');
  const pbw = derivedValueOf(at.derivation, 'predicted_body_weight')?.value ?? null;
  // Without a list of the two: asked for every tidal volume stated.
  const w = weight !== null && weight > 0 ? weight : null;
  const p = pbw !== null && pbw > 0 ? pbw : null;
  return w === null ? p : p === null ? w : Math.min(w, p);
}

/**
 * The unit a value was read in, as a message writes it after a number: ` mmHg`, ` /min`, ` mbar`
 * where the note wrote mbar for hPa (`readUnitName`); none for pH or a fraction.
 */
function unitSuffix(field: FieldDef, s: StatedValue): string {
  return suffixIn(readUnitOf(field, s), s);
}

/** `suffixOf`, with the read unit named as the note wrote it (`readUnitName`). */
function suffixIn(unit: UnitDef | undefined, s: StatedValue): string {
  return unit !== undefined && unit.id === s.readUnit && unit.id !== 'fraction' && unit.id !== 'ph' ? ` ${readUnitName(s)}` : suffixOf(unit);
}

/** A unit as a message writes it after a number: ` mmHg`; none for pH or a fraction. */
function suffixOf(unit: UnitDef | undefined): string {
  return unit && unit.id !== 'fraction' && unit.id !== 'ph' ? ` ${displayUnit(unit.id)}` : '';
}

function readUnitOf(field: FieldDef, s: StatedValue): UnitDef | undefined {
  return unitById(s.readUnit ?? field.unit ?? '') ?? unitById(field.unit ?? '');
}

/** `Sodium 250 mmol/L`: the value as written, with the unit it was read in (written or implied). */
function asWritten(field: FieldDef, s: StatedValue): string {
  return `${field.label} ${s.item.value?.text ?? ''}${unitSuffix(field, s)}`;
}

/**
 * The bounds in the unit the value was read in (`0 Hz to 20 Hz`); with `canonicalToo`, followed by
 * the same in the field's own unit where that differs (`at most 1 Hz, or 60 /min`).
 */
function describe(bounds: Bounds, field: FieldDef, s: StatedValue, canonicalToo = false): string {
  const unit = readUnitOf(field, s);
  const canonical = unitById(field.unit ?? '');
  const shown = describeIn(bounds, field, s, unit, canonical);
  if (!canonicalToo || !canonical || unit === canonical) return shown;
  const other = describeIn(bounds, field, s, canonical, canonical);
  const lead = shown.startsWith('at most ') ? 'at most ' : shown.startsWith('at least ') ? 'at least ' : '';
  return `${shown}, or ${other.slice(lead.length)}`;
}

function describeIn(bounds: Bounds, field: FieldDef, s: StatedValue, unit: UnitDef | undefined, canonical: UnitDef | undefined): string {
  const inRead = (v: number) => (unit && canonical ? convert(v, canonical, unit) : v) ?? v;
  const suffix = suffixIn(unit, s);
  // The value as written, so that each bound keeps it on its side: a height of 47.1 in is not
  // "usually 47 in to 87 in" when the bound is 47.24 in (120 cm).
  const first = inRead(s.value ?? s.parts?.[0] ?? NaN);
  const second = s.parts && s.parts.length > 1 ? inRead(s.parts[1]!) : NaN;
  const decimals = boundDecimals(field, unit, canonical);
  const show = (v: number) => {
    const bound = inRead(v);
    const text = formatAgainst(bound, decimals.places, first, second);
    return `${decimals.trim ? String(Number(text)) : text}${suffix}`;
  };
  if (bounds.min !== undefined && bounds.max !== undefined) return `${show(bounds.min)} to ${show(bounds.max)}`;
  if (bounds.min !== undefined) return `at least ${show(bounds.min)}`;
  return `at most ${show(bounds.max ?? 0)}`;
}

/**
 * The decimals of a bound shown in the unit the value was read in. In the field's own unit, the
 * field's; in kPa, g/L, C or F, those the values are shown with elsewhere (`2.0 kPa`, `30 g/L`);
 * in a coarser unit, as many as keep the field's resolution, trailing zeros left off (1200 mL is
 * `1.2 L`, not `1 L`; 10 L/min is `0.17 L/s`, not `0 L/s`). Hz is such a coarser unit here too:
 * a frequency has no customary tenth, and the bounds of a rate in /min are whole numbers of Hz or
 * sixtieths of one (`20 Hz`, `3 Hz to 15 Hz`, `at most 1 Hz`; never `20.0 Hz`).
 */
function boundDecimals(field: FieldDef, unit: UnitDef | undefined, canonical: UnitDef | undefined): { places: number; trim: boolean } {
  if (!unit || !canonical || unit === canonical) return { places: field.decimals, trim: false };
  const known = unit === HZ ? -1 : decimalsFor(unit.id, -1);
  if (known >= 0) return { places: known, trim: false };
  const step = convert(10 ** -field.decimals, canonical, unit);
  if (step === null || !(step > 0)) return { places: field.decimals, trim: false };
  const places = Math.max(0, Math.ceil(-Math.log10(step) - 1e-9));
  // A unit as fine as the field's own (mEq/L for mmol/L) keeps the field's decimals as written.
  return places > field.decimals ? { places, trim: true } : { places: field.decimals, trim: false };
}

/** Whether any number of the value lies outside the bounds (a loop: this runs for every stated value). */
function outOfBounds(s: StatedValue, bounds: Bounds | undefined): boolean {
  if (s.value !== null) return !within(s.value, bounds);
  if (s.parts) for (const v of s.parts) if (!within(v, bounds)) return true;
  return false;
}

function noneNegative(s: StatedValue): boolean {
  if (s.value !== null) return s.value >= 0;
  if (s.parts) for (const v of s.parts) if (v < 0) return false;
  return true;
}

export const impossibleValue = defineCheck({
  code: 'PN301',
  alias: 'impossible-value',
  title: 'Impossible value',
  severity: 'error',
  tags: ['plausibility'],
  doc: {
    fires: 'A value lies outside the hard bounds of its field: physically or physiologically impossible; or a range (an SpO2 target) has its ends reversed or equal (`target 92-88`), which a range cannot have. The value is not used in any calculation.',
    example: 'abg ph 8.4',
    fix: 'Check the transcription and the unit. Where the number is ordinary in the field\'s other unit (`temp 98.6 C`, `pco2 56 kPa`), a quick fix writes that unit; a unit in which it would be possible but unusual is not offered (`altitude 25000 m`: 25,000 ft is 7,620 m, above the usual 5,100 m). A reversed range is offered its ends swapped (`target 88-92`). The bounds of each field and their sources are listed in grammar/README.md.',
  },
  source: 'field registry bounds; each field names its source (mostly common practice, no source); a child\'s height against the WHO Child Growth Standards 2006, the WHO growth reference for school-aged children and adolescents 2007 and INTERGROWTH-21st very preterm size at birth 2016 (read in their reproductions, physiology/growth.ts)',
  ...valueCheck((ctx, stated, barometricMmhg, at) => {
    const field = stated.field;
    // Most values are within bounds: asked first, the rest only of the few that are not.
    if (!field.hard || !outOfBounds(stated, field.hard)) {
      if (field.join === 'dash' && stated.readUnit !== null && isReversedRange(stated.parts)) reportReversedRange(ctx, stated);
      return;
    }
    if (OWN_CHECKS.has(field.id) || stated.readUnit === null || stated.readUnit === PER_KG_PBW || stated.unitDoubt) return;
    if (SATURATIONS.has(field.id) && noneNegative(stated)) return;
    const fix = otherUnitFix(field, stated, usualBounds(field, barometricMmhg, at));
    ctx.report({
      range: toRange(stated.line, stated.item.value?.span ?? stated.item.span),
      message: `${asWritten(field, stated)} is impossible (expected ${describe(field.hard, field, stated)}); it is not used in calculations.${fix ? ` In ${unitInSentence(fix.unit)} it would be ordinary.` : ''}`,
      ...(fix ? { fixes: [fix.fix] } : {}),
    });
  }),
});

/**
 * A range (`target 92-88`) whose ends are reversed or equal, within its field's bounds: impossible as
 * written, and not used; reversed ends are offered swapped.
 */
function reportReversedRange(ctx: CheckContext, stated: StatedValue): void {
  const value = stated.item.value;
  if (value?.kind !== 'pair') return;
  const [low, high] = value.parts;
  const equal = stated.parts![0] === stated.parts![1];
  const range = toRange(stated.line, value.span);
  ctx.report({
    range,
    message: `${asWritten(stated.field, stated)} is impossible as written: a range gives its lower end first, below its upper end; it is not used in calculations.`,
    ...(!equal && low && high ? { fixes: [{ title: `Swap to ${high.text}-${low.text}`, edits: [{ range, newText: `${high.text}-${low.text}` }] }] } : {}),
  });
}

/**
 * For a number written with a unit that makes it impossible (`temp 98.6 C`, `pco2 56 kPa`): the
 * field's other unit in which the same number is ordinary (within the hard and the `usual` bounds,
 * not merely possible: `vt 5 L` is not offered mL, as 5 mL is no usual tidal volume), and a fix
 * that writes that unit instead. Null when there is none, or more than one (the writer must
 * choose), or the value is a pair or had no unit written (PN204 covers bare numbers), or the field
 * has no usual bounds (what is usual in the other unit is then unknown, and merely possible is not
 * enough: every field with more than one unit has them, tests/core/registry.test.ts).
 */
function otherUnitFix(field: FieldDef, s: StatedValue, usual: Bounds | undefined): { unit: string; fix: Fix } | null {
  const unitToken = s.item.unit;
  const written = s.item.number;
  if (!unitToken || written === null || s.unitImplied || usual === undefined) return null;
  const fitting = unitsWithin(field, written, s.readUnit, field.hard, usual);
  if (fitting.length !== 1) return null;
  const unit = displayUnit(fitting[0]!.id);
  return { unit, fix: { title: `Write ${unit} instead of ${unitToken.text}`, edits: [{ range: toRange(s.line, unitToken.span), newText: unit }] } };
}

export const unusualValue = defineCheck({
  code: 'PN302',
  alias: 'unusual-value',
  title: 'Unusual value',
  severity: 'warning',
  tags: ['plausibility'],
  doc: {
    fires: 'A value is possible but outside the usual (soft) bounds of its field: worth a second look at the unit or the transcription. Low arterial gas pressures are not flagged where the barometric pressure is below 500 mmHg, since they are real at extreme altitude. A tidal volume is usual from 2 mL per kg of body size (the smaller of the weight and the predicted body weight in force), or from 50 mL where the note gives neither; in HFOV, which moves 1–3 mL/kg a breath, it has no usual minimum. In HFOV the set rate is the oscillation frequency, usual from 3 to 15 Hz (180–900 /min) rather than at most 60 /min: a number written bare or in /min that is such a frequency in Hz (`rate 5`) is reported with `Hz` offered; a rate written in Hz in another mode is reported where it is above 60 /min (1 Hz), with its usual maximum in both units and a word that Hz is usual in HFOV, and /min offered where the number is a whole one usual in /min (`rate 14 Hz` in VC; not `rate 1.004 Hz`, a frequency, as rates of breaths are set in whole breaths a minute). A number written in another unit than its field\'s own is compared at the precision written: `pco2 20.0 kPa` is 150.01 mmHg, yet to a tenth of a kPa it is the usual maximum of 150 mmHg, and is not reported. A saturation written as a fraction with no unit (`spo2 0.94`) is reported with the percentage offered, and is not used until it is rewritten. The usual minimum of height and weight is an adult\'s: it is not applied to a patient under 18 years (the age in force), whose usual maximum still is; for such a patient the inspiratory flow is usual from 2 L/min (an infant is given 4–10 L/min) rather than from an adult\'s 10 L/min, and a tidal volume has no usual minimum where the note gives no body size; a height is usual from a floor that rises with age, far below the shortest real child\'s: 24 cm until 16 weeks after birth (a girl born at 24 weeks is 24.0 cm at −3 SD, INTERGROWTH-21st), then the −3 SD of the shorter sex at the age corrected for a birth 16 weeks early (in full until a corrected age of 3 years, then less and less, to none at about 4 years 4 months), less 10 cm: in the first year the girls\' length-for-age in the WHO Child Growth Standards (46 cm at 8 months, 49 cm at 10 months, 52 cm at a year), after it the height-for-age by whole year, straight between them, in those standards to 4 years and in the WHO 2007 reference from 5, the girls\' but the boys\' at 10 to 13 years (63 cm at 2 years, 71 cm at 3, 84 cm at 5, 108 cm at 10, 117 cm at 12), and never above an adult\'s 120 cm, which it reaches at about 12 years 4 months, so it does not drop at 18. A child\'s height below it is reported with a word that a disorder of growth can make it real; from a year on a bare height below it is still read in cm. An SpO2 target with an end that is not a whole number (`target 88.5-92`) is reported too: targets are prescribed in whole percents, as oximeters show SpO2 (common practice, no source); it is used as written.',
    example: 'vitals hr 236',
    fix: 'Confirm the value; if it is right, the warning can stay (or the check can be switched off in settings). Where the number is usual in the field\'s other unit (`vt 0.45 mL`, meant as L), a quick fix writes that unit. An SpO2 target with a decimal end is offered its ends rounded to whole percents (`target 89-92`), where they stay in order.',
  },
  source: 'field registry bounds; each field names its source (mostly common practice, no source); a child\'s height against the WHO Child Growth Standards 2006, the WHO growth reference for school-aged children and adolescents 2007 and INTERGROWTH-21st very preterm size at birth 2016 (read in their reproductions, physiology/growth.ts); an SpO2 target in whole percents, common practice, no source',
  ...valueCheck((ctx, stated, barometricMmhg, at) => {
    const field = stated.field;
    // Most values are within the usual bounds, which a low barometric pressure only widens: asked
    // first. A tidal volume's usual minimum follows the body size, which may raise it, and a set
    // rate's the mode (HFOV): asked on. A child's height floor is never above an adult's
    // (`childHeightMinCm`, capped at 120 cm), so a height within an adult's bounds is within a child's.
    // A range (an SpO2 target) has no usual bounds; an end that is no whole number is unusual for it.
    if (field.join === 'dash') {
      reportRangeDecimals(ctx, stated);
      return;
    }
    if (!field.soft || (!outOfBounds(stated, field.soft) && field.id !== 'vt' && field.id !== 'vent_rate')) return;
    if (stated.value !== null && stated.item.number !== null && isSaturationFraction(field, stated.item.number, stated.item)) {
      const written = stated.item.value!;
      const percent = formatNumber(stated.item.number * 100, Math.max(0, writtenDecimals(written.text) - 2));
      const span = written.span;
      ctx.report({
        range: toRange(stated.line, span),
        message: `${field.short ?? field.label} ${written.text} reads as ${written.text} %, far below any measured saturation: a fraction for ${percent} %? It is not used in calculations until it is written as a percentage.`,
        fixes: [{ title: `Write \`${percent}\``, edits: [{ range: toRange(stated.line, span), newText: percent }], preferred: true }],
      });
      return;
    }
    // A tidal volume per kg of PBW has bounds of its own (PN325).
    if (OWN_CHECKS.has(field.id) || !stated.usable || stated.readUnit === null || stated.readUnit === PER_KG_PBW || stated.unitDoubt) return;
    if (field.hard && outOfBounds(stated, field.hard)) return;
    const ageYears = ageAt(ctx, at);
    const soft = usualBounds(field, barometricMmhg, at, ageYears);
    // A number written in another unit is compared at the precision written: 20.0 kPa is PaCO2's usual 150 mmHg.
    if (!outOfBounds(stated, soft) || (stated.value !== null && withinAsWritten(stated.value, soft, field, stated.readUnit, stated.item.number === null ? null : stated.item.value?.text ?? null))) return;
    // A unit written in which the number is usual (`vt 0.45 mL`, meant as L) is offered, not preferred:
    // the value is possible as written.
    // A set rate under HFOV is offered Hz (its hint says why); one in Hz under another mode is
    // told that Hz belongs to HFOV, and offered /min where the number is usual there.
    const hint = rateHint(stated, at);
    const other = hint?.fix ? { unit: 'Hz', fix: hint.fix } : hint?.slip === false ? null : otherUnitFix(field, stated, soft);
    // The number with the other unit, as it would be written (`As \`45 in\``): a unit's symbol alone
    // can read as a word of the sentence (`In in it would be usual`).
    const written = stated.item.value?.kind === 'number' ? `${stated.item.value.text} ` : '';
    const otherText = hint?.fix ? '' : other ? ` As \`${written}${other.unit}\` it would be usual.` : '';
    ctx.report({
      range: toRange(stated.line, stated.item.value?.span ?? stated.item.span),
      // pH has no unit to check.
      // A rate in Hz outside HFOV has its usual bound in /min too, the unit such a rate is set in.
      message: `${asWritten(field, stated)} is unusual (usually ${describe(soft ?? {}, field, stated, hint !== null && hint.fix === null)}): check ${unitSuffix(field, stated) ? 'the unit and ' : ''}the transcription.${hint?.text ?? ''}${otherText}${shortForAge(stated, soft, ageYears)}`,
      ...(other ? { fixes: [other.fix] } : {}),
    });
  }),
});

/**
 * A range whose ends are not both whole numbers (`target 88.5-92`): an SpO2 target is prescribed
 * in whole percents, as an oximeter shows SpO2 (common practice, no source), so a decimal end is
 * more likely a slip than meant. A warning, not an error: the range is read and used as written
 * (an SpO2 of 88 % is below 88.5–92 %), so no SpO2 goes unchecked for it. The range with its ends
 * rounded to the nearest whole number (a half up) is offered, where that keeps the lower end below
 * the upper (`91.6-92.4` would be 92-92: nothing offered). A range not used (reversed, or out of
 * bounds: PN301) is left to PN301.
 */
function reportRangeDecimals(ctx: CheckContext, stated: StatedValue): void {
  const parts = stated.parts;
  const value = stated.item.value;
  if (!stated.usable || parts === null || parts.length !== 2 || value?.kind !== 'pair') return;
  const [low, high] = parts as [number, number];
  if (Number.isInteger(low) && Number.isInteger(high)) return;
  const lowWhole = Math.round(low);
  const highWhole = Math.round(high);
  const rounded = `${lowWhole}-${highWhole}`;
  const range = toRange(stated.line, value.span);
  const offered = lowWhole < highWhole;
  ctx.report({
    range,
    message: `${asWritten(stated.field, stated)} is not written in whole percents, as SpO2 targets are prescribed and oximeters show SpO2; it is used as written (${formatShort(low)}–${formatShort(high)} %). Check the transcription${offered ? `: rounded, it is ${rounded}` : ''}.`,
    ...(offered ? { fixes: [{ title: `Write \`${rounded}\``, edits: [{ range, newText: rounded }] }] } : {}),
  });
}

/**
 * For a child's height below the floor of the age (`childHeightMinCm`, far below the shortest
 * girls of that age in the WHO references): that a disorder of growth can make it real, so that
 * the finding asks for a check, not a correction. Empty for anything else.
 */
function shortForAge(stated: StatedValue, usual: Bounds | undefined, ageYears: number | null): string {
  if (stated.fieldId !== 'height' || !isChildAge(ageYears) || usual?.min === undefined || stated.value === null || stated.value >= usual.min) return '';
  return ' A disorder of growth can make so short a height real at this age.';
}

export const saturationAbove100 = defineCheck({
  code: 'PN306',
  alias: 'saturation-above-100',
  title: 'Saturation above 100 %',
  severity: 'error',
  tags: ['plausibility'],
  doc: {
    fires: 'An oxygen saturation (SpO2, SaO2, SvO2) is above 100 %.',
    example: 'vitals spo2 104',
    fix: 'Correct the transcription; a saturation cannot exceed 100 %.',
  },
  source: 'definition of saturation (a fraction of haemoglobin), no source needed',
  ...valueCheck((ctx, stated) => {
    if (stated.value === null || stated.value <= 100 || !SATURATIONS.has(stated.fieldId)) return;
    ctx.report({
      range: toRange(stated.line, stated.item.value?.span ?? stated.item.span),
      message: `${stated.field.label} ${stated.item.value?.text ?? ''} % is above 100 %, which is impossible.`,
    });
  }, false),
});

export const fio2OutOfRange = defineCheck({
  code: 'PN307',
  alias: 'fio2-out-of-range',
  title: 'FiO2 outside 0.21–1.0',
  severity: 'error',
  tags: ['plausibility', 'units'],
  doc: {
    fires: 'An FiO2 is below 0.21 (21 %) or above 1.0 (100 %). A bare number up to 1 is read as a fraction, above 1 as a percentage, so `fio2 4` reads as 4 %.',
    example: 'oxygen mask, fio2 4',
    fix: 'Write a fraction (0.4) or a percentage (40 %). For a flow, use the device flow (`oxygen cannula 4 L/min`).',
  },
  source: 'common practice, no source: air is 0.21 and pure oxygen 1.0',
  ...valueCheck((ctx, stated) => {
    if (stated.fieldId !== 'fio2' || stated.value === null) return;
    if (stated.value >= 0.21 - 1e-9 && stated.value <= 1 + 1e-9) return;
    ctx.report({
      range: toRange(stated.line, stated.item.value?.span ?? stated.item.span),
      message: `${fio2AsRead(stated)} is ${fio2Limit(stated)}; it is not used in calculations.`,
    });
  }, false),
});

/**
 * `FiO2 0.2`, `FiO2 40 %`, or for a bare number read as a percentage `FiO2 4 (read as 4 %)`: the
 * reading of a bare number is the likeliest surprise behind this finding.
 */
function fio2AsRead(s: StatedValue): string {
  const written = s.item.value?.text ?? '';
  if (s.readUnit !== '%') return `FiO2 ${written}`;
  return s.unitImplied ? `FiO2 ${written} (read as ${written} %)` : `FiO2 ${written} %`;
}

/** The limit crossed, in the unit the value was read in: a percentage is compared with 21 % and 100 %. */
function fio2Limit(s: StatedValue): string {
  const percent = s.readUnit === '%';
  if ((s.value ?? 0) < 0.21) return percent ? 'below 21 % (room air)' : 'below 0.21 (room air)';
  return percent ? 'above 100 % (pure oxygen)' : 'above 1.0 (pure oxygen)';
}
