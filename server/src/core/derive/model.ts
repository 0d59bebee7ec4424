/**
 * Derived values: what the core computes from the values in force at a timepoint. Each one
 * carries its value and unit, the formula in words, the formula with the numbers put in, every
 * input with where it came from, and the published source.
 */
import type { Origin } from '../analysis/model';
import type { AcidBaseDisorder, MetabolicAcidosisKind, PrimaryAcidBaseFinding, RespiratoryChronicity } from '../physiology';

export type InputOrigin = Origin | { readonly kind: 'derived'; readonly id: string };

/** Inlay-hint and display categories. */
export type DerivedCategory = 'atmosphere' | 'oxygenation' | 'acid-base' | 'mechanics' | 'transport';

/** One input of a formula. */
export interface Term {
  readonly name: string;
  /** The number put in the formula; NaN for an input that is a word (`word`). */
  readonly value: number;
  /**
   * The word of an input that is one (the oxygen device a cannula's or a mask's FiO2 estimate rests
   * on): it has no number, is put in no formula, and is shown and exported as this word.
   */
  readonly word?: string;
  /** Display unit ('' for dimensionless). */
  readonly unit: string;
  readonly decimals: number;
  readonly origin: InputOrigin;
  /** Field id when the input is a stated value. */
  readonly fieldId?: string;
  /** A remark on how the input was chosen (e.g. "room air"). */
  readonly note?: string;
}

export interface DerivedValue {
  readonly id: string;
  readonly label: string;
  readonly short: string;
  readonly category: DerivedCategory;
  readonly value: number;
  readonly unit: string;
  readonly decimals: number;
  /** For expected ranges: the span; `value` is then the centre. */
  readonly range: { readonly low: number; readonly high: number } | null;
  /** The formula in words, e.g. `PaO2 ÷ FiO2`. */
  readonly formula: string;
  /** The formula with the actual numbers, e.g. `71 ÷ 0.40 = 178`. */
  readonly substituted: string;
  /** The formula template the numbers are put into: input names in braces, e.g. `{PaO2} ÷ {FiO2}`. */
  readonly template: string;
  readonly inputs: readonly Term[];
  readonly source: string;
  /** An estimate by a rough rule (e.g. FiO2 from a cannula's flow). */
  readonly estimate: boolean;
  readonly notes: readonly string[];
  /**
   * A few words written beside the value wherever it is shown on its own (`show`, an inlay hint):
   * a condition its source sets that is not met (`SpO2 > 97 %` beside an S/F ratio), or the
   * published threshold it is read against (`6 h: < 3.47` beside a ROX index after 6 h of high
   * flow). Null elsewhere; a note says it in full, in the hover and JSON.
   */
  readonly caveat: string | null;
  /** True when any input (directly or through another derived value) was carried forward. */
  readonly usesCarried: boolean;
  /** The line the value belongs to (its anchor input's line), for hints. */
  readonly line: number | null;
  /**
   * Decimals of the value (or a range's ends) in kPa where it is a gas pressure shown in kPa first,
   * instead of the unit's one: an expected PaCO2's ends keep the PaCO2 on the side its reading puts it
   * (`GasWords.rangeDecimals`). Null: the unit's own (`KPA_DECIMALS`).
   */
  readonly kpaDecimals: number | null;
  /**
   * The end of the range the measured value it is read against is on at the resolution it was
   * written with, shown in mmHg rounded away from the range's middle (`formatOutward`): the mmHg of
   * a PaCO2 written in kPa can be just beyond an end the reading counts it within. Null: none.
   */
  readonly outwardEnd: 'low' | 'high' | null;
}

/**
 * `text` with the value's caveat after it in parentheses (`S/F 248 (SpO2 > 97 %)`), or `text` as it
 * is where the value has none: the one way a caveat is written beside a value shown on its own
 * (`pneumark show`, the inlay hints). An empty `text` gives the caveat alone, after a blank.
 */
export function besideCaveat(text: string, value: { readonly caveat: string | null }): string {
  return value.caveat === null ? text : `${text} (${value.caveat})`;
}

/** Derived values in mmHg that are no gas pressure (a blood pressure): never shown in kPa. */
const NOT_GAS_PRESSURES: ReadonlySet<string> = new Set(['mean_arterial_pressure']);

/** Whether a derived value (or its definition) is a gas pressure, shown in kPa first where the note's gas unit is kPa. */
export function isGasPressureValue(d: { readonly id: string; readonly unit: string }): boolean {
  return d.unit === 'mmHg' && !NOT_GAS_PRESSURES.has(d.id);
}

/** A derived value that could not be computed, and what to add to get it. */
export interface MissingValue {
  readonly id: string;
  readonly label: string;
  /** Keys to add, as a user would write them. */
  readonly needs: readonly string[];
  readonly message: string;
  readonly line: number | null;
}

/** A derived value whose formula does not apply here, and why. */
export interface NotApplicable {
  readonly id: string;
  readonly label: string;
  readonly reason: string;
  readonly line: number | null;
  /**
   * The code of the finding that withholds the value (PN401: the PaO2 cannot be), when it could be
   * computed but its inputs contradict each other: what people read says where it would have been
   * (`WITHHELD_BECAUSE`). Null for a formula that merely does not apply here.
   */
  readonly withheldBy: string | null;
  /**
   * True where the inputs are there but the formula does not hold for the treatment in force (the
   * simplified mechanical power in a pressure mode): what people read says why, where the value
   * would have been. False (or absent) for a formula that merely lacks its anchor.
   */
  readonly explained?: boolean;
}

/** Why values are withheld, by the code of the finding that withholds them: a clause for what people read. */
export const WITHHELD_BECAUSE: Readonly<Record<string, string>> = {
  PN401: 'the PaO2 is above the alveolar PO2 that the FiO2, pressure and PaCO2 in force allow (see PN401)',
  PN312: 'the set rate of 0 cannot be right in a mode that delivers mandatory breaths, and no rate is measured (see PN312)',
};

/**
 * Why values are withheld where no alveolar PO2 is worked out (no usable PaCO2) and the PaO2 is
 * above the inspired PO2 (PN401): the reason of such an outcome, said as it is.
 */
export const ABOVE_INSPIRED_BECAUSE = 'the PaO2 is above the inspired PO2 that the FiO2 and pressure in force allow, which the alveolar PO2 never exceeds (see PN401)';

/** `withheld: the PaO2 is above … (see PN401)`, or the reason itself for a finding not listed. */
export function withheldText(n: NotApplicable): string {
  return n.withheldBy !== null && n.reason !== ABOVE_INSPIRED_BECAUSE ? WITHHELD_BECAUSE[n.withheldBy] ?? n.reason : n.reason;
}

export type InterpretationTopic = 'oxygenation' | 'oxygenation-band' | 'ventilation' | 'respiratory-failure' | 'hypoxaemia-mechanism' | 'acid-base' | 'venous';

/** An assessment line, always phrased "consistent with ...". */
export interface Interpretation {
  readonly topic: InterpretationTopic;
  readonly text: string;
  /** Ids of the derived values and fields it rests on. */
  readonly basis: readonly string[];
  readonly line: number | null;
  /** Abnormal, worth a diagnostic (a normal reading is shown but not reported). */
  readonly notable: boolean;
  /** What the acid–base reading decided, typed (topic `acid-base` only; null for every other reading). */
  readonly acidBase: AcidBaseFinding | null;
}

/**
 * What an acid–base reading decided, as data: what its text says in words, set by the code that
 * decides it (derive/interpret.ts, which phrases the text from it too). What names the reading
 * in short (the inlay hint's label, service/hints.ts) reads this, never the text.
 */
export interface AcidBaseFinding {
  /**
   * What the gas is consistent with: one disorder; a mixed metabolic and respiratory acidosis or
   * alkalosis; normal by pH, PaCO2 and HCO3; undetermined (the pH does not follow the PaCO2 and
   * HCO3); or `not-read`: the pH, PaCO2 and HCO3 do not fit together (PN402), and nothing is read.
   */
  readonly primary: PrimaryAcidBaseFinding | 'not-read';
  /**
   * The timing of a respiratory disorder, as the expected HCO3 tells it: acute, chronic, between
   * the two ranges (`intermediate`: evolving, or acute on chronic), or in both (`acute-or-chronic`).
   * Null for any other primary, or where the HCO3 is outside both ranges.
   */
  readonly phase: RespiratoryChronicity | null;
  /** One disorder, fully compensated: a normal pH with the compensating component beyond its reference interval. */
  readonly fullyCompensated: boolean;
  /**
   * The anion gap of the metabolic acidosis the primary names (a metabolic or a mixed acidosis):
   * high, normal, or both (`mixed-anion-gap`). Null without a gap worked out, or for another primary.
   */
  readonly anionGap: MetabolicAcidosisKind | null;
  /**
   * The disorder the response points to when it is outside the range expected for the primary
   * ("consistent with an added respiratory acidosis"): a suspicion, shown with a `?`.
   * `metabolic-disorder` where the reading cannot say which. Null when the response is as expected.
   */
  readonly suspected: AcidBaseDisorder | 'metabolic-disorder' | null;
  /** The further disorders the reading adds ("also consistent with an added …", from the anion gap), in the order it names them. */
  readonly added: readonly AcidBaseDisorder[];
}

export interface TimepointDerivation {
  readonly timepoint: number;
  readonly derived: readonly DerivedValue[];
  readonly missing: readonly MissingValue[];
  readonly notApplicable: readonly NotApplicable[];
  readonly interpretations: readonly Interpretation[];
}
