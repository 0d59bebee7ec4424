// `--stdin-name PATH` (check, export, fmt, show): the note read from `-` is reported, exported and keyed
// under that path, and its pneumark.config.json is looked up from that path's folder, as for a
// file there (which need not exist). Editors and pipelines pipe a buffer in and say what file it is.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HELP } from '../../server/src/cli/args';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';

/** An invented note: PaCO2 5.3 and PaO2 11 with no unit are ordinary in kPa, implausible in mmHg (PN204). */
const NOTE = '@ day 1 08:00  first look\nabg ph 7.40, paco2 5.3, pao2 11\noxygen fio2 0.4\n@ day 1 12:00\nabg ph 7.38, paco2 5.6, pao2 10.2\nvitals spo2 94 %\n';
/** An invented note in mmHg, and the same note with one value corrected at its second timepoint (PaO2 76 → 67). */
const GASES = '@ day 1 08:00  first look\nabg ph 7.40, paco2 40, pao2 80\noxygen fio2 0.4\n@ day 1 12:00\nabg ph 7.38, paco2 42, pao2 76\nvitals spo2 94 %\n';
const EDITED = GASES.replace('pao2 76', 'pao2 67');

/** A project: `pneumark.config.json` (when given) at its root, a folder `ward` below it, and a folder `elsewhere` beside it. */
function project(config: string | null): string {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-stdin-name-'));
  mkdirSync(join(dir, 'proj', 'ward'), { recursive: true });
  mkdirSync(join(dir, 'elsewhere'));
  if (config !== null) writeFileSync(join(dir, 'proj', 'pneumark.config.json'), config);
  return dir;
}

async function cli(args: readonly string[], cwd: string, stdin = ''): Promise<{ code: number; out: string; err: string }> {
  const io = memoryIo({ cwd, stdin });
  const code = await run(args, io);
  return { code, out: io.out(), err: io.err() };
}

/** The fullUrls of a FHIR export's Observations by resource id (not the Patient's), and each Bundle's id. */
function fhirIds(out: string): { bundles: string[]; observations: Map<string, string> } {
  const bundles = JSON.parse(out) as { id: string; entry: { fullUrl: string; resource: { resourceType: string; id: string } }[] }[];
  const observations = new Map<string, string>();
  for (const b of bundles) for (const e of b.entry) if (e.resource.resourceType === 'Observation') observations.set(e.resource.id, e.fullUrl);
  return { bundles: bundles.map((b) => b.id), observations };
}

describe('--stdin-name names the note read from standard input', () => {
  it('check gives the output a file of that path gives, in every format', async () => {
    const dir = project('{ "gasUnit": "kPa" }');
    writeFileSync(join(dir, 'proj', 'ward', 'bed 4.pneu'), NOTE);
    for (const format of ['text', 'json', 'sarif']) {
      const fromFile = await cli(['check', '--format', format, 'proj/ward/bed 4.pneu'], dir);
      const fromStdin = await cli(['check', '--format', format, '-', '--stdin-name', 'proj/ward/bed 4.pneu'], dir, NOTE);
      expect(fromStdin.code, format).toBe(fromFile.code);
      expect(fromStdin.out, format).toBe(fromFile.out);
      expect(fromStdin.out, format).not.toContain('<stdin>');
    }
  });

  it('names the note in text output and as the SARIF artifact, by a relative URI (the file need not exist)', async () => {
    const dir = project(null);
    const text = await cli(['check', '-', '--stdin-name', 'proj/ward/bed 4.pneu'], dir, NOTE);
    expect(text.out).toMatch(/^proj\/ward\/bed 4\.pneu:2:\d+ {2}warning {2}PN204/);
    const sarif = JSON.parse((await cli(['check', '--format', 'sarif', '-', '--stdin-name', './proj/ward/bed 4.pneu'], dir, NOTE)).out) as {
      runs: { artifacts: { location: { uri?: string; uriBaseId?: string; description?: unknown } }[]; results: { locations: { physicalLocation: { artifactLocation: { uri?: string; index: number } } }[] }[] }[];
    };
    const run0 = sarif.runs[0]!;
    expect(run0.artifacts.map((a) => a.location)).toEqual([{ uri: 'proj/ward/bed%204.pneu', uriBaseId: 'SRCROOT' }]);
    expect(run0.results.length).toBeGreaterThan(0);
    for (const r of run0.results) expect(r.locations[0]!.physicalLocation.artifactLocation.uri).toBe('proj/ward/bed%204.pneu');
    // An absolute path is shown relative to the working folder, as a file named so is.
    const json = JSON.parse((await cli(['check', '--format', 'json', '-', '--stdin-name', join(dir, 'proj/ward/../ward/bed 4.pneu')], dir, NOTE)).out) as { files: { path: string }[] };
    expect(json.files.map((f) => f.path)).toEqual(['proj/ward/bed 4.pneu']);
  });

  it('export: the file column of CSV and JSON Lines is that path', async () => {
    const dir = project(null);
    const csv = await cli(['export', '--format', 'csv', '-', '--stdin-name', 'proj/ward/b.pneu'], dir, NOTE);
    expect(csv.out.trim().split('\n').slice(1).map((line) => line.split(',')[0])).toEqual(['proj/ward/b.pneu', 'proj/ward/b.pneu']);
    const jsonl = await cli(['export', '--format', 'jsonl', '-', '--stdin-name', 'proj/ward/b.pneu'], dir, NOTE);
    expect(jsonl.out.trim().split('\n').map((line) => (JSON.parse(line) as { file: string }).file)).toEqual(['proj/ward/b.pneu', 'proj/ward/b.pneu']);
    // Without it, the placeholder, as before.
    const unnamed = await cli(['export', '--format', 'csv', '-'], dir, NOTE);
    expect(unnamed.out.trim().split('\n')[1]!.split(',')[0]).toBe('<stdin>');
  });

  it('FHIR: ids are those of a file of that path, and an edit renames only what it changed', async () => {
    const dir = project(null);
    writeFileSync(join(dir, 'proj', 'ward', 'b.pneu'), GASES);
    const named = ['export', '--format', 'fhir', '-', '--stdin-name', 'proj/ward/b.pneu'];
    const before = await cli(named, dir, GASES);
    expect(before.out).toBe((await cli(['export', '--format', 'fhir', 'proj/ward/b.pneu'], dir)).out);
    const after = fhirIds((await cli(named, dir, EDITED)).out);
    const ids = fhirIds(before.out);
    expect(after.bundles).toEqual(ids.bundles);
    // Everything but the corrected PaO2 and the P/F made from it keeps its fullUrl.
    const renamed = [...ids.observations].filter(([id, url]) => after.observations.get(id) !== url).map(([id]) => id);
    expect(renamed.sort()).toEqual(['obs-1-pao2', 'obs-1-pf-ratio']);
    expect(ids.observations.size).toBe(10);
    // Unnamed, the note is keyed by its whole text: the same edit renames every Observation.
    const plain = fhirIds((await cli(['export', '--format', 'fhir', '-'], dir, GASES)).out);
    const plainEdited = fhirIds((await cli(['export', '--format', 'fhir', '-'], dir, EDITED)).out);
    expect(plain.observations.get('obs-0-pao2')).not.toBe(plainEdited.observations.get('obs-0-pao2'));
    // Another name, other ids.
    const other = fhirIds((await cli(['export', '--format', 'fhir', '-', '--stdin-name', 'proj/ward/c.pneu'], dir, GASES)).out);
    expect(other.observations.get('obs-0-pao2')).not.toBe(ids.observations.get('obs-0-pao2'));
    expect(other.bundles).not.toEqual(ids.bundles);
  });

  it('--redact: the note takes the place in the run (and so the pseudonym) of a file of that name', async () => {
    const dir = project(null);
    const notes = ['@ 08:00\nvitals spo2 91\n', NOTE, '@ 09:00\nvitals hr 80\n'];
    ['a.pneu', 'b.pneu', 'c.pneu'].forEach((name, i) => writeFileSync(join(dir, 'proj', 'ward', name), notes[i]!));
    const whole = await cli(['export', '--format', 'fhir', '--redact', 'proj/ward'], dir);
    const elsewhere = join(dir, 'elsewhere');
    writeFileSync(join(elsewhere, 'a.pneu'), notes[0]!);
    writeFileSync(join(elsewhere, 'c.pneu'), notes[2]!);
    for (const format of ['fhir', 'csv', 'jsonl']) {
      const expected = format === 'fhir' ? whole.out : (await cli(['export', '--format', format, '--redact', 'proj/ward'], dir)).out;
      const piped = await cli(['export', '--format', format, '--redact', '.', '-', '--stdin-name', 'b.pneu'], elsewhere, NOTE);
      expect(piped.out, format).toBe(expected);
    }
    const csv = await cli(['export', '--format', 'csv', '--redact', '.', '-', '--stdin-name', 'b.pneu'], elsewhere, NOTE);
    expect(csv.out.trim().split('\n').slice(1).map((line) => line.split(',')[0])).toEqual(['note-00001', 'note-00002', 'note-00002', 'note-00003']);
  });

  it('reads pneumark.config.json upward from the folder of that path, not the working folder', async () => {
    const dir = project('{ "gasUnit": "kPa" }');
    const cwd = join(dir, 'elsewhere');
    // Outside the project: read in mmHg, PaCO2 5.3 is doubted (PN204).
    const unnamed = await cli(['check', '-'], cwd, NOTE);
    expect(unnamed.out).toMatch(/PN204/);
    // Named into the project (a file that does not exist): read in kPa, as a note there would be.
    const named = await cli(['check', '-', '--stdin-name', '../proj/ward/new.pneu'], cwd, NOTE);
    expect(named.code).toBe(0);
    expect(named.out).not.toMatch(/PN204/);
    expect(named.out).toMatch(/^1 note checked: 0 errors, 0 warnings/m);
    const exported = await cli(['export', '--format', 'csv', '-', '--stdin-name', '../proj/ward/new.pneu'], cwd, NOTE);
    const [header, row] = exported.out.split('\n');
    const column = header!.split(',').indexOf('paco2_mmHg');
    expect(column).toBeGreaterThan(0);
    // 5.3 kPa = 39.75 mmHg (1 kPa = 7.50062 mmHg, the definition of the units).
    expect(Number(row!.split(',')[column])).toBeCloseTo(39.75, 1);
    // The problems of that file are reported, as for a file there.
    writeFileSync(join(dir, 'proj', 'pneumark.config.json'), '{ "gasUnit": "kpa" }');
    const bad = await cli(['check', '-', '--stdin-name', '../proj/ward/new.pneu'], cwd, NOTE);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^pneumark: \.\.\/proj\/pneumark\.config\.json:1:3: `gasUnit`/);
  });

  it('fmt: messages name the note by that path', async () => {
    const dir = project(null);
    const binary = await cli(['fmt', '-', '--stdin-name', 'proj/ward/b.pneu'], dir, '@ 08:00\u0000\n');
    expect(binary.code).toBe(2);
    expect(binary.err).toBe('pneumark: proj/ward/b.pneu: looks like a binary file, not a note\n');
    const printed = await cli(['fmt', '-', '--stdin-name', 'proj/ward/b.pneu'], dir, NOTE);
    expect(printed.code).toBe(0);
    expect(printed.out).toBe((await cli(['fmt', '-'], dir, NOTE)).out);
  });

  it('show: the heading names the note by that path, and its project file is read from that path\'s folder', async () => {
    const dir = project('{ "gasUnit": "kPa" }');
    const cwd = join(dir, 'elsewhere');
    writeFileSync(join(dir, 'proj', 'ward', 'bed 4.pneu'), NOTE);
    // Unnamed, outside the project: `<stdin>`, read in mmHg, PaCO2 5.3 doubted (PN204).
    const unnamed = await cli(['show', '-'], cwd, NOTE);
    expect(unnamed.out.split('\n')[0]).toMatch(/^<stdin> {2}2 timepoints {2}/);
    expect(unnamed.out).toMatch(/PN204/);
    // Named into the project (a file that does not exist there): read in kPa, as a note there is.
    const named = await cli(['show', '-', '--stdin-name', '../proj/ward/new.pneu'], cwd, NOTE);
    expect(named.code).toBe(0);
    expect(named.err).toBe('');
    expect(named.out.split('\n')[0]).toMatch(/^\.\.\/proj\/ward\/new\.pneu {2}2 timepoints/);
    expect(named.out).not.toMatch(/PN204/);
    expect(named.out).not.toContain('<stdin>');
    // The same output as the file of that path gives (named as the working folder names it).
    const fromFile = await cli(['show', 'proj/ward/bed 4.pneu'], dir);
    const piped = await cli(['show', '-', '--stdin-name', 'proj/ward/bed 4.pneu'], dir, NOTE);
    expect(piped.out).toBe(fromFile.out);
    expect(piped.code).toBe(fromFile.code);
    // The problems of that file are reported, as for a file there (exit 2).
    writeFileSync(join(dir, 'proj', 'pneumark.config.json'), '{ "gasUnit": "kpa" }');
    const bad = await cli(['show', '-', '--stdin-name', '../proj/ward/new.pneu'], cwd, NOTE);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^pneumark: \.\.\/proj\/pneumark\.config\.json:1:3: `gasUnit`/);
    // Messages about the note name it by that path too.
    const binary = await cli(['show', '-', '--stdin-name', 'proj/ward/b.pneu'], dir, '@ 08:00\u0000\n');
    expect(binary.code).toBe(2);
    expect(binary.err).toBe('pneumark: proj/ward/b.pneu: looks like a binary file, not a note\n');
    const blank = await cli(['show', '-', '--stdin-name', 'proj/ward/b.pneu'], dir, '\n\n');
    expect(blank.code).toBe(2);
    expect(blank.err).toMatch(/^pneumark: proj\/ward\/b\.pneu: /);
  });

  it('is described by the help of check, export, fmt and show', () => {
    for (const command of ['check', 'export', 'fmt', 'show']) expect(HELP[command], command).toMatch(/--stdin-name PATH/);
    expect(HELP.main).toMatch(/--stdin-name PATH \(check, export, fmt, show\)/);
    expect(HELP.main).toMatch(/--stdin-name without - among the inputs/);
  });
});

describe('--stdin-name usage errors (exit 2, one line)', () => {
  const cases: [string, string[], RegExp][] = [
    ['without - among the inputs', ['check', 'a.pneu', '--stdin-name', 'b.pneu'], /^pneumark check: --stdin-name names the note read from standard input, and - is not among the inputs; add - or leave --stdin-name out$/],
    ['export without -', ['export', '--format', 'csv', 'a.pneu', '--stdin-name', 'b.pneu'], /^pneumark export: --stdin-name names the note read from standard input, and - is not among/],
    ['fmt without -', ['fmt', 'a.pneu', '--stdin-name', 'b.pneu'], /^pneumark fmt: --stdin-name names the note read from standard input, and - is not among/],
    ['show without -', ['show', 'a.pneu', '--stdin-name', 'b.pneu'], /^pneumark show: --stdin-name names the note read from standard input, and - is not among the inputs; add - or leave --stdin-name out$/],
    ['show: empty', ['show', '-', '--stdin-name', ''], /^pneumark show: --stdin-name: must not be empty .*\(got ""\)$/],
    ['show: no value', ['show', '-', '--stdin-name'], /^pneumark show: --stdin-name needs a value$/],
    ['show: standard input itself', ['show', '-', '--stdin-name', '-'], /^pneumark show: --stdin-name: names standard input itself/],
    ['show: a folder', ['show', '-', '--stdin-name', 'ward/'], /^pneumark show: --stdin-name: ends in a slash: name a file, not a folder \(got "ward\/"\)$/],
    ['show: a NUL character', ['show', '-', '--stdin-name', 'a\u0000.pneu'], /^pneumark show: --stdin-name: holds a NUL character/],
    ['show: given twice', ['show', '-', '--stdin-name', 'a.pneu', '--stdin-name', 'b.pneu'], /^pneumark show: --stdin-name is given twice/],
    ['empty', ['check', '-', '--stdin-name', ''], /^pneumark check: --stdin-name: must not be empty .*\(got ""\)$/],
    ['no value', ['check', '-', '--stdin-name'], /^pneumark check: --stdin-name needs a value$/],
    ['standard input itself', ['check', '-', '--stdin-name', '-'], /^pneumark check: --stdin-name: names standard input itself/],
    ['a folder', ['export', '--format', 'jsonl', '-', '--stdin-name', 'ward/'], /^pneumark export: --stdin-name: ends in a slash: name a file, not a folder \(got "ward\/"\)$/],
    ['a NUL character', ['check', '-', '--stdin-name', 'a\u0000.pneu'], /^pneumark check: --stdin-name: holds a NUL character/],
    ['given twice', ['check', '-', '--stdin-name', 'a.pneu', '--stdin-name', 'b.pneu'], /^pneumark check: --stdin-name is given twice/],
    ['a note among the inputs too', ['check', 'a.pneu', '-', '--stdin-name', './a.pneu'], /^pneumark check: --stdin-name a\.pneu names a note that is among the inputs too; each note is read once: leave out one of the two$/],
  ];
  for (const [what, args, message] of cases) {
    it(what, async () => {
      const dir = project(null);
      writeFileSync(join(dir, 'a.pneu'), NOTE);
      const r = await cli(args, dir, NOTE);
      expect(r.code).toBe(2);
      expect(r.out).toBe('');
      expect(r.err.split('\n')).toHaveLength(2); // one line, then the end of it
      expect(r.err.trimEnd()).toMatch(message);
    });
  }
});

describe('--stdin-name with the built command', () => {
  const CLI = join(process.cwd(), 'dist/cli.js');
  it('names a big note analysed in a worker thread of its own, and reads its project file, as in this thread', () => {
    const dir = project('{ "gasUnit": "kPa" }');
    const args = [CLI, 'check', '--format', 'json', '-', '--stdin-name', 'proj/ward/b.pneu'];
    const spawn = (env: Record<string, string>) => spawnSync(process.execPath, args, { cwd: dir, input: NOTE, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', ...env } });
    // PNEUMARK_BIG_NOTE_KB=0: every note goes to a worker of its own.
    const alone = spawn({ PNEUMARK_BIG_NOTE_KB: '0' });
    const here = spawn({});
    expect(alone.stderr).toBe('');
    expect(alone.stdout).toBe(here.stdout);
    const parsed = JSON.parse(alone.stdout) as { files: { path: string; findings: { code: string }[] }[] };
    expect(parsed.files.map((f) => f.path)).toEqual(['proj/ward/b.pneu']);
    expect(parsed.files[0]!.findings.map((f) => f.code)).not.toContain('PN204');
    expect(readFileSync(join(dir, 'proj', 'pneumark.config.json'), 'utf8')).toContain('kPa');
  });
});

// A note piped in under a path that `.pneuignore` or `--exclude` leaves out is left alone, as the
// file would be when a folder is checked: editors and pre-commit hooks pipe every buffer in with
// --stdin-name, and must not fail on the notes a project excludes.
describe('--stdin-name naming an excluded path', () => {
  /** A project with `pneumark.config.json` (kPa), `.pneuignore` leaving out `ward/skip.pneu` and `drafts/`, and `elsewhere` beside it. */
  function excluding(): string {
    const dir = project('{ "gasUnit": "kPa" }');
    writeFileSync(join(dir, 'proj', '.pneuignore'), 'ward/skip.pneu\ndrafts/\n');
    return dir;
  }
  /** A note with an error finding (an unknown section), so a note that is checked cannot pass unnoticed. */
  const BROKEN = '@ day 1 08:00\nvitalz hr 80\n';
  const cwd = (dir: string) => join(dir, 'proj');

  const ignored: [string, string[], RegExp][] = [
    ['.pneuignore', ['-', '--stdin-name', 'ward/skip.pneu'], /^pneumark: the note on standard input was not (checked|exported|formatted): ward\/skip\.pneu is excluded by \.pneuignore \(line 1: ward\/skip\.pneu\)$/],
    ['.pneuignore, a folder', ['-', '--stdin-name', 'drafts/new.pneu'], /^pneumark: the note on standard input was not (checked|exported|formatted): drafts\/new\.pneu is excluded by \.pneuignore \(line 2: drafts\/\)$/],
    ['--exclude PATTERN', ['-', '--stdin-name', 'ward/a.pneu', '--exclude', 'x.pneu', '--exclude', 'ward/*.pneu'], /^pneumark: the note on standard input was not (checked|exported|formatted): ward\/a\.pneu is excluded by --exclude ward\/\*\.pneu$/],
    ['--exclude ./PATH', ['-', '--stdin-name', 'ward/a.pneu', '--exclude', './ward'], /^pneumark: the note on standard input was not (checked|exported|formatted): ward\/a\.pneu is excluded by --exclude \.\/ward$/],
    // An absolute path excludes whether or not it exists: a buffer piped in is often not saved yet.
    ['--exclude /ABSOLUTE/PATH of no file', ['-', '--stdin-name', 'ward/new.pneu', '--exclude', '<DIR>/proj/ward/new.pneu'], /^pneumark: the note on standard input was not (checked|exported|formatted): ward\/new\.pneu is excluded by --exclude \/.*\/proj\/ward\/new\.pneu$/],
    ['--exclude /ABSOLUTE/FOLDER of no folder', ['-', '--stdin-name', 'unsaved/new.pneu', '--exclude', '<DIR>/proj/unsaved'], /^pneumark: the note on standard input was not (checked|exported|formatted): unsaved\/new\.pneu is excluded by --exclude \/.*\/proj\/unsaved$/],
  ];

  for (const [what, typed, message] of ignored) {
    /** The arguments, with `<DIR>` the project's folder (made afresh for each test). */
    const withDir = (dir: string) => typed.map((a) => a.replace('<DIR>', dir));
    it(`check, every format: an empty run, exit 0, one line on stderr (${what})`, async () => {
      const dir = excluding();
      const empty = { json: '', sarif: '', text: '' };
      for (const format of ['text', 'json', 'sarif'] as const) {
        const r = await cli(['check', '--format', format, ...withDir(dir)], cwd(dir), BROKEN);
        expect(r.code, format).toBe(0);
        expect(r.err.trimEnd(), format).toMatch(message);
        expect(r.err.split('\n'), format).toHaveLength(2);
        expect(r.err, format).toContain('checked');
        // (SARIF lists every rule, PN101 among them, whatever it found.)
        expect(r.out, format).not.toMatch(format === 'sarif' ? /skip|a\.pneu|new\.pneu/ : /PN101|skip|a\.pneu|new\.pneu/);
        empty[format] = r.out;
      }
      expect(empty.text).toBe('0 notes checked: 0 errors, 0 warnings, 0 info.\n');
      const json = JSON.parse(empty.json) as { files: unknown[]; summary: { files: number } };
      expect(json.files).toEqual([]);
      expect(json.summary.files).toBe(0);
      const sarif = JSON.parse(empty.sarif) as { version: string; runs: { artifacts?: unknown[]; results: unknown[] }[] };
      expect(sarif.version).toBe('2.1.0');
      // A run without notes lists no artifacts (SARIF leaves the property out).
      expect(sarif.runs[0]!.artifacts).toBeUndefined();
      expect(sarif.runs[0]!.results).toEqual([]);
    });

    it(`export, every format: what no note gives, exit 0, one line on stderr (${what})`, async () => {
      const dir = excluding();
      for (const format of ['csv', 'jsonl', 'fhir']) {
        const r = await cli(['export', '--format', format, ...withDir(dir)], cwd(dir), BROKEN);
        expect(r.code, format).toBe(0);
        expect(r.err.trimEnd(), format).toMatch(message);
        expect(r.err, format).toContain('exported');
        if (format === 'csv') {
          expect(r.out.split('\n').filter((line) => line !== '')).toHaveLength(1);
          expect(r.out).toMatch(/^file,/);
        }
        if (format === 'jsonl') expect(r.out).toBe('');
        if (format === 'fhir') expect(JSON.parse(r.out)).toEqual([]);
      }
    });

    it(`fmt: prints the note unchanged; fmt --check passes (${what})`, async () => {
      const dir = excluding();
      const messy = '@  day 1   08:00\r\nvitals   hr 80,spo2 91\r\n\r\n\r\n';
      expect((await cli(['fmt', '-'], cwd(dir), messy)).out).not.toBe(messy);
      for (const text of [messy, `\uFEFF${messy}`, '']) {
        const r = await cli(['fmt', ...withDir(dir)], cwd(dir), text);
        expect(r.code).toBe(0);
        expect(r.out).toBe(text);
        expect(r.err.trimEnd()).toMatch(message);
        expect(r.err).toContain('formatted');
      }
      const checked = await cli(['fmt', '--check', ...withDir(dir)], cwd(dir), messy);
      expect(checked.code).toBe(0);
      expect(checked.out).toBe('');
      expect(checked.err.trimEnd()).toMatch(message);
    });
  }

  it('fmt: bytes that are no UTF-8 text come back as they went in', async () => {
    const dir = excluding();
    const bytes = Buffer.from([0x40, 0x20, 0x30, 0x38, 0x3a, 0x30, 0x30, 0x0a, 0x6e, 0x6f, 0x74, 0x65, 0x20, 0xe9, 0x0a]);
    let out: Buffer = Buffer.alloc(0);
    const io = { ...memoryIo({ cwd: cwd(dir), stdin: bytes }), stdout: { write: (s: string | Uint8Array) => { out = Buffer.concat([out, typeof s === 'string' ? Buffer.from(s) : s]); return true; } } };
    expect(await run(['fmt', '-', '--stdin-name', 'ward/skip.pneu'], io)).toBe(0);
    expect(out.equals(bytes)).toBe(true);
  });

  it('show shows the note: it asks for one note by name, and a file named to show is shown whatever excludes it', async () => {
    const dir = excluding();
    writeFileSync(join(dir, 'proj', 'ward', 'skip.pneu'), NOTE);
    const file = await cli(['show', 'ward/skip.pneu'], cwd(dir));
    const piped = await cli(['show', '-', '--stdin-name', 'ward/skip.pneu', ], cwd(dir), NOTE);
    expect(piped.code).toBe(0);
    expect(piped.err).toBe('');
    expect(piped.out).toBe(file.out);
    expect(piped.out.split('\n')[0]).toMatch(/^ward\/skip\.pneu {2}2 timepoints/);
  });

  it('a path that is not excluded is checked, exported and formatted as before', async () => {
    const dir = excluding();
    const checked = await cli(['check', '-', '--stdin-name', 'ward/keep.pneu'], cwd(dir), BROKEN);
    expect(checked.code).toBe(1);
    expect(checked.out).toMatch(/^ward\/keep\.pneu:2:1 {2}error {2}PN101/);
    expect(checked.err).toBe('');
    const exported = await cli(['export', '--format', 'jsonl', '-', '--stdin-name', 'ward/keep.pneu'], cwd(dir), NOTE);
    expect(exported.code).toBe(0);
    expect(exported.out.trim().split('\n')).toHaveLength(2);
    const formatted = await cli(['fmt', '-', '--stdin-name', 'ward/keep.pneu'], cwd(dir), '@  day 1   08:00\nvitals   hr 80\n');
    expect(formatted.out).toBe((await cli(['fmt', '-'], cwd(dir), '@  day 1   08:00\nvitals   hr 80\n')).out);
    expect(formatted.err).toBe('');
  });

  it('the .pneuignore files that apply are found from the folder of that path, as the project file is', async () => {
    const dir = excluding();
    const elsewhere = join(dir, 'elsewhere');
    // From beside the project: the project's .pneuignore (the folder of its pneumark.config.json) applies.
    const left = await cli(['check', '-', '--stdin-name', '../proj/ward/skip.pneu'], elsewhere, BROKEN);
    expect(left.code).toBe(0);
    // The file is named by its absolute path, as it lies outside the working folder.
    expect(left.err.trimEnd()).toBe(`pneumark: the note on standard input was not checked: ../proj/ward/skip.pneu is excluded by ${join(dir, 'proj', '.pneuignore')} (line 1: ward/skip.pneu)`);
    // A note beside it is read with the project's settings (kPa: PaCO2 5.3 is not doubted).
    const kept = await cli(['check', '-', '--stdin-name', '../proj/ward/other.pneu'], elsewhere, NOTE);
    expect(kept.code).toBe(0);
    expect(kept.out).not.toMatch(/PN204/);
    expect(kept.out).toMatch(/^1 note checked/m);
    // A .pneuignore in the note's own folder applies too.
    writeFileSync(join(dir, 'proj', 'ward', '.pneuignore'), 'other.pneu\n');
    const own = await cli(['check', '-', '--stdin-name', '../proj/ward/other.pneu'], elsewhere, NOTE);
    expect(own.code).toBe(0);
    expect(own.out).toBe('0 notes checked: 0 errors, 0 warnings, 0 info.\n');
    expect(own.err.trimEnd()).toBe(`pneumark: the note on standard input was not checked: ../proj/ward/other.pneu is excluded by ${join(dir, 'proj', 'ward', '.pneuignore')} (line 1: other.pneu)`);
    // From the project's folder, relative to it.
    const inside = await cli(['check', '-', '--stdin-name', 'ward/other.pneu'], cwd(dir), NOTE);
    expect(inside.err.trimEnd()).toBe('pneumark: the note on standard input was not checked: ward/other.pneu is excluded by ward/.pneuignore (line 1: other.pneu)');
    // The project file of an excluded note is not read: its problems are not reported either.
    writeFileSync(join(dir, 'proj', 'pneumark.config.json'), '{ "gasUnit": "kpa" }');
    const bad = await cli(['check', '-', '--stdin-name', '../proj/ward/skip.pneu'], elsewhere, BROKEN);
    expect(bad.code).toBe(0);
    expect(bad.err).not.toMatch(/pneumark\.config\.json/);
  });

  it('names the line that matches: the last one, or the one that leaves out a folder above the note', async () => {
    const dir = excluding();
    writeFileSync(join(dir, 'proj', '.pneuignore'), '# drafts and skipped notes\n*.pneu\n!keep.pneu\n\nward/skip.pneu\ndrafts/\n');
    const line = async (name: string) => (await cli(['check', '-', '--stdin-name', name], cwd(dir), BROKEN)).err.trimEnd();
    expect(await line('ward/skip.pneu')).toBe('pneumark: the note on standard input was not checked: ward/skip.pneu is excluded by .pneuignore (line 5: ward/skip.pneu)');
    expect(await line('other.pneu')).toBe('pneumark: the note on standard input was not checked: other.pneu is excluded by .pneuignore (line 2: *.pneu)');
    expect(await line('drafts/keep.pneu')).toBe('pneumark: the note on standard input was not checked: drafts/keep.pneu is excluded by .pneuignore (line 6: drafts/)');
    // Taken back by `!keep.pneu`: checked.
    expect(await line('keep.pneu')).toBe('');
  });

  it('a file named on the command line that .pneuignore leaves out: the problem names the file and the line', async () => {
    const dir = excluding();
    writeFileSync(join(dir, 'proj', 'ward', 'skip.pneu'), BROKEN);
    const r = await cli(['check', 'ward/skip.pneu'], cwd(dir));
    expect(r.code).toBe(2);
    expect(r.out).toContain('ward/skip.pneu: cannot check: excluded by .pneuignore (line 1: ward/skip.pneu); no note left to read');
    expect(r.err.trimEnd()).toBe('pneumark: ward/skip.pneu: excluded by .pneuignore (line 1: ward/skip.pneu); no note left to read');
    // Excluded by --exclude, it says so as before.
    writeFileSync(join(dir, 'proj', 'ward', 'b.pneu'), BROKEN);
    const by = await cli(['check', 'ward/b.pneu', '--exclude', 'b.pneu'], cwd(dir));
    expect(by.err.trimEnd()).toBe('pneumark: ward/b.pneu: excluded by --exclude; no note left to read');
  });

  it('an absolute --exclude path that exists is still a path, and an anchored pattern that exists still a pattern', async () => {
    const dir = excluding();
    writeFileSync(join(dir, 'proj', 'ward', 'a.pneu'), BROKEN);
    // `/ward` names a folder below the working folder: read as the anchored pattern, as before.
    const anchored = await cli(['check', '-', '--stdin-name', 'ward/new.pneu', '--exclude', '/ward'], cwd(dir), BROKEN);
    expect(anchored.err.trimEnd()).toBe('pneumark: the note on standard input was not checked: ward/new.pneu is excluded by --exclude /ward');
    const existing = await cli(['check', '-', '--stdin-name', 'ward/new.pneu', '--exclude', join(dir, 'proj', 'ward')], cwd(dir), BROKEN);
    expect(existing.err.trimEnd()).toBe(`pneumark: the note on standard input was not checked: ward/new.pneu is excluded by --exclude ${join(dir, 'proj', 'ward')}`);
    // An absolute path of no file leaves out that path only.
    const other = await cli(['check', '-', '--stdin-name', 'ward/new.pneu', '--exclude', join(dir, 'proj', 'ward', 'old.pneu')], cwd(dir), BROKEN);
    expect(other.err).toBe('');
    expect(other.out).toMatch(/PN101/);
  });

  it('with other inputs: they are checked, and the run is as if the note were not piped in', async () => {
    const dir = excluding();
    writeFileSync(join(dir, 'proj', 'ward', 'a.pneu'), NOTE);
    const r = await cli(['check', '--format', 'json', 'ward', '-', '--stdin-name', 'ward/skip.pneu'], cwd(dir), BROKEN);
    expect(r.code).toBe(0);
    expect((JSON.parse(r.out) as { files: { path: string }[] }).files.map((f) => f.path)).toEqual(['ward/a.pneu']);
    // fmt without --check prints one note: - counts as one, excluded or not.
    const two = await cli(['fmt', 'ward/a.pneu', '-', '--stdin-name', 'ward/skip.pneu'], cwd(dir), BROKEN);
    expect(two.code).toBe(2);
    expect(two.err).toMatch(/fmt prints one note, and these inputs hold 2/);
  });

  it('is described by the help of check, export and fmt, the main help and README', () => {
    const flat = (text: string) => text.replace(/\s+/g, ' ');
    for (const command of ['check', 'export', 'fmt']) expect(flat(HELP[command]!), command).toMatch(/when PATH is excluded by \.pneuignore or --exclude, the note is (not read|written out unchanged)/);
    expect(flat(HELP.show!)).toMatch(/shown even when \.pneuignore or --exclude would leave it out/);
    expect(flat(HELP.main!)).toMatch(/check, export and fmt leave the note alone when PATH is excluded/);
    const readme = flat(readFileSync(join(process.cwd(), 'README.md'), 'utf8'));
    expect(readme).toMatch(/the note on standard input was not checked: ward\/skip\.pneu is excluded by \.pneuignore \(line 1: ward\/skip\.pneu\)/);
  });
});
