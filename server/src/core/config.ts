/**
 * The project file `pneumark.config.json`: data only, parsed and validated with zod, never
 * executed. Keys such as `__proto__` cannot reach an object's prototype: the JSON is parsed
 * into plain data and validated against a strict schema, and only the validated copy is used.
 * Problems come back with the range they concern, for a diagnostic on the file itself.
 */
import { z } from 'zod';
import { CHECKS } from './checks/registry';
import { HINT_CATEGORIES, type HintCategory } from './service/types';
import { settingsSchema, type Settings } from './settings';
import type { Range } from './types';

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

const WHOLE_FIRST_LINE: Range = { start: { line: 0, character: 0 }, end: { line: 0, character: 1 } };

export function parseProjectConfig(text: string): ParsedConfig {
  let data: unknown;
  try {
    data = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    return { settings: {}, hints: {}, problems: [{ message: `${CONFIG_FILE_NAME} is not valid JSON (${message}); Pneumark uses its defaults.`, range: rangeOfJsonError(text, message) }] };
  }
  const parsed = projectConfigSchema.safeParse(data);
  // Looked for even when another setting is invalid, so that one reading names every problem.
  const unknownChecks = unknownDisabledChecks(text, data);
  if (!parsed.success) {
    return {
      settings: {},
      hints: {},
      problems: [...parsed.error.issues.map((issue) => {
        const key = issue.path.length > 0 ? String(issue.path[issue.path.length - 1]) : (issue.code === 'unrecognized_keys' ? (issue as { keys?: string[] }).keys?.[0] ?? '' : '');
        const where = issue.path.length > 0 ? `\`${issue.path.join('.')}\`` : 'the file';
        return { message: `${CONFIG_FILE_NAME}: ${where}: ${issue.message}. Pneumark uses its defaults until this is fixed.`, range: rangeOfKey(text, key) };
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

/**
 * Names in `disabledChecks` that are no check's code or alias, with where they are written: the
 * runner ignores them, so without a word a typo (`PN 101`) would leave the check on.
 */
function unknownDisabledChecks(text: string, data: unknown): ConfigProblem[] {
  if (typeof data !== 'object' || data === null || !Object.prototype.hasOwnProperty.call(data, 'disabledChecks')) return [];
  const listed = settingsSchema.shape.disabledChecks.safeParse((data as { disabledChecks?: unknown }).disabledChecks);
  if (!listed.success) return []; // reported by the schema's validation
  return listed.data
    .filter((name) => !CHECK_NAMES.has(name.toLowerCase()))
    .map((name) => {
      const needle = JSON.stringify(name);
      const at = text.indexOf(needle);
      return {
        message: `${CONFIG_FILE_NAME}: \`disabledChecks\`: ${needle} is not the code or alias of a check (see docs/checks.md), so it switches nothing off.`,
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
 * Where JSON.parse failed: the position its message gives (`… in JSON at position N`), else (the
 * messages of Node 20 and later that quote the text instead, `Unexpected token 'b', "…" is not
 * valid JSON`, and `Unexpected end of JSON input`) the first offset where the text stops being
 * JSON, found by `jsonErrorOffset`. Offsets count from after a byte-order mark, as parsed.
 */
function rangeOfJsonError(text: string, message: string): Range {
  const bom = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  const parsed = bom === 1 ? text.slice(1) : text;
  const m = /at position (\d+)/.exec(message);
  const offset = m?.[1] !== undefined ? Number(m[1]) : jsonErrorOffset(parsed);
  if (offset === null) return WHOLE_FIRST_LINE;
  const at = Math.min(offset + bom, text.length);
  return rangeOfOffsets(text, at, Math.min(at + 1, text.length));
}

const enum Json {
  /** A value is expected. */
  Value,
  /** After `{`: a key or `}`. */
  FirstKey,
  /** After `,` in an object: a key. */
  Key,
  /** After a key: `:`. */
  Colon,
  /** After a value in an object: `,` or `}`. */
  AfterMember,
  /** After `[`: a value or `]`. */
  FirstElement,
  /** After a value in an array: `,` or `]`. */
  AfterElement,
  /** After the top-level value: nothing but blanks. */
  End,
}

/**
 * The offset of the first character where `text` stops being valid JSON (RFC 8259), the length of
 * the text when it ends too early, or null when it is valid. Iterative: nesting depth costs no stack.
 */
export function jsonErrorOffset(text: string): number | null {
  /** Open containers: true for an object. */
  const open: boolean[] = [];
  let state: Json = Json.Value;
  let i = 0;
  const n = text.length;
  const afterValue = (): Json => (open.length === 0 ? Json.End : open[open.length - 1] ? Json.AfterMember : Json.AfterElement);
  while (true) {
    while (i < n) {
      const c = text.charCodeAt(i);
      if (c !== 0x20 && c !== 0x09 && c !== 0x0a && c !== 0x0d) break;
      i++;
    }
    if (i >= n) return state === Json.End ? null : n;
    const c = text.charCodeAt(i);
    switch (state) {
      case Json.End:
        return i;
      case Json.Colon:
        if (c !== 0x3a) return i;
        i++;
        state = Json.Value;
        continue;
      case Json.AfterMember:
      case Json.AfterElement: {
        const close = state === Json.AfterMember ? 0x7d : 0x5d;
        if (c === 0x2c) { i++; state = state === Json.AfterMember ? Json.Key : Json.Value; continue; }
        if (c !== close) return i;
        i++;
        open.pop();
        state = afterValue();
        continue;
      }
      case Json.FirstKey:
      case Json.Key: {
        if (c === 0x7d && state === Json.FirstKey) { i++; open.pop(); state = afterValue(); continue; }
        if (c !== 0x22) return i;
        const end = stringEnd(text, i);
        if (end < 0) return -end - 1;
        i = end;
        state = Json.Colon;
        continue;
      }
      case Json.FirstElement:
        if (c === 0x5d) { i++; open.pop(); state = afterValue(); continue; }
        state = Json.Value;
        continue;
      case Json.Value: {
        if (c === 0x7b) { i++; open.push(true); state = Json.FirstKey; continue; }
        if (c === 0x5b) { i++; open.push(false); state = Json.FirstElement; continue; }
        let end: number;
        if (c === 0x22) end = stringEnd(text, i);
        else if (c === 0x2d || (c >= 0x30 && c <= 0x39)) end = numberEnd(text, i);
        else end = literalEnd(text, i);
        if (end < 0) return -end - 1;
        i = end;
        state = afterValue();
        continue;
      }
    }
  }
}

/** The end of the string starting at `at` (a `"`), or -(offset of the error) - 1. */
function stringEnd(text: string, at: number): number {
  let i = at + 1;
  while (i < text.length) {
    const c = text.charCodeAt(i);
    if (c === 0x22) return i + 1;
    if (c < 0x20) return -i - 1;
    if (c === 0x5c) {
      const e = text.charCodeAt(i + 1);
      if (e === 0x75) {
        for (let k = 2; k < 6; k++) if (!isHexDigit(text.charCodeAt(i + k))) return -Math.min(i + k, text.length) - 1;
        i += 6;
        continue;
      }
      if (e !== 0x22 && e !== 0x5c && e !== 0x2f && e !== 0x62 && e !== 0x66 && e !== 0x6e && e !== 0x72 && e !== 0x74) return -Math.min(i + 1, text.length) - 1;
      i += 2;
      continue;
    }
    i++;
  }
  return -text.length - 1;
}

/** The end of the number starting at `at`, or -(offset of the error) - 1. */
function numberEnd(text: string, at: number): number {
  let i = at;
  if (text.charCodeAt(i) === 0x2d) i++;
  if (text.charCodeAt(i) === 0x30) i++;
  else if (isDigitCode(text.charCodeAt(i))) while (isDigitCode(text.charCodeAt(i))) i++;
  else return -Math.min(i, text.length) - 1;
  if (text.charCodeAt(i) === 0x2e) {
    i++;
    if (!isDigitCode(text.charCodeAt(i))) return -Math.min(i, text.length) - 1;
    while (isDigitCode(text.charCodeAt(i))) i++;
  }
  if ((text.charCodeAt(i) | 0x20) === 0x65) {
    i++;
    if (text.charCodeAt(i) === 0x2b || text.charCodeAt(i) === 0x2d) i++;
    if (!isDigitCode(text.charCodeAt(i))) return -Math.min(i, text.length) - 1;
    while (isDigitCode(text.charCodeAt(i))) i++;
  }
  return i;
}

/** The end of `true`, `false` or `null` at `at`, or -(offset of the first wrong character) - 1. */
function literalEnd(text: string, at: number): number {
  const word = text.charCodeAt(at) === 0x74 ? 'true' : text.charCodeAt(at) === 0x66 ? 'false' : text.charCodeAt(at) === 0x6e ? 'null' : '';
  if (!word) return -at - 1;
  for (let k = 1; k < word.length; k++) if (text.charCodeAt(at + k) !== word.charCodeAt(k)) return -Math.min(at + k, text.length) - 1;
  return at + word.length;
}

function isDigitCode(c: number): boolean {
  return c >= 0x30 && c <= 0x39;
}

function isHexDigit(c: number): boolean {
  return (c >= 0x30 && c <= 0x39) || ((c | 0x20) >= 0x61 && (c | 0x20) <= 0x66);
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
