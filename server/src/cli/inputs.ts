/**
 * Finding and reading the notes a command was given: files, folders (every `.pneu` below
 * them, in a stable order) and `-` for standard input. Unreadable, binary or huge files give
 * a one-line problem and the run goes on.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

export const MAX_NOTE_BYTES = 20 * 1024 * 1024;
export const NOTE_EXTENSION = '.pneu';

export interface NoteInput {
  /** As shown to the user: relative to the working directory, or `<stdin>`. */
  readonly path: string;
  readonly text: string | null;
  /** Why the note could not be read, when it could not. */
  readonly problem: string | null;
}

export function listInputs(paths: readonly string[], cwd: string): { files: string[]; problems: NoteInput[] } {
  const files: string[] = [];
  const problems: NoteInput[] = [];
  for (const p of paths) {
    if (p === '-') { files.push('-'); continue; }
    const abs = join(cwd, p) === p ? p : p.startsWith('/') ? p : join(cwd, p);
    let stat;
    try {
      stat = statSync(abs);
    } catch {
      problems.push({ path: p, text: null, problem: 'no such file or folder' });
      continue;
    }
    if (stat.isDirectory()) files.push(...walk(abs).map((f) => relative(cwd, f) || f));
    else files.push(p);
  }
  return { files, problems };
}

function walk(dir: string): string[] {
  const out: string[] = [];
  let entries;
  try {
    entries = readdirSync(dir, { withFileTypes: true });
  } catch {
    return out;
  }
  entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  for (const e of entries) {
    if (e.name === 'node_modules' || e.name.startsWith('.')) continue;
    const full = join(dir, e.name);
    if (e.isDirectory()) out.push(...walk(full));
    else if (e.isFile() && e.name.endsWith(NOTE_EXTENSION)) out.push(full);
  }
  return out;
}

export function readNote(path: string, cwd: string, stdin: () => Buffer): NoteInput {
  let bytes: Buffer;
  try {
    if (path === '-') bytes = stdin();
    else {
      const abs = path.startsWith('/') ? path : join(cwd, path);
      const size = statSync(abs).size;
      if (size > MAX_NOTE_BYTES) return { path, text: null, problem: `too large to check (${(size / 1048576).toFixed(1)} MB; the limit is ${MAX_NOTE_BYTES / 1048576} MB)` };
      bytes = readFileSync(abs);
    }
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    return { path: path === '-' ? '<stdin>' : path, text: null, problem: code === 'EACCES' ? 'permission denied' : code === 'EISDIR' ? 'is a folder' : `cannot be read (${code ?? 'unknown error'})` };
  }
  const shown = path === '-' ? '<stdin>' : path;
  if (bytes.length > MAX_NOTE_BYTES) return { path: shown, text: null, problem: `too large to check (the limit is ${MAX_NOTE_BYTES / 1048576} MB)` };
  if (looksBinary(bytes)) return { path: shown, text: null, problem: 'looks like a binary file, not a note' };
  let text = bytes.toString('utf8');
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  return { path: shown, text, problem: null };
}

/** A NUL byte in the first 8 KiB marks a binary file (as git does). */
export function looksBinary(bytes: Buffer): boolean {
  const n = Math.min(bytes.length, 8192);
  for (let i = 0; i < n; i++) if (bytes[i] === 0) return true;
  return false;
}
