// Values that cannot go together are reported, never passed over in silence, and a missing FiO2
// never produces a negative reading. Worked numbers use the simplified alveolar gas equation,
// PAO2 = FiO2 × (PB − 47) − PaCO2 ÷ 0.8 (Fenn, Rahn & Otis 1946; Riley & Cournand 1949 — from
// memory), and West's model atmosphere for PB from altitude (West JB, J Appl Physiol
// 1996;81:1850–1854 — from memory): about 444 mmHg at 4,550 m.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { alveolarPo2Simplified, alveolarPo2SimplifiedSigned } from '../../server/src/core/physiology';
import { derivation, derived, readings } from './helpers';

describe('an alveolar PO2 that comes out negative', () => {
  const note = 'place altitude 4550 m\n@ 08:00\noxygen room air\nabg 7.10/75/50/22.5';

  it('is computed and kept: 0.21 × (444 − 47) − 75 ÷ 0.8 ≈ −10 mmHg', () => {
    expect(alveolarPo2SimplifiedSigned(0.21 * (444 - 47), 75)).toBeCloseTo(83.37 - 93.75, 2);
    // The plain form stays total over the physical domain: null for a negative alveolar PO2.
    expect(alveolarPo2Simplified(0.21 * (444 - 47), 75)).toBeNull();
    const pA = derived(note, 'pao2_alveolar');
    expect(pA.value).toBeLessThan(-5);
    expect(pA.value).toBeGreaterThan(-15);
  });

  it('is reported by PN401 as values that cannot go together, whatever the PaO2', () => {
    const f = checkNote(note).findings.filter((x) => x.code === 'PN401');
    expect(f).toHaveLength(1);
    expect(f[0]?.message).toMatch(/^No PaO2 is possible here: with FiO2 0\.21, the barometric pressure and the PaCO2 in force, the alveolar PO2 comes out at -1\d mmHg\./);
  });

  it('gives no A–a gradient and says why, instead of asking for an FiO2 that is there', () => {
    const d = derivation(note);
    expect(d.notApplicable.find((n) => n.id === 'aa_gradient')?.reason).toMatch(/alveolar PO2 comes out negative/);
    expect(readings(note)['hypoxaemia-mechanism']).toMatch(/^Consistent with hypoxaemia, its mechanism not assessed: the FiO2, pressure, PaCO2 and PaO2 stated cannot go together/);
    expect(readings(note)['hypoxaemia-mechanism']).not.toMatch(/add fio2/);
  });
});

describe('hypercapnia without hypoxaemia (hypoxaemia PaO2 < 60, hypercapnia PaCO2 > 50 mmHg: common practice, no source)', () => {
  it('makes no negative statement when no FiO2 is stated: oxygen may hold the PaO2 up', () => {
    // On air at PB 760, PAO2 = 0.21 × 713 − 60 ÷ 0.8 ≈ 75 mmHg: a PaO2 of 90 would need oxygen.
    const r = readings('@ 08:00\nabg 7.24/60/90/26');
    expect(r['respiratory-failure']).toMatch(/^Consistent with hypercapnia \(PaCO2 60 mmHg, above 50 mmHg\) with PaO2 90 mmHg, not below 60 mmHg, and no FiO2 stated: on supplemental oxygen this would be consistent with type 2 \(hypercapnic\) respiratory failure; add fio2 \(or an oxygen line\) to tell\.$/);
    expect(r['respiratory-failure']).not.toMatch(/not consistent/);
  });

  it('reads an oxygen device without a stated FiO2 as oxygen holding the PaO2 up', () => {
    const r = readings('@ 08:00\noxygen cannula 4 L/min\nabg 7.26/72/81/31');
    expect(r['respiratory-failure']).toBe('Consistent with type 2 (hypercapnic) respiratory failure, with PaO2 held up by supplemental oxygen (PaCO2 72 mmHg, above 50 mmHg; PaO2 81 mmHg with oxygen by cannula, FiO2 not stated).');
  });

  it('on air, reads hypercapnia without hypoxaemia as ventilatory failure short of the type 2 definition, never as no failure', () => {
    // Type 2 failure: hypoxaemia (PaO2 < 60 mmHg) with hypercapnia (PaCO2 > 50 mmHg) (common practice, no source).
    const r = readings('@ 08:00\noxygen room air\nabg 7.33/52/70/27');
    expect(r['respiratory-failure']).toBe('Consistent with hypercapnia (PaCO2 52 mmHg, above 50 mmHg) without hypoxaemia on air (PaO2 70 mmHg, not below 60 mmHg), and so with ventilatory (hypercapnic) failure; type 2 respiratory failure, as Pneumark reads it, also needs hypoxaemia.');
    expect(r['respiratory-failure']).not.toMatch(/not consistent/);
  });
});

describe('what to add for an FiO2 (the grammar: FiO2 in force)', () => {
  it('asks for the FiO2 on the oxygen line that is there, not for an oxygen line', () => {
    const d = derivation('@ 08:00\noxygen venturi 8\nabg 7.40/40/90/24.4');
    expect(d.missing.find((m) => m.id === 'pf_ratio')?.message).toMatch(/^add fio2 \(on the venturi line\) to get/);
    const none = derivation('@ 08:00\nabg 7.40/40/90/24.4');
    expect(none.missing.find((m) => m.id === 'pf_ratio')?.message).toMatch(/^add fio2 \(or an oxygen line\) to get/);
  });
});

describe('a PaO2 above the alveolar PO2 the FiO2 allows (PN401)', () => {
  // Room air at PB 760 with PaCO2 60: PAO2 = 0.21 × (760 − 47) − 60 ÷ 0.8 = 74.7 mmHg (alveolar gas
  // equation, as above), so a PaO2 of 160 cannot be: the FiO2, the unit or the sample is wrong.
  const impossible = '@ 08:00\noxygen room air\nabg 7.40/60/160/36';

  it('gives no oxygenation or respiratory failure reading from that PaO2, only PN401 and what does not rest on it', () => {
    expect(0.21 * (760 - 47) - 60 / 0.8).toBeCloseTo(74.7, 1);
    const r = readings(impossible);
    expect(r.oxygenation).toBe('PaO2 160 mmHg: oxygenation not read, as the FiO2, pressure, PaCO2 and PaO2 stated cannot go together (see PN401).');
    expect(r['respiratory-failure']).toBe('Respiratory failure not read: the FiO2, pressure, PaCO2 and PaO2 stated cannot go together (see PN401).');
    // PaCO2 60 is read as it stands (hypercapnia PaCO2 > 50 mmHg: common practice, no source).
    expect(r.ventilation).toMatch(/^PaCO2 60 mmHg: consistent with hypercapnia/);
    const codes = checkNote(impossible).findings.map((f) => f.code);
    expect(codes).toContain('PN401');
    expect(codes).not.toContain('PN410');
    expect(codes).not.toContain('PN412');
  });

  it('reads a PaO2 within rounding of the alveolar PO2 as usual', () => {
    // PAO2 99.7 mmHg with PaCO2 40 on air; a PaO2 of 100 is within the 5 mmHg allowed for rounding.
    expect(readings('@ 08:00\noxygen room air\nabg 7.40/40/100/24').oxygenation).toBe('PaO2 100 mmHg: consistent with adequate arterial oxygenation.');
  });
});

describe('a PaO2 within rounding above the alveolar PO2', () => {
  // On air at sea level with PaCO2 40: PAO2 = 0.21 × (760 − 47) − 40 ÷ 0.8 = 99.7 mmHg (simplified
  // alveolar gas equation: Fenn, Rahn & Otis 1946; Riley & Cournand 1949 — from memory). A PaO2 of
  // 102 is 2.3 mmHg above it: within the 5 mmHg allowed for rounding, so the gradient shows as 0
  // (grammar/README.md), and the a/A ratio, PaO2 ÷ PAO2 (Gilbert & Keighley 1974, from memory),
  // must say the same thing: 1, not the 1.02 that PaO2 and PAO2 would be no gradient against.
  const note = 'patient age 20 y\n@ 08:00\noxygen room air\nabg 7.40/40/102/24';

  it('gives an a/A ratio of 1, as the gradient of 0 beside it says, with the reason', () => {
    expect(0.21 * (760 - 47) - 40 / 0.8).toBeCloseTo(99.73, 2);
    expect(derived(note, 'aa_gradient').value).toBe(0);
    const ratio = derived(note, 'a_to_A_ratio');
    expect(ratio.value).toBe(1);
    expect(ratio.notes.join(' ')).toMatch(/within rounding of the alveolar PO2/);
  });

  it('on the summit of Everest too (PB 253 mmHg, West et al. 1983, read in its abstract): PAO2 0.21 × 206 − 12 ÷ 0.8 = 28.3, PaO2 30', () => {
    const summit = 'patient age 35 y\nplace barometric 253 mmHg\n@ 08:00\noxygen room air\nabg 7.70/12/30/14';
    expect(0.21 * (253 - 47) - 12 / 0.8).toBeCloseTo(28.26, 2);
    expect(derived(summit, 'aa_gradient').value).toBe(0);
    expect(derived(summit, 'a_to_A_ratio').value).toBe(1);
  });

  it('leaves a PaO2 below the alveolar PO2 as it is: 90 ÷ 99.7 = 0.90', () => {
    expect(derived(note.replace('/102/', '/90/'), 'a_to_A_ratio').value).toBeCloseTo(90 / (0.21 * 713 - 50), 6);
  });
});
