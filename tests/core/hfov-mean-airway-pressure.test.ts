// In high-frequency oscillation the mean airway pressure is what the oscillator is set to (with the
// frequency and the amplitude): a setting, held until restated, where on a conventional mode it is
// a reading of the breaths (common practice, no source). The oxygenation index OI = FiO2 × MAP × 100
// ÷ PaO2 (Ortiz RM et al. 1987, from memory) of a later gas then uses the mean airway pressure in force.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { hoverAt } from '../../server/src/core/service';
import { noteAt } from '../service/cursor';

const HFOV = '@ 09:00\nvent mode HFOV, rate 5 Hz, mpaw 25, amplitude 60, fio2 0.6\nabg 7.30/50/70/24\n@ 10:00\nabg 7.32/48/75/24';
const mapAt = (text: string, i: number) => checkNote(text).analysis.timeline.timepoints[i]?.values.get('mean_airway_pressure');

describe('mean airway pressure under HFOV', () => {
  it('carries to a later timepoint, and gives its OI: 0.6 × 25 × 100 ÷ 75 = 20', () => {
    const map = mapAt(HFOV, 1);
    expect(map?.stated.value).toBe(25);
    expect(map?.origin.kind).toBe('carried');
    const oi = checkNote(HFOV).analysis.derivation(1)?.derived.find((v) => v.id === 'oxygenation_index');
    expect(oi?.value).toBeCloseTo((0.6 * 25 * 100) / 75, 9);
    expect(oi?.usesCarried).toBe(true);
  });

  it('is held when written on a later line under the HFOV in force, and replaced when restated', () => {
    const text = `${HFOV}\n@ 11:00\nvent mpaw 27\n@ 12:00\nabg 7.33/47/80/24`;
    expect(mapAt(text, 3)?.stated.value).toBe(27);
  });

  it('says in its hover that it carries', () => {
    const { result, position } = noteAt(HFOV.replace('mpaw 25', 'mpaw 2|5'));
    expect(hoverAt(result, position)?.markdown ?? '').toMatch(/Carries forward: yes, in HFOV/);
  });

  it('on a conventional mode it stays a reading of its timepoint, and a change of mode drops the one set under HFOV', () => {
    const vc = '@ 08:00\nvent mode VC, vt 450, rate 20, peep 8, map 14, fio2 0.5\n@ 09:00\nabg 7.40/40/80/24';
    expect(mapAt(vc, 1)).toBeUndefined();
    expect(mapAt(`${HFOV}\n@ 11:00\nvent mode PC, peep 12, rate 20`, 2)).toBeUndefined();
  });
});
