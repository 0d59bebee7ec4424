/**
 * Phone numbers and record numbers: runs of digit groups (`+44 20 7946 0958`, `(555) 010-1234`,
 * `999 123 4578`, `1234567`) and letter-and-digit identifiers (`AB123456`). One family, because
 * the same digits can be either: a cue word before them decides (`tel`, `MRN`, `NHS` …), then the
 * shape does. Clinical numbers are kept out by the shapes: decimals, slashes, times and units end
 * a candidate, and lists of small numbers (`118 120 96`) fit no phone shape.
 *
 * Scanning is linear: each candidate is read once from its first character, and the scan
 * resumes after it whether or not it was an identifier.
 */
import { followedByUnit, isGluedQuantity } from './quantities';
import { endsWithPhrase, isAlnumAt, isDigitAt, isLetterAt, withoutTrailing, wordsBefore, type Run } from './text';
import { match, type PrivacyMatch } from './types';

interface DigitGroup {
  readonly start: number;
  readonly end: number;
  readonly digits: string;
  /** Written in parentheses: `(555)`. */
  readonly paren: boolean;
}

interface Candidate {
  readonly start: number;
  readonly end: number;
  readonly plus: boolean;
  readonly groups: readonly DigitGroup[];
  /** Separator after each group but the last: ' ', '-', '.' or '' (after a parenthesised group). */
  readonly seps: readonly string[];
}

const MAX_GROUPS = 8;
const MAX_DIGITS = 20;
/** Every identifier of digit groups needs 5 digits at least (after a record cue); most need 7 or more. */
const MIN_DIGITS = 5;

/** Phone cues (not `call`: `on call` is a duty, not a number). */
const PHONE_CUES = new Set(['tel', 'telephone', 'phone', 'mobile', 'mob', 'cell', 'cellphone', 'fax', 'contact', 'landline', 'whatsapp']);
const RECORD_CUES = new Set([
  'mrn', 'nhs', 'nhi', 'chi', 'urn', 'ur', 'crn', 'hospital', 'hosp', 'record', 'records', 'case', 'id', 'identifier',
  'ssn', 'sin', 'medicare', 'medicaid', 'insurance', 'policy', 'account', 'acct', 'passport', 'licence', 'license',
]);
const CUE_FILLERS = new Set(['no', 'number', 'num', 'nr', 'is', 'was', 'on', 'at', 'code']);

/** The cue word before a position: a phone cue, a record cue, or none. */
export function numberCueBefore(text: string, start: number): { readonly kind: 'phone' | 'record'; readonly word: string } | null {
  const words = withoutTrailing(wordsBefore(text, start, 4), CUE_FILLERS);
  const last = words[words.length - 1];
  if (last === undefined) return null;
  // The cue as written (`MRN`, not `mrn`).
  const from = Math.max(0, start - 40);
  const at = text.slice(from, start).toLowerCase().lastIndexOf(last);
  const written = at >= 0 ? text.slice(from + at, from + at + last.length) : last;
  if (PHONE_CUES.has(last)) return { kind: 'phone', word: written };
  if (RECORD_CUES.has(last)) return { kind: 'record', word: written };
  if (endsWithPhrase(words, ['s', 's'])) return { kind: 'record', word: 'ss' };
  return null;
}

/**
 * Can a candidate start at `i`? Not inside a word, a decimal, a time, a range or a fraction. A
 * colon or a full stop after a letter ends a label or an abbreviation (`MRN:1234567`, `no.48812`),
 * not a number: only after a digit do they join two parts of one (`07:40`, `7.35`).
 */
function startsCleanly(text: string, i: number): boolean {
  if (i === 0) return true;
  const p = text.charAt(i - 1);
  if (isAlnumAt(text, i - 1) || p === '/' || p === '\\' || p === '+' || p === '−') return false;
  if ((p === ':' || p === '.') && i >= 2 && isDigitAt(text, i - 2)) return false;
  if ((p === ',' || p === '-') && i >= 2 && isAlnumAt(text, i - 2)) return false;
  return true;
}

/** Does a candidate end cleanly at `end`? Not glued to a word, a decimal part, a unit or a fraction. */
function endsCleanly(text: string, end: number): boolean {
  if (end >= text.length) return true;
  const c = text.charAt(end);
  if (isAlnumAt(text, end) || c === '/' || c === '%' || c === '\\' || c === '°') return false;
  if ((c === '.' || c === ',' || c === ':' || c === '-') && isAlnumAt(text, end + 1)) return false;
  return true;
}

/**
 * Where the group of digits at `j` ends (after its `)` when it is in parentheses, `(555)`), or -1
 * when no group starts there.
 */
function groupEnd(text: string, j: number): number {
  if (text.charAt(j) === '(' && isDigitAt(text, j + 1)) {
    let k = j + 1;
    while (k < text.length && isDigitAt(text, k) && k - j <= 6) k++;
    return text.charAt(k) === ')' ? k + 1 : -1;
  }
  if (!isDigitAt(text, j)) return -1;
  let k = j;
  while (k < text.length && isDigitAt(text, k)) k++;
  return k;
}

/**
 * The groups of the candidate `readCandidate` is reading (where each starts and ends, the first
 * `groupCount`) and the separators after them: arrays kept from one candidate to the next, as most
 * candidates (`118`, `26`) hold fewer than the five digits every identifier needs and are dropped
 * without building anything.
 */
const groupStarts: number[] = [];
const groupEnds: number[] = [];
const groupSeps: string[] = [];
let groupCount = 0;
let sepCount = 0;

/** The group that `readCandidate` read at `[start, end)`. */
function digitGroup(text: string, start: number, end: number): DigitGroup {
  const paren = text.charAt(start) === '(';
  return { start, end, digits: paren ? text.slice(start + 1, end - 1) : text.slice(start, end), paren };
}

/**
 * Reads a candidate starting at `i` and, when it holds five digits or more (fewer make no
 * identifier: see `classify`), adds what it is to `out`; returns where scanning resumes.
 */
function readCandidate(text: string, i: number, out: PrivacyMatch[]): number {
  let j = i;
  const plus = text.charAt(j) === '+';
  if (plus) j++;
  groupCount = 0;
  sepCount = 0;
  let digits = 0;
  for (;;) {
    const end = groupEnd(text, j);
    if (end < 0) {
      if (groupCount > 0 && sepCount > 0) sepCount--;
      break;
    }
    const paren = text.charAt(j) === '(';
    groupStarts[groupCount] = j;
    groupEnds[groupCount] = end;
    groupCount++;
    digits += paren ? end - j - 2 : end - j;
    j = end;
    if (groupCount > MAX_GROUPS || digits > MAX_DIGITS) {
      // Too long to be a phone or record number: skip the whole run of digit groups.
      while (j < text.length && (isDigitAt(text, j) || text.charAt(j) === ' ' || text.charAt(j) === '-' || text.charAt(j) === '.')) j++;
      return j;
    }
    const c = text.charAt(j);
    if ((c === ' ' || c === '-' || c === '.') && (isDigitAt(text, j + 1) || text.charAt(j + 1) === '(')) {
      groupSeps[sepCount++] = c;
      j++;
      continue;
    }
    if (paren && isDigitAt(text, j)) {
      groupSeps[sepCount++] = '';
      continue;
    }
    break;
  }
  if (groupCount === 0) return i + 1;
  const lastEnd = groupEnds[groupCount - 1]!;
  if (!endsCleanly(text, lastEnd)) {
    let k = lastEnd;
    while (k < text.length && isAlnumAt(text, k)) k++;
    return Math.max(k, i + 1);
  }
  if (digits >= MIN_DIGITS) {
    const groups: DigitGroup[] = [];
    for (let k = 0; k < groupCount; k++) groups.push(digitGroup(text, groupStarts[k]!, groupEnds[k]!));
    const m = classify(text, { start: i, end: lastEnd, plus, groups, seps: groupSeps.slice(0, sepCount) });
    if (m) out.push(m);
  }
  return lastEnd;
}

/** Adds the phone and record numbers made of digit groups to `out`, in order. */
function digitIdentifiers(text: string, out: PrivacyMatch[]): void {
  let i = 0;
  while (i < text.length) {
    const c = text.charAt(i);
    const opens = (c === '+' && (isDigitAt(text, i + 1) || (text.charAt(i + 1) === '(' && isDigitAt(text, i + 2)))) || (c === '(' && isDigitAt(text, i + 1)) || isDigitAt(text, i);
    if (!opens || !startsCleanly(text, i)) {
      // Skip the rest of a run of digits that cannot start a candidate.
      i++;
      while (i < text.length && isDigitAt(text, i) && isDigitAt(text, i - 1)) i++;
      continue;
    }
    i = Math.max(readCandidate(text, i, out), i + 1);
  }
}

/** Modulus-11 check digit of a 10-digit NHS number (NHS Data Dictionary, from memory). */
export function isValidNhsNumber(digits: string): boolean {
  if (digits.length !== 10) return false;
  let sum = 0;
  for (let k = 0; k < 9; k++) sum += Number(digits.charAt(k)) * (10 - k);
  const check = 11 - (sum % 11);
  const expected = check === 11 ? 0 : check;
  return expected !== 10 && expected === Number(digits.charAt(9));
}

function isClockHhmm(digits: string): boolean {
  return digits.length === 4 && Number(digits.slice(0, 2)) <= 23 && Number(digits.slice(2)) <= 59;
}

/** `1000000`, `2500000`: a round quantity rather than an identifier. */
function isRound(digits: string): boolean {
  for (let k = 2; k < digits.length; k++) if (digits.charAt(k) !== '0') return false;
  return true;
}

function lengths(c: Candidate): number[] {
  return c.groups.map((g) => g.digits.length);
}

function sameSeps(c: Candidate, sep: string): boolean {
  return c.seps.length > 0 && c.seps.every((s) => s === sep);
}

function hasShape(c: Candidate, shape: readonly number[]): boolean {
  const ls = lengths(c);
  return ls.length === shape.length && ls.every((l, k) => l === shape[k]);
}

/** What candidate `c` is, if anything; it holds `MIN_DIGITS` digits or more (`readCandidate` passes no other). */
function classify(text: string, c: Candidate): PrivacyMatch | null {
  const all = c.groups.map((g) => g.digits).join('');
  const n = all.length;
  const paren = c.groups.some((g) => g.paren);
  // A LOINC-like code (`2744-1`, `30525-0`: digits, a hyphen, one check digit) is no identifier.
  if (!c.plus && !paren && c.groups.length === 2 && c.seps[0] === '-' && c.groups[1]!.digits.length === 1 && c.groups[0]!.digits.length <= 5) return null;
  const cue = numberCueBefore(text, c.start);
  const at = (kind: 'phone' | 'record-number', cueWord: string | null) => match(kind, text, c.start, c.end, cueWord);

  // A number followed by a unit is a quantity (`250 500 1000 mL`), even after a cue
  // (`record 12500 mL out`, `in this case 25000 units heparin`).
  if (followedByUnit(text, c.end, cue !== null)) return null;
  if (cue?.kind === 'record' && n >= 5) return at('record-number', cue.word);
  if (cue?.kind === 'phone' && n >= 7 && n <= 15 && c.groups.slice(1).every((g) => g.digits.length >= 2)) return at('phone', cue.word);

  // US social security number shape 123-45-6789.
  if (!c.plus && !paren && sameSeps(c, '-') && hasShape(c, [3, 2, 4])) return at('record-number', null);

  // International: +CC …
  if (c.plus) {
    const first = c.groups[0]!;
    const short = c.groups.slice(1).filter((g) => g.digits.length < 2).length;
    const dotted = c.seps.includes('.');
    const single = c.groups.length === 1;
    if (n >= 9 && n <= 15 && !dotted && short <= 1 && (single ? n >= 10 : first.digits.length <= 3)) return at('phone', null);
    return null;
  }

  // An area code in parentheses: (555) 010-1234, (020) 7946 0958.
  if (paren) {
    const k = c.groups.findIndex((g) => g.paren);
    const area = c.groups[k]!;
    const after = c.groups.slice(k + 1);
    if (area.digits.length >= 2 && area.digits.length <= 5 && after.length >= 1 && after.every((g) => g.digits.length >= 3) && n >= 9 && n <= 12 && !c.seps.includes('.')) return at('phone', null);
    return null;
  }

  // 3-3-4 groups: an NHS number when its check digit is right; else a (North American) phone
  // when written with hyphens or dots. Blank-separated 3-3-4 without a valid check digit could
  // as well be a list of quantities (`250 500 1000`), so it is left alone.
  if (hasShape(c, [3, 3, 4]) && (sameSeps(c, ' ') || sameSeps(c, '-') || sameSeps(c, '.'))) {
    if (isValidNhsNumber(all)) return at('record-number', null);
    return sameSeps(c, ' ') ? null : at('phone', null);
  }

  // National numbers with a trunk 0: 020 7946 0958, 07700 900123, 01 23 45 67 89.
  const firstDigits = c.groups[0]!.digits;
  if (c.groups.length >= 2 && firstDigits.startsWith('0') && firstDigits.length >= 2 && n >= 10 && n <= 11 && !c.seps.includes('.') && !c.groups.every((g) => isClockHhmm(g.digits))) {
    return at('phone', null);
  }

  // A national number written without blanks: 10 or 11 digits after a trunk 0 (`07700900123`).
  if (c.groups.length === 1 && !paren && firstDigits.startsWith('0') && (n === 10 || n === 11)) return at('phone', null);

  // A long run of digits alone: a record number (7 digits or more, not a round quantity).
  if (c.groups.length === 1 && n >= 7 && !isRound(all)) return at('record-number', null);
  return null;
}

/** Adds the identifiers of letters and digits to `out`: `AB123456`, `K1234567`, or any after a record cue (`MRN RX12345`). */
function mixedIdentifiers(text: string, runs: readonly Run[], out: PrivacyMatch[]): void {
  for (let r = 0; r < runs.length; r++) {
    const run = runs[r]!;
    if (run.kind !== 'mixed' || run.text.length > 20) continue;
    let digits = 0;
    for (let k = 0; k < run.text.length; k++) if (isDigitAt(run.text, k)) digits++;
    // A quantity with its unit glued on (`record 12500mL out`).
    if (digits < 4 || isGluedQuantity(run.text)) continue;
    const cue = numberCueBefore(text, run.start);
    if (cue?.kind === 'record' && digits >= 4) {
      out.push(match('record-number', text, run.start, run.end, cue.word));
      continue;
    }
    let lead = 0;
    while (lead < run.text.length && isLetterAt(run.text, lead) && run.text.charCodeAt(lead) >= 0x41 && run.text.charCodeAt(lead) <= 0x5a) lead++;
    const prefixShape = lead >= 1 && lead <= 3 && digits === run.text.length - lead && digits >= 6;
    if (prefixShape || digits >= 7) out.push(match('record-number', text, run.start, run.end, null));
  }
}

/**
 * Adds the phone and record numbers in `text` to `out`: `runs` are its runs, and it holds
 * `digits` digits (the groups of digits are read only when there are enough for one identifier).
 */
export function findNumberIdentifiers(text: string, runs: readonly Run[], digits: number, out: PrivacyMatch[]): void {
  if (digits >= MIN_DIGITS) digitIdentifiers(text, out);
  mixedIdentifiers(text, runs, out);
}
