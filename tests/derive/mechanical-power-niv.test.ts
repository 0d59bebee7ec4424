// Mechanical power, simplified equation: 0.098 × RR × VT (L) × (Ppeak − ½ × (Pplat − PEEP)) J/min
// (Gattinoni L, Tonetti T, Cressoni M, et al., "Ventilator-related causes of lung injury: the
// mechanical power", Intensive Care Med 2016;42:1567–1575, from memory). It assumes volume control
// with a constant inspiratory flow and is not suited to pressure-shaped breaths (Becher T, van der
// Staay M, Schädler D, Frerichs I, Weiler N, "Calculation of mechanical power for pressure-controlled
// ventilation", Intensive Care Med 2019, letter: read in its opening paragraph). Non-invasive
// ventilation (IPAP over EPAP) gives pressure-supported breaths and CPAP a constant pressure under
// spontaneous breaths: no volume control, so the power is not worked out there. It used to be
// reported as missing, asking for `peep` (a key of the vent line), where EPAP or the CPAP level
// already is the end-expiratory pressure: adding it would not have given a meaningful value.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { hoverAt } from '../../server/src/core/service';
import { noteAt } from '../service/cursor';
import { derivation } from './helpers';

const NIV = 'patient sex male, height 178 cm\n@ 08:00\noxygen niv ipap 18, epap 6, fio2 0.4\nvent vt 480, peak 18, plateau 16\nvitals rr 22';
const CPAP = 'patient sex male, height 178 cm\n@ 08:00\noxygen cpap 8, fio2 0.4\nvent vt 480, peak 12, plateau 10\nvitals rr 22';

describe('mechanical power under NIV and CPAP (oxygen lines)', () => {
  for (const [name, text, device] of [['NIV', NIV, 'NIV'], ['CPAP', CPAP, 'CPAP']] as const) {
    it(`is not worked out under ${name}, is not reported as missing, and says why`, () => {
      const d = derivation(text);
      expect(d.derived.find((v) => v.id === 'mechanical_power')).toBeUndefined();
      // No request for `peep`: EPAP or the CPAP level is the end-expiratory pressure there.
      expect(d.missing.find((m) => m.id === 'mechanical_power')).toBeUndefined();
      const na = d.notApplicable.find((n) => n.id === 'mechanical_power');
      expect(na?.reason).toMatch(/^the simplified equation is for volume control with a constant flow/);
      expect(na?.reason).toContain(`under ${device}`);
      expect(na?.reason).not.toContain('peep');
      expect(na?.explained).toBe(true);
    });
  }

  it('the hover of the peak pressure under NIV gives the reason, not a request for peep', () => {
    const { result, position } = noteAt(NIV.replace('peak 18', 'peak 1|8'));
    const md = hoverAt(result, position)?.markdown ?? '';
    expect(md).toContain('Not worked out here: MP — the simplified equation is for volume control with a constant flow');
    expect(md).not.toContain('add peep');
  });

  it('is worked out again once a vent line in volume control ends the NIV', () => {
    const text = `${NIV}\n@ 09:00\nvent mode VC, rate 20, peep 8, vt 450, peak 28, plateau 26, fio2 0.5`;
    const mp = checkNote(text).analysis.derivation(1).derived.find((v) => v.id === 'mechanical_power');
    // 0.098 × 20 × 0.45 × (28 − (26 − 8) ÷ 2) = 16.758 J/min (Gattinoni 2016, from memory).
    expect(mp?.value).toBeCloseTo(0.098 * 20 * 0.45 * (28 - 18 / 2), 9);
  });
});
