/** Derived values of oxygen transport, and the low-flow FiO2 estimate. */
import { SOURCES, arterialO2Content, fio2EstimateLowFlow, meanArterialPressure, oxygenDelivery, type LowFlowDevice } from '../physiology';
import { LOW_FLOW_RULE_RANGES_L_PER_MIN } from '../physiology/oxygen-transport';
import { formatNumber } from '../util/format';
import type { Timepoint } from '../analysis/model';
import { formatStated } from '../present';
import { defineDerived, type DeriveContext, type Outcome, type Term, type ValueExtras, type WordInForce } from './context';
import type { DerivedValue } from './model';
import { pao2Withheld } from './gas-exchange';

export const cao2 = defineDerived({
  id: 'cao2',
  label: 'Arterial oxygen content',
  short: 'CaO2',
  unit: 'mL/dL',
  decimals: 1,
  category: 'transport',
  formula: '{Hüfner} × {Hb} × {SaO2} ÷ 100 + 0.003 × {PaO2}',
  source: SOURCES['oxygen-content'],
  anchors: ['hb', 'sao2'],
  compute(c) {
    const hb = haemoglobinOfGas(c);
    const sat = c.field('sao2', 'SaO2') ?? c.field('spo2', 'SaO2');
    const pa = c.field('pao2', 'PaO2');
    if (!hb) return { kind: 'na', reason: 'needs a haemoglobin' };
    if (!sat || !pa) return c.missing([sat, c.needFor(SATURATIONS_OF_CONTENT, 'sao2')], [pa, c.needFor('pao2', 'po2')]);
    const withheld = pao2Withheld(c, pa);
    if (withheld) return withheld;
    const hufner: Term = { name: 'Hüfner', value: c.settings.hufnerConstant, unit: 'mL/g', decimals: 2, origin: { kind: 'default', description: 'Hüfner constant (setting pneumark.hufnerConstant)' } };
    const notes = hbNotUsed(c, hb);
    if (sat.fieldId === 'spo2') notes.push('SpO2 used in place of SaO2');
    return c.value(arterialO2Content(hb.value, sat.value / 100, pa.value, hufner.value), [hufner, hb, sat, pa], { notes });
  },
});

export const do2 = defineDerived({
  id: 'do2',
  label: 'Oxygen delivery',
  short: 'DO2',
  unit: 'mL/min',
  decimals: 0,
  category: 'transport',
  formula: '{CO} × {CaO2} × 10',
  source: SOURCES['oxygen-content'],
  anchors: ['cardiac_output'],
  compute(c) {
    const co = c.field('cardiac_output', 'CO');
    const content = c.derived('cao2', 'CaO2');
    if (!co) return { kind: 'na', reason: 'needs a cardiac output (co on the vitals line)' };
    if (!content) return c.withheldFrom('cao2') ?? c.missing([content, c.lacking('cao2')]);
    return c.value(oxygenDelivery(co.value, content.value), [co, content]);
  },
});

/** No blood pressure here to estimate a mean from (one outcome for every timepoint). */
const NO_BLOOD_PRESSURE: Outcome = { kind: 'na', reason: 'needs a blood pressure (bp systolic/diastolic on the vitals line)' };
const MEAN_STATED: Outcome = { kind: 'na', reason: 'a mean arterial pressure is stated (map on the vitals line)' };
const SYSTOLIC_BELOW: Outcome = { kind: 'na', reason: 'the systolic pressure is below the diastolic (see PN305)' };
const MEAN_PRESSURE_EXTRAS: ValueExtras = { estimate: true, notes: ['estimated from the cuff pressures: a fixed rule, several mmHg from the measured mean in some patients'] };

export const meanArterialPressureDef = defineDerived({
  id: 'mean_arterial_pressure',
  label: 'Mean arterial pressure, estimated from the blood pressure',
  short: 'MAP (BP)',
  unit: 'mmHg',
  decimals: 0,
  category: 'transport',
  formula: '{BP diastolic} + ({BP systolic} − {BP diastolic}) ÷ 3',
  source: SOURCES['mean-arterial-pressure'],
  anchors: ['bp'],
  compute(c) {
    // A mean stated (an arterial line's) is the one to read; the rule only stands in for it.
    if (c.input('mean_bp') !== null) return MEAN_STATED;
    const bp = c.input('bp');
    const parts = bp !== null && bp.stated.usable ? bp.stated.parts : null;
    if (bp === null || parts === null || parts.length !== 2) return NO_BLOOD_PRESSURE;
    const systolic: Term = { name: 'BP systolic', value: parts[0]!, unit: 'mmHg', decimals: 0, origin: bp.origin, fieldId: 'bp' };
    const diastolic: Term = { name: 'BP diastolic', value: parts[1]!, unit: 'mmHg', decimals: 0, origin: bp.origin, fieldId: 'bp' };
    // A systolic below the diastolic (PN305) gives no mean.
    if (systolic.value < diastolic.value) return SYSTOLIC_BELOW;
    return c.value(meanArterialPressure(systolic.value, diastolic.value), [systolic, diastolic], MEAN_PRESSURE_EXTRAS);
  },
});

/** A low-flow device's FiO2 rule: the device as the rule names it, the formula and its source. */
export interface LowFlowFio2Rule {
  readonly device: string;
  readonly formula: string;
  readonly source: string;
}

/**
 * The rule of each low-flow device whose FiO2 is estimated from its flow, as the estimate states it:
 * the one table the definition below, each value and the device's hover read.
 */
export const LOW_FLOW_FIO2_RULES: Readonly<Record<LowFlowDevice, LowFlowFio2Rule>> = {
  cannula: { device: 'cannula', formula: '0.21 + 0.04 × {flow}', source: SOURCES['nasal-cannula-fio2'] },
  mask: { device: 'simple mask', formula: '0.35 + 0.04 × ({flow} − 5)', source: SOURCES['simple-mask-fio2'] },
};

/** The low-flow rule of a canonical device word; null for a device whose FiO2 is not estimated. */
export function lowFlowFio2Rule(device: string): LowFlowFio2Rule | null {
  return device === 'cannula' || device === 'mask' ? LOW_FLOW_FIO2_RULES[device] : null;
}

export const fio2Estimated = defineDerived({
  id: 'fio2_estimated',
  label: 'FiO2 estimated from a low-flow device',
  short: 'FiO2 est',
  unit: '',
  decimals: 2,
  category: 'oxygenation',
  // Each device's rule, as the table in grammar/README.md gives them; a value names its own.
  formula: `${LOW_FLOW_FIO2_RULES.cannula.formula} (${LOW_FLOW_FIO2_RULES.cannula.device}) | ${LOW_FLOW_FIO2_RULES.mask.formula} (${LOW_FLOW_FIO2_RULES.mask.device})`,
  source: `${LOW_FLOW_FIO2_RULES.cannula.source} ${LOW_FLOW_FIO2_RULES.mask.source}`,
  anchors: ['device', 'o2_flow'],
  compute(c) {
    const device = c.word('device');
    if (!device || (device.word !== 'cannula' && device.word !== 'mask')) return { kind: 'na', reason: 'only for nasal cannula and simple mask' };
    if (c.field('fio2')) return { kind: 'na', reason: 'an FiO2 is stated' };
    const flow = c.field('o2_flow', 'flow');
    if (!flow) return c.missing([flow, c.needFor('o2_flow', 'flow')]);
    const value = fio2EstimateLowFlow(device.word, flow.value);
    // A flow outside those the rough rule is quoted for gives no estimate, and says so (`show`'s n/a,
    // hovers) rather than leaving the estimate out unexplained.
    if (value === null) return { kind: 'na', reason: outsideRule(device.word, flow.value), explained: true };
    const formula = LOW_FLOW_FIO2_RULES[device.word].formula;
    // The device is an input as the flow is: the rule differs by device, so the estimate rests on it
    // (and where it is carried, hovers, `show` and PN326 see it so).
    return c.value(value, [wordTerm(device), flow], { estimate: true, formula, notes: ['a rough estimate: the true FiO2 depends on breathing pattern; not used for P/F or the A–a gradient'] });
  },
});

/** `the cannula rule is quoted for flows up to 6 L/min, not 8.0 L/min`: why a flow gives no estimate. */
function outsideRule(device: LowFlowDevice, flowLPerMin: number): string {
  const range = LOW_FLOW_RULE_RANGES_L_PER_MIN[device];
  const flows = range.minExclusive && range.min === 0 ? `up to ${range.max} L/min` : `from ${range.min} to ${range.max} L/min`;
  return `the ${LOW_FLOW_FIO2_RULES[device].device} rule is quoted for flows ${flows}, not ${formatNumber(flowLPerMin, 1)} L/min`;
}

/** A word value in force as a formula input (no number: `Term.word`), under its key. */
function wordTerm(w: WordInForce): Term {
  const field = w.input.stated.field;
  return { name: field.aliases[0] ?? field.id, value: NaN, unit: '', decimals: 0, origin: w.input.origin, fieldId: field.id, word: w.word };
}

/** The saturations an oxygen content reads, in its order (what to add where one written is not used). */
const SATURATIONS_OF_CONTENT: readonly string[] = ['sao2', 'spo2'];

/** How the Hb of a gas line is named among a formula's inputs. */
const GAS_HB_NOTE = 'abg line, measured with the gas';

/**
 * The haemoglobin of the oxygen content: the one on the arterial gas line of this timepoint, which
 * the analyser measures (by co-oximetry) with the SaO2 and PaO2 it is combined with, else the Hb in
 * force (the last one stated here: a labs line, a venous gas). Either way its term says which line
 * it comes from (our convention; common practice, no source).
 */
function haemoglobinOfGas(c: DeriveContext): Term | null {
  const gas = c.fieldOn('hb', 'abg', 'Hb');
  if (gas) return { ...gas, note: GAS_HB_NOTE };
  const any = c.field('hb', 'Hb');
  const section = any ? c.input('hb')?.stated.section : undefined;
  if (any) return section ? { ...any, note: `${section} line` } : any;
  // The last Hb stated here is not used (impossible, or its unit in doubt): a usable one of another line.
  const labs = c.fieldOn('hb', 'labs', 'Hb');
  if (labs) return { ...labs, note: 'labs line' };
  const venous = c.fieldOn('hb', 'vbg', 'Hb');
  return venous ? { ...venous, note: 'vbg line' } : null;
}

/** `labs Hb 9.0 g/dL (line 3) not used: …` for each other usable Hb stated at this timepoint. */
function hbNotUsed(c: DeriveContext, used: Term): string[] {
  const notes: string[] = [];
  const stated = c.timepoint.stated;
  const usedLine = used.origin.kind === 'here' ? used.origin.line : -1;
  for (let i = 0; i < stated.length; i++) {
    const s = stated[i]!;
    if (s.fieldId !== 'hb' || !s.hereOnly || !s.usable || s.value === null || s.line === usedLine) continue;
    const why = used.note === GAS_HB_NOTE ? "the gas line's own Hb is used" : 'the last Hb stated here is used';
    notes.push(`${s.section} Hb ${formatStated(s)} (line ${s.line + 1}) not used: ${why}`);
  }
  return notes;
}

/**
 * `the abg line`: the line whose Hb an oxygen content used, for `show`; null for a value that
 * has no Hb among its inputs, or one not stated at its timepoint.
 */
export function hbSourceOf(d: DerivedValue, tp: Timepoint): string | null {
  const hb = d.inputs.find((t) => t.fieldId === 'hb');
  if (!hb || hb.origin.kind !== 'here') return null;
  const line = hb.origin.line;
  const s = tp.stated.find((x) => x.fieldId === 'hb' && x.line === line);
  return s ? `the ${s.section} line` : null;
}
