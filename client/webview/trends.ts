/**
 * The trend view's page: small multiples drawn with uPlot (bundled, no network), coloured from
 * the editor theme's chart colours, redrawn on each message from the extension. What each panel
 * holds, its axis labels and legend texts come from panels.ts; values are drawn in the units the
 * server gives them in (gas pressures in the note's unit, mmHg or kPa). Clicking a chart moves
 * the editor to the timepoint under the cursor.
 */
import uPlot from 'uplot';
import type { TrendPoint } from '../../server/src/protocol';
import type { FromWebview, ToWebview } from './messages';
import { legendText, panelLayouts } from './panels';

interface VsCodeApi {
  postMessage(message: FromWebview): void;
}
declare function acquireVsCodeApi(): VsCodeApi;

const vscode = acquireVsCodeApi();

const charts: uPlot[] = [];
let points: readonly TrendPoint[] = [];

function themeColour(name: string, fallback: string): string {
  const value = getComputedStyle(document.body).getPropertyValue(`--vscode-charts-${name}`).trim();
  return value || fallback;
}

function cssVar(name: string, fallback: string): string {
  return getComputedStyle(document.body).getPropertyValue(name).trim() || fallback;
}

function highContrast(): boolean {
  return document.body.classList.contains('vscode-high-contrast') || document.body.classList.contains('vscode-high-contrast-light');
}

/** x values: hours since day 1 00:00 when every timepoint has a time, else the timepoint number. */
function xValues(list: readonly TrendPoint[]): { xs: number[]; hours: boolean } {
  const hours = list.length > 0 && list.every((p) => p.minutes !== null);
  return { xs: list.map((p, i) => (hours ? (p.minutes ?? 0) / 60 : i + 1)), hours };
}

function render(list: readonly TrendPoint[], note: string): void {
  points = list;
  for (const c of charts.splice(0)) c.destroy();
  const main = document.getElementById('charts');
  const title = document.getElementById('title');
  if (title) title.textContent = `Trends — ${note}`;
  if (!main) return;
  main.replaceChildren();
  if (list.length === 0) {
    const p = document.createElement('p');
    p.className = 'empty';
    p.textContent = 'No timepoints with values to plot yet.';
    main.append(p);
    return;
  }
  const { xs, hours } = xValues(list);
  const fg = cssVar('--vscode-foreground', '#888');
  const grid = cssVar('--vscode-editorWidget-border', cssVar('--vscode-panel-border', 'rgba(128,128,128,0.3)'));
  const hc = highContrast();
  const width = Math.max(280, main.clientWidth - 8);
  for (const panel of panelLayouts(list)) {
    const section = document.createElement('section');
    section.className = 'panel';
    section.setAttribute('aria-label', panel.name);
    const h = document.createElement('h2');
    h.textContent = panel.title;
    section.append(h);
    main.append(section);
    const data: uPlot.AlignedData = [xs, ...panel.columns];
    const axisStyle = { stroke: fg, grid: { stroke: grid, width: 1 }, ticks: { stroke: grid, width: 1 } };
    const opts: uPlot.Options = {
      width,
      height: 170,
      cursor: { points: { size: hc ? 10 : 7 } },
      legend: { live: true },
      scales: { x: { time: false }, y: {}, ...(panel.rightLabel !== null ? { r: {} } : {}) },
      axes: [
        { ...axisStyle, label: hours ? 'hours since day 1 00:00' : 'timepoint' },
        { ...axisStyle, label: panel.leftLabel, scale: 'y' },
        ...(panel.rightLabel !== null ? [{ ...axisStyle, label: panel.rightLabel, scale: 'r', side: 1 as const, grid: { show: false } }] : []),
      ],
      series: [
        { label: hours ? 'hour' : '#', value: (_u, v) => (v === null ? '—' : labelAt(v, xs)) },
        ...panel.series.map((s) => ({
          label: s.label,
          scale: s.axis === 1 ? 'r' : 'y',
          stroke: themeColour(s.colour, '#3794ff'),
          width: hc ? 3 : 2,
          spanGaps: true,
          points: { show: true, size: hc ? 8 : 5, fill: themeColour(s.colour, '#3794ff') },
          value: (_u: uPlot, v: number | null) => legendText(v, s.unit),
        })),
      ],
    };
    const chart = new uPlot(opts, data, section);
    chart.over.addEventListener('click', () => {
      const idx = chart.cursor.idx;
      if (idx === null || idx === undefined) return;
      const point = points[idx];
      if (point) vscode.postMessage({ type: 'reveal', line: point.line });
    });
    charts.push(chart);
  }
}

function labelAt(x: number, xs: readonly number[]): string {
  const i = xs.indexOf(x);
  const p = i >= 0 ? points[i] : undefined;
  return p ? p.label : String(x);
}

window.addEventListener('message', (event: MessageEvent<ToWebview>) => {
  const m = event.data;
  if (m.type === 'trends') {
    lastNote = m.note;
    render(m.points, m.note);
  }
  if (m.type === 'error') {
    const main = document.getElementById('charts');
    if (main) main.textContent = `Trends could not be loaded: ${m.message}`;
  }
});

let resizeTimer: number | undefined;
window.addEventListener('resize', () => {
  window.clearTimeout(resizeTimer);
  resizeTimer = window.setTimeout(() => {
    const main = document.getElementById('charts');
    const width = Math.max(280, (main?.clientWidth ?? 300) - 8);
    for (const c of charts) c.setSize({ width, height: 170 });
  }, 100);
});

// Redraw with the new colours when the editor theme changes (VS Code swaps the body's classes).
let lastNote = '';
new MutationObserver(() => render(points, lastNote)).observe(document.body, { attributes: true, attributeFilter: ['class'] });

vscode.postMessage({ type: 'ready' });
