// Barometric pressure as weather stations and altimeters give it, in hectopascals (= millibars).
// 1 hPa = 100 Pa; 1 mmHg = 133.322387415 Pa (NIST Special Publication 811, 2008, appendix B, from
// memory), so 1013.25 hPa, the standard atmosphere (SI Brochure, 9th edition, from memory), is 760 mmHg.
// `place barometric 1013 hPa` was refused (PN203, "not measured in mbar") and the place was not used.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { derived } from '../derive/helpers';

const note = (pb: string) => `patient age 40 y, sex female\nplace barometric ${pb}\n@ day 1 08:00\noxygen room air\nabg ph 7.40, pco2 40, po2 90, hco3 24`;

describe('barometric pressure in hPa or mbar (NIST SP 811, from memory)', () => {
  it('1013.25 hPa is the standard atmosphere, 760 mmHg', () => {
    // 101,325 ÷ 133.322387415 = 759.9999 mmHg: the conventional mmHg is 0.14 ppm above the torr (atm ÷ 760).
    expect(derived(note('1013.25 hPa'), 'barometric').value).toBeCloseTo(760, 3);
    expect(checkNote(note('1013.25 hPa')).findings.filter((f) => f.severity === 'error' || f.severity === 'warning')).toEqual([]);
  });

  it('800 mbar, about 600 mmHg, gives the inspired PO2 of that pressure', () => {
    // 800 hPa × 100 ÷ 133.322387415 = 600.05 mmHg; PiO2 0.21 × (600.05 − 47) = 116.1 mmHg.
    expect(derived(note('800 mbar'), 'barometric').value).toBeCloseTo(600.05, 2);
    expect(derived(note('800 mbar'), 'pio2').value).toBeCloseTo(116.14, 2);
  });

  it('a bare 1013, a weather reading without its unit, is doubted as hPa rather than used as 1013 mmHg (1.3 atmospheres)', () => {
    const f = checkNote(note('1013')).findings.filter((x) => x.code === 'PN204');
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toBe('Barometric pressure 1013 was read in mmHg, where it is implausible; in hPa it would be ordinary. Add the unit (or convert); it is not used in calculations until then.');
    expect(() => derived(note('1013'), 'barometric')).toThrow(/was not derived/);
  });

  it('an airway pressure in hPa is still read in cmH2O terms (1 hPa = 1.0197 cmH2O)', () => {
    expect(derived('@ 08:00\nvent mode VC, vt 400, peep 10 hPa, plateau 25 hPa', 'driving_pressure').value).toBeCloseTo(15 * 100 / 98.0665, 6);
  });
});
