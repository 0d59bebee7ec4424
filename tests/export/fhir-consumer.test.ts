// The FHIR export as a consumer reads it: a pipeline or a FHIR server that loads the Bundles of
// every sample and fixture note. Which note a Bundle came from (Bundle.identifier, the same text as
// the `file` column of CSV and JSON Lines), what the Bundle says of itself (type, no timestamp, so
// the same note gives the same bytes), and what every Observation holds: a status, categories of
// the HL7 observation-category code system, codings with a system, a code and a display, quantities
// whose code is valid UCUM, `derivedFrom` references that resolve inside the Bundle, `urn:uuid:`
// fullUrls, and strings that the FHIR R4 JSON schema's pattern takes.
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { UcumLhcUtils } from '@lhncbc/ucum-lhc';
import { beforeAll, describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { bundleObservations, jsonlRecords, observationEntries, toFhirBundle, type FhirBundle, type FhirOptions } from '../../server/src/core/export';
import { NOTE_IDENTIFIER_SYSTEM, REDACTED_NOTE_IDENTIFIER_SYSTEM } from '../../server/src/core/export/fhir';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';
import { allNotes, checked, fhirValidator, samples } from './helpers';

const noAnchor: FhirOptions = { redactProse: false, shiftDays: 0 };
const withAnchor: FhirOptions = { anchor: '2000-01-01T00:00:00+01:00', redactProse: false, shiftDays: 0 };


let validator: ReturnType<typeof fhirValidator>;
let notes: ReturnType<typeof allNotes>;
beforeAll(() => {
  validator = fhirValidator();
  notes = allNotes();
});

describe('which note a Bundle came from', () => {
  it('Bundle.identifier names the note by its path, in a system of our own, as the `file` column of JSON Lines does', () => {
    for (const s of samples()) {
      const bundle = toFhirBundle(s.path, s.result, noAnchor);
      expect(bundle.identifier, s.name).toEqual({ system: 'urn:pneumark:note', value: s.path });
      expect(NOTE_IDENTIFIER_SYSTEM).toBe('urn:pneumark:note');
      const files = new Set(jsonlRecords(s.path, s.result, noAnchor).map((r) => r.file));
      expect([...files], s.name).toEqual([bundle.identifier.value]);
    }
  });

  it('README.md names both systems, and says the value is the `file` column', () => {
    const readme = readFileSync('README.md', 'utf8').replace(/\s+/g, ' ');
    expect(readme).toContain('`system` `urn:pneumark:note`');
    expect(readme).toContain('`value` the note\'s path as the `file` column of CSV and JSON Lines has it');
    expect(readme).toContain('in the system `urn:pneumark:redacted-note`');
  });

  it('a redacted export names the note by its pseudonym, in a system of its own (a pseudonym is a place in one run, not a path)', () => {
    const result = checked('@ day 1 08:00\nvitals hr 90');
    const bundle = toFhirBundle('note-00003', result, { redactProse: true, shiftDays: 0, noteKey: 'note-00003', bundleIdFromEntries: true, pseudonymous: true });
    expect(bundle.identifier).toEqual({ system: 'urn:pneumark:redacted-note', value: 'note-00003' });
    expect(REDACTED_NOTE_IDENTIFIER_SYSTEM).toBe('urn:pneumark:redacted-note');
    expect(validator.validate(bundle, true)).toEqual([]);
  });

  it('the identifier does not change the ids: a Bundle id and fullUrls are made as before, from the note key', () => {
    const result = checked('@ day 1 08:00\nvitals hr 90');
    const a = toFhirBundle('ward/a.pneu', result, noAnchor);
    const keyed = toFhirBundle('ward/a.pneu', result, { ...noAnchor, noteKey: 'stdin\u0000abc' });
    expect(keyed.identifier.value).toBe('ward/a.pneu');
    expect(keyed.id).not.toBe(a.id);
  });

  it('a path or a label with a character a FHIR string may not hold (a no-break space, a control) is written with it escaped, and the Bundle validates', () => {
    // The R4 JSON schema's string pattern is `^[ \r\n\t\S]+$`, whose `\S` (ECMAScript, as JSON
    // Schema reads patterns) leaves out U+00A0, U+2000–U+200A, U+3000, U+FEFF …; FHIR strings
    // SHOULD hold no control below U+0020 but tab, CR and LF, and XML cannot hold them.
    const result = checked('@ day 1 08:00  handover\u00a0done\u0007\nvitals hr 90');
    const bundle = toFhirBundle('ward\u3000a\u0001.pneu', result, noAnchor);
    expect(bundle.identifier.value).toBe('ward\\u{3000}a\\x01.pneu');
    expect(bundleObservations(bundle)[0]?.note?.[0]?.text).toBe('Pneumark timepoint 0 (day 1 08:00): handover\\u{00A0}done\\x07');
    expect(validator.validate(bundle, true)).toEqual([]);
    // A lone surrogate is no Unicode character: escaped too; a pair (an emoji) stays.
    const lone = toFhirBundle('a\ud800b\u{1f600}.pneu', result, noAnchor);
    expect(lone.identifier.value).toBe('a\\u{D800}b\u{1f600}.pneu');
    // Text FHIR takes is written as it is, spaces and tabs included.
    expect(toFhirBundle('ward 7/a\tb.pneu', result, noAnchor).identifier.value).toBe('ward 7/a\tb.pneu');
  });
});

describe('what the Bundle says of itself', () => {
  it('a collection, with no timestamp (the same note gives the same bytes on every run): resourceType, id, identifier, type, entry', () => {
    for (const { path, result } of notes) {
      const bundle = toFhirBundle(path, result, withAnchor);
      const members = ['resourceType', 'id', 'identifier', 'type', ...(bundle.entry ? ['entry'] : [])];
      expect(Object.keys(bundle), path).toEqual(members);
      expect(bundle.type).toBe('collection');
      expect(JSON.stringify(toFhirBundle(path, result, withAnchor)), path).toBe(JSON.stringify(bundle));
    }
  });
});

describe('every note of samples/ and tests/fixtures/, as a consumer reads it', () => {
  const ucum = UcumLhcUtils.getInstance();

  it('is valid FHIR R4 with and without an anchor, and redacted', () => {
    expect(notes.length).toBeGreaterThan(40);
    for (const { path, result } of notes) {
      for (const options of [noAnchor, withAnchor, { ...withAnchor, redactProse: true, shiftDays: 2 }]) {
        const bundle = toFhirBundle(path, result, options);
        expect(validator.validate(bundle, true), path).toEqual([]);
      }
    }
  });

  it('every Observation: status final, categories of the HL7 code system with a display, codings with a system, a code and a display, code.text', () => {
    const categories = new Set<string>();
    for (const { path, result } of notes) {
      for (const o of bundleObservations(toFhirBundle(path, result, withAnchor))) {
        expect(o.status).toBe('final');
        expect(o.code.text, `${path} ${o.id}`).toBeTruthy();
        for (const c of o.category ?? []) {
          for (const coding of c.coding ?? []) {
            expect(coding.system).toBe('http://terminology.hl7.org/CodeSystem/observation-category');
            expect(coding.display, `${path} ${o.id}`).toBeTruthy();
            categories.add(coding.code);
          }
        }
        for (const coding of [...(o.code.coding ?? []), ...(o.component ?? []).flatMap((c) => c.code.coding ?? [])]) {
          expect(coding.system, `${path} ${o.id}`).toBe('http://loinc.org');
          expect(coding.code, `${path} ${o.id}`).toMatch(/^\d{1,7}-\d$/);
          expect(coding.display, `${path} ${o.id}`).toBeTruthy();
        }
      }
    }
    expect([...categories].sort()).toEqual(['laboratory', 'therapy', 'vital-signs']);
  });

  it('every quantity: system UCUM, a code that UCUM reads as valid, a number', () => {
    const codes = new Set<string>();
    for (const { path, result } of notes) {
      for (const o of bundleObservations(toFhirBundle(path, result, noAnchor))) {
        const quantities = [o.valueQuantity, ...(o.component ?? []).map((c) => c.valueQuantity)].filter((q) => q !== undefined);
        expect(quantities.length, `${path} ${o.id}`).toBeGreaterThan(0);
        for (const q of quantities) {
          expect(q.system).toBe('http://unitsofmeasure.org');
          expect(Number.isFinite(q.value), `${path} ${o.id}`).toBe(true);
          expect(q.unit, `${path} ${o.id}`).toBeTruthy();
          codes.add(q.code);
        }
      }
    }
    for (const code of codes) expect(ucum.validateUnitString(code, true).status, code).toBe('valid');
    expect(codes.size).toBeGreaterThan(10);
  });

  it('fullUrls are urn:uuid: and unique in the Bundle, ids unique in the Bundle, and every derivedFrom resolves to an entry of the same Bundle', () => {
    let references = 0;
    for (const { path, result } of notes) {
      const bundle: FhirBundle = toFhirBundle(path, result, withAnchor);
      const entries = bundle.entry ?? [];
      const urls = new Set(entries.map((e) => e.fullUrl));
      expect(urls.size, path).toBe(entries.length);
      expect(new Set(entries.map((e) => e.resource.id)).size, path).toBe(entries.length);
      for (const e of entries) {
        expect(e.fullUrl).toMatch(/^urn:uuid:[0-9a-f]{8}-[0-9a-f]{4}-8[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
        for (const d of e.resource.resourceType === 'Observation' ? e.resource.derivedFrom ?? [] : []) {
          references++;
          expect(urls.has(d.reference), `${path} ${e.resource.id} → ${d.reference}`).toBe(true);
          expect(d.reference).not.toBe(e.fullUrl);
        }
      }
    }
    expect(references).toBeGreaterThan(20);
  });

  it('every P/F ratio is derived from the PaO2 Observation of its own timepoint, and from an FiO2 Observation unless on room air', () => {
    let ratios = 0;
    for (const { path, result } of notes) {
      const entries = observationEntries(toFhirBundle(path, result, noAnchor));
      const idOf = new Map(entries.map((e) => [e.fullUrl, e.resource.id]));
      for (const { resource: o } of entries) {
        if (!o.id.endsWith('-pf-ratio')) continue;
        ratios++;
        const tp = o.id.slice('obs-'.length, -'-pf-ratio'.length);
        const from = (o.derivedFrom ?? []).map((d) => idOf.get(d.reference) ?? '');
        expect(from, `${path} ${o.id}`).toContain(`obs-${tp}-pao2`);
        const fio2 = from.filter((id) => /^obs-\d+-fio2(-[a-z]+)?$/.test(id));
        expect(fio2.length, `${path} ${o.id}: ${from.join(', ')}`).toBeLessThanOrEqual(1);
        if (fio2.length === 0) expect(o.valueQuantity!.value, `${path} ${o.id}: no FiO2 Observation, so FiO2 0.21`).toBeCloseTo(entries.find((e) => e.resource.id === `obs-${tp}-pao2`)!.resource.valueQuantity!.value / 0.21, 6);
      }
    }
    expect(ratios).toBeGreaterThan(20);
  });

  it('ids and fullUrls are the same on every run', () => {
    for (const { path, result } of notes.slice(0, 10)) {
      const again = checkNote(readFileSync(path, 'utf8'));
      expect(toFhirBundle(path, again, withAnchor), path).toEqual(toFhirBundle(path, result, withAnchor));
    }
  });
});

describe('from the command line: the identifier is the `file` column of JSON Lines, note by note', () => {
  /** An invented ward folder: two notes, one of them below a folder. */
  function ward(): string {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-fhir-identifier-'));
    mkdirSync(join(dir, 'ward 7', 'beds'), { recursive: true });
    writeFileSync(join(dir, 'ward 7', 'a.pneu'), '@ day 1 08:00\nvitals hr 90\n');
    writeFileSync(join(dir, 'ward 7', 'beds', 'b.pneu'), '@ day 1 09:00\nabg 7.40/40/90/24\noxygen fio2 0.4\n');
    return dir;
  }
  async function exported(dir: string, args: readonly string[], stdin = ''): Promise<{ fhir: { identifier: { system: string; value: string } }[]; files: string[] }> {
    const fhir = memoryIo({ cwd: dir, stdin });
    expect(await run(['export', '--format', 'fhir', ...args], fhir), fhir.err()).toBe(0);
    const jsonl = memoryIo({ cwd: dir, stdin });
    expect(await run(['export', '--format', 'jsonl', ...args], jsonl), jsonl.err()).toBe(0);
    const files = [...new Set(jsonl.out().trim().split('\n').map((line) => (JSON.parse(line) as { file: string }).file))];
    return { fhir: JSON.parse(fhir.out()) as { identifier: { system: string; value: string } }[], files };
  }

  it('a folder, a file named by its absolute path, standard input with and without --stdin-name', async () => {
    const dir = ward();
    const folder = await exported(dir, ['ward 7']);
    expect(folder.fhir.map((b) => b.identifier)).toEqual([
      { system: 'urn:pneumark:note', value: 'ward 7/a.pneu' },
      { system: 'urn:pneumark:note', value: 'ward 7/beds/b.pneu' },
    ]);
    expect(folder.fhir.map((b) => b.identifier.value)).toEqual(folder.files);
    // Named by its absolute path, it is named relative to the working folder, with forward slashes.
    const absolute = await exported(dir, [join(dir, 'ward 7', 'beds', 'b.pneu')]);
    expect(absolute.fhir.map((b) => b.identifier.value)).toEqual(['ward 7/beds/b.pneu']);
    expect(absolute.files).toEqual(['ward 7/beds/b.pneu']);
    const stdin = await exported(dir, ['-'], '@ day 1 08:00\nvitals hr 90\n');
    expect(stdin.fhir.map((b) => b.identifier)).toEqual([{ system: 'urn:pneumark:note', value: '<stdin>' }]);
    expect(stdin.files).toEqual(['<stdin>']);
    const named = await exported(dir, ['-', '--stdin-name', './ward 7/c.pneu'], '@ day 1 08:00\nvitals hr 90\n');
    expect(named.fhir.map((b) => b.identifier.value)).toEqual(['ward 7/c.pneu']);
    expect(named.files).toEqual(['ward 7/c.pneu']);
  });

  it('--redact: the pseudonym, in the system of redacted notes, and no part of the path', async () => {
    const dir = ward();
    const redacted = await exported(dir, ['--redact', 'ward 7']);
    expect(redacted.fhir.map((b) => b.identifier)).toEqual([
      { system: 'urn:pneumark:redacted-note', value: 'note-00001' },
      { system: 'urn:pneumark:redacted-note', value: 'note-00002' },
    ]);
    expect(redacted.fhir.map((b) => b.identifier.value)).toEqual(redacted.files);
    expect(JSON.stringify(redacted.fhir)).not.toMatch(/ward|beds|a\.pneu|b\.pneu/);
  });
});
