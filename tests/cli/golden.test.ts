// Golden outputs of the command line's text and JSON formats on every sample note (the CSV,
// JSON Lines, FHIR and SARIF goldens live beside them, tested in tests/export/golden.test.ts).
// Regenerate after an intended change with `UPDATE_GOLDEN=1 npx vitest run tests/cli/golden.test.ts`,
// then review the diff like code.
import { existsSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { run } from '../../server/src/cli/main';

const GOLDEN = 'tests/golden';
const update = process.env.UPDATE_GOLDEN === '1';

async function output(args: string[]): Promise<string> {
  let out = '';
  await run(args, {
    cwd: process.cwd(),
    env: { NO_COLOR: '1' },
    stdout: { write: (s: string) => { out += s; return true; }, isTTY: false },
    stderr: new Writable({ write(_c, _e, done) { done(); } }),
    stdin: () => Buffer.alloc(0),
  });
  return out;
}

function compare(name: string, actual: string): void {
  const path = join(GOLDEN, name);
  if (update || !existsSync(path)) writeFileSync(path, actual);
  expect(actual).toBe(readFileSync(path, 'utf8'));
}

const samples = readdirSync('samples').filter((f) => f.endsWith('.pneu')).sort();

describe('golden command-line output', () => {
  for (const sample of samples) {
    const base = sample.replace(/\.pneu$/, '');
    it(`check text: ${sample}`, async () => compare(`${base}.check.txt`, await output(['check', `samples/${sample}`])));
    // Indented, as people read it (on a terminal, or with --indented); piped it is compact, the
    // same value (tests/cli/json-layout.test.ts).
    it(`check json: ${sample}`, async () => compare(`${base}.check.json`, await output(['check', '--format', 'json', '--indented', `samples/${sample}`])));
    it(`check json version 2: ${sample}`, async () => compare(`${base}.check-v2.json`, await output(['check', '--format', 'json', '--json-version', '2', '--indented', `samples/${sample}`])));
    // Findings alone, for continuous integration: no timepoints.
    it(`check json findings: ${sample}`, async () => compare(`${base}.check-findings.json`, await output(['check', '--format', 'json', '--json-detail', 'findings', '--indented', `samples/${sample}`])));
    it(`show: ${sample}`, async () => compare(`${base}.show.txt`, await output(['show', `samples/${sample}`])));
  }
});
