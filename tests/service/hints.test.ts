// Inlay hints: compact derived values at the end of the lines they belong to.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { acidBaseLabel, CAUTION, HINT_CATEGORIES, inlayHints, type HintCategory } from '../../server/src/core/service';
import type { AcidBaseFinding } from '../../server/src/core/derive/model';
import { note } from './cursor';

const ALL = { categories: new Set<HintCategory>(HINT_CATEGORIES) };
const EVERY_LINE = { start: 0, end: 10_000 };

function hintsOf(text: string, options = ALL, lines = EVERY_LINE) {
  return inlayHints(checkNote(text), lines, options);
}

function labelsByLine(text: string, options = ALL): Record<number, string> {
  const out: Record<number, string> = {};
  for (const h of hintsOf(text, options)) out[h.position.line] = `${out[h.position.line] ? `${out[h.position.line]} ` : ''}${h.label}`;
  return out;
}

const gasNote = note(
  'patient   age 60 y, sex female, height 163 cm',
  '@ day 1 08:00  on a mask',
  'oxygen    mask, fio2 0.4',
  'abg       7.28/56/71/26          # first gas',
);

describe('what the hints say', () => {
  it('after a gas line: P/F, A–a with its upper normal, and a short acid–base reading', () => {
    expect(labelsByLine(gasNote)[3]).toBe('P/F 178 · A–a 144 (≤ 19) · consistent with resp. acidosis, acute');
  });

  it('after a vent line with a plateau: driving pressure, VT per kg PBW, static compliance', () => {
    const text = note('patient sex male, height 175 cm', '@ 08:00', 'vent      mode VC, vt 420 mL, rate 20, peep 10, fio2 0.5, plateau 27');
    expect(labelsByLine(text)[2]).toBe('ΔP 17 · VT 6.0 mL/kg · Cstat 25');
  });

  it('after a place line with an altitude (header or timepoint): the barometric pressure', () => {
    const text = note('place     altitude 1650 m', '@ 08:00', 'oxygen room air', 'abg 7.40/38/60/24', '@ 12:00', 'place altitude 1200 m', 'abg 7.40/38/70/24');
    const labels = labelsByLine(text);
    expect(labels[0]).toBe('PB 630 mmHg');
    expect(labels[5]).toBe('PB 663 mmHg');
    expect(labelsByLine(note('place barometric 628 mmHg', '@ 08:00', 'abg 7.40/38/60/24'))[0]).toBeUndefined();
  });

  it('shows the header altitude\'s pressure when only the header is visible, from a later timepoint', () => {
    // The first timepoints have no gas (no value anchored there); the pressure comes with the gas.
    const text = note('place     altitude 1650 m', '', '@ 08:00', 'vitals hr 90', '@ 09:00', 'vitals hr 92', '@ 10:00', 'abg 7.40/38/60/24');
    const hints = hintsOf(text, ALL, { start: 0, end: 1 });
    expect(hints.map((h) => [h.position.line, h.label])).toEqual([[0, 'PB 630 mmHg']]);
    expect(hintsOf(text, ALL, { start: 2, end: 5 })).toEqual([]);
  });

  it('after an oxygen line with a low-flow device: the estimated FiO2', () => {
    expect(labelsByLine(note('@ 08:00', 'oxygen    cannula 3 L/min'))[1]).toBe('FiO2 ≈ 0.33 (est.)');
  });

  it('marks a value that uses a carried-forward input, and names it in the tooltip', () => {
    const text = note('patient sex male, height 175 cm', '@ 08:00  start', 'vent mode VC, vt 420 mL, peep 10, fio2 0.5', '@ 09:00', 'vent plateau 27');
    const [hint] = hintsOf(text).filter((h) => h.position.line === 4);
    expect(hint?.label).toBe('ΔP 17* · Cstat 25*');
    expect(hint?.tooltipMarkdown).toContain('\\* ΔP uses a value carried forward from an earlier timepoint:');
    expect(hint?.tooltipMarkdown).toContain('\\* Cstat uses values carried forward from an earlier timepoint:');
    expect(hint?.tooltipMarkdown).toContain('- PEEP 10 cmH2O — carried from start, line 3');
    expect(hint?.tooltipMarkdown).toContain('- VT 420 mL — carried from start, line 3');
  });

  it('goes at the end of the content, before a trailing comment, counting UTF-16 after non-ASCII text', () => {
    const text = note('@ 08:00', 'oxygen room air', 'vitals    temp 37 °C, spo2 95 %   # 😀 calm');
    const [hint] = hintsOf(text).filter((h) => h.position.line === 2);
    expect(hint?.position).toEqual({ line: 2, character: 'vitals    temp 37 °C, spo2 95 %'.length });
    expect(hint?.label).toBe('S/F 452');
  });

  it('works the same on CRLF notes', () => {
    const crlf = gasNote.replace(/\n/g, '\r\n');
    expect(hintsOf(crlf).map((h) => [h.position, h.label])).toEqual(hintsOf(gasNote).map((h) => [h.position, h.label]));
  });
});

describe('which hints are given', () => {
  it('one per line and category; later ones at the same place start with "· "', () => {
    const hints = hintsOf(gasNote).filter((h) => h.position.line === 3);
    expect(hints.map((h) => h.category)).toEqual(['oxygenation', 'acid-base']);
    expect(hints.map((h) => h.derivedIds)).toEqual([['pf_ratio', 'aa_gradient'], ['interpretation:acid-base', 'hco3_expected_acute', 'hco3_expected_chronic']]);
    expect(hints.every((h) => h.paddingLeft)).toBe(true);
  });

  it('only the requested categories', () => {
    const hints = hintsOf(gasNote, { categories: new Set<HintCategory>(['acid-base']) });
    expect(hints.map((h) => h.label)).toEqual(['consistent with resp. acidosis, acute']);
    expect(hintsOf(gasNote, { categories: new Set<HintCategory>() })).toEqual([]);
  });

  it('only lines within the requested range (both ends inclusive), and nothing past the end', () => {
    expect(hintsOf(gasNote, ALL, { start: 0, end: 2 })).toEqual([]);
    expect(hintsOf(gasNote, ALL, { start: 3, end: 3 }).length).toBe(2);
    expect(hintsOf(gasNote, ALL, { start: 50, end: 90 })).toEqual([]);
    expect(hintsOf(gasNote, ALL, { start: 5, end: 1 })).toEqual([]);
  });

  it('tooltips explain every value shown and end with the caution', () => {
    for (const h of hintsOf(gasNote)) {
      expect(h.tooltipMarkdown.trimEnd().endsWith(`_${CAUTION}_`)).toBe(true);
      expect(h.tooltipMarkdown).not.toMatch(/NaN|Infinity|undefined/);
    }
    const [oxygenation, acidBase] = hintsOf(gasNote).filter((h) => h.position.line === 3);
    expect(oxygenation?.tooltipMarkdown).toContain('**P/F ratio** (P/F): **178 mmHg**');
    expect(oxygenation?.tooltipMarkdown).toContain('With the numbers: `71 ÷ 0.40 = 178 mmHg`');
    expect(acidBase?.tooltipMarkdown).toMatch(/\*\*Acid–base reading\*\*: Consistent with/);
  });

  it('gives no hints on broken lines or notes without derived values', () => {
    expect(hintsOf('vitls hr 100\nabg 7.28/56/71/26/-2')).toEqual([]);
    expect(hintsOf('')).toEqual([]);
  });
});

/** What an acid–base reading decided: one disorder, as expected, unless `over` says otherwise. */
function finding(over: Partial<AcidBaseFinding>): AcidBaseFinding {
  return { primary: 'respiratory-acidosis', phase: null, fullyCompensated: false, anionGap: null, suspected: null, added: [], ...over };
}

describe('acidBaseLabel', () => {
  it('writes a compact form from what the reading decided', () => {
    expect(acidBaseLabel(finding({ phase: 'acute' }))).toBe('consistent with resp. acidosis, acute');
    expect(acidBaseLabel(finding({ phase: 'acute', added: ['metabolic-acidosis'] }))).toBe('consistent with resp. acidosis, acute + met. acidosis');
    expect(acidBaseLabel(finding({ primary: 'metabolic-acidosis', anionGap: 'high-anion-gap' }))).toBe('consistent with met. acidosis, high AG');
    expect(acidBaseLabel(finding({ phase: 'chronic', fullyCompensated: true }))).toBe('consistent with resp. acidosis, chronic, compensated');
    expect(acidBaseLabel(finding({ phase: 'intermediate' }))).toBe('consistent with resp. acidosis, acute on chronic?');
    expect(acidBaseLabel(finding({ phase: 'acute-or-chronic' }))).toBe('consistent with resp. acidosis');
    expect(acidBaseLabel(finding({ primary: 'metabolic-acidosis', suspected: 'respiratory-acidosis' }))).toBe('consistent with met. acidosis + resp. acidosis?');
    expect(acidBaseLabel(finding({ primary: 'metabolic-acidosis', anionGap: 'high-anion-gap', added: ['metabolic-alkalosis'], suspected: 'respiratory-alkalosis' }))).toBe('consistent with met. acidosis, high AG + met. alkalosis + resp. alkalosis?');
    expect(acidBaseLabel(finding({ suspected: 'metabolic-disorder' }))).toBe('consistent with resp. acidosis + met. disorder?');
    expect(acidBaseLabel(finding({ primary: 'mixed-acidosis' }))).toBe('consistent with mixed acidosis');
    expect(acidBaseLabel(finding({ primary: 'mixed-acidosis', anionGap: 'mixed-anion-gap' }))).toBe('consistent with mixed acidosis, mixed AG');
    expect(acidBaseLabel(finding({ primary: 'mixed-alkalosis', added: ['metabolic-acidosis'] }))).toBe('consistent with mixed alkalosis + met. acidosis');
    expect(acidBaseLabel(finding({ primary: 'undetermined' }))).toBe('acid–base unclear');
    expect(acidBaseLabel(finding({ primary: 'undetermined', added: ['metabolic-acidosis'] }))).toBe('acid–base unclear; consistent with met. acidosis');
    expect(acidBaseLabel(finding({ primary: 'normal' }))).toBe('normal pH');
    expect(acidBaseLabel(finding({ primary: 'normal', added: ['metabolic-acidosis', 'metabolic-alkalosis'] }))).toBe('normal pH; consistent with met. acidosis + met. alkalosis');
    // A gas whose pH, PaCO2 and HCO3 do not fit together (PN402) is not read: no label.
    expect(acidBaseLabel(finding({ primary: 'not-read' }))).toBeNull();
  });

  // Every interpretation says "consistent with" (project rule); the inlay label is one too.
  it('says "consistent with" before any disorder it names, and names none bare', () => {
    for (const f of [
      finding({ phase: 'acute' }),
      finding({ primary: 'metabolic-alkalosis' }),
      finding({ primary: 'mixed-alkalosis' }),
      finding({ primary: 'normal', added: ['metabolic-acidosis'] }),
      finding({ primary: 'undetermined', suspected: 'metabolic-disorder' }),
    ]) {
      const label = acidBaseLabel(f)!;
      const at = label.search(/acidosis|alkalosis|disorder/);
      expect(at, label).toBeGreaterThan(0);
      expect(label.slice(0, at), label).toContain('consistent with ');
    }
  });
});
