// PN415: a stated base excess against the pH and HCO3 of its own gas. Expected spans are worked by
// hand from the forms of the CLSI guideline (C46-A, 2001; the SBE's form read in a published study's table, the ABE's from memory; see
// tests/physiology/sources-read.test.ts): SBE = HCO3 − 24.8 + 16.2 × (pH − 7.40),
// ABE = (1 − 0.014 × Hb) × (HCO3 − 24.8 + (1.43 × Hb + 7.7) × (pH − 7.40)), Hb in g/dL, the ABE over
// Hb 7–17 g/dL with no Hb stated (common practice, no source); a stated value is accepted within
// ±3 mmol/L of that span (common practice, no source). Gases are invented.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { applyEdits, codeActions } from '../../server/src/core/service';
import type { Finding } from '../../server/src/core/types';

const found = (text: string): Finding[] => checkNote(text).findings.filter((f) => f.code === 'PN415');
const messages = (text: string): string[] => found(text).map((f) => f.message);

function quickFixes(text: string, f: Finding): { title: string; fixed: string }[] {
  return codeActions(checkNote(text), f.range)
    .filter((a) => a.kind === 'quickfix' && a.findingCodes?.includes(f.code))
    .map((a) => ({ title: a.title, fixed: applyEdits(text, a.edits) }));
}

describe('a base excess that does not agree with its gas (PN415)', () => {
  it('says the numbers and the span expected: pH 7.42, HCO3 24.1 give SBE −0.38 and ABE −0.31 (Hb 7) to −0.05 (Hb 17)', () => {
    // SBE 24.1 − 24.8 + 16.2 × 0.02 = −0.376; ABE(7) 0.902 × (−0.7 + 17.71 × 0.02) = −0.312;
    // ABE(17) 0.762 × (−0.7 + 32.01 × 0.02) = −0.046; accepted −3.4 to +3.0; −8 is outside.
    const text = '@ 08:00\nabg 7.42/37/90/24.1, be -8';
    expect(messages(text)).toEqual([
      'Base excess −8 mmol/L does not agree with pH 7.42 and HCO3 24.1 mmol/L (expected about −0.4 to 0.0 mmol/L from the Van Slyke equation over Hb 7–17 g/dL, give or take 3).',
    ]);
    const [f] = found(text);
    expect(f!.severity).toBe('warning');
    expect(f!.range.start.line).toBe(1);
    // The related places are the pH and the HCO3 of the same gas.
    expect(f!.related!.map((r) => [r.message, r.range.start.character])).toEqual([
      ['pH of the gas', 4],
      ['HCO3 of the gas', 15],
    ]);
    // Its sign is not the question (the span holds values of both signs): no quick fix.
    expect(quickFixes(text, f!)).toEqual([]);
  });

  it('a base deficit written as a positive excess: said, and a quick fix writes the other sign where it agrees', () => {
    // pH 7.20, HCO3 14, Hb 10: SBE 14 − 24.8 − 3.24 = −14.04; ABE 0.86 × (14 − 24.8 + 22 × (−0.20)) = −13.07.
    const text = '@ 08:00\nabg 7.20/36/90/14, be 12, hb 10';
    expect(messages(text)).toEqual([
      'Base excess 12 mmol/L does not agree with pH 7.20 and HCO3 14.0 mmol/L (expected about −14.0 to −13.1 mmol/L from the Van Slyke equation at Hb 10.0 g/dL, give or take 3): a base deficit written as a positive excess?',
    ]);
    const fixes = quickFixes(text, found(text)[0]!);
    expect(fixes).toEqual([{ title: 'Write the base excess as -12', fixed: '@ 08:00\nabg 7.20/36/90/14, be -12, hb 10' }]);
    expect(found(fixes[0]!.fixed)).toEqual([]);
    // Written with a plus sign, the fix writes a minus in its place.
    expect(quickFixes('@ 08:00\nabg 7.20/36/90/14, be +12.5, hb 10', found('@ 08:00\nabg 7.20/36/90/14, be +12.5, hb 10')[0]!).map((x) => x.fixed)).toEqual([
      '@ 08:00\nabg 7.20/36/90/14, be -12.5, hb 10',
    ]);
  });

  it('a positive excess written as a deficit is said too; where the other sign does not agree either, no quick fix', () => {
    // pH 7.50, HCO3 32: SBE 7.2 + 1.62 = +8.82; a −8 flipped is +8, within 3 of it.
    const text = '@ 08:00\nabg 7.50/42/90/32, be -8';
    expect(messages(text)[0]).toMatch(/: a positive excess written as a base deficit\?$/);
    expect(quickFixes(text, found(text)[0]!).map((x) => x.fixed)).toEqual(['@ 08:00\nabg 7.50/42/90/32, be 8']);
    // pH 7.20, HCO3 14: +20 has the wrong sign, but −20 is beyond −17.0 too.
    const far = '@ 08:00\nabg 7.20/36/90/14, be 20';
    expect(messages(far)[0]).toMatch(/a base deficit written as a positive excess\?$/);
    expect(quickFixes(far, found(far)[0]!)).toEqual([]);
  });

  it('accepts a value up to 3 mmol/L beyond the span, and not further (pH 7.40, HCO3 24.4, Hb 15: SBE −0.4, ABE 0.79 × (−0.4) = −0.316)', () => {
    const gas = (be: string) => `@ 08:00\nabg 7.40/40/90/24.4, be ${be}, hb 15`;
    expect(found(gas('2.6'))).toEqual([]);
    expect(found(gas('2.7'))).toHaveLength(1);
    expect(found(gas('-3.4'))).toEqual([]);
    expect(found(gas('-3.5'))).toHaveLength(1);
  });

  it('without an Hb, the ABE over Hb 7–17 g/dL widens the span: pH 7.20, HCO3 14 reach −12.94 (at Hb 7)', () => {
    // No Hb: ABE(7) = 0.902 × (−10.8 + 17.71 × (−0.20)) = −12.94, ABE(17) = −13.11, and −13.14 at its
    // turning point, Hb (B − 0.014 A) ÷ (0.028 B) = 14.14 with A = −12.34, B = −0.286; SBE −14.04: the span
    // −14.04 to −12.94, accepted up to −9.94. Hb 10: −14.04 to −13.07, accepted up to −13.07 + 3 = −10.07.
    expect(found('@ 08:00\nabg 7.20/36/90/14, be -10')).toEqual([]);
    expect(found('@ 08:00\nabg 7.20/36/90/14, be -10, hb 10')).toHaveLength(1);
    // An Hb stated on a labs line at the same timepoint counts as well.
    expect(found('@ 08:00\nlabs hb 10\nabg 7.20/36/90/14, be -10')).toHaveLength(1);
  });

  it('a venous base excess is checked against the venous pH and HCO3, never against an arterial gas beside it', () => {
    // Venous pH 7.32, HCO3 25: SBE 0.2 − 1.296 = −1.10; ABE(7) 0.902 × (0.2 − 17.71 × 0.08) = −1.10,
    // ABE(17) 0.762 × (0.2 − 32.01 × 0.08) = −1.80. All negative: +8 has the opposite sign, but −8 is
    // beyond −4.8 too, so no quick fix; and with up to +1.9 accepted (−1.1 + 3) the gas is expected
    // near 0, not clearly a deficit, so no word of a lost sign either.
    const text = '@ 08:00\nvbg 7.32/50/40/25, be 8';
    expect(messages(text)).toEqual([
      'Base excess 8 mmol/L does not agree with venous pH 7.32 and HCO3 25.0 mmol/L (expected about −1.8 to −1.1 mmol/L from the Van Slyke equation over Hb 7–17 g/dL, give or take 3).',
    ]);
    expect(found(text)[0]!.related!.map((r) => r.message)).toEqual(['venous pH of the gas', 'venous HCO3 of the gas']);
    expect(quickFixes(text, found(text)[0]!)).toEqual([]);
    expect(found('@ 08:00\nvbg 7.32/50/40/25, be -2\nabg 7.36/44/85/24, be -1')).toEqual([]);
    // Each base excess against its own gas: venous 7.20 and 22.5 give SBE −2.3 − 3.24 = −5.54,
    // arterial 7.42 and 24.1 about 0; −5 and −1 each agree with their own gas, and neither with the other.
    expect(found('@ 08:00\nvbg 7.20/60/40/22.5, be -5\nabg 7.42/37/90/24.1, be -1')).toEqual([]);
    expect(found('@ 08:00\nvbg 7.20/60/40/22.5, be -1\nabg 7.42/37/90/24.1, be -5').map((f) => f.range.start.line)).toEqual([1, 2]);
    expect(found('@ 08:00\nvbg 7.32/50/40/25\nabg 7.20/36/90/14, be -1')).toHaveLength(1);
  });

  it('a base excess in mEq/L reads as the same number of mmol/L', () => {
    expect(messages('@ 08:00\nabg 7.42/37/90/24.1, be -8 mEq/L')).toEqual(messages('@ 08:00\nabg 7.42/37/90/24.1, be -8 mmol/L'));
    expect(found('@ 08:00\nabg 7.42/37/90/24.1, be -1 mEq/L')).toEqual([]);
  });

  it('says nothing where the pH or the HCO3 of the gas is missing', () => {
    expect(found('@ 08:00\nabg po2 90, hco3 24.1, be -8')).toEqual([]);
    expect(found('@ 08:00\nabg ph 7.42, pco2 37, be -8')).toEqual([]);
    expect(found('@ 08:00\nvbg ph 7.32, be 8')).toEqual([]);
  });
});
