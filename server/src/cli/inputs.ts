/**
 * Finding and reading the notes a command was given: files and folders (every note below them
 * whose name ends in `.pneu`, in any case, skipping hidden folders and files and `node_modules`),
 * glob patterns, and `-` for standard input; minus what `--exclude` patterns and `.pneuignore` files
 * exclude (gitignore syntax: `--exclude` matched relative to the working folder, or for a note
 * outside it relative to the folder named on the command line; each `.pneuignore`, in the working
 * folder or in a folder on the way down to a note from the note's project folder (its
 * repository's root, else the folder of its `pneumark.config.json`), relative to its own folder,
 * as `.gitignore` files are). A file named on the command line is left out too when they exclude it. A path that
 * exists is always taken as a path, even when it looks like a pattern (`a[1].pneu`, `notes
 * (copy)`). The list is sorted, so output order never depends on the file system or on
 * parallelism. Unreadable, binary, non-UTF-8 or huge files give a one-line problem and the run goes
 * on; inputs that hold no note at all give a one-line problem too, so a run pointed at the wrong
 * folder does not pass.
 */
import { closeSync, constants, existsSync, fstatSync, lstatSync, openSync, readdirSync, readlinkSync, readSync, realpathSync, statSync, type BigIntStats, type Stats } from 'node:fs';
import { isUtf8 } from 'node:buffer';
import { basename, dirname, isAbsolute, join, normalize, relative, resolve, sep } from 'node:path';
import ignore, { type Ignore } from 'ignore';
import { globSync, isDynamicPattern, type FileSystemAdapter } from 'tinyglobby';
import { CONFIG_FILE_NAME } from '../core/config';
import { globstarsIn, MAX_GLOBSTARS, refuseEmptyPaths, UsageError } from './args';

/** The usage error of `--stdin-name` given while no input is `-`. */
export const STDIN_NAME_WITHOUT_STDIN = '--stdin-name names the note read from standard input, and - is not among the inputs; add - or leave --stdin-name out';

/** How a note read from standard input (`-`) is named in output, unless `--stdin-name` names it. */
export const STDIN_NAME = '<stdin>';

/**
 * How output names the note at `path` as a command lists it: `-` (standard input) by the path
 * `--stdin-name` gave (`stdinName`, as `shownFilePath` writes it), else as `<stdin>`; any other
 * path as it is.
 */
export function shownPath(path: string, stdinName: string | null): string {
  return path === '-' ? stdinName ?? STDIN_NAME : path;
}

/**
 * A file named on the command line as output names it: relative to the working folder (forward
 * slashes, `./` and `a/../` left out), also when it was named by its absolute path, unless that is
 * the working folder itself.
 */
export function shownFilePath(arg: string, cwd: string): string {
  return isAbsolute(arg) ? toPosix(relative(cwd, resolve(cwd, arg))) || toPosix(resolve(cwd, arg)) : toPosix(normalize(arg));
}

/** Test hook: lists a folder in place of `fs.readdirSync` (a folder root cannot be kept out of otherwise). */
export const inputHooks: { readdirSync: ((path: string, options: { withFileTypes: true }) => unknown) | undefined } = { readdirSync: undefined };

export const MAX_NOTE_BYTES = 20 * 1024 * 1024;
export const NOTE_EXTENSION = '.pneu';
export const IGNORE_FILE = '.pneuignore';

export interface NoteInput {
  /** As shown to the user: relative to the working directory, or `<stdin>` (the `--stdin-name` path when given). */
  readonly path: string;
  readonly text: string | null;
  /** Why the note could not be read, when it could not. */
  readonly problem: string | null;
}

export interface InputList {
  /** Paths to read (relative to cwd where possible, forward slashes), or `-`. */
  readonly files: string[];
  readonly problems: NoteInput[];
  /**
   * Why standard input is not among `files` though `-` was given: its `--stdin-name` path is
   * excluded, as a file of that path would be. Null otherwise.
   */
  readonly stdinExcluded: StdinExclusion | null;
}

/** The `--stdin-name` path of standard input that an exclusion leaves out, and what leaves it out. */
export interface StdinExclusion {
  /** The path, as `shownFilePath` writes it. */
  readonly path: string;
  /**
   * The `.pneuignore` file that leaves it out (relative to the working folder, or absolute when
   * outside it) with the line and pattern that match (`.pneuignore (line 2: drafts/)`), or
   * `--exclude` and the value that leaves it out (`--exclude drafts/`).
   */
  readonly by: string;
}

/**
 * The line a command writes on standard error when the note on standard input is left out
 * (`done`: what was not done to it, `checked`, `exported`, `formatted`).
 */
export function stdinExcludedLine(exclusion: StdinExclusion, done: string): string {
  return `the note on standard input was not ${done}: ${exclusion.path} is excluded by ${exclusion.by}`;
}

const toPosix = sep === '/' ? (p: string) => p : (p: string) => p.split(sep).join('/');

/** What one command-line argument brought in, for saying why nothing was found. */
interface ArgumentYield {
  readonly arg: string;
  readonly kind: 'folder' | 'file' | 'pattern';
  /** The folder its exclusion patterns are matched from when a note is outside the working folder. */
  readonly root: string;
  found: number;
  readonly excludedBy: Set<ExclusionSource>;
  /** For a file: the line of a `.pneuignore` that leaves it out, when one does. */
  ignoredBy: IgnoreLineHit | null;
}

type ExclusionSource = '--exclude' | typeof IGNORE_FILE;

/** The line of a `.pneuignore` file that leaves a note out (the last that matches it or a folder above it). */
interface IgnoreLineHit {
  readonly by: typeof IGNORE_FILE;
  /** The file, absolute. */
  readonly file: string;
  /** Its line, from 1, and the pattern written there. */
  readonly line: number;
  readonly pattern: string;
}

/** What leaves a note out: `--exclude`, or a line of a `.pneuignore` file. */
type Exclusion = { readonly by: '--exclude' } | IgnoreLineHit;

const BY_EXCLUDE: Exclusion = { by: '--exclude' };

/**
 * A `.pneuignore` line that leaves a note out, as messages name it: the file relative to the
 * working folder (absolute when outside it), the line and the pattern (`ward/.pneuignore (line 2:
 * drafts/)`).
 */
function ignoreLineText(hit: IgnoreLineHit, cwd: string): string {
  const rel = relative(cwd, hit.file);
  return `${toPosix(outside(rel) ? hit.file : rel)} (line ${hit.line}: ${hit.pattern})`;
}

/**
 * The notes `args` name, sorted, minus what the exclusions leave out. `stdinName` (`--stdin-name`,
 * as `shownFilePath` writes it) names the note read from standard input: `-` then takes the place
 * of a file of that name among the others (its place in the run names it in a redacted export),
 * where it otherwise comes last. Naming it without `-` among `args`, or naming a note that is
 * among the inputs too, is a usage error. When the exclusions leave out a file of that path, `-`
 * is left out too (`stdinExcluded` says why), and is not counted as an input that brought in nothing.
 */
export function listInputs(args: readonly string[], cwd: string, exclude: readonly string[] = [], stdinName: string | null = null): InputList {
  refuseEmptyPaths(args);
  if (stdinName !== null && !args.includes('-')) throw new UsageError(STDIN_NAME_WITHOUT_STDIN);
  const problems: NoteInput[] = [];
  /** Each path found, with the arguments that brought it in (the first decides its root). */
  const found = new Map<string, ArgumentYield[]>();
  const yields: ArgumentYield[] = [];
  let stdin = false;
  const walk = new WalkWatch();
  const add = (path: string, from: ArgumentYield) => {
    from.found++;
    const by = found.get(path);
    if (by === undefined) found.set(path, [from]);
    else by.push(from);
  };
  for (const arg of args) {
    if (arg === '-') { stdin = true; continue; }
    const abs = resolve(cwd, arg);
    // A path that exists is a path, whatever characters it has: `a[1].pneu` or `notes (copy)` must
    // not be read as patterns (and match other files, or nothing).
    let stat: Stats | null = null;
    let statError: unknown = null;
    try {
      stat = statSync(abs);
    } catch (error) {
      stat = null;
      statError = error;
    }
    if (stat === null && errorCode(statError) === 'ENOENT' && isDynamicPattern(arg)) {
      const from: ArgumentYield = { arg, kind: 'pattern', root: resolve(cwd, staticPrefix(arg)), found: 0, excludedBy: new Set(), ignoredBy: null };
      yields.push(from);
      walk.root = from.root;
      const matches = globSync(anyCaseExtension(arg), { cwd, onlyFiles: true, dot: false, ignore: ['**/node_modules/**'], expandDirectories: false, fs: walk.fs });
      if (matches.length === 0) problems.push({ path: arg, text: null, problem: 'no file matches this pattern' });
      for (const m of matches) add(toPosix(m), from);
      continue;
    }
    if (stat === null) {
      problems.push({ path: arg, text: null, problem: pathProblem(abs, statError) });
      continue;
    }
    if (stat.isDirectory()) {
      const from: ArgumentYield = { arg, kind: 'folder', root: abs, found: 0, excludedBy: new Set(), ignoredBy: null };
      yields.push(from);
      const base = toPosix(relative(cwd, abs)) || '.';
      walk.root = abs;
      // `.pneu` in any case: a note saved as NOTE.PNEU is a note (and on a case-insensitive disk,
      // the same name).
      for (const m of globSync(`**/*${NOTE_EXTENSION}`, { cwd: abs, onlyFiles: true, dot: false, caseSensitiveMatch: false, ignore: ['**/node_modules/**'], fs: walk.fs })) {
        add(base === '.' ? toPosix(m) : `${base}/${toPosix(m)}`, from);
      }
    } else if (/[/\\]$/.test(arg) && !(sep === '/' && arg.endsWith('\\'))) {
      // `resolve` drops a trailing slash, but opening `ward.pneu/` fails (ENOTDIR).
      problems.push({ path: arg, text: null, problem: TRAILING_SLASH });
    } else {
      const from: ArgumentYield = { arg, kind: 'file', root: dirname(abs), found: 0, excludedBy: new Set(), ignoredBy: null };
      yields.push(from);
      add(shownFilePath(arg, cwd), from);
    }
  }
  const ignoreFiles = new IgnoreFiles(cwd);
  const excludedBy = exclusions(cwd, exclude, ignoreFiles);
  const kept: string[] = [];
  for (const [path, by] of found) {
    const exclusion = excludedBy(path, by[0]!.root);
    if (exclusion === null) kept.push(path);
    else {
      for (const from of by) {
        from.excludedBy.add(exclusion.by);
        if (exclusion.by === IGNORE_FILE && from.kind === 'file') from.ignoredBy = exclusion;
      }
    }
  }
  // A folder below those named that cannot be listed would otherwise pass unnoticed, its notes
  // neither checked nor exported: it is a problem, unless an exclusion leaves out what it holds.
  for (const [folder, { code, root }] of [...walk.unreadable].sort(([a], [b]) => comparePaths(a, b))) {
    const shown = toPosix(relative(cwd, folder)) || '.';
    if (excludedBy(`${shown === '.' ? '' : `${shown}/`}note${NOTE_EXTENSION}`, root) !== null) continue;
    problems.push({ path: shown, text: null, problem: `folder cannot be read (${code === 'EACCES' || code === 'EPERM' ? 'permission denied' : code}); the notes in it are not read` });
  }
  // A pattern left out excludes nothing it says: the notes it names would be read unnoticed.
  for (const { file, line } of ignoreFiles.skipped) {
    problems.push({ path: toPosix(relative(cwd, file)), text: null, problem: `line ${line} holds more than ${MAX_GLOBSTARS} \`**\`, which makes matching take too long on deep folders; it is not used, so the notes it names are read` });
  }
  const files = onePathPerNote(kept.sort(comparePaths), cwd);
  // Standard input named by a path the exclusions leave out is left out as that file would be
  // (root: the file's folder, as for a file named on the command line).
  let stdinExcluded: StdinExclusion | null = null;
  if (stdin && stdinName !== null) {
    const exclusion = excludedBy(stdinName, dirname(resolve(cwd, stdinName)));
    if (exclusion !== null) stdinExcluded = { path: stdinName, by: exclusion.by === IGNORE_FILE ? ignoreLineText(exclusion, cwd) : `--exclude ${excludingValue(cwd, exclude, stdinName)}` };
  }
  if (files.length === 0 && !stdin && problems.length === 0) {
    // Nothing to read, and nothing said so far: a CI job pointed at the wrong folder must not pass.
    for (const from of yields) problems.push({ path: from.arg, text: null, problem: nothingFound(from, cwd) });
  }
  // Standard input left out by its name is not read at all.
  const readStdin = stdin && stdinExcluded === null;
  if (readStdin && stdinName !== null) {
    // Among the others by its name, as the file would be.
    if (files.includes(stdinName)) throw new UsageError(`--stdin-name ${stdinName} names a note that is among the inputs too; each note is read once: leave out one of the two`);
    let at = 0;
    while (at < files.length && comparePaths(files[at]!, stdinName) < 0) at++;
    files.splice(at, 0, '-');
  } else if (readStdin) files.push('-');
  return { files, problems, stdinExcluded };
}

/**
 * Which `--exclude` value leaves out `path` (a path as `shownFilePath` writes it, of a file named
 * on the command line), as typed: a path that holds it, else the last pattern that matches it
 * (a later `!pattern` would have taken it back). Only asked once `exclusions` has said that
 * `--exclude` leaves it out.
 */
function excludingValue(cwd: string, exclude: readonly string[], path: string): string {
  const abs = resolve(cwd, path);
  const { paths, patterns } = splitExclusions(cwd, exclude);
  const holding = paths.find(({ path: p }) => holds(p, abs));
  if (holding !== undefined) return holding.value;
  let rel = relative(cwd, abs);
  if (outside(rel)) rel = relative(dirname(abs), abs);
  for (let i = patterns.length - 1; i >= 0; i--) {
    const { pattern, value } = patterns[i]!;
    if (!pattern.startsWith('!') && exclusionPatterns([pattern]).ignores(toPosix(rel))) return value;
  }
  return patterns[patterns.length - 1]?.value ?? '';
}

/** Why an argument brought in no note (every argument brought in none). */
function nothingFound(from: ArgumentYield, cwd: string): string {
  const by = [...from.excludedBy].sort().join(' and ');
  if (from.kind === 'file') return `excluded by ${from.ignoredBy !== null ? ignoreLineText(from.ignoredBy, cwd) : by || 'an exclusion'}; no note left to read`;
  if (from.found === 0) return `no ${NOTE_EXTENSION} notes found in this folder (hidden folders and node_modules are skipped)`;
  const what = from.kind === 'folder' ? `${NOTE_EXTENSION} note${from.found === 1 ? '' : 's'} in this folder` : `file${from.found === 1 ? '' : 's'} this pattern matches`;
  return `no note left to read: the ${from.found === 1 ? '' : `${from.found} `}${what} ${from.found === 1 ? 'is' : 'are'} excluded by ${by || 'an exclusion'}`;
}

/** Whether a path made by `relative` leads out of its folder. */
function outside(rel: string): boolean {
  return rel === '..' || rel.startsWith(`..${sep}`) || isAbsolute(rel);
}

/**
 * A glob or exclusion pattern whose extension is `.pneu` (in any case), with that extension matched
 * in any case, as a folder scan matches it: `notes/*.pneu` finds `X.PNEU`, which `check notes`
 * finds too. The rest of the pattern is matched as written (`Ward*` is not `ward`, on a
 * case-sensitive file system).
 */
function anyCaseExtension(pattern: string): string {
  // White space after the extension is kept as it is (gitignore syntax drops it).
  const body = pattern.trimEnd();
  if (body.slice(-NOTE_EXTENSION.length).toLowerCase() !== NOTE_EXTENSION) return pattern;
  return `${body.slice(0, -NOTE_EXTENSION.length)}.[pP][nN][eE][uU]${pattern.slice(body.length)}`;
}

/** The part of a glob pattern before its first segment with pattern characters (`.` if none). */
function staticPrefix(pattern: string): string {
  const fixed: string[] = [];
  for (const segment of pattern.split('/')) {
    if (isDynamicPattern(segment)) break;
    fixed.push(segment);
  }
  const prefix = fixed.join('/');
  return prefix === '' ? (pattern.startsWith('/') ? '/' : '.') : prefix;
}
/**
 * Each note once, under the first of its paths in sorted order: a folder reached through a
 * symbolic link (or a note linked into a folder, a note with several names by hard links, or one
 * named twice) would otherwise be checked and exported again, and a dataset would count its rows
 * twice. A path that cannot be resolved is kept (reading it reports why).
 */
function onePathPerNote(paths: readonly string[], cwd: string): string[] {
  const seen = new Set<string>();
  const realFolders = new Map<string, string | null>();
  return paths.filter((path) => {
    const real = noteIdentity(isAbsolute(path) ? path : join(cwd, path), realFolders);
    if (real === null) return true;
    if (seen.has(real)) return false;
    seen.add(real);
    return true;
  });
}

/**
 * What names a file with more than one name (hard links) whichever name it is reached by: its
 * device and inode, as the file system numbers them (exact, as big integers); null for a file of
 * one name, which its real path names, or where the file system gives no inode number.
 */
function inodeName(stats: BigIntStats): string | null {
  return stats.isFile() && stats.nlink > 1n && stats.ino !== 0n ? `\u0000inode ${stats.dev}:${stats.ino}` : null;
}

/**
 * What names a note whichever path reaches it: its device and inode when it has several names
 * (`inodeName`), else its `realpath`; a symbolic link that leads nowhere, the link itself (its
 * folder's real path and its name); null when it cannot be resolved. A file that is not itself a
 * symbolic link is where its folder really is, under its own name: the folder is resolved once for all its notes
 * (`realFolders`) and the file costs one `lstat`, where resolving each path walks every folder
 * above it again (a system call per folder, per note).
 */
function noteIdentity(abs: string, realFolders: Map<string, string | null>): string | null {
  const name = basename(abs);
  let link = true;
  if (name !== '' && name !== '.' && name !== '..') {
    try {
      const stats = lstatSync(abs, { bigint: true });
      link = stats.isSymbolicLink();
      if (!link) {
        const inode = inodeName(stats);
        if (inode !== null) return inode;
      }
    } catch {
      link = true;
    }
  }
  const folder = dirname(abs);
  let real = realFolders.get(folder);
  if (real === undefined) {
    try {
      real = realpathSync.native(folder);
    } catch {
      real = null;
    }
    realFolders.set(folder, real);
  }
  try {
    if (link) return inodeName(statSync(abs, { bigint: true })) ?? realpathSync.native(abs);
    return real === null ? realpathSync.native(abs) : join(real, name);
  } catch {
    // A link that leads nowhere (to nothing, or round a loop) is itself where its folder really
    // is: reached by two paths (through a linked folder), it is one problem, not two.
    return link && real !== null ? `\u0000link ${join(real, name)}` : null;
  }
}

function errorCode(error: unknown): string | undefined {
  return (error as NodeJS.ErrnoException | null)?.code;
}

/**
 * What a folder walk met that it would otherwise pass over in silence (tinyglobby skips what it
 * cannot read): folders that cannot be listed, and symbolic links that lead nowhere (to nothing,
 * or round a loop). A link that leads nowhere is let through the walk as a file, so that the
 * pattern decides whether it is a note, and reading it then says what is wrong with it: a
 * dataset with a broken link has a note missing, which must not pass.
 */
class WalkWatch {
  /** Folders that could not be listed (absolute), with the error code and the `root` of the argument whose walk met them. */
  readonly unreadable = new Map<string, { readonly code: string; readonly root: string }>();
  /** The `root` of the argument being walked. */
  root = '';
  private readonly nowhere = new Set<string>();
  /** The real path of each folder a link was met in or below (null: it cannot be resolved). */
  private readonly realFolders = new Map<string, string | null>();

  /**
   * Whether the symbolic link at `path` (as the walk reached it) leads, as `real`, to a folder the
   * walk came through on its way from the root to the link: a loop (`up -> ..`). Everything in
   * that folder is walked already, so the link is not followed; followed, it would make the walk
   * go round once more and reach every note there again, by a path through the loop that sorts
   * first when the link's name does (`a-loop/ward/x.pneu`), which would then name the note, and
   * which exclusions anchored to the note's own path (`--exclude /ward/x.pneu`) do not match.
   * A link to a folder above the root is followed: its notes are reached no other way.
   */
  private leadsBack(path: string, real: string): boolean {
    const root = resolve(this.root);
    let folder = dirname(resolve(path));
    if (!holds(root, folder)) return false;
    for (;;) {
      let folderReal = this.realFolders.get(folder);
      if (folderReal === undefined) {
        try {
          folderReal = realpathSync(folder);
        } catch {
          folderReal = null;
        }
        this.realFolders.set(folder, folderReal);
      }
      if (folderReal === real) return true;
      if (folder === root) return false;
      const up = dirname(folder);
      if (up === folder) return false;
      folder = up;
    }
  }
  readonly fs: FileSystemAdapter = {
    readdirSync: ((path: string, options: { withFileTypes: true }) => {
      try {
        return (inputHooks.readdirSync ?? readdirSync)(path, options);
      } catch (error) {
        const folder = resolve(path);
        const code = errorCode(error) ?? 'unknown error';
        // A folder that does not exist holds no note to miss: the one a pattern starts from
        // (`nowhere/*.pneu`, which then matches nothing and says so), or one removed meanwhile.
        if (code !== 'ENOENT' && !this.unreadable.has(folder)) this.unreadable.set(folder, { code, root: this.root });
        throw error;
      }
    }) as unknown as FileSystemAdapter['readdirSync'],
    realpathSync: ((path: string) => {
      let real: string;
      try {
        real = realpathSync(path);
      } catch (error) {
        const code = errorCode(error);
        if (code !== 'ENOENT' && code !== 'ELOOP') throw error;
        this.nowhere.add(path);
        return path;
      }
      // The walk leaves a link alone when it throws here (it suppresses the error).
      if (this.leadsBack(path, real)) throw new Error(`${path} leads back to a folder the walk came through`);
      return real;
    }) as unknown as FileSystemAdapter['realpathSync'],
    statSync: ((path: string) => {
      if (this.nowhere.has(path)) return lstatSync(path);
      return statSync(path);
    }) as unknown as FileSystemAdapter['statSync'],
  };
}

/** Why a path named on the command line cannot be used, in a few words. */
/** A file named as a folder is (`ward.pneu/`). */
const TRAILING_SLASH = 'is a file, not a folder (leave out the last /)';

function pathProblem(abs: string, error: unknown): string {
  const code = errorCode(error);
  if (code === 'ENOENT' && abs.includes('\uFFFD') && undecodableName(abs)) return NAME_NOT_UTF8;
  if (code === 'ENOENT') return isLink(abs) ? `${LINK_TO_NOTHING} (${linkTarget(abs)})` : 'no such file or folder';
  if (code === 'ELOOP') return 'a loop of symbolic links';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied (a folder on the way to it cannot be searched)';
  if (code === 'ENOTDIR') return 'a part of the path is not a folder';
  if (code === 'ENAMETOOLONG') return 'the path is too long';
  return `cannot be read (${code ?? 'unknown error'})`;
}

/** Why a path cannot be read when it is a symbolic link to nothing; the link's target follows in brackets. */
const LINK_TO_NOTHING = 'a symbolic link to something that does not exist';

/**
 * A problem as `check --redact` writes it: the one problem that quotes a path (the target of a
 * symbolic link to nothing, which may name a patient as a file name can) with the path replaced by
 * `replacement`; the others are Pneumark's own words and stay.
 */
export function redactedProblem(problem: string, replacement: string): string {
  return problem.startsWith(`${LINK_TO_NOTHING} (`) ? `${LINK_TO_NOTHING} (${replacement})` : problem;
}

/** A file whose name is not UTF-8: listed (with U+FFFD for each bad byte), but not to be opened by that name. */
const NAME_NOT_UTF8 = 'its name is not UTF-8 (shown here with \uFFFD), so it cannot be opened by it; rename the file';

/** Whether the folder of `abs` holds a name that is not UTF-8 and reads as its last part. */
function undecodableName(abs: string): boolean {
  const name = basename(abs);
  try {
    return readdirSync(dirname(abs), { encoding: 'buffer' }).some((bytes) => !isUtf8(bytes) && bytes.toString('utf8') === name);
  } catch {
    return false;
  }
}

function isLink(abs: string): boolean {
  try {
    return lstatSync(abs).isSymbolicLink();
  } catch {
    return false;
  }
}

function linkTarget(abs: string): string {
  try {
    return readlinkSync(abs);
  } catch {
    return '?';
  }
}

/**
 * The order of paths by the bytes of their UTF-8 names, which is that of their code points (the
 * same on every machine and locale, and the order `LC_ALL=C sort` gives). JavaScript's `<` compares
 * UTF-16 code units, where a character above U+FFFF (an emoji: a surrogate pair, 0xD800–0xDFFF)
 * comes before U+E000–U+FFFF; in UTF-8 it comes after them.
 */
function comparePaths(a: string, b: string): number {
  const n = Math.min(a.length, b.length);
  for (let i = 0; i < n; i++) {
    const x = a.charCodeAt(i);
    const y = b.charCodeAt(i);
    if (x !== y) return codeUnitRank(x) - codeUnitRank(y);
  }
  return a.length - b.length;
}

/** A UTF-16 code unit's place in code point order: surrogates after U+E000–U+FFFF. */
function codeUnitRank(unit: number): number {
  return unit >= 0xd800 && unit <= 0xdfff ? unit + 0x2000 : unit >= 0xe000 ? unit - 0x800 : unit;
}

/**
 * Exclusion patterns (gitignore syntax) as `--exclude` and `.pneuignore` files give them: names
 * matched with their case as written, as git does on a case-sensitive file system (`Old/` does not
 * leave out `old/`: a dataset must not lose notes that nobody named), but a pattern's `.pneu`
 * extension in any case, as folder scans and patterns find notes (`*.pneu` leaves out `X.PNEU`).
 */
function exclusionPatterns(lines: readonly string[]): Ignore {
  return ignore({ ignorecase: false }).add(lines.map(anyCaseExtension));
}

/** The same for the lines of a `.pneuignore` file, each rule marked with its line number (from 1), so a match can name its line. */
function markedExclusionPatterns(lines: readonly string[]): Ignore {
  const rules: { pattern: string; mark: string }[] = [];
  lines.forEach((line, i) => { if (globstarsIn(line) <= MAX_GLOBSTARS) rules.push({ pattern: anyCaseExtension(line), mark: String(i + 1) }); });
  return ignore({ ignorecase: false }).add(rules);
}

/** Whether the path `held` is `folder` or lies below it (both absolute). */
function holds(folder: string, held: string): boolean {
  return held === folder || held.startsWith(folder.endsWith(sep) ? folder : folder + sep);
}

/**
 * Which exclusion (if any) leaves a note out. `--exclude` patterns (gitignore syntax) are matched
 * against the note's path relative to the working folder; a note outside the working folder is
 * matched by its path relative to `root`, the folder named on the command line that brought it in
 * (for a file, its folder; for a pattern, its fixed part), so `check ../notes --exclude old.pneu`
 * leaves out `../notes/old.pneu`. `.pneuignore` files are those of `IgnoreFiles`.
 */
function exclusions(cwd: string, exclude: readonly string[], ignoreFiles: IgnoreFiles): (path: string, root: string) => Exclusion | null {
  const split = splitExclusions(cwd, exclude);
  const paths = split.paths.map((p) => p.path);
  // No pattern excludes nothing: no need to ask of each note.
  const fromArgs: Ignore | null = split.patterns.length === 0 ? null : exclusionPatterns(split.patterns.map((p) => p.pattern));
  return (path: string, root: string) => {
    const abs = resolve(cwd, path);
    for (const p of paths) if (holds(p, abs)) return BY_EXCLUDE;
    let rel = relative(cwd, abs);
    const inCwd = !outside(rel);
    if (!inCwd) rel = relative(root, abs);
    if (rel === '' || outside(rel)) return null;
    const hit = ignoreFiles.leaveOut(abs, inCwd, root);
    if (hit !== null) return hit;
    if (fromArgs?.ignores(toPosix(rel))) return BY_EXCLUDE;
    return null;
  };
}

/**
 * `--exclude` values that name a file or folder by its absolute path (`--exclude /data/notes/old`,
 * as a shell's tab completion writes it), apart from gitignore patterns. In gitignore syntax a
 * leading `/` anchors a pattern to the working folder, so such a value would match nothing; it is
 * taken as an absolute path when the anchored reading (below the working folder) names nothing
 * that exists and the path does, or when neither exists and it holds no wildcard: then as both, an
 * absolute path and an anchored pattern (a note piped in with `--stdin-name` is often not saved
 * yet, nor its folder made). So are values that start with `./` or `../` (a path from the working
 * folder, as a shell's tab completion writes it), which gitignore syntax would match against
 * nothing; with a wildcard, `./` becomes the anchoring `/`. Everything at or below such a path is
 * left out. Each path and pattern comes with the value it was read from, as typed.
 */
function splitExclusions(cwd: string, exclude: readonly string[]): { paths: { path: string; value: string }[]; patterns: { pattern: string; value: string }[] } {
  const paths: { path: string; value: string }[] = [];
  const patterns: { pattern: string; value: string }[] = [];
  for (const value of exclude) {
    if (isAbsolute(value)) {
      const anchored = existsSync(join(cwd, value));
      const asPath = !anchored && (existsSync(value) || !isDynamicPattern(value));
      if (asPath) paths.push({ path: resolve(value), value });
      // Existing, the path is what it names; missing, it may name either.
      if (!asPath || !existsSync(value)) patterns.push({ pattern: value, value });
    } else if (/^\.\.?(\/|$)/.test(value)) {
      // `./draft.pneu`, `../notes/old`: a path from the working folder, which gitignore syntax
      // would match against nothing. A wildcard after `./` is anchored there, as a leading `/` is.
      if (!isDynamicPattern(value)) paths.push({ path: resolve(cwd, value), value });
      else if (value.startsWith('./')) patterns.push({ pattern: `/${value.replace(/^(\.\/)+/, '')}`, value });
      else patterns.push({ pattern: value, value });
    } else patterns.push({ pattern: value, value });
  }
  return { paths, patterns };
}

/** A `.pneuignore` file's patterns and where they are matched from. */
interface IgnoreLevel {
  readonly patterns: IgnoreFile;
  /** Its folder relative to the top (see `IgnoreFiles`), with a slash after it; empty for the top. */
  readonly prefix: string;
}

/** What the `.pneuignore` files from the top down to a folder say about what lies in it. */
interface FolderState {
  /** The folder relative to the top, with a slash after it; empty for the top. */
  readonly prefix: string;
  /** The files that apply in the folder, outermost first (its own last). */
  readonly levels: readonly IgnoreLevel[];
  /** The line that leaves the folder itself (or a folder between the top and it) out; null when none does. */
  readonly left: IgnoreLineHit | null;
}

/** A `.pneuignore` file read: where it is, its lines, and its patterns (each marked with its line number). */
interface IgnoreFile {
  readonly file: string;
  readonly lines: readonly string[];
  readonly patterns: Ignore;
}

/**
 * The `.pneuignore` files, read as git reads `.gitignore` files: one in each folder from the top
 * down to the note's folder. The top is the highest of: the note's project folder (the nearest
 * folder above it that holds `.git`, the root of its repository, or when none does, the nearest
 * that holds `pneumark.config.json`), the working folder for a note inside it, and the folder named
 * on the command line (for a note outside the working folder; or inside it, when the named folder
 * holds the working folder). So the files of a project apply to its notes from wherever they are
 * checked: `check ward-a` run inside `notes/`, or `check ../notes/ward-a` from beside it, reads
 * `notes/.pneuignore` and the project's own as `check notes` from the project's folder does. Each
 * file's patterns are matched relative to its own folder and apply only to what lies below it; a
 * deeper file decides over a shallower one (`!keep.pneu` takes back a `*.pneu` from above), and
 * nothing below a folder that is left out can be taken back. For a note outside the working
 * folder, the working folder's file applies too, first, matched relative to the folder named on
 * the command line. Each folder's file is read once per run and each folder worked out once,
 * whatever the number of notes in it: a scan of thousands of notes reads a file per folder, not
 * per note.
 */
class IgnoreFiles {
  private readonly read = new Map<string, IgnoreFile | null>();
  /** Lines left out of the `.pneuignore` files read, for holding more `**` than `MAX_GLOBSTARS`: file and 1-based line. */
  readonly skipped: { readonly file: string; readonly line: number }[] = [];
  private readonly folders = new Map<string, FolderState>();
  /** The state of a note's folder by how the note was reached (the top and the outer file follow from that). */
  private readonly noteFolders = new Map<string, FolderState>();
  /** Per folder, the nearest folder at or above it holding `.git`, and the nearest holding `pneumark.config.json`. */
  private readonly marks = new Map<string, { readonly git: string | null; readonly config: string | null }>();

  constructor(private readonly cwd: string) {}

  /** The line of a `.pneuignore` file that leaves out the note at `abs` (inside the working folder or not; brought in by `root`), or null. */
  leaveOut(abs: string, inCwd: boolean, root: string): IgnoreLineHit | null {
    const folder = dirname(abs);
    const key = `${inCwd ? '' : '>'}${root}\0${folder}`;
    let state = this.noteFolders.get(key);
    if (state === undefined) {
      state = this.folder(folder, this.top(folder, inCwd, root), inCwd ? null : root);
      this.noteFolders.set(key, state);
    }
    return state.left ?? leftOut(state.levels, `${state.prefix}${toPosix(basename(abs))}`);
  }

  /** The highest folder whose `.pneuignore` applies to notes in `folder`. */
  private top(folder: string, inCwd: boolean, root: string): string {
    const rootHolds = !outside(relative(root, folder));
    const named = !inCwd ? (rootHolds ? root : folder) : rootHolds && !outside(relative(root, this.cwd)) ? root : this.cwd;
    const project = this.projectOf(folder);
    return project !== null && !outside(relative(project, named)) ? project : named;
  }

  /** The project folder of notes in `folder`: the root of its repository, else the folder of its `pneumark.config.json`; null when there is neither. */
  private projectOf(folder: string): string | null {
    const marks = this.marksOf(folder);
    return marks.git ?? marks.config;
  }

  private marksOf(folder: string): { readonly git: string | null; readonly config: string | null } {
    const known = this.marks.get(folder);
    if (known !== undefined) return known;
    const parent = dirname(folder);
    const above = parent === folder ? { git: null, config: null } : this.marksOf(parent);
    const marks = {
      // `.git` is a folder in a repository's root, a file in a worktree or a submodule.
      git: existsSync(join(folder, '.git')) ? folder : above.git,
      config: isFile(join(folder, CONFIG_FILE_NAME)) ? folder : above.config,
    };
    this.marks.set(folder, marks);
    return marks;
  }

  /** `folder`'s state below `top`; `outerBase`: where the working folder's file is matched from for notes outside it. */
  private folder(folder: string, top: string, outerBase: string | null): FolderState {
    const key = `${outerBase ?? ''}\0${top}\0${folder}`;
    const known = this.folders.get(key);
    if (known !== undefined) return known;
    let state: FolderState;
    const rel = relative(top, folder);
    if (rel === '' || outside(rel)) {
      const outer = outerBase === null ? null : this.patternsIn(this.cwd);
      const own = this.patternsIn(folder);
      const levels: IgnoreLevel[] = [];
      // Matched relative to the folder named on the command line, which may lie below the top.
      const outerPrefix = outerBase === null ? '' : toPosix(relative(folder, outerBase));
      if (outer) levels.push({ patterns: outer, prefix: outerPrefix === '' || outside(outerPrefix) ? '' : `${outerPrefix}/` });
      if (own) levels.push({ patterns: own, prefix: '' });
      state = { prefix: '', levels, left: null };
    } else {
      const parent = this.folder(dirname(folder), top, outerBase);
      const prefix = `${toPosix(rel)}/`;
      const own = this.patternsIn(folder);
      state = {
        prefix,
        levels: own ? [...parent.levels, { patterns: own, prefix }] : parent.levels,
        left: parent.left ?? leftOut(parent.levels, prefix),
      };
    }
    this.folders.set(key, state);
    return state;
  }

  /**
   * The patterns of the folder's `.pneuignore`; null when it has none (or it cannot be read, or is
   * not a file: it then excludes nothing). Opened without waiting, and read only when it is a
   * regular file: a `.pneuignore` that is a pipe nobody writes to would hold the run up forever,
   * and one that is a link to /dev/zero would fill the memory.
   */
  private patternsIn(folder: string): IgnoreFile | null {
    let patterns = this.read.get(folder);
    if (patterns === undefined) {
      patterns = null;
      try {
        const fd = openSync(join(folder, IGNORE_FILE), constants.O_RDONLY | constants.O_NONBLOCK);
        try {
          const stat = fstatSync(fd);
          // A line with more `**` than `--exclude` takes is left out (see MAX_GLOBSTARS): a
          // .pneuignore comes with the notes, and could otherwise hold a run up for hours.
          if (stat.isFile()) {
            const lines = readAll(fd, stat.size).toString('utf8').split(/\r?\n/);
            const file = join(folder, IGNORE_FILE);
            lines.forEach((line, i) => { if (globstarsIn(line) > MAX_GLOBSTARS) this.skipped.push({ file, line: i + 1 }); });
            patterns = { file, lines, patterns: markedExclusionPatterns(lines) };
          }
        } finally {
          closeSync(fd);
        }
      } catch {
        patterns = null;
      }
      this.read.set(folder, patterns);
    }
    return patterns;
  }
}

/**
 * The line that leaves out `path` (a path relative to the top, a folder's with a slash after it)
 * by `levels` (outermost first, a deeper one deciding over a shallower), or null when they keep it.
 */
function leftOut(levels: readonly IgnoreLevel[], path: string): IgnoreLineHit | null {
  let left: IgnoreLineHit | null = null;
  for (const { patterns: { file, lines, patterns }, prefix } of levels) {
    // Only below its own folder (the working folder's file for notes outside it applies below the
    // folder named on the command line, which may be below the top).
    if (!path.startsWith(prefix) || path === prefix) continue;
    const verdict = patterns.test(path.slice(prefix.length));
    if (verdict.ignored) {
      const line = Number(verdict.rule?.mark ?? 0);
      left = { by: IGNORE_FILE, file, line, pattern: (lines[line - 1] ?? '').trim() };
    } else if (verdict.unignored) left = null;
  }
  return left;
}

function isFile(path: string): boolean {
  try {
    return statSync(path).isFile();
  } catch {
    return false;
  }
}

/** A note's bytes as read, before they are decoded: `bytes` null when they could not be read (`problem` says why). */
export interface NoteBytes {
  /** As shown to the user: relative to the working directory, or `<stdin>` (the `--stdin-name` path when given). */
  readonly path: string;
  readonly bytes: Buffer | null;
  readonly problem: string | null;
}

/**
 * Reads a note. Its bytes must be UTF-8 (a byte-order mark is allowed and left out of the text
 * unless `keepBom`): a note in another encoding gets a problem rather than text with replacement
 * characters, which would be checked, exported or formatted as something it does not say.
 */
export function readNote(path: string, cwd: string, stdin: () => Buffer, options: { readonly keepBom?: boolean; readonly stdinName?: string | null } = {}): NoteInput {
  return noteFromBytes(readNoteBytes(path, cwd, stdin, options.stdinName ?? null), options);
}

/**
 * The bytes of a note (`-`: standard input), or why they cannot be read: missing, a folder, over
 * MAX_NOTE_BYTES. The CLI reads them first to learn a note's size (a big note is analysed in a
 * worker thread of its own: see analyse-alone.ts), then decodes them with `noteFromBytes`.
 * `stdinName`: what names standard input (`--stdin-name`; see `shownPath`).
 */
export function readNoteBytes(path: string, cwd: string, stdin: () => Buffer, stdinName: string | null = null): NoteBytes {
  let bytes: Buffer;
  const shown = shownPath(path, stdinName);
  try {
    if (path === '-') bytes = stdin();
    else {
      // One open, then the size from the open file: a folder of notes is read with as few system
      // calls per note as the checks need (a path looked up once, not once for stat and again to read).
      const fd = openSync(isAbsolute(path) ? path : join(cwd, path), 'r');
      try {
        const stat = fstatSync(fd);
        if (stat.isDirectory()) return { path: shown, bytes: null, problem: 'is a folder' };
        if (stat.size > MAX_NOTE_BYTES) return { path: shown, bytes: null, problem: `too large to check (${(stat.size / 1048576).toFixed(1)} MB; the limit is ${MAX_NOTE_BYTES / 1048576} MB)` };
        // Anything else (a pipe, a device such as /dev/zero) has no size to go by and may never end.
        bytes = stat.isFile() ? readAll(fd, stat.size) : readUpTo(fd, MAX_NOTE_BYTES + 1);
      } finally {
        closeSync(fd);
      }
    }
  } catch (error) {
    return { path: shown, bytes: null, problem: readProblem(path === '-' ? null : isAbsolute(path) ? path : join(cwd, path), error) };
  }
  if (bytes.length > MAX_NOTE_BYTES) return { path: shown, bytes: null, problem: `too large to check (the limit is ${MAX_NOTE_BYTES / 1048576} MB)` };
  return { path: shown, bytes, problem: null };
}

/**
 * Why a note that `check`, `show` and `export` read holds nothing to work on: it is empty, or has
 * only blank lines (standard input with nothing piped in, a file left empty by an export that
 * failed). Reported as a problem, as an empty folder is, so a run fed nothing does not pass as
 * clean. `fmt` formats such a note as it is.
 */
export const NO_NOTE = 'holds no note (it is empty or has only blank lines)';

/** Whether a note's text is empty or blank (white space and byte-order marks only). */
export function isBlankNote(text: string): boolean {
  return !/\S/.test(text);
}

/** A note's text from its bytes, or why they are not a note (binary, not UTF-8). */
export function noteFromBytes(read: NoteBytes, options: { readonly keepBom?: boolean } = {}): NoteInput {
  const { path: shown, bytes } = read;
  if (bytes === null) return { path: shown, text: null, problem: read.problem };
  if (looksBinary(bytes)) return { path: shown, text: null, problem: binaryProblem(bytes) };
  const notUtf8 = utf8Problem(bytes);
  if (notUtf8 !== null) return { path: shown, text: null, problem: `${notUtf8}; convert it to UTF-8 to read it` };
  let text = bytes.toString('utf8');
  if (text.charCodeAt(0) === 0xfeff && options.keepBom !== true) text = text.slice(1);
  return { path: shown, text, problem: null };
}

/** Why a note could not be opened or read, in a few words (`abs` null for standard input). */
export function readProblem(abs: string | null, error: unknown): string {
  const code = errorCode(error);
  if (code === 'EISDIR') return 'is a folder';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied';
  if (abs !== null && (code === 'ENOENT' || code === 'ELOOP')) return pathProblem(abs, error);
  if (code === 'ENOENT') return 'no such file or folder';
  if (code === 'ENOTDIR') return abs !== null && /[/\\]$/.test(abs) && isFile(abs.slice(0, -1)) ? TRAILING_SLASH : 'a part of the path is not a folder';
  return `cannot be read (${code ?? 'unknown error'})`;
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

/**
 * The bytes of an open file read to its end, or the first `limit` of them: standard input and
 * files that are not regular files (a pipe, a device) have no size to go by, and `/dev/zero` or
 * `yes |` never end; a note longer than the limit is refused for its size anyway.
 */
export function readUpTo(fd: number, limit: number): Buffer {
  const chunks: Buffer[] = [];
  let total = 0;
  while (total < limit) {
    const chunk = Buffer.allocUnsafe(Math.min(1 << 16, limit - total));
    const n = readSync(fd, chunk, 0, chunk.length, null);
    if (n === 0) break;
    chunks.push(n === chunk.length ? chunk : chunk.subarray(0, n));
    total += n;
  }
  return Buffer.concat(chunks, total);
}

/**
 * Why bytes that `looksBinary` are not a note: text in UTF-16 or UTF-32 when a byte-order mark
 * says so and what follows reads as a note would in that encoding (Windows editors and PowerShell
 * 5's `>` save text as UTF-16), else a binary file.
 */
export function binaryProblem(bytes: Uint8Array): string {
  const [a, b, c, d] = [bytes[0], bytes[1], bytes[2], bytes[3]];
  const wide = (bits: 2 | 4, big: boolean): string | null =>
    readsAsText(bytes, bits, big) ? `is UTF-${bits * 8} text (${big ? 'big' : 'little'}-endian), not UTF-8: convert it to UTF-8 first` : null;
  let problem: string | null = null;
  if (a === 0xff && b === 0xfe) problem = c === 0 && d === 0 ? wide(4, false) : wide(2, false);
  else if (a === 0 && b === 0 && c === 0xfe && d === 0xff) problem = wide(4, true);
  else if (a === 0xfe && b === 0xff) problem = wide(2, true);
  else {
    // No mark (a script that wrote `utf-16-le`): said only of bytes that are plainly a note's text.
    for (const big of [false, true]) {
      if (problem === null && readsAsText(bytes, 2, big, 0)) problem = `is UTF-16 text (${big ? 'big' : 'little'}-endian, without a byte-order mark), not UTF-8: convert it to UTF-8 first`;
    }
  }
  return problem ?? 'looks like a binary file, not a note';
}

/**
 * Whether the code units after a byte-order mark (the first 2,048) read as a note would: no
 * control character but tab and line breaks, and mostly ASCII (sections, keys and numbers are).
 * Without a mark (`from` 0), more is asked, since nothing but the bytes says what they are: at
 * least 8 units, a line feed among them, and at least 9 in 10 of them ASCII.
 */
function readsAsText(bytes: Uint8Array, width: 2 | 4, big: boolean, from: number = width): boolean {
  let units = 0;
  let ascii = 0;
  let lineFeed = false;
  for (let at = from; at + width <= bytes.length && units < 2048; at += width, units++) {
    let unit = 0;
    for (let k = 0; k < width; k++) unit = unit * 256 + bytes[big ? at + k : at + width - 1 - k]!;
    if (unit < 0x20 && unit !== 0x09 && unit !== 0x0a && unit !== 0x0d) return false;
    if (unit < 0x80) ascii++;
    if (unit === 0x0a) lineFeed = true;
  }
  if (from > 0) return units > 0 && ascii * 2 >= units;
  return units >= 8 && lineFeed && ascii * 10 >= units * 9;
}

/** A NUL byte in the first 8 KiB marks a binary file (as git does). */
export function looksBinary(bytes: Buffer): boolean {
  const n = Math.min(bytes.length, 8192);
  for (let i = 0; i < n; i++) if (bytes[i] === 0) return true;
  return false;
}

/**
 * `null` for bytes that are UTF-8 text, otherwise what is wrong, with where (`is not UTF-8 text
 * (byte 0xE9 on line 3)`): a note saved as Latin-1 or Windows-1252 must be converted, not guessed at.
 */
export function utf8Problem(bytes: Uint8Array): string | null {
  if (isUtf8(bytes)) return null;
  const at = firstInvalidUtf8(bytes);
  if (at < 0) return 'is not UTF-8 text';
  let line = 1;
  for (let i = 0; i < at; i++) if (bytes[i] === 0x0a) line++;
  return `is not UTF-8 text (byte 0x${bytes[at]!.toString(16).toUpperCase().padStart(2, '0')} on line ${line})`;
}

/** The offset of the first byte that does not belong to a well-formed UTF-8 sequence, or -1. */
function firstInvalidUtf8(bytes: Uint8Array): number {
  const n = bytes.length;
  let i = 0;
  while (i < n) {
    const b = bytes[i]!;
    if (b < 0x80) { i++; continue; }
    const follow = b >= 0xc2 && b <= 0xdf ? 1 : b >= 0xe0 && b <= 0xef ? 2 : b >= 0xf0 && b <= 0xf4 ? 3 : 0;
    if (follow === 0) return i;
    // The second byte's range excludes overlong forms, surrogates and code points above U+10FFFF.
    const low = b === 0xe0 ? 0xa0 : b === 0xf0 ? 0x90 : 0x80;
    const high = b === 0xed ? 0x9f : b === 0xf4 ? 0x8f : 0xbf;
    for (let k = 1; k <= follow; k++) {
      const c = bytes[i + k];
      if (c === undefined || c < (k === 1 ? low : 0x80) || c > (k === 1 ? high : 0xbf)) return i;
    }
    i += follow + 1;
  }
  return -1;
}
