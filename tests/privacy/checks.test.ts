// The privacy checks in a note: which parts of a line are read, the setting that switches them
// off, ranges, severities and the placeholder fixes.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { checkByCodeOrAlias } from '../../server/src/core/checks/registry';
import { NoteSession } from '../../server/src/core/session';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { hitsInProse, isPrivacyCode, privacyHits } from './helpers';
import { freeTextOf } from '../../server/src/core/privacy/free-text';
import { parseLine } from '../../server/src/core/syntax/parser';

describe('where the privacy checks look', () => {
  it('reads comments, note prose, timepoint labels and lines that are not sections', () => {
    const note = [
      'vitals    hr 118                 # Mr Smith on the phone',
      'note      name: Jane Roe',
      '@ day 1 07:40  seen by Dr Patel',
      'Jane Roe DOB 12/03/1961',
    ].join('\n');
    expect(privacyHits(note)).toEqual([
      { code: 'PN501', text: 'Smith' },
      { code: 'PN501', text: 'Jane Roe' },
      { code: 'PN501', text: 'Patel' },
      { code: 'PN502', text: '12/03/1961' },
    ]);
  });

  it('reads free words and unread text on item lines, never the readings', () => {
    expect(privacyHits('oxygen    device jane.roe@example.org')).toEqual([{ code: 'PN505', text: 'jane.roe@example.org' }]);
    expect(privacyHits('patient   mrn 1234567')).toEqual([{ code: 'PN506', text: '1234567' }]);
    expect(privacyHits('patient   Jane Roe, age 64 y')).toEqual([{ code: 'PN501', text: 'Jane Roe' }]);
    expect(privacyHits('labs      na 139, 20260304')).toEqual([{ code: 'PN503', text: '20260304' }]);
    // A reading with a known key is clinical, however odd its number: other checks judge it.
    expect(privacyHits('vitals    hr 1234567')).toEqual([]);
    expect(privacyHits('place     altitude 1650 m, barometric 628 mmHg')).toEqual([]);
    expect(privacyHits('vent      mode VC, vt 430 mL, rate 24, peep 10, fio2 0.6, plateau 29, peak 34, flow 60 L/min, map 17')).toEqual([]);
  });

  it('leaves nothing to scan on a line of readings: listed words and the slashes of a shorthand gas are readings too', () => {
    const free = (line: string) => freeTextOf(parseLine(line, 0)).map((f) => f.text.trim());
    expect(free('vent      mode VC, vt 430 mL, peep 10')).toEqual([]);
    expect(free('abg       7.42/41/98/26.5, lactate 1.1')).toEqual([]);
    expect(free('vitals    bp 120/80, hr 72')).toEqual([]);
    // A word the field does not list is free text, and so is anything beside the readings.
    expect(free('vent      mode Smith, peep 10')).toEqual(['vent      mode Smith,']);
    const beside = free('abg       7.42/41/98/26.5 12/03/1961');
    expect(beside).toEqual([expect.stringMatching(/^abg[ /]+12\/03\/1961$/)]);
    expect(privacyHits('abg       7.42/41/98/26.5, DOB 12/03/1961')).toEqual([{ code: 'PN502', text: '12/03/1961' }]);
  });

  it('leaves the time of a timepoint to the syntax check (a calendar date there is PN104 alone)', () => {
    const codes = checkNote('@ 2026-03-04 08:00').findings.map((f) => f.code);
    expect(codes).toContain('PN104');
    expect(codes.filter(isPrivacyCode)).toEqual([]);
  });

  it('does not read fixture markers as identifiers', () => {
    expect(privacyHits('vitals    hr 118   # expect: PN501 PN502 PN503')).toEqual([]);
    expect(privacyHits('# sweep: all severities')).toEqual([]);
  });
});

describe('the privacyChecks setting and disabledChecks', () => {
  const note = 'note      Mr Smith, DOB 12/03/1961, MRN 1234567, tel 07700 900123';

  it('are warnings by default', () => {
    const found = checkNote(note).findings.filter((f) => isPrivacyCode(f.code));
    expect(found.map((f) => f.code)).toEqual(['PN501', 'PN502', 'PN506', 'PN504']);
    expect(new Set(found.map((f) => f.severity))).toEqual(new Set(['warning']));
  });

  it('privacyChecks: false switches them all off', () => {
    expect(privacyHits(note, { privacyChecks: false })).toEqual([]);
  });

  it('one can be switched off by alias or code', () => {
    expect(privacyHits(note, { disabledChecks: ['possible-name', 'PN504'] }).map((h) => h.code)).toEqual(['PN502', 'PN506']);
  });

  it('the documented example of each privacy check raises it', () => {
    for (const code of ['PN501', 'PN502', 'PN503', 'PN504', 'PN505', 'PN506', 'PN507']) {
      const example = checkByCodeOrAlias(code)?.doc.example ?? '';
      expect(checkNote(example).findings.map((f) => f.code), code).toContain(code);
    }
  });

  it('every privacy check is registered with the privacy tag, documentation and a source', () => {
    for (const code of ['PN501', 'PN502', 'PN503', 'PN504', 'PN505', 'PN506', 'PN507']) {
      const check = checkByCodeOrAlias(code);
      expect(check?.tags).toEqual(['privacy']);
      expect(check?.severity).toBe('warning');
      expect(check?.source).toContain('45 CFR 164.514(b)(2)');
      expect(checkByCodeOrAlias(check?.alias ?? '')).toBe(check);
    }
  });
});

describe('ranges and fixes', () => {
  it('ranges count UTF-16 code units on the finding\'s line', () => {
    const note = 'vitals    hr 118\nnote      😀 café, Dr Patel';
    const f = checkNote(note).findings.find((x) => x.code === 'PN501');
    expect(f?.range).toEqual({ start: { line: 1, character: 22 }, end: { line: 1, character: 27 } });
  });

  it('offers a placeholder in place of the identifier, and only there', () => {
    const note = 'note      Mr Smith, DOB 12/03/1961, results to jane.roe@example.org';
    const result = checkNote(note);
    const edits = result.findings.filter((f) => isPrivacyCode(f.code)).flatMap((f) => f.fixes.flatMap((x) => x.edits));
    expect(edits.map((e) => e.newText)).toEqual(['[name]', '[date of birth]', '[email]']);
    const fixed = applyEdits(note, edits);
    expect(fixed).toBe('note      Mr [name], DOB [date of birth], results to [email]');
    expect(privacyHits(fixed)).toEqual([]);
  });

  it('the fix replaces a whole date with a two-digit year, a name after a title in capitals and one name word after a relative', () => {
    const note = 'note      MR SMITH seen 4 Mar 26; wife: Mary';
    const edits = checkNote(note).findings.filter((f) => isPrivacyCode(f.code)).flatMap((f) => f.fixes.flatMap((x) => x.edits));
    const fixed = applyEdits(note, edits);
    expect(fixed).toBe('note      MR [name] seen [date]; wife: [name]');
    expect(privacyHits(fixed)).toEqual([]);
  });

  it('placeholders are not marked safe to apply unseen (a possible identifier is a guess)', () => {
    const f = checkNote('note      name: Jane Roe').findings.find((x) => x.code === 'PN501');
    expect(f?.fixes).toHaveLength(1);
    expect(f?.fixes[0]?.preferred).toBeUndefined();
  });

  it('a calendar-date message points to relative days', () => {
    const f = checkNote('note      admitted 2026-03-04').findings.find((x) => x.code === 'PN503');
    expect(f?.message).toContain('@ day 2 08:00');
  });

  it('every placeholder leaves the line free of privacy findings', () => {
    for (const phrase of ['name: Jane Roe', 'MS JANE ROE', 'daughter - Anne', 'born 1961-03-12', '4 March 2026', '12 March 61', '+44 20 7946 0958', 'NHS 999 123 4578', 'AA9A 9AA', '00345-6789']) {
      const note = `note      ${phrase}`;
      const edits = checkNote(note).findings.filter((f) => isPrivacyCode(f.code)).flatMap((f) => f.fixes.flatMap((x) => x.edits));
      expect(edits.length, phrase).toBeGreaterThan(0);
      expect(hitsInProse(applyEdits(note, edits).slice('note      '.length)), phrase).toEqual([]);
    }
  });
});

describe('lines inside and outside timepoints', () => {
  const note = [
    '# header comment with MRN 1234567',
    'patient   age 64 y',
    'vitals    hr 118                      # implicit first timepoint, Dr Patel',
    '@ day 1 07:40  seen by Dr Roe',
    'note      DOB 12/03/1961',
  ].join('\n');

  it('are each scanned once', () => {
    expect(privacyHits(note)).toEqual([
      { code: 'PN506', text: '1234567' },
      { code: 'PN501', text: 'Patel' },
      { code: 'PN501', text: 'Roe' },
      { code: 'PN502', text: '12/03/1961' },
    ]);
  });

  it('an editing session finds what checkNote finds, after edits inside and outside timepoints', () => {
    const session = new NoteSession();
    const codes = (r: { findings: readonly { code: string; range: { start: { line: number } } }[] }) => r.findings.filter((f) => isPrivacyCode(f.code)).map((f) => `${f.range.start.line}:${f.code}`);
    const edits = [
      note,
      note.replace('MRN 1234567', 'no identifiers'),
      note.replace('seen by Dr Roe', 'seen by the team'),
      note.replace('DOB 12/03/1961', 'DOB 12/03/1961, tel 07700 900123'),
      note,
    ];
    for (const text of edits) expect(codes(session.update(text))).toEqual(codes(checkNote(text)));
  });
});
