/**
 * What `check --redact` writes in place of a note's own words: findings, and the texts of the
 * timepoints of `check --format json`, with every part that quotes the note's free text replaced
 * by `REDACTED_WORD` (`[redacted]`, as a redacted export writes a word Pneumark does not know).
 *
 * A message quotes the note between backticks (`` `vitls` is not a section ``) and, unquoted, in two
 * places only: a timepoint's label where it names where a value was carried from (`carried from
 * LABEL, line 3`), and a ventilator mode Pneumark does not know, which is any word the writer chose
 * (`in Smithvent`). So:
 *
 * - A quoted part stays when each of its words is a word of the format (a section, a key, a unit, a
 *   known value such as `cannula` or `VC`, `day`, `@`, and `key value`, as messages write an item
 *   in general) or a number as values are written (`7,35`,
 *   `120/80`, `25:10`, `+2h30`, groups of at most four digits, not the shape of a calendar date):
 *   those are the format's own vocabulary, not the writer's. Anything else is replaced whole: a
 *   word the note misspells (`vitls`, `rrr`: a misspelt key may be a name), an unknown unit, text
 *   without a key. The suggestion that follows (`Did you mean \`rr\`?`) is a word of the format and
 *   stays. In a privacy finding (PN5xx) every quoted part is replaced, numbers too: what it quotes
 *   is what looks like an identifier (a record number, a date of birth).
 * - Every label written on an `@` line, and every mode word Pneumark does not know, is replaced
 *   wherever it stands as a whole in the text.
 * - A note that holds a backtick itself makes the pairing of backticks unsure (`` `Zor`vath` ``
 *   would leave `vath` out of the quote): there, a finding's message that holds a backtick is
 *   replaced by its check's title, and any other text that holds one by REDACTED_WORD.
 * - Fixes are left out: their titles quote what they replace, and their edits are text to put in
 *   a note that a shared report does not come with. Related places keep their ranges, their
 *   messages redacted as the finding's.
 *
 * Numbers, units, keys, check codes, line and column numbers and Pneumark's own words stay.
 */
import type { NoteResult } from '../check-note';
import { CHECKS } from '../checks/registry';
import { FIELDS } from '../fields/registry';
import { SECTIONS } from '../fields/sections';
import { UNITS } from '../fields/units';
import type { Finding } from '../types';
import { NONE } from '../util/lists';
import { REDACTED_WORD } from './columns';

/** The words of the format, in lower case (sections, keys, units, known values), each word of a phrase (`room air`) on its own. */
const FORMAT_WORDS: ReadonlySet<string> = (() => {
  // `key value`: how messages write an item in general.
  const words = new Set<string>(['day', '@', 'key', 'value']);
  const add = (phrase: string) => { for (const w of phrase.toLowerCase().split(/\s+/)) if (w !== '') words.add(w); };
  for (const s of SECTIONS) { add(s.id); for (const a of s.aliases) add(a); }
  for (const f of FIELDS) {
    for (const a of f.aliases) add(a);
    for (const [written, canonical] of Object.entries(f.words ?? {})) { add(written); add(canonical); }
  }
  for (const u of UNITS) { add(u.id); for (const a of u.aliases) add(a); }
  return words;
})();

/** A number as values are written: groups of at most four digits (a decimal point or comma inside one), joined by `/` or `:`, a sign, a `%` after. */
const NUMBER = /^[+-]?\d{1,4}(?:[.,]\d{1,4})?(?:[/:]\d{1,4}(?:[.,]\d{1,4})?)*%?$/;
/** Three groups of digits the shape of a calendar date (`12/03/61`, `4/3/2026`): replaced even outside a privacy finding. */
const DATE_LIKE = /^\d{1,2}[/.]\d{1,2}[/.]\d{2,4}$/;
/** A time offset (`+2h30`, `+45m`, `+1d`). */
const OFFSET = /^[+-](?:\d{1,3}[dhm]){1,3}\d{0,2}$/i;
/** Brackets and marks before a word that are not part of it (`(93`). */
const OPENING = new Set(['(', '[', '{', '"', "'"]);
/** Brackets and marks after a word that are not part of it (`mmHg)`, `value,`). */
const CLOSING = new Set([')', ']', '}', '"', "'", ',', ';', '.']);

/** `raw` without the brackets and marks around it. */
function bare(raw: string): string {
  let start = 0;
  let end = raw.length;
  while (start < end && OPENING.has(raw[start]!)) start++;
  while (end > start && CLOSING.has(raw[end - 1]!)) end--;
  return raw.slice(start, end);
}

/** Whether every word of a quoted part is a word of the format or a number as values are written. */
function formatOnly(quoted: string): boolean {
  const words = quoted.split(/\s+/).filter((w) => w !== '');
  if (words.length === 0) return true;
  return words.every((raw) => {
    const w = bare(raw);
    if (w === '') return false;
    if (FORMAT_WORDS.has(w.toLowerCase())) return true;
    return (NUMBER.test(w) && !DATE_LIKE.test(w)) || OFFSET.test(w);
  });
}

/** What a note writes in its own words and messages may repeat unquoted: its labels and its unknown modes. */
export interface NoteOwnWords {
  /** Longest first, so a label that holds another is replaced whole. */
  readonly phrases: readonly string[];
  /** Whether the note holds a backtick, so that a backtick in a message may be the note's own. */
  readonly quotesUnsure: boolean;
}

/** The labels written on the note's `@` lines and the words of fields that take any word (a mode) that Pneumark does not know. */
export function noteOwnWords(result: NoteResult): NoteOwnWords {
  const phrases = new Set<string>();
  let quotesUnsure = false;
  for (const line of result.analysis.tree.lines) {
    if (line.text.includes('`')) quotesUnsure = true;
    if (line.kind === 'timepoint' && line.label) {
      const label = line.label.text.trim();
      if (label !== '') phrases.add(label);
    }
  }
  const timeline = result.analysis.timeline;
  const words = (stated: readonly { readonly field: { readonly openWords?: boolean; readonly words?: Readonly<Record<string, string>> }; readonly word: string | null }[]) => {
    for (const s of stated) {
      if (s.word === null || s.field.openWords !== true) continue;
      const known = s.field.words ?? {};
      if (!Object.values(known).includes(s.word) && !(s.word.toLowerCase() in known)) phrases.add(s.word);
    }
  };
  words(timeline.header);
  for (const tp of timeline.timepoints) words(tp.stated);
  return { phrases: [...phrases].sort((a, b) => b.length - a.length), quotesUnsure };
}

function isWordChar(c: string | undefined): boolean {
  return c !== undefined && /[\p{L}\p{N}_]/u.test(c);
}

/** `text` with every whole occurrence of `phrase` (not inside a longer word) replaced by REDACTED_WORD. */
function replaceWhole(text: string, phrase: string): string {
  let out = '';
  let from = 0;
  for (let at = text.indexOf(phrase); at >= 0; at = text.indexOf(phrase, at + 1)) {
    if (at < from) continue;
    const end = at + phrase.length;
    const startsWord = isWordChar(phrase[0]) && isWordChar(text[at - 1]);
    const endsWord = isWordChar(phrase[phrase.length - 1]) && isWordChar(text[end]);
    if (startsWord || endsWord) continue;
    out += text.slice(from, at) + REDACTED_WORD;
    from = end;
  }
  return from === 0 ? text : out + text.slice(from);
}

/**
 * A text of Pneumark's (a message, a reading) with the note's own words replaced (see the header):
 * the note's labels and unknown modes, then each quoted part that is not all words of the format
 * and numbers (`everyQuote`: every quoted part).
 */
export function redactedText(text: string, own: NoteOwnWords, everyQuote = false): string {
  return redactedOrUnsure(text, own, everyQuote) ?? REDACTED_WORD;
}

/** `redactedText`, or null when the text holds a backtick and the note does too (see the header). */
function redactedOrUnsure(text: string, own: NoteOwnWords, everyQuote: boolean): string | null {
  let out = text;
  for (const phrase of own.phrases) out = replaceWhole(out, phrase);
  if (own.quotesUnsure && out.includes('`')) return null;
  return replaceQuoted(out, everyQuote);
}

const TITLE_OF: ReadonlyMap<string, string> = new Map(CHECKS.map((c) => [c.code, c.title]));

/**
 * `text` with each part between two backticks on one line replaced by REDACTED_WORD, unless it is
 * the format's own (`formatOnly`) and not `everyQuote`. A backtick with no other after it on its
 * line is left as it is, with what follows it.
 */
function replaceQuoted(text: string, everyQuote: boolean): string {
  let out = '';
  let from = 0;
  for (let open = text.indexOf('`'); open >= 0; open = text.indexOf('`', from)) {
    const close = text.indexOf('`', open + 1);
    if (close < 0) break;
    const lineEnd = text.indexOf('\n', open + 1);
    if (lineEnd >= 0 && lineEnd < close) {
      // No closing backtick on this line: this one quotes nothing.
      out += text.slice(from, lineEnd);
      from = lineEnd;
      continue;
    }
    const quoted = text.slice(open + 1, close);
    out += text.slice(from, open) + (!everyQuote && formatOnly(quoted) ? text.slice(open, close + 1) : REDACTED_WORD);
    from = close + 1;
  }
  return out + text.slice(from);
}

/** Whether a finding's check is one of the privacy checks, whose quoted parts are all replaced. */
function isPrivacyCode(code: string): boolean {
  return code.startsWith('PN5');
}

/** A finding as `check --redact` writes it: its message and its related places' messages redacted, without fixes. */
export function redactedFinding(finding: Finding, own: NoteOwnWords): Finding {
  const every = isPrivacyCode(finding.code);
  const related = finding.related?.map((r) => ({ range: r.range, message: redactedText(r.message, own, every) }));
  return {
    code: finding.code,
    severity: finding.severity,
    message: redactedOrUnsure(finding.message, own, every) ?? TITLE_OF.get(finding.code) ?? REDACTED_WORD,
    range: finding.range,
    fixes: NONE,
    docAnchor: finding.docAnchor,
    ...(related ? { related } : {}),
  };
}

/** Every string in a value made of plain objects, lists and strings (a timepoint's JSON) redacted as `redactedText` does. */
export function redactedJson(value: unknown, own: NoteOwnWords): unknown {
  if (typeof value === 'string') return redactedText(value, own);
  if (Array.isArray(value)) return value.map((v: unknown) => redactedJson(v, own));
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const [key, v] of Object.entries(value)) out[key] = redactedJson(v, own);
    return out;
  }
  return value;
}
