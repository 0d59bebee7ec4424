// Gas pressures in a note whose gas unit is kPa: the status summary, inlay hints, their tooltips
// and hovers show kPa first with mmHg in parentheses, formulas read true with the numbers the note
// wrote, and a note in mmHg is shown as before.
//
// Numbers: 1 kPa = 7.50062 mmHg (definition of the units: 1 mmHg = 133.3224 Pa, NIST SP 811),
// cross-checked with @lhncbc/ucum-lhc, an independent UCUM implementation.
import { UcumLhcUtils } from '@lhncbc/ucum-lhc';
import { describe, expect, it } from 'vitest';
import { checkNote, type NoteResult } from '../../server/src/core/check-note';
import { derivedHover, HINT_CATEGORIES, hoverAt, inlayHints, type HintCategory } from '../../server/src/core/service';
import { timepointSummary } from '../../server/src/core/trends';
import { note, noteAt } from './cursor';

const ALL = { categories: new Set<HintCategory>(HINT_CATEGORIES) };
const EVERY_LINE = { start: 0, end: 10_000 };

const ucum = UcumLhcUtils.getInstance();
/** mmHg → kPa by UCUM (mm[Hg] is 133.3220 Pa there; the core's 7.50062 agrees to ~3e-6). */
function ucumKpa(mmHg: number): number {
  const r = ucum.convertUnitTo('mm[Hg]', mmHg, 'kPa');
  expect(r.status).toBe('succeeded');
  return r.toVal ?? Number.NaN;
}
function ucumMmhg(kPa: number): number {
  const r = ucum.convertUnitTo('kPa', kPa, 'mm[Hg]');
  expect(r.status).toBe('succeeded');
  return r.toVal ?? Number.NaN;
}

// Invented: a venturi mask at FiO2 0.28, the gas written in kPa as the note's unit says.
const kpaNote = note(
  'patient   age 71 y, sex female',
  'units     gas kPa',
  '@ day 1 14:50  titrated',
  'oxygen    venturi, fio2 28 %',
  'vitals    spo2 90 %',
  'abg       ph 7.28, pco2 9.1, po2 7.9, hco3 31.5',
);
const GAS_LINE = 5;

// The same gas in mmHg: 9.1 kPa = 68.3 mmHg, 7.9 kPa = 59.3 mmHg (to the whole mmHg as an mmHg note writes it).
const mmhgNote = note(
  'patient   age 71 y, sex female',
  '@ day 1 14:50  titrated',
  'oxygen    venturi, fio2 28 %',
  'vitals    spo2 90 %',
  'abg       ph 7.28, pco2 68, po2 59, hco3 31.5',
);

function hintsOn(result: NoteResult, line: number) {
  return inlayHints(result, EVERY_LINE, ALL).filter((h) => h.position.line === line);
}

function pfOf(result: NoteResult) {
  const tp = result.analysis.timeline.timepoints[0]!;
  const pf = result.analysis.derivation(tp.index).derived.find((d) => d.id === 'pf_ratio');
  expect(pf).toBeDefined();
  return { tp, pf: pf! };
}

describe('the expected numbers (definition of the units, cross-checked with UCUM)', () => {
  it('P/F of PaO2 7.9 kPa on FiO2 0.28 is 28.2 kPa, 212 mmHg', () => {
    // 7.9 kPa × 7.50062 = 59.25 mmHg; ÷ 0.28 = 211.6 mmHg = 28.21 kPa.
    expect(ucumMmhg(7.9) / 0.28).toBeCloseTo(211.6, 1);
    expect(ucumKpa(ucumMmhg(7.9) / 0.28)).toBeCloseTo(28.21, 2);
    const { pf } = pfOf(checkNote(kpaNote));
    // UCUM's mm[Hg] is 133.3220 Pa, the conventional one 133.3224 Pa: they agree to ~3e-6.
    expect(pf.value).toBeCloseTo(ucumMmhg(7.9) / 0.28, 2);
  });
});

describe('status summary in a kPa note', () => {
  it('gives every gas pressure its unit, in kPa, and P/F in kPa with mmHg in parentheses', () => {
    // PaCO2 and PaO2 as written (9.1, 7.9 kPa); P/F 28.2 kPa = 212 mmHg (see above).
    expect(timepointSummary(checkNote(kpaNote), GAS_LINE)?.text).toBe('P/F 28.2 kPa (212) · pH 7.28 · PaCO2 9.1 kPa · PaO2 7.9 kPa · SpO2 90 %');
  });

  it('spells each figure out in the tooltip, kPa with mmHg, before the readings and the caution', () => {
    const tooltip = timepointSummary(checkNote(kpaNote), GAS_LINE)?.tooltip.split('\n') ?? [];
    // 9.1 kPa = 68.3 mmHg, 7.9 kPa = 59.3 mmHg (1 kPa = 7.50062 mmHg, the units' definition).
    expect(tooltip.slice(1, 6)).toEqual(['P/F 28.2 kPa (212 mmHg)', 'pH 7.28', 'PaCO2 9.1 kPa (68 mmHg)', 'PaO2 7.9 kPa (59 mmHg)', 'SpO2 90 %']);
    expect(tooltip.at(-1)).toBe('Decision support only — defer to local protocols and licensed practice.');
  });

  it('gives a driving pressure its unit in the status bar and the tooltip', () => {
    const summary = timepointSummary(checkNote(note('@ 08:00', 'vent mode VC, vt 420 mL, rate 16, peep 8, fio2 0.5', 'vent plateau 26')), 2);
    // Driving pressure = plateau − PEEP = 26 − 8 = 18 cmH2O (Amato MBP et al., Driving pressure and survival in ARDS, NEJM 2015).
    expect(summary?.text).toBe('ΔP 18 cmH2O');
    expect(summary?.tooltip.split('\n')).toContain('Driving pressure 18 cmH2O');
  });

  it('follows the gas unit in force at each timepoint, and the gasUnit setting', () => {
    const switched = note('@ 08:00', 'oxygen venturi, fio2 0.4', 'abg 7.30/56/71/26', '@ 09:00', 'units gas kPa', 'abg 7.32/7.2/9.8/26');
    const result = checkNote(switched);
    expect(timepointSummary(result, 2)?.text).toBe('P/F 178 mmHg · pH 7.30 · PaCO2 56 mmHg · PaO2 71 mmHg');
    // 9.8 kPa = 73.5 mmHg; ÷ 0.40 = 183.8 mmHg = 24.5 kPa (UCUM: ucumKpa(ucumMmhg(9.8) / 0.4)).
    expect(ucumKpa(ucumMmhg(9.8) / 0.4)).toBeCloseTo(24.5, 1);
    expect(timepointSummary(result, 5)?.text).toBe('P/F 24.5 kPa (184) · pH 7.32 · PaCO2 7.2 kPa · PaO2 9.8 kPa');
    const bySetting = checkNote(note('@ 09:00', 'oxygen venturi, fio2 0.4', 'abg 7.32/7.2/9.8/26'), { gasUnit: 'kPa' });
    expect(timepointSummary(bySetting, 2)?.text).toBe('P/F 24.5 kPa (184) · pH 7.32 · PaCO2 7.2 kPa · PaO2 9.8 kPa');
  });
});

describe('inlay hints in a kPa note', () => {
  it('show P/F and the A–a gradient in kPa first, compact', () => {
    // P/F 28.2 kPa (212 mmHg, above). A–a: PiO2 0.28 × (760 − 47) = 199.6 mmHg (alveolar gas
    // equation), PAO2 199.6 − 68.26 ÷ 0.8 = 114.3 mmHg, A–a 114.3 − 59.3 = 55.1 mmHg = 7.3 kPa;
    // upper normal 71/4 + 4 = 21.75 mmHg = 2.9 kPa.
    expect(ucumKpa(0.28 * (760 - 47) - ucumMmhg(9.1) / 0.8 - ucumMmhg(7.9))).toBeCloseTo(7.34, 2);
    expect(ucumKpa(71 / 4 + 4)).toBeCloseTo(2.9, 1);
    const [first] = hintsOn(checkNote(kpaNote), GAS_LINE);
    expect(first?.label).toBe('P/F 28.2 kPa (212) · A–a 7.3 kPa (55), ≤ 2.9');
  });

  it('write the P/F formula with the kPa number the note wrote', () => {
    const [first] = hintsOn(checkNote(kpaNote), GAS_LINE);
    const tooltip = first?.tooltipMarkdown ?? '';
    expect(tooltip).toContain('**P/F ratio** (P/F): **28.2 kPa (212 mmHg)**');
    // 7.9 ÷ 0.28 = 28.21: the arithmetic holds in kPa.
    expect(tooltip).toContain('With the numbers: `7.9 ÷ 0.28 = 28.2 kPa (212 mmHg)`');
    expect(tooltip).toContain('- PaO2 7.9 kPa (59 mmHg) — line 6');
    // A–a in kPa too: 15.2 − 7.9 = 7.3.
    expect(tooltip).toContain('With the numbers: `15.2 − 7.9 = 7.3 kPa (55 mmHg)`');
  });

  it('say the conversion where a formula is computed in mmHg (its constants are mmHg)', () => {
    const result = checkNote(kpaNote);
    const tp = result.analysis.timeline.timepoints[0]!;
    const hco3 = result.analysis.derivation(tp.index).derived.find((d) => d.id === 'hco3_calculated');
    expect(hco3).toBeDefined();
    const md = derivedHover(hco3!, tp);
    // 0.0307 mmol/L per mmHg (Henderson–Hasselbalch): PaCO2 9.1 kPa = 68.26 mmHg.
    expect(ucumMmhg(9.1)).toBeCloseTo(68.26, 2);
    // 0.0307 × 68 × 10^1.18 is 31.6, not the 31.7 shown: the PaCO2 is given to a tenth (68.3), in the
    // conversion as in the formula, so the numbers give the value shown.
    expect(md).toContain('With the numbers, in mmHg (PaCO2 9.1 kPa = 68.3 mmHg): `0.0307 × 68.3 × 10^(7.28 − 6.1) = 31.7 mmol/L');
    // The upper normal of the A–a gradient is a rule in mmHg: its result says the kPa too.
    const upper = result.analysis.derivation(tp.index).derived.find((d) => d.id === 'aa_gradient_upper_normal')!;
    expect(derivedHover(upper, tp)).toContain('With the numbers, in mmHg: `71 ÷ 4 + 4 = 22 mmHg = 2.9 kPa`');
  });
});

describe('hovers in a kPa note', () => {
  it('show a gas pressure as written in kPa first, and what it feeds in kPa', () => {
    const md = hoverAt(checkNote(kpaNote), { line: GAS_LINE, character: 34 })?.markdown ?? '';
    expect(md).toContain('**PaO2**');
    // 7.9 kPa = 59.25 mmHg (above).
    expect(md).toContain('Value: **7.9 kPa** = 59 mmHg');
    expect(md).toContain('P/F 28.2 kPa (212 mmHg)');
  });

  it('list the derived gas pressures of a timepoint in kPa first', () => {
    const md = hoverAt(checkNote(kpaNote), { line: 2, character: 3 })?.markdown ?? '';
    expect(md).toContain('- P/F ratio (P/F): **28.2 kPa (212 mmHg)**');
    // PiO2 0.28 × (760 − 47) = 199.6 mmHg = 26.6 kPa (alveolar gas equation; UCUM for the kPa).
    expect(ucumKpa(0.28 * (760 - 47))).toBeCloseTo(26.6, 1);
    expect(md).toContain('- Inspired PO2 of humidified gas (PiO2): **26.6 kPa (200 mmHg)**');
  });
});

describe('header values in a kPa note', () => {
  // 84 kPa = 630.05 mmHg (definition of the units; UCUM agrees).
  it('hover in kPa first, by the header\'s gas unit or the gasUnit setting, as timepoint values do', () => {
    expect(ucumMmhg(84)).toBeCloseTo(630.05, 1);
    const byLine = noteAt(note('units gas kPa', 'place barometric 8|4', '@ 08:00', 'abg 7.40/5.3/11/24'));
    expect(hoverAt(byLine.result, byLine.position)?.markdown).toContain('Value: **84.0 kPa** = 630 mmHg');
    const bySetting = noteAt(note('place barometric 8|4', '@ 08:00', 'abg 7.40/5.3/11/24'), { gasUnit: 'kPa' });
    expect(hoverAt(bySetting.result, bySetting.position)?.markdown).toContain('Value: **84.0 kPa** = 630 mmHg');
  });

  it('stay in mmHg first in an mmHg note, and when only a timepoint says `units gas kPa`', () => {
    const mmhg = noteAt(note('place barometric 63|0', '@ 08:00', 'abg 7.40/40/83/24'));
    expect(hoverAt(mmhg.result, mmhg.position)?.markdown).toContain('Value: **630 mmHg** = 84.0 kPa');
    // The header is read before the timepoint's `units gas`: its 630 is mmHg, and shown so.
    const later = noteAt(note('place barometric 63|0', '@ 08:00', 'units gas kPa', 'abg 7.40/5.3/11/24'));
    expect(hoverAt(later.result, later.position)?.markdown).toContain('Value: **630 mmHg** = 84.0 kPa');
  });

  it('give the pressure estimated from a header altitude in the header\'s unit', () => {
    // West's model atmosphere, 2000 m: exp(6.63268 − 0.1112 × 2 − 0.00149 × 2²) = 604.5 mmHg = 80.6 kPa
    // (West JB, Prediction of barometric pressures at high altitudes with the use of model
    // atmospheres, J Appl Physiol 1996 — from memory; UCUM for the kPa).
    const pb = Math.exp(6.63268 - 0.1112 * 2 - 0.00149 * 4);
    expect(pb).toBeCloseTo(604.5, 1);
    expect(ucumKpa(pb)).toBeCloseTo(80.6, 1);
    const gas = ['oxygen venturi, fio2 0.28', 'abg 7.40/5.3/9.0/24'];
    const kpa = checkNote(note('units gas kPa', 'place altitude 2000 m', '@ 08:00', ...gas));
    const [inKpa] = hintsOn(kpa, 1);
    expect(inKpa?.label).toBe('PB 80.6 kPa (604)');
    expect(inKpa?.tooltipMarkdown).toContain('**Barometric pressure** (PB): **80.6 kPa (604 mmHg)**');
    // A `units gas kPa` of the first timepoint is not the header's: the header line stays in mmHg.
    const later = checkNote(note('place altitude 2000 m', '@ 08:00', 'units gas kPa', ...gas));
    const [inMmhg] = hintsOn(later, 0);
    expect(inMmhg?.label).toBe('PB 604 mmHg');
    expect(inMmhg?.tooltipMarkdown).toContain('**Barometric pressure** (PB): **604 mmHg**');
    // The timepoint itself is in kPa.
    expect(hintsOn(later, 4)[0]?.label).toMatch(/^P\/F [\d.]+ kPa/);
  });

  it('show the standard atmosphere with its geopotential step, with the numbers', () => {
    // U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562, from memory): H = r0·z/(r0 + z), r0 = 6,356,766 m;
    // 3000 m → H = 2998.6 m; 101325 × (1 − 2.25577×10⁻⁵ × H)^5.25588 Pa = 526.0 mmHg.
    const h = (6356766 * 3000) / (6356766 + 3000);
    expect(760 * (1 - 2.25577e-5 * h) ** 5.25588).toBeCloseTo(526.0, 1);
    const result = checkNote(note('place altitude 3000 m', '@ 08:00', 'oxygen room air', 'abg 7.44/33/60/22'), { barometricModel: 'standard' });
    const tooltip = hintsOn(result, 0)[0]?.tooltipMarkdown ?? '';
    expect(tooltip).toContain('**526 mmHg**');
    expect(tooltip).toContain('H = 6,356,766 × 3000 ÷ (6,356,766 + 3000) = 526 mmHg');
    expect(tooltip).toContain('H is the geopotential altitude');
  });
});

describe('a note in mmHg', () => {
  it('is shown as before: no kPa in the summary, hints or formulas; a derived gas pressure\'s explanation gives it in kPa too, after the mmHg', () => {
    const result = checkNote(mmhgNote);
    expect(timepointSummary(result, 4)?.text).toBe('P/F 211 mmHg · pH 7.28 · PaCO2 68 mmHg · PaO2 59 mmHg · SpO2 90 %');
    const [first] = hintsOn(result, 4);
    expect(first?.label).toBe('P/F 211 · A–a 56 (≤ 22)');
    expect(first?.tooltipMarkdown).toContain('With the numbers: `59 ÷ 0.28 = 211 mmHg`');
    expect(first?.tooltipMarkdown).toContain('- PaO2 59 mmHg — line 5');
    // 210.7 mmHg = 28.1 kPa, 55.6 mmHg = 7.4 kPa (UCUM for the kPa).
    expect(ucumKpa(59 / 0.28).toFixed(1)).toBe('28.1');
    expect(first?.tooltipMarkdown).toContain('**P/F ratio** (P/F): **211 mmHg** = 28.1 kPa');
    expect(first?.tooltipMarkdown.split('\n').filter((l) => l.includes('kPa'))).toEqual([
      '**P/F ratio** (P/F): **211 mmHg** = 28.1 kPa',
      expect.stringMatching(/^\*\*A–a gradient\*\* \(A–a\): \*\*56 mmHg\*\* = 7\.4 kPa$/),
    ]);
    const tpHover = hoverAt(result, { line: 1, character: 2 })?.markdown ?? '';
    expect(tpHover).toContain('- P/F ratio (P/F): **211 mmHg** = 28.1 kPa');
    expect(tpHover).toContain('- HCO3 calculated from pH and PaCO2 (HCO3 calc): **31.6 mmol/L**\n');
    const { tp, pf } = pfOf(result);
    expect(derivedHover(pf, tp)).toBe(derivedHover(pf));
  });

  it('is shown as before when it says `units gas mmHg`', () => {
    const explicit = checkNote(note('units gas mmHg', mmhgNote));
    expect(timepointSummary(explicit, 5)?.text).toBe('P/F 211 mmHg · pH 7.28 · PaCO2 68 mmHg · PaO2 59 mmHg · SpO2 90 %');
    expect(hintsOn(explicit, 5)[0]?.label).toBe('P/F 211 · A–a 56 (≤ 22)');
  });
});

describe('a gas written with its unit', () => {
  // 9.8 kPa = 73.5 mmHg; ÷ 0.40 = 183.8 mmHg = 24.5 kPa (as above, UCUM for the kPa).
  it('in kPa, in a note read in mmHg, is shown in kPa first at its timepoint', () => {
    const result = checkNote(note('@ 08:00', 'oxygen venturi, fio2 0.4', 'abg 7.32/7.2/9.8/26 kPa', '@ 09:00', 'abg 7.30/56/71/26'));
    expect(result.analysis.timeline.timepoints.map((tp) => [tp.gasUnit, tp.shownGasUnit])).toEqual([['mmHg', 'kPa'], ['mmHg', 'mmHg']]);
    expect(timepointSummary(result, 2)?.text).toBe('P/F 24.5 kPa (184) · pH 7.32 · PaCO2 7.2 kPa · PaO2 9.8 kPa');
    expect(hintsOn(result, 2)[0]?.label).toMatch(/^P\/F 24\.5 kPa \(184\)/);
    const at = noteAt(note('@ 08:00', 'oxygen venturi, fio2 0.4', 'abg 7.32/7.2/9.|8/26 kPa'));
    expect(hoverAt(at.result, at.position)?.markdown).toContain('Value: **9.8 kPa** = 74 mmHg');
    // The next timepoint writes its gas bare, read in the note's mmHg: shown in mmHg again.
    expect(timepointSummary(result, 4)?.text).toBe('P/F 178 mmHg · pH 7.30 · PaCO2 56 mmHg · PaO2 71 mmHg');
  });

  it('in mmHg, in a kPa note, is shown in mmHg first; units that differ within a gas leave the note\'s unit', () => {
    const inMmhg = checkNote(note('units gas kPa', '@ 08:00', 'oxygen venturi, fio2 0.4', 'abg ph 7.30, pco2 56 mmHg, po2 71 mmHg'));
    expect(inMmhg.analysis.timeline.timepoints[0]?.shownGasUnit).toBe('mmHg');
    expect(timepointSummary(inMmhg, 3)?.text).toBe('P/F 178 mmHg · pH 7.30 · PaCO2 56 mmHg · PaO2 71 mmHg');
    // Its hints say mmHg, where the note's other hints are in kPa (a bare 178 would read as either).
    expect(hintsOn(inMmhg, 3)[0]?.label).toMatch(/^P\/F 178 mmHg · A–a \d+ mmHg$/);
    const mixed = checkNote(note('units gas kPa', '@ 08:00', 'oxygen venturi, fio2 0.4', 'abg ph 7.32, pco2 7.2, po2 73.5 mmHg'));
    expect(mixed.analysis.timeline.timepoints[0]?.shownGasUnit).toBe('kPa');
    expect(timepointSummary(mixed, 3)?.text).toMatch(/^P\/F 24\.5 kPa \(184\)/);
  });
});

/**
 * A tiny evaluator for the arithmetic of a formula with its numbers: numbers, + − × ÷ and
 * parentheses; null for anything else (functions, powers, ranges, words).
 */
function evaluate(text: string): number | null {
  const tokens = text.match(/\d+(?:\.\d+)?|[+\-−×÷()]/g);
  if (!tokens || tokens.join('') !== text.replace(/\s+/g, '')) return null;
  let i = 0;
  const peek = () => tokens[i];
  const factor = (): number => {
    const t = tokens[i++];
    if (t === '(') {
      const v = sum();
      i++;
      return v;
    }
    if (t === '−' || t === '-') return -factor();
    return Number(t);
  };
  const product = (): number => {
    let v = factor();
    while (peek() === '×' || peek() === '÷') v = tokens[i++] === '×' ? v * factor() : v / factor();
    return v;
  };
  const sum = (): number => {
    let v = product();
    while (peek() === '+' || peek() === '−' || peek() === '-') v = tokens[i++] === '+' ? v + product() : v - product();
    return v;
  };
  const v = sum();
  return i === tokens.length && Number.isFinite(v) ? v : null;
}

describe('formulas with their numbers read true', () => {
  it('in kPa and in mmHg notes: the arithmetic of the shown numbers gives the shown result', () => {
    let checked = 0;
    for (const text of [kpaNote, mmhgNote]) {
      const result = checkNote(text);
      for (const tp of result.analysis.timeline.timepoints) {
        for (const d of result.analysis.derivation(tp.index).derived) {
          const line = /With the numbers[^`]*`([^`]*)`/.exec(derivedHover(d, tp))?.[1] ?? '';
          const [left, right] = line.split(' = ');
          const value = evaluate(left ?? '');
          if (value === null || right === undefined) continue;
          const shown = Number(/^-?[\d.]+/.exec(right)?.[0]);
          // The shown inputs are rounded: the result agrees within 1 % or a unit of its last decimal.
          const decimals = (/\.(\d+)/.exec(right)?.[1] ?? '').length;
          expect(Math.abs(value - shown), `${d.id}: ${line}`).toBeLessThanOrEqual(Math.max(Math.abs(shown) * 0.01, 10 ** -decimals));
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThanOrEqual(8);
  });
});

describe('blood pressures in a kPa note (README: no gas pressures, they stay in mmHg)', () => {
  it('the pair, a mean stated with `map` and a measured mean in brackets hover in mmHg only', () => {
    for (const marked of ['units gas kPa\n@ 08:00\nvitals bp 12|0/80', 'units gas kPa\n@ 08:00\nvitals bp 120/80, map 9|3', 'units gas kPa\n@ 08:00\nvitals bp 120/80 (9|3)', 'units gas kPa\n@ 08:00\nvitals bp 120/80 mm Hg(9|3)']) {
      const { result, position } = noteAt(marked);
      const value = /Value: \*\*([^*]+)\*\*(.*)/.exec(hoverAt(result, position)?.markdown ?? '');
      expect(value?.[1], marked).toMatch(/ mmHg$/);
      expect(value?.[2] ?? '', marked).not.toContain('kPa');
    }
  });
});
