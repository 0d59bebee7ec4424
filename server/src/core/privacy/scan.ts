/**
 * `scan(text)`: every possible identifier in a piece of free text, as non-overlapping matches
 * sorted by position. Each detector family reads the text on its own; where two matches
 * overlap, the longer one wins, then the more specific kind (`KIND_PRIORITY`).
 */
import { findDates, LOWER_CASE_MONTHS } from './dates';
import { findEmails } from './emails';
import { findNames } from './names';
import { findNumberIdentifiers } from './numbers';
import { findPostalCodes, POSTCODE_CUE_FIRST_WORDS } from './postal-codes';
import { KIND_PRIORITY, type PrivacyMatch } from './types';
import { isAsciiLowerAt, runsOf } from './text';
import { NONE } from '../util/lists';

/** Longer lines are scanned only up to this many characters (a note line is far shorter). */
export const MAX_SCAN_LENGTH = 10_000;

export function scan(text: string): readonly PrivacyMatch[] {
  return scanPart(text, 0, text.length);
}

/**
 * `scan(source.slice(from, to))`, with spans in the slice. The slice is made only when the quick
 * test lets it through: most free text of a note (`turned and settled`) is rejected unread.
 */
export function scanPart(source: string, from: number, to: number): readonly PrivacyMatch[] {
  const end = Math.min(to, from + MAX_SCAN_LENGTH);
  // A quick test that skips most clinical text: every identifier needs an `@`, a capital (names,
  // postcodes, capitalised months, cues such as `DOB` or `MRN` are often capitalised), four digits
  // or more (phone, record and numeric dates, birth years), a day with a month name in lower case,
  // or a postcode cue.
  let digits = 0;
  let at = false;
  // A capital, or any character beyond ASCII (it may be one: `Émile`).
  let capital = false;
  for (let i = from; i < end; i++) {
    const c = source.charCodeAt(i);
    if (c >= 0x30 && c <= 0x39) digits++;
    else if (c === 0x40) at = true;
    else if ((c >= 0x41 && c <= 0x5a) || c > 0x7f) capital = true;
  }
  if (!at && !capital && digits < 4 && (digits === 0 || !hasLowerCaseCueWord(source, from, end))) return NONE;
  const input = from === 0 && end === source.length ? source : source.slice(from, end);
  // The runs are read once for every detector. A detector runs only when the text has what each
  // of its identifiers needs: dates a digit, phone and record numbers four (five in a group of
  // digits, or four in a run with letters), postal codes two (`A1 1AE`), e-mail addresses an `@`,
  // names a capital (after a cue, which `findNames` looks for itself).
  const runs = runsOf(input);
  const all: PrivacyMatch[] = [];
  if (at) findEmails(input, all);
  if (digits >= 1) findDates(input, runs, all);
  if (digits >= 4) findNumberIdentifiers(input, runs, digits, all);
  if (digits >= 2) findPostalCodes(input, runs, all);
  if (capital) findNames(input, runs, all);
  if (all.length === 0) return NONE;
  all.sort((a, b) => a.span.start - b.span.start || (b.span.end - b.span.start) - (a.span.end - a.span.start) || KIND_PRIORITY[b.kind] - KIND_PRIORITY[a.kind]);
  // Keep the best match of each overlapping cluster: a later match replaces the kept one only
  // when it is longer (or as long and of a higher priority).
  const kept: PrivacyMatch[] = [];
  for (const m of all) {
    const last = kept[kept.length - 1];
    if (!last || m.span.start >= last.span.end) {
      kept.push(m);
      continue;
    }
    const len = m.span.end - m.span.start;
    const lastLen = last.span.end - last.span.start;
    if (len > lastLen || (len === lastLen && KIND_PRIORITY[m.kind] > KIND_PRIORITY[last.kind])) kept[kept.length - 1] = m;
  }
  return kept;
}

/**
 * The words in lower case that let a text with one to three digits and no capital through: the
 * full month names that count in lower case (dates.ts: `june 4`) and the first word of each
 * postcode cue (postal-codes.ts: `postcode a1 1ae`). Each must stand as a word of its own.
 */
const LOWER_CASE_CUE_WORDS: ReadonlySet<string> = new Set([...LOWER_CASE_MONTHS, ...POSTCODE_CUE_FIRST_WORDS]);
const CUE_WORD_INITIALS = new Set([...LOWER_CASE_CUE_WORDS].map((word) => word.charCodeAt(0)));
const CUE_WORD_MIN_LENGTH = Math.min(...[...LOWER_CASE_CUE_WORDS].map((word) => word.length));
const CUE_WORD_MAX_LENGTH = Math.max(...[...LOWER_CASE_CUE_WORDS].map((word) => word.length));

/**
 * Whether `text[from, to)`, which is in lower-case ASCII, holds one of `LOWER_CASE_CUE_WORDS` as a
 * word (a stretch of letters between non-letters). Only words of the right length and initial
 * are copied to be looked up.
 */
function hasLowerCaseCueWord(text: string, from: number, to: number): boolean {
  let i = from;
  while (i < to) {
    if (!isAsciiLowerAt(text, i)) { i++; continue; }
    const start = i;
    while (i < to && isAsciiLowerAt(text, i)) i++;
    const length = i - start;
    if (length >= CUE_WORD_MIN_LENGTH && length <= CUE_WORD_MAX_LENGTH && CUE_WORD_INITIALS.has(text.charCodeAt(start)) && LOWER_CASE_CUE_WORDS.has(text.slice(start, i))) return true;
  }
  return false;
}
