/**
 * The registry of checks: an explicit list, validated when it loads. To add a check, write
 * it in its own file with `defineCheck`, give it the next free code in its range, and add it
 * here; the docs (`npm run docs`) and the SARIF rule list come from this list.
 *
 * Code ranges: PN1xx syntax, PN2xx units and keys, PN3xx plausibility and timeline,
 * PN4xx physiology, PN5xx privacy, PN9xx internal.
 */
import type { CheckDef } from './check';
import { tidalVolumePerKg } from './vt-per-kg';
import { oldSettingCarried } from './old-setting';
import { badShorthand, badTime, highFlowPercent, venturiSetting, decimalComma, duplicateKey, missingValue, otherUnitLikely, strayText, unitNotAllowed, unknownKey, unknownSection, unknownUnit, unknownWord } from './collected';
import { pao2AboveAlveolar } from './alveolar-limit';
import { occultHypoxaemiaCheck } from './occult-hypoxaemia';
import { complianceImplausible } from './compliance-reach';
import { gasInconsistent } from './gas-consistency';
import { baseExcessDisagrees } from './base-excess';
import { internalError } from './internal';
import { acidBaseReading, oxygenationReading, respiratoryFailureReading, venousGasReading, ventilationReading } from './interpretations';
import { drivingPressureHigh, plateauHigh, tidalVolumeHigh } from './ventilation-limits';
import { epapAboveIpap, peepAbovePeak, peepAbovePlateau, plateauAbovePeak, systolicBelowDiastolic } from './pressure-order';
import { birthDate, calendarDate, emailAddress, phoneNumber, possibleName, postalCode, recordNumber } from './privacy';
import { timeGoesBack } from './time-order';
import { rateBelowSet, setRateZero } from './rate-order';
import { amplitudeOutsideHfov } from './oscillation';
import { peakNearAbsolutePinsp } from './insp-pressure';
import { fio2OnRoomAirCheck, flowOnRoomAirCheck } from './room-air-flow';
import { venturiFio2High } from './venturi-fio2';
import { pressureWithoutSupport } from './pressure-without-support';
import { bareHbBesideMmolCheck } from './hb-units';
import { placePressureUnlikeAltitude } from './place-pressure';
import { therapyOverlap } from './therapy-overlap';
import { gasAboveFio2Change } from './gas-above-change';
import { unusualBlank } from './unusual-blank';
import { totalPeepImpossible } from './total-peep';
import { spo2AboveTarget, spo2BelowTarget, targetBesideHypercapnia } from './spo2-target';
import { fio2OutOfRange, impossibleValue, saturationAbove100, unusualValue } from './value-bounds';

export const CHECKS: readonly CheckDef[] = validateCheckList([
  unknownSection,
  missingValue,
  decimalComma,
  badTime,
  strayText,
  badShorthand,
  unusualBlank,
  unknownKey,
  unknownUnit,
  unitNotAllowed,
  otherUnitLikely,
  unknownWord,
  duplicateKey,
  impossibleValue,
  unusualValue,
  peepAbovePlateau,
  plateauAbovePeak,
  systolicBelowDiastolic,
  saturationAbove100,
  fio2OutOfRange,
  timeGoesBack,
  rateBelowSet,
  flowOnRoomAirCheck,
  therapyOverlap,
  setRateZero,
  amplitudeOutsideHfov,
  peepAbovePeak,
  epapAboveIpap,
  fio2OnRoomAirCheck,
  peakNearAbsolutePinsp,
  pressureWithoutSupport,
  bareHbBesideMmolCheck,
  placePressureUnlikeAltitude,
  venturiSetting,
  venturiFio2High,
  highFlowPercent,
  gasAboveFio2Change,
  tidalVolumePerKg,
  oldSettingCarried,
  spo2AboveTarget,
  spo2BelowTarget,
  targetBesideHypercapnia,
  pao2AboveAlveolar,
  gasInconsistent,
  tidalVolumeHigh,
  plateauHigh,
  drivingPressureHigh,
  occultHypoxaemiaCheck,
  complianceImplausible,
  oxygenationReading,
  ventilationReading,
  respiratoryFailureReading,
  acidBaseReading,
  venousGasReading,
  baseExcessDisagrees,
  totalPeepImpossible,
  possibleName,
  birthDate,
  calendarDate,
  phoneNumber,
  emailAddress,
  recordNumber,
  postalCode,
  internalError,
]);

export function validateCheckList(list: readonly CheckDef[]): readonly CheckDef[] {
  const codes = new Set<string>();
  const aliases = new Set<string>();
  for (const c of list) {
    if (!/^PN\d{3}$/.test(c.code)) throw new Error(`check ${c.alias}: code ${c.code} is not PNnnn`);
    if (!/^[a-z0-9]+(-[a-z0-9]+)*$/.test(c.alias)) throw new Error(`check ${c.code}: alias ${c.alias} is not kebab-case`);
    if (codes.has(c.code)) throw new Error(`duplicate check code ${c.code}`);
    if (aliases.has(c.alias)) throw new Error(`duplicate check alias ${c.alias}`);
    if (!c.source.trim() || !c.doc.fires.trim() || !c.doc.fix.trim() || !c.doc.example.trim()) throw new Error(`check ${c.code} lacks documentation or a source`);
    if (!c.run && !c.runTimepoint) throw new Error(`check ${c.code} has nothing to run`);
    codes.add(c.code);
    aliases.add(c.alias);
  }
  return list;
}

const byKey = new Map<string, CheckDef>();
for (const c of CHECKS) {
  byKey.set(c.code, c);
  byKey.set(c.alias, c);
}

export function checkByCodeOrAlias(key: string): CheckDef | undefined {
  return byKey.get(key) ?? byKey.get(key.toUpperCase());
}

/** Anchor of a check's section in docs/checks.md. */
export function docAnchor(check: Pick<CheckDef, 'code' | 'alias'>): string {
  // Kept per check: every finding carries its check's anchor, and a big note has thousands.
  let anchor = ANCHORS.get(check);
  if (anchor === undefined) {
    anchor = `${check.code.toLowerCase()}-${check.alias}`;
    ANCHORS.set(check, anchor);
  }
  return anchor;
}

const ANCHORS = new WeakMap<Pick<CheckDef, 'code' | 'alias'>, string>();
