// FHIR R4: every Bundle and every Observation validates against the R4 JSON schema; stated
// values only, LOINC and UCUM codes from the registries, times from an anchor.
import { readFileSync } from 'node:fs';
import { UcumLhcUtils } from '@lhncbc/ucum-lhc';
import { beforeAll, describe, expect, it } from 'vitest';
import { fhirLoinc, isObservedField, loincMismatch } from '../../server/src/core/export/fhir';
import type { SectionId } from '../../server/src/core/fields/sections';
import { FIELDS, fieldById, loincCodesOf, type FieldDef } from '../../server/src/core/fields/registry';
import { checked, fhirValidator, samples } from './helpers';
import { anchorProblem, bundleObservations, type FhirBundle, type FhirObservation, type FhirOptions, observationCategory, observationEntries, toFhirBundle, ucumCode } from '../../server/src/core/export';

const ANCHOR = '2000-01-01T00:00:00+01:00';
const withAnchor: FhirOptions = { anchor: ANCHOR, redactProse: false, shiftDays: 0 };
const noAnchor: FhirOptions = { redactProse: false, shiftDays: 0 };

let validator: ReturnType<typeof fhirValidator>;
beforeAll(() => {
  validator = fhirValidator();
});

function observations(bundle: FhirBundle): FhirObservation[] {
  return bundleObservations(bundle);
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

  it('a note with nothing exported gives an empty collection without an entry array', () => {
    const bundle = toFhirBundle('a.pneu', checked('@ day 1 08:00\nvent mode VC\noxygen room air\nnote calm'), noAnchor);
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
    expect(ids).toEqual(['obs-1-fio2', 'obs-1-peep', 'obs-1-plateau', 'obs-1-peak', 'obs-1-mean-airway-pressure', 'obs-1-ph', 'obs-1-paco2', 'obs-1-pao2', 'obs-1-hco3', 'obs-1-sao2', 'obs-1-pf-ratio']);
  });

  it('header values once, without a time', () => {
    const header = observations(bundle).filter((o) => o.id.startsWith('obs-header-'));
    expect(header.map((o) => [o.id, o.valueQuantity?.value, o.valueQuantity?.code])).toEqual([
      ['obs-header-age', 58, 'a'], ['obs-header-height', 165, 'cm'], ['obs-header-weight', 82, 'kg'],
    ]);
    for (const o of header) expect(o.effectiveDateTime).toBeUndefined();
  });

  it('header values of a note that has no timepoint yet, valid FHIR', () => {
    const header = toFhirBundle('intake.pneu', checked('patient   age 40 y, height 170 cm, weight 70 kg\n'), noAnchor);
    expect(observations(header).map((o) => [o.id, o.valueQuantity?.value, o.valueQuantity?.code])).toEqual([
      ['obs-header-age', 40, 'a'], ['obs-header-height', 170, 'cm'], ['obs-header-weight', 70, 'kg'],
    ]);
    expect(validator.validate(header, true)).toEqual([]);
  });

  it('a header value restated at the first timepoint: the header’s value and the timepoint’s, each once', () => {
    const restated = toFhirBundle('weighed.pneu', checked('patient   age 40 y, weight 70 kg\n@ day 1 08:00\npatient   weight 72 kg\nvitals    hr 80\n'), noAnchor);
    expect(observations(restated).map((o) => [o.id, o.valueQuantity?.value])).toEqual([
      ['obs-header-age', 40], ['obs-header-weight', 70], ['obs-0-weight', 72], ['obs-0-hr', 80],
    ]);
    // Stated twice in the header: the later value, as everywhere else (PN206).
    const twice = toFhirBundle('twice.pneu', checked('patient   weight 70 kg, weight 71 kg\n@ day 1 08:00\nvitals    hr 80\n'), noAnchor);
    expect(observations(twice).map((o) => [o.id, o.valueQuantity?.value])).toEqual([['obs-header-weight', 71], ['obs-0-hr', 80]]);
  });

  it('LOINC from the registry, UCUM from the unit registry, canonical value', () => {
    const pao2 = byId(bundle, 'obs-0-pao2')!;
    expect(pao2.status).toBe('final');
    expect(pao2.code.coding).toEqual([{ system: 'http://loinc.org', code: '2703-7', display: 'Oxygen [Partial pressure] in Arterial blood' }]);
    expect(pao2.valueQuantity).toEqual({ value: 74, unit: 'mmHg', system: 'http://unitsofmeasure.org', code: 'mm[Hg]' });
    expect(byId(bundle, 'obs-0-temp')?.valueQuantity).toEqual({ value: 38.9, unit: '°C', system: 'http://unitsofmeasure.org', code: 'Cel' });
    expect(byId(bundle, 'obs-0-ph')?.valueQuantity).toEqual({ value: 7.29, unit: 'pH', system: 'http://unitsofmeasure.org', code: '[pH]' });
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
    expect(bp.code.coding?.[0]?.code).toBe('85354-9');
    expect(bp.component?.map((c) => [c.code.coding?.[0]?.code, c.valueQuantity.value, c.valueQuantity.code])).toEqual([['8480-6', 104, 'mm[Hg]'], ['8462-4', 62, 'mm[Hg]']]);
    // LOINC 8480-6 "Systolic blood pressure" and 8462-4 "Diastolic blood pressure", as the blood
    // pressure example of FHIR 6.0.0-ballot1 (hl7.org/fhir/6.0.0-ballot1/observation-example-bloodpressure.html) codes its components.
    expect(bp.component?.map((c) => c.code.coding?.[0]?.display)).toEqual(['Systolic blood pressure', 'Diastolic blood pressure']);
  });

  it('P/F ratio with its LOINC code, in mmHg, derived from the PaO2 and FiO2 Observations', () => {
    const pf = byId(bundle, 'obs-2-pf-ratio')!;
    // LOINC 50984-4 "Horowitz index in Arterial blood", as the MII ICU module's value set of
    // ventilation codes shows it (CPG on EBMonFHIR 1.0.2 build, ValueSet
    // vs-mii-icu-code-observation-beatmung-loinc, build.fhir.org/ig/CEOsys/cpg-on-ebm-on-fhir).
    expect(pf.code.coding).toEqual([{ system: 'http://loinc.org', code: '50984-4', display: 'Horowitz index in Arterial blood' }]);
    expect(pf.valueQuantity?.value).toBeCloseTo(82 / 0.6, 9);
    expect(pf.valueQuantity?.code).toBe('mm[Hg]');
    // Timepoint 2 uses the FiO2 carried from timepoint 1: the reference points there.
    const urlOf = (id: string) => observationEntries(bundle).find((e) => e.resource.id === id)?.fullUrl;
    expect(pf.derivedFrom).toEqual([{ reference: urlOf('obs-2-pao2') }, { reference: urlOf('obs-1-fio2') }]);
  });

  it('P/F ratio on room air: derived from the PaO2 alone, since the FiO2 of 0.21 the device implies is no Observation; README says so', () => {
    const b = toFhirBundle('a.pneu', checked('@ 08:00\noxygen room air\nabg 7.40/40/84/24'), noAnchor);
    const urlOf = (id: string) => observationEntries(b).find((e) => e.resource.id === id)?.fullUrl;
    expect(byId(b, 'obs-0-pf-ratio')?.valueQuantity?.value).toBe(400); // 84 / 0.21
    expect(byId(b, 'obs-0-pf-ratio')?.derivedFrom).toEqual([{ reference: urlOf('obs-0-pao2') }]);
    expect(byId(b, 'obs-0-fio2')).toBeUndefined();
    const readme = readFileSync('README.md', 'utf8').replace(/\s+/g, ' ');
    expect(readme.includes('on room air, whose FiO2 of 0.21 is implied and no Observation, its PaO2 alone'), 'README.md says so').toBe(true);
  });

  it('no other derived value, no identifier; the subject is the Bundle\'s anonymous Patient, its last entry', () => {
    const codes = new Set(observations(bundle).map((o) => o.code.coding?.[0]?.code).filter((c) => c !== undefined));
    const registry = new Set(FIELDS.flatMap((f) => loincCodesOf(f).map((l) => l.code)));
    for (const code of codes) expect(registry.has(code!) || code === '50984-4', code).toBe(true);
    const patient = bundle.entry!.at(-1)!;
    expect(patient.resource).toEqual({ resourceType: 'Patient', id: 'patient' });
    for (const o of observations(bundle)) {
      expect(o.subject).toEqual({ reference: patient.fullUrl });
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

  it('a field stated in two sections at one timepoint gives an Observation for each, and a carried FiO2 is referenced where it was stated', () => {
    const note = [
      '@ day 1 08:00',
      'vent      mode VC, vt 400, peep 5, fio2 0.4',
      'abg       7.35/45/80/24, fio2 0.5, na 139',
      'labs      na 141',
      'vitals    etco2 30',
      'vent      etco2 40',
      '@ 09:00',
      'abg       po2 90',
    ].join('\n');
    const b = toFhirBundle('two-sections.pneu', checked(note), noAnchor);
    const value = (id: string) => byId(b, id)?.valueQuantity?.value;
    // In force (and in the CSV column): the gas's sampling FiO2, the labs sodium, the vent line's EtCO2.
    expect([value('obs-0-fio2'), value('obs-0-na'), value('obs-0-etco2')]).toEqual([0.5, 141, 40]);
    // Stated too, and not lost: the ventilator's FiO2 setting, the blood gas sodium, the vitals EtCO2.
    expect(byId(b, 'obs-0-fio2-vent')?.code.coding?.[0]?.code).toBe('19994-3');
    expect(value('obs-0-fio2-vent')).toBe(0.4);
    expect(byId(b, 'obs-0-na-abg')?.code.coding?.[0]?.code).toBe('2947-0');
    expect(value('obs-0-na-abg')).toBe(139);
    expect(value('obs-0-etco2-vitals')).toBe(30);
    // Timepoint 1's P/F uses the ventilator's FiO2 carried from timepoint 0 (90 / 0.4), not the gas's 0.5.
    const urlOf = (id: string) => observationEntries(b).find((e) => e.resource.id === id)?.fullUrl;
    const pf = byId(b, 'obs-1-pf-ratio')!;
    expect(pf.valueQuantity?.value).toBeCloseTo(90 / 0.4, 9);
    expect(pf.derivedFrom).toEqual([{ reference: urlOf('obs-1-pao2') }, { reference: urlOf('obs-0-fio2-vent') }]);
    expect(validator.validate(b, true)).toEqual([]);
    expect(new Set(b.entry?.map((e) => e.fullUrl)).size).toBe(b.entry?.length);
  });

  it('a setting that is not used (an oxygen line ended by a vent line at the same timepoint) or replaced in its section is not exported', () => {
    const note = '@ day 1 08:00\noxygen mask, fio2 0.3\nvent mode VC, vt 400, fio2 0.5\nabg po2 80, fio2 0.45\n@ 09:00\nvent mode VC, vt 400\nvent mode PC, vt 380';
    const b = toFhirBundle('not-used.pneu', checked(note), noAnchor);
    const values = observations(b).filter((o) => /^obs-\d+-(fio2|vt)/.test(o.id)).map((o) => [o.id, o.valueQuantity?.value]);
    expect(values).toEqual([['obs-0-fio2', 0.45], ['obs-0-fio2-vent', 0.5], ['obs-0-vt', 400], ['obs-1-vt', 380]]);
  });

  it('every UCUM code is one a UCUM library reads, [pH] included, and names the unit the value is in', () => {
    const ucum = UcumLhcUtils.getInstance();
    const codes = new Set(samples().flatMap((s) => observations(toFhirBundle(s.path, s.result, noAnchor)).flatMap((o) => [o.valueQuantity?.code, ...(o.component ?? []).map((c) => c.valueQuantity.code)])));
    expect(codes).toContain('[pH]');
    for (const code of codes) if (code) expect(ucum.validateUnitString(code, true).status, code).toBe('valid');
    // Every unit a field can be exported in (its canonical unit), not only those the samples use.
    for (const f of FIELDS) {
      if (!isObservedField(f)) continue;
      const code = ucumCode(f.unit ?? '');
      expect(code, f.id).not.toBeNull();
      expect(ucum.validateUnitString(code!, true).status, `${f.id}: ${code}`).toBe('valid');
    }
  });
});

describe('codes that fit the value', () => {
  const codeOf = (b: FhirBundle, id: string) => byId(b, id)?.code;

  it('glucose in mmol/L carries a [Moles/volume] code: serum or plasma on a labs line (14749-6), blood on a blood gas line (15074-8)', () => {
    const b = toFhirBundle('a.pneu', checked('@ day 1 08:00\nlabs glucose 5.5\n@ +1h\nabg 7.40/40/90/24, glucose 6.1\n@ +1h\nvbg 7.35/46/40/25, glucose 6.4'), noAnchor);
    const glucose = byId(b, 'obs-0-glucose')!;
    expect(glucose.code).toEqual({ coding: [{ system: 'http://loinc.org', code: '14749-6', display: 'Glucose [Moles/volume] in Serum or Plasma' }], text: 'Glucose' });
    expect(glucose.valueQuantity).toEqual({ value: 5.5, unit: 'mmol/L', system: 'http://unitsofmeasure.org', code: 'mmol/L' });
    expect(codeOf(b, 'obs-1-glucose')?.coding).toEqual([{ system: 'http://loinc.org', code: '15074-8', display: 'Glucose [Moles/volume] in Blood' }]);
    expect(codeOf(b, 'obs-2-glucose')?.coding?.map((c) => c.code)).toEqual(['15074-8']);
    expect(validator.validate(b, true)).toEqual([]);
  });

  it('a venous base excess is coded as venous blood, not as arterial; an electrolyte from a blood gas is coded as whole blood, from the laboratory as serum or plasma', () => {
    const b = toFhirBundle('a.pneu', checked('@ day 1 08:00\nvbg 7.30/50/40/24, be -4, na 135, k 4.4\n@ +1h\nabg 7.35/40/90/22, be -2, cl 101\n@ +1h\nlabs na 140, k 4.1, cl 103'), noAnchor);
    expect(codeOf(b, 'obs-0-base-excess')).toEqual({ coding: [{ system: 'http://loinc.org', code: '1927-3', display: 'Base excess in Venous blood by calculation' }], text: 'Base excess' }); // vbg: venous blood
    expect(loincMismatch(fieldById('base_excess')!.loinc!, fieldById('base_excess')!, 'vbg')).toBe('1925-7 is for arterial blood, the value is from a venous gas');
    expect(loincMismatch(fieldById('base_excess')!.loincBySection!.vbg!, fieldById('base_excess')!, 'abg')).toBe('1927-3 is for venous blood, the value is from an arterial gas');
    expect(codeOf(b, 'obs-1-base-excess')?.coding?.map((c) => c.code)).toEqual(['1925-7']); // arterial, on an abg line
    expect(codeOf(b, 'obs-0-na')?.coding).toEqual([{ system: 'http://loinc.org', code: '2947-0', display: 'Sodium [Moles/volume] in Blood' }]); // vbg: whole blood
    expect(codeOf(b, 'obs-0-k')?.coding?.map((c) => c.code)).toEqual(['6298-4']);
    expect(codeOf(b, 'obs-1-cl')?.coding?.map((c) => c.code)).toEqual(['2069-3']); // abg: whole blood
    expect(codeOf(b, 'obs-2-na')?.coding).toEqual([{ system: 'http://loinc.org', code: '2951-2', display: 'Sodium [Moles/volume] in Serum or Plasma' }]); // labs: serum or plasma
    expect(codeOf(b, 'obs-2-k')?.coding?.map((c) => c.code)).toEqual(['2823-3']);
    expect(codeOf(b, 'obs-2-cl')?.coding?.map((c) => c.code)).toEqual(['2075-0']);
    expect(codeOf(b, 'obs-0-pvco2')?.coding?.map((c) => c.code)).toEqual(['2021-4']);
    expect(validator.validate(b, true)).toEqual([]);
  });

  it('a serum or plasma code is never kept on a blood gas line, nor a whole-blood code refused there', () => {
    const na = fieldById('na')!;
    const serum = na.loinc!;
    for (const section of ['abg', 'vbg'] as const) {
      expect(loincMismatch(serum, na, section)).toBe('2951-2 is for serum or plasma, the value is from a blood gas (whole blood)');
      expect(fhirLoinc(na, section)?.code).toBe('2947-0');
    }
    expect(fhirLoinc(na, 'labs')?.code).toBe('2951-2');
  });

  it('the flow of a high-flow device is the total gas flow, so it is not coded as inhaled oxygen flow (3151-8)', () => {
    const b = toFhirBundle('a.pneu', checked('@ day 1 08:00\noxygen hfnc 50 L/min, fio2 60 %\n@ +1h\noxygen cannula 2 L/min\n@ +1h\noxygen mask 10 L/min'), noAnchor);
    expect(codeOf(b, 'obs-0-o2-flow')).toEqual({ text: 'Oxygen flow' });
    expect(byId(b, 'obs-0-o2-flow')?.valueQuantity?.value).toBe(50);
    expect(codeOf(b, 'obs-1-o2-flow')?.coding?.map((c) => c.code)).toEqual(['3151-8']);
    expect(codeOf(b, 'obs-2-o2-flow')?.coding?.map((c) => c.code)).toEqual(['3151-8']);
    expect(validator.validate(b, true)).toEqual([]);
  });

  it('a tidal volume under a mode that sets none (PS, PC, …) was delivered, so it does not carry the setting code (20112-9)', () => {
    const b = toFhirBundle('a.pneu', checked('@ day 1 08:00\nvent mode VC, vt 420, rate 16, peep 8, fio2 0.5\n@ +1h\nvent mode PS, ps 10, vt 510\n@ +1h\nvent vt 400'), noAnchor);
    expect(codeOf(b, 'obs-0-vt')?.coding?.map((c) => c.code)).toEqual(['20112-9']);
    expect(codeOf(b, 'obs-1-vt')).toEqual({ text: 'Tidal volume' });
    expect(byId(b, 'obs-1-vt')?.valueQuantity?.value).toBe(510);
    expect(codeOf(b, 'obs-2-vt')).toEqual({ text: 'Tidal volume' }); // PS carried: still no set volume
  });

  it('a serum value written as tco2 is total CO2 (2028-9), not the bicarbonate of 1963-8, and the reverse', () => {
    const b = toFhirBundle('a.pneu', checked('@ day 1 08:00\nlabs tco2 25\n@ +1h\nlabs hco3 24\n@ +1h\nlabs bicarb 23'), noAnchor);
    expect(codeOf(b, 'obs-0-hco3-serum')).toEqual({ coding: [{ system: 'http://loinc.org', code: '2028-9', display: 'Carbon dioxide, total [Moles/volume] in Serum or Plasma' }], text: 'Bicarbonate (serum)' });
    expect(byId(b, 'obs-0-hco3-serum')?.valueQuantity?.value).toBe(25);
    expect(codeOf(b, 'obs-1-hco3-serum')?.coding?.map((c) => c.code)).toEqual(['1963-8']);
    expect(codeOf(b, 'obs-2-hco3-serum')?.coding?.map((c) => c.code)).toEqual(['1963-8']);
    expect(validator.validate(b, true)).toEqual([]);
    // Whatever code the registry gives, the mismatch rules refuse each on the other key.
    const field = fieldById('hco3_serum')!;
    const bicarbonate = field.loinc!;
    const totalCo2 = field.loincByKey!['tco2']!;
    const written = (key: string) => ({ key, device: null, mode: null, support: null });
    expect(loincMismatch(bicarbonate, field, 'labs', written('tco2'))).toBe('1963-8 is bicarbonate, the value was written as total CO2 (tco2)');
    expect(loincMismatch(totalCo2, field, 'labs', written('hco3'))).toBe('2028-9 is total CO2, the value was written as hco3');
    expect(loincMismatch(totalCo2, field, 'labs', written('tco2'))).toBeNull();
  });

  it('the registry codes left out, by field and section, are exactly these (a change shows in review)', () => {
    const dropped: string[] = [];
    for (const f of FIELDS) {
      for (const section of f.sections as readonly SectionId[]) {
        const registry = f.loincBySection?.[section] ?? f.loinc;
        if (registry && fhirLoinc(f, section) === null) dropped.push(`${f.id}@${section}: ${loincMismatch(registry, f, section)}`);
      }
    }
    // None: a venous base excess has a venous code of its own (1927-3) instead of the arterial 1925-7.
    expect(dropped).toEqual([]);
  });

  it('every code that is kept names a property that agrees with the unit of the value, and a specimen that agrees with the line', () => {
    for (const f of FIELDS) {
      for (const section of f.sections as readonly SectionId[]) {
        for (const key of [null, ...f.aliases]) {
          const loinc = fhirLoinc(f, section, { key, device: null, mode: null, support: null });
          if (!loinc) continue;
          if (loinc.display.includes('[Moles/volume]')) expect(f.unit, f.id).toBe('mmol/L');
          if (loinc.display.includes('[Mass/volume]')) expect(f.unit, f.id).toBe('g/dL');
          if (loinc.display.includes('[Partial pressure]')) expect(f.unit, f.id).toBe('mmHg');
          if (/ in Serum or Plasma\b/.test(loinc.display)) expect(section, `${f.id}@${section}`).toBe('labs'); // never on a blood gas line
        }
      }
    }
  });

  it('values with no code of their own are exported with their label alone; words and the place are not exported', () => {
    const b = toFhirBundle('a.pneu', checked('place altitude 2000 m\n@ day 1 08:00\nvent mode VC, vt 450, rate 14, peep 5, fio2 0.4, ve 7.2\nvitals etco2 35\n@ +1h\noxygen niv, ipap 14, epap 6, fio2 0.4'), noAnchor);
    expect(codeOf(b, 'obs-0-vent-rate')).toEqual({ text: 'Set rate' });
    expect(codeOf(b, 'obs-0-minute-volume')).toEqual({ text: 'Measured minute volume' });
    expect(byId(b, 'obs-0-minute-volume')?.category).toBeUndefined(); // read off the ventilator: not a setting
    expect(byId(b, 'obs-0-vent-rate')?.category?.[0]?.coding?.[0]?.code).toBe('therapy');
    expect(codeOf(b, 'obs-1-ipap')).toEqual({ text: 'IPAP' });
    expect(codeOf(b, 'obs-1-epap')).toEqual({ text: 'EPAP' });
    expect(byId(b, 'obs-1-ipap')?.category?.[0]?.coding?.[0]?.code).toBe('therapy');
    expect(byId(b, 'obs-0-etco2')?.valueQuantity).toEqual({ value: 35, unit: 'mmHg', system: 'http://unitsofmeasure.org', code: 'mm[Hg]' });
    const ids = observations(b).map((o) => o.id);
    for (const id of ['obs-0-mode', 'obs-1-device', 'obs-header-altitude', 'obs-header-barometric', 'obs-0-barometric']) expect(ids).not.toContain(id);
    expect(FIELDS.filter((f) => isObservedField(f) && loincCodesOf(f).length === 0).map((f) => f.id)).toEqual(['ipap', 'epap', 'cpap_level', 'vent_rate', 'peep_total', 'autopeep', 'amplitude', 'insp_pressure', 'minute_volume']);
    // The SpO2 target, a prescription with no LOINC code found, is not exported either (CSV and JSON Lines have it).
    expect(FIELDS.filter((f) => !isObservedField(f)).map((f) => f.id)).toEqual(['sex', 'altitude', 'barometric', 'gas_unit', 'device', 'spo2_target', 'mode']);
    expect(validator.validate(b, true)).toEqual([]);
  });
  it('a total PEEP and an intrinsic PEEP read off the ventilator (no LOINC code of their own) are Observations with their label alone, not settings, and the Bundle stays valid', () => {
    const b = toFhirBundle('a.pneu', checked('@ day 1 08:00\nvent mode VC, vt 420, rate 22, peep 8, fio2 0.5, plateau 27, tpeep 13, ipeep 5'), noAnchor);
    for (const [id, label, value] of [['obs-0-peep-total', 'Total PEEP', 13], ['obs-0-autopeep', 'Intrinsic PEEP', 5]] as const) {
      expect(codeOf(b, id)?.coding).toBeUndefined();
      expect(codeOf(b, id)?.text, id).toMatch(new RegExp(label, 'i'));
      expect(byId(b, id)?.category, id).toBeUndefined(); // measured at an end-expiratory hold: not a setting
      expect(byId(b, id)?.valueQuantity, id).toEqual({ value, unit: 'cmH2O', system: 'http://unitsofmeasure.org', code: 'cm[H2O]' });
    }
    expect(validator.validate(b, true)).toEqual([]);
    for (const resource of observations(b)) expect(validator.validate(resource, true), resource.id).toEqual([]);
  });
  it('a set inspiratory pressure (`pinsp`, no LOINC code found on a LOINC or HL7 page) is a therapy Observation with its label alone, and the Bundle stays valid', () => {
    const b = toFhirBundle('a.pneu', checked('@ day 1 08:00\nvent mode PC, pinsp 18, peep 8, rate 20, fio2 0.5\n@ +1h\nvent fio2 0.4'), noAnchor);
    expect(codeOf(b, 'obs-0-insp-pressure')).toEqual({ text: 'Set inspiratory pressure' });
    expect(byId(b, 'obs-0-insp-pressure')?.category?.[0]?.coding?.[0]?.code).toBe('therapy');
    expect(byId(b, 'obs-0-insp-pressure')?.valueQuantity).toEqual({ value: 18, unit: 'cmH2O', system: 'http://unitsofmeasure.org', code: 'cm[H2O]' });
    // Carried to the next timepoint, not exported again there.
    expect(byId(b, 'obs-1-insp-pressure')).toBeUndefined();
    expect(validator.validate(b, true)).toEqual([]);
    for (const resource of observations(b)) expect(validator.validate(resource, true), resource.id).toEqual([]);
  });
});

describe('LOINC codes by section', () => {
  it('codes a ventilator FiO2 as the ventilator setting (19994-3, HL7 SANER IG 1.0.0 ValueSet Ventilator Observations, 2021) and an oxygen-line FiO2 as inhaled oxygen (3150-0)', () => {
    const b = toFhirBundle('a.pneu', checked('@ 08:00\nvent mode VC, vt 420, rate 16, peep 8, fio2 0.5\n@ 09:00\noxygen venturi, fio2 0.28'), noAnchor);
    expect(byId(b, 'obs-0-fio2')?.code.coding?.[0]?.code).toBe('19994-3');
    expect(byId(b, 'obs-1-fio2')?.code.coding?.[0]?.code).toBe('3150-0');
    expect(validator.validate(b, true)).toEqual([]);
  });
});

describe('a ventilated note (codes of the MII ICU module)', () => {
  const note = [
    '@ day 1 08:00',
    'vent mode VC, vt 420, rate 18, peep 10, fio2 0.5, flow 60 L/min, plateau 26, peak 31, map 15',
    'vitals hr 98, co 5.4, etco2 38',
    '@ +1h',
    'vent etco2 5.1 kPa',
    '@ +1h',
    'vent mode PS, ps 10, flow 45',
  ].join('\n');
  const b = toFhirBundle('a.pneu', checked(note), withAnchor);
  const coding = (id: string) => byId(b, id)?.code.coding;
  const category = (id: string) => byId(b, id)?.category?.[0]?.coding?.[0]?.code;

  it('plateau, peak and mean airway pressure carry their measured codes and no category; the set flow its setting code and therapy', () => {
    expect(coding('obs-0-plateau')).toEqual([{ system: 'http://loinc.org', code: '76259-1', display: 'Pressure.plateau Respiratory system airway --on ventilator' }]);
    expect(coding('obs-0-peak')).toEqual([{ system: 'http://loinc.org', code: '76531-3', display: 'Pressure.max Respiratory system airway --on ventilator' }]);
    expect(coding('obs-0-mean-airway-pressure')).toEqual([{ system: 'http://loinc.org', code: '76530-5', display: 'Mean pressure Respiratory system airway --on ventilator' }]);
    for (const id of ['obs-0-plateau', 'obs-0-peak', 'obs-0-mean-airway-pressure']) expect(byId(b, id)?.category, id).toBeUndefined();
    expect(byId(b, 'obs-0-plateau')?.valueQuantity).toEqual({ value: 26, unit: 'cmH2O', system: 'http://unitsofmeasure.org', code: 'cm[H2O]' });
    expect(coding('obs-0-insp-flow')).toEqual([{ system: 'http://loinc.org', code: '76275-7', display: 'Inspiratory flow setting Ventilator' }]);
    expect(category('obs-0-insp-flow')).toBe('therapy');
    expect(byId(b, 'obs-0-insp-flow')?.valueQuantity).toEqual({ value: 60, unit: 'L/min', system: 'http://unitsofmeasure.org', code: 'L/min' });
  });

  it('end-tidal CO2 has one code and the vital-signs category on a vitals line and on a vent line, in mmHg; cardiac output keeps its code and has no category', () => {
    for (const id of ['obs-0-etco2', 'obs-1-etco2']) {
      expect(coding(id), id).toEqual([{ system: 'http://loinc.org', code: '19891-1', display: 'Carbon dioxide [Partial pressure] in Exhaled gas --at end expiration' }]);
      expect(category(id), id).toBe('vital-signs');
    }
    expect(byId(b, 'obs-1-etco2')?.valueQuantity?.value).toBeCloseTo(5.1 * (1000 / 133.322387415), 9);
    expect(byId(b, 'obs-1-etco2')?.valueQuantity?.code).toBe('mm[Hg]');
    expect(coding('obs-0-cardiac-output')).toEqual([{ system: 'http://loinc.org', code: '8741-1', display: 'Left ventricular Cardiac output' }]);
    // Not one of FHIR R4's vital signs (8741-1 is none of the profile's codes, L/min none of its units).
    expect(category('obs-0-cardiac-output')).toBeUndefined();
    expect(byId(b, 'obs-0-cardiac-output')?.category).toBeUndefined();
  });

  it('a flow written under a mode that sets none (PS) was measured: exported without the setting code', () => {
    expect(byId(b, 'obs-2-insp-flow')?.code).toEqual({ text: 'Inspiratory flow' });
    expect(byId(b, 'obs-2-insp-flow')?.valueQuantity?.value).toBe(45);
    const flow = fieldById('insp_flow')!;
    const under = (mode: string) => loincMismatch(flow.loinc!, flow, 'vent', { key: 'flow', device: null, mode, support: null });
    for (const mode of ['PC', 'PRVC', 'PS', 'APRV', 'CPAP', 'HFOV']) expect(under(mode), mode).toBe(`76275-7 is a set inspiratory flow, and ${mode} sets none`);
    for (const mode of ['VC', 'SIMV']) expect(under(mode), mode).toBeNull();
    expect(loincMismatch(flow.loinc!, flow, 'vent')).toBeNull(); // no mode known: a flow on a vent line is set
  });

  it('a setting code is refused on a reading and a code measured on the ventilator on a setting', () => {
    const [plateau, peep, flow, etco2] = ['plateau', 'peep', 'insp_flow', 'etco2'].map((id) => fieldById(id)!) as [FieldDef, FieldDef, FieldDef, FieldDef];
    expect(loincMismatch(peep.loinc!, plateau, 'vent')).toBe('20077-4 is a setting, the value is a reading');
    expect(loincMismatch(flow.loinc!, etco2, 'vent')).toBe('76275-7 is a setting, the value is a reading');
    expect(loincMismatch(plateau.loinc!, peep, 'vent')).toBe('76259-1 is measured on the ventilator, the value is a setting');
    // Every code the registry gives agrees with the field: settings on settings, measurements on readings.
    for (const f of FIELDS) for (const c of loincCodesOf(f)) {
      if (/\bsetting\b/.test(c.display)) expect(f.reading, `${f.id} ${c.code}`).not.toBe(true);
      if (/--on ventilator\b/.test(c.display)) expect(f.reading, `${f.id} ${c.code}`).toBe(true);
    }
  });

  it('validates as FHIR R4', () => {
    expect(validator.validate(b, true)).toEqual([]);
    for (const resource of observations(b)) expect(validator.validate(resource, true), resource.id).toEqual([]);
  });

  it('a mean airway pressure set in HFOV is a setting: therapy, without the code measured on the ventilator (76530-5); measured under VC it keeps both', () => {
    // In HFOV the oscillator is set to a mean airway pressure, which the timeline holds and carries
    // as a setting (grammar/README.md; the field's description), so a code that names a reading does not fit it.
    const hfov = toFhirBundle('h.pneu', checked('@ 08:00\nvent mode HFOV, rate 5 Hz, map 22, amplitude 40, fio2 0.6\n@ 09:00\nvent mode VC, vt 420, rate 16, peep 8, map 14'), noAnchor);
    expect(byId(hfov, 'obs-0-mean-airway-pressure')?.code).toEqual({ text: 'Mean airway pressure' });
    expect(byId(hfov, 'obs-0-mean-airway-pressure')?.category?.[0]?.coding?.[0]?.code).toBe('therapy');
    expect(byId(hfov, 'obs-0-mean-airway-pressure')?.valueQuantity?.value).toBe(22);
    expect(byId(hfov, 'obs-1-mean-airway-pressure')?.code.coding?.[0]?.code).toBe('76530-5');
    expect(byId(hfov, 'obs-1-mean-airway-pressure')?.category).toBeUndefined();
    expect(validator.validate(hfov, true)).toEqual([]);
  });
});

describe('categories', () => {
  it('vital signs, laboratory or therapy by the field section; none for age and cardiac output', () => {
    const of = (id: string) => observationCategory(FIELDS.find((f) => f.id === id)!);
    expect(['hr', 'rr', 'spo2', 'temp', 'bp', 'etco2', 'height', 'weight'].map(of)).toEqual(Array(8).fill('vital-signs'));
    expect(['ph', 'paco2', 'pao2', 'sao2', 'pvo2', 'lactate', 'hb', 'na', 'albumin', 'glucose'].map(of)).toEqual(Array(10).fill('laboratory'));
    expect(['fio2', 'o2_flow', 'vt', 'peep', 'pressure_support', 'insp_flow', 'vent_rate', 'ipap', 'epap', 'cpap_level'].map(of)).toEqual(Array(10).fill('therapy'));
    expect(['plateau', 'peak', 'mean_airway_pressure', 'minute_volume', 'age', 'cardiac_output'].map(of)).toEqual(Array(6).fill(null));
  });

  it('every field with a LOINC code has a category decided for it: none only for age, cardiac output and what is read off the ventilator', () => {
    // A field that gets a code must be added here with its category (a change shows in review).
    const decided = Object.fromEntries(FIELDS.filter((f) => loincCodesOf(f).length > 0).map((f) => [f.id, observationCategory(f)]));
    expect(decided).toEqual({
      age: null, height: 'vital-signs', weight: 'vital-signs',
      hr: 'vital-signs', rr: 'vital-signs', spo2: 'vital-signs', temp: 'vital-signs', bp: 'vital-signs', mean_bp: 'vital-signs', etco2: 'vital-signs', cardiac_output: null,
      o2_flow: 'therapy', fio2: 'therapy', vt: 'therapy', peep: 'therapy', pressure_support: 'therapy', insp_flow: 'therapy',
      plateau: null, peak: null, mean_airway_pressure: null,
      ph: 'laboratory', paco2: 'laboratory', pao2: 'laboratory', hco3: 'laboratory', base_excess: 'laboratory', sao2: 'laboratory',
      ph_venous: 'laboratory', pvco2: 'laboratory', pvo2: 'laboratory', hco3_venous: 'laboratory', svo2: 'laboratory',
      lactate: 'laboratory', hb: 'laboratory', na: 'laboratory', k: 'laboratory', cl: 'laboratory', hco3_serum: 'laboratory', albumin: 'laboratory', glucose: 'laboratory',
    });
    for (const f of FIELDS) if (loincCodesOf(f).length > 0 && observationCategory(f) === null) expect(f.id === 'age' || f.id === 'cardiac_output' || f.reading === true, f.id).toBe(true);
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
    expect(anchorProblem('2024-03-01T00:00:00.000-03:00')).toBeNull();
    for (const bad of ['2024-03-01', '2024-03-01T00:00:00', '2024-02-30T00:00Z', '2024-03-01T24:00Z', 'yesterday', '2024-03-01T00:00+15:00']) {
      expect(anchorProblem(bad), bad).not.toBeNull();
      expect(() => toFhirBundle('a.pneu', result, { anchor: bad, redactProse: false, shiftDays: 0 }), bad).toThrow(RangeError);
    }
  });

  it('an anchor in the years 1 to 99 is taken as that year (it was refused as no valid date: read as a year of 1901 to 1999)', () => {
    expect(anchorProblem('0001-01-01T00:00:00Z')).toBeNull();
    expect(anchorProblem('0048-02-29T00:00:00Z')).toBeNull();
    expect(anchorProblem('0050-02-29T00:00:00Z')).not.toBeNull();
    const times = observations(toFhirBundle('a.pneu', result, { anchor: '0050-06-01T00:00:00Z', redactProse: false, shiftDays: 0 })).map((o) => o.effectiveDateTime?.slice(0, 4));
    expect(times.length).toBeGreaterThan(0);
    expect(new Set(times)).toEqual(new Set(['0050']));
  });

  it('an anchor offset is at most 14:00 either way, as a FHIR dateTime allows (its pattern: 00:00 to 13:59, or 14:00)', () => {
    for (const good of ['2024-03-01T00:00+14:00', '2024-03-01T00:00-14:00', '2024-03-01T00:00+13:59', '2024-03-01T00:00-00:00']) {
      expect(anchorProblem(good), good).toBeNull();
      const bundle = toFhirBundle('a.pneu', result, { anchor: good, redactProse: false, shiftDays: 0 });
      expect(validator.validate(bundle, true), good).toEqual([]);
    }
    for (const bad of ['2024-03-01T00:00+14:30', '2024-03-01T00:00-14:59', '2024-03-01T00:00+12:60']) expect(anchorProblem(bad), bad).not.toBeNull();
  });

  it('an anchor that is not 00:00 is refused rather than moving every clock time of the note by its time', () => {
    // `@ day 1 08:00` with an anchor of 08:00 would otherwise be written as 16:00.
    for (const bad of ['2024-03-01T08:00:00Z', '2024-03-01T00:01Z', '2024-03-01T00:00:30+01:00', '2024-03-01T00:00:00.250-03:00']) {
      expect(anchorProblem(bad), bad).toMatch(/is 00:00 of day 1.*write its time as 00:00 \(2024-03-01T00:00:00(Z|[+-]\d\d:\d\d)\)/);
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
