// The readings take shortcuts on the common path (no gas at the timepoint, no sodium and chloride
// for an anion gap, texts phrased only when read); each gives what the full path gives.
// Anion gap = Na − (Cl + HCO3), normal ≤ 12 mmol/L (common practice, no source); P/F = PaO2 ÷ FiO2,
// Berlin oxygenation bands with PEEP ≥ 5 cmH2O (ARDS Definition Task Force, JAMA 2012, from memory).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { readFileSync } from 'node:fs';
import { DeriveContext } from '../../server/src/core/derive/context';
import { DERIVED } from '../../server/src/core/derive/registry';
import { FIELDS } from '../../server/src/core/fields/registry';
import { withDefaults } from '../../server/src/core/settings';
import type { Kept } from '../../server/src/core/util/small-store';
import { derivation, derived, readings } from './helpers';

describe('readings of a timepoint without a gas', () => {
  it('are none, whatever is in force from earlier timepoints', () => {
    const note = ['@ 08:00', 'vent mode VC, vt 420 mL, rate 18, peep 10, fio2 0.6', 'abg 7.25/68/70/29', '@ 09:00', 'vitals hr 80, rr 20', 'vent plateau 24'].join('\n');
    expect(derivation(note, {}, 0).interpretations.length).toBeGreaterThan(0);
    expect(derivation(note, {}, 1).interpretations).toEqual([]);
    expect(checkNote(note).findings.filter((f) => f.code >= 'PN410' && f.code <= 'PN413').every((f) => f.range.start.line === 2)).toBe(true);
  });

  it('are read from a PaCO2 alone, and from a pH alone with nothing to read', () => {
    // PaCO2 52 mmHg: above the 50 mmHg hypercapnia threshold (setting).
    expect(readings('@ 08:00\nabg pco2 52').ventilation).toBe('PaCO2 52 mmHg: consistent with hypercapnia (above 50 mmHg): ventilation is not clearing CO2.');
    expect(derivation('@ 08:00\nabg ph 7.31').interpretations).toEqual([]);
  });
});

describe('the acid–base reading without a sodium and a chloride', () => {
  // 7.21/24/95/9.5: metabolic acidosis; with Na 140 and Cl 100 the gap is 140 − (100 + 9.5) = 30.5.
  const gas = 'abg 7.21/24/95/9.5';

  it('names the anion gap only when both are stated', () => {
    expect(readings(`@ 08:00\n${gas}\nlabs na 140, cl 100`)['acid-base']).toMatch(/with a high anion gap .*anion gap 31 mmol\/L/);
    expect(readings(`@ 08:00\n${gas}\nlabs na 140`)['acid-base']).not.toMatch(/anion gap/);
    expect(readings(`@ 08:00\n${gas}\nlabs cl 100`)['acid-base']).not.toMatch(/anion gap/);
    expect(readings(`@ 08:00\n${gas}`)['acid-base']).toMatch(/^Consistent with metabolic acidosis \(pH 7\.21, PaCO2 24 mmHg, HCO3 9\.5 mmol\/L\)/);
  });

  it('still reports what the anion gap lacks where a sodium is stated, whether the readings were read first or not', () => {
    const note = `@ 08:00\n${gas}\nlabs na 140, albumin 2.5`;
    const readingsFirst = checkNote(note).analysis.derivation(0);
    expect(readingsFirst.interpretations.length).toBeGreaterThan(0);
    const valuesOnly = checkNote(note).analysis.derivation(0);
    for (const d of [readingsFirst, valuesOnly]) {
      expect(d.missing.find((m) => m.id === 'anion_gap')?.message).toBe('add cl to get AG');
      expect(d.missing.find((m) => m.id === 'anion_gap_albumin_corrected')?.message).toBe('add cl to get AG corr');
    }
  });
});

describe('readings phrased when read', () => {
  const note = ['@ 08:00', 'vent mode VC, vt 420 mL, rate 18, peep 10, fio2 0.6', '@ 09:00', 'abg 7.36/44/90/24.4'].join('\n');

  it('write their text into JSON as a field, in the order topic, text, basis, line, notable, acidBase', () => {
    const list = checkNote(note).analysis.derivation(1).interpretations;
    const json = JSON.parse(JSON.stringify(list)) as Record<string, unknown>[];
    expect(json.map((r) => Object.keys(r))).toEqual(list.map(() => ['topic', 'text', 'basis', 'line', 'notable', 'acidBase']));
    expect(json.map((r) => r.text)).toEqual(list.map((r) => r.text));
    expect(json.map((r) => r.topic)).toEqual(['oxygenation', 'oxygenation-band', 'ventilation', 'acid-base']);
    // The acid–base reading's finding goes with it (7.36/44/24.4: normal by the three values); the others have none.
    expect(json.map((r) => r.acidBase)).toEqual([null, null, null, { primary: 'normal', phase: null, fullyCompensated: false, anionGap: null, suspected: null, added: [] }]);
  });

  it('give one text however often and in whatever order they are read', () => {
    const a = checkNote(note).analysis.derivation(1).interpretations;
    const b = checkNote(note).analysis.derivation(1).interpretations;
    const forwards = a.map((r) => r.text);
    const backwards = [...b].reverse().map((r) => r.text).reverse();
    expect(backwards).toEqual(forwards);
    expect(a.map((r) => r.text)).toEqual(forwards);
  });

  it('write a missing value’s message into JSON as a field', () => {
    const missing = checkNote('@ 08:00\nabg 7.40/40/90/24').analysis.derivation(0).missing;
    const pf = JSON.parse(JSON.stringify(missing)).find((m: { id: string }) => m.id === 'pf_ratio');
    expect(pf).toEqual({ id: 'pf_ratio', label: 'P/F ratio', needs: ['fio2 (or an oxygen line)'], message: 'add fio2 (or an oxygen line) to get P/F', line: 1 });
  });
});

describe('settings carried from two lines', () => {
  it('are named with each line (90 ÷ 0.50 = P/F 180 mmHg)', () => {
    const note = ['@ 08:00', 'vent mode VC, vt 420 mL, rate 18, peep 10, fio2 0.6', '@ 09:00', 'vent fio2 0.5', '@ 10:00', 'abg 7.36/44/90/24.4'].join('\n');
    const r = readings(note, {}, 2);
    expect(r.oxygenation).toBe('PaO2 90 mmHg on FiO2 0.50 (P/F 180 mmHg; FiO2 carried from line 4): consistent with impaired oxygenation supported by oxygen.');
    expect(r['oxygenation-band']).toMatch(/^P\/F 180 mmHg with PEEP 10 cmH2O \(FiO2 carried from line 4; PEEP carried from line 2\): consistent with the 100–200 mmHg oxygenation band/);
  });

  it('are named together when they come from one line, and not at all when stated with the gas', () => {
    const note = ['@ 08:00', 'oxygen niv ipap 14, epap 6, fio2 0.5', '@ 09:00', 'abg 7.36/44/90/24.4', '@ 10:00', 'oxygen niv ipap 14, epap 6, fio2 0.5', 'abg 7.36/44/90/24.4'].join('\n');
    expect(readings(note, {}, 1)['oxygenation-band']).toMatch(/with EPAP 6 cmH2O \(FiO2 and EPAP carried from line 2\): below the 200–300 mmHg oxygenation band/);
    expect(readings(note, {}, 2)['oxygenation-band']).toMatch(/with EPAP 6 cmH2O: below the 200–300 mmHg oxygenation band/);
  });
});

describe('a gas line without a gas', () => {
  it('gives no readings (a lactate alone)', () => {
    expect(derivation('@ 08:00\nabg lactate 2.1').interpretations).toEqual([]);
  });
});

describe('what a derivation context reads of the values in force', () => {
  const table = { list: DERIVED, slots: new Map(DERIVED.map((d, i) => [d.id, i])) };
  const samples = ['icu-ventilated-lung-injury', 'summit-hut-evacuation', 'home-oxygen-exacerbation'].map((n) => readFileSync(`samples/${n}.pneu`, 'utf8'));

  it('agrees with the values in force, whether a field is read before or after it is asked about', () => {
    for (const text of samples) {
      const { analysis, settings } = checkNote(text);
      for (const tp of analysis.timeline.timepoints) {
        const askedFirst = new DeriveContext(tp, settings, table);
        const readFirst = new DeriveContext(tp, settings, table);
        for (const f of FIELDS) {
          const here = tp.values.originOf(f.id) === 'here';
          const inForce = tp.values.get(f.id) ?? null;
          expect(askedFirst.statedHere(f.id), `${f.id} at ${tp.label}`).toBe(here);
          expect(askedFirst.input(f.id)).toEqual(inForce);
          expect(readFirst.input(f.id)).toEqual(inForce);
          expect(readFirst.statedHere(f.id), `${f.id} at ${tp.label}`).toBe(here);
          // Asked again: the same answers, and the same term object for the same name.
          expect(readFirst.statedHere(f.id)).toBe(here);
          expect(readFirst.field(f.id)).toBe(readFirst.field(f.id));
          // The number alone, asked before and after the field is read, is the term's number.
          const numberOnly = new DeriveContext(tp, settings, table).number(f.id);
          expect(numberOnly).toBe(readFirst.field(f.id)?.value ?? null);
          expect(readFirst.number(f.id)).toBe(numberOnly);
        }
      }
    }
  });

  it('keeps each memo once, the first and the others, also one asked for while another is computed', () => {
    const tp = checkNote('@ 08:00\nabg 7.40/40/90/24').analysis.timeline.timepoints[0]!;
    const c = new DeriveContext(tp, withDefaults(), table);
    const computed = { a: 0, b: 0, c: 0 };
    const b: Kept<number, DeriveContext> = { name: 'b', compute: () => 10 + ++computed.b };
    const a: Kept<number, DeriveContext> = { name: 'a', compute: (ctx) => ctx.memo(b) + 100 + ++computed.a };
    const third: Kept<string | undefined, DeriveContext> = { name: 'c', compute: () => (++computed.c, undefined) };
    expect(c.memo(a)).toBe(112);
    expect(c.memo(b)).toBe(11);
    expect(c.memo(a)).toBe(112);
    expect(c.memo(third)).toBeUndefined();
    expect(c.memo(third)).toBeUndefined();
    expect(computed).toEqual({ a: 1, b: 1, c: 1 });
  });
});

describe('inputs shared from timepoint to timepoint', () => {
  it('give the respiratory quotient of the settings each note is checked with', () => {
    const note = '@ 08:00\noxygen room air\nabg 7.40/40/90/24';
    const rq = (settings: Parameters<typeof derived>[2]) => derived(note, 'pao2_alveolar', settings).inputs.find((t) => t.name === 'RQ')?.value;
    expect(rq({})).toBe(0.8);
    expect(rq({ respiratoryQuotient: 1 })).toBe(1);
    expect(rq({})).toBe(0.8);
  });

  it('name each temperature stated beside PH2O, repeated or not, with the field’s decimals', () => {
    const note = ['@ 08:00', 'oxygen room air', 'vitals temp 38.1 C', 'abg 7.40/40/90/24', '@ 09:00', 'vitals temp 38.1 C', 'abg 7.40/40/90/24', '@ 10:00', 'vitals temp 100.4 F', 'abg 7.40/40/90/24', '@ 11:00', 'abg 7.40/40/90/24'].join('\n');
    const ph2o = (tp: number) => derived(note, 'pio2', {}, tp).inputs.find((t) => t.name === 'PH2O')!;
    const why = 'humidified at 37 °C, the pinned convention (setting waterVapour: fixed)';
    expect(ph2o(0).origin).toEqual({ kind: 'default', description: `${why}; the temperature 38.1 °C stated here is not used` });
    expect(ph2o(1).origin).toEqual(ph2o(0).origin);
    // 100.4 °F = 38 °C, shown with one decimal as every temperature input.
    expect(ph2o(2).origin).toEqual({ kind: 'default', description: `${why}; the temperature 38.0 °C stated here is not used` });
    expect(ph2o(3).origin).toEqual({ kind: 'default', description: why });
    expect(ph2o(0).value).toBe(47);
  });
});
