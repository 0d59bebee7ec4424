/**
 * JSON Lines: one JSON object per timepoint, one object per line (each line ends with `\n`).
 *
 * Shape of an object:
 * - every column of `exportColumns()`, in column order, with the same name and cell value as the
 *   CSV (numbers as JSON numbers to 12 significant digits, precision.ts; text as strings, null for an empty cell:
 *   nulls are kept, so every object has every key);
 * - `findings`: the findings that start on the timepoint's lines (all severities, hints
 *   included), each `{ code, severity, line, column, message }` with `line` and `column`
 *   1-based, columns counted in UTF-16 code units as in `check --format json`.
 *
 * With redactProse the label is null, as in the CSV, and each finding's message is replaced by
 * the title of its check: messages may quote the note's own words (a timepoint label, a stray
 * word), which redaction promises to leave out.
 */
import type { NoteResult } from '../check-note';
import { CHECKS } from '../checks/registry';
import type { Finding, Severity } from '../types';
import { exportColumns, findingsByTimepoint, timepointCells, timepointRows, type Cell, type ExportOptions, type Row } from './columns';

export interface JsonlFinding {
  readonly code: string;
  readonly severity: Severity;
  readonly line: number;
  readonly column: number;
  readonly message: string;
}

/** A row's cells by column name, and the timepoint's findings. */
export interface JsonlRecord {
  readonly [column: string]: Cell | readonly JsonlFinding[];
  readonly findings: readonly JsonlFinding[];
}

const titleOf: ReadonlyMap<string, string> = new Map(CHECKS.map((c) => [c.code, c.title]));

function jsonlFinding(f: Finding, redactProse: boolean): JsonlFinding {
  return {
    code: f.code,
    severity: f.severity,
    line: f.range.start.line + 1,
    column: f.range.start.character + 1,
    message: redactProse ? (titleOf.get(f.code) ?? f.code) : f.message,
  };
}

/** The objects of a note, one per timepoint. */
export function jsonlRecords(path: string, result: NoteResult, options: ExportOptions): JsonlRecord[] {
  const rows = timepointRows(path, result, options);
  const findingsAt = findingsByTimepoint(result);
  const columns = exportColumns();
  return rows.map((row, i) => {
    const ordered: Row = {};
    for (const c of columns) ordered[c.name] = row[c.name] ?? null;
    return { ...ordered, findings: (findingsAt[i] ?? []).map((f) => jsonlFinding(f, options.redactProse)) };
  });
}

/** Each column's key as it opens a member of a record's JSON (`"file":`). */
const MEMBER_KEYS: readonly string[] = exportColumns().map((c) => `${JSON.stringify(c.name)}:`);

/**
 * The JSON Lines text of a note: one line per timepoint, each ending with `\n` ('' for no
 * timepoints). The bytes of `JSON.stringify` of each of `jsonlRecords`, written member by member
 * from the row's cells: a record of a hundred keys built as an object (twice: the row, then the
 * record) is a slow dictionary-mode object, only to be turned into text.
 */
export function toJsonl(path: string, result: NoteResult, options: ExportOptions): string {
  const findingsAt = findingsByTimepoint(result);
  return timepointCells(path, result, options).map((cells, i) => {
    const members = new Array<string>(cells.length);
    for (let k = 0; k < cells.length; k++) members[k] = MEMBER_KEYS[k]! + JSON.stringify(cells[k] ?? null);
    const findings = (findingsAt[i] ?? []).map((f) => jsonlFinding(f, options.redactProse));
    return `{${members.join(',')},"findings":${JSON.stringify(findings)}}\n`;
  }).join('');
}
