/** Messages between the trend view's webview and the extension, and the state the page keeps. */
import type { TrendPoint } from '../../server/src/protocol';

export type ToWebview =
  /**
   * The points of a note. `closed`: the note is no longer open, and these are its points as they
   * were when it closed.
   */
  | { readonly type: 'trends'; readonly points: readonly TrendPoint[]; readonly note: string; readonly uri: string; readonly closed: boolean }
  | { readonly type: 'error'; readonly message: string }
  /** Nothing to plot, and why (no note, a note that cannot be opened again). */
  | { readonly type: 'notice'; readonly message: string };

export type FromWebview =
  | { readonly type: 'ready' }
  | { readonly type: 'reveal'; readonly line: number };

/** What the page keeps across a reload of the window (VS Code hands it to the serializer). */
export interface TrendViewState {
  readonly uri: string;
}

/** A message from the page, checked: the page is code of ours, but its messages are data. */
export function fromWebview(value: unknown): FromWebview | null {
  if (typeof value !== 'object' || value === null) return null;
  const m = value as Record<string, unknown>;
  if (m['type'] === 'ready') return { type: 'ready' };
  if (m['type'] === 'reveal' && typeof m['line'] === 'number' && Number.isInteger(m['line']) && m['line'] >= 0) return { type: 'reveal', line: m['line'] };
  return null;
}

/** The state the serializer was given, checked: it was stored by an earlier page. */
export function trendViewState(value: unknown): TrendViewState | null {
  if (typeof value !== 'object' || value === null) return null;
  const uri = (value as Record<string, unknown>)['uri'];
  return typeof uri === 'string' && uri.length > 0 && uri.length < 10_000 ? { uri } : null;
}
