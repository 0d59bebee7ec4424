/**
 * Writing a note back without ever losing it: the new text goes to a temporary file beside the
 * note (same folder, so the rename is atomic), is flushed, and replaces the note by rename only if
 * the note on disk is still exactly what was read. A write interrupted at any point leaves either
 * the original or the new note, never a mix; a note edited by someone else meanwhile is left alone.
 * A note reached through a symbolic link is written where the link leads (the temporary file goes
 * beside the real note, on its file system): the link stays a link, and the note it names changes.
 * The new file gets the note's permissions (whatever the umask) and its owner and group: root rewriting a colleague's
 * note leaves it theirs. A process that may not give the new file the note's owner or group (a user
 * who may write someone else's note, but not give a file away) writes nothing and says so
 * ('owner-not-kept'), rather than leave the note owned by whoever formatted it.
 */
import { closeSync, fchmodSync, fchownSync, fstatSync, fsyncSync, openSync, readFileSync, realpathSync, renameSync, statSync, unlinkSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';

export interface ReadSnapshot {
  readonly text: string;
  readonly bytes: Buffer;
  readonly mtimeMs: number;
  readonly size: number;
  /** The note's real path (symbolic links resolved) when it was read. */
  readonly realPath: string;
  /** How many names (hard links) the note has: a rename gives a new file to one of them only. */
  readonly links: number;
}

/** Thrown by `readSnapshot` for what is not a regular file (a device, pipe or socket). */
export class NotRegularFile extends Error {}

export function readSnapshot(path: string): ReadSnapshot {
  const realPath = realpathSync.native(path);
  // A device or a pipe may never end (/dev/zero): read whole, it would fill the memory.
  if (!statSync(realPath).isFile()) throw new NotRegularFile(realPath);
  const bytes = readFileSync(realPath);
  const stat = statSync(realPath);
  return { bytes, text: bytes.toString('utf8'), mtimeMs: stat.mtimeMs, size: stat.size, realPath, links: stat.nlink };
}

export type WriteOutcome = 'written' | 'changed-on-disk' | 'owner-not-kept';

/** Test hook: called after the temporary file is complete and before the rename. */
export type BeforeRename = (tempPath: string) => void;

export function writeIfUnchanged(path: string, snapshot: ReadSnapshot, text: string, beforeRename?: BeforeRename): WriteOutcome {
  // Renaming over a symbolic link would replace the link with a file and leave the note unchanged:
  // write the note the link leads to. A link that now leads elsewhere than when the note was read
  // counts as a change on disk.
  const real = realpathSync.native(path);
  if (real !== snapshot.realPath) return 'changed-on-disk';
  const temp = join(dirname(real), tempName(basename(real)));
  const note = statSync(real);
  const fd = openSync(temp, 'wx', note.mode & 0o777);
  try {
    const made = fstatSync(fd);
    if (made.uid !== note.uid || made.gid !== note.gid) {
      try {
        fchownSync(fd, note.uid, note.gid);
      } catch (error) {
        const code = (error as NodeJS.ErrnoException).code;
        if (code !== 'EPERM' && code !== 'EACCES') throw error;
        closeSync(fd);
        safeUnlink(temp);
        return 'owner-not-kept';
      }
    }
    // The mode given to open is cut by the umask (a group-writable note would lose its group's
    // write permission); set it in full, after the owner, whose change may clear some bits. Only
    // when it differs: a file system without Unix permissions (a FAT memory stick) gives every
    // file the same mode and may refuse a change.
    if ((fstatSync(fd).mode & 0o777) !== (note.mode & 0o777)) fchmodSync(fd, note.mode & 0o777);
    const data = Buffer.from(text, 'utf8');
    let offset = 0;
    while (offset < data.length) offset += writeSync(fd, data, offset, data.length - offset);
    fsyncSync(fd);
  } catch (error) {
    closeSync(fd);
    safeUnlink(temp);
    throw error;
  }
  closeSync(fd);
  try {
    beforeRename?.(temp);
    if (!unchanged(real, snapshot)) {
      safeUnlink(temp);
      return 'changed-on-disk';
    }
    renameSync(temp, real);
    return 'written';
  } catch (error) {
    safeUnlink(temp);
    throw error;
  }
}

/** The most bytes a file name may have on common file systems (ext4, XFS, APFS, NTFS in UTF-16 units). */
const NAME_MAX_BYTES = 255;

/**
 * The temporary file's name: the note's own in it where it fits (a leftover is then easy to place),
 * else the note's name cut to fit: a note whose name is near the limit must still be rewritable.
 */
function tempName(note: string): string {
  const suffix = `.pneumark-${process.pid}-${Date.now()}.tmp`;
  const room = NAME_MAX_BYTES - 1 - Buffer.byteLength(suffix);
  let kept = note;
  while (Buffer.byteLength(kept) > room) kept = kept.slice(0, Math.max(0, kept.length - Math.ceil((Buffer.byteLength(kept) - room) / 4)));
  // A cut between the two halves of a surrogate pair would leave half a character.
  if (/[\uD800-\uDBFF]$/.test(kept)) kept = kept.slice(0, -1);
  return `.${kept}${suffix}`;
}

function unchanged(path: string, snapshot: ReadSnapshot): boolean {
  try {
    const stat = statSync(path);
    if (stat.size !== snapshot.size || stat.mtimeMs !== snapshot.mtimeMs) return false;
    return readFileSync(path).equals(snapshot.bytes);
  } catch {
    return false;
  }
}

function safeUnlink(path: string): void {
  try {
    unlinkSync(path);
  } catch {
    // already gone
  }
}
