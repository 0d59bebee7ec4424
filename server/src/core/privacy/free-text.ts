/**
 * Which parts of a note line are free text, where identifiers can hide: comments, note prose,
 * timepoint labels, the whole of a line that is not a section, and on item lines everything but
 * the readings (a known key with its number and unit, or with a word the field lists, is masked
 * out, so `hr 118`, `bp 120/80` or `mode VC` never reach the detectors, while a free word such
 * as `mode Smith`, an unknown key or stray text does).
 */
import { fieldFor } from '../fields/registry';
import type { LineNode, Span } from '../syntax/tree';
import { scan } from './scan';
import type { PrivacyMatch } from './types';

export interface FreeText {
  /** The text to scan; positions in it are positions in the line plus `start`. */
  readonly text: string;
  readonly start: number;
}

export function freeTextOf(node: LineNode): FreeText[] {
  const out: FreeText[] = [];
  const bodyEnd = node.comment ? node.comment.span.start : node.text.length;
  switch (node.kind) {
    case 'blank':
      break;
    case 'timepoint':
      if (node.label) out.push({ text: node.label.text, start: node.label.span.start });
      break;
    case 'unknown': {
      const end = node.rest ? node.rest.span.end : node.first.span.end;
      out.push({ text: node.text.slice(node.first.span.start, end), start: node.first.span.start });
      break;
    }
    case 'section':
      if (node.section === 'note') {
        if (node.prose) out.push({ text: node.prose.text, start: node.prose.span.start });
      } else {
        const masked = maskReadings(node.text, bodyEnd, node);
        if (masked !== '') out.push({ text: masked, start: 0 });
      }
      break;
  }
  if (node.comment) out.push({ text: node.comment.text, start: node.comment.span.start });
  return out;
}

/**
 * The body of an item line (`text` up to `bodyEnd`) with each reading (known key, number or pair
 * value, unit) blanked out; '' when nothing else is there (the common case, found without
 * copying the line).
 */
function maskReadings(text: string, bodyEnd: number, node: Extract<LineNode, { kind: 'section' }>): string {
  const masked: Span[] = [];
  for (const item of node.items) {
    if (!item.value) continue;
    const field = item.implied !== null && item.value.kind !== 'word' ? true : fieldFor(node.section, item.keyName);
    if (!field) continue;
    // A word is a reading when it is one the field lists (`mode VC`); any other word is free text.
    if (item.value.kind === 'word' && (field === true || field.words?.[item.value.text.toLowerCase()] === undefined)) continue;
    masked.push(item.span);
  }
  // Blanks, commas and the slashes of a shorthand gas between its numbers are no text.
  const isFree = (c: number) => c !== 0x20 && c !== 0x09 && c !== 0x2c && c !== 0x2f;
  // Common case: nothing but the section word, readings, blanks and commas. Nothing to scan.
  let free = false;
  let at0 = node.sectionToken.span.end;
  for (const span of masked) {
    for (let i = at0; i < span.start && i < bodyEnd; i++) {
      if (isFree(text.charCodeAt(i))) { free = true; break; }
    }
    if (free) break;
    at0 = Math.max(at0, span.end);
  }
  if (!free) {
    for (let i = at0; i < bodyEnd; i++) {
      if (isFree(text.charCodeAt(i))) { free = true; break; }
    }
  }
  if (!free) return '';
  const body = text.slice(0, bodyEnd);
  if (masked.length === 0) return body;
  let out = '';
  let at = 0;
  for (const span of masked) {
    const start = Math.max(at, Math.min(span.start, body.length));
    const end = Math.max(start, Math.min(span.end, body.length));
    out += body.slice(at, start) + ' '.repeat(end - start);
    at = end;
  }
  return out + body.slice(at);
}

/** Identifiers on one line, with spans in line coordinates. */
export function scanLine(node: LineNode): PrivacyMatch[] {
  const out: PrivacyMatch[] = [];
  for (const part of freeTextOf(node)) {
    for (const m of scan(part.text)) {
      out.push({ ...m, span: { start: m.span.start + part.start, end: m.span.end + part.start } });
    }
  }
  return out;
}
