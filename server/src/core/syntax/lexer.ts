/**
 * Splits one line body (comment already removed) into chunks: runs of characters that are
 * not blanks or separating commas. A comma between two digits stays inside its chunk (it is a
 * decimal comma, reported later). Linear in the length of the line; no regular expressions.
 */
import type { Span } from './tree';
import { compact } from '../util/numbers';
import { isBlank } from './blanks';

/**
 * A chunk of a line: its text and where it is. A chunk is its own span (`span` returns the chunk),
 * so a chunk kept as a token in the tree is one object, not two: a big note has one per word.
 */
export class Chunk implements Span {
  // Declared, not class fields, as the parser's nodes are (see `BlankNode` in parser.ts).
  declare readonly text: string;
  declare readonly start: number;
  declare readonly end: number;
  /** A comma separated this chunk from the previous one. */
  declare readonly afterComma: boolean;

  constructor(text: string, start: number, end: number, afterComma: boolean) {
    this.text = text;
    this.start = start;
    this.end = end;
    this.afterComma = afterComma;
  }

  get span(): Span {
    return this;
  }
}

/** Blanks are defined once, in blanks.ts, for the lexer, the grammar and the format spec alike. */
export { isBlank } from './blanks';

/**
 * `text.toLowerCase()`, without a copy when the text has no capital to lower: V8 makes a new string
 * at every call, and the parser lowers a word for most words of a note, nearly all written in
 * lower case already. Text with a character beyond ASCII goes to toLowerCase as it is.
 */
export function lowerCase(text: string): string {
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if ((c >= 0x41 && c <= 0x5a) || c > 0x7f) return text.toLowerCase();
  }
  return text;
}

export function isDigit(code: number): boolean {
  return code >= 0x30 && code <= 0x39;
}

/**
 * A chunk as the parser reads it. The lexer reuses words from line to line (a big note has one
 * per word, and the tree keeps few), so a word holds only until the next line is cut: what the
 * tree keeps is copied out of it. `span` gives a new span at each read, never the word itself.
 *
 * A word is read in place in the text its line is in (`source`, where the line starts at `base`:
 * the whole note as `parseNote` reads it, so no line is cut out to be read, see `wordsIn`); its
 * `start` and `end` are places in its line. Its text is cut out when first read (a word of the
 * format is given its kept string instead): most numbers are read in place (`scanWord`) and the
 * words of prose are never read, so their texts would be copies made only to be dropped. Whoever
 * changes a word keeps that so (a full stop left out: `text` and `end` together).
 */
export class Word {
  /** The text once known (or given), else null: see `text`. */
  private cut: string | null;

  constructor(
    text: string | null = null,
    public start = 0,
    public end = 0,
    /** A comma separated this word from the previous one. */
    public afterComma = false,
    /** The text the word's line is in (the line itself, or its whole note). */
    public source = '',
    /** Where the word's line starts in `source`. */
    public base = 0,
    /**
     * Which word of the vocabulary given to `wordsOf` this word is (its index in `words`), or -1:
     * what the caller knows of the words of its format is looked up by it, not by the text.
     */
    public known = -1,
  ) {
    this.cut = text;
  }

  get text(): string {
    return (this.cut ??= this.source.slice(this.base + this.start, this.base + this.end));
  }

  /** The word made another text: no longer a word of the vocabulary (a caller that knows it is sets `known` after). */
  set text(text: string) {
    this.cut = text;
    this.known = -1;
  }

  get span(): Span {
    return { start: this.start, end: this.end };
  }

  /** The word made another: the pooled words are reused from line to line (see `wordsOf`). */
  reuse(text: string | null, start: number, end: number, afterComma: boolean, source: string, base: number, known: number): void {
    this.cut = text;
    this.start = start;
    this.end = end;
    this.afterComma = afterComma;
    this.source = source;
    this.base = base;
    this.known = known;
  }
}

/**
 * `scanNumber` of a word's text, read in its line without cutting the text out. A number scanned
 * in the line stops where it stops in the word (a word ends at a blank, a separating comma or the
 * end of the line) but in one case: a sign before a comma and digits (`-,5`), where the word's own
 * text is scanned instead.
 */
export function scanWord(word: Word): number {
  // Past the line's end in its note comes a line end or a comment's `#`, which end a number as the end of the text does.
  const length = scanNumber(word.source, word.base + word.start);
  return length <= word.end - word.start ? length : scanNumber(word.text);
}

/** What a character is to `wordsOf`: part of a word (0), a blank or a comma. */
const BLANK = 1;
const COMMA = 2;
/**
 * The kind of each ASCII character, looked up in one read in the lexer's loop (most characters of
 * a note are ASCII) instead of the comparisons of `isBlank` and the comma's; beyond ASCII, `isBlank`.
 */
const ASCII_KIND: Uint8Array = (() => {
  const kinds = new Uint8Array(0x80);
  for (let c = 0; c < 0x80; c++) kinds[c] = c === 0x2c ? COMMA : isBlank(c) ? BLANK : 0;
  return kinds;
})();

/** More words than any line holds (its characters are fewer), as a whole number. */
const MOST_WORDS = 0x3fffffff;

/** Words reused from line to line, by their place in the line; a line longer than this gets words of its own beyond it. */
const POOL: Word[] = [];
const POOL_LIMIT = 4096;
/**
 * The list `wordsOf` hands out, also reused from line to line: a list grown by push for every line
 * of a big note would be some megabytes of garbage. Its length is set to each line's count of words
 * but never to 0 (V8 would free its backing store, and the next line would grow a new one): a line
 * without words gets its own empty list.
 */
const LIST: Word[] = [];
/** How many words `wordsOf` handed out last. */
let handedCount = 0;
/** The line `wordsIn` read last, for `moreWordsOf` to read on in: its text, where it starts in it and where its body ends. */
let lineSource = '';
let lineBase = 0;
let lineLimit = 0;
/** The most words handed out for one line since `releaseWords` last ran: those it lets go of. */
let heldCount = 0;

/**
 * What `wordsOf` saw of the line besides its words: whether two commas came with no word
 * between them (`hr 80,, rr 18`, also before the first word or after the last). One record for
 * every line, read right after the call: few lines have such commas, and the parser looks for
 * them only then; whether a digit came right after a comma (`7,35`, `,5`): a number read from the
 * line can have a decimal comma only then, and the parser looks for one only then. And where
 * `wordsOf` stopped reading, given a `max` it reached before the end of the line (-1: at the end),
 * for `moreWordsOf` to read on from.
 */
export const LEXED: { doubledComma: boolean; digitAfterComma: boolean; stoppedAt: number } = { doubledComma: false, digitAfterComma: false, stoppedAt: -1 };

/**
 * Lets go of the texts the words handed out since the last call still hold (a word's text may be a
 * slice that keeps its whole note alive): the parser calls this when it is done with a line, or
 * with all the lines of a note (`parseNote`: the words of one line hold only text of the note, alive
 * while it is parsed anyway, so they are let go of once, not after every line).
 */
export function releaseWords(): void {
  // By the most handed out, not the list's length: a caller may have shortened the list (a full stop left out).
  for (let k = 0; k < heldCount; k++) {
    const word = k < POOL_LIMIT ? POOL[k] : LIST[k];
    if (word) word.reuse('', 0, 0, false, '', 0, -1);
  }
  handedCount = 0;
  heldCount = 0;
  lineSource = '';
}

/**
 * The words of the caller's format (section names, keys, units), each kept once: a word of a line
 * that is one of them is given its kept string as its text, so the tree does not hold a copy of
 * `hr` per line, and its index as `known`.
 */
export interface Vocabulary {
  readonly words: readonly string[];
  /** The index in `words` of the text `[start, end)` of `body`, or -1 when it is none of them. */
  indexAt(body: string, start: number, end: number): number;
}

/**
 * The words of a line body from `from`, in a reused list of reused words (see `Word`, `LIST`):
 * valid until the next call. A word of `vocabulary` is given its kept text and index (see
 * `Vocabulary`); another word's text is cut out when read (see `Word`).
 *
 * Given `max`, it stops after that many words (what the parser needs of a line of prose: a note
 * line's words after its first two, a timepoint's label, are not read as words); `moreWordsOf`
 * reads on. `LEXED.doubledComma` then says what the words read so far showed.
 */
export function wordsOf(body: string, from = 0, vocabulary?: Vocabulary, max = Infinity): Word[] {
  return wordsIn(body, 0, body.length, vocabulary, max, from);
}

/**
 * `wordsOf` of the line body of `length` characters at `base` in `source`, read there: the words'
 * places are counted from `base`, as if the body had been cut out, but it is not. `parseNote` reads
 * each line so, in its note: a line cut out is a string of its own to make, and V8 reads the
 * characters of a slice through its parent, more slowly than those of a whole flat string.
 */
export function wordsIn(source: string, base: number, length: number, vocabulary?: Vocabulary, max = Infinity, from = 0): Word[] {
  LEXED.doubledComma = false;
  LEXED.digitAfterComma = false;
  handedCount = 0;
  lineSource = source;
  lineBase = base;
  lineLimit = base + length;
  return lexFrom(base + from, vocabulary, max);
}

/**
 * The words of the line `wordsOf` or `wordsIn` last read, read on up to `max` words in all, from
 * where it stopped (the same list, with the words after those it had). Valid until the next call.
 */
export function moreWordsOf(vocabulary?: Vocabulary, max = Infinity): Word[] {
  if (LEXED.stoppedAt < 0 || handedCount >= max) return handedCount === 0 ? [] : LIST;
  return lexFrom(lineBase + LEXED.stoppedAt, vocabulary, max);
}

/**
 * Reads words of the line last given (`lineSource` up to `lineLimit`) from `from` (a place in
 * `lineSource`) after the `handedCount` words already in LIST, until `max` in all.
 */
function lexFrom(from: number, vocabulary: Vocabulary | undefined, max: number): Word[] {
  // A whole number (no limit is `Infinity`, a floating-point number: compared with it, every word's count would be too).
  const most = max < MOST_WORDS ? max | 0 : MOST_WORDS;
  const words = LIST;
  const body = lineSource;
  const base = lineBase;
  const n = lineLimit;
  let count = handedCount;
  let i = from;
  let sawComma = false;
  LEXED.stoppedAt = -1;
  while (i < n && count < most) {
    const c = body.charCodeAt(i);
    const kind = c < 0x80 ? ASCII_KIND[c]! : isBlank(c) ? BLANK : 0;
    if (kind === BLANK) { i++; continue; }
    if (kind === COMMA) {
      if (sawComma) LEXED.doubledComma = true;
      if (i + 1 < n && isDigit(body.charCodeAt(i + 1))) LEXED.digitAfterComma = true;
      sawComma = true;
      i++;
      continue;
    }
    const start = i;
    while (++i < n) {
      const d = body.charCodeAt(i);
      const dKind = d < 0x80 ? ASCII_KIND[d]! : isBlank(d) ? BLANK : 0;
      if (dKind === 0) continue;
      if (dKind === BLANK) break;
      // A comma between two digits stays in its word (a decimal comma); the word has a character before it.
      if (!(isDigit(body.charCodeAt(i - 1)) && i + 1 < n && isDigit(body.charCodeAt(i + 1)))) break;
      LEXED.digitAfterComma = true;
    }
    let known = -1;
    let text: string | null = null;
    if (vocabulary) {
      known = vocabulary.indexAt(body, start, i);
      if (known >= 0) text = vocabulary.words[known]!;
    }
    let word: Word;
    if (count < POOL_LIMIT) {
      word = POOL[count] ?? (POOL[count] = new Word());
      word.reuse(text, start - base, i - base, sawComma, body, base, known);
    } else {
      word = new Word(text, start - base, i - base, sawComma, body, base, known);
    }
    if (count < words.length) words[count] = word;
    else words.push(word);
    count++;
    sawComma = false;
  }
  // Stopped at `max` with more of the line to read: `moreWordsOf` reads on from here.
  if (i < n) LEXED.stoppedAt = i - base;
  handedCount = count;
  if (count > heldCount) heldCount = count;
  if (count === 0) return [];
  // Shortened by `pop`, not by setting `length`: that is a call into the runtime on nearly every
  // line (lines of 2 and of 12 words alternate), and `pop` is not.
  while (words.length > count) words.pop();
  return words;
}

/**
 * Splits one line body into chunks of their own (kept as long as the caller likes, unlike the
 * words of `wordsOf`): runs of characters that are not blanks or separating commas. A comma
 * between two digits stays inside its chunk (a decimal comma, reported later).
 */
export function chunkLine(body: string, from = 0): Chunk[] {
  const chunks = wordsOf(body, from).map((w) => new Chunk(w.text, w.start, w.end, w.afterComma));
  releaseWords();
  return chunks;
}

export interface NumberParts {
  /** Length of the numeric prefix (0 when the chunk does not start with a number). */
  readonly length: number;
  readonly value: number;
  readonly decimalComma: boolean;
}

/**
 * Reads a number at the start of `text`: optional sign, digits, optional decimal point or
 * comma followed by digits (or a leading point: `.5`).
 */
export function leadingNumber(text: string, at = 0): NumberParts {
  const length = scanNumber(text, at);
  return length === 0 ? NO_NUMBER : { length, value: compact(SCANNED.value), decimalComma: SCANNED.decimalComma };
}

const NO_NUMBER: NumberParts = Object.freeze({ length: 0, value: NaN, decimalComma: false });

/**
 * What `scanNumber` read last: one object for every scan rather than one per number (a big note
 * has tens of thousands). Valid until the next scan: read it right after the call.
 */
export const SCANNED: { value: number; decimalComma: boolean } = { value: 0, decimalComma: false };

/**
 * `leadingNumber` without an object per call: the length (0: no number), the rest in SCANNED. One
 * pass over the characters (by code, not as one-character strings) that reads the value as it
 * goes: with up to 15 digits the digits form an exact integer and one division by an exact power
 * of ten rounds once, so the value is the double `Number()` gives for the same text; longer
 * numbers go through `Number()`.
 */
export function scanNumber(text: string, at = 0): number {
  const n = text.length;
  let i = at;
  let c = i < n ? text.charCodeAt(i) : 0;
  if (c === 0x2d /* - */ || c === 0x2b /* + */ || c === 0x2212 /* − */) c = ++i < n ? text.charCodeAt(i) : 0;
  const intStart = i;
  let mantissa = 0;
  while (c >= 0x30 && c <= 0x39) {
    mantissa = mantissa * 10 + (c - 0x30);
    c = ++i < n ? text.charCodeAt(i) : 0;
  }
  const intDigits = i - intStart;
  let decimals = 0;
  let decimalComma = false;
  if ((c === 0x2e /* . */ || c === 0x2c /* , */) && i + 1 < n && isDigit(text.charCodeAt(i + 1))) {
    decimalComma = c === 0x2c;
    const fractionStart = ++i;
    c = text.charCodeAt(i);
    while (c >= 0x30 && c <= 0x39) {
      mantissa = mantissa * 10 + (c - 0x30);
      c = ++i < n ? text.charCodeAt(i) : 0;
    }
    decimals = i - fractionStart;
  } else if (intDigits === 0) {
    return 0;
  }
  let value: number;
  if (intDigits + decimals > 15) {
    value = Number(text.slice(at, i).replace(',', '.').replace('−', '-'));
    if (!Number.isFinite(value)) return 0;
  } else {
    const magnitude = decimals > 0 ? mantissa / POWERS_OF_TEN[decimals]! : mantissa;
    value = compact(intStart > at && text.charCodeAt(at) !== 0x2b /* + */ ? -magnitude : magnitude);
  }
  SCANNED.value = value;
  SCANNED.decimalComma = decimalComma;
  return i - at;
}

const POWERS_OF_TEN = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];
