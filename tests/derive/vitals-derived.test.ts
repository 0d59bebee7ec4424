// Two values derived from vital signs and the gas: the mean arterial pressure from a cuff's
// systolic and diastolic pressures, and the arterial to end-tidal CO2 difference.
//
// Mean arterial pressure ≈ diastolic + (systolic − diastolic) ÷ 3: common practice, no single
// source; it is the "standard formula" in Razminia M et al., Validation of a new formula for mean
// arterial pressure calculation: the new formula is superior to the standard formula, Catheter
// Cardiovasc Interv 2004;63:419–425 (authors from memory), and fixed rules of this kind differ from
// the measured mean by several mmHg (Optimal calculation of mean pressure from pulse pressure, Am J
// Hypertens 2023;36:297–305): an estimate.
//
// PaCO2 − EtCO2: usually about 2–5 mmHg in health and wider with alveolar dead space (AARC Clinical
// Practice Guideline, Capnography/capnometry during mechanical ventilation, 2003 update, Respir
// Care 2003;48:534–539, as cited by a secondary page, not read here).
import { describe, expect, it } from 'vitest';
import { paint } from '../../server/src/cli/colour';
import { renderShow } from '../../server/src/cli/render-show';
import { checkNote } from '../../server/src/core/check-note';
import { exportColumns, timepointRows } from '../../server/src/core/export';
import { arterialEndTidalCo2Difference, meanArterialPressure } from '../../server/src/core/physiology';
import { HINT_CATEGORIES, inlayHints, type HintCategory } from '../../server/src/core/service';
import { derivedHover } from '../../server/src/core/service/derived-hover';
import { derivation, derived } from './helpers';

const ALL_HINTS = { categories: new Set<HintCategory>(HINT_CATEGORIES) };
const hintLabels = (text: string, line: number) => inlayHints(checkNote(text), { start: 0, end: 100 }, ALL_HINTS).filter((h) => h.position.line === line).map((h) => h.label);

describe('mean arterial pressure from the blood pressure', () => {
  it('is diastolic + a third of the pulse pressure (common practice, no source)', () => {
    // 120/80: 80 + 40/3 = 93.3 mmHg.
    expect(meanArterialPressure(120, 80)).toBeCloseTo(93.333, 3);
    // 90/60: 60 + 10 = 70 mmHg.
    expect(meanArterialPressure(90, 60)).toBe(70);
    expect(meanArterialPressure(80, 120)).toBeNull(); // systolic below diastolic (PN: systolic-below-diastolic)
    expect(meanArterialPressure(Number.NaN, 60)).toBeNull();
  });

  it('is derived from `bp` on a vitals line, with its formula, inputs and source, and marked an estimate', () => {
    const d = derived('@ 08:00\nvitals bp 120/80', 'mean_arterial_pressure');
    expect(d.value).toBeCloseTo(93.333, 3);
    expect(d.unit).toBe('mmHg');
    expect(d.short).toBe('MAP (BP)');
    expect(d.formula).toBe('BP diastolic + (BP systolic − BP diastolic) ÷ 3');
    expect(d.substituted).toBe('80 + (120 − 80) ÷ 3 = 93 mmHg');
    expect(d.inputs.map((t) => [t.name, t.origin.kind])).toEqual([['BP systolic', 'here'], ['BP diastolic', 'here']]);
    expect(d.estimate).toBe(true);
    expect(d.source).toContain('common practice');
  });

  it('is not derived from a systolic below the diastolic, nor where there is no blood pressure', () => {
    expect(derivation('@ 08:00\nvitals bp 80/120').derived.map((d) => d.id)).not.toContain('mean_arterial_pressure');
    expect(derivation('@ 08:00\nvitals bp 80/120').notApplicable.find((d) => d.id === 'mean_arterial_pressure')?.reason).toBe('the systolic pressure is below the diastolic (see PN305)');
    expect(derivation('@ 08:00\nvitals hr 80').derived.map((d) => d.id)).not.toContain('mean_arterial_pressure');
    expect(derivation('@ 08:00\nvitals hr 80').missing.map((d) => d.id)).not.toContain('mean_arterial_pressure');
  });

  it('is shown by `show` and in the hover, and exported in a column added last', () => {
    const text = '@ 08:00\nvitals bp 120/80';
    const result = checkNote(text);
    expect(renderShow('n.pneu', result, paint(false))).toMatch(/MAP \(BP\) 93 mmHg est\./);
    expect(derivedHover(derived(text, 'mean_arterial_pressure'), result.analysis.timeline.timepoints[0]!)).toContain('80 + (120 − 80) ÷ 3 = 93 mmHg');
    const names = exportColumns().map((c) => c.name);
    // Added after every earlier column (the findings counts close the first list), in the order added.
    const at = names.indexOf('mean_arterial_pressure_mmHg');
    expect(at).toBeGreaterThan(names.indexOf('findings_information'));
    expect(names.slice(at, at + 2)).toEqual(['mean_arterial_pressure_mmHg', 'paco2_etco2_difference_mmHg']);
    expect(timepointRows('n.pneu', result, { redactProse: false, shiftDays: 0 })[0]!['mean_arterial_pressure_mmHg']).toBeCloseTo(93.333, 3);
  });

  it('stays in mmHg in a note whose gas unit is kPa: a blood pressure is no gas pressure', () => {
    const text = '@ 08:00\nunits gas kPa\nvitals bp 120/80\nabg ph 7.40, pco2 5.3, po2 12';
    const result = checkNote(text);
    const shown = renderShow('n.pneu', result, paint(false));
    expect(shown).toMatch(/MAP \(BP\) 93 mmHg est\./);
    expect(shown).not.toMatch(/MAP \(BP\) [0-9.]+ kPa/);
    expect(shown).toMatch(/MAP \(BP\) +Mean arterial pressure, estimated from the blood pressure, in mmHg/);
    const hover = derivedHover(derived(text, 'mean_arterial_pressure'), result.analysis.timeline.timepoints[0]!);
    expect(hover).toContain('80 + (120 − 80) ÷ 3 = 93 mmHg');
    expect(hover).not.toContain('kPa');
  });

  it('has an inlay hint on the blood pressure line, in mmHg in an mmHg and in a kPa note', () => {
    expect(hintLabels('@ 08:00\nvitals bp 120/80', 1)).toEqual(['MAP ≈ 93 mmHg']);
    expect(hintLabels('@ 08:00\nunits gas kPa\nvitals bp 120/80', 2)).toEqual(['MAP ≈ 93 mmHg']);
  });
});

describe('arterial to end-tidal CO2 difference', () => {
  it('is PaCO2 − EtCO2', () => {
    expect(arterialEndTidalCo2Difference(45, 38)).toBe(7);
    expect(arterialEndTidalCo2Difference(40, 42)).toBe(-2);
    expect(arterialEndTidalCo2Difference(Number.POSITIVE_INFINITY, 42)).toBeNull();
  });

  it('is derived where an arterial gas and an end-tidal CO2 are stated at one timepoint', () => {
    const d = derived('@ 08:00\nvent etco2 38\nabg ph 7.35, pco2 45, po2 80', 'paco2_etco2_difference');
    expect(d.value).toBe(7);
    expect(d.formula).toBe('PaCO2 − EtCO2');
    expect(d.substituted).toBe('45 − 38 = 7 mmHg');
    expect(d.source).toContain('AARC');
    // In a kPa note the difference is shown in kPa first, with the numbers as written.
    const kpa = '@ 08:00\nunits gas kPa\nvent etco2 5.0\nabg ph 7.35, pco2 6.0, po2 10';
    const result = checkNote(kpa);
    expect(derivedHover(derived(kpa, 'paco2_etco2_difference'), result.analysis.timeline.timepoints[0]!)).toContain('6.0 − 5.0 = 1.0 kPa');
  });

  it('is not derived from an end-tidal CO2 of another timepoint, nor reported missing without both', () => {
    const text = '@ 08:00\nvent etco2 38\n@ 09:00\nabg ph 7.35, pco2 45, po2 80';
    expect(derivation(text).derived.map((d) => d.id)).not.toContain('paco2_etco2_difference');
    expect(derivation(text).missing.map((d) => d.id)).not.toContain('paco2_etco2_difference');
    expect(derivation('@ 08:00\nvitals etco2 38').missing.map((d) => d.id)).not.toContain('paco2_etco2_difference');
  });

  it('has an inlay hint on the gas line, in kPa first in a kPa note', () => {
    expect(hintLabels('@ 08:00\nvent etco2 38\nabg ph 7.35, pco2 45, po2 80', 2)).toContain('PaCO2–EtCO2 7');
    expect(hintLabels('@ 08:00\nunits gas kPa\nvent etco2 5.0\nabg ph 7.35, pco2 6.0, po2 10', 3)).toContain('PaCO2–EtCO2 1.0 kPa (8)');
  });

  it('is exported in its column', () => {
    const rows = timepointRows('n.pneu', checkNote('@ 08:00\nvitals etco2 38\nabg ph 7.35, pco2 45, po2 80'), { redactProse: false, shiftDays: 0 });
    expect(rows[0]!['paco2_etco2_difference_mmHg']).toBe(7);
  });
});

describe('a measured mean arterial pressure', () => {
  it('is read from `map` on a vitals line (an arterial line\'s mean), in mmHg, with no finding', () => {
    const text = '@ 08:00\nvitals map 65, bp 110/50';
    const result = checkNote(text);
    expect(result.findings.map((f) => f.code)).toEqual([]);
    const map = result.analysis.timeline.timepoints[0]!.values.get('mean_bp')!.stated;
    expect([map.value, map.unit]).toEqual([65, 'mmHg']);
  });

  it('is used rather than estimated: no MAP (BP) where one is stated', () => {
    const text = '@ 08:00\nvitals map 65, bp 110/50';
    expect(derivation(text).derived.map((d) => d.id)).not.toContain('mean_arterial_pressure');
    expect(derivation(text).notApplicable.find((d) => d.id === 'mean_arterial_pressure')?.reason).toBe('a mean arterial pressure is stated (map on the vitals line)');
  });

  it('is exported in a column added last, and never shown in kPa', () => {
    const names = exportColumns().map((c) => c.name);
    // Added after every earlier column (the findings counts close the first list), before the later ones.
    expect(names.indexOf('mean_bp_mmHg')).toBeGreaterThan(names.indexOf('findings_information'));
    expect(names.indexOf('mean_bp_mmHg')).toBe(names.indexOf('paco2_etco2_difference_mmHg') + 1);
    const text = '@ 08:00\nunits gas kPa\nvitals map 65';
    expect(timepointRows('n.pneu', checkNote(text), { redactProse: false, shiftDays: 0 })[0]!['mean_bp_mmHg']).toBe(65);
    expect(renderShow('n.pneu', checkNote(text), paint(false))).toMatch(/MAP 65 mmHg(?! \()/);
  });
});

