// The Berlin definition (ARDS Definition Task Force, Ranieri VM et al., "Acute respiratory distress
// syndrome: the Berlin Definition", JAMA 2012;307:2526–2533; its table as reproduced in the Merck
// Manual Professional, "Berlin Definition of ARDS", and in Trials 2017;18:536, Table 1) grades
// oxygenation only "with PEEP or CPAP ≥ 5 cmH2O". Below that, a P/F at or under 300 mmHg was read
// against no band and the reading said nothing: a clinician saw the band of one gas and none at the
// next without a word. The reading now says why no band is given (not a notable reading: no finding).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { readings } from './helpers';

const band = (text: string) => readings(text)['oxygenation-band'];

describe('Berlin bands below a PEEP of 5 cmH2O', () => {
  it('says why a P/F at or under 300 mmHg is not read against the bands', () => {
    // 90 ÷ 0.6 = 150 mmHg with PEEP 3.
    expect(band('@ 08:00\nvent mode VC, vt 450 mL, rate 18, peep 3, fio2 0.6\nabg 7.40/40/90/24')).toBe(
      'P/F 150 mmHg with PEEP 3 cmH2O: not read against the oxygenation bands of the Berlin definition, which grade oxygenation only with PEEP or CPAP of at least 5 cmH2O.',
    );
    // 80 ÷ 0.5 = 160 mmHg with EPAP 4 on NIV; in kPa first in a kPa note: 10.7 ÷ 0.5 = 21.4 kPa (80.3 mmHg ÷ 0.5 = 161 mmHg).
    expect(band('@ 08:00\noxygen niv ipap 12, epap 4, fio2 0.5\nabg 7.40/40/80/24')).toBe(
      'P/F 160 mmHg with EPAP 4 cmH2O: not read against the oxygenation bands of the Berlin definition, which grade oxygenation only with PEEP or CPAP of at least 5 cmH2O.',
    );
    expect(band('units gas kPa\n@ 08:00\nvent mode VC, vt 450 mL, rate 18, peep 0, fio2 0.5\nabg 7.40/5.3/10.7/24')).toMatch(
      /^P\/F 21\.4 kPa \(161 mmHg\) with PEEP 0 cmH2O: not read against the oxygenation bands/,
    );
  });

  it('says nothing above 300 mmHg, with no PEEP known, or at 5 cmH2O and more', () => {
    // 200 ÷ 0.6 = 333 mmHg: no band would be given at any PEEP.
    expect(band('@ 08:00\nvent mode VC, vt 450 mL, rate 18, peep 3, fio2 0.6\nabg 7.40/40/200/24')).toBeUndefined();
    expect(band('@ 08:00\noxygen mask 8 L/min\nabg 7.40/40/60/24')).toBeUndefined();
    expect(band('@ 08:00\nvent mode VC, vt 450 mL, rate 18, peep 5, fio2 0.6\nabg 7.40/40/90/24')).toMatch(/^P\/F 150 mmHg with PEEP 5 cmH2O: consistent with the 100–200 mmHg/);
  });

  it('is no finding: the check reports notable readings only', () => {
    const r = checkNote('@ 08:00\nvent mode VC, vt 450 mL, rate 18, peep 3, fio2 0.6\nabg 7.40/40/90/24');
    expect(r.findings.filter((f) => /Berlin/.test(f.message))).toEqual([]);
  });

  it('leaves a child to the pediatric reading', () => {
    expect(band('patient age 8 y\n@ 08:00\nvent mode PC, pinsp 14, rate 24, peep 3, fio2 0.6\nabg 7.40/40/90/24')).toBeUndefined();
  });
});
