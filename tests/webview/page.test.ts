// The trend view's page as HTML (its content security policy) and the messages between the page
// and the extension.
import { describe, expect, it } from 'vitest';
import { trendPageCsp, trendPageHtml } from '../../client/src/trend-html';
import { fromWebview, trendViewState } from '../../client/webview/messages';

const resources = { cspSource: 'https://abc.vscode-cdn.net', nonce: 'bm9uY2Ugb2YgdGhlIHBhZ2U=', script: 'https://abc.vscode-cdn.net/ext/dist/webview/trends.js', style: 'https://abc.vscode-cdn.net/ext/dist/webview/trends.css' };

describe('the trend page', () => {
  it('allows nothing by default, scripts only with its nonce, and no network', () => {
    const csp = trendPageCsp(resources);
    const directives = new Map(csp.split('; ').map((d) => [d.split(' ')[0], d.split(' ').slice(1)]));
    expect(directives.get('default-src')).toEqual(["'none'"]);
    expect(directives.get('script-src')).toEqual([`'nonce-${resources.nonce}'`]);
    expect(directives.get('connect-src')).toEqual(["'none'"]);
    expect(csp).not.toMatch(/unsafe-inline|unsafe-eval|https?:\/\/(?!abc\.vscode-cdn\.net)|\*/);
  });

  it('loads its one script with the nonce, and writes the policy as the page\'s first rule', () => {
    const html = trendPageHtml(resources);
    expect(html).toContain(`<meta http-equiv="Content-Security-Policy" content="${trendPageCsp(resources)}">`);
    expect(html.match(/<script/g)).toHaveLength(1);
    expect(html).toContain(`<script nonce="${resources.nonce}" src="${resources.script}"></script>`);
    expect(html.indexOf('Content-Security-Policy')).toBeLessThan(html.indexOf('<link'));
  });

  it('quotes what it writes into attributes', () => {
    expect(trendPageHtml({ ...resources, script: 'x"><img src=y>' })).toContain('src="x&quot;&gt;&lt;img src=y&gt;"');
  });
});

describe('messages from the page', () => {
  it('are taken only in the shapes the extension expects', () => {
    expect(fromWebview({ type: 'ready' })).toEqual({ type: 'ready' });
    expect(fromWebview({ type: 'reveal', line: 4 })).toEqual({ type: 'reveal', line: 4 });
    for (const bad of [null, 'ready', { type: 'reveal', line: -1 }, { type: 'reveal', line: 1.5 }, { type: 'reveal', line: '4' }, { type: 'run', command: 'x' }]) expect(fromWebview(bad)).toBeNull();
  });

  it('and so is the state restored after a reload', () => {
    expect(trendViewState({ uri: 'file:///n/a.pneu' })).toEqual({ uri: 'file:///n/a.pneu' });
    for (const bad of [undefined, null, {}, { uri: 4 }, { uri: '' }]) expect(trendViewState(bad)).toBeNull();
  });
});
