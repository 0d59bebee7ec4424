/**
 * What the trend view draws, worked out from the points apart from the page (no DOM, no chart
 * library, so it is tested on its own): the panels and series that have values, the unit of each
 * series and the label of each axis, the columns to plot and a value's text in the legend.
 *
 * The points carry each value with its unit (gas pressures and P/F in the unit the note writes its
 * gases in, mmHg or kPa; FiO2 as a percentage): nothing here converts a value.
 */
import type { TrendPoint, TrendSeries, TrendUnit } from '../../server/src/protocol';
import { shownEscaped } from '../../server/src/core/util/format';

/**
 * The x value of each point: hours since day 1 00:00 when every timepoint has a time and the
 * times never go back, else the timepoint's number (1, 2, …). The chart needs x values in order:
 * a note whose times go back (PN308) drawn by time would leave points off the chart, scale the
 * values to the wrong ones and send a click to another timepoint.
 */
export function xAxis(points: readonly TrendPoint[]): { xs: number[]; hours: boolean } {
  let hours = points.length > 0;
  for (let i = 0; i < points.length && hours; i++) {
    const minutes = points[i]!.minutes;
    if (minutes === null || !Number.isFinite(minutes) || (i > 0 && minutes < points[i - 1]!.minutes!)) hours = false;
  }
  return { xs: points.map((p, i) => (hours ? p.minutes! / 60 : i + 1)), hours };
}

export interface SeriesSpec {
  readonly key: TrendSeries;
  readonly label: string;
  /** A name of the editor theme's chart colours (`--vscode-charts-<colour>`). */
  readonly colour: string;
  /** Axis: 0 left, 1 right. */
  readonly axis: 0 | 1;
}

export interface PanelSpec {
  readonly title: string;
  readonly series: readonly SeriesSpec[];
}

export const PANELS: readonly PanelSpec[] = [
  { title: 'Oxygenation', series: [
    { key: 'pao2', label: 'PaO2', colour: 'blue', axis: 0 },
    { key: 'pf_ratio', label: 'P/F', colour: 'purple', axis: 0 },
  ] },
  { title: 'Carbon dioxide and pH', series: [
    { key: 'paco2', label: 'PaCO2', colour: 'orange', axis: 0 },
    { key: 'ph', label: 'pH', colour: 'green', axis: 1 },
  ] },
  { title: 'Saturation and FiO2', series: [
    { key: 'spo2', label: 'SpO2', colour: 'blue', axis: 0 },
    { key: 'fio2', label: 'FiO2', colour: 'red', axis: 0 },
  ] },
  { title: 'Ventilator', series: [
    { key: 'peep', label: 'PEEP', colour: 'yellow', axis: 0 },
    { key: 'driving_pressure', label: 'ΔP', colour: 'red', axis: 0 },
    { key: 'compliance_static', label: 'Cstat', colour: 'green', axis: 1 },
  ] },
];

/**
 * How the series of a panel are told apart besides their colours (two theme colours may look alike,
 * to a reader or on a theme): the first is drawn solid, the second dashed, the third dotted, and
 * the legend's sample of each line likewise. `segments`: the canvas's dash pattern for a line
 * `width` pixels wide (empty: solid); `border`: the CSS border style of the legend's sample.
 */
export function seriesDash(position: number, width: number): { segments: number[]; border: 'solid' | 'dashed' | 'dotted' } {
  if (position % 3 === 1) return { segments: [4 * width, 2 * width], border: 'dashed' };
  if (position % 3 === 2) return { segments: [width, 1.5 * width], border: 'dotted' };
  return { segments: [], border: 'solid' };
}

/** A series with values, and the unit they are in. */
/** The narrowest pH axis: 0.2 of pH, so that one gas sits mid-axis. */
export const PH_AXIS_SPAN = 0.2;

/**
 * The pH axis's ends when its values span less than `PH_AXIS_SPAN`: that span, centred on them
 * and on hundredths (one gas at pH 7.30 is drawn on 7.20 to 7.40). Null otherwise, and where there
 * is no value: the chart's own padded range then (the chart's default made a lone pH 7.30 an axis
 * from 0 to 14, with the point halfway up like a PaCO2 of 50 on its own axis).
 */
export function phAxisRange(min: number | null, max: number | null): [number, number] | null {
  if (min === null || max === null || !Number.isFinite(min) || !Number.isFinite(max) || max - min >= PH_AXIS_SPAN) return null;
  const low = Math.round(((min + max) / 2 - PH_AXIS_SPAN / 2) * 100) / 100;
  return [low, Math.round((low + PH_AXIS_SPAN) * 100) / 100];
}

export interface PlottedSeries extends SeriesSpec {
  readonly unit: TrendUnit;
}

export interface PanelLayout {
  readonly title: string;
  /** The title with the units of its axes, for screen readers (the axes are drawn, not text): `Oxygenation (kPa)`. */
  readonly name: string;
  readonly series: readonly PlottedSeries[];
  /** The left axis's label: the units of the series on it (`kPa`, `%`); empty when none is. */
  readonly leftLabel: string;
  /** The right axis's label, or null when no series with values is on it (then there is no right axis). */
  readonly rightLabel: string | null;
  /** One column per series, in the order of `series`: its value at each point, or null. */
  readonly columns: readonly (number | null)[][];
}

/** The panels that have values at some point, in the order of PANELS. */
export function panelLayouts(points: readonly TrendPoint[]): PanelLayout[] {
  const layouts: PanelLayout[] = [];
  for (const panel of PANELS) {
    const series: PlottedSeries[] = [];
    for (const s of panel.series) {
      // The server gives a series in one unit at every point (gas pressures in the note's unit).
      const unit = points.find((p) => p.values[s.key] !== undefined)?.values[s.key]?.unit;
      if (unit !== undefined) series.push({ ...s, unit });
    }
    if (series.length === 0) continue;
    const leftLabel = axisLabel(series, 0);
    const rightLabel = series.some((s) => s.axis === 1) ? axisLabel(series, 1) : null;
    const units = [leftLabel, rightLabel ?? ''].filter((label) => label !== '');
    layouts.push({
      title: panel.title,
      name: `${panel.title} (${units.join(', ')})`,
      series,
      leftLabel,
      rightLabel,
      columns: series.map((s) => points.map((p) => p.values[s.key]?.value ?? null)),
    });
  }
  return layouts;
}

/** The units of the series on an axis, each once: `kPa` for PaO2 and P/F of a kPa note. */
function axisLabel(series: readonly PlottedSeries[], axis: 0 | 1): string {
  return [...new Set(series.filter((s) => s.axis === axis).map((s) => s.unit))].join(' · ');
}

/**
 * A value as the legend shows it, to one decimal at most: `9.4 kPa`, `211.6 mmHg`, `28 %` (a
 * percentage worked out from a fraction may be 28.000000000000004); pH with two decimals and no
 * unit (`7.31`); `—` for none.
 */
export function legendText(v: number | null, unit: TrendUnit): string {
  if (v === null) return '—';
  if (unit === 'pH') return v.toFixed(2);
  return `${String(Number(v.toFixed(1)))} ${unit}`;
}

/**
 * What the view says instead of charts, or null when it has charts to draw: a note with no
 * timepoint, or with timepoints but none of the values the view plots (a note of vital signs
 * only would otherwise show an empty page).
 */
export function emptyMessage(points: readonly TrendPoint[]): string | null {
  if (points.length === 0) return 'This note has no timepoints yet: add one with a line such as "@ day 1 08:00".';
  if (panelLayouts(points).length > 0) return null;
  const names = PANELS.flatMap((p) => p.series.map((s) => s.label));
  return `No values to plot yet: the trend view draws ${names.slice(0, -1).join(', ')} and ${names[names.length - 1]!} (driving pressure), once a timepoint has one.`;
}

/** The values of each timepoint as a table, the charts' keyboard- and screen-reader-friendly twin. */
export interface TimepointTable {
  /** One heading per plotted series, with its unit: `PaO2 (kPa)`, `pH`. */
  readonly headings: readonly string[];
  readonly rows: readonly { readonly label: string; readonly line: number; readonly cells: readonly string[] }[];
}

export function timepointTable(points: readonly TrendPoint[]): TimepointTable {
  const series = panelLayouts(points).flatMap((p) => p.series);
  return {
    headings: series.map((s) => (s.unit === 'pH' ? s.label : `${s.label} (${s.unit})`)),
    rows: points.map((p) => ({
      // Characters that reorder or hide text written as escapes, as the editor's messages write them.
      label: shownEscaped(p.label),
      line: p.line,
      cells: series.map((s) => {
        const v = p.values[s.key];
        // The unit is in the heading; a value carried from an earlier timepoint is marked.
        const legend = v === undefined ? '—' : legendText(v.value, v.unit);
        const space = legend.indexOf(' ');
        const text = space >= 0 ? legend.slice(0, space) : legend;
        return v !== undefined && p.carried.includes(s.key) ? `${text}*` : text;
      }),
    })),
  };
}

/**
 * The legend of a panel is a row of toggles, one per series, that show or hide its line. Each is
 * named by what pressing it does, with the series' label as written under the chart (so a voice
 * command that says the visible label reaches it), and is pressed while the line is shown:
 * "Show the PaO2 line, toggle button, pressed". The name stays the same whatever the state.
 */
export function toggleName(label: string): string {
  return `Show the ${label} line`;
}

/** The name of a panel's group of toggles. */
export function legendName(title: string): string {
  return `Lines shown in the ${title} chart`;
}

/**
 * The series whose toggle takes the keyboard focus after a redraw, when the focus was on the
 * toggle of `key` in the panel titled `title`: the same series when it is still drawn, else the
 * first series of that panel, else the first of any panel; null when no panel is drawn.
 */
export function toggleAfterRedraw(key: TrendSeries, title: string, layouts: readonly PanelLayout[]): TrendSeries | null {
  for (const p of layouts) if (p.series.some((s) => s.key === key)) return key;
  const same = layouts.find((p) => p.title === title);
  return (same ?? layouts[0])?.series[0]?.key ?? null;
}
