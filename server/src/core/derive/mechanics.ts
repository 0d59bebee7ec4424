/** Derived values of ventilation and respiratory mechanics. */
import {
  DRIVING_PRESSURE_FLAG_CMH2O,
  LUNG_PROTECTIVE_VT_MAX_ML_PER_KG,
  MECHANICAL_POWER_MODE,
  NIV_VT_MEDIAN_ML_PER_KG,
  PBW_REFERENCE_HEIGHT_CM,
  SOURCES,
  airwayResistance,
  complianceDynamic,
  complianceStatic,
  drivingPressure,
  mechanicalPowerSimplified,
  mechanicalPowerSurrogate,
  minuteVentilationLPerMin,
  predictedBodyWeightKg,
  ventilatoryRatio,
  vtPerKgPbw,
} from '../physiology';
import type { NoninvasiveSupport } from '../analysis/noninvasive-support';
import { ADULT_FROM_YEARS, defineDerived, withDecimals, type DeriveContext, type Outcome, type Term, type ValueExtras } from './context';
import { decimalsAgainst, formatAgeYears, formatShort } from '../util/format';
import { modeFamily, ownBreaths, type OwnBreaths } from '../fields/modes';

export const minuteVentilation = defineDerived({
  id: 'minute_ventilation',
  label: 'Minute ventilation',
  short: 'VE',
  unit: 'L/min',
  decimals: 1,
  category: 'mechanics',
  formula: '{VT} × {RR} ÷ 1000',
  source: SOURCES['respiratory-mechanics'],
  anchors: ['vt', 'vent_rate', 'rr'],
  compute(c) {
    const vt = c.field('vt', 'VT');
    // Where the mode measures the volume (PS, PC), none is carried from an earlier timepoint: asked for.
    if (!vt && !askedVolume(c)) return { kind: 'na', reason: 'needs a tidal volume' };
    const hfov = c.oscillation();
    if (hfov) return hfov;
    const rr = c.respiratoryRate();
    if (!vt) return c.missing([vt, c.need('vt')], [rr, c.rateNeed()]);
    // A set rate of 0 gives no minute ventilation of 0: withheld where it is a mistake (PN312),
    // else a measured rate is asked for (in a spontaneous mode the patient sets the rate).
    if (!rr) return c.zeroSetRate() ?? c.missing([rr, c.rateNeed()]);
    return c.value(minuteVentilationLPerMin(vt.value, rr.value), [vt, rr]);
  },
});

/**
 * Whether a missing tidal volume is asked for rather than the value left unmentioned: where the mode
 * in force measures it (PS, PC: one of an earlier timepoint is not carried), but not in HFOV, where
 * what is worked out from breaths is not (`oscillation`). With no mode, under NIV or CPAP of an
 * oxygen line, only where this timepoint writes a vent line (the support's readings, `vent peak 16`):
 * many notes on NIV never record a volume, and asking at every gas would repeat one line at each; a
 * rate among the vital signs is charted on any support and asks for none (our convention).
 */
function askedVolume(c: DeriveContext): boolean {
  if (!c.measuredByMode('vt') || c.oscillation() !== null) return false;
  return c.word('mode') !== null || c.ventLineHere();
}

/** Age (years) from which the ARDS Network's predicted body weight is worked out: the trial's adults (ARDS Network 2000, which excluded patients younger than 18 years, read in the trial's summary at pathway.md/studies; the equation is for adults only, read in the abstract of BMC Pulm Med 2017, doi 10.1186/s12890-017-0427-1). */
export const PBW_ADULT_FROM_YEARS = ADULT_FROM_YEARS;
const PBW_FOR_ADULTS = `the ARDS Network equation is for adults (${PBW_ADULT_FROM_YEARS} years or more)`;

/**
 * What a value computed from the predicted body weight gives where that weight is not worked out
 * (a child, a height it gives no weight for): the same reason, rather than asking for a PBW, which
 * cannot be written. Null where the weight is there or merely lacks its inputs.
 */
function withoutPbw(c: DeriveContext): Outcome | null {
  const r = c.evaluate('predicted_body_weight');
  return r !== null && 'reason' in r && !('value' in r) ? { kind: 'na', reason: `no predicted body weight: ${r.reason}`, explained: true } : null;
}

/**
 * What a predicted body weight from a height below PBW_REFERENCE_HEIGHT_CM (152.4 cm, the
 * equations' base: 60 inches) carries, and every value computed from it: the equation was not
 * validated there (ARDS Network 2000, whose line goes below its base weight), said in full in a
 * note (hover, JSON) and in a few words beside the number where it is shown alone (`show`, the
 * inlay hint of VT/PBW).
 */
const SHORT_FOR_PBW: ValueExtras = Object.freeze({
  notes: Object.freeze(['below 152.4 cm the equation was not validated (short adults)']),
  caveat: 'height < 152.4 cm',
});

/** Whether the predicted body weight worked out at this timepoint is from a height below 152.4 cm (`SHORT_FOR_PBW`). */
function pbwOfShortHeight(c: DeriveContext): boolean {
  const r = c.evaluate('predicted_body_weight');
  return r !== null && 'caveat' in r && r.caveat === SHORT_FOR_PBW.caveat;
}

/** `extras` with the note and the caveat of a PBW from a height below 152.4 cm where `short`. */
function withShortPbw(extras: ValueExtras, short: boolean): ValueExtras {
  if (!short) return extras;
  return { ...extras, notes: [...(extras.notes ?? []), ...SHORT_FOR_PBW.notes!], caveat: SHORT_FOR_PBW.caveat };
}

export const pbw = defineDerived({
  id: 'predicted_body_weight',
  label: 'Predicted body weight',
  short: 'PBW',
  unit: 'kg',
  decimals: 1,
  category: 'mechanics',
  formula: '{base} + 0.91 × ({height} − 152.4)',
  source: SOURCES['ardsnet-2000'],
  anchors: ['vt', 'height'],
  compute(c) {
    const height = c.field('height', 'height');
    const sex = c.word('sex');
    if (!height || !sex) return c.missing([height, c.needFor('height', 'height (patient line)')], [sex, c.needFor('sex', 'sex (patient line)')]);
    // The equation was made for adults: a child's weight is not read from it (nor a tidal volume per kg).
    const age = c.number('age');
    // Said where the value would have been (show, the hovers), as nothing can be added to get it.
    if (age !== null && age < PBW_ADULT_FROM_YEARS) return { kind: 'na', reason: `${PBW_FOR_ADULTS}: not worked out at age ${formatAgeYears(age)} y`, explained: true };
    const male = sex.word === 'male';
    const weight = predictedBodyWeightKg(height.value, male ? 'male' : 'female');
    // Far below 152.4 cm the line reaches 0 kg (about 102 cm for a woman): no weight, rather than "add PBW".
    if (weight === null) return { kind: 'na', reason: `the ARDS Network equation gives no weight for a height of ${formatShort(height.value, 0)} cm`, explained: true };
    const base = { name: 'base', value: male ? 50 : 45.5, unit: 'kg', decimals: 1, origin: sex.input.origin, note: male ? 'male' : 'female' };
    return c.value(weight, [base, height], height.value < PBW_REFERENCE_HEIGHT_CM ? SHORT_FOR_PBW : undefined);
  },
});

export const vtPerKg = defineDerived({
  id: 'vt_per_kg_pbw',
  label: 'Tidal volume per kg predicted body weight',
  short: 'VT/PBW',
  unit: 'mL/kg',
  decimals: 1,
  category: 'mechanics',
  formula: '{VT} ÷ {PBW}',
  source: SOURCES['ardsnet-2000'],
  anchors: ['vt'],
  compute(c) {
    const vt = c.field('vt', 'VT');
    const p = c.derived('predicted_body_weight', 'PBW');
    if (!p) {
      const none = withoutPbw(c);
      if (none) return none;
    }
    if (!vt || !p) return c.missing([vt, c.need('vt')], [p, c.lacking('predicted_body_weight')]);
    const perKg = vtPerKgPbw(vt.value, p.value);
    // Shown beside the 8 mL/kg top of the lung-protective range (PN403): 8.04 as 8.04, not 8.0.
    const decimals = perKg === null ? undefined : decimalsAgainst(perKg, 1, LUNG_PROTECTIVE_VT_MAX_ML_PER_KG);
    // In HFOV the volume is an oscillation's, far below a conventional breath's: the quotient holds,
    // the lung-protective range of conventional breaths does not apply (nor does PN403). Under NIV
    // or CPAP the volume is the patient's own breath, no setting: shown, not held to a ventilator's limit.
    return c.value(perKg, [vt, p], withShortPbw({ notes: vtPerKgNotes(c), decimals }, pbwOfShortHeight(c)));
  },
});

/**
 * A formula template with its end-expiratory pressure named as it was taken (`named`, in braces):
 * PEEP on the ventilator, EPAP on NIV, the CPAP level on CPAP (`peepLike`), or the total PEEP of a
 * hold or the set plus intrinsic PEEP (`elasticBase`); undefined for `{PEEP}` (the definition's own
 * template serves).
 */
function namingEndExpiratory(template: string, named: string): string | undefined {
  return named === '{PEEP}' ? undefined : template.replace('{PEEP}', named);
}

function formulaExtras(template: string, named: string): ValueExtras | undefined {
  const formula = namingEndExpiratory(template, named);
  return formula === undefined ? undefined : { formula };
}

/**
 * The end-expiratory pressure the elastic pressure of a breath is measured from, with the terms it
 * is made of and how a formula names it (`{PEEPtot}`, `({PEEP} + {PEEPi})`, `{PEEP}`, `{EPAP}`,
 * `{CPAP}`): the total PEEP of an end-expiratory hold where one is written at this timepoint (a
 * reading: the set PEEP plus any intrinsic PEEP); else, where an intrinsic PEEP is written at this
 * timepoint (a reading of the same hold, `autopeep`) and a ventilator's set PEEP is in force, their
 * sum, which in a passive patient is the total PEEP the hold measured (respiratory mechanics:
 * total PEEP = set PEEP + intrinsic PEEP; common practice, no source); else the PEEP in force
 * (`peepLike`). Not the EPAP or CPAP level plus an intrinsic PEEP: an end-expiratory hold is a
 * ventilator's manoeuvre. Plateau − total PEEP is the pressure across the respiratory system at the
 * end of inspiration above that at the end of expiration. Read (December 2026, session 31): driving
 * pressure as the plateau pressure less the end-expiratory pressure of the respiratory system, in the
 * abstract of a 2018 review at pmc.ncbi.nlm.nih.gov/articles/PMC6212354, and as Pplat − PEEP or
 * VT / Crs in table 1 of a 2020 review at PMC7449829; which PEEP Amato 2015 meant is not read (from
 * memory).
 */
function elasticBase(c: DeriveContext): ElasticBase | null {
  const total = c.field('peep_total', 'PEEPtot');
  if (total) return { value: total.value, terms: [total], named: '{PEEPtot}' };
  const set = c.field('peep', 'PEEP');
  const intrinsic = set ? c.field('autopeep', 'PEEPi') : null;
  if (set && intrinsic) return { value: set.value + intrinsic.value, terms: [set, intrinsic], named: SET_PLUS_INTRINSIC };
  const peep = c.peepLike();
  return peep ? { value: peep.value, terms: [peep], named: `{${peep.name}}` } : null;
}

/** An end-expiratory pressure for the elastic pressure of a breath (`elasticBase`). */
interface ElasticBase {
  readonly value: number;
  readonly terms: readonly Term[];
  /** How a formula names it, in braces: `{PEEP}` or `({PEEP} + {PEEPi})`. */
  readonly named: string;
}

/** The total PEEP as the set PEEP plus the intrinsic PEEP of a hold, as a formula names it. */
const SET_PLUS_INTRINSIC = '({PEEP} + {PEEPi})';

const LUNG_PROTECTIVE_NOTES: readonly string[] = ['lung-protective target 6 mL/kg (4–8) in the ARDS Network protocol'];
const OSCILLATION_VOLUME_NOTES: readonly string[] = ['in HFOV the volume of one oscillation, not compared with the lung-protective range of conventional breaths'];

/** Why a tidal volume under NIV or CPAP is not held to the 8 mL/kg of a ventilator's breath (PN403). */
const OWN_BREATH_BECAUSE = `the patient's own breath, not a ventilator setting: not compared with the ${LUNG_PROTECTIVE_VT_MAX_ML_PER_KG} mL/kg lung-protective limit of invasive ventilation (PN403)`;

/**
 * The notes of a VT/PBW under NIV (with what a larger expired volume during NIV was associated with,
 * `carteaux-2016` in physiology/mechanics.ts: medians, no threshold) and under CPAP.
 */
const OWN_BREATH_NOTES: Readonly<Record<'niv' | 'cpap', readonly string[]>> = Object.freeze({
  niv: [
    `under NIV ${OWN_BREATH_BECAUSE}`,
    `a larger expired tidal volume during NIV for de novo hypoxaemic respiratory failure was associated with failure of NIV (Carteaux 2016: a median of ${NIV_VT_MEDIAN_ML_PER_KG.failed} mL/kg where NIV failed, ${NIV_VT_MEDIAN_ML_PER_KG.succeeded} where it succeeded)`,
  ],
  cpap: [`under CPAP ${OWN_BREATH_BECAUSE}`],
});

/**
 * The notes beside a VT/PBW: an oscillation's volume in HFOV; the patient's own breath under NIV or
 * CPAP (`ownBreaths`, as PN403 reads it); else the lung-protective range, pressure support on a
 * ventilator included (its tidal volume is the patient's, helped by the ventilator, through a tube:
 * lung protection still applies).
 */
function vtPerKgNotes(c: DeriveContext): readonly string[] {
  if (c.oscillationBreath()) return OSCILLATION_VOLUME_NOTES;
  const own = ownBreathsOf(c);
  return own === 'niv' || own === 'cpap' ? OWN_BREATH_NOTES[own] : LUNG_PROTECTIVE_NOTES;
}

export const drivingPressureDef = defineDerived({
  id: 'driving_pressure',
  label: 'Driving pressure',
  short: 'ΔP',
  unit: 'cmH2O',
  decimals: 0,
  category: 'mechanics',
  formula: '{Pplat} − {PEEP}',
  otherFormulas: ['{Pplat} − {PEEPtot}', `{Pplat} − ${SET_PLUS_INTRINSIC}`],
  source: SOURCES['amato-2015'],
  anchors: ['plateau'],
  compute(c) {
    const plat = c.field('plateau', 'Pplat');
    if (!plat) return { kind: 'na', reason: 'needs a plateau pressure (inspiratory hold)' };
    const hfov = c.oscillationBreath();
    if (hfov) return hfov;
    const peep = elasticBase(c);
    if (!peep) return c.missing([peep, c.peepNeed()]);
    const dp = drivingPressure(plat.value, peep.value);
    // Shown beside the 15 cmH2O flag (PN405): 15.4 as 15.4, not as 15 next to "above 15".
    const decimals = dp === null ? undefined : decimalsAgainst(dp, 0, DRIVING_PRESSURE_FLAG_CMH2O);
    const formula = namingEndExpiratory('{Pplat} − {PEEP}', peep.named);
    return c.value(dp, [plat, ...peep.terms], formula === undefined ? withDecimals(decimals) : { decimals, formula });
  },
});

export const complianceStaticDef = defineDerived({
  id: 'compliance_static',
  label: 'Static compliance',
  short: 'Cstat',
  unit: 'mL/cmH2O',
  decimals: 0,
  category: 'mechanics',
  formula: '{VT} ÷ ({Pplat} − {PEEP})',
  otherFormulas: ['{VT} ÷ ({Pplat} − {PEEPtot})', `{VT} ÷ ({Pplat} − ${SET_PLUS_INTRINSIC})`],
  source: SOURCES['respiratory-mechanics'],
  anchors: ['plateau'],
  compute(c) {
    const vt = c.field('vt', 'VT');
    const plat = c.field('plateau', 'Pplat');
    if (!plat) return { kind: 'na', reason: 'needs a plateau pressure' };
    const hfov = c.oscillationBreath();
    if (hfov) return hfov;
    const peep = elasticBase(c);
    if (!vt || !peep) return c.missing([vt, c.need('vt')], [peep, c.peepNeed()]);
    return c.value(complianceStatic(vt.value, plat.value, peep.value), [vt, plat, ...peep.terms], formulaExtras('{VT} ÷ ({Pplat} − {PEEP})', peep.named));
  },
});

export const complianceDynamicDef = defineDerived({
  id: 'compliance_dynamic',
  label: 'Dynamic compliance',
  short: 'Cdyn',
  unit: 'mL/cmH2O',
  decimals: 0,
  category: 'mechanics',
  formula: '{VT} ÷ ({Ppeak} − {PEEP})',
  source: SOURCES['respiratory-mechanics'],
  anchors: ['peak'],
  compute(c) {
    const vt = c.field('vt', 'VT');
    const peak = c.field('peak', 'Ppeak');
    if (!peak) return { kind: 'na', reason: 'needs a peak pressure' };
    const hfov = c.oscillationBreath();
    if (hfov) return hfov;
    const own = ownEffort(c);
    if (own) return own;
    const peep = c.peepLike();
    if (!vt || !peep) return c.missing([vt, c.need('vt')], [peep, c.peepNeed()]);
    return c.value(complianceDynamic(vt.value, peak.value, peep.value), [vt, peak, peep], formulaExtras('{VT} ÷ ({Ppeak} − {PEEP})', `{${peep.name}}`));
  },
});

/**
 * Why the dynamic compliance is not worked out where the breaths in force are the patient's own
 * (the spontaneous family: `mode PS`, `mode CPAP`, or with no mode NIV or CPAP of the oxygen line,
 * fields/modes.ts `familyInForce`); null elsewhere. VT ÷ (Ppeak − PEEP) is the respiratory
 * system's compliance only where the ventilator alone moves the volume: with the patient's own
 * inspiratory effort the volume is drawn in by muscle pressure that the airway pressure does not
 * show, so the quotient is higher than the compliance by an unknown amount, and under CPAP, where
 * the airway pressure barely rises, it has no meaning at all (respiratory mechanics, common
 * practice, no source). Withheld rather than shown with a caveat: a number named compliance would
 * go into the exports, the trends and the checks with nothing to say it is not one; the hover and
 * `show` say why where it would have been, and ask for no tidal volume to get it.
 */
function ownEffort(c: DeriveContext): Outcome | null {
  const own = ownBreathsOf(c);
  return own === null ? null : OWN_EFFORT[own];
}

/** `ownBreaths` (fields/modes.ts) of the mode and the oxygen line in force here. */
function ownBreathsOf(c: DeriveContext): OwnBreaths | null {
  const mode = c.word('mode');
  return mode !== null ? ownBreaths(mode.word) : ownBreaths(null, c.noninvasiveSupport());
}

const ownEffortBecause = (endExpiratory: string): string =>
  `the patient's own inspiratory effort draws in part of the volume, which the airway pressure does not show, so VT ÷ (Ppeak − ${endExpiratory}) is higher than the respiratory system's compliance by an unknown amount; a plateau of a passive breath (an inspiratory hold) gives the static compliance`;

/** The reasons of `ownEffort`, one per kind of spontaneous breathing, made once. */
const OWN_EFFORT: Readonly<Record<'ps' | 'cpap' | 'niv', Outcome>> = Object.freeze({
  ps: { kind: 'na', reason: `not worked out under pressure support: ${ownEffortBecause('PEEP')}`, explained: true },
  niv: { kind: 'na', reason: `not worked out under NIV: ${ownEffortBecause('EPAP')}`, explained: true },
  cpap: { kind: 'na', reason: "not worked out under CPAP: the patient breathes at one set pressure, which barely rises in inspiration, and draws the volume in by their own effort, so VT ÷ (Ppeak − CPAP) is no compliance of the respiratory system", explained: true },
});

export const airwayResistanceDef = defineDerived({
  id: 'airway_resistance',
  label: 'Airway resistance',
  short: 'Raw',
  unit: 'cmH2O/L/s',
  decimals: 1,
  category: 'mechanics',
  formula: '({Ppeak} − {Pplat}) ÷ ({flow} ÷ 60)',
  source: SOURCES['respiratory-mechanics'],
  anchors: ['peak', 'plateau'],
  compute(c) {
    // The flow is set and constant in the volume family (VC, SIMV, SIMV-VC: fields/modes.ts), where a
    // mandatory breath's peak exceeds its plateau by flow × resistance; elsewhere the flow decelerates.
    // Said only where both pressures are written: a peak alone under PC asks for nothing.
    const peak = c.field('peak', 'Ppeak');
    const plat = c.field('plateau', 'Pplat');
    if (!peak || !plat) return { kind: 'na', reason: 'needs peak and plateau pressures' };
    const mode = c.word('mode');
    if (mode && modeFamily(mode.word) !== 'volume') return NOT_CONSTANT_FLOW;
    const flow = c.field('insp_flow', 'flow');
    if (!flow) return c.missing([flow, c.needFor('insp_flow', 'flow (inspiratory flow, L/min)')]);
    return c.value(airwayResistance(peak.value, plat.value, flow.value), [peak, plat, flow]);
  },
});

/** Why the airway resistance is not worked out under a mode that sets no constant flow: shown where it would have been. */
const NOT_CONSTANT_FLOW: Outcome = {
  kind: 'na',
  reason: 'holds only for a set, constant inspiratory flow (VC, SIMV, SIMV-VC), where the peak exceeds the plateau by flow × resistance',
  explained: true,
};

export const mechanicalPower = defineDerived({
  id: 'mechanical_power',
  label: 'Mechanical power (simplified)',
  short: 'MP',
  unit: 'J/min',
  decimals: 1,
  category: 'mechanics',
  formula: '0.098 × {RR} × {VT} ÷ 1000 × ({Ppeak} − ({Pplat} − {PEEP}) ÷ 2)',
  source: `${SOURCES['gattinoni-2016']} ${SOURCES['becher-2019']}`,
  anchors: ['peak', 'plateau'],
  compute(c) {
    const rr = c.respiratoryRate();
    const vt = c.field('vt', 'VT');
    const peak = c.field('peak', 'Ppeak');
    const plat = c.field('plateau', 'Pplat');
    const peep = c.field('peep', 'PEEP');
    if (!peak || !plat) return { kind: 'na', reason: 'needs peak and plateau pressures' };
    const hfov = c.oscillation();
    if (hfov) return hfov;
    // The equation is one of constant-flow volume control (a mode in force that is not VC: not worked out).
    const mode = c.word('mode');
    if (mode && mode.word !== MECHANICAL_POWER_MODE) return { kind: 'na', reason: notVolumeControl(mode.word), explained: true };
    // Under NIV or CPAP of an oxygen line no ventilator mode is in force, and no `peep` either (EPAP
    // or the CPAP level is the end-expiratory pressure): the breaths are not volume-controlled.
    const support = mode ? null : c.noninvasiveSupport();
    if (support !== null) return { kind: 'na', reason: UNDER_SUPPORT[support], explained: true };
    if (!rr) {
      const withheld = c.zeroSetRate();
      if (withheld) return withheld;
    }
    if (!rr || !vt || !peep) return c.missing([rr, c.rateNeed()], [vt, c.need('vt')], [peep, c.needFor('peep', 'peep')]);
    return c.value(mechanicalPowerSimplified(rr.value, vt.value, peak.value, plat.value, peep.value), [rr, vt, peak, plat, peep]);
  },
});

/**
 * Why the simplified mechanical power is not worked out in `mode`: its equation is one of
 * volume control with a constant flow (Gattinoni 2016), unsuited to pressure-controlled or
 * -supported breaths (Becher 2019), whose own equations Pneumark does not use.
 */
function notVolumeControl(mode: string): string {
  // SIMV run volume-targeted: its mandatory breaths are VC's, the patient's breaths between them are not.
  if (modeFamily(mode) === 'volume') return `${CONSTANT_FLOW_ONLY}in ${mode} the mandatory breaths are so, but the patient's own breaths between them are pressure-supported and the rate counts them too, and pressure-supported breaths need equations of their own (Becher T et al., Intensive Care Med 2019)`;
  return `${CONSTANT_FLOW_ONLY}in ${mode} the breaths are shaped otherwise, and pressure-controlled or -supported breaths need equations of their own (Becher T et al., Intensive Care Med 2019)`;
}

/** What the simplified equation describes, which each reason it is not worked out begins with. */
const CONSTANT_FLOW_ONLY = 'the simplified equation is for volume control with a constant flow, the airway pressure rising in a straight line through inspiration; ';
const UNDER_NIV = CONSTANT_FLOW_ONLY + 'under NIV the breaths are pressure-supported, from EPAP up to IPAP, and pressure-shaped breaths need equations of their own (Becher T et al., Intensive Care Med 2019)';
const UNDER_CPAP = CONSTANT_FLOW_ONLY + 'under CPAP the patient breathes spontaneously at one constant pressure, and the device gives no volume-controlled breath for the equation to describe';

/**
 * Why the simplified mechanical power is not worked out under the non-invasive support of an
 * oxygen line (the one rule of `noninvasiveSupport`: the device `niv` or `cpap`, or with none named,
 * an IPAP or an EPAP for NIV, a CPAP level for CPAP).
 */
const UNDER_SUPPORT: Readonly<Record<NoninvasiveSupport, string>> = { niv: UNDER_NIV, cpap: UNDER_CPAP };

export const mechanicalPowerSurrogateDef = defineDerived({
  id: 'mechanical_power_surrogate',
  label: 'Mechanical power (surrogate, volume control)',
  short: 'MP surr',
  unit: 'J/min',
  decimals: 1,
  category: 'mechanics',
  formula: '{VE} × ({Ppeak} + {PEEP} + {flow} ÷ 6) ÷ 20',
  source: SOURCES['giosa-2019'],
  anchors: ['peak', 'insp_flow'],
  compute(c) {
    const mode = c.word('mode');
    if (mode && mode.word !== 'VC') return { kind: 'na', reason: 'the surrogate is for volume control' };
    const ve = c.derived('minute_ventilation', 'VE');
    const peak = c.field('peak', 'Ppeak');
    const peep = c.field('peep', 'PEEP');
    const flow = c.field('insp_flow', 'flow');
    if (!peak || !flow) return { kind: 'na', reason: 'needs the peak pressure and the inspiratory flow' };
    if (!ve) {
      const withheld = c.withheldFrom('minute_ventilation');
      if (withheld) return withheld;
    }
    if (!ve || !peep) return c.missing([ve, c.lacking('minute_ventilation')], [peep, c.needFor('peep', 'peep')]);
    return c.value(mechanicalPowerSurrogate(ve.value, peak.value, peep.value, flow.value), [ve, peak, peep, flow]);
  },
});

export const ventilatoryRatioDef = defineDerived({
  id: 'ventilatory_ratio',
  label: 'Ventilatory ratio',
  short: 'VR',
  unit: '',
  decimals: 2,
  category: 'mechanics',
  formula: '{VE} × 1000 × {PaCO2} ÷ ({PBW} × 100 × 37.5)',
  source: `${SOURCES['sinha-2009']} ${SOURCES['sinha-2019']}`,
  anchors: ['paco2'],
  compute(c) {
    if (!c.field('vt') && !c.field('minute_volume') && !askedVolume(c)) return { kind: 'na', reason: 'needs ventilation (vt and rate, or measured ve)' };
    const hfov = c.oscillation();
    if (hfov) return hfov;
    const ve = c.field('minute_volume', 'VE') ?? c.derived('minute_ventilation', 'VE');
    const paco2 = c.field('paco2', 'PaCO2');
    const p = c.derived('predicted_body_weight', 'PBW');
    if (!ve) {
      const withheld = c.withheldFrom('minute_ventilation');
      if (withheld) return withheld;
    }
    if (!p) {
      const none = withoutPbw(c);
      if (none) return none;
    }
    if (!ve || !paco2 || !p) return c.missing([ve, c.lacking('minute_ventilation')], [paco2, c.needFor('paco2', 'pco2')], [p, c.lacking('predicted_body_weight')]);
    return c.value(ventilatoryRatio(ve.value * 1000, paco2.value, p.value), [ve, paco2, p], withShortPbw({}, pbwOfShortHeight(c)));
  },
});
