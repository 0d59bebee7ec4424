/**
 * What the server says on a `pneumark.config.json` with problems, by whether open notes read it.
 * A file that makes Pneumark use its defaults (invalid JSON, an invalid setting, a link to a file
 * that is not JSON, a file over 1 MB) says so while an open note reads it. Once every open note
 * below it reads a nearer project file instead, the file is still wrong and keeps its problems
 * (a note opened between the two would read it), but "Pneumark uses its defaults" would be untrue
 * of the notes open: its problems then say that those notes read a nearer file.
 */
import { CONFIG_FILE_NAME } from '../core/config';

/** The endings of problems (from core/config.ts and node/project-config.ts) that say the defaults apply. */
const USES_DEFAULTS = /(?:[;.] (?:Pneumark|it) uses its defaults(?: until this is fixed)?)\.$/;

/** Whether a problem's message says that Pneumark uses its defaults. */
export function saysDefaultsApply(message: string): boolean {
  return USES_DEFAULTS.test(message);
}

/**
 * A problem's message for a file that no open note reads, while open notes below it read a
 * nearer project file: the same problem, and what it changes said of the notes that would read it.
 */
export function supersededMessage(message: string): string {
  const match = USES_DEFAULTS.exec(message);
  if (!match) return message;
  const point = match[0].startsWith(';') ? ';' : '.';
  const head = message.slice(0, match.index);
  const tail = `the open notes below it read a nearer ${CONFIG_FILE_NAME}, and a note that reads this one gets Pneumark's defaults until it is fixed.`;
  return point === ';' ? `${head}; ${tail}` : `${head}. ${tail.charAt(0).toUpperCase()}${tail.slice(1)}`;
}
