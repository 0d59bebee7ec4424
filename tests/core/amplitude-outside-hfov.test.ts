// PN313: an oscillation amplitude is the pressure swing of a high-frequency oscillator, a setting
// of no other mode (common practice, no source); written under another mode, the mode or the key
// is likely mistaken.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const pn313 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN313');

describe('an oscillation amplitude under a mode other than HFOV (PN313)', () => {
  it('fires on the amplitude written under a conventional mode, stated there or carried', () => {
    const [f] = pn313('@ 08:00\nvent mode VC, vt 420 mL, rate 16, amp 40');
    expect(f?.message).toBe('Oscillation amplitude 40 cmH2O is written under VC: it is a setting of high-frequency oscillation (HFOV) only. Check the mode and the key.');
    expect(f?.severity).toBe('warning');
    expect(f?.range.start).toEqual({ line: 1, character: 34 }); // the `amp` item
    // The mode carried from an earlier timepoint; the amplitude as written, in its own unit.
    const carried = pn313('@ 08:00\nvent mode PC, rate 14\n@ 09:00\nvent amplitude 40 mbar');
    expect(carried.map((x) => [x.range.start.line, x.message.slice(0, 44)])).toEqual([[3, 'Oscillation amplitude 40 mbar is written und']]);
  });

  it('stays quiet under HFOV, with no mode known, and after a change of mode (the amplitude is dropped)', () => {
    expect(pn313('@ 08:00\nvent mode HFOV, rate 8 Hz, mpaw 24, amplitude 60')).toEqual([]);
    expect(pn313('@ 08:00\nvent amplitude 60')).toEqual([]);
    expect(pn313('@ 08:00\nvent mode HFOV, rate 8 Hz, amplitude 60\n@ 09:00\nvent mode VC, vt 420 mL, rate 16')).toEqual([]);
    // Reported once, where it is written, not at each later timepoint.
    expect(pn313('@ 08:00\nvent mode VC, amp 40\n@ 09:00\nvent peep 6')).toHaveLength(1);
  });
});
