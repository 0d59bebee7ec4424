/**
 * CSV as RFC 4180 describes it, with one choice of ours: records end with LF (`\n`), not CRLF,
 * so the file diffs cleanly and reads the same on every platform; every CSV reader we know
 * accepts LF (RFC 4180 itself allows it for text/csv from other systems). The file ends with a
 * line break after the last record.
 *
 * - The first record is the header: the column names (`csvHeader`), so the CLI can write it once
 *   and then stream the records of many notes (`csvRecord`).
 * - Fields are separated by commas. A field holding `"`, `,`, CR or LF is quoted, with every `"`
 *   doubled; other fields are written as they are (no trimming, any Unicode).
 * - Numbers are written by JavaScript's own conversion (`String(n)`: `72.0059112812`, `-4`,
 *   `1e+21`), independent of locale; null, NaN and infinities are written as an empty field. The
 *   cells come rounded to 12 significant digits (`exportedNumber` in precision.ts, the rule of
 *   every export); a number is written as it is given.
 * - Text is written exactly as it is by default, even when it starts with `=`, `+`, `-` or `@`:
 *   spreadsheet programs may run such a cell (a timepoint label such as `=HYPERLINK(…)`, a file
 *   name) as a formula when the file is opened in them, while a pipeline needs the exact text.
 *   With `spreadsheetSafe` (`pneumark export --format csv --spreadsheet-safe`), every text cell
 *   that starts with `=`, `+`, `-`, `@`, a tab, a carriage return, a line feed or an apostrophe gets one more
 *   apostrophe in front (`=1+1` → `'=1+1`, `'quoted` → `''quoted`), which spreadsheet programs
 *   take as "text, not a formula". Numbers are never changed (`-4` stays a number). The change is
 *   exact to undo: remove one leading apostrophe from every text cell that starts with one. The
 *   file then also starts with a byte-order mark, so that spreadsheet programs read it as UTF-8.
 * - Otherwise there is no byte-order mark: the file starts with the header's first column name.
 */
import type { Cell, ColumnDef, Row } from './columns';

export interface CsvOptions {
  /** Put an apostrophe before text that a spreadsheet program would read as a formula (see above). */
  readonly spreadsheetSafe: boolean;
}

const EXACT: CsvOptions = { spreadsheetSafe: false };

/**
 * The first characters that make a spreadsheet program read a cell as a formula (`=`, `+`, `-`,
 * `@`, tab, carriage return, line feed: read in OWASP's page "CSV Injection", its source
 * pages/attacks/CSV_Injection.md in OWASP/www-community at 0e5e8f00, August 2025, which added the
 * line feed), and the apostrophe itself, so that removing one leading apostrophe always gives the
 * text back.
 */
const FORMULA_START = /^[=+\-@\t\r\n']/;

/** Text as `spreadsheetSafe` writes it: with an apostrophe in front when it starts like a formula. */
export function spreadsheetText(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/** One field, quoted when it has to be. */
export function csvField(value: Cell | undefined, options: CsvOptions = EXACT): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  const text = options.spreadsheetSafe ? spreadsheetText(value) : value;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/**
 * The header record, ending with `\n`; with `spreadsheetSafe`, after a byte-order mark (U+FEFF),
 * without which spreadsheet programs may read the UTF-8 file in a legacy code page (`é` as `Ã©`,
 * from memory of common spreadsheet behaviour).
 */
export function csvHeader(columns: readonly ColumnDef[], options: CsvOptions = EXACT): string {
  return `${options.spreadsheetSafe ? '\ufeff' : ''}${columns.map((c) => csvField(c.name)).join(',')}\n`;
}

/** One record of a row, in column order, ending with `\n`. A key the row lacks is an empty field. */
export function csvRecord(columns: readonly ColumnDef[], row: Readonly<Row>, options: CsvOptions = EXACT): string {
  return `${columns.map((c) => csvField(row[c.name], options)).join(',')}\n`;
}

/** One record of cells already in column order (`timepointCells`), ending with `\n`. */
export function csvCells(cells: readonly (Cell | undefined)[], options: CsvOptions = EXACT): string {
  // Joined, not appended one by one: `+=` makes a rope of two pieces per cell that is flattened
  // when the rows are joined, several times the cost of one join into a flat string.
  const fields = new Array<string>(cells.length);
  for (let k = 0; k < cells.length; k++) fields[k] = csvField(cells[k], options);
  return `${fields.join(',')}\n`;
}

/** A whole CSV file: the header, then one record per row. */
export function toCsv(columns: readonly ColumnDef[], rows: readonly Readonly<Row>[], options: CsvOptions = EXACT): string {
  return csvHeader(columns, options) + rows.map((row) => csvRecord(columns, row, options)).join('');
}
