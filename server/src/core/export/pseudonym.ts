/**
 * What names a note in a redacted export (`export --redact`): its place among the notes of the
 * run, counted from 1 (`note-00001`), in place of its path. File names of a dataset can carry
 * identifiers (a name, a record number, a date), and so can anything derived from them, such as a
 * hash of the path in an id: a pseudonym made from the place alone carries no part of the name.
 */

/** Digits a pseudonym's number is padded to, so that up to 99,999 notes sort in their order. */
const PLACE_DIGITS = 5;

/** The pseudonym of the note at `place` (1 for the first note of the run). */
export function notePseudonym(place: number): string {
  if (!Number.isSafeInteger(place) || place < 1) throw new RangeError(`a note's place is a whole number from 1 (got ${place})`);
  return `note-${String(place).padStart(PLACE_DIGITS, '0')}`;
}
