// Glucose in mg/dL, as many laboratories report it, beside mmol/L. Glucose C6H12O6 has a molar mass
// of 180.16 g/mol (6 × 12.011 + 12 × 1.008 + 6 × 15.999 = 180.156, with the conventional standard
// atomic weights of IUPAC/CIAAW, from memory), so 1 mmol/L = 180.16 mg/L = 18.016 mg/dL; the
// conversion is checked against @lhncbc/ucum-lhc, given that molecular weight. A bare glucose above
// the usual maximum of 40 mmol/L (common practice, no source) that is ordinary in mg/dL (`glucose 126`,
// 7.0 mmol/L) is doubted (PN204) and kept out of the values, not read as 126 mmol/L.
import { UcumLhcUtils } from '@lhncbc/ucum-lhc';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { FIELDS } from '../../server/src/core/fields/registry';
import { convert, unitById } from '../../server/src/core/fields/units';
import { GLUCOSE_MG_PER_DL_PER_MMOL_L } from '../../server/src/core/physiology/units';

const ucum = UcumLhcUtils.getInstance();
const GLUCOSE_G_PER_MOL = 180.16;

function ucumGlucose(value: number, from: string, to: string): number {
  const result = ucum.convertUnitTo(from, value, to, { molecularWeight: GLUCOSE_G_PER_MOL });
  expect(result.status, result.msg.join('; ')).toBe('succeeded');
  return result.toVal ?? Number.NaN;
}

const glucoseOf = (text: string) => checkNote(text).analysis.timeline.timepoints[0]?.values.numberOf('glucose');
const codesOf = (text: string) => checkNote(text).findings.map((f) => f.code);

describe('glucose in mg/dL', () => {
  it('converts by the molar mass of glucose, 18.016 mg/dL per mmol/L, as UCUM does (molecular weight 180.16 g/mol)', () => {
    expect(GLUCOSE_MG_PER_DL_PER_MMOL_L).toBeCloseTo(ucumGlucose(1, 'mmol/L', 'mg/dL'), 9);
    for (const mgdl of [40, 99, 126, 200, 600]) {
      const mmol = convert(mgdl, unitById('mg/dL')!, unitById('mmol/L')!);
      expect(mmol).toBeCloseTo(ucumGlucose(mgdl, 'mg/dL', 'mmol/L'), 9);
    }
  });

  it('is a unit of glucose alone: no other field lists it', () => {
    expect(FIELDS.filter((f) => f.units?.includes('mg/dL')).map((f) => f.id)).toEqual(['glucose']);
  });

  it('reads `glucose 126 mg/dL` as 7.0 mmol/L, with no finding', () => {
    const text = '@ 08:00\nlabs glucose 126 mg/dL';
    expect(glucoseOf(text)).toBeCloseTo(126 / 18.016, 9);
    expect(codesOf(text)).toEqual([]);
  });

  it('doubts a bare glucose that is ordinary only in mg/dL (PN204), and does not use it', () => {
    const text = '@ 08:00\nlabs glucose 126';
    const found = checkNote(text).findings;
    expect(found.map((f) => f.code)).toEqual(['PN204']);
    expect(found[0]!.message).toBe('Glucose 126 was read in mmol/L, where it is implausible; in mg/dL it would be ordinary. Add the unit (or convert); it is not used in calculations until then.');
    expect(found[0]!.fixes.map((f) => f.title)).toEqual(['Mark as mg/dL', 'Convert to 7.0 mmol/L']);
    expect(glucoseOf(text) ?? null).toBeNull();
  });

  it('keeps a bare glucose read in mmol/L where it is usual there (`glucose 7.8`, `glucose 33`)', () => {
    expect(glucoseOf('@ 08:00\nlabs glucose 7.8')).toBe(7.8);
    expect(glucoseOf('@ 08:00\nabg glucose 33')).toBe(33);
    expect(codesOf('@ 08:00\nabg glucose 33')).toEqual([]);
  });
});
