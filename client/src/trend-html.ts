/**
 * The trend view's page as HTML, apart from VS Code so it is tested on its own: a strict content
 * security policy (nothing by default; the script and styles only with this page's nonce or from
 * the extension's files; no network at all), the bundled script and stylesheet.
 */
export interface TrendPageResources {
  /** The webview's source expression for the extension's own files (`webview.cspSource`). */
  readonly cspSource: string;
  /** Webview URIs of the bundled script and stylesheet. */
  readonly script: string;
  readonly style: string;
  /** A fresh random value for this page (base64). */
  readonly nonce: string;
}

export function trendPageCsp(r: Pick<TrendPageResources, 'cspSource' | 'nonce'>): string {
  return [
    "default-src 'none'",
    `img-src ${r.cspSource} data:`,
    `style-src ${r.cspSource} 'nonce-${r.nonce}'`,
    `script-src 'nonce-${r.nonce}'`,
    `font-src ${r.cspSource}`,
    "connect-src 'none'",
    "form-action 'none'",
    "base-uri 'none'",
  ].join('; ');
}

function attribute(value: string): string {
  return value.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

export function trendPageHtml(r: TrendPageResources): string {
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="UTF-8">
<meta http-equiv="Content-Security-Policy" content="${attribute(trendPageCsp(r))}">
<meta name="viewport" content="width=device-width, initial-scale=1.0">
<link rel="stylesheet" href="${attribute(r.style)}" nonce="${attribute(r.nonce)}">
<title>Trends</title>
</head>
<body>
<header><h1 id="title">Trends</h1><p class="caution">Decision support only — defer to local protocols and licensed practice.</p></header>
<main id="charts"><p class="empty">Waiting for the note's analysis…</p></main>
<p id="announce" class="visually-hidden" role="status"></p>
<script nonce="${attribute(r.nonce)}" src="${attribute(r.script)}"></script>
</body>
</html>`;
}
