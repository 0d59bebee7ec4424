// The trend view's page in headless Chromium (browser.ts): what a note can put into it (labels,
// file names, messages) stays text, nothing breaks its content security policy, messages of
// another shape are ignored, and it copes with an empty note, a long one (its table shows the latest
// 500 timepoints until asked for all), missing values, times
// that go back and a server that stops and starts again; a redraw leaves the keyboard focus where it was.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TrendPoint } from '../../server/src/protocol';
import { hasChromium, launch, openTrendPage, shutdown, until, type TrendPage } from './browser';

function point(i: number, label: string, minutes: number | null, pao2: number | null = 70 + i): TrendPoint {
  return { timepoint: i + 1, label, line: i * 2, minutes, values: { pao2: { value: pao2 as number, unit: 'mmHg' }, ph: { value: 7.3, unit: 'pH' } }, carried: [] };
}

const trends = (points: readonly TrendPoint[], note = 'icu.pneu') => ({ type: 'trends', points, note, uri: `file:///work/${note}`, closed: false });

async function text(t: TrendPage, selector: string): Promise<string> {
  return (await t.page.locator(selector).innerText()).trim();
}

describe.skipIf(!hasChromium)('the trend page in a browser', () => {
  beforeAll(launch, 60_000);
  afterAll(shutdown);

  it('shows labels, file names and messages from a note as text, with reordering characters escaped', async () => {
    const t = await openTrendPage();
    const labels = ['<img src=x onerror=alert(1)>', '</script><script>alert(2)</script>', '${alert(3)}', 'a\u202Eexe.pdf', '"><svg onload=alert(4)>', 'x\u2066y\u200bz'];
    await t.send(trends(labels.map((l, i) => point(i, l, i * 60)), '<b>n</b>\u202Eunp.pneu'));
    expect(await text(t, '#title')).toBe('Trends — <b>n</b>\\u{202E}unp.pneu');
    const shown = await t.page.locator('button.go').allInnerTexts();
    expect(shown).toEqual(['<img src=x onerror=alert(1)>', '</script><script>alert(2)</script>', '${alert(3)}', 'a\\u{202E}exe.pdf', '"><svg onload=alert(4)>', 'x\\u{2066}y\\u{200B}z']);
    expect(await t.page.locator('main img, main svg, main script').count()).toBe(0);
    // The legend's label of the point under the cursor is text too.
    const over = t.page.locator('.u-over').first();
    const box = (await over.boundingBox())!;
    await t.page.mouse.move(box.x + box.width * 0.6, box.y + box.height / 2);
    expect(await t.page.locator('.legend').first().innerText()).toContain('a\\u{202E}exe.pdf');
    await t.send({ type: 'error', message: '<img src=x onerror=alert(5)>' });
    expect(await text(t, '#charts')).toBe('Trends could not be loaded: <img src=x onerror=alert(5)>');
    await t.send({ type: 'notice', message: '<svg onload=alert(6)>' });
    expect(await t.page.locator('main svg').count()).toBe(0);
    expect(t.problems).toEqual([]);
    await t.close();
  });

  it('ignores messages of another shape, keeping what it shows and the note it keeps for a reload', async () => {
    const t = await openTrendPage();
    await t.send(trends([point(0, 'first', 0)]));
    for (const bad of [null, 'trends', { type: 'trends' }, { type: 'trends', points: 'x', note: 3 }, { ...trends([]), points: [{ label: 1, values: null }] },
      { ...trends([]), uri: 'file:///other.pneu', points: [{ ...point(0, 'x', 0), values: { pao2: { value: 1, unit: 'furlong' } } }] }, { type: 'error' }, { type: 'run', command: 'x' }]) await t.send(bad);
    expect(await t.page.locator('button.go').allInnerTexts()).toEqual(['first']);
    expect(await t.state()).toEqual({ uri: 'file:///work/icu.pneu', hidden: [] });
    expect(t.problems).toEqual([]);
    await t.close();
  });

  it('copes with an empty note, values that are not numbers, and a server that stops and starts', async () => {
    const t = await openTrendPage();
    await t.send(trends([]));
    expect(await text(t, '#charts')).toMatch(/^This note has no timepoints yet/);
    // NaN and Infinity arrive as null: left out, as absent values are.
    await t.send(trends([point(0, 'a', 0, Number.NaN), point(1, 'b', 60, Number.POSITIVE_INFINITY), point(2, 'c', 120)]));
    expect(t.problems).toEqual([]);
    const cells = await t.page.locator('section.values tbody tr').allInnerTexts();
    expect(cells.map((c) => c.split('\t').map((s) => s.trim()))).toEqual([['a', '—', '7.30'], ['b', '—', '7.30'], ['c', '72', '7.30']]);
    await t.send({ type: 'error', message: 'the Pneumark language server is not running (run "Pneumark: Restart Language Server")' });
    expect(await text(t, '#charts')).toMatch(/not running/);
    await t.send(trends([point(0, 'again', 0)]));
    expect(await t.page.locator('button.go').allInnerTexts()).toEqual(['again']);
    expect(t.problems).toEqual([]);
    await t.close();
  });

  it('draws a note whose times go back by timepoint, with every point on the chart, a click goes to the point under it and a drag zooms nothing', async () => {
    const t = await openTrendPage();
    // 10:00, 09:00 (earlier: PN308), 11:00, 11:00, 11:40.
    const points = [600, 540, 660, 660, 700].map((m, i) => point(i, `tp ${i + 1}`, m));
    await t.send(trends(points));
    // The legend names the x values: timepoint numbers (`#`), not hours.
    expect(await t.page.locator('.legend .at .label').first().innerText()).toBe('#');
    const over = t.page.locator('.u-over').first();
    const box = (await over.boundingBox())!;
    // Timepoints 1…5 across the width: the middle is the third.
    await t.page.mouse.click(box.x + box.width / 2, box.y + box.height / 2);
    expect((await t.posted()).at(-1)).toEqual({ type: 'reveal', line: points[2]!.line });
    // A drag across it does not zoom (the keyboard could not, nor undo it): the left edge is still the first timepoint.
    await t.page.mouse.move(box.x + box.width * 0.2, box.y + box.height / 2);
    await t.page.mouse.down();
    await t.page.mouse.move(box.x + box.width * 0.7, box.y + box.height / 2, { steps: 5 });
    await t.page.mouse.up();
    await t.page.mouse.move(box.x + 2, box.y + box.height / 2);
    expect(await t.page.locator('.legend .at .value').first().innerText()).toBe('tp 1');
    expect(t.problems).toEqual([]);
    await t.close();
  });

  it('draws a note of 5,000 timepoints, and only the last of the trends that came while it drew', async () => {
    // Counts what the page draws: its title is written once per drawing.
    const t = await openTrendPage({ initScript: `window.__drawn = []; addEventListener('DOMContentLoaded', () => new MutationObserver(() => window.__drawn.push(document.getElementById('title').textContent)).observe(document.getElementById('title'), { childList: true, characterData: true, subtree: true }));` });
    const points = Array.from({ length: 5000 }, (_, i) => point(i, `day ${Math.floor(i / 24) + 1} ${i % 24}:00`, i * 60));
    await t.send(trends(points, 'long.pneu'));
    // The table shows the latest 500 timepoints (the charts all of them), and all on request.
    expect(await t.page.locator('section.values tbody tr').count()).toBe(500);
    expect(await t.page.locator('section.values tbody tr th button.go').first().innerText()).toBe(points[4500]!.label);
    expect(await text(t, 'section.values p.more')).toBe('The latest 500 of 5000 timepoints (the charts show them all). Show all 5000 timepoints');
    expect(await t.page.locator('section.panel').count()).toBe(2);
    await t.page.locator('section.values button.all-rows').click();
    await until(t.page, `document.querySelectorAll('section.values tbody tr').length === 5000`);
    expect(await t.page.locator('section.values p.more').count()).toBe(0);
    // Kept for that note when its trends come again; another note starts with the latest rows again.
    await t.send(trends(points, 'long.pneu'));
    expect(await t.page.locator('section.values tbody tr').count()).toBe(5000);
    await t.send(trends(points, 'other.pneu'));
    expect(await t.page.locator('section.values tbody tr').count()).toBe(500);
    await t.send(trends(points, 'long.pneu'));
    // A note edited at speed: its trends come again after each analysis, faster than they are drawn.
    await t.page.evaluate('window.__drawn.length = 0');
    await t.page.evaluate(`for (let i = 1; i <= 5; i++) window.postMessage({ ...${JSON.stringify(trends(points, 'long.pneu'))}, note: 'long ' + i + '.pneu' }, '*')`);
    await until(t.page, `document.getElementById('title').textContent === 'Trends — long 5.pneu'`);
    expect(await t.page.evaluate('window.__drawn')).toEqual(['Trends — long 5.pneu']);
    expect(t.problems).toEqual([]);
    await t.close();
  }, 60_000);

  it('keeps the keyboard focus on its timepoint when the page is redrawn, and moves it to the first row when all rows are shown', async () => {
    const t = await openTrendPage();
    const points = Array.from({ length: 4 }, (_, i) => point(i, `tp ${i + 1}`, i * 60));
    await t.send(trends(points));
    const focused = () => t.page.evaluate('document.activeElement?.textContent') as Promise<string | null>;
    // Past the toggles of the two charts' legends (PaO2, pH), the table's buttons.
    for (let i = 0; i < 5; i++) await t.page.keyboard.press('Tab');
    expect(await focused()).toBe('tp 3');
    // A new analysis of the note, the note closing, a theme change: each redraws the page.
    await t.send(trends(points));
    expect(await focused()).toBe('tp 3');
    await t.send({ ...trends(points), closed: true });
    expect(await focused()).toBe('tp 3');
    await t.page.evaluate(`window.__was = document.activeElement; document.body.classList.add('vscode-light')`);
    await until(t.page, `document.activeElement !== window.__was`);
    expect(await focused()).toBe('tp 3');
    // A timepoint removed: the focus goes to the one before where it was.
    await t.send(trends(points.slice(0, 2)));
    expect(await focused()).toBe('tp 2');
    await t.page.keyboard.press('Enter');
    expect((await t.posted()).at(-1)).toEqual({ type: 'reveal', line: points[1]!.line });
    // A long note: the "Show all" button keeps the focus across a redraw, and once pressed (with
    // the keyboard) hands it to the first timepoint of the whole table, not to the top of the page.
    const long = Array.from({ length: 700 }, (_, i) => point(i, `tp ${i + 1}`, i * 60));
    await t.send(trends(long, 'long.pneu'));
    const all = t.page.getByRole('button', { name: 'Show all 700 timepoints' });
    await all.focus();
    await t.send(trends(long, 'long.pneu'));
    expect(await focused()).toBe('Show all 700 timepoints');
    await t.page.keyboard.press('Space');
    await until(t.page, `document.querySelectorAll('section.values tbody tr').length === 700`);
    expect(await focused()).toBe('tp 1');
    expect(t.problems).toEqual([]);
    await t.close();
  }, 60_000);

  it('shows and hides a line from the keyboard with its legend toggle, and keeps the focus on it when the page is redrawn', async () => {
    // PaO2 drawn in a colour seen nowhere else, to count its pixels; a focus colour of its own.
    const t = await openTrendPage({ initScript: `addEventListener('DOMContentLoaded', () => { document.documentElement.style.cssText = '--vscode-charts-blue: #ff00ff; --vscode-focusBorder: #00c000'; });` });
    const points = Array.from({ length: 4 }, (_, i) => point(i, `tp ${i + 1}`, i * 60));
    await t.send(trends(points));
    const pao2Pixels = `(() => { const c = document.querySelector('section.panel canvas'); const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data; let n = 0; for (let i = 0; i < d.length; i += 4) if (d[i] > 200 && d[i + 1] < 80 && d[i + 2] > 200) n++; return n; })()`;
    const focused = () => t.page.evaluate(`(() => { const el = document.activeElement; return el ? el.getAttribute('aria-label') + ' ' + el.getAttribute('aria-pressed') : null; })()`) as Promise<string | null>;
    expect(await t.page.evaluate(pao2Pixels)).toBeGreaterThan(20);
    // The first stop of the Tab key: the first chart's first toggle, a button named by what it does, pressed while its line is shown.
    await t.page.keyboard.press('Tab');
    expect(await focused()).toBe('Show the PaO2 line true');
    const toggle = t.page.getByRole('button', { name: 'Show the PaO2 line' });
    expect(await toggle.evaluate((el) => el.tagName)).toBe('BUTTON');
    // Its focus ring is drawn in the theme's focus colour.
    expect(await t.page.evaluate(`(() => { const s = getComputedStyle(document.activeElement); return [document.activeElement.matches(':focus-visible'), s.outlineStyle, s.outlineColor]; })()`)).toEqual([true, 'solid', 'rgb(0, 192, 0)']);
    await t.page.keyboard.press('Space');
    await until(t.page, `${pao2Pixels} === 0`);
    expect(await focused()).toBe('Show the PaO2 line false');
    expect(await t.page.locator('section.panel .legend .item.off .label').allInnerTexts()).toEqual(['PaO2']);
    // A new analysis redraws the page: the line stays hidden, the toggle says so and keeps the focus.
    await t.send(trends(points));
    expect(await focused()).toBe('Show the PaO2 line false');
    expect(await t.page.evaluate(pao2Pixels)).toBe(0);
    expect(await t.page.evaluate(`document.activeElement.matches(':focus-visible')`)).toBe(true);
    await t.page.keyboard.press('Enter');
    await until(t.page, `${pao2Pixels} > 20`);
    expect(await focused()).toBe('Show the PaO2 line true');
    // The next stop: the toggle of the next chart's line; the mouse presses toggles too.
    await t.page.keyboard.press('Tab');
    expect(await focused()).toBe('Show the pH line true');
    await t.page.getByRole('button', { name: 'Show the PaO2 line' }).click();
    expect(await t.page.getByRole('button', { name: 'Show the PaO2 line', pressed: false }).count()).toBe(1);
    // A theme change redraws too; then the series goes from the note: the focus goes to the toggle of a line still drawn.
    await t.page.evaluate(`window.__was = document.activeElement; document.body.classList.add('vscode-light')`);
    await until(t.page, `document.activeElement !== window.__was`);
    expect(await focused()).toBe('Show the PaO2 line false');
    await t.send(trends(points.map((p) => ({ ...p, values: { ph: p.values.ph! } }))));
    expect(await focused()).toBe('Show the pH line true');
    // Nothing that takes the focus is inside a part hidden from screen readers.
    expect(await t.page.locator('[aria-hidden="true"] :is(button, a[href], input, select, textarea, [tabindex])').count()).toBe(0);
    expect(t.problems).toEqual([]);
    await t.close();
  }, 60_000);

  it('keeps the lines hidden with the legend when the page is loaded again (the panel shown again, or the window reloaded)', async () => {
    const points = Array.from({ length: 3 }, (_, i) => point(i, `tp ${i + 1}`, i * 60));
    const first = await openTrendPage();
    await first.send(trends(points));
    await first.page.getByRole('button', { name: 'Show the pH line' }).click();
    expect(await first.state()).toEqual({ uri: 'file:///work/icu.pneu', hidden: ['ph'] });
    const kept = await first.state();
    await first.close();
    // VS Code loads the page again with the state the first one kept: the pH line is still hidden,
    // before and after the note's trends come again, and the state still says so.
    const again = await openTrendPage({ state: kept });
    expect(await again.state()).toEqual(kept);
    await again.send(trends(points));
    expect(await again.page.getByRole('button', { name: 'Show the pH line' }).getAttribute('aria-pressed')).toBe('false');
    expect(await again.page.getByRole('button', { name: 'Show the PaO2 line' }).getAttribute('aria-pressed')).toBe('true');
    expect(await again.page.locator('section.panel .legend .item.off .label').allInnerTexts()).toEqual(['pH']);
    // Shown again there, it is shown after the next load too; another note keeps the choice.
    await again.page.getByRole('button', { name: 'Show the pH line' }).click();
    await again.page.getByRole('button', { name: 'Show the PaO2 line' }).click();
    await again.send(trends(points, 'other.pneu'));
    expect(await again.state()).toEqual({ uri: 'file:///work/other.pneu', hidden: ['pao2'] });
    expect(again.problems).toEqual([]);
    await again.close();
    // A state kept by an older page (the note only), or of another shape, hides nothing.
    for (const state of [{ uri: 'file:///work/icu.pneu' }, { uri: 'file:///work/icu.pneu', hidden: 'ph' }, 'ph']) {
      const older = await openTrendPage({ state });
      await older.send(trends(points));
      expect(await older.page.locator('section.panel .legend .item.off').count(), JSON.stringify(state)).toBe(0);
      expect(await older.state()).toEqual({ uri: 'file:///work/icu.pneu', hidden: [] });
      expect(older.problems).toEqual([]);
      await older.close();
    }
  }, 60_000);

  it('says where each timepoint\'s button goes to the keyboard and screen readers, not in a tooltip only', async () => {
    const t = await openTrendPage();
    await t.send(trends(Array.from({ length: 3 }, (_, i) => point(i, `tp ${i + 1}`, i * 60))));
    // Its accessible description, as Chromium gives it to screen readers (the name stays the label).
    const cdp = await t.page.context().newCDPSession(t.page);
    const { nodes } = await cdp.send('Accessibility.getFullAXTree') as { nodes: { role?: { value: string }; name?: { value: string }; description?: { value: string } }[] };
    const described = nodes.filter((n) => n.role?.value === 'button' && /^tp \d$/.test(n.name?.value ?? '')).map((n) => [n.name?.value, n.description?.value]);
    expect(described).toEqual([['tp 1', 'Go to line 1'], ['tp 2', 'Go to line 3'], ['tp 3', 'Go to line 5']]);
    // Not read again as text of the table; shown beside the button only while it has the keyboard focus.
    const table = t.page.getByRole('table', { name: /moves the editor/ });
    expect(await table.ariaSnapshot()).not.toContain('Go to line');
    const line = (n: number) => t.page.locator('section.values .go-line').nth(n);
    expect(await line(1).isVisible()).toBe(false);
    await t.page.locator('button.go').nth(0).focus();
    await t.page.keyboard.press('Tab');
    expect(await t.page.evaluate(`document.activeElement.textContent`)).toBe('tp 2');
    expect(await line(1).isVisible()).toBe(true);
    expect(await line(1).innerText()).toBe('Go to line 3');
    expect(await line(0).isVisible()).toBe(false);
    // Pressed from the keyboard, it goes there.
    await t.page.keyboard.press('Enter');
    expect((await t.posted()).at(-1)).toEqual({ type: 'reveal', line: 2 });
    expect(t.problems).toEqual([]);
    await t.close();
  });

  it('lets the keyboard scroll the table sideways when it is wider than the view, and only then', async () => {
    const all = (i: number): TrendPoint => ({ timepoint: i + 1, label: `tp ${i + 1}`, line: i, minutes: i * 60, carried: [], values: {
      pao2: { value: 70, unit: 'mmHg' }, pf_ratio: { value: 175, unit: 'mmHg' }, paco2: { value: 48, unit: 'mmHg' }, ph: { value: 7.31, unit: 'pH' }, spo2: { value: 92, unit: '%' },
      fio2: { value: 40, unit: '%' }, peep: { value: 8, unit: 'cmH2O' }, driving_pressure: { value: 14, unit: 'cmH2O' }, compliance_static: { value: 30, unit: 'mL/cmH2O' } } });
    const t = await openTrendPage({ width: 320, initScript: `addEventListener('DOMContentLoaded', () => { document.documentElement.style.cssText = '--vscode-focusBorder: #00c000'; });` });
    await t.send(trends([all(0), all(1)]));
    const values = t.page.locator('section.values');
    expect(await values.evaluate((el) => el.scrollWidth > el.clientWidth)).toBe(true);
    // Past the nine legend toggles, the table's region: a stop of the Tab key, named, with a focus ring.
    for (let i = 0; i < 10; i++) await t.page.keyboard.press('Tab');
    expect(await t.page.evaluate(`document.activeElement.matches('section.values')`)).toBe(true);
    expect(await values.getAttribute('aria-label')).toBe('Values by timepoint');
    expect(await t.page.evaluate(`getComputedStyle(document.activeElement).outlineColor`)).toBe('rgb(0, 192, 0)');
    await t.page.keyboard.press('ArrowRight');
    await until(t.page, `document.querySelector('section.values').scrollLeft > 0`);
    // Still the focused region after a redraw; once the view is wide enough, no stop at all.
    await t.send(trends([all(0), all(1)]));
    expect(await t.page.evaluate(`document.activeElement.matches('section.values')`)).toBe(true);
    await t.page.setViewportSize({ width: 1400, height: 800 });
    await until(t.page, `!document.querySelector('section.values').hasAttribute('tabindex')`);
    expect(t.problems).toEqual([]);
    await t.close();
  });

  it('gives screen readers the table for the charts, and says what it shows once, not at every analysis', async () => {
    // Records what the status line says: each change of its text is read out.
    const t = await openTrendPage({ initScript: `window.__said = []; addEventListener('DOMContentLoaded', () => new MutationObserver(() => window.__said.push(document.getElementById('announce').textContent)).observe(document.getElementById('announce'), { childList: true, characterData: true, subtree: true }));` });
    const points = Array.from({ length: 3 }, (_, i) => point(i, `tp ${i + 1}`, i * 60));
    await t.send(trends(points));
    const main = await t.page.locator('main').ariaSnapshot();
    // Each chart is out of the accessibility tree (its canvas, axes and cursor), its region named,
    // with a heading and a pointer to the table; its legend's toggles come after it, outside it,
    // as a named group of toggle buttons (the values under the mouse beside them are for the eye).
    expect(main).toContain('- region "Oxygenation (mmHg)":\n    - heading "Oxygenation" [level=2]\n    - paragraph: "PaO2 by hour: a chart, its values in the table \\"Values by timepoint\\" below."\n'
      + '    - group "Lines shown in the Oxygenation chart":\n      - button "Show the PaO2 line" [pressed]: PaO2\n  - region');
    expect(await t.page.locator('.uplot button, .uplot [tabindex]').count()).toBe(0);
    expect(await t.page.getByRole('table').count()).toBe(1);
    expect(await t.page.locator('.uplot').first().getAttribute('aria-hidden')).toBe('true');
    const table = t.page.getByRole('table', { name: /moves the editor/ });
    expect(await table.getByRole('columnheader').allInnerTexts()).toEqual(['Timepoint', 'PaO2 (mmHg)', 'pH']);
    expect(await table.getByRole('rowheader').allInnerTexts()).toEqual(['tp 1', 'tp 2', 'tp 3']);
    expect(await table.getByRole('button', { name: 'tp 2' }).getAttribute('title')).toBe('Go to line 3');
    // Nothing around the charts and the table is a live region; the status line speaks politely.
    expect(await t.page.locator('[aria-live]').count()).toBe(0);
    expect(await t.page.getByRole('status').count()).toBe(1);
    // A note edited: its trends come after each analysis, redrawn each time, said once.
    for (let i = 0; i < 4; i++) await t.send(trends(points.map((p) => ({ ...p, values: { ...p.values, pao2: { value: 80 + i, unit: 'mmHg' } } }))));
    await t.send({ ...trends(points), closed: true });
    await t.send(trends([]));
    await t.send(trends([]));
    await t.send({ type: 'error', message: 'the server stopped' });
    await t.send({ type: 'error', message: 'the server stopped' });
    await t.send(trends(points, 'other.pneu'));
    expect(await t.page.evaluate('window.__said')).toEqual([
      'Trends of icu.pneu.',
      'Trends of icu.pneu, as they were when the note closed.',
      'Trends of icu.pneu: This note has no timepoints yet: add one with a line such as "@ day 1 08:00".',
      'Trends could not be loaded: the server stopped',
      'Trends of other.pneu.',
    ]);
    expect(t.problems).toEqual([]);
    await t.close();
  });

  it('tells the series of a chart apart by their lines, dashed or dotted, and draws them thicker in a high-contrast theme', async () => {
    const t = await openTrendPage();
    const vent = (i: number): TrendPoint => ({ timepoint: i + 1, label: `tp ${i + 1}`, line: i, minutes: i * 60, carried: [],
      values: { peep: { value: 8, unit: 'cmH2O' }, driving_pressure: { value: 14 + i, unit: 'cmH2O' }, compliance_static: { value: 30 - i, unit: 'mL/cmH2O' } } });
    await t.send(trends([vent(0), vent(1), vent(2)]));
    const markers = `[...document.querySelectorAll('section.panel .legend .item')].map((row) => { const m = getComputedStyle(row.querySelector('.marker')); return row.querySelector('.label').textContent + ' ' + m.borderTopStyle + ' ' + m.borderTopWidth + ' ' + m.borderBottomWidth; })`;
    // The legend's sample of each line: PEEP solid, ΔP dashed, Cstat dotted (only its top border drawn).
    expect(await t.page.evaluate(markers)).toEqual(['PEEP solid 2px 0px', 'ΔP dashed 2px 0px', 'Cstat dotted 2px 0px']);
    await t.page.evaluate(`window.__was = document.querySelector('.uplot'); document.body.classList.add('vscode-high-contrast')`);
    await until(t.page, `document.querySelector('.uplot') !== window.__was`);
    expect(await t.page.evaluate(markers)).toEqual(['PEEP solid 3px 0px', 'ΔP dashed 3px 0px', 'Cstat dotted 3px 0px']);
    expect(t.problems).toEqual([]);
    await t.close();
  });

  it('writes its secondary text in the theme\'s description colour, readable on a light theme', async () => {
    // The colours VS Code's default light theme sets.
    const t = await openTrendPage({ initScript: `addEventListener('DOMContentLoaded', () => { document.documentElement.style.cssText = '--vscode-foreground: #616161; --vscode-descriptionForeground: #717171; --vscode-editor-background: #ffffff'; document.body.className = 'vscode-light'; });` });
    const luminance = (rgb: string) => {
      const [r, g, b] = rgb.match(/\d+/g)!.slice(0, 3).map((c) => { const v = Number(c) / 255; return v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4; });
      return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
    };
    const looks = (selector: string) => t.page.evaluate(`(() => { const s = getComputedStyle(document.querySelector(${JSON.stringify(selector)})); return { color: s.color, opacity: s.opacity }; })()`) as Promise<{ color: string; opacity: string }>;
    await t.send(trends([]));
    const long = Array.from({ length: 501 }, (_, i) => point(i, `tp ${i + 1}`, i * 60));
    const seen = [await looks('p.empty')];
    await t.send(trends(long));
    for (const selector of ['p.caution', 'section.values caption', 'section.values p.more']) seen.push(await looks(selector));
    for (const { color, opacity } of seen) {
      expect(opacity).toBe('1');
      // WCAG AA for text of normal size: 4.5 to 1 against the white background.
      expect((1.05) / (luminance(color) + 0.05)).toBeGreaterThanOrEqual(4.5);
    }
    expect(t.problems).toEqual([]);
    await t.close();
  });
});
