/**
 * Pneumark's own requests and notifications between the VS Code client and the language
 * server, declared once and imported by both sides. Methods carry the `pneumark/` prefix.
 * Plain types only: no LSP library imports, so the client and the server share this file.
 */

/** The series the trend view plots, one point per timepoint. */
export const TRENDS_REQUEST = 'pneumark/trends';

export interface TrendsParams {
  readonly uri: string;
}

export const TREND_SERIES = ['pao2', 'paco2', 'ph', 'pf_ratio', 'spo2', 'fio2', 'peep', 'driving_pressure', 'compliance_static'] as const;
export type TrendSeries = (typeof TREND_SERIES)[number];

/**
 * Units of plotted values. Gas pressures (PaO2, PaCO2) and P/F are in one unit for the whole note,
 * mmHg or kPa: the unit the note writes its gases in (most of them; a tie goes to the last).
 */
export type TrendUnit = 'mmHg' | 'kPa' | 'pH' | '%' | 'cmH2O' | 'mL/cmH2O';

/** A plotted value in its unit, ready to draw: the view converts nothing. */
export interface TrendValue {
  readonly value: number;
  readonly unit: TrendUnit;
}

export interface TrendPoint {
  readonly timepoint: number;
  readonly label: string;
  /** 0-based line of the timepoint (its `@` line, or its first line). */
  readonly line: number;
  /** Minutes since day 1 00:00, when known. */
  readonly minutes: number | null;
  /** Values by series, each with its unit (FiO2 as a percentage, like SpO2); absent when not known. */
  readonly values: Partial<Record<TrendSeries, TrendValue>>;
  /** Series whose value used a carried-forward input. */
  readonly carried: readonly TrendSeries[];
}

export interface TrendsResult {
  readonly uri: string;
  readonly version: number | null;
  readonly points: readonly TrendPoint[];
  /** Why the note has no points although it may have timepoints: it is too large to be analysed. */
  readonly notAnalysed?: string;
}

/** The key figures of the timepoint at a line (for a status bar). */
export const SUMMARY_REQUEST = 'pneumark/timepointSummary';

export interface SummaryParams {
  readonly uri: string;
  readonly line: number;
}

export interface SummaryResult {
  readonly label: string;
  /** A compact line of figures, e.g. `P/F 147 · PaCO2 47 · pH 7.31`. */
  readonly text: string;
  readonly tooltip: string;
}

/** Edits converting every gas pressure of a note to one unit. */
export const CONVERT_UNITS_REQUEST = 'pneumark/convertUnits';

export interface ConvertUnitsParams {
  readonly uri: string;
  readonly to: 'mmHg' | 'kPa';
}

export interface PlainTextEdit {
  readonly range: { readonly start: { readonly line: number; readonly character: number }; readonly end: { readonly line: number; readonly character: number } };
  readonly newText: string;
}

/** Sent after a note has been analysed and its diagnostics published. */
export const ANALYSED_NOTIFICATION = 'pneumark/analysed';

export interface AnalysedParams {
  readonly uri: string;
  readonly version: number;
  /** Milliseconds the analysis took, from its start to its diagnostics. */
  readonly millis: number;
  /** Steps it was read in (see NoteSession.steps); 1 for an ordinary edit. */
  readonly steps: number;
  /** Milliseconds of the longest step: the longest the server was busy with it at a stretch. */
  readonly longestStepMillis: number;
}
