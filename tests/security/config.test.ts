// Configuration is data: parsed, validated with zod, never executed, and unable to pollute objects.
import { mkdirSync, mkdtempSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { run } from '../../server/src/cli/main';
import { parseProjectConfig } from '../../server/src/core/config';
import { ProjectConfigs } from '../../server/src/node/project-config';
import { memoryIo } from '../helpers/memory-io';
import { readClientSettings } from '../../server/src/server/settings';

describe('pneumark.config.json', () => {
  it('cannot pollute Object.prototype through __proto__ or constructor keys', () => {
    const attempts = [
      '{ "__proto__": { "polluted": true } }',
      '{ "gasUnit": "kPa", "__proto__": { "polluted": true } }',
      '{ "constructor": { "prototype": { "polluted": true } } }',
      '{ "hints": { "__proto__": { "polluted": true } } }',
    ];
    for (const text of attempts) {
      const parsed = parseProjectConfig(text);
      expect(({} as Record<string, unknown>).polluted).toBeUndefined();
      expect(Object.prototype.hasOwnProperty.call(Object.prototype, 'polluted')).toBe(false);
      expect((parsed.settings as Record<string, unknown>).polluted).toBeUndefined();
    }
  });

  it('reports unknown keys and wrong types with the range of the key, and applies no setting', () => {
    const text = '{\n  "gasUnit": "bar",\n  "respiratoryQuotient": 0.8\n}';
    const parsed = parseProjectConfig(text);
    expect(parsed.settings).toEqual({});
    expect(parsed.problems[0]?.message).toMatch(/gasUnit/);
    expect(parsed.problems[0]?.range.start.line).toBe(1);
    expect(parseProjectConfig('{ "runThis": "rm -rf /" }').problems[0]?.message).toMatch(/Unrecognized key|runThis/);
  });

  it('reports invalid JSON and falls back to the defaults', () => {
    const parsed = parseProjectConfig('{ "gasUnit": ');
    expect(parsed.settings).toEqual({});
    expect(parsed.problems[0]?.message).toMatch(/not valid JSON/);
  });

  it('takes a valid file', () => {
    expect(parseProjectConfig('{ "gasUnit": "kPa", "hints": { "transport": true } }')).toEqual({ settings: { gasUnit: 'kPa' }, hints: { transport: true }, problems: [] });
  });
});

describe('editor settings of the wrong shape', () => {
  it('fall back to the defaults with a message, never reaching the core', () => {
    const { settings, problem } = readClientSettings({ gasUnit: 42, hints: 'all', debounceMs: -5 });
    expect(problem).toMatch(/pneumark\./);
    expect(settings.analysis).toEqual({});
    expect(readClientSettings(null).problem).toBeNull();
    expect(readClientSettings({ __proto__: { polluted: true } }).problem).toBeNull();
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});

describe('a pneumark.config.json that is a symbolic link', () => {
  /** A project checked out from elsewhere whose project file leads to a file of secrets outside it. */
  function project(target: string, text: string): string {
    const root = mkdtempSync(join(tmpdir(), 'pneumark-link-'));
    mkdirSync(join(root, 'home'));
    mkdirSync(join(root, 'repo'));
    writeFileSync(join(root, 'home', target), text);
    symlinkSync(join(root, 'home', target), join(root, 'repo', 'pneumark.config.json'));
    writeFileSync(join(root, 'repo', 'n.pneu'), '@ day 1 08:00\nabg ph 7.40, paco2 40, pao2 90\n');
    return join(root, 'repo');
  }

  it('is not read when it leads to a file that is not JSON, so no message quotes what that file holds', async () => {
    const repo = project('.env', 'SECRET_TOKEN=sk_live_0123456789abcdef\n');
    const found = new ProjectConfigs().forPath(join(repo, 'n.pneu'));
    expect(found?.config.settings).toEqual({});
    expect(found?.config.problems.map((p) => p.message)).toEqual(['pneumark.config.json is a symbolic link to a file whose name does not end in .json, so Pneumark does not read it; it uses its defaults.']);
    // The command line says so and fails, as for any file with problems, without the secret.
    const out = memoryIo({ cwd: repo, stdin: '' });
    expect(await run(['check', '.'], out)).toBe(2);
    expect(out.err()).toMatch(/symbolic link/);
    expect(out.err() + out.out()).not.toMatch(/SECRET|sk_live/);
  });

  it('is read when it leads to a JSON file (a team\'s shared settings)', () => {
    const repo = project('team-settings.json', '{ "gasUnit": "kPa" }');
    expect(new ProjectConfigs().forPath(join(repo, 'n.pneu'))?.config).toEqual({ settings: { gasUnit: 'kPa' }, hints: {}, problems: [] });
  });
});
