/**
 * An SpO2 against the target in force (PN327 above it on supplemental oxygen, PN328 below it), and a
 * hypercapnic arterial gas beside a target whose lower end is 92 % or more (PN329). The target is the
 * one the note wrote (`oxygen target 88-92`, in force until another is written) or the `spo2Target`
 * setting's (by default none): see analysis/spo2-target.ts. Findings point to where the target was
 * written.
 */
import type { InputValue } from '../analysis/model';
import { breathing, spo2AgainstText, standing, targetInForce, targetText, type Spo2Target } from '../analysis/spo2-target';
import { sideOf } from '../physiology/numeric';
import { GAS_KPA, GAS_MMHG } from '../derive/gas-words';
import { carriedFromText, deviceShown, kpaResolutionMmhg, showsKpa, timeText } from '../present';
import { toRange } from '../syntax/tree';
import type { Range } from '../types';
import { writtenDecimals } from '../util/format';
import { defineCheck, type TimepointContext } from './check';

/** The published source of the targets (BTS 2017), read in December 2026 (session 31): see tests/physiology/sources-read.test.ts. */
const BTS_2017 = 'O\'Driscoll BR, Howard LS, Earis J, Mak V, on behalf of the BTS Emergency Oxygen Guideline Group: BTS guideline for oxygen use in adults in healthcare and emergency settings, Thorax 2017;72(Suppl 1):ii1–ii90 — a target of 94–98 % for most acutely ill adults and 88–92 % for those at risk of hypercapnic respiratory failure (both read in its table 2 at thorax.bmj.com, the initial target range of 94–98 % for serious illness, and 88–92 % pending blood gases where COPD or another risk of hypercapnic respiratory failure coexists; both again in the British Thoracic Society\'s own page of the guideline, its update of December 2019, at brit-thoracic.org.uk; the citation read in the National Guideline Clearinghouse summary 11253)';

/** The lower end of a target from which PN329 speaks: the ordinary targets (92–96 %, 94–98 %), not 88–92 %. */
export const ORDINARY_TARGET_FROM_PCT = 92;

/**
 * The target as a message names it, with where it comes from: written here, in force since the
 * timepoint that wrote it, or given by the setting.
 */
function targetPhrase(ctx: TimepointContext, target: Spo2Target): string {
  const text = `the target ${targetText(target)}`;
  const origin = target.input?.origin;
  if (origin === undefined) return `${text} of the spo2Target setting`;
  if (origin.kind === 'carried') {
    const since = timeText(origin.fromTime);
    return `${text} in force since ${since === null ? '' : `${since}, `}line ${origin.line + 1}`;
  }
  return origin.kind === 'here' && ctx.timepoint.line !== null ? `${text} written at this timepoint` : text;
}

/** Where the target was written, as a finding's related place; none for the setting's. */
function relatedTarget(target: Spo2Target): { related?: { range: Range; message: string }[] } {
  const origin = target.input?.origin;
  if (origin === undefined || origin.kind === 'default') return {};
  return { related: [{ range: toRange(origin.line, origin.span), message: origin.kind === 'carried' ? `SpO2 target ${carriedFromText(origin, 'here')}` : 'SpO2 target written here' }] };
}

/** The SpO2 measured at the timepoint and the target in force, or null where either is missing. */
function spo2AndTarget(ctx: TimepointContext): { spo2: InputValue; value: number; target: Spo2Target } | null {
  const values = ctx.timepoint.values;
  // Asked without building values: most timepoints have no SpO2, and most notes no target.
  const value = values.numberOf('spo2');
  if (value === null) return null;
  const target = targetInForce(values, ctx.settings);
  if (target === null) return null;
  const spo2 = values.get('spo2');
  return spo2 === undefined || spo2.origin.kind !== 'here' ? null : { spo2, value, target };
}

/**
 * The SpO2 as written (`92.4`, not `92`), with more decimals only where fewer would put it on an end
 * of the target: never "SpO2 92 % is above the target 88–92 %".
 */
function spo2Shown(found: { spo2: InputValue; value: number; target: Spo2Target }): string {
  return spo2AgainstText(found.value, found.target, writtenDecimals(found.spo2.stated.item.value?.text ?? ''));
}

export const spo2AboveTarget = defineCheck({
  code: 'PN327',
  alias: 'spo2-above-target',
  title: 'SpO2 above its target on oxygen',
  severity: 'warning',
  tags: ['timeline', 'physiology'],
  doc: {
    fires: 'An SpO2 is above the upper end of the SpO2 target in force (written on an oxygen line with `target`, in force until another target is written; or the `spo2Target` setting\'s) while the patient is on supplemental oxygen: a device other than room air, or an FiO2 above 0.21. On room air an SpO2 above the target is no finding. The finding points to where the target was written.',
    example: 'oxygen cannula 2 L/min, target 88-92\nvitals spo2 97',
    fix: 'Check the reading and the target; review the oxygen against the target under local protocol.',
  },
  source: BTS_2017,
  runTimepoint(ctx) {
    const found = spo2AndTarget(ctx);
    if (found === null || standing(found.value, found.target) !== 'above') return;
    const air = breathing(ctx.timepoint.values);
    if (air === null || !air.onOxygen) return;
    ctx.report({
      range: toRange(found.spo2.stated.line, found.spo2.stated.item.span),
      message: `SpO2 ${spo2Shown(found)} % on oxygen (${deviceShown(air.how)}) is above ${targetPhrase(ctx, found.target)}.`,
      ...relatedTarget(found.target),
    });
  },
});

export const spo2BelowTarget = defineCheck({
  code: 'PN328',
  alias: 'spo2-below-target',
  title: 'SpO2 below its target',
  severity: 'warning',
  tags: ['timeline', 'physiology'],
  doc: {
    fires: 'An SpO2 is below the lower end of the SpO2 target in force (written on an oxygen line with `target`, in force until another target is written; or the `spo2Target` setting\'s), on oxygen or on air; the message says which, or that the note says neither. The finding points to where the target was written.',
    example: 'oxygen room air, target 94-98\nvitals spo2 91',
    fix: 'Check the reading (probe, trace) and the target; review the oxygen against the target under local protocol.',
  },
  source: BTS_2017,
  runTimepoint(ctx) {
    const found = spo2AndTarget(ctx);
    if (found === null || standing(found.value, found.target) !== 'below') return;
    const air = breathing(ctx.timepoint.values);
    const on = air === null ? ' (neither oxygen nor room air written)' : air.onOxygen ? ` on oxygen (${deviceShown(air.how)})` : ' on room air';
    ctx.report({
      range: toRange(found.spo2.stated.line, found.spo2.stated.item.span),
      message: `SpO2 ${spo2Shown(found)} %${on} is below ${targetPhrase(ctx, found.target)}.`,
      ...relatedTarget(found.target),
    });
  },
});

export const targetBesideHypercapnia = defineCheck({
  code: 'PN329',
  alias: 'target-beside-hypercapnia',
  title: 'Hypercapnia under an ordinary SpO2 target',
  severity: 'information',
  tags: ['interpretation', 'physiology'],
  doc: {
    fires: `An arterial gas shows hypercapnia (a PaCO2 above the \`hypercapniaAboveMmhg\` setting, 50 mmHg by default; one written in kPa is read at the resolution it was written with, as PN411 reads it, so 6.7 kPa is on the 50 mmHg threshold and not above it) while the SpO2 target in force has a lower end of ${ORDINARY_TARGET_FROM_PCT} % or more (94–98 %, 92–96 %): consistent with hypercapnic respiratory failure, for which BTS 2017 suggests a target of 88–92 %. Only where a target is in force (written in the note, or given by the \`spo2Target\` setting): with none, nothing is said. The finding points to where the target was written.`,
    example: 'oxygen mask 5 L/min, target 94-98\nabg 7.31/62/68/30',
    fix: 'Review the target under local protocol; where 88–92 % is meant, write it (`target 88-92`).',
  },
  source: BTS_2017,
  runTimepoint(ctx) {
    const values = ctx.timepoint.values;
    const paco2Mmhg = values.numberOf('paco2');
    if (paco2Mmhg === null || !(paco2Mmhg > ctx.settings.hypercapniaAboveMmhg)) return;
    const paco2 = values.get('paco2');
    if (paco2 === undefined || paco2.origin.kind !== 'here') return;
    // A PaCO2 written in kPa is compared at the resolution it was written with, as the ventilation
    // reading (PN411) compares it: 6.7 kPa is on the 50 mmHg threshold, not above it.
    const resolution = kpaResolutionMmhg(paco2.stated);
    if (sideOf(paco2Mmhg, ctx.settings.hypercapniaAboveMmhg, resolution) <= 0) return;
    const target = targetInForce(values, ctx.settings);
    if (target === null || target.lowPct < ORDINARY_TARGET_FROM_PCT) return;
    // Written as the ventilation reading writes them: each number on its side of the threshold
    // (6.70 kPa is 50.3 mmHg, above 6.67 kPa), not both shown as 50 mmHg.
    const gas = showsKpa(ctx.timepoint) ? GAS_KPA : GAS_MMHG;
    const at = ctx.settings.hypercapniaAboveMmhg;
    ctx.report({
      range: toRange(paco2.stated.line, paco2.stated.item.span),
      message: `PaCO2 ${gas.measured(paco2Mmhg, resolution, at)} is above ${gas.threshold(at, paco2Mmhg)} under ${targetPhrase(ctx, target)}: consistent with hypercapnic respiratory failure; BTS 2017 suggests a target of 88–92 % for patients at risk of it — review the target under local protocol.`,
      ...relatedTarget(target),
    });
  },
});
