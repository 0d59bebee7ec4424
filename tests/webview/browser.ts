/**
 * The trend view's page in headless Chromium, as VS Code would show it: the HTML of trend-html.ts
 * with its content security policy, the bundled script and stylesheet from dist/webview (npm test
 * builds first), served by request interception from a made-up origin (nothing leaves the
 * machine; any other request is refused and recorded). `acquireVsCodeApi` is a stand-in that
 * records what the page posts and the state it keeps; messages from the extension are posted to
 * the window as VS Code posts them. Errors, CSP violations and dialogs are recorded too.
 */
import { existsSync, readFileSync } from 'node:fs';
import { chromium, type Browser, type Page } from 'playwright-core';
import { trendPageHtml } from '../../client/src/trend-html';

export const CHROMIUM = '/usr/bin/chromium';
export const hasChromium = existsSync(CHROMIUM) && existsSync('dist/webview/trends.js');

const ORIGIN = 'https://webview.pneumark.test';

export interface TrendPage {
  readonly page: Page;
  /** Messages the page posted to the extension. */
  posted(): Promise<unknown[]>;
  /** The state the page asked VS Code to keep. */
  state(): Promise<unknown>;
  /** Posts a message to the page as the extension does, and waits for it to be handled. */
  send(message: unknown): Promise<void>;
  /** Uncaught errors, console errors, CSP violations, dialogs (alert, …), requests refused. */
  readonly problems: string[];
  close(): Promise<void>;
}

let browser: Browser | null = null;

/**
 * Waits until an expression is true in the page. (Playwright's waitForFunction evaluates a string
 * with eval, which the page's policy refuses, as it should.)
 */
export async function until(page: Page, expression: string, timeoutMs = 20_000): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!(await page.evaluate(expression))) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${expression}`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

export async function launch(): Promise<void> {
  browser ??= await chromium.launch({ executablePath: CHROMIUM, headless: true, args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--no-first-run'] });
}

export async function shutdown(): Promise<void> {
  await browser?.close();
  browser = null;
}

/**
 * `state`: what VS Code gives back to a page loaded again (the panel shown again after being
 * hidden, or the window reloaded): the state an earlier page kept, returned by `getState`.
 */
export async function openTrendPage(options: { width?: number; initScript?: string; state?: unknown } = {}): Promise<TrendPage> {
  if (!browser) throw new Error('launch() first');
  const context = await browser.newContext({ viewport: { width: options.width ?? 900, height: 800 } });
  const page = await context.newPage();
  const problems: string[] = [];
  const html = trendPageHtml({
    cspSource: ORIGIN,
    nonce: 'dGVzdCBub25jZSBvZiB0aGUgcGFnZQ==',
    script: `${ORIGIN}/dist/webview/trends.js`,
    style: `${ORIGIN}/dist/webview/trends.css`,
  });
  await context.route('**/*', async (route) => {
    const url = new URL(route.request().url());
    if (url.origin === ORIGIN && url.pathname === '/index.html') return route.fulfill({ status: 200, contentType: 'text/html', body: html });
    if (url.origin === ORIGIN && (url.pathname === '/dist/webview/trends.js' || url.pathname === '/dist/webview/trends.css')) {
      return route.fulfill({ status: 200, contentType: url.pathname.endsWith('.js') ? 'text/javascript' : 'text/css', body: readFileSync(url.pathname.slice(1)) });
    }
    problems.push(`request: ${route.request().url()}`);
    return route.abort();
  });
  page.on('pageerror', (e) => problems.push(`pageerror: ${e.message}`));
  page.on('console', (m) => { if (m.type() === 'error') problems.push(`console: ${m.text()}`); });
  page.on('dialog', (d) => { problems.push(`dialog: ${d.message()}`); void d.dismiss(); });
  // The stand-in for VS Code's API, and a record of CSP violations. Init scripts are not subject to
  // the page's policy, as VS Code's own bootstrap is not.
  await page.addInitScript(`
    window.__posted = []; window.__state = ${JSON.stringify(options.state ?? null)} ?? undefined; window.__violations = [];
    window.acquireVsCodeApi = () => ({ postMessage: (m) => window.__posted.push(JSON.parse(JSON.stringify(m))), setState: (s) => { window.__state = s; }, getState: () => window.__state });
    document.addEventListener('securitypolicyviolation', (e) => window.__violations.push(e.violatedDirective + ' ' + e.blockedURI));
    ${options.initScript ?? ''}
  `);
  await page.goto(`${ORIGIN}/index.html`);
  await until(page, 'window.__posted.length > 0');
  return {
    page,
    problems,
    posted: () => page.evaluate('window.__posted') as Promise<unknown[]>,
    state: () => page.evaluate('window.__state'),
    async send(message) {
      // As VS Code passes a message: serialised as JSON (NaN and Infinity become null).
      await page.evaluate(`window.postMessage(JSON.parse(${JSON.stringify(JSON.stringify(message) ?? 'null')}), '*')`);
      await page.evaluate('new Promise((r) => setTimeout(r, 0))');
      const violations = await page.evaluate('window.__violations.splice(0)') as string[];
      problems.push(...violations.map((v) => `csp: ${v}`));
    },
    close: () => context.close(),
  };
}
