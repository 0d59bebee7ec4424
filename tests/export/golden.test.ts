// Golden files: the CSV, JSON Lines, FHIR and SARIF exports of every sample note, compared
// exactly with tests/golden/. To regenerate after an intended change:
//   UPDATE_GOLDEN=1 npx vitest run tests/export/golden.test.ts
// then read the diff as you would read code (units, values, LOINC and UCUM codes).
import { describe, it } from 'vitest';
import { exportColumns, timepointRows, toCsv, toFhirBundle, toJsonl, toSarifLog } from '../../server/src/core/export';
import { expectGolden, samples } from './helpers';

const plain = { redactProse: false, shiftDays: 0 } as const;
/** A made-up anchor with an offset, so the goldens show effective times in the anchor's zone. */
const ANCHOR = '2000-01-01T00:00:00+01:00';
const json = (value: unknown): string => `${JSON.stringify(value, null, 2)}\n`;

describe.each(samples().map((s) => [s.name, s] as const))('%s', (name, s) => {
  it('CSV', () => {
    expectGolden(`${name}.csv`, toCsv(exportColumns(), timepointRows(s.path, s.result, plain)));
  });
  it('JSON Lines', () => {
    expectGolden(`${name}.jsonl`, toJsonl(s.path, s.result, plain));
  });
  it('FHIR', () => {
    expectGolden(`${name}.fhir.json`, json(toFhirBundle(s.path, s.result, { anchor: ANCHOR, ...plain })));
  });
  it('SARIF', () => {
    expectGolden(`${name}.sarif`, json(toSarifLog([{ path: s.path, result: s.result, problem: null }], { toolVersion: 'golden' })));
  });
});
