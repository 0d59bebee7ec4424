/**
 * Finding and reading the notes a command was given: files, folders (every `.pneu` below them),
 * glob patterns, and `-` for standard input; minus what `--exclude` patterns and a `.pneuignore`
 * file in the working folder exclude (gitignore syntax). The list is sorted, so output order never
 * depends on the file system or on parallelism. Unreadable, binary or huge files give a one-line
 * problem and the run goes on.
 */
import { closeSync, existsSync, fstatSync, openSync, readFileSync, readSync, realpathSync, statSync } from 'node:fs';
import { isAbsolute, join, normalize, relative, sep } from 'node:path';
import ignore from 'ignore';
import { globSync, isDynamicPattern } from 'tinyglobby';

export const MAX_NOTE_BYTES = 20 * 1024 * 1024;
export const NOTE_EXTENSION = '.pneu';
export const IGNORE_FILE = '.pneuignore';

export interface NoteInput {
  /** As shown to the user: relative to the working directory, or `<stdin>`. */
  readonly path: string;
  readonly text: string | null;
  /** Why the note could not be read, when it could not. */
  readonly problem: string | null;
}

export interface InputList {
  /** Paths to read (relative to cwd where possible, forward slashes), or `-`. */
  readonly files: string[];
  readonly problems: NoteInput[];
}

const toPosix = (p: string) => p.split(sep).join('/');

export function listInputs(args: readonly string[], cwd: string, exclude: readonly string[] = []): InputList {
  const problems: NoteInput[] = [];
  const found = new Set<string>();
  let stdin = false;
  for (const arg of args) {
    if (arg === '-') { stdin = true; continue; }
    if (isDynamicPattern(arg)) {
      const matches = globSync(arg, { cwd, onlyFiles: true, dot: false, ignore: ['**/node_modules/**'], expandDirectories: false });
      if (matches.length === 0) problems.push({ path: arg, text: null, problem: 'no file matches this pattern' });
      for (const m of matches) found.add(toPosix(m));
      continue;
    }
    const abs = isAbsolute(arg) ? arg : join(cwd, arg);
    let stat;
    try {
      stat = statSync(abs);
    } catch {
      problems.push({ path: arg, text: null, problem: 'no such file or folder' });
      continue;
    }
    if (stat.isDirectory()) {
      const base = toPosix(relative(cwd, abs)) || '.';
      for (const m of globSync(`**/*${NOTE_EXTENSION}`, { cwd: abs, onlyFiles: true, dot: false, ignore: ['**/node_modules/**'] })) {
        found.add(base === '.' ? toPosix(m) : `${base}/${toPosix(m)}`);
      }
    } else {
      found.add(isAbsolute(arg) ? toPosix(relative(cwd, abs)) || toPosix(abs) : toPosix(normalize(arg)));
    }
  }
  const filter = exclusions(cwd, exclude);
  const files = onePathPerNote([...found].filter((f) => !filter(f)).sort(comparePaths), cwd);
  if (stdin) files.push('-');
  return { files, problems };
}

/**
 * Each note once, under the first of its paths in sorted order: a folder reached through a
 * symbolic link (or a note linked into a folder, or named twice) would otherwise be checked and
 * exported again, and a dataset would count its rows twice. A path that cannot be resolved is kept
 * (reading it reports why).
 */
function onePathPerNote(paths: readonly string[], cwd: string): string[] {
  const seen = new Set<string>();
  return paths.filter((path) => {
    let real: string;
    try {
      real = realpathSync.native(isAbsolute(path) ? path : join(cwd, path));
    } catch {
      return true;
    }
    if (seen.has(real)) return false;
    seen.add(real);
    return true;
  });
}

/** Byte-wise order of paths (the same on every machine and locale). */
function comparePaths(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** A predicate that says whether a path (relative to cwd) is excluded. */
function exclusions(cwd: string, exclude: readonly string[]): (path: string) => boolean {
  const rules = ignore();
  const file = join(cwd, IGNORE_FILE);
  if (existsSync(file)) {
    try {
      rules.add(readFileSync(file, 'utf8'));
    } catch {
      // an unreadable ignore file excludes nothing
    }
  }
  rules.add([...exclude]);
  return (path: string) => {
    const rel = path.startsWith('../') || isAbsolute(path) ? null : path.replace(/^\.\//, '');
    return rel !== null && rel !== '' && rules.ignores(rel);
  };
}

export function readNote(path: string, cwd: string, stdin: () => Buffer): NoteInput {
  let bytes: Buffer;
  const shown = path === '-' ? '<stdin>' : path;
  try {
    if (path === '-') bytes = stdin();
    else {
      // One open, then the size from the open file: a folder of notes is read with as few system
      // calls per note as the checks need (a path looked up once, not once for stat and again to read).
      const fd = openSync(isAbsolute(path) ? path : join(cwd, path), 'r');
      try {
        const stat = fstatSync(fd);
        if (stat.isDirectory()) return { path: shown, text: null, problem: 'is a folder' };
        if (stat.size > MAX_NOTE_BYTES) return { path: shown, text: null, problem: `too large to check (${(stat.size / 1048576).toFixed(1)} MB; the limit is ${MAX_NOTE_BYTES / 1048576} MB)` };
        bytes = stat.isFile() ? readAll(fd, stat.size) : readFileSync(fd);
      } finally {
        closeSync(fd);
      }
    }
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    if (code === 'EISDIR') return { path: shown, text: null, problem: 'is a folder' };
    const problem = code === 'EACCES' || code === 'EPERM' ? 'permission denied' : code === 'ENOENT' ? 'no such file or folder' : `cannot be read (${code ?? 'unknown error'})`;
    return { path: shown, text: null, problem };
  }
  if (bytes.length > MAX_NOTE_BYTES) return { path: shown, text: null, problem: `too large to check (the limit is ${MAX_NOTE_BYTES / 1048576} MB)` };
  if (looksBinary(bytes)) return { path: shown, text: null, problem: 'looks like a binary file, not a note' };
  let text = bytes.toString('utf8');
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  return { path: shown, text, problem: null };
}

/** The bytes of an open regular file of `size` bytes (fewer if it shrank meanwhile). */
function readAll(fd: number, size: number): Buffer {
  const bytes = Buffer.allocUnsafe(size);
  let read = 0;
  while (read < size) {
    const n = readSync(fd, bytes, read, size - read, read);
    if (n === 0) break;
    read += n;
  }
  return read === size ? bytes : bytes.subarray(0, read);
}

/** A NUL byte in the first 8 KiB marks a binary file (as git does). */
export function looksBinary(bytes: Buffer): boolean {
  const n = Math.min(bytes.length, 8192);
  for (let i = 0; i < n; i++) if (bytes[i] === 0) return true;
  return false;
}
