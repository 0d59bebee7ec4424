// `pneumark fmt` on awkward files: names that look like patterns, symbolic links, notes that are
// not UTF-8, byte-order marks when printing, and what it says when inputs are missing.
import { chownSync, copyFileSync, linkSync, lstatSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, readlinkSync, statSync, symlinkSync, writeFileSync, chmodSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { memoryIo, type MemoryIo } from '../helpers/memory-io';
import { run } from '../../server/src/cli/main';

const io = (cwd: string): MemoryIo => memoryIo({ cwd });

const messy = '@ 08:00   first\nvitals hr 80,rr 12 ,  spo2 97 %\n';
const tidy = '@ 08:00  first\nvitals    hr 80, rr 12, spo2 97 %\n';

function tempDir(): string {
  return mkdtempSync(join(tmpdir(), 'pneumark-fmt-'));
}

describe('fmt --write on files named like patterns', () => {
  it('rewrites the file named, not the one the brackets would match', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'a[1].pneu'), messy);
    writeFileSync(join(dir, 'a1.pneu'), messy);
    const out = io(dir);
    expect(await run(['fmt', '--write', 'a[1].pneu'], out)).toBe(0);
    expect(out.out()).toBe('formatted a[1].pneu\n');
    expect(readFileSync(join(dir, 'a[1].pneu'), 'utf8')).toBe(tidy);
    expect(readFileSync(join(dir, 'a1.pneu'), 'utf8')).toBe(messy);
  });
});

describe('fmt --write on a symbolic link', () => {
  it('formats the note the link leads to and keeps the link', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, 'real'));
    mkdirSync(join(dir, 'links'));
    const target = join(dir, 'real', 'note.pneu');
    writeFileSync(target, messy);
    chmodSync(target, 0o640);
    symlinkSync('../real/note.pneu', join(dir, 'links', 'note.pneu'), 'file');
    const out = io(dir);
    expect(await run(['fmt', '--write', 'links/note.pneu'], out)).toBe(0);
    expect(out.err()).toBe('');
    expect(lstatSync(join(dir, 'links', 'note.pneu')).isSymbolicLink()).toBe(true);
    expect(readlinkSync(join(dir, 'links', 'note.pneu'))).toBe('../real/note.pneu');
    expect(readFileSync(target, 'utf8')).toBe(tidy);
    expect(statSync(target).mode & 0o777).toBe(0o640);
    // The temporary file went beside the real note and is gone; nothing was left beside the link.
    expect(readdirSync(join(dir, 'real'))).toEqual(['note.pneu']);
    expect(readdirSync(join(dir, 'links'))).toEqual(['note.pneu']);
  });

  it('formats a note reached through a linked folder', async () => {
    const dir = tempDir();
    mkdirSync(join(dir, 'real'));
    writeFileSync(join(dir, 'real', 'note.pneu'), messy);
    symlinkSync(join(dir, 'real'), join(dir, 'linked'), 'dir');
    expect(await run(['fmt', '--write', 'linked/note.pneu'], io(dir))).toBe(0);
    expect(lstatSync(join(dir, 'linked')).isSymbolicLink()).toBe(true);
    expect(readFileSync(join(dir, 'real', 'note.pneu'), 'utf8')).toBe(tidy);
  });
});

describe('fmt on notes that are not UTF-8', () => {
  const latin1 = Buffer.concat([Buffer.from('@ 08:00   r'), Buffer.from([0xe9]), Buffer.from('veil\nvitals hr 80,rr 12 ,  spo2 97 %\n')]);

  it('refuses --write and --check with one line and exit 2, leaving the bytes as they were', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'latin1.pneu'), latin1);
    writeFileSync(join(dir, 'fine.pneu'), messy);
    const written = io(dir);
    expect(await run(['fmt', '--write', '.'], written)).toBe(2);
    expect(written.err()).toBe('pneumark: latin1.pneu: is not UTF-8 text (byte 0xE9 on line 1); not rewritten (convert it to UTF-8 first)\n');
    expect(readFileSync(join(dir, 'latin1.pneu')).equals(latin1)).toBe(true);
    expect(readFileSync(join(dir, 'fine.pneu'), 'utf8')).toBe(tidy); // the other notes are still formatted
    const checked = io(dir);
    expect(await run(['fmt', '--check', 'latin1.pneu'], checked)).toBe(2);
    expect(checked.err()).toBe('pneumark: latin1.pneu: is not UTF-8 text (byte 0xE9 on line 1); not checked (convert it to UTF-8 first)\n');
    const printed = io(dir);
    expect(await run(['fmt', 'latin1.pneu'], printed)).toBe(2);
    expect(printed.out()).toBe('');
    expect(printed.err()).toMatch(/^pneumark: latin1\.pneu: is not UTF-8 text \(byte 0xE9 on line 1\)[^\n]*\n$/);
    expect(readFileSync(join(dir, 'latin1.pneu')).equals(latin1)).toBe(true);
  });

  it('names the line of the first byte that is not UTF-8', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'a.pneu'), Buffer.concat([Buffer.from('@ 08:00\nvitals hr 80\nnote caf'), Buffer.from([0xe9, 0x0a])]));
    const out = io(dir);
    expect(await run(['fmt', '--check', 'a.pneu'], out)).toBe(2);
    expect(out.err()).toMatch(/byte 0xE9 on line 3/);
  });
});

describe('fmt printing a note', () => {
  it('keeps a byte-order mark, as --write does', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'a.pneu'), `\uFEFF${messy}`);
    const out = io(dir);
    expect(await run(['fmt', 'a.pneu'], out)).toBe(0);
    expect(out.out()).toBe(`\uFEFF${tidy}`);
  });

  it('says which files are missing, without a usage message that does not apply', async () => {
    const dir = tempDir();
    const out = io(dir);
    expect(await run(['fmt', 'a.pneu', 'b.pneu'], out)).toBe(2);
    expect(out.err()).toBe('pneumark: a.pneu: no such file or folder\npneumark: b.pneu: no such file or folder\n');
    const one = io(dir);
    expect(await run(['fmt', 'a.pneu'], one)).toBe(2);
    expect(one.err()).toBe('pneumark: a.pneu: no such file or folder\n');
  });

  it('says how many notes it was given when given several', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'a.pneu'), messy);
    writeFileSync(join(dir, 'b.pneu'), messy);
    const out = io(dir);
    expect(await run(['fmt', 'a.pneu', 'b.pneu'], out)).toBe(2);
    expect(out.err()).toBe('pneumark fmt: without --check or --write, fmt prints one note, and these inputs hold 2; add --check or --write to work on several\n');
    const folder = io(dir);
    expect(await run(['fmt', '.'], folder)).toBe(2);
    expect(folder.err()).toBe('pneumark fmt: without --check or --write, fmt prints one note, and . holds 2; add --check or --write to work on several\n');
    expect(folder.out()).toBe('');
  });
});

describe('fmt --write on a read-only note', () => {
  it('leaves it as it is, with one line and exit 2, and formats the others', async () => {
    const dir = tempDir();
    const locked = join(dir, 'signed-off.pneu');
    writeFileSync(locked, messy);
    chmodSync(locked, 0o444);
    writeFileSync(join(dir, 'draft.pneu'), messy);
    const out = io(dir);
    expect(await run(['fmt', '--write', '.'], out)).toBe(2);
    expect(out.err()).toBe('pneumark: signed-off.pneu: read-only (no permission to write it); not rewritten\n');
    expect(out.out()).toBe('formatted draft.pneu\n');
    expect(readFileSync(locked, 'utf8')).toBe(messy);
    expect(statSync(locked).mode & 0o777).toBe(0o444);
    expect(readFileSync(join(dir, 'draft.pneu'), 'utf8')).toBe(tidy);
    // --force is about syntax errors, not permissions; --check still lists it.
    expect(await run(['fmt', '--write', '--force', 'signed-off.pneu'], io(dir))).toBe(2);
    expect(readFileSync(locked, 'utf8')).toBe(messy);
    const checked = io(dir);
    expect(await run(['fmt', '--check', '.'], checked)).toBe(1);
    expect(checked.out()).toBe('signed-off.pneu\n');
    // Already formatted: nothing to write, nothing to refuse.
    chmodSync(locked, 0o644);
    writeFileSync(locked, tidy);
    chmodSync(locked, 0o444);
    expect(await run(['fmt', '--write', 'signed-off.pneu'], io(dir))).toBe(0);
  });
});

describe('fmt --force', () => {
  it('without --write is a usage error, not silently ignored', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'n.pneu'), messy);
    for (const args of [['fmt', '--force', 'n.pneu'], ['fmt', '--check', '--force', 'n.pneu']]) {
      const out = io(dir);
      expect(await run(args, out), args.join(' ')).toBe(2);
      expect(out.out()).toBe('');
      expect(out.err()).toBe('pneumark fmt: --force: only applies to --write (it lets --write rewrite notes with syntax errors)\n');
    }
    expect(readFileSync(join(dir, 'n.pneu'), 'utf8')).toBe(messy);
  });
});

describe('fmt --write keeps a note’s permissions', () => {
  it('whatever the umask would take away from a new file (group and others may write a shared note)', async () => {
    const dir = tempDir();
    for (const [name, mode] of [['ward.pneu', 0o664], ['open.pneu', 0o666], ['own.pneu', 0o600]] as const) {
      writeFileSync(join(dir, name), messy);
      chmodSync(join(dir, name), mode);
    }
    const out = io(dir);
    expect(await run(['fmt', '--write', '.'], out)).toBe(0);
    expect(out.err()).toBe('');
    for (const [name, mode] of [['ward.pneu', 0o664], ['open.pneu', 0o666], ['own.pneu', 0o600]] as const) {
      expect(readFileSync(join(dir, name), 'utf8'), name).toBe(tidy);
      expect((statSync(join(dir, name)).mode & 0o777).toString(8), name).toBe(mode.toString(8));
    }
  });
});

describe('fmt --write keeps who owns a note', () => {
  const asRoot = process.getuid?.() === 0;
  const NOBODY = 65534;

  // Only root can give a file to another user, so these run where CI runs (as root).
  it.skipIf(!asRoot)('a note of another user rewritten by root stays theirs, with its group', async () => {
    const dir = tempDir();
    const note = join(dir, 'shared.pneu');
    writeFileSync(note, messy);
    chmodSync(note, 0o640);
    chownSync(note, NOBODY, NOBODY);
    const out = io(dir);
    expect(await run(['fmt', '--write', 'shared.pneu'], out)).toBe(0);
    expect(readFileSync(note, 'utf8')).toBe(tidy);
    const after = statSync(note);
    expect([after.uid, after.gid]).toEqual([NOBODY, NOBODY]);
    expect(after.mode & 0o777).toBe(0o640);
  });

  it.skipIf(!asRoot || process.platform === 'win32')('a user who may write a note of someone else, but not give a file away, leaves it as it is', () => {
    // The note is root's and writable by all, in a folder anyone may write in: the user nobody
    // could put a new file in its place, but that file would be nobody's, and root would lose it.
    const dir = tempDir();
    chmodSync(dir, 0o777);
    const note = join(dir, 'ward.pneu');
    writeFileSync(note, messy);
    chmodSync(note, 0o666);
    const bin = tempDir();
    chmodSync(bin, 0o755);
    copyFileSync(resolve('dist/cli.js'), join(bin, 'cli.js'));
    const r = spawnSync('setpriv', ['--reuid=65534', '--regid=65534', '--clear-groups', process.execPath, join(bin, 'cli.js'), 'fmt', '--write', 'ward.pneu'], { cwd: dir, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
    if (r.error) throw r.error;
    expect(r.stderr).toBe('pneumark: ward.pneu: owned by another user or group, which a rewritten file could not keep; not rewritten\n');
    expect(r.status).toBe(2);
    expect(readFileSync(note, 'utf8')).toBe(messy);
    expect(statSync(note).uid).toBe(0);
    expect(readdirSync(dir)).toEqual(['ward.pneu']);
  });
});

describe('fmt --write on a note with several names (hard links)', () => {
  it('leaves it as it is: a new file would take one name and leave the others with the old text', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'today.pneu'), messy);
    linkSync(join(dir, 'today.pneu'), join(dir, 'archive.pneu'));
    const out = io(dir);
    expect(await run(['fmt', '--write', 'today.pneu'], out)).toBe(2);
    expect(out.err()).toBe('pneumark: today.pneu: has 2 names (hard links), which a rewritten file would separate; not rewritten\n');
    expect(out.out()).toBe('');
    expect(readFileSync(join(dir, 'today.pneu'), 'utf8')).toBe(messy);
    expect(statSync(join(dir, 'today.pneu')).ino).toBe(statSync(join(dir, 'archive.pneu')).ino);
    // --check still lists it; a note with one name is rewritten as before.
    const checked = io(dir);
    expect(await run(['fmt', '--check', 'today.pneu'], checked)).toBe(1);
    expect(checked.out()).toBe('today.pneu\n');
    writeFileSync(join(dir, 'single.pneu'), messy);
    expect(await run(['fmt', '--write', 'single.pneu'], io(dir))).toBe(0);
    expect(readFileSync(join(dir, 'single.pneu'), 'utf8')).toBe(tidy);
  });
});

describe('fmt --write on a note with a long name', () => {
  it('rewrites it: the temporary file beside it must fit the file system\'s limit on a name too', async () => {
    const dir = tempDir();
    // 250 bytes, under the usual limit of 255 bytes a name.
    const name = `${'ward-'.repeat(49)}.pneu`;
    writeFileSync(join(dir, name), messy);
    const out = io(dir);
    expect(await run(['fmt', '--write', name], out)).toBe(0);
    expect(out.err()).toBe('');
    expect(readFileSync(join(dir, name), 'utf8')).toBe(tidy);
    expect(readdirSync(dir)).toEqual([name]);
  });
});

describe('fmt --check and --write on what is not a regular file', () => {
  // /dev/zero never ends: read whole, it would fill the memory before anything is said.
  it.skipIf(process.platform !== 'linux')('say so at once and go on with the notes, without reading it whole', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'n.pneu'), messy);
    for (const mode of ['--check', '--write']) {
      const out = io(dir);
      expect(await run(['fmt', mode, '/dev/zero', 'n.pneu'], out), mode).toBe(2);
      // The path is shown from the working folder (../../dev/zero).
      expect(out.err(), mode).toMatch(/^pneumark: (\.\.\/)*dev\/zero: is not a regular file \(a device, pipe or socket\); fmt --check and --write work on files, `pneumark fmt PATH` prints it formatted\n$/);
    }
    expect(readFileSync(join(dir, 'n.pneu'), 'utf8')).toBe(tidy);
  });
});
