// `check --format json`: indented on a terminal (or with --indented), compact when piped, the same
// value either way; version 2 (`--json-version 2`) writes each derived value's formula and source
// once, in the run's `definitions`, and origins without their null members: version 1 is rebuilt
// from it, byte for byte.
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { run } from '../../server/src/cli/main';
import { CheckJsonWriter, jsonFileEntry, toJsonFinding, type FileOutcome, type JsonLayout } from '../../server/src/cli/render-check';
import { definitionKey, timepointsJson, timepointsJsonV2, timepointV2, type KeyedDefinition } from '../../server/src/cli/timepoints-json';
import { checkNote } from '../../server/src/core/check-note';
import { DERIVED } from '../../server/src/core/derive/registry';
import { memoryIo } from '../helpers/memory-io';
import { generateNote } from '../bench/generate.mjs';

async function checked(args: readonly string[], options: { cwd?: string; tty?: boolean } = {}): Promise<{ code: number; out: string; err: string }> {
  const io = memoryIo({ ...(options.cwd ? { cwd: options.cwd } : {}), tty: options.tty ?? false });
  const code = await run(['check', '--no-progress', ...args], io);
  return { code, out: io.out(), err: io.err() };
}

const SAMPLES = readdirSync('samples').filter((f) => f.endsWith('.pneu')).sort().map((f) => `samples/${f}`);

/** A folder with generated notes and a note at altitude (the barometric pressure from the altitude, then as stated). */
function folder(): string {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-json-layout-'));
  for (let i = 0; i < 3; i++) writeFileSync(join(dir, `g${i}.pneu`), generateNote(4 + i, i + 7));
  writeFileSync(join(dir, 'hut.pneu'), 'patient age 40 y\nplace altitude 3600 m\n\n@ 06:00\noxygen room air\nabg 7.47/30/50/22\n\n@ 07:00\nplace pb 490 mmHg\nabg 7.46/31/52/22\n');
  return dir;
}

interface V2Origin { kind: string; line?: number; timepoint?: number; description?: string; derived?: string; carriedMinutes?: number }
interface V2Derived { id: string; value: unknown; low?: unknown; high?: unknown; unit: string; definition: string; substituted: string; estimate: boolean; usesCarried: boolean; inputs: { name: string; value: unknown; unit: string; origin: V2Origin; note?: string }[]; notes: string[] }
interface V2Timepoint { values: { origin: V2Origin }[]; derived: V2Derived[] }
interface V2 { pneumark: number; detail?: string; files: { timepoints?: V2Timepoint[] }[]; summary: unknown; definitions: Record<string, { formula: string; source: string }> }

/** Version 1 as rebuilt from version 2 alone: the origins' null members put back, each definition's formula and source in place of its key (`detail` kept where it is there). */
function v1FromV2(v2: V2): unknown {
  const origin = (o: V2Origin) => ({ kind: o.kind, line: o.line ?? null, timepoint: o.timepoint ?? null, description: o.description ?? null, ...(o.derived !== undefined ? { derived: o.derived } : {}), ...(o.kind === 'carried' ? { carriedMinutes: o.carriedMinutes ?? null } : {}) });
  const definition = (key: string) => {
    const found = v2.definitions[key];
    if (found === undefined) throw new Error(`no definition ${key}`);
    return found;
  };
  return {
    pneumark: 1,
    ...(v2.detail !== undefined ? { detail: v2.detail } : {}),
    files: v2.files.map((f) => ({
      ...f,
      ...(f.timepoints ? {
        timepoints: f.timepoints.map((tp) => ({
          ...tp,
          values: tp.values.map((v) => ({ ...v, origin: origin(v.origin) })),
          derived: tp.derived.map((d) => ({
            id: d.id,
            value: d.value,
            ...(d.low !== undefined ? { low: d.low, high: d.high } : {}),
            unit: d.unit,
            formula: definition(d.definition).formula,
            substituted: d.substituted,
            estimate: d.estimate,
            usesCarried: d.usesCarried,
            inputs: d.inputs.map((t) => ({ name: t.name, value: t.value, unit: t.unit, origin: origin(t.origin), ...(t.note !== undefined ? { note: t.note } : {}) })),
            notes: d.notes,
            source: definition(d.definition).source,
          })),
        })),
      } : {}),
    })),
    summary: v2.summary,
  };
}

/** Every definition key the files point to. */
function keysUsed(v2: V2): Set<string> {
  const keys = new Set<string>();
  for (const f of v2.files) for (const tp of f.timepoints ?? []) for (const d of tp.derived) keys.add(d.definition);
  return keys;
}

describe('check --format json: indented for people, compact for programs', () => {
  it('is compact when standard output is not a terminal: the indented value, a line per note', async () => {
    const indented = await checked(['--format', 'json', '--indented', ...SAMPLES]);
    const piped = await checked(['--format', 'json', ...SAMPLES]);
    expect(piped.code).toBe(indented.code);
    expect(JSON.parse(piped.out)).toEqual(JSON.parse(indented.out));
    // Compact: JSON.stringify of the whole with a line break before each note and before the list's end.
    const lines = piped.out.split('\n');
    expect(lines).toHaveLength(SAMPLES.length + 3);
    expect(lines[0]).toBe('{"pneumark":1,"files":[');
    expect(lines.at(-1)).toBe('');
    expect(lines.at(-2)).toMatch(/^\],"summary":\{"files":4,/);
    lines.slice(1, -2).forEach((line, k) => {
      const entry = JSON.parse(line.replace(/,$/, '')) as { path: string };
      expect(entry.path).toBe(SAMPLES[k]);
    });
    expect(piped.out.replace(/\n/g, '')).toBe(JSON.stringify(JSON.parse(indented.out)));
    expect(piped.out.length).toBeLessThan(indented.out.length * 0.6);
  });

  it('is indented on a terminal, as with --indented', async () => {
    const terminal = await checked(['--format', 'json', SAMPLES[0]!], { tty: true });
    expect(terminal.out).toBe((await checked(['--format', 'json', '--indented', SAMPLES[0]!])).out);
    expect(terminal.out.startsWith('{\n  "pneumark": 1,\n  "files": [\n    {\n      "path": ')).toBe(true);
    expect(terminal.out).toBe(`${JSON.stringify(JSON.parse(terminal.out), null, 2)}\n`);
  });

  it('writes a run with no note, and one with a note that could not be read, in both layouts', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-json-empty-'));
    writeFileSync(join(dir, 'blank.pneu'), '\n');
    for (const version of ['1', '2']) {
      const piped = await checked(['--format', 'json', '--json-version', version, '.'], { cwd: dir });
      const indented = await checked(['--format', 'json', '--json-version', version, '.'], { cwd: dir, tty: true });
      expect(JSON.parse(piped.out)).toEqual(JSON.parse(indented.out));
      expect(piped.out.split('\n')).toHaveLength(4);
    }
    let text = '';
    for (const layout of [{ version: 1, indented: false }, { version: 2, indented: false }, { version: 2, indented: true }] as JsonLayout[]) {
      text = '';
      const writer = new CheckJsonWriter({ write: (s: string) => { text += s; } }, false, layout);
      writer.end();
      expect(JSON.parse(text)).toEqual({ pneumark: layout.version, files: [], summary: { files: 0, unreadable: 0, errors: 0, warnings: 0, information: 0, hints: 0 }, ...(layout.version === 2 ? { definitions: {} } : {}) });
    }
    expect(text).toBe('{\n  "pneumark": 2,\n  "files": [],\n  "summary": {\n    "files": 0,\n    "unreadable": 0,\n    "errors": 0,\n    "warnings": 0,\n    "information": 0,\n    "hints": 0\n  },\n  "definitions": {}\n}');
  });

  it('writes an entry compact as JSON.stringify does, from the timepoints or from texts', () => {
    const result = checkNote(generateNote(6, 2));
    const timepoints = timepointsJson(result);
    const outcome: FileOutcome = { path: 'ward/a.pneu', findings: result.findings, problem: null, timepoints };
    const compact: JsonLayout = { version: 1, indented: false };
    expect(jsonFileEntry(outcome, false, compact)).toBe(JSON.stringify({ path: 'ward/a.pneu', problem: null, findings: result.findings.map(toJsonFinding), timepoints }));
    const texts: FileOutcome = { ...outcome, timepoints: undefined, timepointTexts: timepoints.map((t) => JSON.stringify(t)) };
    expect(jsonFileEntry(texts, false, compact)).toBe(jsonFileEntry(outcome, false, compact));
  });

  it('refuses --json-version and --indented without --format json, and a version it does not know', async () => {
    expect((await checked(['--json-version', '2', SAMPLES[0]!])).err).toBe('pneumark check: --json-version applies to --format json only\n');
    expect((await checked(['--format', 'sarif', '--indented', SAMPLES[0]!])).err).toBe('pneumark check: --indented applies to --format json only\n');
    const three = await checked(['--format', 'json', '--json-version', '3', SAMPLES[0]!]);
    expect(three.code).toBe(2);
    expect(three.err).toBe('pneumark check: --json-version: must be one of 1 or 2 (got "3")\n');
  });
});

describe('check --format json --json-version 2', () => {
  it('rebuilds version 1 byte for byte on the samples, generated notes and a project that chooses other formulas', async () => {
    const dir = folder();
    const project = mkdtempSync(join(tmpdir(), 'pneumark-json-project-'));
    writeFileSync(join(project, 'pneumark.config.json'), JSON.stringify({ alveolarEquation: 'full', aaGradientRule: 'mellemgaard' }));
    writeFileSync(join(project, 'p.pneu'), generateNote(3, 5));
    for (const inputs of [SAMPLES.map((s) => join(process.cwd(), s)), [dir, project]]) {
      const v1 = await checked(['--format', 'json', '--indented', ...inputs]);
      const v2 = await checked(['--format', 'json', '--json-version', '2', ...inputs]);
      expect(v2.code).toBe(v1.code);
      const parsed = JSON.parse(v2.out) as V2;
      expect(parsed.pneumark).toBe(2);
      expect(`${JSON.stringify(v1FromV2(parsed), null, 2)}\n`).toBe(v1.out);
      // Each definition once, each one pointed to, in sorted order; no origin with a null member.
      expect(Object.keys(parsed.definitions)).toEqual([...keysUsed(parsed)].sort());
      expect(v2.out).not.toMatch(/"(line|timepoint|description)":null/);
      expect(v2.out.length).toBeLessThan(v1.out.length * 0.4);
    }
    // The project's formulas are the registry's others: keyed by id and a hash of their text.
    const project2 = JSON.parse((await checked(['--format', 'json', '--json-version', '2', project])).out) as V2;
    expect(Object.keys(project2.definitions)).toContain('pf_ratio');
    expect(Object.keys(project2.definitions).filter((k) => k.startsWith('aa_gradient_upper_normal'))).toEqual([expect.stringMatching(/^aa_gradient_upper_normal~[0-9a-f]{8}$/)]);
    expect(Object.entries(project2.definitions).find(([k]) => k.startsWith('aa_gradient_upper_normal~'))?.[1].formula).toBe('2.5 + 0.21 × age');
  });

  it('keys a definition by its id when it is the registry\'s, else by its id and a hash of its text, the same in every call', () => {
    for (const d of DERIVED) expect(definitionKey(d.id, d.shownFormula, d.source).key).toBe(d.id);
    const other = definitionKey('pf_ratio', 'PaO2 ÷ FiO2 (another)', 'a source');
    expect(other.key).toMatch(/^pf_ratio~[0-9a-f]{8}$/);
    expect(definitionKey('pf_ratio', 'PaO2 ÷ FiO2 (another)', 'a source').key).toBe(other.key);
    expect(definitionKey('pf_ratio', 'PaO2 ÷ FiO2 (another)', 'another source').key).not.toBe(other.key);
  });

  it('makes each timepoint directly as it makes it from version 1\'s object', () => {
    for (const text of [generateNote(8, 3), ...SAMPLES.map((f) => readFileSync(f, 'utf8'))]) {
      const result = checkNote(text);
      const fromV1 = new Map<string, KeyedDefinition>();
      const direct = new Map<string, KeyedDefinition>();
      expect(timepointsJsonV2(result, direct, (json) => JSON.stringify(json))).toEqual(timepointsJson(result, (json) => JSON.stringify(timepointV2(json, fromV1))));
      expect([...direct]).toEqual([...fromV1]);
      expect(direct.size).toBeGreaterThan(0);
    }
  });

  it('rebuilds version 1 with --json-detail findings too (its definitions empty), with and without --quiet', async () => {
    for (const extra of [[], ['--quiet']]) {
      const v1 = await checked(['--format', 'json', '--indented', '--json-detail', 'findings', ...extra, ...SAMPLES]);
      const v2 = await checked(['--format', 'json', '--json-version', '2', '--json-detail', 'findings', ...extra, ...SAMPLES]);
      const parsed = JSON.parse(v2.out) as V2;
      expect(parsed.definitions).toEqual({});
      expect(parsed.detail).toBe('findings');
      expect(`${JSON.stringify(v1FromV2(parsed), null, 2)}\n`).toBe(v1.out);
    }
  });

  it('is redacted as version 1 is, and rebuilds it', async () => {
    const v1 = await checked(['--format', 'json', '--indented', '--redact', ...SAMPLES]);
    const v2 = await checked(['--format', 'json', '--json-version', '2', '--redact', ...SAMPLES]);
    expect(`${JSON.stringify(v1FromV2(JSON.parse(v2.out) as V2), null, 2)}\n`).toBe(v1.out);
  });
});
