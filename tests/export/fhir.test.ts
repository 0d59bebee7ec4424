// FHIR R4: every Bundle and every Observation validates against the R4 JSON schema; stated
// values only, LOINC and UCUM codes from the registries, times from an anchor.
import { UcumLhcUtils } from '@lhncbc/ucum-lhc';
import { beforeAll, describe, expect, it } from 'vitest';
import { anchorProblem, observationCategory, toFhirBundle, type FhirBundle, type FhirObservation, type FhirOptions } from '../../server/src/core/export';
import { FIELDS } from '../../server/src/core/fields/registry';
import { checked, fhirValidator, samples } from './helpers';

const ANCHOR = '2000-01-01T00:00:00+01:00';
const withAnchor: FhirOptions = { anchor: ANCHOR, redactProse: false, shiftDays: 0 };
const noAnchor: FhirOptions = { redactProse: false, shiftDays: 0 };

let validator: ReturnType<typeof fhirValidator>;
beforeAll(() => {
  validator = fhirValidator();
});

function observations(bundle: FhirBundle): FhirObservation[] {
  return (bundle.entry ?? []).map((e) => e.resource);
}

function byId(bundle: FhirBundle, id: string): FhirObservation | undefined {
  return observations(bundle).find((o) => o.id === id);
}

describe('schema', () => {
  const cases = samples().flatMap((s) => [
    [`${s.name} with an anchor`, s.path, s.result, withAnchor],
    [`${s.name} without an anchor`, s.path, s.result, noAnchor],
    [`${s.name} redacted and shifted`, s.path, s.result, { anchor: '2024-02-28T00:00Z', redactProse: true, shiftDays: 3 }],
  ] as const);

  it.each(cases)('%s: the Bundle and every resource are valid FHIR R4', (_name, path, result, options) => {
    const bundle = toFhirBundle(path, result, options);
    expect(validator.validate(bundle, true)).toEqual([]);
    for (const resource of observations(bundle)) expect(validator.validate(resource, true), resource.id).toEqual([]);
  });

  it('the validator does reject what is not FHIR (it is not vacuous)', () => {
    expect(validator.validate({ resourceType: 'Observation', status: 'final' }, true)).not.toEqual([]);
    const bundle = toFhirBundle('a.pneu', checked('@ day 1 08:00\nvitals hr 90'), noAnchor);
    const broken = { ...bundle, entry: bundle.entry?.map((e) => ({ ...e, resource: { ...e.resource, status: 'done' } })) };
    expect(validator.validate(broken, true)).not.toEqual([]);
  });

  it('a note with nothing coded gives an empty collection without an entry array', () => {
    const bundle = toFhirBundle('a.pneu', checked('@ day 1 08:00\nvent rate 14'), noAnchor);
    expect(bundle.entry).toBeUndefined();
    expect(validator.validate(bundle, true)).toEqual([]);
  });
});

describe('observations', () => {
  const icu = samples().find((s) => s.name === 'icu-ventilated-lung-injury')!;
  const bundle = toFhirBundle(icu.path, icu.result, withAnchor);

  it('one per value stated at a timepoint, never for carried values', () => {
    // Timepoint 1 restates PEEP and FiO2; mode, VT, rate and flow are carried and not repeated.
    const ids = observations(bundle).map((o) => o.id).filter((id) => id.startsWith('obs-1-'));
    expect(ids).toEqual(['obs-1-fio2', 'obs-1-peep', 'obs-1-ph', 'obs-1-paco2', 'obs-1-pao2', 'obs-1-hco3', 'obs-1-sao2', 'obs-1-pf-ratio']);
  });

  it('header values once, without a time', () => {
    const header = observations(bundle).filter((o) => o.id.startsWith('obs-header-'));
    expect(header.map((o) => [o.id, o.valueQuantity?.value, o.valueQuantity?.code])).toEqual([
      ['obs-header-age', 58, 'a'], ['obs-header-height', 165, 'cm'], ['obs-header-weight', 82, 'kg'],
    ]);
    for (const o of header) expect(o.effectiveDateTime).toBeUndefined();
  });

  it('LOINC from the registry, UCUM from the unit registry, canonical value', () => {
    const pao2 = byId(bundle, 'obs-0-pao2')!;
    expect(pao2.status).toBe('final');
    expect(pao2.code.coding).toEqual([{ system: 'http://loinc.org', code: '2703-7', display: 'Oxygen [Partial pressure] in Arterial blood' }]);
    expect(pao2.valueQuantity).toEqual({ value: 74, unit: 'mmHg', system: 'http://unitsofmeasure.org', code: 'mm[Hg]' });
    expect(byId(bundle, 'obs-0-temp')?.valueQuantity).toEqual({ value: 38.9, unit: 'C', system: 'http://unitsofmeasure.org', code: 'Cel' });
    expect(byId(bundle, 'obs-0-fio2')?.valueQuantity).toEqual({ value: 0.8, unit: 'fraction', system: 'http://unitsofmeasure.org', code: '1' });
    expect(byId(bundle, 'obs-0-spo2')?.valueQuantity).toEqual({ value: 91, unit: '%', system: 'http://unitsofmeasure.org', code: '%' });
  });

  it('gases in kPa are written in mmHg at full precision', () => {
    const home = samples().find((s) => s.name === 'home-oxygen-exacerbation')!;
    const b = toFhirBundle(home.path, home.result, noAnchor);
    expect(byId(b, 'obs-0-paco2')?.valueQuantity?.value).toBeCloseTo(9.6 * (1000 / 133.322387415), 9);
  });

  it('blood pressure: one Observation, panel code, two components in mmHg', () => {
    const bp = byId(bundle, 'obs-0-bp')!;
    expect(bp.valueQuantity).toBeUndefined();
    expect(bp.code.coding[0]?.code).toBe('85354-9');
    expect(bp.component?.map((c) => [c.code.coding[0]?.code, c.valueQuantity.value, c.valueQuantity.code])).toEqual([['8480-6', 104, 'mm[Hg]'], ['8462-4', 62, 'mm[Hg]']]);
  });

  it('P/F ratio with its LOINC code, in mmHg, derived from the PaO2 and FiO2 Observations', () => {
    const pf = byId(bundle, 'obs-2-pf-ratio')!;
    expect(pf.code.coding[0]?.code).toBe('50984-4');
    expect(pf.valueQuantity?.value).toBeCloseTo(82 / 0.6, 9);
    expect(pf.valueQuantity?.code).toBe('mm[Hg]');
    // Timepoint 2 uses the FiO2 carried from timepoint 1: the reference points there.
    const urlOf = (id: string) => bundle.entry?.find((e) => e.resource.id === id)?.fullUrl;
    expect(pf.derivedFrom).toEqual([{ reference: urlOf('obs-2-pao2') }, { reference: urlOf('obs-1-fio2') }]);
  });

  it('no other derived value, no subject, no identifier', () => {
    const codes = new Set(observations(bundle).map((o) => o.code.coding[0]?.code));
    const registry = new Set(FIELDS.flatMap((f) => [...(f.loinc ? [f.loinc.code] : []), ...Object.values(f.loincBySection ?? {}).map((l) => l.code)]));
    for (const code of codes) expect(registry.has(code!) || code === '50984-4', code).toBe(true);
    for (const o of observations(bundle)) {
      expect(o).not.toHaveProperty('subject');
      expect(o).not.toHaveProperty('identifier');
    }
  });

  it('leaves out values Pneumark does not use', () => {
    const broken = samples().find((s) => s.name === 'broken-note')!;
    const ids = observations(toFhirBundle(broken.path, broken.result, noAnchor)).map((o) => o.id);
    expect(ids).not.toContain('obs-5-na'); // na 250, impossible
    expect(ids).not.toContain('obs-8-spo2'); // spo2 104
    expect(ids).not.toContain('obs-4-pvo2'); // doubtful unit
    expect(ids).toContain('obs-5-spo2');
  });

  it('every UCUM code is one a UCUM library reads', () => {
    const ucum = UcumLhcUtils.getInstance();
    const codes = new Set(samples().flatMap((s) => observations(toFhirBundle(s.path, s.result, noAnchor)).flatMap((o) => [o.valueQuantity?.code, ...(o.component ?? []).map((c) => c.valueQuantity.code)])));
    for (const code of codes) if (code && code !== '[pH]') expect(ucum.convertUnitTo(code, 1, code).status, code).toBe('succeeded');
  });
});

describe('LOINC codes by section', () => {
  it('codes a ventilator FiO2 as the ventilator setting (19994-3) and an oxygen-line FiO2 as inhaled oxygen (3150-0) — LOINC (from memory)', () => {
    const b = toFhirBundle('a.pneu', checked('@ 08:00\nvent mode VC, vt 420, rate 16, peep 8, fio2 0.5\n@ 09:00\noxygen venturi, fio2 0.28'), noAnchor);
    expect(byId(b, 'obs-0-fio2')?.code.coding[0]?.code).toBe('19994-3');
    expect(byId(b, 'obs-1-fio2')?.code.coding[0]?.code).toBe('3150-0');
    expect(validator.validate(b, true)).toEqual([]);
  });
});

describe('categories', () => {
  it('vital signs, laboratory or therapy by the field section; none for age', () => {
    const of = (id: string) => observationCategory(FIELDS.find((f) => f.id === id)!);
    expect(['hr', 'rr', 'spo2', 'temp', 'bp', 'height', 'weight'].map(of)).toEqual(Array(7).fill('vital-signs'));
    expect(['ph', 'paco2', 'pao2', 'sao2', 'pvo2', 'lactate', 'hb', 'na', 'albumin', 'glucose'].map(of)).toEqual(Array(10).fill('laboratory'));
    expect(['fio2', 'o2_flow', 'vt', 'peep'].map(of)).toEqual(Array(4).fill('therapy'));
    expect(of('age')).toBeNull();
  });

  it('every field with a LOINC code except age has one', () => {
    for (const f of FIELDS) if (f.loinc && f.id !== 'age') expect(observationCategory(f), f.id).not.toBeNull();
  });
});

describe('time', () => {
  const note = '@ day 1 22:15  Mrs Example\nvitals hr 100\n@ 01:30\nvitals hr 90\n@ day 3\nvitals hr 80';
  const result = checked(note);

  it('with an anchor: anchor + minutes, in the anchor offset; a day without a time of day gives the date alone (FHIR R4 dateTime allows day precision)', () => {
    const b = toFhirBundle('a.pneu', result, withAnchor);
    expect(observations(b).map((o) => o.effectiveDateTime)).toEqual(['2000-01-01T22:15:00+01:00', '2000-01-02T01:30:00+01:00', '2000-01-03']);
  });

  it('shiftDays moves the effective time by whole days (across month ends)', () => {
    const b = toFhirBundle('a.pneu', result, { anchor: '2024-02-28T00:00Z', redactProse: false, shiftDays: 1 });
    expect(observations(b).map((o) => o.effectiveDateTime)).toEqual(['2024-02-29T22:15:00Z', '2024-03-01T01:30:00Z', '2024-03-02']);
  });

  it('without an anchor: no effective time; the note names the timepoint and its relative time', () => {
    const b = toFhirBundle('a.pneu', result, noAnchor);
    expect(observations(b).map((o) => o.effectiveDateTime)).toEqual([undefined, undefined, undefined]);
    expect(observations(b).map((o) => o.note?.[0]?.text)).toEqual([
      'Pneumark timepoint 0 (day 1 22:15): Mrs Example',
      'Pneumark timepoint 1 (day 2 01:30)',
      'Pneumark timepoint 2 (day 3)',
    ]);
  });

  it('redactProse leaves the label out; shiftDays shifts the relative day too', () => {
    const b = toFhirBundle('a.pneu', result, { redactProse: true, shiftDays: 10 });
    expect(JSON.stringify(b)).not.toContain('Example');
    expect(observations(b)[0]?.note?.[0]?.text).toBe('Pneumark timepoint 0 (day 11 22:15)');
  });

  it('anchors must be a date-time with a zone', () => {
    expect(anchorProblem('2024-03-01T00:00:00Z')).toBeNull();
    expect(anchorProblem('2024-03-01T00:00+05:30')).toBeNull();
    expect(anchorProblem('2024-03-01T00:00:00.250-03:00')).toBeNull();
    for (const bad of ['2024-03-01', '2024-03-01T00:00:00', '2024-02-30T00:00Z', '2024-03-01T24:00Z', 'yesterday', '2024-03-01T00:00+15:00']) {
      expect(anchorProblem(bad), bad).not.toBeNull();
      expect(() => toFhirBundle('a.pneu', result, { anchor: bad, redactProse: false, shiftDays: 0 }), bad).toThrow(RangeError);
    }
  });
});

describe('ids', () => {
  it('are deterministic, and fullUrls unique across all samples', () => {
    const urls: string[] = [];
    for (const s of samples()) {
      const a = toFhirBundle(s.path, s.result, withAnchor);
      const b = toFhirBundle(s.path, s.result, withAnchor);
      expect(a).toEqual(b);
      const ids = observations(a).map((o) => o.id);
      expect(new Set(ids).size).toBe(ids.length);
      for (const e of a.entry ?? []) {
        expect(e.fullUrl).toMatch(/^urn:uuid:[0-9a-f]{8}-[0-9a-f]{4}-8[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
        urls.push(e.fullUrl);
      }
    }
    expect(new Set(urls).size).toBe(urls.length);
  });

  it('depend on the file: the same note under another path gets other fullUrls', () => {
    const result = checked('@ day 1 08:00\nvitals hr 90');
    const a = toFhirBundle('a.pneu', result, noAnchor);
    const b = toFhirBundle('b.pneu', result, noAnchor);
    expect(a.entry?.[0]?.resource.id).toBe(b.entry?.[0]?.resource.id);
    expect(a.entry?.[0]?.fullUrl).not.toBe(b.entry?.[0]?.fullUrl);
    expect(a.id).not.toBe(b.id);
  });
});
