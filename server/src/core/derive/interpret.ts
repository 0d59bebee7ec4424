/**
 * Interpretations: the assessment lines a clinician would write, each phrased "consistent
 * with ...", built only from values and derived values of this timepoint. Thresholds are
 * settings (hypoxaemia PaO2 < 60 mmHg and hypercapnia PaCO2 > 50 mmHg by default, common
 * practice). Grades and cut-offs not taken from settings are named below with their source.
 */
import { ANION_GAP_UPPER_NORMAL_MMOL_L, BERLIN_BAND_SEVERITY, HCO3_CENTRE_MMOL_L, HCO3_NORMAL_MMOL_L, PACO2_NORMAL_MMHG, PH_NORMAL, berlinOxygenationBand, type AcidBaseClassification, type AcidBaseDisorder } from '../physiology';
import { sideOf } from '../physiology/numeric';
import { MMHG_PER_KPA } from '../physiology/units';
import type { Settings } from '../settings';
import { formatAgainst, formatNumber, formatShort, rangeAgainst, wordList } from '../util/format';
import { KPA_DECIMALS, kpaFromMmhg, kpaNumber, showsKpa } from '../present';
import { classification } from './acid-base';
import { isAboveAlveolar } from './gas-exchange';
import type { DeriveContext, Term } from './context';
import type { Interpretation } from './model';

/** PaO2 below this (mmHg) grades hypoxaemia as severe (common practice, no source). */
export const SEVERE_HYPOXAEMIA_MMHG = 40;
/** PaO2 below this (mmHg) is below the usual range for adults breathing air (common practice). */
export const LOW_NORMAL_PAO2_MMHG = 80;
/** Upper normal PaCO2 (mmHg) (common practice). */
export const UPPER_NORMAL_PACO2_MMHG = 45;
/** PiO2 below this (mmHg) counts as low inspired oxygen: sea-level air gives about 150 (our convention). */
export const LOW_PIO2_MMHG = 140;
/** Upper normal A–a gradient (mmHg) used when the age is unknown (common practice, generous). */
export const AA_UPPER_NORMAL_NO_AGE_MMHG = 20;
/** The boundaries (mmHg) of the Berlin oxygenation bands: 200 < P/F ≤ 300, 100 < P/F ≤ 200, P/F ≤ 100 (ARDS Definition Task Force, JAMA 2012). */
const BERLIN_BOUNDARIES: readonly number[] = [100, 200, 300];
/** PEEP or CPAP (cmH2O) from which the Berlin oxygenation bands apply. */
export const BERLIN_MIN_PEEP_CMH2O = 5;


const DISORDER_WORDS: Readonly<Record<AcidBaseDisorder, string>> = {
  'metabolic-acidosis': 'metabolic acidosis',
  'metabolic-alkalosis': 'metabolic alkalosis',
  'respiratory-acidosis': 'respiratory acidosis',
  'respiratory-alkalosis': 'respiratory alkalosis',
};

/**
 * How a reading writes gas pressures: in mmHg, or where the note's gas unit is kPa, in kPa first
 * with mmHg in brackets (`PaO2 7.9 kPa (59 mmHg)`), as hints and hovers do. Thresholds and ranges
 * are then in kPa. Every number takes the decimals that keep it on its side of the thresholds
 * it is read against (mmHg arguments; NaN: none).
 */
class GasWords {
  constructor(readonly kpa: boolean) {}

  /** A pressure: `59 mmHg`, or `7.9 kPa (59 mmHg)`. */
  value(mmHg: number, t1 = NaN, t2 = NaN, t3 = NaN, kpaDecimals = KPA_DECIMALS): string {
    const inMmhg = `${formatAgainst(mmHg, 0, t1, t2, t3)} mmHg`;
    if (!this.kpa) return inMmhg;
    return `${formatAgainst(kpaFromMmhg(mmHg), kpaDecimals, kpaFromMmhg(t1), kpaFromMmhg(t2), kpaFromMmhg(t3))} kPa (${inMmhg})`;
  }

  /**
   * A measured pressure with the resolution it was written with (`writtenResolutionMmhg`): a
   * threshold it is on is not pushed apart from it by more decimals (6.7 kPa on 50 mmHg shows
   * as `6.7 kPa (50 mmHg)`, not `(50.3 mmHg)`).
   */
  measured(mmHg: number, resolution: number, t1 = NaN, t2 = NaN, t3 = NaN): string {
    const off = (t: number) => (sideOf(mmHg, t, resolution) === 0 ? NaN : t);
    return this.value(mmHg, off(t1), off(t2), off(t3), kpaDecimalsOf(resolution));
  }

  /**
   * A threshold a value is on (`sideOf` gives 0): `60 mmHg`, or in kPa with the decimals the value
   * was written with, at least one (`8.0 kPa`, not the `7.999 kPa` that 60 mmHg is).
   */
  on(mmHg: number, resolution: number): string {
    if (!this.kpa) return `${formatShort(mmHg)} mmHg`;
    return `${formatNumber(kpaFromMmhg(mmHg), kpaDecimalsOf(resolution))} kPa`;
  }

  /** A threshold read against `value`: `60 mmHg`, or `8.0 kPa`. */
  threshold(mmHg: number, value = NaN): string {
    if (!this.kpa) return `${formatShort(mmHg)} mmHg`;
    return `${formatAgainst(kpaFromMmhg(mmHg), KPA_DECIMALS, kpaFromMmhg(value))} kPa`;
  }

  /** A limit read against `value`, with the decimals of the values it limits: `13 mmHg`, or `2.9 kPa`. */
  limit(mmHg: number, value = NaN): string {
    return this.kpa ? `${formatAgainst(kpaFromMmhg(mmHg), KPA_DECIMALS, kpaFromMmhg(value))} kPa` : `${formatAgainst(mmHg, 0, value)} mmHg`;
  }

  /** A range with its unit, ends shown against `observed`: `28.5–32.5 mmHg`, or `3.8–4.3 kPa`. */
  range(low: number, high: number, observed: number): string {
    if (!this.kpa) return `${rangeAgainst(low, high, 0, observed)} mmHg`;
    return `${rangeAgainst(kpaFromMmhg(low), kpaFromMmhg(high), KPA_DECIMALS, kpaFromMmhg(observed))} kPa`;
  }
}

/** The kPa decimals a value was written with, from its resolution (`writtenResolutionMmhg`); at least one. */
function kpaDecimalsOf(resolutionMmhg: number): number {
  if (!(resolutionMmhg > 0)) return KPA_DECIMALS;
  return Math.max(KPA_DECIMALS, Math.round(-Math.log10((2 * resolutionMmhg) / MMHG_PER_KPA)));
}

export function interpret(c: DeriveContext, settings: Settings): Interpretation[] {
  const out: Interpretation[] = [];
  const gasHere = c.statedHere('pao2') || c.statedHere('paco2') || c.statedHere('ph');
  if (!gasHere) return out;
  const pao2 = c.field('pao2', 'PaO2');
  const paco2 = c.field('paco2', 'PaCO2');
  const line = (pao2 ?? paco2)?.origin.kind === 'here' ? ((pao2 ?? paco2)!.origin as { line: number }).line : null;
  const push = (topic: Interpretation['topic'], text: string, basis: string[], notable = true) => out.push({ topic, text, basis, line, notable });
  const gas = new GasWords(showsKpa(c.timepoint));

  // A gas written in kPa is compared with a threshold at the resolution it was written with, so
  // that it falls on the side the mmHg value it is written for would: 8.0 kPa as 60 mmHg, 6.7 kPa as 50.
  const o2Resolution = c.writtenResolutionMmhg('pao2');
  const co2Resolution = c.writtenResolutionMmhg('paco2');
  const hypoxaemic = pao2 !== null && sideOf(pao2.value, settings.hypoxaemiaBelowMmhg, o2Resolution) < 0;
  const hypercapnic = paco2 !== null && sideOf(paco2.value, settings.hypercapniaAboveMmhg, co2Resolution) > 0;
  const fio2 = c.fio2();
  const onOxygen = fio2 !== null && fio2.value > 0.21 + 1e-9;
  // An oxygen device in force whose FiO2 is not stated (a cannula, a mask): oxygen, amount unknown.
  const device = fio2 === null ? c.word('device')?.word ?? null : null;
  const oxygenDevice = device !== null && device !== 'room air' ? device : null;

  // A PaO2 above the alveolar PO2 the FiO2, pressure and PaCO2 allow (PN401): one of them is wrong,
  // so nothing is read from the PaO2 until the note is mended (as PN402 holds the acid–base reading).
  const alveolar = pao2 ? c.derivedValue('pao2_alveolar') : null;
  const impossible = pao2 !== null && alveolar !== null && isAboveAlveolar(pao2.value, alveolar.value);
  const notRead = 'the FiO2, pressure, PaCO2 and PaO2 stated cannot go together (see PN401)';

  // Oxygenation
  if (pao2 && impossible) {
    push('oxygenation', `PaO2 ${gas.value(pao2.value)}: oxygenation not read, as ${notRead}.`, ['pao2', 'pao2_alveolar'], false);
  } else if (pao2) {
    const pf = c.derivedValue('pf_ratio');
    // A P/F from a PaO2 written in kPa is read at the PaO2's resolution divided by the FiO2: 16.0 kPa
    // on FiO2 0.60 (P/F 200.02 mmHg) is on the 200 mmHg boundary, as 120 mmHg on 0.60 is.
    const pfResolution = fio2 !== null && fio2.value > 0 ? o2Resolution / fio2.value : 0;
    // Numbers are shown with the decimals that keep them on their side of the thresholds named.
    const hypoxaemiaAt = settings.hypoxaemiaBelowMmhg;
    const pao2Shown = (t1: number, t2 = NaN) => gas.measured(pao2.value, o2Resolution, t1, t2);
    const onHypoxaemiaThreshold = sideOf(pao2.value, hypoxaemiaAt, o2Resolution) === 0;
    if (hypoxaemic) {
      const grade = sideOf(pao2.value, SEVERE_HYPOXAEMIA_MMHG, o2Resolution) < 0 ? 'severe' : 'moderate';
      push('oxygenation', `PaO2 ${pao2Shown(hypoxaemiaAt, SEVERE_HYPOXAEMIA_MMHG)}: consistent with ${grade} hypoxaemia (below ${gas.threshold(hypoxaemiaAt, pao2.value)}${grade === 'severe' ? `, and below ${gas.threshold(SEVERE_HYPOXAEMIA_MMHG, pao2.value)}` : ''})${onOxygen ? ` despite ${fio2Words(fio2)}` : ''}.`, ['pao2']);
    } else if (onOxygen && pf && sideOf(pf.value, 300, pfResolution) <= 0) {
      const carried = carriedWords(fio2);
      push('oxygenation', `PaO2 ${pao2Shown(hypoxaemiaAt)} on FiO2 ${formatNumber(fio2.value, 2)} (P/F ${gas.kpa ? `${kpaNumber(pf.value)} kPa, ` : ''}${formatAgainst(pf.value, 0, 300)} mmHg${carried ? `; ${carried}` : ''}): consistent with impaired oxygenation supported by oxygen.`, ['pao2', 'pf_ratio']);
    } else if (sideOf(pao2.value, LOW_NORMAL_PAO2_MMHG, o2Resolution) < 0) {
      const where = onHypoxaemiaThreshold ? `at the hypoxaemia threshold of ${gas.on(hypoxaemiaAt, o2Resolution)}, not below it` : `above the hypoxaemia threshold of ${gas.threshold(hypoxaemiaAt, pao2.value)}`;
      push('oxygenation', `PaO2 ${pao2Shown(hypoxaemiaAt, LOW_NORMAL_PAO2_MMHG)}: consistent with mildly reduced oxygenation, ${where}.`, ['pao2'], false);
    } else {
      push('oxygenation', `PaO2 ${pao2Shown(LOW_NORMAL_PAO2_MMHG)}${onOxygen ? ` on ${fio2Words(fio2)}` : ''}: consistent with adequate arterial oxygenation.`, ['pao2'], false);
    }
    // Berlin oxygenation band: only with PEEP or CPAP ≥ 5 cmH2O; an oxygenation band, never a diagnosis.
    const peep = c.peepLike();
    const adjusted = c.derivedValue('pf_ratio_altitude_adjusted');
    const pfForBand = adjusted ?? pf;
    if (pfForBand && peep && peep.value >= BERLIN_MIN_PEEP_CMH2O) {
      // The altitude adjustment scales the resolution as it scales the P/F.
      const resolution = pf && pf.value > 0 ? (pfResolution * pfForBand.value) / pf.value : 0;
      const onBoundary = BERLIN_BOUNDARIES.find((b) => sideOf(pfForBand.value, b, resolution) === 0 && resolution > 0);
      const band = berlinOxygenationBand(onBoundary ?? pfForBand.value);
      if (band) {
        const words = band === 'pf-200-to-300' ? '200–300' : band === 'pf-100-to-200' ? '100–200' : '≤ 100';
        // The bands are defined in mmHg: a kPa note gets the P/F in both units.
        const pfShown = `${onBoundary ?? formatAgainst(pfForBand.value, 0, 100, 200, 300)} mmHg`;
        const carried = carriedWords(fio2, peep);
        push('oxygenation-band', `P/F ${gas.kpa ? `${kpaNumber(pfForBand.value)} kPa (${pfShown})` : pfShown}${adjusted ? ' (adjusted for altitude)' : ''} with ${peep.name} ${formatAgainst(peep.value, 0, BERLIN_MIN_PEEP_CMH2O)} cmH2O${carried ? ` (${carried})` : ''}: consistent with the ${words} mmHg oxygenation band of the Berlin definition (the band called ${BERLIN_BAND_SEVERITY[band]} there) — an oxygenation band, not a diagnosis.`, [adjusted ? 'pf_ratio_altitude_adjusted' : 'pf_ratio', peep.fieldId ?? 'peep']);
      }
    }
  }

  // Ventilation
  if (paco2) {
    const v = paco2.value;
    const hypercapniaAt = settings.hypercapniaAboveMmhg;
    const hypocapnic = sideOf(v, settings.hypocapniaBelowMmhg, co2Resolution) < 0;
    const below = sideOf(v, hypercapniaAt, co2Resolution) === 0 ? `at the hypercapnia threshold of ${gas.on(hypercapniaAt, co2Resolution)}, not above it` : `below the hypercapnia threshold of ${gas.threshold(hypercapniaAt, v)}`;
    const text = hypercapnic
      ? `consistent with hypercapnia (above ${gas.threshold(hypercapniaAt, v)}): ventilation is not clearing CO2`
      : sideOf(v, UPPER_NORMAL_PACO2_MMHG, co2Resolution) > 0
        ? `consistent with a mildly raised PaCO2, ${below}`
        : hypocapnic
          ? `consistent with hypocapnia (below ${gas.threshold(settings.hypocapniaBelowMmhg, v)}): ventilation above metabolic need`
          : 'consistent with normal ventilation';
    push('ventilation', `PaCO2 ${gas.measured(v, co2Resolution, hypercapniaAt, UPPER_NORMAL_PACO2_MMHG, settings.hypocapniaBelowMmhg)}: ${text}.`, ['paco2'], hypercapnic || hypocapnic);
  }

  // Respiratory failure
  if (pao2 && paco2 && impossible) {
    push('respiratory-failure', `Respiratory failure not read: ${notRead}.`, ['pao2', 'paco2', 'pao2_alveolar'], false);
  } else if (pao2 && paco2) {
    // The numbers each reading rests on, with the threshold each is read against: `PaO2 52 mmHg, below
    // 60 mmHg`, `PaCO2 50 mmHg, not above 50 mmHg` (a value on a threshold is on neither side).
    const o2At = settings.hypoxaemiaBelowMmhg;
    const co2At = settings.hypercapniaAboveMmhg;
    const o2 = `PaO2 ${gas.measured(pao2.value, o2Resolution, o2At)}`;
    const o2Side = `${hypoxaemic ? 'below' : 'not below'} ${sideOf(pao2.value, o2At, o2Resolution) === 0 ? gas.on(o2At, o2Resolution) : gas.threshold(o2At, pao2.value)}`;
    const co2 = `PaCO2 ${gas.measured(paco2.value, co2Resolution, co2At)}, ${hypercapnic ? 'above' : 'not above'} ${sideOf(paco2.value, co2At, co2Resolution) === 0 ? gas.on(co2At, co2Resolution) : gas.threshold(co2At, paco2.value)}`;
    if (hypoxaemic && hypercapnic) push('respiratory-failure', `Consistent with type 2 (hypercapnic) respiratory failure: hypoxaemia with hypercapnia (${o2}, ${o2Side}; ${co2}).`, ['pao2', 'paco2']);
    else if (hypoxaemic) push('respiratory-failure', `Consistent with type 1 (hypoxaemic) respiratory failure: hypoxaemia with normal or low PaCO2 (${o2}, ${o2Side}; ${co2}).`, ['pao2', 'paco2']);
    else if (hypercapnic && onOxygen) push('respiratory-failure', `Consistent with type 2 (hypercapnic) respiratory failure, with PaO2 held up by supplemental oxygen (${co2}; ${o2} on ${fio2Words(fio2)}).`, ['pao2', 'paco2', 'fio2']);
    else if (hypercapnic && oxygenDevice !== null) push('respiratory-failure', `Consistent with type 2 (hypercapnic) respiratory failure, with PaO2 held up by supplemental oxygen (${co2}; ${o2} with oxygen by ${oxygenDevice}, FiO2 not stated).`, ['pao2', 'paco2', 'device']);
    // FiO2 unknown: oxygen may be holding the PaO2 up, so no negative statement is made.
    else if (hypercapnic && fio2 === null) push('respiratory-failure', `Hypercapnia (${co2}) with ${o2}, ${o2Side}, and no FiO2 stated: on supplemental oxygen this would be consistent with type 2 (hypercapnic) respiratory failure; add ${c.fio2Need()} to tell.`, ['pao2', 'paco2']);
    // Hypercapnia on air is ventilatory failure whatever the PaO2; the type 2 reading here also needs hypoxaemia, and says so rather than calling it no failure.
    else if (hypercapnic) push('respiratory-failure', `Hypercapnia (${co2}) without hypoxaemia on air (${o2}, ${o2Side}): consistent with ventilatory (hypercapnic) failure; the type 2 respiratory failure read here also needs hypoxaemia.`, ['pao2', 'paco2', 'fio2']);
  }

  // Mechanism of hypoxaemia
  if (hypoxaemic) out.push(...mechanism(c, settings, line, gas, hypercapnic));

  // Acid–base
  const cls = classification(c);
  if (cls && !cls.consistency.consistent) {
    const stated = (id: string) => c.field(id)?.value ?? NaN;
    push('acid-base', `Acid–base not interpreted: the reported HCO3 ${formatNumber(stated('hco3'), HCO3_DECIMALS)} mmol/L differs from the ${formatNumber(cls.consistency.calculatedHco3MmolL, HCO3_DECIMALS)} mmol/L that pH ${formatNumber(stated('ph'), PH_DECIMALS)} and PaCO2 ${gas.measured(stated('paco2'), c.writtenResolutionMmhg('paco2'))} give (see PN402), so neither the disorder nor its expected compensation is worked out.`, ['ph', 'paco2', 'hco3'], false);
  } else if (cls) {
    const gapCorrected = c.derivedValue('anion_gap_albumin_corrected') !== null;
    const ph = c.field('ph')?.value ?? NaN;
    const hco3 = c.field('hco3')?.value ?? NaN;
    push('acid-base', acidBaseText(cls, gas, { ph, paco2: paco2?.value ?? NaN, hco3, hypercapniaAboveMmhg: settings.hypercapniaAboveMmhg, co2Resolution: c.writtenResolutionMmhg('paco2'), gapCorrected }), ['ph', 'paco2', 'hco3'], cls.primary !== 'normal' || cls.additional.length > 0);
  }
  return out;
}

function mechanism(c: DeriveContext, settings: Settings, line: number | null, gas: GasWords, hypercapnic: boolean): Interpretation[] {
  const pio2 = c.derivedValue('pio2');
  const gradient = c.derivedValue('aa_gradient');
  const upper = c.derivedValue('aa_gradient_upper_normal');
  const paco2 = c.field('paco2');
  if (pio2 && paco2 && !gradient) {
    // Everything is stated, yet no gradient: the PaO2 is above the alveolar PO2, or that comes out negative.
    return [{ topic: 'hypoxaemia-mechanism', text: 'Mechanism of hypoxaemia not assessed: the FiO2, pressure, PaCO2 and PaO2 stated cannot go together, so there is no A–a gradient (see PN401).', basis: ['pio2', 'paco2', 'pao2'], line, notable: false }];
  }
  if (!pio2 || !gradient || !paco2) {
    const need = !paco2 ? 'pco2' : c.fio2Need();
    return [{ topic: 'hypoxaemia-mechanism', text: `Mechanism of hypoxaemia not assessed: add ${need} to get the A–a gradient.`, basis: [], line, notable: false }];
  }
  const limit = upper?.value ?? AA_UPPER_NORMAL_NO_AGE_MMHG;
  const causes: string[] = [];
  const basis = ['pio2', 'aa_gradient', 'paco2'];
  if (pio2.value < LOW_PIO2_MMHG) causes.push(`low inspired oxygen (PiO2 ${gas.value(pio2.value, LOW_PIO2_MMHG)})`);
  if (hypercapnic) causes.push(`hypoventilation (PaCO2 ${gas.value(paco2.value, settings.hypercapniaAboveMmhg)})`);
  const raised = gradient.value > limit;
  const gradientShown = gas.value(gradient.value, limit);
  const limitShown = gas.limit(limit, gradient.value);
  if (raised) causes.push(`a raised A–a gradient (${gradientShown}, above ${limitShown}): V/Q mismatch, shunt or a diffusion limit`);
  const normalGradient = raised ? '' : ` The A–a gradient (${gradientShown}) is within the ${upper ? 'age-based ' : ''}normal of ${limitShown}${upper ? '' : ' (age unknown)'}.`;
  const fio2 = c.fio2();
  const onOxygen = (fio2?.value ?? 0.21) > 0.21 + 1e-9;
  const caveat = onOxygen ? ' On supplemental oxygen the normal gradient is wider than the air-based limit.' : '';
  // The PiO2 (and so the gradient) rests on the FiO2: say so when it was stated at an earlier timepoint.
  const carried = fio2 !== null && fio2.origin.kind === 'carried' ? ` The PiO2 uses ${fio2Words(fio2)}.` : '';
  if (causes.length === 0) return [{ topic: 'hypoxaemia-mechanism', text: `Hypoxaemia without a low PiO2, hypercapnia or a raised A–a gradient: recheck the inputs.${normalGradient}${carried}${caveat}`, basis, line, notable: true }];
  const text = causes.length === 1 ? `Hypoxaemia consistent with ${causes[0]}.` : `Hypoxaemia consistent with a mix of ${wordList(causes)}.`;
  return [{ topic: 'hypoxaemia-mechanism', text: `${text}${normalGradient}${carried}${caveat}`, basis, line, notable: true }];
}

/**
 * Which of a reading's settings were stated at an earlier timepoint (a ventilator's FiO2 and PEEP
 * carry forward), since the reading is then only as current as that line: `FiO2 and PEEP carried
 * from line 3`; '' when none was. The line, not the timepoint's label: a label is free text.
 */
function carriedWords(...terms: readonly (Term | null)[]): string {
  // Most readings rest on nothing carried: nothing to build then.
  if (!terms.some((t) => t !== null && t.origin.kind === 'carried')) return '';
  const byOrigin = new Map<string, string[]>();
  for (const t of terms) {
    if (t === null || t.origin.kind !== 'carried') continue;
    const where = `carried from line ${t.origin.line + 1}`;
    const names = byOrigin.get(where) ?? [];
    names.push(t.name);
    byOrigin.set(where, names);
  }
  return [...byOrigin].map(([where, names]) => `${wordList(names)} ${where}`).join('; ');
}

/** `FiO2 0.60`, with where it came from when it was carried: `FiO2 0.60 (carried from line 3)`. */
function fio2Words(fio2: Term): string {
  const value = `FiO2 ${formatNumber(fio2.value, 2)}`;
  return fio2.origin.kind === 'carried' ? `${value} (carried from line ${fio2.origin.line + 1})` : value;
}

/** What the acid–base reading names besides the classification: how the PaCO2 was written, and which anion gap was used. */
interface AcidBaseBasis {
  readonly ph: number;
  readonly paco2: number;
  readonly hco3: number;
  readonly co2Resolution: number;
  /** The hypercapnia threshold (setting): the PaCO2 is shown on the side of it the ventilation reading gives. */
  readonly hypercapniaAboveMmhg: number;
  /** The anion gap the classification used was corrected for albumin. */
  readonly gapCorrected: boolean;
}

const PH_DECIMALS = 2;
const HCO3_DECIMALS = 1;

/**
 * The acid–base reading: the disorder the gas is consistent with, then the gas's own numbers with
 * their units, then what the disorder rests on (the expected response and its range, the anion
 * gap and delta ratio), each with its number. It begins "Consistent with …" (the inlay hint's short
 * label is read from that beginning, up to the first semicolon: service/hints.ts acidBaseLabel).
 */
function acidBaseText(cls: AcidBaseClassification, gas: GasWords, basis: AcidBaseBasis): string {
  const parts: string[] = [];
  const { ph, paco2, hco3 } = basis;
  const gap = cls.anionGap;
  const gapKind = gap?.metabolicAcidosisKind;
  const gapWords = gapKind === 'high-anion-gap' ? ' with a high anion gap' : gapKind === 'normal-anion-gap' ? ' with a normal anion gap' : gapKind === 'mixed-anion-gap' ? ' with high and normal anion-gap components' : '';
  const limits = { ph: [PH_NORMAL.low, PH_NORMAL.high], paco2: [PACO2_NORMAL_MMHG.low, PACO2_NORMAL_MMHG.high], hco3: [HCO3_NORMAL_MMOL_L.low, HCO3_NORMAL_MMOL_L.high] } as const;
  const phShown = `pH ${formatAgainst(ph, PH_DECIMALS, limits.ph[0], limits.ph[1])}`;
  const paco2Shown = `PaCO2 ${gas.measured(paco2, basis.co2Resolution, limits.paco2[0], limits.paco2[1], basis.hypercapniaAboveMmhg)}`;
  const hco3Shown = `HCO3 ${formatAgainst(hco3, HCO3_DECIMALS, limits.hco3[0], limits.hco3[1])} mmol/L`;
  const numbers = `${phShown}, ${paco2Shown}, ${hco3Shown}`;
  // The anion gap as the reading names it: `anion gap 26 mmol/L`, `anion gap 23 mmol/L corrected for albumin`.
  const gapShown = gap ? `anion gap ${formatAgainst(gap.valueMmolL, 0, ANION_GAP_UPPER_NORMAL_MMOL_L)} mmol/L${basis.gapCorrected ? ' corrected for albumin' : ''}` : '';
  const ratioShown = gap?.deltaRatio !== null && gap?.deltaRatio !== undefined ? `delta ratio ${formatAgainst(gap.deltaRatio, 2, 0.4, 0.8, 2)}` : '';
  switch (cls.primary) {
    // With a disorder the anion gap shows, the balance is normal only by these three.
    case 'normal': parts.push(`Consistent with normal acid–base balance${cls.additional.length > 0 ? ' by pH, PaCO2 and HCO3' : ''} (${numbers})`); break;
    case 'undetermined': parts.push(`Acid–base reading undetermined: the pH does not follow the PaCO2 and HCO3 (${numbers})`); break;
    case 'mixed-acidosis':
    case 'mixed-alkalosis': {
      const acid = cls.primary === 'mixed-acidosis';
      // Both components beyond their reference ranges, each named with the limit it is beyond.
      const co2Limit = acid ? limits.paco2[1] : limits.paco2[0];
      const hco3Limit = acid ? limits.hco3[0] : limits.hco3[1];
      parts.push(`Consistent with a mixed metabolic and respiratory ${acid ? 'acidosis' : 'alkalosis'} (${phShown}; PaCO2 ${gas.measured(paco2, basis.co2Resolution, co2Limit)} ${acid ? 'above' : 'below'} ${gas.limit(co2Limit, paco2)} and HCO3 ${formatAgainst(hco3, HCO3_DECIMALS, hco3Limit)} mmol/L ${acid ? 'below' : 'above'} ${formatShort(hco3Limit)} mmol/L)`);
      break;
    }
    default: {
      const chron = cls.respiratoryChronicity;
      const timing = chron === 'acute' ? 'acute ' : chron === 'chronic' ? 'chronic ' : '';
      const gapDetail = cls.primary === 'metabolic-acidosis' && gapKind ? `; ${[gapShown, gapKind === 'normal-anion-gap' ? '' : ratioShown].filter(Boolean).join(', ')}` : '';
      parts.push(`Consistent with ${cls.fullyCompensated ? 'a fully compensated ' : ''}${timing}${DISORDER_WORDS[cls.primary]}${cls.primary === 'metabolic-acidosis' ? gapWords : ''} (${numbers}${gapDetail})`);
    }
  }
  const exp = cls.expected;
  const named = new Set<AcidBaseDisorder>();
  if (exp?.kind === 'respiratory-response') {
    // The ends of a range are shown with the decimals that keep the observed value outside or inside it, as it is.
    const o = exp.observed;
    const range = gas.range(exp.range.low, exp.range.high, o);
    if (cls.compensation === 'appropriate') parts[0] += `, with the expected respiratory response (PaCO2 within the expected ${range})`;
    else if (cls.additional.includes('respiratory-acidosis')) { parts.push(`PaCO2 ${gas.measured(o, basis.co2Resolution, exp.range.high)} is above the expected ${range}: consistent with an added respiratory acidosis`); named.add('respiratory-acidosis'); }
    else if (cls.additional.includes('respiratory-alkalosis')) { parts.push(`PaCO2 ${gas.measured(o, basis.co2Resolution, exp.range.low)} is below the expected ${range}: consistent with an added respiratory alkalosis`); named.add('respiratory-alkalosis'); }
  } else if (exp?.kind === 'metabolic-response') {
    const o = exp.observed;
    const acuteRange = `${rangeAgainst(exp.acute.low, exp.acute.high, 0, o)} mmol/L`;
    const chronicRange = `${rangeAgainst(exp.chronic.low, exp.chronic.high, 0, o)} mmol/L`;
    const hco3Against = `HCO3 ${formatAgainst(o, HCO3_DECIMALS, exp.acute.low, exp.acute.high, exp.chronic.low, exp.chronic.high)} mmol/L`;
    const chron = cls.respiratoryChronicity;
    if (cls.compensation !== 'appropriate' && cls.compensation !== 'not-applicable') {
      const added = cls.additional.find((d) => d === 'metabolic-acidosis' || d === 'metabolic-alkalosis');
      parts.push(`${hco3Against} is outside the expected ${acuteRange} (acute) and ${chronicRange} (chronic): consistent with an added ${added ? DISORDER_WORDS[added] : 'metabolic disorder'}`);
      if (added) named.add(added);
    } else if (chron === 'acute') parts[0] += `, with HCO3 within the ${acuteRange} expected if acute (${chronicRange} if chronic)`;
    else if (chron === 'chronic') parts[0] += `, with HCO3 within the ${chronicRange} expected if chronic (${acuteRange} if acute)`;
    else if (chron === 'intermediate') parts.push(`${hco3Against} is between the acute and chronic ranges (${acuteRange} if acute, ${chronicRange} if chronic): evolving, or acute on chronic`);
    else if (chron === 'acute-or-chronic') parts.push(`${hco3Against} is within both the acute (${acuteRange}) and the chronic (${chronicRange}) range, which overlap here, so acute cannot be told from chronic`);
  }
  const extra = cls.additional.filter((d) => d !== cls.primary && !named.has(d));
  if (extra.length > 0) {
    // Disorders added from the anion gap: the gap (and the delta ratio, or an HCO3 not below 24) they rest on.
    const why: string[] = [];
    if (gap?.high && extra.includes('metabolic-acidosis')) why.push(`${gapShown}, above ${ANION_GAP_UPPER_NORMAL_MMOL_L} mmol/L`);
    if (extra.includes('metabolic-alkalosis')) {
      why.push(gap?.deltaRatio === null || gap?.deltaRatio === undefined ? `${extra.includes('metabolic-acidosis') ? 'with ' : `${gapShown} with `}an HCO3 that has not fallen below ${HCO3_CENTRE_MMOL_L} mmol/L` : `${ratioShown}, above 2`);
    }
    parts.push(`also consistent with an added ${extra.map((d) => DISORDER_WORDS[d]).join(' and ')}${why.length > 0 ? ` (${why.join(', ')})` : ''}`);
  }
  return `${parts.join('; ')}.`;
}
