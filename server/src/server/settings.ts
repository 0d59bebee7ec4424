/**
 * Settings as the editor sends them (`workspace/configuration`, section `pneumark`), validated
 * with zod: a wrong shape never reaches the core; the defaults stand in and the problem is logged.
 * The project file `pneumark.config.json` (see ../core/config.ts) overrides the editor's
 * analysis settings, so a team's note conventions are the same in every editor and in CI.
 */
import { z } from 'zod';
import type { ParsedConfig } from '../core/config';
import { HINT_CATEGORIES, type HintCategory } from '../core/service/types';
import { settingsSchema, withDefaults, type Settings } from '../core/settings';

export const clientSettingsSchema = z
  .object({
    analysis: settingsSchema.partial().default({}),
    hints: z.record(z.string(), z.boolean()).default({}),
    /** Milliseconds to wait after the last keystroke before analysing. */
    debounceMs: z.number().int().min(0).max(5000).default(60),
    /** Notes larger than this (KiB) are not analysed; the editor stays responsive. */
    maxNoteSizeKb: z.number().int().min(16).max(65536).default(2048),
  })
  .passthrough();

export type ClientSettings = z.infer<typeof clientSettingsSchema>;

export const DEFAULT_CLIENT_SETTINGS: ClientSettings = clientSettingsSchema.parse({});

/**
 * Reads the `pneumark` configuration section. The client contributes flat keys
 * (`pneumark.gasUnit`, `pneumark.hints.mechanics`, ...): they arrive as a nested object.
 */
export function readClientSettings(raw: unknown): { settings: ClientSettings; problem: string | null } {
  const source = raw && typeof raw === 'object' ? (raw as Record<string, unknown>) : {};
  const analysisKeys = Object.keys(settingsSchema.shape);
  const analysis: Record<string, unknown> = {};
  for (const key of analysisKeys) if (source[key] !== undefined && source[key] !== null) analysis[key] = source[key];
  const candidate = { analysis, hints: source.hints ?? {}, debounceMs: source.debounceMs, maxNoteSizeKb: source.maxNoteSizeKb };
  const parsed = clientSettingsSchema.safeParse(candidate);
  if (parsed.success) return { settings: parsed.data, problem: null };
  return { settings: DEFAULT_CLIENT_SETTINGS, problem: parsed.error.issues.map((i) => `pneumark.${i.path.join('.')}: ${i.message}`).join('; ') };
}

export interface EffectiveSettings {
  readonly analysis: Settings;
  readonly hints: ReadonlySet<HintCategory>;
  readonly debounceMs: number;
  readonly maxNoteBytes: number;
}

export function effectiveSettings(client: ClientSettings, project: ParsedConfig | null): EffectiveSettings {
  const analysis = withDefaults({ ...client.analysis, ...(project?.settings ?? {}) });
  const hints = new Set<HintCategory>();
  for (const c of HINT_CATEGORIES) {
    const on = project?.hints[c] ?? client.hints[c] ?? c !== 'transport';
    if (on) hints.add(c);
  }
  return { analysis, hints, debounceMs: client.debounceMs, maxNoteBytes: client.maxNoteSizeKb * 1024 };
}

/** A stable key for settings, so a session is rebuilt only when they change. */
export function settingsKey(s: Settings): string {
  return JSON.stringify(s);
}
