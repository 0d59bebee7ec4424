/** Derived values of gas exchange: alveolar PO2, A–a gradient, oxygenation ratios and indices. */
import {
  OSI_MAX_SPO2_PERCENT,
  SOURCES,
  aaGradient,
  aaGradientUpperNormal,
  alveolarPo2FullSigned,
  alveolarPo2SimplifiedSigned,
  fullFormExcessMmhg,
  arterialAlveolarRatio,
  arterialEndTidalCo2Difference,
  oxygenSaturationIndex,
  oxygenationIndex,
  pfRatio,
  pfRatioAltitudeAdjusted,
  BERLIN_ADJUSTED_ABOVE_M,
  barometricFromAltitudeWest,
  roxIndex,
  sfRatio,
} from '../physiology';
import { ADULT_FROM_YEARS, defineDerived, withDecimals, type DeriveContext, type Outcome, type Term, type ValueExtras } from './context';
import { decimalsAgainst, formatAgeYears, formatNumber, formatShort } from '../util/format';
import { SEA_LEVEL_MMHG, pressureFitsAltitude } from './atmosphere';
import type { Settings } from '../settings';
import { ABOVE_INSPIRED_BECAUSE } from './model';
import { roxAtHour } from './high-flow';

/** PaO2 above alveolar PO2 by more than this (mmHg) is impossible rather than rounding. */
export const ALVEOLAR_ROUNDING_MMHG = 5;

/**
 * Whether a PaO2 is above the alveolar PO2 by more than rounding: impossible (PN401), so nothing is
 * read from it. `allowanceMmhg` (`simplifiedFormAllowance`) lifts the alveolar PO2 shown to what the
 * full alveolar gas equation gives, where the one shown is the simplified form's.
 */
export function isAboveAlveolar(pao2Mmhg: number, alveolarMmhg: number, allowanceMmhg = 0): boolean {
  return pao2Mmhg > alveolarMmhg + allowanceMmhg + ALVEOLAR_ROUNDING_MMHG;
}

/**
 * How much higher (mmHg) the full alveolar gas equation puts the alveolar PO2 than the one shown:
 * 0 under the full form (setting), else PaCO2 × FiO2 × (1/R − 1). The simplified form reads low on
 * a high FiO2 (by 25 mmHg on FiO2 1.0 with PaCO2 100), so a PaO2 is called impossible only above
 * the full form's alveolar PO2, the higher of the two. Source: `alveolar-gas-equation`.
 */
export function simplifiedFormAllowance(settings: Settings, fio2: number | null, paco2Mmhg: number | null): number {
  if (settings.alveolarEquation === 'full' || fio2 === null || paco2Mmhg === null) return 0;
  return fullFormExcessMmhg(fio2, paco2Mmhg, settings.respiratoryQuotient) ?? 0;
}

/** `simplifiedFormAllowance` at a timepoint being derived. */
export function allowanceAt(c: DeriveContext): number {
  if (c.settings.alveolarEquation === 'full') return 0;
  return simplifiedFormAllowance(c.settings, c.fio2()?.value ?? null, c.number('paco2'));
}

/** A value read from a PaO2 above the alveolar PO2 (PN401) is withheld, as the A–a gradient and the readings are. */
const ABOVE_ALVEOLAR: Outcome = { kind: 'na', reason: 'PaO2 is above the alveolar PO2 (see PN401)', withheldBy: 'PN401' };
/** The same where no alveolar PO2 is worked out (no usable PaCO2) and the PaO2 is above the inspired PO2. */
const ABOVE_INSPIRED: Outcome = { kind: 'na', reason: ABOVE_INSPIRED_BECAUSE, withheldBy: 'PN401' };

/**
 * Whether a PaO2 is above the inspired PO2 by more than rounding, where no alveolar PO2 is worked
 * out (no usable PaCO2): the alveolar PO2 is the inspired PO2 less a PaCO2 term that is never
 * negative, by either form of the alveolar gas equation, so such a PaO2 cannot be either (PN401).
 * Source: `alveolar-gas-equation`.
 */
export function isAboveInspiredAt(c: DeriveContext, pao2Mmhg: number): boolean {
  if (c.derivedValue('pao2_alveolar') !== null) return false;
  const pi = c.derivedValue('pio2');
  return pi !== null && isAboveAlveolar(pao2Mmhg, pi.value);
}

/**
 * `ABOVE_ALVEOLAR` when the PaO2 in force is above the alveolar PO2 the FiO2, pressure and PaCO2
 * allow (by more than rounding; always where the alveolar PO2 comes out negative), and
 * `ABOVE_INSPIRED` when, with no alveolar PO2 worked out, it is above the inspired PO2; else null:
 * whatever is computed from that PaO2 (P/F, a/A, the oxygenation index, CaO2) would rest on a value
 * that cannot be.
 */
export function pao2Withheld(c: DeriveContext, pa: Term): Outcome | null {
  const pA = c.derivedValue('pao2_alveolar');
  if (pA === null) return isAboveInspiredAt(c, pa.value) ? ABOVE_INSPIRED : null;
  return isAboveAlveolar(pa.value, pA.value, allowanceAt(c)) ? ABOVE_ALVEOLAR : null;
}

export const pao2Alveolar = defineDerived({
  id: 'pao2_alveolar',
  label: 'Alveolar PO2',
  short: 'PAO2',
  unit: 'mmHg',
  decimals: 0,
  category: 'oxygenation',
  formula: '{PiO2} − {PaCO2} ÷ {RQ}',
  source: SOURCES['alveolar-gas-equation'],
  anchors: ['pao2', 'paco2'],
  compute(c) {
    const pio2 = c.derived('pio2', 'PiO2');
    const paco2 = c.field('paco2', 'PaCO2');
    if (!pio2 || !paco2) return c.missing([pio2, c.lacking('pio2')], [paco2, c.needFor('paco2', 'pco2')]);
    const rq = rqTerm(c.settings.respiratoryQuotient);
    if (c.settings.alveolarEquation === 'full') {
      const fio2 = c.fio2();
      if (!fio2) return c.missing([fio2, c.fio2Need()]);
      const full = alveolarPo2FullSigned(fio2.value, pio2.value, paco2.value, rq.value);
      return c.value(full, [pio2, paco2, fio2, rq], isNegative(full) ? FULL_NEGATIVE : FULL);
    }
    const simplified = alveolarPo2SimplifiedSigned(pio2.value, paco2.value, rq.value);
    return c.value(simplified, [pio2, paco2, rq], isNegative(simplified) ? SIMPLIFIED_NEGATIVE : SIMPLIFIED);
  },
});

/**
 * The respiratory quotient as a formula input: one term for the setting's value (a one-entry memo:
 * every timepoint of a note reads the same settings).
 */
let lastRq: Term | null = null;
function rqTerm(value: number): Term {
  if (lastRq === null || lastRq.value !== value) {
    lastRq = { name: 'RQ', value, unit: '', decimals: 2, origin: { kind: 'default', description: 'respiratory quotient (setting pneumark.respiratoryQuotient)' } };
  }
  return lastRq;
}

/**
 * A negative alveolar PO2 is kept (not dropped as out of domain): it is how the note's FiO2,
 * pressure and PaCO2 contradict each other, and PN401 reports it.
 */
const NEGATIVE_NOTE = 'negative: no PaO2 is possible with this FiO2, pressure and PaCO2 (see PN401)';

function isNegative(alveolar: number | null): boolean {
  return alveolar !== null && alveolar < 0;
}

// The notes and formula of the alveolar PO2, one object each for every timepoint.
const SIMPLIFIED: ValueExtras = { notes: ['simplified alveolar gas equation'] };
const SIMPLIFIED_NEGATIVE: ValueExtras = { notes: ['simplified alveolar gas equation', NEGATIVE_NOTE] };
const FULL_FORMULA = '{PiO2} − {PaCO2} × ({FiO2} + (1 − {FiO2}) ÷ {RQ})';
const FULL: ValueExtras = { formula: FULL_FORMULA, notes: ['full alveolar gas equation (setting)'] };
const FULL_NEGATIVE: ValueExtras = { formula: FULL_FORMULA, notes: ['full alveolar gas equation (setting)', NEGATIVE_NOTE] };

export const aaGradientDef = defineDerived({
  id: 'aa_gradient',
  label: 'A–a gradient',
  short: 'A–a',
  unit: 'mmHg',
  decimals: 0,
  category: 'oxygenation',
  formula: '{PAO2} − {PaO2}',
  source: SOURCES['alveolar-gas-equation'],
  anchors: ['pao2'],
  compute(c) {
    const pA = c.derived('pao2_alveolar', 'PAO2');
    const pa = c.field('pao2', 'PaO2');
    if (!pA || !pa) return c.missing([pa, c.needFor('pao2', 'po2')], [pA, c.lacking('pao2_alveolar')]);
    if (pA.value < 0) return { kind: 'na', reason: `the alveolar PO2 comes out negative (${Math.round(pA.value)} mmHg): this FiO2, pressure and PaCO2 cannot go together (see PN401)`, withheldBy: 'PN401' };
    const g = aaGradient(pA.value, pa.value);
    if (g === null) return c.value(null, []);
    if (isAboveAlveolar(pa.value, pA.value, allowanceAt(c))) return { kind: 'na', reason: `PaO2 ${Math.round(pa.value)} mmHg is above the alveolar PO2 ${Math.round(pA.value)} mmHg that the stated FiO2 and pressure allow (see PN401)`, withheldBy: 'PN401' };
    if (g < 0) return c.value(0, [pA, pa], g < -ALVEOLAR_ROUNDING_MMHG ? BELOW_FULL_FORM : WITHIN_ROUNDING_GRADIENT);
    // Shown beside its upper normal for age: with the decimals that keep it on its side of it.
    const upper = upperNormalFor(c);
    return c.value(g, [pA, pa], withDecimals(upper === null ? undefined : decimalsAgainst(g, 0, upper)));
  },
});

// The notes of a gradient shown as 0: one object each for every timepoint.
const WITHIN_ROUNDING_GRADIENT: ValueExtras = { notes: ['PaO2 within rounding of the alveolar PO2: gradient shown as 0'] };
const BELOW_FULL_FORM: ValueExtras = { notes: ['PaO2 above the alveolar PO2 of the simplified equation but not above that of the full alveolar gas equation, which reads higher on a high FiO2: gradient shown as 0'] };

const AGE_RULE_TEXT = {
  'age-over-4-plus-4': '{age} ÷ 4 + 4',
  'age-plus-10-over-4': '({age} + 10) ÷ 4',
  mellemgaard: '2.5 + 0.21 × {age}',
} as const;

/**
 * The age rules were all made in adults, and no published rule for children was found: a patient
 * under ADULT_FROM_YEARS gets no age-based upper normal (the reading then uses the generous limit it
 * uses without an age, and says why).
 */
export function isUnderAdultAge(age: number): boolean {
  return age < ADULT_FROM_YEARS;
}

const AA_RULES_FOR_ADULTS = `the age rules were made in adults (${ADULT_FROM_YEARS} years or more)`;

/** The upper normal A–a gradient for the age in force, by the rule the settings choose; null without an adult age. */
function upperNormalFor(c: DeriveContext): number | null {
  const age = c.field('age', 'age');
  return age && !isUnderAdultAge(age.value) ? aaGradientUpperNormal(age.value, c.settings.aaGradientRule) : null;
}

export const aaGradientUpperNormalDef = defineDerived({
  id: 'aa_gradient_upper_normal',
  label: 'A–a gradient, upper normal for age',
  short: 'A–a normal ≤',
  unit: 'mmHg',
  decimals: 0,
  category: 'oxygenation',
  formula: AGE_RULE_TEXT['age-over-4-plus-4'],
  source: `${SOURCES['aa-gradient-age-rules']} Alternative: ${SOURCES['mellemgaard-1966']}`,
  anchors: ['pao2'],
  compute(c) {
    const age = c.field('age', 'age');
    if (!age) return c.missing([age, c.needFor('age', 'age (patient line)')]);
    if (isUnderAdultAge(age.value)) return { kind: 'na', reason: `${AA_RULES_FOR_ADULTS}: no upper normal at age ${formatAgeYears(age.value)} y`, explained: true };
    const upper = aaGradientUpperNormal(age.value, c.settings.aaGradientRule);
    // Shown beside the gradient: with the decimals that keep the gradient on its side of it (A–a 11.8 above 11.5, not 12 and 12).
    const gradient = c.derivedValue('aa_gradient')?.value;
    const decimals = upper === null || gradient === undefined ? undefined : decimalsAgainst(upper, 0, gradient);
    return c.value(upper, [age], { formula: AGE_RULE_TEXT[c.settings.aaGradientRule], notes: ['breathing air at sea level; the gradient widens on oxygen'], decimals });
  },
});

export const aToARatio = defineDerived({
  id: 'a_to_A_ratio',
  label: 'a/A ratio',
  short: 'a/A',
  unit: '',
  decimals: 2,
  category: 'oxygenation',
  formula: '{PaO2} ÷ {PAO2}',
  source: SOURCES['gilbert-keighley-1974'],
  anchors: ['pao2'],
  compute(c) {
    const pa = c.field('pao2', 'PaO2');
    const pA = c.derived('pao2_alveolar', 'PAO2');
    if (!pa || !pA) return c.missing([pa, c.needFor('pao2', 'po2')], [pA, c.lacking('pao2_alveolar')]);
    if (isAboveAlveolar(pa.value, pA.value, allowanceAt(c))) return ABOVE_ALVEOLAR;
    // Within rounding above the alveolar PO2 the gradient shows as 0, and the ratio says the same:
    // 1, not the 1.06 that no blood can reach (a gradient of 0 beside a ratio above 1 would contradict it).
    if (pa.value > pA.value && pA.value > 0) return c.value(1, [pa, pA], pa.value > pA.value + ALVEOLAR_ROUNDING_MMHG ? BELOW_FULL_FORM_RATIO : WITHIN_ROUNDING_RATIO);
    return c.value(arterialAlveolarRatio(pa.value, pA.value), [pa, pA]);
  },
});

/** The a/A ratio of a PaO2 within rounding above the alveolar PO2: one object for every timepoint. */
const WITHIN_ROUNDING_RATIO: ValueExtras = { notes: ['PaO2 within rounding of the alveolar PO2: ratio shown as 1'] };
const BELOW_FULL_FORM_RATIO: ValueExtras = { notes: ['PaO2 above the alveolar PO2 of the simplified equation but not above that of the full alveolar gas equation, which reads higher on a high FiO2: ratio shown as 1'] };

export const pfRatioDef = defineDerived({
  id: 'pf_ratio',
  label: 'P/F ratio',
  short: 'P/F',
  unit: 'mmHg',
  decimals: 0,
  category: 'oxygenation',
  formula: '{PaO2} ÷ {FiO2}',
  source: SOURCES['berlin-2012'],
  anchors: ['pao2'],
  compute(c) {
    const pa = c.field('pao2', 'PaO2');
    const fio2 = c.fio2();
    if (!pa || !fio2) return c.missing([pa, c.needFor('pao2', 'po2')], [fio2, c.fio2Need()]);
    return pao2Withheld(c, pa) ?? c.value(pfRatio(pa.value, fio2.value), [pa, fio2]);
  },
});

export const pfRatioAltitude = defineDerived({
  id: 'pf_ratio_altitude_adjusted',
  label: 'P/F ratio adjusted for altitude',
  short: 'P/F × PB/760',
  unit: 'mmHg',
  decimals: 0,
  category: 'oxygenation',
  formula: '{P/F} × {PB} ÷ 760',
  source: SOURCES['berlin-2012'],
  anchors: ['pao2'],
  compute(c) {
    const pb = c.derived('barometric', 'PB');
    // At 1,000 m or below there is no adjustment, whatever the P/F: what the P/F lacks (an FiO2) is
    // not asked for in its name, since adding it would give a P/F and still no adjusted one.
    const notHere = notAdjustedAt(c, pb);
    if (notHere !== null) return notHere;
    const pf = c.derived('pf_ratio', 'P/F');
    // A P/F withheld (PN401) withholds its adjustment, where there would be one (above 1,000 m).
    const withheld = pf ? null : c.withheldFrom('pf_ratio');
    if (withheld) return pb ? withheld : c.missing();
    if (!pf || !pb) return c.missing([pf, c.lacking('pf_ratio')]);
    return c.value(pfRatioAltitudeAdjusted(pf.value, pb.value), [pf, pb]);
  },
});

/**
 * The Berlin definition adjusts the P/F for altitude where the altitude is higher than 1,000 m
 * (`berlin-2012`, read in the footnote of its table as reproduced in Crit Care 2012), and only
 * there: a P/F at 800 m (PB about 694 mmHg) is read against the bands as it is, as the definition
 * reads it.
 *
 * Where the note states an altitude that is used, the altitude decides: alone (the pressure is
 * then the model's, whichever the setting chooses: above 1,000 m in either model is below its own
 * pressure at 1,000 m), or with a pressure beside it that can belong to it (the pressure stated is
 * the one the P/F is multiplied by). An altitude that the pressure beside it contradicts (PN320) is
 * not used, here as for PiO2: the pressure decides.
 *
 * Where only a pressure decides (stated, or sea level assumed), it is compared with
 * PF_ADJUSTED_BELOW_MMHG, the pressure of 1,000 m in West's model atmosphere, the default, whatever
 * the setting `barometricModel`: the setting chooses how an altitude becomes a pressure, and a note
 * that states a pressure has no altitude to convert, so it reads the same under either model (the
 * standard atmosphere gives 674.1 mmHg at 1,000 m, about 45 m away).
 */
function notAdjustedAt(c: DeriveContext, pb: Term | null): Outcome | null {
  const altitude = c.number('altitude');
  if (altitude !== null) {
    const stated = c.number('barometric');
    if (stated === null || pressureFitsAltitude(stated, altitude)) return altitude > BERLIN_ADJUSTED_ABOVE_M ? null : AT_OR_BELOW_1000_M;
  }
  if (pb === null || pb.value < PF_ADJUSTED_BELOW_MMHG) return null;
  return pb.value > SEA_LEVEL_MMHG + WEATHER_MMHG ? ABOVE_SEA_LEVEL : NEAR_SEA_LEVEL;
}

/**
 * The pressure (mmHg) of 1,000 m in West's model atmosphere, exp(6.63268 − 0.1112 − 0.00149) =
 * 678.57, to a tenth, so that the number the reasons show is the one compared with: 678.6 mmHg
 * (`west-1996`). A pressure below it is adjusted where no altitude decides.
 */
export const PF_ADJUSTED_BELOW_MMHG = Math.round(barometricFromAltitudeWest(BERLIN_ADJUSTED_ABOVE_M)! * 10) / 10;

/**
 * Weather alone moves the pressure at sea level by some 20 mmHg either way (common practice, no
 * source): a pressure higher than sea level's by more is not "near sea level".
 */
const WEATHER_MMHG = 20;

/** Why there is no adjustment, after where: said once for every gas. */
const NO_ADJUSTMENT_THERE = 'the Berlin definition makes no altitude adjustment there (it adjusts above 1,000 m)';

/** Most notes are near sea level: one outcome serves every gas. */
const NEAR_SEA_LEVEL: Outcome = { kind: 'na', reason: `barometric pressure is ${formatNumber(PF_ADJUSTED_BELOW_MMHG, 1)} mmHg or more, near sea level or up to 1,000 m by West's model atmosphere: ${NO_ADJUSTMENT_THERE}` };

/** An altitude stated at 1,000 m or below (and used): one outcome serves every gas. */
const AT_OR_BELOW_1000_M: Outcome = { kind: 'na', reason: `the altitude is 1,000 m or less: ${NO_ADJUSTMENT_THERE}` };

/**
 * Above sea level's pressure and the 20 mmHg the weather moves it (a hyperbaric chamber, a place
 * below sea level): not "near sea level", and the adjustment is for altitude only.
 */
const ABOVE_SEA_LEVEL: Outcome = { kind: 'na', reason: `barometric pressure is above sea level's (${SEA_LEVEL_MMHG} mmHg): the adjustment is for altitude above 1,000 m, a pressure below ${formatNumber(PF_ADJUSTED_BELOW_MMHG, 1)} mmHg` };

export const sfRatioDef = defineDerived({
  id: 'sf_ratio',
  label: 'S/F ratio',
  short: 'S/F',
  unit: '',
  decimals: 0,
  category: 'oxygenation',
  formula: '{SpO2} ÷ {FiO2}',
  source: SOURCES['rice-2007'],
  anchors: ['spo2'],
  compute(c) {
    const spo2 = c.field('spo2', 'SpO2');
    const fio2 = c.fio2();
    if (!spo2 || !fio2) return c.missing([spo2, c.needFor('spo2', 'spo2')], [fio2, c.fio2Need()]);
    return c.value(sfRatio(spo2.value, fio2.value), [spo2, fio2], spo2.value > OSI_MAX_SPO2_PERCENT ? SF_ABOVE_97 : undefined);
  },
});

/** An S/F ratio from an SpO2 above 97 %, where the ratio no longer tracks P/F: said beside the number, not only in its hover. */
const SF_ABOVE_97: ValueExtras = { notes: ['SpO2 above 97 %: the S/F ratio no longer tracks P/F (Rice 2007)'], caveat: 'SpO2 > 97 %' };

/** The thresholds of the ROX index by the hours of high flow, each time the source gives (`roca-2019`). */
const ROX_NOTES: ValueExtras = { notes: ['≥ 4.88 at 2, 6 or 12 h of high flow was associated with success; below 2.85 at 2 h, 3.47 at 6 h and 3.85 at 12 h with failure (Roca 2019)'] };

export const roxIndexDef = defineDerived({
  id: 'rox_index',
  label: 'ROX index',
  short: 'ROX',
  unit: '',
  decimals: 2,
  category: 'oxygenation',
  formula: '({SpO2} ÷ {FiO2}) ÷ {RR}',
  source: `${SOURCES['roca-2016']} ${SOURCES['roca-2019']} Read against the thresholds of 2, 6 or 12 h where the hours of high flow are known and within 1 h of that hour: common practice, no source.`,
  anchors: ['spo2', 'rr'],
  compute(c) {
    const device = c.word('device');
    if (device?.word !== 'hfnc') return { kind: 'na', reason: 'the ROX index was validated on high-flow nasal oxygen' };
    const spo2 = c.field('spo2', 'SpO2');
    const fio2 = c.fio2();
    const rr: Term | null = c.field('rr', 'RR');
    if (!spo2 || !fio2 || !rr) return c.missing([spo2, c.needFor('spo2', 'spo2')], [fio2, c.fio2Need()], [rr, c.needFor('rr', 'rr')]);
    const rox = roxIndex(spo2.value, fio2.value, rr.value);
    const atHour = rox === null ? null : roxAtHour(rox, c.highFlowHours());
    return c.value(rox, [spo2, fio2, rr], atHour === null ? ROX_NOTES : { notes: [...ROX_NOTES.notes!, atHour.note], caveat: atHour.caveat });
  },
});

export const oxygenationIndexDef = defineDerived({
  id: 'oxygenation_index',
  label: 'Oxygenation index',
  short: 'OI',
  unit: '',
  decimals: 1,
  category: 'oxygenation',
  formula: '{FiO2} × {MAP} × 100 ÷ {PaO2}',
  source: `${SOURCES['ortiz-1987']} ${SOURCES['palicc-2015']}`,
  anchors: ['pao2', 'mean_airway_pressure'],
  compute(c) {
    const fio2 = c.fio2();
    const map = c.field('mean_airway_pressure', 'MAP');
    const pa = c.field('pao2', 'PaO2');
    if (!map && !c.statedHere('mean_airway_pressure')) return { kind: 'na', reason: 'needs a mean airway pressure (map on the vent line)' };
    if (!fio2 || !map || !pa) return c.missing([fio2, c.needFor('fio2', 'fio2')], [map, c.needFor('mean_airway_pressure', 'map')], [pa, c.needFor('pao2', 'po2')]);
    return pao2Withheld(c, pa) ?? c.value(oxygenationIndex(fio2.value, map.value, pa.value), [fio2, map, pa]);
  },
});

export const oxygenSaturationIndexDef = defineDerived({
  id: 'oxygen_saturation_index',
  label: 'Oxygen saturation index',
  short: 'OSI',
  unit: '',
  decimals: 1,
  category: 'oxygenation',
  formula: '{FiO2} × {MAP} × 100 ÷ {SpO2}',
  source: SOURCES['palicc-2015'],
  anchors: ['spo2', 'mean_airway_pressure'],
  compute(c) {
    const fio2 = c.fio2();
    const map = c.field('mean_airway_pressure', 'MAP');
    const spo2 = c.field('spo2', 'SpO2');
    if (!map) return { kind: 'na', reason: 'needs a mean airway pressure (map on the vent line)' };
    if (!fio2 || !spo2) return c.missing([fio2, c.needFor('fio2', 'fio2')], [spo2, c.needFor('spo2', 'spo2')]);
    if (spo2.value > OSI_MAX_SPO2_PERCENT) return { kind: 'na', reason: 'valid only for SpO2 ≤ 97 %' };
    return c.value(oxygenSaturationIndex(fio2.value, map.value, spo2.value), [fio2, map, spo2]);
  },
});

/** Either of the two CO2 values not stated at this timepoint: nothing to compare (one outcome for every timepoint). */
const NOT_BOTH_CO2: Outcome = { kind: 'na', reason: 'needs a PaCO2 and an EtCO2 stated at the same timepoint' };
const CO2_DIFFERENCE_EXTRAS: ValueExtras = { notes: ['usually about 2–5 mmHg; wider with more alveolar dead space'] };

export const paco2Etco2DifferenceDef = defineDerived({
  id: 'paco2_etco2_difference',
  label: 'Arterial to end-tidal CO2 difference',
  short: 'PaCO2–EtCO2',
  unit: 'mmHg',
  decimals: 0,
  category: 'mechanics',
  formula: '{PaCO2} − {EtCO2}',
  source: SOURCES['arterial-end-tidal-co2'],
  anchors: ['paco2', 'etco2'],
  compute(c) {
    // Both measured here: an end-tidal CO2 is a reading of its moment, never carried to a later gas.
    if (!c.statedHere('paco2') || !c.statedHere('etco2')) return NOT_BOTH_CO2;
    const pa = c.field('paco2', 'PaCO2');
    const et = c.field('etco2', 'EtCO2');
    if (!pa || !et) return NOT_BOTH_CO2;
    return c.value(arterialEndTidalCo2Difference(pa.value, et.value), [pa, et], CO2_DIFFERENCE_EXTRAS);
  },
});
