// `pneumark export` as a researcher runs it (the built CLI, dist/cli.js): options that only one
// format takes, notes with nothing to export, unreadable files, and --spreadsheet-safe in worker
// threads as in one thread. Needs `npm run build` first.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';

const CLI = join(process.cwd(), 'dist/cli.js');

function cli(cwd: string, args: readonly string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' }, maxBuffer: 1 << 26 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

function folder(files: Readonly<Record<string, string | Buffer>>): string {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-export-'));
  for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, name), text);
  return dir;
}

const rowsOf = (csv: string): Record<string, string>[] => parse(csv, { columns: true, bom: true }) as Record<string, string>[];

describe('notes with nothing to export, and notes that cannot be read', () => {
  const dir = folder({
    'a-empty.pneu': '',
    'b-header-only.pneu': 'patient age 40 y, height 170 cm\n',
    'c-broken.pneu': '@ day 1 08:00  first\nvitls hr 100\nabg ph 7,35, pco2 41\n',
    'd-binary.pneu': Buffer.from([0xff, 0xfe, 0x00, 0x01]),
    'e-fine.pneu': '@ day 1 08:00\nvitals hr 90\n',
  });

  it('CSV: a row per timepoint of each readable note, the header once; the empty and the unreadable file named on stderr, exit code 2', () => {
    const r = cli(dir, ['export', '.', '--format', 'csv']);
    expect(r.status).toBe(2);
    expect(r.stderr).toBe('pneumark: a-empty.pneu: holds no note (it is empty or has only blank lines)\npneumark: d-binary.pneu: looks like a binary file, not a note\n');
    const rows = rowsOf(r.stdout);
    expect(rows.map((x) => [x.file, x.timepoint, x.findings_errors])).toEqual([['c-broken.pneu', '0', '1'], ['e-fine.pneu', '0', '0']]);
    expect(rows[0]?.ph_pH).toBe('7.35'); // read despite the decimal comma (a warning); `vitls` is the error
    expect(r.stdout.split('\n').filter((l) => l.startsWith('file,'))).toHaveLength(1);
  });

  it('JSON Lines and FHIR go on the same way', () => {
    const jsonl = cli(dir, ['export', '.', '--format', 'jsonl']);
    expect(jsonl.status).toBe(2);
    expect(jsonl.stdout.trimEnd().split('\n').map((l) => (JSON.parse(l) as { file: string }).file)).toEqual(['c-broken.pneu', 'e-fine.pneu']);
    const fhir = cli(dir, ['export', '.', '--format', 'fhir']);
    expect(fhir.status).toBe(2);
    const bundles = JSON.parse(fhir.stdout) as { entry?: unknown[] }[];
    // One Bundle per note that holds one (an empty note is reported as such, not exported as an
    // empty collection); a header alone gives its values (age and height: a FHIR Observation needs
    // no time, where a CSV row needs a timepoint); each with its Patient, last.
    expect(bundles.map((b) => b.entry?.length ?? 0)).toEqual([3, 3, 2]);
  });
});

describe('the exit code of an export whose notes are all read', () => {
  // A pipeline reads the exit code: 1 says a note has an error finding, though every row was
  // written (README, under `export`); 0 that none has.
  it('is 1 where a note has an error finding, with every row written; 0 where none has', () => {
    const dir = folder({ 'a-fine.pneu': '@ day 1 08:00\nvitals hr 90\n', 'b-broken.pneu': '@ day 1 08:00\nvitls hr 100\n@ +1h\nvitals hr 80\n' });
    for (const format of ['csv', 'jsonl', 'fhir']) {
      const r = cli(dir, ['export', '.', '--format', format]);
      expect(r.status, format).toBe(1);
      expect(r.stderr, format).toBe('');
    }
    const rows = rowsOf(cli(dir, ['export', '.', '--format', 'csv']).stdout);
    expect(rows.map((x) => [x.file, x.timepoint, x.hr_per_min, x.findings_errors])).toEqual([['a-fine.pneu', '0', '90', '0'], ['b-broken.pneu', '0', '', '1'], ['b-broken.pneu', '1', '80', '0']]);
    expect(cli(dir, ['export', 'a-fine.pneu', '--format', 'csv']).status).toBe(0);
  });
});

describe('--spreadsheet-safe', () => {
  const labels = ['=HYPERLINK("http://example.invalid","x")', '+SUM(1;2)', '-2+3', '@cmd', 'plain'];
  const note = labels.map((l, i) => `@ day 1 0${i}:00  ${l}\nvitals hr 90\nabg be -4`).join('\n');

  it('puts an apostrophe before text that starts like a formula, only when asked', () => {
    const dir = folder({ '=note.pneu': note });
    const exact = rowsOf(cli(dir, ['export', '.', '--format', 'csv']).stdout);
    expect(exact.map((r) => r.label)).toEqual(labels);
    const safe = cli(dir, ['export', '.', '--format', 'csv', '--spreadsheet-safe']);
    expect(safe.status).toBe(0);
    expect(safe.stdout.startsWith('\ufefffile,')).toBe(true); // a byte-order mark, once
    expect(safe.stdout.split('\ufeff')).toHaveLength(2);
    const rows = rowsOf(safe.stdout);
    expect(rows.map((r) => r.label)).toEqual(labels.map((l) => (/^[=+\-@]/.test(l) ? `'${l}` : l)));
    expect(rows.map((r) => r.file)).toEqual(Array(5).fill("'=note.pneu"));
    expect(rows.map((r) => r.base_excess_mmol_L)).toEqual(Array(5).fill('-4'));
  });

  it('holds in worker threads as in one thread (200 notes)', () => {
    const files: Record<string, string> = {};
    for (let i = 0; i < 200; i++) files[`n${String(i).padStart(3, '0')}.pneu`] = note;
    const dir = folder(files);
    const one = cli(dir, ['export', '.', '--format', 'csv', '--spreadsheet-safe', '--jobs', '0', '--no-progress']);
    const two = cli(dir, ['export', '.', '--format', 'csv', '--spreadsheet-safe', '--jobs', '2', '--no-progress']);
    expect(one.status).toBe(0);
    expect(two.stdout).toBe(one.stdout);
    expect(rowsOf(two.stdout).filter((r) => r.label?.startsWith("'=")).length).toBe(200);
  }, 60_000);

  it('is refused with other formats, which keep text exact', () => {
    const dir = folder({ 'a.pneu': note });
    for (const format of ['jsonl', 'fhir']) {
      const r = cli(dir, ['export', 'a.pneu', '--format', format, '--spreadsheet-safe']);
      expect(r.status).toBe(2);
      expect(r.stderr).toBe('pneumark export: --spreadsheet-safe only applies to --format csv (JSON Lines and FHIR keep text exact)\n');
    }
  });
});

describe('--anchor', () => {
  it('must be 00:00 of day 1: another time is a usage error that says so, not a shift of every time', () => {
    const dir = folder({ 'a.pneu': '@ day 1 08:00\nvitals hr 90\n' });
    const r = cli(dir, ['export', 'a.pneu', '--format', 'fhir', '--anchor', '2024-03-01T08:00Z']);
    expect(r.status).toBe(2);
    expect(r.stderr).toBe('pneumark export: --anchor: is 00:00 of day 1 (the note\'s clock times are added to it): write its time as 00:00, e.g. 2026-01-05T00:00:00Z (got "2024-03-01T08:00Z")\n');
    const ok = cli(dir, ['export', 'a.pneu', '--format', 'fhir', '--anchor', '2024-03-01T00:00+01:00']);
    expect(ok.status).toBe(0);
    expect(JSON.stringify(JSON.parse(ok.stdout))).toContain('"effectiveDateTime":"2024-03-01T08:00:00+01:00"');
  });

  it('a date-time that names no such day is called so, not "not ISO 8601"', () => {
    const dir = folder({ 'a.pneu': '@ day 1 08:00\nvitals hr 90\n' });
    const r = cli(dir, ['export', 'a.pneu', '--format', 'fhir', '--anchor', '2026-02-30T00:00:00Z']);
    expect(r.status).toBe(2);
    expect(r.stderr).toBe('pneumark export: --anchor: no such date, time or zone offset (offsets go from -14:00 to +14:00), e.g. 2026-01-05T00:00:00Z (got "2026-02-30T00:00:00Z")\n');
    expect(cli(dir, ['export', 'a.pneu', '--format', 'fhir', '--anchor', '2026-01-05']).stderr).toContain('not an ISO 8601 date-time with a zone');
  });
});

describe('CSV read back equals the analysis, value by value', () => {
  interface JsonValue { field: string; value: number | string | number[] | null; usable: boolean; origin: { kind: string; line?: number } }
  interface JsonDerived { id: string; value: number; low?: number; high?: number; inputs?: { name: string; value: number }[] }
  interface JsonTimepoint { index: number; values: JsonValue[]; derived: JsonDerived[] }
  interface JsonFile { path: string; timepoints: JsonTimepoint[] }

  it('every cell of `export --format csv` is the value `check --format json` reports (samples and fixtures)', async () => {
    const { exportColumns } = await import('../../server/src/core/export');
    const { sectionByName } = await import('../../server/src/core/fields/sections');
    const { readFileSync } = await import('node:fs');
    const root = process.cwd();
    /** The section of a 1-based line of a note (its first word). */
    const sectionOfLine = (path: string, line: number): string | undefined => sectionByName(readFileSync(path, 'utf8').split(/\r\n|\r|\n/)[line - 1]?.trim().split(/\s+/)[0] ?? '')?.id;
    const paths = ['samples', 'tests/fixtures'];
    const csv = cli(root, ['export', ...paths, '--format', 'csv']);
    const json = cli(root, ['check', ...paths, '--format', 'json']);
    expect(csv.stderr).toBe('');
    const files = (JSON.parse(json.stdout) as { files: JsonFile[] }).files;
    const rows = rowsOf(csv.stdout);
    expect(rows.map((r) => `${r.file}#${r.timepoint}`)).toEqual(files.flatMap((f) => f.timepoints.map((t) => `${f.path}#${t.index}`)));
    const columns = exportColumns();
    let compared = 0;
    let k = 0;
    for (const file of files) {
      for (const tp of file.timepoints) {
        const row = rows[k++]!;
        const values = new Map(tp.values.filter((v) => v.usable).map((v) => [v.field, v.value]));
        const derived = new Map(tp.derived.map((d) => [d.id, d]));
        // Carried values are named as such: the fields whose value came from an earlier timepoint.
        const carried = tp.values.filter((v) => v.usable && v.origin.kind === 'carried').map((v) => v.field);
        expect((row.carried_fields ? row.carried_fields.split(';') : []).sort(), `${file.path}#${tp.index} carried_fields`).toEqual(carried.sort());
        for (const c of columns) {
          if (c.kind === 'timepoint' || c.kind === 'summary' || c.name === 'gas_unit') continue;
          const where = `${file.path}#${tp.index} ${c.name}`;
          let expected: number | string | null;
          if (c.kind === 'field') {
            // A column of one kind of line (arterial or venous base excess) is compared where the value in force is from that kind;
            // the value of the other kind, which the analysis does not report beside it, is checked in columns.test.ts.
            const inForce = tp.values.find((v) => v.usable && v.field === c.source);
            if (c.section !== null && inForce?.origin.line !== undefined && sectionOfLine(file.path, inForce.origin.line) !== c.section) continue;
            const v = values.get(c.source!) ?? null;
            // A pair's second number is the diastolic pressure, or a range's upper end (the SpO2 target).
            expected = Array.isArray(v) ? v[c.part === 'diastolic' || c.part === 'high' ? 1 : 0] ?? null : v;
          } else if (c.kind === 'in-force') {
            // The FiO2 the calculations used, where one of them (P/F, PiO2, S/F …) names it among its inputs.
            const used = tp.derived.flatMap((d) => d.inputs ?? []).find((i) => i.name === 'FiO2');
            if (used === undefined) continue;
            expected = used.value;
          } else {
            const d = derived.get(c.source!);
            expected = d === undefined ? null : c.part === 'low' ? d.low ?? null : c.part === 'high' ? d.high ?? null : d.value;
          }
          const cell = row[c.name];
          if (expected === null) expect(cell, where).toBe('');
          else if (typeof expected === 'number') expect(Number(cell), where).toBe(expected);
          else expect(cell, where).toBe(expected);
          if (expected !== null) compared++;
        }
      }
    }
    expect(compared).toBeGreaterThan(500);
  }, 60_000);
});

describe('the documented columns are the columns written', () => {
  it('README.md lists exactly the CSV header of the built CLI, in order, and JSON Lines has the same keys', async () => {
    const { readFileSync } = await import('node:fs');
    const readme = readFileSync('README.md', 'utf8');
    const block = readme.slice(readme.indexOf('<!-- export-columns:start'), readme.indexOf('<!-- export-columns:end'));
    const documented = [...block.matchAll(/^\| `([^`]+)` \|/gm)].map((m) => m[1]);
    const count = /share these (\d+) columns/.exec(block)?.[1];
    const dir = folder({ 'a.pneu': '@ day 1 08:00\nvitals hr 90\n' });
    const header = cli(dir, ['export', 'a.pneu', '--format', 'csv']).stdout.split('\n')[0]!.split(',');
    expect(documented).toEqual(header);
    expect(Number(count)).toBe(header.length);
    const keys = Object.keys(JSON.parse(cli(dir, ['export', 'a.pneu', '--format', 'jsonl']).stdout) as object);
    expect(keys).toEqual([...header, 'findings']);
  });
});

describe('check --format sarif from the built CLI', () => {
  it('is valid SARIF 2.1.0, with UTF-16 columns after an emoji, relative URIs under SRCROOT, absolute ones as file: URIs and standard input without a URI', async () => {
    const { sarifValidator } = await import('./helpers');
    const validate = sarifValidator();
    const dir = folder({ 'e 1.pneu': '@ day 1 08:00\nvitals 😀 rrr 5\n' });
    const relative = cli(dir, ['check', 'e 1.pneu', '--format', 'sarif']);
    const log = JSON.parse(relative.stdout) as { runs: { columnKind: string; results: { ruleId: string; locations: { physicalLocation: { artifactLocation: Record<string, unknown>; region: Record<string, number> } }[] }[] }[] };
    expect(validate(log).errors).toEqual([]);
    const run = log.runs[0]!;
    expect(run.columnKind).toBe('utf16CodeUnits');
    const pn201 = run.results.find((r) => r.ruleId === 'PN201')!.locations[0]!.physicalLocation;
    expect(pn201.region).toEqual({ startLine: 2, startColumn: 11, endLine: 2, endColumn: 14 });
    expect(pn201.artifactLocation).toEqual({ uri: 'e%201.pneu', uriBaseId: 'SRCROOT', index: 0 });

    const absolute = JSON.parse(cli(dir, ['check', join(dir, 'e 1.pneu'), '--format', 'sarif']).stdout) as typeof log;
    expect(validate(absolute).errors).toEqual([]);
    const uri = absolute.runs[0]!.results[0]!.locations[0]!.physicalLocation.artifactLocation;
    // The CLI shows a note inside the working folder by its relative path, whatever was typed.
    expect(uri).toEqual({ uri: 'e%201.pneu', uriBaseId: 'SRCROOT', index: 0 });

    const stdin = spawnSync(process.execPath, [CLI, 'check', '-', '--format', 'sarif'], { cwd: dir, input: '@ day 1 08:00\nvitals 😀 rrr 5\n', encoding: 'utf8' });
    const fromStdin = JSON.parse(stdin.stdout) as typeof log;
    expect(validate(fromStdin).errors).toEqual([]);
    expect(fromStdin.runs[0]!.results[0]!.locations[0]!.physicalLocation.artifactLocation).toEqual({ description: { text: 'standard input' }, index: 0 });
  });
});

describe('FHIR bundles of notes read from standard input', () => {
  const exportStdin = (input: string): { id: string; entry: { fullUrl: string }[] } => {
    const r = spawnSync(process.execPath, [CLI, 'export', '-', '--format', 'fhir'], { cwd: tmpdir(), input, encoding: 'utf8' });
    expect(r.status).toBe(0);
    const bundles = JSON.parse(r.stdout) as { id: string; entry: { fullUrl: string }[] }[];
    expect(bundles).toHaveLength(1);
    return bundles[0]!;
  };
  const one = '@ day 1 08:00\nvitals hr 90\n';
  const other = '@ day 1 08:00\nvitals hr 91\n';

  it('different notes get different bundle ids and fullUrls, so loading both keeps both', () => {
    const a = exportStdin(one);
    const b = exportStdin(other);
    expect(a.id).not.toBe(b.id);
    expect(a.entry[0]!.fullUrl).not.toBe(b.entry[0]!.fullUrl);
  });

  it('the same note gets the same ids on every run, whatever its line ends', () => {
    const a = exportStdin(one);
    expect(exportStdin(one)).toEqual(a);
    expect(exportStdin(one.replace(/\n/g, '\r\n')).id).toBe(a.id);
  });

  it('a file keeps ids named by its path (a re-export of an edited note updates the same resources)', () => {
    const dir = folder({ 'n.pneu': one });
    const first = JSON.parse(cli(dir, ['export', 'n.pneu', '--format', 'fhir']).stdout) as { id: string }[];
    writeFileSync(join(dir, 'n.pneu'), other);
    const second = JSON.parse(cli(dir, ['export', 'n.pneu', '--format', 'fhir']).stdout) as { id: string }[];
    expect(second[0]!.id).toBe(first[0]!.id);
  });
});

describe('check --format sarif on a POSIX file name with a backslash', () => {
  it.skipIf(process.platform === 'win32')('names that file, percent-encoded, not a folder and a file', () => {
    const dir = folder({ 'ward\\bed 3.pneu': '@ day 1 08:00\nvitals hr 500\n' });
    const out = cli(dir, ['check', '.', '--format', 'sarif']);
    const log = JSON.parse(out.stdout) as { runs: { artifacts: { location: { uri: string } }[] }[] };
    expect(log.runs[0]!.artifacts.map((a) => a.location.uri)).toEqual(['ward%5Cbed%203.pneu']);
    expect(decodeURIComponent(log.runs[0]!.artifacts[0]!.location.uri)).toBe('ward\\bed 3.pneu');
  });
});
