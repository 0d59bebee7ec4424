// A key the section does not know, written with nothing after it, is reported once: as an unknown
// key (PN201), with the device or keys it is near and the fix, not also as a key with no value (PN102).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { applyEdits } from '../../server/src/core/service/text-edits';

const findings = (text: string) => checkNote(text).findings;

describe('an unknown key with no value is reported once', () => {
  it('`oxygen roomair`: the device offered, and the fixed note reads room air', () => {
    const text = '@ 08:00\noxygen roomair';
    const found = findings(text);
    expect(found.map((f) => f.code)).toEqual(['PN201']);
    expect(found[0]?.message).toBe('`roomair` is neither a device nor a key of oxygen lines. Did you mean `room air`?');
    const fixed = applyEdits(text, found[0]!.fixes[0]!.edits);
    expect(fixed).toBe('@ 08:00\noxygen room air');
    expect(findings(fixed)).toEqual([]);
    expect(checkNote(fixed).analysis.timeline.timepoints[0]?.values.get('device')?.stated.word).toBe('room air');
  });

  it('so is a misspelt device before other items, and an unknown key of another section', () => {
    expect(findings('@ 08:00\noxygen canula, fio2 0.3').map((f) => f.code)).toEqual(['PN201']);
    expect(findings('@ 08:00\nvitals hrr').map((f) => f.code)).toEqual(['PN201']);
  });

  it('a known key with no value is still reported as such', () => {
    const found = findings('@ 08:00\nabg ph');
    expect(found.map((f) => f.code)).toEqual(['PN102']);
    expect(found[0]?.message).toBe('`ph` has no value.');
  });
});
