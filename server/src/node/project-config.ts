/**
 * Finds `pneumark.config.json` upward from a note's folder and reads it (cached by path and
 * modification time). Shared by the language server (notes by URI; only `file:` notes have a
 * project file) and the CLI (notes by path).
 */
import { lstatSync, readFileSync, realpathSync, statSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { CONFIG_FILE_NAME, parseProjectConfig, type ParsedConfig } from '../core/config';

/** The defaults, with one problem reported at the start of the file. */
function defaultsWith(message: string): ParsedConfig {
  return { settings: {}, hints: {}, problems: [{ message, range: { start: { line: 0, character: 0 }, end: { line: 0, character: 1 } } }] };
}

/**
 * Whether a project file that is a symbolic link leads to a JSON file. A link to any other file
 * (`/proc/self/environ`, `~/.aws/credentials`, a `.env`) is not read: a project checked out from
 * elsewhere could otherwise have Pneumark quote the start of that file in a message about its
 * JSON, in the editor and in a CI log. A link to another `.json` file (a team's shared settings) is
 * read as usual.
 */
function linksToJson(path: string): boolean {
  if (!lstatSync(path).isSymbolicLink()) return true;
  return /\.json$/i.test(basename(realpathSync.native(path)));
}

/** The file-system path of a `file:` note; null for any other URI. */
export function notePathOf(uri: string): string | null {
  if (!uri.startsWith('file:')) return null;
  try {
    return fileURLToPath(uri);
  } catch {
    return null;
  }
}

/** The depth to which the lookup climbs (folders above the note's, the note's own included). */
export const LOOKUP_DEPTH = 64;

export interface FoundConfig {
  readonly path: string;
  readonly config: ParsedConfig;
}

export class ProjectConfigs {
  private readonly cache = new Map<string, { mtimeMs: number; size: number; config: ParsedConfig }>();
  /** Folder → where its project file is (null: none above it); cleared by `invalidate`. */
  private readonly folders = new Map<string, string | null>();

  /** The project file for a note by URI; `fresh` looks again at every folder above it (see `forPath`). */
  forNote(uri: string, fresh = false): FoundConfig | null {
    const path = notePathOf(uri);
    return path === null ? null : this.forPath(path, fresh);
  }

  /**
   * The project file for a note at a file-system path (absolute). Where the note's folder was
   * looked up before, only the file found then is looked at again (its modification time and
   * size), and the folders above it again only when it is gone; `fresh` looks at every folder
   * again (a file may have been made nearer the note), a stat per folder.
   */
  forPath(notePath: string, fresh = false): FoundConfig | null {
    const start = dirname(notePath);
    const known = fresh ? undefined : this.folders.get(start);
    if (known === null) return null;
    if (known !== undefined) {
      const config = this.read(known);
      if (config) return { path: known, config };
    }
    let dir = start;
    let found: FoundConfig | null = null;
    for (let depth = 0; depth < LOOKUP_DEPTH; depth++) {
      const candidate = join(dir, CONFIG_FILE_NAME);
      const config = this.read(candidate);
      if (config) {
        found = { path: candidate, config };
        break;
      }
      const parent = dirname(dir);
      if (parent === dir) break;
      dir = parent;
    }
    this.folders.set(start, found?.path ?? null);
    return found;
  }

  /** What the project file at `path` says (read again only when it changed); null when there is no file. */
  file(path: string): ParsedConfig | null {
    return this.read(path);
  }

  /** Forgets cached files (after a change notification). */
  invalidate(): void {
    this.cache.clear();
    this.folders.clear();
  }

  private read(path: string): ParsedConfig | null {
    let stat;
    try {
      stat = statSync(path);
    } catch {
      return null;
    }
    if (!stat.isFile()) return null;
    const known = this.cache.get(path);
    if (known && known.mtimeMs === stat.mtimeMs && known.size === stat.size) return known.config;
    let config: ParsedConfig;
    try {
      config = !linksToJson(path)
        ? defaultsWith(`${CONFIG_FILE_NAME} is a symbolic link to a file whose name does not end in .json, so Pneumark does not read it; it uses its defaults.`)
        : stat.size > 1024 * 1024
          ? defaultsWith(`${CONFIG_FILE_NAME} is larger than 1 MB; Pneumark uses its defaults.`)
          : parseProjectConfig(readFileSync(path, 'utf8'));
    } catch (error) {
      config = defaultsWith(`${CONFIG_FILE_NAME} could not be read (${error instanceof Error ? error.message : String(error)}).`);
    }
    this.cache.set(path, { mtimeMs: stat.mtimeMs, size: stat.size, config });
    return config;
  }
}
