/**
 * Small markdown helpers for hovers and tooltips: escaping text that comes from the note, and
 * the caution line that ends every hover with clinical content.
 */
import { shownEscaped } from '../util/format';
import { CAUTION } from './types';

/** Escapes characters markdown would read as formatting (text from the note is never markup). */
export function escapeMarkdown(text: string): string {
  return text.replace(/[\\`*_[\]<>|~]/g, (c) => `\\${c}`);
}

/**
 * Pneumark's own prose (a section's or a field's description), in which words between backticks
 * are code (`gas kPa`): those become code spans, the rest is escaped as text.
 */
export function describedMarkdown(text: string): string {
  return text.split('`').map((part, i) => (i % 2 === 1 ? code(part) : escapeMarkdown(part))).join('');
}

/**
 * Inline code that survives backticks inside the text. Invisible and reordering characters are
 * shown escaped (`h\u{200D}r`), as in messages: a hover must not quote `hr` where the note holds
 * something else.
 */
export function code(raw: string): string {
  const text = shownEscaped(raw);
  const fence = text.includes('`') ? '``' : '`';
  const pad = text.startsWith('`') || text.endsWith('`') ? ' ' : '';
  return `${fence}${pad}${text}${pad}${fence}`;
}

/** The caution paragraph. */
export function cautionLine(): string {
  return `_${CAUTION}_`;
}

/** Joins paragraphs with blank lines, dropping empty ones. */
export function paragraphs(parts: readonly (string | null | undefined | false)[]): string {
  return parts.filter((p): p is string => typeof p === 'string' && p.length > 0).join('\n\n');
}
