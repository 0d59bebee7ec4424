// A place line that states both an altitude and a barometric pressure: the stated pressure is the
// one used (derive/atmosphere.ts), so an altitude it cannot belong to is left out without a word.
// The pressure an altitude gives: West JB. Prediction of barometric pressures at high altitudes with
// the use of model atmospheres. J Appl Physiol 1996;81:1850–1854 (its equation read in a reproduction), and the U.S. Standard
// Atmosphere 1976 (from memory); the two differ by a few mmHg at 2,000 m (West 604, standard 596).
// The margin around them (5 %, weather and season at one place: a few percent) is Pneumark's own
// convention, no source.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { barometricFromAltitudeStandard, barometricFromAltitudeWest } from '../../server/src/core/physiology/atmosphere';

const found = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN320');

describe('barometric pressure unlike the altitude on its place line (PN320)', () => {
  it('the models give about 604 and 596 mmHg at 2,000 m (West 1996, its equation read in a reproduction; U.S. Standard Atmosphere 1976, from memory)', () => {
    expect(barometricFromAltitudeWest(2000)).toBeCloseTo(604.3, 0);
    expect(barometricFromAltitudeStandard(2000)).toBeCloseTo(596.3, 0);
  });

  it('is reported on the pressure, with the altitude as related, when the two cannot belong together', () => {
    // 700 mmHg is the pressure of about 550 m, not 2,000 m.
    const text = 'place altitude 2000 m, barometric 700 mmHg\n@ 08:00\nvitals hr 80';
    const f = found(text);
    expect(f).toHaveLength(1);
    expect(f[0]!.severity).toBe('warning');
    expect(f[0]!.range.start).toEqual({ line: 0, character: 23 });
    expect(f[0]!.message).toBe('Barometric pressure 700 mmHg is unlike altitude 2000 m on the same line, where about 596–604 mmHg is expected (by the U.S. Standard Atmosphere and West\'s model; weather moves it by a few percent). The pressure is used and the altitude is not: check both.');
    expect(f[0]!.related?.[0]?.range.start).toEqual({ line: 0, character: 6 });
  });

  it('gives one pressure, not a range with equal ends, where the two models agree at the decimals shown', () => {
    // At sea level both models give 760 mmHg (101.3 kPa), and at 100 m both about 751 mmHg (West 1996;
    // U.S. Standard Atmosphere 1976, both from memory): never "760–760 mmHg".
    const sea = found('place altitude 0 m, barometric 700 mmHg\n@ 08:00\nvitals hr 80');
    expect(sea).toHaveLength(1);
    expect(sea[0]!.message).toContain('where about 760 mmHg is expected');
    expect(found('place altitude 0 m, barometric 93 kPa\n@ 08:00\nvitals hr 80')[0]!.message).toContain('where about 101.3 kPa (760 mmHg) is expected');
    expect(found('place altitude 100 m, barometric 700\n@ 08:00\nvitals hr 80')[0]!.message).toContain('where about 751 mmHg is expected');
    for (const f of [...sea, ...found('place altitude 0 m, barometric 93 kPa')]) expect(f.message).not.toMatch(/(\d+(?:\.\d+)?)–\1 /);
  });

  it('names an altitude in feet and a pressure in kPa as written, with mmHg beside the kPa', () => {
    // 12,000 ft = 3,658 m: about 485–496 mmHg; 80 kPa is 600 mmHg.
    const f = found('@ 08:00\nplace altitude 12000 ft, barometric 80 kPa\nvitals hr 80');
    expect(f).toHaveLength(1);
    expect(f[0]!.range.start.line).toBe(1);
    expect(f[0]!.message).toMatch(/^Barometric pressure 80\.0 kPa \(600 mmHg\) is unlike altitude 12000 ft on the same line, where about 64\.\d–66\.\d kPa \(48\d–496 mmHg\) is expected /);
  });

  it('is silent where the pressure is within 5 % of what the altitude gives (our convention), and where either is missing or not used', () => {
    expect(found('place altitude 2000 m, barometric 600 mmHg\n@ 08:00\nvitals hr 80')).toEqual([]);
    // 5 % below the standard atmosphere's 596.3 is 566.5; 5 % above West's 604.3 is 634.5.
    expect(found('place altitude 2000 m, barometric 567 mmHg\n@ 08:00\nvitals hr 80')).toEqual([]);
    expect(found('place altitude 2000 m, barometric 634 mmHg\n@ 08:00\nvitals hr 80')).toEqual([]);
    expect(found('place altitude 2000 m, barometric 566 mmHg\n@ 08:00\nvitals hr 80')).toHaveLength(1);
    expect(found('place altitude 2000 m, barometric 635 mmHg\n@ 08:00\nvitals hr 80')).toHaveLength(1);
    // Sea level: 760 mmHg with 0 m, and the weather's 740 mmHg.
    expect(found('place altitude 0 m, barometric 740 mmHg\n@ 08:00\nvitals hr 80')).toEqual([]);
    // On separate place lines the later one replaces the place: nothing to compare.
    expect(found('place altitude 2000 m\n@ 08:00\nplace barometric 700 mmHg\nvitals hr 80')).toEqual([]);
    // A pressure whose unit is in doubt (PN204) is not used: it is not compared either.
    expect(found('units gas kPa\nplace altitude 2000 m, barometric 700\n@ 08:00\nvitals hr 80')).toEqual([]);
  });
});
