// The peak airway pressure is measured above atmospheric and includes the end-expiratory pressure
// (respiratory mechanics: peak = PEEP + resistive + elastic pressure; common practice, no source).
// On NIV the end-expiratory pressure is the EPAP, on CPAP the CPAP level: a measured peak below it
// is as impossible as one below PEEP (PN314).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';

const pn314 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN314');

describe('PN314 on NIV and CPAP', () => {
  it('reports a measured peak below the EPAP in force, naming the EPAP', () => {
    const [f] = pn314('@ 08:00\noxygen niv ipap 14, epap 8, fio2 0.4\n@ 09:00\nvent peak 6, vt 450');
    expect(f?.message).toBe('EPAP 8 cmH2O is above the peak pressure 6 cmH2O; peak pressure includes the EPAP.');
    expect(f?.range.start.line).toBe(3); // the vent line, where the peak is stated
  });

  it('and one below the CPAP level', () => {
    expect(pn314('@ 08:00\noxygen cpap level 10, fio2 0.4\nvent peak 7')[0]?.message).toBe('CPAP 10 cmH2O is above the peak pressure 7 cmH2O; peak pressure includes the CPAP.');
  });

  it('stays silent for a peak above the EPAP, and on the ventilator names PEEP as before', () => {
    expect(pn314('@ 08:00\noxygen niv ipap 14, epap 8, fio2 0.4\n@ 09:00\nvent peak 15')).toEqual([]);
    expect(pn314('@ 08:00\nvent peep 12, peak 10')[0]?.message).toBe('PEEP 12 cmH2O is above the peak pressure 10 cmH2O; peak pressure includes PEEP.');
  });
});
