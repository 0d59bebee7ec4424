// `export --redact` over a folder whose file names carry identifiers: every format names each note
// by its place in the run (`note-00001`), never by anything derived from its path, and the same
// whatever the parallelism.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { memoryIo } from '../helpers/memory-io';
import { run } from '../../server/src/cli/main';

// Invented names and numbers, the kind a hospital's export puts in file names.
const FOLDER = 'Quillfeather Zebulon MRN-77123';
const NAMES = ['2026-03-01 Quillfeather Z 77123.pneu', 'Vantorre-Ilse 66510.PNEU', 'zz Ormsby 55409 ward7.pneu'];
/** Parts of the names above: none may appear in a redacted export. */
const PARTS = ['Quillfeather', 'Zebulon', '77123', 'Vantorre', 'Ilse', '66510', 'Ormsby', '55409', 'ward7', 'MRN', '2026-03-01', '.pneu', '.PNEU'];

const NOTES = [
  '@ 08:00 seen by Dr Quillfeather\nvitals spo2 91 rr 24\noxygen nasal 2\nabg 7.31/52/64/26\n@ 12:00\nvitals spo2 95\n',
  '@ day 2 09:30\nabg 7.40/40/90/24\noxygen fio2 0.4\n',
  'patient age 61 sex f height 160\n@ 10:00\nvitals spo2 104\n',
];

/** A folder of the notes (NOTES, or `notes`) under identifying names; `names` in the order they sort in. */
function dataset(names: readonly string[], notes: readonly string[] = NOTES): string {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-redact-'));
  mkdirSync(join(dir, FOLDER));
  names.forEach((name, i) => writeFileSync(join(dir, FOLDER, name), notes[i]!));
  return dir;
}

async function exported(dir: string, format: string, extra: readonly string[] = [], stdin = ''): Promise<{ code: number; out: string; err: string }> {
  const io = memoryIo({ cwd: dir, stdin });
  const code = await run(['export', '--format', format, '--redact', ...extra], io);
  return { code, out: io.out(), err: io.err() };
}

describe('export --redact names notes by their place in the run', () => {
  it('CSV: the file column is note-00001, note-00002 … in the sorted order of the paths', async () => {
    const dir = dataset(NAMES);
    const { code, out } = await exported(dir, 'csv', ['.']);
    expect(code).toBe(1); // SpO2 104 is an error finding
    const files = out.trim().split('\n').slice(1).map((line) => line.split(',')[0]);
    // Sorted byte-wise: '2026-…' < 'Vantorre…' < 'zz …'; the first note has two timepoints.
    expect(files).toEqual(['note-00001', 'note-00001', 'note-00002', 'note-00003']);
    for (const part of PARTS) expect(out, part).not.toContain(part);
  });

  it('JSON Lines: file is the pseudonym, and nothing else names the file', async () => {
    const dir = dataset(NAMES);
    const { out } = await exported(dir, 'jsonl', ['.']);
    const records = out.trim().split('\n').map((line) => JSON.parse(line) as { file: string; label: unknown });
    expect(records.map((r) => r.file)).toEqual(['note-00001', 'note-00001', 'note-00002', 'note-00003']);
    expect(records.every((r) => r.label === null)).toBe(true);
    for (const part of PARTS) expect(out, part).not.toContain(part);
  });

  it('FHIR: bundle ids and fullUrls are derived from the pseudonym, so renaming the files changes nothing', async () => {
    const dir = dataset(NAMES);
    const { out } = await exported(dir, 'fhir', ['.']);
    const bundles = JSON.parse(out) as { id: string; entry?: { fullUrl: string }[] }[];
    expect(bundles).toHaveLength(3);
    for (const part of PARTS) expect(out, part).not.toContain(part);
    // The same notes in the same order under other names: the same export, byte for byte. A hash
    // of the path in an id would differ (and could be matched against a list of names).
    const renamed = dataset(['a.pneu', 'b.pneu', 'c.pneu']);
    expect((await exported(renamed, 'fhir', ['.'])).out).toBe(out);
    // Without --redact the ids come from the paths, and differ.
    const open = memoryIo({ cwd: dir });
    await run(['export', '--format', 'fhir', '.'], open);
    expect((JSON.parse(open.out()) as { id: string }[]).map((b) => b.id)).not.toEqual(bundles.map((b) => b.id));
  });

  it('FHIR: the notes in the same place of two redacted exports get different ids when they differ, the same when they do not', async () => {
    // Two wards exported apart and loaded into one store: ids made from the place alone would
    // collide, and one ward's resources would replace the other's.
    const wardA = dataset(NAMES.slice(0, 1));
    const wardB = dataset(NAMES.slice(1, 2), NOTES.slice(1, 2));
    const idsOf = (text: string) => (JSON.parse(text) as { id: string; entry?: { fullUrl: string }[] }[]).flatMap((b) => [b.id, ...(b.entry ?? []).map((e) => e.fullUrl)]);
    const a = idsOf((await exported(wardA, 'fhir', ['.'])).out);
    const b = idsOf((await exported(wardB, 'fhir', ['.'])).out);
    expect(a.length).toBeGreaterThan(1);
    expect(a.filter((id) => b.includes(id))).toEqual([]);
    // The same note in the same place: the same ids on every run, whatever the file is called.
    expect(idsOf((await exported(dataset(['x.pneu']), 'fhir', ['.'])).out)).toEqual(a);
  });

  it('every format: the same export from other names, and a place for each note named (standard input last)', async () => {
    const dir = dataset(NAMES);
    const renamed = dataset(['a.pneu', 'b.pneu', 'c.pneu']);
    for (const format of ['csv', 'jsonl', 'fhir']) {
      const here = await exported(dir, format, ['.', '-'], NOTES[0]);
      expect(here.out, format).toBe((await exported(renamed, format, ['.', '-'], NOTES[0])).out);
      expect(here.out, format).not.toContain('<stdin>');
      // CSV's file column, JSON Lines' file, the FHIR Bundle's identifier.
      expect(here.out, format).toMatch(/^note-00004\b|"file":"note-00004"|"value": "note-00004"/m);
    }
  });

  it('a note that cannot be read keeps its place; standard error still names it by its path', async () => {
    const dir = dataset(NAMES);
    writeFileSync(join(dir, FOLDER, 'Vantorre-Ilse 66510.PNEU'), Buffer.from([0x40, 0x00, 0x01]));
    const { code, out, err } = await exported(dir, 'csv', ['.']);
    expect(code).toBe(2);
    expect(out.trim().split('\n').slice(1).map((line) => line.split(',')[0])).toEqual(['note-00001', 'note-00001', 'note-00003']);
    expect(err).toContain('Vantorre-Ilse 66510.PNEU: looks like a binary file');
  });
});

describe('export --redact with worker threads (built command)', () => {
  it('gives the same pseudonyms, byte for byte, with and without workers, and with notes analysed alone', () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-redact-par-'));
    for (let i = 0; i < 12; i++) writeFileSync(join(dir, `Patient ${String(11 - i).padStart(2, '0')} Ormsby.pneu`), `@ 08:00\nvitals spo2 ${90 + (i % 9)}\nabg 7.40/40/${60 + i}/24\n`);
    const cli = join(process.cwd(), 'dist/cli.js');
    const runWith = (args: readonly string[], env: NodeJS.ProcessEnv = {}) =>
      spawnSync(process.execPath, [cli, 'export', '--redact', ...args, '.'], { cwd: dir, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', ...env } });
    for (const format of ['csv', 'jsonl', 'fhir']) {
      const single = runWith(['--format', format, '--jobs', '0']);
      expect(single.status, single.stderr).toBe(0);
      expect(single.stdout).not.toContain('Ormsby');
      expect(single.stdout).toContain('note-00012'); // in FHIR, the Bundle's identifier (and ids are made from it)
      expect(runWith(['--format', format, '--jobs', '2']).stdout, format).toBe(single.stdout);
    }
    // Every note in a worker thread of its own (one at a time: slow, so one format).
    const single = runWith(['--format', 'fhir', '--jobs', '0']);
    expect(runWith(['--format', 'fhir', '--jobs', '0'], { PNEUMARK_BIG_NOTE_KB: '0' }).stdout).toBe(single.stdout);
    expect(runWith(['--format', 'fhir', '--jobs', '2'], { PNEUMARK_BIG_NOTE_KB: '0' }).stdout).toBe(single.stdout);
  }, 90_000);
});
