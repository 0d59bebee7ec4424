// Settings that change between two updates of an open note (the editor's settings, or
// pneumark.config.json edited beside the note) must never leave findings, values or readings
// worked out under the old settings: after each change the session gives what a fresh analysis
// with the new settings gives, also after further edits, and also when the change comes while
// the note is being read in steps.
import { describe, expect, it } from 'vitest';
import { checkNote, type NoteResult } from '../../server/src/core/check-note';
import { NoteSession } from '../../server/src/core/session';
import type { Settings } from '../../server/src/core/settings';
import { snapshot } from './session-snapshot';

// Invented note: bare gas numbers that read differently in mmHg and kPa, a PaO2 between the
// default hypoxaemia threshold and a raised one, a name for the privacy checks, a ventilator.
const NOTE = [
  'patient   age 58 y, sex female, height 165 cm',
  'place     altitude 1200 m',
  '',
  '@ day 1 08:00  arrival',
  'oxygen    mask 10 L/min',
  'vitals    hr 104, rr 28, spo2 90 %',
  'abg       7.31/6.9/9.2/25                 # written in kPa without saying so',
  'note      seen by Dr Roe',
  '',
  '@ 11:00  intubated',
  'vent      mode VC, vt 420 mL, rate 22, peep 10, fio2 0.6, plateau 27',
  'abg       7.33/52/70/26',
  '',
  '@ 15:00',
  'vent      peep 12',
  'abg       ph 7.36, pco2 46, po2 76, hco3 25',
].join('\n');

function codes(r: NoteResult): string[] {
  return r.findings.map((f) => `${f.code}@${f.range.start.line}`);
}

function same(session: NoteSession, text: string, settings: Partial<Settings>): NoteResult {
  const got = session.update(text);
  expect(snapshot(got)).toEqual(snapshot(checkNote(text, settings)));
  return got;
}

/** Each change of settings, with what it must change in this note (so the test cannot pass by reusing). */
const CHANGES: readonly { name: string; settings: Partial<Settings>; differs: (before: NoteResult, after: NoteResult) => boolean }[] = [
  { name: 'gas unit kPa', settings: { gasUnit: 'kPa' }, differs: (a, b) => codes(a).includes('PN204@6') && !codes(b).includes('PN204@6') },
  { name: 'raised hypoxaemia threshold', settings: { hypoxaemiaBelowMmhg: 80 }, differs: (a, b) => codes(a).join() !== codes(b).join() },
  { name: 'lowered hypercapnia threshold', settings: { hypercapniaAboveMmhg: 45 }, differs: (a, b) => codes(a).filter((c) => c.startsWith('PN411')).length < codes(b).filter((c) => c.startsWith('PN411')).length },
  { name: 'a reading check switched off by code', settings: { disabledChecks: ['PN410'] }, differs: (a, b) => codes(a).some((c) => c.startsWith('PN410')) && !codes(b).some((c) => c.startsWith('PN410')) },
  { name: 'a check switched off by alias', settings: { disabledChecks: ['other-unit-likely'] }, differs: (a, b) => codes(a).includes('PN204@6') && !codes(b).includes('PN204@6') },
  { name: 'privacy checks off', settings: { privacyChecks: false }, differs: (a, b) => codes(a).includes('PN501@7') && !codes(b).includes('PN501@7') },
  { name: 'a shorter limit on carried settings', settings: { carriedSettingHours: 3 }, differs: (a, b) => !codes(a).includes('PN326@15') && codes(b).includes('PN326@15') },
  { name: 'full alveolar equation', settings: { alveolarEquation: 'full' }, differs: (a, b) => JSON.stringify(snapshot(a)) !== JSON.stringify(snapshot(b)) },
];

describe('NoteSession when settings change between updates', () => {
  for (const change of CHANGES) {
    it(`${change.name}: gives what a fresh analysis gives, before and after further edits, and back`, () => {
      const session = new NoteSession();
      const before = same(session, NOTE, {});
      session.setSettings(change.settings);
      const after = same(session, NOTE, change.settings);
      expect(change.differs(before, after)).toBe(true);
      // An edit of one timepoint: the others are reused, under the new settings.
      const edited = NOTE.replace('abg       7.33/52/70/26', 'abg       7.33/52/71/26');
      same(session, edited, change.settings);
      expect(session.stats.reusedTimepoints).toBeGreaterThan(0);
      // Back to the defaults, then an edit again.
      session.setSettings({});
      same(session, edited, {});
      same(session, edited.replace('peep 12', 'peep 14'), {});
    });
  }

  it('changing settings back and forth on every edit never mixes findings of the two', () => {
    const session = new NoteSession();
    const lines = NOTE.split('\n');
    for (let k = 0; k < 24; k++) {
      const settings = CHANGES[k % CHANGES.length]!.settings;
      if (k % 3 === 0) session.setSettings(settings);
      const current = k % 3 === 0 ? settings : CHANGES[(k - (k % 3)) % CHANGES.length]!.settings;
      lines[5] = `vitals    hr ${100 + k}, rr 28, spo2 ${88 + (k % 5)} %`;
      same(session, lines.join('\n'), current);
    }
  });

  it('takes a change of settings that comes while the note is read in steps', () => {
    const big = Array.from({ length: 60 }, (_, i) => `@ +1h\nvent      peep ${5 + (i % 8)}, fio2 0.5\nabg       7.3${i % 10}/6.${i % 9}/9.${i % 7}/24`).join('\n');
    const session = new NoteSession();
    const steps = session.steps(big, 20);
    steps.next();
    steps.next();
    session.setSettings({ gasUnit: 'kPa', disabledChecks: ['PN410'] });
    let next = steps.next();
    while (!next.done) next = steps.next();
    expect(snapshot(next.value)).toEqual(snapshot(checkNote(big, { gasUnit: 'kPa', disabledChecks: ['PN410'] })));
  });

  it('keeps its own copy of the settings: a caller that changes the object it passed changes nothing', () => {
    const passed: Partial<Settings> & { disabledChecks: string[] } = { disabledChecks: [] };
    const session = new NoteSession(passed);
    same(session, NOTE, {});
    // The caller reuses its list for another purpose; the session's settings change only through setSettings.
    passed.disabledChecks.push('PN410', 'PN204');
    const edited = NOTE.replace('abg       7.33/52/70/26', 'abg       7.33/52/69/26');
    const result = same(session, edited, {});
    expect(result.settings.disabledChecks).toEqual([]);
    session.setSettings(passed);
    same(session, edited, { disabledChecks: ['PN410', 'PN204'] });
  });
});
