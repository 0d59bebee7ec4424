/**
 * The markdown explanation of one derived value, shared by hovers and inlay-hint tooltips:
 * what it is, its value, the formula in words and with the numbers, every input with where it
 * came from, notes, the source, and the caution line.
 *
 * Given the timepoint, gas pressures follow the gas unit in force there: in a kPa note they are
 * shown in kPa first with mmHg in parentheses (`28.2 kPa (212 mmHg)`). A formula whose arithmetic
 * holds in any pressure unit (no constant in it: P/F, PiO2, PAO2, A–a, a/A) is written out in
 * kPa, with the numbers as the note wrote them; any other formula is written out in mmHg, as it
 * is computed, and says so, with the conversion of each input the note wrote in kPa.
 */
import type { InputValue, Timepoint } from '../analysis/model';
import { displayUnit } from '../analysis/read-value';
import { describeInputOrigin, substitute } from '../derive/context';
import { isGasPressureValue, type DerivedValue, type Term } from '../derive/model';
import { derivedDef } from '../derive/registry';
import { reproducingExtra, reproducingSubstitution, termWithExtra } from '../derive/reproduce';
import { isKpaField, KPA_DECIMALS, kpaFromMmhg, kpaNumber, showsKpa, statedInKpa, statedKpaNumber, statedNumber } from '../present';
import { formatNumber, formatOutward } from '../util/format';
import { cautionLine, code, escapeMarkdown, paragraphs } from './markdown';

/**
 * A value's number, or its span (`23–27`), in its own unit (mmHg for a gas pressure). An end the
 * value read against it is on at its written resolution is rounded away from the middle
 * (`DerivedValue.outwardEnd`): `35–40` beside a PaCO2 of 4.7 kPa (35 mmHg) counted within 35.55–39.55.
 */
export function numberText(d: DerivedValue): string {
  const r = d.range;
  const out = d.outwardEnd;
  if (!r || out === null) return computedText(d);
  return `${out === 'low' ? formatOutward(r.low, d.decimals, 'low') : formatNumber(r.low, d.decimals)}–${out === 'high' ? formatOutward(r.high, d.decimals, 'high') : formatNumber(r.high, d.decimals)}`;
}

/** A value's number or span as computed, each end rounded as usual (the formula's own result). */
function computedText(d: DerivedValue): string {
  return d.range ? `${formatNumber(d.range.low, d.decimals)}–${formatNumber(d.range.high, d.decimals)}` : formatNumber(d.value, d.decimals);
}

/** The same in kPa (a gas pressure), with the value's own kPa decimals where it has them (an expected range's ends beside the PaCO2). */
export function kpaText(d: DerivedValue): string {
  const places = d.kpaDecimals;
  const kpa = (mmHg: number): string => (places === null ? kpaNumber(mmHg) : formatNumber(kpaFromMmhg(mmHg), places));
  return d.range ? `${kpa(d.range.low)}–${kpa(d.range.high)}` : kpa(d.value);
}

/** Whether a derived value is a gas pressure shown in kPa first at this timepoint. */
export function derivedInKpa(d: DerivedValue, tp: Timepoint | null | undefined): boolean {
  return isGasPressureValue(d) && showsKpa(tp);
}

/**
 * `178 mmHg`, `23–27 mmol/L`, `0.33`: the value as shown; at a timepoint whose gas unit is kPa,
 * a gas pressure is `23.7 kPa (178 mmHg)`.
 */
export function derivedValueText(d: DerivedValue, tp: Timepoint | null = null): string {
  const number = numberText(d);
  if (derivedInKpa(d, tp)) return `${kpaText(d)} kPa (${number} mmHg)`;
  return d.unit ? `${number} ${d.unit}` : number;
}

/**
 * ` = 2.3 kPa`: a gas pressure shown in mmHg, in the other unit system too (as a stated value's
 * hover gives it); empty for any other value, and where kPa is shown first.
 */
export function otherSystemText(d: DerivedValue, tp: Timepoint | null = null): string {
  return isGasPressureValue(d) && !derivedInKpa(d, tp) ? ` = ${kpaText(d)} kPa` : '';
}

/** A formula input that is a gas pressure (PaO2, PaCO2, PB, PH2O, a derived PAO2), in mmHg. */
function isGasTerm(t: Term): boolean {
  return t.unit === 'mmHg' && (t.fieldId === undefined || isKpaField(t.fieldId));
}

/** The stated value an input was read from, when it is one of the timepoint's values in force. */
function statedOfTerm(t: Term, tp: Timepoint): InputValue | undefined {
  if (t.fieldId === undefined || t.origin.kind === 'derived' || t.origin.kind === 'default') return undefined;
  const input = tp.values.get(t.fieldId);
  // A formula that chose among the lines of a timepoint (the Hb of the gas line over a labs Hb):
  // the value of the term's own line, not the last one stated.
  const origin = t.origin;
  if (origin.kind !== 'here' || input === undefined || input.stated.line === origin.line) return input;
  const stated = tp.stated.find((s) => s.fieldId === t.fieldId && s.line === origin.line);
  return stated ? { stated, origin } : input;
}

/**
 * A gas-pressure input's number in kPa: as the note wrote it where it was written in kPa, else
 * converted, with `extra` decimals more where the formula needs them to give its value (reproduce.ts).
 */
function termKpa(t: Term, tp: Timepoint, extra = 0): string {
  const input = statedOfTerm(t, tp);
  return (input ? statedKpaNumber(input.stated) : null) ?? (extra === 0 ? kpaNumber(t.value) : termWithExtra(kpaFromMmhg(t.value), KPA_DECIMALS, extra));
}

/** `PaO2 71 mmHg`: an input as shown; at a kPa timepoint, a gas pressure is `PaO2 9.5 kPa (71 mmHg)`. */
export function termText(t: Term, tp: Timepoint | null = null): string {
  const note = t.note ? ` (${t.note})` : '';
  if (t.word !== undefined) return `${t.name} ${t.word}${note}`;
  if (tp && showsKpa(tp) && isGasTerm(t)) return `${t.name} ${termKpa(t, tp)} kPa (${formatNumber(t.value, t.decimals)} mmHg)${note}`;
  const unit = t.unit ? ` ${t.unit}` : '';
  return `${t.name} ${formatNumber(t.value, t.decimals)}${unit}${tp ? writtenInOtherUnit(t, tp) : ''}${note}`;
}

/**
 * ` (written 5000 ft)`: an input the note wrote in another unit than the one the formula takes (feet
 * for an altitude in metres, pounds for a weight in kg), as written; '' otherwise. A percentage for
 * a fraction (`fio2 40 %` used as 0.40) reads at a glance and is left as it is.
 */
function writtenInOtherUnit(t: Term, tp: Timepoint): string {
  const s = statedOfTerm(t, tp)?.stated;
  if (!s || s.readUnit === null || s.unit === null || s.readUnit === s.unit || s.readUnit === '%' || s.unitDoubt !== null) return '';
  const number = s.item.value?.text;
  return number ? ` (written ${number} ${displayUnit(s.readUnit)})` : '';
}

/**
 * Whether a formula's arithmetic holds in kPa as well as in mmHg: it has no number of its own
 * (a constant may carry a unit: 760 mmHg, 0.003 mL/dL per mmHg) and every input and the result
 * is a gas pressure or a plain ratio. Then every gas pressure scales alike.
 */
function holdsInKpa(d: DerivedValue): boolean {
  if (!isGasPressureValue(d) && d.unit !== '') return false;
  let gas = d.unit === 'mmHg';
  for (const t of d.inputs) {
    if (isGasTerm(t)) gas = true;
    else if (t.unit !== '') return false;
  }
  return gas && !numberOutsideBraces(d.template);
}

function numberOutsideBraces(template: string): boolean {
  let depth = 0;
  for (let i = 0; i < template.length; i++) {
    const c = template.charCodeAt(i);
    if (c === 0x7b) depth++;
    else if (c === 0x7d) depth = Math.max(0, depth - 1);
    else if (depth === 0 && c >= 0x30 && c <= 0x39) return true;
  }
  return false;
}

/** Whether the value or any of its inputs is a gas pressure shown in kPa first at this timepoint. */
function touchesKpa(d: DerivedValue, tp: Timepoint | null): tp is Timepoint {
  return showsKpa(tp) && (isGasPressureValue(d) || d.inputs.some(isGasTerm));
}

/**
 * The formula with the numbers put in, for the timepoint: `7.9 ÷ 0.28 = 28.2 kPa (212 mmHg)` in
 * a kPa note (the formula holds in kPa), `0.0307 × 68 × 10^(7.28 − 6.1) = 31.7 mmol/L` (computed
 * in mmHg: see `substitutedUnitNote`), `71 ÷ 4 + 4 = 22 mmHg = 2.9 kPa`. Unchanged in an mmHg note.
 */
export function substitutedText(d: DerivedValue, tp: Timepoint | null = null): string {
  if (!touchesKpa(d, tp)) return d.substituted;
  if (holdsInKpa(d)) {
    const shown = (t: Term, extra: number): string => (isGasTerm(t) ? termKpa(t, tp, extra) : termWithExtra(t.value, t.decimals, extra));
    const left = d.unit === 'mmHg'
      ? reproducingSubstitution(d.template, d.inputs, substitute, shown, kpaText(d), KPA_DECIMALS)
      // A ratio of two pressures: the same number in either unit.
      : reproducingSubstitution(d.template, d.inputs, substitute, shown, numberText(d), d.decimals);
    return `${left} = ${derivedValueText(d, tp)}`;
  }
  return isGasPressureValue(d) ? `${d.substituted} = ${kpaText(d)} kPa` : d.substituted;
}

/**
 * For a formula written out in mmHg at a kPa timepoint: `in mmHg (PaCO2 9.1 kPa = 68 mmHg)`, the
 * conversion of each input the note wrote in kPa; null when the formula is written out in kPa
 * or the note is in mmHg.
 */
export function substitutedUnitNote(d: DerivedValue, tp: Timepoint | null = null): string | null {
  if (!touchesKpa(d, tp) || holdsInKpa(d)) return null;
  const converted: string[] = [];
  // The mmHg numbers as the formula shows them: with the decimals it needs to give its value.
  // Against the result as computed (the formula's own rounding, as `d.substituted` writes it).
  const extra = reproducingExtra(d.template, d.inputs, substitute, (t, e) => termWithExtra(t.value, t.decimals, e), computedText(d), d.decimals);
  for (const t of d.inputs) {
    if (!isGasTerm(t)) continue;
    const input = statedOfTerm(t, tp);
    if (!input || input.stated.readUnit !== 'kPa') continue;
    const mmHg = extra === 0 ? (statedNumber(input.stated) ?? formatNumber(t.value, t.decimals)) : termWithExtra(t.value, t.decimals, extra);
    converted.push(`${t.name} ${statedInKpa(input.stated) ?? ''} = ${mmHg} mmHg`);
  }
  return converted.length > 0 ? `in mmHg (${converted.join(', ')})` : 'in mmHg';
}

/** Where an input came from; a derived input is named by its label rather than its id. */
function originText(t: Term): string {
  if (t.origin.kind !== 'derived') return describeInputOrigin(t.origin);
  const label = derivedDef(t.origin.id)?.label;
  return label ? `computed here: ${label}` : describeInputOrigin(t.origin);
}

/** The body of a derived value's explanation, without the caution line. */
export function derivedBody(d: DerivedValue, options: { readonly carriedSentence?: boolean; readonly timepoint?: Timepoint | null } = {}): string {
  const tp = options.timepoint ?? null;
  const head = `**${escapeMarkdown(d.label)}** (${escapeMarkdown(d.short)}): **${escapeMarkdown(derivedValueText(d, tp))}**${escapeMarkdown(otherSystemText(d, tp))}${d.estimate ? ' — _estimate_' : ''}`;
  const unitNote = substitutedUnitNote(d, tp);
  const formula = `Formula: ${code(d.formula)}  \nWith the numbers${unitNote ? `, ${escapeMarkdown(unitNote)}` : ''}: ${code(substitutedText(d, tp))}`;
  const inputs = d.inputs.length > 0
    ? `Inputs:\n${d.inputs.map((t) => `- ${escapeMarkdown(termText(t, tp))} — ${escapeMarkdown(originText(t))}`).join('\n')}`
    : null;
  const noteText = d.notes.map((n) => escapeMarkdown(n)).join('; ');
  const notes = noteText ? `Notes: ${noteText}${noteText.endsWith('.') ? '' : '.'}` : null;
  const carried = d.usesCarried && options.carriedSentence !== false ? 'Uses a value carried forward from an earlier timepoint.' : null;
  return paragraphs([head, formula, inputs, notes, carried, `Source: ${escapeMarkdown(d.source)}`]);
}

/** Markdown explanation of one derived value, ending with the caution line; gas pressures as at `timepoint`. */
export function derivedHover(d: DerivedValue, timepoint: Timepoint | null = null): string {
  return paragraphs([derivedBody(d, { timepoint }), cautionLine()]);
}
