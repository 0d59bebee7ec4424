/**
 * The markdown explanation of one derived value, shared by hovers and inlay-hint tooltips:
 * what it is, its value, the formula in words and with the numbers, every input with where it
 * came from, notes, the source, and the caution line.
 */
import { describeInputOrigin } from '../derive/context';
import type { DerivedValue, Term } from '../derive/model';
import { derivedDef } from '../derive/registry';
import { formatNumber } from '../util/format';
import { cautionLine, code, escapeMarkdown, paragraphs } from './markdown';

/** `178 mmHg`, `23–27 mmol/L`, `0.33`: the value as shown. */
export function derivedValueText(d: DerivedValue): string {
  const number = d.range ? `${formatNumber(d.range.low, d.decimals)}–${formatNumber(d.range.high, d.decimals)}` : formatNumber(d.value, d.decimals);
  return d.unit ? `${number} ${d.unit}` : number;
}

/** `PaO2 71 mmHg`: an input as shown. */
export function termText(t: Term): string {
  const unit = t.unit ? ` ${t.unit}` : '';
  return `${t.name} ${formatNumber(t.value, t.decimals)}${unit}${t.note ? ` (${t.note})` : ''}`;
}

/** Where an input came from; a derived input is named by its label rather than its id. */
function originText(t: Term): string {
  if (t.origin.kind !== 'derived') return describeInputOrigin(t.origin);
  const label = derivedDef(t.origin.id)?.label;
  return label ? `computed here: ${label}` : describeInputOrigin(t.origin);
}

/** The body of a derived value's explanation, without the caution line. */
export function derivedBody(d: DerivedValue, options: { readonly carriedSentence?: boolean } = {}): string {
  const head = `**${escapeMarkdown(d.label)}** (${escapeMarkdown(d.short)}): **${escapeMarkdown(derivedValueText(d))}**${d.estimate ? ' — _estimate_' : ''}`;
  const formula = `Formula: ${code(d.formula)}  \nWith the numbers: ${code(d.substituted)}`;
  const inputs = d.inputs.length > 0
    ? `Inputs:\n${d.inputs.map((t) => `- ${escapeMarkdown(termText(t))} — ${escapeMarkdown(originText(t))}`).join('\n')}`
    : null;
  const noteText = d.notes.map((n) => escapeMarkdown(n)).join('; ');
  const notes = noteText ? `Notes: ${noteText}${noteText.endsWith('.') ? '' : '.'}` : null;
  const carried = d.usesCarried && options.carriedSentence !== false ? 'Uses a value carried forward from an earlier timepoint.' : null;
  return paragraphs([head, formula, inputs, notes, carried, `Source: ${escapeMarkdown(d.source)}`]);
}

/** Markdown explanation of one derived value, ending with the caution line. */
export function derivedHover(d: DerivedValue): string {
  return paragraphs([derivedBody(d), cautionLine()]);
}
