// SARIF 2.1.0: the log validates against the 2.1.0 schema; rules come from the check registry;
// regions are 1-based with UTF-16 columns; fixes and unreadable files are carried over.
import { describe, expect, it } from 'vitest';
import type * as Sarif from 'sarif';
import { artifactLocationOf, artifactUri, SARIF_SCHEMA, SARIF_URI_BASE_ID, toSarifLog, type SarifFile } from '../../server/src/core/export';
import { CHECKS } from '../../server/src/core/checks/registry';
import { checked, samples, sarifSchema, sarifValidator } from './helpers';

const validate = sarifValidator();

function run(log: Sarif.Log): Sarif.Run {
  const r = log.runs[0];
  if (!r) throw new Error('no run');
  return r;
}

describe('schema', () => {
  it('the schema file can be compiled as draft-07 (no draft-04-only keywords besides `id`)', () => {
    const text = JSON.stringify(sarifSchema());
    expect(sarifSchema().$schema).toBe('http://json-schema.org/draft-04/schema#');
    expect(text).not.toMatch(/"exclusive(Minimum|Maximum)"/);
  });

  it.each(samples().map((s) => [s.name, s] as const))('%s: the log is valid SARIF 2.1.0', (_name, s) => {
    const { valid, errors } = validate(toSarifLog([{ path: s.path, result: s.result, problem: null }], { toolVersion: '0.1.0' }));
    expect(errors).toEqual([]);
    expect(valid).toBe(true);
  });

  it('a log of every sample, an unreadable file and a path with spaces is valid', () => {
    const files: SarifFile[] = [
      ...samples().map((s) => ({ path: s.path, result: s.result, problem: null })),
      { path: 'notes/missing one.pneu', result: null, problem: 'no such file' },
      { path: 'dir with space\\ü.pneu', result: checked('@ day 1 08:00\nvitals hr 500'), problem: null },
    ];
    const { valid, errors } = validate(toSarifLog(files));
    expect(errors).toEqual([]);
    expect(valid).toBe(true);
  });

  it('the validator does reject what is not SARIF (it is not vacuous)', () => {
    const log = toSarifLog([{ path: 'a.pneu', result: checked('@ day 1 08:00\nvitals hr 500'), problem: null }]);
    const bad = JSON.parse(JSON.stringify(log)) as { runs: { results: { locations: { physicalLocation: { region: { startColumn: number } } }[] }[] }[] };
    bad.runs[0]!.results[0]!.locations[0]!.physicalLocation.region.startColumn = 0;
    expect(validate(bad).valid).toBe(false);
    expect(validate({ ...log, version: '2.0.0' }).valid).toBe(false);
  });
});

describe('the log', () => {
  const icu = samples().find((s) => s.name === 'icu-ventilated-lung-injury')!;
  const log = toSarifLog([{ path: icu.path, result: icu.result, problem: null }], { toolVersion: '0.1.0' });

  it('names its schema and version, one run, UTF-16 columns', () => {
    expect(log.$schema).toBe(SARIF_SCHEMA);
    expect(log.version).toBe('2.1.0');
    expect(log.runs).toHaveLength(1);
    expect(run(log).columnKind).toBe('utf16CodeUnits');
    expect(run(log).tool.driver.name).toBe('pneumark');
    expect(run(log).tool.driver.version).toBe('0.1.0');
    expect(toSarifLog([]).runs[0]?.tool.driver.version).toBeUndefined();
  });

  it('has one rule per check, from the registry', () => {
    const rules = run(log).tool.driver.rules ?? [];
    expect(rules.map((r) => r.id)).toEqual(CHECKS.map((c) => c.code));
    const pn405 = rules.find((r) => r.id === 'PN405')!;
    const check = CHECKS.find((c) => c.code === 'PN405')!;
    expect(pn405).toEqual({
      id: 'PN405',
      name: check.alias,
      shortDescription: { text: check.title },
      fullDescription: { text: check.doc.fires },
      help: { text: `${check.doc.fix}\nSource: ${check.source}` },
      defaultConfiguration: { level: 'warning' },
      properties: { tags: [...check.tags] },
    });
    const levels = new Map(rules.map((r) => [r.id, r.defaultConfiguration?.level]));
    for (const c of CHECKS) expect(levels.get(c.code), c.code).toBe(c.severity === 'error' ? 'error' : c.severity === 'warning' ? 'warning' : 'note');
  });

  it('has one result per finding, with rule index, level and a 1-based region', () => {
    const results = run(log).results ?? [];
    expect(results).toHaveLength(icu.result.findings.length);
    const first = results[0]!;
    expect(first).toMatchObject({
      ruleId: 'PN405',
      level: 'warning',
      message: { text: 'Driving pressure is 19 cmH2O (plateau − PEEP), above 15 cmH2O.' },
      locations: [{ physicalLocation: { artifactLocation: { uri: 'samples/icu-ventilated-lung-injury.pneu', uriBaseId: 'SRCROOT', index: 0 }, region: { startLine: 7, startColumn: 58 } } }],
    });
    for (const r of results) expect(run(log).tool.driver.rules?.[r.ruleIndex!]?.id).toBe(r.ruleId);
    expect(results.filter((r) => r.level === 'note')).toHaveLength(11);
  });

  it('counts columns in UTF-16 code units', () => {
    const result = checked('@ day 1 08:00  😀\nvitals hr 100, rrr 5  # 😀');
    const finding = result.findings.find((f) => f.code === 'PN201')!;
    const [sarif] = run(toSarifLog([{ path: 'a.pneu', result, problem: null }])).results ?? [];
    expect(sarif?.locations?.[0]?.physicalLocation?.region).toEqual({
      startLine: 2, startColumn: finding.range.start.character + 1, endLine: 2, endColumn: finding.range.end.character + 1,
    });
    expect(sarif?.locations?.[0]?.physicalLocation?.region?.startColumn).toBe(16);
  });

  it('counts a non-BMP character before a finding on the same line as two columns, as columnKind utf16CodeUnits declares', () => {
    // `vitals 😀 rrr 5`: the emoji is one code point but two UTF-16 code units (U+1F600 is a
    // surrogate pair), so `rrr` starts at UTF-16 column 11 (code point column 10, UTF-8 byte 14).
    const line = 'vitals 😀 rrr 5';
    const log = toSarifLog([{ path: 'a.pneu', result: checked(`@ day 1 08:00\n${line}`), problem: null }]);
    expect(run(log).columnKind).toBe('utf16CodeUnits');
    const results = run(log).results ?? [];
    const regionOf = (code: string) => results.find((r) => r.ruleId === code)?.locations?.[0]?.physicalLocation?.region;
    expect(regionOf('PN201')).toEqual({ startLine: 2, startColumn: 11, endLine: 2, endColumn: 14 });
    expect(regionOf('PN105')).toEqual({ startLine: 2, startColumn: 8, endLine: 2, endColumn: 10 }); // the emoji itself: two units
    // What the columns pick out of the line, read as UTF-16 code units, is the text each finding names.
    const { startColumn = 0, endColumn = 0 } = regionOf('PN201') ?? {};
    expect(line.slice(startColumn - 1, endColumn - 1)).toBe('rrr');
    expect([...line].slice(startColumn - 1, endColumn - 1).join('')).not.toBe('rrr'); // code points would be off by one
  });

  it('carries fixes as replacements', () => {
    const result = checked('@ day 1 08:00\nvitls hr 100\nabg ph 7,35');
    const results = run(toSarifLog([{ path: 'a.pneu', result, problem: null }])).results ?? [];
    const unknown = results.find((r) => r.ruleId === 'PN101')!;
    expect(unknown.fixes?.[0]).toEqual({
      description: { text: 'Change to `vitals`' },
      artifactChanges: [{
        artifactLocation: { uri: 'a.pneu', uriBaseId: SARIF_URI_BASE_ID, index: 0 },
        replacements: [{ deletedRegion: { startLine: 2, startColumn: 1, endLine: 2, endColumn: 6 }, insertedContent: { text: 'vitals' } }],
      }],
    });
    expect(results.find((r) => r.ruleId === 'PN103')?.fixes?.[0]?.artifactChanges[0]?.replacements[0]?.insertedContent?.text).toBe('7.35');
  });

  it('uses a caller’s filtered findings when given instead of the result', () => {
    const result = icu.result;
    const errorsOnly = result.findings.filter((f) => f.severity === 'error');
    const filtered = toSarifLog([{ path: icu.path, result, findings: errorsOnly, problem: null }]);
    expect(run(filtered).results).toEqual([]);
  });
});

describe('files', () => {
  it('unreadable files become notifications, and the execution is not successful', () => {
    const log = toSarifLog([
      { path: 'a.pneu', result: checked('@ day 1 08:00\nvitals hr 90'), problem: null },
      { path: 'b.pneu', result: null, problem: 'binary file' },
    ]);
    const invocation = run(log).invocations?.[0];
    expect(invocation?.executionSuccessful).toBe(false);
    expect(invocation?.toolExecutionNotifications).toEqual([
      { level: 'error', message: { text: 'b.pneu: cannot check: binary file' }, locations: [{ physicalLocation: { artifactLocation: { uri: 'b.pneu', uriBaseId: 'SRCROOT', index: 1 } } }] },
    ]);
    expect(run(log).artifacts).toEqual([{ location: { uri: 'a.pneu', uriBaseId: 'SRCROOT' } }, { location: { uri: 'b.pneu', uriBaseId: 'SRCROOT' } }]);
  });

  it('problems of a settings file become configuration notifications, and the execution is not successful', () => {
    const log = toSarifLog([{ path: 'a.pneu', result: checked('@ day 1 08:00\nvitals hr 90'), problem: null }], {
      toolVersion: '0.1.0',
      configurationProblems: [{ path: 'pneumark.config.json', line: 1, column: 2, message: '`bogus` is not a setting. Pneumark uses its defaults until this is fixed.' }],
    });
    const invocation = run(log).invocations?.[0];
    expect(invocation?.executionSuccessful).toBe(false);
    expect(invocation?.toolExecutionNotifications).toBeUndefined();
    expect(invocation?.toolConfigurationNotifications).toEqual([{
      level: 'error',
      message: { text: '`bogus` is not a setting. Pneumark uses its defaults until this is fixed.' },
      locations: [{ physicalLocation: { artifactLocation: { uri: 'pneumark.config.json', uriBaseId: 'SRCROOT' }, region: { startLine: 1, startColumn: 2 } } }],
    }]);
    expect(validate(log).errors).toEqual([]);
  });

  it('a run where every file was read is successful, with no notifications', () => {
    const invocation = run(toSarifLog([{ path: 'a.pneu', result: checked('@ day 1 08:00\nvitals hr 90'), problem: null }])).invocations?.[0];
    expect(invocation).toEqual({ executionSuccessful: true });
  });

  it.each([
    ['samples/a.pneu', 'samples/a.pneu'],
    ['./samples/a.pneu', 'samples/a.pneu'],
    ['samples\\sub\\a.pneu', 'samples/sub/a.pneu'],
    ['my notes/ü #1.pneu', 'my%20notes/%C3%BC%20%231.pneu'],
    ['-', '-'],
    ['/home/someone/notes/a b.pneu', 'file:///home/someone/notes/a%20b.pneu'],
    ['C:\\notes\\a.pneu', 'file:///C:/notes/a.pneu'],
    ['\\\\server\\share\\a.pneu', 'file://server/share/a.pneu'],
    ['a:b.pneu', 'a%3Ab.pneu'],
  ])('path %s → uri %s', (path, uri) => {
    expect(artifactUri(path)).toBe(uri);
  });

  it('a backslash is a separator only where paths use it: on POSIX systems it is a character of the name', () => {
    // `a\\b.pneu` is one file on Linux and macOS; read as `a/b.pneu` the log would point to another.
    expect(artifactUri('a\\b.pneu', { backslashSeparates: false })).toBe('a%5Cb.pneu');
    expect(artifactUri('notes/a\\b.pneu', { backslashSeparates: false })).toBe('notes/a%5Cb.pneu');
    expect(artifactUri('/srv/a\\b.pneu', { backslashSeparates: false })).toBe('file:///srv/a%5Cb.pneu');
    expect(artifactUri('a\\b.pneu')).toBe('a/b.pneu');
    const log = toSarifLog([{ path: 'a\\b.pneu', result: checked('@ day 1 08:00\nvitals hr 500'), problem: null }], { toolVersion: '0', backslashSeparates: false });
    expect(run(log).artifacts).toEqual([{ location: { uri: 'a%5Cb.pneu', uriBaseId: SARIF_URI_BASE_ID } }]);
    expect(validate(log).errors).toEqual([]);
  });

  it('relative URIs name their base (SRCROOT, declared on the run without a local address); absolute ones do not', () => {
    const log = toSarifLog([
      { path: 'notes/a.pneu', result: checked('@ day 1 08:00\nvitals hr 500'), problem: null },
      { path: '/srv/notes/b.pneu', result: checked('@ day 1 08:00\nvitals hr 500'), problem: null },
    ]);
    const r = run(log);
    expect(Object.keys(r.originalUriBaseIds ?? {})).toEqual([SARIF_URI_BASE_ID]);
    expect(r.originalUriBaseIds?.[SARIF_URI_BASE_ID]?.uri).toBeUndefined();
    expect(r.originalUriBaseIds?.[SARIF_URI_BASE_ID]?.description?.text).toMatch(/working folder/);
    const locations = (r.results ?? []).map((x) => x.locations?.[0]?.physicalLocation?.artifactLocation);
    expect(locations).toEqual([
      { uri: 'notes/a.pneu', uriBaseId: 'SRCROOT', index: 0 },
      { uri: 'file:///srv/notes/b.pneu', index: 1 },
    ]);
    for (const l of locations) if (l?.uriBaseId) expect(l.uri).not.toMatch(/^[a-z][a-z0-9+.-]*:/i); // relative under a base
    expect(validate(log).errors).toEqual([]);
  });

  it('standard input has no URI (it is no file), only a description', () => {
    expect(artifactLocationOf('<stdin>')).toEqual({ description: { text: 'standard input' } });
    const log = toSarifLog([{ path: '<stdin>', result: checked('@ day 1 08:00\nvitals hr 500'), problem: null }]);
    expect(run(log).artifacts).toEqual([{ location: { description: { text: 'standard input' } } }]);
    expect(run(log).results?.[0]?.locations?.[0]?.physicalLocation?.artifactLocation).toEqual({ description: { text: 'standard input' }, index: 0 });
    expect(validate(log).errors).toEqual([]);
  });
});
