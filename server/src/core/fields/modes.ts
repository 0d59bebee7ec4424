/**
 * Ventilator modes by family: what the machine is set to deliver in each, and so whether a value
 * written on a `vent` line is a setting (held and carried until changed) or a measurement (in force
 * at its timepoint only). The field registry says it per field (`reading`, `measuredIn`, `setIn`);
 * the timeline, the hovers, the derived values' "add …" and the FHIR export ask `isMeasuredUnder`.
 *
 * - volume (VC, SIMV): the tidal volume and the inspiratory flow are set; pressures are measured.
 * - adaptive (PRVC): the tidal volume is set (the target), the pressure and flow follow it.
 * - pressure (PC, APRV): a pressure (and a rate or timing) is set; the tidal volume and the flow follow
 *   the lungs and the patient and change from breath to breath.
 * - spontaneous (PS, CPAP): the patient breathes; a support pressure and a backup rate are set.
 * - oscillation (HFOV): a mean airway pressure, an amplitude and a frequency are set.
 *
 * A mode word outside this list (`ASV`), or no mode at all, has no family: each field is then as its
 * row says by default (a tidal volume a setting, as before).
 */
import type { FieldDef } from './registry';

export type ModeFamily = 'volume' | 'adaptive' | 'pressure' | 'spontaneous' | 'oscillation';

/** The family of each mode the registry lists, by its canonical word. */
export const MODE_FAMILIES: Readonly<Record<string, ModeFamily>> = Object.freeze({
  VC: 'volume',
  SIMV: 'volume',
  PRVC: 'adaptive',
  PC: 'pressure',
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

/** The family of a mode word (any case), or null for no mode or a word the registry does not list. */
export function modeFamily(mode: string | null | undefined): ModeFamily | null {
  if (mode === null || mode === undefined) return null;
  return MODE_FAMILIES[mode.toUpperCase()] ?? null;
}

/**
 * Whether a value of `field` written under `mode` (a word, or null for none) is a measurement of its
 * timepoint rather than a setting: the field's row for the mode's family, else its default (`reading`).
 */
export function isMeasuredUnder(field: FieldDef, mode: string | null | undefined): boolean {
  const family = modeFamily(mode);
  if (family !== null) {
    if (field.setIn?.includes(family)) return false;
    if (field.measuredIn?.includes(family)) return true;
  }
  return field.reading === true;
}

/** Whether `field` is a setting by default but measured under the mode family of `mode` (a tidal volume under PS). */
export function measuredByMode(field: FieldDef, mode: string | null | undefined): boolean {
  return field.reading !== true && isMeasuredUnder(field, mode);
}

/** The families in which a field is measured though a setting by default, or set though a reading by default: for docs. */
export function modesOfFamilies(families: readonly ModeFamily[]): readonly string[] {
  return Object.keys(MODE_FAMILIES).filter((m) => families.includes(MODE_FAMILIES[m]!));
}
