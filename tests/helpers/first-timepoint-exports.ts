// What the exports make of a note's first timepoint, for tests that follow one value from the text
// to the CSV row and the FHIR bundle.
import { parse } from 'csv-parse/sync';
import { checkNote } from '../../server/src/core/check-note';
import { bundleObservations, csvCells, csvHeader, exportColumns, timepointCells, toFhirBundle } from '../../server/src/core/export';

const plain = { redactProse: false, shiftDays: 0 } as const;

/** The CSV row of the note's first timepoint, read back with a CSV parser (header names as keys). */
export function firstCsvRow(text: string): Record<string, string> {
  const result = checkNote(text, {}, { keepDerivations: true });
  const csv = csvHeader(exportColumns()) + timepointCells('a.pneu', result, plain).map((c) => csvCells(c)).join('');
  return (parse(csv, { columns: true }) as Record<string, string>[])[0]!;
}

/** The FiO2 values of the note's FHIR bundle, in order. */
export function fhirFio2Values(text: string): (number | undefined)[] {
  const bundle = toFhirBundle('a.pneu', checkNote(text, {}, { keepDerivations: true }), plain);
  return bundleObservations(bundle).filter((o) => /^obs-\d+-fio2/.test(o.id)).map((o) => o.valueQuantity?.value);
}
