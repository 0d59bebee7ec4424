// Derived values are computed on demand, part by part: whatever is read first, the answers are
// the ones a full derivation gives.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { DERIVED, derivedAt, derivedValueOf } from '../../server/src/core/derive/registry';
import { nearlyValidNote } from '../helpers/arbitraries';
import { readFileSync } from 'node:fs';

const plain = (d: ReturnType<ReturnType<typeof checkNote>['analysis']['derivation']>) => ({
  timepoint: d.timepoint,
  derived: d.derived.map((v) => ({ ...v, substituted: v.substituted })),
  missing: d.missing.map((m) => ({ ...m, message: m.message })),
  notApplicable: d.notApplicable,
  // A reading's text is phrased on first read (a getter): compared as read.
  interpretations: d.interpretations.map((i) => ({ topic: i.topic, text: i.text, basis: i.basis, line: i.line, notable: i.notable })),
});

const samples = ['icu-ventilated-lung-injury', 'summit-hut-evacuation', 'home-oxygen-exacerbation'].map((n) => readFileSync(`samples/${n}.pneu`, 'utf8'));
const notes = fc.oneof(nearlyValidNote, fc.constantFrom(...samples));

describe('derivations on demand', () => {
  it('give the same values whichever part is read first (300 notes)', () => {
    fc.assert(
      fc.property(notes, fc.nat(), (text, seed) => {
        const { analysis, settings } = checkNote(text);
        for (const tp of analysis.timeline.timepoints) {
          const whole = plain(analysis.derivation(tp.index));
          // Read single values first, in an order of the seed's choosing, then the rest.
          const piecemeal = analysis.derivation(tp.index);
          const ids = DERIVED.map((d) => d.id);
          for (let k = 0; k < ids.length; k++) {
            const id = ids[(k * 7 + seed) % ids.length]!;
            const one = derivedValueOf(piecemeal, id);
            const listed = whole.derived.find((v) => v.id === id) ?? null;
            expect(one === null ? null : { ...one, substituted: one.substituted }, `${id} at ${tp.label}`).toEqual(listed);
            const alone = derivedAt(tp, settings, id);
            expect(alone === null ? null : alone.value).toBe(listed === null ? null : listed.value);
          }
          expect(plain(piecemeal)).toEqual(whole);
          // Interpretations first, then the lists.
          const readingsFirst = analysis.derivation(tp.index);
          const readings = readingsFirst.interpretations;
          expect(plain(readingsFirst)).toEqual(whole);
          expect(readings.map((i) => i.text)).toEqual(whole.interpretations.map((i) => i.text));
        }
      }),
      { numRuns: 300 },
    );
  });

  it('report a value in the list and through derivedValueOf as the same object', () => {
    const { analysis } = checkNote(samples[0]!);
    for (const tp of analysis.timeline.timepoints) {
      const d = analysis.derivation(tp.index);
      for (const v of d.derived) expect(derivedValueOf(d, v.id)).toBe(v);
      expect(derivedValueOf(d, 'no_such_value')).toBeNull();
    }
  });
});
