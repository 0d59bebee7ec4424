// Minute ventilation VE = VT × RR (standard respiratory mechanics, common practice, no single
// source) needs the rate the patient breathes at. In pressure support and CPAP the patient sets
// that rate: the modes deliver no mandatory breath, and a rate set there is a backup (apnoea) rate,
// given only if the patient stops breathing (common practice, no source). So VT × a backup rate is
// no minute ventilation: it used to be shown (450 mL × 12 = 5.4 L/min for a patient breathing at
// any rate), and the mechanical power (Gattinoni L et al., "Ventilator-related causes of lung
// injury: the mechanical power", Intensive Care Med 2016;42:1567–1575) and the ventilatory ratio
// (Sinha P et al., "Ventilatory ratio: a simple bedside measure of ventilation", Br J Anaesth
// 2009;102:692–697) followed from it. The measured rate (vitals `rr`) or the measured minute volume
// (`ve`) gives them instead.
import { describe, expect, it } from 'vitest';
import { derivation, derived } from './helpers';

const HEADER = 'patient sex male, height 178 cm\n@ 08:00\n';
const PS = `${HEADER}vent mode PS, ps 10, peep 5, vt 450, rate 12, fio2 0.4, peak 15, plateau 14\nabg 7.40/40/80/24`;

describe('a set rate in a spontaneous mode is a backup rate, not the rate of breathing', () => {
  it('gives no minute ventilation, mechanical power or ventilatory ratio in PS, and asks for the measured rate', () => {
    const d = derivation(PS);
    for (const id of ['minute_ventilation', 'mechanical_power', 'ventilatory_ratio']) expect(d.derived.find((v) => v.id === id), id).toBeUndefined();
    expect(d.missing.find((m) => m.id === 'minute_ventilation')?.message).toBe('add rr to get VE');
  });

  it('does the same in CPAP', () => {
    const d = derivation(`${HEADER}vent mode CPAP, peep 5, rate 10, vt 400\nabg 7.40/40/80/24`);
    expect(d.derived.find((v) => v.id === 'minute_ventilation')).toBeUndefined();
    expect(d.missing.find((m) => m.id === 'minute_ventilation')?.needs).toEqual(['rr']);
  });

  it('uses the measured rate there: 450 mL × 24 /min = 10.8 L/min', () => {
    const ve = derived(`${PS}\nvitals rr 24`, 'minute_ventilation');
    expect(ve.value).toBeCloseTo(10.8, 10);
    expect(ve.inputs.map((t) => t.name)).toEqual(['VT', 'RR']);
  });

  it('uses the measured minute volume for the ventilatory ratio: 9,000 mL/min × 40 ÷ (73.3 kg × 100 × 37.5) = 1.31', () => {
    // PBW, male 178 cm: 50 + 0.91 × (178 − 152.4) = 73.296 kg (ARDS Network, NEJM 2000;342:1301–1308).
    expect(derived(PS.replace('rate 12', 'rate 12, ve 9'), 'ventilatory_ratio').value).toBeCloseTo((9000 * 40) / (73.296 * 100 * 37.5), 10);
  });

  it('still uses the set rate in modes with mandatory breaths, and where no mode is written', () => {
    expect(derived(PS.replace('mode PS, ps 10', 'mode VC'), 'minute_ventilation').value).toBeCloseTo(5.4, 10);
    expect(derived(PS.replace('mode PS, ps 10, ', ''), 'minute_ventilation').value).toBeCloseTo(5.4, 10);
  });
});
