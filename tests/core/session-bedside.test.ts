// Edits met at a bedside that the other session tests do not make, each compared with a fresh
// analysis of the same text (tests/core/session-snapshot.ts: everything a user sees).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { NoteSession } from '../../server/src/core/session';
import { codeActions } from '../../server/src/core/service/actions';
import type { Settings } from '../../server/src/core/settings';
import { sameAsJson, snapshot } from './session-snapshot';
import type { NoteResult } from '../../server/src/core/check-note';

/** The code actions offered with the cursor at each character of each line. */
function actionsEverywhere(result: NoteResult): unknown[] {
  const out: unknown[] = [];
  for (const node of result.analysis.tree.lines) {
    for (let character = 0; character <= node.text.length; character++) {
      const at = { line: node.line, character };
      out.push([at, codeActions(result, { start: at, end: at })]);
    }
  }
  return out;
}

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

describe('NoteSession: code actions on a line read again though unchanged', () => {
  // A line next to a change is read again (its terminator, or the character after it, is in the
  // changed stretch), so the tree holds a new node for it; when its timepoint is kept, the values
  // in force still hold the items of the node read before. The actions at a value must not care.
  const cases: { name: string; before: string; after: string }[] = [
    {
      name: 'a line end changed on the blank line after a gas (LF to CRLF)',
      before: '@ 08:00\nabg       7.33/45/82/23.1, etco2 40\n\n@ 09:00\nvitals    hr 80\n',
      after: '@ 08:00\nabg       7.33/45/82/23.1, etco2 40\n\r\n@ 09:00\nvitals    hr 80\n',
    },
    {
      name: 'the line end of a setting line changed (LF to CRLF)',
      before: '@ 08:00\nvent      peep 12, fio2 0.6, map 18\n@ 09:00\nvitals    hr 80\n',
      after: '@ 08:00\nvent      peep 12, fio2 0.6, map 18\r\n@ 09:00\nvitals    hr 80\n',
    },
    {
      name: 'two lines far apart changed at once (a fix applied to the whole note)',
      before: '@ 08:00\nvitals    hr 80.\n@ 09:00\nabg       7.33/45/82/23.1\n@ 10:00\nvitals    hr 81.\n',
      after: '@ 08:00\nvitals    hr 80\n@ 09:00\nabg       7.33/45/82/23.1\n@ 10:00\nvitals    hr 81\n',
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const session = new NoteSession();
      session.update(c.before);
      const got = session.update(c.after);
      const fresh = checkNote(c.after);
      const offered = actionsEverywhere(fresh);
      // Not vacuous: values on the unchanged lines are offered their unit written out, or in another unit.
      expect(JSON.stringify(offered)).toMatch(/Write the unit|shorthand gas pressures in kPa/);
      expect(actionsEverywhere(got)).toEqual(offered);
    });
  }
});
