/**
 * `pneumark check` output. Text: one line per finding, `path:line:col  severity  code  message`.
 * JSON: the stable shapes documented in README.md ("JSON output"), version 1 and, with
 * `--json-version 2`, version 2; indented for people (standard output a terminal, or `--indented`),
 * else compact with one line per note. SARIF 2.1.0. All three are written in pieces (a big
 * folder's output is larger than one string can hold).
 */
import { constants } from 'node:buffer';
import { sep } from 'node:path';
import { CHECKS } from '../core/checks/registry';
import { sarifLogParts, type SarifConfigurationProblem } from '../core/export/sarif';
import { PNEUMARK_VERSION } from '../core/version';
import type { Finding } from '../core/types';
import type { Paint } from './colour';
import { countSeverities, type SeverityCounts } from './render-show';
import { visible } from './visible';
import type { JsonDefinition, KeyedDefinition } from './timepoints-json';

/**
 * What `check --format json` writes of each note (`--json-detail`): `full`, its findings and its
 * timepoints with every value; `findings`, its path, problem and findings alone (for continuous
 * integration: a note's timepoints are tens of times the size of its findings).
 */
export type JsonDetail = 'full' | 'findings';

/**
 * How `check --format json` is written: its version (1, or 2 with the run's definitions in a
 * table), indented (two spaces a level, as `JSON.stringify(…, null, 2)`) or compact (no space
 * between tokens; a line break before each note's entry and before the end of the list of files,
 * so each note is one line), and its detail (`full` when not given). With `findings`, the run's
 * object says so after its version (`"detail": "findings"`), so that an entry without timepoints
 * is not read as a note whose timepoints could not be written, and in version 2 its table of
 * definitions is empty (no derived value points to one).
 */
export interface JsonLayout {
  readonly version: 1 | 2;
  readonly indented: boolean;
  readonly detail?: JsonDetail;
}

/** Version 1, indented: what `check --format json` wrote before layouts were chosen. */
export const INDENTED_V1: JsonLayout = { version: 1, indented: true };

export interface FileOutcome {
  readonly path: string;
  readonly findings: readonly Finding[];
  readonly problem: string | null;
  /** Timepoints with values and derived values (JSON output only). */
  readonly timepoints?: unknown[];
  /**
   * The same, each already written as it is nested in the note's entry (`timepointText`): what
   * the CLI keeps of a note's timepoints, a string each rather than the objects they were
   * written from. Used in place of `timepoints` when given.
   */
  readonly timepointTexts?: readonly string[];
  /** The note's entry in the JSON output, already written out (by a worker: see `jsonFileEntry`). */
  readonly entry?: string;
  /** Every finding of the note by severity, when `findings` keeps only the errors (`--quiet`). */
  readonly counts?: SeverityCounts;
  /** Version 2: the definitions the note's derived values point to (each once), for the run's table. */
  readonly definitions?: readonly KeyedDefinition[];
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

/**
 * Parts of a JSON entry gathered up to this many characters before they are written. Writing
 * makes the gathered parts into one string first, which V8 makes in its large-object space (a
 * block of memory of its own, fresh pages) once it is over 128 KB, 64 K characters of text with
 * any character outside Latin-1: gathering megabytes cost more than the JSON itself.
 */
const GATHER = 1 << 15;

/** The most characters one string holds (V8's limit). */
const MAX_STRING_LENGTH = constants.MAX_STRING_LENGTH;

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
 * of JSON: more than one string can hold): `file` for each note in order, then `end`. Indented, the
 * bytes are those of `JSON.stringify` of the whole object with two-space indentation; compact,
 * those of `JSON.stringify` of it with a line break before each note's entry and before the `]`
 * that ends the list of files (when it is not empty). With `errorsOnly` (`--quiet`) each note lists
 * its error findings only; the summary still counts every finding. Version 2 ends with the table of
 * the definitions the notes' derived values point to, by key in sorted order.
 */
export class CheckJsonWriter {
  private readonly total: SeverityCounts = { error: 0, warning: 0, information: 0, hint: 0 };
  private files = 0;
  private unreadable = 0;
  private readonly definitions = new Map<string, JsonDefinition>();

  constructor(private readonly out: { write(s: string): unknown }, private readonly errorsOnly = false, private readonly layout: JsonLayout = INDENTED_V1) {
    const findingsOnly = layout.detail === 'findings';
    out.write(layout.indented
      ? `{\n  "pneumark": ${layout.version},${findingsOnly ? '\n  "detail": "findings",' : ''}\n  "files": [`
      : `{"pneumark":${layout.version},${findingsOnly ? '"detail":"findings",' : ''}"files":[`);
  }

  /**
   * Writes a note's entry; returns the note's problem (see `jsonFileEntryOrProblem`). An entry
   * made here is never made into one string (the entry of a note of thousands of timepoints is
   * tens of megabytes): its parts are written as they are, gathered up to `GATHER` characters.
   */
  file(o: FileOutcome): string | null {
    countOutcome(o, this.total);
    const { parts, problem } = o.entry !== undefined ? { parts: [o.entry], problem: o.problem } : jsonFileEntryPartsOrProblem(o, this.errorsOnly, this.layout);
    if (problem) this.unreadable++;
    // An entry that had to leave its timepoints out (or was asked to) points to no definition.
    if (o.definitions !== undefined && this.layout.detail !== 'findings' && problem !== TOO_MUCH_JSON && problem !== TOO_MANY_FINDINGS) this.define(o.definitions);
    let piece = `${this.files++ === 0 ? '' : ','}\n${this.layout.indented ? '    ' : ''}`;
    for (const part of parts) {
      if (piece.length > 0 && piece.length + part.length > GATHER) {
        this.out.write(piece);
        piece = '';
      }
      piece += part;
    }
    this.out.write(piece);
    return problem;
  }

  /** Adds a note's definitions to the run's table; one key is one definition (see `definitionKey`). */
  private define(list: readonly KeyedDefinition[]): void {
    for (const d of list) {
      const known = this.definitions.get(d.key);
      if (known === undefined) this.definitions.set(d.key, { formula: d.formula, source: d.source });
      else if (known.formula !== d.formula || known.source !== d.source) throw new Error(`two definitions have the key ${d.key}`);
    }
  }

  /** Closes the list of files and writes the summary, and in version 2 the definitions (no line break after the closing brace). */
  end(): void {
    const t = this.total;
    const summary = { files: this.files, unreadable: this.unreadable, errors: t.error, warnings: t.warning, information: t.information, hints: t.hint };
    const keys = [...this.definitions.keys()].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
    const table = this.layout.version === 2 ? Object.fromEntries(keys.map((k) => [k, this.definitions.get(k)!])) : null;
    if (this.layout.indented) {
      this.out.write(`${this.files === 0 ? '' : '\n  '}],\n  "summary": ${nested(summary, '  ')}${table === null ? '' : `,\n  "definitions": ${nested(table, '  ')}`}\n}`);
    } else {
      this.out.write(`${this.files === 0 ? '' : '\n'}],"summary":${JSON.stringify(summary)}${table === null ? '' : `,"definitions":${JSON.stringify(table)}`}}`);
    }
  }
}

/**
 * One note's entry in the JSON output, as nested there (`errorsOnly`: with its error findings
 * only). A worker writes it out itself: a string crosses to the main thread in one copy, where the
 * timepoints as objects would be cloned one by one.
 */
export function jsonFileEntry(o: FileOutcome, errorsOnly = false, layout: JsonLayout = INDENTED_V1): string {
  return jsonFileEntryParts(o, errorsOnly, layout).join('');
}

/** The list of timepoints that ends an entry with timepoints, as written before they are put in (indented, compact). */
const NO_TIMEPOINTS = '"timepoints": []';
const NO_TIMEPOINTS_COMPACT = '"timepoints":[]';

/**
 * `jsonFileEntry`'s text in parts, which joined are that text: the entry with an empty list of
 * timepoints cut before its end, then each timepoint as nested there, then the end. A timepoint at
 * a time: one string of tens of megabytes, and a split of it into a list of a million lines to
 * indent them, cost seconds on a note of thousands of timepoints, where the pieces stay small.
 * Throws a RangeError when the whole would be more than one string holds, as the whole would.
 */
function jsonFileEntryParts(o: FileOutcome, errorsOnly: boolean, layout: JsonLayout): string[] {
  const findings = (errorsOnly ? o.findings.filter((f) => f.severity === 'error') : o.findings).map(toJsonFinding);
  // `--json-detail findings`: the entry of a note that could not be read, whatever it was given.
  const findingsOnly = layout.detail === 'findings';
  const texts = findingsOnly ? undefined : o.timepointTexts;
  const timepoints = findingsOnly ? undefined : texts ?? o.timepoints;
  const indented = layout.indented;
  const entry = (value: unknown): string => (indented ? nested(value, '    ') : JSON.stringify(value));
  if (timepoints === undefined) return [entry({ path: o.path, problem: o.problem, findings })];
  // `timepoints` is the last member: its empty list is the last one in the text.
  const whole = entry({ path: o.path, problem: o.problem, findings, timepoints: [] });
  if (timepoints.length === 0) return [whole];
  const empty = indented ? NO_TIMEPOINTS : NO_TIMEPOINTS_COMPACT;
  const at = whole.lastIndexOf(empty);
  const parts: string[] = [`${whole.slice(0, at)}${empty.slice(0, -1)}`];
  let length = parts[0]!.length;
  const before = indented ? '\n        ' : '';
  for (let i = 0; i < timepoints.length; i++) {
    const part = `${i === 0 ? '' : ','}${before}${texts === undefined ? timepointText(timepoints[i], indented) : texts[i]!}`;
    parts.push(part);
    length += part.length;
  }
  const end = `${indented ? '\n      ' : ''}]${whole.slice(at + empty.length)}`;
  parts.push(end);
  length += end.length;
  if (length > MAX_STRING_LENGTH) throw new RangeError('Invalid string length');
  return parts;
}

/** Why a note's JSON entry leaves out its timepoints, when they make more JSON than one string can hold. */
export const TOO_MUCH_JSON = 'its timepoints make more JSON than one string can hold; check it with --json-detail findings or --format text or sarif, or export it with --format jsonl or csv';

/** Why a note's JSON entry leaves out its findings (and timepoints), when they make more JSON than one string can hold. */
export const TOO_MANY_FINDINGS = 'its findings make more JSON than one string can hold; check it with --format text or sarif';

/**
 * The note's entry, or, when its timepoints make more JSON than one string can hold (hundreds of
 * megabytes: a note of tens of thousands of timepoints), its entry without them and with a problem
 * that says so, so the run goes on and ends with exit code 2; when its findings alone make too
 * much (a note of a million bare timepoints has a finding on each), its entry without either.
 */
export function jsonFileEntryOrProblem(o: FileOutcome, errorsOnly = false, layout: JsonLayout = INDENTED_V1): { readonly entry: string; readonly problem: string | null } {
  const { parts, problem } = jsonFileEntryPartsOrProblem(o, errorsOnly, layout);
  return { entry: parts.join(''), problem };
}

/** `jsonFileEntryOrProblem` with the entry in parts (see `jsonFileEntryParts`). */
function jsonFileEntryPartsOrProblem(o: FileOutcome, errorsOnly: boolean, layout: JsonLayout): { readonly parts: readonly string[]; readonly problem: string | null } {
  try {
    return { parts: jsonFileEntryParts(o, errorsOnly, layout), problem: o.problem };
  } catch (error) {
    if (!(error instanceof RangeError)) throw error;
  }
  if (o.timepoints || o.timepointTexts) {
    try {
      return { parts: jsonFileEntryParts({ path: o.path, findings: o.findings, problem: TOO_MUCH_JSON }, errorsOnly, layout), problem: TOO_MUCH_JSON };
    } catch (error) {
      if (!(error instanceof RangeError)) throw error;
    }
  }
  return { parts: jsonFileEntryParts({ path: o.path, findings: [], problem: TOO_MANY_FINDINGS }, errorsOnly, layout), problem: TOO_MANY_FINDINGS };
}

/** A timepoint's JSON (see `timepointsJson`) as it is nested in its note's entry, in the list of timepoints (`indented`, or compact). */
export function timepointText(timepoint: unknown, indented = true): string {
  return indented ? nested(timepoint, '        ') : JSON.stringify(timepoint) ?? 'null';
}

/**
 * A value as `JSON.stringify(…, null, 2)` writes it nested at `indent` (spaces, two per level):
 * its first line as it is, each further line after `indent`. Written by `JSON.stringify` itself
 * with the value inside one list per level, whose brackets are then cut off: the same text as
 * indenting each line of the value's JSON (line breaks only come from the layout), without
 * splitting tens of megabytes of JSON into lines and joining them again.
 */
function nested(value: unknown, indent: string): string {
  const levels = indent.length / 2;
  let wrapped: unknown = value;
  for (let k = 0; k < levels; k++) wrapped = [wrapped];
  const json = JSON.stringify(wrapped, null, 2);
  // Before the value, per level k (from 0): `[`, a line break and 2 (k + 1) spaces; after it, per
  // level k: a line break, 2 k spaces and `]`.
  return json.slice(levels * (levels + 3), json.length - levels * (levels + 1));
}

export function renderCheckJson(outcomes: readonly FileOutcome[], layout: JsonLayout = INDENTED_V1): string {
  let text = '';
  const writer = new CheckJsonWriter({ write: (s: string) => { text += s; } }, false, layout);
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
