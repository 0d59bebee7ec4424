// Mechanical power, simplified equation: 0.098 × RR × VT (L) × (Ppeak − ½ × (Pplat − PEEP)) J/min
// (Gattinoni L, Tonetti T, Cressoni M, et al., "Ventilator-related causes of lung injury: the
// mechanical power", Intensive Care Med 2016;42:1567–1575). The equation assumes volume control with
// a constant inspiratory flow, the airway pressure rising in a straight line during inspiration, and
// is not suited to pressure-controlled breaths, whose pressure is square (Becher T, van der Staay M,
// Schädler D, Frerichs I, Weiler N, "Calculation of mechanical power for pressure-controlled
// ventilation", Intensive Care Med 2019, letter: read in its opening paragraph). Becher's own
// equations for those modes were not read in full (only recalled, from memory), so Pneumark does not
// compute the power there and says why.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { hoverAt } from '../../server/src/core/service';
import { noteAt } from '../service/cursor';
import { derivation } from './helpers';
import { renderDerived } from '../../server/src/cli/render-derived';
import { Legend } from '../../server/src/cli/render-legend';
import { paint } from '../../server/src/cli/colour';

const plain = paint(false);

const NOTE = (mode: string) => `patient sex male, height 178 cm\n@ 08:00\nvent mode ${mode}, rate 20, peep 8, vt 450, peak 28, plateau 26, fio2 0.5`;

describe('mechanical power by mode', () => {
  it('is worked out in volume control: 0.098 × 20 × 0.45 × (28 − 18 ÷ 2) = 16.758 J/min', () => {
    const mp = derivation(NOTE('VC')).derived.find((v) => v.id === 'mechanical_power');
    expect(mp?.value).toBeCloseTo(0.098 * 20 * 0.45 * (28 - 18 / 2), 9);
  });

  it('is still worked out where no mode is written (nothing says the breaths are not volume-controlled)', () => {
    const text = NOTE('VC').replace('mode VC, ', '');
    expect(derivation(text).derived.find((v) => v.id === 'mechanical_power')?.value).toBeCloseTo(16.758, 9);
  });

  for (const mode of ['PC', 'PRVC', 'PS', 'SIMV', 'APRV']) {
    it(`is not worked out in ${mode}, and says why`, () => {
      const d = derivation(NOTE(mode).replace('rate 20', mode === 'PS' ? 'rate 20, ps 12' : 'rate 20') + '\nvitals rr 20');
      expect(d.derived.find((v) => v.id === 'mechanical_power'), mode).toBeUndefined();
      expect(d.missing.find((m) => m.id === 'mechanical_power'), mode).toBeUndefined();
      expect(d.notApplicable.find((n) => n.id === 'mechanical_power')?.reason).toMatch(/^the simplified equation is for volume control with a constant flow/);
    });
  }

  // Under SIMV and SIMV-VC the mandatory breaths are volume-controlled with a set constant flow, as
  // under VC (fields/modes.ts): "shaped otherwise" was wrong of them. What the equation does not fit
  // there is the patient's own breaths between them, pressure-supported, which the rate counts too
  // (common practice, no source; Becher 2019 for pressure-shaped breaths).
  for (const mode of ['SIMV', 'SIMV-VC']) {
    it(`in ${mode} says that the breaths between the mandatory ones are what the equation does not fit`, () => {
      const d = derivation(NOTE(mode) + '\nvitals rr 20');
      expect(d.notApplicable.find((n) => n.id === 'mechanical_power')?.reason).toBe(
        `the simplified equation is for volume control with a constant flow, the airway pressure rising in a straight line through inspiration; in ${mode} the mandatory breaths are so, but the patient's own breaths between them are pressure-supported and the rate counts them too, and pressure-supported breaths need equations of their own (Becher T et al., Intensive Care Med 2019)`,
      );
    });
  }

  it('a mode carried from an earlier timepoint counts', () => {
    const d = derivation(`${NOTE('PC')}\n@ 09:00\nvent peak 27, plateau 25`);
    expect(d.derived.find((v) => v.id === 'mechanical_power')).toBeUndefined();
  });

  it('the `show` output and the hover give the reason in PC, not a value', () => {
    const result = checkNote(NOTE('PC'));
    const d = result.analysis.derivation(0);
    expect(d?.notApplicable.find((n) => n.id === 'mechanical_power')?.reason).toContain('in PC');
    const { result: r, position } = noteAt(NOTE('PC').replace('peak 28', 'peak 2|8'));
    const md = hoverAt(r, position)?.markdown ?? '';
    expect(md).not.toMatch(/MP \d/);
    expect(md).toContain('Not worked out here: MP — the simplified equation is for volume control with a constant flow');
    // In VC the hover of the peak gives the value instead.
    const vc = noteAt(NOTE('VC').replace('peak 28', 'peak 2|8'));
    expect(hoverAt(vc.result, vc.position)?.markdown ?? '').not.toContain('Not worked out here');
  });

  it('the `show` output of the command line says why, where the value would have been', () => {
    const lines = renderDerived(checkNote(NOTE('PC')).analysis.timeline.timepoints[0]!, checkNote(NOTE('PC')).analysis.derivation(0), plain, new Legend());
    expect(lines.find((l) => l.includes('MP'))).toMatch(/^ {2}n\/a {6}MP: the simplified equation is for volume control with a constant flow.*in PC/);
  });
});
