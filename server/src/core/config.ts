/**
 * The project file `pneumark.config.json`: data only, parsed and validated with zod, never
 * executed. Keys such as `__proto__` cannot reach an object's prototype: the JSON is parsed
 * into plain data and validated against a strict schema, and only the validated copy is used.
 * Problems come back with the range they concern, for a diagnostic on the file itself.
 */
import { z } from 'zod';
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
  if (!parsed.success) {
    return {
      settings: {},
      hints: {},
      problems: parsed.error.issues.map((issue) => {
        const key = issue.path.length > 0 ? String(issue.path[issue.path.length - 1]) : (issue.code === 'unrecognized_keys' ? (issue as { keys?: string[] }).keys?.[0] ?? '' : '');
        const where = issue.path.length > 0 ? `\`${issue.path.join('.')}\`` : 'the file';
        return { message: `${CONFIG_FILE_NAME}: ${where}: ${issue.message}. Pneumark uses its defaults until this is fixed.`, range: rangeOfKey(text, key) };
      }),
    };
  }
  const { $schema: _schema, hints, ...validated } = parsed.data;
  // Only the settings the file writes: the schema's defaults must not override the editor's settings.
  const written = data as Record<string, unknown>;
  const settings: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(validated)) if (Object.prototype.hasOwnProperty.call(written, key)) settings[key] = value;
  return { settings: settings as Partial<Settings>, hints: hints ?? {}, problems: [] };
}

/** The range of `"key"` in the text (the first occurrence), or the first character. */
function rangeOfKey(text: string, key: string): Range {
  if (!key) return WHOLE_FIRST_LINE;
  const needle = JSON.stringify(key);
  const at = text.indexOf(needle);
  if (at < 0) return WHOLE_FIRST_LINE;
  return rangeOfOffsets(text, at, at + needle.length);
}

function rangeOfJsonError(text: string, message: string): Range {
  const m = /position (\d+)/.exec(message);
  if (!m?.[1]) return WHOLE_FIRST_LINE;
  const at = Math.min(Number(m[1]), text.length);
  return rangeOfOffsets(text, at, Math.min(at + 1, text.length));
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
