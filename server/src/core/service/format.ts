/**
 * The formatter: rewrites each readable line into the canonical layout, touching nothing else.
 *
 * Canonical layout of a section line: the section word as written, padded so that items start
 * in column 10 (one space after a longer word); the lead (a shorthand gas, or an oxygen device
 * with its flow) as written, followed by `, ` when a comma was written after it and by one
 * space otherwise; items `key value unit` with single spaces, joined with `, `, and a comma
 * written after the last item kept. A unit glued to its number (`89%`) is written apart (`89 %`)
 * when it is a known unit. A range (`target 88 - 92`, `88 – 92`, `88–92`) is written `88-92`, its two
 * numbers joined by a hyphen. Note lines keep their prose exactly. Timepoint lines read
 * `@ <time>  <label>` (time words single spaced, label exactly as written), or `@ <time>, <label>`
 * when a comma was written after the time. Every blank written between words that are read,
 * also inside a unit or a word of two words and a shorthand gas, becomes one plain space (a
 * no-break or thin space is an unusual blank, PN107).
 *
 * Nothing but blanks is ever removed: commas that separate nothing (at the start of a line, right
 * after the section word, a second one between two items) and a full stop that ends the items are
 * reported by the parser, so their lines are left as they are (below).
 *
 * Comments: a trailing comment keeps its column when the formatted content ends at least two
 * columns before it, else it follows the content after two spaces (so hand-aligned comments
 * stay aligned). Trailing blanks are removed (also inside the end of a comment).
 *
 * Left exactly as they are: blank lines, comment-only lines, lines with syntax issues (unknown
 * section, key without value, decimal comma, unreadable time or shorthand, stray text) and
 * any line whose canonical form would not read back to the same items (checked by re-parsing
 * it). Spellings of sections, keys, numbers, units and words are never changed (a range's dash
 * is punctuation, not a spelling), line endings
 * are kept per line, and a byte-order mark at the start of the text is kept.
 */
import { isKnownUnitSpelling } from '../fields/units';
import { isBlank } from '../syntax/lexer';
import { squeezeBlanks } from '../syntax/blanks';
import { eachLineBetween, isDashedPair, parseLine, parseNote } from '../syntax/parser';
import type { ItemNode, LineNode, SectionLine, TimepointLine } from '../syntax/tree';
import type { TextEdit } from '../types';
import { applyEdits } from './text-edits';
import type { LineSpan } from './types';

import { COMMENT_GAP, ITEM_COLUMN } from '../syntax/layout';

export { COMMENT_GAP, ITEM_COLUMN };

const BOM = '\uFEFF';

/** The whole note in the canonical layout. */
export function formatNote(text: string): string {
  return applyEdits(text, formatEdits(text));
}

/**
 * Minimal edits that bring the note (or only the given lines, both ends inclusive) into the
 * canonical layout: one edit per changed line, covering only the part that changes. Given lines,
 * only those are cut out of the text and parsed (lines are read independently), so formatting a
 * few lines of a long note costs little more than finding where they start.
 */
export function formatEdits(text: string, lines?: LineSpan): TextEdit[] {
  const edits: TextEdit[] = [];
  if (!lines) {
    for (const node of parseNote(text).lines) pushLineEdit(edits, node);
    return edits;
  }
  if (lines.end < lines.start || lines.end < 0) return edits;
  eachLineBetween(text, Math.max(0, lines.start), lines.end, (line, number) => pushLineEdit(edits, parseLine(line, number)));
  return edits;
}

function pushLineEdit(edits: TextEdit[], node: LineNode): void {
  const formatted = formatLine(node);
  if (formatted !== null && formatted !== node.text) edits.push(lineEdit(node.line, node.text, formatted));
}

/** The canonical form of one parsed line, or null when the line is left as it is. */
export function formatLine(node: LineNode): string | null {
  if (node.issues.length > 0) return null;
  if (node.kind !== 'section' && node.kind !== 'timepoint') return null;
  const prefix = node.line === 0 && node.text.startsWith(BOM) ? BOM : '';
  const wanted = signature(node);
  for (const unglue of [true, false]) {
    const content = node.kind === 'section' ? sectionContent(node, unglue) : timepointContent(node);
    if (content === null) return null;
    const candidate = withComment(node, prefix + content);
    if (signature(parseLine(candidate, node.line)) === wanted) return candidate;
  }
  return null;
}

function withComment(node: LineNode, content: string): string {
  if (!node.comment) return content;
  const comment = trimEndBlanks(node.comment.text);
  const column = Math.max(content.length + COMMENT_GAP, node.comment.span.start);
  return content + ' '.repeat(column - content.length) + comment;
}

function trimEndBlanks(text: string): string {
  let end = text.length;
  while (end > 0 && (isBlank(text.charCodeAt(end - 1)) || /\s/.test(text.charAt(end - 1)))) end--;
  return text.slice(0, end);
}

/** Blank-separated words joined by single spaces. */
function singleSpaced(text: string): string {
  const words: string[] = [];
  let word = '';
  for (let i = 0; i < text.length; i++) {
    if (isBlank(text.charCodeAt(i))) {
      if (word) words.push(word);
      word = '';
    } else word += text.charAt(i);
  }
  if (word) words.push(word);
  return words.join(' ');
}

function timepointContent(node: TimepointLine): string | null {
  if (!node.time) return null;
  const time = singleSpaced(node.time.text);
  // `@ 08:00, arrival`: commas after the time are kept, glued to it.
  const commas = commasIn(node.text, node.time.span.end, node.label ? node.label.span.start : bodyEnd(node));
  return `@ ${time}${commas}${node.label ? `${commas ? ' ' : '  '}${node.label.text}` : ''}`;
}

/** Where the content of a line ends: at its comment, or at its end. */
function bodyEnd(node: LineNode): number {
  return node.comment ? node.comment.span.start : node.text.length;
}

/** The commas in `[from, to)` of a line (where only blanks and commas are), as a string of commas. */
function commasIn(text: string, from: number, to: number): string {
  let commas = '';
  for (let i = from; i < to; i++) if (text.charCodeAt(i) === 0x2c) commas += ',';
  return commas;
}

/** The comma written after the last item (`vitals hr 80, rr 18,`), if any: the grammar allows it, so it is kept. */
function trailingComma(node: SectionLine): string {
  let end = -1;
  for (const item of node.items) end = Math.max(end, item.span.end, item.unit?.span.end ?? -1);
  return end < 0 ? '' : commasIn(node.text, end, bodyEnd(node));
}

function sectionContent(node: SectionLine, unglue: boolean): string | null {
  const word = node.sectionToken.text;
  const items = node.section === 'note' ? (node.prose?.text ?? '') : itemsText(node, unglue);
  if (items === null) return null;
  const rest = node.section === 'note' ? items : items + trailingComma(node);
  if (!rest) return word;
  return `${word.padEnd(ITEM_COLUMN - 1)} ${rest}`;
}

function unitText(item: ItemNode, unglue: boolean): string {
  const unit = item.unit;
  if (!unit) return '';
  const glued = item.value !== null && unit.span.start === item.value.span.end;
  if (glued && !(unglue && isKnownUnitSpelling(unit.text))) return squeezeBlanks(unit.text);
  return ` ${squeezeBlanks(unit.text)}`;
}

/**
 * An item's value as the canonical layout writes it: as written with its blanks squeezed, but a
 * range (`target 88 - 92`, `88 – 92`, `88–92`) as its two numbers joined by a hyphen, `88-92`.
 */
function valueText(item: ItemNode): string {
  const value = item.value!;
  if (value.kind === 'pair' && isDashedPair(value)) {
    const [low, high] = value.parts;
    if (low && high) return `${low.text}-${high.text}`;
  }
  return squeezeBlanks(value.text);
}

function itemsText(node: SectionLine, unglue: boolean): string | null {
  const parts: string[] = [];
  /** Where the lead (shorthand or device) ends, to keep the separator written after it. */
  let leadEnd: number | null = null;
  const items = node.items;
  let i = 0;
  while (i < items.length) {
    const item = items[i]!;
    if (item.implied === 'shorthand') {
      let last = item;
      let unit = item.unit;
      while (items[i + 1]?.implied === 'shorthand') {
        i++;
        last = items[i]!;
        unit ??= last.unit;
      }
      if (!item.value || !last.value) return null;
      const group = squeezeBlanks(node.text.slice(item.value.span.start, last.value.span.end));
      parts.push(unit ? `${group} ${squeezeBlanks(unit.text)}` : group);
      leadEnd = (unit ?? last.value).span.end;
    } else if (item.implied === 'device') {
      if (!item.value) return null;
      let lead = squeezeBlanks(item.value.text);
      leadEnd = item.value.span.end;
      const flow = items[i + 1];
      if (flow?.implied === 'device-flow') {
        i++;
        if (!flow.value) return null;
        lead += ` ${flow.value.text}${unitText(flow, unglue)}`;
        leadEnd = (flow.unit ?? flow.value).span.end;
      }
      parts.push(lead);
    } else if (item.implied === 'device-flow') {
      return null; // a flow always follows its device
    } else if (item.implied === 'bracketed-mean') {
      // `bp 120/80 (93)`: the mean stays in its brackets after the blood pressure it belongs to,
      // with its unit (`(93 mmHg)`); one blank before the bracket (`120/80(93)` too) and none inside.
      if (!item.value || parts.length === 0) return null;
      parts[parts.length - 1] += ` (${item.value.text}${unitText(item, unglue)})`;
    } else {
      if (!item.key || !item.value) return null;
      parts.push(`${item.key.text} ${valueText(item)}${unitText(item, unglue)}`);
    }
    i++;
  }
  if (leadEnd === null || parts.length < 2) return parts.join(', ');
  // The lead is followed by a comma only when one was written after it (`venturi, fio2 28 %`
  // and `niv ipap 18, epap 5` both stay as they are).
  const next = items.find((it) => it.span.start >= leadEnd! && it.implied !== 'shorthand' && it.implied !== 'device' && it.implied !== 'device-flow');
  const commaAfterLead = next !== undefined && node.text.slice(leadEnd, next.span.start).includes(',');
  const [lead, ...rest] = parts;
  return `${lead}${commaAfterLead ? ', ' : ' '}${rest.join(', ')}`;
}

/** What a line means, independent of its layout: equal signatures read the same. */
function signature(node: LineNode): string {
  const comment = node.comment ? trimEndBlanks(node.comment.text) : null;
  switch (node.kind) {
    case 'section':
      return JSON.stringify([
        'section', node.section, node.sectionToken.text, node.prose?.text ?? null, comment, node.issues.length,
        node.items.map((i) => [i.keyName, i.implied, i.key?.text ?? null, i.value?.kind ?? null, i.value ? valueText(i) : null, i.unit ? squeezeBlanks(i.unit.text) : null]),
      ]);
    case 'timepoint':
      return JSON.stringify(['timepoint', node.time ? [node.time.kind, node.time.day, node.time.minutes, singleSpaced(node.time.text)] : null, node.label?.text ?? null, comment, node.issues.length]);
    default:
      return JSON.stringify([node.kind, node.text]);
  }
}

/** The smallest edit that turns one line into another (never splitting a surrogate pair). */
function lineEdit(line: number, before: string, after: string): TextEdit {
  let start = 0;
  const max = Math.min(before.length, after.length);
  while (start < max && before.charCodeAt(start) === after.charCodeAt(start)) start++;
  if (start > 0 && isHighSurrogate(before.charCodeAt(start - 1))) start--;
  let endBefore = before.length;
  let endAfter = after.length;
  while (endBefore > start && endAfter > start && before.charCodeAt(endBefore - 1) === after.charCodeAt(endAfter - 1)) {
    endBefore--;
    endAfter--;
  }
  if (endBefore < before.length && isLowSurrogate(before.charCodeAt(endBefore))) {
    endBefore++;
    endAfter++;
  }
  return {
    range: { start: { line, character: start }, end: { line, character: endBefore } },
    newText: after.slice(start, endAfter),
  };
}

function isHighSurrogate(c: number): boolean {
  return c >= 0xd800 && c <= 0xdbff;
}

function isLowSurrogate(c: number): boolean {
  return c >= 0xdc00 && c <= 0xdfff;
}
