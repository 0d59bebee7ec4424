// What check and show print for people: control characters from a note are made visible (an
// escape sequence in a label must not clear the screen or retitle the window), a value whose unit
// is in doubt is never shown converted from the doubted unit, and --quiet lists errors only in
// every format.
import { describe, expect, it } from 'vitest';
import { memoryIo, type MemoryIo } from '../helpers/memory-io';
import { run } from '../../server/src/cli/main';
import { visible } from '../../server/src/cli/visible';

const io = (stdinText = '', colour = false): MemoryIo => memoryIo({ stdin: stdinText, env: colour ? { FORCE_COLOR: '1' } : { NO_COLOR: '1' }, tty: colour });

/** Escape sequences (clear screen, window title, colour) and other controls in every kind of text a note has. */
const HOSTILE = [
  '@ day 1 08:00  \u001b[2J\u001b]0;pwned\u0007label\u009b31m\u007f',
  'vitals hr 80 \u001b[31mbpm',
  'note seen by \u001b]0;title\u0007 the team',
  'bogus\u001b[2J line',
  'oxygen device \u001b[8mcanula',
  '@ day 1 09:00  second\u001b[5m',
  'vitals spo2 90',
  '',
].join('\n');

/** Every C0 control but tab and line feed, DEL and every C1 control. */
const CONTROLS = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/;
/** Our own colour codes (SGR with one number), and nothing else that starts with ESC. */
const OUR_COLOURS = /\u001b\[\d{1,2}m/g;

describe('control characters from a note', () => {
  it('are written visibly escaped by show and check, without colour', async () => {
    for (const command of ['show', 'check']) {
      const out = io(HOSTILE);
      await run([command, '-'], out);
      expect(out.out(), command).not.toMatch(CONTROLS);
    }
    const shown = io(HOSTILE);
    await run(['show', '-'], shown);
    expect(shown.out()).toContain('@ day 1 08:00  \\x1b[2J\\x1b]0;pwned\\x07label\\x9b31m\\x7f  line 1');
    expect(shown.out()).toContain('note     seen by \\x1b]0;title\\x07 the team');
    expect(shown.out()).toContain('? bogus\\x1b[2J line');
    expect(shown.out()).toMatch(/PN105 `\\x1b\[31mbpm` is not a key/);
    const checked = io(HOSTILE);
    await run(['check', '-'], checked);
    expect(checked.out()).toMatch(/<stdin>:4:1 {2}error {2}PN101 unknown-section {2}`bogus\\x1b\[2J` is not a section/);
  });

  it('leave only our own colour codes on a terminal', async () => {
    for (const command of ['show', 'check']) {
      const out = io(HOSTILE, true);
      await run([command, '-'], out);
      expect(out.out(), command).toContain('\u001b[');
      expect(out.out().replace(OUR_COLOURS, ''), command).not.toMatch(CONTROLS);
    }
  });

  it('are written as \\xHH, tab kept', () => {
    expect(visible('a\tb\u001b[2Jc\u0007\u007f\u0085\u009b\r\nd')).toBe('a\tb\\x1b[2Jc\\x07\\x7f\\x85\\x9b\\x0d\\x0ad');
    expect(visible('PaO2 88 mmHg · P/F 147 — ≤ 100')).toBe('PaO2 88 mmHg · P/F 147 — ≤ 100');
  });

  it('are escaped by the JSON and SARIF encoders already (C0 controls as \\u00XX)', async () => {
    for (const format of ['json', 'sarif']) {
      const out = io(HOSTILE);
      await run(['check', '--format', format, '-'], out);
      expect(out.out(), format).not.toMatch(/[\u0000-\u0008\u000b-\u001f]/);
      expect(out.out(), format).toContain('\\u001b[');
    }
  });
});

describe('show, for a value whose unit is in doubt', () => {
  it('prints the number as written and what it would be in the likely unit, never a conversion from the doubted unit', async () => {
    const out = io('@ day 1 08:00\nabg ph 7.40, paco2 5.3, pao2 11 kPa\nplace pb 101\n');
    await run(['show', '-'], out);
    const text = out.out();
    expect(text).toContain('PaCO2 5.3 ? (if kPa: 40 mmHg) (not used)');
    expect(text).toContain('PB 101 ? (if kPa: 758 mmHg) (not used)');
    // A conversion from mmHg of 5.3 (0.7 kPa) or of 101 (13.5 kPa) says nothing true.
    expect(text).not.toMatch(/\(0\.7 kPa\)|\(13\.5 kPa\)/);
    // A usable value keeps its other unit.
    expect(text).toContain('PaO2 83 mmHg (11.0 kPa)');
  });

  it('in a note that reads bare gases in kPa, shows the likely mmHg value in kPa', async () => {
    const out = io('units gas kPa\n@ day 1 08:00\nabg paco2 40\n');
    await run(['show', '-'], out);
    expect(out.out()).toContain('PaCO2 40 ? (if mmHg: 5.3 kPa) (not used)');
  });
});

describe('--quiet', () => {
  it('lists error findings only in JSON too, and the summary still counts every finding', async () => {
    const quiet = io();
    await run(['check', '--format', 'json', '--quiet', 'samples/broken-note.pneu'], quiet);
    const all = io();
    await run(['check', '--format', 'json', 'samples/broken-note.pneu'], all);
    type Out = { files: { findings: { severity: string }[] }[]; summary: { errors: number; warnings: number } };
    const q = JSON.parse(quiet.out()) as Out;
    const a = JSON.parse(all.out()) as Out;
    expect(a.files[0]!.findings.some((f) => f.severity === 'warning')).toBe(true);
    expect(q.files[0]!.findings.length).toBeGreaterThan(0);
    expect(q.files[0]!.findings.every((f) => f.severity === 'error')).toBe(true);
    expect(q.files[0]!.findings.length).toBe(a.summary.errors);
    expect(q.summary).toEqual(a.summary);
  });
});
