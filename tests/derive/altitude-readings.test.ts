// Type 1 and type 2 respiratory failure and the mechanism of hypoxaemia at sea level (PB 760 mmHg)
// and at altitude (PB 600 mmHg), for invented patients. Inspired PO2 (humidified) = FiO2 × (PB − 47):
// 0.21 × 713 = 149.7 mmHg at 760, 0.21 × 553 = 116.1 mmHg at 600 (dry: 0.21 × PB = 159.6 and 126 mmHg)
// (common practice). Alveolar PO2 = PiO2 − PaCO2 ÷ 0.8 (simplified alveolar gas equation; Fenn, Rahn
// & Otis 1946, Riley & Cournand 1949, from memory). Upper normal A–a gradient age ÷ 4 + 4 (common
// practice, no source). Hypoxaemia PaO2 < 60 mmHg, hypercapnia PaCO2 > 50 mmHg (common practice, no
// source). Low inspired oxygen: PiO2 below 140 mmHg (Pneumark's convention, interpret.ts).
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { Settings } from '../../server/src/core/settings';
import { derivation, derived, readings } from './helpers';

const at = (pb: number, gas: string) => `patient age 40 y\nplace barometric ${pb} mmHg\n@ 08:00\noxygen room air\n${gas}`;

describe('at PB 600 mmHg', () => {
  it('inspired PO2 is 116 mmHg', () => {
    expect(derived(at(600, 'abg 7.39/40/58/24'), 'pio2').value).toBeCloseTo(116.13, 1);
  });

  it('hypoxaemia with a normal PaCO2 and gradient is type 1 from low inspired oxygen alone (PAO2 116.1 − 50 = 66.1, A–a 8 mmHg)', () => {
    const r = readings(at(600, 'abg 7.39/40/58/24'));
    expect(r['respiratory-failure']).toBe('Consistent with type 1 (hypoxaemic) respiratory failure: hypoxaemia with normal or low PaCO2 (PaO2 58 mmHg, below 60 mmHg; PaCO2 40 mmHg, not above 50 mmHg).');
    expect(r['hypoxaemia-mechanism']).toBe('Consistent with hypoxaemia from low inspired oxygen (PiO2 116 mmHg). The A–a gradient (8 mmHg) is within the age-based normal of 14 mmHg.');
  });

  it('hypoventilation there is type 2, from low inspired oxygen and hypoventilation with a normal gradient (PAO2 116.1 − 72.5 = 43.6, A–a 4 mmHg)', () => {
    const r = readings(at(600, 'abg 7.30/58/40/27.8'));
    expect(r['respiratory-failure']).toBe('Consistent with type 2 (hypercapnic) respiratory failure: hypoxaemia with hypercapnia (PaO2 40 mmHg, below 60 mmHg; PaCO2 58 mmHg, above 50 mmHg).');
    expect(r['hypoxaemia-mechanism']).toBe('Consistent with hypoxaemia from a mix of low inspired oxygen (PiO2 116 mmHg) and hypoventilation (PaCO2 58 mmHg). The A–a gradient (4 mmHg) is within the age-based normal of 14 mmHg.');
  });

  it('a raised gradient there adds V/Q mismatch or shunt (PAO2 116.1 − 37.5 = 78.6, A–a 34 mmHg)', () => {
    const r = readings(at(600, 'abg 7.48/30/45/22.3'));
    expect(r['respiratory-failure']).toBe('Consistent with type 1 (hypoxaemic) respiratory failure: hypoxaemia with normal or low PaCO2 (PaO2 45 mmHg, below 60 mmHg; PaCO2 30 mmHg, not above 50 mmHg).');
    expect(r['hypoxaemia-mechanism']).toBe('Consistent with hypoxaemia from a mix of low inspired oxygen (PiO2 116 mmHg) and a raised A–a gradient (34 mmHg, above 14 mmHg): V/Q mismatch, shunt or a diffusion limit.');
  });
});

describe('the same gas at PB 760 mmHg', () => {
  it('PaCO2 58, PaO2 40: PAO2 149.7 − 72.5 = 77.2, A–a 37 mmHg: hypoventilation and a raised gradient, not low inspired oxygen', () => {
    const r = readings(at(760, 'abg 7.30/58/40/27.8'));
    expect(r['hypoxaemia-mechanism']).toBe('Consistent with hypoxaemia from a mix of hypoventilation (PaCO2 58 mmHg) and a raised A–a gradient (37 mmHg, above 14 mmHg): V/Q mismatch, shunt or a diffusion limit.');
  });
});

describe('hypoxaemia with a normal gradient and no single cause past its threshold', () => {
  // The alveolar gas equation still explains it: a PaCO2 above the normal 45 mmHg (common practice)
  // and a PiO2 below sea-level air's 149.7 mmHg lower the alveolar PO2 together.
  it('PB 715 mmHg, PaCO2 50, PaO2 59 (age 60): PiO2 0.21 × 668 = 140.3, PAO2 140.3 − 62.5 = 77.8, A–a 18.8 mmHg (normal ≤ 19)', () => {
    const note = 'patient age 60 y\nplace barometric 715 mmHg\n@ 08:00\noxygen room air\nabg 7.35/50/59/27';
    expect(derived(note, 'pio2').value).toBeCloseTo(140.28, 1);
    expect(derived(note, 'aa_gradient').value).toBeCloseTo(18.78, 1);
    expect(readings(note)['hypoxaemia-mechanism']).toBe('Consistent with hypoxaemia from a low alveolar PO2 (PAO2 78 mmHg) from mild hypoventilation (PaCO2 50 mmHg, above 45 mmHg but not above 50 mmHg) and a PiO2 a little below that of air at sea level (140.3 mmHg, about 150 mmHg there), neither past its own threshold. The A–a gradient (18.8 mmHg) is within the age-based normal of 19 mmHg.');
  });

  it('the same gas with the hypoxaemia threshold set above what the values explain is still sent back to its inputs', () => {
    // PaO2 88 under a threshold of 90 mmHg (a setting), PaCO2 40, PiO2 149.7: PAO2 99.7, A–a 11.7 mmHg; nothing lowers the alveolar PO2.
    const note = 'patient age 60 y\n@ 08:00\noxygen room air\nabg 7.40/40/88/24';
    expect(readings(note, { hypoxaemiaBelowMmhg: 90 })['hypoxaemia-mechanism']).toMatch(/^Consistent with hypoxaemia, yet without a low PiO2, hypercapnia or a raised A–a gradient: recheck the inputs\./);
  });
});

describe('a place stated but not usable', () => {
  // 12,000 written without a unit reads as metres, beyond any summit (PN204: ordinary in feet);
  // 80 bare in an mmHg note is implausible as mmHg (ordinary as kPa). Neither is used, and sea
  // level is not assumed in their place: 12,000 ft is 3,658 m, where West's model atmosphere gives
  // PB ≈ 496 mmHg (West JB, J Appl Physiol 1996;81:1850–1854, its equation read in a reproduction), so PiO2 = 0.21 ×
  // (496 − 47) ≈ 94 mmHg, not the 150 mmHg of sea level (inspired PO2: common practice).
  const notes = [
    'patient age 40 y\nplace altitude 12000\n@ 08:00\noxygen room air\nabg 7.40/40/50/24',
    'patient age 40 y\nplace barometric 80\n@ 08:00\noxygen room air\nabg 7.40/40/50/24',
  ];
  it.each(notes)('gives no PB, PiO2, PAO2 or A–a gradient, and says what to add: %s', (note) => {
    expect(() => derived(note, 'pio2')).toThrow(/a usable barometric pressure or altitude/);
    expect(() => derived(note, 'aa_gradient')).toThrow(/not derived/);
    expect(readings(note)['hypoxaemia-mechanism']).toBe('Consistent with hypoxaemia, its mechanism not assessed: add a usable barometric pressure or altitude (the one on the place line is not used: see its finding) to get the A–a gradient.');
  });
  it('with the unit written, the same altitude gives PiO2 ≈ 94 mmHg (West 1996 model, its equation read in a reproduction)', () => {
    expect(derived('patient age 40 y\nplace altitude 12000 ft\n@ 08:00\noxygen room air\nabg 7.40/40/50/24', 'pio2').value).toBeCloseTo(94.2, 0);
  });
});

describe('P/F adjusted for altitude: above 1,000 m, as the Berlin definition asks', () => {
  // P/F × PB ÷ 760 "if altitude is higher than 1,000 m" (ARDS Definition Task Force, Acute respiratory
  // distress syndrome: the Berlin Definition, JAMA 2012;307:2526–2533: read in the footnote of its
  // table as reproduced in Crit Care 2012 cc11867, Table 1, and in PMC8450703, Table 1; the JAMA text
  // itself not read). Where the note states only a pressure, 1,000 m is the pressure West's model
  // atmosphere gives there, exp(6.63268 − 0.1112 − 0.00149) = 678.57 mmHg, taken to a tenth: 678.6
  // (West JB, J Appl Physiol 1996;81:1850–1854, its equation read in a reproduction), whichever model the setting chooses.
  // PaO2 84 on FiO2 0.4: P/F 210, in the 200–300 mmHg band; adjusted at PB 670 it would be 185.
  const vent = (place: string) => `place ${place}\n@ 08:00\nvent mode vc, peep 8, fio2 0.4\nabg 7.38/42/84/24`;
  const pb = (mmhg: number) => vent(`barometric ${mmhg} mmHg`);
  const alt = (m: number) => vent(`altitude ${m} m`);
  const notApplied = (text: string, settings: Partial<Settings> = {}) => derivation(text, settings).notApplicable.find((n) => n.id === 'pf_ratio_altitude_adjusted');
  const band = (text: string, settings: Partial<Settings> = {}) => readings(text, settings)['oxygenation-band'];
  const NEAR = "barometric pressure is 678.6 mmHg or more, near sea level or up to 1,000 m by West's model atmosphere: the Berlin definition makes no altitude adjustment there (it adjusts above 1,000 m)";
  const LOW_ALTITUDE = 'the altitude is 1,000 m or less: the Berlin definition makes no altitude adjustment there (it adjusts above 1,000 m)';

  it('at PB 700 mmHg (about 800 m) there is no adjustment, and the band is that of the plain P/F (Berlin, read)', () => {
    // Before: 210 × 700 ÷ 760 = 193.4, the 100–200 band, a band lower than the definition's own.
    expect(notApplied(pb(700))?.reason).toBe(NEAR);
    expect(band(pb(700))).toMatch(/^P\/F 210 mmHg with PEEP 8 cmH2O: .*200–300/);
    expect(band(pb(700))).not.toMatch(/adjusted/);
  });

  it('at PB 670 mmHg it is 210 × 670 ÷ 760 = 185.1, and the band uses it (Berlin, read)', () => {
    expect(derived(pb(670), 'pf_ratio_altitude_adjusted').value).toBeCloseTo(185.13, 2);
    expect(band(pb(670))).toMatch(/^P\/F 185 mmHg \(adjusted for altitude\) with PEEP 8 cmH2O: .*100–200/);
  });

  it("at 1,200 m it is adjusted by either model's pressure (West 663.2, its equation read in a reproduction; standard 657.9 mmHg, from memory)", () => {
    expect(derived(alt(1200), 'pf_ratio_altitude_adjusted').value).toBeCloseTo((210 * 663.2118) / 760, 2); // 183.26
    expect(derived(alt(1200), 'pf_ratio_altitude_adjusted', { barometricModel: 'standard' }).value).toBeCloseTo((210 * 657.9389) / 760, 2); // 181.80
    expect(band(alt(1200))).toMatch(/^P\/F 183 mmHg \(adjusted for altitude\)/);
  });

  it('at 800 m it is not adjusted under either model, and the reason names the altitude (Berlin, read)', () => {
    for (const barometricModel of ['west', 'standard'] as const) {
      expect(notApplied(alt(800), { barometricModel })?.reason).toBe(LOW_ALTITUDE);
      expect(band(alt(800), { barometricModel })).toMatch(/^P\/F 210 mmHg with/);
    }
  });

  it('on the boundary: 1,000 m is not above 1,000 m, 1,001 m is (Berlin, read)', () => {
    expect(notApplied(alt(1000))?.reason).toBe(LOW_ALTITUDE);
    expect(notApplied(alt(1000), { barometricModel: 'standard' })?.reason).toBe(LOW_ALTITUDE);
    expect(derived(alt(1001), 'pf_ratio_altitude_adjusted').value).toBeLessThan(210);
  });

  it("a pressure alone: 678.6 mmHg, West's 1,000 m, is not adjusted, 678.5 is (West 1996, its equation read in a reproduction)", () => {
    expect(notApplied(pb(678.6))?.reason).toBe(NEAR);
    expect(derived(pb(678.5), 'pf_ratio_altitude_adjusted').value).toBeCloseTo((210 * 678.5) / 760, 2);
  });

  it('a pressure alone reads the same whichever model the setting chooses: the model converts no altitude there', () => {
    // 676 mmHg is about 1,020 m by West's model and about 980 m by the standard atmosphere (674.1 mmHg at 1,000 m).
    for (const barometricModel of ['west', 'standard'] as const) {
      expect(derived(pb(676), 'pf_ratio_altitude_adjusted', { barometricModel }).value).toBeCloseTo((210 * 676) / 760, 2);
      expect(notApplied(pb(690), { barometricModel })?.reason).toBe(NEAR);
    }
  });

  it('an altitude with a pressure that fits it (no PN320): the altitude decides, the pressure stated is the one used', () => {
    // 1,050 m with 680 mmHg: above 1,000 m, so adjusted, by 680 ÷ 760: 187.9.
    expect(derived(vent('altitude 1050 m, barometric 680 mmHg'), 'pf_ratio_altitude_adjusted').value).toBeCloseTo((210 * 680) / 760, 2);
    // 950 m with 676 mmHg: not above 1,000 m, so not adjusted though the pressure is below 678.6.
    expect(notApplied(vent('altitude 950 m, barometric 676 mmHg'))?.reason).toBe(LOW_ALTITUDE);
  });

  it('an altitude the pressure beside it contradicts (PN320: the altitude is not used): the pressure decides', () => {
    expect(notApplied(vent('altitude 2000 m, barometric 700 mmHg'))?.reason).toBe(NEAR);
    expect(derived(vent('altitude 0 m, barometric 600 mmHg'), 'pf_ratio_altitude_adjusted').value).toBeCloseTo((210 * 600) / 760, 2);
  });

  it('in a hyperbaric chamber (PB 2,280 mmHg, 3 atmospheres) it is not applied either, and the reason does not call it near sea level', () => {
    expect(notApplied(pb(2280))?.reason).toBe("barometric pressure is above sea level's (760 mmHg): the adjustment is for altitude above 1,000 m, a pressure below 678.6 mmHg");
    // Within the weather's 20 mmHg of sea level it is near sea level (common practice, no source).
    expect(notApplied(pb(780))?.reason).toBe(NEAR);
  });

  it('the summit-hut sample is adjusted as before: 4,550 m and 1,200 m are both above 1,000 m', () => {
    const text = readFileSync(new URL('../../samples/summit-hut-evacuation.pneu', import.meta.url), 'utf8');
    // Room air at the hut: PaO2 33 ÷ 0.21 = 157.1; West's model at 4,550 m: 447.6 mmHg (its equation read in a reproduction).
    expect(derived(text, 'pf_ratio_altitude_adjusted', {}, 0).value).toBeCloseTo(((33 / 0.21) * Math.exp(6.63268 - 0.1112 * 4.55 - 0.00149 * 4.55 ** 2)) / 760, 2);
    // Room air in the valley: PaO2 74 ÷ 0.21 = 352.4 at 1,200 m (663.2 mmHg): 307.5.
    expect(derived(text, 'pf_ratio_altitude_adjusted', {}, 3).value).toBeCloseTo(((74 / 0.21) * 663.2118) / 760, 2);
  });
});

describe('what a note near sea level is asked to add', () => {
  // The adjustment is not applied at 1,000 m or below (above), so adding an FiO2 there gives a P/F
  // and no adjusted P/F: the request for an FiO2 must not promise one. At 2,000 m (West's model
  // atmosphere, PB ≈ 604 mmHg: West JB, J Appl Physiol 1996, its equation read in a reproduction) it does give one.
  const cannula = (place: string) => `${place}@ 08:00\noxygen cannula 2\nabg 7.40/40/80/24`;
  const asked = (text: string) => derivation(text).missing.filter((m) => m.id === 'pf_ratio_altitude_adjusted');

  it('at sea level (no place, or 760 mmHg) the request for fio2 names P/F but not P/F × PB/760', () => {
    for (const text of [cannula(''), cannula('place barometric 760 mmHg\n')]) {
      expect(asked(text)).toEqual([]);
      expect(derivation(text).missing.find((m) => m.id === 'pf_ratio')?.needs).toEqual(["fio2 (a cannula's FiO2 is only an estimate)"]);
      expect(derivation(text).notApplicable.find((n) => n.id === 'pf_ratio_altitude_adjusted')?.reason).toMatch(/near sea level/);
    }
  });

  it('at 2,000 m it names the adjusted P/F too', () => {
    expect(asked(cannula('place altitude 2000 m\n'))[0]?.needs).toEqual(["fio2 (a cannula's FiO2 is only an estimate)"]);
  });
});
