/**
 * Messages between the trend view's webview and the extension, and the state the page keeps,
 * each checked with zod where it is received: the page checks what the extension posts, the
 * extension what the page posts and the state VS Code hands back after a reload.
 */
import * as z from 'zod/mini';
import { TREND_SERIES, type TrendPoint, type TrendSeries, type TrendValue } from '../../server/src/protocol';

export type ToWebview =
  /**
   * The points of a note. `closed`: the note is no longer open, and these are its points as they
   * were when it closed.
   */
  | { readonly type: 'trends'; readonly points: readonly TrendPoint[]; readonly note: string; readonly uri: string; readonly closed: boolean }
  | { readonly type: 'error'; readonly message: string }
  /**
   * Nothing to plot, and why (no note, a note that cannot be opened again, a note too large to be
   * analysed). `uri`: the note it is about, when the view shows one, kept for a reload as for trends.
   */
  | { readonly type: 'notice'; readonly message: string; readonly uri?: string };

export type FromWebview =
  | { readonly type: 'ready' }
  | { readonly type: 'reveal'; readonly line: number };

/**
 * What the page keeps while its panel lives and across a reload of the window (VS Code hands it
 * to the serializer, and back to the page through `getState` when the page is loaded again, as it
 * is each time the hidden panel is shown). `uri`: the note shown, none before the first message;
 * `hidden`: the lines hidden with the legend's toggles.
 */
export interface TrendViewState {
  readonly uri?: string;
  readonly hidden: readonly TrendSeries[];
}

const fromWebviewSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('ready') }),
  z.object({ type: z.literal('reveal'), line: z.int().check(z.minimum(0), z.maximum(2 ** 31 - 1)) }),
]);

/** A message from the page, checked: the page is code of ours, but its messages are data. */
export function fromWebview(value: unknown): FromWebview | null {
  const parsed = fromWebviewSchema.safeParse(value);
  if (!parsed.success) return null;
  return parsed.data.type === 'ready' ? { type: 'ready' } : { type: 'reveal', line: parsed.data.line };
}

const stateUriSchema = z.string().check(z.minLength(1), z.maxLength(9_999));
const stateSchema = z.object({ uri: z.optional(z.unknown()), hidden: z.optional(z.unknown()) });
const hiddenSchema = z.array(z.unknown()).check(z.maxLength(TREND_SERIES.length * 4));

/**
 * The state kept by an earlier page, checked (the serializer's and the page's own after a reload):
 * null when it is not an object. Each part that does not check is left out on its own, so that a
 * state kept by an older page (the note only) still reopens its note; a hidden line of a series
 * this version does not draw is dropped.
 */
export function trendViewState(value: unknown): TrendViewState | null {
  const parsed = stateSchema.safeParse(value);
  if (!parsed.success) return null;
  const uri = stateUriSchema.safeParse(parsed.data.uri);
  const list = hiddenSchema.safeParse(parsed.data.hidden);
  const hidden = list.success ? TREND_SERIES.filter((key) => list.data.includes(key)) : [];
  return uri.success ? { uri: uri.data, hidden } : { hidden };
}

/**
 * A plotted value as it arrives: VS Code passes messages as JSON, where a value that is not a
 * finite number (NaN, Infinity) arrives as null. Such a value counts as absent.
 */
const trendValueSchema = z.object({
  value: z.nullable(z.number()),
  unit: z.enum(['mmHg', 'kPa', 'pH', '%', 'cmH2O', 'mL/cmH2O']),
});

const trendPointSchema = z.object({
  timepoint: z.number(),
  label: z.string(),
  line: z.int().check(z.minimum(0)),
  minutes: z.nullable(z.number()),
  values: z.partialRecord(z.enum(TREND_SERIES), trendValueSchema),
  carried: z.array(z.enum(TREND_SERIES)),
});

const toWebviewSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('trends'), points: z.array(trendPointSchema), note: z.string(), uri: z.string(), closed: z.boolean() }),
  z.object({ type: z.literal('error'), message: z.string() }),
  z.object({ type: z.literal('notice'), message: z.string(), uri: z.optional(z.string()) }),
]);

/**
 * A message from the extension, checked by the page before it draws anything: null for one of
 * another shape (which the page leaves alone, keeping what it shows). Values that arrived as
 * null are left out of their point.
 */
export function toWebview(value: unknown): ToWebview | null {
  const parsed = toWebviewSchema.safeParse(value);
  if (!parsed.success) return null;
  const m = parsed.data;
  if (m.type === 'error') return { type: 'error', message: m.message };
  if (m.type === 'notice') return m.uri === undefined ? { type: 'notice', message: m.message } : { type: 'notice', message: m.message, uri: m.uri };
  const points = m.points.map((p): TrendPoint => {
    const values: Partial<Record<TrendSeries, TrendValue>> = {};
    for (const key of TREND_SERIES) {
      const v = p.values[key];
      if (v && v.value !== null && Number.isFinite(v.value)) values[key] = { value: v.value, unit: v.unit };
    }
    return { timepoint: p.timepoint, label: p.label, line: p.line, minutes: p.minutes, values, carried: p.carried };
  });
  return { type: 'trends', points, note: m.note, uri: m.uri, closed: m.closed };
}
