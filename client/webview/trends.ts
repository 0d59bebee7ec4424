/**
 * The trend view's page: small multiples drawn with uPlot (bundled, no network), coloured from
 * the editor theme's chart colours, redrawn on each message from the extension and when the
 * theme changes. What each panel holds, its axis labels and legend texts come from panels.ts;
 * values are drawn in the units the server gives them in (gas pressures in the note's unit, mmHg
 * or kPa). Clicking a chart moves the editor to the timepoint under the cursor; below the charts
 * a table of the same values has a button per timepoint, so the keyboard and screen readers
 * reach every timepoint too: each says the line it goes to in its description, and beside it
 * while it has the keyboard focus (the mouse has its tooltip).
 *
 * The chart itself (canvas, axes, cursor) is hidden from screen readers, which are pointed to the
 * table. Its legend is not uPlot's (a table inside the hidden chart, toggled by clicks only): it is
 * the page's own row of toggle buttons beside the chart, outside the hidden part, reached with
 * Tab and pressed with Enter or Space like any button, each pressed while its line is shown. The
 * values under the mouse it shows beside them are for the eye only (the table has them).
 */
import uPlot from 'uplot';
import type { TrendPoint, TrendSeries } from '../../server/src/protocol';
import { toWebview, trendViewState, type FromWebview, type ToWebview, type TrendViewState } from './messages';
import { shownEscaped, wordList } from '../../server/src/core/util/format';
import { emptyMessage, legendName, legendText, panelLayouts, phAxisRange, seriesDash, timepointTable, toggleAfterRedraw, toggleName, xAxis, type PanelLayout } from './panels';

interface VsCodeApi {
  postMessage(message: FromWebview): void;
  setState(state: TrendViewState): void;
  getState(): unknown;
}
declare function acquireVsCodeApi(): VsCodeApi;

const vscode = acquireVsCodeApi();

const charts: uPlot[] = [];
let points: readonly TrendPoint[] = [];
let lastNote = '';
let lastClosed = false;
/** The address of the note shown (the table of a long note shows every row only for the note that asked). */
let lastUri = '';
/** Nothing has come from the extension yet: the page keeps its "waiting" line. */
let received = false;

/** VS Code's own chart colours (dark themes), for a theme that sets none: each series its own. */
/** The range of the pH axis: `phAxisRange`, else the chart's default (padded, snapped). */
const pHRange: uPlot.Range.Function = (_u, min, max) =>
  phAxisRange(min, max) ?? ((min as number | null) === null ? [null, null] : uPlot.rangeNum(min, max, 0.1, true));

const CHART_COLOURS: Readonly<Record<string, string>> = { blue: '#3794ff', purple: '#b180d7', orange: '#d18616', green: '#89d185', red: '#f14c4c', yellow: '#cca700' };

function themeColour(name: string): string {
  const value = getComputedStyle(document.body).getPropertyValue(`--vscode-charts-${name}`).trim();
  return value || (CHART_COLOURS[name] ?? '#3794ff');
}

function cssVar(name: string, fallback: string): string {
  return getComputedStyle(document.body).getPropertyValue(name).trim() || fallback;
}

function highContrast(): boolean {
  return document.body.classList.contains('vscode-high-contrast') || document.body.classList.contains('vscode-high-contrast-light');
}

function reveal(line: number): void {
  vscode.postMessage({ type: 'reveal', line });
}

function paragraph(className: string, text: string): HTMLParagraphElement {
  const p = document.createElement('p');
  p.className = className;
  p.textContent = text;
  return p;
}

/** The control of the page that has the keyboard focus, to put it back once the page is redrawn. */
type FocusedControl =
  | { readonly kind: 'row'; readonly index: number }
  | { readonly kind: 'all-rows' }
  | { readonly kind: 'table' }
  | { readonly kind: 'series'; readonly key: TrendSeries; readonly panel: string };

function focusedControl(): FocusedControl | null {
  const el = document.activeElement;
  const main = document.getElementById('charts');
  if (!(el instanceof HTMLElement) || !main?.contains(el)) return null;
  if (el.matches('section.values')) return { kind: 'table' };
  if (!(el instanceof HTMLButtonElement)) return null;
  if (el.classList.contains('all-rows')) return { kind: 'all-rows' };
  if (el.classList.contains('series-toggle')) {
    const key = el.dataset.series as TrendSeries;
    return { kind: 'series', key, panel: el.closest('section.panel')?.querySelector('h2')?.textContent ?? '' };
  }
  const index = Number(el.dataset.index);
  return el.classList.contains('go') && Number.isInteger(index) ? { kind: 'row', index } : null;
}

/**
 * Focuses the control that had the focus before the page was redrawn (a redraw replaces every
 * element): the same timepoint's button, else the nearest one before it, else the first; the
 * "Show all" button, else the first timepoint's; the same series' toggle in the legend, else the
 * one `toggleAfterRedraw` picks; the table's scrolling region when it still scrolls. Without this a
 * redraw (a new analysis, the note closing, a theme change) would drop a keyboard user's focus to
 * the top of the page.
 */
function restoreFocus(f: FocusedControl | null, layouts: readonly PanelLayout[]): void {
  const main = document.getElementById('charts');
  if (!f || !main) return;
  const buttons = main.querySelectorAll<HTMLButtonElement>('button.go');
  let target: HTMLElement | null = null;
  if (f.kind === 'all-rows') target = main.querySelector<HTMLButtonElement>('button.all-rows');
  if (f.kind === 'table') target = main.querySelector<HTMLElement>('section.values[tabindex]');
  if (f.kind === 'row') {
    for (const b of buttons) if (Number(b.dataset.index) <= f.index) target = b;
  }
  if (f.kind === 'series') {
    const key = toggleAfterRedraw(f.key, f.panel, layouts);
    for (const b of main.querySelectorAll<HTMLButtonElement>('button.series-toggle')) if (b.dataset.series === key) target = b;
  }
  (target ?? buttons[0] ?? null)?.focus();
}

/**
 * What the page keeps (`TrendViewState`): VS Code gives it back when the page is loaded again (the
 * panel hidden and shown again, or the window reloaded), so the reader's choices outlive the page.
 */
const restored = trendViewState(vscode.getState());
/** The note shown, kept for a reload. */
let keptUri: string | undefined = restored?.uri;
/** Whether this page has written its state yet (a state kept by an older page is written anew once). */
let stateWritten = false;

/**
 * Series the reader has hidden with the legend's toggles: still hidden after a redraw, in another
 * note, and once the page is loaded again (kept in its state).
 */
const hiddenSeries = new Set<TrendSeries>(restored?.hidden ?? []);

function keepState(): void {
  const hidden = [...hiddenSeries];
  vscode.setState(keptUri === undefined ? { hidden } : { uri: keptUri, hidden });
  stateWritten = true;
}

function span(className: string, text: string): HTMLSpanElement {
  const el = document.createElement('span');
  el.className = className;
  el.textContent = text;
  return el;
}

/**
 * A panel's legend, below its chart and outside the part hidden from screen readers: what the x
 * values are and the label of the point under the mouse, then per series a sample of its line and
 * its label in a toggle button that shows or hides the line (pressed while shown), and its value
 * under the mouse. The values are for the eye (hidden from screen readers: the table has them);
 * `showAt` writes those of a point, or dashes for none.
 */
function panelLegend(panel: PanelLayout, chart: uPlot, lineWidth: number, hours: boolean): { element: HTMLElement; showAt(idx: number | null): void } {
  const box = document.createElement('div');
  box.className = 'legend';
  box.setAttribute('role', 'group');
  box.setAttribute('aria-label', legendName(panel.title));
  const at = span('at', '');
  at.setAttribute('aria-hidden', 'true');
  const atValue = span('value', '—');
  at.append(span('label', hours ? 'hour' : '#'), atValue);
  box.append(at);
  const values = panel.series.map((s, position) => {
    const item = span('item', '');
    const button = document.createElement('button');
    button.type = 'button';
    button.className = 'series-toggle';
    button.dataset.series = s.key;
    button.setAttribute('aria-label', toggleName(s.label));
    const marker = span('marker', '');
    marker.setAttribute('aria-hidden', 'true');
    marker.style.borderTop = `${lineWidth}px ${seriesDash(position, lineWidth).border} ${themeColour(s.colour)}`;
    button.append(marker, span('label', s.label));
    const value = span('value', '—');
    value.setAttribute('aria-hidden', 'true');
    const shown = (show: boolean) => {
      button.setAttribute('aria-pressed', String(show));
      item.classList.toggle('off', !show);
    };
    shown(!hiddenSeries.has(s.key));
    button.addEventListener('click', () => {
      const show = hiddenSeries.has(s.key);
      if (show) hiddenSeries.delete(s.key);
      else hiddenSeries.add(s.key);
      shown(show);
      keepState();
      chart.setSeries(position + 1, { show });
    });
    item.append(button, value);
    box.append(item);
    return value;
  });
  const xs = chart.data[0];
  return {
    element: box,
    showAt(idx) {
      atValue.textContent = labelAt(idx === null ? null : (xs[idx] ?? null), idx);
      values.forEach((v, i) => { v.textContent = legendText(idx === null ? null : (panel.columns[i]?.[idx] ?? null), panel.series[i]!.unit); });
    },
  };
}

/**
 * The values table scrolls sideways when it is wider than the view (many series, a narrow
 * panel): then its region takes the focus, so that the arrow keys scroll it (its buttons, in its
 * first column, would not); otherwise it is no stop of the Tab key.
 */
function scrollableByKeyboard(section: Element | null): void {
  if (!(section instanceof HTMLElement)) return;
  if (section.scrollWidth > section.clientWidth) section.tabIndex = 0;
  else section.removeAttribute('tabindex');
}

/** What the status line last said (it speaks only when that changes). */
let announced = '';

/**
 * Says what the page now shows, through its status line (a polite live region), once: the page is
 * redrawn after every analysis of the note, and a live region around the charts and the table
 * would read all of them out at each keystroke. The same words again say nothing.
 */
function announce(text: string): void {
  if (text === announced) return;
  announced = text;
  const status = document.getElementById('announce');
  if (status) status.textContent = text;
}

function render(list: readonly TrendPoint[], note: string, closed: boolean): void {
  const focused = focusedControl();
  points = list;
  lastNote = note;
  lastClosed = closed;
  for (const c of charts.splice(0)) c.destroy();
  const main = document.getElementById('charts');
  const title = document.getElementById('title');
  if (title) title.textContent = `Trends — ${shownEscaped(note)}`;
  if (!main) return;
  main.replaceChildren();
  if (closed) main.append(paragraph('notice', 'This note is closed: these are its trends as they were when it closed. Go to a timepoint to open it again.'));
  const empty = emptyMessage(list);
  const shown = `Trends of ${shownEscaped(note)}${closed ? ', as they were when the note closed' : ''}`;
  if (empty !== null) {
    main.append(paragraph('empty', empty));
    announce(`${shown}: ${empty}`);
    return;
  }
  announce(`${shown}.`);
  const { xs, hours } = xAxis(list);
  const fg = cssVar('--vscode-foreground', '#888');
  const grid = cssVar('--vscode-editorWidget-border', cssVar('--vscode-panel-border', 'rgba(128,128,128,0.3)'));
  const hc = highContrast();
  const width = Math.max(280, main.clientWidth - 8);
  const layouts = panelLayouts(list);
  for (const panel of layouts) {
    const section = document.createElement('section');
    section.className = 'panel';
    section.setAttribute('aria-label', panel.name);
    const h = document.createElement('h2');
    h.textContent = panel.title;
    section.append(h);
    main.append(section);
    const data: uPlot.AlignedData = [xs, ...panel.columns];
    const lineWidth = hc ? 3 : 2;
    const axisStyle = { stroke: fg, grid: { stroke: grid, width: 1 }, ticks: { stroke: grid, width: 1 } };
    let legend: ReturnType<typeof panelLegend> | null = null;
    const opts: uPlot.Options = {
      width,
      height: 170,
      // No zoom by dragging across the chart (uPlot's default): only a pointer could do it, only a
      // double click undo it, the next analysis of the note undid it anyway, and a click that
      // moved a little zoomed instead of going to the timepoint.
      cursor: { points: { size: hc ? 10 : 7 }, drag: { x: false, y: false, setScale: false } },
      // The page's own legend (panelLegend) shows the values under the cursor.
      legend: { show: false },
      hooks: { setCursor: [(u) => legend?.showAt(u.cursor.idx ?? null)] },
      scales: { x: { time: false }, y: {}, ...(panel.rightLabel !== null ? { r: panel.series.some((s) => s.key === 'ph' && s.axis === 1) ? { range: pHRange } : {} } : {}) },
      axes: [
        { ...axisStyle, label: hours ? 'hours since day 1 00:00' : 'timepoint' },
        { ...axisStyle, label: panel.leftLabel, scale: 'y' },
        ...(panel.rightLabel !== null ? [{ ...axisStyle, label: panel.rightLabel, scale: 'r', side: 1 as const, grid: { show: false } }] : []),
      ],
      series: [
        { label: hours ? 'hour' : '#' },
        ...panel.series.map((s, position) => ({
          label: s.label,
          scale: s.axis === 1 ? 'r' : 'y',
          show: !hiddenSeries.has(s.key),
          stroke: themeColour(s.colour),
          width: lineWidth,
          dash: seriesDash(position, lineWidth).segments,
          spanGaps: true,
          points: { show: true, size: hc ? 8 : 5, fill: themeColour(s.colour) },
        })),
      ],
    };
    const chart = new uPlot(opts, data, section);
    // The chart is a picture: hidden from screen readers, which are told where the same values
    // are. It holds no control: its legend's toggles come after it, outside it.
    chart.root.setAttribute('aria-hidden', 'true');
    section.append(paragraph('visually-hidden', `${wordList(panel.series.map((s) => s.label))} by ${hours ? 'hour' : 'timepoint'}: a chart, its values in the table "Values by timepoint" below.`));
    legend = panelLegend(panel, chart, lineWidth, hours);
    section.append(legend.element);
    chart.over.addEventListener('click', () => {
      const idx = chart.cursor.idx;
      if (idx === null || idx === undefined) return;
      const point = points[idx];
      if (point) reveal(point.line);
    });
    charts.push(chart);
  }
  main.append(table(list));
  scrollableByKeyboard(main.querySelector('section.values'));
  restoreFocus(focused, layouts);
}

/**
 * Rows of the table shown at first: a table of thousands of timepoints takes seconds to lay out at
 * every redraw (55,000 cells for 5,000 timepoints), while the charts above show them all. A long
 * note shows its latest timepoints, with a button that shows every one of them for that note.
 */
export const TABLE_ROWS = 500;
/** The note whose table shows every row (asked for with the button), until another note is shown. */
let allRowsFor: string | null = null;

/** The values as a table, with a button per timepoint to go to it. */
function table(list: readonly TrendPoint[]): HTMLElement {
  const { headings, rows: allRows } = timepointTable(list);
  const whole = allRows.length <= TABLE_ROWS || allRowsFor === lastUri;
  const rows = whole ? allRows : allRows.slice(allRows.length - TABLE_ROWS);
  const section = document.createElement('section');
  section.className = 'values';
  section.setAttribute('aria-label', 'Values by timepoint');
  const h = document.createElement('h2');
  h.textContent = 'Values by timepoint';
  const t = document.createElement('table');
  const caption = document.createElement('caption');
  caption.textContent = 'Each timepoint\'s button moves the editor to it. * uses a value carried from an earlier timepoint.';
  const head = document.createElement('tr');
  for (const text of ['Timepoint', ...headings]) {
    const th = document.createElement('th');
    th.scope = 'col';
    th.textContent = text;
    head.append(th);
  }
  const thead = document.createElement('thead');
  thead.append(head);
  const tbody = document.createElement('tbody');
  const first = allRows.length - rows.length;
  rows.forEach((row, i) => {
    const tr = document.createElement('tr');
    const th = document.createElement('th');
    th.scope = 'row';
    const button = document.createElement('button');
    button.type = 'button';
    button.className = 'go';
    button.textContent = row.label;
    button.title = `Go to line ${row.line + 1}`;
    button.dataset.index = String(first + i);
    button.addEventListener('click', () => reveal(row.line));
    // What the button does, beyond the tooltip that only a mouse shows: its accessible description
    // (read by screen readers after its name), and shown beside it while it has the keyboard focus.
    const does = span('go-line', `Go to line ${row.line + 1}`);
    does.id = `go-line-${first + i}`;
    does.setAttribute('aria-hidden', 'true');
    button.setAttribute('aria-describedby', does.id);
    th.append(button, does);
    tr.append(th);
    for (const cell of row.cells) {
      const td = document.createElement('td');
      td.textContent = cell;
      tr.append(td);
    }
    tbody.append(tr);
  });
  t.append(caption, thead, tbody);
  section.append(h);
  if (!whole) {
    const more = document.createElement('p');
    more.className = 'more';
    more.textContent = `The latest ${TABLE_ROWS} of ${allRows.length} timepoints (the charts show them all). `;
    const all = document.createElement('button');
    all.type = 'button';
    all.className = 'all-rows';
    all.textContent = `Show all ${allRows.length} timepoints`;
    all.addEventListener('click', () => {
      allRowsFor = lastUri;
      const whole = table(list);
      section.replaceWith(whole);
      scrollableByKeyboard(whole);
      // The button is gone with the section it was in: the focus goes to the first timepoint.
      whole.querySelector<HTMLButtonElement>('button.go')?.focus();
    });
    more.append(all);
    section.append(more);
  }
  section.append(t);
  return section;
}

/** The label of the point at `idx` (by its index: two timepoints may share a time), else its x value. */
function labelAt(x: number | null, idx: number | null): string {
  const p = idx === null ? undefined : points[idx];
  return p ? shownEscaped(p.label) : x === null ? '—' : String(x);
}

function showText(className: string, text: string): void {
  for (const c of charts.splice(0)) c.destroy();
  points = [];
  const main = document.getElementById('charts');
  if (main) main.replaceChildren(paragraph(className, text));
}

/**
 * The latest message not drawn yet. Messages are drawn once those that arrived meanwhile have been
 * read, and only the last of them: drawing a long note takes a while, and a note edited at speed
 * sends its trends again after each analysis, so the page would otherwise fall ever further behind,
 * drawing each one in turn.
 */
let latest: ToWebview | null = null;

function drawLatest(): void {
  const m = latest;
  latest = null;
  if (!m) return;
  if (m.type === 'trends') {
    lastUri = m.uri;
    render(m.points, m.note, m.closed);
  }
  if (m.type === 'error') {
    showText('error', `Trends could not be loaded: ${m.message}`);
    announce(`Trends could not be loaded: ${m.message}`);
  }
  if (m.type === 'notice') {
    const title = document.getElementById('title');
    if (title) title.textContent = 'Trends';
    showText('empty', m.message);
    announce(m.message);
  }
}

window.addEventListener('message', (event: MessageEvent<unknown>) => {
  // Checked before anything is drawn or kept: a message of another shape changes nothing.
  const m = toWebview(event.data);
  if (!m) {
    console.warn('Pneumark trend view: a message of an unknown shape was ignored.');
    return;
  }
  received = true;
  // Kept by VS Code across a reload of the window, for the serializer to reopen this note.
  const uri = m.type === 'error' ? undefined : m.uri;
  if (uri !== undefined && (uri !== keptUri || !stateWritten)) {
    keptUri = uri;
    keepState();
  }
  if (latest === null) window.setTimeout(drawLatest, 0);
  latest = m;
});

let resizeTimer: number | undefined;
window.addEventListener('resize', () => {
  window.clearTimeout(resizeTimer);
  resizeTimer = window.setTimeout(() => {
    const main = document.getElementById('charts');
    const width = Math.max(280, (main?.clientWidth ?? 300) - 8);
    for (const c of charts) c.setSize({ width, height: 170 });
    scrollableByKeyboard(document.querySelector('section.values'));
  }, 100);
});

// Redraw with the new colours when the editor theme changes: VS Code swaps the body's classes
// (light, dark, high contrast) and its theme attributes, and sets the colours as CSS variables on
// the root element (another theme of the same kind changes only those).
const redraw = () => { if (received && charts.length > 0) render(points, lastNote, lastClosed); };
new MutationObserver(redraw).observe(document.body, { attributes: true, attributeFilter: ['class', 'data-vscode-theme-id', 'data-vscode-theme-kind'] });
new MutationObserver(redraw).observe(document.documentElement, { attributes: true, attributeFilter: ['style'] });

vscode.postMessage({ type: 'ready' });
