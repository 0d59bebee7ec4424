// The name of a note in a redacted export: its place in the run, never its path.
import { describe, expect, it } from 'vitest';
import { notePseudonym } from '../../server/src/core/export/pseudonym';

describe('notePseudonym', () => {
  it('pads the place to five digits, so the names of up to 99,999 notes sort in their order', () => {
    expect(notePseudonym(1)).toBe('note-00001');
    expect(notePseudonym(42)).toBe('note-00042');
    expect(notePseudonym(99999)).toBe('note-99999');
    expect(notePseudonym(123456)).toBe('note-123456');
    const names = Array.from({ length: 1200 }, (_, i) => notePseudonym(i + 1));
    expect([...names].sort()).toEqual(names);
  });

  it('refuses a place that is not a whole number from 1', () => {
    for (const bad of [0, -1, 1.5, Number.NaN, Number.POSITIVE_INFINITY]) expect(() => notePseudonym(bad), String(bad)).toThrow(RangeError);
  });
});
