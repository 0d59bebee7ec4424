// The change since the previous arterial gas in hovers: on a gas value of an abg line, on the
// timepoint line, and in the P/F ratio's inlay-hint tooltip. Invented note; P/F = PaO2 ÷ FiO2
// (ARDS Definition Task Force, Acute respiratory distress syndrome: the Berlin Definition, JAMA
// 2012): 80 ÷ 0.40 = 200 at the first gas, 60 ÷ 0.60 = 100 at the second.
import { describe, expect, it } from 'vitest';
import { hoverAt, inlayHints } from '../../server/src/core/service';
import { HINT_CATEGORIES } from '../../server/src/core/service/types';
import { checkNote } from '../../server/src/core/check-note';
import { noteAt } from './cursor';

const NOTE = [
  'patient   age 60 y, sex male, height 175 cm',
  '@ day 1 08:00  first gas',
  'vent      mode VC, vt 450 mL, rate 18, peep 8, fio2 0.4',
  'abg       ph 7.30, pco2 50, po2 80',
  '@ day 1 14:30  second gas',
  'vent      peep 10, fio2 0.6',
  'abg       ph 7.34, pco2 46, po2 60',
  '',
].join('\n');

const CHANGE = '**Since the previous arterial gas**: from timepoint 1 (first gas, day 1 08:00), 6 h 30 min earlier: PaO2 down 20 mmHg (was 80) · PaCO2 down 4 mmHg (was 50) · pH up 0.04 (was 7.30) · P/F down 100 mmHg (was 200) · FiO2 up 0.20 (was 0.40) · PEEP up 2 cmH2O (was 8).';

function hoverMarkdown(marked: string): string {
  const { result, position } = noteAt(marked);
  return hoverAt(result, position)?.markdown ?? '';
}

describe('the change since the previous arterial gas, in hovers', () => {
  it('is in the hover of a PaO2, a PaCO2 and a pH of a later gas', () => {
    for (const value of ['po2 6|0', 'pco2 4|6', 'ph 7.3|4']) {
      const md = hoverMarkdown(NOTE.replace(value.replace('|', ''), value));
      expect(md).toContain(CHANGE);
      expect(md).toContain("PaO2, PaCO2 and pH are compared only where stated at each gas's own timepoint; P/F and the settings (FiO2, O2 flow, PEEP, IPAP, EPAP, CPAP) as in force at each gas, and the oxygen device where it changed.");
    }
  });

  it('is in the hover of the later timepoint line, and in none of the first gas', () => {
    expect(hoverMarkdown(NOTE.replace('second gas', 'second |gas'))).toContain(CHANGE);
    expect(hoverMarkdown(NOTE.replace('po2 80', 'po2 8|0'))).not.toContain('Since the previous arterial gas');
    expect(hoverMarkdown(NOTE.replace('first gas', 'first |gas'))).not.toContain('Since the previous arterial gas');
  });

  it('is not in the hover of a setting on a vent line (it is no gas value)', () => {
    expect(hoverMarkdown(NOTE.replace('peep 10', 'peep 1|0'))).not.toContain('Since the previous arterial gas');
  });

  it('is under the P/F ratio in its inlay hint tooltip, and in no other tooltip', () => {
    const result = checkNote(NOTE);
    const hints = inlayHints(result, { start: 0, end: 7 }, { categories: new Set(HINT_CATEGORIES) });
    const pf = hints.filter((h) => h.position.line === 6 && h.derivedIds.includes('pf_ratio'));
    expect(pf).toHaveLength(1);
    expect(pf[0]!.tooltipMarkdown).toContain(CHANGE);
    const others = hints.filter((h) => !h.derivedIds.includes('pf_ratio'));
    expect(others.length).toBeGreaterThan(0);
    for (const h of others) expect(h.tooltipMarkdown).not.toContain('Since the previous arterial gas');
    const first = hints.filter((h) => h.position.line === 3 && h.derivedIds.includes('pf_ratio'));
    expect(first).toHaveLength(1);
    expect(first[0]!.tooltipMarkdown).not.toContain('Since the previous arterial gas');
  });

  it('on a cannula, gives the FiO2 estimated from its flow, and says what est means', () => {
    // Nasal cannula FiO2 ≈ 0.21 + 0.04 per L/min (common practice, no source): 0.29 at 2 L/min, 0.37 at 4.
    const note = '@ day 1 08:00\noxygen cannula 2 L/min\nabg ph 7.40, pco2 41, po2 62\n@ day 1 10:00\noxygen cannula 4 L/min\nabg ph 7.39, pco2 42, po2 7|0\n';
    const md = hoverMarkdown(note);
    expect(md).toContain('FiO2 est up 0.08 (was 0.29 est) · O2 flow up 2.0 L/min (was 2.0).');
    expect(md).toContain("An FiO2 marked est is a cannula's or simple mask's, estimated from its flow (a rough rule; not used for P/F).");
    expect(hoverMarkdown(NOTE.replace('po2 60', 'po2 6|0'))).not.toContain('marked est');
  });

  it('escapes the note’s label as markdown', () => {
    const md = hoverMarkdown(NOTE.replace('first gas', 'first *gas*').replace('po2 60', 'po2 6|0'));
    expect(md).toContain('from timepoint 1 (first \\*gas\\*, day 1 08:00)');
  });
});
