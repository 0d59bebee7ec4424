/**
 * `pneumark check` output. Text: one line per finding, `path:line:col  severity  code  message`.
 * JSON: the stable shape documented in README.md ("JSON output"), version 1. SARIF 2.1.0. All
 * three are written in pieces (a big folder's output is larger than one string can hold).
 */
import { sep } from 'node:path';
import { CHECKS } from '../core/checks/registry';
import { sarifLogParts, type SarifConfigurationProblem } from '../core/export/sarif';
import { PNEUMARK_VERSION } from '../core/version';
import type { Finding } from '../core/types';
import type { Paint } from './colour';
import { countSeverities, type SeverityCounts } from './render-show';
import { visible } from './visible';

export interface FileOutcome {
  readonly path: string;
  readonly findings: readonly Finding[];
  readonly problem: string | null;
  /** Timepoints with values and derived values (JSON output only). */
  readonly timepoints?: unknown[];
  /** The note's entry in the JSON output, already written out (by a worker: see `jsonFileEntry`). */
  readonly entry?: string;
  /** Every finding of the note by severity, when `findings` keeps only the errors (`--quiet`). */
  readonly counts?: SeverityCounts;
}

/** Adds a note's findings by severity to `into`: every finding, also those `--quiet` did not keep. */
export function countOutcome(o: FileOutcome, into: SeverityCounts): SeverityCounts {
  const c = o.counts;
  if (c === undefined) return countSeverities(o.findings, into);
  into.error += c.error;
  into.warning += c.warning;
  into.information += c.information;
  into.hint += c.hint;
  return into;
}

const aliasOf = new Map(CHECKS.map((c) => [c.code, c.alias]));

/** Where a long output goes: written in pieces, waiting while the reader is behind (see `Output`). */
export interface Sink {
  write(text: string): void;
  ready(): Promise<void>;
}

/** Pieces of output gathered up to this many characters before they are written. */
const PIECE = 1 << 20;

/** Output gathered into pieces of about a megabyte, each written to the sink once full. */
class Pieces {
  private piece = '';

  constructor(private readonly out: Sink) {}

  /** Adds text; when that fills the piece, writes it and returns a wait for the sink to take more. */
  add(text: string): Promise<void> | null {
    this.piece += text;
    if (this.piece.length < PIECE) return null;
    this.out.write(this.piece);
    this.piece = '';
    return this.out.ready();
  }

  /** Writes what is left, with `text` after it. */
  end(text: string): void {
    this.out.write(this.piece + text);
    this.piece = '';
  }
}

/**
 * Text output: a line per finding (`--quiet`: errors only) and a line of totals, written in pieces
 * of about a megabyte. Paths and messages (which quote the note) have their control characters
 * made visible (see `visible`).
 */
export async function writeCheckText(outcomes: readonly FileOutcome[], p: Paint, quiet: boolean, out: Sink): Promise<void> {
  const total: SeverityCounts = { error: 0, warning: 0, information: 0, hint: 0 };
  const pieces = new Pieces(out);
  for (const o of outcomes) {
    let lines = '';
    if (o.problem) {
      lines = `${visible(o.path)}: ${p.red('cannot check')}: ${visible(o.problem)}\n`;
    } else {
      countOutcome(o, total);
      const path = visible(o.path);
      for (const f of o.findings) {
        if (quiet && f.severity !== 'error') continue;
        const sev = f.severity === 'error' ? p.red('error') : f.severity === 'warning' ? p.yellow('warning') : p.blue(f.severity === 'information' ? 'info' : 'hint');
        lines += `${path}:${f.range.start.line + 1}:${f.range.start.character + 1}  ${sev}  ${p.dim(`${f.code} ${aliasOf.get(f.code) ?? ''}`)}  ${visible(f.message)}\n`;
      }
    }
    const full = pieces.add(lines);
    if (full) await full;
  }
  const checked = outcomes.filter((o) => !o.problem).length;
  const unreadable = outcomes.length - checked;
  pieces.end(`${checked} note${checked === 1 ? '' : 's'} checked${unreadable ? `, ${unreadable} could not be checked` : ''}: ${total.error} error${total.error === 1 ? '' : 's'}, ${total.warning} warning${total.warning === 1 ? '' : 's'}, ${total.information} info.\n`);
}

export interface JsonFinding {
  readonly code: string;
  readonly alias: string;
  readonly severity: Finding['severity'];
  readonly message: string;
  /** 1-based line and column (UTF-16 code units), for people. */
  readonly line: number;
  readonly column: number;
  readonly endLine: number;
  readonly endColumn: number;
  /** 0-based LSP range, for tools. */
  readonly range: Finding['range'];
  readonly fixes: Finding['fixes'];
  readonly doc: string;
}

export function toJsonFinding(f: Finding): JsonFinding {
  return {
    code: f.code,
    alias: aliasOf.get(f.code) ?? '',
    severity: f.severity,
    message: f.message,
    line: f.range.start.line + 1,
    column: f.range.start.character + 1,
    endLine: f.range.end.line + 1,
    endColumn: f.range.end.character + 1,
    range: f.range,
    fixes: f.fixes,
    doc: `docs/checks.md#${f.docAnchor}`,
  };
}

/**
 * Writes the JSON output a note at a time (a folder of notes with their timepoints makes gigabytes
 * of JSON: more than one string can hold): `file` for each note in order, then `end`. The bytes are
 * those of `JSON.stringify` of the whole object with two-space indentation. With `errorsOnly`
 * (`--quiet`) each note lists its error findings only; the summary still counts every finding.
 */
export class CheckJsonWriter {
  private readonly total: SeverityCounts = { error: 0, warning: 0, information: 0, hint: 0 };
  private files = 0;
  private unreadable = 0;

  constructor(private readonly out: { write(s: string): unknown }, private readonly errorsOnly = false) {
    out.write('{\n  "pneumark": 1,\n  "files": [');
  }

  /** Writes a note's entry; returns the note's problem (see `jsonFileEntryOrProblem`). */
  file(o: FileOutcome): string | null {
    countOutcome(o, this.total);
    const { entry, problem } = o.entry !== undefined ? { entry: o.entry, problem: o.problem } : jsonFileEntryOrProblem(o, this.errorsOnly);
    if (problem) this.unreadable++;
    this.out.write(`${this.files++ === 0 ? '' : ','}\n    ${entry}`);
    return problem;
  }

  /** Closes the list of files and writes the summary (no line break after the closing brace). */
  end(): void {
    const t = this.total;
    const summary = { files: this.files, unreadable: this.unreadable, errors: t.error, warnings: t.warning, information: t.information, hints: t.hint };
    this.out.write(`${this.files === 0 ? '' : '\n  '}],\n  "summary": ${nested(summary, '  ')}\n}`);
  }
}

/**
 * One note's entry in the JSON output, as nested there (`errorsOnly`: with its error findings
 * only). A worker writes it out itself: a string crosses to the main thread in one copy, where the
 * timepoints as objects would be cloned one by one.
 */
export function jsonFileEntry(o: FileOutcome, errorsOnly = false): string {
  const file = {
    path: o.path,
    problem: o.problem,
    findings: (errorsOnly ? o.findings.filter((f) => f.severity === 'error') : o.findings).map(toJsonFinding),
    ...(o.timepoints ? { timepoints: o.timepoints } : {}),
  };
  return nested(file, '    ');
}

/** Why a note's JSON entry leaves out its timepoints, when they make more JSON than one string can hold. */
export const TOO_MUCH_JSON = 'its timepoints make more JSON than one string can hold; check it with --format text or sarif, or export it with --format jsonl or csv';

/** Why a note's JSON entry leaves out its findings (and timepoints), when they make more JSON than one string can hold. */
export const TOO_MANY_FINDINGS = 'its findings make more JSON than one string can hold; check it with --format text or sarif';

/**
 * The note's entry, or, when its timepoints make more JSON than one string can hold (hundreds of
 * megabytes: a note of tens of thousands of timepoints), its entry without them and with a problem
 * that says so, so the run goes on and ends with exit code 2; when its findings alone make too
 * much (a note of a million bare timepoints has a finding on each), its entry without either.
 */
export function jsonFileEntryOrProblem(o: FileOutcome, errorsOnly = false): { readonly entry: string; readonly problem: string | null } {
  try {
    return { entry: jsonFileEntry(o, errorsOnly), problem: o.problem };
  } catch (error) {
    if (!(error instanceof RangeError)) throw error;
  }
  if (o.timepoints) {
    try {
      return { entry: jsonFileEntry({ path: o.path, findings: o.findings, problem: TOO_MUCH_JSON }, errorsOnly), problem: TOO_MUCH_JSON };
    } catch (error) {
      if (!(error instanceof RangeError)) throw error;
    }
  }
  return { entry: jsonFileEntry({ path: o.path, findings: [], problem: TOO_MANY_FINDINGS }, errorsOnly), problem: TOO_MANY_FINDINGS };
}

/** A value as `JSON.stringify(…, null, 2)` writes it nested at `indent` (line breaks only come from the layout). */
function nested(value: unknown, indent: string): string {
  return JSON.stringify(value, null, 2).split('\n').join(`\n${indent}`);
}

export function renderCheckJson(outcomes: readonly FileOutcome[]): string {
  let text = '';
  const writer = new CheckJsonWriter({ write: (s: string) => { text += s; } });
  for (const o of outcomes) writer.file(o);
  writer.end();
  return text;
}

/**
 * SARIF 2.1.0, for code-scanning tools (rules come from the check registry), written a result at a
 * time in pieces of about a megabyte (the log of a big folder is larger than one string can hold).
 * The bytes are those of `JSON.stringify` of the whole log with two-space indentation.
 */
export async function writeCheckSarif(outcomes: readonly FileOutcome[], quiet: boolean, out: Sink, configurationProblems: readonly SarifConfigurationProblem[] = []): Promise<void> {
  const files = outcomes.map((o) => ({ path: o.path, findings: o.findings.filter((f) => !quiet || f.severity === 'error'), problem: o.problem }));
  const { log, resultsOf } = sarifLogParts(files, { toolVersion: PNEUMARK_VERSION, configurationProblems, backslashSeparates: sep === '\\' });
  const whole = JSON.stringify(log, null, 2);
  // `results` is the last member of the only run: its empty list is the last one in the text.
  const empty = '"results": []';
  const at = whole.lastIndexOf(empty);
  const pieces = new Pieces(out);
  await pieces.add(`${whole.slice(0, at)}"results": [`);
  let count = 0;
  for (const file of files) {
    for (const result of resultsOf(file)) {
      const full = pieces.add(`${count++ === 0 ? '' : ','}\n        ${nested(result, '        ')}`);
      if (full) await full;
    }
  }
  pieces.end(`${count === 0 ? '' : '\n      '}]${whole.slice(at + empty.length)}`);
}
