// The command line and pneumark.config.json: an invalid project file is reported (one line per
// problem on standard error, naming the file, once per file) and fails the run with exit code 2;
// standard input reads the project file found upward from the working folder.
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { memoryIo, type MemoryIo } from '../helpers/memory-io';
import { run } from '../../server/src/cli/main';

const io = (cwd: string, stdinText = ''): MemoryIo => memoryIo({ cwd, stdin: stdinText });

/** PaCO2 5.3 with no unit: ordinary in kPa, implausible in mmHg (PN204 unless the gas unit is kPa). */
const NOTE = '@ day 1 08:00  first look\nabg ph 7.40, paco2 5.3, pao2 11\n';

/** A project: a config file at its root and a note in a folder below it. */
function project(config: string | null): string {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-config-'));
  mkdirSync(join(dir, 'ward'));
  writeFileSync(join(dir, 'ward', 'k.pneu'), NOTE);
  writeFileSync(join(dir, 'ward', 'l.pneu'), NOTE);
  if (config !== null) writeFileSync(join(dir, 'pneumark.config.json'), config);
  return dir;
}

describe('an invalid pneumark.config.json', () => {
  it('is reported once, in one line naming the file, and the run exits 2 (a value out of its choices)', async () => {
    const dir = project('{ "gasUnit": "kpa" }\n');
    const out = io(dir);
    expect(await run(['check', 'ward'], out)).toBe(2);
    const lines = out.err().trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^pneumark: pneumark\.config\.json:1:3: `gasUnit`: .*Pneumark uses its defaults/);
    // The notes are still checked (with the defaults), so the log shows what ran.
    expect(out.out()).toMatch(/2 notes checked/);
  });

  it('is reported when it is not JSON (a trailing comma), with the place of the mistake', async () => {
    const dir = project('{\n  "gasUnit": "kPa",\n}\n');
    const out = io(dir);
    expect(await run(['check', 'ward/k.pneu'], out)).toBe(2);
    expect(out.err()).toBe('pneumark: pneumark.config.json:3:1: is not valid JSON (a comma cannot come just before `}`); Pneumark uses its defaults.\n');
  });

  it('says in plain words that comments are not allowed, where the comment starts', async () => {
    const dir = project('{\n  "gasUnit": "kPa" // the ward writes kPa\n}\n');
    const out = io(dir);
    expect(await run(['check', 'ward/k.pneu'], out)).toBe(2);
    expect(out.err()).toBe('pneumark: pneumark.config.json:2:20: is not valid JSON (comments are not allowed in pneumark.config.json); Pneumark uses its defaults.\n');
  });

  it('names check codes in disabledChecks that are no check, where they are written', async () => {
    const dir = project('{\n  "gasUnit": "kPa",\n  "disabledChecks": ["PN 101", "pn204", "Unknown-Section", "no-such-check"]\n}\n');
    const out = io(dir);
    expect(await run(['check', 'ward/k.pneu'], out)).toBe(2);
    const lines = out.err().trim().split('\n');
    expect(lines).toEqual([
      'pneumark: pneumark.config.json:3:22: `disabledChecks`: "PN 101" is not the code or alias of a check (see docs/checks.md), so it switches nothing off. Did you mean PN101 (unknown-section)?',
      'pneumark: pneumark.config.json:3:60: `disabledChecks`: "no-such-check" is not the code or alias of a check (see docs/checks.md), so it switches nothing off.',
    ]);
    // The rest of the file applies: the gas unit is kPa.
    expect(out.out()).toMatch(/1 note checked: 0 errors, 0 warnings/);
  });

  it('reports every problem of the file in one run, the unknown check names too', async () => {
    const dir = project('{ "gasUnit": "kpa", "disabledChecks": ["PN 101"] }');
    const out = io(dir);
    expect(await run(['check', 'ward'], out)).toBe(2);
    expect(out.err()).toMatch(/`gasUnit`/);
    expect(out.err()).toMatch(/"PN 101" is not the code or alias of a check/);
  });

  it('keeps standard output valid JSON and SARIF, with the problem on standard error', async () => {
    const dir = project('{ "gasUnit": "kpa" }');
    for (const format of ['json', 'sarif']) {
      const out = io(dir);
      expect(await run(['check', '--format', format, 'ward'], out), format).toBe(2);
      expect(() => JSON.parse(out.out()) as unknown, format).not.toThrow();
      expect(out.err(), format).toMatch(/^pneumark: pneumark\.config\.json:1:3: `gasUnit`/);
    }
  });

  it('marks the SARIF log unsuccessful, with the problem as a configuration notification at its place, so an uploaded log does not claim a clean run', async () => {
    const dir = project('{ "gasUnit": "kpa" }');
    const out = io(dir);
    expect(await run(['check', '--format', 'sarif', 'ward'], out)).toBe(2);
    const invocation = (JSON.parse(out.out()) as { runs: { invocations: { executionSuccessful: boolean; toolConfigurationNotifications?: unknown[] }[] }[] }).runs[0]!.invocations[0]!;
    expect(invocation.executionSuccessful).toBe(false);
    expect(invocation.toolConfigurationNotifications).toEqual([{
      level: 'error',
      message: { text: expect.stringMatching(/^pneumark\.config\.json: `gasUnit`: .*Pneumark uses its defaults/) as unknown },
      locations: [{ physicalLocation: { artifactLocation: { uri: 'pneumark.config.json', uriBaseId: 'SRCROOT' }, region: { startLine: 1, startColumn: 3 } } }],
    }]);
    // A valid file leaves the run successful.
    const clean = io(project('{ "gasUnit": "kPa" }'));
    await run(['check', '--format', 'sarif', 'ward'], clean);
    expect((JSON.parse(clean.out()) as { runs: { invocations: { executionSuccessful: boolean }[] }[] }).runs[0]!.invocations[0]!.executionSuccessful).toBe(true);
  });

  it('fails show and export too, after their output', async () => {
    const dir = project('{ "gasUnit": "kpa" }');
    const shown = io(dir);
    expect(await run(['show', 'ward/k.pneu'], shown)).toBe(2);
    expect(shown.out()).toMatch(/@ day 1 08:00 {2}first look/);
    expect(shown.err()).toMatch(/^pneumark: pneumark\.config\.json:1:3: `gasUnit`/);
    const exported = io(join(dir, 'ward'));
    expect(await run(['export', '--format', 'csv', 'k.pneu'], exported)).toBe(2);
    expect(exported.out().split('\n')[1]).toMatch(/^k\.pneu,0,first look,/);
    expect(exported.err()).toMatch(/^pneumark: \.\.\/pneumark\.config\.json:1:3: `gasUnit`/);
  });

  it('leaves a valid file silent', async () => {
    const dir = project('{ "gasUnit": "kPa", "disabledChecks": ["PN410", "unknown-section"] }');
    const out = io(dir);
    expect(await run(['check', 'ward'], out)).toBe(0);
    expect(out.err()).toBe('');
  });
});

describe('standard input', () => {
  it('reads pneumark.config.json upward from the working folder, as a note there would', async () => {
    const dir = project('{ "gasUnit": "kPa" }');
    const cwd = join(dir, 'ward');
    const fromFile = io(cwd);
    expect(await run(['check', 'k.pneu'], fromFile)).toBe(0);
    const fromStdin = io(cwd, readFileSync(join(cwd, 'k.pneu'), 'utf8'));
    expect(await run(['check', '-'], fromStdin)).toBe(0);
    expect(fromStdin.out()).toBe(fromFile.out().replaceAll('k.pneu', '<stdin>'));
    expect(fromStdin.out()).toMatch(/0 warnings/);
    const shown = io(cwd, NOTE);
    await run(['show', '-'], shown);
    // Read in kPa (the config's gas unit), so shown in kPa first: 5.3 kPa = 40 mmHg.
    expect(shown.out()).toMatch(/PaCO2 5\.3 kPa \(40 mmHg\)/);
  });

  it('reports the problems of that file', async () => {
    const dir = project('{ "gasUnit": "kpa" }');
    const out = io(join(dir, 'ward'), NOTE);
    expect(await run(['check', '-'], out)).toBe(2);
    expect(out.err()).toMatch(/^pneumark: \.\.\/pneumark\.config\.json:1:3: `gasUnit`/);
  });
});
