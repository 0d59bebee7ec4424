// Converting every gas pressure of a note between mmHg and kPa (the code action) must not move a
// value across a threshold a check or a reading uses: a PaO2 just inside the alveolar limit
// (PN401) or a PaCO2 at the edge of the HCO3 tolerance (PN402) stays where it was, and every
// reading keeps its band. Rounding a PaO2 of 101 mmHg to 13.5 kPa (101.26 mmHg) did not.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkNote, type NoteResult } from '../../server/src/core/check-note';
import { convertNoteUnits } from '../../server/src/core/service/unit-conversion';
import { applyEdits } from '../../server/src/core/service/text-edits';

/**
 * What must not change, per timepoint: the physiology findings (PN4xx) and each reading with its
 * numbers, units and parenthesised conversions taken out (`PaO2 10.3 kPa (77 mmHg): consistent
 * with …` and `PaO2 77 mmHg: consistent with …` read alike).
 */
function outcome(result: NoteResult): string[] {
  const tps = result.analysis.timeline.timepoints;
  return tps.map((tp) => {
    const codes = result.findings
      .filter((f) => f.code.startsWith('PN4') && f.range.start.line >= tp.startLine && f.range.start.line <= tp.endLine)
      .map((f) => f.code)
      .sort();
    const readings = result.analysis.derivation(tp.index).interpretations.map((i) => {
      let text = i.text;
      for (let before = ''; before !== text;) {
        before = text;
        text = text.replace(/\s*\([^()]*\d[^()]*\)/g, '');
      }
      return `${i.topic}${i.notable ? '!' : ''}: ${text.replace(/-?\d+(?:\.\d+)?/g, '#').replace(/\s*\b(kPa|mmHg)\b/g, '')}`;
    });
    return `${codes.join(' ')} | ${readings.join(' | ')}`;
  });
}

function converted(text: string, to: 'mmHg' | 'kPa'): string {
  return applyEdits(text, convertNoteUnits(checkNote(text), to));
}

function expectSameOutcome(text: string, to: 'mmHg' | 'kPa'): void {
  const after = converted(text, to);
  expect(outcome(checkNote(after)), `${text}\n→\n${after}`).toEqual(outcome(checkNote(text)));
}

describe('converting a note keeps its findings and reading bands', () => {
  it('a PaO2 on the alveolar limit (PN401) in mmHg, written in kPa', () => {
    // Simplified alveolar gas equation (Fenn, Rahn & Otis 1946, from memory; common practice):
    // 0.21 × (760 − 47) − 43 ÷ 0.8 = 95.98 mmHg; PN401 fires more than 5 mmHg above it.
    expectSameOutcome('@ day 1 08:00\noxygen room air\nabg ph 7.40, pco2 43, po2 101, hco3 24\n', 'kPa');
    expectSameOutcome('@ day 1 08:00\noxygen room air\nabg ph 7.40, pco2 38, po2 107, hco3 24\n', 'kPa');
  });

  it('an HCO3 at the edge of the tolerance (PN402), and the acid–base band', () => {
    // Henderson–Hasselbalch, 0.0307 × 40 × 10^1.3 = 24.5 mmol/L: 22 is 2.5 away, beyond max(2, 10 %).
    expectSameOutcome('@ day 1 08:00\nabg ph 7.40, pco2 40, po2 90, hco3 22\n', 'kPa');
    expectSameOutcome('@ day 1 08:00\nabg ph 7.40, pco2 35, po2 90, hco3 19.5\n', 'kPa');
  });

  it('a kPa value no one mmHg number reads as is kept in kPa, with its unit', () => {
    // 6.7 kPa stands for 6.65–6.75 kPa (49.9–50.6 mmHg): at the hypercapnia threshold of 50 mmHg
    // (common practice, no source), and within the HCO3 tolerance of PN402 only at its upper end
    // (Henderson–Hasselbalch: 0.0307 × 50.6 × 10^1.3 = 31.0 mmol/L, 3.0 from 34, within 10 %).
    const text = 'units gas kPa\n@ day 1 08:00\noxygen room air\nabg ph 7.40, pco2 6.7, po2 11.0, hco3 34\n';
    const after = converted(text, 'mmHg');
    expect(after).toContain('pco2 6.7 kPa, po2 11.0 kPa');
    expect(after).toContain('units gas mmHg');
    expectSameOutcome(text, 'mmHg');
  });

  it('a usual value stays usual: EtCO2 1 kPa is 10 mmHg, not 8 (PN302)', () => {
    // 1 kPa = 7.50 mmHg (1 mmHg = 133.322387415 Pa, NIST SP 811, from memory); written to a whole
    // kPa it stands for 0.5–1.5 kPa, which reaches the usual 10 mmHg of end-tidal CO2 (Pneumark's
    // usual range). 8 mmHg, read as exact, would be unusual; 10 mmHg is still 1 kPa to a whole kPa.
    const text = 'units gas kPa\n@ day 1 08:00\nvitals etco2 1 kPa\n';
    const after = converted(text, 'mmHg');
    expect(after).toContain('etco2 10 mmHg');
    expect(checkNote(after).findings.map((f) => f.code)).toEqual(checkNote(text).findings.map((f) => f.code));
    expect(converted(after, 'kPa')).toContain('etco2 1.3 kPa');
  });

  it('values near the thresholds, in mmHg to kPa and back (property)', () => {
    fc.assert(fc.property(
      fc.integer({ min: 85, max: 125 }), fc.integer({ min: 28, max: 62 }), fc.integer({ min: 0, max: 40 }), fc.constantFrom('7.30', '7.35', '7.40', '7.45'), fc.constantFrom('room air', 'fio2 0.25', 'fio2 0.3'),
      (po2, pco2, hco3Halves, ph, oxygen) => {
        const hco3 = 14 + hco3Halves / 2;
        const text = `@ day 1 08:00\noxygen ${oxygen}\nabg ph ${ph}, pco2 ${pco2}, po2 ${po2}, hco3 ${hco3}\n`;
        expectSameOutcome(text, 'kPa');
        const kpa = converted(text, 'kPa');
        expectSameOutcome(kpa, 'mmHg');
      },
    ), { numRuns: 250 });
  });

  it('values near the thresholds, written in kPa, to mmHg (property)', () => {
    fc.assert(fc.property(
      fc.integer({ min: 110, max: 170 }), fc.integer({ min: 38, max: 82 }), fc.integer({ min: 0, max: 40 }), fc.constantFrom('7.30', '7.35', '7.40', '7.45'),
      (po2Tenths, pco2Tenths, hco3Halves, ph) => {
        const hco3 = 14 + hco3Halves / 2;
        const text = `units gas kPa\n@ day 1 08:00\noxygen room air\nabg ph ${ph}, pco2 ${(pco2Tenths / 10).toFixed(1)}, po2 ${(po2Tenths / 10).toFixed(1)}, hco3 ${hco3}\n`;
        expectSameOutcome(text, 'mmHg');
      },
    ), { numRuns: 250 });
  });
});
