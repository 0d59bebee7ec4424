/**
 * Settings as the editor sends them (`workspace/configuration`, section `pneumark`, or pushed with
 * `workspace/didChangeConfiguration`), validated with zod key by key: a value of the wrong shape
 * never reaches the core; that key takes its default, the others apply, and the problem is logged.
 * The project file `pneumark.config.json` (see ../core/config.ts) overrides the editor's
 * analysis settings, so a team's note conventions are the same in every editor and in CI.
 */
import { z } from 'zod';
import { settingProblem, unknownCheckNames, unknownCheckSentence, type ParsedConfig } from '../core/config';
import { HINT_CATEGORIES, HINTS_OFF_BY_DEFAULT, type HintCategory } from '../core/service/types';
import { settingsSchema, withDefaults, type Settings } from '../core/settings';

/** The most `pneumark.maxNoteSizeKb` may be (see its schema). */
export const MAX_NOTE_SIZE_KB = 4096;

export const clientSettingsSchema = z
  .object({
    analysis: settingsSchema.partial().default({}),
    hints: z.record(z.string(), z.boolean()).default({}),
    /** Milliseconds to wait after the last keystroke before analysing. */
    debounceMs: z.number().int().min(0).max(5000).default(60),
    /**
     * Milliseconds typing must pause before a new finding at the place typed is shown (a value or
     * word half typed: see core/service/typing.ts); 0 shows every finding at once.
     */
    typingPauseMs: z.number().int().min(0).max(10000).default(1000),
    /** Notes larger than this (KiB) are not analysed; the editor stays responsive. */
    // At most 4 MB: a hostile note of that size (bare `@` lines, each a timepoint with a finding)
    // would take the server to about 3.3 GB; its analysis is dropped once it outgrows the heap
    // budget (see memory.ts), and notes much larger would make even the ordinary ones slow.
    maxNoteSizeKb: z.number().int().min(16).max(MAX_NOTE_SIZE_KB).default(2048),
  })
  .passthrough();

export type ClientSettings = z.infer<typeof clientSettingsSchema>;

export const DEFAULT_CLIENT_SETTINGS: ClientSettings = clientSettingsSchema.parse({});

/** A whole number's bound in JavaScript, which zod's `int()` checks beside the setting's own bounds. */
function beyondSafeInteger(issue: z.core.$ZodIssue): boolean {
  return (issue.code === 'too_big' && Number(issue.maximum) === Number.MAX_SAFE_INTEGER) || (issue.code === 'too_small' && Number(issue.minimum) === Number.MIN_SAFE_INTEGER);
}

/**
 * Reads the `pneumark` configuration section. The client contributes flat keys
 * (`pneumark.gasUnit`, `pneumark.hints.mechanics`, ...): they arrive as a nested object. Each key
 * is validated on its own: an invalid one is dropped (and named in `problem`), the others apply.
 * Names in `disabledChecks` that are no check's code or alias are kept (they switch nothing off,
 * as in `pneumark.config.json`) and named in `unknownChecks`, with the check each likely meant:
 * `PN220` or `unusal-value` would otherwise leave a check on that its author believes off.
 * An empty list stands for an empty object (the section or `hints`): Lua has one kind of table,
 * and Neovim sends an empty one as `[]`.
 */
export function readClientSettings(raw: unknown): { settings: ClientSettings; problem: string | null; unknownChecks: string | null } {
  const source = isRecord(raw) ? raw : {};
  const problems: string[] = [];
  const take = <S extends z.ZodType>(key: string, schema: S, value: unknown): z.output<S> | undefined => {
    if (value === undefined || value === null) return undefined;
    const parsed = schema.safeParse(value, { error: settingProblem });
    if (parsed.success) return parsed.data;
    // Each problem once (every item of a list may have the same), and not the bounds of a whole
    // number in JavaScript (9007199254740991) beside the setting's own.
    const issues = parsed.error.issues;
    const own = issues.filter((i) => !beyondSafeInteger(i));
    const messages = new Set((own.length > 0 ? own : issues).map((i) => i.message));
    problems.push(`pneumark.${key}: ${[...messages].join(', ')}`);
    return undefined;
  };

  const analysis: Record<string, unknown> = {};
  for (const [key, schema] of Object.entries(settingsSchema.shape)) {
    if (!Object.prototype.hasOwnProperty.call(source, key)) continue;
    const value = take(key, schema.unwrap(), source[key]);
    if (value !== undefined) analysis[key] = value;
  }
  const hints: Record<string, boolean> = {};
  const rawHints = Object.prototype.hasOwnProperty.call(source, 'hints') ? source['hints'] : undefined;
  if (isRecord(rawHints)) {
    for (const key of Object.keys(rawHints)) {
      if (key === '__proto__') continue;
      const on = take(`hints.${key}`, z.boolean(), rawHints[key]);
      if (on !== undefined) hints[key] = on;
    }
  } else if (rawHints !== undefined && rawHints !== null && !isEmptyList(rawHints)) {
    problems.push('pneumark.hints: expected an object of booleans');
  }
  const own = (key: string): unknown => (Object.prototype.hasOwnProperty.call(source, key) ? source[key] : undefined);
  const debounceMs = take('debounceMs', clientSettingsSchema.shape.debounceMs.unwrap(), own('debounceMs'));
  const typingPauseMs = take('typingPauseMs', clientSettingsSchema.shape.typingPauseMs.unwrap(), own('typingPauseMs'));
  const maxNoteSizeKb = take('maxNoteSizeKb', clientSettingsSchema.shape.maxNoteSizeKb.unwrap(), own('maxNoteSizeKb'));
  // Only the keys the client wrote (validated one by one above): the defaults fill in later.
  const settings: ClientSettings = {
    ...DEFAULT_CLIENT_SETTINGS,
    analysis: analysis as Partial<Settings>,
    hints,
    ...(debounceMs !== undefined ? { debounceMs } : {}),
    ...(typingPauseMs !== undefined ? { typingPauseMs } : {}),
    ...(maxNoteSizeKb !== undefined ? { maxNoteSizeKb } : {}),
  };
  const unknown = unknownCheckNames(settings.analysis.disabledChecks ?? []);
  return {
    settings,
    problem: problems.length > 0 ? problems.join('; ') : null,
    unknownChecks: unknown.length > 0 ? `pneumark.disabledChecks: ${unknown.map(unknownCheckSentence).join(' ')}` : null,
  };
}

/** An empty list where an object is expected: a Lua client's empty table (Neovim encodes `{}` as `[]`). */
function isEmptyList(value: unknown): boolean {
  return Array.isArray(value) && value.length === 0;
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

export interface EffectiveSettings {
  readonly analysis: Settings;
  readonly hints: ReadonlySet<HintCategory>;
  readonly debounceMs: number;
  readonly typingPauseMs: number;
  readonly maxNoteBytes: number;
}

export function effectiveSettings(client: ClientSettings, project: ParsedConfig | null): EffectiveSettings {
  const analysis = withDefaults({ ...client.analysis, ...(project?.settings ?? {}) });
  const hints = new Set<HintCategory>();
  for (const c of HINT_CATEGORIES) {
    const on = project?.hints[c] ?? client.hints[c] ?? !HINTS_OFF_BY_DEFAULT.has(c);
    if (on) hints.add(c);
  }
  return { analysis, hints, debounceMs: client.debounceMs, typingPauseMs: client.typingPauseMs, maxNoteBytes: client.maxNoteSizeKb * 1024 };
}

/** A stable key for settings, so a session is rebuilt only when they change. */
export function settingsKey(s: Settings): string {
  return JSON.stringify(s);
}
