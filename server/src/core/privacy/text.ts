/**
 * Reading free text for the de-identification detectors: character classes and "runs"
 * (maximal stretches of letters and digits) with their spans. Everything here is a linear
 * scan over the text; no regular expressions.
 */
export type RunKind = 'digits' | 'letters' | 'mixed';

/** A maximal stretch of letters and digits, with its span in the scanned text. */
export interface Run {
  readonly text: string;
  readonly start: number;
  readonly end: number;
  readonly kind: RunKind;
}

export function isDigitAt(text: string, i: number): boolean {
  const c = text.charCodeAt(i);
  return c >= 0x30 && c <= 0x39;
}

/** A cased letter (Latin, Greek, Cyrillic, …): it has an upper- and a lower-case form. */
export function isLetterChar(ch: string): boolean {
  if (ch.length !== 1) return false;
  const c = ch.charCodeAt(0);
  if (c < 0x80) return (c >= 0x41 && c <= 0x5a) || (c >= 0x61 && c <= 0x7a); // ASCII without case folding
  return ch.toLowerCase() !== ch.toUpperCase();
}

export function isLetterAt(text: string, i: number): boolean {
  if (i < 0 || i >= text.length) return false;
  const c = text.charCodeAt(i);
  // ASCII without making a one-character string: every run of every scanned text comes here.
  if (c < 0x80) return (c >= 0x41 && c <= 0x5a) || (c >= 0x61 && c <= 0x7a);
  return isLetterChar(text.charAt(i));
}

export function isUpperChar(ch: string): boolean {
  const c = ch.charCodeAt(0);
  if (ch.length === 1 && c < 0x80) return c >= 0x41 && c <= 0x5a;
  return isLetterChar(ch) && ch === ch.toUpperCase();
}

export function isLowerChar(ch: string): boolean {
  const c = ch.charCodeAt(0);
  if (ch.length === 1 && c < 0x80) return c >= 0x61 && c <= 0x7a;
  return isLetterChar(ch) && ch === ch.toLowerCase();
}

export function isAsciiUpperAt(text: string, i: number): boolean {
  const c = text.charCodeAt(i);
  return c >= 0x41 && c <= 0x5a;
}

export function isAsciiLowerAt(text: string, i: number): boolean {
  const c = text.charCodeAt(i);
  return c >= 0x61 && c <= 0x7a;
}

export function isAlnumAt(text: string, i: number): boolean {
  return isDigitAt(text, i) || isLetterAt(text, i);
}

/**
 * Whether the character at `i` may be an upper-case letter: an ASCII capital, or any character
 * beyond ASCII (`isUpperChar` decides those). Every name starts with one, so a text without
 * one after a cue holds no name (see `findNames`).
 */
export function mayBeUpperAt(text: string, i: number): boolean {
  const c = text.charCodeAt(i);
  return (c >= 0x41 && c <= 0x5a) || c > 0x7f;
}

/** Splits text into runs of letters and digits (everything else separates them). */
export function runsOf(text: string): Run[] {
  const runs: Run[] = [];
  let i = 0;
  const n = text.length;
  while (i < n) {
    const start = i;
    let digits = 0;
    let letters = 0;
    // Each character is classed once.
    for (; i < n; i++) {
      if (isDigitAt(text, i)) digits++;
      else if (isLetterAt(text, i)) letters++;
      else break;
    }
    if (i === start) { i++; continue; }
    const kind: RunKind = letters === 0 ? 'digits' : digits === 0 ? 'letters' : 'mixed';
    runs.push({ text: text.slice(start, i), start, end: i, kind });
  }
  return runs;
}

/** Whether the text is one or more blanks and nothing else. */
export function isBlankGap(gap: string): boolean {
  if (gap.length === 0) return false;
  for (let i = 0; i < gap.length; i++) if (!isBlankChar(gap.charCodeAt(i))) return false;
  return true;
}

export function isBlankChar(code: number): boolean {
  return code === 0x20 || code === 0x09 || code === 0xa0 || code === 0x202f || (code >= 0x2000 && code <= 0x200a);
}

/**
 * The words (lower case, letters only) in the text just before `end`, last word last: at most
 * `maxWords` words within `maxChars` characters. Dots and other marks separate words, so
 * `D.O.B.` reads as `d o b`.
 */
export function wordsBefore(text: string, end: number, maxWords = 4, maxChars = 40): string[] {
  const from = Math.max(0, end - maxChars);
  const words: string[] = [];
  let i = end - 1;
  while (i >= from && words.length < maxWords) {
    if (!isLetterAt(text, i)) {
      // A digit ends the look-back: the words before a number belong to that number.
      if (isDigitAt(text, i)) break;
      i--;
      continue;
    }
    const wordEnd = i + 1;
    while (i >= from && isLetterAt(text, i)) i--;
    // A word cut off by the look-back window is not a word.
    if (i < from && from > 0 && isLetterAt(text, from - 1)) break;
    words.unshift(text.slice(i + 1, wordEnd).toLowerCase());
  }
  return words;
}

/** Drops trailing filler words (`no`, `is`, `on` …) from a word list. */
export function withoutTrailing(words: readonly string[], fillers: ReadonlySet<string>): string[] {
  const out = [...words];
  while (out.length > 0 && fillers.has(out[out.length - 1]!)) out.pop();
  return out;
}

/** Whether the word list ends with the phrase (lower-case words). */
export function endsWithPhrase(words: readonly string[], phrase: readonly string[]): boolean {
  if (phrase.length > words.length) return false;
  const offset = words.length - phrase.length;
  return phrase.every((w, k) => words[offset + k] === w);
}
