// `check --redact`: a report of a dataset that can be shared. A marker word planted in every place a
// note holds free text (prose, labels, comments, unknown sections, keys, words, units and modes,
// text without a key, a name the privacy checks find) and in the file names must appear nowhere in
// the output of any format, while the findings (codes, places, severities) stay those of a run
// without --redact, and the format's words and numbers stay in the messages.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HELP } from '../../server/src/cli/args';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';

/** The planted marker (an invented surname), and a second one for a given name. */
const MARK = 'Zorvath';
const GIVEN = 'Quillane';

/** An invented note with the marker in every place that holds the writer's own words. */
const MARKED = [
  `# ${MARK} wrote this`,
  `patient age 61 ${MARK}`,
  `@ day 1 08:00  ${MARK} visit`,
  'oxygen room air',
  `note seen by Mr ${MARK} ${GIVEN} at home, ${MARK} family present, mrn 7310482`,
  `${MARK} hr 80`,
  `vitals ${MARK.toLowerCase()} 12, hr 80 ${MARK}, 120 ${MARK}, hrr 80`,
  '@ day 1 12:00',
  'abg 7.40/40/160/24',
  `@ day 1 13:00  ${MARK} again`,
  `vent mode ${MARK}, peep 5, vt 450`,
  'oxygen cannula 2',
  'abg ph 7,35',
  'vitals hr',
  `oxygen ${MARK} 2`,
  '',
].join('\n');

/** An invented note without the marker. */
const PLAIN = '@ day 2 09:30\nabg 7.40/40/90/24\noxygen fio2 0.4\n';

/** A dataset whose folder and file names carry the marker, with the marked note in it (and one plain note). */
function dataset(): string {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-check-redact-'));
  mkdirSync(join(dir, `${MARK} ward`));
  writeFileSync(join(dir, `${MARK} ward`, `${MARK} 01.pneu`), MARKED);
  writeFileSync(join(dir, `${MARK} ward`, `${MARK} 02.pneu`), PLAIN);
  return dir;
}

async function checked(dir: string, args: readonly string[], stdin = ''): Promise<{ code: number; out: string; err: string }> {
  const io = memoryIo({ cwd: dir, stdin });
  const code = await run(['check', ...args], io);
  return { code, out: io.out(), err: io.err() };
}

/** Whether the output holds either marker, in any case. */
function marked(text: string): boolean {
  const lower = text.toLowerCase();
  return lower.includes(MARK.toLowerCase()) || lower.includes(GIVEN.toLowerCase());
}

interface JsonOut { files: { path: string; findings: { code: string; message: string; line: number; column: number; severity: string; fixes: unknown[] }[]; timepoints?: { label: string; writtenLabel: string | null; values: { field: string; value: unknown }[] }[] }[] }

describe('check --redact keeps the notes\' own words out of the output', () => {
  it('every format: the markers appear nowhere with --redact, and in every format without it', async () => {
    const dir = dataset();
    for (const format of ['text', 'json', 'sarif']) {
      const plain = await checked(dir, ['--format', format, '.', '-', '--stdin-name', `${MARK}/new.pneu`], MARKED);
      const redacted = await checked(dir, ['--format', format, '--redact', '.', '-', '--stdin-name', `${MARK}/new.pneu`], MARKED);
      expect(marked(plain.out), format).toBe(true);
      expect(marked(redacted.out), `${format}:\n${redacted.out}`).toBe(false);
      expect(redacted.out, format).not.toContain('7310482');
      expect(redacted.code, format).toBe(plain.code);
      expect(redacted.err, format).toBe(plain.err);
    }
  });

  it('the findings are those of a run without --redact: the same codes, places and severities, in the same order', async () => {
    const dir = dataset();
    const plain = JSON.parse((await checked(dir, ['--format', 'json', '.'])).out) as JsonOut;
    const redacted = JSON.parse((await checked(dir, ['--format', 'json', '--redact', '.'])).out) as JsonOut;
    const shape = (out: JsonOut) => out.files.map((f) => f.findings.map((x) => [x.code, x.severity, x.line, x.column]));
    expect(shape(redacted)).toEqual(shape(plain));
    expect(redacted.files.map((f) => f.path)).toEqual(['note-00001', 'note-00002']);
    expect(plain.files.map((f) => f.path)).toEqual([`${MARK} ward/${MARK} 01.pneu`, `${MARK} ward/${MARK} 02.pneu`]);
  });

  it('quoted words of the note are [redacted]; keys, units, known words and numbers stay', async () => {
    const dir = dataset();
    const { out } = await checked(dir, ['--redact', '.']);
    const lines = out.split('\n');
    const message = (code: string, contains: string) => lines.find((l) => l.includes(`  ${code} `) && l.includes(contains));
    expect(message('PN101', 'is not a section')).toMatch(/ \[redacted\] is not a section; /);
    // A misspelt key may be a name: replaced; the key suggested is the format's own word.
    expect(message('PN201', 'Did you mean')).toMatch(/ \[redacted\] is not a key of vitals lines\. Did you mean `hr` or `rr`\?$/);
    expect(message('PN202', 'Heart rate')).toMatch(/ \[redacted\] is not a unit Pneumark knows; Heart rate takes \/min\.$/);
    expect(message('PN105', 'has no key')).toMatch(/ `120` has no key; write it as `key value`, e.g\. `hr 118`\.$/);
    expect(message('PN102', 'has no value')).toMatch(/ `hr` has no value\.$/);
    expect(message('PN103', 'decimal comma')).toMatch(/ `7,35` uses a decimal comma; Pneumark reads it as 7\.35/);
    // A mode Pneumark does not know is any word the writer chose: replaced where a message names it.
    expect(message('PN311', 'its mode')).toMatch(/its mode \[redacted\], PEEP 5 cmH2O/);
    // Privacy findings: everything they quote, numbers too.
    expect(message('PN501', 'person\'s name')).toMatch(/ \[redacted\] looks like a person's name \(after \[redacted\]\)/);
    expect(message('PN506', 'record')).toMatch(/ \[redacted\] looks like a record or identity number \(after \[redacted\]\)/);
  });

  it('a label named where a value was carried from is [redacted], its line number kept', async () => {
    const dir = dataset();
    const plain = JSON.parse((await checked(dir, ['--format', 'sarif', '.'])).out) as { runs: { results: { ruleId: string; relatedLocations?: { message: { text: string } }[] }[] }[] };
    const redacted = JSON.parse((await checked(dir, ['--format', 'sarif', '--redact', '.'])).out) as typeof plain;
    const related = (log: typeof plain) => log.runs[0]!.results.filter((r) => r.ruleId === 'PN401').flatMap((r) => (r.relatedLocations ?? []).map((l) => l.message.text));
    expect(related(plain)).toEqual([`FiO2 0.21 in force (carried from ${MARK} visit, line 4)`]);
    expect(related(redacted)).toEqual(['FiO2 0.21 in force (carried from [redacted], line 4)']);
  });

  it('JSON: no fixes; timepoint labels are [redacted], the rest of the timepoints as without --redact', async () => {
    const dir = dataset();
    const plain = JSON.parse((await checked(dir, ['--format', 'json', '.'])).out) as JsonOut;
    const redacted = JSON.parse((await checked(dir, ['--format', 'json', '--redact', '.'])).out) as JsonOut;
    expect(plain.files[0]!.findings.some((f) => f.fixes.length > 0)).toBe(true);
    expect(redacted.files.flatMap((f) => f.findings).every((f) => f.fixes.length === 0)).toBe(true);
    const tps = redacted.files[0]!.timepoints!;
    expect(tps.map((t) => [t.label, t.writtenLabel])).toEqual([['[redacted]', '[redacted]'], ['day 1 12:00', null], ['[redacted]', '[redacted]']]);
    // The plain note's timepoints are as without --redact.
    expect(redacted.files[1]!.timepoints).toEqual(plain.files[1]!.timepoints);
  });

  it('names notes by their place in the run, standard input by that of its --stdin-name; standard error by their paths', async () => {
    const dir = dataset();
    writeFileSync(join(dir, `${MARK} ward`, `${MARK} 03.pneu`), Buffer.from([0x40, 0x00, 0x01]));
    symlinkSync(join(dir, `${MARK} gone.pneu`), join(dir, `${MARK} ward`, `${MARK} 04.pneu`));
    const r = await checked(dir, ['--redact', '.', 'nowhere-' + MARK, '-', '--stdin-name', `${MARK} ward/${MARK} 025.pneu`], PLAIN);
    expect(r.code).toBe(2);
    expect(marked(r.out)).toBe(false);
    expect(r.out).toContain('[redacted]: cannot check: no such file or folder');
    expect(r.out).toContain('note-00004: cannot check: looks like a binary file');
    expect(r.out).toContain('note-00005: cannot check: a symbolic link to something that does not exist ([redacted])');
    expect(r.out).toMatch(/^3 notes checked, 3 could not be checked/m);
    // Standard error is for whoever runs the command: it names the paths.
    expect(r.err).toContain(`pneumark: nowhere-${MARK}: no such file or folder`);
    expect(r.err).toContain(`pneumark: ${MARK} ward/${MARK} 03.pneu: looks like a binary file`);
    expect(r.err).toContain(`pneumark: ${MARK} ward/${MARK} 04.pneu: a symbolic link to something that does not exist`);
    // JSON and SARIF name them so too.
    const json = JSON.parse((await checked(dir, ['--redact', '--format', 'json', '.', '-', '--stdin-name', `${MARK} ward/${MARK} 025.pneu`], PLAIN)).out) as JsonOut;
    expect(json.files.map((f) => f.path)).toEqual(['note-00001', 'note-00002', 'note-00003', 'note-00004', 'note-00005']);
    const sarif = (await checked(dir, ['--redact', '--format', 'sarif', '.'])).out;
    expect(marked(sarif)).toBe(false);
    expect(sarif).toContain('"uri": "note-00004"');
  });

  it('--quiet: the error findings alone, redacted', async () => {
    const dir = dataset();
    const { out } = await checked(dir, ['--redact', '--quiet', '.']);
    expect(marked(out)).toBe(false);
    expect(out).toMatch(/^note-00001:\d+:\d+ {2}error {2}PN101 /m);
    expect(out).not.toMatch(/ warning /);
  });

  it('is described by check --help and README (privacy)', () => {
    const flat = (text: string) => text.replace(/\s+/g, ' ');
    expect(flat(HELP.check!)).toMatch(/--redact keep the notes' own words out of the output/);
    const readme = flat(readFileSync(join(process.cwd(), 'README.md'), 'utf8'));
    expect(readme.includes('`check --redact`')).toBe(true);
    expect(readme.includes('a misspelt key could be a name')).toBe(true);
  });
});

describe('check --redact with worker threads (built command)', () => {
  it('gives the same output, byte for byte, with and without workers, and with notes analysed alone', () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-check-redact-par-'));
    for (let i = 0; i < 12; i++) writeFileSync(join(dir, `Patient ${String(11 - i).padStart(2, '0')} ${MARK}.pneu`), i % 3 === 0 ? MARKED : `@ 08:00  ${MARK} round\nvitals spo2 ${90 + (i % 9)}\nabg 7.40/40/${60 + i}/24\n`);
    const cli = join(process.cwd(), 'dist/cli.js');
    const runWith = (args: readonly string[], env: NodeJS.ProcessEnv = {}) =>
      spawnSync(process.execPath, [cli, 'check', '--redact', ...args, '.'], { cwd: dir, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', ...env } });
    for (const format of ['text', 'json', 'sarif']) {
      const single = runWith(['--format', format, '--jobs', '0']);
      expect(single.status, single.stderr).toBe(1);
      expect(marked(single.stdout), format).toBe(false);
      expect(single.stdout).toContain('note-00012');
      expect(runWith(['--format', format, '--jobs', '2']).stdout, format).toBe(single.stdout);
    }
    const single = runWith(['--format', 'json', '--jobs', '0']);
    expect(runWith(['--format', 'json', '--jobs', '2'], { PNEUMARK_BIG_NOTE_KB: '0' }).stdout).toBe(single.stdout);
  }, 90_000);
});
