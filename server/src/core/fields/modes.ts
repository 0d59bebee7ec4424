/**
 * Ventilator modes by family: what the machine is set to deliver in each, and so whether a value
 * written on a `vent` line is a setting (held and carried until changed) or a measurement (in force
 * at its timepoint only). The field registry says it per field (`reading`, `measuredIn`, `setIn`);
 * the timeline, the hovers, the derived values' "add …" and the FHIR export ask `isMeasuredUnder`.
 *
 * - volume (VC, SIMV, SIMV-VC): the tidal volume and the inspiratory flow are set; pressures are measured.
 *   SIMV is run volume-targeted (`SIMV-VC`) or pressure-targeted (`SIMV-PC`); plain `SIMV` is read as
 *   volume-targeted (common practice, no source).
 * - adaptive (PRVC): the tidal volume is set (the target), the pressure and flow follow it.
 * - pressure (PC, SIMV-PC, APRV): a pressure (and a rate or timing) is set; the tidal volume and the flow follow
 *   the lungs and the patient and change from breath to breath.
 * - spontaneous (PS, CPAP): the patient breathes; a support pressure and a backup rate are set.
 * - oscillation (HFOV): a mean airway pressure, an amplitude and a frequency are set.
 *
 * Non-invasive support on an oxygen line (NIV, CPAP), where no mode is in force, gives spontaneous
 * breaths (`SUPPORT_FAMILY`): a vent line under it that states only what that family measures is a
 * line of readings, and ends nothing.
 *
 * A mode word outside this list (`ASV`), or no mode and no such support, has no family: each field is
 * then as its row says by default (a tidal volume a setting, as before).
 */
import type { FieldDef } from './registry';
import type { NoninvasiveSupport } from '../analysis/noninvasive-support';

export type ModeFamily = 'volume' | 'adaptive' | 'pressure' | 'spontaneous' | 'oscillation';

/** The family of each mode the registry lists, by its canonical word. */
export const MODE_FAMILIES: Readonly<Record<string, ModeFamily>> = Object.freeze({
  VC: 'volume',
  SIMV: 'volume',
  'SIMV-VC': 'volume',
  PRVC: 'adaptive',
  PC: 'pressure',
  'SIMV-PC': 'pressure',
  APRV: 'pressure',
  PS: 'spontaneous',
  CPAP: 'spontaneous',
  HFOV: 'oscillation',
});

/**
 * Where the distinction is from: Scottish Intensive Care Society, SICS induction modules,
 * "Ventilation – pressure control ventilation" (web page, year not shown): in pressure control the
 * breath's pressure and, normally, the rate are set, and the tidal volume depends on the compliance
 * and may change from breath to breath (read in its page on scottishintensivecare.org.uk). The other
 * families (pressure support and CPAP, APRV, PRVC's flow, HFOV): common practice, no source.
 */
export const MODE_FAMILY_SOURCE =
  'Scottish Intensive Care Society, SICS induction modules, "Ventilation – pressure control ventilation" (web page, year not shown): in pressure control the pressure and normally the rate are set, and the tidal volume depends on the compliance and may change from breath to breath (read in its page on scottishintensivecare.org.uk); the other families: common practice, no source';

/** What each family sets and measures, in a phrase (the hover of a mode). */
export const FAMILY_MEANING: Readonly<Record<ModeFamily, string>> = Object.freeze({
  volume: 'the tidal volume and the inspiratory flow are set; the airway pressures are measured',
  adaptive: 'the tidal volume is set as a target; the pressure and the flow follow it and are measured',
  pressure: 'a pressure (and a rate or timing) is set; the tidal volume and the flow are measured, of their timepoint only',
  spontaneous: 'the patient breathes, helped by a set pressure (a backup rate may be set); the tidal volume and the flow are measured, of their timepoint only',
  oscillation: 'a mean airway pressure, an amplitude and a frequency are set; the mean airway pressure is held as a setting',
});

/** The mode word read as the volume-targeted form where its targeting is not written (common practice, no source). */
export const SIMV_UNTARGETED = 'SIMV';

/** The family of a mode word (any case), or null for no mode or a word the registry does not list. */
export function modeFamily(mode: string | null | undefined): ModeFamily | null {
  if (mode === null || mode === undefined) return null;
  return MODE_FAMILIES[mode.toUpperCase()] ?? null;
}

/**
 * The family of the breaths non-invasive support on an oxygen line gives (NIV or CPAP): the patient
 * breathes, helped by a pressure, as under PS or the CPAP mode of a ventilator, so its family is
 * theirs (common practice, no source). A tidal volume or a flow read off the device is measured.
 */
export const SUPPORT_FAMILY: ModeFamily = 'spontaneous';

/**
 * The family of the breaths in force: the ventilator's mode (`mode`, a word or null for none); where
 * no mode is in force, the non-invasive support of the oxygen line in force (`support`, NIV or CPAP:
 * `SUPPORT_FAMILY`). A mode word the registry does not list (`ASV`) has none, whatever the support.
 */
export function familyInForce(mode: string | null | undefined, support: NoninvasiveSupport | null = null): ModeFamily | null {
  if (mode !== null && mode !== undefined) return modeFamily(mode);
  return support === null ? null : SUPPORT_FAMILY;
}

/** Whose breaths are in force where the patient breathes with help: pressure support, CPAP or NIV. */
export type OwnBreaths = 'ps' | 'cpap' | 'niv';

/**
 * The kind of the patient's own breathing in force (`familyInForce`'s spontaneous family), or null
 * where the breaths are the ventilator's (or unknown): the mode decides where one is in force (`PS`,
 * or the `CPAP` mode of a ventilator), else the NIV or CPAP of the oxygen line (`support`). The one
 * reading of it for the derived values that do not hold under the patient's own effort (the dynamic
 * compliance) and for the checks whose limit is of a ventilator's breath (PN403).
 */
export function ownBreaths(mode: string | null | undefined, support: NoninvasiveSupport | null = null): OwnBreaths | null {
  if (mode !== null && mode !== undefined) {
    if (modeFamily(mode) !== 'spontaneous') return null;
    return mode.toUpperCase() === 'CPAP' ? 'cpap' : 'ps';
  }
  return support;
}

/**
 * The one rule for whether a value of `field` written on a `vent` line is a measurement of its
 * timepoint rather than a setting: the field's row for the family of the breaths in force
 * (`familyInForce`: the mode, or with none the NIV or CPAP of the oxygen line), else its default
 * (`reading`). The timeline, the derived values' "add …", the hover and the FHIR export ask it.
 */
export function isMeasuredUnder(field: FieldDef, mode: string | null | undefined, support: NoninvasiveSupport | null = null): boolean {
  return isMeasuredIn(field, familyInForce(mode, support));
}

/** Whether a value of `field` is measured under breaths of `family` (null: none known, the field's default). */
export function isMeasuredIn(field: FieldDef, family: ModeFamily | null): boolean {
  if (family !== null) {
    if (field.setIn?.includes(family)) return false;
    if (field.measuredIn?.includes(family)) return true;
  }
  return field.reading === true;
}

/** Whether `field` is a setting by default but measured under the breaths in force (a tidal volume under PS, or under NIV with no mode). */
export function measuredByMode(field: FieldDef, mode: string | null | undefined, support: NoninvasiveSupport | null = null): boolean {
  return field.reading !== true && isMeasuredUnder(field, mode, support);
}

/** The families in which a field is measured though a setting by default, or set though a reading by default: for docs. */
export function modesOfFamilies(families: readonly ModeFamily[]): readonly string[] {
  return Object.keys(MODE_FAMILIES).filter((m) => families.includes(MODE_FAMILIES[m]!));
}
