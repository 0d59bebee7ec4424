/**
 * Exports: pure functions from a checked note (`NoteResult`) to data other tools read. Text and
 * options in, strings or plain objects out; no file system, no editor. The CLI calls them once
 * per note and owns files, ordering and output streams.
 *
 * - columns.ts  the column model of the tabular exports: one row per timepoint (`timepointRows`)
 * - csv.ts      RFC 4180 CSV of those rows (header once, then records, so notes can be streamed)
 * - jsonl.ts    JSON Lines: one object per timepoint, the same keys plus the findings
 * - fhir.ts     a FHIR R4 collection Bundle of LOINC-coded Observations per note, named by its path (`Bundle.identifier`)
 * - sarif.ts    a SARIF 2.1.0 log of the findings of many notes
 * - precision.ts the one rule for the numbers they all write (12 significant digits)
 * - pseudonym.ts what names a note in a redacted export, in place of its path (`note-00001`)
 * - redact.ts   the note's own words left out of findings and readings (`check --redact`)
 *
 * May import: the rest of the core. Must not import: node:fs, vscode, the server or the CLI.
 * To add a format: a new file here taking `(path, result, options)`, exported below, with golden
 * files under tests/golden/ and a schema or read-back test under tests/export/.
 */
export { exportColumns, timepointCells, timepointRows, findingsByTimepoint, findingsOfTimepoint, writtenLabel, RANGE_DERIVED_IDS, type Cell, type ColumnDef, type ColumnKind, type ExportOptions, type Row } from './columns';
export { csvCells, csvField, csvHeader, csvRecord, spreadsheetText, toCsv, type CsvOptions } from './csv';
export { jsonlRecords, toJsonl, type JsonlFinding, type JsonlRecord } from './jsonl';
export {
  anchorProblem,
  bundleObservations,
  DATA_ABSENT_REASON_URL,
  fhirString,
  NOTE_IDENTIFIER_SYSTEM,
  observationCategory,
  observationEntries,
  PATIENT_ID,
  REDACTED_NOTE_IDENTIFIER_SYSTEM,
  toFhirBundle,
  type FhirBundle,
  type FhirBundleEntry,
  type FhirCodeableConcept,
  type FhirCoding,
  type FhirIdentifier,
  type FhirObservation,
  type FhirObservationComponent,
  type FhirObservationEntry,
  type FhirPatient,
  type FhirPatientEntry,
  type FhirReference,
  type FhirAbsentPrimitive,
  type FhirOptions,
  type FhirQuantity,
  type ObservationCategory,
} from './fhir';
export { artifactLocationOf, artifactUri, SARIF_SCHEMA, SARIF_URI_BASE_ID, sarifLogParts, toSarifLog, type PathStyle, type SarifConfigurationProblem, type SarifFile, type SarifOptions } from './sarif';
export { exportedNumber, EXPORTED_MAX_DECIMALS, EXPORTED_SIGNIFICANT_DIGITS } from './precision';
export { notePseudonym } from './pseudonym';
export { stableUuid } from './stable-id';
export { ucumCode, unitSlug } from './units';
export { noteOwnWords, redactedFinding, redactedJson, redactedText, type NoteOwnWords } from './redact';
