// PN308: timepoints move forward in time (a format rule, grammar/README.md). A timepoint with a day
// but no time of day is placed by its day.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';

const backAt = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN308').map((f) => f.range.start.line + 1);

describe('a timepoint earlier than the one before (PN308)', () => {
  it('by its time, as before', () => {
    expect(backAt('@ day 2 08:00\n@ day 1 09:00\n')).toEqual([2]);
    // A clock time without a day that is earlier is the next day, not a step back.
    expect(backAt('@ day 1 23:00\n@ 01:00\n')).toEqual([]);
  });

  it('by its day, when it has no time of day', () => {
    expect(backAt('@ day 3\n@ day 2\n')).toEqual([2]);
    expect(backAt('@ day 2 10:00\n@ day 1\n')).toEqual([2]);
    // Against the latest day read, also across timepoints without a time.
    expect(backAt('@ day 3 08:00\n@ +1h\n@ day 2\n')).toEqual([3]);
  });

  it('names the timepoint by its time as written, not by its label', () => {
    const messages = checkNote('@ day 2 08:00\n@ day 1 00:39  but this is\n').findings.filter((f) => f.code === 'PN308').map((f) => f.message);
    expect(messages).toEqual(['This timepoint (@ day 1 00:39) is earlier than the one before it.']);
  });

  it('not for the same day, a later day, or a time later on a day given alone', () => {
    expect(backAt('@ day 1 08:00\n@ day 1\n@ day 2\n@ 09:00\n')).toEqual([]);
    expect(backAt('@ day 2\n@ day 2 07:00\n@ day 3\n')).toEqual([]);
    expect(backAt('@ day 1 23:00\n@ +2h\n@ day 2\n')).toEqual([]);
  });
});
