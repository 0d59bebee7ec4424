// Notes written as clinicians write them at the bedside (tests/fixtures/bedside/, invented patients,
// places and times): abbreviations (`pt`, `obs`, `o2`, `art`, `sats`, `resp`, `bicarb`), kPa and mmHg
// in one gas, feet and Fahrenheit, oxygen in words (`nasal 2 lpm`, `ra`, `high flow 50 L/min 60 %`),
// ventilator settings spread over lines, a correction further down, a gas with no oxygen written, a
// gas on room air at altitude, a child, NIV, CPAP and high flow. Every derived value below was worked
// out by hand from the formulas, beside its source:
// - 1 kPa = 7.500617 mmHg (the conventional millimetre of mercury, 133.322387415 Pa: NIST SP 811, from
//   memory); °F → °C = (F − 32) × 5 ÷ 9; 1 ft = 0.3048 m.
// - PiO2 = FiO2 × (PB − 47) (common practice); PAO2 = PiO2 − PaCO2 ÷ 0.8 (simplified alveolar gas
//   equation; Fenn, Rahn & Otis 1946 and Riley & Cournand 1949, from memory); A–a = PAO2 − PaO2; a/A =
//   PaO2 ÷ PAO2; upper normal A–a age ÷ 4 + 4 (common practice, no source), adults only.
// - P/F = PaO2 ÷ FiO2 and, above 1,000 m, P/F × PB ÷ 760 (ARDS Definition Task Force, JAMA
//   2012;307:2526–2533); S/F = SpO2 ÷ FiO2 (Rice TW et al., Chest 2007;132:410–417); ROX = S/F ÷ RR
//   (Roca O et al., J Crit Care 2016, from memory).
// - PB from altitude, West's model atmosphere: exp(6.63268 − 0.1112 h − 0.00149 h²), h in km (West JB,
//   J Appl Physiol 1996;81:1850–1854, from memory).
// - HCO3 calc = 0.0307 × PaCO2 × 10^(pH − 6.1) (Henderson–Hasselbalch); expected HCO3 in a respiratory
//   disorder 24 + k × (PaCO2 − 40) ÷ 10 ± 2, k 1 acute and 3.5–5 chronic acidosis, 2 acute and 4–5
//   chronic alkalosis (Narins & Emmett 1980; Adrogué & Madias 2010, from memory), a PaCO2 written in
//   kPa standing for ± 0.05 kPa (the project's convention); Winters' 1.5 × HCO3 + 8 ± 2 (Albert, Dell &
//   Winters 1967, from memory).
// - Anion gap Na − (Cl + HCO3); albumin-corrected AG + 2.5 × (4.0 − albumin g/dL) (Figge J et al.,
//   Crit Care Med 1998;26:1807–1810, from memory); delta ratio (AG − 12) ÷ (24 − HCO3) (Rastegar A,
//   JASN 2007;18:2429–2431, from memory).
// - VE = VT × RR ÷ 1000 (measured RR first); PBW female 45.5 + 0.91 × (height − 152.4) (ARDS Network,
//   NEJM 2000;342:1301–1308); ΔP = Pplat − PEEP (Amato MBP et al., NEJM 2015;372:747–755); Cstat VT ÷
//   (Pplat − PEEP), Cdyn VT ÷ (Ppeak − PEEP), Raw (Ppeak − Pplat) ÷ (flow ÷ 60) (common practice, no
//   source); mechanical power 0.098 × RR × VT(L) × (Ppeak − ΔP ÷ 2) (Gattinoni L et al., Intensive Care
//   Med 2016;42:1567–1575), its surrogate VE × (Ppeak + PEEP + flow ÷ 6) ÷ 20 (Giosa L et al., ICM Exp
//   2019;7:61); ventilatory ratio VE(mL/min) × PaCO2 ÷ (PBW × 100 × 37.5) (Sinha P et al., BJA
//   2009;102:692–697); OI = FiO2 × MAP × 100 ÷ PaO2, OSI with SpO2 (Ortiz et al. 1987; PALICC 2015,
//   from memory).
// - CaO2 = 1.34 × Hb × SaO2 (else SpO2) ÷ 100 + 0.003 × PaO2 (common practice); MAP estimate DBP +
//   (SBP − DBP) ÷ 3 (common practice, no source); FiO2 estimate of a cannula 0.21 + 0.04 × flow, of a
//   simple mask 0.35 at 5 to 0.55 at 10 L/min, linear (common practice, no source, rough).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { derivation } from './helpers';

const KPA = 1000 / 133.322387415;
const DIR = 'tests/fixtures/bedside';
const text = (name: string) => readFileSync(`${DIR}/${name}.pneu`, 'utf8');

/** The derived values of one timepoint by id: value, or [low, high] for a range. */
function values(name: string, timepoint: number): Record<string, number | [number, number]> {
  const out: Record<string, number | [number, number]> = {};
  for (const d of derivation(text(name), {}, timepoint).derived) out[d.id] = d.range ? [d.range.low, d.range.high] : d.value!;
  return out;
}

/** Each value expected, to 9 decimals (numbers worked out here in full, not rounded). */
function expectValues(actual: Record<string, number | [number, number]>, expected: Record<string, number | [number, number]>): void {
  for (const [id, want] of Object.entries(expected)) {
    const got = actual[id];
    expect(got, `${id} derived`).toBeDefined();
    if (Array.isArray(want)) {
      expect(Array.isArray(got), id).toBe(true);
      expect((got as [number, number])[0], `${id} low`).toBeCloseTo(want[0], 9);
      expect((got as [number, number])[1], `${id} high`).toBeCloseTo(want[1], 9);
    } else expect(got as number, id).toBeCloseTo(want, 9);
  }
}

/** Findings as `line code` (lines from 1), in the order of the note. */
function findings(name: string): string[] {
  return checkNote(text(name)).findings.map((f) => `${f.range.start.line + 1} ${f.code}`).sort((a, b) => parseInt(a) - parseInt(b) || a.localeCompare(b));
}

const hco3Calc = (ph: number, paco2: number) => 0.0307 * paco2 * 10 ** (ph - 6.1);
const westPb = (km: number) => Math.exp(6.63268 - 0.1112 * km - 0.00149 * km * km);

describe('01: a ward note in kPa, one PaCO2 in mmHg, height in feet and inches', () => {
  it('findings: feet and inches not read together (PN105); readings on both gases', () => {
    expect(findings('01-ward-kpa-mixed')).toEqual(['3 PN105', '8 PN410', '8 PN411', '8 PN412', '8 PN413', '12 PN410', '12 PN411', '12 PN412', '12 PN412', '12 PN413']);
  });

  it('on a cannula at 2 L/min: the FiO2 estimate, and the acute and chronic HCO3 of a PaCO2 of 8.4 kPa', () => {
    const paco2 = 8.4 * KPA;
    expectValues(values('01-ward-kpa-mixed', 0), {
      fio2_estimated: 0.21 + 0.04 * 2,
      aa_gradient_upper_normal: 68 / 4 + 4,
      hco3_calculated: hco3Calc(7.31, paco2),
      hco3_gap: 31.2 - hco3Calc(7.31, paco2),
      // ± 0.05 kPa: the low end at 8.35 kPa, the high end at 8.45 kPa.
      hco3_expected_acute: [24 + (8.35 * KPA - 40) / 10 - 2, 24 + (8.45 * KPA - 40) / 10 + 2],
      hco3_expected_chronic: [24 + 3.5 * (8.35 * KPA - 40) / 10 - 2, 24 + 5 * (8.45 * KPA - 40) / 10 + 2],
    });
    // 99.1 °F is 37.28 °C.
    expect(checkNote(text('01-ward-kpa-mixed')).analysis.timeline.timepoints[0]!.values.numberOf('temp')).toBeCloseTo((99.1 - 32) * 5 / 9, 9);
  });

  it('on a Venturi 28 %: the PaCO2 written in mmHg and the PaO2 in the note\'s kPa, each read as meant', () => {
    const pao2 = 7.6 * KPA;
    const pio2 = 0.28 * (760 - 47);
    const alveolar = pio2 - 66 / 0.8;
    expectValues(values('01-ward-kpa-mixed', 1), {
      pio2, pao2_alveolar: alveolar, aa_gradient: alveolar - pao2, a_to_A_ratio: pao2 / alveolar,
      pf_ratio: pao2 / 0.28, sf_ratio: 89 / 0.28, hco3_calculated: hco3Calc(7.3, 66),
      // Written in mmHg, so no widening: 31.1–39.0.
      hco3_expected_chronic: [24 + 3.5 * 2.6 - 2, 24 + 5 * 2.6 + 2],
    });
  });
});

describe('02: room air at 12,500 ft', () => {
  const pb = westPb(12500 * 0.3048 / 1000);
  it('PB from the altitude in feet, PiO2, A–a, P/F and its altitude adjustment', () => {
    const pio2 = 0.21 * (pb - 47);
    const alveolar = pio2 - 27 / 0.8;
    expectValues(values('02-altitude-room-air', 0), {
      barometric: pb, pio2, pao2_alveolar: alveolar, aa_gradient: alveolar - 43, aa_gradient_upper_normal: 34 / 4 + 4,
      pf_ratio: 43 / 0.21, pf_ratio_altitude_adjusted: (43 / 0.21) * pb / 760, sf_ratio: 81 / 0.21,
      hco3_expected_acute: [24 - 2 * 1.3 - 2, 24 - 2 * 1.3 + 2],
      hco3_expected_chronic: [24 - 5 * 1.3 - 2, 24 - 4 * 1.3 + 2],
    });
    // About 487 mmHg: exp(6.63268 − 0.423672 − 0.021629).
    expect(pb).toBeCloseTo(486.5, 0);
  });

  it('the readings name the low inspired oxygen; the cannula an hour later gives an estimate only', () => {
    expect(findings('02-altitude-room-air')).toEqual(['8 PN410', '8 PN411', '8 PN412', '8 PN412', '8 PN413']);
    const d = derivation(text('02-altitude-room-air'), {}, 0);
    expect(d.interpretations.map((i) => i.text).join(' ')).toContain('low inspired oxygen (PiO2 92 mmHg)');
    expectValues(values('02-altitude-room-air', 1), { fio2_estimated: 0.29 });
  });
});

describe('03: a ventilated six-year-old', () => {
  it('no unusual height or weight (a child), no adult-only values, the oxygenation index', () => {
    expect(findings('03-child-vent')).toEqual(['8 PN410', '8 PN413']);
    const pio2 = 0.45 * 713;
    expectValues(values('03-child-vent', 0), {
      pio2, pao2_alveolar: pio2 - 44 / 0.8, aa_gradient: pio2 - 55 - 78, pf_ratio: 78 / 0.45, sf_ratio: 95 / 0.45,
      oxygenation_index: 0.45 * 11 * 100 / 78, oxygen_saturation_index: 0.45 * 11 * 100 / 95,
      // The measured VT under PC with the measured RR; Cdyn with the measured peak.
      minute_ventilation: 150 * 24 / 1000, compliance_dynamic: 150 / (22 - 6),
    });
    const ids = Object.keys(values('03-child-vent', 0));
    for (const adult of ['predicted_body_weight', 'vt_per_kg_pbw', 'ventilatory_ratio', 'aa_gradient_upper_normal']) expect(ids).not.toContain(adult);
    const words = derivation(text('03-child-vent'), {}, 0).interpretations.map((i) => i.text).join(' ');
    expect(words).toContain('not read against the oxygenation bands of the Berlin definition');
  });
});

describe('04: ventilator settings spread over four lines', () => {
  it('every line read into one set of settings, with the plateau and peak of the last', () => {
    expect(findings('04-icu-vent-lines')).toEqual(['8 PN405', '10 PN410', '10 PN410', '10 PN411', '10 PN412', '10 PN413']);
    const pio2 = 0.6 * 713;
    const alveolar = pio2 - 52 / 0.8;
    const pbw = 45.5 + 0.91 * (162 - 152.4);
    const ve = 420 * 22 / 1000;
    const ag = 141 - (108 + 24.5);
    expectValues(values('04-icu-vent-lines', 0), {
      pio2, pao2_alveolar: alveolar, aa_gradient: alveolar - 71, a_to_A_ratio: 71 / alveolar, pf_ratio: 71 / 0.6, sf_ratio: 93 / 0.6,
      aa_gradient_upper_normal: 57 / 4 + 4, hco3_calculated: hco3Calc(7.29, 52),
      anion_gap: ag, anion_gap_albumin_corrected: ag + 2.5 * (4.0 - 2.6),
      hco3_expected_acute: [24 + 1.2 - 2, 24 + 1.2 + 2], hco3_expected_chronic: [24 + 3.5 * 1.2 - 2, 24 + 5 * 1.2 + 2],
      minute_ventilation: ve, predicted_body_weight: pbw, vt_per_kg_pbw: 420 / pbw,
      driving_pressure: 17, compliance_static: 420 / 17, compliance_dynamic: 420 / 23, airway_resistance: (33 - 27) / (50 / 60),
      mechanical_power: 0.098 * 22 * 0.42 * (33 - 17 / 2), mechanical_power_surrogate: ve * (33 + 10 + 50 / 6) / 20,
      ventilatory_ratio: ve * 1000 * 52 / (pbw * 100 * 37.5),
      cao2: 1.34 * 9.1 * 93 / 100 + 0.003 * 71, mean_arterial_pressure: 60 + (104 - 60) / 3,
    });
  });
});

describe('05: high flow, then weaned by its FiO2 alone', () => {
  it('the percentage after the flow is the FiO2 (said); the ROX at start and at 12 hours', () => {
    expect(findings('05-hfnc-rox')).toEqual(['5 PN323', '10 PN410', '10 PN411', '10 PN413']);
    expectValues(values('05-hfnc-rox', 0), { pio2: 0.6 * 713, sf_ratio: 91 / 0.6, rox_index: 91 / 0.6 / 30 });
    const pio2 = 0.5 * 713;
    expectValues(values('05-hfnc-rox', 1), {
      pio2, pao2_alveolar: pio2 - 33 / 0.8, aa_gradient: pio2 - 33 / 0.8 - 72, pf_ratio: 72 / 0.5, sf_ratio: 94 / 0.5, rox_index: 94 / 0.5 / 25,
    });
    // The device and its flow carry through the update of the FiO2.
    const tp = checkNote(text('05-hfnc-rox')).analysis.timeline.timepoints[1]!;
    expect(tp.values.wordOf('device')).toBe('hfnc');
    expect(tp.values.numberOf('o2_flow')).toBe(50);
  });
});

describe('06: a bicarbonate corrected further down the note', () => {
  it('the later HCO3 is the one used (PN206 says so): anion gap, delta ratio, Winters', () => {
    expect(findings('06-correction')).toEqual(['7 PN411', '7 PN413', '9 PN206']);
    const ag = 138 - (99 + 12.1);
    expectValues(values('06-correction', 0), {
      fio2_estimated: 0.35 + (6 - 5) * (0.55 - 0.35) / 5, hco3_calculated: hco3Calc(7.21, 31), hco3_gap: 12.1 - hco3Calc(7.21, 31),
      anion_gap: ag, delta_ratio: (ag - 12) / (24 - 12.1), paco2_expected: [1.5 * 12.1 + 8 - 2, 1.5 * 12.1 + 8 + 2],
      mean_arterial_pressure: 44 + (82 - 44) / 3,
    });
  });
});

describe('07: NIV, its IPAP raised on a line of its own', () => {
  it('the EPAP and FiO2 carry; the gas is read with them', () => {
    expect(findings('07-niv-spread')).toEqual(['7 PN414', '10 PN410', '10 PN410', '10 PN411', '10 PN412', '10 PN413']);
    const pio2 = 0.35 * 713;
    expectValues(values('07-niv-spread', 0), { pio2, sf_ratio: 90 / 0.35 });
    expectValues(values('07-niv-spread', 1), {
      pio2, pao2_alveolar: pio2 - 63 / 0.8, aa_gradient: pio2 - 63 / 0.8 - 66, pf_ratio: 66 / 0.35, aa_gradient_upper_normal: 61 / 4 + 4,
      hco3_expected_acute: [24 + 2.3 - 2, 24 + 2.3 + 2], hco3_expected_chronic: [24 + 3.5 * 2.3 - 2, 24 + 5 * 2.3 + 2],
    });
    const tp = checkNote(text('07-niv-spread')).analysis.timeline.timepoints[1]!;
    expect([tp.values.numberOf('ipap'), tp.values.numberOf('epap'), tp.values.numberOf('fio2')]).toEqual([20, 8, 0.35]);
  });
});

describe('08: a gas with no oxygen written', () => {
  it('no oxygenation values, asked for; the acid–base of ketoacidosis with albumin in g/L', () => {
    expect(findings('08-no-fio2-dka')).toEqual(['6 PN411', '6 PN413']);
    const ag = 133 - (97 + 5.1);
    const corrected = ag + 2.5 * (4.0 - 4.4);
    expectValues(values('08-no-fio2-dka', 0), {
      hco3_calculated: hco3Calc(7.08, 16), anion_gap: ag, anion_gap_albumin_corrected: corrected,
      delta_ratio: (corrected - 12) / (24 - 5.1), paco2_expected: [1.5 * 5.1 + 8 - 2, 1.5 * 5.1 + 8 + 2],
    });
    const d = derivation(text('08-no-fio2-dka'), {}, 0);
    expect(d.derived.map((x) => x.id)).not.toContain('pf_ratio');
    expect(d.missing.map((m) => JSON.stringify(m)).join(' ')).toContain('fio2');
    // The low PaCO2 is the response to the acidosis, within Winters' 13.65–17.65 mmHg.
    expect(d.interpretations.find((i) => i.topic === 'ventilation')!.text).toBe('PaCO2 16 mmHg: consistent with hypocapnia (below 35 mmHg): the breathing\'s response to the metabolic acidosis (the acid–base reading compares it with the response expected).');
  });
});

describe('09: CPAP under a barometric pressure written in kPa', () => {
  it('PB 94.1 kPa is used for PiO2; no altitude adjustment of the P/F (below 1,000 m by pressure)', () => {
    expect(findings('09-cpap-barometric')).toEqual(['8 PN410', '8 PN410', '8 PN413']);
    const pb = 94.1 * KPA;
    const pio2 = 0.6 * (pb - 47);
    const alveolar = pio2 - (6.1 * KPA) / 0.8;
    expectValues(values('09-cpap-barometric', 0), {
      barometric: pb, pio2, pao2_alveolar: alveolar, aa_gradient: alveolar - 8.2 * KPA, pf_ratio: (8.2 * KPA) / 0.6, aa_gradient_upper_normal: 83 / 4 + 4,
    });
    expect(Object.keys(values('09-cpap-barometric', 0))).not.toContain('pf_ratio_altitude_adjusted');
  });
});
