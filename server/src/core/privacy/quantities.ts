/**
 * Quantities: a number followed by a unit or a counting word (`250 500 1000 mL`, `Aug 1 g`) is
 * a quantity, not an identifier or a date. Units come from the field registry, plus the words of
 * doses, counts and durations that clinical prose uses.
 */
import { isKnownUnitSpelling } from '../fields/units';
import { isBlankChar } from './text';

/** Words after a number that make it a quantity (besides the units of the field registry). */
const QUANTITY_WORDS = new Set([
  'mg', 'mcg', 'ug', 'µg', 'g', 'kg', 'ml', 'l', 'units', 'unit', 'iu', 'u', 'mmol', 'mol', 'meq', 'tablets', 'tabs', 'puffs',
  'doses', 'times', 'x', 'h', 'hr', 'hrs', 'hours', 'min', 'mins', 'minutes', 's', 'sec', 'days', 'd', 'weeks', 'wk', 'months',
  'years', 'y', 'yr', 'yrs', 'cells', 'copies', 'per', 'breaths', 'beats', 'bpm', 'm', 'ft', 'cm', 'mm', 'steps', 'metres', 'meters',
]);

/** Unit spellings that are also everyday words after a number or a date (`… 2026 in clinic`, `… a day`). */
const EVERYDAY_WORDS = new Set(['in', 'a']);

/**
 * Whether a unit or a quantity word follows the number ending at `end` (`250 500 1000 mL`).
 * After an identifier cue (`afterCue`), `per` does not count (`MRN 1234567 per GP letter`).
 */
export function followedByUnit(text: string, end: number, afterCue = false): boolean {
  let i = end;
  while (i < text.length && i - end < 2 && isBlankChar(text.charCodeAt(i))) i++;
  if (i === end) return false;
  const start = i;
  while (i < text.length && i - start < 12 && !isBlankChar(text.charCodeAt(i)) && text.charAt(i) !== ',' && text.charAt(i) !== ';' && text.charAt(i) !== ')') i++;
  let word = text.slice(start, i);
  if (word.endsWith('.')) word = word.slice(0, -1);
  if (word.length === 0) return false;
  if (afterCue && word.toLowerCase() === 'per') return false;
  return isQuantityWord(word);
}

/** A unit or a quantity word (`mL`, `units`, `mg`). */
export function isQuantityWord(word: string): boolean {
  const lower = word.toLowerCase();
  return QUANTITY_WORDS.has(lower) || (!EVERYDAY_WORDS.has(lower) && isKnownUnitSpelling(word));
}

/**
 * A number with its unit glued on: `12500mL`, `25000units` (digits first, then a unit with a
 * lower-case letter: `1234567T` may be a check letter).
 */
export function isGluedQuantity(run: string): boolean {
  let k = 0;
  while (k < run.length && run.charCodeAt(k) >= 0x30 && run.charCodeAt(k) <= 0x39) k++;
  if (k === 0 || k === run.length) return false;
  const unit = run.slice(k);
  return unit !== unit.toUpperCase() && isQuantityWord(unit);
}

