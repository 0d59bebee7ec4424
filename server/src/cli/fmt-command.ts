/**
 * `pneumark fmt`: the editor's formatter over files. `--check` lists notes whose layout would
 * change; `--write` rewrites them atomically (a note reached through a symbolic link where the link
 * leads) and never over a note that has syntax errors (unless --force), that is not UTF-8 text, or
 * that changed on disk while being formatted, nor over one with several names (hard links: the new
 * file would take one of them only) or whose owner and group the new file could not be given. Its
 * permissions are kept whatever the umask. A byte-order mark is kept, when printing too. Paths in
 * its messages have their control characters made visible (see `visible`); a note printed formatted
 * is the note itself, written as it is.
 */
import { accessSync, constants, statSync } from 'node:fs';
import { isAbsolute, join } from 'node:path';
import { z } from 'zod';
import { checkNote } from '../core/check-note';
import { formatNote } from '../core/service/format';
import { NotRegularFile, readSnapshot, writeIfUnchanged, type BeforeRename } from '../node/atomic-write';
import { binaryProblem, listInputs, looksBinary, MAX_NOTE_BYTES, readNote, readProblem, shownFilePath, stdinExcludedLine, utf8Problem } from './inputs';
import { excludeOption, EXIT, HELP, parse, stdinNameOption, UsageError, validate, type Io } from './args';
import { visible } from './visible';

const fmtOptions = z.object({
  check: z.boolean().default(false),
  write: z.boolean().default(false),
  force: z.boolean().default(false),
  exclude: excludeOption,
  stdinName: stdinNameOption,
}).refine((o) => !(o.check && o.write), { message: 'use either --check or --write, not both', path: ['check'] })
  // --force lets --write rewrite notes with syntax errors; elsewhere it would be silently ignored.
  .refine((o) => !o.force || o.write, { message: 'only applies to --write (it lets --write rewrite notes with syntax errors)', path: ['force'] });

const NOT_REGULAR = 'is not a regular file (a device, pipe or socket); fmt --check and --write work on files, `pneumark fmt PATH` prints it formatted';

/** Test hook for the race and interruption tests. */
export const fmtHooks: { beforeRename: BeforeRename | undefined } = { beforeRename: undefined };

export function runFmt(args: readonly string[], io: Io): number {
  const { positionals, values } = parse(args, { check: { type: 'boolean' }, write: { type: 'boolean' }, force: { type: 'boolean' }, exclude: { type: 'string', multiple: true }, 'stdin-name': { type: 'string' } });
  if (values.help) { io.stdout.write(`${HELP.fmt}\n`); return EXIT.ok; }
  const opts = validate(fmtOptions, { check: values.check, write: values.write, force: values.force, exclude: values.exclude, stdinName: values['stdin-name'] });
  if (positionals.length === 0) throw new UsageError('fmt needs at least one file, folder, pattern or - (stdin)');
  const stdinName = opts.stdinName === undefined ? null : shownFilePath(opts.stdinName, io.cwd);
  const { files, problems, stdinExcluded } = listInputs(positionals, io.cwd, opts.exclude, stdinName);
  for (const p of problems) io.stderr.write(`pneumark: ${visible(p.path)}: ${visible(p.problem ?? '')}\n`);

  if (!opts.check && !opts.write) {
    // Standard input counts as one note, excluded or not.
    const notes = files.length + (stdinExcluded === null ? 0 : 1);
    if (notes > 1) {
      throw new UsageError(`without --check or --write, fmt prints one note, and ${positionals.length === 1 ? `${visible(positionals[0]!)} holds` : 'these inputs hold'} ${notes}; add --check or --write to work on several`);
    }
    // A missing, unreadable or empty input has had its line above; there is nothing to print.
    if (problems.length > 0 || notes === 0) return EXIT.usage;
    if (stdinExcluded !== null) return passThrough(io, stdinExcludedLine(stdinExcluded, 'formatted'));
    const note = readNote(files[0]!, io.cwd, io.stdin, { keepBom: true, stdinName });
    if (note.text === null) {
      io.stderr.write(`pneumark: ${visible(note.path)}: ${visible(note.problem ?? '')}\n`);
      return EXIT.usage;
    }
    const bom = note.text.charCodeAt(0) === 0xfeff ? '\uFEFF' : '';
    io.stdout.write(bom + formatNote(bom ? note.text.slice(1) : note.text));
    return EXIT.ok;
  }

  // Left alone, as the file of that name would be in a folder formatted.
  if (stdinExcluded !== null) io.stderr.write(`pneumark: ${visible(stdinExcludedLine(stdinExcluded, opts.check ? 'checked' : 'formatted'))}\n`);
  let failed = problems.length > 0;
  let changed = 0;
  for (const file of files) {
    if (file === '-') {
      io.stderr.write('pneumark: fmt --check/--write works on files; use `pneumark fmt -` to print a formatted note\n');
      failed = true;
      continue;
    }
    const abs = isAbsolute(file) ? file : join(io.cwd, file);
    const shown = visible(file);
    let snapshot;
    try {
      snapshot = readSnapshot(abs);
    } catch (error) {
      io.stderr.write(`pneumark: ${shown}: ${error instanceof NotRegularFile ? NOT_REGULAR : visible(readProblem(abs, error))}\n`);
      failed = true;
      continue;
    }
    if (snapshot.size > MAX_NOTE_BYTES || looksBinary(snapshot.bytes)) {
      io.stderr.write(`pneumark: ${shown}: ${snapshot.size > MAX_NOTE_BYTES ? 'too large to format' : binaryProblem(snapshot.bytes)}\n`);
      failed = true;
      continue;
    }
    // Decoding other bytes would turn each into U+FFFD, and writing that back would damage the note.
    const notUtf8 = utf8Problem(snapshot.bytes);
    if (notUtf8 !== null) {
      io.stderr.write(`pneumark: ${shown}: ${notUtf8}; not ${opts.write ? 'rewritten' : 'checked'} (convert it to UTF-8 first)\n`);
      failed = true;
      continue;
    }
    const text = snapshot.text.charCodeAt(0) === 0xfeff ? snapshot.text.slice(1) : snapshot.text;
    const formatted = formatNote(text);
    if (formatted === text) continue;
    changed++;
    if (opts.check) {
      io.stdout.write(`${shown}\n`);
      continue;
    }
    // A note without write permission is kept as it is: the rename would replace it all the same,
    // defeating the permission (an archived or signed-off note is often made read-only on purpose).
    if (!writable(snapshot.realPath)) {
      io.stderr.write(`pneumark: ${shown}: read-only (no permission to write it); not rewritten\n`);
      failed = true;
      continue;
    }
    // A rename gives the new text to this name only: the note's other names would keep the old one.
    if (snapshot.links > 1) {
      io.stderr.write(`pneumark: ${shown}: has ${snapshot.links} names (hard links), which a rewritten file would separate; not rewritten\n`);
      failed = true;
      continue;
    }
    const syntaxErrors = checkNote(text).findings.filter((f) => f.severity === 'error' && /^PN1/.test(f.code));
    if (syntaxErrors.length > 0 && !opts.force) {
      io.stderr.write(`pneumark: ${shown}: not rewritten: ${syntaxErrors.length} syntax error${syntaxErrors.length === 1 ? '' : 's'}, first at line ${syntaxErrors[0]!.range.start.line + 1}; fix them or use --force\n`);
      failed = true;
      continue;
    }
    const bom = snapshot.text.charCodeAt(0) === 0xfeff ? '\uFEFF' : '';
    try {
      const outcome = writeIfUnchanged(abs, snapshot, bom + formatted, fmtHooks.beforeRename);
      if (outcome === 'changed-on-disk') {
        io.stderr.write(`pneumark: ${shown}: changed on disk while being formatted; left as it is\n`);
        failed = true;
      } else if (outcome === 'owner-not-kept') {
        io.stderr.write(`pneumark: ${shown}: owned by another user or group, which a rewritten file could not keep; not rewritten\n`);
        failed = true;
      } else {
        io.stdout.write(`formatted ${shown}\n`);
      }
    } catch (error) {
      io.stderr.write(`pneumark: ${shown}: could not be written (${visible(writeProblem(error))}); the original is intact\n`);
      failed = true;
    }
  }
  if (failed) return EXIT.usage;
  if (opts.check && changed > 0) {
    io.stderr.write(`${changed} note${changed === 1 ? '' : 's'} would be reformatted\n`);
    return EXIT.findings;
  }
  return EXIT.ok;
}

/** Whether a note may be rewritten: it has a write permission, and this process may write it. */
function writable(path: string): boolean {
  try {
    if ((statSync(path).mode & 0o222) === 0) return false;
    accessSync(path, constants.W_OK);
    return true;
  } catch {
    return false;
  }
}

/**
 * `fmt -` whose `--stdin-name` path is excluded: standard input written out as it came, byte for
 * byte (an editor that replaces its buffer with the output loses nothing), and `line` on
 * standard error. Only input too long to read whole is refused (exit 2, nothing written).
 */
function passThrough(io: Io, line: string): number {
  const bytes = io.stdin();
  if (bytes.length > MAX_NOTE_BYTES) {
    io.stderr.write(`pneumark: standard input: too large to pass through (the limit is ${MAX_NOTE_BYTES / 1048576} MB)\n`);
    return EXIT.usage;
  }
  // Text as text; other bytes (not UTF-8) as they are, never decoded.
  io.stdout.write(utf8Problem(bytes) === null ? bytes.toString('utf8') : bytes);
  io.stderr.write(`pneumark: ${visible(line)}\n`);
  return EXIT.ok;
}

/** Why the formatted note could not be put in place, in a few words (not the temporary file's name). */
function writeProblem(error: unknown): string {
  const code = (error as NodeJS.ErrnoException | null)?.code;
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied: its folder does not allow a new file beside it';
  if (code === 'ENOSPC') return 'no space left on the disk';
  if (code === 'EDQUOT') return 'disk quota exceeded';
  if (code === 'EROFS') return 'read-only file system';
  // Node's message ends with the call and the path (`, open '/notes/.a.pneu.pneumark-….tmp'`).
  if (!(error instanceof Error)) return String(error);
  const quote = error.message.indexOf(" '");
  const at = quote < 0 ? -1 : error.message.lastIndexOf(', ', quote);
  return at < 0 ? error.message : error.message.slice(0, at);
}
