// `check --format json --json-detail findings`: each note's path, problem and findings, without
// its timepoints, for continuous integration (annotate a change, count codes, fail a build). The
// findings are those of the full output, member for member; the summary stays; the run's object
// says what it leaves out (`"detail": "findings"`).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { run } from '../../server/src/cli/main';
import { jsonFileEntryOrProblem, TOO_MUCH_JSON } from '../../server/src/cli/render-check';
import { memoryIo } from '../helpers/memory-io';
import { generateNote } from '../bench/generate.mjs';

async function checked(args: readonly string[], options: { cwd?: string; tty?: boolean; stdin?: string } = {}): Promise<{ code: number; out: string; err: string }> {
  const io = memoryIo({ ...(options.cwd ? { cwd: options.cwd } : {}), ...(options.stdin !== undefined ? { stdin: options.stdin } : {}), tty: options.tty ?? false });
  const code = await run(['check', '--no-progress', ...args], io);
  return { code, out: io.out(), err: io.err() };
}

const SAMPLES = readdirSync('samples').filter((f) => f.endsWith('.pneu')).sort().map((f) => `samples/${f}`);

interface Entry { path: string; problem: string | null; findings: unknown[]; timepoints?: unknown[] }
interface Run { pneumark: number; detail?: string; files: Entry[]; summary: Record<string, number>; definitions?: Record<string, unknown> }

/** Generated notes, a note that cannot be read (not UTF-8) and a blank one. */
function folder(): string {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-json-detail-'));
  for (let i = 0; i < 5; i++) writeFileSync(join(dir, `g${i}.pneu`), generateNote(3 + i, i + 11));
  writeFileSync(join(dir, 'latin1.pneu'), Buffer.from([0x40, 0x20, 0x30, 0x38, 0x3a, 0x30, 0x30, 0x0a, 0x23, 0x20, 0xe9, 0x0a]));
  writeFileSync(join(dir, 'blank.pneu'), '\n\n');
  return dir;
}

/** The full output with each note's timepoints left out, and the run marked as findings only (version 2: nothing to define). */
function withoutTimepoints(full: Run): Run {
  return {
    pneumark: full.pneumark,
    detail: 'findings',
    files: full.files.map((f) => ({ path: f.path, problem: f.problem, findings: f.findings })),
    summary: full.summary,
    ...(full.pneumark === 2 ? { definitions: {} } : {}),
  };
}

describe('check --format json --json-detail findings', () => {
  it('gives each note\'s findings member for member as the full output does, and the same summary and exit code', async () => {
    const dir = folder();
    for (const version of ['1', '2']) {
      for (const extra of [[], ['--quiet'], ['--redact'], ['--quiet', '--redact']]) {
        for (const inputs of [SAMPLES.map((s) => join(process.cwd(), s)), [dir]]) {
          const full = await checked(['--format', 'json', '--json-version', version, ...extra, ...inputs]);
          const findings = await checked(['--format', 'json', '--json-version', version, '--json-detail', 'findings', ...extra, ...inputs]);
          expect(findings.code).toBe(full.code);
          expect(findings.err).toBe(full.err);
          const fullRun = JSON.parse(full.out) as Run;
          const findingsRun = JSON.parse(findings.out) as Run;
          // The full run has timepoints to leave out, and findings in it (errors among them in the samples).
          expect(fullRun.files.some((f) => (f.timepoints?.length ?? 0) > 0)).toBe(true);
          if (!extra.includes('--quiet') || inputs[0] !== dir) expect(fullRun.files.some((f) => f.findings.length > 0)).toBe(true);
          expect(findingsRun).toEqual(withoutTimepoints(fullRun));
          // Member order too: the entries are the full ones cut before their timepoints.
          expect(findings.out).toBe(`${JSON.stringify(withoutTimepoints(fullRun)).replace('"files":[', '"files":[\n').replace(/\},\{"path"/g, '},\n{"path"').replace('],"summary"', '\n],"summary"')}\n`);
        }
      }
    }
  });

  it('writes a note per line when compact, and indents as JSON.stringify does on a terminal or with --indented', async () => {
    const piped = await checked(['--format', 'json', '--json-detail', 'findings', ...SAMPLES]);
    const lines = piped.out.split('\n');
    expect(lines).toHaveLength(SAMPLES.length + 3);
    expect(lines[0]).toBe('{"pneumark":1,"detail":"findings","files":[');
    lines.slice(1, -2).forEach((line, k) => {
      const entry = JSON.parse(line.replace(/,$/, '')) as Entry;
      expect(Object.keys(entry)).toEqual(['path', 'problem', 'findings']);
      expect(entry.path).toBe(SAMPLES[k]);
    });
    expect(lines.at(-2)).toMatch(/^\],"summary":\{"files":4,.*\}\}$/);
    expect(lines.at(-1)).toBe('');
    const indented = await checked(['--format', 'json', '--json-detail', 'findings', '--indented', ...SAMPLES]);
    expect(indented.out).toBe(`${JSON.stringify(JSON.parse(piped.out), null, 2)}\n`);
    const terminal = await checked(['--format', 'json', '--json-detail', 'findings', '--json-version', '2', ...SAMPLES], { tty: true });
    expect(terminal.out).toBe(`${JSON.stringify(JSON.parse(terminal.out), null, 2)}\n`);
    expect(terminal.out.endsWith('\n  },\n  "definitions": {}\n}\n')).toBe(true);
    // The full output of the same notes is many times larger.
    const full = await checked(['--format', 'json', ...SAMPLES]);
    expect(piped.out.length * 5).toBeLessThan(full.out.length);
  });

  it('reads standard input, named by --stdin-name or not, as the full output does', async () => {
    const text = readFileSync(SAMPLES[0]!, 'utf8');
    for (const named of [[], ['--stdin-name', 'ward/bed-4.pneu']]) {
      const full = await checked(['--format', 'json', ...named, '-'], { stdin: text });
      const findings = await checked(['--format', 'json', '--json-detail', 'findings', ...named, '-'], { stdin: text });
      expect(findings.code).toBe(full.code);
      expect(JSON.parse(findings.out)).toEqual(withoutTimepoints(JSON.parse(full.out) as Run));
      expect((JSON.parse(findings.out) as Run).files[0]!.path).toBe(named.length === 0 ? '<stdin>' : 'ward/bed-4.pneu');
    }
  });

  it('writes the same bytes with and without worker threads (built command)', () => {
    const dir = folder();
    for (let i = 0; i < 12; i++) writeFileSync(join(dir, `n${String(i).padStart(2, '0')}.pneu`), generateNote(4 + (i % 5), 40 + i));
    const cli = join(process.cwd(), 'dist/cli.js');
    const runWith = (args: string[]) => spawnSync(process.execPath, [cli, 'check', '--format', 'json', '--json-detail', 'findings', ...args, '.'], { cwd: dir, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
    const single = runWith(['--jobs', '0']);
    const parallel = runWith(['--jobs', '2']);
    expect(single.status).toBe(2); // the note that is not UTF-8, and the blank one
    expect(parallel.status).toBe(single.status);
    expect(parallel.stdout).toBe(single.stdout);
    const parsed = JSON.parse(single.stdout) as Run;
    expect(parsed.files).toHaveLength(19);
    expect(parsed.files.every((f) => f.timepoints === undefined)).toBe(true);
    expect(parsed.files.filter((f) => f.problem !== null)).toHaveLength(2);
    expect(runWith(['--jobs', '2', '--redact', '--quiet']).stdout).toBe(runWith(['--jobs', '0', '--redact', '--quiet']).stdout);
  }, 60_000);

  it('refuses a value it does not know, the option given twice, and the option without --format json', async () => {
    const bad = await checked(['--format', 'json', '--json-detail', 'timepoints', SAMPLES[0]!]);
    expect(bad).toEqual({ code: 2, out: '', err: 'pneumark check: --json-detail: must be one of findings or full (got "timepoints")\n' });
    const empty = await checked(['--format', 'json', '--json-detail=', SAMPLES[0]!]);
    expect(empty.code).toBe(2);
    expect(empty.err).toBe('pneumark check: --json-detail: must be one of findings or full (got "")\n');
    const twice = await checked(['--format', 'json', '--json-detail', 'findings', '--json-detail', 'full', SAMPLES[0]!]);
    expect(twice.code).toBe(2);
    expect(twice.err).toBe('pneumark check: --json-detail is given twice ("findings", then "full"); give it once\n');
    const missing = await checked(['--format', 'json', SAMPLES[0]!, '--json-detail']);
    expect(missing).toEqual({ code: 2, out: '', err: 'pneumark check: --json-detail needs a value\n' });
    for (const format of [[], ['--format', 'text'], ['--format', 'sarif']]) {
      for (const value of ['findings', 'full']) {
        const wrong = await checked([...format, '--json-detail', value, SAMPLES[0]!]);
        expect(wrong).toEqual({ code: 2, out: '', err: 'pneumark check: --json-detail applies to --format json only\n' });
      }
    }
  });

  it('writes by default, and with --json-detail full, what it wrote before the option', async () => {
    for (const version of ['1', '2']) {
      const plain = await checked(['--format', 'json', '--json-version', version, ...SAMPLES]);
      const full = await checked(['--format', 'json', '--json-version', version, '--json-detail', 'full', ...SAMPLES]);
      expect(full).toEqual(plain);
      const parsed = JSON.parse(plain.out) as Run;
      expect(parsed.detail).toBeUndefined();
      expect(parsed.files.every((f) => Array.isArray(f.timepoints))).toBe(true);
    }
  });

  it('writes the findings of a note whose timepoints are more JSON than a string holds, and points to that way in the problem of the full output', () => {
    const tooBig = { toJSON() { throw new RangeError('Invalid string length'); } };
    const outcome = { path: 'huge.pneu', findings: [], problem: null, timepoints: [tooBig] };
    const findingsOnly = jsonFileEntryOrProblem(outcome, false, { version: 1, indented: false, detail: 'findings' });
    expect(findingsOnly).toEqual({ entry: '{"path":"huge.pneu","problem":null,"findings":[]}', problem: null });
    expect(jsonFileEntryOrProblem(outcome, false, { version: 1, indented: false }).problem).toBe(TOO_MUCH_JSON);
    expect(TOO_MUCH_JSON).toMatch(/--json-detail findings/);
  });

  it('is described in check --help', async () => {
    const io = memoryIo();
    await run(['check', '--help'], io);
    const text = io.out().replace(/\s+/g, ' ');
    expect(text).toContain('--json-detail KIND json: what each note\'s entry holds, KIND full (the default): its findings and its timepoints');
    expect(text).toContain('or findings: its path, problem and findings alone');
  });
});
