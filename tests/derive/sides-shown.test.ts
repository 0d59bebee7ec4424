// A number shown beside a range end or a threshold keeps its side of it as shown, however many
// decimals that takes: an expected HCO3 range that ends at 26.995 mmol/L is not shown ending at
// 27.00 beside an HCO3 of 27.0 read as outside it.
import { describe, expect, it } from 'vitest';
import { decimalsAgainst, formatAgainst } from '../../server/src/core/util/format';
import { readings } from './helpers';

describe('numbers beside the ends they are read against', () => {
  it('take a third decimal more when two would put them on the end', () => {
    // 26.995 against 27: 27.0 and 27.00 both show it on 27; 26.995 shows it below.
    expect(decimalsAgainst(26.995, 0, 27)).toBe(3);
    expect(formatAgainst(26.995, 0, 27)).toBe('26.995');
    expect(formatAgainst(59.6, 0, 60)).toBe('59.6');
  });

  it('an HCO3 just outside the acute range is not shown on its end', () => {
    // Acute respiratory acidosis: HCO3 rises about 1 mmol/L per 10 mmHg of PaCO2 above 40 (Narins &
    // Emmett, Medicine 1980;59:161–187, from memory), ± 2: PaCO2 6.66 kPa = 49.95 mmHg gives
    // 22.995–26.995 mmol/L, and an HCO3 of 27.0 is just above it.
    const text = 'units gas kPa\n@ day 1 09:00\noxygen room air\nabg ph 7.35, pco2 6.66, po2 8.01, hco3 27\n';
    const acidBase = readings(text)['acid-base'];
    const acute = /\(([\d.]+)–([\d.]+) mmol\/L if acute\)/.exec(acidBase);
    expect(acute, acidBase).not.toBeNull();
    expect(Number(acute![2]), acidBase).toBeLessThan(27);
  });
});
