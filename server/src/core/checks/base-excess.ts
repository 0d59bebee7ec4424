/**
 * A stated base excess must agree with the pH and HCO3 of its own gas, arterial or venous: the
 * Van Slyke equation as standardised gives the standard base excess (SBE) and the actual one (ABE,
 * which takes the Hb) from them. A base excess typed with the wrong sign, or copied from another
 * gas, otherwise passes silently.
 */
import type { StatedValue, Timepoint } from '../analysis/model';
import { BASE_EXCESS_HB_SPAN_G_DL, BASE_EXCESS_TOLERANCE_MMOL_L, SOURCES, baseExcessAgrees, baseExcessSpan, type NumericRange } from '../physiology';
import { toRange } from '../syntax/tree';
import type { Fix } from '../types';
import { formatAgainst, formatNumber, writtenDecimals } from '../util/format';
import { defineCheck, usableNumber, type TimepointContext } from './check';

export const baseExcessDisagrees = defineCheck({
  code: 'PN415',
  alias: 'base-excess-disagrees',
  title: 'Base excess disagrees with pH and HCO3',
  severity: 'warning',
  tags: ['physiology'],
  doc: {
    fires: `A base excess stated on a gas line lies more than ${BASE_EXCESS_TOLERANCE_MMOL_L} mmol/L outside the span from the lowest to the highest of the standard base excess and the actual base excess that the pH and HCO3 of the same gas give by the Van Slyke equation: the actual one at the Hb stated (on the gas line, else at the timepoint), or over every Hb from ${BASE_EXCESS_HB_SPAN_G_DL.low} to ${BASE_EXCESS_HB_SPAN_G_DL.high} g/dL when none is. A venous base excess is checked against the venous pH and HCO3, never against an arterial gas beside it. The message says when the base excess has the sign opposite to every value accepted, the tolerance included (a base deficit written as a positive excess; not where the gas is expected near 0), and where the other sign agrees a quick fix writes it.`,
    example: '@ 08:00\nabg 7.20/38/90/14, be 12',
    fix: 'Check the base excess against the analyser print-out: its sign (a base deficit is a negative excess), and that it belongs to this gas. The hover of the HCO3 shows the standard base excess its pH and HCO3 give (`sbe`).',
  },
  source: `${SOURCES['van-slyke-sbe']} ${SOURCES['pneumark-base-excess-tolerance']}`,
  runTimepoint(ctx) {
    const tp = ctx.timepoint;
    // A base excess is a measurement, in force only where stated: most timepoints state none.
    if (tp.values.originOf('base_excess') !== 'here') return;
    const stated = tp.stated;
    for (let i = 0; i < stated.length; i++) {
      const s = stated[i]!;
      if (s.fieldId !== 'base_excess' || !s.usable || s.value === null) continue;
      if (s.section === 'abg') checkBaseExcess(ctx, s, ARTERIAL);
      else if (s.section === 'vbg') checkBaseExcess(ctx, s, VENOUS);
    }
  },
});

/** The pH and HCO3 fields of one kind of gas, and how a message names them. */
interface GasFields {
  readonly ph: string;
  readonly hco3: string;
  readonly section: 'abg' | 'vbg';
  /** Before the pH in a message: '' for an arterial gas, 'venous ' for a venous one. */
  readonly words: string;
}

const ARTERIAL: GasFields = { ph: 'ph', hco3: 'hco3', section: 'abg', words: '' };
const VENOUS: GasFields = { ph: 'ph_venous', hco3: 'hco3_venous', section: 'vbg', words: 'venous ' };

/** A usable number stated at this timepoint for a field (a gas or lab value is in force only where stated: `usableNumber` finds it there or not at all). */
function statedHere(tp: Timepoint, id: string): StatedValue | null {
  return usableNumber(tp, id)?.input.stated ?? null;
}

/** The Hb of the gas line itself where it states one, else the Hb stated at this timepoint; null for none. */
function hbOf(tp: Timepoint, line: number): number | null {
  const stated = tp.stated;
  for (let i = stated.length - 1; i >= 0; i--) {
    const s = stated[i]!;
    if (s.fieldId === 'hb' && s.line === line && s.usable && s.value !== null) return s.value;
  }
  return statedHere(tp, 'hb')?.value ?? null;
}

function checkBaseExcess(ctx: TimepointContext, be: StatedValue, gas: GasFields): void {
  const tp = ctx.timepoint;
  const ph = statedHere(tp, gas.ph);
  const hco3 = statedHere(tp, gas.hco3);
  if (ph === null || hco3 === null) return;
  const hb = hbOf(tp, be.line);
  const span = baseExcessSpan(ph.value!, hco3.value!, hb);
  const value = be.value!;
  if (span === null || baseExcessAgrees(value, span)) return;
  const low = span.low - BASE_EXCESS_TOLERANCE_MMOL_L;
  const high = span.high + BASE_EXCESS_TOLERANCE_MMOL_L;
  const over = hb === null ? `over Hb ${BASE_EXCESS_HB_SPAN_G_DL.low}–${BASE_EXCESS_HB_SPAN_G_DL.high} g/dL` : `at Hb ${formatNumber(hb, 1)} g/dL`;
  const written = be.item.value?.kind === 'number' ? writtenDecimals(be.item.value.text) : 1;
  let message = `Base excess ${signed(formatAgainst(value, written, low, high), false)} mmol/L does not agree with ${gas.words}pH ${formatNumber(ph.value!, 2)} and HCO3 ${formatNumber(hco3.value!, 1)} mmol/L (expected about ${spanText(span)} mmol/L from the Van Slyke equation ${over}, give or take ${BASE_EXCESS_TOLERANCE_MMOL_L})`;
  const sign = oppositeSign(value, span);
  message += sign === null ? '.' : `: ${sign}`;
  ctx.report({
    range: toRange(be.line, be.item.value?.span ?? be.item.span),
    message,
    fixes: signFlip(be, span),
    related: [
      { range: toRange(ph.line, ph.item.value?.span ?? ph.item.span), message: `${gas.words === '' ? 'pH' : 'venous pH'} of the gas` },
      { range: toRange(hco3.line, hco3.item.value?.span ?? hco3.item.span), message: `${gas.words === '' ? 'HCO3' : 'venous HCO3'} of the gas` },
    ],
  });
}

/** A number's text with a true minus sign, and (`plus`) a plus sign before a positive one. */
function signed(text: string, plus: boolean): string {
  if (text.charCodeAt(0) === 45) return `−${text.slice(1)}`;
  return plus && Number(text) !== 0 ? `+${text}` : text;
}

/** `−13.1 to −12.4`: the span of the two forms, one decimal. */
function spanText(span: NumericRange): string {
  return `${signed(formatNumber(span.low, 1), true)} to ${signed(formatNumber(span.high, 1), true)}`;
}

/**
 * Words for a base excess whose sign is opposite to that of every value the span accepts, its
 * tolerance included; null where the accepted values reach 0 or the signs match. A gas whose base
 * excess is expected near 0 (−1.8 to −0.5, so up to +1.2 accepted) does not make a written +8 a
 * deficit with its sign lost: that hint is kept for a gas that is clearly of the other sign.
 */
function oppositeSign(value: number, span: NumericRange): string | null {
  if (value > 0 && span.high + BASE_EXCESS_TOLERANCE_MMOL_L < 0) return 'a base deficit written as a positive excess?';
  if (value < 0 && span.low - BASE_EXCESS_TOLERANCE_MMOL_L > 0) return 'a positive excess written as a base deficit?';
  return null;
}

/** The number written with the other sign. */
function flippedText(text: string): string {
  const first = text.charCodeAt(0);
  // '-' or '−': drop it; '+': a minus instead; none: a minus before.
  if (first === 45 || first === 0x2212) return text.slice(1);
  if (first === 43) return `-${text.slice(1)}`;
  return `-${text}`;
}

const NO_FIXES: readonly Fix[] = Object.freeze([]);

/** The quick fix that writes the base excess with the other sign, only where that value agrees with the gas. */
function signFlip(be: StatedValue, span: NumericRange): readonly Fix[] {
  const number = be.item.value;
  if (!number || number.kind !== 'number' || number.value === 0) return NO_FIXES;
  // The number as written, in its own unit (mmol/L and mEq/L are the same number here).
  if (oppositeSign(be.value!, span) === null || !baseExcessAgrees(-be.value!, span)) return NO_FIXES;
  const text = flippedText(number.text);
  return [{ title: `Write the base excess as ${text}`, edits: [{ range: toRange(be.line, number.span), newText: text }] }];
}
