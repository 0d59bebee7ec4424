/**
 * Runs the annotated grammar fixtures (tests/grammar/*.test.pneu) through vscode-tmgrammar-test:
 * each `#  ^^^ scope` line under a source line names the scopes the characters above it must
 * have (`# <--- scope` for the first columns, `- scope` for scopes they must not have).
 *
 * `--config` points at a file without `contributes`, so the grammar under test is exactly the
 * one passed with `-g`, whatever package.json declares.
 */
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

describe('vscode-tmgrammar-test', () => {
  it('finds the fixtures', () => {
    const fixtures = readdirSync('tests/grammar').filter((f) => f.endsWith('.test.pneu'));
    expect(fixtures.length).toBeGreaterThanOrEqual(7);
  });

  it('passes every annotated fixture', () => {
    const result = spawnSync(
      'node_modules/.bin/vscode-tmgrammar-test',
      ['-g', 'grammar/pneumark.tmLanguage.json', '--config', 'tests/grammar/tmgrammar.config.json', 'tests/grammar/*.test.pneu'],
      { encoding: 'utf8', timeout: 60_000, env: { ...process.env, FORCE_COLOR: '0', NO_COLOR: '1' } },
    );
    const output = `${result.stdout ?? ''}${result.stderr ?? ''}${result.error ? String(result.error) : ''}`;
    expect({ status: result.status, output }).toMatchObject({ status: 0 });
    expect(output).toMatch(/run successfuly/);
    expect(output).not.toMatch(/failed|ERROR/);
  });
});
