/** Messages between the trend view's webview and the extension. */
import type { TrendPoint } from '../../server/src/protocol';

export type ToWebview =
  | { readonly type: 'trends'; readonly points: readonly TrendPoint[]; readonly note: string }
  | { readonly type: 'error'; readonly message: string };

export type FromWebview =
  | { readonly type: 'ready' }
  | { readonly type: 'reveal'; readonly line: number };
