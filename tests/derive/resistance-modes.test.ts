// Inspiratory airway resistance (Ppeak − Pplat) ÷ flow holds where the ventilator gives a set,
// constant inspiratory flow: the peak then exceeds the plateau by the flow times the resistance
// (respiratory mechanics, common practice, no source). The field registry holds the inspiratory
// flow a setting in the volume family, VC, SIMV and SIMV-VC (fields/modes.ts), so the resistance of
// a mandatory breath's peak and plateau is worked out there; not under PRVC or pressure-set modes,
// where the flow decelerates, and there the reason is shown where the value would have been.
import { describe, expect, it } from 'vitest';
import { derivation } from './helpers';

const note = (mode: string) => `@ 08:00\nvent mode ${mode}, vt 450 mL, rate 12, peep 8, fio2 0.4, plateau 22, peak 30, flow 54 L/min`;
const raw = (text: string) => derivation(text).derived.find((v) => v.id === 'airway_resistance')?.value;

describe('airway resistance by mode', () => {
  it('is worked out under every volume-controlled mode with a set constant flow', () => {
    // (30 − 22) ÷ (54 ÷ 60) = 8 ÷ 0.9 = 8.9 cmH2O/L/s (common practice, no source).
    for (const mode of ['VC', 'SIMV', 'SIMV-VC']) expect(raw(note(mode)), mode).toBeCloseTo(8 / 0.9, 9);
  });

  it('is not worked out where the flow is not set, and says why where it would have been', () => {
    for (const mode of ['PRVC', 'PC', 'SIMV-PC', 'PS']) {
      const d = derivation(note(mode));
      expect(d.derived.find((v) => v.id === 'airway_resistance'), mode).toBeUndefined();
      const na = d.notApplicable.find((n) => n.id === 'airway_resistance');
      expect(na?.reason, mode).toBe('holds only for a set, constant inspiratory flow (VC, SIMV, SIMV-VC), where the peak exceeds the plateau by flow × resistance');
      expect(na?.explained, mode).toBe(true);
    }
  });
});

describe('airway resistance where only one pressure is written', () => {
  it('says nothing of the mode where a pressure is missing', () => {
    const d = derivation('@ 08:00\nvent mode PC, pinsp 15, rate 14, peep 8, fio2 0.4, peak 23');
    expect(d.notApplicable.find((n) => n.id === 'airway_resistance')?.explained ?? false).toBe(false);
  });
});
