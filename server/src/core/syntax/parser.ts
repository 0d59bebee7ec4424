/**
 * The tolerant parser. It never throws: every line becomes a node, and what it cannot read
 * becomes a syntax issue on that node. Lines are parsed independently, so a changed line can
 * be re-parsed alone (see `parseLine`). Linear in the length of the text.
 */
import { canonicalWord, fieldFor, FIELDS, type FieldDef } from '../fields/registry';
import { DEVICE_PHRASES_LONGEST_FIRST } from '../fields/device-phrases';
import { SECTIONS, sectionByName, type SectionDef, type SectionId } from '../fields/sections';
import { isKnownUnitSpelling, unitsForSpelling, UNITS } from '../fields/units';
import { unitsWithin } from '../analysis/bounds';
import { closest } from '../util/suggest';
import { Chunk, isBlank, isDigit, leadingNumber, LEXED, lowerCase, moreWordsOf, releaseWords, scanNumber, scanWord, SCANNED, wordsIn, Word, type Vocabulary } from './lexer';
import type {
  BlankLine,
  ItemNode,
  LineFix,
  LineNode,
  NoteTree,
  NumberValue,
  PairValue,
  SectionLine,
  Span,
  SyntaxIssue,
  TimepointLine,
  TimeSpec,
  Token,
  UnknownLine,
  ValueNode,
  WordValue,
} from './tree';
import { NONE } from '../util/lists';
import { renameKeepingColumns } from './layout';
import { compact } from '../util/numbers';

export interface LineSlice {
  readonly text: string;
  readonly offset: number;
}

/**
 * Cuts text into lines as LSP does (`\n`, `\r\n` and `\r` all end a line), handing each line
 * and its start offset to `visit`. Line ends are found with indexOf (a native search) for each
 * terminator. Given `first` and `last` (line numbers, inclusive), only those lines are cut out and
 * visited, and the cutting stops after `last`. Returns the first terminator (see `firstEol`).
 */
function cutLines(text: string, visit: (line: string, offset: number, number: number) => void, first = 0, last = Infinity): NoteTree['eol'] {
  let start = 0;
  let number = 0;
  let lf = text.indexOf('\n');
  let cr = text.indexOf('\r');
  while ((lf >= 0 || cr >= 0) && number <= last) {
    const end = cr < 0 || (lf >= 0 && lf < cr) ? lf : cr;
    if (number >= first) visit(text.slice(start, end), start, number);
    number++;
    start = end === cr && lf === end + 1 ? end + 2 : end + 1;
    if (lf >= 0 && lf < start) lf = text.indexOf('\n', start);
    if (cr >= 0 && cr < start) cr = text.indexOf('\r', start);
  }
  if (number >= first && number <= last) visit(text.slice(start), start, number);
  return firstEol(text);
}

/** Hands lines `first` to `last` (inclusive, those that exist) and their numbers to `visit`, cut as the parser cuts them. */
export function eachLineBetween(text: string, first: number, last: number, visit: (line: string, number: number) => void): void {
  cutLines(text, (line, _offset, number) => { visit(line, number); }, first, last);
}

/** The line terminator used first in the text (`\n` when it has none). */
export function firstEol(text: string): NoteTree['eol'] {
  const lf = text.indexOf('\n');
  const cr = text.indexOf('\r');
  if (cr < 0 || (lf >= 0 && lf < cr)) return '\n';
  return text.charCodeAt(cr + 1) === 0x0a ? '\r\n' : '\r';
}

/** Splits text into lines as LSP does (`\n`, `\r\n` and `\r` all end a line). */
export function splitLines(text: string): { lines: LineSlice[]; eol: NoteTree['eol'] } {
  const lines: LineSlice[] = [];
  const eol = cutLines(text, (line, offset) => { lines.push({ text: line, offset }); });
  return { lines, eol };
}

/**
 * Parses a note; each line is parsed as it is cut (no list of pieces is kept), its words read in
 * the note itself (`wordsIn`), not in the line's own text. The list of lines is made at its length
 * once the lines are counted: grown by push, a list as long as the note is copied a dozen times on
 * the way, and keeps room to spare.
 */
export function parseNote(text: string): NoteTree {
  const nodes = new Array<LineNode>(countLines(text));
  let count = 0;
  try {
    const eol = cutLines(text, (line, offset) => { nodes[count] = readLine(line, count, text, offset); count++; });
    return { lines: nodes, eol };
  } finally {
    // Once for the note, not after every line (see `releaseWords`).
    releaseWords();
  }
}

/** How many lines `cutLines` cuts `text` into: one more than its line ends (`\n`, `\r\n`, `\r`). */
function countLines(text: string): number {
  let count = 1;
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) count++;
  for (let i = text.indexOf('\r'); i >= 0; i = text.indexOf('\r', i + 1)) if (text.charCodeAt(i + 1) !== 0x0a) count++;
  return count;
}

/** The words of the format, kept once (see `FORMAT_WORDS`). */
const VOCABULARY: ReadonlyMap<string, string> = (() => {
  const words = new Map<string, string>();
  const add = (w: string) => { words.set(w, w); };
  for (const s of SECTIONS) { add(s.id); for (const a of s.aliases) add(a); }
  for (const f of FIELDS) { for (const a of f.aliases) add(a); for (const w of Object.keys(f.words ?? {})) add(w); }
  for (const u of UNITS) { add(u.id); for (const a of u.aliases) add(a); }
  add('day'); // of a timepoint's time
  return words;
})();

/** The words of VOCABULARY in a list: a word of a line that is one of them knows its index (`Word.known`). */
const VOCABULARY_WORDS: readonly string[] = [...VOCABULARY.keys()];

/**
 * The words of VOCABULARY as a trie over their characters, in which `knownIndex` looks up a word of
 * a line by reading each of its characters once, in place (it is not cut out of its line first),
 * and stops at the first that no word of the format has there: a number at its first digit.
 * `TRIE_NEXT[state * TRIE_WIDTH + TRIE_CLASS[c]]` is the state after the character `c` (0: no word
 * goes on so, and no character leaves state 0); `TRIE_CLASS` numbers the characters the words use
 * from 1 (0 for any other ASCII character); `TRIE_WORD[state]` is the index of the word that ends
 * there, or -1. Only words all of whose characters are ASCII are in it: a word of the format with
 * another (`°C`, `°F`) is not known, and a word of a line written so is read as any other word is
 * (its text cut out, its unit looked up by its spelling).
 */
const TRIE_ROOT = 1;
const TRIE_CLASS = new Uint8Array(0x80);
const { TRIE_WIDTH, TRIE_NEXT, TRIE_WORD } = (() => {
  let width = 1;
  for (const w of VOCABULARY_WORDS) {
    if (!isAscii(w)) continue;
    for (let k = 0; k < w.length; k++) if (TRIE_CLASS[w.charCodeAt(k)] === 0) TRIE_CLASS[w.charCodeAt(k)] = width++;
  }
  const next: number[] = [];
  const word = [-1, -1];
  VOCABULARY_WORDS.forEach((w, index) => {
    if (!isAscii(w)) return;
    let state = TRIE_ROOT;
    for (let k = 0; k < w.length; k++) {
      const at = state * width + TRIE_CLASS[w.charCodeAt(k)]!;
      if (next[at] === undefined) {
        next[at] = word.length;
        word.push(-1);
      }
      state = next[at]!;
    }
    word[state] = index;
  });
  const table = new Uint16Array(word.length * width);
  next.forEach((to, at) => { table[at] = to; });
  return { TRIE_WIDTH: width, TRIE_NEXT: table, TRIE_WORD: Int16Array.from(word) };
})();

function isAscii(word: string): boolean {
  for (let k = 0; k < word.length; k++) if (word.charCodeAt(k) >= 0x80) return false;
  return true;
}

/** The index in VOCABULARY_WORDS of the word of the format `[start, end)` of `body` is, or -1 when it is none. */
function knownIndex(body: string, start: number, end: number): number {
  let state = TRIE_ROOT;
  for (let k = start; k < end; k++) {
    const c = body.charCodeAt(k);
    if (c >= 0x80) return -1;
    state = TRIE_NEXT[state * TRIE_WIDTH + TRIE_CLASS[c]!]!;
    if (state === 0) return -1;
  }
  return TRIE_WORD[state]!;
}

/** The words of the format as the lexer looks them up (see `Vocabulary`). */
const FORMAT_WORDS: Vocabulary = { words: VOCABULARY_WORDS, indexAt: knownIndex };

/**
 * What the parser asks of a word of the format, by its index (`Word.known`), worked out once for
 * each: the section it names, whether it is a unit, and the field it is the key of in each section.
 * A word of a line is looked up here in one read rather than in the maps of the registries.
 */
const SECTION_OF_KNOWN: readonly (SectionDef | null)[] = VOCABULARY_WORDS.map((w) => sectionByName(w) ?? null);
const UNIT_KNOWN: readonly boolean[] = VOCABULARY_WORDS.map((w) => isKnownUnitSpelling(w));
const FIELDS_OF_KNOWN: ReadonlyMap<SectionId, readonly (FieldDef | null)[]> = new Map(SECTIONS.map((s) => [s.id, VOCABULARY_WORDS.map((w) => fieldFor(s.id, w) ?? null)] as const));

/**
 * The fields of a section's keys by the index of the word (a row of FIELDS_OF_KNOWN). Asked for
 * each line and each unit read: the row of the section asked last is kept (a one-entry memo).
 */
function knownFieldsOf(section: SectionId): readonly (FieldDef | null)[] {
  if (section !== LAST_FIELDS_SECTION) {
    LAST_FIELDS = FIELDS_OF_KNOWN.get(section) ?? NONE;
    LAST_FIELDS_SECTION = section;
  }
  return LAST_FIELDS;
}

let LAST_FIELDS_SECTION: SectionId | null = null;
let LAST_FIELDS: readonly (FieldDef | null)[] = NONE;

/** The field a word is the key of in `section`, whose row of FIELDS_OF_KNOWN is `fields` (`fieldFor` of its text when it is no word of the format). */
function fieldOfWord(section: SectionId, fields: readonly (FieldDef | null)[], word: Word): FieldDef | null {
  return word.known >= 0 ? fields[word.known] ?? null : fieldFor(section, word.text) ?? null;
}

/** Whether a word is a unit the format knows (`isKnownUnitSpelling`, looked up once for a word of the format). */
function isUnitWord(word: Word): boolean {
  return word.known >= 0 ? UNIT_KNOWN[word.known]! : isKnownUnitSpelling(word.text);
}

/** The section a line's first word names (`sectionByName`, which lowers a copy of the word, asked once per word of the format). */
function sectionOf(word: Word): SectionDef | undefined {
  return (word.known >= 0 ? SECTION_OF_KNOWN[word.known] : sectionByName(word.text)) ?? undefined;
}

/** The `@` of a timepoint line that starts with it (most do): one token for all. */
const MARKER_AT_LINE_START: Chunk = Object.freeze(token('@', 0, 1));

/** Tokens of the format's words written at the start of a line (`vitals`), one per word, by its index (`Word.known`). */
const LINE_START_TOKENS: (Chunk | undefined)[] = new Array<Chunk | undefined>(VOCABULARY_WORDS.length).fill(undefined);

/**
 * The token of a chunk, shared when it is a word of the format at the start of its line: tokens
 * never change, and a big note has thousands of lines that start with the same few words.
 */
function lineStartToken(chunk: Word): Chunk {
  if (chunk.start !== 0 || chunk.known < 0) return keep(chunk);
  return (LINE_START_TOKENS[chunk.known] ??= Object.freeze(token(chunk.text, 0, chunk.end)));
}

/** One line's node, the lexer's words let go of after it. */
export function parseLine(text: string, line: number): LineNode {
  try {
    return readLine(text, line);
  } finally {
    releaseWords();
  }
}

/**
 * A line's node, the lexer's words not let go of (see `releaseWords`). The line's words are read
 * where the line starts in `source` (at `base`: see `wordsIn`), its whole note or the line itself.
 */
function readLine(text: string, line: number, source = text, base = 0): LineNode {
  try {
    return parseLineUnsafe(text, line, source, base);
  } catch {
    // Defensive: the parser is written not to throw, but a line must never take the note down.
    return new BlankNode(line, text, null, [{ check: 'stray-text', span: { start: 0, end: text.length }, message: 'This line could not be read.', fixes: NONE }]);
  }
}

/**
 * Line nodes are made by constructors, not object literals: the tree keeps every one, and V8 would
 * pretenure a literal's allocation site whose objects all survive (see `PlainFinding` in check-note.ts).
 *
 * The kinds of object the parser makes by the thousand (line nodes, items, values, tokens) have their
 * fields declared with `declare` and set in the constructor, in the order they always had (`kind`
 * last on a line node): a field declared otherwise is a class field (the build targets ES2022), which
 * each `new` first defines as undefined, by a call of its own, before the constructor sets it.
 */
class BlankNode implements BlankLine {
  declare readonly line: number;
  declare readonly text: string;
  declare readonly comment: Token | null;
  declare readonly issues: readonly SyntaxIssue[];
  declare readonly kind: 'blank';
  constructor(line: number, text: string, comment: Token | null, issues: readonly SyntaxIssue[]) {
    this.line = line;
    this.text = text;
    this.comment = comment;
    this.issues = issues;
    this.kind = 'blank';
  }
}

class SectionNode implements SectionLine {
  declare readonly line: number;
  declare readonly text: string;
  declare readonly comment: Token | null;
  declare readonly section: SectionId;
  declare readonly sectionToken: Token;
  declare readonly items: readonly ItemNode[];
  declare readonly prose: Token | null;
  declare readonly issues: readonly SyntaxIssue[];
  declare readonly kind: 'section';
  constructor(
    line: number, text: string, comment: Token | null, section: SectionId,
    sectionToken: Token, items: readonly ItemNode[], prose: Token | null, issues: readonly SyntaxIssue[],
  ) {
    this.line = line;
    this.text = text;
    this.comment = comment;
    this.section = section;
    this.sectionToken = sectionToken;
    this.items = items;
    this.prose = prose;
    this.issues = issues;
    this.kind = 'section';
  }
}

class UnknownNode implements UnknownLine {
  declare readonly line: number;
  declare readonly text: string;
  declare readonly comment: Token | null;
  declare readonly first: Token;
  declare readonly rest: Token | null;
  declare readonly issues: readonly SyntaxIssue[];
  declare readonly kind: 'unknown';
  constructor(line: number, text: string, comment: Token | null, first: Token, rest: Token | null, issues: readonly SyntaxIssue[]) {
    this.line = line;
    this.text = text;
    this.comment = comment;
    this.first = first;
    this.rest = rest;
    this.issues = issues;
    this.kind = 'unknown';
  }
}

class TimepointNode implements TimepointLine {
  declare readonly line: number;
  declare readonly text: string;
  declare readonly comment: Token | null;
  declare readonly marker: Token;
  declare readonly time: TimeSpec | null;
  declare readonly label: Token | null;
  declare readonly issues: readonly SyntaxIssue[];
  declare readonly kind: 'timepoint';
  constructor(line: number, text: string, comment: Token | null, marker: Token, time: TimeSpec | null, label: Token | null, issues: readonly SyntaxIssue[]) {
    this.line = line;
    this.text = text;
    this.comment = comment;
    this.marker = marker;
    this.time = time;
    this.label = label;
    this.issues = issues;
    this.kind = 'timepoint';
  }
}

/** The same line node at another line number (lines moved by an edit above them). */
export function movedLine(node: LineNode, line: number): LineNode {
  switch (node.kind) {
    case 'blank': return new BlankNode(line, node.text, node.comment, node.issues);
    case 'section': return new SectionNode(line, node.text, node.comment, node.section, node.sectionToken, node.items, node.prose, node.issues);
    case 'timepoint': return new TimepointNode(line, node.text, node.comment, node.marker, node.time, node.label, node.issues);
    case 'unknown': return new UnknownNode(line, node.text, node.comment, node.first, node.rest, node.issues);
  }
}

function parseLineUnsafe(text: string, line: number, source = text, base = 0): LineNode {
  const hash = text.indexOf('#');
  const bodyEnd = hash >= 0 ? hash : text.length;
  const comment: Token | null = hash >= 0 ? token(text.slice(hash), hash, text.length) : null;
  const body = hash >= 0 ? text.slice(0, bodyEnd) : text;
  // A timepoint line reads the words of its time and the first of its label; another line first
  // reads two words, which tell its kind, and a note line no more (its prose is not read as words).
  const timepoint = firstWordChar(source, base, base + bodyEnd) === 0x40 /* @ */;
  let chunks = wordsIn(source, base, bodyEnd, FORMAT_WORDS, timepoint ? TIMEPOINT_WORDS : 2);
  const first = chunks[0];
  if (!first) {
    // A line of commas only (`,`): nothing is read from it, and a comma is not a blank.
    const comma = body.indexOf(',');
    return new BlankNode(line, text, comment, comma < 0 ? NONE : [strayCommaIssue(body, comma, body.length, 'alone', '', text.length)]);
  }

  if (timepoint) return parseTimepoint(body, chunks, line, text, comment);

  const section = sectionOf(first);
  // A note line's prose is not read as words: what follows reads only its first two.
  if (section?.id !== 'note') chunks = moreWordsOf(FORMAT_WORDS);
  const doubledComma = LEXED.doubledComma;
  const digitAfterComma = LEXED.digitAfterComma;
  // The words of a line are reused for the next line: what the tree keeps is copied (`keep`), and a
  // section word at the start of its line is one token shared by every such line.
  const sectionToken: Token = section ? lineStartToken(first) : keep(first);
  if (!section) {
    const restStart = chunks[1]?.start;
    const restText = restStart === undefined ? '' : body.slice(restStart).trimEnd();
    const rest: Token | null = restStart === undefined ? null : token(restText, restStart, restStart + restText.length);
    const strays: SyntaxIssue[] = [];
    strayCommas(body, chunks, false, false, strays);
    // Last: it may read the line again under a section, which reuses the lexer's words (`chunks`).
    const issues = [unknownSectionIssue(sectionToken, body, line, text), ...strays];
    return new UnknownNode(line, text, comment, sectionToken, rest, issues);
  }
  if (section.id === 'note') {
    const proseStart = chunks[1]?.start;
    const prose: Token | null = proseStart === undefined ? null : new Cut(body, proseStart, proseEnd(body));
    // Commas inside the prose are prose; one before it separates nothing.
    let noteIssues: readonly SyntaxIssue[] = NONE;
    if (first.afterComma || chunks[1]?.afterComma || commaAfterLoneWord(body, chunks)) {
      const found: SyntaxIssue[] = [];
      strayCommas(body, chunks, true, false, found);
      noteIssues = found;
    }
    return new SectionNode(line, text, comment, section.id, sectionToken, NONE, prose, noteIssues);
  }
  const issues = lineIssues();
  if (first.afterComma || chunks[1]?.afterComma || doubledComma || commaAfterLoneWord(body, chunks)) strayCommas(body, chunks, true, doubledComma, issues);
  if (chunks.length > 1) {
    const last = chunks[chunks.length - 1]!;
    if (body.charCodeAt(last.end - 1) === 0x2e /* . */) leaveOutFullStop(chunks, issues);
  }
  const items = parseItems(section.id, chunks, 1, issues, text, digitAfterComma);
  return new SectionNode(line, text, comment, section.id, sectionToken, items, null, keptIssues(issues));
}

/** The first character of the first word of `source` from `from` to `end` (-1 for none): the lexer's words start after blanks and commas. */
function firstWordChar(source: string, from: number, end: number): number {
  for (let i = from; i < end; i++) {
    const c = source.charCodeAt(i);
    if (c !== 0x2c /* , */ && !isBlank(c)) return c;
  }
  return -1;
}

/**
 * The issues of the line being read (a line of items or a timepoint line), in scratch space: most
 * lines have none, and a list per line would be garbage. `keptIssues` copies them out and empties
 * it; a line read under another while it is read (`readsUnder`) is an unknown line, which does not
 * use it.
 */
const LINE_ISSUES: SyntaxIssue[] = [];

function lineIssues(): SyntaxIssue[] {
  // Empty unless a line threw part-way (see `parseLine`).
  if (LINE_ISSUES.length > 0) LINE_ISSUES.length = 0;
  return LINE_ISSUES;
}

function keptIssues(issues: SyntaxIssue[]): readonly SyntaxIssue[] {
  if (issues.length === 0) return NONE;
  const kept = issues.slice();
  issues.length = 0;
  return kept;
}

function unknownSectionIssue(first: Token, body: string, line: number, text: string): SyntaxIssue {
  const word = first.text.toLowerCase();
  // The section meant, with the items kept in the column they were laid out in (`renameKeepingColumns`).
  const fixes: LineFix[] = closest(word, SECTIONS.map((s) => s.id)).map((s) => ({
    title: `Change to \`${s}\``,
    edits: renameKeepingColumns(text, first.span, s),
  }));
  // A key written without its section, e.g. `hr 118`: offer the section that owns the key, when
  // the line reads cleanly under it (not `lac` alone, which would leave a key without a value).
  const owners = new Set<SectionId>();
  for (const id of ['vitals', 'abg', 'vbg', 'labs', 'vent', 'oxygen', 'patient', 'place'] as const) {
    if (fieldFor(id, word)) owners.add(id);
  }
  for (const owner of owners) {
    if (!readsUnder(owner, body, first.span.start, line)) continue;
    fixes.push({ title: `Start the line with \`${owner}\``, edits: [{ span: { start: first.span.start, end: first.span.start }, newText: `${owner} ` }] });
  }
  const hint = fixes.length > 0 ? ` Did you mean ${fixes.map((f) => f.title.replace(/^(Change to|Start the line with) /, '')).join(' or ')}?` : '';
  return {
    check: 'unknown-section',
    span: first.span,
    message: `\`${first.text}\` is not a section; a line starts with a section such as vitals, abg, oxygen, vent, labs or note.${hint}`,
    fixes,
  };
}

/** Where a comma that separates nothing is: what the message says of it. */
type StrayCommaPlace = 'alone' | 'start' | 'after-first' | 'doubled';

/**
 * Commas that separate nothing, each run reported once (lightly: the line reads the same
 * without them, and a fix removes them). Before the line's first word; when `afterFirst`,
 * between it and the next word (after the section word or a lone `@`); when `between`, a comma
 * after another with no word between them (between two words or after the last). A single
 * comma after the last word is a separator the grammar allows, and is kept.
 */
/**
 * Whether `body` with `section ` put before its first word reads without a problem: no syntax
 * issue, and every item a known key with a value of its kind (a number or pair for a number
 * field, a word for a word field). Used for fixes only, on lines that start with no section.
 */
function readsUnder(section: SectionId, body: string, at: number, line: number): boolean {
  const node = parseLineUnsafe(`${body.slice(0, at)}${section} ${body.slice(at)}`, line);
  if (node.kind !== 'section' || node.issues.length > 0 || node.items.length === 0) return false;
  return node.items.every((item) => item.field !== null && item.valueKind !== null && (item.valueKind === 'word') === (item.field.kind === 'word'));
}

function strayCommas(body: string, chunks: readonly Word[], afterFirst: boolean, between: boolean, issues: SyntaxIssue[]): void {
  const first = chunks[0]!;
  if (first.afterComma) issues.push(strayCommaIssue(body, 0, first.start, 'start'));
  if (afterFirst && chunks[1]?.afterComma) issues.push(strayCommaIssue(body, first.end, chunks[1].start, 'after-first', first.text));
  // `patient ,`: commas after the section word and nothing else (no item for them to follow).
  else if (afterFirst && commaAfterLoneWord(body, chunks)) issues.push(strayCommaIssue(body, first.end, body.length, 'after-first', first.text));
  if (!between) return;
  for (let k = 2; k <= chunks.length; k++) {
    const from = chunks[k - 1]!.end;
    const to = k < chunks.length ? chunks[k]!.start : body.length;
    const comma = body.indexOf(',', from);
    if (comma < 0 || comma >= to) continue;
    const second = body.indexOf(',', comma + 1);
    if (second >= 0 && second < to) issues.push(strayCommaIssue(body, second, to, 'doubled'));
  }
}

/** Whether the line's one word is followed by a comma (`patient ,`, `note,`): there is no item or prose for it to end. */
function commaAfterLoneWord(body: string, chunks: readonly Word[]): boolean {
  return chunks.length === 1 && body.indexOf(',', chunks[0]!.end) >= 0;
}

/**
 * The commas in `[from, to)` of `body` (blanks and commas only), from the first to the last,
 * reported as separating nothing, with a fix that removes them unless that would leave the line
 * (`lineLength` long) empty: an empty line between the `\r` and the `\n` of a note would make
 * one line end of two, and join the lines around it.
 */
function strayCommaIssue(body: string, from: number, to: number, place: StrayCommaPlace, firstWord = '', lineLength = -1): SyntaxIssue {
  let start = from;
  while (body.charCodeAt(start) !== 0x2c /* , */) start++;
  let end = to;
  while (body.charCodeAt(end - 1) !== 0x2c) end--;
  const span = { start, end };
  const next = body.indexOf(',', start + 1);
  const several = next >= 0 && next < end;
  const commas = several ? 'commas' : 'comma';
  const read = `the line is read without ${several ? 'them' : 'it'}`;
  const message =
    place === 'alone' ? `${several ? 'Commas' : 'A comma'} alone on a line ${several ? 'separate' : 'separates'} nothing; the line reads as blank.`
    : place === 'start' ? `${several ? 'Commas' : 'A comma'} at the start of the line ${several ? 'separate' : 'separates'} nothing; ${read}.`
    : place === 'after-first' ? `${several ? 'Commas' : 'A comma'} right after \`${firstWord}\` ${several ? 'separate' : 'separates'} nothing; ${read}.`
    : `Commas with nothing between them: is a value missing here? The line is read without the extra ${commas}.`;
  const title = place === 'doubled' ? `Remove the extra ${commas}` : `Remove the ${commas}`;
  // Commas glued to a word on both sides (`patient,7`) leave a blank behind, so the two words stay apart.
  const glued = start > 0 && end < body.length && !isBlank(body.charCodeAt(start - 1)) && !isBlank(body.charCodeAt(end));
  const fixes = start === 0 && end === lineLength ? NONE : [{ title, edits: [{ span, newText: glued ? ' ' : '' }], preferred: true }];
  return { check: 'stray-text', severity: 'information', span, message, fixes };
}

/**
 * A full stop that ends the items of a line (`vitals hr 80, rr 18.`): people end lines so. It is
 * cut from the last word before the items are read, so `80.` reads as 80 and `C.` as the unit C
 * (a number never loses more than this last character: `80.5` and `.5` do not end with a full
 * stop), and reported lightly with a fix that removes it. A full stop alone is left out.
 */
function leaveOutFullStop(chunks: Word[], issues: SyntaxIssue[]): void {
  const last = chunks[chunks.length - 1]!;
  const written = last.text;
  const span = { start: last.end - 1, end: last.end };
  let message: string;
  if (written.length === 1) {
    last.text = '';
    chunks.pop();
    message = 'A full stop at the end of the line is not part of any item; the line is read without it.';
  } else {
    const known = knownIndex(written, 0, written.length - 1);
    last.text = known >= 0 ? VOCABULARY_WORDS[known]! : written.slice(0, -1);
    last.known = known;
    last.end--;
    message = `\`${written}\` is read as \`${last.text}\`: a full stop at the end of the line is left out.`;
  }
  issues.push({ check: 'stray-text', severity: 'information', span, message, fixes: [{ title: 'Remove the full stop', edits: [{ span, newText: '' }], preferred: true }] });
}

// ── timepoints ──────────────────────────────────────────────────────────

/**
 * The words of a timepoint line `parseTimepoint` reads: the `@`, at most three of its time and the
 * first of its label (and the one after an offset, `splitOffset`); a line with more has no full
 * stop glued to its time (`timeEndsWithFullStop`). The words of a label are not read as words.
 */
const TIMEPOINT_WORDS = 5;

function parseTimepoint(body: string, chunks: Word[], line: number, text: string, comment: Token | null): LineNode {
  const issues = lineIssues();
  const first = chunks[0]!;
  // `@, 08:00`: a comma between `@` and the time; one between the time and the label is kept.
  if (first.afterComma || (first.text.length === 1 && chunks[1]?.afterComma)) strayCommas(body, chunks, first.text.length === 1, false, issues);
  const marker: Token = first.start === 0 ? MARKER_AT_LINE_START : token('@', first.start, first.start + 1);
  // The words after the `@` are `chunks` from `at` (no list of their own). `@07:40` is read like
  // `@ 07:40`: its word (reused for the next line anyway) becomes the time's.
  const at = first.text.length > 1 ? 0 : 1;
  if (at === 0) {
    first.text = first.text.slice(1);
    first.start++;
    first.afterComma = false;
  }

  // `@ 08:00.`: a full stop glued to the end of the time, read as a line of items reads one.
  if (timeEndsWithFullStop(body, chunks, at)) leaveOutFullStop(chunks, issues);

  let time: TimeSpec | null = null;
  let used = 0;
  const c0 = chunks[at];
  if (!c0) {
    issues.push({ check: 'bad-time', span: marker.span, message: 'A timepoint needs a time: `@ day 1 07:40`, `@ 07:40` or `@ +2h30`.', fixes: NONE });
  } else if (c0.end - c0.start === 3 && lowerCase(c0.text) === 'day') {
    const c1 = chunks[at + 1];
    // The number is left in SCANNED (no object per timepoint): read before anything scans again.
    // Read in the line (see `scanWord`): the day's text is cut out only for a message.
    const dayLength = c1 ? scanWord(c1) : 0;
    const day = compact(SCANNED.value);
    if (!c1 || dayLength === 0 || dayLength !== c1.end - c1.start || !Number.isInteger(day) || day < 0 || !asciiDigitsOnly(body, c1.start, c1.end)) {
      issues.push({ check: 'bad-time', span: c1 ? c1.span : c0.span, message: 'After `day` write the day number, e.g. `@ day 2 08:00`.', fixes: NONE });
      used = c1 ? 2 : 1;
    } else if (day > MAX_DAY) {
      issues.push({ check: 'bad-time', span: c1.span, message: `\`day ${c1.text}\` is beyond the last day a note can name (day ${MAX_DAY}).`, fixes: NONE });
      const c2 = chunks[at + 2];
      used = c2 && clockAt(body, c2.start, c2.end) !== null ? 3 : 2;
    } else {
      const c2 = chunks[at + 2];
      const clock = c2 ? clockAt(body, c2.start, c2.end) : null;
      const twelve = c2 ? twelveHourIssue(body, chunks, at + 2, clock !== null, issues) : 0;
      if (twelve > 0) {
        // `@ day 1 9:00 pm`: a 12-hour time, reported (PN104); the day is known, its time is not.
        time = new TimeNode('day', day, null, body, c0.start, c1.end);
        used = 2 + twelve;
      } else if (c2 && clock !== null) {
        time = new TimeNode('clock', day, clock, body, c0.start, c2.end);
        used = 3;
      } else {
        if (c2 && looksLikeClock(c2.text)) {
          issues.push({ check: 'bad-time', span: c2.span, message: `\`${c2.text}\` is not a time of day (00:00 to 23:59).`, fixes: NONE });
          used = 3;
        } else if (c2 && clockWithoutColon(c2.text) !== null) {
          // `@ day 2 0800`: a time written without its colon would otherwise become the label.
          const clock = clockWithoutColon(c2.text)!;
          issues.push({ check: 'bad-time', span: c2.span, message: `\`${c2.text}\` reads as a time without its colon; write \`${clock}\` (the time is unknown until then).`, fixes: [{ title: `Write \`${clock}\``, edits: [{ span: c2.span, newText: clock }], preferred: true }] });
          used = 3;
        } else used = 2;
        time = new TimeNode('day', day, null, body, c0.start, c1.end);
      }
    }
  } else if (body.charCodeAt(c0.start) === 0x2b /* + */) {
    const minutes = readOffset(c0.text);
    used = 1;
    const over = minutes === null ? offsetOverflow(c0.text) : null;
    if ((minutes ?? over ?? 0) > MAX_OFFSET_MINUTES) {
      // Beyond any note's span, and beyond what a number keeps exactly: never a time (or a fix) built from it.
      issues.push({ check: 'bad-time', span: c0.span, message: `\`${c0.text}\` is longer than a note can span (${MAX_DAY} days).`, fixes: NONE });
    } else if (over !== null) {
      // `+2h90`: read as 3h30 it would move every later timepoint; what was meant is the writer's to say.
      const meant = offsetText(over);
      issues.push({ check: 'bad-time', span: c0.span, message: `\`${c0.text}\` runs over: hours after days go from 0 to 23 and minutes after hours or days from 0 to 59. Did you mean \`${meant}\`?`, fixes: [{ title: `Write \`${meant}\``, edits: [{ span: c0.span, newText: meant }] }] });
    } else if (minutes === null) {
      issues.push({ check: 'bad-time', span: c0.span, message: `\`${c0.text}\` is not an offset; write it like \`+2h30\`, \`+45m\` or \`+1d\`.`, fixes: NONE });
    } else {
      time = new TimeNode('offset', null, compact(minutes), body, c0.start, c0.end);
      splitOffset(body, c0, chunks[at + 1], issues);
    }
  } else {
    const clock = clockAt(body, c0.start, c0.end);
    const twelve = twelveHourIssue(body, chunks, at, clock !== null, issues);
    used = 1;
    if (twelve > 0) {
      // `@ 9:00 pm`: a 12-hour time, reported (PN104); the time is unknown until it is written on the 24-hour clock.
      used = twelve;
    } else if (clock !== null) {
      time = new TimeNode('clock', null, clock, body, c0.start, c0.end);
    } else if (looksLikeDate(c0.text)) {
      issues.push({ check: 'bad-time', span: c0.span, message: `\`${c0.text}\` looks like a calendar date; Pneumark notes use relative days instead (\`@ day 2 08:00\`), which keeps dates of care out of shared notes.`, fixes: NONE });
    } else if (looksLikeClock(c0.text)) {
      issues.push({ check: 'bad-time', span: c0.span, message: `\`${c0.text}\` is not a time of day (00:00 to 23:59).`, fixes: NONE });
    } else {
      issues.push({ check: 'bad-time', span: c0.span, message: `Expected a time after \`@\` (\`@ day 1 07:40\`, \`@ 07:40\` or \`@ +2h30\`), found \`${c0.text}\`.`, fixes: NONE });
      used = 0;
    }
  }
  const l0 = chunks[at + used];
  // `@ 08:00,, arrival`: one comma may end the time; more separate nothing (information, as on item lines).
  if (l0 && used > 0) {
    const comma = body.indexOf(',', chunks[at + used - 1]!.end);
    const second = comma >= 0 && comma < l0.start ? body.indexOf(',', comma + 1) : -1;
    if (second >= 0 && second < l0.start) issues.push(strayCommaIssue(body, second, l0.start, 'doubled'));
  }
  const labelEnd = l0 ? proseEnd(body) : 0;
  // Cut from the line when read (one object rather than a token and its text): the timeline reads it once.
  const label: Token | null = l0 ? new Cut(body, l0.start, labelEnd) : null;
  return new TimepointNode(line, text, comment, marker, time, label, keptIssues(issues));
}

/**
 * Whether the last word of a timepoint line is a part of its time with a full stop glued on
 * (`@ 08:00.`, `@ +2h.`, `@ day 2.`, `@ day 2 08:00.`), and no label follows: a full stop in a
 * label is prose and stays.
 */
function timeEndsWithFullStop(body: string, chunks: readonly Word[], at: number): boolean {
  const last = chunks[chunks.length - 1];
  if (!last || chunks.length <= at || last.end - last.start < 2 || body.charCodeAt(last.end - 1) !== 0x2e /* . */ || chunks.length - at > 3) return false;
  const word = last.text.slice(0, -1);
  const k = chunks.length - at - 1;
  if (lowerCase(chunks[at]!.text) === 'day') {
    if (k === 1) {
      const day = leadingNumber(word);
      return day.length === word.length && Number.isInteger(day.value) && day.value >= 0;
    }
    return k === 2 && readClock(word) !== null;
  }
  return k === 0 && (readClock(word) !== null || (word.startsWith('+') && readOffset(word) !== null));
}

/**
 * Where the prose of a line (a note line's text, a timepoint's label) ends: after its last
 * character that is not a blank. A comma there is prose, not a separator (`arrival, then ward,`
 * keeps its last comma), so the end is not the end of the last word.
 */
function proseEnd(body: string): number {
  let end = body.length;
  while (end > 0 && isBlank(body.charCodeAt(end - 1))) end--;
  return end;
}

/**
 * A node cut from its line when its text is asked for: it keeps the line and where it is in it,
 * and is its own span. Numbers, pairs, times and prose are nodes of this kind: a big note has
 * tens of thousands, most of whose texts are never read, and each is one object rather than
 * an object, a span and a string.
 */
class Cut implements Token {
  declare readonly source: string;
  declare readonly start: number;
  declare readonly end: number;

  constructor(source: string, start: number, end: number) {
    this.source = source;
    this.start = start;
    this.end = end;
  }

  get span(): Span {
    return this;
  }

  get text(): string {
    return this.source.slice(this.start, this.end);
  }
}


/** The time of a timepoint line. */
class TimeNode extends Cut implements TimeSpec {
  declare readonly kind: TimeSpec['kind'];
  declare readonly day: number | null;
  declare readonly minutes: number | null;

  constructor(kind: TimeSpec['kind'], day: number | null, minutes: number | null, source: string, start: number, end: number) {
    super(source, start, end);
    this.kind = kind;
    this.day = day;
    this.minutes = minutes;
  }
}

/**
 * Whether `[start, end)` of the text is ASCII digits only: a day number is an integer as written
 * (`day 2`, `day 02`), not a number that happens to be whole (`day 2.0`, `day 2,0`, `day .0`, or
 * a sign, ASCII or U+2212).
 */
function asciiDigitsOnly(text: string, start: number, end: number): boolean {
  for (let i = start; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c < 0x30 || c > 0x39) return false;
  }
  return end > start;
}

/**
 * A time of day on the 12-hour clock where the 24-hour clock reads another time: `9:00 pm` (read
 * as 09:00, 12 hours early, with `pm` starting the label), `10:15pm`, `12:30 am` (00:30, not
 * 12:30). The times the two clocks read alike (`8:00 am`, `12:15 pm`) are left as they are. Pushes
 * a PN104 finding with a fix that writes the 24-hour time and returns how many words the time
 * takes (1 glued, 2 with a blank before `pm`), or 0 when the words at `i` are no such time.
 * `read` says whether the word at `i` is a time of day by itself; the finding goes to `issues`.
 */
function twelveHourIssue(body: string, chunks: readonly Word[], i: number, read: boolean, issues: SyntaxIssue[]): number {
  const clock = chunks[i]!;
  let words = 1;
  let clockEnd = clock.end;
  let suffix: string;
  if (read) {
    const next = chunks[i + 1];
    if (next === undefined || next.afterComma) return 0;
    suffix = next.text;
    words = 2;
  } else {
    const glued = /(?:[ap]\.?m\.?)$/i.exec(clock.text);
    if (glued === null) return 0;
    suffix = glued[0];
    clockEnd = clock.end - suffix.length;
  }
  const meridiem = /^([ap])\.?m\.?$/i.exec(suffix)?.[1]?.toLowerCase();
  const minutes = meridiem === undefined ? null : clockAt(body, clock.start, clockEnd);
  if (minutes === null) return 0;
  const hour = Math.floor(minutes / 60);
  if (hour < 1 || hour > 12) return 0;
  const pm = meridiem === 'p';
  // 1–11 am and 12 pm are the same time on both clocks.
  if (pm === (hour === 12)) return 0;
  const h24 = pm ? hour + 12 : 0;
  const meant = `${String(h24).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')}`;
  const end = words === 2 ? chunks[i + 1]!.end : clock.end;
  const written = body.slice(clock.start, end);
  const span = { start: clock.start, end };
  issues.push({
    check: 'bad-time', span,
    message: `\`${written}\` is a time on the 12-hour clock; Pneumark reads times on the 24-hour clock, where it is \`${meant}\` (the time is unknown until it is written so).`,
    fixes: [{ title: `Write \`${meant}\``, edits: [{ span, newText: meant }], preferred: true }],
  });
  return words;
}

/** `0800` → `08:00`, `745` → `07:45`: three or four digits that make a time of day; null otherwise. */
function clockWithoutColon(text: string): string | null {
  if (text.length < 3 || text.length > 4) return null;
  for (let i = 0; i < text.length; i++) if (!isDigit(text.charCodeAt(i))) return null;
  const h = Number(text.slice(0, text.length - 2));
  const m = Number(text.slice(text.length - 2));
  return h > 23 || m > 59 ? null : `${String(h).padStart(2, '0')}:${text.slice(text.length - 2)}`;
}

function looksLikeClock(text: string): boolean {
  return text.includes(':') && isDigit(text.charCodeAt(0));
}

function looksLikeDate(text: string): boolean {
  let digits = 0;
  let seps = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (isDigit(c)) digits++;
    else if (c === 0x2d || c === 0x2f || c === 0x2e) seps++;
    else return false;
  }
  return digits >= 4 && seps === 2;
}

/** `H:MM` or `HH:MM` (also `HHMM`h-free forms are not accepted) → minutes after midnight. */
export function readClock(text: string): number | null {
  return clockAt(text, 0, text.length);
}

/** `readClock` of `[start, end)` of `text`, read in place (a timepoint line's time is not cut out of it). */
function clockAt(text: string, start: number, end: number): number | null {
  const colon = text.indexOf(':', start) - start;
  if (colon < 1 || colon > 2 || end - start !== colon + 3) return null;
  let h = 0;
  let m = 0;
  for (let i = 0; i < end - start; i++) {
    if (i === colon) continue;
    const c = text.charCodeAt(start + i);
    if (!isDigit(c)) return null;
    if (i < colon) h = h * 10 + c - 0x30;
    else m = m * 10 + c - 0x30;
  }
  if (h > 23 || m > 59) return null;
  return h * 60 + m;
}

/**
 * `+2h30`, `+2h`, `+45m`, `+45min`, `+1d`, `+1d6h` → minutes; null when unreadable. A part after a
 * larger one stays within it, as a clock's do: hours after days 0 to 23, minutes after hours or
 * days 0 to 59, in one or two digits (`+2h90` is no offset: see `offsetOverflow`).
 */
export function readOffset(text: string): number | null {
  return offsetMinutes(text, true);
}

/**
 * The minutes of an offset whose later parts run over (`+2h90` → 210), or null when it has no such
 * part or does not read at all: what the writer may have meant, for the message.
 */
function offsetOverflow(text: string): number | null {
  return offsetMinutes(text, true) === null ? offsetMinutes(text, false) : null;
}

/** A part of an offset with its unit (`30m`, `2h`, `45min`, `1d`), as it may be left after a blank. */
const OFFSET_PART = /^[0-9]+(?:d|h|m|min)$/i;

/**
 * `@ +2h 30m`: a blank inside an offset ends it, and the rest starts the label, so the timepoint is
 * half an hour early and nothing looks wrong. Reported (a warning: the line still reads) with the
 * joined offset offered, when the word right after the offset is a part with its unit and the two
 * together read as an offset.
 */
function splitOffset(body: string, offset: Word, next: Word | undefined, issues: SyntaxIssue[]): void {
  if (!next || next.afterComma || !OFFSET_PART.test(next.text)) return;
  const joined = `${offset.text}${next.text}`;
  if (readOffset(joined) === null) return;
  const span = { start: offset.start, end: next.end };
  issues.push({
    check: 'bad-time',
    severity: 'warning',
    span,
    message: `\`${body.slice(span.start, span.end)}\` reads as the offset \`${offset.text}\` and a label starting \`${next.text}\`: an offset has no blanks. Did you mean \`${joined}\`?`,
    fixes: [{ title: `Write \`${joined}\``, edits: [{ span, newText: joined }], preferred: true }],
  });
}

/**
 * The last day a note can name (`@ day 100000`), and the longest offset: about 270 years, far
 * beyond any note, and kept exactly by a number. The timeline holds timepoints that offsets or
 * clock times take past it to the same limit.
 */
export const MAX_DAY = 100_000;
const MAX_OFFSET_MINUTES = MAX_DAY * 1440;

function offsetMinutes(text: string, withinLarger: boolean): number | null {
  if (!text.startsWith('+') || text.length < 2) return null;
  let i = 1;
  let total = 0;
  let lastUnit: 'd' | 'h' | 'm' | null = null;
  while (i < text.length) {
    const start = i;
    while (i < text.length && isDigit(text.charCodeAt(i))) i++;
    if (i === start) return null;
    const n = Number(text.slice(start, i));
    // A part after a larger one: at most two digits, and below the size of the larger unit.
    const inner = withinLarger && lastUnit !== null && i - start > 2;
    const rest = text.slice(i).toLowerCase();
    if (rest.startsWith('min')) { if (lastUnit === 'm' || inner || (withinLarger && lastUnit !== null && n > 59)) return null; total += n; i += 3; lastUnit = 'm'; }
    else if (rest.startsWith('d')) { if (lastUnit) return null; total += n * 1440; i += 1; lastUnit = 'd'; }
    else if (rest.startsWith('h')) { if (lastUnit === 'h' || lastUnit === 'm' || inner || (withinLarger && lastUnit === 'd' && n > 23)) return null; total += n * 60; i += 1; lastUnit = 'h'; }
    else if (rest.startsWith('m')) { if (lastUnit === 'm' || inner || (withinLarger && lastUnit !== null && n > 59)) return null; total += n; i += 1; lastUnit = 'm'; }
    else if (rest === '' && lastUnit === 'h') { if (inner || (withinLarger && n > 59)) return null; total += n; lastUnit = 'm'; }
    else return null;
  }
  return lastUnit === null ? null : total;
}

/** Minutes as an offset of days, hours and minutes, each after the first within the one before: 210 → `+3h30`. */
function offsetText(minutes: number): string {
  const d = Math.floor(minutes / 1440);
  const h = Math.floor((minutes % 1440) / 60);
  const m = minutes % 60;
  return `+${d > 0 ? `${d}d` : ''}${h > 0 ? `${h}h` : ''}${m > 0 ? (h > 0 && d === 0 ? String(m).padStart(2, '0') : `${m}m`) : ''}` || '+0m';
}

// ── items ───────────────────────────────────────────────────────────────

/** What the tree keeps of a word (words are reused for the next line): a token of its own. */
function keep(word: Word): Chunk {
  return token(word.text, word.start, word.end);
}

/** A unit as an item reads it: a word of the line, or a unit glued to a number. */
interface Located {
  readonly text: string;
  readonly start: number;
  readonly end: number;
}

/** A word value (a mode, a device): made by a constructor, as line nodes are. */
class WordNode implements WordValue {
  declare readonly text: string;
  declare readonly span: Span;
  declare readonly kind: 'word';

  constructor(text: string, span: Span) {
    this.text = text;
    this.span = span;
    this.kind = 'word';
  }
}

/** A token that is its own span (one object, not two): a chunk no comma came before. */
function token(text: string, start: number, end: number): Chunk {
  return new Chunk(text, start, end, false);
}

/** A number as written (cut from its line when its text is asked for; few numbers' texts ever are). */
class NumberNode extends Cut implements NumberValue {
  declare readonly value: number;
  declare readonly decimalComma: boolean;

  constructor(source: string, value: number, start: number, end: number, decimalComma: boolean) {
    super(source, start, end);
    this.value = value;
    this.decimalComma = decimalComma;
  }

  /** On the class, not on each number. */
  get kind(): 'number' {
    return 'number';
  }
}

/**
 * Reads a chunk as a number, possibly with a unit glued to it (`89%`, `38.4C`): the number's
 * length, 0 when the chunk is no number (or the start of a pair, `120/80`). The value and its
 * comma are left in SCANNED (no object per number); read them before scanning again.
 */
function numberChunk(chunk: Word): number {
  // Read in the line: most numbers' texts are never cut out (see `Word`).
  const length = scanWord(chunk);
  if (length === 0 || length === chunk.end - chunk.start) return length;
  const text = chunk.text;
  if (text.indexOf('/', length) >= 0 && isDigit(text.charCodeAt(length + 1))) return 0;
  return length;
}

/** The unit glued to a number of `length` at the start of `chunk`, if any. */
function gluedUnit(chunk: Word, length: number): Located | null {
  return length === chunk.end - chunk.start ? null : token(chunk.text.slice(length), chunk.start + length, chunk.end);
}

/**
 * Where the unit glued to the last slash group read begins in its chunk (`120/80mmHg` → 6), or
 * -1 when none is. One variable, read right after `readSlashGroup`, rather than an object per group.
 */
let GROUP_UNIT_AT = -1;

/**
 * What `groupAt` read besides the group: how many chunks it took and the unit glued to its last
 * number. One record for all reads (read right after the call), rather than an object per group.
 */
const GROUP: { used: number; unit: Located | null } = { used: 0, unit: null };

/**
 * The numbers of the slash group read last, four entries each (value, start, end, 1 for a decimal
 * comma): scratch space reused from group to group, read right after the call (a shorthand gas
 * makes its items from it). A pair keeps none of it: it reads its numbers again when asked.
 */
const GROUP_NUMBERS: number[] = [];

/**
 * The numbers joined by slashes at chunk `i` (`120/80`, `7.28/56/71/26`, a unit glued to the
 * last), or, where `spaced`, written with blanks around the slashes (`120 / 80`); null when none.
 * How many chunks it took and its glued unit are left in GROUP. Where `meanLimit` is not -1 (a
 * blood pressure, on a line whose words end there), a number in brackets glued to the last number
 * (`120/80(93)`) ends the group and is left as its glued unit, for the caller to cut off.
 */
function groupAt(chunks: readonly Word[], i: number, source: string, spaced: boolean, meanLimit = -1): PairNode | null {
  const chunk = chunks[i];
  GROUP.used = 1;
  GROUP.unit = null;
  if (!chunk) return null;
  let last = chunk;
  let group = readSlashGroup(chunk, source, meanLimit);
  if (!group && spaced) {
    group = readSpacedGroup(chunks, i, source, meanLimit);
    if (group) last = chunks[i + GROUP.used - 1]!;
  }
  if (group && GROUP_UNIT_AT >= 0) GROUP.unit = token(last.text.slice(GROUP_UNIT_AT), last.start + GROUP_UNIT_AT, last.end);
  return group;
}

/**
 * Numbers joined by single slashes in one chunk (`120/80`, `7.28/56/71/26`), or null. The last
 * number may carry a glued unit (`120/80mmHg`), whose position is left in GROUP_UNIT_AT.
 */
function readSlashGroup(chunk: Word, source: string, meanLimit = -1): PairNode | null {
  GROUP_UNIT_AT = -1;
  let slash = slashIn(chunk, 0);
  if (slash < 0) return null;
  // Numbers separated by single slashes, read in place in the line (no split of the chunk, and
  // its text is not cut out): `from`, `slash` and `end` are places in the chunk, `wordStart` the
  // chunk's place in the text it is read in (see `Word`).
  const body = chunk.source;
  const wordStart = chunk.base + chunk.start;
  const packed = GROUP_NUMBERS;
  let count = 0;
  let comma = false;
  let from = 0;
  let groupEnd = chunk.end;
  for (let k = 0; ; k++) {
    const end = slash < 0 ? chunk.end - chunk.start : slash;
    if (end === from) return null;
    const length = scanWordFrom(chunk, from);
    if (length !== end - from) {
      // Only the last number may have a unit glued to it, and only one that starts with a letter or
      // %; a known unit with a slash of its own ends the group there (`7.28/56/71/26mmol/L`).
      if (length === 0) return null;
      if (!isUnitStart(body.charCodeAt(wordStart + from + length))) {
        // `120/80(93)`: a blood pressure with its mean glued to it (see `groupAt`).
        if (!(slash < 0 && k > 0 && meanLimit >= 0 && bracketAt(source, chunk.start + from + length, meanLimit, null) !== NO_BRACKET)) return null;
      } else if (slash >= 0) {
        // (After one number only, it is a number and its unit: `24mmol/L`.)
        if (k === 0 || !isKnownUnitSpelling(body.slice(wordStart + from + length, chunk.base + chunk.end))) return null;
        slash = -1;
      }
      GROUP_UNIT_AT = from + length;
      groupEnd = chunk.start + from + length;
    }
    const start = chunk.start + from;
    packed[4 * k] = SCANNED.value;
    packed[4 * k + 1] = start;
    packed[4 * k + 2] = start + length;
    packed[4 * k + 3] = SCANNED.decimalComma ? 1 : 0;
    comma ||= SCANNED.decimalComma;
    count++;
    if (slash < 0) break;
    from = slash + 1;
    slash = slashIn(chunk, from);
  }
  return new PairNode(source, chunk.start, groupEnd, count, comma);
}

/**
 * Where the first slash of a word from `from` is (places in the word), or -1: looked for in its
 * line, as most words have none and their texts need not be cut out.
 */
function slashIn(word: Word, from: number): number {
  const body = word.source;
  const start = word.base + word.start;
  const end = word.base + word.end;
  for (let i = start + from; i < end; i++) if (body.charCodeAt(i) === 0x2f /* / */) return i - start;
  return -1;
}

/**
 * `scanNumber` of a word's text from `from` (a place in the word), read in its line as `scanWord`
 * reads from the word's start: a number scanned in the line stops where it stops in the word but
 * where it runs past the word's end (a sign before a separating comma and digits), where the
 * word's own text is scanned instead.
 */
function scanWordFrom(word: Word, from: number): number {
  const length = scanNumber(word.source, word.base + word.start + from);
  return length <= word.end - word.start - from ? length : scanNumber(word.text, from);
}

const DECIMAL_DIGIT = /^\p{Nd}$/u;

function isDecimalDigit(code: number): boolean {
  return DECIMAL_DIGIT.test(String.fromCodePoint(code));
}

/** Marks written between such digits: fullwidth `．` `，` `／`, the Arabic decimal separator `٫`. */
const OTHER_MARKS: Readonly<Record<number, string>> = { 0xff0e: '.', 0xff0c: ',', 0xff0f: '/', 0x066b: '.' };
const ENDING_MARKS = '.,/';

/**
 * Placeholders of a snippet left unfilled: a word in angle brackets (`<VT>`, `<age>`), or words
 * joined by slashes of which one at least is such a word and the others numbers (`<sys>/<dia>`, a
 * shorthand gas begun, `7.31/<PaCO2>/<PaO2>/<HCO3>`). Pneumark's snippets write their placeholders
 * so, and no value of a note is written so.
 */
function isPlaceholder(text: string): boolean {
  return PLACEHOLDERS.test(text) && PLACEHOLDER_WORD.test(text);
}

const PLACEHOLDERS = /^(?:<[A-Za-z][A-Za-z0-9_]*>|[-+]?[0-9]+(?:[.,][0-9]+)?)(?:\/(?:<[A-Za-z][A-Za-z0-9_]*>|[-+]?[0-9]+(?:[.,][0-9]+)?))*$/;
const PLACEHOLDER_WORD = /<[A-Za-z]/;

/**
 * The one finding (PN102) of the placeholders at `i` (`isPlaceholder`), after their `key` where
 * they stand for its value, over the key, the placeholders and a unit after them on the same item;
 * returns where those words end.
 */
function placeholderIssue(chunks: readonly Word[], i: number, key: Word | null, issues: SyntaxIssue[]): number {
  const word = chunks[i]!;
  const after = chunks[i + 1];
  const end = after !== undefined && !after.afterComma && isKnownUnitSpelling(after.text) ? i + 2 : i + 1;
  const what = word.text.indexOf('/') < 0
    ? `\`${word.text}\` is a placeholder left unfilled; write the value in its place.`
    : `\`${word.text}\` holds placeholders left unfilled; write the values in their places.`;
  issues.push({
    check: 'missing-value', span: { start: (key ?? word).start, end: chunks[end - 1]!.end },
    message: key === null ? what : `\`${key.text}\` has no value: ${what}`,
    fixes: NONE,
  });
  return end;
}

/**
 * The name of the dash a number starts with in place of a minus sign (`–5`: an en dash, as a word
 * processor writes one), or null: a dash other than the hyphen-minus and U+2212, followed by a
 * digit or by a point and a digit. Such a number is not read (the format's signs are `-`, `+` and
 * `−`); the parser says why in one finding, with the fix.
 */
function dashBeforeNumber(text: string): string | null {
  const name = DASH_NAMES.get(text.charCodeAt(0));
  if (name === undefined) return null;
  const c = text.charCodeAt(1);
  return isDigit(c) || (c === 0x2e /* . */ && isDigit(text.charCodeAt(2))) ? name : null;
}

const DASH_NAMES: ReadonlyMap<number, string> = new Map([
  [0x2010, 'a hyphen (U+2010)'], [0x2011, 'a non-breaking hyphen (U+2011)'], [0x2012, 'a figure dash (U+2012)'],
  [0x2013, 'an en dash (U+2013)'], [0x2014, 'an em dash (U+2014)'], [0xfe63, 'a small hyphen-minus (U+FE63)'],
  [0xff0d, 'a fullwidth hyphen-minus (U+FF0D)'],
]);

/**
 * A number written at the start of `text` with decimal digits of another script (fullwidth
 * `８０`, Arabic-Indic `٨٠`, Devanagari `८०`), with ASCII digits, full stops, commas and slashes
 * among them (`7.4/40/٩٠`): the number in the digits 0–9, and how many UTF-16 units it takes in `text`. Null when
 * `text` does not start with a digit, or holds only ASCII ones.
 */
function asciiNumberOf(text: string): { readonly text: string; readonly length: number } | null {
  let out = '';
  let other = false;
  let at = 0;
  while (at < text.length) {
    const c = text.codePointAt(at)!;
    const size = c > 0xffff ? 2 : 1;
    if ((c >= 0x30 && c <= 0x39) || ((c === 0x2e || c === 0x2c || c === 0x2f) && at > 0)) out += String.fromCharCode(c);
    else if (at > 0 && OTHER_MARKS[c] !== undefined) {
      out += OTHER_MARKS[c];
      other = true;
    } else if (c > 0x7f && isDecimalDigit(c)) {
      // Unicode writes each script's digits 0 to 9 in a row (some scripts several rows in a run): the digit's value is its place in the run.
      let zero = c;
      while (isDecimalDigit(zero - 1)) zero--;
      out += String((c - zero) % 10);
      other = true;
    } else break;
    at += size;
  }
  // A full stop, comma or slash that ends it is not part of the number.
  let end = out.length;
  while (end > 0 && ENDING_MARKS.includes(out[end - 1]!)) end--;
  at -= out.length - end;
  out = out.slice(0, end);
  return other ? { text: out, length: at } : null;
}

/** Whether a chunk can be a key: keys start with a letter (any script, so a misspelt key is still named). */
function startsLikeKey(text: string): boolean {
  const c = text.charCodeAt(0);
  const lower = c | 0x20;
  return (lower >= 0x61 && lower <= 0x7a) || (c > 0x7f && text[0]!.toLowerCase() !== text[0]!.toUpperCase());
}

/** A letter, `%`, `°` or a micro sign: how a unit starts (glued to a number, or the word after it). */
function isUnitStart(c: number): boolean {
  const lower = c | 0x20;
  // µ (the micro sign, U+00B5) and μ (the Greek letter, U+03BC): `µmol/L` is a unit Pneumark does
  // not know (PN202), as `umol/L` is, not a key.
  return (lower >= 0x61 && lower <= 0x7a) || c === 0x25 || c === 0xb0 || c === 0xb5 || c === 0x3bc;
}

/**
 * Numbers joined by slashes written with blanks around them (`120 / 80`, `7.28 / 56 / 71 / 26`),
 * from chunk `i`, or null; how many chunks it took is left in GROUP.used. A glued unit may follow
 * the last number (`120 / 80mmHg`, left in GROUP_UNIT_AT as for `readSlashGroup`).
 */
function readSpacedGroup(chunks: readonly Word[], i: number, source: string, meanLimit = -1): PairNode | null {
  GROUP_UNIT_AT = -1;
  const first = chunks[i];
  if (!first || first.text.indexOf('/') >= 0 || scanNumber(first.text) !== first.text.length) return null;
  const packed = GROUP_NUMBERS;
  packed[0] = SCANNED.value;
  packed[1] = first.start;
  packed[2] = first.end;
  packed[3] = SCANNED.decimalComma ? 1 : 0;
  let comma = SCANNED.decimalComma;
  let count = 1;
  let k = i + 1;
  let end = first.end;
  while (k + 1 < chunks.length) {
    const slash = chunks[k]!;
    const next = chunks[k + 1]!;
    if (slash.text !== '/' || slash.afterComma || next.afterComma) break;
    const length = scanNumber(next.text);
    if (length === 0 || next.text.indexOf('/') >= 0) break;
    const glued = length < next.text.length;
    if (glued && !isUnitStart(next.text.charCodeAt(length)) && !(meanLimit >= 0 && bracketAt(source, next.start + length, meanLimit, null) !== NO_BRACKET)) break;
    packed[4 * count] = SCANNED.value;
    packed[4 * count + 1] = next.start;
    packed[4 * count + 2] = next.start + length;
    packed[4 * count + 3] = SCANNED.decimalComma ? 1 : 0;
    comma ||= SCANNED.decimalComma;
    count++;
    k += 2;
    end = next.start + length;
    if (glued) {
      GROUP_UNIT_AT = length;
      break;
    }
  }
  if (count === 1) return null;
  GROUP.used = k - i;
  return new PairNode(source, first.start, end, count, comma);
}

/**
 * Two numbers joined by one hyphen or en dash in one chunk, a range with its lower end first
 * (`88-92`, `88–92`; a unit may be glued to the second: `88-92%`), for a field whose pairs are
 * joined so (`join: 'dash'`), or null. Like `groupAt`, it leaves its glued unit in GROUP. A sign
 * after the dash is no part of a range (`88--92` is none).
 */
function readDashGroup(chunk: Word, source: string): PairNode | null {
  GROUP.used = 1;
  GROUP.unit = null;
  const body = chunk.source;
  const wordStart = chunk.base + chunk.start;
  const size = chunk.end - chunk.start;
  const first = scanWordFrom(chunk, 0);
  if (first === 0 || first >= size - 1) return null;
  const comma = SCANNED.decimalComma;
  const dash = body.charCodeAt(wordStart + first);
  if ((dash !== 0x2d /* - */ && dash !== 0x2013 /* – */) || !isDigit(body.charCodeAt(wordStart + first + 1))) return null;
  const second = scanWordFrom(chunk, first + 1);
  if (second === 0) return null;
  const end = first + 1 + second;
  if (end < size) {
    if (!isUnitStart(body.charCodeAt(wordStart + end))) return null;
    GROUP.unit = token(chunk.text.slice(end), chunk.start + end, chunk.end);
  }
  return new PairNode(source, chunk.start, chunk.start + end, 2, comma || SCANNED.decimalComma, true);
}

/** A hyphen or an en dash, the joins of a range (`88-92`, `88–92`). */
function isRangeDash(c: number): boolean {
  return c === 0x2d /* - */ || c === 0x2013 /* – */;
}

/**
 * A range written with blanks around its dash or on one side of it (`88 - 92`, `88 – 92 %`,
 * `88 -92`, `88- 92`), from chunk `i`, for a field whose pairs are joined so (`join: 'dash'`), or
 * null: read as the same range as `88-92`, which the formatter writes. How many chunks it took is
 * left in GROUP.used, and a unit glued to the second number in GROUP.unit. The second number starts
 * with a digit (`88 - -92` is none).
 */
function readSpacedDashGroup(chunks: readonly Word[], i: number, source: string): PairNode | null {
  GROUP.used = 1;
  GROUP.unit = null;
  const first = chunks[i];
  const after = chunks[i + 1];
  if (!first || !after || after.afterComma) return null;
  const text = first.text;
  const lead = scanNumber(text);
  if (lead === 0 || !isDigit(text.charCodeAt(0))) return null;
  let comma = SCANNED.decimalComma;
  let second: Word;
  let from: number;
  let used: number;
  if (lead === text.length - 1 && isRangeDash(text.charCodeAt(lead))) {
    // `88- 92`
    second = after;
    from = 0;
    used = 2;
  } else if (lead !== text.length) {
    return null;
  } else if (after.text.length === 1 && isRangeDash(after.text.charCodeAt(0))) {
    // `88 - 92`, `88 – 92`
    const next = chunks[i + 2];
    if (!next || next.afterComma) return null;
    second = next;
    from = 0;
    used = 3;
  } else if (isRangeDash(after.text.charCodeAt(0))) {
    // `88 -92`
    second = after;
    from = 1;
    used = 2;
  } else return null;
  const secondText = second.text;
  if (!isDigit(secondText.charCodeAt(from))) return null;
  const length = scanNumber(secondText, from);
  if (length === 0) return null;
  comma ||= SCANNED.decimalComma;
  const end = from + length;
  if (end < secondText.length) {
    if (!isUnitStart(secondText.charCodeAt(end))) return null;
    GROUP.unit = token(secondText.slice(end), second.start + end, second.end);
  }
  GROUP.used = used;
  return new PairNode(source, first.start, second.start + end, 2, comma, true);
}

/**
 * Numbers joined by slashes (`120/80`, `120 / 80`). It keeps where it is and how many numbers it
 * has, and reads its numbers again from its line when they are asked for (`parts`, `numbers`): a
 * big note has a blood pressure at every timepoint, and few pairs are read more than once.
 */
class PairNode extends Cut implements PairValue {
  /** How many numbers (times 4), plus 2 when they are joined by a dash (a range), plus 1 when one has a decimal comma. */
  declare private readonly flags: number;

  constructor(source: string, start: number, end: number, count: number, decimalComma: boolean, dash = false) {
    super(source, start, end);
    this.flags = count * 4 + (dash ? 2 : 0) + (decimalComma ? 1 : 0);
  }

  /** On the class, not on each pair. */
  get kind(): 'pair' {
    return 'pair';
  }

  /** Whether its numbers are joined by a dash (a range: `88-92`) rather than by slashes. */
  get dashed(): boolean {
    return (this.flags & 2) !== 0;
  }

  /** How many numbers the pair has (without building them). */
  get count(): number {
    return this.flags >> 2;
  }

  /** Built on each read: callers read them once. */
  get parts(): readonly NumberValue[] {
    const parts = new Array<NumberValue>(this.count);
    let at = this.start;
    for (let k = 0; k < parts.length; k++) {
      at = this.numberAt(at, k);
      parts[k] = new NumberNode(this.source, compact(SCANNED.value), at, at + NUMBER_LENGTH, SCANNED.decimalComma);
      at += NUMBER_LENGTH;
    }
    return parts;
  }

  /** The values of the numbers, in a new list of their own (no node per number). */
  numbers(): number[] {
    // Read into scratch space and copied out with `slice`: an array made with `new Array(n)` or a
    // literal is tracked by its allocation site, and one kept this often would be pretenured (see
    // the performance notes in DEVELOPERS.md).
    const values = PAIR_NUMBERS;
    let at = this.start;
    for (let k = 0; k < this.count; k++) {
      at = this.numberAt(at, k) + NUMBER_LENGTH;
      values[k] = compact(SCANNED.value);
    }
    return values.slice(0, this.count);
  }

  hasDecimalComma(): boolean {
    return (this.flags & 1) !== 0;
  }

  /**
   * Reads number `k` again from `at` (the end of the one before), as the group read it: between
   * two numbers there are only a slash and blanks (`120/80`, `120 / 80`), and a number ends where
   * it ended then (a glued unit or a full stop left out of the line does not scan as part of it).
   * Returns where it starts; its length is left in NUMBER_LENGTH, its value and comma in SCANNED.
   */
  private numberAt(at: number, k: number): number {
    const source = this.source;
    if (k > 0 && (this.flags & 2) !== 0) {
      // The one hyphen or en dash of a range (`88-92`), and any blanks around it (`88 - 92`).
      while (isBlank(source.charCodeAt(at))) at++;
      at++;
      while (isBlank(source.charCodeAt(at))) at++;
    } else if (k > 0) while (source.charCodeAt(at) === 0x2f /* / */ || isBlank(source.charCodeAt(at))) at++;
    NUMBER_LENGTH = scanNumber(source, at);
    return at;
  }
}

/** What a range field (`join: 'dash'`) written in another shape is told (PN102). */
function rangeShapeMessage(key: string, written: string): string {
  return `\`${key}\` takes a range of two whole numbers joined by a hyphen, the lower first (\`${key} 88-92\`); \`${written}\` is not one, so it is not read.`;
}

/** Whether a pair is a range, its numbers joined by a dash (`88-92`), not by a slash. */
export function isDashedPair(pair: PairValue): boolean {
  return pair instanceof PairNode && pair.dashed;
}

/** The numbers of a pair, in a new list of their own: for a pair the parser made, without a node per number. */
export function pairNumbers(pair: PairValue): number[] {
  return pair instanceof PairNode ? pair.numbers() : pair.parts.map((p) => p.value);
}

/** Scratch space of `PairNode.numbers`. */
const PAIR_NUMBERS: number[] = [];

/** The length of the number `PairNode.numberAt` read last (read right after the call). */
let NUMBER_LENGTH = 0;

/** What implies an item's key (index 0: the key is written), and the flag of a decimal comma, kept in one number. */
const IMPLIED: readonly ItemNode['implied'][] = [null, 'shorthand', 'device', 'device-flow', 'bracketed-mean'];
const IMPLIED_MASK = 7;
/** The indexes of IMPLIED, which items are made with. */
const WRITTEN = 0;
const SHORTHAND = 1;
const DEVICE = 2;
const DEVICE_FLOW = 3;
const BRACKETED_MEAN = 4;
const DECIMAL_COMMA = 8;
/** An item's flags take values below this; where its number ends is kept above them (see `Item.packed`). */
const FLAG_VALUES = 16;

/**
 * An item: `key value [unit]`, or a value whose key is implied by its place (a shorthand gas part,
 * an oxygen device and its flow). Every item is of this one class (so code that reads items sees
 * one shape). It is its own span (`span` returns the item, which has `start` and `end`).
 *
 * A big note keeps one item per value, so an item keeps its parts flat rather than as objects of
 * their own: its key's text (the key starts the item), a number value's digits (where they end and
 * what they read as) and its unit's text and start. `key`, `value` and `unit` build the token or
 * the number when asked; a pair or a word value is kept as it is. One object per item instead of three.
 * Where the item ends, and where its number starts, follow from the rest (see `end`, `numStart`).
 */
class Item implements ItemNode, Span {
  /** The key as written, or for an implied key the key it stands for (see `flags`). */
  declare private readonly name: string;
  /**
   * The item's flags (what implied the key, an index into IMPLIED, 0: written; plus DECIMAL_COMMA),
   * plus FLAG_VALUES times where a number value ends (0 for none): one field for the two, a field
   * less on each item. Read by arithmetic, not bit operations, so a line longer than 2^28 (where the
   * sum leaves the 31-bit range) still reads right.
   */
  declare private readonly packed: number;
  /**
   * A pair or word value, or for a number value (kept flat below) the line the number is on (a
   * string: see `other`, `source`); null for no value. One field for the two, as an item has only
   * one of them: a field less on each of the tens of thousands of items a big note keeps.
   */
  declare private readonly ref: PairValue | WordValue | string | null;
  /**
   * The number value (null: none) and where it is. `num` may hold null, so a whole number is kept
   * in the item itself rather than in a box of its own (as a field that only ever holds numbers would keep it).
   */
  declare private readonly num: number | null;
  declare readonly unitText: string | null;
  declare private readonly unitStart: number;
  declare readonly field: FieldDef | null;
  declare readonly start: number;

  constructor(
    keyText: string | null,
    keyName: string,
    /** What implies the key: an index of IMPLIED. */
    implied: number,
    field: FieldDef | null,
    other: PairValue | WordValue | null,
    source: string,
    num: number | null,
    numEnd: number,
    numComma: boolean,
    unit: Located | null,
    start: number,
  ) {
    this.field = field;
    this.start = start;
    this.name = implied === WRITTEN && keyText !== null ? keyText : keyName;
    this.packed = numEnd * FLAG_VALUES + (implied | (numComma ? DECIMAL_COMMA : 0));
    this.ref = num === null ? other : source;
    this.num = num === null ? null : compact(num);
    this.unitText = unit?.text ?? null;
    this.unitStart = unit?.start ?? 0;
  }

  private get flags(): number {
    return this.packed % FLAG_VALUES;
  }

  /** Where a number value ends. */
  private get numEnd(): number {
    return Math.floor(this.packed / FLAG_VALUES);
  }

  /** A pair or word value; null for a number value or none. */
  private get other(): PairValue | WordValue | null {
    return typeof this.ref === 'string' ? null : this.ref;
  }

  /** The line a number value is on. */
  private get source(): string {
    return typeof this.ref === 'string' ? this.ref : '';
  }

  /**
   * Where the item ends: after its unit (but for a part of a shorthand gas, whose unit follows the
   * whole gas), else after its value, else after its key.
   */
  get end(): number {
    if (this.unitText !== null && (this.flags & IMPLIED_MASK) !== SHORTHAND) return this.unitStart + this.unitText.length;
    if (this.other !== null) return this.other.span.end;
    if (this.num !== null) return this.numEnd;
    return this.start + this.name.length;
  }

  /** Where a number value starts: an implied key's item starts with it, a written key is followed by blanks and then it. */
  private get numStart(): number {
    if ((this.flags & IMPLIED_MASK) !== 0) return this.start;
    const source = this.source;
    let at = this.start + this.name.length;
    while (isBlank(source.charCodeAt(at))) at++;
    return at;
  }

  get implied(): ItemNode['implied'] {
    return IMPLIED[this.flags & IMPLIED_MASK]!;
  }

  /** The key as written (null when implied). */
  private get keyText(): string | null {
    return (this.flags & IMPLIED_MASK) === 0 ? this.name : null;
  }

  get keyName(): string {
    return (this.flags & IMPLIED_MASK) === 0 ? lowerCase(this.name) : this.name;
  }

  private get numComma(): boolean {
    return (this.flags & DECIMAL_COMMA) !== 0;
  }

  get key(): Token | null {
    return this.keyText === null ? null : token(this.keyText, this.start, this.start + this.keyText.length);
  }

  /** Whether a number of the value was written with a decimal comma. */
  hasDecimalComma(): boolean {
    if (this.other instanceof PairNode) return this.other.hasDecimalComma();
    return this.numComma;
  }

  get valueKind(): ValueNode['kind'] | null {
    return this.other !== null ? this.other.kind : this.num === null ? null : 'number';
  }

  get number(): number | null {
    return this.num;
  }

  get value(): ValueNode | null {
    if (this.other !== null) return this.other;
    return this.num === null ? null : new NumberNode(this.source, this.num, this.numStart, this.numEnd, this.numComma);
  }

  get unit(): Token | null {
    return this.unitText === null ? null : token(this.unitText, this.unitStart, this.unitStart + this.unitText.length);
  }

  get span(): Span {
    return this;
  }
}

/**
 * What `bracketAt` found: no number in brackets there, one closed by `)`, one whose `)` is
 * missing, one whose `)` has more glued to it (`(93)x`).
 */
const NO_BRACKET = 0;
const CLOSED = 1;
const UNCLOSED = 2;
const GLUED = 3;

/**
 * What `bracketAt` read last (read right after the call, as SCANNED is): the number inside the
 * brackets (its value, where it starts and ends, a decimal comma), where its unit starts and ends
 * (-1: none), and where the bracket ends: after its `)`, or for an unclosed one after the last
 * word it took. One record for every bracket rather than an object per bracket.
 */
const BRACKET = { value: 0, numStart: 0, numEnd: 0, comma: false, unitStart: -1, unitEnd: -1, end: 0 };

/** Where a run of characters inside brackets ends from `at` (at a blank, a comma, a bracket or `limit`). */
function bracketWordEnd(source: string, at: number, limit: number): number {
  while (at < limit) {
    const c = source.charCodeAt(at);
    if (isBlank(c) || c === 0x2c /* , */ || c === 0x29 /* ) */ || c === 0x28 /* ( */) break;
    at++;
  }
  return at;
}

function blanksEnd(source: string, at: number, limit: number): number {
  while (at < limit && isBlank(source.charCodeAt(at))) at++;
  return at;
}

/**
 * A number in brackets at `open` (the `(`) of `source`, whose words end at `limit`: `(93)`,
 * `(93 mmHg)`, `(93mmHg)`, `( 93 )`, `(93 mm Hg)`: blanks may come after `(` and before `)`, and
 * a unit after the number, glued or not. CLOSED when a `)` follows and ends a word (a blank, a
 * comma or the end of the words comes next); UNCLOSED when the number is not followed by a `)`
 * (at the end of the line, at a comma or at another word): then the word after the number is kept
 * as its unit only when it is a unit the format knows and no key of `section` (null: any word
 * that is a unit), so `(93 hr 80` leaves `hr 80` to be read; GLUED when the `)` is glued to more
 * (`(93)x`, `(93)(94)`: the bracket then ends where that run of characters does, at a blank or a
 * comma). NO_BRACKET when no number follows the `(`. What it read is left in BRACKET.
 */
function bracketAt(source: string, open: number, limit: number, section: SectionId | null): number {
  if (open < 0 || open >= limit || source.charCodeAt(open) !== 0x28 /* ( */) return NO_BRACKET;
  const numStart = blanksEnd(source, open + 1, limit);
  const length = numStart < limit ? scanNumber(source, numStart) : 0;
  // A number is read within the words (`limit`), and ends where a word inside brackets may.
  if (length === 0 || numStart + length > limit) return NO_BRACKET;
  BRACKET.value = SCANNED.value;
  BRACKET.comma = SCANNED.decimalComma;
  BRACKET.numStart = numStart;
  BRACKET.numEnd = numStart + length;
  BRACKET.unitStart = -1;
  BRACKET.unitEnd = -1;
  let at = BRACKET.numEnd;
  const unitStart = blanksEnd(source, at, limit);
  let unitEnd = bracketWordEnd(source, unitStart, limit);
  if (unitEnd > unitStart) {
    // `(93 mm Hg)`: a unit of two words.
    const second = blanksEnd(source, unitEnd, limit);
    const secondEnd = bracketWordEnd(source, second, limit);
    if (unitEnd - unitStart === 2 && second > unitEnd && secondEnd > second && isKnownUnitSpelling(`${source.slice(unitStart, unitEnd)} ${source.slice(second, secondEnd)}`)) unitEnd = secondEnd;
    BRACKET.unitStart = unitStart;
    BRACKET.unitEnd = unitEnd;
    at = unitEnd;
  }
  const close = blanksEnd(source, at, limit);
  if (close < limit && source.charCodeAt(close) === 0x29 /* ) */) {
    let after = close + 1;
    if (after >= limit || isBlank(source.charCodeAt(after)) || source.charCodeAt(after) === 0x2c /* , */) {
      BRACKET.end = after;
      return CLOSED;
    }
    while (after < limit && !isBlank(source.charCodeAt(after)) && source.charCodeAt(after) !== 0x2c /* , */) after++;
    BRACKET.end = after;
    return GLUED;
  }
  // Unclosed: the word after the number stays its unit only when it is one (`(93 mmHg`), not a key (`(93 hr 80`).
  if (BRACKET.unitStart >= 0) {
    const unit = source.slice(BRACKET.unitStart, BRACKET.unitEnd);
    if (!isKnownUnitSpelling(unit) || (section !== null && isKey(section, unit))) {
      BRACKET.unitStart = -1;
      BRACKET.unitEnd = -1;
    }
  }
  BRACKET.end = BRACKET.unitStart >= 0 ? BRACKET.unitEnd : BRACKET.numEnd;
  return UNCLOSED;
}

/**
 * The measured mean of a blood pressure that `bracketAt` read last (`bp 120/80 (93)`): an item of
 * the field `mean_bp` with its key implied by its place, spanning the number inside the brackets
 * and its unit; null when the section has no mean.
 */
function bracketedMean(source: string, section: SectionId): Item | null {
  const field = fieldFor(section, 'map') ?? null;
  if (field === null) return null;
  const unit = BRACKET.unitStart < 0 ? null : token(source.slice(BRACKET.unitStart, BRACKET.unitEnd), BRACKET.unitStart, BRACKET.unitEnd);
  return numberItem(null, 'map', BRACKETED_MEAN, field, source, BRACKET.value, BRACKET.numEnd, BRACKET.comma, unit, BRACKET.numStart);
}

/** How many chunks `chunksThrough` counted last (read right after the call, as UNIT_CHUNKS is). */
let BRACKET_CHUNKS = 0;

/**
 * Where a bracket that ends at `end` ends as the words of its line go: at the end of the last of
 * `chunks` from `i` that starts before `end` (at least `end`). How many such chunks there are is
 * left in BRACKET_CHUNKS, for the caller to step over.
 */
function chunksThrough(chunks: readonly Word[], i: number, end: number): number {
  let k = i;
  let last = end;
  while (k < chunks.length && chunks[k]!.start < end) last = Math.max(last, chunks[k++]!.end);
  BRACKET_CHUNKS = k - i;
  return last;
}

/** The finding on an unclosed bracket after a blood pressure (`bp 120/80 (93`), from `open`; the mean is not read. */
function unclosedMeanIssue(source: string, open: number, end: number): SyntaxIssue {
  const written = source.slice(open, end);
  const closed = `${written})`;
  return {
    check: 'stray-text',
    span: { start: open, end },
    message: `\`${written}\` has no closing bracket: the measured mean after a blood pressure is written in brackets, \`${closed}\`, and is not read until the bracket is closed.`,
    fixes: [{ title: `Write \`${closed}\``, edits: [{ span: { start: open, end }, newText: closed }] }],
  };
}

/**
 * The finding on the bracket of a measured mean with more glued after its `)` (`bp 120/80 (93)x`),
 * from `open`: the mean is not read (what is glued may change what it says), the pressure is.
 */
function gluedMeanIssue(source: string, open: number, end: number): SyntaxIssue {
  const written = source.slice(open, end);
  const close = written.indexOf(')') + 1;
  return {
    check: 'stray-text',
    span: { start: open, end },
    message: `\`${written}\` is not read: \`${written.slice(close)}\` is glued to the bracket of the measured mean. Write the mean alone in its brackets, \`${written.slice(0, close)}\`, with a blank or a comma after them.`,
    fixes: NONE,
  };
}

/** The finding on a number in brackets that follows no blood pressure (`hr 80 (93)`, `bp 120/80, (93)`). */
function misplacedBracketIssue(source: string, open: number, end: number): SyntaxIssue {
  return {
    check: 'stray-text',
    span: { start: open, end },
    message: `\`${source.slice(open, end)}\` is not read: a number in brackets is read only right after a blood pressure, with no comma between, as its measured mean (\`bp 120/80 (93)\`). Write other values as \`key value\`, e.g. \`map 93\`.`,
    fixes: NONE,
  };
}

/** An item whose value is a pair, a word or nothing. */
function otherItem(keyText: string | null, keyName: string, implied: number, field: FieldDef | null, value: PairValue | WordValue | null, unit: Located | null, start: number): Item {
  return new Item(keyText, keyName, implied, field, value, '', null, 0, false, unit, start);
}

/** An item whose value is the number `value` written up to `numEnd` of `source` (see `Item.numStart`). */
function numberItem(keyText: string | null, keyName: string, implied: number, field: FieldDef | null, source: string, value: number, numEnd: number, comma: boolean, unit: Located | null, start: number): Item {
  return new Item(keyText, keyName, implied, field, null, source, value, numEnd, comma, unit, start);
}

const SHORTHAND_KEYS = ['ph', 'pco2', 'po2', 'hco3'] as const;
/** The indexes of SHORTHAND_KEYS among the words of the format (-1 for one that is none). */
const SHORTHAND_KNOWN: readonly number[] = SHORTHAND_KEYS.map((key) => VOCABULARY_WORDS.indexOf(key));

const COUNT_WORDS = ['none', 'one', 'two', 'three', 'four'];

/** How many numbers a slash group has, in words (`three`). */
function countWord(count: number): string {
  return COUNT_WORDS[count] ?? String(count);
}

function isKey(section: SectionId, text: string): boolean {
  return fieldFor(section, text) !== undefined;
}

function deviceWordAt(chunks: readonly Word[], i: number): { text: string; span: Span; used: number } | null {
  const c = chunks[i];
  if (!c) return null;
  const device = fieldFor('oxygen', 'device');
  if (!device?.words) return null;
  const first = lowerCase(c.text);
  // A device of several words (`room air`, `nasal cannula`, `simple face mask`), longest first, its
  // words separated by blanks only: the words as written, joined by one blank.
  for (const phrase of DEVICE_PHRASES_LONGEST_FIRST) {
    const n = phrase.words.length;
    if (phrase.words[0] !== first) continue;
    let fits = true;
    for (let j = 1; j < n && fits; j++) {
      const w = chunks[i + j];
      fits = w !== undefined && !w.afterComma && lowerCase(w.text) === phrase.words[j];
    }
    if (!fits) continue;
    let text = c.text;
    for (let j = 1; j < n; j++) text += ` ${chunks[i + j]!.text}`;
    return { text, span: { start: c.start, end: chunks[i + n - 1]!.end }, used: n };
  }
  if (device.words[first] && !isKey('oxygen', c.text)) return { text: c.text, span: c.span, used: 1 };
  return null;
}

/**
 * How many chunks the unit `unitWordAt` or `unitAfter` read last takes: 2 for a unit of two words
 * (`mm Hg`), else 1 (for `unitAfter`, the chunks after the number's: 0 for no unit or one glued to
 * the number, 1 for `80mm Hg`). One variable, read right after the call, rather than an object per unit.
 */
let UNIT_CHUNKS = 1;

/**
 * The unit of a number whose chunk ends at chunk `i`: the unit glued to it, if any (`89%`), made
 * whole by the next chunk when the two are a unit of two words (`80mm Hg`, `5cm H2O`, read as
 * `80 mm Hg` is), else the unit after it (see `unitWordAt`). How many chunks from `i` it takes is
 * left in UNIT_CHUNKS.
 */
function unitAfter(glued: Located | null, chunks: readonly Word[], i: number, section: SectionId, source: string): Located | null {
  if (glued === null) {
    const unit = unitWordAt(chunks, i, section, source);
    if (unit === null) UNIT_CHUNKS = 0;
    return unit;
  }
  const after = chunks[i];
  if (after !== undefined && !after.afterComma && startsTwoWordUnit(glued.text, after)) {
    UNIT_CHUNKS = 1;
    return token(source.slice(glued.start, after.end), glued.start, after.end);
  }
  UNIT_CHUNKS = 0;
  return glued;
}

/**
 * The chunk at `i` when it reads as the unit of the number before it, or the two chunks from `i`
 * when they read as a unit of two words (`mm Hg`, `cm H2O`: `source` is the line they are cut
 * from); null when it does not. How many chunks the unit takes is left in UNIT_CHUNKS.
 */
function unitWordAt(chunks: readonly Word[], i: number, section: SectionId, source: string): Located | null {
  UNIT_CHUNKS = 1;
  const next = chunks[i];
  if (!next || next.afterComma) return null;
  if (scanWord(next) > 0) return null;
  const after = chunks[i + 1];
  if (after !== undefined && !after.afterComma && startsTwoWordUnit(next.text, after)) {
    UNIT_CHUNKS = 2;
    return token(source.slice(next.start, after.end), next.start, after.end);
  }
  const numberAfter = after !== undefined && !after.afterComma && scanWord(after) > 0;
  // `pco2 40 ph 7.4`: a unit spelling that is also a key of the section, with a number after it, is that key.
  if (isUnitWord(next)) return numberAfter && fieldOfWord(section, knownFieldsOf(section), next) !== null ? null : next;
  if (fieldOfWord(section, knownFieldsOf(section), next) !== null) return null;
  if (numberAfter) return null;
  // Something unit-like we do not know: keep it as the unit so the unit check can name it. Punctuation
  // (`hr 80 / rr 20`) is no unit: it is reported as stray text.
  return next.text.length <= 12 && isUnitStart(next.text.charCodeAt(0)) ? next : null;
}

/**
 * Whether two words make a unit written with a blank (`mm Hg`, `cm H2O`; any case). Only `mm` or
 * `cm` followed by a word that starts with `h` can: the words are joined and looked up only then,
 * so the words after most numbers cost two character reads here.
 */
function startsTwoWordUnit(first: string, second: Word): boolean {
  if (first.length !== 2 || (first.charCodeAt(1) | 0x20) !== 0x6d /* m */ || (second.source.charCodeAt(second.base + second.start) | 0x20) !== 0x68 /* h */) return false;
  const c = first.charCodeAt(0) | 0x20;
  return (c === 0x6d /* m */ || c === 0x63 /* c */) && isKnownUnitSpelling(`${first} ${second.text}`);
}

const BILEVEL_PAIR = /^([0-9]+(?:\.[0-9]+)?)\/([0-9]+(?:\.[0-9]+)?)$/;

/**
 * A pair of pressures written without keys on an oxygen line whose device (so far) is NIV
 * (`oxygen niv 16/6`): bilevel pressures are commonly written so, the inspiratory first (common
 * practice, no source). Its keys (`ipap 16, epap 6`) where the first is the higher and the line
 * writes neither key; else null (`6/16` and `8/8` leave the order open).
 */
function bilevelPairKeys(chunk: Word, chunks: readonly Word[], at: number, items: readonly (Item | undefined)[], count: number): string | null {
  const pair = BILEVEL_PAIR.exec(chunk.text);
  if (pair === null || !(Number(pair[1]) > Number(pair[2]))) return null;
  const device = fieldFor('oxygen', 'device');
  let niv = false;
  for (let k = 0; k < count; k++) {
    const item = items[k]!;
    if (item.keyName === 'ipap' || item.keyName === 'epap') return null;
    if (item.keyName === 'device' && device) niv = item.value?.kind === 'word' && canonicalWord(device, item.value.text) === 'niv';
  }
  if (!niv) return null;
  for (let k = at + 1; k < chunks.length; k++) {
    const word = chunks[k]!.text.toLowerCase();
    if (word === 'ipap' || word === 'epap') return null;
  }
  return `ipap ${pair[1]}, epap ${pair[2]}`;
}

/**
 * The oxygen fractions of the Venturi settings, as a bare percentage: 24 to 60 % (European Lung
 * White Book, Principles of respiratory therapy, figure 2; the settings 24, 28, 31, 35, 40 and 60 %
 * read in a teaching table of Venturi colour codes at md3.info/skills/oxygen/amplified).
 */
export const VENTURI_PERCENT = { min: 24, max: 60 } as const;

/**
 * What the number after `venturi` is. A Venturi mask is set by the oxygen fraction it gives, not by
 * a flow (its settings give about 24, 28, 31, 35, 40 and 60 % oxygen, each at an oxygen flow of some
 * 2 to 15 L/min the device names: O'Driscoll BR et al., BTS guideline for oxygen use in adults in
 * healthcare and emergency settings, Thorax 2017;72 Suppl 1, not read; a 28 % mask at 4 L/min read
 * in table 1 of a Breathe review adapted from the 2008 BTS guideline, breathe.ersjournals.com; the
 * six settings at oxygen flows from 2 to 15 L/min read in a teaching table at md3.info). So the number is its FiO2 where it
 * can only be one: a fraction (above 0, up to 1: no Venturi mask runs at 0.4 L/min) or a
 * percentage (`venturi 40 %`); and a bare number of a setting (24–60, above any flow a Venturi mask
 * takes), as a percentage, which `venturiSettingIssue` reports. Any other number, and one written in
 * another unit (`venturi 8 L/min`), is the flow, as after other devices.
 */
function venturiNumberKey(number: number, unit: Located | null): 'fio2' | 'flow' {
  if (unit !== null) return unitsForSpelling(unit.text).some((u) => u.id === '%') ? 'fio2' : 'flow';
  if (number > 0 && number <= 1) return 'fio2';
  return number >= VENTURI_PERCENT.min && number <= VENTURI_PERCENT.max ? 'fio2' : 'flow';
}

/**
 * A bare number of a Venturi setting after `venturi` (`venturi 28`), read as the FiO2 in %: said
 * (information), with fixes that write which was meant, the FiO2 read or a flow in L/min. Where a
 * flow follows it without a key (`flowAfter`: `venturi 28 8 L/min`), the number is not that flow:
 * no flow is offered (it would be a second one), and the fix that writes `fio2` gives the flow its
 * key too, since after a key no number is read as the device's (as `highFlowPercentIssue` does).
 */
function venturiSettingIssue(device: string, source: string, start: number, end: number, flowAfter: Item | null): SyntaxIssue {
  const number = source.slice(start, end);
  const edits = [{ span: { start, end: start }, newText: 'fio2 ' }, { span: { start: end, end }, newText: ' %' }];
  if (flowAfter !== null) edits.push({ span: { start: flowAfter.span.start, end: flowAfter.span.start }, newText: 'flow ' });
  const fixes: LineFix[] = [{ title: `Write \`fio2 ${number} %\``, edits }];
  if (flowAfter === null) fixes.push({ title: `Write \`${number} L/min\``, edits: [{ span: { start: end, end }, newText: ' L/min' }] });
  const setting = `${number} % (a Venturi mask is set by its oxygen fraction, ${VENTURI_PERCENT.min}–${VENTURI_PERCENT.max} %)`;
  return {
    check: 'venturi-setting',
    span: { start, end },
    message: flowAfter === null
      ? `\`${number}\` after \`${device}\` is read as the FiO2 it gives, ${setting}, not as a flow of ${number} L/min. Write \`fio2 ${number} %\` to say so, or \`${number} L/min\` for a flow.`
      : `\`${number}\` after \`${device}\` is read as the FiO2 it gives, ${setting}, not as a flow: the flow is the \`${source.slice(flowAfter.span.start, flowAfter.span.end)}\` after it. Write \`fio2 ${number} %\` to say so.`,
    fixes,
  };
}

/** Whether a device word names a high-flow device (`hfnc`, or one of its aliases such as `highflow`). */
function isHighFlowDevice(section: SectionId, word: string): boolean {
  return canonicalWord(fieldFor(section, 'device')!, word) === 'hfnc';
}

/** Whether a unit is written as a percentage (`%`). */
function isPercent(unit: Located | null): boolean {
  return unit !== null && unitsForSpelling(unit.text).some((u) => u.id === '%');
}

/**
 * A percentage after a high-flow device without a key (`hfnc 60 %`), read as the FiO2 it gives (a
 * flow is never in %): said (information), with fixes that write which was meant, the FiO2 read or,
 * where the line gives no flow of its own without a key (`offerFlow`), a flow in L/min.
 */
function highFlowPercentIssue(device: string, source: string, item: Item, offerFlow: boolean, flowAfter: Item | null): SyntaxIssue {
  const start = item.span.start;
  const unit = item.unit!;
  const numberText = item.value!.text;
  // A flow after the percentage (`hfnc 60 % 40 L/min`) is given its key too: after `fio2 60 %` no
  // number is read as the device's.
  const edits = [{ span: { start, end: start }, newText: 'fio2 ' }];
  if (flowAfter !== null) edits.push({ span: { start: flowAfter.span.start, end: flowAfter.span.start }, newText: 'flow ' });
  const fixes: LineFix[] = [{ title: `Write \`fio2 ${numberText} %\``, edits }];
  if (offerFlow) fixes.push({ title: `Write \`${numberText} L/min\``, edits: [{ span: unit.span, newText: 'L/min' }] });
  return {
    check: 'high-flow-percent',
    span: { start, end: item.span.end },
    message: `\`${source.slice(start, item.span.end)}\` after \`${device}\` is read as the FiO2 it gives, ${numberText} % (a high-flow device is set by a flow in L/min and an FiO2; a flow is never in %). Write \`fio2 ${numberText} %\` to say so${offerFlow ? `, or \`${numberText} L/min\` for a flow` : ''}.`,
    fixes,
  };
}

/** The device an oxygen line names among its first `count` items (as written), or null. */
function deviceOf(items: readonly (Item | undefined)[], count: number): string | null {
  for (let k = 0; k < count; k++) {
    const item = items[k]!;
    if (item.keyName === 'device' && item.value?.kind === 'word') return item.value.text;
  }
  return null;
}

/**
 * A number in % without a key after a comma on an oxygen line (`hfnc 40 L/min, 60 %`): a comma
 * ends the numbers read after the device, as it does everywhere, so it is not read; but no key of
 * the section but `fio2` takes %, so it is one finding (not one for the number and one for its
 * unit) with a fix that writes that key. After `hfnc`, where it would have been read as the FiO2
 * without the comma, the message says so.
 */
function percentAfterCommaIssue(source: string, start: number, end: number, device: string | null): SyntaxIssue {
  const written = source.slice(start, end);
  const highFlow = device !== null && isHighFlowDevice('oxygen', device);
  const why = highFlow ? `: after \`${device}\` a percentage is read as its FiO2 only among the numbers right after the device, before any comma.` : '.';
  return {
    check: 'stray-text',
    span: { start, end },
    message: `\`${written}\` has no key${why} A percentage on an oxygen line can only be the FiO2: write \`fio2 ${written}\`.`,
    fixes: [{ title: `Write \`fio2 ${written}\``, edits: [{ span: { start, end: start }, newText: 'fio2 ' }], preferred: true }],
  };
}

/** What a device set by its oxygen flow is, as a message names it (`percentAfterFlowIssue`), by its canonical word. */
const SET_BY_FLOW: Readonly<Record<string, string>> = { cannula: 'a nasal cannula', mask: 'a simple mask', reservoir: 'a reservoir mask' };

/**
 * A percentage right after the number of a device that is set by neither its FiO2 nor a
 * percentage (`mask 10 L/min 40 %`, `cannula 2 L/min 28%`, `cpap 8 40 %`): not read, since only the
 * number right after the device is read without a key, and a cannula or a simple or reservoir mask
 * is set by its oxygen flow, the FiO2 it gives not fixed (common practice, no source). One finding
 * over the number and its unit (not one for each), with a fix that writes `fio2`, the only key of
 * the section that takes %; as `percentAfterCommaIssue` does after a comma.
 */
function percentAfterFlowIssue(source: string, start: number, end: number, device: string): SyntaxIssue {
  const written = source.slice(start, end);
  const setByFlow = SET_BY_FLOW[canonicalWord(fieldFor('oxygen', 'device')!, device) ?? ''];
  const message = setByFlow !== undefined
    ? `\`${written}\` after the flow of \`${device}\` is not read: ${setByFlow} is set by its oxygen flow, a percentage is not one of its settings, and the FiO2 it gives is not fixed. If it is an FiO2 measured or worked out, write \`fio2 ${written}\`.`
    : `\`${written}\` after the number of \`${device}\` is not read: only the number right after the device is read without a key. A percentage on an oxygen line can only be the FiO2: write \`fio2 ${written}\`.`;
  return {
    check: 'stray-text',
    span: { start, end },
    message,
    fixes: [{ title: `Write \`fio2 ${written}\``, edits: [{ span: { start, end: start }, newText: 'fio2 ' }], preferred: true }],
  };
}

/**
 * The canonical key of the one field of `section` that takes the unit spelt `unitText`, or null
 * where none does or several do (`cmH2O` on a vent line: PEEP, plateau, peak...). A unit names its
 * field only where no other field of the section takes it: `L/min` on an oxygen line is the flow,
 * `mL` on a vent line the tidal volume. Memoised by section and spelling (a bounded set: the
 * spellings looked up are known units).
 */
function onlyKeyTaking(section: SectionId, unitText: string): string | null {
  const units = unitsForSpelling(unitText);
  if (units.length === 0) return null;
  const memoKey = `${section} ${unitText}`;
  const known = KEY_OF_UNIT.get(memoKey);
  if (known !== undefined) return known;
  let owner: FieldDef | null = null;
  let several = false;
  for (const field of FIELDS) {
    // A range (`target 88-92`) is never one number: a lone `40 %` is no SpO2 target.
    if (!field.sections.includes(section) || field.join === 'dash' || !units.some((u) => field.units?.includes(u.id) === true)) continue;
    if (owner !== null) several = true;
    owner = field;
  }
  const key = several || owner === null ? null : owner.aliases[0]!;
  KEY_OF_UNIT.set(memoKey, key);
  return key;
}

const KEY_OF_UNIT = new Map<string, string | null>();

/**
 * A number with its unit and no key, where the unit is taken by one key of the section alone
 * (`onlyKeyTaking`): one finding over both, not one for the number and another for its unit read as
 * an unknown key, with a fix that writes that key before the number.
 */
function keyOfUnitIssue(source: string, start: number, end: number, key: string, alreadyRead: boolean): SyntaxIssue {
  const written = source.slice(start, end);
  // Where the line already gives that key (`hfnc 40 L/min 50 L/min`: a second flow), the number is
  // not read, and writing the key would state it twice: offered, not preferred.
  return {
    check: 'stray-text',
    span: { start, end },
    message: alreadyRead
      ? `\`${written}\` has no key and is not read: the only key of this line that takes its unit is \`${key}\`, which the line already gives.`
      : `\`${written}\` has no key; the only key of this line that takes its unit is \`${key}\`: write \`${key} ${written}\`.`,
    fixes: [{ title: `Write \`${key} ${written}\``, edits: [{ span: { start, end: start }, newText: `${key} ` }], ...(alreadyRead ? {} : { preferred: true }) }],
  };
}

/** The key of the cardiac output, the one key of a vitals line in L/min, and the key of the oxygen flow. */
const CARDIAC_OUTPUT_KEY = FIELDS.find((f) => f.id === 'cardiac_output')!.aliases[0]!;
const OXYGEN_FLOW_KEY = FIELDS.find((f) => f.id === 'o2_flow')!.aliases[0]!;

/**
 * A number in L/min with no key on a vitals line (`vitals 4 L/min`): the only key there that takes
 * it is the cardiac output's, yet such a number is far more often an oxygen flow written in the
 * wrong section (common practice, no source). Said so, with the oxygen line offered first where
 * the number is all the line holds (`sectionWord`, the span of the line's section word; null
 * otherwise), and `co` second, neither preferred: a guess either way. Where the line gives a
 * cardiac output already, `co` is not offered.
 */
function flowOnVitalsIssue(source: string, start: number, end: number, alreadyRead: boolean, sectionWord: Span | null): SyntaxIssue {
  const written = source.slice(start, end);
  const oxygenLine = `oxygen ${OXYGEN_FLOW_KEY} ${written}`;
  const fixes: LineFix[] = [];
  if (sectionWord !== null) {
    fixes.push({ title: `Make this an oxygen line: \`${oxygenLine}\``, edits: [{ span: sectionWord, newText: 'oxygen' }, { span: { start, end: start }, newText: `${OXYGEN_FLOW_KEY} ` }] });
  }
  if (!alreadyRead) fixes.push({ title: `Write \`${CARDIAC_OUTPUT_KEY} ${written}\``, edits: [{ span: { start, end: start }, newText: `${CARDIAC_OUTPUT_KEY} ` }] });
  return {
    check: 'stray-text',
    span: { start, end },
    message: alreadyRead
      ? `\`${written}\` has no key and is not read; a flow in L/min on a vitals line is more likely an oxygen flow written in the wrong section: write it on an oxygen line, \`${oxygenLine}\` (the line gives its cardiac output already).`
      : `\`${written}\` has no key; a flow in L/min on a vitals line is more likely an oxygen flow written in the wrong section than a cardiac output: write it on an oxygen line, \`${oxygenLine}\`, or as \`${CARDIAC_OUTPUT_KEY} ${written}\` if it is a cardiac output.`,
    fixes,
  };
}

/** Whether one of the first `count` items read on the line holds the key `key` (canonical). */
function keyRead(items: readonly (Item | undefined)[], count: number, key: string): boolean {
  for (let k = 0; k < count; k++) if (items[k]!.keyName === key) return true;
  return false;
}

/**
 * `source` is the text of the line (spans and numbers' texts refer to it). `digitAfterComma`: whether
 * the lexer saw a digit right after a comma in it (`LEXED`), without which no number has a decimal comma.
 */
function parseItems(section: SectionId, chunks: readonly Word[], start: number, issues: SyntaxIssue[], source: string, digitAfterComma: boolean): readonly ItemNode[] {
  let i = start;
  const n = chunks.length;
  /** Where the line's words end (before a comment, and before a full stop left out at its end). */
  const limit = n > 0 ? chunks[n - 1]!.end : 0;
  // Read into scratch space (reused from line to line: parseItems never nests), then copied into
  // a list of the exact length, kept as long as the line.
  const items = ITEMS;
  let count = 0;
  const fields = knownFieldsOf(section);


  // Shorthand gas: abg 7.28/56/71/26 [kPa]
  if ((section === 'abg' || section === 'vbg') && chunks[start]) {
    const group = groupAt(chunks, start, source, true);
    const glued = GROUP.unit;
    if (group) {
      i = start + GROUP.used;
      if (group.count < 2 || group.count > 4) {
        issues.push({ check: 'bad-shorthand', span: { start: group.start, end: group.end }, message: `A shorthand gas has 2 to 4 numbers (pH/PCO2/PO2/HCO3); this one has ${group.count}.`, fixes: NONE });
      } else {
        const unit = unitAfter(glued, chunks, i, section, source);
        i += UNIT_CHUNKS;
        // From the numbers the group read (GROUP_NUMBERS), without building them.
        for (let k = 0; k < group.count; k++) {
          const keyName = SHORTHAND_KEYS[k]!;
          const isPressure = keyName === 'pco2' || keyName === 'po2';
          const p = GROUP_NUMBERS;
          // Positions come back from the list whole but maybe as floating-point (it holds values too): `compact` keeps them unboxed.
          const start = compact(p[4 * k + 1]!);
          const end = compact(p[4 * k + 2]!);
          const known = SHORTHAND_KNOWN[k]!;
          const field = known >= 0 ? fields[known] ?? null : fieldFor(section, keyName) ?? null;
          items[count++] = new Item(null, keyName, SHORTHAND, field, null, source, p[4 * k]!, end, p[4 * k + 3] === 1, isPressure ? unit : null, start);
        }
      }
    }
  }

  // Where the numbers read after a device that is set by neither its FiO2 nor a percentage end
  // (`mask 10 L/min`): a percentage right there is reported as one finding (`percentAfterFlowIssue`).
  let afterDeviceNumber = -1;
  // Oxygen device first: oxygen cannula 4 L/min, oxygen room air
  if (section === 'oxygen') {
    const dev = deviceWordAt(chunks, start);
    if (dev) {
      i = start + dev.used;
      const value: WordValue = new WordNode(dev.text, dev.span);
      items[count++] = otherItem(null, 'device', DEVICE, fieldFor(section, 'device') ?? null, value, null, dev.span.start);
      const next = chunks[i];
      if (next && !next.afterComma) {
        const length = numberChunk(next);
        if (length > 0) {
          const number = SCANNED.value;
          const comma = SCANNED.decimalComma;
          i++;
          const unit = unitAfter(gluedUnit(next, length), chunks, i, section, source);
          i += UNIT_CHUNKS;
          // The device by its usual name (`venturi mask` is `venturi`).
          const deviceWord = canonicalWord(fieldFor(section, 'device')!, dev.text) ?? lowerCase(dev.text);
          const highFlow = deviceWord !== 'cpap' && deviceWord !== 'venturi' && isHighFlowDevice(section, dev.text);
          const percent = highFlow && isPercent(unit);
          const keyName = deviceWord === 'cpap' ? 'level' : deviceWord === 'venturi' ? venturiNumberKey(number, unit) : percent ? 'fio2' : 'flow';
          items[count++] = numberItem(null, keyName, DEVICE_FLOW, fieldFor(section, keyName) ?? null, source, number, next.start + length, comma, unit, next.start);
          if (!highFlow && deviceWord !== 'venturi') afterDeviceNumber = i;
          // A bare number of a Venturi setting (`venturi 28`), read as the FiO2 in % and said (PN321)
          // once what follows it is known: a flow after it (`venturi 28 8 L/min`) changes its fixes.
          const bareSetting = keyName === 'fio2' && unit === null && number > 1;
          let flowAfter: Item | null = null;
          if (deviceWord === 'venturi') {
            // `venturi 8 L/min 28 %`, `venturi 28 % 8 L/min`, `venturi 28 8 L/min`: a Venturi mask is
            // set by the FiO2 it gives and the flow its valve asks for, so a second number whose unit
            // says it is the other setting is read as it, each without its key (as after `hfnc`).
            // Not a bare second number (`venturi 8 L/min 28`, `venturi 28 8`).
            const second = chunks[i];
            const secondLength = second && !second.afterComma ? numberChunk(second) : 0;
            if (secondLength > 0) {
              const secondNumber = SCANNED.value;
              const secondComma = SCANNED.decimalComma;
              const secondUnit = unitAfter(gluedUnit(second!, secondLength), chunks, i + 1, section, source);
              if (secondUnit !== null && isPercent(secondUnit) !== (keyName === 'fio2')) {
                i += 1 + UNIT_CHUNKS;
                const secondKey = keyName === 'fio2' ? 'flow' : 'fio2';
                const other = numberItem(null, secondKey, DEVICE_FLOW, fieldFor(section, secondKey) ?? null, source, secondNumber, second!.start + secondLength, secondComma, secondUnit, second!.start);
                items[count++] = other;
                if (secondKey === 'flow') flowAfter = other;
              }
            }
          }
          if (bareSetting) issues.push(venturiSettingIssue(dev.text, source, next.start, next.start + length, flowAfter));
          if (highFlow) {
            // `hfnc 40 L/min 60 %`, `hfnc 60 % 40 L/min`: a flow and a percentage, each without its key.
            const second = chunks[i];
            const secondLength = second && !second.afterComma ? numberChunk(second) : 0;
            let other: Item | null = null;
            if (secondLength > 0) {
              const secondNumber = SCANNED.value;
              const secondComma = SCANNED.decimalComma;
              const secondUnit = unitAfter(gluedUnit(second!, secondLength), chunks, i + 1, section, source);
              if (isPercent(secondUnit) !== percent) {
                i += 1 + UNIT_CHUNKS;
                const secondKey = percent ? 'flow' : 'fio2';
                other = numberItem(null, secondKey, DEVICE_FLOW, fieldFor(section, secondKey) ?? null, source, secondNumber, second!.start + secondLength, secondComma, secondUnit, second!.start);
                items[count++] = other;
              }
            }
            const fio2 = percent ? items[count - (other === null ? 1 : 2)]! : other;
            if (fio2 !== null) issues.push(highFlowPercentIssue(dev.text, source, fio2, other === null, percent ? other : null));
          }
        }
      }
    }
  }

  while (i < n) {
    const chunk = chunks[i]!;
    if (chunk.text.indexOf('<') >= 0 && isPlaceholder(chunk.text)) {
      // `oxygen cannula <flow> L/min`, `abg 7.31/<PaCO2>/<PaO2>/<HCO3>`: a snippet's placeholders
      // left as they were, with the unit after them: one finding.
      i = placeholderIssue(chunks, i, null, issues);
      continue;
    }
    // Most words here are keys: one that starts with no number is no number and no slash group either.
    if (scanWord(chunk) > 0 && (numberChunk(chunk) > 0 || readSlashGroup(chunk, source))) {
      const feet = count > 0 ? feetAndInchesIssue(items[count - 1]!, chunk, source) : null;
      if (feet !== null) {
        issues.push(feet);
        // The inches' unit (`in`) is part of what the finding names: no unknown key of its own.
        while (i < n && chunks[i]!.start < feet.span.end) i++;
        continue;
      }
      if (section === 'oxygen' && (chunk.afterComma || i === afterDeviceNumber)) {
        const length = numberChunk(chunk);
        const unit = length > 0 ? unitAfter(gluedUnit(chunk, length), chunks, i + 1, section, source) : null;
        if (isPercent(unit)) {
          issues.push(chunk.afterComma ? percentAfterCommaIssue(source, chunk.start, unit!.end, deviceOf(items, count)) : percentAfterFlowIssue(source, chunk.start, unit!.end, deviceOf(items, count)!));
          i += 1 + UNIT_CHUNKS;
          continue;
        }
      }
      // `oxygen 4 L/min`, `vent 450 mL`: a number with a unit and no key, where one key of the
      // section alone takes that unit, is one finding over both, with a fix that writes that key.
      const ownedLength = numberChunk(chunk);
      if (ownedLength > 0) {
        const unit = unitAfter(gluedUnit(chunk, ownedLength), chunks, i + 1, section, source);
        const owner = unit === null ? null : onlyKeyTaking(section, unit.text);
        if (owner !== null) {
          const alreadyRead = keyRead(items, count, owner);
          // `vitals 4 L/min`: more likely an oxygen flow than a cardiac output (the oxygen line is
          // offered where the number and its unit are all the line holds).
          issues.push(section === 'vitals' && owner === CARDIAC_OUTPUT_KEY
            ? flowOnVitalsIssue(source, chunk.start, unit!.end, alreadyRead, i === start && i + 1 + UNIT_CHUNKS === n ? chunks[0]!.span : null)
            : keyOfUnitIssue(source, chunk.start, unit!.end, owner, alreadyRead));
          i += 1 + UNIT_CHUNKS;
          continue;
        }
      }
      const bilevel = section === 'oxygen' ? bilevelPairKeys(chunk, chunks, i, items, count) : null;
      issues.push({
        check: 'stray-text', span: chunk.span,
        message: `\`${chunk.text}\` has no key; write it as \`key value\`, e.g. \`hr 118\`.${bilevel === null ? '' : ` Did you mean \`${bilevel}\`?`}`,
        fixes: bilevel === null ? NONE : [{ title: `Write \`${bilevel}\``, edits: [{ span: chunk.span, newText: bilevel }] }],
      });
      i++;
      continue;
    }
    if (!startsLikeKey(chunk.text)) {
      const meant = asciiNumberOf(chunk.text);
      if (meant !== null) {
        // `hr ８０`, `hr ٨٠`: a number typed with digits of another script (a keyboard or an input method).
        const span = { start: chunk.start, end: chunk.start + meant.length };
        issues.push({
          check: 'stray-text', span,
          message: `\`${chunk.text.slice(0, meant.length)}\` is written with digits other than 0–9, which are not read as a number; write \`${meant.text}\`.`,
          fixes: [{ title: `Write \`${meant.text}\``, edits: [{ span, newText: meant.text }], preferred: true }],
        });
        i++;
        continue;
      }
      if (source.charCodeAt(chunk.start) === 0x28 /* ( */ && bracketAt(source, chunk.start, limit, section) !== NO_BRACKET) {
        // `hr 80 (93)`, `bp 120/80, (93)`: a number in brackets that follows no blood pressure, as one finding.
        const end = chunksThrough(chunks, i, BRACKET.end);
        issues.push(misplacedBracketIssue(source, chunk.start, end));
        i += BRACKET_CHUNKS;
        continue;
      }
      // `/`, `-`, `(sitting)`: punctuation is never a key (and a did-you-mean would turn it into one).
      issues.push({ check: 'stray-text', span: chunk.span, message: `\`${chunk.text}\` is not a key; write items as \`key value\`, e.g. \`hr 118\`.`, fixes: NONE });
      i++;
      continue;
    }
    const key = chunk;
    const field = fieldOfWord(section, fields, chunk);
    i++;
    const next = chunks[i];
    let value: PairValue | WordValue | null = null;
    let unit: Located | null = null;
    if (next && !next.afterComma) {
      if (field?.kind === 'word') {
        if (fieldOfWord(section, fields, next) === null || (field.words?.[lowerCase(next.text)] !== undefined)) {
          if (field.id === 'device') {
            const dev = deviceWordAt(chunks, i);
            const used = dev?.used ?? 1;
            const span = dev?.span ?? next.span;
            value = new WordNode(dev?.text ?? next.text, span);
            i += used;
          } else {
            value = new WordNode(next.text, next.span);
            i++;
          }
        }
      } else {
        // `bp 120 / 80`: a pair may be written with blanks around its slash. A word that does not start
        // with a number starts no group, nor does a number that is the whole word unless the key takes
        // a pair; then SCANNED still holds what `scanWord` read.
        const lead = scanWord(next);
        const tryGroup = lead > 0 && (lead < next.end - next.start || field?.kind === 'pair');
        // A range (`target 88-92`) is joined by a dash, never by a slash.
        const dashed = field?.join === 'dash';
        // A slash group there (`target 88/92`) is read as any pair is, and reported (PN102).
        const group = !tryGroup ? null : (dashed ? readDashGroup(next, source) ?? readSpacedDashGroup(chunks, i, source) : null) ?? groupAt(chunks, i, source, field?.kind === 'pair', field?.id === 'bp' ? limit : -1);
        const glued = GROUP.unit;
        const used = GROUP.used;
        const length = group ? 0 : tryGroup ? numberChunk(next) : lead;
        if (group) {
          value = group;
          i += used;
          unit = unitAfter(glued, chunks, i, section, source);
          i += UNIT_CHUNKS;
          if (field?.kind === 'number') {
            // `hr 80/90`: numbers joined by a slash where the key takes one; nothing would be read from it.
            issues.push({ check: 'missing-value', span: { start: key.start, end: group.end }, message: `\`${key.text}\` takes one number; \`${group.text}\` is ${countWord(group.count)} numbers, so it is not read.`, fixes: NONE });
          } else if (dashed && !group.dashed) {
            // `target 88/92`: a range is joined by a dash; nothing is read from it.
            issues.push({ check: 'missing-value', span: { start: key.start, end: group.end }, message: rangeShapeMessage(key.text, group.text), fixes: NONE });
          } else if (field?.kind === 'pair' && group.count !== 2) {
            // `bp 120/80/60`: a pair is two numbers; a third would otherwise be dropped in silence.
            issues.push({ check: 'missing-value', span: { start: key.start, end: group.end }, message: `\`${key.text}\` takes two numbers joined by a slash (\`${key.text} 120/80\`); \`${group.text}\` is ${countWord(group.count)}, so it is not read.`, fixes: NONE });
          }
          if (field?.id === 'bp' && group.count === 2) {
            // `bp 120/80 (93)`: the measured mean in brackets after the blood pressure, read as `map 93`;
            // also glued to the pair or its unit (`120/80(93)`, `120/80 mmHg(93)`: cut off the unit).
            const cut = unit === null ? -1 : unit.text.indexOf('(');
            const after = chunks[i];
            // `120/80 mm Hg(93)`: glued to the second word of a unit of two words, which ends there.
            const second = unit !== null && cut < 0 && after !== undefined && !after.afterComma ? after.text.indexOf('(') : -1;
            const twoWords = unit !== null && second > 0 && isKnownUnitSpelling(`${unit.text} ${after!.text.slice(0, second)}`);
            const open = twoWords ? after!.start + second : unit !== null && cut >= 0 ? unit.start + cut : after !== undefined && !after.afterComma ? after.start : -1;
            const found = bracketAt(source, open, limit, section);
            if (found !== NO_BRACKET && (found !== CLOSED || fieldFor(section, 'map') !== undefined)) {
              if (twoWords) unit = token(source.slice(unit!.start, open), unit!.start, open);
              else if (unit !== null && cut >= 0) unit = cut === 0 ? null : token(unit.text.slice(0, cut), unit.start, open);
              items[count++] = otherItem(key.text, key.text, WRITTEN, field, value, unit, key.start);
              const mean = found === CLOSED ? bracketedMean(source, section) : null;
              if (mean !== null) items[count++] = mean;
              const end = chunksThrough(chunks, i, BRACKET.end);
              if (found === UNCLOSED) issues.push(unclosedMeanIssue(source, open, end));
              else if (found === GLUED) issues.push(gluedMeanIssue(source, open, end));
              i += BRACKET_CHUNKS;
              continue;
            }
          }
        } else if (length > 0) {
          const number = SCANNED.value;
          const comma = SCANNED.decimalComma;
          i++;
          unit = unitAfter(gluedUnit(next, length), chunks, i, section, source);
          i += UNIT_CHUNKS;
          items[count++] = numberItem(key.text, key.text, WRITTEN, field, source, number, next.start + length, comma, unit, key.start);
          if (field?.kind === 'pair') {
            // `bp 120`: a key that takes two numbers with one; nothing would be read from it.
            issues.push({ check: 'missing-value', span: { start: key.start, end: next.start + length }, message: dashed ? rangeShapeMessage(key.text, next.text.slice(0, length)) : `\`${key.text}\` takes two numbers joined by a slash (\`${key.text} 120/80\`); \`${next.text.slice(0, length)}\` is one, so it is not read.`, fixes: NONE });
          }
          continue;
        }
      }
    }
    // A key the section does not know is reported as such (PN201, with the keys or the device it
    // is near; the words of a misspelt device, `room aor`, together): that it has no value would
    // only say it twice (`oxygen roomair`).
    if (!value && field !== null) {
      const dash = next !== undefined && !next.afterComma && field.kind === 'number' ? dashBeforeNumber(next.text) : null;
      if (next !== undefined && !next.afterComma && isPlaceholder(next.text)) {
        // `vt <VT> mL`: a snippet's placeholder left as it was. One finding over the key, the
        // placeholder and its unit, rather than a key without a value, a stray word and a unit read as a key.
        i = placeholderIssue(chunks, i, key, issues);
      } else if (dash !== null) {
        // `be –5`: a minus sign a word processor turned into a dash. One finding, on the number, with
        // the fix, rather than a key without a value and a stray word.
        const meant = `-${next!.text.slice(1)}`;
        issues.push({
          check: 'stray-text', span: next!.span,
          message: `\`${next!.text}\` starts with ${dash}, which is not read as a minus sign, so \`${key.text}\` has no value; write \`${meant}\`.`,
          fixes: [{ title: `Write \`${meant}\``, edits: [{ span: { start: next!.start, end: next!.start + 1 }, newText: '-' }], preferred: true }],
        });
        i++;
      } else {
        issues.push({ check: 'missing-value', span: key.span, message: `\`${key.text}\` has no value.`, fixes: NONE });
      }
    }
    items[count++] = otherItem(key.text, key.text, WRITTEN, field, value, unit, key.start);
  }

  // Decimal commas anywhere in the line's numbers (few lines have one: asked of each item without building its number).
  for (let k = 0; digitAfterComma && k < count; k++) {
    const item = items[k]!;
    if (!item.hasDecimalComma()) continue;
    const value = item.value;
    const numbers: readonly NumberValue[] = value?.kind === 'number' ? [value] : value?.kind === 'pair' ? value.parts : NONE;
    for (const num of numbers) {
      if (!num.decimalComma) continue;
      const fixed = num.text.replace(',', '.');
      const thousands = value?.kind === 'number' ? thousandsReading(item.field, num.text, item.unitText) : null;
      if (thousands !== null) {
        // `altitude 1,650 m`: read as 1.650 it would be used as a plausible value the writer never meant.
        const whole = String(thousands);
        issues.push({
          check: 'decimal-comma',
          span: num.span,
          message: `\`${num.text}\` may be ${whole} written with a thousands separator or ${fixed} with a decimal comma; it is not used in calculations until it is written as one of them.`,
          fixes: [
            { title: `Write \`${whole}\``, edits: [{ span: num.span, newText: whole }] },
            { title: `Write \`${fixed}\``, edits: [{ span: num.span, newText: fixed }] },
          ],
        });
        continue;
      }
      issues.push({
        check: 'decimal-comma',
        span: num.span,
        message: `\`${num.text}\` uses a decimal comma; Pneumark reads it as ${fixed}, but a comma also separates items, so write a decimal point.`,
        fixes: [{ title: `Write \`${fixed}\``, edits: [{ span: num.span, newText: fixed }], preferred: true }],
      });
    }
  }
  if (count === 0) return NONE;
  const kept = new Array<ItemNode>(count);
  for (let k = 0; k < count; k++) {
    kept[k] = items[k]!;
    items[k] = undefined;
  }
  return kept;
}

/** A number with a comma before exactly three digits (`1,650`): also how a thousands separator is written. */
const THOUSANDS_LIKE = /^[-+−]?[0-9]{1,3},[0-9]{3}$/u;

/**
 * The reading of a number written like `1,650` with its comma as a thousands separator (1650), when
 * that reading is possible for the field (within its hard bounds) in the unit written or, with no
 * unit written, in a unit the field takes; null otherwise. Such a number is ambiguous: it is reported
 * with both readings (PN103) and not used until it is rewritten. Where the thousands reading is
 * impossible the comma is a decimal comma, as for any other number (`ph 7,352` is pH 7.352).
 */
export function thousandsReading(field: FieldDef | null, text: string, unitText: string | null): number | null {
  if (field === null || field.kind !== 'number' || !field.hard || !THOUSANDS_LIKE.test(text)) return null;
  const value = Number(text.replace(',', '').replace('−', '-'));
  const possible = unitsWithin(field, value, null, field.hard);
  const fits = unitText === null ? possible.length > 0 : unitsForSpelling(unitText).some((u) => possible.includes(u));
  return fits ? value : null;
}

/**
 * `height 5 ft 10 in`: the inches written after a length in feet (a number of 0 to under 12, bare or
 * followed by `in`, `inch` or `inches`, glued or after blanks, maybe after a comma), read from the
 * line from `feetEnd`, where the unit `ft` ends; null when no such inches follow. A value of the
 * format is one number and one unit, so the parser reports them (`feetAndInchesIssue`) and the
 * reader keeps the feet alone out of calculations: 5 ft is not the height meant. 1 ft = 12 in.
 */
export function inchesAfterFeet(source: string, feetEnd: number): { readonly inches: number; readonly end: number } | null {
  let at = feetEnd;
  while (isBlank(source.charCodeAt(at))) at++;
  if (source.charCodeAt(at) === 0x2c /* , */) {
    at++;
    while (isBlank(source.charCodeAt(at))) at++;
  }
  const numberStart = at;
  while (isDigit(source.charCodeAt(at))) at++;
  if (at === numberStart) return null;
  if (source.charCodeAt(at) === 0x2e /* . */ && isDigit(source.charCodeAt(at + 1))) {
    at++;
    while (isDigit(source.charCodeAt(at))) at++;
  }
  const inches = Number(source.slice(numberStart, at));
  if (!(inches < 12)) return null;
  let end = at;
  while (isBlank(source.charCodeAt(end))) end++;
  const word = /^[A-Za-z]+/.exec(source.slice(end, end + 8))?.[0] ?? '';
  if (word !== '') {
    if (!unitsForSpelling(word).some((u) => u.id === 'in')) return null;
    end += word.length;
  } else end = at;
  // The inches end where the item would: at a blank, a comma, a comment or the end of the line.
  const next = source.charCodeAt(end);
  return Number.isNaN(next) || isBlank(next) || next === 0x2c /* , */ || next === 0x23 /* # */ ? { inches, end } : null;
}

/** The finding on inches written after a height in feet (`inchesAfterFeet`), with the height in inches offered; null when none follow. */
function feetAndInchesIssue(previous: Item, chunk: Word, source: string): SyntaxIssue | null {
  const feet = previous.number;
  if (feet === null || previous.field?.id !== 'height' || previous.unitText === null || !unitsForSpelling(previous.unitText).some((u) => u.id === 'ft')) return null;
  const inches = inchesAfterFeet(source, previous.end);
  if (inches === null || inches.end <= chunk.start) return null;
  const total = Math.round((feet * 12 + inches.inches) * 100) / 100;
  const from = previous.value?.span.start ?? previous.start;
  const written = source.slice(from, inches.end);
  const span = { start: chunk.start, end: inches.end };
  return {
    check: 'stray-text',
    span,
    message: `\`${written}\` is read as ${previous.value?.text ?? feet} ${previous.unitText}: feet and inches are not read together. Write the height in one unit, \`${total} in\` (${Math.round(total * 2.54)} cm); until then it is not used in calculations.`,
    fixes: [{ title: `Write \`${total} in\``, edits: [{ span: { start: from, end: inches.end }, newText: `${total} in` }], preferred: true }],
  };
}

/** The items of the line `parseItems` reads (emptied before it returns). */
const ITEMS: (Item | undefined)[] = [];
