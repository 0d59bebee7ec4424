// The expected PaCO2 of a metabolic disorder as `show` and the hover print it (numberText, kpaText:
// the derived value's range) takes the decimals that keep the PaCO2 of the gas on the side of the
// range the classification puts it, as the acid–base reading writes the range (GasWords.range).
// Before, the kPa ends took one decimal whatever the PaCO2: 3.01 kPa below 3.020 kPa showed beside
// `3.0–3.6 kPa`, and 4.91 kPa within 4.913 kPa beside `4.4–4.9 kPa`.
// Winters' formula, PaCO2 = 1.5 × HCO3 + 8 ± 2 mmHg: Albert MS, Dell RB, Winters RW. Quantitative
// displacement of acid-base equilibrium in metabolic acidosis. Ann Intern Med 1967;66(2):312–322 (the
// coefficients from memory, as physiology/acid-base.ts SOURCES says). 1 kPa = 7.50062 mmHg (UCUM's
// conversion, the unit registry). pH from Henderson–Hasselbalch, 6.1 + log10(HCO3 ÷ (0.0307 × PaCO2)),
// so that the gas is consistent (PN402). Invented gases.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { kpaText, numberText } from '../../server/src/core/service/derived-hover';
import { gasAsReadingsShowIt } from '../../server/src/core/derive/interpret';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';

const MMHG_PER_KPA = 7.50062;

function gas(pco2: string, unit: 'kPa' | 'mmHg', hco3: number) {
  const mmHg = Number(pco2) * (unit === 'kPa' ? MMHG_PER_KPA : 1);
  const ph = (6.1 + Math.log10(hco3 / (0.0307 * mmHg))).toFixed(2);
  const text = `@ 08:00\nabg ph ${ph}, pco2 ${pco2} ${unit}, hco3 ${hco3}`;
  const result = checkNote(text);
  const d = result.analysis.derivation(0)!;
  const expected = d.derived.find((v) => v.id === 'paco2_expected')!;
  const reading = d.interpretations.find((i) => /the expected/.test(i.text))?.text ?? '';
  // The PaCO2's mmHg as the gas row of `show` writes it in a kPa note, beside that range.
  const stated = result.analysis.timeline.timepoints[0]!.stated.find((s) => s.fieldId === 'paco2')!;
  const rowMmhg = unit === 'kPa' ? Number(gasAsReadingsShowIt(stated, result.settings, expected?.range ?? null)?.mmHg) : NaN;
  return { text, expected, reading, rowMmhg, within: /within the expected/.test(reading), outside: /(above|below) the expected/.test(reading) };
}

const ends = (text: string) => text.split('–').map(Number) as [number, number];

describe('the expected PaCO2 shown beside a PaCO2 written in kPa', () => {
  it('3.01 kPa with HCO3 11.1: below 22.65 mmHg (3.020 kPa), shown beside 3.02–3.55 kPa, not 3.0–3.6', () => {
    // 1.5 × 11.1 + 8 = 24.65 ± 2: 22.65–26.65 mmHg, 3.0198–3.5530 kPa; 3.01 kPa is 22.58 mmHg, ± 0.0375 at two decimals.
    const g = gas('3.01', 'kPa', 11.1);
    expect(g.outside).toBe(true);
    expect(kpaText(g.expected)).toBe('3.02–3.55');
    expect(3.01).toBeLessThan(ends(kpaText(g.expected))[0]);
  });

  it('4.91 kPa with HCO3 17.9: within 36.85 mmHg (4.913 kPa) at its resolution, shown beside 4.38–4.91 kPa, not 4.4–4.9', () => {
    // 1.5 × 17.9 + 8 = 34.85 ± 2: 32.85–36.85 mmHg, 4.3796–4.9129 kPa; 4.91 kPa is 36.83 mmHg.
    const g = gas('4.91', 'kPa', 17.9);
    expect(g.within).toBe(true);
    expect(kpaText(g.expected)).toBe('4.38–4.91');
    const [low, high] = ends(kpaText(g.expected));
    expect(4.91 >= low && 4.91 <= high).toBe(true);
  });

  it('a PaCO2 written to one decimal keeps one decimal on the ends where that tells the side: 3.0 kPa with HCO3 11.3 beside 3.1–3.6 kPa', () => {
    // 1.5 × 11.3 + 8 = 24.95 ± 2: 22.95–26.95 mmHg, 3.060–3.593 kPa; 3.0 kPa is 22.50 mmHg, ± 0.375: below.
    const g = gas('3.0', 'kPa', 11.3);
    expect(g.outside).toBe(true);
    expect(kpaText(g.expected)).toBe('3.1–3.6');
  });

  it('the mmHg in brackets too: 2.89 kPa (21.7 mmHg) with HCO3 10.5 beside 2.9–3.4 kPa (21.8–25.8 mmHg), not (22 mmHg)', async () => {
    // 1.5 × 10.5 + 8 = 23.75 ± 2: 21.75–25.75 mmHg; 2.89 kPa is 21.68 mmHg, ± 0.0375: below.
    const g = gas('2.89', 'kPa', 10.5);
    expect(g.outside).toBe(true);
    const io = memoryIo({ stdin: g.text, env: { NO_COLOR: '1' }, tty: false });
    await run(['show', '-'], io);
    expect(io.out()).toContain('PaCO2 2.89 kPa (21.7 mmHg)');
    expect(io.out()).toContain('PaCO2 expected 2.9–3.4 kPa (21.8–25.8 mmHg)');
  });

  it('agrees with the reading over a sweep of PaCO2s in kPa (one and two decimals) and of HCO3s', () => {
    let compared = 0;
    for (let h = 100; h <= 220; h += 7) {
      for (let i = 0; i <= 300; i += 7) {
        const pco2 = (2.5 + i * 0.01).toFixed(i % 2 === 0 ? 2 : 1);
        const g = gas(pco2, 'kPa', h / 10);
        if (!g.within && !g.outside) continue;
        compared++;
        const [low, high] = ends(kpaText(g.expected));
        const shownWithin = Number(pco2) >= low && Number(pco2) <= high;
        expect([pco2, h / 10, shownWithin]).toEqual([pco2, h / 10, g.within]);
        // And the mmHg in brackets, the gas row's beside the range's, where the range is outside the PaCO2 by more than the PaCO2's resolution.
        const [mLow, mHigh] = ends(numberText(g.expected));
        if (g.outside) expect([pco2, h / 10, g.rowMmhg >= mLow && g.rowMmhg <= mHigh]).toEqual([pco2, h / 10, false]);
      }
    }
    expect(compared).toBeGreaterThan(50);
  });
});

describe('the expected PaCO2 shown beside a PaCO2 in mmHg', () => {
  it('31 mmHg with HCO3 14.3: within 27.45–31.45, shown 27.5–31.5 (not 27–31, which would put 31.45 under 31)', () => {
    const g = gas('31', 'mmHg', 14.3);
    expect(g.within).toBe(true);
    expect(numberText(g.expected)).toBe('27.5–31.5');
  });

  it('31.5 mmHg with HCO3 14.3: above 31.45, shown beside 27–31, whole numbers being enough', () => {
    const g = gas('31.5', 'mmHg', 14.3);
    expect(g.outside).toBe(true);
    expect(numberText(g.expected)).toBe('27–31');
  });

  it('agrees with the reading over a sweep of PaCO2s (tenths of a mmHg) and of HCO3s', () => {
    let compared = 0;
    for (let h = 100; h <= 220; h += 7) {
      for (let i = 0; i <= 300; i += 3) {
        const pco2 = (20 + i * 0.1).toFixed(1);
        const g = gas(pco2, 'mmHg', h / 10);
        if (!g.within && !g.outside) continue;
        compared++;
        const [low, high] = ends(numberText(g.expected));
        expect([pco2, h / 10, Number(pco2) >= low && Number(pco2) <= high]).toEqual([pco2, h / 10, g.within]);
      }
    }
    expect(compared).toBeGreaterThan(50);
  });
});
