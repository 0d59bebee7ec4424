// The field and unit registries are data: validated here with zod, and checked for
// ambiguity (one field per key within a section) and sane bounds.
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { FIELDS, fieldFor, keysInSection } from '../../server/src/core/fields/registry';
import { SECTIONS } from '../../server/src/core/fields/sections';
import { UNITS, unitById, unitsForSpelling } from '../../server/src/core/fields/units';

const bounds = z.object({ min: z.number().optional(), max: z.number().optional() }).strict();
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
    loinc: z.object({ code: z.string().regex(/^\d{1,6}-\d$/), display: z.string().min(3), fromMemory: z.boolean().optional() }).strict().optional(),
    loincBySection: z.record(z.string(), z.object({ code: z.string().regex(/^\d{1,6}-\d$/), display: z.string().min(3), fromMemory: z.boolean().optional() }).strict()).optional(),
    words: z.record(z.string(), z.string()).optional(),
    openWords: z.boolean().optional(),
    reading: z.boolean().optional(),
    decimals: z.number().int().min(0).max(3),
  })
  .strict();

describe('field registry', () => {
  it.each(FIELDS.map((f) => [f.id, f] as const))('%s is a valid row', (_id, field) => {
    fieldSchema.parse(field);
    if (field.kind !== 'word') {
      expect(field.unit, 'numeric fields have a canonical unit').toBeDefined();
      expect(field.units, 'the canonical unit is allowed').toContain(field.unit);
      for (const u of field.units ?? []) expect(unitById(u)?.dimension, `${u} shares the field's dimension`).toBe(field.dimension);
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
