/**
 * Oxygen devices written in more than one word (`room air`), and the runs of words near one: a
 * device of two words with a word misspelt (`room aor`, `rom air`) is read as unknown keys, which
 * the parser does not report as keys without a value (no unknown key is), and the reader reports
 * them once, with the device offered for all of them (analysis/read-value.ts).
 */
import { FIELDS } from './registry';
import { closest } from '../util/suggest';

export interface DevicePhraseDef {
  /** The device, by the spelling the registry maps these words to. */
  readonly device: string;
  /** Its words, lower case. */
  readonly words: readonly string[];
}

/** The device spellings of more than one word in the field registry, made once. */
export const DEVICE_PHRASES: readonly DevicePhraseDef[] = (() => {
  const words = FIELDS.find((f) => f.id === 'device')?.words ?? {};
  return Object.keys(words).filter((w) => w.includes(' ')).map((w) => ({ device: words[w]!, words: w.split(' ') }));
})();

/** `DEVICE_PHRASES` with the most words first, so that `nasal high flow` is read before `nasal`. */
export const DEVICE_PHRASES_LONGEST_FIRST: readonly DevicePhraseDef[] = [...DEVICE_PHRASES].sort((a, b) => b.words.length - a.words.length);

/**
 * The device of several words that the words `written` begin with, near it word by word as a
 * did-you-mean is (`closest`) and with at least one word misspelt (a device written right is read
 * as the device); null when there is none. `written(j)` gives the j-th word, or null where the run
 * of words ends (a comma, a number, a key, the end of the line).
 */
export function nearDevicePhrase(written: (j: number) => string | null): DevicePhraseDef | null {
  for (const phrase of DEVICE_PHRASES) {
    let misspelt = false;
    let fits = true;
    for (let j = 0; j < phrase.words.length && fits; j++) {
      const word = written(j);
      const want = phrase.words[j]!;
      fits = word !== null && (word.toLowerCase() === want || closest(word, [want]).length > 0);
      if (fits && word!.toLowerCase() !== want) misspelt = true;
    }
    if (fits && misspelt) return phrase;
  }
  return null;
}
