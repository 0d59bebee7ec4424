// `tv` is common shorthand for the tidal volume in ventilator settings (common practice, no
// source): on a vent line it is read as `vt`, with the same unit, bounds and derived values.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { fieldFor } from '../../server/src/core/fields/registry';

const at = (text: string) => checkNote(text);

describe('`tv` on a vent line', () => {
  it('is the tidal volume', () => {
    expect(fieldFor('vent', 'tv')?.id).toBe('vt');
    expect(fieldFor('vent', 'TV'.toLowerCase())?.id).toBe('vt');
  });

  it('reads as `vt` does: no finding, and the same minute ventilation (VT × rate: 0.45 L × 16 = 7.2 L/min)', () => {
    const written = at('@ 08:00\nvent mode VC, tv 450, rate 16, peep 8, fio2 0.4');
    const canonical = at('@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, fio2 0.4');
    expect(written.findings.map((f) => f.code)).toEqual(canonical.findings.map((f) => f.code));
    expect(written.findings.filter((f) => f.code === 'PN201')).toEqual([]);
    const mv = (r: ReturnType<typeof at>) => r.analysis.derivation(0).derived.find((d) => d.id === 'minute_ventilation');
    expect(mv(written)?.value).toBeCloseTo(7.2, 6);
    expect(mv(written)?.value).toBe(mv(canonical)?.value);
  });

  it('is no key of a vitals line (the tidal volume belongs on a vent line)', () => {
    const found = at('@ 08:00\nvitals tv 450').findings.filter((f) => f.code === 'PN201');
    expect(found.map((f) => f.message)).toEqual(['`tv` is not a key of vitals lines (`tv` belongs on a vent line).']);
  });
});
