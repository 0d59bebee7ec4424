// The command line: exit codes, the JSON shape, unreadable input, colour, stdin.
// Most tests call `run` with in-memory streams; a few run the built bundle as users do.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync, mkdirSync, truncateSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { memoryIo, type MemoryIo } from '../helpers/memory-io';
import { run } from '../../server/src/cli/main';

const io = (stdinText = '', env: NodeJS.ProcessEnv = { NO_COLOR: '1' }, cwd = process.cwd()): MemoryIo => memoryIo({ cwd, stdin: stdinText, env });

const jsonShape = z.object({
  pneumark: z.literal(1),
  files: z.array(z.object({
    path: z.string(),
    problem: z.string().nullable(),
    findings: z.array(z.object({
      code: z.string().regex(/^PN\d{3}$/),
      alias: z.string(),
      severity: z.enum(['error', 'warning', 'information', 'hint']),
      message: z.string(),
      line: z.number().int().positive(),
      column: z.number().int().positive(),
      endLine: z.number().int().positive(),
      endColumn: z.number().int().positive(),
      range: z.object({ start: z.object({ line: z.number(), character: z.number() }), end: z.object({ line: z.number(), character: z.number() }) }),
      fixes: z.array(z.object({ title: z.string(), edits: z.array(z.object({ newText: z.string() }).passthrough()) }).passthrough()),
      doc: z.string().startsWith('docs/checks.md#'),
    }).strict()),
    timepoints: z.array(z.object({ index: z.number(), label: z.string(), values: z.array(z.object({ field: z.string(), unit: z.string().nullable() }).passthrough()) }).passthrough()).optional(),
  }).passthrough()),
  summary: z.object({ files: z.number(), unreadable: z.number(), errors: z.number(), warnings: z.number(), information: z.number(), hints: z.number() }).strict(),
});

function tempDir(): string {
  return mkdtempSync(join(tmpdir(), 'pneumark-cli-'));
}

describe('pneumark check', async () => {
  it('exits 0 on clean notes and 1 when any finding is an error', async () => {
    const clean = io();
    expect(await run(['check', 'samples/summit-hut-evacuation.pneu'], clean)).toBe(0);
    expect(clean.out()).toMatch(/1 note checked: 0 errors/);
    const broken = io();
    expect(await run(['check', 'samples/broken-note.pneu'], broken)).toBe(1);
    expect(broken.out()).toMatch(/samples\/broken-note\.pneu:4:1 {2}error {2}PN101 unknown-section/);
  });

  it('exits 2 on usage errors', async () => {
    expect(await run(['check'], io())).toBe(2);
    expect(await run(['check', '--format', 'xml', 'samples'], io())).toBe(2);
    expect(await run(['check', '--colour', 'samples'], io())).toBe(2);
    expect(await run(['frobnicate'], io())).toBe(2);
    expect(await run([], io())).toBe(2);
    expect(await run(['show'], io())).toBe(2);
  });

  it('checks every .pneu in a folder, in a stable order', async () => {
    const out = io();
    await run(['check', '--format', 'json', 'samples'], out);
    const parsed = jsonShape.parse(JSON.parse(out.out()));
    expect(parsed.files.map((f) => f.path)).toEqual([...parsed.files.map((f) => f.path)].sort());
    expect(parsed.files.length).toBeGreaterThanOrEqual(4);
  });

  it('writes JSON in the documented shape, with timepoints and values in force', async () => {
    const out = io();
    expect(await run(['check', '--format', 'json', 'samples/broken-note.pneu'], out)).toBe(1);
    const parsed = jsonShape.parse(JSON.parse(out.out()));
    const file = parsed.files[0]!;
    const first = file.findings[0]!;
    expect(first).toMatchObject({ code: 'PN101', alias: 'unknown-section', severity: 'error', line: 4, column: 1, doc: 'docs/checks.md#pn101-unknown-section' });
    expect(parsed.summary.errors).toBe(file.findings.filter((f) => f.severity === 'error').length);
    expect(file.timepoints?.length).toBe(10);
  });

  it('names a note saved as UTF-16 or UTF-32 (a byte-order mark says so) as such, not as a binary file, in check and fmt', async () => {
    // Windows editors and PowerShell 5's `>` save text as UTF-16 with a byte-order mark.
    const text = '@ day 1 08:00\nvitals hr 80\n';
    const dir = tempDir();
    writeFileSync(join(dir, 'le.pneu'), Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]));
    writeFileSync(join(dir, 'be.pneu'), Buffer.concat([Buffer.from([0xfe, 0xff]), Buffer.from(text, 'utf16le').swap16()]));
    writeFileSync(join(dir, 'wide.pneu'), Buffer.from([0xff, 0xfe, 0x00, 0x00, 0x40, 0x00, 0x00, 0x00]));
    const out = io();
    expect(await run(['check', join(dir, 'be.pneu'), join(dir, 'le.pneu'), join(dir, 'wide.pneu')], out)).toBe(2);
    const lines = out.err().trim().split('\n');
    expect(lines).toHaveLength(3);
    expect(lines[0]).toMatch(/be\.pneu: is UTF-16 text \(big-endian\), not UTF-8: convert it to UTF-8 first$/);
    expect(lines[1]).toMatch(/le\.pneu: is UTF-16 text \(little-endian\), not UTF-8: convert it to UTF-8 first$/);
    expect(lines[2]).toMatch(/wide\.pneu: is UTF-32 text \(little-endian\), not UTF-8: convert it to UTF-8 first$/);
    const fmt = memoryIo({ cwd: dir });
    expect(await run(['fmt', '--write', 'le.pneu'], fmt)).toBe(2);
    expect(fmt.err()).toBe('pneumark: le.pneu: is UTF-16 text (little-endian), not UTF-8: convert it to UTF-8 first\n');
  });

  it('names a note saved as UTF-16 without a byte-order mark (a script writing utf-16-le) as such, not as a binary file', async () => {
    const text = '@ day 1 08:00  caf\u00e9\nvitals hr 80\n';
    const dir = tempDir();
    writeFileSync(join(dir, 'le.pneu'), Buffer.from(text, 'utf16le'));
    writeFileSync(join(dir, 'be.pneu'), Buffer.from(text, 'utf16le').swap16());
    writeFileSync(join(dir, 'short.pneu'), Buffer.from([0x76, 0x00, 0x01, 0x02])); // too little to tell: binary
    writeFileSync(join(dir, 'zeros.pneu'), Buffer.alloc(64)); // NULs alone are no text
    const out = memoryIo({ cwd: dir });
    expect(await run(['check', '.'], out)).toBe(2);
    expect(out.err()).toBe([
      'pneumark: be.pneu: is UTF-16 text (big-endian, without a byte-order mark), not UTF-8: convert it to UTF-8 first',
      'pneumark: le.pneu: is UTF-16 text (little-endian, without a byte-order mark), not UTF-8: convert it to UTF-8 first',
      'pneumark: short.pneu: looks like a binary file, not a note',
      'pneumark: zeros.pneu: looks like a binary file, not a note',
      '',
    ].join('\n'));
  });

  it('a note named with a trailing slash, as a folder would be, is told so in words, not by an error code', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'ward.pneu'), '@ day 1 08:00\nvitals hr 80\n');
    for (const args of [['check', 'ward.pneu/'], ['export', '--format', 'csv', 'ward.pneu/'], ['fmt', '--check', 'ward.pneu/'], ['show', 'ward.pneu/']]) {
      const out = memoryIo({ cwd: dir });
      expect(await run(args, out), args.join(' ')).toBe(2);
      expect(out.err(), args.join(' ')).toBe('pneumark: ward.pneu/: is a file, not a folder (leave out the last /)\n');
    }
  });

  it('reports missing, binary and huge files in one line each, and goes on', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'binary.pneu'), Buffer.from([0x76, 0x00, 0x01, 0x02]));
    writeFileSync(join(dir, 'ok.pneu'), 'vitals hr 80\n');
    // 21 MB without writing them: a sparse file (the size is what the limit reads).
    writeFileSync(join(dir, 'huge.pneu'), '');
    truncateSync(join(dir, 'huge.pneu'), 21 * 1024 * 1024);
    const out = io();
    const code = await run(['check', join(dir, 'binary.pneu'), join(dir, 'missing.pneu'), join(dir, 'huge.pneu'), join(dir, 'ok.pneu')], out);
    expect(code).toBe(2);
    expect(out.err()).toMatch(/binary.pneu: looks like a binary file/);
    expect(out.err()).toMatch(/missing.pneu: no such file or folder/);
    expect(out.err()).toMatch(/huge.pneu: too large to check \(21\.0 MB; the limit is 20 MB\)/);
    expect(out.err().trim().split('\n')).toHaveLength(3);
    expect(out.out()).toMatch(/1 note checked, 3 could not be checked/);
  });

  it('reads a note from standard input with -', async () => {
    const out = io('@ 08:00\nvitals spo2 104\n');
    expect(await run(['check', '-'], out)).toBe(1);
    expect(out.out()).toMatch(/<stdin>:2:\d+ {2}error {2}PN306/);
  });

  it('reports an empty note (nothing, or only blank lines) in one line, as a note that holds nothing to check, and exits 2', async () => {
    // As an empty folder or a pattern that matches nothing: a run fed nothing must not pass as clean.
    const empty = io('');
    expect(await run(['check', '-'], empty)).toBe(2);
    expect(empty.err()).toBe('pneumark: <stdin>: holds no note (it is empty or has only blank lines)\n');
    expect(empty.out()).toMatch(/0 notes checked, 1 could not be checked/);
    const dir = tempDir();
    writeFileSync(join(dir, 'empty.pneu'), '');
    writeFileSync(join(dir, 'blank.pneu'), '\ufeff \n\t\r\n\n');
    writeFileSync(join(dir, 'ok.pneu'), 'vitals hr 80\n');
    const files = memoryIo({ cwd: dir, env: { NO_COLOR: '1' } });
    expect(await run(['check', '.'], files)).toBe(2);
    expect(files.err().split('\n').filter(Boolean).sort()).toEqual([
      'pneumark: blank.pneu: holds no note (it is empty or has only blank lines)',
      'pneumark: empty.pneu: holds no note (it is empty or has only blank lines)',
    ]);
    expect(files.out()).toMatch(/1 note checked, 2 could not be checked/);
    // In JSON, the note is listed with its problem, and counted as not read.
    const json = io('\n');
    expect(await run(['check', '-', '--format', 'json'], json)).toBe(2);
    const parsed = jsonShape.parse(JSON.parse(json.out()));
    expect(parsed.files.map((f) => [f.path, f.problem])).toEqual([['<stdin>', 'holds no note (it is empty or has only blank lines)']]);
  });

  it('takes a note of comments only as a note (someone wrote it), not as empty', async () => {
    const out = io('# to be filled in\n');
    expect(await run(['check', '-'], out)).toBe(0);
    expect(out.err()).toBe('');
  });

  it('shows only errors with --quiet', async () => {
    const out = io();
    await run(['check', '--quiet', 'samples/broken-note.pneu'], out);
    expect(out.out()).not.toMatch(/ {2}warning {2}/);
    expect(out.out()).toMatch(/error/);
  });
});

describe('pneumark show', async () => {
  it('prints each timepoint with normalised values, carried values and findings under their line', async () => {
    const out = io();
    expect(await run(['show', 'samples/home-oxygen-exacerbation.pneu'], out)).toBe(0);
    const text = out.out();
    expect(text).toMatch(/@ day 1 14:20 {2}emergency department/);
    // A kPa note: gas pressures in kPa first (9.6 kPa = 72 mmHg), derived ones too.
    expect(text).toMatch(/PaCO2 9\.6 kPa \(72 mmHg\)/);
    expect(text).toMatch(/P\/F 28\.2 kPa \(212 mmHg\)/);
    const broken = io();
    await run(['show', 'samples/broken-note.pneu'], broken);
    expect(broken.out()).toMatch(/vitals {3}SpO2 104 % \(not used\)\n {6}✖ error PN306/);
  });

  it('refuses a note over the size check analyses alone, in one line, with exit status 2 (a hostile one would exhaust the heap)', async () => {
    const text = '@\n'.repeat(1024);
    const out = io(text, { NO_COLOR: '1', PNEUMARK_BIG_NOTE_KB: '1' });
    expect(await run(['show', '-'], out)).toBe(2);
    expect(out.out()).toBe('');
    expect(out.err()).toBe('pneumark: <stdin>: too large to show (2 KB; show takes notes up to 1 KB): check or export it instead\n');
    // The same note under the limit is shown.
    const shown = io(text, { NO_COLOR: '1', PNEUMARK_BIG_NOTE_KB: '2' });
    expect(await run(['show', '-'], shown)).toBe(1);
    expect(shown.out()).toContain('1024 timepoints');
  });

  it('counts information findings in its first line as check does, not as readings (which it prints in full below)', async () => {
    const out = io();
    await run(['show', 'samples/home-oxygen-exacerbation.pneu'], out);
    const [first] = out.out().split('\n');
    expect(first).toBe('samples/home-oxygen-exacerbation.pneu  4 timepoints  1 warning, 17 info');
  });

  it('shows a value whose unit could not be read as written, never as a unit without its number', async () => {
    const out = io('@ 08:00\nabg po2 71 mmhgg\nvitals temp 37 mmHg\nvent plateau 3 kPa\n');
    await run(['show', '-'], out);
    const text = out.out();
    expect(text).toContain('PaO2 71 mmhgg (not used)');
    expect(text).toContain('temp 37 mmHg (not used)');
    expect(text).toContain('plateau 3 kPa (not used)');
  });

  it('marks a carried value that is not used as it is marked on its own line', async () => {
    const out = io('@ 08:00\noxygen mask, fio2 4\n@ 09:00\nvitals hr 80\n');
    await run(['show', '-'], out);
    expect(out.out()).toContain('carried  device mask · FiO2 0.04 (not used) (carried from 08:00, line 2)');
  });

  it('prints derived values, what is missing, and readings under each timepoint', async () => {
    const out = io();
    await run(['show', 'samples/icu-ventilated-lung-injury.pneu'], out);
    const text = out.out();
    expect(text).toMatch(/derived {2}.*P\/F 93 mmHg/);
    expect(text).toMatch(/ΔP 19 cmH2O/);
    expect(text).toMatch(/ΔP 15 cmH2O\*/);
    expect(text).toMatch(/missing {2}add spo2 to get OSI/);
    expect(text).toMatch(/reading {2}P\/F 93 mmHg with PEEP 8 cmH2O: consistent with the ≤ 100 mmHg oxygenation band/);
  });

  it('puts derived values with formula, inputs and sources in the JSON', async () => {
    const out = io();
    await run(['check', '--format', 'json', 'samples/icu-ventilated-lung-injury.pneu'], out);
    const parsed = JSON.parse(out.out()) as { files: { timepoints: { derived: { id: string; substituted: string; inputs: { origin: { kind: string } }[]; source: string }[]; readings: { text: string }[] }[] }[] };
    const pf = parsed.files[0]!.timepoints[1]!.derived.find((d) => d.id === 'pf_ratio')!;
    expect(pf.substituted).toBe('88 ÷ 0.60 = 147 mmHg');
    expect(pf.inputs.map((i) => i.origin.kind)).toEqual(['here', 'here']);
    expect(pf.source).toMatch(/Berlin/);
    expect(parsed.files[0]!.timepoints[1]!.readings.length).toBeGreaterThan(0);
  });

  it('lists in the JSON the values withheld at a timepoint, with the reason (a gas PN402 doubts holds back its expected compensation)', async () => {
    const out = io('@ 08:00\noxygen room air\nabg ph 7.40, pco2 40, po2 90, hco3 15\n');
    await run(['check', '--format', 'json', '-'], out);
    const parsed = JSON.parse(out.out()) as { files: { timepoints: { notApplicable: { id: string; reason: string }[] }[] }[] };
    const withheld = parsed.files[0]!.timepoints[0]!.notApplicable;
    // pH 7.40 and PaCO2 40 mmHg give HCO3 24.5 mmol/L (Henderson–Hasselbalch, pK 6.1, CO2 solubility 0.0307 mmol/L/mmHg; from memory).
    expect(withheld.find((n) => n.id === 'paco2_expected')?.reason).toMatch(/^the pH, PaCO2 and HCO3 stated do not fit together \(pH and PaCO2 give HCO3 24\.5 mmol\/L; see PN402\)/);
    expect(withheld.map((n) => n.id)).toEqual(expect.arrayContaining(['hco3_expected_acute', 'hco3_expected_chronic']));
  });

  it('tells a written label from the name given to a timepoint without one (writtenLabel)', async () => {
    const out = io('@ day 1 08:00  first look\nvitals hr 80\n@ +5m\nvitals hr 82\n');
    await run(['check', '--format', 'json', '-'], out);
    const tps = (JSON.parse(out.out()) as { files: { timepoints: { label: string; writtenLabel: string | null }[] }[] }).files[0]!.timepoints;
    expect(tps.map((t) => [t.label, t.writtenLabel])).toEqual([['first look', 'first look'], ['+5m', null]]);
  });

  it('uses colour on a terminal unless NO_COLOR is set', async () => {
    const tty = io('', {});
    tty.stdout.isTTY = true;
    await run(['show', 'samples/summit-hut-evacuation.pneu'], tty);
    expect(tty.out()).toContain('\u001b[');
    const noColour = io('', { NO_COLOR: '1' });
    noColour.stdout.isTTY = true;
    await run(['show', 'samples/summit-hut-evacuation.pneu'], noColour);
    expect(noColour.out()).not.toContain('\u001b[');
  });
});

describe('the built command', async () => {
  it('runs as a program, with exit codes for the shell', async () => {
    const ok = spawnSync(process.execPath, ['dist/cli.js', 'check', 'samples/icu-ventilated-lung-injury.pneu'], { encoding: 'utf8' });
    expect(ok.status).toBe(0);
    const bad = spawnSync(process.execPath, ['dist/cli.js', 'check', '-'], { input: '@ 08:00\nabg ph 9.1\n', encoding: 'utf8' });
    expect(bad.status).toBe(1);
    expect(bad.stdout).toMatch(/PN301/);
    const dir = tempDir();
    mkdirSync(join(dir, 'nested'));
    writeFileSync(join(dir, 'nested', 'a.pneu'), 'vitals hr 80\n');
    const folder = spawnSync(process.execPath, [join(process.cwd(), 'dist/cli.js'), 'check', '.'], { cwd: dir, encoding: 'utf8' });
    expect(folder.stdout).toMatch(/1 note checked/);
  });

  it('reports standard input with nothing piped in, in show and export as in check', () => {
    for (const args of [['check', '-'], ['show', '-'], ['export', '-', '--format', 'csv']]) {
      const r = spawnSync(process.execPath, ['dist/cli.js', ...args], { input: '', encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
      expect(r.status, args.join(' ')).toBe(2);
      expect(r.stderr, args.join(' ')).toBe('pneumark: <stdin>: holds no note (it is empty or has only blank lines)\n');
    }
  });
});
