/**
 * The message for a note over `pneumark.maxNoteSizeKb` (its diagnostic, and what the trend view
 * says instead of charts): the limit in KB, the note's size in KB under 1 MB and in MB from there,
 * with the decimals that keep it over the limit, and what to do about it.
 */
import { formatAgainst } from '../core/util/format';
import { MAX_NOTE_SIZE_KB } from './settings';

const KB = 1024;
const MB = 1024 * 1024;

export function tooLargeMessage(noteBytes: number, maxNoteBytes: number): string {
  const limitKb = Math.round(maxNoteBytes / KB);
  const shown = noteBytes < MB
    ? `${formatAgainst(noteBytes / KB, 0, maxNoteBytes / KB)} KB`
    : `${formatAgainst(noteBytes / MB, 1, maxNoteBytes / MB)} MB`;
  const size = `Pneumark does not analyse notes over ${limitKb} KB (this one is ${shown})`;
  // At the largest limit there is no higher one to offer.
  return maxNoteBytes >= MAX_NOTE_SIZE_KB * KB
    ? `${size}, the most pneumark.maxNoteSizeKb allows: split it into smaller notes, or run \`pneumark check\` on it.`
    : `${size}: split it into smaller notes, or raise pneumark.maxNoteSizeKb.`;
}
