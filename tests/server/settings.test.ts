// Editor settings read key by key, the diagnostic of an invalid pneumark.config.json (where the
// JSON stops being valid and what is wrong, in plain words), and the size limit counted in UTF-8 bytes.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseProjectConfig, unknownCheckNames } from '../../server/src/core/config';
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

  it('reads typingPauseMs: a whole number of milliseconds from 0 to 10000, 1000 by default', () => {
    expect(DEFAULT_CLIENT_SETTINGS.typingPauseMs).toBe(1000);
    expect(readClientSettings({ typingPauseMs: 0 })).toMatchObject({ settings: { typingPauseMs: 0 }, problem: null });
    expect(readClientSettings({ typingPauseMs: 20000 })).toMatchObject({ settings: { typingPauseMs: 1000 }, problem: 'pneumark.typingPauseMs: must be at most 10000' });
    expect(readClientSettings({ typingPauseMs: 1.5 }).settings.typingPauseMs).toBe(1000);
  });

  it('names each problem of a setting once, and not the largest whole number JavaScript holds', () => {
    expect(readClientSettings({ debounceMs: 1e308 }).problem).toBe('pneumark.debounceMs: must be at most 5000');
    expect(readClientSettings({ maxNoteSizeKb: -1e300 }).problem).toBe('pneumark.maxNoteSizeKb: must be at least 16');
    // A note made to exhaust memory takes the server to about 3.3 GB at 4 MB: no more is allowed.
    expect(readClientSettings({ maxNoteSizeKb: 65536 }).problem).toBe('pneumark.maxNoteSizeKb: must be at most 4096');
    expect(readClientSettings({ maxNoteSizeKb: 4096 })).toMatchObject({ settings: { maxNoteSizeKb: 4096 }, problem: null });
    expect(readClientSettings({ disabledChecks: [1, 2, 3] }).problem).toBe('pneumark.disabledChecks: must be a string in quotes');
  });

  it('takes nothing from the prototype and reports nothing for an empty section', () => {
    expect(readClientSettings(undefined)).toEqual({ settings: DEFAULT_CLIENT_SETTINGS, problem: null, unknownChecks: null });
    expect(readClientSettings(Object.create({ gasUnit: 'kPa' })).settings.analysis).toEqual({});
    expect(readClientSettings({ gasUnit: null }).problem).toBeNull();
  });
});

describe('settings from a Lua client (Neovim)', () => {
  it('take an empty table, which Lua sends as [], as empty, with no problem', () => {
    // vim.json.encode({}) is "[]": `hints = {}` and `pneumark = {}` arrive as empty lists.
    expect(readClientSettings([])).toEqual({ settings: DEFAULT_CLIENT_SETTINGS, problem: null, unknownChecks: null });
    expect(readClientSettings({ hints: [], gasUnit: 'kPa' })).toMatchObject({ settings: { hints: {}, analysis: { gasUnit: 'kPa' } }, problem: null });
    expect(readClientSettings({ hints: ['mechanics'] }).problem).toMatch(/pneumark\.hints/);
  });
});

describe('names in disabledChecks that are no check', () => {
  it('are found case-insensitively, each once, with the check they likely meant', () => {
    expect(unknownCheckNames(['PN302', 'pn302', 'Unusual-Value', 'decimal-comma'])).toEqual([]);
    expect(unknownCheckNames(['PN220', 'pn220', 'unusal-value', 'PN 101', 'pn-410', '302', 'PN999999', 'PN30', 'zz'])).toEqual([
      // One edit from two codes (a swap of neighbours counts as one): both are named.
      { name: 'PN220', likely: ['PN202 (unknown-unit)', 'PN320 (pressure-unlike-altitude)'] },
      { name: 'unusal-value', likely: ['unusual-value (PN302)'] },
      // The same code written with a space or a hyphen, or without its PN.
      { name: 'PN 101', likely: ['PN101 (unknown-section)'] },
      { name: 'pn-410', likely: ['PN410 (oxygenation-reading)'] },
      { name: '302', likely: ['PN302 (unusual-value)'] },
      { name: 'PN999999', likely: [] },
      // One edit from PN301 to PN309: none is more likely than another.
      { name: 'PN30', likely: [] },
      { name: 'zz', likely: [] },
    ]);
  });

  it('are kept in the editor settings (they switch nothing off) and named with what they likely meant', () => {
    const { settings, problem, unknownChecks } = readClientSettings({ disabledChecks: ['unusal-value', 'PN103'] });
    expect(settings.analysis.disabledChecks).toEqual(['unusal-value', 'PN103']);
    expect(problem).toBeNull();
    expect(unknownChecks).toBe('pneumark.disabledChecks: "unusal-value" is not the code or alias of a check (see docs/checks.md), so it switches nothing off. Did you mean unusual-value (PN302)?');
    expect(readClientSettings({ disabledChecks: ['PN103', 'unusual-value'] }).unknownChecks).toBeNull();
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

  it('says what a setting takes in plain words, in the editor and in pneumark.config.json', () => {
    expect(readClientSettings({ gasUnit: 'kpa', hypoxaemiaBelowMmhg: 5, privacyChecks: 'yes' }).problem).toBe(
      'pneumark.gasUnit: must be one of "mmHg" or "kPa"; pneumark.hypoxaemiaBelowMmhg: must be at least 20; pneumark.privacyChecks: must be true or false',
    );
    expect(parseProjectConfig('{ "hufnerConstant": 1.35, "disabledChecks": "PN101", "bogus": 1, "hints": { "foo": true } }').problems.map((p) => p.message)).toEqual([
      'pneumark.config.json: `hufnerConstant`: must be one of 1.34, 1.36 or 1.39. Pneumark uses its defaults until this is fixed.',
      'pneumark.config.json: `disabledChecks`: must be a list in brackets. Pneumark uses its defaults until this is fixed.',
      'pneumark.config.json: `hints`: `foo` is not a setting here. Pneumark uses its defaults until this is fixed.',
      'pneumark.config.json: `bogus` is not a setting. Pneumark uses its defaults until this is fixed.',
    ]);
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
  const problem = (text: string) => parseProjectConfig(text).problems[0];
  const at = (text: string) => problem(text)?.range.start;

  it('is reported where the JSON stops being valid, also where Node 20’s message gives no position', () => {
    expect(at('{ "gasUnit": bar }')).toEqual({ line: 0, character: 13 });
    expect(at('{\n  "gasUnit": "kPa",\n  "alveolarEquation": simplified\n}')).toEqual({ line: 2, character: 22 });
    expect(at('[1,]')).toEqual({ line: 0, character: 3 });
    expect(at('{ "a": 1 } x')).toEqual({ line: 0, character: 11 });
    expect(at('{ "gasUnit": ')).toEqual({ line: 0, character: 13 });
    expect(at('{\r\n  "gasUnit": "kPa",\r\n}\r\n')).toEqual({ line: 2, character: 0 });
  });

  it('covers the whole word or string that is wrong, and nothing past the end of the file', () => {
    expect(problem('{ "gasUnit": bar }')?.range).toEqual({ start: { line: 0, character: 13 }, end: { line: 0, character: 16 } });
    expect(problem('{\n "gasUnit": tru }')?.range).toEqual({ start: { line: 1, character: 12 }, end: { line: 1, character: 15 } });
    expect(problem('{ "a": "C:\\Users" }')?.range).toEqual({ start: { line: 0, character: 7 }, end: { line: 0, character: 17 } });
    expect(problem('{ "gasUnit": ')?.range).toEqual({ start: { line: 0, character: 13 }, end: { line: 0, character: 13 } });
  });

  it('says what is wrong in plain words', () => {
    const cases: [string, { line: number; character: number }, string][] = [
      ['{\n  // our ward\n  "gasUnit": "kPa"\n}', { line: 1, character: 2 }, 'comments are not allowed in pneumark.config.json'],
      ['{ /* ward */ "gasUnit": "kPa" }', { line: 0, character: 2 }, 'comments are not allowed in pneumark.config.json'],
      ['{\n  "gasUnit": "kPa",\n}', { line: 2, character: 0 }, 'a comma cannot come just before `}`'],
      ['{ "disabledChecks": ["PN410",] }', { line: 0, character: 29 }, 'a comma cannot come just before `]`'],
      ['{\n  "gasUnit": "kPa"\n  "waterVapour": "fixed"\n}', { line: 2, character: 2 }, 'a comma is missing'],
      ['{ "gasUnit": "kPa",, "waterVapour": "fixed" }', { line: 0, character: 19 }, 'two commas with nothing between them'],
      ['{ gasUnit: "kPa" }', { line: 0, character: 2 }, 'a property name must be in double quotes'],
      ["{ 'gasUnit': \"kPa\" }", { line: 0, character: 2 }, 'a property name must be in double quotes, not single quotes'],
      ["{ \"gasUnit\": 'kPa' }", { line: 0, character: 13 }, 'text must be in double quotes, not single quotes'],
      ['{ "gasUnit" "kPa" }', { line: 0, character: 12 }, 'a colon (`:`) is missing after the property name'],
      ['{ "gasUnit": }', { line: 0, character: 13 }, 'a value is missing'],
      ['{ "hypoxaemiaBelowMmhg": 060 }', { line: 0, character: 26 }, 'a number cannot start with 0 followed by more digits'],
      ['{ "respiratoryQuotient": .8 }', { line: 0, character: 25 }, '`.8` is not a number as JSON writes them (such as 7, -0.5 or 2e3)'],
      ['{ "respiratoryQuotient": 8. }', { line: 0, character: 25 }, 'a number is cut short: a digit must follow `.` or `e`'],
      ['{ "gasUnit": kPa }', { line: 0, character: 13 }, '`kPa` is not a value: text must be in double quotes, and the only words without them are true, false and null'],
      ['{ "hints": { "transport": True } }', { line: 0, character: 26 }, 'true, false and null are written in lower case'],
      ['{ "gasUnit": "kPa\n}', { line: 0, character: 13 }, 'a string is not closed: its closing `"` is missing before the end of the line'],
      ['{ "$schema": "C:\\schemas" }', { line: 0, character: 13 }, 'a backslash in a string must be written `\\\\` or start an escape such as `\\n`'],
      ['{ "$schema": "caf\\u00e" }', { line: 0, character: 13 }, 'a `\\u` escape needs four hexadecimal digits, such as `\\u00e9`'],
      ['{ "$schema": "a\tb" }', { line: 0, character: 13 }, 'a string holds a control character such as a tab; write it as an escape such as `\\t`'],
      ['{ "disabledChecks": ["PN410" }', { line: 0, character: 29 }, 'a comma or `]` is expected here, not `}`'],
      ['{ "gasUnit": "kPa" ]', { line: 0, character: 19 }, 'a comma or `}` is expected here, not `]`'],
      ['{ "gasUnit": "kPa" }\n{ "waterVapour": "fixed" }', { line: 1, character: 0 }, 'there is more after the end of the JSON value'],
      ['{ "gasUnit": "kPa" } ;', { line: 0, character: 21 }, 'there is more after the end of the JSON value'],
      ['{ "gasUnit": "kPa"', { line: 0, character: 18 }, 'the file ends too early: a closing `}` is missing'],
      ['{ "disabledChecks": ["PN410"', { line: 0, character: 28 }, 'the file ends too early: a closing `]` is missing'],
      ['{ "gasUnit": "kPa",', { line: 0, character: 19 }, 'the file ends too early: a property name is missing'],
      ['{ "gasUnit": ;', { line: 0, character: 13 }, '`;` has no place here'],
      ['{ "gasUnit":\u00a0"kPa" }', { line: 0, character: 12 }, 'an unexpected character (U+00A0)'],
      ['', { line: 0, character: 0 }, 'the file is empty; write `{}` for a project without settings of its own'],
    ];
    for (const [text, start, words] of cases) {
      const parsed = parseProjectConfig(text);
      expect(() => JSON.parse(text) as unknown, text).toThrow();
      expect(parsed.settings, text).toEqual({});
      expect(parsed.problems, text).toHaveLength(1);
      expect(parsed.problems[0]?.message, text).toBe(`pneumark.config.json is not valid JSON (${words}); Pneumark uses its defaults.`);
      expect(parsed.problems[0]?.range.start, text).toEqual(start);
    }
  });

  it('takes every form strict JSON allows', () => {
    const text = ' {"$schema": "x\\u00e9\\n\\/\\"\\\\", "respiratoryQuotient": 8e-1, "disabledChecks": [], "hints": {"transport": true}}\r\n\t';
    expect(parseProjectConfig(text)).toEqual({ settings: { respiratoryQuotient: 0.8, disabledChecks: [] }, hints: { transport: true }, problems: [] });
    // -0 is JSON; the schema, not the JSON, refuses it here.
    expect(parseProjectConfig('{ "hypoxaemiaBelowMmhg": -0 }').problems.map((p) => p.message)).toEqual([expect.stringMatching(/^pneumark\.config\.json: `hypoxaemiaBelowMmhg`: /)]);
  });

  it('skips a byte-order mark at the start and reports one anywhere else at its place', () => {
    expect(parseProjectConfig('\uFEFF{ "gasUnit": "kPa" }')).toEqual({ settings: { gasUnit: 'kPa' }, hints: {}, problems: [] });
    expect(at('\uFEFF{\n "gasUnit": tru }')).toEqual({ line: 1, character: 12 });
    expect(problem('{\n "gasUnit":\uFEFF "kPa" }')?.message).toMatch(/\(an unexpected character \(U\+FEFF\)\)/);
    expect(at('{\n "gasUnit":\uFEFF "kPa" }')).toEqual({ line: 1, character: 11 });
  });

  it('counts columns of the first line from after a byte-order mark, as editors show the file', () => {
    // The same file with and without the mark: the same places, for every kind of problem.
    for (const text of ['{ "gasUnit": tru }', '{ "gasUnit": "bar" }', '{ "disabledChecks": ["PN 101"] }']) {
      const plain = parseProjectConfig(text).problems.map((p) => p.range);
      expect(plain, text).toHaveLength(1);
      expect(parseProjectConfig(`\uFEFF${text}`).problems.map((p) => p.range), text).toEqual(plain);
    }
    expect(at('\uFEFF{ "gasUnit": tru }')).toEqual({ line: 0, character: 13 });
  });

  it('reports nesting too deep to follow on the first line, and takes deep valid nesting as JSON', () => {
    const open = '['.repeat(100000);
    const unclosed = parseProjectConfig(open);
    expect(unclosed.problems).toHaveLength(1);
    expect(unclosed.problems[0]?.message).toMatch(/^pneumark\.config\.json is not valid JSON \(.+\); Pneumark uses its defaults\.$/);
    expect(unclosed.problems[0]?.range).toEqual({ start: { line: 0, character: 0 }, end: { line: 0, character: 1 } });
    const closed = parseProjectConfig(`${open}${']'.repeat(100000)}`);
    expect(closed.problems).toHaveLength(1);
    expect(closed.problems[0]?.message).not.toMatch(/not valid JSON/);
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
