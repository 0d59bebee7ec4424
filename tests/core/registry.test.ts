// The field and unit registries are data: validated here with zod, and checked for
// ambiguity (one field per key within a section) and sane bounds.
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { FIELDS, fieldById, fieldFor, keysInSection, loincCodesOf, loincFor, type LoincCode } from '../../server/src/core/fields/registry';
import type { SectionId } from '../../server/src/core/fields/sections';
import { SECTIONS } from '../../server/src/core/fields/sections';
import { UNITS, unitById, unitsForSpelling } from '../../server/src/core/fields/units';

const bounds = z.object({ min: z.number().optional(), max: z.number().optional() }).strict();
const loincCode = z.object({ code: z.string().regex(/^\d{1,6}-\d$/), display: z.string().min(3), fromMemory: z.boolean().optional(), source: z.string().regex(/ — https:\/\/\S+$/).optional() }).strict()
  .refine((c) => !(c.fromMemory && c.source), 'a code read on a page is not from memory');
const fieldSchema = z
  .object({
    id: z.string().regex(/^[a-z][a-z0-9_]*$/),
    label: z.string().min(2),
    short: z.string().min(1).optional(),
    description: z.string().min(5).endsWith('.'),
    sections: z.array(z.enum(SECTIONS.map((s) => s.id) as [string, ...string[]])).min(1),
    aliases: z.array(z.string().regex(/^[a-z][a-z0-9_]*$/)).min(1),
    kind: z.enum(['number', 'pair', 'word']),
    dimension: z.string().optional(),
    unit: z.string().optional(),
    units: z.array(z.string()).optional(),
    bare: z.enum(['canonical', 'gas', 'fraction-or-percent']).optional(),
    hard: bounds.optional(),
    soft: bounds.optional(),
    doubt: bounds.optional(),
    boundsSource: z.string().min(10).optional(),
    loinc: loincCode.optional(),
    loincBySection: z.record(z.string(), loincCode).optional(),
    loincByKey: z.record(z.string(), loincCode).optional(),
    words: z.record(z.string(), z.string()).optional(),
    openWords: z.boolean().optional(),
    reading: z.boolean().optional(),
    measuredIn: z.array(z.enum(['volume', 'adaptive', 'pressure', 'spontaneous', 'oscillation'])).optional(),
    setIn: z.array(z.enum(['volume', 'adaptive', 'pressure', 'spontaneous', 'oscillation'])).optional(),
    join: z.enum(['slash', 'dash']).optional(),
    decimals: z.number().int().min(0).max(3),
  })
  .strict();

describe('field registry', () => {
  it.each(FIELDS.map((f) => [f.id, f] as const))('%s is a valid row', (_id, field) => {
    fieldSchema.parse(field);
    if (field.kind !== 'word') {
      expect(field.unit, 'numeric fields have a canonical unit').toBeDefined();
      expect(field.units, 'the canonical unit is allowed').toContain(field.unit);
      // The one exception: a tidal volume per kg of predicted body weight, read in mL by the timeline (tests/core/vt-per-kg.test.ts).
      for (const u of field.units ?? []) {
        if (field.id === 'vt' && u === 'mL/kg') expect(unitById(u)?.dimension).toBe('volume-per-kg');
        else expect(unitById(u)?.dimension, `${u} shares the field's dimension`).toBe(field.dimension);
      }
      expect(field.boundsSource, 'bounds name their source').toBeDefined();
    } else {
      expect(field.words ?? field.openWords).toBeTruthy();
    }
    if (field.hard && field.soft) {
      if (field.soft.min !== undefined) expect(field.soft.min).toBeGreaterThanOrEqual(field.hard.min ?? -Infinity);
      if (field.soft.max !== undefined) expect(field.soft.max).toBeLessThanOrEqual(field.hard.max ?? Infinity);
    }
    if (field.doubt) {
      // A doubt window widens the soft bounds (never narrows them) inside the hard ones.
      expect(field.soft, 'a doubt window widens soft bounds').toBeDefined();
      expect(field.doubt.min ?? -Infinity).toBeLessThanOrEqual(field.soft?.min ?? -Infinity);
      expect(field.doubt.max ?? Infinity).toBeGreaterThanOrEqual(field.soft?.max ?? Infinity);
      expect(field.doubt.min ?? Infinity).toBeGreaterThanOrEqual(field.hard?.min ?? -Infinity);
      expect(field.doubt.max ?? -Infinity).toBeLessThanOrEqual(field.hard?.max ?? Infinity);
    }
  });

  it('gives usual bounds to every field a note may write in more than one unit, so a unit is offered only where a number is usual in it', () => {
    // FiO2 (a fraction or a percentage) has a check of its own (PN307).
    const without = FIELDS.filter((f) => f.kind !== 'word' && (f.units?.length ?? 0) > 1 && !f.soft && f.id !== 'fio2').map((f) => f.id);
    expect(without).toEqual([]);
  });

  it('has unique ids', () => {
    expect(new Set(FIELDS.map((f) => f.id)).size).toBe(FIELDS.length);
  });

  it('maps every key of a section to exactly one field', () => {
    for (const s of SECTIONS) {
      const seen = new Map<string, string>();
      for (const f of FIELDS.filter((x) => x.sections.includes(s.id))) {
        for (const a of f.aliases) {
          expect(seen.get(a), `${s.id}:${a} is claimed by ${seen.get(a)} and ${f.id}`).toBeUndefined();
          seen.set(a, f.id);
        }
      }
    }
  });

  it('finds fields by section and key, case-insensitively', () => {
    expect(fieldFor('abg', 'PaCO2')?.id).toBe('paco2');
    expect(fieldFor('vbg', 'pco2')?.id).toBe('pvco2');
    expect(fieldFor('vent', 'pplat')?.id).toBe('plateau');
    expect(fieldFor('vitals', 'pplat')).toBeUndefined();
    expect(keysInSection('abg')).toContain('po2');
  });

  it('uses the LOINC codes listed in the project reference for gases and vitals', () => {
    // LOINC codes as listed in shared reference notes (LOINC table, Regenstrief Institute).
    const expected: Record<string, string> = { ph: '2744-1', paco2: '2019-8', pao2: '2703-7', hco3: '1960-4', base_excess: '1925-7', sao2: '2708-6', spo2: '59408-5', fio2: '3150-0', o2_flow: '3151-8', rr: '9279-1', hr: '8867-4', peep: '20077-4', vt: '20112-9', temp: '8310-5' };
    for (const [id, code] of Object.entries(expected)) expect(FIELDS.find((f) => f.id === id)?.loinc?.code, id).toBe(code);
    expect(FIELDS.find((f) => f.id === 'barometric')?.loinc, 'no code is known for barometric pressure: none is invented').toBeUndefined();
  });

  it('keys with a code of their own are keys of the field, and sections with one are sections of the field', () => {
    for (const f of FIELDS) {
      for (const key of Object.keys(f.loincByKey ?? {})) expect(f.aliases, `${f.id}: ${key}`).toContain(key);
      for (const section of Object.keys(f.loincBySection ?? {})) expect(f.sections, `${f.id}: ${section}`).toContain(section);
    }
  });

  it('one code has one name wherever it is used', () => {
    const names = new Map<string, string>();
    for (const f of FIELDS) for (const c of loincCodesOf(f)) {
      expect(names.get(c.code) ?? c.display, c.code).toBe(c.display);
      names.set(c.code, c.display);
    }
  });
});

/**
 * Each LOINC code checked on a page that shows the code with its LOINC name. The page stands
 * beside each check (title, address, version or year shown); the registry's `source` must name the
 * same address. Looked up while writing; the tool itself fetches nothing.
 */
describe('LOINC codes checked on a page', () => {
  const at = (id: string, section: SectionId, key: string | null = null): LoincCode | undefined => loincFor(fieldById(id)!, section, key);
  const expectCode = (loinc: LoincCode | undefined, code: string, display: string, address: string) => {
    expect(loinc?.code).toBe(code);
    expect(loinc?.display).toBe(display);
    expect(loinc?.fromMemory).toBeUndefined();
    expect(loinc?.source, code).toContain(address);
  };

  it('patient and vital signs', () => {
    // HL7 Terminology (THO) 7.0.1, ValueSet LOINCObservationActContextAgeDefinitionCode (value set of 2010-03-16): 30525-0 Age
    expectCode(at('age', 'patient'), '30525-0', 'Age', 'https://build.fhir.org/ig/HL7/UTG/ValueSet-v3-LOINCObservationActContextAgeDefinitionCode.json.html');
    // FHIR 6.0.0-ballot2 (2024), ValueSet observation-vitalsign-bppanel: 85354-9 is the panel "with all children optional"
    // (35094-2 is "Blood pressure panel"; the registry's name was wrong)
    expectCode(at('bp', 'vitals'), '85354-9', 'Blood pressure panel with all children optional', 'https://hl7.org/fhir/6.0.0-ballot2/valueset-observation-vitalsign-bppanel.html');
    // FHIR R4 ballot 2 (2018Sep), Observation example mbp: LOINC 8478-0 "Mean blood pressure", in mm[Hg]
    expectCode(at('mean_bp', 'vitals'), '8478-0', 'Mean blood pressure', 'https://hl7.org/fhir/2018Sep/observation-example-mbp.json');
    // FHIR R5 5.0.0, Observation example satO2: 2708-6 and 59408-5 with their names
    expectCode(at('spo2', 'vitals'), '59408-5', 'Oxygen saturation in Arterial blood by Pulse oximetry', 'https://hl7.org/FHIR/observation-example-satO2.html');
    expectCode(at('sao2', 'abg'), '2708-6', 'Oxygen saturation in Arterial blood', 'https://hl7.org/FHIR/observation-example-satO2.html');
  });

  it('ventilator settings', () => {
    // HL7 SANER IG 1.0.0 (2021), ValueSet Ventilator Observations: 19994-3, 20077-4, 20079-0 with their names
    // (LOINC now names 19994-3 "Oxygen/Total gas", the registry had the older "Oxygen/Inspired gas";
    // 20077-4 is the PEEP setting, the registry had another name)
    const saner = 'https://hl7.org/fhir/uv/saner/ValueSet-VentilatorObservations.json.html';
    expectCode(at('fio2', 'vent'), '19994-3', 'Oxygen/Total gas setting [Volume Fraction] Ventilator', saner);
    expectCode(at('peep', 'vent'), '20077-4', 'Positive end expiratory pressure setting Ventilator', saner);
    expectCode(at('pressure_support', 'vent'), '20079-0', 'Pressure support setting Ventilator', saner);
  });

  it('ventilator readings and settings, end-tidal CO2: the MII ICU module', () => {
    // MII ICU module (kerndatensatzmodul-intensivmedizin) 2027.0.0-ballot.3, ValueSet-mii-vs-icu-code-observation-beatmung-loinc.json
    // (the ventilation codes with their LOINC names). Measured `--on ventilator` for our readings; a `setting` for our set flow.
    // The module's examples use them alike: Observation-mii-exa-icu-vent-mittlerer-beatmungsdruck-gemessen.json (76530-5, measured),
    // Observation-mii-exa-icu-vent-maximaler-beatmungsdruck-gemessen.xml (76531-3, measured),
    // Observation-mii-exa-icu-vent-eingestellter-inspiratorischer-gasfluss.json (76275-7, set, L/min).
    const miiVent = 'https://github.com/medizininformatik-initiative/kerndatensatzmodul-intensivmedizin/blob/ff65203e72c0cf029196b3322a326ef4069c83c8/2027.0.0-ballot.3/ValueSet-mii-vs-icu-code-observation-beatmung-loinc.json';
    expectCode(at('mean_airway_pressure', 'vent'), '76530-5', 'Mean pressure Respiratory system airway --on ventilator', miiVent);
    expectCode(at('peak', 'vent'), '76531-3', 'Pressure.max Respiratory system airway --on ventilator', miiVent);
    expectCode(at('insp_flow', 'vent'), '76275-7', 'Inspiratory flow setting Ventilator', miiVent);
    // Partial pressure (mmHg) in exhaled gas, one code on a vitals line and on a vent line.
    for (const s of ['vitals', 'vent'] as const) expectCode(at('etco2', s), '19891-1', 'Carbon dioxide [Partial pressure] in Exhaled gas --at end expiration', miiVent);
    // MII ICU module 2027.0.0-ballot.3, StructureDefinition-mii-pr-icu-vent-plateau-beatmungsdruck.json: the profile's LOINC
    // coding is 76259-1 "Pressure.plateau Respiratory system airway --on ventilator" (SNOMED "Airway plateau pressure")
    expectCode(at('plateau', 'vent'), '76259-1', 'Pressure.plateau Respiratory system airway --on ventilator', 'https://github.com/medizininformatik-initiative/kerndatensatzmodul-intensivmedizin/blob/58ca65e998b3598e98b3a9795d026af3283109ff/2027.0.0-ballot.3/StructureDefinition-mii-pr-icu-vent-plateau-beatmungsdruck.json');
    // Left out, no page found showing a code that fits: the set rate (the MII module has only measured rates, 33438-3
    // "Breath rate mechanical --on ventilator"; HL7 SANER has only 19835-8, the SIMV rate), the minute volume (the MII module
    // has 76009-0 "Inspired minute Volume during Mechanical ventilation", ours is exhaled), IPAP, EPAP and CPAP.
    for (const id of ['vent_rate', 'minute_volume', 'ipap', 'epap', 'cpap_level']) expect(fieldById(id)?.loinc, id).toBeUndefined();
  });

  it('cardiac output', () => {
    // MII ICU module, profile MII_PR_ICU_MUV_Herzzeitvolumen (input/fsh/profiles/Monitoring und Vitaldaten, cardiac output
    // in L/min, SNOMED 82799009 "Cardiac output"): LOINC 8741-1 "Left ventricular Cardiac output"
    expectCode(at('cardiac_output', 'vitals'), '8741-1', 'Left ventricular Cardiac output', 'https://github.com/medizininformatik-initiative/kerndatensatzmodul-intensivmedizin/blob/c00e913579eda959f02282bd8219ca144eff153e/input/fsh/profiles/Monitoring%20und%20Vitaldaten/MII_PR_ICU_MUV_Herzzeitvolumen.fsh');
  });

  it('blood gases', () => {
    // HL7 MCC eCare Plan IG 1.0.0, Observation ph-lab-observation: 2744-1 pH of Arterial blood
    expectCode(at('ph', 'abg'), '2744-1', 'pH of Arterial blood', 'https://www.hl7.org/fhir/us/mcc/Observation-ph-lab-observation.xml.html');
    // HL7 MCC eCare Plan IG 1.0.0, Observation pO2-arterial-observation: 2703-7
    expectCode(at('pao2', 'abg'), '2703-7', 'Oxygen [Partial pressure] in Arterial blood', 'https://build.fhir.org/ig/HL7/fhir-us-mcc/Observation-pO2-arterial-observation.json.html');
    // LOINC term page 2711-0, LOINC 2.78: long common name "Oxygen saturation in Venous blood", system BldV
    expectCode(at('svo2', 'vbg'), '2711-0', 'Oxygen saturation in Venous blood', 'https://cdn.loinc.org/2711-0');
    // DICOM PS3.16 CID 3528 Blood pH (as a FHIR ValueSet in bvdh/dicom-terminology-in-fhir): LOINC 2746-6 "Venous Blood pH"
    expectCode(at('ph_venous', 'vbg'), '2746-6', 'pH of Venous blood', 'ValueSet-dicom-cid-3528-BloodpH.fsh');
    // DICOM PS3.16 CID 3524 Blood Gas Pressure: LOINC 2021-4 "Venous Blood Carbon dioxide partial pressure",
    // 2705-2 "Venous Oxygen partial pressure" (and the arterial 2019-8 and 2703-7 beside them, as Pneumark has them)
    expectCode(at('pvco2', 'vbg'), '2021-4', 'Carbon dioxide [Partial pressure] in Venous blood', 'ValueSet-dicom-cid-3524-BloodGasPressure.fsh');
    expectCode(at('pvo2', 'vbg'), '2705-2', 'Oxygen [Partial pressure] in Venous blood', 'ValueSet-dicom-cid-3524-BloodGasPressure.fsh');
    // A venous base excess: both terms read (December 2026, session 26). 11555-0 "Base excess in Blood by calculation"
    // (FHIR R4 ballot 3 (2018), Observation example f002-excess) has the system Bld, blood of any kind; 1927-3 "Base
    // excess in Venous blood by calculation" has the system BldV with the same component (Base excess), property (SCnc),
    // scale (Qn) and method (Calc) as the arterial 1925-7 (system BldA): read in the LOINC 2.82 term data of 1927-3 and
    // 1925-7 as reproduced at healthassure.in, and beside 11555-0 and 1925-7 in DICOM CID 3527 Blood Base Excess
    // ("Venous Blood Base Excess"). A vbg line states venous blood, as its pH, PvCO2, PvO2 and HCO3 codes (2746-6, 2021-4,
    // 2705-2, 14627-4) say: its base excess takes the venous code, no longer the unspecified blood one.
    expectCode(at('base_excess', 'vbg'), '1927-3', 'Base excess in Venous blood by calculation', 'https://www.healthassure.in/codes/loinc-1927-3-base-excess-calc-bldv-molesvol');
    expect(at('base_excess', 'vbg')?.source).toContain('ValueSet-dicom-cid-3527-BloodBaseExcess.fsh');
    expect(at('base_excess', 'abg')?.code).toBe('1925-7');
  });

  it('electrolytes: serum or plasma on a labs line, whole blood on a blood gas line', () => {
    // LOINC group LG11363-5, LOINC 2.73: 2947-0 Sodium [Moles/volume] in Blood, 2951-2 ... in Serum or Plasma
    const sodium = 'https://loinc.org/LG11363-5/';
    expectCode(at('na', 'labs'), '2951-2', 'Sodium [Moles/volume] in Serum or Plasma', sodium);
    for (const s of ['abg', 'vbg'] as const) expectCode(at('na', s), '2947-0', 'Sodium [Moles/volume] in Blood', sodium);
    // CH LAB-Order (R4) 2.0.0 (2024), ValueSet top-2000-lab-observations-si: 2823-3 Potassium [Moles/volume] in Serum or Plasma
    expectCode(at('k', 'labs'), '2823-3', 'Potassium [Moles/volume] in Serum or Plasma', 'https://build.fhir.org/ig/hl7ch/ch-lab-order/ValueSet-top-2000-lab-observations-si.html');
    // HL7 PDDI CDS IG 1.0.0, ValueSet valueset-potassium-LOINC: 6298-4 Potassium [Moles/volume] in Blood (the list runs past
    // the stored copy of the page; read in full in the guide's source, HL7/PDDI-CDS input/resources/valueset-potassium-LOINC.xml)
    for (const s of ['abg', 'vbg'] as const) expectCode(at('k', s), '6298-4', 'Potassium [Moles/volume] in Blood', 'https://hl7.org/fhir/uv/pddi/en/ValueSet-valueset-potassium-LOINC.html');
    // CH LAB-Order (R4) 3.0.0 ci-build, ActivityDefinition procedure-chloride-serum: 2075-0 Chloride [Moles/volume] in Serum or Plasma
    expectCode(at('cl', 'labs'), '2075-0', 'Chloride [Moles/volume] in Serum or Plasma', 'https://build.fhir.org/ig/hl7ch/ch-lab-order/ActivityDefinition-procedure-chloride-serum.html');
    // CH LAB-Order (R4) 2.0.0, ObservationDefinition observation-serum-chloride: 2069-3 Chloride [Moles/volume] in Blood
    for (const s of ['abg', 'vbg'] as const) expectCode(at('cl', s), '2069-3', 'Chloride [Moles/volume] in Blood', 'https://build.fhir.org/ig/hl7ch/ch-lab-order/ObservationDefinition-observation-serum-chloride.html');
  });

  it('bicarbonate and total CO2 from the laboratory', () => {
    // LOINC term page 1963-8, LOINC 2.80: "Bicarbonate [Moles/volume] in Serum or Plasma" (changed from Ser to Ser/Plas in 2.73)
    expectCode(at('hco3_serum', 'labs'), '1963-8', 'Bicarbonate [Moles/volume] in Serum or Plasma', 'https://cdn.loinc.org/1963-8');
    // HL7 US Core 3.1.0, Observation serum-co2: LOINC 2028-9 = "Carbon dioxide, total [Moles/volume] in Serum or Plasma"
    expectCode(at('hco3_serum', 'labs', 'tco2'), '2028-9', 'Carbon dioxide, total [Moles/volume] in Serum or Plasma', 'https://hl7.org/fhir/us/core/STU3.1/Observation-serum-co2.html');
  });

  it('glucose in mmol/L: Moles/volume codes (2345-7 is Mass/volume and was dropped)', () => {
    // LOINC group LG7967-5 (https://loinc.org/LG7967-5/, LOINC 2.67) lists 2345-7 as Glucose [Mass/volume] in Serum or Plasma
    expect(loincCodesOf(fieldById('glucose')!).map((c) => c.code)).not.toContain('2345-7');
    // HL7 LIVD IG 1.0.0-ballot (2024), ValueSet testcode-mappings-livd (LOINC 2.65): 14749-6 Glucose [Moles/volume] in Serum or Plasma
    expectCode(at('glucose', 'labs'), '14749-6', 'Glucose [Moles/volume] in Serum or Plasma', 'https://hl7.org/fhir/uv/livd/2024Jan/ValueSet-testcode-mappings-livd.html');
    // FHIR R4 ballot 3 (2018), Observation example f001-glucose: LOINC 15074-8 = "Glucose [Moles/volume] in Blood"
    for (const s of ['abg', 'vbg'] as const) expectCode(at('glucose', s), '15074-8', 'Glucose [Moles/volume] in Blood', 'https://hl7.org/fhir/2018Dec/observation-example-f001-glucose.html');
  });

  it('haemoglobin', () => {
    // CH LAB-Order (R4) 2.0.0 (2024), ValueSet top-2000-lab-observations-si: 718-7 Hemoglobin [Mass/volume] in Blood
    expectCode(at('hb', 'labs'), '718-7', 'Hemoglobin [Mass/volume] in Blood', 'https://build.fhir.org/ig/hl7ch/ch-lab-order/ValueSet-top-2000-lab-observations-si.html');
  });

  it('venous bicarbonate and lactate, read in a copy of LOINC table rows', () => {
    // Elexis's LOINC table (at_medevit_elexis_loinc: code, long common name, short name, class), loaded in
    // ngiger/elexis-jubula jubula-tests/rsc/db/mysql/simple.sql at 5b7079c9: 14627-4 "Bicarbonate [Moles/volume] in
    // Venous blood" (HCO3 BldV-sCnc, CHEM) and 32693-4 "Lactate [Moles/volume] in Blood" (Lactate Bld-sCnc, CHEM),
    // beside 2947-0 "Sodium [Moles/volume] in Blood" as the registry has it. Both were recalled before (December 2026).
    const elexis = 'https://github.com/ngiger/elexis-jubula/blob/5b7079c92711afba1a7f7837bd49af3ff99fb548/jubula-tests/rsc/db/mysql/simple.sql';
    expectCode(at('hco3_venous', 'vbg'), '14627-4', 'Bicarbonate [Moles/volume] in Venous blood', elexis);
    for (const s of ['abg', 'vbg', 'labs'] as const) expectCode(at('lactate', s), '32693-4', 'Lactate [Moles/volume] in Blood', elexis);
  });

  it('respiratory rate', () => {
    // FHIR R4 ballot 1 (2018Jan), Observation example respiratory-rate: LOINC code '9279-1' = 'Respiratory rate'
    expectCode(at('rr', 'vitals'), '9279-1', 'Respiratory rate', 'https://hl7.org/fhir/2018Jan/observation-example-respiratory-rate.xml.html');
  });

  it('codes from the project reference notes, read on a page (December 2026, session 26), each with the unit the page gives', () => {
    // The UCUM unit Pneumark exports a field in, to hold against the unit of the value on the page.
    const ucum = (id: string) => unitById(fieldById(id)!.unit!)!.ucum;
    // GECCO, the German Corona Consensus data set (hl7germany/forschungsnetz-covid19 at 0ae58236, 046e5961): its example
    // Observations code body height 8302-2 "Body height" in cm, body weight 29463-7 "Body weight" in kg, heart rate 8867-4
    // "Heart rate" in /min, body temperature 8310-5 "Body temperature" in Cel, PaCO2 2019-8 "Carbon dioxide [Partial
    // pressure] in Arterial blood" in mm[Hg], and the inhaled oxygen concentration 3150-0 "Inhaled oxygen concentration"
    // in % (a volume fraction, VFr in LOINC: Pneumark writes the same fraction with the UCUM unit 1).
    const gecco = (file: string, commit = '0ae58236e41cf4fd148d7a30a68bc313bd62d959') => `https://github.com/hl7germany/forschungsnetz-covid19/blob/${commit}/input/fsh/instances/${file}`;
    expectCode(at('height', 'patient'), '8302-2', 'Body height', gecco('Example_BodyHeight.fsh'));
    expect(ucum('height')).toBe('cm');
    expectCode(at('weight', 'patient'), '29463-7', 'Body weight', gecco('Example_BodyWeight.fsh'));
    expect(ucum('weight')).toBe('kg');
    expectCode(at('hr', 'vitals'), '8867-4', 'Heart rate', gecco('Example_HeartRate.fsh'));
    expect(ucum('hr')).toBe('/min');
    expectCode(at('temp', 'vitals'), '8310-5', 'Body temperature', gecco('Example_BodyTemperature.fsh', '046e59610e08ccff469a632d0a55d3755c57b01b'));
    expect(ucum('temp')).toBe('Cel');
    expectCode(at('paco2', 'abg'), '2019-8', 'Carbon dioxide [Partial pressure] in Arterial blood', gecco('Example_PaCO2.fsh'));
    expect(ucum('paco2')).toBe('mm[Hg]');
    for (const s of ['oxygen', 'abg'] as const) expectCode(at('fio2', s), '3150-0', 'Inhaled oxygen concentration', gecco('Example_FiO2.fsh'));
    expect(ucum('fio2')).toBe('1');
    // HL7 US Core 7.0.0-ballot (2024Jan), Observation satO2-fiO2: a component "Inhaled oxygen flow rate (LOINC#3151-8)",
    // 6 liters/min (UCUM L/min).
    expectCode(at('o2_flow', 'oxygen'), '3151-8', 'Inhaled oxygen flow rate', 'https://hl7.org/fhir/us/core/2024Jan/Observation-satO2-fiO2.html');
    expect(ucum('o2_flow')).toBe('L/min');
    // MII ICU module 2027.0.0-ballot.3, the ventilation LOINC value set (above): 20112-9 "Tidal volume setting Ventilator";
    // its example Observation mii-exa-icu-vent-atemzugvolumen-einstellung gives 500 mL.
    expectCode(at('vt', 'vent'), '20112-9', 'Tidal volume setting Ventilator', 'ValueSet-mii-vs-icu-code-observation-beatmung-loinc.json');
    expect(ucum('vt')).toBe('mL');
    // LOINC 2.82 term data of 1925-7 as reproduced at healthassure.in: "Base excess in Arterial blood by calculation",
    // component Base excess, property SCnc (mmol/L), system BldA, method Calc; DICOM CID 3527 "Arterial Blood Base Excess".
    expectCode(at('base_excess', 'abg'), '1925-7', 'Base excess in Arterial blood by calculation', 'https://www.healthassure.in/codes/loinc-1925-7-base-excess-calc-blda-molesvol');
    expect(at('base_excess', 'abg')?.source).toContain('ValueSet-dicom-cid-3527-BloodBaseExcess.fsh');
    expect(ucum('base_excess')).toBe('mmol/L');
    // HL7 Vulcan Schedule of Activities IG, ObservationDefinition LOINC-1751-7 (LOINC 2.74): "Albumin [Mass/volume] in Serum
    // or Plasma", permitted unit g/dL, specimen Ser/Plas.
    expectCode(at('albumin', 'labs'), '1751-7', 'Albumin [Mass/volume] in Serum or Plasma', 'https://github.com/HL7/Vulcan-schedule-ig/blob/1814964ae606eed4b0104fbb6034d0671fa46b26/input/fsh/observationdefinitions/LOINC-1751-7-ObservationDefinition.fsh');
    expect(ucum('albumin')).toBe('g/dL');
  });

  it('arterial bicarbonate, read in a table of LOINC names (December 2026, session 28)', () => {
    // Not found on a LOINC page, a FHIR example or a value set in session 26; read since in LHNCBC's flowsheet-lhc
    // (src/stores/c2.js at 43491805), a table whose columns are the LOINC code (LOINC_MERGED), the LOINC long common
    // name (LONG_COMMON_NAME_LOINC) and short name (LOINC_SHORTNAME): its row "HCO3 BldA Qn Calc" gives 1960-4,
    // "Bicarbonate [Moles/volume] in Arterial blood", HCO3 BldA-sCnc, in mmol/L; the rows above it give 2019-8 and 2703-7 as
    // the registry has them, and the blood (not arterial) bicarbonate as 1959-6, a code of its own.
    const flowsheet = 'https://github.com/LHNCBC/flowsheet-lhc/blob/43491805f8a2ca29d8b49d76e7fe0a6850ff4301/src/stores/c2.js';
    expectCode(at('hco3', 'abg'), '1960-4', 'Bicarbonate [Moles/volume] in Arterial blood', flowsheet);
    expect(unitById(fieldById('hco3')!.unit!)!.ucum).toBe('mmol/L');
    expect(loincCodesOf(fieldById('hco3')!).map((c) => c.code)).not.toContain('1959-6');
  });

  it('no code is left marked as recalled', () => {
    // Seen on such pages since they were recalled: 8478-0 (FHIR example mbp), 2746-6, 2021-4 and 2705-2 (DICOM CID 3528
    // and 3524), 14627-4 and 32693-4 (LOINC table rows, above).
    const recalled = FIELDS.flatMap((f) => loincCodesOf(f).filter((c) => c.fromMemory).map((c) => `${f.id} ${c.code}`));
    expect(recalled).toEqual([]);
  });
});

describe('unit registry', () => {
  it('has unique ids and UCUM codes for every unit', () => {
    expect(new Set(UNITS.map((u) => u.id)).size).toBe(UNITS.length);
    for (const u of UNITS) expect(u.ucum.length).toBeGreaterThan(0);
  });

  it('round-trips every unit through its base', () => {
    for (const u of UNITS) expect(u.fromBase(u.toBase(12.5))).toBeCloseTo(12.5, 9);
  });

  it('reads spellings case-insensitively, exact case first', () => {
    expect(unitsForSpelling('mmhg')[0]?.id).toBe('mmHg');
    expect(unitsForSpelling('KPA')[0]?.id).toBe('kPa');
    expect(unitsForSpelling('%').map((u) => u.id).sort()).toEqual(['%', '%sat']);
    expect(unitsForSpelling('furlong')).toEqual([]);
  });

  it('spells a percentage alike for a fraction (FiO2) and a saturation (SpO2): `spo2 94 pct` reads as `fio2 40 pct` does', () => {
    const spellings = (id: string) => [...new Set([id === '%sat' ? '%' : id, ...unitById(id)!.aliases].map((s) => s.toLowerCase()))].sort();
    expect(spellings('%sat')).toEqual(spellings('%'));
  });
});
