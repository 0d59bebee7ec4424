// Edits met at a bedside that the other session tests do not make, each compared with a fresh
// analysis of the same text (tests/core/session-snapshot.ts: everything a user sees).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { NoteSession } from '../../server/src/core/session';
import type { Settings } from '../../server/src/core/settings';
import { sameAsJson, snapshot } from './session-snapshot';

/** Opens the first text in a session, then updates it to each of the others; every result is compared with a fresh analysis. */
function expectFreshThrough(texts: readonly string[], settings: Partial<Settings> = {}): NoteSession {
  const session = new NoteSession(settings);
  for (const text of texts) {
    const got = snapshot(session.update(text));
    const fresh = snapshot(checkNote(text, settings));
    if (!sameAsJson(got, fresh)) expect(got).toEqual(fresh);
  }
  return session;
}

describe('NoteSession: a setting held as before only when it reads the same', () => {
  it('reads `place barometric 0` again when `units gas` above it changes (0 is 0 in either unit, read in another)', () => {
    const note = (unit: string) => [`units     gas ${unit}`, 'place     barometric 0', '', '@ 08:00', 'abg       7.40/40/90/24'].join('\n');
    const session = expectFreshThrough([note('mmHg'), note('kPa'), note('mmHg')]);
    // The place line itself is unchanged: its value is read again under the new unit, not kept.
    expect(session.result!.analysis.timeline.timepoints[0]!.values.get('barometric')?.stated.readUnit).toBe('mmHg');
  });
});

describe('NoteSession: lines added above a timepoint whose findings quote a label', () => {
  it('reads again a timepoint whose FiO2 is carried from a timepoint labelled with words like `line 7`', () => {
    // PN401 names where its FiO2 came from with that timepoint's label (`carried from see line 7,
    // line 2`): a line added before the third timepoint must not move the `7` of the label.
    const before = [
      '@ day 1 08:00  see line 7',
      'vent      mode VC, vt 400 mL, peep 5, fio2 0.3',
      '',
      '@ 09:00',
      'vitals    hr 70',
      '@ 10:00',
      'abg       7.40/40/400/24',
    ];
    const after = [...before.slice(0, 3), 'vitals    hr 80', ...before.slice(3)];
    const fresh = checkNote(after.join('\n')).findings.find((f) => f.code === 'PN401');
    expect(fresh?.related?.[0]?.message).toBe('FiO2 0.30 in force (carried from see line 7, line 2)');
    expectFreshThrough([before.join('\n'), after.join('\n'), before.join('\n')]);
  });
});
