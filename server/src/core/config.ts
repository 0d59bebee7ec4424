/**
 * The project file `pneumark.config.json`: data only, parsed and validated with zod, never
 * executed. Keys such as `__proto__` cannot reach an object's prototype: the JSON is parsed
 * into plain data and validated against a strict schema, and only the validated copy is used.
 * Problems come back with the range they concern, for a diagnostic on the file itself.
 */
import { getLocation, printParseErrorCode, visit, type ParseErrorCode } from 'jsonc-parser';
import { z } from 'zod';
import { CHECKS } from './checks/registry';
import { HINT_CATEGORIES, type HintCategory } from './service/types';
import { settingsSchema, type Settings } from './settings';
import type { Range } from './types';
import { wordList } from './util/format';
import { editDistance } from './util/suggest';

export const CONFIG_FILE_NAME = 'pneumark.config.json';

const hintsSchema = z
  .object(Object.fromEntries(HINT_CATEGORIES.map((c) => [c, z.boolean().optional()])) as Record<HintCategory, z.ZodOptional<z.ZodBoolean>>)
  .strict();

export const projectConfigSchema = settingsSchema
  .partial()
  .extend({
    $schema: z.string().max(500).optional(),
    hints: hintsSchema.optional(),
  })
  .strict();

export type ProjectConfig = z.infer<typeof projectConfigSchema>;

export interface ConfigProblem {
  readonly message: string;
  readonly range: Range;
}

export interface ParsedConfig {
  /** Settings the file sets (empty when the file is invalid: defaults apply). */
  readonly settings: Partial<Settings>;
  readonly hints: Partial<Record<HintCategory, boolean>>;
  readonly problems: readonly ConfigProblem[];
}

/**
 * A setting's problem in plain words, the setting named before it (`must be one of "mmHg" or
 * "kPa"`), rather than zod's own (`Invalid option: expected one of "mmHg"|"kPa"`).
 */
export function settingProblem(issue: z.core.$ZodRawIssue): string {
  switch (issue.code) {
    case 'unrecognized_keys':
      return `${wordList(issue.keys.map((k) => `\`${k}\``))} ${issue.keys.length === 1 ? 'is not a setting' : 'are not settings'}${issue.path?.length ? ' here' : ''}`;
    case 'invalid_value':
      return `must be ${issue.values.length === 1 ? JSON.stringify(issue.values[0]) : `one of ${wordList(issue.values.map((v) => JSON.stringify(v)), 'or')}`}`;
    case 'invalid_union': {
      // A choice of literal values (hufnerConstant: 1.34, 1.36 or 1.39): each branch names its value.
      const values = issue.errors.flat().flatMap((e) => (e.code === 'invalid_value' ? e.values : []));
      return values.length > 0 ? `must be one of ${wordList(values.map((v) => JSON.stringify(v)), 'or')}` : 'is not one of the values it takes';
    }
    case 'too_small':
      return issue.origin === 'array' ? `must list at least ${String(issue.minimum)}` : issue.origin === 'string' ? 'must not be empty' : `must be at least ${String(issue.minimum)}`;
    case 'too_big':
      return issue.origin === 'array' ? `must list at most ${String(issue.maximum)}` : issue.origin === 'string' ? `must be at most ${String(issue.maximum)} characters long` : `must be at most ${String(issue.maximum)}`;
    case 'invalid_type':
      return `must be ${TYPE_WORDS[issue.expected] ?? 'of another kind'}`;
    default:
      return 'is not valid';
  }
}

const TYPE_WORDS: Readonly<Record<string, string>> = {
  number: 'a number', boolean: 'true or false', string: 'a string in quotes', array: 'a list in brackets', object: 'an object in braces',
};

const WHOLE_FIRST_LINE: Range = { start: { line: 0, character: 0 }, end: { line: 0, character: 1 } };

export function parseProjectConfig(file: string): ParsedConfig {
  // A byte-order mark at the start is no part of the text: editors do not show it, so positions
  // (the editor's ranges, the CLI's columns) count from after it.
  const text = file.charCodeAt(0) === 0xfeff ? file.slice(1) : file;
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (error) {
    return { settings: {}, hints: {}, problems: [notJsonProblem(text, error)] };
  }
  const parsed = projectConfigSchema.safeParse(data, { error: settingProblem });
  // Looked for even when another setting is invalid, so that one reading names every problem.
  const unknownChecks = unknownDisabledChecks(text, data);
  if (!parsed.success) {
    return {
      settings: {},
      hints: {},
      problems: [...parsed.error.issues.map((issue) => {
        const key = issue.path.length > 0 ? String(issue.path[issue.path.length - 1]) : (issue.code === 'unrecognized_keys' ? (issue as { keys?: string[] }).keys?.[0] ?? '' : '');
        const where = issue.path.length > 0 ? `\`${issue.path.join('.')}\`: ` : '';
        return { message: `${CONFIG_FILE_NAME}: ${where}${issue.message}. Pneumark uses its defaults until this is fixed.`, range: rangeOfKey(text, key) };
      }), ...unknownChecks],
    };
  }
  const { $schema: _schema, hints, ...validated } = parsed.data;
  // Only the settings the file writes: the schema's defaults must not override the editor's settings.
  const written = data as Record<string, unknown>;
  const settings: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(validated)) if (Object.prototype.hasOwnProperty.call(written, key)) settings[key] = value;
  return { settings: settings as Partial<Settings>, hints: hints ?? {}, problems: unknownChecks };
}

/** Check codes (lower case) and aliases, as `disabledChecks` matches them (see `runChecks`). */
const CHECK_NAMES: ReadonlySet<string> = new Set(CHECKS.flatMap((c) => [c.code.toLowerCase(), c.alias]));

/** A name in `disabledChecks` that is no check's code or alias, and the checks it likely meant. */
export interface UnknownCheckName {
  readonly name: string;
  /** The checks it is closest to, as `PN302 (unusual-value)` (or `unusual-value (PN302)` when the alias is what it is near); empty when none is near. */
  readonly likely: readonly string[];
}

/**
 * The names of a `disabledChecks` list that are no check's code or alias (each once, in the
 * order written), with the checks they likely meant: the same code written with a space, hyphen
 * or without its `PN` (`PN 302`, `pn-302`, `302`), or with a letter O for a zero or an l or I for
 * a one among its digits (`PN41O`, `PN3l2`), else the codes and aliases at the fewest edits
 * (one or two; one for names of three letters or fewer; a swap of two neighbours counts as one:
 * `PN220` is one edit from both PN202 and PN320), when there are at most three (`PN30` is one
 * edit from nine codes, and names none).
 */
export function unknownCheckNames(names: readonly string[]): UnknownCheckName[] {
  const out: UnknownCheckName[] = [];
  const seen = new Set<string>();
  for (const name of names) {
    const lower = name.toLowerCase();
    if (CHECK_NAMES.has(lower) || seen.has(lower)) continue;
    seen.add(lower);
    out.push({ name, likely: likelyChecks(lower) });
  }
  return out;
}

function likelyChecks(lower: string): string[] {
  const squeezed = lower.replace(/[\s_-]+/g, '');
  // `PN41O`, `PN3l2`: a letter O for a zero, an l or I for a one, among the digits of a code.
  const digits = squeezed.startsWith('pn') ? squeezed.slice(2) : squeezed;
  const read = /^[0-9oil]{3}$/.test(digits) && /[0-9]/.test(digits) ? digits.replace(/o/g, '0').replace(/[il]/g, '1') : null;
  const asCode = read !== null ? `pn${read}` : squeezed;
  const same = CHECKS.find((c) => c.code.toLowerCase() === asCode);
  if (same) return [`${same.code} (${same.alias})`];
  const limit = lower.length <= 3 ? 1 : 2;
  let best = limit + 1;
  let found: string[] = [];
  for (const c of CHECKS) {
    const toCode = editDistance(lower, c.code.toLowerCase(), limit);
    const toAlias = editDistance(lower, c.alias, limit);
    const d = Math.min(toCode, toAlias);
    if (d > limit || d > best) continue;
    const shown = toAlias < toCode ? `${c.alias} (${c.code})` : `${c.code} (${c.alias})`;
    if (d < best) { best = d; found = [shown]; } else found.push(shown);
  }
  // More than three as near: naming some of them would be a guess.
  return found.length <= 3 ? found : [];
}

/**
 * What a name in `disabledChecks` that is no check's code or alias does (nothing), and what it
 * likely meant: `"PN220" is not the code or alias of a check (see docs/checks.md), so it switches
 * nothing off. Did you mean PN202 (unknown-unit) or PN320 (pressure-unlike-altitude)?`
 */
export function unknownCheckSentence(unknown: UnknownCheckName): string {
  const said = `${JSON.stringify(unknown.name)} is not the code or alias of a check (see docs/checks.md), so it switches nothing off.`;
  return unknown.likely.length > 0 ? `${said} Did you mean ${wordList(unknown.likely, 'or')}?` : said;
}

/**
 * Names in `disabledChecks` that are no check's code or alias, with where they are written: the
 * runner ignores them, so without a word a typo (`PN 101`) would leave the check on.
 */
function unknownDisabledChecks(text: string, data: unknown): ConfigProblem[] {
  if (typeof data !== 'object' || data === null || !Object.prototype.hasOwnProperty.call(data, 'disabledChecks')) return [];
  const listed = settingsSchema.shape.disabledChecks.safeParse((data as { disabledChecks?: unknown }).disabledChecks);
  if (!listed.success) return []; // reported by the schema's validation
  return unknownCheckNames(listed.data).map((unknown) => {
    const needle = JSON.stringify(unknown.name);
    const at = text.indexOf(needle);
    return {
      message: `${CONFIG_FILE_NAME}: \`disabledChecks\`: ${unknownCheckSentence(unknown)}`,
      range: at < 0 ? WHOLE_FIRST_LINE : rangeOfOffsets(text, at, at + needle.length),
    };
  });
}

/** The range of `"key"` in the text (the first occurrence), or the first character. */
function rangeOfKey(text: string, key: string): Range {
  if (!key) return WHOLE_FIRST_LINE;
  const needle = JSON.stringify(key);
  const at = text.indexOf(needle);
  if (at < 0) return WHOLE_FIRST_LINE;
  return rangeOfOffsets(text, at, at + needle.length);
}

/**
 * The problem of a file JSON.parse refused. JSON.parse decides what is JSON (strict JSON: no
 * comments, no trailing commas), so the file reads the same in every tool; jsonc-parser, held to
 * the same rules, says where and what, as Node 20's messages often give no position. `text` has
 * no byte-order mark at its start.
 */
function notJsonProblem(text: string, error: unknown): ConfigProblem {
  const mistake = firstJsonMistake(text);
  if (!mistake) {
    const message = error instanceof Error ? error.message : String(error);
    return { message: `${CONFIG_FILE_NAME} is not valid JSON (${message}); Pneumark uses its defaults.`, range: WHOLE_FIRST_LINE };
  }
  const start = mistake.offset;
  // At least one character, so that the editor shows it; none at the very end of the text.
  const end = Math.min(Math.max(start + mistake.length, start + 1), text.length);
  return { message: `${CONFIG_FILE_NAME} is not valid JSON (${mistake.words}); Pneumark uses its defaults.`, range: rangeOfOffsets(text, start, end) };
}

interface JsonMistake {
  readonly offset: number;
  readonly length: number;
  /** What is wrong, in plain words. */
  readonly words: string;
}

const STRICT_JSON = { disallowComments: true, allowTrailingComma: false, allowEmptyContent: false } as const;

/**
 * The first mistake jsonc-parser finds in `json`, or null when it finds none or cannot look: its
 * descent is recursive, and about ten thousand open brackets exhaust the stack.
 */
function firstJsonMistake(json: string): JsonMistake | null {
  const found: { code: ParseErrorCode; offset: number; length: number }[] = [];
  try {
    visit(json, { onError: (code, offset, length) => { if (found.length === 0) found.push({ code, offset, length }); } }, STRICT_JSON);
  } catch (error) {
    if (error instanceof RangeError) return null;
    throw error;
  }
  const first = found[0];
  if (!first) return null;
  return { offset: first.offset, length: first.length, words: inPlainWords(json, printParseErrorCode(first.code), first.offset, first.length) };
}

/** What jsonc-parser's error code means at the place it gives, for someone who edits the file by hand. */
function inPlainWords(json: string, code: ReturnType<typeof printParseErrorCode>, offset: number, length: number): string {
  const found = json.slice(offset, offset + length);
  if (offset >= json.length && code !== 'UnexpectedEndOfString' && code !== 'UnexpectedEndOfComment') {
    if (/^[ \t\n\r]*$/.test(json)) return 'the file is empty; write `{}` for a project without settings of its own';
    const missing = MISSING_AT_END[code];
    return missing ? `the file ends too early: ${missing} is missing` : 'the file ends too early';
  }
  switch (code) {
    case 'InvalidCommentToken':
    case 'UnexpectedEndOfComment':
      return `comments are not allowed in ${CONFIG_FILE_NAME}`;
    case 'PropertyNameExpected':
    case 'ValueExpected': {
      const before = json.slice(0, offset).trimEnd().slice(-1);
      if (before === ',' && (found === '}' || found === ']')) return `a comma cannot come just before \`${found}\``;
      if (before === ',' && found === ',') return 'two commas with nothing between them';
      if (found === ',' && (before === '{' || before === '[')) return `a comma cannot come just after \`${before}\``;
      return code === 'ValueExpected' ? 'a value is missing' : 'a property name must be in double quotes';
    }
    case 'ColonExpected':
      return 'a colon (`:`) is missing after the property name';
    case 'CommaExpected':
      // `01` reads as the number 0 and then another number.
      if (/^[0-9]/.test(found) && json[offset - 1] === '0') return 'a number cannot start with 0 followed by more digits';
      if (found === ']') return 'a comma or `}` is expected here, not `]`';
      if (found === '}') return 'a comma or `]` is expected here, not `}`';
      return 'a comma is missing';
    case 'CloseBraceExpected':
      return 'a closing `}` is missing';
    case 'CloseBracketExpected':
      return 'a closing `]` is missing';
    case 'EndOfFileExpected':
      return MORE_AFTER_THE_END;
    case 'UnexpectedEndOfString':
      return 'a string is not closed: its closing `"` is missing before the end of the line';
    case 'UnexpectedEndOfNumber':
      return 'a number is cut short: a digit must follow `.` or `e`';
    case 'InvalidNumberFormat':
      return 'a number is not written as JSON writes numbers';
    case 'InvalidUnicode':
      return 'a `\\u` escape needs four hexadecimal digits, such as `\\u00e9`';
    case 'InvalidEscapeCharacter':
      return 'a backslash in a string must be written `\\\\` or start an escape such as `\\n`';
    case 'InvalidCharacter':
      return 'a string holds a control character such as a tab; write it as an escape such as `\\t`';
    case 'InvalidSymbol':
      return invalidSymbolInWords(json, offset, found);
    default:
      return 'this is not JSON';
  }
}

const MORE_AFTER_THE_END = 'there is more after the end of the JSON value';

/** What is missing when the text ends where jsonc-parser expected more. */
const MISSING_AT_END: Partial<Record<ReturnType<typeof printParseErrorCode>, string>> = {
  ValueExpected: 'a value',
  PropertyNameExpected: 'a property name',
  ColonExpected: 'a colon (`:`)',
  CloseBraceExpected: 'a closing `}`',
  CloseBracketExpected: 'a closing `]`',
};

/** Text that is no JSON token: an unquoted word, a single-quoted string, a number JSON does not write, a stray character. */
function invalidSymbolInWords(json: string, offset: number, found: string): string {
  const location = getLocation(json, offset);
  // At the top level, after a value: jsonc-parser skips the symbol without saying the value had ended.
  if (location.path.length === 0 && json.slice(0, offset).trim() !== '') return MORE_AFTER_THE_END;
  const atKey = location.isAtPropertyKey;
  if (found.startsWith("'")) return atKey ? 'a property name must be in double quotes, not single quotes' : 'text must be in double quotes, not single quotes';
  if (atKey) return 'a property name must be in double quotes';
  if (/^(true|false|null)$/i.test(found)) return 'true, false and null are written in lower case';
  const shown = found.length > 24 ? `${found.slice(0, 24)}…` : found;
  if (/^[A-Za-z_]/.test(found)) return `\`${shown}\` is not a value: text must be in double quotes, and the only words without them are true, false and null`;
  if (/^[-+.0-9]/.test(found)) return `\`${shown}\` is not a number as JSON writes them (such as 7, -0.5 or 2e3)`;
  const c = found.codePointAt(0) ?? 0;
  return c > 0x20 && c < 0x7f ? `\`${shown}\` has no place here` : `an unexpected character (U+${c.toString(16).toUpperCase().padStart(4, '0')})`;
}

function rangeOfOffsets(text: string, start: number, end: number): Range {
  const pos = (offset: number) => {
    let line = 0;
    let lineStart = 0;
    for (let i = 0; i < offset; i++) {
      const c = text.charCodeAt(i);
      if (c === 0x0a || (c === 0x0d && text.charCodeAt(i + 1) !== 0x0a)) { line++; lineStart = i + 1; }
    }
    return { line, character: offset - lineStart };
  };
  return { start: pos(start), end: pos(end) };
}
