/**
 * What to add where a value for an input was written but is kept out of the calculations: the
 * missing text names that one (`a usable pco2 (the one on line 3 is not used: see PN204)`), not
 * `add pco2` as if nothing had been written. Invented notes.
 */
import { describe, expect, it } from 'vitest';
import { derivation } from './helpers';
import { checkNote } from '../../server/src/core/check-note';
import { hoverAt } from '../../server/src/core/service';
import { timepointsJson } from '../../server/src/cli/timepoints-json';

function message(text: string, id: string): string | undefined {
  return derivation(text).missing.find((m) => m.id === id)?.message;
}

describe('missing inputs written but not used', () => {
  it('names a bare gas pressure doubted as kPa (PN204) as the one to mend', () => {
    const note = '@ 08:00\noxygen venturi, fio2 0.4\nabg ph 7.35, pco2 5.3, po2 88';
    expect(message(note, 'pao2_alveolar')).toBe('add a usable pco2 (the one on line 3 is not used: see PN204) to get PAO2');
    expect(message(note, 'hco3_calculated')).toBe('add a usable pco2 (the one on line 3 is not used: see PN204) to get HCO3 calc');
    // Through the value it is read from: the A–a gradient lacks the PAO2's input.
    expect(derivation(note).missing.find((m) => m.id === 'aa_gradient')?.needs).toEqual(['a usable pco2 (the one on line 3 is not used: see PN204)']);
  });

  it('names a bicarbonate written with a unit the field does not take, where the anion gap needs one', () => {
    const note = '@ 08:00\nlabs na 140, cl 100, hco3 50 mmol';
    // `hco3 50 mmol`: a unit the field does not take, so the laboratory's bicarbonate is not used.
    expect(message(note, 'anion_gap')).toBe('add a usable hco3 (the one on line 2 is not used: see its finding) to get AG');
  });

  it('names a value written with a unit the field does not take', () => {
    const note = '@ 08:00\noxygen venturi, fio2 0.4\nabg ph 7.35, pco2 40, po2 88 L';
    expect(message(note, 'pf_ratio')).toBe('add a usable po2 (the one on line 3 is not used: see its finding) to get P/F');
  });

  it('names a value beyond the hard bounds of its field', () => {
    const note = '@ 08:00\noxygen venturi, fio2 0.4\nabg ph 7.35, pco2 40, po2 3000';
    expect(message(note, 'pf_ratio')).toBe('add a usable po2 (the one on line 3 is not used: see its finding) to get P/F');
    expect(message('@ 08:00\noxygen venturi, fio2 0.4\nabg ph 9.1, pco2 40, po2 90', 'hco3_calculated')).toBe('add a usable ph (the one on line 3 is not used: see its finding) to get HCO3 calc');
  });

  it('names a carried setting that is not used, with its line', () => {
    const note = '@ 08:00\nvent mode VC, vt 450, rate 14, peep 90, fio2 0.5\n@ 09:00\nvent plateau 26, vt 450\nabg 7.40/40/90/24';
    expect(message(note, 'driving_pressure')).toBe('add a usable peep (the one on line 2 is not used: see its finding) to get ΔP');
  });

  it('names a bare PaO2 doubted as kPa (PN204) where the P/F needs it', () => {
    // 11.2 mmHg is below the PaO2's doubt window (20 mmHg); 11.2 kPa is ordinary.
    const note = '@ 08:00\noxygen venturi, fio2 0.4\nabg ph 7.40, pco2 40, po2 11.2';
    expect(message(note, 'pf_ratio')).toBe('add a usable po2 (the one on line 3 is not used: see PN204) to get P/F');
  });

  it('names an impossible PEEP stated at this timepoint', () => {
    const note = '@ 08:00\nvent mode VC, vt 450, rate 14, peep 90, fio2 0.5\nvent plateau 25\nabg 7.40/40/90/24';
    expect(message(note, 'compliance_static')).toBe('add a usable peep (the one on line 2 is not used: see its finding) to get Cstat');
  });

  it('names a patient-line value that is not used, and a measured rate', () => {
    // A bare age of 300 is doubted as another unit (PN204).
    expect(message('patient age 300\n@ 08:00\noxygen venturi, fio2 0.4\nabg 7.40/40/90/24', 'aa_gradient_upper_normal')).toBe('add a usable age (the one on line 1 is not used: see PN204) to get A–a normal');
    expect(message('@ 08:00\noxygen hfnc 40, fio2 0.5\nvitals spo2 93, rr 900', 'rox_index')).toBe('add a usable rr (the one on line 3 is not used: see its finding) to get ROX');
  });

  it('still says `add …` where nothing was written', () => {
    const note = '@ 08:00\noxygen venturi, fio2 0.4\nabg ph 7.35, po2 88';
    expect(message(note, 'pao2_alveolar')).toBe('add pco2 to get PAO2');
    expect(message('@ 08:00\nabg 7.40/40/95/24', 'pf_ratio')).toBe('add fio2 (or an oxygen line) to get P/F');
    expect(message('@ 08:00\nvent mode VC, vt 450, rate 14, fio2 0.5\nvent plateau 25\nabg 7.40/40/90/24', 'driving_pressure')).toBe('add peep to get ΔP');
  });
});

describe('where the missing text is shown', () => {
  const note = '@ 08:00\noxygen venturi, fio2 0.4\nabg ph 7.35, pco2 5.3, po2 88';
  const wanted = 'add a usable pco2 (the one on line 3 is not used: see PN204) to get';

  it('in the hover of the timepoint line', () => {
    const hover = hoverAt(checkNote(note), { line: 0, character: 0 });
    expect(hover?.markdown).toContain('**Could be derived**');
    expect(hover?.markdown).toContain(wanted);
    expect(hover?.markdown).not.toMatch(/add pco2\b/);
  });

  it("in the JSON of the timepoints (`missing`: needs and message)", () => {
    const [tp] = timepointsJson(checkNote(note));
    const alveolar = tp?.missing.find((m) => m.id === 'pao2_alveolar');
    expect(alveolar?.needs).toEqual(['a usable pco2 (the one on line 3 is not used: see PN204)']);
    expect(alveolar?.message).toBe(`${wanted} PAO2`);
  });
});
