// Editor settings read key by key, the diagnostic of an invalid pneumark.config.json at the
// place JSON.parse stopped, and the size limit counted in UTF-8 bytes.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { jsonErrorOffset, parseProjectConfig } from '../../server/src/core/config';
import { DEFAULT_SETTINGS, settingsSchema } from '../../server/src/core/settings';
import { exceedsBytes, formattedLines } from '../../server/src/server/server';
import { DEFAULT_CLIENT_SETTINGS, effectiveSettings, readClientSettings } from '../../server/src/server/settings';

describe('readClientSettings', () => {
  it('keeps the valid keys when one is invalid, and names only the invalid one', () => {
    const { settings, problem } = readClientSettings({ gasUnit: 'kPa', disabledChecks: ['PN411'], debounceMs: 10000 });
    expect(settings.analysis).toEqual({ gasUnit: 'kPa', disabledChecks: ['PN411'] });
    expect(settings.debounceMs).toBe(DEFAULT_CLIENT_SETTINGS.debounceMs);
    expect(problem).toMatch(/pneumark\.debounceMs/);
    expect(problem).not.toMatch(/gasUnit|disabledChecks/);
    const effective = effectiveSettings(settings, null);
    expect(effective.analysis.gasUnit).toBe('kPa');
    expect(effective.analysis.disabledChecks).toEqual(['PN411']);
  });

  it('drops one invalid hint category or size and keeps the rest', () => {
    const { settings, problem } = readClientSettings({ hints: { mechanics: false, transport: 'yes' }, maxNoteSizeKb: 64, respiratoryQuotient: 5 });
    expect(settings.hints).toEqual({ mechanics: false });
    expect(settings.maxNoteSizeKb).toBe(64);
    expect(settings.analysis).toEqual({});
    expect(problem).toMatch(/pneumark\.hints\.transport/);
    expect(problem).toMatch(/pneumark\.respiratoryQuotient/);
    expect(readClientSettings({ hints: 'all', debounceMs: 5 })).toMatchObject({ settings: { hints: {}, debounceMs: 5 }, problem: expect.stringMatching(/pneumark\.hints/) });
  });

  it('takes nothing from the prototype and reports nothing for an empty section', () => {
    expect(readClientSettings(undefined)).toEqual({ settings: DEFAULT_CLIENT_SETTINGS, problem: null });
    expect(readClientSettings(Object.create({ gasUnit: 'kPa' })).settings.analysis).toEqual({});
    expect(readClientSettings({ gasUnit: null }).problem).toBeNull();
  });
});

describe('the waterVapour setting', () => {
  it('defaults to fixed (47 mmHg) and takes body-temperature from the editor', () => {
    expect(DEFAULT_SETTINGS.waterVapour).toBe('fixed');
    const { settings, problem } = readClientSettings({ waterVapour: 'body-temperature' });
    expect(problem).toBeNull();
    expect(settings.analysis).toEqual({ waterVapour: 'body-temperature' });
    expect(effectiveSettings(settings, null).analysis.waterVapour).toBe('body-temperature');
    expect(effectiveSettings(readClientSettings({}).settings, null).analysis.waterVapour).toBe('fixed');
  });

  it('drops an invalid value from the editor with a message naming it, keeping the other keys', () => {
    const { settings, problem } = readClientSettings({ waterVapour: '37C', gasUnit: 'kPa' });
    expect(settings.analysis).toEqual({ gasUnit: 'kPa' });
    expect(problem).toMatch(/pneumark\.waterVapour/);
    expect(problem).not.toMatch(/gasUnit/);
  });

  it('is accepted in pneumark.config.json, overrides the editor, and an invalid value is reported at its key', () => {
    const project = parseProjectConfig('{ "waterVapour": "body-temperature" }');
    expect(project).toEqual({ settings: { waterVapour: 'body-temperature' }, hints: {}, problems: [] });
    expect(effectiveSettings(readClientSettings({ waterVapour: 'fixed' }).settings, project).analysis.waterVapour).toBe('body-temperature');
    const invalid = parseProjectConfig('{\n  "gasUnit": "kPa",\n  "waterVapour": "humid"\n}');
    expect(invalid.settings).toEqual({});
    expect(invalid.problems).toHaveLength(1);
    expect(invalid.problems[0]?.message).toMatch(/`waterVapour`/);
    expect(invalid.problems[0]?.range).toEqual({ start: { line: 2, character: 2 }, end: { line: 2, character: 15 } });
  });

  it('is contributed to VS Code with the same values and default as the schema', () => {
    const manifest = JSON.parse(readFileSync('package.json', 'utf8')) as {
      contributes: { configuration: { properties: Record<string, { enum?: unknown[]; default?: unknown; markdownDescription?: string }> } };
    };
    const contributed = manifest.contributes.configuration.properties['pneumark.waterVapour'];
    expect(contributed?.enum).toEqual(settingsSchema.shape.waterVapour.unwrap().options);
    expect(contributed?.default).toBe(DEFAULT_SETTINGS.waterVapour);
    expect(contributed?.markdownDescription).toMatch(/47 mmHg/);
  });
});

describe('an invalid pneumark.config.json', () => {
  const at = (text: string) => parseProjectConfig(text).problems[0]?.range.start;

  it('is reported where JSON.parse stopped, also for messages without a position (Node 20)', () => {
    expect(at('{ "gasUnit": bar }')).toEqual({ line: 0, character: 13 });
    expect(at('{\n  "gasUnit": "kPa",\n  "alveolarEquation": simplified\n}')).toEqual({ line: 2, character: 22 });
    expect(at('[1,]')).toEqual({ line: 0, character: 3 });
    expect(at('{ "a": 1 } x')).toEqual({ line: 0, character: 11 });
    expect(at('{ "gasUnit": ')).toEqual({ line: 0, character: 13 });
    expect(at('\uFEFF{\n "gasUnit": tru }')).toEqual({ line: 1, character: 15 });
  });

  it('finds the first offset that is not JSON, the end when it ends early, none when it is JSON', () => {
    const cases: [string, number | null][] = [
      ['{"a": [1, 2.5e-3, -0, true, false, null, "x\\u00e9\\n"], "b": {}}', null],
      ['  []  ', null],
      ['', 0],
      ['{"a":01}', 6],
      ['{"a":1,}', 7],
      ['{a:1}', 1],
      ['{"a" 1}', 5],
      ['{"a":"\u0001"}', 6],
      ['"\\x"', 2],
      ['[1.]', 3],
      ['[-]', 2],
      ['[nul]', 4],
      ['[1 2]', 3],
      ['{"a":1}}', 7],
      [`${'['.repeat(100000)}${']'.repeat(100000)}`, null],
      ['[[', 2],
    ];
    for (const [text, offset] of cases) {
      expect(jsonErrorOffset(text), text.slice(0, 40)).toBe(offset);
      let parses = true;
      try { JSON.parse(text); } catch { parses = false; }
      expect(parses, text.slice(0, 40)).toBe(offset === null);
    }
  });
});

describe('the size limit', () => {
  it('counts UTF-8 bytes, not UTF-16 code units', () => {
    expect(exceedsBytes('a'.repeat(1024), 1024)).toBe(false);
    expect(exceedsBytes('a'.repeat(1025), 1024)).toBe(true);
    expect(exceedsBytes('é'.repeat(600), 1024)).toBe(true); // 600 code units, 1200 bytes
    expect(exceedsBytes('é'.repeat(512), 1024)).toBe(false);
    expect(exceedsBytes('😀'.repeat(256), 1024)).toBe(false); // 512 code units, 1024 bytes
    expect(exceedsBytes('😀'.repeat(257), 1024)).toBe(true);
  });
});

describe('range formatting lines', () => {
  it('leaves out the line a range ends at the start of', () => {
    expect(formattedLines({ start: { line: 1, character: 0 }, end: { line: 2, character: 0 } })).toEqual({ start: 1, end: 1 });
    expect(formattedLines({ start: { line: 1, character: 0 }, end: { line: 2, character: 1 } })).toEqual({ start: 1, end: 2 });
    expect(formattedLines({ start: { line: 1, character: 3 }, end: { line: 1, character: 3 } })).toEqual({ start: 1, end: 1 });
    expect(formattedLines({ start: { line: 1, character: 0 }, end: { line: 1, character: 0 } })).toEqual({ start: 1, end: 1 });
  });
});
