// PN302 compares a number written in another unit than its field's own at the precision it was
// written with: its conversion carries a rounding its writer did not make. PaCO2's usual maximum is
// 150 mmHg (field registry: common practice, no source); 1 kPa = 7.50062 mmHg (definition of the
// units), so 20.0 kPa is 150.01 mmHg, and written to a tenth of a kPa it stands for 149.6–150.4 mmHg.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { withinAsWritten } from '../../server/src/core/analysis/bounds';
import { FIELDS } from '../../server/src/core/fields/registry';

const unusual = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN302');
const paco2 = FIELDS.find((f) => f.id === 'paco2')!;

describe('usual bounds at the precision written', () => {
  it('PaCO2 20.0 kPa is usual as written (the usual maximum, 150 mmHg); 20.1 kPa is not', () => {
    expect(unusual('@ 08:00\nabg ph 7.10, pco2 20.0 kPa, po2 9.0 kPa')).toEqual([]);
    expect(unusual('units gas kPa\n@ 08:00\nabg 7.10/20.0/9.0')).toEqual([]);
    const [f] = unusual('@ 08:00\nabg ph 7.10, pco2 20.1 kPa, po2 9.0 kPa');
    expect(f?.message).toBe('PaCO2 20.1 kPa is unusual (usually 2.0 kPa to 20.0 kPa): check the unit and the transcription. As `20.1 mmHg` it would be usual.');
  });

  it('more decimals narrow the margin: 20.00 kPa stands for 19.995–20.005 kPa, which holds 150 mmHg (19.998 kPa); 20.01 kPa does not', () => {
    expect(unusual('@ 08:00\nabg ph 7.10, pco2 20.00 kPa, po2 9.0 kPa')).toEqual([]);
    expect(unusual('@ 08:00\nabg ph 7.10, pco2 20.01 kPa, po2 9.0 kPa')).toHaveLength(1);
  });

  it('a number in the field\'s own unit is compared as it is: 151 mmHg is unusual, 150 is not', () => {
    expect(unusual('@ 08:00\nabg ph 7.10, pco2 150, po2 70')).toEqual([]);
    expect(unusual('@ 08:00\nabg ph 7.10, pco2 151, po2 70')).toHaveLength(1);
  });

  it('withinAsWritten: the bound within half the last written digit, on either side', () => {
    const kpa = (n: number) => n * 7.50062;
    expect(withinAsWritten(kpa(20.0), paco2.soft, paco2, 'kPa', '20.0')).toBe(true);
    expect(withinAsWritten(kpa(20.1), paco2.soft, paco2, 'kPa', '20.1')).toBe(false);
    expect(withinAsWritten(kpa(20), paco2.soft, paco2, 'kPa', '20')).toBe(true);
    expect(withinAsWritten(kpa(20.0), paco2.soft, paco2, 'mmHg', '150.01')).toBe(false);
    // The lower bound, 15 mmHg, is 2.0 kPa (15.0 mmHg): 1.9 kPa (14.25 mmHg) stands for 13.9–14.6 mmHg.
    expect(withinAsWritten(kpa(1.9), paco2.soft, paco2, 'kPa', '1.9')).toBe(false);
    expect(withinAsWritten(kpa(1.98), paco2.soft, paco2, 'kPa', '1,98')).toBe(false);
    // 15 mmHg is 1.99983 kPa: 1.998 kPa stands for at most 14.99 mmHg, 1.9998 kPa for up to 15.0003.
    expect(withinAsWritten(kpa(1.998), paco2.soft, paco2, 'kPa', '1.998')).toBe(false);
    expect(withinAsWritten(kpa(1.9998), paco2.soft, paco2, 'kPa', '1.9998')).toBe(true);
  });
});
