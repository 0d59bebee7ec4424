// What check and show print for people: control characters from a note are made visible (an
// escape sequence in a label must not clear the screen or retitle the window), and so are
// bidirectional controls in notes and file names (they would reorder what is shown), a value whose unit
// is in doubt is never shown converted from the doubted unit, and --quiet lists errors only in
// every format.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { memoryIo, type MemoryIo } from '../helpers/memory-io';
import { run } from '../../server/src/cli/main';
import { visible } from '../../server/src/cli/visible';
import { Legend } from '../../server/src/cli/render-legend';
import { checkNote } from '../../server/src/core/check-note';
import { renderDerived } from '../../server/src/cli/render-derived';
import { paint } from '../../server/src/cli/colour';
import { DERIVED } from '../../server/src/core/derive/registry';
import { shortAsName } from '../../server/src/core/derive/context';

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

/** Every character that reorders text when it is displayed. */
const BIDI = /[\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/;
const RLO = '\u202e';

/** Bidirectional controls in a label, prose, a stray word, a word value and a value. */
const REORDERING = [
  `@ day 1 08:00  bed ${RLO}4 \u2066left\u2069`,
  `vitals hr 80 ${RLO}bpm`,
  `note seen by ${RLO}the\u200f team\u061c`,
  `bog${RLO}us line`,
  `oxygen device can${RLO}ula`,
  '@ day 1 09:00',
  'vitals spo2 90',
  '',
].join('\n');

const tempDir = (): string => mkdtempSync(join(tmpdir(), 'pneumark-visible-'));
/** A name that a terminal would show as `ward-uenp.x`-like gibberish, or as a different name. */
const TRICK_NAME = `ward${RLO}uenp.x.pneu`;

describe('bidirectional controls', () => {
  it('are written as \\u{HHHH}, every one of them; letters of right-to-left scripts are kept', () => {
    expect(visible('a\u202ab\u202bc\u202cd\u202de\u202ef')).toBe('a\\u{202A}b\\u{202B}c\\u{202C}d\\u{202D}e\\u{202E}f');
    expect(visible('\u2066\u2067\u2068\u2069')).toBe('\\u{2066}\\u{2067}\\u{2068}\\u{2069}');
    expect(visible('\u200e\u200f\u061c')).toBe('\\u{200E}\\u{200F}\\u{061C}');
    // Separators and invisible characters are shown too; the joiners of scripts and emoji are kept.
    expect(visible('\u2028\u2029')).toBe('\\u{2028}\\u{2029}');
    expect(visible('h\u200br \u2060\ufeff')).toBe('h\\u{200B}r \\u{2060}\\u{FEFF}');
    expect(visible('👩\u200d⚕️ ❤️\u200d🔥 👩🏽\u200d💻')).toBe('👩\u200d⚕️ ❤️\u200d🔥 👩🏽\u200d💻');
    expect(visible('می\u200cخواهم क्\u200dष')).toBe('می\u200cخواهم क्\u200dष');
    expect(visible('סימן שם · علامة')).toBe('סימן שם · علامة');
    expect(visible('\u001b\u202e')).toBe('\\x1b\\u{202E}');
  });

  it('from a note are written escaped by show and check, with and without colour', async () => {
    for (const colour of [false, true]) {
      for (const command of ['show', 'check']) {
        const out = io(REORDERING, colour);
        await run([command, '-'], out);
        expect(out.out(), command).not.toMatch(BIDI);
        expect(out.out(), command).toContain('\\u{202E}');
      }
    }
    const shown = io(REORDERING);
    await run(['show', '-'], shown);
    expect(shown.out()).toContain('@ day 1 08:00  bed \\u{202E}4 \\u{2066}left\\u{2069}  line 1');
    expect(shown.out()).toContain('note     seen by \\u{202E}the\\u{200F} team\\u{061C}');
    expect(shown.out()).toContain('? bog\\u{202E}us line');
    expect(shown.out()).toContain('(carried from bed \\u{202E}4 \\u{2066}left\\u{2069}, line 5)');
    const checked = io(REORDERING);
    await run(['check', '-'], checked);
    expect(checked.out()).toContain('<stdin>:2:14  error  PN105 stray-text  `\\u{202E}bpm` is not a key');
    expect(checked.out()).toContain('<stdin>:5:15  error  PN205 unknown-word  `can\\u{202E}ula` is not a known value');
  });

  it('a joiner no script or emoji needs there, a soft hyphen and the invisible operators are shown', () => {
    // Between Latin letters, beside a digit or a space, at either end, or two in a row.
    expect(visible('h\u200dr h\u200cr 1\u200d2 \u200d\u200c x\u200d')).toBe('h\\u{200D}r h\\u{200C}r 1\\u{200D}2 \\u{200D}\\u{200C} x\\u{200D}');
    // A combining accent before the joiner does not hide it when a Latin letter follows.
    expect(visible('e\u0301\u200dr')).toBe('e\u0301\\u{200D}r');
    expect(visible('sa\u00adtu\u2062ration')).toBe('sa\\u{00AD}tu\\u{2062}ration');
  });

  it('a zero-width joiner in a key is shown, so h<ZWJ>r does not read as `hr` in "is not a key"', async () => {
    const checked = io('@ day 1 08:00\nvitals h\u200dr 80, s\u00adpo2 94\n');
    await run(['check', '-'], checked);
    expect(checked.out()).toMatch(/`h\\u\{200D\}r` is not a key/);
    expect(checked.out()).toMatch(/`s\\u\{00AD\}po2` is not a key/);
    expect(checked.out()).not.toMatch(/[\u200d\u00ad]/);
  });

  it('an invisible character in a key is shown, so `h\u{200B}r` does not read as `hr` in "is not a key"', async () => {
    const checked = io('@ day 1 08:00\nvitals h\u200br 80\n');
    await run(['check', '-'], checked);
    expect(checked.out()).toMatch(/`h\\u\{200B\}r` is not a key/);
    expect(checked.out()).not.toContain('\u200b');
  });

  it('in file names are written escaped by check, show, fmt and in the errors that name a file', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, TRICK_NAME), '@ 08:00\nvitals spo2 104\n');
    const escapedName = 'ward\\u{202E}uenp.x.pneu';
    const checked = io();
    expect(await run(['check', join(dir, TRICK_NAME)], checked)).toBe(1);
    expect(checked.out()).toContain(`${escapedName}:2:13  error`);
    const shown = io();
    await run(['show', join(dir, TRICK_NAME)], shown);
    expect(shown.out().split('\n')[0]).toContain(escapedName);

    const messy = tempDir();
    writeFileSync(join(messy, TRICK_NAME), '@ 08:00   first\nvitals hr 80,rr 12\n');
    const listed = memoryIo({ cwd: messy });
    expect(await run(['fmt', '--check', '.'], listed)).toBe(1);
    expect(listed.out()).toBe(`${escapedName}\n`);
    const written = memoryIo({ cwd: messy });
    expect(await run(['fmt', '--write', '.'], written)).toBe(0);
    expect(written.out()).toBe(`formatted ${escapedName}\n`);
    expect(readFileSync(join(messy, TRICK_NAME), 'utf8')).toBe('@ 08:00  first\nvitals    hr 80, rr 12\n');

    const broken = tempDir();
    writeFileSync(join(broken, TRICK_NAME), Buffer.from([0x40, 0x20, 0xe9, 0x0a]));
    const cases: [string[], string][] = [
      [['check', TRICK_NAME], `pneumark: ${escapedName}: is not UTF-8 text`],
      [['show', TRICK_NAME], `pneumark: ${escapedName}: is not UTF-8 text`],
      [['export', TRICK_NAME, '--format', 'csv'], `pneumark: ${escapedName}: is not UTF-8 text`],
      [['fmt', '--check', TRICK_NAME], `pneumark: ${escapedName}: is not UTF-8 text`],
      [['fmt', TRICK_NAME], `pneumark: ${escapedName}: is not UTF-8 text`],
      [['check', `missing${RLO}.pneu`], 'pneumark: missing\\u{202E}.pneu: no such file or folder'],
      [['fmt', '--check', `missing${RLO}.pneu`], 'pneumark: missing\\u{202E}.pneu: no such file or folder'],
      [['check', '--format', `te${RLO}xt`, '-'], 'pneumark check: --format: must be one of text, json or sarif (got "te\\u{202E}xt")'],
      [[`ch${RLO}eck`], 'pneumark: unknown command `ch\\u{202E}eck`'],
    ];
    for (const [args, expected] of cases) {
      const out = memoryIo({ cwd: broken });
      expect(await run(args, out), args.join(' ')).toBe(2);
      expect(out.err(), args.join(' ')).toContain(expected);
      expect(out.err() + out.out(), args.join(' ')).not.toMatch(BIDI);
    }
    // The text report names the unreadable note too.
    const report = memoryIo({ cwd: broken });
    await run(['check', TRICK_NAME], report);
    expect(report.out()).toContain(`${escapedName}: cannot check: is not UTF-8 text`);
  });

  it('are kept as data in JSON, SARIF, CSV, JSON Lines and FHIR', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, TRICK_NAME), REORDERING);
    // What each format holds as written: the path (SARIF as a URI, the character percent-encoded;
    // FHIR names no file), and the text a finding quotes or a label.
    const formats: [string[], string[]][] = [
      [['check', '--format', 'json'], [TRICK_NAME, `can${RLO}ula`]],
      [['check', '--format', 'sarif'], ['ward%E2%80%AEuenp.x.pneu', `can${RLO}ula`]],
      [['export', '--format', 'csv'], [TRICK_NAME, `bed ${RLO}4 \u2066left\u2069`]],
      [['export', '--format', 'jsonl'], [TRICK_NAME, `bed ${RLO}4 \u2066left\u2069`]],
      [['export', '--format', 'fhir'], [`bed ${RLO}4 \u2066left\u2069`]],
    ];
    for (const [args, kept] of formats) {
      const out = memoryIo({ cwd: dir });
      await run([...args, TRICK_NAME], out);
      for (const text of kept) expect(out.out(), args.join(' ')).toContain(text);
      expect(out.out(), args.join(' ')).not.toContain('\\u{202E}');
    }
    const json = memoryIo({ cwd: dir });
    await run(['check', '--format', 'json', TRICK_NAME], json);
    expect((JSON.parse(json.out()) as { files: { path: string }[] }).files[0]!.path).toBe(TRICK_NAME);
  });
});

describe('C1 controls and DEL in file names', () => {
  it('are written as \\xHH by check and fmt --check', async () => {
    const dir = tempDir();
    const name = 'a\u0085b\u009bc\u007fd.pneu';
    writeFileSync(join(dir, name), '@ 08:00   x\nvitals spo2 104\n');
    const checked = memoryIo({ cwd: dir });
    await run(['check', '.'], checked);
    expect(checked.out()).toContain('a\\x85b\\x9bc\\x7fd.pneu:2:13  error');
    const listed = memoryIo({ cwd: dir });
    await run(['fmt', '--check', '.'], listed);
    expect(listed.out()).toBe('a\\x85b\\x9bc\\x7fd.pneu\n');
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
    // The one usable gas pressure is written in kPa, so the timepoint shows kPa first.
    expect(text).toContain('PaO2 11.0 kPa (83 mmHg)');
  });

  it('in a note that reads bare gases in kPa, shows the likely mmHg value in kPa', async () => {
    const out = io('units gas kPa\n@ day 1 08:00\nabg paco2 40\n');
    await run(['show', '-'], out);
    expect(out.out()).toContain('PaCO2 40 ? (if mmHg: 5.3 kPa) (not used)');
  });
});

describe('show, in a kPa note', () => {
  it('gives header gas pressures in kPa first, as at a timepoint', async () => {
    // 84 kPa = 630 mmHg (1 kPa = 7.50062 mmHg, definition of the units).
    const kpa = io('units gas kPa\nplace barometric 84\n@ day 1 08:00\nabg paco2 5.3\n');
    await run(['show', '-'], kpa);
    expect(kpa.out()).toContain('PB 84.0 kPa (630 mmHg)');
    expect(kpa.out()).toContain('PaCO2 5.3 kPa (40 mmHg)');
    const mmhg = io('place barometric 630\n@ day 1 08:00\nabg paco2 40\n');
    await run(['show', '-'], mmhg);
    expect(mmhg.out()).toContain('PB 630 mmHg (84.0 kPa)');
  });

  it('gives header values in the gas unit at the header\'s end, a `units gas` after a measurement before any `@` included', async () => {
    // Every units line before the first `@` is the header's: the 630 read before it is mmHg, shown in kPa.
    const out = io('place barometric 630\nvitals hr 80\nunits gas kPa\nabg paco2 5.3\n');
    await run(['show', '-'], out);
    expect(out.out()).toContain('PB 84.0 kPa (630 mmHg)');
    expect(out.out()).toContain('PaCO2 5.3 kPa (40 mmHg)');
  });
});

describe('show, a kPa row beside its readings', () => {
  // 1 kPa = 7.50062 mmHg (definition of the units). The thresholds are Pneumark's defaults:
  // hypoxaemia below 60 mmHg (8.0 kPa), hypercapnia above 50 mmHg (6.67 kPa), common practice, no source.
  it('gives the mmHg of a kPa value on the side of the threshold its reading names', async () => {
    // 7.99 kPa is 59.93 mmHg: below 60, so never "(60 mmHg)" beside "below 8.0 kPa".
    // 6.68 kPa is 50.10 mmHg: above 50, so never "(50 mmHg)" beside "above 6.67 kPa".
    const out = io('units gas kPa\n@ day 1 08:00\noxygen venturi, fio2 28 %\nabg ph 7.28, pco2 6.68, po2 7.99, hco3 23\n');
    await run(['show', '-'], out);
    const text = out.out();
    expect(text).toContain('PaO2 7.99 kPa (59.9 mmHg): consistent with moderate hypoxaemia (below 8.0 kPa)');
    expect(text).toContain('PaCO2 6.68 kPa (50.1 mmHg): consistent with hypercapnia (above 6.67 kPa)');
    const row = text.split('\n').find((l) => l.trimStart().startsWith('abg')) ?? '';
    expect(row).toContain('PaO2 7.99 kPa (59.9 mmHg)');
    expect(row).toContain('PaCO2 6.68 kPa (50.1 mmHg)');
  });

  it('keeps whole mmHg where no threshold is near, and a value on a threshold at its written decimals as written', async () => {
    // 9.6 kPa = 72.0 mmHg, 10.8 kPa = 81.0 mmHg: far from every threshold.
    // 6.7 kPa stands for 6.65–6.75 kPa (49.9–50.6 mmHg), on 50: shown 50 mmHg as the readings show it.
    const out = io('units gas kPa\n@ day 1 08:00\nabg ph 7.30, pco2 9.6, po2 10.8\n@ day 1 09:00\nabg ph 7.33, pco2 6.7, po2 10.8\n');
    await run(['show', '-'], out);
    const rows = out.out().split('\n').filter((l) => l.trimStart().startsWith('abg'));
    expect(rows[0]).toContain('PaCO2 9.6 kPa (72 mmHg) · PaO2 10.8 kPa (81 mmHg)');
    expect(rows[1]).toContain('PaCO2 6.7 kPa (50 mmHg)');
  });
});

describe('readings quote a kPa value with its written decimals', () => {
  it('names the PaCO2 of the hypoventilation cause as the note wrote it', async () => {
    // Hypoventilation among the causes of hypoxaemia: PaCO2 6.68 kPa (50.1 mmHg) is above 50 mmHg.
    const out = io('patient age 60 y\nunits gas kPa\n@ day 1 08:00\noxygen venturi, fio2 28 %\nabg ph 7.28, pco2 6.68, po2 7.99, hco3 23\n');
    await run(['show', '-'], out);
    const text = out.out();
    expect(text).toContain('hypoventilation (PaCO2 6.68 kPa (50.1 mmHg))');
    expect(text).not.toContain('PaCO2 6.7 kPa');
  });

  it('names the PaO2 of an oxygenation not read as the note wrote it', async () => {
    // 16.45 kPa (123 mmHg) on air at sea level is above the alveolar PO2 of about 100 mmHg (alveolar gas equation).
    const out = io('units gas kPa\n@ day 1 08:00\noxygen air\nabg ph 7.40, pco2 5.33, po2 16.45, hco3 24\n');
    await run(['show', '-'], out);
    const text = out.out();
    expect(text).toContain('PaO2 16.45 kPa (123 mmHg): oxygenation not read');
    expect(text).toContain('PN401 PaO2 16.45 kPa (123 mmHg) is above the alveolar PO2');
  });

  it('names the PaCO2 of mild hypoventilation as the note wrote it', async () => {
    // 6.55 kPa = 49.1 mmHg: above the upper normal 45 mmHg, not above the 50 mmHg hypercapnia threshold.
    // At PB 715 mmHg on air the alveolar PO2 is low with a gradient normal for 80 years (alveolar gas
    // equation; age/4 + 4 mmHg, common practice, no source), so the PaCO2 is named as a cause.
    const out = io('patient age 80 y\nunits gas kPa\nplace pb 715 mmHg\n@ day 1 08:00\noxygen air\nabg ph 7.36, pco2 6.55, po2 7.85, hco3 27\n');
    await run(['show', '-'], out);
    const text = out.out();
    expect(text).toContain('from mild hypoventilation (PaCO2 6.55 kPa (49 mmHg), above 6.0 kPa');
    expect(text).not.toContain('PaCO2 6.6 kPa');
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

  it('still counts every finding in the totals line and for --max-warnings', async () => {
    // A note with warnings and no error: --quiet lists nothing, yet counts its warnings.
    const note = 'samples/icu-ventilated-lung-injury.pneu';
    const all = io();
    expect(await run(['check', note], all)).toBe(0);
    const totals = all.out().trimEnd().split('\n').pop()!;
    expect(totals).toMatch(/: 0 errors, [1-9]\d* warnings?, /);
    const quiet = io();
    expect(await run(['check', '--quiet', note], quiet)).toBe(0);
    expect(quiet.out()).toBe(`${totals}\n`);
    const warnings = Number(/(\d+) warnings?/.exec(totals)![1]);
    const strict = io();
    expect(await run(['check', '--quiet', '--max-warnings', String(warnings - 1), note], strict)).toBe(1);
    expect(strict.err()).toContain(`pneumark: ${warnings} warning`);
    expect(await run(['check', '--quiet', '--max-warnings', String(warnings), note], io())).toBe(0);
  });
});

describe('show\'s legend', () => {
  const shown = async (args: string[], stdinText = ''): Promise<string> => {
    const out = io(stdinText);
    await run(['show', ...args], out);
    return out.out();
  };
  /** The legend's entries, by the name or mark they explain. */
  const legendOf = (text: string): Map<string, string> => {
    const start = text.indexOf('\nlegend\n');
    if (start < 0) return new Map();
    const lines = text.slice(start + '\nlegend\n'.length).split('\n\n')[0]!.split('\n');
    return new Map(lines.map((l) => /^ {2}(.+?) {2,}(\S.*)$/.exec(l)!).map((m) => [m[1]!, m[2]!]));
  };

  it('explains each short name the output used, once, with its name and unit from the registry of derived values', async () => {
    const text = await shown(['samples/icu-ventilated-lung-injury.pneu']);
    const legend = legendOf(text);
    expect(legend.get('MP surr')).toBe('Mechanical power (surrogate, volume control), in J/min');
    expect(legend.get('VR')).toBe('Ventilatory ratio');
    expect(legend.get('OSI')).toBe('Oxygen saturation index');
    expect(legend.get('A–a normal')).toBe('A–a gradient, upper normal for age, in mmHg');
    // A name that is only the short one with "ratio" or "gradient" after it comes with its formula.
    expect(legend.get('P/F')).toBe('P/F ratio (PaO2 ÷ FiO2), in mmHg');
    expect(legend.get('Δ ratio')).toBe('Delta ratio ((AG − 12) ÷ (24 − HCO3))');
    // Every derived value the note shows is in it, and nothing else of the registry.
    const shownIds = new Set<string>();
    const result = checkNote(readFileSync('samples/icu-ventilated-lung-injury.pneu', 'utf8'));
    for (const tp of result.analysis.timeline.timepoints) {
      const d = result.analysis.derivation(tp.index);
      for (const v of d?.derived ?? []) if (v.id !== 'barometric' || v.inputs[0]?.origin.kind !== 'default') shownIds.add(v.id);
      for (const m of d?.missing ?? []) shownIds.add(m.id);
    }
    for (const def of DERIVED) expect(legend.has(shortAsName(def.short)), def.id).toBe(shownIds.has(def.id));
    expect(text.split('\nlegend\n')).toHaveLength(2);
  });

  it('lists only what appeared: the summit note has no mechanics and no findings under lines', async () => {
    const legend = legendOf(await shown(['samples/summit-hut-evacuation.pneu']));
    expect(legend.has('P/F × PB/760')).toBe(true);
    expect(legend.has('FiO2 est')).toBe(true);
    expect(legend.has('MP')).toBe(false);
    expect(legend.has('OSI')).toBe(false);
    expect(legend.has('PNnnn (l:c)')).toBe(false);
    expect(legend.has('(not used)')).toBe(false);
  });

  it('explains the carried-value mark once, at the end, not under every timepoint that uses it', async () => {
    const text = await shown(['samples/icu-ventilated-lung-injury.pneu']);
    expect(text).toMatch(/Cstat 28 mL\/cmH2O\*/);
    expect(text.match(/carried from an earlier timepoint/g)).toHaveLength(1);
    expect(legendOf(text).get('*')).toBe('a derived value computed with a value carried from an earlier timepoint; on a change line, a setting carried in or a ratio computed with one');
  });

  it('explains (not used), a unit in doubt, an unreadable line and a finding\'s code and place when they appear', async () => {
    const legend = legendOf(await shown(['samples/broken-note.pneu']));
    expect(legend.get('(not used)')).toMatch(/^left out of every calculation; the finding under the line it was written on says why$/);
    expect(legend.get('… ?')).toMatch(/unit is in doubt/);
    expect(legend.get('? …')).toMatch(/could not read/);
    expect(legend.get('PNnnn (l:c)')).toMatch(/check code and its line:column; `pneumark docs` explains every code/);
    expect(legend.has('@ (start)')).toBe(false);
  });

  it('explains @ (start) when measurements come before the first @ line, and is left out when nothing needs explaining', async () => {
    expect(legendOf(await shown(['-'], 'vitals hr 80\n@ 08:00\nvitals hr 82\n')).get('@ (start)')).toMatch(/before the note's first @ line/);
    expect(await shown(['-'], '@ 08:00\nvitals hr 82\n')).not.toContain('legend');
  });

  it('gives gas pressures shown in kPa first as in kPa (mmHg)', async () => {
    const legend = legendOf(await shown(['samples/home-oxygen-exacerbation.pneu']));
    expect(legend.get('P/F')).toBe('P/F ratio (PaO2 ÷ FiO2), in kPa (mmHg)');
    expect(legend.get('HCO3 calc')).toBe('HCO3 calculated from pH and PaCO2, in mmol/L');
  });

  it('takes every entry from the registry: each derived value\'s name and unit', () => {
    const legend = new Legend();
    for (const def of DERIVED) legend.value(def.id, false);
    const lines = legend.lines(paint(false)).slice(2);
    expect(lines).toHaveLength(DERIVED.length);
    DERIVED.forEach((def, i) => {
      expect(lines[i]).toContain(`  ${shortAsName(def.short)} `);
      expect(lines[i]).toContain(def.label);
      if (def.unit) expect(lines[i]).toMatch(new RegExp(`, in ${def.unit.replace(/[/()]/g, '\\$&')}$`));
    });
  });

  it('marks an estimate whose short name does not say so with est., and explains the mark', () => {
    const result = checkNote('@ 08:00\noxygen room air\nabg ph 7.40, pco2 40, po2 90\n');
    const tp = result.analysis.timeline.timepoints[0]!;
    const real = result.analysis.derivation(0)!;
    const pf = real.derived.find((v) => v.id === 'pf_ratio')!;
    const legend = new Legend();
    const lines = renderDerived(tp, { ...real, derived: [{ ...pf, estimate: true }], missing: [], notApplicable: [], interpretations: [] }, paint(false), legend);
    expect(lines[0]).toBe('  derived  P/F 429 mmHg est.');
    expect(legend.lines(paint(false))).toContain('  est.  a derived value that is an estimate by a rough rule');
  });

  it('is announced by show --help, which names every row of the output', async () => {
    const out = io();
    await run(['show', '--help'], out);
    const help = out.out();
    for (const row of ['header', 'SECTION', 'carried', 'derived', 'withheld', 'n/a', 'missing', 'reading']) expect(help, row).toMatch(new RegExp(`(?<![\\w/])${row}(?![\\w/])`));
    expect(help.replace(/\s+/g, ' ')).toContain('A legend at the end explains every short name and mark used above');
  });

  it('is plain text without colour, and only our colour codes on a terminal', async () => {
    const plain = await shown(['samples/broken-note.pneu']);
    expect(plain).not.toContain('\u001b[');
    const coloured = io('', true);
    await run(['show', 'samples/broken-note.pneu'], coloured);
    expect(coloured.out()).toContain('\u001b[1mlegend\u001b[22m');
  });
});

describe('colour, as README.md says', () => {
  it('on a terminal; NO_COLOR (not empty) turns it off; FORCE_COLOR (not 0) turns it on in a file or a pipe; NO_COLOR wins', async () => {
    const { colourWanted } = await import('../../server/src/cli/colour');
    expect(colourWanted({ isTTY: true }, {})).toBe(true);
    expect(colourWanted({ isTTY: false }, {})).toBe(false);
    expect(colourWanted({ isTTY: true }, { NO_COLOR: '1' })).toBe(false);
    expect(colourWanted({ isTTY: true }, { NO_COLOR: '' })).toBe(true);
    expect(colourWanted({ isTTY: false }, { FORCE_COLOR: '1' })).toBe(true);
    expect(colourWanted({ isTTY: false }, { FORCE_COLOR: '0' })).toBe(false);
    expect(colourWanted({ isTTY: false }, { FORCE_COLOR: '1', NO_COLOR: '1' })).toBe(false);
    const doc = readFileSync('README.md', 'utf8').replace(/\s+/g, ' ');
    expect(doc).toContain('set `NO_COLOR` (to any non-empty value) to turn it off (output to a file or a pipe has none, unless `FORCE_COLOR` is set to anything but `0`; `NO_COLOR` wins over it)');
  });
});
