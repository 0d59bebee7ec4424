/**
 * CSV as RFC 4180 describes it, with one choice of ours: records end with LF (`\n`), not CRLF,
 * so the file diffs cleanly and reads the same on every platform; every CSV reader we know
 * accepts LF (RFC 4180 itself allows it for text/csv from other systems). The file ends with a
 * line break after the last record.
 *
 * - The first record is the header: the column names (`csvHeader`), so the CLI can write it once
 *   and then stream the records of many notes (`csvRecord`).
 * - Fields are separated by commas. A field holding `"`, `,`, CR or LF is quoted, with every `"`
 *   doubled; other fields are written as they are (no trimming, no BOM, any Unicode).
 * - Numbers are written by JavaScript's own conversion (`String(n)`: `72.00591128118`, `-4`,
 *   `1e+21`), independent of locale; null, NaN and infinities are written as an empty field.
 * - Fields that start with `=`, `+`, `-` or `@` are not altered: spreadsheet programs may read
 *   such a label as a formula, so open an export in one with care (or export with redactProse).
 */
import type { Cell, ColumnDef, Row } from './columns';

/** One field, quoted when it has to be. */
export function csvField(value: Cell | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/** The header record, ending with `\n`. */
export function csvHeader(columns: readonly ColumnDef[]): string {
  return `${columns.map((c) => csvField(c.name)).join(',')}\n`;
}

/** One record of a row, in column order, ending with `\n`. A key the row lacks is an empty field. */
export function csvRecord(columns: readonly ColumnDef[], row: Readonly<Row>): string {
  return `${columns.map((c) => csvField(row[c.name])).join(',')}\n`;
}

/** One record of cells already in column order (`timepointCells`), ending with `\n`. */
export function csvCells(cells: readonly (Cell | undefined)[]): string {
  let out = '';
  for (let k = 0; k < cells.length; k++) out += k === 0 ? csvField(cells[k]) : `,${csvField(cells[k])}`;
  return `${out}\n`;
}

/** A whole CSV file: the header, then one record per row. */
export function toCsv(columns: readonly ColumnDef[], rows: readonly Readonly<Row>[]): string {
  return csvHeader(columns) + rows.map((row) => csvRecord(columns, row)).join('');
}
