// What crosses from a worker thread to the main thread: packed findings come back as they went
// in, and notes are read with one open each (folders and limits reported, not thrown).
import { mkdtempSync, mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import type { Finding } from '../../server/src/core/types';
import { readNote } from '../../server/src/cli/inputs';
import { batchSize, handover, nextBatchSize, PARALLEL_FROM, runAll, workerCount } from '../../server/src/cli/pool';
import { Output } from '../../server/src/cli/output';
import { CheckJsonWriter, jsonFileEntry, jsonFileEntryOrProblem, TOO_MANY_FINDINGS, TOO_MUCH_JSON, toJsonFinding, writeCheckSarif, writeCheckText, type FileOutcome } from '../../server/src/cli/render-check';
import { toSarifLog } from '../../server/src/core/export';
import { PNEUMARK_VERSION } from '../../server/src/core/version';
import { paint } from '../../server/src/cli/colour';
import { NoteWorker } from '../../server/src/cli/work';
import { bundleText } from '../../server/src/cli/export-command';
import { EventEmitter } from 'node:events';
import { run } from '../../server/src/cli/main';
import { availableParallelism } from 'node:os';
import { Writable } from 'node:stream';
import { packFindings, packReport, unpackFindings, unpackReport } from '../../server/src/cli/work';

const roundTrip = (findings: readonly Finding[]) => unpackFindings(structuredClone(packFindings(findings)));

describe('packed findings', () => {
  it('come back equal, for every sample note, through a structured clone', () => {
    for (const name of readdirSync('samples')) {
      const findings = checkNote(readFileSync(join('samples', name), 'utf8')).findings;
      expect(findings.length, name).toBeGreaterThan(0);
      expect(roundTrip(findings), name).toEqual(findings);
    }
  });

  it('keep fixes and related places where a finding has them, and nothing extra where it has none', () => {
    const range = (line: number, a: number, b: number) => ({ start: { line, character: a }, end: { line, character: b } });
    const findings: Finding[] = [
      { code: 'PN101', severity: 'error', message: 'first', range: range(0, 0, 5), fixes: [], docAnchor: 'pn101' },
      { code: 'PN205', severity: 'warning', message: 'with a fix', range: range(3, 7, 9), fixes: [{ title: 'Change to `kPa`', edits: [{ range: range(3, 7, 9), newText: 'kPa' }], preferred: true }], docAnchor: 'pn205' },
      { code: 'PN206', severity: 'information', message: 'with a related place', range: range(12, 0, 30), fixes: [], docAnchor: 'pn206', related: [{ range: range(2, 4, 8), message: 'first stated here' }] },
      { code: 'PN410', severity: 'hint', message: 'last', range: range(70000, 1, 2), fixes: [], docAnchor: 'pn410' },
    ];
    const back = roundTrip(findings);
    expect(back).toEqual(findings);
    expect('related' in back[0]!).toBe(false);
    expect(roundTrip([])).toEqual([]);
  });

  it('leave the rest of a report as it is', () => {
    const report = { path: 'ward/a.pneu', problem: null, findings: checkNote('@ 08:00\nvitals spo2 104\n').findings, timepoints: [{ label: '08:00' }] };
    expect(unpackReport(structuredClone(packReport(report)))).toEqual(report);
  });
});

describe('batches for workers', () => {
  it('give each worker about eight batches, of 1 to 64 notes', () => {
    expect(batchSize(10, 2)).toBe(1);
    expect(batchSize(200, 2)).toBe(12);
    expect(batchSize(10000, 2)).toBe(64);
    expect(batchSize(0, 0)).toBe(1);
  });
});

describe('batch sizes from the time a note takes', () => {
  it('start small, then aim at about 25 ms of work per batch, within the most allowed', () => {
    expect(nextBatchSize(Number.NaN, 64)).toBe(4);
    expect(nextBatchSize(Number.NaN, 2)).toBe(2);
    expect(nextBatchSize(0.3, 64)).toBe(64); // a note checked in 0.3 ms: the most allowed
    expect(nextBatchSize(5, 64)).toBe(5);
    expect(nextBatchSize(15, 64)).toBe(2); // a note with its timepoints as JSON
    expect(nextBatchSize(400, 64)).toBe(1);
    expect(nextBatchSize(0, 64)).toBe(64);
  });
});

describe('output written a note at a time', () => {
  const outcomes = (): FileOutcome[] => [
    { path: 'missing.pneu', findings: [], problem: 'no such file or folder' },
    { path: 'ward/a.pneu', findings: checkNote('@ 08:00\nvitals spo2 104\nabg 7.21/24/95/9.5\n').findings, problem: null, timepoints: [{ label: '08:00', values: [{ field: 'spo2', value: 104 }] }] },
    { path: 'ward/b.pneu', findings: [], problem: null, timepoints: [] },
  ];
  const whole = (list: FileOutcome[]) => {
    const count = (severity: string) => list.reduce((n, o) => n + o.findings.filter((f) => f.severity === severity).length, 0);
    return JSON.stringify({
      pneumark: 1,
      files: list.map((o) => ({ path: o.path, problem: o.problem, findings: o.findings.map(toJsonFinding), ...(o.timepoints ? { timepoints: o.timepoints } : {}) })),
      summary: { files: list.length, unreadable: list.filter((o) => o.problem).length, errors: count('error'), warnings: count('warning'), information: count('information'), hints: count('hint') },
    }, null, 2);
  };
  const written = (list: FileOutcome[]) => {
    let text = '';
    const writer = new CheckJsonWriter({ write: (s: string) => { text += s; } });
    for (const o of list) writer.file(o);
    writer.end();
    return text;
  };

  it('is byte for byte the JSON of the whole output, with or without notes, and with entries written out by a worker', () => {
    for (const list of [outcomes(), outcomes().slice(0, 1), []]) expect(written(list)).toBe(whole(list));
    const byWorker = outcomes().map((o) => ({ ...o, entry: jsonFileEntry(o), timepoints: undefined }));
    expect(written(byWorker)).toBe(whole(outcomes()));
  });

  it('writes SARIF and text in pieces, byte for byte as the whole, over megabytes of findings', async () => {
    // Enough findings for several pieces of a megabyte: 40 notes of 60 impossible saturations each.
    const note = `@ 08:00\n${Array.from({ length: 60 }, (_, k) => `vitals spo2 ${101 + k}`).join('\n')}\n`;
    const findings = checkNote(note).findings;
    const many: FileOutcome[] = [...Array.from({ length: 40 }, (_, k) => ({ path: `ward ${k}/n.pneu`, findings, problem: null })), { path: 'gone.pneu', findings: [], problem: 'no such file or folder' }];
    for (const list of [many, outcomes(), []]) {
      for (const quiet of [false, true]) {
        let text = '';
        let pieces = 0;
        const sink = { write: (s: string) => { text += s; pieces++; }, ready: () => Promise.resolve() };
        await writeCheckSarif(list, quiet, sink);
        const files = list.map((o) => ({ path: o.path, findings: o.findings.filter((f) => !quiet || f.severity === 'error'), problem: o.problem }));
        expect(text).toBe(JSON.stringify(toSarifLog(files, { toolVersion: PNEUMARK_VERSION }), null, 2));
        if (list === many && !quiet) expect(pieces).toBeGreaterThan(2);
        let lines = '';
        await writeCheckText(list, paint(false), quiet, { write: (s: string) => { lines += s; }, ready: () => Promise.resolve() });
        const expected = list.flatMap((o) => o.problem ? [`${o.path}: cannot check: ${o.problem}`] : o.findings.filter((f) => !quiet || f.severity === 'error').map((f) => `${o.path}:${f.range.start.line + 1}:${f.range.start.character + 1}`));
        expect(lines.split('\n').slice(0, -2).map((l) => l.split('  ')[0])).toEqual(expected);
        expect(lines).toMatch(/ notes? checked.*info\.\n$/);
      }
    }
  });

  it('gives a note whose timepoints make more JSON than a string holds a problem instead of them', () => {
    // What JSON.stringify throws past the longest string V8 makes (hundreds of megabytes).
    const tooBig = { toJSON() { throw new RangeError('Invalid string length'); } };
    const findings = checkNote('@ 08:00\nvitals spo2 104\n').findings;
    const { entry, problem } = jsonFileEntryOrProblem({ path: 'huge.pneu', findings, problem: null, timepoints: [tooBig] });
    expect(problem).toBe(TOO_MUCH_JSON);
    expect(JSON.parse(entry)).toEqual({ path: 'huge.pneu', problem: TOO_MUCH_JSON, findings: findings.map(toJsonFinding) });
    let text = '';
    const writer = new CheckJsonWriter({ write: (s: string) => { text += s; } });
    expect(writer.file({ path: 'huge.pneu', findings, problem: null, timepoints: [tooBig] })).toBe(TOO_MUCH_JSON);
    expect(writer.file(outcomes()[1]!)).toBeNull();
    writer.end();
    const parsed = JSON.parse(text) as { summary: { files: number; unreadable: number } };
    expect(parsed.summary).toMatchObject({ files: 2, unreadable: 1 });
    // Findings that make too much JSON on their own (a million bare timepoints, a finding on
    // each): the entry leaves them out too, where the run used to end with a RangeError.
    const [first] = findings;
    const heavy = { ...first!, fixes: [tooBig] } as unknown as Finding;
    for (const timepoints of [[tooBig], undefined]) {
      const alone = jsonFileEntryOrProblem({ path: 'huge.pneu', findings: [heavy], problem: null, ...(timepoints ? { timepoints } : {}) });
      expect(alone.problem).toBe(TOO_MANY_FINDINGS);
      expect(JSON.parse(alone.entry)).toEqual({ path: 'huge.pneu', problem: TOO_MANY_FINDINGS, findings: [] });
    }
    // Any other failure is not mistaken for size.
    const broken = { toJSON() { throw new TypeError('broken'); } };
    expect(() => jsonFileEntryOrProblem({ path: 'b.pneu', findings: [], problem: null, timepoints: [broken] })).toThrow(TypeError);
    // The same for a FHIR bundle.
    expect(bundleText({ resourceType: 'Bundle', entry: [tooBig] })).toBeNull();
    expect(bundleText({ resourceType: 'Bundle', entry: [] })).toBe(JSON.stringify({ resourceType: 'Bundle', entry: [] }, null, 2));
    expect(() => bundleText({ entry: [broken] })).toThrow(TypeError);
  });

  it('waits for a full stream to drain before more is read', async () => {
    const stream = Object.assign(new EventEmitter(), { full: false, write(_s: string) { return !this.full; } });
    const output = new Output(stream);
    output.write('small');
    let drained = false;
    await output.ready();
    stream.full = true;
    output.write('big');
    const waiting = output.ready().then(() => { drained = true; });
    await new Promise((r) => setImmediate(r));
    expect(drained).toBe(false);
    stream.full = false;
    stream.emit('drain');
    await waiting;
    expect(drained).toBe(true);
    // A plain writer (no drain event) never holds the run up.
    const plain = new Output({ write: () => false });
    plain.write('x');
    await plain.ready();
  });

  it('reads no more notes while too many are done behind a slow one, and goes on once it is in', async () => {
    const handed: number[] = [];
    const report = (i: number) => ({ path: `n${i}.pneu`, problem: null, findings: [] });
    const h = handover(10, { inOrder: (r) => { handed.push(Number(r.path.slice(1, -5))); return r; } }, 3);
    // Notes 1 to 4 are done while note 0 is still being read: four held back, one over the limit.
    for (const i of [1, 2, 3]) h.finish(i, report(i));
    let free = false;
    await h.mayRead().then(() => { free = true; });
    expect(free).toBe(true);
    h.finish(4, report(4));
    free = false;
    const waiting = h.mayRead().then(() => { free = true; });
    await new Promise((r) => setImmediate(r));
    expect(free).toBe(false);
    expect(handed).toEqual([]);
    h.finish(0, report(0));
    await waiting;
    expect(free).toBe(true);
    expect(handed).toEqual([0, 1, 2, 3, 4]);
    // Without reports in order nothing is held back.
    const plain = handover(10, {}, 0);
    plain.finish(5, report(5));
    await plain.mayRead();
  });

  it('hands reports over in the order of the notes, and reads no note while the output is full', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-order-'));
    const files = ['a.pneu', 'b.pneu', 'c.pneu', 'd.pneu'];
    for (const f of files) writeFileSync(join(dir, f), '@ 08:00\nvitals hr 80\n');
    const seen: string[] = [];
    let holds = 0;
    const reports = await runAll(files, { kind: 'check', timepoints: false }, new NoteWorker(dir, {}), () => Buffer.alloc(0), {
      cwd: dir,
      overrides: {},
      workers: 0,
      inOrder: (r) => { seen.push(r.path); return { path: r.path, problem: null, findings: [] }; },
      ready: async () => { holds++; expect(seen).toHaveLength(holds - 1); },
    });
    expect(seen).toEqual(files);
    expect(holds).toBe(files.length);
    expect(reports.map((r) => r.path)).toEqual(files);
  });
});

describe('worker count', () => {
  it('comes from --jobs, else PNEUMARK_WORKERS, else the cores from PARALLEL_FROM notes on', () => {
    expect(workerCount(10, { PNEUMARK_WORKERS: '3' }, 0)).toBe(0);
    expect(workerCount(10, {}, 2)).toBe(2);
    expect(workerCount(10, { PNEUMARK_WORKERS: '3' })).toBe(3);
    expect(workerCount(10, { PNEUMARK_WORKERS: 'many' })).toBe(0);
    expect(workerCount(PARALLEL_FROM - 1, {})).toBe(0);
    expect(workerCount(PARALLEL_FROM, {})).toBe(Math.min(4, availableParallelism()));
  });

  it('refuses a --jobs that is not a whole number from 0 to 64, with a usage error', async () => {
    for (const jobs of ['x', '-1', '65', '1.5']) {
      let err = '';
      const code = await run(['check', `--jobs=${jobs}`, 'samples'], {
        cwd: process.cwd(),
        env: {},
        stdout: { write: () => true },
        stderr: new Writable({ write(chunk: Buffer, _e, done) { err += chunk.toString(); done(); } }),
        stdin: () => Buffer.alloc(0),
      });
      expect(code, jobs).toBe(2);
      expect(err, jobs).toMatch(/--jobs: expected a whole number from 0 to 64/);
    }
  });
});

describe('reading a note', () => {
  it('reports a folder, a missing file and the size limit in a line, and reads a note with a byte-order mark', () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-read-'));
    mkdirSync(join(dir, 'folder.pneu'));
    writeFileSync(join(dir, 'bom.pneu'), '\uFEFF@ 08:00\nvitals hr 80\n');
    const none = () => Buffer.alloc(0);
    expect(readNote('folder.pneu', dir, none)).toEqual({ path: 'folder.pneu', text: null, problem: 'is a folder' });
    expect(readNote('missing.pneu', dir, none)).toEqual({ path: 'missing.pneu', text: null, problem: 'no such file or folder' });
    expect(readNote('bom.pneu', dir, none)).toEqual({ path: 'bom.pneu', text: '@ 08:00\nvitals hr 80\n', problem: null });
    expect(readNote(join(dir, 'bom.pneu'), '/', none).text).toBe('@ 08:00\nvitals hr 80\n');
    expect(readNote('-', dir, () => Buffer.from('vitals hr 80\n'))).toEqual({ path: '<stdin>', text: 'vitals hr 80\n', problem: null });
  });
});
