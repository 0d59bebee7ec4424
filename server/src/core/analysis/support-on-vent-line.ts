/**
 * NIV or CPAP written on a vent line (`vent mode NIV, ipap 16, epap 5`, `vent cpap 8`). In this
 * format NIV and CPAP are written on oxygen lines (`oxygen niv ipap 16, epap 5`, `oxygen cpap 8`),
 * so their pressures on a vent line are unknown keys (PN201). Where the line is plainly NIV or CPAP
 * and nothing else, `supportLineMove` writes it as that oxygen line; where it also holds what only a
 * vent line takes, it says so and moves nothing: a vent line with a setting ends the support, so
 * moving part of it would change what the note says (our rule, no source).
 *
 * The ventilator's mode CPAP (`vent mode CPAP, peep 8`) is a mode of this format, with its level
 * written `peep`: a line in that mode is the ventilator's, and is not moved.
 */
import { canonicalWord, fieldById, fieldFor, FIELDS } from '../fields/registry';
import type { ItemNode, LineEdit } from '../syntax/tree';
import { isBlank, squeezeBlanks } from '../syntax/blanks';
import { ITEM_COLUMN } from '../syntax/layout';
import { supportOfDevice, supportOfPressure, type NoninvasiveSupport } from './noninvasive-support';

/** What a vent line holding NIV or CPAP is offered (see `supportLineMove`). */
export type SupportLineMove =
  /** The line as the oxygen line: `newText` in place of the whole line, `shown` its content as people read it. */
  | { readonly kind: 'move'; readonly edit: LineEdit; readonly shown: string; readonly support: NoninvasiveSupport }
  /** The line names NIV (`mode NIV`, `niv`) but also holds keys an oxygen line does not take (`vt`, `rate`). */
  | { readonly kind: 'kept'; readonly blockers: readonly string[]; readonly named: boolean };

/** A word of the device field that names NIV or CPAP (`niv`, `bilevel`, `cpap`, in any case), as its support; else null. */
function supportWord(word: string): NoninvasiveSupport | null {
  const device = canonicalWord(fieldById('device')!, word);
  return device === null ? null : supportOfDevice(device);
}

/** Whether a key is a key of some line (of any section), in any case. */
function isKeyOfSomeLine(key: string): boolean {
  const lower = key.toLowerCase();
  return FIELDS.some((f) => f.aliases.includes(lower));
}

/** Whether an unknown key of a vent line is one of NIV or CPAP: a pressure of an oxygen line (`ipap`, `epap`, `level`) or a device word (`niv`, `cpap`). */
export function isSupportKeyOnVentLine(key: string): boolean {
  const field = fieldFor('oxygen', key.toLowerCase());
  return (field !== undefined && supportOfPressure(field.id) !== null) || supportWord(key) !== null;
}

/** Whether an item of a vent line is NIV or CPAP: the mode NIV (or bilevel), or an unknown key that `isSupportKeyOnVentLine`. */
export function isSupportItem(item: ItemNode): boolean {
  if (item.field?.id === 'mode') return item.value?.kind === 'word' && supportWord(item.value.text) === 'niv';
  return item.field === null && item.key !== null && isSupportKeyOnVentLine(item.key.text);
}

/**
 * The vent line `lineText` (its items `lineItems`) written as the oxygen line of the NIV or CPAP it
 * holds; null where it holds none, or not plainly one. The device comes from the mode (`mode NIV`,
 * `mode bilevel`: the word as written, in lower case), from a device word written as a key (`niv`,
 * `cpap 8`, with the level after it), else from the pressures (`ipap` or `epap`: `niv`; `level`:
 * `cpap`), and goes right after the section word; every other item stays as written, in its order,
 * with its unit, and the comment with it. Not moved (null): the mode CPAP (the ventilator's), two
 * devices, or pressures of both supports (one of them would be a pressure the support does not
 * give, PN318). Not moved either (`kept`, naming them) where the line holds keys of a line that an
 * oxygen line does not take (`vt`, `rate`, `peep`, `hr`); a word that is no key of any line (a
 * misspelt key) moves with the rest, to be offered its key there.
 */
export function supportLineMove(lineItems: readonly ItemNode[], lineText: string): SupportLineMove | null {
  let source: ItemNode | null = null;
  let sourceText = '';
  let sources = 0;
  let support: NoninvasiveSupport | null = null;
  let niv = false;
  let cpap = false;
  const blockers: string[] = [];
  for (let k = 0; k < lineItems.length; k++) {
    const item = lineItems[k]!;
    const key = item.key;
    if (key === null) return null;
    const lower = key.text.toLowerCase();
    if (item.field?.id === 'mode') {
      const word = item.value?.kind === 'word' ? item.value.text : null;
      const named = word === null ? null : supportWord(word);
      // The ventilator's CPAP mode is a mode of this format: the line is the ventilator's.
      if (named === 'cpap') return null;
      if (named === 'niv') {
        sources++;
        source = item;
        sourceText = word!.toLowerCase();
        support = named;
      } else blockers.push(key.text);
      continue;
    }
    const named = item.field === null ? supportWord(lower) : null;
    if (named !== null) {
      // `niv`, `bilevel`, `cpap` written as a key: with no value, or a CPAP level after `cpap`.
      if (item.value !== null && (named !== 'cpap' || item.valueKind !== 'number')) return null;
      sources++;
      source = item;
      sourceText = item.value === null ? lower : lineText.slice(key.span.start, item.span.end);
      support = named;
      continue;
    }
    const oxygen = fieldFor('oxygen', lower);
    if (oxygen !== undefined) {
      const of = supportOfPressure(oxygen.id);
      if (of === 'niv') niv = true;
      else if (of === 'cpap') cpap = true;
      continue;
    }
    if (item.field !== null || isKeyOfSomeLine(lower)) blockers.push(key.text);
  }
  if (sources > 1 || (niv && cpap)) return null;
  const fromPressures: NoninvasiveSupport | null = niv ? 'niv' : cpap ? 'cpap' : null;
  if (support !== null && fromPressures !== null && fromPressures !== support) return null;
  support ??= fromPressures;
  if (support === null) return null;
  if (blockers.length > 0) return { kind: 'kept', blockers, named: source !== null };
  // A section word with no blank after it (`vent,ipap 16`, PN105) is left to its own finding first.
  if (!blankAfterFirstWord(lineText)) return null;
  return moveOf(lineItems, lineText, source, source !== null ? sourceText : support, support);
}

/** The edit that writes the vent line as the oxygen line, the device `deviceText` right after the section word (see `supportLineMove`). */
function moveOf(lineItems: readonly ItemNode[], lineText: string, source: ItemNode | null, deviceText: string, support: NoninvasiveSupport): SupportLineMove {
  let sectionStart = 0;
  while (sectionStart < lineText.length && isBlank(lineText.charCodeAt(sectionStart))) sectionStart++;
  let sectionEnd = sectionStart;
  while (sectionEnd < lineText.length && !isBlank(lineText.charCodeAt(sectionEnd)) && lineText.charCodeAt(sectionEnd) !== 0x2c /* , */) sectionEnd++;
  let itemsStart = sectionEnd;
  while (itemsStart < lineText.length && isBlank(lineText.charCodeAt(itemsStart))) itemsStart++;
  // The section word laid out in the formatter's column (`vent      mode`) keeps its items there.
  const blanks = lineText.slice(sectionEnd, itemsStart);
  const padded = /^ +$/.test(blanks) && itemsStart === Math.max(ITEM_COLUMN, sectionEnd + 1);
  let text = `${lineText.slice(0, sectionStart)}oxygen${padded ? ' '.repeat(Math.max(1, ITEM_COLUMN - sectionStart - 'oxygen'.length)) : blanks}`;
  const afterDevice = source?.valueKind === 'number' ? ', ' : ' ';
  let from = itemsStart;
  if (source !== null && source === lineItems[0] && source.span.start === itemsStart) {
    if (source.field?.id === 'mode') {
      // `mode NIV, ipap 16` → `niv ipap 16`: the mode and the separator after it give way to the device.
      text += `${deviceText} `;
      from = separatorAfter(lineText, source.span.end);
    }
    // A device word written first as a key (`niv ipap 16`, `cpap 8`) is the device already.
  } else {
    text += `${deviceText}${afterDevice}`;
    if (source !== null) {
      // The device written later on the line is taken out, with the separator before it.
      const cut = separatorBefore(lineText, source.span.start);
      text += lineText.slice(from, cut);
      from = source.span.end;
    }
  }
  text += lineText.slice(from);
  const comment = text.indexOf('#');
  const shown = squeezeBlanks((comment >= 0 ? text.slice(0, comment) : text).trim());
  return { kind: 'move', edit: { span: { start: 0, end: lineText.length }, newText: text }, shown, support };
}

/** Whether the first word of a line (its section word) is followed by a blank. */
function blankAfterFirstWord(text: string): boolean {
  let at = 0;
  while (at < text.length && isBlank(text.charCodeAt(at))) at++;
  while (at < text.length && !isBlank(text.charCodeAt(at))) {
    if (text.charCodeAt(at) === 0x2c /* , */) return false;
    at++;
  }
  return at < text.length;
}

/** Where the blanks and the one comma after an item that ends at `end` end. */
function separatorAfter(text: string, end: number): number {
  let at = end;
  while (at < text.length && isBlank(text.charCodeAt(at))) at++;
  if (text.charCodeAt(at) === 0x2c /* , */) {
    at++;
    while (at < text.length && isBlank(text.charCodeAt(at))) at++;
  }
  return at;
}

/** Where the blanks and the one comma before an item that starts at `start` start. */
function separatorBefore(text: string, start: number): number {
  let at = start;
  while (at > 0 && isBlank(text.charCodeAt(at - 1))) at--;
  if (text.charCodeAt(at - 1) === 0x2c /* , */) {
    at--;
    while (at > 0 && isBlank(text.charCodeAt(at - 1))) at--;
  }
  return at;
}
