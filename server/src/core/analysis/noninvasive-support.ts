/**
 * Which non-invasive support that gives breaths an oxygen line holds: NIV, CPAP or none. One rule
 * for every part of Pneumark that asks: the timeline (under NIV or CPAP, a tidal volume on a vent
 * line of readings is the exhaled volume the device measured, not a ventilator setting), mechanical
 * power (not worked out under either, and says which) and the FHIR export (no code of a set tidal
 * volume on a measured one).
 */

/** Non-invasive support that gives breaths: bilevel ventilation (`niv`) or continuous pressure (`cpap`). */
export type NoninvasiveSupport = 'niv' | 'cpap';

/** How people read each support's name. */
export const SUPPORT_NAMES: Readonly<Record<NoninvasiveSupport, string>> = { niv: 'NIV', cpap: 'CPAP' };

/**
 * The settings held, asked whether a field is among them without building its value: the oxygen
 * line's held settings in the timeline, the values in force at a timepoint elsewhere.
 */
export interface HeldFields {
  has(fieldId: string): boolean;
}

/**
 * The support the oxygen line in force gives, from its device (the canonical word of the device
 * field, `bilevel` read as `niv`; null when the line names none) and the pressures `held`; null
 * when it is neither NIV nor CPAP.
 *
 * A device named decides: `niv` or `cpap`, and any other device (a mask, high flow) is neither,
 * whatever pressures are written beside it. With no device, the pressures decide: an IPAP or an
 * EPAP is NIV, else a CPAP level is CPAP. An IPAP alone (no EPAP, no device) is NIV: IPAP is the
 * inspiratory pressure of bilevel ventilation, the higher of the two pressures it gives each breath,
 * while CPAP holds one pressure and has no inspiratory one, so an IPAP written without its EPAP is
 * bilevel support with its EPAP not written, not nothing. For the same reason an IPAP beside a CPAP
 * level is NIV (common practice, no source).
 *
 * Allocates nothing (it runs for every vent line of readings and every derivation that asks):
 * the pressures are asked only where no device is named.
 */
export function noninvasiveSupport(device: string | null, held: HeldFields): NoninvasiveSupport | null {
  if (device !== null) return device === 'niv' || device === 'cpap' ? device : null;
  if (held.has('ipap') || held.has('epap')) return 'niv';
  return held.has('cpap_level') ? 'cpap' : null;
}
