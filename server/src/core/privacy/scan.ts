/**
 * `scan(text)`: every possible identifier in a piece of free text, as non-overlapping matches
 * sorted by position. Each detector family reads the text on its own; where two matches
 * overlap, the longer one wins, then the more specific kind (`KIND_PRIORITY`).
 */
import { findDates } from './dates';
import { findEmails } from './emails';
import { findNames } from './names';
import { findNumberIdentifiers } from './numbers';
import { findPostalCodes } from './postal-codes';
import { KIND_PRIORITY, type PrivacyMatch } from './types';
import { NONE } from '../util/lists';

/** Longer lines are scanned only up to this many characters (a note line is far shorter). */
export const MAX_SCAN_LENGTH = 10_000;

export function scan(text: string): readonly PrivacyMatch[] {
  const input = text.length > MAX_SCAN_LENGTH ? text.slice(0, MAX_SCAN_LENGTH) : text;
  if (!mayHoldIdentifier(input)) return NONE;
  const all = [...findEmails(input), ...findDates(input), ...findNumberIdentifiers(input), ...findPostalCodes(input), ...findNames(input)];
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

/** Full month names that count in lower case (see dates.ts). */
const LOWER_CASE_MONTHS = ['january', 'february', 'april', 'june', 'july', 'september', 'october', 'november', 'december'];

/** Cues after which a code in lower case counts (`postcode m1 1ae`, `zip 90210`). */
const LOWER_CASE_CUES = ['post', 'zip', 'addr'];

/**
 * A quick test that skips most clinical text: every identifier needs an `@`, a capital (names,
 * postcodes, capitalised months, cues such as `DOB` or `MRN` are often capitalised), four digits
 * or more (phone, record and numeric dates, birth years), a day with a month name in lower case,
 * or a postcode cue.
 */
function mayHoldIdentifier(text: string): boolean {
  let digits = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c >= 0x30 && c <= 0x39) digits++;
    else if (c === 0x40 || (c >= 0x41 && c <= 0x5a) || c > 0x7f) return true;
  }
  if (digits >= 4) return true;
  if (digits === 0) return false;
  const lower = text.toLowerCase();
  return LOWER_CASE_MONTHS.some((m) => lower.includes(m)) || LOWER_CASE_CUES.some((w) => lower.includes(w));
}
