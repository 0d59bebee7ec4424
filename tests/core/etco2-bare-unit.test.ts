// End-tidal CO2 written without a unit. Normal end-tidal CO2 is about 35–45 mmHg, 4.7–6.0 kPa
// (common practice, no source); 1 kPa = 7.50062 mmHg (NIST SP 811, from memory). Below 10 mmHg a
// capnograph reads so low only in a cardiac arrest, a disconnection or a misplaced tube: worth a
// second look (common practice, no source). So a bare `etco2 4.5` in a note whose gas unit is
// mmHg is an ordinary value in kPa (34 mmHg), doubted (PN204) as a bare PaCO2 of 5.3 is, not read
// as 4.5 mmHg; and `etco2 0`, a real reading, is reported as unusual (PN302), not doubted.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const found = (text: string) => checkNote(text).findings.map((f) => [f.code, f.message]);
const etco2Of = (text: string) => checkNote(text).analysis.timeline.timepoints[0]?.values.numberOf('etco2') ?? null;

describe('a bare end-tidal CO2', () => {
  it('in an mmHg note, doubts a value that is ordinary only in kPa (vitals and vent lines) and keeps it out of the values', () => {
    expect(found('@ 08:00\nvitals etco2 4.5')).toEqual([
      ['PN204', 'End-tidal CO2 4.5 was read in mmHg, where it is implausible; in kPa it would be ordinary. Add the unit (or convert); it is not used in calculations until then.'],
    ]);
    expect(etco2Of('@ 08:00\nvitals etco2 4.5')).toBeNull();
    expect(found('@ 08:00\nvent mode VC, vt 450, rate 14, peep 5, fio2 0.4, etco2 5.1').map(([code]) => code)).toEqual(['PN204']);
  });

  it('reads ordinary values as written: 38 in an mmHg note, 5.1 in a kPa note, 4.5 kPa with its unit', () => {
    expect(found('@ 08:00\nvitals etco2 38')).toEqual([]);
    expect(etco2Of('@ 08:00\nvitals etco2 38')).toBe(38);
    expect(found('units gas kPa\n@ 08:00\nvitals etco2 5.1')).toEqual([]);
    expect(found('@ 08:00\nvitals etco2 4.5 kPa')).toEqual([]);
  });

  it('reports a reading near zero as unusual (PN302), still used, and never as a kPa value', () => {
    expect(found('@ 08:00\nvitals etco2 0')).toEqual([
      ['PN302', 'End-tidal CO2 0 mmHg is unusual (usually 10 mmHg to 100 mmHg): check the unit and the transcription.'],
    ]);
    expect(etco2Of('@ 08:00\nvitals etco2 0')).toBe(0);
  });
});
