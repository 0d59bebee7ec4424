// A measured respiratory rate is usual from 6 /min (common practice, no source): a lower one is more
// often a slip than a real bradypnoea or apnoea, and PN302 asks for a second look. Invented notes only.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const pn302 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN302');

describe('the usual minimum of a respiratory rate', () => {
  it('reports a rate below 6 /min as unusual, not as impossible', () => {
    const f = pn302('@ 08:00\nvitals rr 2, spo2 94');
    expect(f).toHaveLength(1);
    expect(f[0]!.severity).toBe('warning');
    expect(f[0]!.message).toContain('6');
    expect(checkNote('@ 08:00\nvitals rr 2').findings.filter((x) => x.code === 'PN301')).toEqual([]);
  });

  it('leaves 6 /min and above alone, and an apnoea of 0 is still possible (unusual, not impossible)', () => {
    expect(pn302('@ 08:00\nvitals rr 6')).toEqual([]);
    expect(pn302('@ 08:00\nvitals rr 12')).toEqual([]);
    expect(pn302('@ 08:00\nvitals rr 0')).toHaveLength(1);
    expect(checkNote('@ 08:00\nvitals rr 0').findings.filter((x) => x.code === 'PN301')).toEqual([]);
  });
});
