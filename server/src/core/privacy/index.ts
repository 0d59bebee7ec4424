/**
 * De-identification: finding what looks like a person's identifiers in a note's free text.
 * Pneumark's format never needs a name, a date, a phone number or a record number, and notes
 * are shared as teaching material and datasets, so the privacy checks (PN5xx,
 * `checks/privacy.ts`) warn where such things appear.
 *
 * What lives here: pure functions, text in and matches (kind, span, cue) out.
 * - `scan(text)` runs every detector over one piece of free text (scan.ts);
 * - `scanLine(node)` scans the free-text parts of one syntax-tree line (free-text.ts);
 * - one file per detector family: names.ts, dates.ts (calendar dates and dates of birth),
 *   numbers.ts (phone and record numbers), emails.ts, postal-codes.ts; text.ts holds the
 *   shared character and word helpers, quantities.ts the test for a unit after a number.
 * May import: ../syntax/tree (types) and ../fields (registries). Only checks/privacy.ts imports it.
 * To add a detector: write `findX(text, runs, out)` in its own file (it adds what it finds to
 * `out`; `runs` are the text's runs, read once for every detector), add its kind to
 * types.ts (placeholder and priority), call it from scan.ts, give it a check in
 * checks/privacy.ts, and add true and false positives to tests/privacy.
 *
 * Every detector is a linear scan without regular expressions (no backtracking to worry about).
 * Low false positives on clinical prose come first: see each file's notes.
 */
export { scan, MAX_SCAN_LENGTH } from './scan';
export { freeTextOf, scanLine, type FreeText } from './free-text';
export { PLACEHOLDERS, type PrivacyKind, type PrivacyMatch } from './types';
