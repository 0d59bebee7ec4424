import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkNote, KEEP_DERIVATIONS_UP_TO } from '../../server/src/core/check-note';
import type { NoteResult } from '../../server/src/core/check-note';

const FIXTURES = join(__dirname, '../fixtures');

/** Every timepoint's derivation as plain data (getters read, private caches left out). */
function derivations(result: NoteResult): unknown {
  return JSON.parse(JSON.stringify(result.analysis.timeline.timepoints.map((tp) => {
    const d = result.analysis.derivation(tp.index);
    return { derived: d.derived.map((v) => ({ ...v, substituted: v.substituted })), missing: d.missing, notApplicable: d.notApplicable, interpretations: d.interpretations.map((i) => ({ ...i, text: i.text })) };
  })));
}

describe('checkNote with keepDerivations', () => {
  it('answers with the derivations the checks made, equal to those derived afresh, and the same findings', () => {
    for (const name of readdirSync(FIXTURES).filter((f) => f.endsWith('.pneu'))) {
      const text = readFileSync(join(FIXTURES, name), 'utf8');
      const fresh = checkNote(text);
      const kept = checkNote(text, {}, { keepDerivations: true });
      expect(kept.findings, name).toEqual(fresh.findings);
      expect(derivations(kept), name).toEqual(derivations(fresh));
    }
  });

  it('hands back the very derivation the checks used, read again', () => {
    const result = checkNote('@ 08:00\nabg 7.35/40/90/22\nvent vc vt 450 rr 14 peep 5 fio2 0.4\n', {}, { keepDerivations: true });
    expect(result.analysis.derivation(0)).toBe(result.analysis.derivation(0));
    expect(checkNote('@ 08:00\nabg 7.35/40/90/22\n').analysis.derivation(0)).not.toBe(checkNote('@ 08:00\nabg 7.35/40/90/22\n').analysis.derivation(0));
  });

  it('keeps none for a note of more timepoints than the limit, which derives on request', () => {
    const text = Array.from({ length: KEEP_DERIVATIONS_UP_TO + 1 }, (_, i) => `@ +${i + 1}m\nspo2 95\n`).join('');
    const result = checkNote(text, {}, { keepDerivations: true });
    expect(result.analysis.timeline.timepoints.length).toBe(KEEP_DERIVATIONS_UP_TO + 1);
    expect(result.analysis.derivation(0)).not.toBe(result.analysis.derivation(0));
  });
});
