/**
 * The SpO2 target in force at a timepoint: the range written on an oxygen line (`target 88-92`), held
 * apart from the oxygen line's settings by the timeline (`CarryState.target`: in force until another
 * target is written, through a new device, room air or ventilation), else the one the `spo2Target`
 * setting gives notes that write none (by default none). And where an SpO2 stands against it, and
 * whether the patient breathes supplemental oxygen (PN327 asks it: above the target is a finding on
 * oxygen only).
 */
import type { Settings } from '../settings';
import type { InputValue, ValuesInForce } from './model';
import { fio2InForce, ROOM_AIR_FIO2 } from '../derive/context';
import { deviceInForce } from './noninvasive-support';
import { formatAgainst, formatNumber, formatShort } from '../util/format';

export const SPO2_TARGET_FIELD = 'spo2_target';

export interface Spo2Target {
  readonly lowPct: number;
  readonly highPct: number;
  /** The target the note wrote (here or carried); null where the setting gives it. */
  readonly input: InputValue | null;
}

/** The targets the `spo2Target` setting may give, by its value. */
const SETTING_TARGETS: Readonly<Record<string, Spo2Target>> = {
  '88-92': { lowPct: 88, highPct: 92, input: null },
  '92-96': { lowPct: 92, highPct: 96, input: null },
  '94-98': { lowPct: 94, highPct: 98, input: null },
};

/**
 * The target in force: the one written (stated here or carried), else the setting's; null where
 * neither gives one, and where the one written is not used (out of bounds or reversed, PN301): a
 * target written overrides the setting even then.
 */
export function targetInForce(values: ValuesInForce, settings: Pick<Settings, 'spo2Target'>): Spo2Target | null {
  if (values.originOf(SPO2_TARGET_FIELD) !== null) {
    const input = values.get(SPO2_TARGET_FIELD)!;
    const parts = input.stated.parts;
    if (!input.stated.usable || parts === null || parts.length !== 2) return null;
    return { lowPct: parts[0]!, highPct: parts[1]!, input };
  }
  return SETTING_TARGETS[settings.spo2Target] ?? null;
}

/** `88–92 %`; an end written with decimals keeps them (`88.5–92 %`, PN302), never rounded onto another. */
export function targetText(target: Spo2Target): string {
  return `${formatShort(target.lowPct)}–${formatShort(target.highPct)} %`;
}

/**
 * An SpO2 as a message beside a target shows it: with the decimals it was written with (`decimals`,
 * 92.4 as 92.4), or more where fewer would put it on an end or the other side of one (88.6 beside
 * 88.5–92 % is 88.6, not 89; never "SpO2 92 % is above the target 88–92 %").
 */
export function spo2AgainstText(spo2Pct: number, target: Spo2Target, decimals = 0): string {
  return formatAgainst(spo2Pct, decimals, target.lowPct, target.highPct);
}

/** Where an SpO2 stands against a target: below its lower end, within it (ends included), above its upper end. */
export function standing(spo2Pct: number, target: Spo2Target): 'below' | 'within' | 'above' {
  return spo2Pct < target.lowPct ? 'below' : spo2Pct > target.highPct ? 'above' : 'within';
}

/**
 * What the patient breathes at a timepoint: supplemental oxygen where a device other than room air
 * is in force or an FiO2 above 0.21 (written on an oxygen, vent or gas line), with what says so
 * (`cannula`, `FiO2 0.40`; the device read through `deviceInForce`, as the rest of the core reads it); air where the device is room air or the FiO2 0.21; null where the note
 * says neither.
 */
export function breathing(values: ValuesInForce): { readonly onOxygen: boolean; readonly how: string } | null {
  const word = deviceInForce(values);
  if (word !== null && word !== 'room air') return { onOxygen: true, how: word };
  const fio2 = fio2InForce(values);
  if (fio2 !== null && fio2 > ROOM_AIR_FIO2 + 1e-9) return { onOxygen: true, how: `FiO2 ${formatNumber(fio2, 2)}` };
  if (word === 'room air' || fio2 !== null) return { onOxygen: false, how: 'room air' };
  return null;
}
