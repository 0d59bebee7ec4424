// The command line over folders of notes: patterns, exclusions, limits, formatting in place,
// and the same output whatever the parallelism.
import { spawn, spawnSync } from 'node:child_process';
import { closeSync, cpSync, linkSync, mkdirSync, mkdtempSync, openSync, readFileSync, readdirSync, symlinkSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { memoryIo, type MemoryIo } from '../helpers/memory-io';
import { fmtHooks } from '../../server/src/cli/fmt-command';
import { run } from '../../server/src/cli/main';
import { generateNote } from '../bench/generate.mjs';

const io = (cwd: string, stdinText = ''): MemoryIo => memoryIo({ cwd, stdin: stdinText });

function corpus(): string {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-corpus-'));
  mkdirSync(join(dir, 'ward/a'), { recursive: true });
  mkdirSync(join(dir, 'archive'), { recursive: true });
  writeFileSync(join(dir, 'ward/a/one.pneu'), '@ 08:00\nvitals hr 80\n');
  writeFileSync(join(dir, 'ward/two.pneu'), '@ 08:00\nvitals spo2 104\n');
  writeFileSync(join(dir, 'ward/three.pneu'), '@ 08:00\nvitals hr 236\n');
  writeFileSync(join(dir, 'archive/old.pneu'), '@ 08:00\nvitals spo2 105\n');
  writeFileSync(join(dir, 'readme.txt'), 'not a note');
  return dir;
}

describe('finding notes', () => {
  it('walks folders and expands glob patterns, in sorted order', async () => {
    const dir = corpus();
    const all = io(dir);
    await run(['check', '.'], all);
    expect(all.out()).toMatch(/4 notes checked/);
    const pattern = io(dir);
    await run(['check', 'ward/**/*.pneu'], pattern);
    const paths = pattern.out().split('\n').filter((l) => /\.pneu:\d/.test(l)).map((l) => l.split(':')[0]);
    expect(paths).toEqual(['ward/three.pneu', 'ward/two.pneu']);
    expect(pattern.out()).toMatch(/3 notes checked/);
  });

  it('leaves out what --exclude and .pneuignore name', async () => {
    const dir = corpus();
    const excluded = io(dir);
    await run(['check', '.', '--exclude', 'archive/'], excluded);
    expect(excluded.out()).toMatch(/3 notes checked/);
    writeFileSync(join(dir, '.pneuignore'), '# old notes\narchive/\nward/three.pneu\n');
    const ignored = io(dir);
    await run(['check', '.'], ignored);
    expect(ignored.out()).toMatch(/2 notes checked/);
  });

  it('checks a note once however many paths reach it (symbolic links, a path named twice)', async () => {
    const dir = corpus();
    const outside = mkdtempSync(join(tmpdir(), 'pneumark-linked-'));
    writeFileSync(join(outside, 'elsewhere.pneu'), '@ 08:00\nvitals spo2 103\n');
    symlinkSync(join(dir, 'ward'), join(dir, 'archive', 'ward-again'), 'dir'); // a folder linked below its parent's sibling
    symlinkSync(dir, join(dir, 'ward', 'a', 'loop'), 'dir'); // a loop back to the top
    symlinkSync(join(outside, 'elsewhere.pneu'), join(dir, 'archive', 'linked.pneu'), 'file');
    const out = io(dir);
    await run(['check', '.', 'ward/two.pneu', './ward/two.pneu'], out);
    const paths = [...new Set(out.out().split('\n').filter((l) => /\.pneu:\d/.test(l)).map((l) => l.split(':')[0]))];
    // Each note under the first of its paths in sorted order; the linked note from outside once.
    expect(paths).toEqual(['archive/linked.pneu', 'archive/old.pneu', 'archive/ward-again/three.pneu', 'archive/ward-again/two.pneu']);
    expect(out.out()).toMatch(/5 notes checked/); // the four notes of the folder and the linked one
  });

  it('does not walk a folder link that leads back to a folder the walk came through: notes keep their own paths, and anchored exclusions hold', async () => {
    const dir = corpus();
    // `a-loop` sorts before every other folder: walked through, it would name every note
    // `a-loop/…`, the first of their paths in sorted order, and `/ward/three.pneu` would not match.
    symlinkSync(dir, join(dir, 'a-loop'), 'dir');
    symlinkSync('..', join(dir, 'ward', 'up'), 'dir'); // a loop one folder down
    const out = io(dir);
    expect(await run(['check', '.', '--exclude', '/ward/three.pneu'], out)).toBe(1);
    const paths = [...new Set(out.out().split('\n').filter((l) => /\.pneu:\d/.test(l)).map((l) => l.split(':')[0]))];
    expect(paths).toEqual(['archive/old.pneu', 'ward/two.pneu']);
    expect(out.out()).toMatch(/3 notes checked/);
    expect(out.err()).toBe('');
    // A link to a folder above the one named is walked (its notes are not reached otherwise), once.
    const above = io(join(dir, 'ward'));
    await run(['export', '.', '--format', 'jsonl'], above);
    const files = new Set(above.out().trim().split('\n').map((l) => (JSON.parse(l) as { file: string }).file));
    expect([...files].sort()).toEqual(['a/one.pneu', 'three.pneu', 'two.pneu', 'up/archive/old.pneu']);
  });

  it('names a symbolic link to nothing once however many paths reach it, and counts it once', async () => {
    const dir = corpus();
    symlinkSync('moved-away.pneu', join(dir, 'ward', 'gone.pneu'));
    symlinkSync(join(dir, 'ward'), join(dir, 'archive', 'ward-again'), 'dir');
    const out = io(dir);
    expect(await run(['check', '.'], out)).toBe(2);
    expect(out.err()).toBe('pneumark: archive/ward-again/gone.pneu: a symbolic link to something that does not exist (moved-away.pneu)\n');
    expect(out.out()).toMatch(/4 notes checked, 1 could not be checked/);
  });

  it('checks a note once when it has several names (hard links), under the first in sorted order', async () => {
    const dir = corpus();
    linkSync(join(dir, 'ward', 'two.pneu'), join(dir, 'archive', 'two-linked.pneu'));
    // And a symbolic link to one of the names: the same note again.
    symlinkSync(join(dir, 'ward', 'two.pneu'), join(dir, 'archive', 'two-symlinked.pneu'), 'file');
    const out = io(dir);
    await run(['check', '.'], out);
    const paths = [...new Set(out.out().split('\n').filter((l) => /\.pneu:\d/.test(l)).map((l) => l.split(':')[0]))];
    expect(paths).not.toContain('ward/two.pneu');
    expect(paths).not.toContain('archive/two-symlinked.pneu');
    expect(out.out()).toMatch(/4 notes checked/); // the four notes of the folder, the linked one once
    // Exported once too: a dataset does not count its rows twice.
    const exported = io(dir);
    await run(['export', '.', '--format', 'jsonl'], exported);
    const files = new Set(exported.out().trim().split('\n').map((l) => (JSON.parse(l) as { file: string }).file));
    expect([...files].sort()).toEqual(['archive/old.pneu', 'archive/two-linked.pneu', 'ward/a/one.pneu', 'ward/three.pneu']);
  });

  it('says when a pattern matches nothing, and goes on', async () => {
    const dir = corpus();
    const out = io(dir);
    expect(await run(['check', 'nowhere/**/*.pneu', 'ward/a/one.pneu'], out)).toBe(2);
    expect(out.err()).toMatch(/nowhere\/\*\*\/\*\.pneu: no file matches this pattern/);
    expect(out.out()).toMatch(/1 note checked/);
  });

  it('says it once when the folder a pattern starts from does not exist (not also that the folder cannot be read)', async () => {
    const dir = corpus();
    const out = io(dir);
    expect(await run(['check', 'nowhere/*.pneu', 'ward/missing/**/*.pneu', 'ward/a/one.pneu'], out)).toBe(2);
    expect(out.err()).toBe('pneumark: nowhere/*.pneu: no file matches this pattern\npneumark: ward/missing/**/*.pneu: no file matches this pattern\n');
    expect(out.out()).toMatch(/1 note checked, 2 could not be checked/);
  });
});

describe('limits and levels', () => {
  it('fails on more warnings than --max-warnings', async () => {
    const dir = corpus();
    expect(await run(['check', 'ward/three.pneu', '--max-warnings', '0'], io(dir))).toBe(1);
    expect(await run(['check', 'ward/three.pneu', '--max-warnings', '1'], io(dir))).toBe(0);
    expect(await run(['check', 'ward/three.pneu', '--max-warnings', 'lots'], io(dir))).toBe(2);
  });

  it('prints help for every command', async () => {
    for (const command of ['show', 'check', 'export', 'fmt', 'docs']) {
      const out = io(process.cwd());
      expect(await run([command, '--help'], out)).toBe(0);
      expect(out.out()).toMatch(new RegExp(`^Usage: pneumark ${command}`));
    }
  });

  it('lays out every command\'s options alike: an Options heading, descriptions in one column', async () => {
    for (const command of ['check', 'export', 'fmt', 'docs']) {
      const out = io(process.cwd());
      await run([command, '--help'], out);
      const text = out.out();
      expect(text, command).toContain('\nOptions:\n');
      for (const line of text.split('\n').filter((l) => /^ {2}--/.test(l))) expect(line.slice(0, 29), `${command}: ${line}`).toMatch(/^ {2}--\S.* {2,}$/);
    }
  });

  it('lists export\'s --spreadsheet-safe, and says --anchor takes 00:00 of day 1', async () => {
    const out = io(process.cwd());
    await run(['export', '--help'], out);
    const text = out.out().replace(/\s+/g, ' ');
    expect(text).toContain('--spreadsheet-safe CSV only: an apostrophe before text starting with = + - @ tab');
    expect(text).toContain('--anchor DATETIME FHIR only: the ISO date-time of day 1 00:00 (its time must be 00:00');
  });

  it('names every cause of exit code 2 in the main help, inputs that hold no note among them', async () => {
    const out = io(process.cwd());
    await run(['--help'], out);
    const text = out.out().replace(/\s+/g, ' ');
    expect(text).toContain('2 a usage error, inputs that hold no note (an empty folder, a pattern that matches nothing; in check, show and export, a note that is empty or has only blank lines, as standard input with nothing piped in is), a note that could not be read, or analysed in the memory one note is given, or that fmt --write would not rewrite, a folder below those named that cannot be listed');
  });
});

describe('fmt', () => {
  const messy = '@ 08:00   first\nvitals hr 80,rr 12 ,  spo2 97 %\n';
  const tidy = '@ 08:00  first\nvitals    hr 80, rr 12, spo2 97 %\n';

  it('prints a formatted note, lists notes that would change, and rewrites them', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-fmt-'));
    writeFileSync(join(dir, 'a.pneu'), messy);
    writeFileSync(join(dir, 'b.pneu'), tidy);
    const printed = io(dir);
    expect(await run(['fmt', 'a.pneu'], printed)).toBe(0);
    expect(printed.out()).toBe(tidy);
    const checked = io(dir);
    expect(await run(['fmt', '--check', '.'], checked)).toBe(1);
    expect(checked.out()).toBe('a.pneu\n');
    expect(await run(['fmt', '--write', '.'], io(dir))).toBe(0);
    expect(readFileSync(join(dir, 'a.pneu'), 'utf8')).toBe(tidy);
    expect(await run(['fmt', '--check', '.'], io(dir))).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(['a.pneu', 'b.pneu']);
  });

  it('refuses to rewrite a note with syntax errors unless --force', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-fmt-'));
    const broken = `${messy}vitls hr 80\n`;
    writeFileSync(join(dir, 'a.pneu'), broken);
    const out = io(dir);
    expect(await run(['fmt', '--write', 'a.pneu'], out)).toBe(2);
    expect(out.err()).toMatch(/not rewritten: 1 syntax error/);
    expect(readFileSync(join(dir, 'a.pneu'), 'utf8')).toBe(broken);
    expect(await run(['fmt', '--write', '--force', 'a.pneu'], io(dir))).toBe(0);
    expect(readFileSync(join(dir, 'a.pneu'), 'utf8')).toBe(`${tidy}vitls hr 80\n`);
  });

  it('never overwrites a note that changed on disk between read and write', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-fmt-'));
    const file = join(dir, 'a.pneu');
    writeFileSync(file, messy);
    const concurrent = `${messy}note   added by someone else meanwhile\n`;
    fmtHooks.beforeRename = () => {
      writeFileSync(file, concurrent);
      utimesSync(file, new Date(), new Date(Date.now() + 5000));
    };
    try {
      const out = io(dir);
      expect(await run(['fmt', '--write', 'a.pneu'], out)).toBe(2);
      expect(out.err()).toMatch(/changed on disk while being formatted; left as it is/);
    } finally {
      fmtHooks.beforeRename = undefined;
    }
    expect(readFileSync(file, 'utf8')).toBe(concurrent);
    expect(readdirSync(dir)).toEqual(['a.pneu']);
  });

  it('leaves the original intact when the write is interrupted before the rename', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-fmt-'));
    const file = join(dir, 'a.pneu');
    writeFileSync(file, messy);
    fmtHooks.beforeRename = () => {
      throw new Error('interrupted');
    };
    try {
      const out = io(dir);
      expect(await run(['fmt', '--write', 'a.pneu'], out)).toBe(2);
      expect(out.err()).toMatch(/could not be written \(interrupted\); the original is intact/);
    } finally {
      fmtHooks.beforeRename = undefined;
    }
    expect(readFileSync(file, 'utf8')).toBe(messy);
    expect(readdirSync(dir)).toEqual(['a.pneu']);
  });

  it('keeps a byte-order mark and CRLF line ends', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-fmt-'));
    const file = join(dir, 'a.pneu');
    writeFileSync(file, `\uFEFF${messy.replace(/\n/g, '\r\n')}`);
    expect(await run(['fmt', '--write', 'a.pneu'], io(dir))).toBe(0);
    expect(readFileSync(file, 'utf8')).toBe(`\uFEFF${tidy.replace(/\n/g, '\r\n')}`);
  });
});

describe('big outputs', () => {
  it('stream a note at a time to a slow reader, the same as a run in one thread (built command)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-stream-'));
    for (let i = 0; i < 60; i++) writeFileSync(join(dir, `note-${String(i).padStart(2, '0')}.pneu`), `@ 08:00\noxygen fio2 0.4\nvitals spo2 ${90 + (i % 9)}\nabg 7.3${i % 10}/4${i % 10}/${60 + i}/24\n@ +1h\nvitals hr ${70 + i}\n`);
    const cli = join(process.cwd(), 'dist/cli.js');
    for (const args of [['check', '--format', 'json', '.'], ['export', '--format', 'fhir', '.']]) {
      const single = spawnSync(process.execPath, [cli, ...args, '--jobs', '0'], { cwd: dir, encoding: 'utf8', maxBuffer: 1 << 28 });
      // A reader that pauses: the command's writes fill the pipe and it has to wait for drain.
      const child = spawn(process.execPath, [cli, ...args, '--jobs', '2'], { cwd: dir });
      const chunks: Buffer[] = [];
      child.stdout.on('data', (chunk: Buffer) => {
        chunks.push(chunk);
        child.stdout.pause();
        setTimeout(() => child.stdout.resume(), 2);
      });
      const code = await new Promise<number | null>((resolve) => child.on('close', resolve));
      expect(code).toBe(single.status);
      expect(Buffer.concat(chunks).toString('utf8')).toBe(single.stdout);
    }
  });
});

describe('output larger than memory', () => {
  it('is written with a heap far smaller than the output (built command)', async () => {
    // 150 notes of 20 timepoints: about 65 MB of indented JSON (piped it would be compact, about
    // half), written by a process allowed 48 MB of heap.
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-big-'));
    for (let i = 0; i < 150; i++) writeFileSync(join(dir, `note-${String(i).padStart(3, '0')}.pneu`), generateNote(20, i + 1));
    const child = spawn(process.execPath, ['--max-old-space-size=48', join(process.cwd(), 'dist/cli.js'), 'check', '--format', 'json', '--indented', '--jobs', '0', '.'], { cwd: dir });
    let bytes = 0;
    let tail = '';
    child.stdout.on('data', (chunk: Buffer) => { bytes += chunk.length; tail = (tail + chunk.toString('latin1')).slice(-200); });
    let err = '';
    child.stderr.on('data', (chunk: Buffer) => { err += chunk.toString(); });
    const code = await new Promise<number | null>((resolve) => child.on('close', resolve));
    expect(err).toBe('');
    expect(code).toBe(0);
    expect(bytes).toBeGreaterThan(48 * 1024 * 1024);
    expect(tail).toMatch(/"summary": \{\n    "files": 150,[\s\S]*\n\}\n$/);
  }, 60_000);
});

describe('a reader that stops early', () => {
  it('stops the command at once and quietly, with exit code 2 (built command)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-head-'));
    for (let i = 0; i < 30; i++) writeFileSync(join(dir, `note-${String(i).padStart(2, '0')}.pneu`), `@ 08:00\nabg 7.3${i % 10}/4${i % 10}/${60 + i}/24\n`);
    const child = spawn(process.execPath, [join(process.cwd(), 'dist/cli.js'), 'check', '--format', 'json', '.'], { cwd: dir });
    let err = '';
    child.stderr.on('data', (chunk: Buffer) => { err += chunk.toString(); });
    // Like `| head -c 100`: read the first chunk, then close the pipe.
    child.stdout.once('data', () => child.stdout.destroy());
    const code = await new Promise<number | null>((resolve) => child.on('close', resolve));
    expect(code).toBe(2);
    expect(err).toBe('');
  });
});

describe('standard output that cannot be written', () => {
  // A full disk (`> out.csv` on a full file system; Linux's /dev/full fails every write with
  // ENOSPC). Exit code 1 would read as "notes with error findings", which a dataset with a broken
  // note always gives, so a pipeline would take a cut-off file for a whole one.
  it('says so in one line on standard error and ends with exit code 2, never a stack trace (built command)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-full-'));
    writeFileSync(join(dir, 'a.pneu'), '@ 08:00\nvitals hr 80\nabg 7.40/40/90/24\n');
    writeFileSync(join(dir, 'b.pneu'), '@ 08:00\nvitlas hr 80\n');
    const cli = join(process.cwd(), 'dist/cli.js');
    for (const args of [['export', '--format', 'csv', '.'], ['export', '--format', 'jsonl', '.'], ['export', '--format', 'fhir', '.'], ['check', '--format', 'json', '.'], ['check', '.']]) {
      const full = openSync('/dev/full', 'w');
      try {
        const r = spawnSync(process.execPath, [cli, ...args], { cwd: dir, stdio: ['ignore', full, 'pipe'], encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
        expect(r.stderr, args.join(' ')).toMatch(/^pneumark: could not write to standard output \(ENOSPC\): the output is incomplete\n$/);
        expect(r.status, args.join(' ')).toBe(2);
      } finally {
        closeSync(full);
      }
    }
  });
});

describe('parallel runs', () => {
  it('give byte-identical output with and without workers (built command)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'pneumark-par-'));
    cpSync(join(process.cwd(), 'samples'), join(dir, 'samples'), { recursive: true });
    for (let i = 0; i < 40; i++) writeFileSync(join(dir, `note-${String(i).padStart(2, '0')}.pneu`), `@ 08:00\nvitals spo2 ${90 + (i % 15)}\nabg 7.40/40/${60 + i}/24.4\n`);
    const cli = join(process.cwd(), 'dist/cli.js');
    // The indented JSON of these 44 notes is over 1 MB, spawnSync's default buffer: a larger one, or the outputs are cut.
    const runWith = (workers: string, args: string[]) => spawnSync(process.execPath, [cli, ...args], { cwd: dir, encoding: 'utf8', maxBuffer: 1 << 28, env: { ...process.env, PNEUMARK_WORKERS: workers, NO_COLOR: '1' } });
    // JSON piped is compact; indented (--indented) and version 2 are written by the workers too.
    for (const args of [['check', '.'], ['check', '--format', 'json', '.'], ['check', '--format', 'json', '--indented', '.'], ['check', '--format', 'json', '--json-version', '2', '.'], ['export', '--format', 'csv', '.']]) {
      const single = runWith('0', args);
      const parallel = runWith('2', args);
      expect(parallel.status, parallel.stderr).toBe(single.status);
      expect(parallel.stdout).toBe(single.stdout);
      if (args.includes('--json-version')) expect(Object.keys((JSON.parse(single.stdout) as { definitions: object }).definitions)).toContain('pf_ratio');
      // --jobs wins over the environment either way.
      const [command, ...rest] = args;
      const byOption = runWith('0', [command!, '--jobs', '3', ...rest]);
      expect(byOption.stdout).toBe(single.stdout);
      expect(runWith('2', [command!, '--jobs', '0', ...rest]).stdout).toBe(single.stdout);
    }
    // Twenty runs of the built command, each starting Node and, in eight of them, worker threads:
    // some 28 s on this 2-core machine when it is otherwise idle.
  }, 150_000);
});
