/**
 * Watches, for the language server, the folders whose `pneumark.config.json` decides an open
 * note's settings but that the editor's own file watcher does not cover: the folders above the
 * workspace (a shared parent folder) and, without a workspace, all of them. An editor that can
 * be told what to watch reports changes inside its workspace folders (`workspace/didChangeWatchedFiles`),
 * so those folders are not watched here; for one that cannot (Neovim 0.7), they are.
 *
 * Each note names the folders it needs (`need`); a folder is watched (Node's `fs.watch`: inotify
 * on Linux, nothing that polls) while some open note needs it, and let go when none does. Events
 * about a file of another name are ignored; those about the project file are gathered for a short
 * while (an editor's save is often a write and a rename) and then reported once. A folder that
 * cannot be watched (ENOSPC when the system's watches are used up, EACCES, a folder that is
 * removed or moved) is logged once and counted as unwatched (`watchesAll` is false for the notes
 * that need it): the server looks at those notes' project files again when a note is opened or
 * saved, and tries to watch the folder again the next time a note needs it.
 *
 * A project file may be a symbolic link to a shared file elsewhere: a change of that file makes no
 * event in the link's folder, so the folder of the file it leads to (`linkTargetOf`) is watched
 * too, for events about that file only, with the note's other folders and let go with them. So is
 * the folder where a link that leads to nothing yet would lead (`missingLinkTargetOf`), in each
 * folder the lookup passes through, so that the note reads the file once it is made; where that
 * folder does not exist either, the nearest folder above it that does is watched for the first
 * missing one, and each change there moves the watch down as the folders appear.
 */
import { lstatSync, readlinkSync, realpathSync, statSync, watch } from 'node:fs';
import { basename, dirname, join, resolve, sep } from 'node:path';
import { CONFIG_FILE_NAME } from '../core/config';
import { LOOKUP_DEPTH } from '../node/project-config';

/** Whether `dir` is one of `folders` or inside one. */
export function insideFolders(dir: string, folders: readonly string[]): boolean {
  for (const folder of folders) {
    if (dir === folder) return true;
    const prefix = folder.endsWith(sep) ? folder : folder + sep;
    if (dir.startsWith(prefix)) return true;
  }
  return false;
}

/**
 * The folders to watch for a note: those the lookup reads (`ProjectConfigs.forPath`), from the
 * note's folder up to the one whose project file applies (a file above that one changes nothing),
 * or up to the root when none does, leaving out the workspace folders the editor watches and
 * everything inside them.
 */
export function foldersToWatch(notePath: string, found: string | null, workspaceFolders: readonly string[]): string[] {
  const last = found === null ? null : dirname(found);
  const dirs: string[] = [];
  let dir = dirname(notePath);
  for (let depth = 0; depth < LOOKUP_DEPTH; depth++) {
    if (!insideFolders(dir, workspaceFolders)) dirs.push(dir);
    if (dir === last) break;
    const parent = dirname(dir);
    if (parent === dir) break;
    dir = parent;
  }
  return dirs;
}

/**
 * The file a project file that is a symbolic link leads to (through every link on the way): a
 * change of it changes what the note reads, and makes no event in the link's folder. Null when
 * the file is not a link, or leads to nothing.
 */
export function linkTargetOf(configPath: string | null): string | null {
  if (configPath === null) return null;
  try {
    return lstatSync(configPath).isSymbolicLink() ? realpathSync.native(configPath) : null;
  } catch {
    return null;
  }
}

/** Links followed, at most, from a project file to what it leads to (as the system's own limit, ELOOP). */
const MAX_LINKS = 40;

/**
 * Where a project file that is a symbolic link to nothing (yet) would lead, through every link on
 * the way: the file whose making would give the note a project file to read. Where that file's
 * folder does not exist either, the first missing folder on the way to it instead (whose making is
 * the first step). The existing part of the path is given as it really is (its links resolved),
 * as `linkTargetOf` gives it. Null when the file is not a link, leads to a file, or cannot be
 * followed (a loop of links, a folder that may not be read).
 */
export function missingLinkTargetOf(configPath: string): string | null {
  return missingLinkOf(configPath)?.watch ?? null;
}

/** The file a link to nothing would lead to (`path`, its links on the way not resolved), and what to watch for it. */
function missingLinkOf(configPath: string): { readonly path: string; readonly watch: string } | null {
  let path = configPath;
  try {
    if (!lstatSync(path).isSymbolicLink()) return null;
  } catch {
    return null;
  }
  for (let hops = 0; hops < MAX_LINKS; hops++) {
    let stat;
    try {
      stat = lstatSync(path);
    } catch (error) {
      if ((error as { code?: unknown }).code !== 'ENOENT') return null;
      const watch = nearestMissing(path);
      return watch === null ? null : { path, watch };
    }
    if (!stat.isSymbolicLink()) return null;
    try {
      // A relative target is read from the link's real folder (`..` of a folder reached through a link is its real parent).
      path = resolve(realpathSync.native(dirname(path)), readlinkSync(path));
    } catch {
      return null;
    }
  }
  return null;
}

/** `path` (missing) with its nearest existing folder resolved, cut after the first part below it that is missing. */
function nearestMissing(path: string): string | null {
  let missing = path;
  for (let depth = 0; depth < LOOKUP_DEPTH * 4; depth++) {
    const parent = dirname(missing);
    if (parent === missing) return null;
    let real: string;
    try {
      real = realpathSync.native(parent);
    } catch (error) {
      if ((error as { code?: unknown }).code !== 'ENOENT') return null;
      missing = parent;
      continue;
    }
    // The parent exists now, but through a link that leads elsewhere it may be a file: nothing to watch in it.
    try {
      if (!statSync(real).isDirectory()) return null;
    } catch {
      return null;
    }
    return join(real, basename(missing));
  }
  return null;
}

/**
 * The files other than project files to watch for a note whose project file is `found`: the file
 * it leads to when it is a link, and, given the note's path, where each project file the lookup
 * passed over on its way up (from the note's folder to `found`'s) would lead if it is a link to
 * nothing yet (`missingLinkTargetOf`); in each case unless the editor reports changes of that
 * file itself (a file of the project file's name in a workspace folder).
 */
export function filesToWatch(found: string | null, workspaceFolders: readonly string[], notePath?: string): string[] {
  const files: string[] = [];
  const reported = (file: string) => basename(file) === CONFIG_FILE_NAME && insideFolders(dirname(file), workspaceFolders);
  const target = linkTargetOf(found);
  if (target !== null && !reported(target)) files.push(target);
  if (notePath === undefined) return files;
  const last = found === null ? null : dirname(found);
  let dir = dirname(notePath);
  for (let depth = 0; depth < LOOKUP_DEPTH && dir !== last; depth++) {
    const missing = missingLinkOf(join(dir, CONFIG_FILE_NAME));
    // The editor reports the making of a project file in a workspace folder (the last step, whatever folders come first).
    if (missing !== null && !reported(missing.path) && !files.includes(missing.watch)) files.push(missing.watch);
    const parent = dirname(dir);
    if (parent === dir) break;
    dir = parent;
  }
  return files;
}

/** What the watcher needs of `fs.watch` (replaced in tests). */
export interface WatchHandle {
  close(): void;
  on(event: 'error', listener: (error: Error) => void): unknown;
}
export type Watch = (dir: string, listener: (event: string, filename: string | null) => void) => WatchHandle;

const nodeWatch: Watch = (dir, listener) =>
  watch(dir, { persistent: false }, (event, filename) => listener(event, filename === null ? null : String(filename)));

export interface ConfigWatcherOptions {
  /** Milliseconds to gather events before reporting them (default 100). */
  readonly debounceMs?: number;
  readonly watch?: Watch;
  /** The folder's identity, to tell a folder that is gone or replaced (default: its inode). */
  readonly identity?: (dir: string) => number | null;
  /** Where problems go (each once). */
  readonly log?: (message: string) => void;
}

const GONE = 'the folder was removed or moved';

interface Watched {
  /** Each note that needs the folder, with the names of the files there it reads. */
  readonly owners: Map<string, ReadonlySet<string>>;
  handle: WatchHandle | null;
  identity: number | null;
}

function inodeOf(dir: string): number | null {
  try {
    return statSync(dir).ino;
  } catch {
    return null;
  }
}

function reasonOf(error: unknown): string {
  const code = (error as { code?: unknown } | null)?.code;
  return typeof code === 'string' ? code : error instanceof Error ? error.message : String(error);
}

export class ConfigWatcher {
  private readonly dirs = new Map<string, Watched>();
  private readonly owned = new Map<string, readonly string[]>();
  private readonly logged = new Set<string>();
  private timer: ReturnType<typeof setTimeout> | null = null;
  private readonly debounceMs: number;
  private readonly watch: Watch;
  private readonly identity: (dir: string) => number | null;
  private readonly log: (message: string) => void;

  /** `changed` is called (once per burst of events) when a watched folder's project file may have changed. */
  constructor(private readonly changed: () => void, options: ConfigWatcherOptions = {}) {
    this.debounceMs = options.debounceMs ?? 100;
    this.watch = options.watch ?? nodeWatch;
    this.identity = options.identity ?? inodeOf;
    this.log = options.log ?? (() => undefined);
  }

  /**
   * Sets the folders `owner` (a note) needs watched for their project file, and the other files it
   * reads (`files`: where its project file, a link, leads), in place of those it needed before.
   * True when a watch started: what was read in that folder before it may have changed since.
   */
  need(owner: string, dirs: readonly string[], files: readonly string[] = []): boolean {
    const before = this.owned.get(owner) ?? [];
    const names = new Map<string, Set<string>>();
    const add = (dir: string, name: string) => {
      const list = names.get(dir);
      if (list) list.add(name);
      else names.set(dir, new Set([name]));
    };
    for (const dir of dirs) add(dir, CONFIG_FILE_NAME);
    for (const file of files) add(dirname(file), basename(file));
    let started = false;
    for (const [dir, read] of names) {
      let watched = this.dirs.get(dir);
      if (!watched) {
        watched = { owners: new Map(), handle: null, identity: null };
        this.dirs.set(dir, watched);
      }
      watched.owners.set(owner, read);
      if (!watched.handle) started = this.start(dir, watched) || started;
    }
    for (const dir of before) if (!names.has(dir)) this.drop(owner, dir);
    if (names.size > 0) this.owned.set(owner, [...names.keys()]);
    else this.owned.delete(owner);
    return started;
  }

  /** `owner` needs no folder any more (its note is closed). */
  release(owner: string): void {
    this.need(owner, []);
  }

  /** Whether every folder `owner` needs is being watched. */
  watchesAll(owner: string): boolean {
    const dirs = this.owned.get(owner);
    return !dirs || dirs.every((dir) => this.dirs.get(dir)?.handle != null);
  }

  /** The notes that need a folder that is not being watched. */
  unwatched(): string[] {
    return [...this.owned.keys()].filter((owner) => !this.watchesAll(owner));
  }

  /** The folders being watched now. */
  watching(): string[] {
    return [...this.dirs].filter(([, w]) => w.handle !== null).map(([dir]) => dir);
  }

  /** Stops every watch. */
  close(): void {
    for (const watched of this.dirs.values()) watched.handle?.close();
    this.dirs.clear();
    this.owned.clear();
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
  }

  private start(dir: string, watched: Watched): boolean {
    try {
      watched.identity = this.identity(dir);
      const handle = this.watch(dir, (_event, filename) => this.heard(dir, handle, filename));
      handle.on('error', (error) => this.lost(dir, handle, reasonOf(error)));
      watched.handle = handle;
      return true;
    } catch (error) {
      watched.handle = null;
      this.logOnce(dir, reasonOf(error));
      return false;
    }
  }

  private heard(dir: string, handle: WatchHandle, filename: string | null): void {
    if (filename === null || this.reads(dir, filename)) {
      this.soon();
      return;
    }
    // An event named after the folder itself: it may have been removed or moved, which ends the watch silently.
    if (filename === basename(dir) && this.dirs.get(dir)?.handle === handle) {
      const now = this.identity(dir);
      if (now === null || now !== this.dirs.get(dir)?.identity) this.lost(dir, handle, GONE);
    }
  }

  /** Whether some note reads the file `name` in `dir`. */
  private reads(dir: string, name: string): boolean {
    const owners = this.dirs.get(dir)?.owners;
    if (!owners) return false;
    for (const read of owners.values()) if (read.has(name)) return true;
    return false;
  }

  /** A watch that has ended: the notes that need it fall back, and what they read is looked at again. */
  private lost(dir: string, handle: WatchHandle, reason: string): void {
    const watched = this.dirs.get(dir);
    handle.close();
    if (!watched || watched.handle !== handle) return;
    watched.handle = null;
    this.logOnce(dir, reason);
    this.soon();
  }

  private drop(owner: string, dir: string): void {
    const watched = this.dirs.get(dir);
    if (!watched) return;
    watched.owners.delete(owner);
    if (watched.owners.size > 0) return;
    watched.handle?.close();
    this.dirs.delete(dir);
  }

  private soon(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => {
      this.timer = null;
      this.changed();
    }, this.debounceMs);
    this.timer.unref?.();
  }

  private logOnce(dir: string, reason: string): void {
    // A folder that is gone is not a problem to report: nothing below it is left to read.
    if (reason === 'ENOENT' || reason === GONE) return;
    const message = `pneumark: cannot watch ${dir} for changes of ${CONFIG_FILE_NAME} (${reason}); a change there is noticed when a note below it is opened or saved.`;
    if (this.logged.has(message)) return;
    this.logged.add(message);
    this.log(message);
  }
}
