// Which notes a command reads: paths that look like patterns, exclusions outside the working
// folder, `.pneuignore` files in the folders scanned, inputs that hold no note, extensions in any
// case, and notes that are not UTF-8.
import { chmodSync, closeSync, copyFileSync, mkdirSync, mkdtempSync, openSync, readdirSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { spawnSync } from 'node:child_process';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { memoryIo, type MemoryIo } from '../helpers/memory-io';
import { run } from '../../server/src/cli/main';
import { inputHooks } from '../../server/src/cli/inputs';

const io = (cwd: string, stdinText: string | Buffer = ''): MemoryIo => memoryIo({ cwd, stdin: stdinText });

const clean = '@ 08:00\nvitals hr 80\n';
const alarming = '@ 08:00\nvitals spo2 104\n'; // an error-level finding, so its path shows in the output

function tempDir(): string {
  return mkdtempSync(join(tmpdir(), 'pneumark-inputs-'));
}

/** The note paths a text report names (findings are printed as `path:line:column`). */
function reported(text: string): string[] {
  return [...new Set(text.split('\n').filter((l) => /\.pneu:\d/i.test(l)).map((l) => l.replace(/:\d+:\d+.*$/, '')))];
}

describe('a path that exists is a path, never a pattern', () => {
  it('checks a file whose name has brackets, not the file the brackets would match', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'a[1].pneu'), alarming);
    writeFileSync(join(dir, 'a1.pneu'), alarming);
    const out = io(dir);
    expect(await run(['check', 'a[1].pneu'], out)).toBe(1);
    expect(reported(out.out())).toEqual(['a[1].pneu']);
    expect(out.out()).toMatch(/1 note checked/);
  });

  it('walks folders named like patterns (brackets, parentheses)', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, 'ward [A]'));
    mkdirSync(join(dir, 'notes (copy)'));
    writeFileSync(join(dir, 'ward [A]', 'one.pneu'), alarming);
    writeFileSync(join(dir, 'notes (copy)', 'two.pneu'), alarming);
    const out = io(dir);
    expect(await run(['check', 'ward [A]', 'notes (copy)'], out)).toBe(1);
    expect(out.err()).toBe('');
    expect(reported(out.out())).toEqual(['notes (copy)/two.pneu', 'ward [A]/one.pneu']);
  });

  it('still expands a pattern that names no existing path', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'a1.pneu'), alarming);
    writeFileSync(join(dir, 'a2.pneu'), alarming);
    const out = io(dir);
    expect(await run(['check', 'a[12].pneu'], out)).toBe(1);
    expect(reported(out.out())).toEqual(['a1.pneu', 'a2.pneu']);
  });
});

describe('inputs that hold no note', () => {
  it('fail with one line when a folder has no notes, for check, export and fmt', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, 'empty'));
    writeFileSync(join(dir, 'empty', 'readme.txt'), 'not a note');
    for (const args of [['check', 'empty'], ['export', 'empty', '--format', 'csv'], ['fmt', '--check', 'empty'], ['fmt', '--write', 'empty'], ['fmt', 'empty']]) {
      const out = io(dir);
      expect(await run(args, out), args.join(' ')).toBe(2);
      expect(out.err(), args.join(' ')).toBe('pneumark: empty: no .pneu notes found in this folder (hidden folders and node_modules are skipped)\n');
    }
  });

  it('fail when --exclude or .pneuignore leaves nothing, and say which excluded it', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'one.pneu'), clean);
    writeFileSync(join(dir, 'two.pneu'), clean);
    const excluded = io(dir);
    expect(await run(['check', '.', '--exclude', '*.pneu'], excluded)).toBe(2);
    expect(excluded.err()).toBe('pneumark: .: no note left to read: the 2 .pneu notes in this folder are excluded by --exclude\n');
    writeFileSync(join(dir, '.pneuignore'), 'one.pneu\n');
    const ignored = io(dir);
    expect(await run(['check', 'one.pneu'], ignored)).toBe(2);
    expect(ignored.err()).toBe('pneumark: one.pneu: excluded by .pneuignore (line 1: one.pneu); no note left to read\n');
    const pattern = io(dir);
    expect(await run(['export', 'o*.pneu', '--format', 'jsonl'], pattern)).toBe(2);
    expect(pattern.err()).toBe('pneumark: o*.pneu: no note left to read: the file this pattern matches is excluded by .pneuignore\n');
  });

  it('pass as before when some input holds a note, or a note comes on standard input', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, 'empty'));
    writeFileSync(join(dir, 'one.pneu'), clean);
    const some = io(dir);
    expect(await run(['check', 'empty', 'one.pneu'], some)).toBe(0);
    expect(some.err()).toBe('');
    const stdin = io(dir, clean);
    expect(await run(['check', 'empty', '-'], stdin)).toBe(0);
    expect(stdin.err()).toBe('');
  });
});

describe('folder scans', () => {
  it('find notes whose extension is in any case, and skip hidden folders and files', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, '.hidden'));
    writeFileSync(join(dir, 'UPPER.PNEU'), alarming);
    writeFileSync(join(dir, 'mixed.Pneu'), alarming);
    writeFileSync(join(dir, 'plain.pneu'), alarming);
    writeFileSync(join(dir, '.dotted.pneu'), alarming);
    writeFileSync(join(dir, '.hidden', 'inside.pneu'), alarming);
    const out = io(dir);
    expect(await run(['check', '.'], out)).toBe(1);
    expect(reported(out.out())).toEqual(['UPPER.PNEU', 'mixed.Pneu', 'plain.pneu']);
  });

  it('are read in the byte order of their UTF-8 names (as `LC_ALL=C sort` lists them), emoji included', async () => {
    const dir = tempDir();
    // UTF-16 code units would put the emoji (a surrogate pair, 0xD83D…) before U+FF21 (0xFF21);
    // in UTF-8, and by code point, U+FF21 (EF BC A1) comes first and U+1F600 (F0 9F 98 80) last.
    for (const name of ['\u{1F600}.pneu', '\u{FF21}.pneu', 'b.pneu', '\u00E9.pneu', 'Z.pneu']) writeFileSync(join(dir, name), alarming);
    const byBytes = ['Z.pneu', 'b.pneu', '\u00E9.pneu', '\u{FF21}.pneu', '\u{1F600}.pneu'];
    expect([...byBytes].sort((a, b) => Buffer.compare(Buffer.from(a), Buffer.from(b)))).toEqual(byBytes);
    const out = io(dir);
    expect(await run(['check', '.'], out)).toBe(1);
    expect(reported(out.out())).toEqual(byBytes);
    const named = io(dir);
    expect(await run(['check', ...[...byBytes].reverse()], named)).toBe(1);
    expect(reported(named.out())).toEqual(byBytes);
  });

  it('and so do patterns: a pattern\'s .pneu extension matches in any case, the rest as written', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, 'ward', 'bay'), { recursive: true });
    writeFileSync(join(dir, 'ward', 'UPPER.PNEU'), alarming);
    writeFileSync(join(dir, 'ward', 'mixed.Pneu'), alarming);
    writeFileSync(join(dir, 'ward', 'plain.pneu'), alarming);
    writeFileSync(join(dir, 'ward', 'bay', 'deep.PNEU'), alarming);
    writeFileSync(join(dir, 'ward', 'other.pneux'), alarming);
    writeFileSync(join(dir, 'ward', 'readme.txt'), alarming);
    const folder = io(dir);
    expect(await run(['check', 'ward'], folder)).toBe(1);
    const all = ['ward/UPPER.PNEU', 'ward/bay/deep.PNEU', 'ward/mixed.Pneu', 'ward/plain.pneu'];
    expect(reported(folder.out())).toEqual(all);
    for (const [pattern, expected] of [
      ['ward/*.pneu', ['ward/UPPER.PNEU', 'ward/mixed.Pneu', 'ward/plain.pneu']],
      ['ward/*.PNEU', ['ward/UPPER.PNEU', 'ward/mixed.Pneu', 'ward/plain.pneu']],
      ['ward/**/*.pneu', all], // what a folder scan finds, as a pattern
      ['**/*.Pneu', all],
      ['ward/{plain,UPPER}.pneu', ['ward/UPPER.PNEU', 'ward/plain.pneu']],
      // Only the extension: the name is matched as written (on a case-sensitive file system).
      ['ward/upper.pneu*', null],
      ['ward/m*.pneu', ['ward/mixed.Pneu']],
      ['ward/M*.pneu', null],
    ] as const) {
      const out = io(dir);
      const code = await run(['check', pattern], out);
      if (expected === null) {
        expect(code, pattern).toBe(2);
        expect(out.err(), pattern).toMatch(/no file matches this pattern/);
      } else {
        expect(code, pattern).toBe(1);
        expect(reported(out.out()), pattern).toEqual(expected);
      }
    }
  });
});

describe('exclusions and case', () => {
  it('match names with their case as written, as git does on a case-sensitive file system, and .pneu in any case', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, 'Old'));
    mkdirSync(join(dir, 'old'));
    for (const name of ['Draft.pneu', 'draft.pneu', 'Old/x.pneu', 'old/y.pneu', 'keep.PNEU']) writeFileSync(join(dir, name), alarming);
    const kept = ['draft.pneu', 'keep.PNEU', 'old/y.pneu'];
    const byOption = io(dir);
    expect(await run(['check', '.', '--exclude', 'Draft.pneu', '--exclude', 'Old/'], byOption)).toBe(1);
    expect(reported(byOption.out())).toEqual(kept);
    writeFileSync(join(dir, '.pneuignore'), 'Draft.pneu\nOld/\n');
    const byFile = io(dir);
    expect(await run(['check', '.'], byFile)).toBe(1);
    expect(reported(byFile.out())).toEqual(kept);
    // The extension, as in folder scans and patterns, in any case.
    const extension = io(dir);
    expect(await run(['check', '.', '--exclude', '*.pneu', '--exclude', '!keep.pneu'], extension)).toBe(1);
    expect(reported(extension.out())).toEqual(['keep.PNEU']);
    writeFileSync(join(dir, '.pneuignore'), '*.PNEU\n');
    const all = io(dir);
    expect(await run(['check', '.'], all)).toBe(2);
    expect(all.err()).toMatch(/the 5 \.pneu notes in this folder are excluded by \.pneuignore/);
  });
});

describe('exclusions for notes outside the working folder', () => {
  it('match --exclude relative to the folder named on the command line', async () => {
    const top = tempDir();
    mkdirSync(join(top, 'work'));
    mkdirSync(join(top, 'notes', 'old'), { recursive: true });
    writeFileSync(join(top, 'notes', 'one.pneu'), alarming);
    writeFileSync(join(top, 'notes', 'two.pneu'), alarming);
    writeFileSync(join(top, 'notes', 'old', 'three.pneu'), alarming);
    const cwd = join(top, 'work');
    const named = io(cwd);
    await run(['check', '../notes', '--exclude', 'two.pneu', '--exclude', '/old/'], named);
    expect(reported(named.out())).toEqual(['../notes/one.pneu']);
    const absolute = io(cwd);
    await run(['check', join(top, 'notes'), '--exclude', 'two.pneu'], absolute);
    expect(reported(absolute.out())).toEqual(['../notes/old/three.pneu', '../notes/one.pneu']);
    const pattern = io(cwd);
    await run(['check', '../notes/**/*.pneu', '--exclude', 'old/'], pattern);
    expect(reported(pattern.out())).toEqual(['../notes/one.pneu', '../notes/two.pneu']);
    const file = io(cwd);
    await run(['check', '../notes/two.pneu', '../notes/one.pneu', '--exclude', 'two.pneu'], file);
    expect(reported(file.out())).toEqual(['../notes/one.pneu']);
  });

  it('match the working folder’s .pneuignore the same way', async () => {
    const top = tempDir();
    mkdirSync(join(top, 'work'));
    mkdirSync(join(top, 'notes'));
    writeFileSync(join(top, 'notes', 'one.pneu'), alarming);
    writeFileSync(join(top, 'notes', 'draft.pneu'), alarming);
    writeFileSync(join(top, 'work', '.pneuignore'), 'draft.pneu\n');
    const out = io(join(top, 'work'));
    await run(['check', '../notes'], out);
    expect(reported(out.out())).toEqual(['../notes/one.pneu']);
  });

  it('still match relative to the working folder for notes inside it', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, 'ward', 'old'), { recursive: true });
    writeFileSync(join(dir, 'ward', 'one.pneu'), alarming);
    writeFileSync(join(dir, 'ward', 'old', 'two.pneu'), alarming);
    const out = io(dir);
    await run(['check', 'ward', '--exclude', '/ward/old/'], out);
    expect(reported(out.out())).toEqual(['ward/one.pneu']);
  });

  it('take a path written from the working folder (./, ../, as tab completion writes it) as that path', async () => {
    const top = tempDir();
    mkdirSync(join(top, 'work', 'ward', 'old'), { recursive: true });
    mkdirSync(join(top, 'notes'), { recursive: true });
    writeFileSync(join(top, 'work', 'one.pneu'), alarming);
    writeFileSync(join(top, 'work', 'draft.pneu'), alarming);
    writeFileSync(join(top, 'work', 'ward', 'two.pneu'), alarming);
    writeFileSync(join(top, 'work', 'ward', 'old', 'three.pneu'), alarming);
    writeFileSync(join(top, 'notes', 'four.pneu'), alarming);
    writeFileSync(join(top, 'notes', 'five.pneu'), alarming);
    const cwd = join(top, 'work');
    const out = io(cwd);
    await run(['check', '.', '../notes', '--exclude', './draft.pneu', '--exclude', './ward/old/', '--exclude', '../notes/five.pneu'], out);
    expect(reported(out.out())).toEqual(['../notes/four.pneu', 'one.pneu', 'ward/two.pneu']);
    // With a wildcard, anchored in the working folder as a leading / is in gitignore syntax.
    const pattern = io(cwd);
    await run(['check', '.', '--exclude', './*.pneu'], pattern);
    expect(reported(pattern.out())).toEqual(['ward/old/three.pneu', 'ward/two.pneu']);
  });

  it('take an absolute path to a folder or file as that path, inside the working folder or outside it', async () => {
    const top = tempDir();
    mkdirSync(join(top, 'work', 'ward', 'old'), { recursive: true });
    mkdirSync(join(top, 'notes', 'old'), { recursive: true });
    writeFileSync(join(top, 'work', 'ward', 'one.pneu'), alarming);
    writeFileSync(join(top, 'work', 'ward', 'old', 'two.pneu'), alarming);
    writeFileSync(join(top, 'notes', 'three.pneu'), alarming);
    writeFileSync(join(top, 'notes', 'four.pneu'), alarming);
    writeFileSync(join(top, 'notes', 'old', 'five.pneu'), alarming);
    const cwd = join(top, 'work');
    const out = io(cwd);
    await run(['check', 'ward', '../notes', '--exclude', join(cwd, 'ward', 'old'), '--exclude', join(top, 'notes', 'old') + '/', '--exclude', join(top, 'notes', 'four.pneu')], out);
    expect(reported(out.out())).toEqual(['../notes/three.pneu', 'ward/one.pneu']);
    // A folder whose name only begins like the excluded one stays in.
    mkdirSync(join(top, 'notes', 'older'));
    writeFileSync(join(top, 'notes', 'older', 'six.pneu'), alarming);
    const prefix = io(cwd);
    await run(['check', '../notes', '--exclude', join(top, 'notes', 'old')], prefix);
    expect(reported(prefix.out())).toEqual(['../notes/four.pneu', '../notes/older/six.pneu', '../notes/three.pneu']);
  });
});

/** Writes `files` (paths with forward slashes, relative to `dir`), making their folders. */
function lay(dir: string, files: Readonly<Record<string, string>>): void {
  for (const [path, text] of Object.entries(files)) {
    mkdirSync(join(dir, path, '..'), { recursive: true });
    writeFileSync(join(dir, path), text);
  }
}

describe('.pneuignore files in the folders scanned', () => {
  it('match patterns with two `**` in folders 120 deep, in the deep folder and the ones on the way', async () => {
    const dir = tempDir();
    const deep = Array.from({ length: 120 }, (_, i) => `bed-${i}`).join('/');
    lay(dir, {
      '.pneuignore': '**/bed-1*/**/draft-*.pneu\n!**/bed-119/**/draft-keep.pneu\n/notes/bed-0/bed-1/bed-2/\n',
      'notes/draft-a.pneu': alarming,
      'notes/bed-0/draft-b.pneu': alarming,
      'notes/bed-0/bed-1/draft-c.pneu': alarming,
      'notes/bed-0/bed-1/kept.pneu': alarming,
      [`notes/${deep}/draft-d.pneu`]: alarming,
      [`notes/${deep}/draft-keep.pneu`]: alarming,
      [`notes/${deep}/kept.pneu`]: alarming,
    });
    const out = io(dir);
    await run(['check', 'notes'], out);
    // bed-1 and below: drafts left out, but the one taken back in bed-119; bed-2 and all below it left out as a folder.
    expect(reported(out.out())).toEqual(['notes/bed-0/bed-1/kept.pneu', 'notes/bed-0/draft-b.pneu', 'notes/draft-a.pneu']);
    writeFileSync(join(dir, '.pneuignore'), '**/bed-1*/**/draft-*.pneu\n!**/bed-119/**/draft-keep.pneu\n');
    const again = io(dir);
    await run(['check', 'notes'], again);
    expect(reported(again.out())).toEqual([`notes/${deep}/draft-keep.pneu`, `notes/${deep}/kept.pneu`, 'notes/bed-0/bed-1/kept.pneu', 'notes/bed-0/draft-b.pneu', 'notes/draft-a.pneu']);
  });

  it('apply below their own folder only, matched relative to it; siblings are unaffected', async () => {
    const dir = tempDir();
    lay(dir, {
      'data/ward-a/.pneuignore': 'draft.pneu\n/old/\n',
      'data/ward-a/one.pneu': alarming,
      'data/ward-a/draft.pneu': alarming,
      'data/ward-a/bed-2/draft.pneu': alarming,
      'data/ward-a/old/two.pneu': alarming,
      'data/ward-a/bed-2/old/three.pneu': alarming,
      'data/ward-b/draft.pneu': alarming,
      'data/ward-b/old/two.pneu': alarming,
      'data/draft.pneu': alarming,
    });
    const expected = ['data/draft.pneu', 'data/ward-a/bed-2/old/three.pneu', 'data/ward-a/one.pneu', 'data/ward-b/draft.pneu', 'data/ward-b/old/two.pneu'];
    // The same notes whichever folder is named, and in the same order.
    const whole = io(dir);
    await run(['check', 'data'], whole);
    expect(reported(whole.out())).toEqual(expected);
    const ward = io(dir);
    await run(['check', 'data/ward-a'], ward);
    expect(reported(ward.out())).toEqual(expected.filter((p) => p.startsWith('data/ward-a/')));
    const pattern = io(dir);
    await run(['check', 'data/**/*.pneu'], pattern);
    expect(reported(pattern.out())).toEqual(expected);
    // A file named on the command line is left out as the working folder's .pneuignore leaves it out.
    const named = io(dir);
    expect(await run(['check', 'data/ward-a/draft.pneu'], named)).toBe(2);
    expect(named.err()).toBe('pneumark: data/ward-a/draft.pneu: excluded by data/ward-a/.pneuignore (line 1: draft.pneu); no note left to read\n');
  });

  it('take back with a negation what a file above left out, unless its folder is left out', async () => {
    const dir = tempDir();
    lay(dir, {
      '.pneuignore': '*.pneu\nshelved/\n',
      'top.pneu': alarming,
      'ward/.pneuignore': '!keep.pneu\n!/sub/\n',
      'ward/keep.pneu': alarming,
      'ward/other.pneu': alarming,
      'ward/bed/keep.pneu': alarming,
      'ward/shelved/.pneuignore': '!*.pneu\n',
      'ward/shelved/keep.pneu': alarming,
      'ward/deeper/.pneuignore': 'keep.pneu\n!other.pneu\n',
      'ward/deeper/keep.pneu': alarming,
      'ward/deeper/other.pneu': alarming,
    });
    const out = io(dir);
    await run(['check', '.'], out);
    expect(reported(out.out())).toEqual(['ward/bed/keep.pneu', 'ward/deeper/other.pneu', 'ward/keep.pneu']);
  });

  it('apply in the folder named when run from another working folder, with the working folder’s own', async () => {
    const top = tempDir();
    lay(top, {
      'work/.pneuignore': 'old.pneu\n',
      'work/mine.pneu': alarming,
      'notes/.pneuignore': 'draft.pneu\n',
      'notes/one.pneu': alarming,
      'notes/draft.pneu': alarming,
      'notes/old.pneu': alarming,
      'notes/ward/draft.pneu': alarming,
      'notes/ward/two.pneu': alarming,
      'other/draft.pneu': alarming,
    });
    const cwd = join(top, 'work');
    const named = io(cwd);
    await run(['check', '../notes', '../other'], named);
    expect(reported(named.out())).toEqual(['../notes/one.pneu', '../notes/ward/two.pneu', '../other/draft.pneu']);
    const absolute = io(join(top, 'other'));
    await run(['check', join(top, 'notes')], absolute);
    expect(reported(absolute.out())).toEqual(['../notes/old.pneu', '../notes/one.pneu', '../notes/ward/two.pneu']);
    // From above the notes, the folder's file applies on the way down.
    const above = io(top);
    await run(['check', 'notes/ward', 'work'], above);
    expect(reported(above.out())).toEqual(['notes/ward/two.pneu', 'work/mine.pneu']);
    // Named from a folder that holds the working folder, the notes beside it get its files too.
    const parent = io(cwd);
    await run(['check', '..'], parent);
    expect(reported(parent.out())).toEqual(['../notes/one.pneu', '../notes/ward/two.pneu', '../other/draft.pneu', '../work/mine.pneu']);
  });

  it('are read in a folder that holds no note (only folders below it do), and --exclude still applies', async () => {
    const dir = tempDir();
    lay(dir, {
      'set/.pneuignore': 'b/\n',
      'set/a/one.pneu': alarming,
      'set/a/two.pneu': alarming,
      'set/b/three.pneu': alarming,
    });
    const out = io(dir);
    await run(['check', 'set', '--exclude', 'two.pneu'], out);
    expect(reported(out.out())).toEqual(['set/a/one.pneu']);
    const exported = io(dir);
    expect(await run(['export', 'set/b', '--format', 'csv'], exported)).toBe(2);
    expect(exported.err()).toBe('pneumark: set/b: no note left to read: the .pneu note in this folder is excluded by .pneuignore\n');
  });
});

describe('.pneuignore files of the project, above the folder named', () => {
  /** A project: its own file, one in `notes/`, and notes that each of them leaves out. */
  const project = (marker: Readonly<Record<string, string>>): string => {
    const top = tempDir();
    lay(top, {
      // Above the project: never read for its notes.
      '.pneuignore': '*.pneu\n',
      ...Object.fromEntries(Object.entries(marker).map(([path, text]) => [`proj/${path}`, text])),
      'proj/.pneuignore': 'drafts/\n',
      'proj/notes/.pneuignore': 'old.pneu\n/ward-b/shelved.pneu\n',
      'proj/notes/ward-a/one.pneu': alarming,
      'proj/notes/ward-a/old.pneu': alarming,
      'proj/notes/ward-a/drafts/draft.pneu': alarming,
      'proj/notes/ward-b/two.pneu': alarming,
      'proj/notes/ward-b/shelved.pneu': alarming,
      'elsewhere/mine.pneu': alarming,
    });
    return top;
  };

  it.each([
    ['a repository (.git folder)', { '.git/HEAD': 'ref: refs/heads/main\n' }],
    ['a repository worktree (.git file)', { '.git': 'gitdir: /nowhere\n' }],
    ['a pneumark.config.json', { 'pneumark.config.json': '{}\n' }],
  ])('apply from the project folder, %s, down to each note, from wherever the notes are checked', async (_what, marker) => {
    const top = project(marker);
    const proj = join(top, 'proj');
    const cases: [cwd: string, args: string[], expected: string[]][] = [
      [proj, ['notes/ward-a'], ['notes/ward-a/one.pneu']],
      // Inside the folder named: the files above the working folder apply too.
      [join(proj, 'notes', 'ward-a'), ['.'], ['one.pneu']],
      [join(proj, 'notes', 'ward-a'), ['one.pneu', 'old.pneu', 'drafts/draft.pneu'], ['one.pneu']],
      [join(proj, 'notes', 'ward-b'), ['.'], ['two.pneu']],
      // Beside it, and from outside the project.
      [join(proj, 'notes', 'ward-b'), ['../ward-a'], ['../ward-a/one.pneu']],
      [join(top, 'elsewhere'), ['../proj/notes/ward-a', '../proj/notes/ward-b/*.pneu'], ['../proj/notes/ward-a/one.pneu', '../proj/notes/ward-b/two.pneu']],
      [join(top, 'elsewhere'), [join(proj, 'notes', 'ward-a')], ['../proj/notes/ward-a/one.pneu']],
    ];
    for (const [cwd, args, expected] of cases) {
      const out = io(cwd);
      await run(['check', ...args], out);
      expect(reported(out.out()), `${cwd}: check ${args.join(' ')}`).toEqual(expected);
    }
  });

  it('are not read above the folder named when no folder above holds .git or pneumark.config.json', async () => {
    const top = project({});
    const ward = io(join(top, 'proj', 'notes', 'ward-a'));
    await run(['check', '.'], ward);
    expect(reported(ward.out())).toEqual(['drafts/draft.pneu', 'old.pneu', 'one.pneu']);
  });

  it('leave the working folder’s own file matched relative to the folder named, for notes outside it', async () => {
    const top = project({ 'pneumark.config.json': '{}\n' });
    // Anchored: it leaves out ward-a/one.pneu, not ward-a/bed/one.pneu.
    lay(top, { 'proj/notes/ward-b/.pneuignore': '/one.pneu\n', 'proj/notes/ward-a/bed/one.pneu': alarming });
    const out = io(join(top, 'proj', 'notes', 'ward-b'));
    await run(['check', '../ward-a'], out);
    expect(reported(out.out())).toEqual(['../ward-a/bed/one.pneu']);
  });
});

describe('notes that are not UTF-8', () => {
  const latin1 = Buffer.concat([Buffer.from('@ 08:00 r'), Buffer.from([0xe9]), Buffer.from('veil\nvitals hr 80\n')]);

  it('get a one-line problem and exit 2 from check, export and show', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'latin1.pneu'), latin1);
    writeFileSync(join(dir, 'fine.pneu'), clean);
    const checked = io(dir);
    expect(await run(['check', '.', '--format', 'json'], checked)).toBe(2);
    expect(checked.err()).toBe('pneumark: latin1.pneu: is not UTF-8 text (byte 0xE9 on line 1); convert it to UTF-8 to read it\n');
    const files = (JSON.parse(checked.out()) as { files: { path: string; problem: string | null }[] }).files;
    expect(files.map((f) => [f.path, f.problem === null])).toEqual([['fine.pneu', true], ['latin1.pneu', false]]);
    const exported = io(dir);
    expect(await run(['export', 'latin1.pneu', '--format', 'jsonl'], exported)).toBe(2);
    expect(exported.out()).toBe('');
    expect(exported.err()).toMatch(/^pneumark: latin1\.pneu: is not UTF-8 text \(byte 0xE9 on line 1\)/);
    const shown = io(dir);
    expect(await run(['show', 'latin1.pneu'], shown)).toBe(2);
    expect(shown.err().trim().split('\n')).toHaveLength(1);
    const stdin = io(dir, latin1);
    expect(await run(['check', '-'], stdin)).toBe(2);
    expect(stdin.err()).toMatch(/^pneumark: <stdin>: is not UTF-8 text/);
  });

  it('reads UTF-8 with or without a byte-order mark as before', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'bom.pneu'), `\uFEFF@ 08:00 réveil\nvitals hr 80\n`);
    const out = io(dir);
    expect(await run(['check', 'bom.pneu'], out)).toBe(0);
    expect(out.err()).toBe('');
  });
});

describe('what a folder walk cannot read is a problem, never skipped in silence', () => {
  /** Lists folders as fs does, except those named `locked`, as if their permissions forbade it. */
  const lockedFolders = (path: string, options: { withFileTypes: true }) => {
    if (/[\\/]locked[\\/]?$/.test(path)) throw Object.assign(new Error(`EACCES: permission denied, scandir '${path}'`), { code: 'EACCES' });
    return readdirSync(path, options);
  };

  it('a folder below the one named that cannot be listed: exit 2 from check, export and fmt --check', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'a.pneu'), clean);
    mkdirSync(join(dir, 'ward', 'locked'), { recursive: true });
    writeFileSync(join(dir, 'ward', 'locked', 'b.pneu'), alarming);
    inputHooks.readdirSync = lockedFolders;
    try {
      for (const args of [['check', '.'], ['check', '**/*.pneu'], ['export', '.', '--format', 'csv'], ['fmt', '--check', '.']]) {
        const out = io(dir);
        expect(await run(args, out), args.join(' ')).toBe(2);
        expect(out.err(), args.join(' ')).toContain('pneumark: ward/locked: folder cannot be read (permission denied); the notes in it are not read\n');
      }
      const json = io(dir);
      expect(await run(['check', '.', '--format', 'json'], json)).toBe(2);
      const files = (JSON.parse(json.out()) as { files: { path: string; problem: string | null }[] }).files;
      expect(files.map((f) => f.path)).toEqual(['ward/locked', 'a.pneu']);
      // Left out on purpose, it is no problem.
      const excluded = io(dir);
      expect(await run(['check', '.', '--exclude', 'locked/'], excluded)).toBe(0);
      expect(excluded.err()).toBe('');
    } finally {
      inputHooks.readdirSync = undefined;
    }
  });

  /**
   * Runs the command as a user that permissions apply to: in this process, or as root (which reads
   * anything) the built command line as the unprivileged user `nobody`, through util-linux's setpriv.
   */
  async function runUnprivileged(args: string[], cwd: string): Promise<{ status: number; err: string }> {
    if (process.getuid?.() !== 0) {
      const out = io(cwd);
      return { status: await run(args, out), err: out.err() };
    }
    // The bundle needs nothing beside it: a copy where that user may read it, wherever the clone is.
    const bin = tempDir();
    chmodSync(bin, 0o755);
    copyFileSync(resolve('dist/cli.js'), join(bin, 'cli.js'));
    const r = spawnSync('setpriv', ['--reuid=65534', '--regid=65534', '--clear-groups', process.execPath, join(bin, 'cli.js'), ...args], { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
    if (r.error) throw r.error;
    return { status: r.status ?? -1, err: r.stderr };
  }

  it.skipIf(process.platform === 'win32')('the same with real permissions (as root, the command runs as an unprivileged user)', async () => {
    const dir = tempDir();
    chmodSync(dir, 0o755);
    writeFileSync(join(dir, 'a.pneu'), clean);
    mkdirSync(join(dir, 'locked'));
    writeFileSync(join(dir, 'locked', 'b.pneu'), alarming);
    chmodSync(join(dir, 'locked'), 0o000);
    try {
      const out = await runUnprivileged(['check', '.'], dir);
      expect(out.status).toBe(2);
      expect(out.err).toContain('pneumark: locked: folder cannot be read (permission denied)');
      const named = await runUnprivileged(['check', 'locked/b.pneu'], dir);
      expect(named.status).toBe(2);
      expect(named.err).toBe('pneumark: locked/b.pneu: permission denied (a folder on the way to it cannot be searched)\n');
    } finally {
      chmodSync(join(dir, 'locked'), 0o755);
    }
  });

  it.skipIf(process.platform === 'win32')('a note that is a symbolic link to nothing, or a loop of links, is named, not left out', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'a.pneu'), clean);
    symlinkSync('moved-away.pneu', join(dir, 'b.pneu'));
    symlinkSync('c2.pneu', join(dir, 'c1.pneu'));
    symlinkSync('c1.pneu', join(dir, 'c2.pneu'));
    symlinkSync('nowhere.txt', join(dir, 'other.txt')); // not a note: nothing to say
    const folder = io(dir);
    expect(await run(['check', '.'], folder)).toBe(2);
    expect(folder.err()).toBe([
      'pneumark: b.pneu: a symbolic link to something that does not exist (moved-away.pneu)',
      'pneumark: c1.pneu: a loop of symbolic links',
      'pneumark: c2.pneu: a loop of symbolic links',
      '',
    ].join('\n'));
    expect(folder.out()).toMatch(/1 note checked, 3 could not be checked/);
    // A pattern still decides which links are notes.
    const pattern = io(dir);
    expect(await run(['check', '[ab].pneu'], pattern)).toBe(2);
    expect(pattern.err()).toBe('pneumark: b.pneu: a symbolic link to something that does not exist (moved-away.pneu)\n');
    const named = io(dir);
    expect(await run(['export', 'b.pneu', 'c1.pneu', '--format', 'jsonl'], named)).toBe(2);
    expect(named.err()).toBe('pneumark: b.pneu: a symbolic link to something that does not exist (moved-away.pneu)\npneumark: c1.pneu: a loop of symbolic links\n');
    const fmt = io(dir);
    expect(await run(['fmt', '--check', '.'], fmt)).toBe(2);
    expect(fmt.err()).toContain('pneumark: b.pneu: a symbolic link to something that does not exist (moved-away.pneu)\n');
  });
});

describe('inputs that never end', () => {
  // Run by the built command with a time limit: before, each of these read until memory ran out or
  // waited forever, which no test could interrupt in its own process.
  const cli = (args: readonly string[], cwd: string, stdin: number | 'pipe' = 'pipe') =>
    spawnSync(process.execPath, [join(process.cwd(), 'dist/cli.js'), ...args], { cwd, stdio: [stdin, 'pipe', 'pipe'], encoding: 'utf8', timeout: 30_000 });

  it.skipIf(process.platform === 'win32')('a note that is a device without end (/dev/zero) is read up to the size limit and refused', () => {
    const dir = tempDir();
    symlinkSync('/dev/zero', join(dir, 'zero.pneu'));
    const named = cli(['check', 'zero.pneu'], dir);
    expect(named.stderr).toBe('pneumark: zero.pneu: too large to check (the limit is 20 MB)\n');
    expect(named.status).toBe(2);
  });

  it.skipIf(process.platform === 'win32')('standard input without end is read up to the size limit and refused', () => {
    const zero = openSync('/dev/zero', 'r');
    try {
      const child = cli(['check', '-'], process.cwd(), zero);
      expect(child.stderr).toBe('pneumark: <stdin>: too large to check (the limit is 20 MB)\n');
      expect(child.status).toBe(2);
    } finally {
      closeSync(zero);
    }
  });

  it.skipIf(process.platform === 'win32')('a .pneuignore that is a pipe nobody writes to, or a link to /dev/zero, is not read: it excludes nothing', () => {
    for (const make of [(path: string) => spawnSync('mkfifo', [path]), (path: string) => symlinkSync('/dev/zero', path)]) {
      const dir = tempDir();
      writeFileSync(join(dir, 'a.pneu'), alarming);
      make(join(dir, '.pneuignore'));
      const folder = cli(['check', '.'], dir);
      expect(reported(folder.stdout)).toEqual(['a.pneu']);
      expect(folder.status).toBe(1);
    }
  });
});

describe('patterns with many `**`', () => {
  // Each `**` multiplies the time a pattern takes to match a path by the path's depth: fourteen of
  // them took ten seconds for each note 30 folders deep, and a .pneuignore comes with the notes.
  const deep = ['d', 'd', 'd', 'd', 'd'].join('/');

  it('--exclude takes at most two', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, deep), { recursive: true });
    writeFileSync(join(dir, deep, 'n.pneu'), alarming);
    const three = io(dir);
    expect(await run(['check', '.', '--exclude', '**/d/**/d/**/n.pneu'], three)).toBe(2);
    expect(three.err()).toBe('pneumark check: --exclude: holds more than 2 `**`, which makes matching take too long on deep folders (got "**/d/**/d/**/n.pneu")\n');
    const two = io(dir);
    expect(await run(['check', '.', '--exclude', '**/d/**/n.pneu'], two)).toBe(2);
    expect(two.err()).toContain('excluded by --exclude');
  });

  it('a .pneuignore line with more than two is left out, and said so (exit 2); its other lines apply', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, deep), { recursive: true });
    writeFileSync(join(dir, deep, 'n.pneu'), alarming);
    writeFileSync(join(dir, deep, 'other.pneu'), alarming);
    writeFileSync(join(dir, '.pneuignore'), `# deep notes\n${'**/d/'.repeat(3)}n.pneu\n**/d/**/other.pneu\n`);
    const folder = io(dir);
    expect(await run(['check', '.'], folder)).toBe(2);
    expect(reported(folder.out())).toEqual([`${deep}/n.pneu`]);
    expect(folder.err()).toBe('pneumark: .pneuignore: line 2 holds more than 2 `**`, which makes matching take too long on deep folders; it is not used, so the notes it names are read\n');
  });
});

describe('a note whose file name is not UTF-8', () => {
  // Linux keeps a name's bytes as they are (a Latin-1 `café` from an old archive); macOS and
  // Windows refuse such names, so there is nothing to meet there.
  it.skipIf(process.platform !== 'linux')('is named as such, with how to fix it, not as missing; the other notes are read', async () => {
    const dir = tempDir();
    writeFileSync(Buffer.concat([Buffer.from(`${dir}/caf`), Buffer.from([0xe9]), Buffer.from('.pneu')]), '@ day 1 08:00\nvitals hr 80\n');
    writeFileSync(join(dir, 'fine.pneu'), '@ day 1 08:00\nvitals hr 80\n');
    for (const args of [['check', '.'], ['fmt', '--check', '.'], ['export', '--format', 'csv', '.']]) {
      const out = io(dir);
      expect(await run(args, out), args.join(' ')).toBe(2);
      expect(out.err(), args.join(' ')).toBe('pneumark: caf\uFFFD.pneu: its name is not UTF-8 (shown here with \uFFFD), so it cannot be opened by it; rename the file\n');
    }
    const checked = io(dir);
    await run(['check', '.'], checked);
    expect(checked.out()).toMatch(/1 note checked, 1 could not be checked/);
  });
});
