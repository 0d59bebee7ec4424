/**
 * Calendar dates and dates of birth. Numeric dates need three parts with one separator
 * (`2026-03-04`, `04/03/2026`, `4.3.2026`) and a four-digit year from 1900 to 2099; a two-digit
 * year (`12/03/61`) counts only after a birth cue. Written dates need a month name next to a day
 * or a year (`4 March 2026`, `March 4, 2026`, `4th of March`, `Mar 2026`); a two-digit year after
 * a day and a month is part of the date (`4 Mar 26`, `4-Mar-26`). A date after a birth
 * cue (`DOB`, `D.O.B.`, `born`, `date of birth`) is a date of birth, and so is a bare year there.
 * Shorthand gases (`7.28/56/71/26`), pressures (`120/80`), fractions (`3/7`) and LOINC codes
 * (`2744-1`) have the wrong number of parts or a decimal, so they never read as dates.
 */
import { followedByUnit } from './quantities';
import { endsWithPhrase, isAlnumAt, isBlankGap, isDigitAt, withoutTrailing, wordsBefore, type Run } from './text';
import { match, type PrivacyMatch } from './types';

/** Month spellings: full names and abbreviations. */
const MONTHS: readonly (readonly string[])[] = [
  ['january', 'jan'], ['february', 'feb'], ['march', 'mar'], ['april', 'apr'], ['may'], ['june', 'jun'],
  ['july', 'jul'], ['august', 'aug'], ['september', 'sep', 'sept'], ['october', 'oct'], ['november', 'nov'], ['december', 'dec'],
];

/** Each spelling of `MONTHS` with its month's index (0 for January). */
const MONTH_INDEX: ReadonlyMap<string, number> = new Map(MONTHS.flatMap((names, index) => names.map((name) => [name, index] as const)));

/** The shortest and longest month spellings: other words are no month, found without lowering their case. */
const MONTH_MIN_LENGTH = Math.min(...[...MONTH_INDEX.keys()].map((name) => name.length));
const MONTH_MAX_LENGTH = Math.max(...[...MONTH_INDEX.keys()].map((name) => name.length));

/** Full month names that are also ordinary words: they count only when capitalised. */
const AMBIGUOUS_FULL = new Set(['may', 'march', 'august']);

/** The full month names that count in lower case (`june 4`): scan.ts lets a text with one through its quick test. */
export const LOWER_CASE_MONTHS: readonly string[] = MONTHS.map((names) => names[0]!).filter((name) => !AMBIGUOUS_FULL.has(name));

const BIRTH_FILLERS = new Set(['on', 'in', 'is', 'was', 'the', 'at']);

/**
 * Whether a run is a month name. Full names count in lower case too (except may, march and
 * august, which must be capitalised); abbreviations must be capitalised (`Mar`). Names in
 * capitals (`MAR`, `SEP`, `MAY`) count too, but only in a date with a year (see `writtenDates`).
 */
export function monthOf(run: Run): number | null {
  if (run.kind !== 'letters' || run.text.length < MONTH_MIN_LENGTH || run.text.length > MONTH_MAX_LENGTH) return null;
  const lower = run.text.toLowerCase();
  const index = MONTH_INDEX.get(lower);
  if (index === undefined) return null;
  const full = MONTHS[index]![0] === lower;
  const capitalised = run.text.charAt(0) === run.text.charAt(0).toUpperCase() && run.text.slice(1) === run.text.slice(1).toLowerCase();
  if (full && !AMBIGUOUS_FULL.has(lower)) return index + 1;
  return capitalised || isCapitals(run.text) ? index + 1 : null;
}

/** A word in capitals of three letters or more (`MAR`, `SEPT`). */
function isCapitals(word: string): boolean {
  return word.length >= 3 && word === word.toUpperCase() && word !== word.toLowerCase();
}

/** An abbreviated month (`Mar`, `Sept`, `MAR`): a full stop may follow it (`Mar. 4`). */
function isAbbreviatedMonth(run: Run): boolean {
  const lower = run.text.toLowerCase();
  const index = MONTH_INDEX.get(lower);
  return index !== undefined && MONTHS[index]![0] !== lower;
}

/** A day of the month: `4`, `04`, `4th`, `22nd`. */
function dayOf(run: Run | undefined): number | null {
  if (!run) return null;
  let digits = run.text;
  if (run.kind === 'mixed') {
    const suffix = run.text.slice(-2).toLowerCase();
    if (!['st', 'nd', 'rd', 'th'].includes(suffix)) return null;
    digits = run.text.slice(0, -2);
    for (let k = 0; k < digits.length; k++) if (!isDigitAt(digits, k)) return null;
  } else if (run.kind !== 'digits') return null;
  if (digits.length < 1 || digits.length > 2) return null;
  const d = Number(digits);
  return d >= 1 && d <= 31 ? d : null;
}

function yearOf(run: Run | undefined): number | null {
  if (!run || run.kind !== 'digits' || run.text.length !== 4) return null;
  const y = Number(run.text);
  return y >= 1900 && y <= 2099 ? y : null;
}

/** Whether a birth cue stands right before `start` (only blanks and marks between). */
export function birthCueBefore(text: string, start: number): string | null {
  const words = withoutTrailing(wordsBefore(text, start, 5), BIRTH_FILLERS);
  if (endsWithPhrase(words, ['date', 'of', 'birth'])) return 'date of birth';
  if (endsWithPhrase(words, ['birth', 'date'])) return 'birth date';
  if (endsWithPhrase(words, ['d', 'o', 'b'])) return 'D.O.B.';
  const last = words[words.length - 1];
  if (last === 'dob' || last === 'born' || last === 'birthdate' || last === 'birthday') return last === 'dob' ? 'DOB' : last;
  return null;
}

function isDateSep(gap: string): boolean {
  return gap === '/' || gap === '-' || gap === '.';
}

/**
 * Between words of a written date: blanks, or one hyphen (`4-Mar-2026`), or a comma and blanks
 * (`March 4, 2026`), or a full stop and blanks after an abbreviated month (`Mar. 4`). A full
 * stop anywhere else ends a sentence (`RR 24. May need NIV`).
 */
function isWordGap(gap: string, afterAbbreviation: boolean): boolean {
  if (isBlankGap(gap) || gap === '-') return true;
  if (gap === '.' || gap === ',') return false;
  const first = gap.charAt(0);
  return (first === ',' || (first === '.' && afterAbbreviation)) && isBlankGap(gap.slice(1));
}

/** Whether runs `x` and `y` are both there with a gap between words of a written date between them. */
function wordGapBetween(text: string, x: Run | undefined, y: Run | undefined): boolean {
  return x !== undefined && y !== undefined && isWordGap(text.slice(x.end, y.start), isAbbreviatedMonth(x));
}

/** Between a day and the month after it: blanks or one hyphen (`4 March`, `4-Mar`). */
function isDayMonthGap(gap: string): boolean {
  return isBlankGap(gap) || gap === '-';
}

/** A two-digit year: `26` in `4-Mar-26`. */
function isTwoDigitYear(run: Run | undefined): boolean {
  return run !== undefined && run.kind === 'digits' && run.text.length === 2;
}

function validDayMonth(a: number, b: number): boolean {
  return (a >= 1 && b >= 1) && ((a <= 31 && b <= 12) || (a <= 12 && b <= 31));
}

/**
 * Adds the date found at `[start, end)` to `out`: a date of birth after a birth cue, else a
 * calendar date unless it needs the cue (`needsBirthCue`: a two-digit year, or a bare year).
 */
function addDate(out: PrivacyMatch[], text: string, start: number, end: number, needsBirthCue: boolean): void {
  const cue = birthCueBefore(text, start);
  if (cue !== null) out.push(match('birth-date', text, start, end, cue));
  else if (!needsBirthCue) out.push(match('calendar-date', text, start, end, null));
}

function numericDates(text: string, runs: readonly Run[], out: PrivacyMatch[]): void {
  for (let i = 0; i + 2 < runs.length; i++) {
    const a = runs[i]!;
    const b = runs[i + 1]!;
    let c = runs[i + 2]!;
    // An ISO date with a time glued on: `2026-03-04T08:00` (the date part is the finding).
    if (c.kind === 'mixed' && a.text.length === 4 && c.text.length > 3 && isDigitAt(c.text, 0) && isDigitAt(c.text, 1) && c.text.charAt(2) === 'T' && isDigitAt(c.text, 3)) {
      c = { text: c.text.slice(0, 2), start: c.start, end: c.start + 2, kind: 'digits' };
    }
    if (a.kind !== 'digits' || b.kind !== 'digits' || c.kind !== 'digits') continue;
    const g1 = text.slice(a.end, b.start);
    const g2 = text.slice(b.end, c.start);
    if (g1 !== g2 || !isDateSep(g1)) continue;
    // Exactly three parts: nothing joined on either side.
    const before = text.charAt(a.start - 1);
    if (a.start > 0 && (isDateSep(before) || before === ',' || before === ':') && isAlnumAt(text, a.start - 2)) continue;
    const after = text.charAt(c.end);
    if ((isDateSep(after) || after === ',' || after === ':') && isAlnumAt(text, c.end + 1)) continue;
    if (b.text.length > 2) continue;
    const bn = Number(b.text);
    if (a.text.length === 4) {
      const y = yearOf(a);
      if (y !== null && bn >= 1 && bn <= 12 && c.text.length <= 2 && Number(c.text) >= 1 && Number(c.text) <= 31) addDate(out, text, a.start, c.end, false);
      continue;
    }
    if (a.text.length > 2 || !validDayMonth(Number(a.text), bn)) continue;
    if (c.text.length === 4 && yearOf(c) !== null) addDate(out, text, a.start, c.end, false);
    else if (c.text.length === 2) addDate(out, text, a.start, c.end, true);
  }
}

/** `20260304`: a compact year-month-day. */
function compactDates(text: string, runs: readonly Run[], out: PrivacyMatch[]): void {
  for (const r of runs) {
    if (r.kind !== 'digits' || r.text.length !== 8) continue;
    const y = Number(r.text.slice(0, 4));
    const m = Number(r.text.slice(4, 6));
    const d = Number(r.text.slice(6));
    if (y >= 1900 && y <= 2099 && m >= 1 && m <= 12 && d >= 1 && d <= 31) addDate(out, text, r.start, r.end, false);
  }
}

/**
 * Whether the character at `at` joins the date to more of a number: a letter or digit, or a mark
 * (`.`, `,`, `:`, `/`, `-`) with a digit beyond it (`direction` is -1 before the date, 1 after).
 */
function joinedNumber(text: string, at: number, direction: -1 | 1): boolean {
  if (at < 0 || at >= text.length) return false;
  if (isAlnumAt(text, at)) return true;
  const c = text.charAt(at);
  return (c === '.' || c === ',' || c === ':' || c === '/' || c === '-') && isDigitAt(text, at + direction);
}

/**
 * Whether a two-digit year (`yearRun`) belongs to the day and month before it, so that the
 * finding covers it too: between hyphens (`4-Mar-26`), or after blanks (`4 Mar 26`, `12 March 61`)
 * when it is no quantity (`4 May 10 mg` is a date and a dose) and no part of a longer number
 * (`4 Mar 10:30`, `4 Mar 26.5`). With blanks, a month in capitals (`MAR` is also a drug chart)
 * takes it only after a birth cue (`DOB 12 MAR 61`).
 */
function twoDigitYearAfter(text: string, dayGap: string, month: Run, yearRun: Run, start: number): boolean {
  const gap = text.slice(month.end, yearRun.start);
  if (dayGap === '-' && gap === '-') return true;
  if (!isBlankGap(dayGap) || !isBlankGap(gap)) return false;
  if (birthCueBefore(text, start) !== null) return true;
  return !isCapitals(month.text) && !joinedNumber(text, yearRun.end, 1) && !followedByUnit(text, yearRun.end);
}

/**
 * Whether one of the two runs on either side of run `i` holds digits: the day (`4 March`, `4th of
 * March`, `March 4`) or the year (`Mar 2026`, `March 4, 2026`) of a written date is there, so a
 * month with none is no date (most words are told so without a look at their letters).
 */
function digitsNear(runs: readonly Run[], i: number): boolean {
  for (let k = Math.max(0, i - 2); k <= i + 2 && k < runs.length; k++) if (k !== i && runs[k]!.kind !== 'letters') return true;
  return false;
}

function writtenDates(text: string, runs: readonly Run[], out: PrivacyMatch[]): void {
  for (let i = 0; i < runs.length; i++) {
    const month = runs[i]!;
    if (!digitsNear(runs, i) || monthOf(month) === null) continue;
    let start = month.start;
    let end = month.end;
    let found = false;
    let year = false;
    // Day before: `4 March`, `4th of March`, `4-Mar`.
    const prev = runs[i - 1];
    const prev2 = runs[i - 2];
    let dayGap: string | null = null;
    if (prev && dayOf(prev) !== null && isDayMonthGap(text.slice(prev.end, month.start))) {
      start = prev.start;
      dayGap = text.slice(prev.end, month.start);
      found = true;
    } else if (prev?.text.toLowerCase() === 'of' && isBlankGap(text.slice(prev.end, month.start)) && prev2 && isBlankGap(text.slice(prev2.end, prev.start)) && dayOf(prev2) !== null) {
      start = prev2.start;
      found = true;
    }
    let k = i + 1;
    // Day after: `March 4`, `Mar. 4th` (only when no day came before).
    if (!found && wordGapBetween(text, month, runs[k]) && dayOf(runs[k]) !== null && yearOf(runs[k]) === null) {
      end = runs[k]!.end;
      found = true;
      k++;
    }
    // Year after: `4 March 2026`, `March 4, 2026`, `March 2026`.
    const yearRun = runs[k];
    if (wordGapBetween(text, runs[k - 1], yearRun) && yearOf(yearRun) !== null) {
      end = yearRun!.end;
      found = true;
      year = true;
    } else if (dayGap !== null && k === i + 1 && isTwoDigitYear(yearRun) && twoDigitYearAfter(text, dayGap, month, yearRun!, start)) {
      end = yearRun!.end;
      year = true;
    }
    if (!found) continue;
    // A month in capitals (`MAR` is also a drug chart, `MAY` a word) needs a year.
    if (isCapitals(month.text) && !year) continue;
    // Not part of a longer token: `Aug 1.2 g` is a dose, `March 2026/27` no year.
    if (joinedNumber(text, start - 1, -1) || joinedNumber(text, end, 1)) continue;
    // `Aug 1 g`, `May 5 mg`: a quantity after a word that looks like a month.
    if (followedByUnit(text, end)) continue;
    addDate(out, text, start, end, false);
  }
}

function birthYears(text: string, runs: readonly Run[], out: PrivacyMatch[]): void {
  for (const r of runs) {
    if (yearOf(r) === null) continue;
    const before = text.charAt(r.start - 1);
    const after = text.charAt(r.end);
    if (isDateSep(before) || isDateSep(after) || after === ':') continue;
    // A bare year is a date of birth after a birth cue, and nothing without one.
    addDate(out, text, r.start, r.end, true);
  }
}

/** Adds the dates and dates of birth in `text` (whose runs are `runs`) to `out`. */
export function findDates(text: string, runs: readonly Run[], out: PrivacyMatch[]): void {
  numericDates(text, runs, out);
  compactDates(text, runs, out);
  writtenDates(text, runs, out);
  birthYears(text, runs, out);
}
