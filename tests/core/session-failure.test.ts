// An update that fails part-way (an analysis error in some later code) must not leave the session
// out of step with its text: the server logs the error and goes on with the same session, so the
// next edit would otherwise be read against line starts of a text the session never finished.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { NoteSession } from '../../server/src/core/session';

/** When set, the next timeline build throws (standing in for any error after the parse). */
const fault = vi.hoisted(() => ({ armed: false }));

vi.mock('../../server/src/core/analysis/timeline', async (importOriginal) => {
  const original = await importOriginal<typeof import('../../server/src/core/analysis/timeline')>();
  return {
    ...original,
    buildTimelineIncremental: (...args: Parameters<typeof original.buildTimelineIncremental>) => {
      if (fault.armed) {
        fault.armed = false;
        throw new Error('simulated analysis failure');
      }
      return original.buildTimelineIncremental(...args);
    },
  };
});

const NOTE = ['patient   age 60 y, sex male, height 178 cm', '', '@ day 1 08:00', 'vitals    hr 80, rr 18', 'abg       7.40/40/90/24', '', '@ 10:00', 'vent      mode VC, vt 420 mL, peep 8, fio2 0.5, plateau 24', 'abg       7.35/48/70/25'].join('\n');

function plain(r: ReturnType<typeof checkNote>): unknown {
  return {
    lines: r.analysis.tree.lines,
    findings: r.findings,
    timepoints: r.analysis.timeline.timepoints.map((tp) => ({ line: tp.line, startLine: tp.startLine, endLine: tp.endLine, time: tp.time, values: [...tp.values.entries()].map(([k, v]) => [k, v.stated.value, v.origin]) })),
  };
}

describe('NoteSession after an update that failed', () => {
  beforeEach(() => { fault.armed = false; });

  it('reads the next text right when the failed edit changed line lengths but not the line count', () => {
    const session = new NoteSession();
    session.update(NOTE);
    // Same number of lines, the first one longer: the session's line starts are updated in place.
    const failed = NOTE.replace('patient   age 60 y', 'patient   age 60 y, weight 91 kg');
    fault.armed = true;
    expect(() => session.update(failed)).toThrow('simulated analysis failure');
    // Edits after it, each compared with a fresh analysis: a line start left wrong shows on a later one.
    let text = failed;
    for (const [from, to] of [['hr 80', 'hr 81'], ['7.35/48', '7.31/48'], ['rr 18', 'rr 19'], ['plateau 24', 'plateau 26'], ['@ 10:00', '@ 10:30']] as const) {
      text = text.replace(from, to);
      expect(plain(session.update(text))).toEqual(plain(checkNote(text)));
    }
  });

  it('reads the next text right when the failed edit added lines', () => {
    const session = new NoteSession();
    session.update(NOTE);
    const failed = NOTE.replace('@ 10:00', 'note      extra line\n\n@ 10:00');
    fault.armed = true;
    expect(() => session.update(failed)).toThrow('simulated analysis failure');
    let text = failed;
    for (const [from, to] of [['peep 8', 'peep 10'], ['hr 80', 'hr 81'], ['7.35/48', '7.31/48'], ['extra line', 'extra']] as const) {
      text = text.replace(from, to);
      expect(plain(session.update(text))).toEqual(plain(checkNote(text)));
    }
    // And back to the text before the failure.
    expect(plain(session.update(NOTE))).toEqual(plain(checkNote(NOTE)));
  });

  it('ends a reading in steps that failed, and the next reading starts afresh', () => {
    const session = new NoteSession();
    const big = Array.from({ length: 40 }, (_, i) => `@ +1h\nvitals hr ${60 + i}\nabg 7.40/40/${80 + i}/24`).join('\n');
    const steps = session.steps(big, 5);
    steps.next();
    fault.armed = true;
    expect(() => steps.next()).toThrow('simulated analysis failure');
    const edited = big.replace('hr 61', 'hr 161 extra words');
    const rest = session.steps(edited, 5);
    let step = rest.next();
    while (!step.done) step = rest.next();
    expect(plain(step.value)).toEqual(plain(checkNote(edited)));
  });
});
