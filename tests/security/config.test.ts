// Configuration is data: parsed, validated with zod, never executed, and unable to pollute objects.
import { describe, expect, it } from 'vitest';
import { parseProjectConfig } from '../../server/src/core/config';
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
