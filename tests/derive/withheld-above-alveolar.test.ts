// A PaO2 above the alveolar PO2 that the FiO2, pressure and PaCO2 allow cannot be (PN401): nothing
// computed from it is shown, and what people read names each value withheld where it would have
// been. Worked numbers: the simplified alveolar gas equation, PAO2 = FiO2 × (PB − 47) − PaCO2 ÷ 0.8
// (Fenn, Rahn & Otis 1946; Riley & Cournand 1949 — from memory): on FiO2 0.21 at 760 mmHg with
// PaCO2 60, 0.21 × 713 − 75 = 74.7 mmHg, so a PaO2 of 160 is impossible. P/F = PaO2 ÷ FiO2 (ARDS
// Definition Task Force, JAMA 2012); OI = FiO2 × MAP × 100 ÷ PaO2 (Ortiz et al. 1987, from memory);
// CaO2 = 1.34 × Hb × SaO2 + 0.003 × PaO2 (common practice, no source).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { timepointRows } from '../../server/src/core/export';
import { HINT_CATEGORIES, hoverAt, inlayHints, type HintCategory } from '../../server/src/core/service';
import { renderDerived } from '../../server/src/cli/render-derived';
import { Legend } from '../../server/src/cli/render-legend';
import { paint } from '../../server/src/cli/colour';
import { noteAt } from '../service/cursor';

const impossible = [
  'patient age 60 y',
  '@ 08:00',
  'vent mode VC, fio2 0.21, map 12, peep 5',
  'abg 7.40/60/160/36, sao2 97, hb 12',
  'vitals co 5',
].join('\n');
const GAS_LINE = 3;

const WITHHELD = ['aa_gradient', 'a_to_A_ratio', 'pf_ratio', 'oxygenation_index', 'cao2', 'do2'];

describe('values computed from a PaO2 that PN401 says cannot be', () => {
  it('are withheld, each saying which finding withholds it; nothing else from that PaO2 is derived', () => {
    expect(0.21 * (760 - 47) - 60 / 0.8).toBeCloseTo(74.7, 1);
    const result = checkNote(impossible);
    expect(result.findings.map((f) => f.code)).toContain('PN401');
    const d = result.analysis.derivation(0);
    for (const id of WITHHELD) {
      expect(d.derived.find((v) => v.id === id), id).toBeUndefined();
      expect(d.notApplicable.find((n) => n.id === id)?.withheldBy, id).toBe('PN401');
    }
    // The S/F ratio and OSI rest on the SpO2, not the PaO2: not withheld (none here, no SpO2).
    expect(d.notApplicable.filter((n) => n.withheldBy !== null).map((n) => n.id).sort()).toEqual([...WITHHELD].sort());
  });

  it('are shown as usual once the PaO2 is possible: P/F 60 ÷ 0.21 = 286, OI 0.21 × 12 × 100 ÷ 60 = 4.2', () => {
    const d = checkNote(impossible.replace('/160/', '/60/')).analysis.derivation(0);
    expect(d.derived.find((v) => v.id === 'pf_ratio')?.value).toBeCloseTo(60 / 0.21, 6);
    expect(d.derived.find((v) => v.id === 'oxygenation_index')?.value).toBeCloseTo((0.21 * 12 * 100) / 60, 6);
    expect(d.notApplicable.filter((n) => n.withheldBy !== null)).toEqual([]);
  });

  it('withhold the altitude-adjusted P/F too, below sea level, and say nothing of it near sea level', () => {
    // West's model atmosphere at 3,000 m: PB ≈ 526 mmHg (West JB, J Appl Physiol 1996, its equation read in a reproduction);
    // PAO2 on air = 0.21 × (526 − 47) − 40 ÷ 0.8 ≈ 51 mmHg, so a PaO2 of 160 cannot be.
    const high = checkNote('place altitude 3000 m\n@ 08:00\nvent mode VC, fio2 0.21, peep 5\nabg 7.40/40/160/24').analysis.derivation(0);
    expect(high.notApplicable.find((n) => n.id === 'pf_ratio_altitude_adjusted')?.withheldBy).toBe('PN401');
    const sea = checkNote(impossible).analysis.derivation(0);
    expect(sea.notApplicable.find((n) => n.id === 'pf_ratio_altitude_adjusted')?.withheldBy ?? null).toBeNull();
    expect(sea.missing.map((m) => m.id)).not.toContain('pf_ratio_altitude_adjusted');
  });

  it('inlay hints: where P/F and A–a would be, `P/F, A–a withheld (PN401)`, with the reason in the tooltip; CaO2 likewise', () => {
    const hints = inlayHints(checkNote(impossible), { start: 0, end: 100 }, { categories: new Set<HintCategory>(HINT_CATEGORIES) });
    const labels = hints.filter((h) => h.position.line === GAS_LINE).map((h) => h.label);
    expect(labels).toContain('P/F, A–a withheld (PN401)');
    expect(labels.join(' ')).toContain('CaO2 withheld (PN401)');
    expect(labels.join(' ')).not.toMatch(/P\/F \d/);
    const pf = hints.find((h) => h.label.startsWith('P/F, A–a withheld'))!;
    expect(pf.derivedIds).toEqual(['pf_ratio', 'aa_gradient']);
    expect(pf.tooltipMarkdown).toContain('**P/F ratio**: withheld, as the PaO2 is above the alveolar PO2 that the FiO2, pressure and PaCO2 in force allow (see PN401).');
  });

  it('hovers: the PaO2 names the values it would feed, the timepoint lists them', () => {
    const marked = impossible.replace('/160/', '/1|60/');
    const { result, position } = noteAt(marked);
    const md = hoverAt(result, position)?.markdown ?? '';
    expect(md).toContain('Withheld here: A–a, a/A, P/F, OI — the PaO2 is above the alveolar PO2 that the FiO2, pressure and PaCO2 in force allow (see PN401).');
    expect(md).not.toMatch(/P\/F \d/);
    const at = noteAt(impossible.replace('@ 08:00', '@ 08|:00'));
    const tp = hoverAt(at.result, at.position)?.markdown ?? '';
    expect(tp).toContain('**Withheld**');
    expect(tp).toContain('- P/F ratio (P/F): the PaO2 is above the alveolar PO2');
    expect(tp).not.toMatch(/P\/F\)?: \*\*\d/);
  });

  it('`show`: one line names the values withheld and why, and the derived line has none of them', () => {
    const result = checkNote(impossible);
    const legend = new Legend();
    const lines = renderDerived(result.analysis.timeline.timepoints[0]!, result.analysis.derivation(0), paint(false), legend);
    expect(lines).toContain('  withheld A–a · a/A · P/F · OI · CaO2 · DO2: the PaO2 is above the alveolar PO2 that the FiO2, pressure and PaCO2 in force allow (see PN401)');
    expect(lines.find((l) => l.includes('derived'))).not.toMatch(/P\/F|CaO2|OI/);
    // The legend explains the short names of the withheld values too.
    expect(legend.lines(paint(false)).join('\n')).toMatch(/^ {2}OI +Oxygenation index/m);
  });

  it('export: the cells of the withheld values are empty, the PaO2 itself is exported as written', () => {
    const [row] = timepointRows('note.pneu', checkNote(impossible), { redactProse: false, shiftDays: 0 });
    expect(row!['pao2_mmHg']).toBe(160);
    for (const name of ['pf_ratio', 'a_to_A_ratio', 'oxygenation_index', 'cao2_mL_dL', 'do2_mL_min', 'aa_gradient_mmHg']) expect(row![name], name).toBeNull();
  });
});
