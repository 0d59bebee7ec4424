// Did-you-mean fixes for unknown keys, and which of them "fix all" may apply unasked. A fix marked
// preferred is applied with every other safe fix at once (source.fixAll, fix on save), so it must
// never turn a key into a different field: the value would then be stated as something the writer
// never meant (`p 1.2` read as potassium). The rule is ours (common practice of safe auto-fixes, no source).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { applyEdits } from '../../server/src/core/service/text-edits';

function keyFixes(text: string): { key: string; titles: string[]; preferred: boolean[] }[] {
  const lines = text.split('\n');
  return checkNote(text).findings.filter((f) => f.code === 'PN201').map((f) => ({
    key: lines[f.range.start.line]!.slice(f.range.start.character, f.range.end.character),
    titles: f.fixes.map((x) => x.title),
    preferred: f.fixes.map((x) => x.preferred === true),
  }));
}

describe('a misspelt device written first on an oxygen line', () => {
  it('is offered the devices it is near, the fix applied reads the device and its flow', () => {
    const text = '@ 08:00\noxygen    canula 2 L/min\noxygen    hfcn 40 L/min\n';
    const found = checkNote(text).findings.filter((f) => f.code === 'PN201');
    expect(found.map((f) => f.message)).toEqual([
      '`canula` is neither a device nor a key of oxygen lines. Did you mean `cannula`?',
      '`hfcn` is neither a device nor a key of oxygen lines. Did you mean `hfnc`?',
    ]);
    expect(keyFixes(text).map((f) => [f.key, f.titles, f.preferred])).toEqual([
      ['canula', ['Change to `cannula`'], [true]],
      // Two letters swapped count as one edit, as for keys.
      ['hfcn', ['Change to `hfnc`'], [true]],
    ]);
    const fixed = checkNote('@ 08:00\noxygen    cannula 2 L/min\n');
    expect(fixed.findings).toEqual([]);
    expect(fixed.analysis.timeline.timepoints[0]!.values.numberOf('o2_flow')).toBe(2);
  });

  it('of two words with one misspelt (`room aor`, `rom air`) is reported once, on both words, and offered the device for them together', () => {
    for (const [written, line] of [['room aor', 'oxygen    room aor'], ['rom air', 'oxygen    rom air'], ['Room  Aor', 'oxygen    Room  Aor']] as const) {
      const text = `@ 08:00\n${line}\n`;
      const found = checkNote(text).findings.filter((f) => f.code === 'PN201');
      expect(found.map((f) => f.message), written).toEqual([`\`${written}\` is neither a device nor a key of oxygen lines. Did you mean \`room air\`?`]);
      // Its words are no keys without a value (PN102): the one finding says what they are.
      expect(checkNote(text).findings.map((f) => f.code), written).toEqual(['PN201']);
      // One letter from `room air`: safe for "fix all", as a one-letter slip of a long key is.
      expect(keyFixes(text).map((f) => [f.key, f.titles, f.preferred]), written).toEqual([[written, ['Change to `room air`'], [true]]]);
      const fixed = applyEdits(text, found[0]!.fixes[0]!.edits);
      expect(fixed).toBe('@ 08:00\noxygen    room air\n');
      const again = checkNote(fixed);
      expect(again.findings).toEqual([]);
      expect(again.analysis.timeline.timepoints[0]!.values.get('device')?.stated.word).toBe('room air');
    }
  });

  it('of two words keeps the flow after it, and the fix no longer leaves the second word behind (`raom air 2` was offered `room air air 2`)', () => {
    const text = '@ 08:00\noxygen raom air 2\n';
    const [f] = checkNote(text).findings.filter((x) => x.code === 'PN201');
    expect(f?.fixes.map((x) => applyEdits(text, x.edits))).toEqual(['@ 08:00\noxygen room air 2\n']);
    // The flow is then read as the device's (and room air takes none: PN310).
    const fixed = checkNote('@ 08:00\noxygen room air 2\n');
    expect(fixed.analysis.timeline.timepoints[0]!.values.numberOf('o2_flow')).toBe(2);
    expect(fixed.findings.map((x) => x.code)).toEqual(['PN310']);
  });

  it('of two words after the `device` key is offered the device too (PN205), and its second word is not reported as a key', () => {
    const text = '@ 08:00\noxygen device room aor, fio2 0.21\n';
    const found = checkNote(text).findings.filter((f) => f.code === 'PN205' || f.code === 'PN201');
    expect(found.map((f) => [f.code, f.message])).toEqual([['PN205', '`room aor` is not a known value for oxygen device. Did you mean `room air`?']]);
    expect(checkNote(text).findings.map((f) => f.code)).toEqual(['PN205']);
    const fixed = applyEdits(text, found[0]!.fixes[0]!.edits);
    expect(fixed).toBe('@ 08:00\noxygen device room air, fio2 0.21\n');
    expect(checkNote(fixed).findings).toEqual([]);
  });

  it('is not made of words a comma separates, of a word that is a key, or of words after the first item', () => {
    expect(keyFixes('@ 08:00\noxygen room, aor\n').map((f) => [f.key, f.titles])).toEqual([['room', []], ['aor', []]]);
    // Each unknown word once, as an unknown key (PN201), not also as a key with no value (PN102).
    expect(checkNote('@ 08:00\noxygen room, aor\n').findings.map((f) => f.code)).toEqual(['PN201', 'PN201']);
    expect(keyFixes('@ 08:00\noxygen mask 10, room aor\n').map((f) => [f.key, f.titles])).toEqual([['room', []], ['aor', []]]);
    expect(keyFixes('@ 08:00\noxygen room flow 2\n').map((f) => [f.key, f.titles])).toEqual([['room', []]]);
    expect(keyFixes('@ 08:00\noxygen room 5 L/min aor\n').map((f) => [f.key, f.titles])).toEqual([['room', []], ['aor', []]]);
  });

  it('is not offered a device after the first word, where a device cannot stand', () => {
    expect(keyFixes('@ 08:00\noxygen    mask 10, maks 5\n').map((f) => f.titles)).toEqual([[]]);
  });
});

describe('did-you-mean fixes for unknown keys', () => {
  it('never marks a fix of a one- or two-letter key as safe: `p` is one letter from `k`, `x` from `t`', () => {
    const fixes = keyFixes('@ 08:00\nlabs      na 140, p 1.2\nvitals    x 37\n');
    expect(fixes.map((f) => f.key)).toEqual(['p', 'x']);
    for (const f of fixes) expect(f.preferred.every((p) => !p)).toBe(true);
  });

  it('does not read punctuation as a key, so nothing offers to make it one (`120 / 80` is a pair)', () => {
    const text = '@ 08:00\nvitals    bp 120 / 80, hr 80\nvitals    hr 80 / 90\n';
    expect(keyFixes(text)).toEqual([]);
    const stray = checkNote(text).findings.filter((f) => f.code === 'PN105');
    expect(stray.map((f) => f.range.start.line)).toEqual([2, 2]);
  });

  it('marks safe a unique fix one letter away from a key of four letters or more, or a doubled letter', () => {
    const fixes = keyFixes('@ 08:00\nvitals    tempp 37.2, rrr 18\n');
    expect(fixes.map((f) => [f.key, f.titles, f.preferred])).toEqual([
      ['tempp', ['Change to `temp`'], [true]],
      ['rrr', ['Change to `rr`'], [true]],
    ]);
  });

  it('offers but does not mark safe a fix of a short key one substitution away', () => {
    const fixes = keyFixes('@ 08:00\nvitals    hx 80\n');
    expect(fixes[0]?.titles.length).toBeGreaterThan(0);
    expect(fixes[0]?.preferred.every((p) => !p)).toBe(true);
  });
});

describe('a line that starts with a key instead of a section (PN101)', () => {
  const fixTitles = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN101').flatMap((f) => f.fixes.map((x) => x.title));

  it('offers the section that owns the key when the line reads cleanly under it', () => {
    expect(fixTitles('@ 08:00\nhr 118, rr 20')).toEqual(['Start the line with `vitals`']);
    expect(fixTitles('@ 08:00\npco2 40')).toEqual(['Start the line with `abg`', 'Start the line with `vbg`']);
  });

  it('offers no section that would leave a key without its value (a fix that trades one problem for another)', () => {
    expect(fixTitles('@ 08:00\nlac')).toEqual([]);
    expect(fixTitles('@ 08:00\nhr')).toEqual([]);
  });

  it('reads the rest of the note as before (the trial reading does not disturb the lines after it)', () => {
    const text = '@ 08:00\nlac\nvitals hr 80, rr 18\nhr 90';
    const r = checkNote(text);
    expect(r.analysis.timeline.timepoints[0]!.values.get('rr')?.stated.value).toBe(18);
    expect(r.findings.map((f) => [f.code, f.range.start.line])).toEqual([['PN101', 1], ['PN101', 3]]);
  });
});

describe('an unknown unit near a spelling Pneumark accepts (PN202)', () => {
  const unitFixes = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN202').map((f) => f.fixes.map((x) => x.title));

  it('suggests the accepted spelling it is near, not only the unit\'s own symbol', () => {
    expect(unitFixes('@ 08:00\nvitals hr 80 bpmm')).toEqual([['Change to bpm']]);
    expect(unitFixes('@ 08:00\nabg po2 80 mmgh')).toEqual([['Change to mmHg']]);
  });

  it('suggests each unit once, and nothing far from every spelling', () => {
    expect(unitFixes('@ 08:00\nvitals hr 80 furlongs')).toEqual([[]]);
    // Two letters from `hPa` (an accepted spelling of mbar) is too far: a plateau of 0.00 hPa was never meant.
    expect(unitFixes('@ 08:00\nvent plateau 0.00 kpa2, peep 1 cmH2O')).toEqual([[]]);
  });
});
