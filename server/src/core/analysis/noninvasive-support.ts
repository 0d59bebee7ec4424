/**
 * Which non-invasive support that gives breaths an oxygen line holds: NIV, CPAP or none. One rule
 * for every part of Pneumark that asks: the timeline (under NIV or CPAP, a tidal volume on a vent
 * line of readings is the exhaled volume the device measured, not a ventilator setting), mechanical
 * power (not worked out under either, and says which) and the FHIR export (no code of a set tidal
 * volume on a measured one). And which settings each oxygen device takes (`deviceSets`): what a
 * later oxygen line that names no device may restate of the device in force (the timeline), and
 * the keys completion leaves out beside a device.
 */
import type { StatedValue, ValuesInForce } from './model';

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

/** The oxygen-line pressures each support gives: IPAP and EPAP under NIV, one level under CPAP. */
export const SUPPORT_PRESSURES: Readonly<Record<NoninvasiveSupport, readonly string[]>> = { niv: ['ipap', 'epap'], cpap: ['cpap_level'] };

/** The fields of those pressures, in the order they are asked about. */
export const SUPPORT_PRESSURE_FIELDS: readonly string[] = [...SUPPORT_PRESSURES.niv, ...SUPPORT_PRESSURES.cpap];

/** The support a pressure field belongs to (`niv` for IPAP and EPAP, `cpap` for the level); null for another field. */
export function supportOfPressure(fieldId: string): NoninvasiveSupport | null {
  return fieldId === 'cpap_level' ? 'cpap' : fieldId === 'ipap' || fieldId === 'epap' ? 'niv' : null;
}

/** Every field `deviceSets` may answer yes for: the flow, the FiO2 and the pressures of the supports. */
export const DEVICE_SETTING_FIELDS: readonly string[] = ['o2_flow', 'fio2', ...SUPPORT_PRESSURE_FIELDS];

/**
 * Whether `fieldId` is a setting of the oxygen device `device` (a canonical device word): what the
 * device is set to, and what a later oxygen line that names no device may restate of it, at a later
 * timepoint or below it at its own (the timeline's `updatedDevice`: `oxygen flow 4` after `oxygen
 * cannula 2` is the cannula at 4 L/min). The one table of it:
 * - a flow (`o2_flow`) for every device but room air, which takes no oxygen;
 * - an FiO2 for the devices that set one: a Venturi mask (its entrainment valve gives a fixed
 *   fraction, which is why a number after `venturi` may be read as it), high flow (the blender of
 *   its air and oxygen) and NIV and CPAP (their oxygen blended or bled in). A cannula, a simple or a
 *   reservoir mask is set by its flow only: the FiO2 the patient breathes follows the flow and the
 *   breathing, so an FiO2 written beside one is a value stated, not what the device is set to
 *   (common practice, no source);
 * - the pressures of its support (`givesPressure`): an IPAP and an EPAP for NIV, a level for CPAP.
 */
export function deviceSets(device: string, fieldId: string): boolean {
  if (fieldId === 'o2_flow') return device !== 'room air';
  if (fieldId === 'fio2') return device === 'venturi' || device === 'hfnc' || supportOfDevice(device) !== null;
  return supportOfPressure(fieldId) !== null && givesPressure(device, fieldId);
}

/** Nothing held: asked of the rule where only the device decides. */
const NOTHING_HELD: HeldFields = { has: () => false };

/** The support a device gives by itself (`noninvasiveSupport` with no pressures held): with none named, none. */
export function supportOfDevice(device: string | null): NoninvasiveSupport | null {
  return noninvasiveSupport(device, NOTHING_HELD);
}

/**
 * Whether an oxygen line whose device is `device` gives no set airway pressure: a device is named and
 * the rule above reads it as neither NIV nor CPAP (room air, a cannula, a mask, a venturi or
 * reservoir mask, high flow). An IPAP, an EPAP or a CPAP level written on such a line (`oxygen mask,
 * epap 6`) is reported (PN318) and not used: not as the end-expiratory pressure (driving pressure,
 * the compliances, the Berlin band reading) and not compared with a peak or with each other, until
 * the line names the support (`niv`, `cpap`) or drops the pressure. The exports keep it as written.
 */
export function givesNoSetPressure(device: string | null): boolean {
  return device !== null && supportOfDevice(device) === null;
}

/**
 * Whether an oxygen line whose device is `device` gives the pressure `fieldId` (an IPAP, an EPAP or
 * a CPAP level): with no device named, any (the pressures decide the support); beside `niv` its
 * IPAP and EPAP, beside `cpap` its level (CPAP holds one pressure and has no inspiratory one; bilevel
 * support gives two, not one level: common practice, no source); beside another device none
 * (`givesNoSetPressure`). A pressure a device does not give is reported (PN318) and not used.
 */
export function givesPressure(device: string | null, fieldId: string): boolean {
  return device === null || supportOfDevice(device) === supportOfPressure(fieldId);
}

/**
 * The device of the oxygen line of `pressure` (an IPAP, an EPAP or a CPAP level stated at a
 * timepoint; `stated` the values stated there) when that device does not give the pressure
 * (`givesPressure`, PN318: one that gives no set airway pressure, or the other support) and the
 * pressure is not 0; else null. The device is the one written on the pressure's line.
 */
export function deviceWithoutPressure(stated: readonly StatedValue[], pressure: StatedValue): StatedValue | null {
  // A pressure of 0 is no pressure, which any device agrees with (`oxygen room air, epap 0`).
  if (pressure.section !== 'oxygen' || pressure.value === 0 || supportOfPressure(pressure.fieldId) === null) return null;
  // The last device of the line, as the values in force take it (a device written twice is PN206).
  for (let i = stated.length - 1; i >= 0; i--) {
    const s = stated[i]!;
    if (s.line === pressure.line && s.fieldId === 'device' && s.section === 'oxygen') return s.word !== null && !givesPressure(s.word, pressure.fieldId) ? s : null;
  }
  return null;
}

/**
 * With no device named on the line of `pressure` (a CPAP level above 0 stated at a timepoint;
 * `stated` the values stated there): the first IPAP or EPAP written on that line, which makes the
 * line NIV by the one rule (`noninvasiveSupport`), so that the level is a pressure its support does
 * not give (PN318) and is not used (`endExpiratoryField`); else null. Pressures of one support
 * alone with no device (`oxygen epap 6`, `oxygen level 8`) make the support, and are not reported.
 */
export function nivPressureBesideLevel(stated: readonly StatedValue[], pressure: StatedValue): StatedValue | null {
  if (pressure.section !== 'oxygen' || pressure.fieldId !== 'cpap_level' || pressure.value === 0) return null;
  let niv: StatedValue | null = null;
  for (let i = 0; i < stated.length; i++) {
    const s = stated[i]!;
    if (s.line !== pressure.line || s.section !== 'oxygen') continue;
    if (s.fieldId === 'device') return null;
    if (niv === null && (s.fieldId === 'ipap' || s.fieldId === 'epap')) niv = s;
  }
  return niv;
}

/** The values in force, asked for numbers without building values. */
export interface NumbersInForce {
  numberOf(fieldId: string): number | null;
}

const NIV_FIRST: readonly ['epap', 'cpap_level'] = ['epap', 'cpap_level'];
const CPAP_FIRST: readonly ['cpap_level', 'epap'] = ['cpap_level', 'epap'];

/**
 * The oxygen-line pressure in force taken as the end-expiratory pressure where no PEEP is (the
 * oxygenation band, driving pressure, the compliances, PN314): one of the support the line gives by
 * the one rule (`noninvasiveSupport`: the device named, else the pressures written), the CPAP level
 * under CPAP and the EPAP under NIV; none that the support does not give (PN318: `oxygen mask, epap
 * 6`, `oxygen ipap 12, level 8`), but one of 0 (no pressure, which any device agrees with). Null
 * when none is.
 */
export function endExpiratoryField(device: string | null, values: NumbersInForce): 'epap' | 'cpap_level' | null {
  const support = noninvasiveSupport(device, { has: (id) => values.numberOf(id) !== null });
  const order = support === 'cpap' ? CPAP_FIRST : NIV_FIRST;
  for (let i = 0; i < order.length; i++) {
    const id = order[i]!;
    const value = values.numberOf(id);
    if (value !== null && (value === 0 || supportOfPressure(id) === support)) return id;
  }
  return null;
}

/**
 * The device word of the oxygen line in force at a timepoint (the device and the pressures in force
 * come from one oxygen line, which replaces the one before it whole); null when none. Asked without
 * building a value where no device is in force.
 */
export function deviceInForce(values: ValuesInForce): string | null {
  if (values.originOf('device') === null) return null;
  return values.wordOf('device');
}

/** Whether the IPAP and EPAP in force are pressures the device in force does not give (PN318). */
export function nivPressuresNotGiven(values: ValuesInForce): boolean {
  return !givesPressure(deviceInForce(values), 'epap');
}
