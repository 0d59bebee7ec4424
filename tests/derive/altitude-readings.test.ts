// Type 1 and type 2 respiratory failure and the mechanism of hypoxaemia at sea level (PB 760 mmHg)
// and at altitude (PB 600 mmHg), for invented patients. Inspired PO2 (humidified) = FiO2 × (PB − 47):
// 0.21 × 713 = 149.7 mmHg at 760, 0.21 × 553 = 116.1 mmHg at 600 (dry: 0.21 × PB = 159.6 and 126 mmHg)
// (common practice). Alveolar PO2 = PiO2 − PaCO2 ÷ 0.8 (simplified alveolar gas equation; Fenn, Rahn
// & Otis 1946, Riley & Cournand 1949, from memory). Upper normal A–a gradient age ÷ 4 + 4 (common
// practice, no source). Hypoxaemia PaO2 < 60 mmHg, hypercapnia PaCO2 > 50 mmHg (common practice, no
// source). Low inspired oxygen: PiO2 below 140 mmHg (Pneumark's convention, interpret.ts).
import { describe, expect, it } from 'vitest';
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
  // PB ≈ 496 mmHg (West JB, J Appl Physiol 1996;81:1850–1854, from memory), so PiO2 = 0.21 ×
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
  it('with the unit written, the same altitude gives PiO2 ≈ 94 mmHg (West 1996 model, from memory)', () => {
    expect(derived('patient age 40 y\nplace altitude 12000 ft\n@ 08:00\noxygen room air\nabg 7.40/40/50/24', 'pio2').value).toBeCloseTo(94.2, 0);
  });
});

describe('P/F adjusted for altitude: from 740 mmHg down', () => {
  // P/F × PB ÷ 760 (ARDS Definition Task Force, JAMA 2012;307:2526–2533, from memory); it starts
  // below 740 mmHg (Pneumark's convention: weather moves sea-level pressure by about 20 mmHg either
  // way, common practice, no source). PaO2 90 on FiO2 0.4: P/F 225.
  const vent = (pb: number) => `place barometric ${pb} mmHg\n@ 08:00\nvent mode vc, peep 8, fio2 0.4\nabg 7.38/42/90/24`;

  const notApplied = (pb: number) => derivation(vent(pb)).notApplicable.find((n) => n.id === 'pf_ratio_altitude_adjusted');

  it('at 741 mmHg it is not applicable, and the reason names the threshold', () => {
    expect(notApplied(741)?.reason).toBe('barometric pressure is 740 mmHg or more, close to sea level (the adjustment starts below 740 mmHg)');
  });

  it('in a hyperbaric chamber (PB 2,280 mmHg, 3 atmospheres) it is not applied either, and the reason does not call it close to sea level', () => {
    expect(notApplied(2280)?.reason).toBe("barometric pressure is above sea level's (760 mmHg): the adjustment is for altitude, below 740 mmHg");
    // Within the weather's 20 mmHg of sea level it is close to sea level (common practice, no source).
    expect(notApplied(780)?.reason).toMatch(/close to sea level/);
  });

  it('at 740 mmHg, on the threshold, it is still not applied', () => {
    expect(notApplied(740)).toBeDefined();
    expect(notApplied(739)).toBeUndefined();
  });

  it('at 739 mmHg it is 225 × 739 ÷ 760 = 218.8, and the oxygenation band uses it', () => {
    expect(derived(vent(739), 'pf_ratio_altitude_adjusted').value).toBeCloseTo(218.78, 1);
    expect(readings(vent(739))['oxygenation-band']).toMatch(/219/);
    expect(readings(vent(741))['oxygenation-band']).toMatch(/^P\/F 225 mmHg/);
  });
});

describe('what a note near sea level is asked to add', () => {
  // The adjustment is not applied from 740 mmHg up (above), so adding an FiO2 there gives a P/F and
  // no adjusted P/F: the request for an FiO2 must not promise one. At 2,000 m (West's model
  // atmosphere, PB ≈ 604 mmHg: West JB, J Appl Physiol 1996, from memory) it does give one.
  const cannula = (place: string) => `${place}@ 08:00\noxygen cannula 2\nabg 7.40/40/80/24`;
  const asked = (text: string) => derivation(text).missing.filter((m) => m.id === 'pf_ratio_altitude_adjusted');

  it('at sea level (no place, or 760 mmHg) the request for fio2 names P/F but not P/F × PB/760', () => {
    for (const text of [cannula(''), cannula('place barometric 760 mmHg\n')]) {
      expect(asked(text)).toEqual([]);
      expect(derivation(text).missing.find((m) => m.id === 'pf_ratio')?.needs).toEqual(["fio2 (a cannula's FiO2 is only an estimate)"]);
      expect(derivation(text).notApplicable.find((n) => n.id === 'pf_ratio_altitude_adjusted')?.reason).toMatch(/close to sea level/);
    }
  });

  it('at 2,000 m it names the adjusted P/F too', () => {
    expect(asked(cannula('place altitude 2000 m\n'))[0]?.needs).toEqual(["fio2 (a cannula's FiO2 is only an estimate)"]);
  });
});
