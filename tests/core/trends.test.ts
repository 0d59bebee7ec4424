// Trend points: what a trend view plots per timepoint, and which points used carried inputs.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { NoteSession } from '../../server/src/core/session';
import { timepointSummary, trendPoints } from '../../server/src/core/trends';

const note = [
  'patient sex male, height 175 cm',
  '@ 08:00  start',
  'vent mode VC, vt 420 mL, rate 20, peep 10, fio2 0.5, plateau 27',
  'abg 7.30/50/75/24',
  '@ 09:00',
  'vent plateau 25',
  'abg 7.32/48/80/24',
  '@ 10:00',
  'vitals spo2 95 %',
].join('\n');

describe('trend points', () => {
  it('plot stated values where stated, settings where carried, and derived values with their carried mark', () => {
    const points = trendPoints(checkNote(note));
    expect(points.map((p) => p.label)).toEqual(['start', '09:00', '10:00']);
    expect(points[0]?.values).toMatchObject({ pao2: 75, paco2: 50, ph: 7.3, fio2: 0.5, peep: 10, pf_ratio: 150, driving_pressure: 17 });
    expect(points[0]?.carried).toEqual([]);
    // PEEP and FiO2 carried to 09:00; the driving pressure there uses the carried PEEP.
    expect(points[1]?.values).toMatchObject({ fio2: 0.5, peep: 10, pf_ratio: 160, driving_pressure: 15 });
    expect(points[1]?.carried).toEqual(expect.arrayContaining(['fio2', 'peep', 'driving_pressure', 'pf_ratio']));
    expect(points[2]?.values).toEqual({ spo2: 95, fio2: 0.5, peep: 10 });
    expect(timepointSummary(checkNote(note), 6)?.text).toMatch(/P\/F 160/);
  });

  it('keep the points of timepoints an edit did not touch, and recompute the edited one', () => {
    const session = new NoteSession();
    const first = trendPoints(session.update(note));
    const edited = note.replace('abg 7.32/48/80/24', 'abg 7.32/48/90/24');
    const second = trendPoints(session.update(edited));
    expect(second[0]).toBe(first[0]);
    expect(second[1]).not.toBe(first[1]);
    expect(second[1]?.values.pao2).toBe(90);
    expect(second[1]?.values.pf_ratio).toBe(180);
    expect(second).toEqual(trendPoints(checkNote(edited)));
  });
});
