// PN404, a plateau pressure above the lung-protective limit: the message quotes the plateau as the
// note wrote it. The limit, a plateau pressure of 30 cmH2O or less: ARDS Network, N Engl J Med
// 2000;342:1301–1308 (the paper not read here; the network's protocol card, plateau pressure goal
// 30 cmH2O or less, read in its reproduction at thorax.us/ventilator_settings_pulmonary_me.htm).
// Invented notes only.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const pn404 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN404');

describe('plateau pressure above 30 cmH2O (PN404)', () => {
  it('quotes a plateau with the decimals it was written with, not rounded up to a number the note does not hold', () => {
    // 30.5 cmH2O is above 30 (ARDS Network 2000): the message says 30.5, not 31.
    const f = pn404('@ 08:00\nvent mode VC, vt 400, rate 16, peep 10, plateau 30.5');
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toBe('Plateau pressure 30.5 cmH2O is above 30 cmH2O.');
    expect(pn404('@ 08:00\nvent peep 8, plateau 33')[0]!.message).toBe('Plateau pressure 33 cmH2O is above 30 cmH2O.');
  });

  it('is silent on the limit itself (30 cmH2O or less, ARDS Network 2000)', () => {
    expect(pn404('@ 08:00\nvent peep 8, plateau 30')).toEqual([]);
    expect(pn404('@ 08:00\nvent peep 8, plateau 30.0')).toEqual([]);
  });
});
