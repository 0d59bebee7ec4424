// Haemoglobin in mmol/L, as many laboratories report it, beside g/dL and g/L. The substance
// concentration is counted per haem-carrying chain (the monomer), molar mass 16,114.5 g/mol, a
// quarter of the tetramer's 64,458 g/mol (the tetramer's read in the oxygen delivery model of
// Bretherick and Baillie, baillielab/oxygen_delivery: tests/physiology/sources-read.test.ts; the usual SI
// convention for haemoglobin), so 1 mmol/L = 16.1145 g/L = 1.61145 g/dL and 1 g/dL ≈ 0.6206 mmol/L. The factor
// from g/dL to mmol/L, × 0.62063, counting haemoglobin subunits, was read in table 1 of the review
// at pmc.ncbi.nlm.nih.gov/articles/PMC3934467 (iron-status tests). The conversion is checked
// against @lhncbc/ucum-lhc, given that molecular weight. A bare Hb is still read in g/dL.
import { UcumLhcUtils } from '@lhncbc/ucum-lhc';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { FIELDS } from '../../server/src/core/fields/registry';
import { SECTIONS } from '../../server/src/core/fields/sections';
import { convert, unitById, unitsForSpelling } from '../../server/src/core/fields/units';
import { HB_G_PER_DL_PER_MMOL_L, HB_MONOMER_G_PER_MOL } from '../../server/src/core/physiology/units';
import { formatAlternative, formatStated } from '../../server/src/core/present';
import { bundleObservations, timepointRows, toFhirBundle } from '../../server/src/core/export';

const ucum = UcumLhcUtils.getInstance();

function ucumHb(value: number, from: string, to: string): number {
  const result = ucum.convertUnitTo(from, value, to, { molecularWeight: HB_MONOMER_G_PER_MOL });
  expect(result.status, result.msg.join('; ')).toBe('succeeded');
  return result.toVal ?? Number.NaN;
}

const HB_MMOL = unitsForSpelling('mmol/L').find((u) => u.dimension === 'mass-concentration')!;
const hbOf = (text: string) => checkNote(text).analysis.timeline.timepoints[0]?.values.get('hb')?.stated;
const codesOf = (text: string) => checkNote(text).findings.map((f) => f.code);

describe('haemoglobin in mmol/L', () => {
  it('converts by the molar mass of the monomer, 16,114.5 g/mol, as UCUM does given that molecular weight (the 64,458 g/mol of the tetramer read in a reproduction; the factor read in table 1 of PMC3934467)', () => {
    expect(HB_MONOMER_G_PER_MOL).toBe(16114.5);
    expect(HB_G_PER_DL_PER_MMOL_L).toBeCloseTo(ucumHb(1, 'mmol/L', 'g/dL'), 9);
    // 1 g/dL × 0.62063 = mmol/L of haemoglobin subunits (read in table 1 of the review at
    // pmc.ncbi.nlm.nih.gov/articles/PMC3934467): the same to four figures (0.62056 here).
    expect(convert(1, unitById('g/dL')!, HB_MMOL)).toBeCloseTo(0.6206, 4);
    expect(Math.abs(convert(1, unitById('g/dL')!, HB_MMOL)! - 0.62063)).toBeLessThan(0.0001);
    // Hb 12–16 g/dL is 7.45–9.93 mmol/L here, which that table rounds to 7.5–10 mmol/L.
    expect(convert(12, unitById('g/dL')!, HB_MMOL)).toBeCloseTo(7.45, 2);
    expect(convert(16, unitById('g/dL')!, HB_MMOL)).toBeCloseTo(9.93, 2);
    for (const mmol of [2.5, 5, 8, 8.7, 11]) {
      expect(convert(mmol, HB_MMOL, unitById('g/dL')!)).toBeCloseTo(ucumHb(mmol, 'mmol/L', 'g/dL'), 9);
    }
    expect(HB_MMOL.ucum).toBe('mmol/L');
  });

  it('is a measurement stated only on measurement lines, so the check finds the timepoints that state one by the value in force (PN319 looks at no other)', () => {
    const hb = FIELDS.find((f) => f.id === 'hb')!;
    expect(hb.sections.map((id) => SECTIONS.find((s) => s.id === id)?.kind)).toEqual(hb.sections.map(() => 'measure'));
    // Stated twice at one timepoint, the first is the one in mmol/L: still found.
    expect(codesOf('@ 08:00\nlabs hb 8.4 mmol/L, hb 8.4 mmol/L\n@ 09:00\nvitals hr 80\n@ 12:00\nlabs hb 8.1')).toContain('PN319');
  });

  it('is a unit of haemoglobin alone: no other field lists it', () => {
    expect(FIELDS.filter((f) => f.units?.includes(HB_MMOL.id)).map((f) => f.id)).toEqual(['hb']);
  });

  it('reads `hb 8.0 mmol/L` as 12.9 g/dL, with no finding, and shows both units', () => {
    for (const text of ['@ 08:00\nlabs hb 8.0 mmol/L', '@ 08:00\nabg ph 7.40, hb 8.0 mmol/l']) {
      const hb = hbOf(text)!;
      expect(hb.value).toBeCloseTo(8 * 1.61145, 9);
      expect(hb.unit).toBe('g/dL');
      expect(codesOf(text)).toEqual([]);
      expect(formatStated(hb)).toBe('12.9 g/dL');
      expect(formatAlternative(hb)).toBe('8.0 mmol/L');
    }
  });

  it('does not take an Hb in mmol/L as low: 8 mmol/L is ordinary, 8 g/dL is not read from it', () => {
    expect(hbOf('@ 08:00\nlabs hb 8 mmol/L')!.value).toBeGreaterThan(12);
    // A bare Hb is still read in g/dL.
    expect(hbOf('@ 08:00\nlabs hb 8')!.value).toBe(8);
    expect(hbOf('@ 08:00\nlabs hb 8')!.readUnit).toBe('g/dL');
    expect(codesOf('@ 08:00\nlabs hb 8')).toEqual([]);
  });

  it('bounds the converted value: 80 mmol/L (129 g/dL) is impossible, not read', () => {
    const text = '@ 08:00\nlabs hb 80 mmol/L';
    expect(codesOf(text)).toContain('PN301');
    expect(hbOf(text)!.usable).toBe(false);
  });

  it('keeps a bare Hb of 2.5 in g/dL (unusual, reported), as before mmol/L was accepted', () => {
    const hb = hbOf('@ 08:00\nlabs hb 2.5')!;
    expect(hb.readUnit).toBe('g/dL');
    expect(hb.unitDoubt).toBeNull();
    expect(hb.usable).toBe(true);
  });

  it('exports the Hb in g/dL (column hb_g_dL; FHIR 718-7 with UCUM g/dL), converted from mmol/L', () => {
    const result = checkNote('@ 08:00\nlabs hb 8.0 mmol/L');
    const row = timepointRows('n.pneu', result, { redactProse: false, shiftDays: 0 })[0]!;
    expect(row['hb_g_dL']).toBeCloseTo(12.8916, 4);
    const bundle = toFhirBundle('n.pneu', result, { redactProse: false, shiftDays: 0 });
    const obs = bundleObservations(bundle).find((o) => o.code.text === 'Haemoglobin')!;
    expect(obs.code.coding?.[0]?.code).toBe('718-7');
    expect(obs.valueQuantity).toMatchObject({ unit: 'g/dL', system: 'http://unitsofmeasure.org', code: 'g/dL' });
    expect(obs.valueQuantity!.value).toBeCloseTo(12.8916, 4);
  });
});

describe('a bare Hb in a note that writes Hb in mmol/L (PN319)', () => {
  // A note whose laboratory reports Hb in mmol/L: a later `hb 8.1` without its unit is read in g/dL,
  // the default, though it is more likely 8.1 mmol/L (13.1 g/dL). Said, never silently misread.
  const text = '@ 08:00\nlabs hb 8.4 mmol/L\n@ 12:00\nlabs hb 8.1';

  it('is reported where it is written, naming the line that writes mmol/L, with both readings offered', () => {
    const found = checkNote(text).findings.filter((f) => f.code === 'PN319');
    expect(found).toHaveLength(1);
    expect(found[0]!.range.start.line).toBe(3);
    expect(found[0]!.message).toBe('Hb 8.1 has no unit and is read as 8.1 g/dL, but this note writes Hb in mmol/L (line 2), where it would be 13.1 g/dL. Write the unit.');
    expect(found[0]!.fixes.map((f) => f.title)).toEqual(['Mark as mmol/L', 'Mark as g/dL']);
    expect(found[0]!.fixes[0]!.edits[0]!.newText).toBe(' mmol/L');
  });

  it('is silent where every Hb has its unit, where no Hb is in mmol/L, and for a bare Hb that is implausible in mmol/L', () => {
    const codes = (t: string) => checkNote(t).findings.map((f) => f.code);
    expect(codes('@ 08:00\nlabs hb 8.4 mmol/L\n@ 12:00\nlabs hb 13.0 g/dL')).toEqual([]);
    expect(codes('@ 08:00\nlabs hb 13.5\n@ 12:00\nlabs hb 13.0')).toEqual([]);
    // 14.5 mmol/L would be 23.4 g/dL, above the usual maximum: read in g/dL, nothing to doubt.
    expect(codes('@ 08:00\nlabs hb 8.4 mmol/L\n@ 12:00\nlabs hb 14.5')).toEqual([]);
  });
});
