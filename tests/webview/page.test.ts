// The trend view's page as HTML (its content security policy) and the messages between the page
// and the extension.
import { describe, expect, it } from 'vitest';
import { trendPageCsp, trendPageHtml } from '../../client/src/trend-html';
import { fromWebview, toWebview, trendViewState } from '../../client/webview/messages';

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
    for (const bad of [null, 'ready', { type: 'reveal', line: -1 }, { type: 'reveal', line: 1.5 }, { type: 'reveal', line: '4' }, { type: 'reveal', line: Number.NaN }, { type: 'reveal', line: 2 ** 53 }, { type: 'run', command: 'x' }]) expect(fromWebview(bad)).toBeNull();
  });

  it('and so is the state restored after a reload: each part on its own, a state of an older page (the note only) still taken', () => {
    expect(trendViewState({ uri: 'file:///n/a.pneu' })).toEqual({ uri: 'file:///n/a.pneu', hidden: [] });
    expect(trendViewState({ uri: 'file:///n/a.pneu', hidden: ['ph', 'pao2'] })).toEqual({ uri: 'file:///n/a.pneu', hidden: ['pao2', 'ph'] });
    // Lines hidden before any note was shown; a series this version does not draw, or a list of another shape, is dropped.
    expect(trendViewState({ hidden: ['pao2', 'furlongs', 3] })).toEqual({ hidden: ['pao2'] });
    expect(trendViewState({ uri: 'file:///n/a.pneu', hidden: 'pao2' })).toEqual({ uri: 'file:///n/a.pneu', hidden: [] });
    expect(trendViewState({ uri: 'file:///n/a.pneu', hidden: Array.from({ length: 1000 }, () => 'pao2') })).toEqual({ uri: 'file:///n/a.pneu', hidden: [] });
    for (const bad of [{}, { uri: 4 }, { uri: '' }]) expect(trendViewState(bad)).toEqual({ hidden: [] });
    for (const bad of [undefined, null, 'file:///n/a.pneu', ['pao2']]) expect(trendViewState(bad)).toBeNull();
  });
});

describe('messages to the page', () => {
  const point = { timepoint: 1, label: 'first', line: 2, minutes: 480, values: { pao2: { value: 71, unit: 'mmHg' } }, carried: ['pao2'] };
  const trends = { type: 'trends', points: [point], note: 'a.pneu', uri: 'file:///n/a.pneu', closed: false };

  it('are taken only in the shapes the page draws', () => {
    expect(toWebview(trends)).toEqual(trends);
    expect(toWebview({ type: 'error', message: 'x' })).toEqual({ type: 'error', message: 'x' });
    expect(toWebview({ type: 'notice', message: 'y' })).toEqual({ type: 'notice', message: 'y' });
    expect(toWebview({ type: 'notice', message: 'y', uri: 'file:///n/a.pneu' })).toEqual({ type: 'notice', message: 'y', uri: 'file:///n/a.pneu' });
    for (const bad of [null, 'trends', { type: 'trends' }, { ...trends, points: 'x' }, { ...trends, note: 3 }, { ...trends, points: [{ ...point, values: null }] },
      { ...trends, points: [{ ...point, values: { pao2: { value: 1, unit: 'furlong' } } }] }, { ...trends, points: [{ ...point, carried: ['eval'] }] },
      { ...trends, points: [{ ...point, line: -1 }] }, { type: 'error' }, { type: 'html', html: '<b>' }]) expect(toWebview(bad)).toBeNull();
  });

  it('leave out a value that arrived as null (NaN and Infinity cross as null)', () => {
    const sent = JSON.parse(JSON.stringify({ ...trends, points: [{ ...point, values: { pao2: { value: Number.NaN, unit: 'mmHg' }, ph: { value: 7.3, unit: 'pH' } } }] })) as unknown;
    expect(toWebview(sent)).toMatchObject({ points: [{ values: { ph: { value: 7.3, unit: 'pH' } } }] });
    expect((toWebview(sent) as unknown as { points: { values: object }[] }).points[0]?.values).not.toHaveProperty('pao2');
  });
});
