/**
 * Postal codes, conservatively: only shapes that clinical text does not produce.
 * - UK postcodes in capitals with their letter rules (`AA9A 9AA`, `A1 1AE`): the inward part
 *   never uses C, I, K, M, O or V, so `V1 2MM` or `T2 4HR`-like clinical shorthand stays silent.
 * - US ZIP+4 (`00345-6789`).
 * - A 5-digit ZIP after a comma and a US state abbreviation (`Fernleigham, IL 00427`), so
 *   `Head CT 12345` stays silent.
 * - After a postcode cue (`postcode`, `post code`, `postal code`, `zip`, `zip code`, `address`):
 *   a UK postcode in any case, a Canadian one (`Z1Z 9Z9`), a ZIP or ZIP+4.
 */
import { endsWithPhrase, isAlnumAt, isAsciiUpperAt, isBlankGap, isDigitAt, isLetterAt, wordsBefore, type Run } from './text';
import { match, type PrivacyMatch } from './types';

const US_STATES = new Set([
  'AL', 'AK', 'AZ', 'AR', 'CA', 'CO', 'CT', 'DE', 'DC', 'FL', 'GA', 'HI', 'ID', 'IL', 'IN', 'IA', 'KS', 'KY', 'LA', 'ME', 'MD', 'MA',
  'MI', 'MN', 'MS', 'MO', 'MT', 'NE', 'NV', 'NH', 'NJ', 'NM', 'NY', 'NC', 'ND', 'OH', 'OK', 'OR', 'PA', 'RI', 'SC', 'SD', 'TN', 'TX',
  'UT', 'VT', 'VA', 'WA', 'WV', 'WI', 'WY', 'PR',
]);

/** Letters a UK postcode may hold at each place (Royal Mail rules, from memory). */
const UK_FIRST = 'ABCDEFGHIJKLMNOPRSTUWYZ';
const UK_SECOND = 'ABCDEFGHKLMNOPQRSTUVWXY';
const UK_THIRD = 'ABCDEFGHJKPSTUW';
const UK_FOURTH = 'ABEHMNPRVWXY';
const UK_INWARD = 'ABDEFGHJLNPQRSTUWXYZ';

/** Inward parts that are clinical shorthand rather than postcodes. */
const UK_INWARD_EXCLUDED = new Set(['HR', 'RR', 'BP']);

/** The outward code of a UK postcode: A9, A9A, A99, AA9, AA9A, AA99 (capitals). */
export function isUkOutward(code: string): boolean {
  const c = code.toUpperCase();
  const letter = (k: number, set: string) => set.includes(c.charAt(k)) && c.charAt(k) !== '';
  const digit = (k: number) => isDigitAt(c, k);
  switch (c.length) {
    case 2: return letter(0, UK_FIRST) && digit(1);
    case 3: return letter(0, UK_FIRST) && ((digit(1) && (digit(2) || letter(2, UK_THIRD))) || (letter(1, UK_SECOND) && digit(2)));
    case 4: return letter(0, UK_FIRST) && letter(1, UK_SECOND) && digit(2) && (digit(3) || letter(3, UK_FOURTH));
    default: return false;
  }
}

/** The inward code of a UK postcode: 9AA with the allowed letters. */
export function isUkInward(code: string): boolean {
  const c = code.toUpperCase();
  return c.length === 3 && isDigitAt(c, 0) && UK_INWARD.includes(c.charAt(1)) && UK_INWARD.includes(c.charAt(2)) && !UK_INWARD_EXCLUDED.has(c.slice(1));
}

function isCapitals(run: Run): boolean {
  for (let k = 0; k < run.text.length; k++) if (isLetterAt(run.text, k) && !isAsciiUpperAt(run.text, k)) return false;
  return true;
}

/** Canadian postal code: A9A 9A9. */
function isCanadian(a: Run, b: Run): boolean {
  if (a.text.length !== 3 || b.text.length !== 3) return false;
  const s = (a.text + b.text).toUpperCase();
  for (let k = 0; k < 6; k++) {
    const wantsDigit = k % 2 === 1;
    if (wantsDigit !== isDigitAt(s, k)) return false;
    if (!wantsDigit && !isAsciiUpperAt(s, k)) return false;
  }
  return true;
}

function isDigits(run: Run | undefined, length: number): boolean {
  return run !== undefined && run.kind === 'digits' && run.text.length === length;
}

/** Postcode cues of two words (`post code`), looked for first, and of one word (`postcode`). */
const CUE_PHRASES: readonly (readonly string[])[] = [['post', 'code'], ['postal', 'code'], ['zip', 'code']];
const CUE_WORDS: ReadonlySet<string> = new Set(['postcode', 'zip', 'zipcode', 'address', 'addr']);

/** The first word of each postcode cue: scan.ts lets a text in lower case with one through its quick test. */
export const POSTCODE_CUE_FIRST_WORDS: readonly string[] = [...CUE_PHRASES.map((phrase) => phrase[0]!), ...CUE_WORDS];

function isPostcodeCue(text: string, start: number): string | null {
  const words = wordsBefore(text, start, 3);
  for (const phrase of CUE_PHRASES) if (endsWithPhrase(words, phrase)) return phrase.join(' ');
  const last = words[words.length - 1];
  return last !== undefined && CUE_WORDS.has(last) ? last : null;
}

/** A run stands alone: not glued to letters, digits or a decimal point on either side. */
function standsAlone(text: string, start: number, end: number): boolean {
  const before = text.charAt(start - 1);
  const after = text.charAt(end);
  if (isAlnumAt(text, start - 1) || isAlnumAt(text, end)) return false;
  if ((before === '.' || before === '/' || before === '-') && isAlnumAt(text, start - 2)) return false;
  if ((after === '.' || after === '/' || after === '-') && isAlnumAt(text, end + 1)) return false;
  return true;
}

/** Adds the postal codes in `text` (whose runs are `runs`) to `out`. */
export function findPostalCodes(text: string, runs: readonly Run[], out: PrivacyMatch[]): void {
  // Each shape below reads the cue (`isPostcodeCue`) only once the run has that shape.
  for (let i = 0; i < runs.length; i++) {
    const a = runs[i]!;
    // Every code starts with five digits (a ZIP) or with two to four letters and digits (`AA9A`, `Z1Z`).
    if (a.kind === 'letters' || (a.kind === 'digits' ? a.text.length !== 5 : a.text.length > 4)) continue;
    const b = runs[i + 1];
    const gap = b ? text.slice(a.end, b.start) : '';
    // UK: outward, one blank, inward.
    if (b && gap === ' ' && b.kind === 'mixed' && isUkOutward(a.text) && isUkInward(b.text) && standsAlone(text, a.start, b.end)) {
      const cue = isPostcodeCue(text, a.start);
      if (cue !== null || (isCapitals(a) && isCapitals(b))) {
        out.push(match('postal-code', text, a.start, b.end, cue));
        i++;
        continue;
      }
    }
    // Canadian, after a cue only.
    if (b && isBlankGap(gap) && isCanadian(a, b) && standsAlone(text, a.start, b.end)) {
      const cue = isPostcodeCue(text, a.start);
      if (cue !== null) {
        out.push(match('postal-code', text, a.start, b.end, cue));
        i++;
        continue;
      }
    }
    // ZIP+4.
    if (isDigits(a, 5) && gap === '-' && isDigits(b, 4) && standsAlone(text, a.start, b!.end)) {
      out.push(match('postal-code', text, a.start, b!.end, isPostcodeCue(text, a.start)));
      i++;
      continue;
    }
    // 5-digit ZIP after a cue, or after `, ST` / `Place ST`.
    if (isDigits(a, 5) && standsAlone(text, a.start, a.end)) {
      const state = runs[i - 1];
      const place = runs[i - 2];
      const stateOk = state !== undefined && US_STATES.has(state.text) && isBlankGap(text.slice(state.end, a.start));
      const before = state && place ? text.slice(place.end, state.start) : '';
      const placeOk = place !== undefined && place.kind === 'letters' && before.startsWith(',') && isBlankGap(before.slice(1));
      const cue = isPostcodeCue(text, a.start);
      if (cue !== null || (stateOk && placeOk)) out.push(match('postal-code', text, a.start, a.end, cue ?? state?.text ?? null));
    }
  }
}
