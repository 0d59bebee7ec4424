/**
 * Interpretations: the assessment lines a clinician would write, each phrased "consistent
 * with ...", built only from values and derived values of this timepoint. Thresholds are
 * settings (hypoxaemia PaO2 < 60 mmHg and hypercapnia PaCO2 > 50 mmHg by default, common
 * practice). Grades and cut-offs not taken from settings are named below with their source.
 */
import { ALKALOSIS_ANION_GAP_MARGIN_MMOL_L, ANION_GAP_UPPER_NORMAL_MMOL_L, BERLIN_BAND_SEVERITY, HCO3_CENTRE_MMOL_L, HCO3_NORMAL_MMOL_L, PACO2_NORMAL_MMHG, PH_NORMAL, berlinOxygenationBand, inspiredPo2Humidified, type AcidBaseClassification, type AcidBaseDisorder, type BerlinOxygenationBand, type MetabolicAcidosisKind, type PrimaryAcidBaseFinding } from '../physiology';
import { sideOf } from '../physiology/numeric';
import type { Settings } from '../settings';
import { decimalsAgainst, formatAgainst, formatAgeYears, formatNumber, formatShort, rangeAgainst, wordList, writtenDecimals } from '../util/format';
import { carriedFromText, kpaFromMmhg, kpaNumber, kpaResolutionMmhg, showsKpa, statedKpaNumber, statedNumber } from '../present';
import type { StatedValue } from '../analysis/model';
import { classification, paco2ApartFromRange } from './acid-base';
import { GAS_KPA, GAS_MMHG, GasWords, kpaDecimalsOf, offThreshold } from './gas-words';
import { readVenous } from './venous';
import { allowanceAt, isAboveAlveolar, isAboveInspiredAt, isUnderAdultAge } from './gas-exchange';
import { SEA_LEVEL_MMHG } from './atmosphere';
import { ADULT_FROM_YEARS, type DeriveContext, type Term } from './context';
import { ABOVE_INSPIRED_BECAUSE, type AcidBaseFinding, type DerivedValue, type Interpretation, type InterpretationTopic } from './model';
import { NONE } from '../util/lists';
import { fieldById } from '../fields/registry';
import type { SectionId } from '../fields/sections';

/** PaO2 below this (mmHg) grades hypoxaemia as severe (common practice, no source). */
export const SEVERE_HYPOXAEMIA_MMHG = 40;
/** PaO2 below this (mmHg) is below the usual range for adults breathing air (common practice). */
export const LOW_NORMAL_PAO2_MMHG = 80;
/** Upper normal PaCO2 (mmHg) (common practice). */
export const UPPER_NORMAL_PACO2_MMHG = 45;
/** PiO2 below this (mmHg) counts as low inspired oxygen: sea-level air gives about 150 (our convention). */
export const LOW_PIO2_MMHG = 140;
/**
 * The humidified PiO2 (mmHg) of air at sea level: 0.21 × (760 − 47) = 149.7. A PiO2 below it, with
 * the A–a gradient normal, lowers the alveolar PO2 even above LOW_PIO2_MMHG. Source: `inspired-po2`.
 */
const SEA_LEVEL_AIR_PIO2_MMHG = inspiredPo2Humidified(0.21, SEA_LEVEL_MMHG) ?? 149.7;
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

/** What a reading's text is built from, on first read: the gas it belongs to. */
type Phrase = (g: GasFacts) => string;

/**
 * One reading. Its text is phrased on first read: the reading checks report only the notable
 * readings, and most gases have a normal ventilation and acid–base reading that a check never
 * shows (`show`, hovers and exports read every text, and get the same words).
 */
class Reading implements Interpretation {
  readonly topic: InterpretationTopic;
  readonly basis: readonly string[];
  readonly line: number | null;
  readonly notable: boolean;
  readonly acidBase: AcidBaseFinding | null;
  // ES private fields: not own properties, so comparing two readings looks at what they say.
  #gas: GasFacts | null;
  /** The text, or until it is first read, how to phrase it. */
  #text: Phrase | string;

  constructor(topic: InterpretationTopic, basis: readonly string[], gas: GasFacts, notable: boolean, phrase: Phrase | string, acidBase: AcidBaseFinding | null = null) {
    this.topic = topic;
    this.basis = basis;
    this.line = gas.line;
    this.notable = notable;
    this.acidBase = acidBase;
    this.#gas = typeof phrase === 'string' ? null : gas;
    this.#text = phrase;
  }

  get text(): string {
    const known = this.#text;
    if (typeof known === 'string') return known;
    const text = known(this.#gas!);
    this.#text = text;
    this.#gas = null;
    return text;
  }

  /** As JSON, the text is written as a field was (a getter is not an own property). */
  toJSON(): Interpretation {
    return { topic: this.topic, text: this.text, basis: this.basis, line: this.line, notable: this.notable, acidBase: this.acidBase };
  }
}

// The fields and derived values each reading rests on: one list each, shared by every gas.
const BASIS_PAO2: readonly string[] = ['pao2'];
const BASIS_PAO2_ALVEOLAR: readonly string[] = ['pao2', 'pao2_alveolar'];
const BASIS_PAO2_INSPIRED: readonly string[] = ['pao2', 'pio2'];
const BASIS_PAO2_PF: readonly string[] = ['pao2', 'pf_ratio'];
const BASIS_PACO2: readonly string[] = ['paco2'];
const BASIS_GASES: readonly string[] = ['pao2', 'paco2'];
const BASIS_GASES_ALVEOLAR: readonly string[] = ['pao2', 'paco2', 'pao2_alveolar'];
const BASIS_GASES_FIO2: readonly string[] = ['pao2', 'paco2', 'fio2'];
const BASIS_GASES_DEVICE: readonly string[] = ['pao2', 'paco2', 'device'];
const BASIS_ACID_BASE: readonly string[] = ['ph', 'paco2', 'hco3'];
const BASIS_MECHANISM: readonly string[] = ['pio2', 'aa_gradient', 'paco2'];
const BASIS_MECHANISM_NOT_READ: readonly string[] = ['pio2', 'paco2', 'pao2'];
const BASIS_NONE: readonly string[] = [];

/** Why nothing is read from a PaO2 above the alveolar PO2 (PN401). */
const NOT_READ = 'the FiO2, pressure, PaCO2 and PaO2 stated cannot go together (see PN401)';
/** The same where no PaCO2 is used: the PaO2 is above the inspired PO2. */
const NOT_READ_INSPIRED = ABOVE_INSPIRED_BECAUSE;

/**
 * The gas at one timepoint as its readings see it: the values, what they are compared with, and
 * which side of each threshold they fall on. Made once per gas and shared by its readings.
 */
class GasFacts {
  readonly gas: GasWords;
  readonly pao2: Term | null;
  readonly paco2: Term | null;
  /** The gas line, for the reading checks (null when the gas was not stated here). */
  readonly line: number | null;
  readonly o2Resolution: number;
  readonly co2Resolution: number;
  readonly hypoxaemic: boolean;
  readonly hypercapnic: boolean;
  readonly fio2: Term | null;
  readonly onOxygen: boolean;
  /** An oxygen device in force whose FiO2 is not stated (a cannula, a mask): oxygen, amount unknown. */
  readonly oxygenDevice: string | null;
  /** A PaO2 above the alveolar PO2 the FiO2, pressure and PaCO2 allow, or above the inspired PO2 where no PaCO2 is used (PN401). */
  readonly impossible: boolean;
  /** The second case of `impossible`: no alveolar PO2 is worked out, and the PaO2 is above the inspired PO2. */
  readonly aboveInspired: boolean;
  /** Set by the oxygenation reading: the P/F, and the Berlin band's P/F, PEEP and boundary. */
  pf: DerivedValue | null = null;
  bandPf: DerivedValue | null = null;
  adjusted = false;
  peep: Term | null = null;
  onBoundary: number | undefined = undefined;
  band: BerlinOxygenationBand | null = null;
  /** The band's PEEP is noninvasive (EPAP on NIV, CPAP on an oxygen line): the definition names the 200–300 mmHg band only there. */
  noninvasive = false;
  cls: AcidBaseClassification | null = null;
  /** Set with `cls`: what the acid–base reading decides from it, which its text says. */
  acidBase: ReadFinding | null = null;

  constructor(readonly c: DeriveContext, readonly settings: Settings) {
    const pao2 = (this.pao2 = c.field('pao2', 'PaO2'));
    const paco2 = (this.paco2 = c.field('paco2', 'PaCO2'));
    const lineOf = pao2 ?? paco2;
    this.line = lineOf !== null && lineOf.origin.kind === 'here' ? lineOf.origin.line : null;
    this.gas = showsKpa(c.timepoint) ? GAS_KPA : GAS_MMHG;
    // A gas written in kPa is compared with a threshold at the resolution it was written with, so
    // that it falls on the side the mmHg value it is written for would: 8.0 kPa as 60 mmHg, 6.7 kPa as 50.
    this.o2Resolution = c.writtenResolutionMmhg('pao2');
    this.co2Resolution = c.writtenResolutionMmhg('paco2');
    this.hypoxaemic = pao2 !== null && sideOf(pao2.value, settings.hypoxaemiaBelowMmhg, this.o2Resolution) < 0;
    this.hypercapnic = paco2 !== null && sideOf(paco2.value, settings.hypercapniaAboveMmhg, this.co2Resolution) > 0;
    const fio2 = (this.fio2 = c.fio2());
    this.onOxygen = fio2 !== null && fio2.value > 0.21 + 1e-9;
    const device = fio2 === null ? c.word('device')?.word ?? null : null;
    this.oxygenDevice = device !== null && device !== 'room air' ? device : null;
    // One of the FiO2, pressure, PaCO2 and PaO2 is wrong, so nothing is read from the PaO2 until the
    // note is mended (as PN402 holds the acid–base reading).
    const alveolar = pao2 ? c.derivedValue('pao2_alveolar') : null;
    this.aboveInspired = pao2 !== null && alveolar === null && isAboveInspiredAt(c, pao2.value);
    this.impossible = this.aboveInspired || (pao2 !== null && alveolar !== null && isAboveAlveolar(pao2.value, alveolar.value, allowanceAt(c)));
  }
}

/** The sections a PaO2, PaCO2 or pH can be stated in (the blood gas line). */
const GAS_SECTIONS: readonly SectionId[] = [...new Set(['pao2', 'paco2', 'ph'].flatMap((id) => fieldById(id)?.sections ?? []))];

/** Whether a PaO2, PaCO2 or pH is stated at this timepoint: the readings are of a gas stated here. */
function gasStatedHere(c: DeriveContext): boolean {
  // Most timepoints state no gas. A field stated here is among the values stated here, on a line of
  // one of its sections: without such a line, the values in force need not be asked.
  const stated = c.timepoint.stated;
  for (let i = 0; i < stated.length; i++) {
    const section = stated[i]!.section;
    // Compared one by one (`includes` on strings takes a slow path here).
    for (let k = 0; k < GAS_SECTIONS.length; k++) {
      if (section === GAS_SECTIONS[k]) return readHere(c, 'pao2') || readHere(c, 'paco2') || c.statedHere('ph');
    }
  }
  return false;
}

/** Whether a field is stated here, reading its value (the readings read the PaO2 and PaCO2 next). */
function readHere(c: DeriveContext, id: string): boolean {
  return c.input(id)?.origin.kind === 'here';
}

export function interpret(c: DeriveContext, settings: Settings): readonly Interpretation[] {
  // No arterial gas here: a venous gas stated here, if any, is read for what it can say.
  if (!gasStatedHere(c)) return readVenous(c);
  const g = new GasFacts(c, settings);
  const out: Interpretation[] = [];
  if (g.pao2 !== null) readOxygenation(g, out);
  if (g.paco2 !== null) {
    const v = g.paco2.value;
    const hypocapnic = sideOf(v, settings.hypocapniaBelowMmhg, g.co2Resolution) < 0;
    out.push(new Reading('ventilation', BASIS_PACO2, g, g.hypercapnic || hypocapnic, ventilationText));
  }
  readRespiratoryFailure(g, out);
  if (g.hypoxaemic) out.push(mechanism(g));
  const cls = (g.cls = classification(c));
  if (cls && !cls.consistency.consistent) out.push(new Reading('acid-base', BASIS_ACID_BASE, g, false, acidBaseNotReadText, NOT_READ_FINDING));
  else if (cls) {
    const finding = (g.acidBase = acidBaseFinding(cls));
    out.push(new Reading('acid-base', BASIS_ACID_BASE, g, cls.primary !== 'normal' || cls.additional.length > 0, acidBaseReadingText, finding));
  }
  return out;
}

function readOxygenation(g: GasFacts, out: Interpretation[]): void {
  const { c, settings, pao2, fio2 } = g;
  if (pao2 === null) return;
  if (g.impossible) {
    out.push(new Reading('oxygenation', g.aboveInspired ? BASIS_PAO2_INSPIRED : BASIS_PAO2_ALVEOLAR, g, false, oxygenationNotReadText));
    return;
  }
  const pf = (g.pf = c.derivedValue('pf_ratio'));
  // A P/F from a PaO2 written in kPa is read at the PaO2's resolution divided by the FiO2: 16.0 kPa
  // on FiO2 0.60 (P/F 200.02 mmHg) is on the 200 mmHg boundary, as 120 mmHg on 0.60 is.
  const pfResolution = fio2 !== null && fio2.value > 0 ? g.o2Resolution / fio2.value : 0;
  if (g.hypoxaemic) out.push(new Reading('oxygenation', BASIS_PAO2, g, true, hypoxaemiaText));
  else if (g.onOxygen && pf && sideOf(pf.value, 300, pfResolution) <= 0) out.push(new Reading('oxygenation', BASIS_PAO2_PF, g, true, supportedOxygenationText));
  else if (sideOf(pao2.value, LOW_NORMAL_PAO2_MMHG, g.o2Resolution) < 0) out.push(new Reading('oxygenation', BASIS_PAO2, g, false, mildlyReducedText));
  else out.push(new Reading('oxygenation', BASIS_PAO2, g, false, adequateOxygenationText));
  // Berlin oxygenation band: only with PEEP or CPAP ≥ 5 cmH2O (on noninvasive support, the
  // 200–300 mmHg band only: see BELOW_NONINVASIVE_BAND_WORDS); an oxygenation band, never a diagnosis.
  // Not under HFOV: an oscillator sets a mean airway pressure and no PEEP, so the definition's
  // condition on PEEP is not met nor failed there (the oxygenation index is worked out instead).
  if (c.oscillation()) return;
  const peep = (g.peep = c.peepLike());
  const adjusted = c.derivedValue('pf_ratio_altitude_adjusted');
  const pfForBand = adjusted ?? pf;
  if (!pfForBand || !peep) return;
  // A child on invasive ventilation: the Berlin bands were made in adults, and the pediatric
  // consensus (PALICC 2015) grades a ventilated child's oxygenation by the oxygenation index
  // instead. Under the adult age Pneumark uses elsewhere (our convention: PALICC names none), the
  // P/F is not read against the bands, and the reading says why. Noninvasive support is read as before.
  const age = peep.fieldId === 'peep' ? c.field('age', 'age') : null;
  const child = age !== null && isUnderAdultAge(age.value);
  if (peep.value < BERLIN_MIN_PEEP_CMH2O) {
    // Below the definition's PEEP or CPAP, a P/F a band would be given for is said not to be read
    // against the bands, rather than left without a word (not for a child, whom no band is for).
    if (!child && pf !== null && berlinOxygenationBand(pfForBand.value) !== null) {
      g.peep = peep;
      out.push(new Reading('oxygenation-band', [pf.id, peep.fieldId ?? 'peep'], g, false, `P/F ${pfText(g, pf.value)} with ${peep.name} ${formatShort(peep.value)} cmH2O${carriedOf(g.fio2, peep)}: ${LOW_PEEP_BAND_WORDS}`));
    }
    return;
  }
  if (child && age !== null && pf !== null) {
    g.peep = peep;
    out.push(new Reading('oxygenation-band', BASIS_CHILD_BAND, g, false, `P/F ${pfText(g, pf.value)} with ${peep.name} ${formatShort(peep.value)} cmH2O${carriedOf(g.fio2, peep)} at age ${formatAgeYears(age.value)} y: ${CHILD_BAND_WORDS}`));
    return;
  }
  // The altitude adjustment scales the resolution as it scales the P/F.
  const resolution = pf && pf.value > 0 ? (pfResolution * pfForBand.value) / pf.value : 0;
  const onBoundary = boundaryOn(pfForBand.value, resolution);
  const band = berlinOxygenationBand(onBoundary ?? pfForBand.value);
  if (!band) return;
  g.bandPf = pfForBand;
  g.adjusted = adjusted !== null;
  g.onBoundary = onBoundary;
  g.band = band;
  g.noninvasive = peep.fieldId !== 'peep';
  out.push(new Reading('oxygenation-band', [adjusted ? 'pf_ratio_altitude_adjusted' : 'pf_ratio', peep.fieldId ?? 'peep'], g, true, berlinBandText));
}

const BASIS_CHILD_BAND: readonly string[] = ['pf_ratio', 'peep', 'age'];
/** What the band reading says of a P/F at or under 300 mmHg below a PEEP or CPAP of 5 cmH2O (ARDS Definition Task Force, JAMA 2012). */
const LOW_PEEP_BAND_WORDS = `not read against the oxygenation bands of the Berlin definition, which grade oxygenation only with PEEP or CPAP of at least ${BERLIN_MIN_PEEP_CMH2O} cmH2O.`;

/** A P/F as the band readings write it: in kPa first at a gas read in kPa. */
function pfText(g: GasFacts, pfMmhg: number): string {
  return g.gas.kpa ? `${kpaNumber(pfMmhg)} kPa (${formatShort(pfMmhg, 0)} mmHg)` : `${formatShort(pfMmhg, 0)} mmHg`;
}
/** What the band reading says of a child on invasive ventilation, after its numbers (Khemani RG et al, PALICC, Pediatr Crit Care Med 2015;16(5 Suppl 1):S23–S40). */
const CHILD_BAND_WORDS = 'not read against the oxygenation bands of the Berlin definition, which were made in adults; the pediatric consensus (PALICC 2015) grades the oxygenation of a ventilated child by the oxygenation index instead.';

/** The Berlin boundary (mmHg) a P/F read at `resolution` is on, if any (none when read exactly). */
function boundaryOn(pf: number, resolution: number): number | undefined {
  if (!(resolution > 0)) return undefined;
  for (const b of BERLIN_BOUNDARIES) if (sideOf(pf, b, resolution) === 0) return b;
  return undefined;
}

function readRespiratoryFailure(g: GasFacts, out: Interpretation[]): void {
  const { pao2, paco2, hypoxaemic, hypercapnic } = g;
  if (pao2 === null || paco2 === null) return;
  if (g.impossible) out.push(new Reading('respiratory-failure', g.aboveInspired ? BASIS_PAO2_INSPIRED : BASIS_GASES_ALVEOLAR, g, false, `Respiratory failure not read: ${g.aboveInspired ? NOT_READ_INSPIRED : NOT_READ}.`));
  // Neither hypoxaemia nor hypercapnia (the usual gas): no respiratory failure reading.
  else if (hypoxaemic && hypercapnic) out.push(new Reading('respiratory-failure', BASIS_GASES, g, true, type2Text));
  else if (hypoxaemic) out.push(new Reading('respiratory-failure', BASIS_GASES, g, true, type1Text));
  else if (!hypercapnic) return;
  else if (g.onOxygen) out.push(new Reading('respiratory-failure', BASIS_GASES_FIO2, g, true, type2OnOxygenText));
  else if (g.oxygenDevice !== null) out.push(new Reading('respiratory-failure', BASIS_GASES_DEVICE, g, true, type2OnDeviceText));
  // FiO2 unknown: oxygen may be holding the PaO2 up, so no negative statement is made.
  else if (g.fio2 === null) out.push(new Reading('respiratory-failure', BASIS_GASES, g, true, hypercapniaNoFio2Text));
  // Hypercapnia on air is ventilatory failure whatever the PaO2; the type 2 reading here also needs hypoxaemia, and says so rather than calling it no failure.
  else out.push(new Reading('respiratory-failure', BASIS_GASES_FIO2, g, true, hypercapniaOnAirText));
}

// The readings' words. Each is called with the gas it reads, on the first read of the text, and
// only where the reading checks above chose it (so `pao2`, `paco2`, `fio2`… are there when used).

function oxygenationNotReadText(g: GasFacts): string {
  return `PaO2 ${g.gas.measured(g.pao2!.value, g.o2Resolution)}: oxygenation not read, as ${g.aboveInspired ? NOT_READ_INSPIRED : NOT_READ}.`;
}

/** The PaO2 with the decimals that keep it on its side of the thresholds named. */
function pao2Shown(g: GasFacts, t1: number, t2 = NaN): string {
  return g.gas.measured(g.pao2!.value, g.o2Resolution, t1, t2);
}

function hypoxaemiaText(g: GasFacts): string {
  const { gas, fio2 } = g;
  const pao2 = g.pao2!.value;
  const hypoxaemiaAt = g.settings.hypoxaemiaBelowMmhg;
  const grade = sideOf(pao2, SEVERE_HYPOXAEMIA_MMHG, g.o2Resolution) < 0 ? 'severe' : 'moderate';
  // On oxygen whose FiO2 is not stated (a cannula, a mask), the device is named, as the hypercapnic reading names it.
  const despite = g.onOxygen ? ` despite ${fio2Words(fio2!)}` : g.oxygenDevice !== null ? ` despite oxygen by ${g.oxygenDevice}, FiO2 not stated` : '';
  return `PaO2 ${pao2Shown(g, hypoxaemiaAt, SEVERE_HYPOXAEMIA_MMHG)}: consistent with ${grade} hypoxaemia (below ${gas.threshold(hypoxaemiaAt, pao2)}${grade === 'severe' ? `, and below ${gas.threshold(SEVERE_HYPOXAEMIA_MMHG, pao2)}` : ''})${despite}.`;
}

function supportedOxygenationText(g: GasFacts): string {
  const fio2 = g.fio2!;
  const pf = g.pf!.value;
  const carried = carriedWords(fio2);
  return `PaO2 ${pao2Shown(g, g.settings.hypoxaemiaBelowMmhg)} on FiO2 ${formatNumber(fio2.value, 2)} (P/F ${g.gas.kpa ? `${kpaNumber(pf)} kPa, ` : ''}${formatAgainst(pf, 0, 300)} mmHg${carried ? `; ${carried}` : ''}): consistent with impaired oxygenation supported by oxygen.`;
}

function mildlyReducedText(g: GasFacts): string {
  const { gas } = g;
  const pao2 = g.pao2!.value;
  const hypoxaemiaAt = g.settings.hypoxaemiaBelowMmhg;
  const onThreshold = sideOf(pao2, hypoxaemiaAt, g.o2Resolution) === 0;
  const where = onThreshold ? `at the hypoxaemia threshold of ${gas.on(hypoxaemiaAt, g.o2Resolution)}, not below it` : `above the hypoxaemia threshold of ${gas.threshold(hypoxaemiaAt, pao2)}`;
  // On oxygen of an FiO2 not stated the PaO2 is not graded as a mild impairment: it may hide a severe one.
  if (deviceNoFio2(g) !== '') return `PaO2 ${pao2Shown(g, hypoxaemiaAt, LOW_NORMAL_PAO2_MMHG)}${deviceNoFio2(g)}: consistent with a PaO2 ${where} on oxygen, which may still hide impaired gas exchange: add ${g.c.fio2Need()} to grade it.`;
  return `PaO2 ${pao2Shown(g, hypoxaemiaAt, LOW_NORMAL_PAO2_MMHG)}: consistent with mildly reduced oxygenation, ${where}.`;
}

function adequateOxygenationText(g: GasFacts): string {
  return `PaO2 ${pao2Shown(g, LOW_NORMAL_PAO2_MMHG)}${g.onOxygen ? ` on ${fio2Words(g.fio2!)}` : deviceNoFio2(g)}: consistent with adequate arterial oxygenation${fio2ToTell(g)}.`;
}

/**
 * On oxygen by a device whose FiO2 is not stated (a cannula, a mask), a PaO2 at or above the
 * hypoxaemia threshold says nothing of how much oxygen holds it there: a PaO2 of 70 mmHg on a
 * reservoir mask is no mild impairment. The readings name the device, as the hypoxaemia reading
 * does, and what to add to tell; '' off oxygen or with an FiO2.
 */
function deviceNoFio2(g: GasFacts): string {
  return !g.onOxygen && g.oxygenDevice !== null ? ` with oxygen by ${g.oxygenDevice}, FiO2 not stated` : '';
}

function fio2ToTell(g: GasFacts): string {
  return deviceNoFio2(g) !== '' ? ` on oxygen: add ${g.c.fio2Need()} to tell how well the lungs oxygenate` : '';
}

function berlinBandText(g: GasFacts): string {
  const band = g.band!;
  const pf = g.bandPf!.value;
  const peep = g.peep!;
  // The bands are defined in mmHg: a kPa note gets the P/F in both units.
  const pfShown = `${g.onBoundary ?? formatAgainst(pf, 0, 100, 200, 300)} mmHg`;
  const carried = carriedWords(g.fio2, peep);
  // On noninvasive support (EPAP, an oxygen line's CPAP) the definition names the 200–300 mmHg band only.
  const words = g.noninvasive && band !== 'pf-200-to-300' ? BELOW_NONINVASIVE_BAND_WORDS : BAND_WORDS[band];
  return `P/F ${g.gas.kpa ? `${kpaNumber(pf)} kPa (${pfShown})` : pfShown}${g.adjusted ? ' (adjusted for altitude)' : ''} with ${peep.name} ${formatAgainst(peep.value, 0, BERLIN_MIN_PEEP_CMH2O)} cmH2O${carried ? ` (${carried})` : ''}${words}`;
}

/**
 * What the band reading says of a P/F at or below 200 mmHg on noninvasive support: the Berlin
 * definition names its 200–300 mmHg band "with PEEP or CPAP ≥ 5 cmH2O", which may be given
 * noninvasively, and its two lower bands "with PEEP ≥ 5 cmH2O" only, on invasive ventilation
 * (ARDS Definition Task Force, JAMA 2012;307:2526–2533).
 */
const BELOW_NONINVASIVE_BAND_WORDS = ': below the 200–300 mmHg oxygenation band, the one band the Berlin definition names on noninvasive support (its 100–200 and ≤ 100 mmHg bands need PEEP on invasive ventilation) — an oxygenation band, not a diagnosis.';

/**
 * What the band reading says of each band, after its numbers: written once rather than pieced
 * together for every gas (most gases on PEEP give one).
 */
const BAND_WORDS: Readonly<Record<BerlinOxygenationBand, string>> = {
  'pf-200-to-300': bandWords('pf-200-to-300', '200–300'),
  'pf-100-to-200': bandWords('pf-100-to-200', '100–200'),
  'pf-100-or-below': bandWords('pf-100-or-below', '≤ 100'),
};

function bandWords(band: BerlinOxygenationBand, range: string): string {
  return `: consistent with the ${range} mmHg oxygenation band of the Berlin definition (the band called ${BERLIN_BAND_SEVERITY[band]} there) — an oxygenation band, not a diagnosis.`;
}

/**
 * A low PaCO2 in a primary metabolic acidosis is the breathing's response to it (Winters' formula
 * expects it: Albert, Dell & Winters 1967), not ventilation above need: so the ventilation reading
 * says where the acid–base reading finds such an acidosis with its response as expected or short of
 * it. Where the PaCO2 is below what the acidosis calls for (an added respiratory alkalosis
 * suspected), the ventilation is above it, and the words say so as before. The acid–base finding is
 * set on the facts after this reading is made, and read when its text is first asked for.
 */
function respondsToMetabolicAcidosis(g: GasFacts): boolean {
  const finding = g.acidBase;
  return finding !== null && finding.primary === 'metabolic-acidosis' && finding.suspected !== 'respiratory-alkalosis';
}

const RESPONSE_TO_ACIDOSIS = 'the breathing\'s response to the metabolic acidosis (the acid–base reading compares it with the response expected)';

/**
 * The mirror of `respondsToMetabolicAcidosis`: a raised PaCO2 in a primary metabolic alkalosis is
 * the breathing's response to it (PaCO2 40 + 0.7 × (HCO3 − 24) ± 2: Berend et al. 2014), not
 * ventilation failing to clear CO2, where the acid–base reading finds the PaCO2 within or short of
 * the response (not above it: an added respiratory acidosis is then suspected, and the words stay
 * as before).
 */
function respondsToMetabolicAlkalosis(g: GasFacts): boolean {
  const finding = g.acidBase;
  return finding !== null && finding.primary === 'metabolic-alkalosis' && finding.suspected !== 'respiratory-acidosis';
}

const RESPONSE_TO_ALKALOSIS = 'the breathing\'s response to the metabolic alkalosis (the acid–base reading compares it with the response expected)';

/** What the hypercapnic failure readings add where the raised PaCO2 is that response: '' elsewhere. */
function alkalosisResponseNote(g: GasFacts): string {
  return respondsToMetabolicAlkalosis(g) ? `; the raised PaCO2 may be ${RESPONSE_TO_ALKALOSIS}` : '';
}

/**
 * A PaCO2 within its reference interval is not "normal ventilation" where the acid–base reading finds
 * a primary metabolic disorder whose respiratory response it is outside of: above the range a
 * metabolic acidosis calls for (Winters' formula: Albert, Dell & Winters 1967), an added respiratory
 * acidosis, or below the range a metabolic alkalosis calls for (Berend et al. 2014), an added
 * respiratory alkalosis. The words say so, as the acid–base reading does; '' where neither holds.
 */
function outsideMetabolicResponse(g: GasFacts): string {
  const finding = g.acidBase;
  if (finding === null) return '';
  const [low, high] = NORMAL_LIMITS.paco2;
  const within = `a PaCO2 within its reference range (${g.gas.range(low, high, g.paco2!.value, g.co2Resolution)})`;
  if (finding.primary === 'metabolic-acidosis' && finding.suspected === 'respiratory-acidosis') return `${within} but above what the metabolic acidosis calls for: ventilation short of the response expected ${AGAINST_RESPONSE}`;
  if (finding.primary === 'metabolic-alkalosis' && finding.suspected === 'respiratory-alkalosis') return `${within} but below what the metabolic alkalosis calls for: ventilation beyond the response expected ${AGAINST_RESPONSE}`;
  return '';
}

const AGAINST_RESPONSE = '(the acid–base reading compares it with that response)';

function ventilationText(g: GasFacts): string {
  const { gas, settings, co2Resolution } = g;
  const v = g.paco2!.value;
  const hypercapniaAt = settings.hypercapniaAboveMmhg;
  const text = g.hypercapnic
    ? `consistent with hypercapnia (above ${gas.threshold(hypercapniaAt, v)}): ${respondsToMetabolicAlkalosis(g) ? RESPONSE_TO_ALKALOSIS : 'ventilation is not clearing CO2'}`
    : sideOf(v, UPPER_NORMAL_PACO2_MMHG, co2Resolution) > 0
      ? `consistent with a mildly raised PaCO2, ${sideOf(v, hypercapniaAt, co2Resolution) === 0 ? `at the hypercapnia threshold of ${gas.on(hypercapniaAt, co2Resolution)}, not above it` : `below the hypercapnia threshold of ${gas.threshold(hypercapniaAt, v)}`}${respondsToMetabolicAlkalosis(g) ? `: ${RESPONSE_TO_ALKALOSIS}` : ''}`
      : sideOf(v, settings.hypocapniaBelowMmhg, co2Resolution) < 0
        ? `consistent with hypocapnia (below ${gas.threshold(settings.hypocapniaBelowMmhg, v)}): ${respondsToMetabolicAcidosis(g) ? RESPONSE_TO_ACIDOSIS : 'ventilation above metabolic need'}`
        : `consistent with ${outsideMetabolicResponse(g) || 'normal ventilation'}`;
  return `PaCO2 ${gas.measured(v, co2Resolution, hypercapniaAt, UPPER_NORMAL_PACO2_MMHG, settings.hypocapniaBelowMmhg)}: ${text}.`;
}

// The numbers each respiratory failure reading rests on, with the threshold each is read against:
// `PaO2 52 mmHg, below 60 mmHg`, `PaCO2 50 mmHg, not above 50 mmHg` (a value on a threshold is on neither side).

function o2Words(g: GasFacts): string {
  return `PaO2 ${pao2Shown(g, g.settings.hypoxaemiaBelowMmhg)}`;
}

function o2Side(g: GasFacts): string {
  const pao2 = g.pao2!.value;
  const o2At = g.settings.hypoxaemiaBelowMmhg;
  return `${g.hypoxaemic ? 'below' : 'not below'} ${sideOf(pao2, o2At, g.o2Resolution) === 0 ? g.gas.on(o2At, g.o2Resolution) : g.gas.threshold(o2At, pao2)}`;
}

function co2Words(g: GasFacts): string {
  const paco2 = g.paco2!.value;
  const co2At = g.settings.hypercapniaAboveMmhg;
  return `PaCO2 ${g.gas.measured(paco2, g.co2Resolution, co2At)}, ${g.hypercapnic ? 'above' : 'not above'} ${sideOf(paco2, co2At, g.co2Resolution) === 0 ? g.gas.on(co2At, g.co2Resolution) : g.gas.threshold(co2At, paco2)}`;
}

function type2Text(g: GasFacts): string {
  return `Consistent with type 2 (hypercapnic) respiratory failure: hypoxaemia with hypercapnia (${o2Words(g)}, ${o2Side(g)}; ${co2Words(g)})${alkalosisResponseNote(g)}.`;
}

/**
 * Type 1 is hypoxaemia without hypercapnia. Its PaCO2 is normal or low up to the upper normal
 * (45 mmHg); between that and the hypercapnia threshold (50 mmHg by default) it is raised, though
 * not hypercapnia, and the reading says so rather than calling it normal.
 */
function type1Text(g: GasFacts): string {
  const raised = sideOf(g.paco2!.value, UPPER_NORMAL_PACO2_MMHG, g.co2Resolution) > 0;
  return `Consistent with type 1 (hypoxaemic) respiratory failure: hypoxaemia ${raised ? 'without hypercapnia, PaCO2 mildly raised' : 'with normal or low PaCO2'} (${o2Words(g)}, ${o2Side(g)}; ${co2Words(g)}).`;
}

function type2OnOxygenText(g: GasFacts): string {
  return `Consistent with type 2 (hypercapnic) respiratory failure, with PaO2 held up by supplemental oxygen (${co2Words(g)}; ${o2Words(g)} on ${fio2Words(g.fio2!)})${alkalosisResponseNote(g)}.`;
}

function type2OnDeviceText(g: GasFacts): string {
  return `Consistent with type 2 (hypercapnic) respiratory failure, with PaO2 held up by supplemental oxygen (${co2Words(g)}; ${o2Words(g)} with oxygen by ${g.oxygenDevice}, FiO2 not stated)${alkalosisResponseNote(g)}.`;
}

function hypercapniaNoFio2Text(g: GasFacts): string {
  return `Consistent with hypercapnia (${co2Words(g)}) with ${o2Words(g)}, ${o2Side(g)}, and no FiO2 stated: on supplemental oxygen this would be consistent with type 2 (hypercapnic) respiratory failure; add ${g.c.fio2Need()} to tell${alkalosisResponseNote(g)}.`;
}

function hypercapniaOnAirText(g: GasFacts): string {
  // Where the raised PaCO2 is the response to a metabolic alkalosis, it is not called ventilatory failure.
  if (respondsToMetabolicAlkalosis(g)) return `Consistent with hypercapnia (${co2Words(g)}) without hypoxaemia on air (${o2Words(g)}, ${o2Side(g)}), which may be ${RESPONSE_TO_ALKALOSIS} rather than ventilatory failure.`;
  return `Consistent with hypercapnia (${co2Words(g)}) without hypoxaemia on air (${o2Words(g)}, ${o2Side(g)}), and so with ventilatory (hypercapnic) failure; type 2 respiratory failure, as Pneumark reads it, also needs hypoxaemia.`;
}

function acidBaseNotReadText(g: GasFacts): string {
  const { c } = g;
  const stated = (id: string) => c.number(id) ?? NaN;
  return `Acid–base not interpreted: the reported HCO3 ${formatNumber(stated('hco3'), HCO3_DECIMALS)} mmol/L differs from the ${formatNumber(g.cls!.consistency.calculatedHco3MmolL, HCO3_DECIMALS)} mmol/L that pH ${formatNumber(stated('ph'), PH_DECIMALS)} and PaCO2 ${g.gas.measured(stated('paco2'), c.writtenResolutionMmhg('paco2'))} give (see PN402), so neither the disorder nor its expected compensation is worked out.`;
}

function acidBaseReadingText(g: GasFacts): string {
  const { c, settings } = g;
  // Named only beside an anion gap: without one, the correction is not asked for.
  const gapCorrected = g.cls!.anionGap !== null && c.derivedValue('anion_gap_albumin_corrected') !== null;
  const ph = c.number('ph') ?? NaN;
  const hco3 = c.number('hco3') ?? NaN;
  // The anion gap takes the laboratory's bicarbonate where one is stated (derive/acid-base.ts).
  const gapSerumHco3 = g.cls!.anionGap !== null ? c.number('hco3_serum') : null;
  return acidBaseText(g.cls!, g.acidBase!, g.gas, { ph, paco2: g.paco2?.value ?? NaN, hco3, hypercapniaAboveMmhg: settings.hypercapniaAboveMmhg, co2Resolution: g.co2Resolution, gapCorrected, gapSerumHco3 });
}

/** The mechanism of hypoxaemia (a hypoxaemic gas only, so phrased at once). */
function mechanism(g: GasFacts): Interpretation {
  const { c, settings, gas, hypercapnic } = g;
  const pio2 = c.derivedValue('pio2');
  const gradient = c.derivedValue('aa_gradient');
  const upper = c.derivedValue('aa_gradient_upper_normal');
  const paco2 = c.field('paco2');
  if (pio2 && paco2 && !gradient) {
    // Everything is stated, yet no gradient: the PaO2 is above the alveolar PO2, or that comes out negative.
    return new Reading('hypoxaemia-mechanism', BASIS_MECHANISM_NOT_READ, g, false, 'Consistent with hypoxaemia, its mechanism not assessed: the FiO2, pressure, PaCO2 and PaO2 stated cannot go together, so there is no A–a gradient (see PN401).');
  }
  if (!pio2 || !gradient || !paco2) {
    // What the PiO2 lacks: the FiO2, or a usable place.
    const need = !paco2 ? 'pco2' : wordList(c.lacking('pio2'));
    return new Reading('hypoxaemia-mechanism', BASIS_NONE, g, false, `Consistent with hypoxaemia, its mechanism not assessed: add ${need} to get the A–a gradient.`);
  }
  const limit = upper?.value ?? AA_UPPER_NORMAL_NO_AGE_MMHG;
  const causes: string[] = [];
  if (pio2.value < LOW_PIO2_MMHG) causes.push(`low inspired oxygen (PiO2 ${gas.value(pio2.value, LOW_PIO2_MMHG)})`);
  if (hypercapnic) causes.push(`hypoventilation (PaCO2 ${gas.measured(paco2.value, g.co2Resolution, settings.hypercapniaAboveMmhg)})`);
  const raised = gradient.value > limit;
  const gradientShown = gas.value(gradient.value, limit);
  const limitShown = gas.limit(limit, gradient.value);
  // Without an age-based limit: the age is unknown, or a child's (the age rules were made in adults).
  const age = upper ? null : c.field('age');
  const child = age !== null && isUnderAdultAge(age.value);
  const noAgeLimit = child ? `no age-based normal under ${ADULT_FROM_YEARS} years` : 'age unknown';
  if (raised) causes.push(`a raised A–a gradient (${gradientShown}, above ${limitShown}${child ? `; ${noAgeLimit}` : ''}): V/Q mismatch, shunt or a diffusion limit`);
  const normalGradient = raised ? '' : ` The A–a gradient (${gradientShown}) is within the ${upper ? 'age-based ' : ''}normal of ${limitShown}${upper ? '' : ` (${noAgeLimit})`}.`;
  const fio2 = c.fio2();
  const onOxygen = (fio2?.value ?? 0.21) > 0.21 + 1e-9;
  const caveat = onOxygen ? ' On supplemental oxygen the normal gradient is wider than the air-based limit.' : '';
  // The PiO2 (and so the gradient) rests on the FiO2: say so when it was stated at an earlier timepoint.
  const carried = fio2 !== null && fio2.origin.kind === 'carried' ? ` The PiO2 uses ${fio2Words(fio2)}.` : '';
  if (causes.length === 0) {
    // With the gradient normal, the PaO2 is low because the alveolar PO2 is (alveolar gas equation):
    // a PaCO2 above its normal range and a PiO2 below sea-level air's lower it together, though
    // neither is past its own threshold (PaCO2 50 at PB 715 mmHg: PAO2 78 mmHg, PaO2 59).
    const alveolar = c.derivedValue('pao2_alveolar');
    const lowering: string[] = [];
    if (sideOf(paco2.value, UPPER_NORMAL_PACO2_MMHG, g.co2Resolution) > 0) {
      lowering.push(`mild hypoventilation (PaCO2 ${gas.measured(paco2.value, g.co2Resolution, UPPER_NORMAL_PACO2_MMHG, settings.hypercapniaAboveMmhg)}, above ${gas.limit(UPPER_NORMAL_PACO2_MMHG, paco2.value)} but not above ${gas.limit(settings.hypercapniaAboveMmhg, paco2.value)})`);
    }
    if (pio2.value < SEA_LEVEL_AIR_PIO2_MMHG - 0.5) {
      lowering.push(`a PiO2 a little below that of air at sea level (${gas.value(pio2.value, LOW_PIO2_MMHG)}, about ${gas.limit(SEA_LEVEL_AIR_PIO2_MMHG, pio2.value)} there)`);
    }
    if (alveolar && lowering.length > 0) {
      const short = lowering.length === 1 ? 'short of its threshold' : 'neither past its own threshold';
      return new Reading('hypoxaemia-mechanism', BASIS_MECHANISM, g, true, `Consistent with hypoxaemia from a low alveolar PO2 (PAO2 ${gas.value(alveolar.value, LOW_PIO2_MMHG)}) from ${wordList(lowering)}, ${short}.${normalGradient}${carried}${caveat}`);
    }
    return new Reading('hypoxaemia-mechanism', BASIS_MECHANISM, g, true, `Consistent with hypoxaemia, yet without a low PiO2, hypercapnia or a raised A–a gradient: recheck the inputs.${normalGradient}${carried}${caveat}`);
  }
  const text = causes.length === 1 ? `Consistent with hypoxaemia from ${causes[0]}.` : `Consistent with hypoxaemia from a mix of ${wordList(causes)}.`;
  return new Reading('hypoxaemia-mechanism', BASIS_MECHANISM, g, true, `${text}${normalGradient}${carried}${caveat}`);
}

/**
 * Which of a reading's settings were stated at an earlier timepoint (a ventilator's FiO2 and PEEP
 * carry forward), since the reading is then only as current as that line: `FiO2 and PEEP carried
 * from line 3`; '' when none was. The line, not the timepoint's label: a label is free text.
 */
function carriedWords(first: Term | null, second: Term | null = null): string {
  // Most readings rest on nothing carried: nothing to build then.
  const a = first !== null && first.origin.kind === 'carried' ? first : null;
  const b = second !== null && second.origin.kind === 'carried' ? second : null;
  if (a === null || b === null) {
    const one = a ?? b;
    return one === null ? '' : `${one.name} ${carriedFrom(one)}`;
  }
  // Both carried: named together when they came from one line (`FiO2 and PEEP carried from line 3`),
  // each name once (as `wordList` names two).
  if (carriedLine(a) !== carriedLine(b)) return `${a.name} ${carriedFrom(a)}; ${b.name} ${carriedFrom(b)}`;
  return `${a.name === b.name ? a.name : `${a.name} and ${b.name}`} ${carriedFrom(a)}`;
}

/** ` (FiO2 carried from line 3)` where a setting the reading rests on was stated earlier; '' otherwise. */
function carriedOf(first: Term | null, second: Term | null): string {
  const carried = carriedWords(first, second);
  return carried ? ` (${carried})` : '';
}

function carriedLine(t: Term): number {
  return t.origin.kind === 'carried' ? t.origin.line : -1;
}

/** `carried from line 3`; `carried from day 1 10:00, line 3` from another day (`carriedFromText`). */
function carriedFrom(t: Term): string {
  return t.origin.kind === 'carried' ? carriedFromText(t.origin, 'line') : '';
}

/** `FiO2 0.60`, with where it came from when it was carried: `FiO2 0.60 (carried from line 3)`. */
function fio2Words(fio2: Term): string {
  const value = `FiO2 ${formatNumber(fio2.value, 2)}`;
  return fio2.origin.kind === 'carried' ? `${value} (${carriedFromText(fio2.origin, 'line')})` : value;
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
  /**
   * The laboratory's bicarbonate (mmol/L) the anion gap and the delta ratio were worked out with, or
   * null when they took the gas HCO3: the reading names it where it rests on it, since it is not the
   * HCO3 the reading shows.
   */
  readonly gapSerumHco3: number | null;
}

/** The reference ranges the acid–base reading shows its numbers against. */
const NORMAL_LIMITS = { ph: [PH_NORMAL.low, PH_NORMAL.high], paco2: [PACO2_NORMAL_MMHG.low, PACO2_NORMAL_MMHG.high], hco3: [HCO3_NORMAL_MMOL_L.low, HCO3_NORMAL_MMOL_L.high] } as const;

const PH_DECIMALS = 2;
const HCO3_DECIMALS = 1;

/** The finding of a gas that is read: its pH, PaCO2 and HCO3 fit together. */
type ReadFinding = AcidBaseFinding & { readonly primary: PrimaryAcidBaseFinding };

/** The finding of a gas whose pH, PaCO2 and HCO3 do not fit together (PN402): nothing is read. */
const NOT_READ_FINDING: AcidBaseFinding = Object.freeze({ primary: 'not-read', phase: null, fullyCompensated: false, anionGap: null, suspected: null, added: NONE });
/** The finding of most gases: normal, nothing added (shared, as nothing is made for it). */
const NORMAL_FINDING: ReadFinding = Object.freeze({ primary: 'normal', phase: null, fullyCompensated: false, anionGap: null, suspected: null, added: NONE });

/**
 * What the acid–base reading decides from the classification of a gas whose numbers fit together:
 * the disorder it names first, its timing and compensation, the anion gap of its metabolic
 * acidosis, the disorder a response outside its expected range points to, and the disorders the
 * anion gap adds besides. `acidBaseText` says in words what this decides, and nothing else does.
 */
function acidBaseFinding(cls: AcidBaseClassification): ReadFinding {
  const primary = cls.primary;
  const additional = cls.additional;
  if (primary === 'normal' && additional.length === 0) return NORMAL_FINDING;
  const exp = cls.expected;
  let suspected: AcidBaseFinding['suspected'] = null;
  if (exp?.kind === 'respiratory-response') {
    // A PaCO2 outside the range expected for a metabolic primary: an added respiratory disorder.
    if (cls.compensation !== 'appropriate') suspected = additional.includes('respiratory-acidosis') ? 'respiratory-acidosis' : additional.includes('respiratory-alkalosis') ? 'respiratory-alkalosis' : null;
  } else if (exp?.kind === 'metabolic-response' && cls.compensation !== 'appropriate' && cls.compensation !== 'not-applicable') {
    // An HCO3 outside both ranges expected for a respiratory primary: an added metabolic disorder.
    suspected = additional.find((d) => d === 'metabolic-acidosis' || d === 'metabolic-alkalosis') ?? 'metabolic-disorder';
  }
  // Most gases add no disorder: no list is made then, and an empty one is the shared one.
  const kept = additional.length === 0 ? NONE : additional.filter((d) => d !== primary && d !== suspected);
  const added: readonly AcidBaseDisorder[] = kept.length === 0 ? NONE : kept;
  // The anion gap is named with the metabolic acidosis of the primary (a metabolic acidosis added besides has its own reasons).
  const anionGap = primary === 'metabolic-acidosis' || primary === 'mixed-acidosis' ? cls.anionGap?.metabolicAcidosisKind ?? null : null;
  return { primary, phase: cls.respiratoryChronicity, fullyCompensated: cls.fullyCompensated, anionGap, suspected, added };
}

/** How the reading names the anion gap of the metabolic acidosis of its primary. */
const ANION_GAP_WORDS: Readonly<Record<MetabolicAcidosisKind, string>> = {
  'high-anion-gap': ' with a high anion gap',
  'normal-anion-gap': ' with a normal anion gap',
  'mixed-anion-gap': ' with high and normal anion-gap components',
};

/**
 * The acid–base reading: the disorder the gas is consistent with, then the gas's own numbers with
 * their units, then what the disorder rests on (the expected response and its range, the anion
 * gap and delta ratio), each with its number. It begins "Consistent with …". It says in words
 * what `finding` decides (the inlay hint's short label is made from that finding, not from these
 * words: service/hints.ts acidBaseLabel); the classification gives the numbers.
 */
function acidBaseText(cls: AcidBaseClassification, finding: ReadFinding, gas: GasWords, basis: AcidBaseBasis): string {
  // The text's parts, separated by `; ` (built as one string: no list to join).
  let text: string;
  const { ph, paco2, hco3 } = basis;
  const gap = cls.anionGap;
  const gapKind = finding.anionGap;
  const gapWords = gapKind === null ? '' : ANION_GAP_WORDS[gapKind];
  const limits = NORMAL_LIMITS;
  const phShown = `pH ${formatAgainst(ph, PH_DECIMALS, limits.ph[0], limits.ph[1])}`;
  const exp = cls.expected;
  const suspected = finding.suspected;
  // A PaCO2 read against the range expected for a metabolic disorder is written once for the
  // sentence, on the side of that range's ends its reading puts it (`paco2BesideRange`): 2.20 kPa
  // (16.5 mmHg) below 2.22–2.75 kPa, not (17 mmHg) among the gas's numbers first.
  const paco2Text = exp?.kind === 'respiratory-response'
    ? paco2BesideRange(gas, paco2, basis.co2Resolution, exp.range, limits.paco2[0], limits.paco2[1], basis.hypercapniaAboveMmhg)
    : gas.measured(paco2, basis.co2Resolution, limits.paco2[0], limits.paco2[1], basis.hypercapniaAboveMmhg);
  const paco2Shown = `PaCO2 ${paco2Text}`;
  const hco3Shown = `HCO3 ${formatAgainst(hco3, HCO3_DECIMALS, limits.hco3[0], limits.hco3[1])} mmol/L`;
  const numbers = `${phShown}, ${paco2Shown}, ${hco3Shown}`;
  // The anion gap as the reading names it: `anion gap 26 mmol/L`, `anion gap 23 mmol/L corrected for albumin`.
  // Beside a primary metabolic alkalosis with an alkalaemia, also kept on its side of the margin the alkalaemia's own rise is read within.
  const gapMarginEnd = cls.primary === 'metabolic-alkalosis' && cls.phStatus === 'alkalaemia' ? ANION_GAP_UPPER_NORMAL_MMOL_L + ALKALOSIS_ANION_GAP_MARGIN_MMOL_L : NaN;
  const gapShown = gap ? `anion gap ${formatAgainst(gap.valueMmolL, 0, ANION_GAP_UPPER_NORMAL_MMOL_L, gapMarginEnd)} mmol/L${basis.gapCorrected ? ' corrected for albumin' : ''}` : '';
  const ratioShown = gap?.deltaRatio !== null && gap?.deltaRatio !== undefined ? `delta ratio ${formatAgainst(gap.deltaRatio, 2, 0.4, 0.8, 2)}` : '';
  // Where the anion gap names the kind of a metabolic acidosis: the gap, and the delta ratio unless the gap is normal.
  const gapDetail = gapKind !== null ? `; ${[gapShown, gapKind === 'normal-anion-gap' ? '' : ratioShown].filter(Boolean).join(', ')}` : '';
  const primary = finding.primary;
  switch (primary) {
    // With a disorder the anion gap shows, the balance is normal only by these three.
    case 'normal': text = `Consistent with normal acid–base balance${finding.added.length > 0 ? ' by pH, PaCO2 and HCO3' : ''} (${numbers})`; break;
    case 'undetermined': text = `Acid–base reading undetermined: the pH does not follow the PaCO2 and HCO3 (${numbers})`; break;
    case 'mixed-acidosis':
    case 'mixed-alkalosis': {
      const acid = primary === 'mixed-acidosis';
      // Both components beyond their reference ranges, each named with the limit it is beyond.
      const co2Limit = acid ? limits.paco2[1] : limits.paco2[0];
      const hco3Limit = acid ? limits.hco3[0] : limits.hco3[1];
      // The metabolic part of a mixed acidosis is named by its anion gap, as a metabolic acidosis is.
      const metabolicPart = gapKind !== null ? `, the metabolic part${gapWords}` : '';
      text = `Consistent with a mixed metabolic and respiratory ${acid ? 'acidosis' : 'alkalosis'}${metabolicPart} (${phShown}; PaCO2 ${gas.measured(paco2, basis.co2Resolution, co2Limit)} ${acid ? 'above' : 'below'} ${gas.limit(co2Limit, paco2)} and HCO3 ${formatAgainst(hco3, HCO3_DECIMALS, hco3Limit)} mmol/L ${acid ? 'below' : 'above'} ${formatShort(hco3Limit)} mmol/L${gapDetail})`;
      break;
    }
    default: {
      const phase = finding.phase;
      const timing = phase === 'acute' ? 'acute ' : phase === 'chronic' ? 'chronic ' : '';
      text = `Consistent with ${finding.fullyCompensated ? 'a fully compensated ' : ''}${timing}${DISORDER_WORDS[primary]}${gapWords} (${numbers}${gapDetail})`;
    }
  }
  if (exp?.kind === 'respiratory-response') {
    // The ends of a range are shown with the decimals that keep the observed value outside or inside it, as it is.
    const o = exp.observed;
    const { low, high } = exp.range;
    const range = gas.range(low, high, o, basis.co2Resolution);
    if (cls.compensation === 'appropriate') text += `, with the expected respiratory response (PaCO2 within the expected ${range})`;
    // The PaCO2 as the gas's numbers write it, on its side of the end as shown (`paco2BesideRange`).
    else if (suspected === 'respiratory-acidosis') text += `; PaCO2 ${paco2Text} is above the expected ${range}: consistent with an added respiratory acidosis`;
    else if (suspected === 'respiratory-alkalosis') text += `; PaCO2 ${paco2Text} is below the expected ${range}: consistent with an added respiratory alkalosis`;
  } else if (exp?.kind === 'metabolic-response') {
    const o = exp.observed;
    const acuteRange = `${rangeAgainst(exp.acute.low, exp.acute.high, 0, o)} mmol/L`;
    const chronicRange = `${rangeAgainst(exp.chronic.low, exp.chronic.high, 0, o)} mmol/L`;
    const hco3Against = `HCO3 ${formatAgainst(o, HCO3_DECIMALS, exp.acute.low, exp.acute.high, exp.chronic.low, exp.chronic.high)} mmol/L`;
    const phase = finding.phase;
    if (suspected !== null) text += `; ${hco3Against} is outside the expected ${acuteRange} (acute) and ${chronicRange} (chronic): consistent with an added ${suspected === 'metabolic-disorder' ? 'metabolic disorder' : DISORDER_WORDS[suspected]}`;
    else if (phase === 'acute') text += `, with HCO3 within the ${acuteRange} expected if acute (${chronicRange} if chronic)`;
    else if (phase === 'chronic') text += `, with HCO3 within the ${chronicRange} expected if chronic (${acuteRange} if acute)`;
    else if (phase === 'intermediate') text += `; ${hco3Against} is between the acute and chronic ranges (${acuteRange} if acute, ${chronicRange} if chronic): evolving, or acute on chronic`;
    else if (phase === 'acute-or-chronic') text += `; ${hco3Against} is within both the acute (${acuteRange}) and the chronic (${chronicRange}) range, which overlap here, so acute cannot be told from chronic`;
    else if (phase === null) {
      // Within a range, but beside a metabolic disorder the anion gap adds, which moves the HCO3 too.
      const acid = finding.added.includes('metabolic-acidosis');
      const alkali = finding.added.includes('metabolic-alkalosis');
      if (acid || alkali) {
        const moved = acid && alkali ? `${DISORDER_WORDS['metabolic-acidosis']} and ${DISORDER_WORDS['metabolic-alkalosis']} move` : acid ? `${DISORDER_WORDS['metabolic-acidosis']} lowers` : `${DISORDER_WORDS['metabolic-alkalosis']} raises`;
        text += `; HCO3 ${formatNumber(o, HCO3_DECIMALS)} mmol/L does not tell acute from chronic, as the added ${moved} it too (${acuteRange} expected if acute, ${chronicRange} if chronic)`;
      }
    }
  }
  if (gap?.raisedByAlkalosis) {
    // A modest rise beside a primary metabolic alkalosis: said as the alkalaemia's own, not an added acidosis.
    text += `; ${gapShown}, above ${ANION_GAP_UPPER_NORMAL_MMOL_L} mmol/L by no more than ${ALKALOSIS_ANION_GAP_MARGIN_MMOL_L}: consistent with the alkalaemia itself raising the gap rather than an added ${DISORDER_WORDS['metabolic-acidosis']}`;
  }
  const extra = finding.added;
  if (extra.length > 0) {
    // Disorders added from the anion gap: the gap (and the delta ratio, or an HCO3 not below 24) they rest on.
    const why: string[] = [];
    if (gap?.high && extra.includes('metabolic-acidosis')) why.push(`${gapShown}, above ${ANION_GAP_UPPER_NORMAL_MMOL_L} mmol/L`);
    if (extra.includes('metabolic-alkalosis')) {
      // The bicarbonate that has not fallen is the one the gap took: the laboratory's, when stated, is
      // named with its number (the gas HCO3 shown above may well be below 24).
      const notFallen = basis.gapSerumHco3 === null ? 'an HCO3 that' : `a serum HCO3 of ${formatAgainst(basis.gapSerumHco3, HCO3_DECIMALS, HCO3_CENTRE_MMOL_L)} mmol/L, which`;
      why.push(gap?.deltaRatio === null || gap?.deltaRatio === undefined ? `${extra.includes('metabolic-acidosis') ? 'with ' : `${gapShown} with `}${notFallen} has not fallen below ${HCO3_CENTRE_MMOL_L} mmol/L` : `${ratioShown}, above 2`);
    }
    text += `; also consistent with an added ${extra.map((d) => DISORDER_WORDS[d]).join(' and ')}${why.length > 0 ? ` (${why.join(', ')})` : ''}`;
  }
  return `${text}.`;
}

/**
 * A measured PaCO2 (mmHg) beside the PaCO2 expected for a metabolic disorder, `r`, as the acid–base
 * reading writes it: as `GasWords.measured` does against the thresholds `t1`–`t3`, and with the
 * decimals that keep it on its side of each end of `r` as shown beside it (or equal to an end it
 * equals): in kPa the ends as the reading writes them (`GasWords.range`), in mmHg, in brackets or
 * not, as the derived range shows them (`numberText`). An end the PaCO2 is on at the resolution it
 * was written with in kPa pushes nothing apart: its kPa shows as the PaCO2 does, and its mmHg is
 * rounded outward (`DerivedValue.outwardEnd`). In an mmHg note, 17.5 within 13.5–17.5 mmHg is
 * written 17.5, not 18; in a kPa note, 2.20 kPa (16.5 mmHg) below 2.22–2.75 kPa (16.7–20.7 mmHg),
 * not (17 mmHg).
 */
function paco2BesideRange(gas: GasWords, v: number, resolution: number, r: { readonly low: number; readonly high: number }, t1: number, t2: number, t3: number): string {
  const a = offThreshold(v, t1, resolution);
  const b = offThreshold(v, t2, resolution);
  const c = offThreshold(v, t3, resolution);
  const onLow = resolution > 0 && sideOf(v, r.low, resolution) === 0;
  const onHigh = resolution > 0 && sideOf(v, r.high, resolution) === 0;
  // The mmHg ends as the derived range shows them (`paco2RangeDecimals` in acid-base.ts).
  const dm = Math.max(GAS_MMHG.rangeDecimals(r.low, r.high, v, resolution), resolution > 0 ? paco2ApartFromRange(v, resolution, r) : 0);
  const mLow = onLow ? NaN : Number(formatNumber(r.low, dm));
  const mHigh = onHigh ? NaN : Number(formatNumber(r.high, dm));
  // One count for the thresholds and the ends together: 49.61 beside an end shown 49.6 and the 50 of
  // hypercapnia is 49.61, where 49.6 would be that end.
  const mmHg = `${formatNumber(v, decimalsAgainst(v, 0, a, b, c, mLow, mHigh))} mmHg`;
  if (!gas.kpa) return mmHg;
  const kv = kpaFromMmhg(v);
  const dk = gas.rangeDecimals(r.low, r.high, v, resolution);
  const kLow = onLow ? NaN : Number(formatNumber(kpaFromMmhg(r.low), dk));
  const kHigh = onHigh ? NaN : Number(formatNumber(kpaFromMmhg(r.high), dk));
  const base = kpaDecimalsOf(resolution);
  const kpaPlaces = decimalsAgainst(kv, base, kpaFromMmhg(a), kpaFromMmhg(b), kpaFromMmhg(c), kLow, kHigh);
  return `${formatNumber(kv, kpaPlaces)} kPa (${mmHg})`;
}

/**
 * A stated PaO2 or PaCO2 as a row of `show` writes it where gas pressures are shown in kPa first
 * (`7.99 kPa (59.9 mmHg)`), as its kPa and mmHg numbers: each number with the decimals it is shown with anyway (the kPa as
 * written), and more where fewer would put it on the other side of a threshold that a reading
 * reads it against (the union of them: hypoxaemia, severe hypoxaemia and the low normal PaO2;
 * hypercapnia, the normal PaCO2 range and hypocapnia), as the readings write it. A threshold the
 * value is on at the decimals it was written with (6.7 kPa on 50 mmHg) pushes nothing apart, as in
 * `GasWords.measured`. A PaCO2 shown beside the PaCO2 expected for a metabolic disorder
 * (`expected`, its range in mmHg) keeps its side of that range's ends too. Null for any other value.
 */
export function gasAsReadingsShowIt(s: StatedValue, settings: Settings, expected: { readonly low: number; readonly high: number } | null = null): { readonly kpa: string; readonly mmHg: string } | null {
  const v = s.value;
  if (v === null || s.word !== null || s.parts || (s.fieldId !== 'pao2' && s.fieldId !== 'paco2')) return null;
  const kpaShown = statedKpaNumber(s);
  const mmhgShown = statedNumber(s);
  if (kpaShown === null || mmhgShown === null) return null;
  const r = kpaResolutionMmhg(s);
  const o2 = s.fieldId === 'pao2';
  const t1 = offThreshold(v, o2 ? settings.hypoxaemiaBelowMmhg : settings.hypercapniaAboveMmhg, r);
  const t2 = offThreshold(v, o2 ? SEVERE_HYPOXAEMIA_MMHG : UPPER_NORMAL_PACO2_MMHG, r);
  const t3 = offThreshold(v, o2 ? LOW_NORMAL_PAO2_MMHG : settings.hypocapniaBelowMmhg, r);
  const t4 = o2 ? NaN : offThreshold(v, PACO2_NORMAL_MMHG.low, r);
  // A PaCO2 beside the PaCO2 expected for a metabolic disorder (`expected`, the derived range in
  // mmHg) and those ends take decimals that keep them apart (`paco2ApartFromRange`).
  const apart = expected === null || !(r > 0) ? 0 : paco2ApartFromRange(v, r, expected);
  const mmHg = formatNumber(v, Math.max(decimalsAgainst(v, writtenDecimals(mmhgShown), t1, t2, t3, t4), apart));
  const kpa = formatAgainst(kpaFromMmhg(v), writtenDecimals(kpaShown), kpaFromMmhg(t1), kpaFromMmhg(t2), kpaFromMmhg(t3), kpaFromMmhg(t4));
  return { kpa, mmHg };
}
