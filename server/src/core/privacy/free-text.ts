/**
 * Which parts of a note line are free text, where identifiers can hide: comments, note prose,
 * timepoint labels, the whole of a line that is not a section, and on item lines everything but
 * the readings (a known key with its number and unit, or with a word the field lists, is masked
 * out, so `hr 118`, `bp 120/80` or `mode VC` never reach the detectors, while a free word such
 * as `mode Smith`, an unknown key or stray text does).
 */
import type { ItemNode, LineNode } from '../syntax/tree';
import { scanPart } from './scan';
import type { PrivacyMatch } from './types';
import { NONE } from '../util/lists';

export interface FreeText {
  /** The text to scan; positions in it are positions in the line plus `start`. */
  readonly text: string;
  readonly start: number;
}

export function freeTextOf(node: LineNode): FreeText[] {
  const out: FreeText[] = [];
  eachFreeText(node, (source, from, to) => { out.push({ text: source.slice(from, to), start: from }); });
  return out;
}

/**
 * Calls `visit` with each free-text part of a line: `source[from, to)`, where `from` is also where
 * the part starts in the line (`source` is the line, or the line with its readings blanked out).
 * Parts are passed by position so that a part the scan rejects at a glance is never copied.
 */
function eachFreeText(node: LineNode, visit: (source: string, from: number, to: number) => void): void {
  const bodyEnd = node.comment ? node.comment.span.start : node.text.length;
  switch (node.kind) {
    case 'blank':
      break;
    case 'timepoint':
      if (node.label) visit(node.text, node.label.span.start, node.label.span.end);
      break;
    case 'unknown': {
      const end = node.rest ? node.rest.span.end : node.first.span.end;
      visit(node.text, node.first.span.start, end);
      break;
    }
    case 'section':
      if (node.section === 'note') {
        if (node.prose) visit(node.text, node.prose.span.start, node.prose.span.end);
      } else {
        const masked = maskReadings(node.text, bodyEnd, node);
        if (masked !== '') visit(masked, 0, masked.length);
      }
      break;
  }
  if (node.comment) visit(node.text, node.comment.span.start, node.comment.span.end);
}

/**
 * The body of an item line (`text` up to `bodyEnd`) with each reading (known key, number or pair
 * value, unit; or a word the field lists) blanked out; '' when nothing else is there (the common
 * case, found without copying the line or allocating).
 */
function maskReadings(text: string, bodyEnd: number, node: Extract<LineNode, { kind: 'section' }>): string {
  // Common case: nothing but the section word, readings, blanks, commas and slashes.
  let at = node.sectionToken.span.end;
  let free = false;
  const items = node.items;
  for (let k = 0; k < items.length; k++) {
    const item = items[k]!;
    if (!isReading(item)) continue;
    const span = item.span;
    if (hasFreeText(text, at, Math.min(span.start, bodyEnd))) { free = true; break; }
    at = Math.max(at, span.end);
  }
  if (!free && !hasFreeText(text, at, bodyEnd)) return '';
  const body = text.slice(0, bodyEnd);
  let out = '';
  at = 0;
  for (const item of node.items) {
    if (!isReading(item)) continue;
    const span = item.span;
    const start = Math.max(at, Math.min(span.start, body.length));
    const end = Math.max(start, Math.min(span.end, body.length));
    out += body.slice(at, start) + ' '.repeat(end - start);
    at = end;
  }
  return out + body.slice(at);
}

/** A reading: a known key with a number or pair value, or with a word the field lists (`mode VC`). */
function isReading(item: ItemNode): boolean {
  const kind = item.valueKind;
  if (kind === null) return false;
  const field = item.field;
  // A number or a pair: under a known key, or an implied one (a shorthand gas part).
  if (kind !== 'word') return field !== null || item.implied !== null;
  return field !== null && field.words?.[item.value!.text.toLowerCase()] !== undefined;
}

/** Whether `text[from, to)` holds anything but blanks, commas and slashes (the slashes of a shorthand gas). */
function hasFreeText(text: string, from: number, to: number): boolean {
  for (let i = from; i < to; i++) {
    const c = text.charCodeAt(i);
    if (c !== 0x20 && c !== 0x09 && c !== 0x2c && c !== 0x2f) return true;
  }
  return false;
}

/** Identifiers on one line, with spans in line coordinates. */
export function scanLine(node: LineNode): readonly PrivacyMatch[] {
  found = null;
  try {
    eachFreeText(node, scanFreeText);
    return found ?? NONE;
  } finally {
    found = null;
  }
}

/**
 * The matches of the line `scanLine` is reading (null while none). One variable for all lines
 * rather than a closure per line: a big note has thousands of lines, and a scan never starts
 * another.
 */
let found: PrivacyMatch[] | null = null;

function scanFreeText(source: string, from: number, to: number): void {
  const matches = scanPart(source, from, to);
  for (let k = 0; k < matches.length; k++) {
    const m = matches[k]!;
    (found ??= []).push({ ...m, span: { start: m.span.start + from, end: m.span.end + from } });
  }
}
