// Predicted body weight by the ARDS Network equation (The Acute Respiratory Distress Syndrome Network.
// Ventilation with lower tidal volumes as compared with traditional tidal volumes for acute lung injury
// and the acute respiratory distress syndrome. N Engl J Med 2000;342:1301–1308, from memory: female
// 45.5 + 0.91 × (height cm − 152.4), male 50 + 0.91 × (height cm − 152.4)) has its base at 152.4 cm
// (60 inches): below it the line goes under its base weight, and the equation was not validated there.
// The hover and JSON said so in a note; `show` printed the PBW, the tidal volume per kg and the
// ventilatory ratio without it, and so did the inlay hint of VT/PBW. They now carry the caveat
// "height < 152.4 cm" beside the number, as the S/F ratio carries "SpO2 > 97 %". Invented patients.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { inlayHints } from '../../server/src/core/service';
import { derivedHover } from '../../server/src/core/service';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';

const note = (height: string) => `patient age 54 y, sex female, height ${height}\n@ day 1 08:00\nvent mode VC, vt 300, rate 20, peep 8, fio2 0.5\nabg ph 7.36, pco2 46, po2 82, hco3 25\n`;
const derivedOf = (text: string) => checkNote(text).analysis.derivation(0).derived;
const value = (text: string, id: string) => derivedOf(text).find((d) => d.id === id)!;
const mechanicsHints = (text: string) => {
  const result = checkNote(text);
  return inlayHints(result, { start: 0, end: result.analysis.tree.lines.length - 1 }, { categories: new Set(['mechanics']) }).map((h) => h.label);
};
const shown = async (text: string) => {
  const io = memoryIo({ stdin: text, env: { NO_COLOR: '1' }, tty: false });
  await run(['show', '-'], io);
  return io.out();
};
const NOTE = 'below 152.4 cm the equation was not validated (short adults)';

describe('a predicted body weight from a height below 152.4 cm, and what is computed from it', () => {
  it('the PBW, VT/PBW and the ventilatory ratio carry the caveat "height < 152.4 cm" and its note', () => {
    // 45.5 + 0.91 × (150 − 152.4) = 43.316 kg; 300 ÷ 43.316 = 6.93 mL/kg (ARDS Network 2000).
    const text = note('150 cm');
    expect(value(text, 'predicted_body_weight').value).toBeCloseTo(43.316, 3);
    for (const id of ['predicted_body_weight', 'vt_per_kg_pbw', 'ventilatory_ratio']) {
      expect([id, value(text, id).caveat]).toEqual([id, 'height < 152.4 cm']);
      expect(value(text, id).notes).toContain(NOTE);
    }
    // VT/PBW keeps its own note, the lung-protective range, before it.
    expect(value(text, 'vt_per_kg_pbw').notes).toEqual(['lung-protective target 6 mL/kg (4–8) in the ARDS Network protocol', NOTE]);
    expect(derivedHover(value(text, 'vt_per_kg_pbw'))).toContain(NOTE);
  });

  it('from 152.4 cm none: the equation\'s base (45.5 kg for a woman) and above', () => {
    for (const height of ['152.4 cm', '165 cm']) {
      for (const id of ['predicted_body_weight', 'vt_per_kg_pbw', 'ventilatory_ratio']) {
        expect(value(note(height), id).notes).not.toContain(NOTE);
        expect([height, id, value(note(height), id).caveat]).toEqual([height, id, null]);
      }
    }
    // 45.5 + 0.91 × 0 = 45.5 kg at 152.4 cm.
    expect(value(note('152.4 cm'), 'predicted_body_weight').value).toBeCloseTo(45.5, 6);
  });

  it('`pneumark show` writes the caveat beside the PBW, VT/PBW and VR', async () => {
    const out = await shown(note('150 cm'));
    expect(out).toContain('PBW 43.3 kg (height < 152.4 cm)');
    expect(out).toContain('VT/PBW 6.9 mL/kg (height < 152.4 cm)');
    expect(out).toMatch(/VR \d+\.\d\d \(height < 152\.4 cm\)/);
    expect(await shown(note('165 cm'))).not.toContain('152.4');
  });

  it('the inlay hint of VT/PBW writes it too', () => {
    expect(mechanicsHints(note('150 cm'))).toEqual(['VT 6.9 mL/kg (height < 152.4 cm)']);
    // 45.5 + 0.91 × 12.6 = 56.97 kg; 300 ÷ 56.97 = 5.27 mL/kg.
    expect(mechanicsHints(note('165 cm'))).toEqual(['VT 5.3 mL/kg']);
  });
});
