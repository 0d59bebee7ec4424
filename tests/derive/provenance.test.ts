// Every derived value names each input and where it came from; missing inputs are named
// instead of computing from nothing.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { allDerivations } from '../../server/src/core/analysis/analyse';
import { checkNote } from '../../server/src/core/check-note';
import { DERIVED } from '../../server/src/core/derive/registry';
import { anyText } from '../helpers/arbitraries';
import { derivation, derived } from './helpers';

const icu = [
  'patient age 58 y, sex female, height 165 cm', // 0
  '@ day 1 08:00 start', //                        1
  'vent mode VC, vt 420 mL, rate 20, peep 10, fio2 0.6, plateau 27, peak 33, flow 60 L/min', // 2
  '@ 10:00 later', //                              3
  'vent plateau 28', //                            4
  'abg 7.31/47/88/23.2', //                        5
].join('\n');

describe('inputs and where they came from', () => {
  it('names the line, the carried timepoint and the header for each input', () => {
    const pf = derived(icu, 'pf_ratio');
    expect(pf.value).toBeCloseTo(88 / 0.6, 6);
    expect(pf.inputs.map((t) => [t.name, t.origin.kind])).toEqual([['PaO2', 'here'], ['FiO2', 'carried']]);
    expect(pf.inputs[1]?.origin).toMatchObject({ kind: 'carried', line: 2, timepointLabel: 'start' });
    expect(pf.usesCarried).toBe(true);
    expect(pf.substituted).toBe('88 ÷ 0.60 = 147 mmHg');
    expect(pf.formula).toBe('PaO2 ÷ FiO2');
    expect(pf.line).toBe(5);
    const pbw = derived(icu, 'predicted_body_weight', {}, 0);
    expect(pbw.inputs.find((t) => t.name === 'height')?.origin).toMatchObject({ kind: 'header', line: 0 });
  });

  it('chains derived values and marks defaults (sea level, RQ, water vapour)', () => {
    const aa = derived(icu, 'aa_gradient');
    expect(aa.inputs[0]?.origin).toEqual({ kind: 'derived', id: 'pao2_alveolar' });
    const pio2 = derived(icu, 'pio2');
    expect(pio2.inputs.map((t) => t.origin.kind)).toEqual(['carried', 'derived', 'default']);
    const pb = derived(icu, 'barometric');
    expect(pb.value).toBe(760);
    expect(pb.inputs[0]?.origin).toEqual({ kind: 'default', description: 'sea level assumed: no place stated' });
    const pA = derived(icu, 'pao2_alveolar');
    expect(pA.inputs.find((t) => t.name === 'RQ')?.value).toBe(0.8);
  });

  it('takes the sampling FiO2 on the gas line over the ventilator setting', () => {
    const note = `${icu}, fio2 0.5`;
    const pf = derived(note, 'pf_ratio');
    expect(pf.value).toBeCloseTo(176, 0);
    expect(pf.inputs[1]?.origin.kind).toBe('here');
  });

  it('reads room air as FiO2 0.21 and says so', () => {
    const pf = derived('@ 08:00\noxygen room air\nabg 7.40/40/95/24', 'pf_ratio');
    expect(pf.inputs[1]).toMatchObject({ name: 'FiO2', value: 0.21, note: 'room air' });
  });

  it('names what to add when an input is missing, and computes nothing from it', () => {
    const d = derivation('@ 08:00\nabg 7.40/40/95/24');
    expect(d.derived.find((x) => x.id === 'pf_ratio')).toBeUndefined();
    expect(d.missing.find((m) => m.id === 'pf_ratio')?.message).toBe('add fio2 (or an oxygen line) to get P/F');
    expect(d.missing.find((m) => m.id === 'aa_gradient')?.needs).toEqual(['fio2 (or an oxygen line)']);
  });

  it('asks for the FiO2 on the vent line when the patient is on the ventilator, not for an oxygen line', () => {
    // A vent line ends the oxygen line before it, with its FiO2: the FiO2 goes on the vent line.
    const d = derivation('@ 08:00\noxygen venturi, fio2 0.28\nvent mode VC, peep 5\nabg 7.40/40/90/24');
    expect(d.missing.find((m) => m.id === 'pf_ratio')?.message).toBe('add fio2 (on the vent line) to get P/F');
    expect(derivation('@ 08:00\nvent peep 5\n@ 09:00\nabg 7.40/40/90/24').missing.find((m) => m.id === 'pf_ratio')?.message).toBe('add fio2 (on the vent line) to get P/F');
    expect(derivation('@ 08:00\nvent peep 5\n@ 09:00\noxygen cannula 2\nabg 7.40/40/90/24').missing.find((m) => m.id === 'pf_ratio')?.message).toBe("add fio2 (a cannula's FiO2 is only an estimate) to get P/F");
  });

  it('asks for a usable FiO2, and says where, when the one written is kept out of calculations', () => {
    // 1.5 with no unit reads as 1.5 %, below room air: impossible (PN307), so not used.
    const d = derivation('@ 08:00\nvent mode VC, vt 450, rate 14, peep 5, fio2 1.5\nabg 7.40/40/90/24');
    expect(d.missing.find((m) => m.id === 'pf_ratio')?.message).toBe('add a usable fio2 (the one on line 2 is not used: see its finding) to get P/F');
    // Carried from an earlier timepoint, it is still the one to mend.
    const carried = derivation('@ 08:00\noxygen venturi, fio2 0.1\n@ 09:00\nabg 7.40/40/90/24');
    expect(carried.missing.find((m) => m.id === 'pf_ratio')?.message).toBe('add a usable fio2 (the one on line 2 is not used: see its finding) to get P/F');
  });

  it('names each key to add once, as a list a sentence writes, also through another derived value', () => {
    // The delta ratio needs the anion gap (na, cl, hco3) and an hco3 of its own: hco3 once.
    const labs = derivation('@ 08:00\nlabs na 140');
    expect(labs.missing.find((m) => m.id === 'delta_ratio')).toMatchObject({ needs: ['cl', 'hco3'], message: 'add cl and hco3 to get Δ ratio' });
    const gas = derivation('@ 08:00\nabg po2 71 mmhgg');
    // The po2 is written, in a unit Pneumark does not read: a usable one is asked for, on its line.
    expect(gas.missing.find((m) => m.id === 'aa_gradient')?.message).toBe('add a usable po2 (the one on line 2 is not used: see its finding), fio2 (or an oxygen line) and pco2 to get A–a');
  });

  it('names a value whose short name ends in a sign without the sign', () => {
    // `A–a normal ≤ 14 mmHg` in a list of values; `to get A–a normal` in a sentence.
    const d = derivation('@ 08:00\noxygen room air\nabg 7.40/40/95/24');
    expect(d.missing.find((m) => m.id === 'aa_gradient_upper_normal')?.message).toBe('add age (patient line) to get A–a normal');
  });

  it('labels a low-flow FiO2 as an estimate and never uses it for P/F', () => {
    const d = derivation('@ 08:00\noxygen cannula 3 L/min\nabg 7.40/40/95/24');
    const est = d.derived.find((x) => x.id === 'fio2_estimated');
    // Nasal cannula ≈ 0.21 + 0.04 per L/min up to 6 L/min (common practice, rough).
    expect(est?.value).toBeCloseTo(0.33, 6);
    expect(est?.estimate).toBe(true);
    expect(d.derived.find((x) => x.id === 'pf_ratio')).toBeUndefined();
    expect(d.missing.find((m) => m.id === 'pf_ratio')?.message).toBe("add fio2 (a cannula's FiO2 is only an estimate) to get P/F");
  });

  it('does not use a value that failed its checks (impossible, or a doubtful unit)', () => {
    const d = derivation('@ 08:00\noxygen room air\nabg ph 7.4, pco2 40, po2 9.1');
    expect(d.derived.find((x) => x.id === 'pf_ratio')).toBeUndefined();
    const e = derivation('@ 08:00\nvent vt 450, peep 60, plateau 25');
    expect(e.derived.find((x) => x.id === 'driving_pressure')).toBeUndefined();
  });

  it('lists every derived id once, in snake_case, with a source', () => {
    const ids = DERIVED.map((d) => d.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const d of DERIVED) expect(d.source.length, d.id).toBeGreaterThan(10);
  });
});

describe('never NaN, Infinity or undefined', () => {
  it('holds for every derived value, missing note and reading on generated notes (400 cases)', () => {
    fc.assert(
      fc.property(anyText, (text) => {
        for (const d of allDerivations(checkNote(text).analysis)) {
          for (const v of d.derived) {
            expect(Number.isFinite(v.value), v.id).toBe(true);
            for (const t of v.inputs) expect(Number.isFinite(t.value)).toBe(true);
            expect(`${v.substituted} ${v.notes.join(' ')}`).not.toMatch(/NaN|Infinity|undefined/);
          }
          for (const i of d.interpretations) expect(i.text).not.toMatch(/NaN|Infinity|undefined/);
          for (const m of d.missing) expect(m.message).not.toMatch(/NaN|Infinity|undefined/);
        }
      }),
      { numRuns: 400 },
    );
  });

  it('holds on notes made of real keys with extreme numbers (400 cases)', () => {
    const value = fc.oneof(fc.constantFrom(0, -0, 1e-9, 1e9, -5, 0.21, 100, 760), fc.double({ min: -1e6, max: 1e6, noNaN: true }));
    fc.assert(
      fc.property(fc.array(value, { minLength: 14, maxLength: 14 }), (v) => {
        const f = (x: number | undefined) => String(x ?? 0);
        const text = `patient age ${f(v[0])}, sex male, height ${f(v[1])}\nplace altitude ${f(v[2])}\n@ 08:00\nvent vt ${f(v[3])}, rate ${f(v[4])}, peep ${f(v[5])}, fio2 ${f(v[6])}, plateau ${f(v[7])}, peak ${f(v[8])}, flow ${f(v[9])}, map ${f(v[10])}\nabg ${f(v[11])}/${f(v[12])}/${f(v[13])}/24\nlabs na 140, cl 100, albumin 3`;
        for (const d of allDerivations(checkNote(text).analysis)) for (const x of d.derived) expect(Number.isFinite(x.value), x.id).toBe(true);
      }),
      { numRuns: 400 },
    );
  });
});
