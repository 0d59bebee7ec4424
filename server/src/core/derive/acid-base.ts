/** Derived values of acid–base balance. The interpretation itself lives in interpret.ts. */
import {
  ANION_GAP_UPPER_NORMAL_MMOL_L,
  SOURCES,
  acidBaseConsistency,
  anionGap,
  anionGapAlbuminCorrected,
  classifyAcidBase,
  deltaRatio,
  expectedHco3Respiratory,
  RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG,
  expectedPaco2MetabolicAcidosis,
  expectedPaco2MetabolicAlkalosis,
  hco3FromPhPco2,
  standardBaseExcess,
  type AcidBaseClassification,
} from '../physiology';
import { sideOf } from '../physiology/numeric';
import { GAS_KPA, GAS_MMHG } from './gas-words';
import { defineDerived, type DeriveContext, type Outcome, type Term } from './context';
import { decimalsAgainst, decimalsApart, formatNumber } from '../util/format';
import type { Kept } from '../util/small-store';

/** The fields `bicarbonate` reads, in its order (what to add where one written is not used). */
const BICARBONATES: readonly string[] = ['hco3_serum', 'hco3', 'hco3_venous'];

/**
 * The bicarbonate of the anion gap: the laboratory's when it gave one, else the arterial gas
 * analyser's, else a venous gas analyser's (the sodium and chloride of a venous gas come with a
 * bicarbonate of the same sample, and a laboratory's bicarbonate is venous too).
 */
function bicarbonate(c: DeriveContext): Term | null {
  return c.field('hco3_serum', 'HCO3') ?? c.field('hco3', 'HCO3') ?? c.field('hco3_venous', 'HCO3');
}

/**
 * A note for values that take a gas analyser's HCO3 (no laboratory bicarbonate is stated) when
 * that HCO3 does not fit the gas's pH and PCO2 (PN402): the value is worked out, but is only as
 * good as that HCO3. Checked directly, not through the classification, which itself reads the gap.
 */
function gasHco3Doubted(c: DeriveContext, hco3: Term): string[] {
  const venous = hco3.fieldId === 'hco3_venous';
  if (hco3.fieldId !== 'hco3' && !venous) return [];
  const ph = c.field(venous ? 'ph_venous' : 'ph');
  const pco2Id = venous ? 'pvco2' : 'paco2';
  const pco2 = c.field(pco2Id);
  if (!ph || !pco2) return [];
  const fit = acidBaseConsistency(ph.value, pco2.value, hco3.value, c.writtenResolutionMmhg(pco2Id));
  if (!fit || fit.consistent) return [];
  return [venous ? 'uses the venous HCO3, which does not fit the venous pH and PvCO2 (see PN402)' : 'uses the gas HCO3, which does not fit the pH and PaCO2 (see PN402)'];
}

/** The acid–base classification of this timepoint's arterial gas (computed once per timepoint). */
export function classification(c: DeriveContext): AcidBaseClassification | null {
  return c.memo(CLASSIFICATION);
}

const CLASSIFICATION: Kept<AcidBaseClassification | null, DeriveContext> = {
  name: 'acid-base classification',
  compute(c) {
    // Numbers only: the classification names no inputs.
    const ph = c.number('ph');
    const paco2 = c.number('paco2');
    const hco3 = c.number('hco3');
    if (ph === null || paco2 === null || hco3 === null) return null;
    // The anion gap needs a sodium and a chloride: without them (most gases) neither it nor its
    // correction for albumin is worked out for the classification (nor what each lacks).
    const gap = c.number('na') !== null && c.number('cl') !== null ? c.derivedValue('anion_gap_albumin_corrected') ?? c.derivedValue('anion_gap') : null;
    // The delta ratio takes the bicarbonate the gap was computed with (serum when the laboratory gave it).
    return classifyAcidBase({ ph, paco2Mmhg: paco2, hco3MmolL: hco3, anionGapMmolL: gap?.value, gapHco3MmolL: gap ? bicarbonate(c)?.value : undefined, paco2ResolutionMmhg: c.writtenResolutionMmhg('paco2') });
  },
};

/**
 * An expected compensation is worked out from the classification of the gas; when its pH, PaCO2
 * and HCO3 do not fit together (PN402, and the acid–base reading is held back), it would rest on
 * the same numbers, one of which is wrong: it is withheld with the reason.
 */
function withheldForInconsistentGas(cls: AcidBaseClassification): Outcome | null {
  if (cls.consistency.consistent) return null;
  return { kind: 'na', reason: `the pH, PaCO2 and HCO3 stated do not fit together (pH and PaCO2 give HCO3 ${formatNumber(cls.consistency.calculatedHco3MmolL, 1)} mmol/L; see PN402), so no compensation is worked out from them` };
}

/** Decimals (from `decimals`) that keep `observed` on its side of both ends of an expected range, as the reading shows them. */
function rangeDecimals(range: { readonly low: number; readonly high: number }, decimals: number, observed: number | undefined): number {
  if (observed === undefined) return decimals;
  return Math.max(decimalsAgainst(range.low, decimals, observed), decimalsAgainst(range.high, decimals, observed));
}

/**
 * The decimals of an expected PaCO2's ends, in mmHg and in kPa, that show the PaCO2 of the gas on
 * the side of the range the classification puts it (compared at the resolution a PaCO2 in kPa was
 * written with, `sideOf`), as the acid–base reading writes the range (`GasWords.range`): an end the
 * PaCO2 is on at that resolution is shown with the PaCO2's own decimals, not pushed apart from it.
 * Where the PaCO2 was written in kPa, its mmHg in brackets (the gas row of `show`) and the ends in
 * mmHg take decimals that keep them apart (`paco2ApartFromRange`): `2.89 kPa (21.7 mmHg)` beside
 * `21.8–25.8 mmHg`, not `(22 mmHg)` beside `22–26`.
 */
function paco2RangeDecimals(c: DeriveContext, r: { readonly low: number; readonly high: number }): { decimals: number; kpaDecimals: number; outwardEnd: 'low' | 'high' | undefined } | { decimals: number } {
  const paco2 = c.field('paco2')?.value;
  if (paco2 === undefined) return { decimals: 0 };
  const resolution = c.writtenResolutionMmhg('paco2');
  let decimals = GAS_MMHG.rangeDecimals(r.low, r.high, paco2, resolution);
  if (resolution > 0) decimals = Math.max(decimals, paco2ApartFromRange(paco2, resolution, r));
  return { decimals, kpaDecimals: GAS_KPA.rangeDecimals(r.low, r.high, paco2, resolution), outwardEnd: paco2OnEnd(paco2, resolution, r) };
}

/**
 * The end of an expected range that a PaCO2 written in kPa is on at the resolution it was written
 * with (`sideOf` gives 0), which the reading counts it within: its mmHg is shown rounded away from
 * the range's middle (`formatOutward`), since the PaCO2's own mmHg in brackets can be just beyond
 * it (4.7 kPa is 35.25 mmHg, on a low end of 35.55 mmHg: `(35 mmHg)` beside `35–40`, not `36–40`).
 * Undefined for a PaCO2 written in mmHg, which is on an end only where it equals it.
 */
export function paco2OnEnd(paco2: number, resolution: number, r: { readonly low: number; readonly high: number }): 'low' | 'high' | undefined {
  if (!(resolution > 0)) return undefined;
  if (sideOf(paco2, r.low, resolution) === 0) return 'low';
  if (sideOf(paco2, r.high, resolution) === 0) return 'high';
  return undefined;
}

/**
 * The decimals (from 0) at which a PaCO2 written in kPa (`paco2` in mmHg, `resolution` the mmHg its
 * kPa stands for either side) and the ends of an expected range `r` it is not on at that resolution
 * show, in mmHg, in the order they are in (`decimalsApart`). The derived range's ends and the gas
 * row of `show` (`gasAsReadingsShowIt`) both take at least these.
 */
export function paco2ApartFromRange(paco2: number, resolution: number, r: { readonly low: number; readonly high: number }): number {
  const low = sideOf(paco2, r.low, resolution) === 0 ? NaN : r.low;
  const high = sideOf(paco2, r.high, resolution) === 0 ? NaN : r.high;
  return Math.max(decimalsApart(paco2, 0, low), decimalsApart(paco2, 0, high));
}

export const hco3Calculated = defineDerived({
  id: 'hco3_calculated',
  label: 'HCO3 calculated from pH and PaCO2',
  short: 'HCO3 calc',
  unit: 'mmol/L',
  decimals: 1,
  category: 'acid-base',
  formula: '0.0307 × {PaCO2} × 10^({pH} − 6.1)',
  source: SOURCES['henderson-hasselbalch'],
  anchors: ['ph', 'paco2'],
  compute(c) {
    const ph = c.field('ph', 'pH');
    const paco2 = c.field('paco2', 'PaCO2');
    if (!ph || !paco2) return c.missing([ph, c.needFor('ph', 'ph')], [paco2, c.needFor('paco2', 'pco2')]);
    return c.value(hco3FromPhPco2(ph.value, paco2.value), [ph, paco2]);
  },
});

export const hco3Gap = defineDerived({
  id: 'hco3_gap',
  label: 'Reported minus calculated HCO3',
  short: 'HCO3 gap',
  unit: 'mmol/L',
  decimals: 1,
  category: 'acid-base',
  formula: '{HCO3} − {HCO3 calc}',
  source: `${SOURCES['henderson-hasselbalch']} ${SOURCES['pneumark-consistency-tolerance']}`,
  anchors: ['hco3'],
  compute(c) {
    const reported = c.field('hco3', 'HCO3');
    const calc = c.derived('hco3_calculated', 'HCO3 calc');
    if (!reported || !calc) return c.missing([calc, c.lacking('hco3_calculated')]);
    return c.value(reported.value - calc.value, [reported, calc]);
  },
});

export const anionGapDef = defineDerived({
  id: 'anion_gap',
  label: 'Anion gap',
  short: 'AG',
  unit: 'mmol/L',
  decimals: 0,
  category: 'acid-base',
  formula: '{Na} − ({Cl} + {HCO3})',
  source: SOURCES['anion-gap'],
  anchors: ['na', 'cl'],
  compute(c) {
    const na = c.field('na', 'Na');
    const cl = c.field('cl', 'Cl');
    const hco3 = bicarbonate(c);
    if (!na || !cl || !hco3) return c.missing([na, c.needFor('na', 'na')], [cl, c.needFor('cl', 'cl')], [hco3, c.needFor(BICARBONATES, 'hco3')]);
    return c.value(anionGap(na.value, cl.value, hco3.value), [na, cl, hco3], { notes: ['without potassium', ...gasHco3Doubted(c, hco3)] });
  },
});

export const anionGapCorrected = defineDerived({
  id: 'anion_gap_albumin_corrected',
  label: 'Anion gap corrected for albumin',
  short: 'AG corr',
  unit: 'mmol/L',
  decimals: 0,
  category: 'acid-base',
  formula: '{AG} + 2.5 × (4.0 − {albumin})',
  source: SOURCES['figge-1998'],
  anchors: ['albumin'],
  compute(c) {
    const ag = c.derived('anion_gap', 'AG');
    const albumin = c.field('albumin', 'albumin');
    if (!ag || !albumin) return c.missing([ag, c.lacking('anion_gap')], [albumin, c.needFor('albumin', 'albumin')]);
    return c.value(anionGapAlbuminCorrected(ag.value, albumin.value), [ag, albumin]);
  },
});

export const deltaRatioDef = defineDerived({
  id: 'delta_ratio',
  label: 'Delta ratio',
  short: 'Δ ratio',
  unit: '',
  // Two decimals: its bands end at 0.4, 0.8 and 2, and 2.03 shown as 2.0 would read as the wrong band.
  decimals: 2,
  category: 'acid-base',
  formula: '({AG} − 12) ÷ (24 − {HCO3})',
  source: SOURCES['rastegar-2007'],
  anchors: ['na', 'cl'],
  compute(c) {
    const ag = c.derived('anion_gap_albumin_corrected', 'AG') ?? c.derived('anion_gap', 'AG');
    const hco3 = bicarbonate(c);
    if (!ag || !hco3) return c.missing([ag, c.lacking('anion_gap')], [hco3, c.needFor(BICARBONATES, 'hco3')]);
    if (hco3.value >= 24) return { kind: 'na', reason: 'HCO3 is not below 24 mmol/L' };
    // Compared as the classification compares it: a gap of 12 on paper is 12, however it was summed.
    if (sideOf(ag.value, ANION_GAP_UPPER_NORMAL_MMOL_L) <= 0) return { kind: 'na', reason: 'the anion gap is not raised' };
    const notes = gasHco3Doubted(c, hco3);
    return c.value(deltaRatio(ag.value, hco3.value), [ag, hco3], notes.length > 0 ? { notes } : undefined);
  },
});

export const paco2Expected = defineDerived({
  id: 'paco2_expected',
  label: 'Expected PaCO2 for the metabolic disorder',
  short: 'PaCO2 expected',
  unit: 'mmHg',
  decimals: 0,
  category: 'acid-base',
  // Both forms, as the table in grammar/README.md gives them; a value names the one it used.
  formula: '1.5 × {HCO3} + 8 ± 2 (acidosis) | 40 + 0.7 × ({HCO3} − 24) ± 2 (alkalosis)',
  source: `Acidosis: ${SOURCES['winters-1967']} Alkalosis: ${SOURCES['berend-2014']}`,
  anchors: ['ph', 'hco3'],
  compute(c) {
    const cls = classification(c);
    const hco3 = c.field('hco3', 'HCO3');
    if (!cls || !hco3) return c.missing([hco3, c.needFor('hco3', 'hco3')]);
    const withheld = withheldForInconsistentGas(cls);
    if (withheld) return withheld;
    if (cls.primary === 'metabolic-acidosis') {
      const r = expectedPaco2MetabolicAcidosis(hco3.value);
      return r ? c.value(r.centre, [hco3], { range: r, formula: '1.5 × {HCO3} + 8 ± 2', notes: ["Winters' formula"], ...paco2RangeDecimals(c, r) }) : c.value(null, []);
    }
    if (cls.primary === 'metabolic-alkalosis') {
      const r = expectedPaco2MetabolicAlkalosis(hco3.value);
      return r ? c.value(r.centre, [hco3], { range: r, formula: '40 + 0.7 × ({HCO3} − 24) ± 2', ...paco2RangeDecimals(c, r) }) : c.value(null, []);
    }
    return { kind: 'na', reason: 'the primary disorder is not metabolic' };
  },
});

/**
 * The formula of one expected HCO3 with the coefficient its PaCO2 takes (up per 10 mmHg above
 * 40, down per 10 mmHg below it: `expectedHco3Respiratory`), so that the formula with the numbers
 * put in holds numbers only (`24 + 1 × (49 − 40) ÷ 10 ± 2`), not both branches of the template.
 */
function respiratoryFormula(k: readonly [number, number]): string {
  const coefficient = k[0] === k[1] ? `${k[0]}` : `(${k[0]}…${k[1]})`;
  return `24 + ${coefficient} × ({PaCO2} − 40) ÷ 10 ± 2`;
}
const RESPIRATORY_FORMULAS = {
  acute: { above: respiratoryFormula(RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG.acuteAcidosis), below: respiratoryFormula(RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG.acuteAlkalosis) },
  chronic: { above: respiratoryFormula(RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG.chronicAcidosis), below: respiratoryFormula(RESPIRATORY_HCO3_COEFFICIENTS_PER_10_MMHG.chronicAlkalosis) },
} as const;

function respiratoryExpected(chronicity: 'acute' | 'chronic') {
  return defineDerived({
    id: `hco3_expected_${chronicity}`,
    label: `Expected HCO3 if the respiratory disorder is ${chronicity}`,
    short: `HCO3 expected (${chronicity})`,
    unit: 'mmol/L',
    decimals: 0,
    category: 'acid-base',
    // HCO3 moves with PaCO2 (up above 40 mmHg, down below it), so each coefficient is positive: a
    // `−2` for alkalosis would turn 24 + (−2) × (27 − 40) ÷ 10 into 26.6, where HCO3 falls to 21.4.
    // The formula of a PaCO2 above 40 mmHg (a respiratory acidosis), and that of one below it.
    formula: RESPIRATORY_FORMULAS[chronicity].above,
    otherFormulas: [RESPIRATORY_FORMULAS[chronicity].below],
    source: `${SOURCES['narins-emmett-1980']} ${SOURCES['adrogue-madias-2010']}`,
    anchors: ['ph', 'paco2'],
    compute(c) {
      const cls = classification(c);
      const paco2 = c.field('paco2', 'PaCO2');
      if (!cls || !paco2) return c.missing([paco2, c.needFor('paco2', 'pco2')]);
      const withheld = withheldForInconsistentGas(cls);
      if (withheld) return withheld;
      if (cls.primary !== 'respiratory-acidosis' && cls.primary !== 'respiratory-alkalosis') return { kind: 'na', reason: 'the primary disorder is not respiratory' };
      // Over the PaCO2s a value written in kPa stands for, as the classification reads it.
      const r = expectedHco3Respiratory(paco2.value, chronicity, c.writtenResolutionMmhg('paco2'));
      const formula = paco2.value >= 40 ? RESPIRATORY_FORMULAS[chronicity].above : RESPIRATORY_FORMULAS[chronicity].below;
      return r ? c.value((r.low + r.high) / 2, [paco2], { range: r, formula, notes: ['span of published coefficients, ± 2 mmol/L'], decimals: rangeDecimals(r, 0, c.field('hco3')?.value) }) : c.value(null, []);
    },
  });
}

export const hco3ExpectedAcute = respiratoryExpected('acute');
export const hco3ExpectedChronic = respiratoryExpected('chronic');

/**
 * The standard base excess of the arterial gas stated here, from its pH and HCO3. Reported where
 * an arterial HCO3 is stated; no inlay hint (the acid–base hints are the anion gap's).
 * Source: `van-slyke-sbe`.
 */
export const standardBaseExcessDef = defineDerived({
  id: 'sbe',
  label: 'Standard base excess, from pH and HCO3',
  short: 'SBE calc',
  unit: 'mmol/L',
  decimals: 1,
  category: 'acid-base',
  formula: '{HCO3} − 24.8 + 16.2 × ({pH} − 7.40)',
  source: SOURCES['van-slyke-sbe'],
  anchors: ['hco3'],
  compute(c) {
    const hco3 = c.field('hco3', 'HCO3');
    const ph = c.field('ph', 'pH');
    if (!hco3 || !ph) return c.missing([ph, c.needFor('ph', 'ph')], [hco3, c.needFor('hco3', 'hco3')]);
    const notes = gasHco3Doubted(c, hco3);
    return c.value(standardBaseExcess(ph.value, hco3.value), [hco3, ph], notes.length > 0 ? { notes } : undefined);
  },
});

/**
 * The standard base excess of the venous gas stated here, from its own pH and HCO3 (never an
 * arterial pH with a venous HCO3). Reported where a venous HCO3 is stated. Source: `van-slyke-sbe`.
 */
export const standardBaseExcessVenousDef = defineDerived({
  id: 'sbe_venous',
  label: 'Standard base excess of the venous gas, from its pH and HCO3',
  short: 'SBE(v) calc',
  unit: 'mmol/L',
  decimals: 1,
  category: 'acid-base',
  formula: '{HCO3(v)} − 24.8 + 16.2 × ({pH(v)} − 7.40)',
  source: SOURCES['van-slyke-sbe'],
  anchors: ['hco3_venous'],
  compute(c) {
    const hco3 = c.field('hco3_venous', 'HCO3(v)');
    const ph = c.field('ph_venous', 'pH(v)');
    if (!hco3 || !ph) return c.missing([ph, c.needFor('ph_venous', 'ph')], [hco3, c.needFor('hco3_venous', 'hco3')]);
    const notes = gasHco3Doubted(c, hco3);
    return c.value(standardBaseExcess(ph.value, hco3.value), [hco3, ph], notes.length > 0 ? { notes } : undefined);
  },
});
