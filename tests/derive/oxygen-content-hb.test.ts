// Which haemoglobin goes into the arterial oxygen content (CaO2 = Hüfner × Hb × SaO2 + 0.003 ×
// PaO2; standard physiology, e.g. West JB, Respiratory Physiology: The Essentials, from memory)
// when a timepoint states two: the Hb of the arterial gas line, measured by co-oximetry with the
// SaO2 and PaO2 it is combined with, wins over a laboratory Hb of the same timepoint, wherever the
// lines stand (our convention: the Hb that belongs to the gas). Whichever is used, the formula's
// inputs, the hover and `show` say which and where it came from.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { derivedHover } from '../../server/src/core/service/derived-hover';
import { paint } from '../../server/src/cli/colour';
import { renderShow } from '../../server/src/cli/render-show';
import { derived } from './helpers';

const GAS = 'abg ph 7.40, pco2 40, po2 90, sao2 97, hb 12.0';

describe('the haemoglobin of the oxygen content', () => {
  it('takes the Hb of the arterial gas line over a labs Hb of the same timepoint, after it or before it', () => {
    for (const text of [`@ 08:00\n${GAS}\nlabs hb 9.0`, `@ 08:00\nlabs hb 9.0\n${GAS}`]) {
      const d = derived(text, 'cao2');
      // 1.34 × 12.0 × 0.97 + 0.003 × 90 = 15.87 (Hüfner 1.34 mL/g by default).
      expect(d.value, text).toBeCloseTo(1.34 * 12 * 0.97 + 0.003 * 90, 9);
      const hb = d.inputs.find((t) => t.name === 'Hb')!;
      expect(hb.value).toBe(12);
      expect(hb.note).toBe('abg line, measured with the gas');
      expect(hb.origin).toMatchObject({ kind: 'here', line: text.split('\n').indexOf(GAS) });
      expect(d.notes).toContain(`labs Hb 9.0 g/dL (line ${text.split('\n').indexOf('labs hb 9.0') + 1}) not used: the gas line's own Hb is used`);
    }
  });

  it('uses the labs Hb when the gas line has none, and says so', () => {
    const text = '@ 08:00\nlabs hb 9.0\nabg ph 7.40, pco2 40, po2 90, sao2 97';
    const d = derived(text, 'cao2');
    expect(d.value).toBeCloseTo(1.34 * 9 * 0.97 + 0.003 * 90, 9);
    expect(d.inputs.find((t) => t.name === 'Hb')!.note).toBe('labs line');
    expect(d.notes).toEqual([]);
  });

  it('uses a usable labs Hb where the gas line\'s Hb is impossible (not used), rather than computing nothing', () => {
    // hb 0.1 g/dL is below the possible minimum (PN301), so it feeds no calculation.
    const text = '@ 08:00\nlabs hb 9.0\nabg ph 7.40, pco2 40, po2 90, sao2 97, hb 0.1';
    const d = derived(text, 'cao2');
    expect(d.value).toBeCloseTo(1.34 * 9 * 0.97 + 0.003 * 90, 9);
    expect(d.inputs.find((t) => t.name === 'Hb')!.note).toBe('labs line');
  });

  it('names the Hb used and its line in the hover and in `show`', () => {
    const text = `@ 08:00\n${GAS}\nlabs hb 9.0 mmol/L`;
    const result = checkNote(text);
    const tp = result.analysis.timeline.timepoints[0]!;
    const d = derived(text, 'cao2');
    const hover = derivedHover(d, tp);
    expect(hover).toContain('Hb 12.0 g/dL (abg line, measured with the gas) — line 2');
    // The labs Hb was written in mmol/L: named as written, not the gas Hb's unit.
    expect(hover).toContain('labs Hb 14.5 g/dL (line 3) not used');
    expect(hover).not.toContain('(written 9.0 mmol/L)) (abg');
    const shown = renderShow('n.pneu', result, paint(false));
    expect(shown).toMatch(/CaO2 15\.9 mL\/dL \(Hb of the abg line\)/);
  });
});
