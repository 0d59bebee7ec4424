/**
 * Reads one parsed item into a stated value in the field's canonical unit, and names what
 * stands in the way (unknown key, unknown or disallowed unit, a number that only makes
 * sense in another unit).
 */
import { canonicalWord, fieldById, fieldFor, FIELDS, keysInSection, type FieldDef } from '../fields/registry';
import { sectionById, SECTIONS, type SectionId } from '../fields/sections';
import { convert, HB_MMOL_PER_L, unitById, UNITS, unitsForSpelling, type UnitDef } from '../fields/units';
import type { ItemNode, LineFix, PairValue, Span } from '../syntax/tree';
import { inchesAfterFeet, isDashedPair, pairNumbers, thousandsReading } from '../syntax/parser';
import { scanNumber } from '../syntax/lexer';
import { formatNumber, wordList } from '../util/format';
import { closest, editDistance } from '../util/suggest';
import { nearDevicePhrase } from '../fields/device-phrases';
import { squeezeBlanks } from '../syntax/blanks';
import { renameKeepingColumns } from '../syntax/layout';
import { doubtBoundsAt, ordinaryBoundsAt, unitsWithin, within, type BoundsContext } from './bounds';
import type { StatedValue } from './model';
import { givesNoSetPressure, givesPressure, supportOfDevice, SUPPORT_PRESSURE_FIELDS } from './noninvasive-support';
import type { ReadIssue } from './read-issues';
import { isSupportItem, isSupportKeyOnVentLine, supportLineMove } from './support-on-vent-line';

export interface ReadContext extends BoundsContext {
  readonly gasUnit: 'mmHg' | 'kPa';
  /**
   * The patient's age (years) in force where the line is read, null when none: a bare height or
   * weight under 18 years is read against a child's size (`doubtBoundsAt`). The timeline takes it
   * from the whole header, or the whole timepoint, before reading their lines (`ageForReading`).
   */
  readonly ageYears: number | null;
}

/** Section ids and unit ids by index, and back: a stated value keeps its section and units as indexes in one number. */
const SECTION_IDS: readonly SectionId[] = SECTIONS.map((x) => x.id);
const UNIT_IDS: readonly string[] = UNITS.map((u) => u.id);
const SECTION_INDEX: ReadonlyMap<string, number> = new Map(SECTION_IDS.map((id, i) => [id, i]));
const UNIT_INDEX: ReadonlyMap<string, number> = new Map(UNIT_IDS.map((id, i) => [id, i]));

/**
 * The flags of a stated value: bit 0 the unit was implied, bit 1 usable, then the section's index,
 * the read unit's and the doubted unit's (plus 1; 0 for none), then whether the value is in force
 * only where stated.
 */
const IMPLIED_FLAG = 1;
const USABLE_FLAG = 2;
const SECTION_SHIFT = 2;
const SECTION_MASK = 0x1f;
const READ_UNIT_SHIFT = 7;
const DOUBT_SHIFT = 15;
const UNIT_MASK = 0xff;
const HERE_ONLY_FLAG = 1 << 23;
/** By section index: a measuring section, whose values are in force only where stated. */
const MEASURES: readonly boolean[] = SECTIONS.map((x) => x.kind === 'measure');

// The indexes must fit their bits (a table grown past them would mix the flags up).
if (SECTION_IDS.length > SECTION_MASK || UNIT_IDS.length >= UNIT_MASK) throw new Error('read-value: too many sections or units for the flags of a stated value');

/** A unit id as an index plus 1 (0: none), for the flags of a stated value. */
function unitCode(id: string | null): number {
  if (id === null) return 0;
  const index = UNIT_INDEX.get(id);
  if (index === undefined) throw new Error(`unknown unit ${id}`); // unreachable: units come from the table
  return index + 1;
}

/**
 * A stated value, one per value of a note, kept as long as the note: an object of one shape that
 * keeps its field (the item knows it too, but the checks and the timeline ask a value for its field
 * many times, and its item is one more object to reach). Its number, numbers or word share one
 * slot (a value has one of them), and its section, the unit it was read in, the unit it is doubted
 * to be in and its three flags one number (indexes into the tables of sections and units): a big
 * note keeps tens of thousands of these.
 */
class Stated implements StatedValue {
  /** The canonical number, the canonical numbers of a pair, or the canonical word; null when unread. */
  private readonly data: number | readonly number[] | string | null;
  /** See IMPLIED_FLAG and what follows it. */
  private readonly flags: number;

  constructor(
    readonly field: FieldDef,
    section: SectionId,
    readonly line: number,
    readonly item: ItemNode,
    value: number | null,
    parts: readonly number[] | null,
    word: string | null,
    readUnit: string | null,
    unitImplied: boolean,
    unitDoubt: string | null,
    usable: boolean,
  ) {
    this.data = value ?? parts ?? word;
    const sectionIndex = SECTION_INDEX.get(section)!;
    this.flags = (unitImplied ? IMPLIED_FLAG : 0) | (usable ? USABLE_FLAG : 0) | (sectionIndex << SECTION_SHIFT) |
      (unitCode(readUnit) << READ_UNIT_SHIFT) | (unitCode(unitDoubt) << DOUBT_SHIFT) | (MEASURES[sectionIndex] || field.reading ? HERE_ONLY_FLAG : 0);
  }

  get section(): SectionId {
    return SECTION_IDS[(this.flags >> SECTION_SHIFT) & SECTION_MASK]!;
  }

  get readUnit(): string | null {
    const code = (this.flags >> READ_UNIT_SHIFT) & UNIT_MASK;
    return code === 0 ? null : UNIT_IDS[code - 1]!;
  }

  get unitDoubt(): string | null {
    const code = (this.flags >> DOUBT_SHIFT) & UNIT_MASK;
    return code === 0 ? null : UNIT_IDS[code - 1]!;
  }

  get value(): number | null {
    return typeof this.data === 'number' ? this.data : null;
  }

  get parts(): readonly number[] | null {
    return typeof this.data === 'object' ? this.data : null;
  }

  get word(): string | null {
    return typeof this.data === 'string' ? this.data : null;
  }

  get unitImplied(): boolean {
    return (this.flags & IMPLIED_FLAG) !== 0;
  }

  get usable(): boolean {
    return (this.flags & USABLE_FLAG) !== 0;
  }

  get hereOnly(): boolean {
    return (this.flags & HERE_ONLY_FLAG) !== 0;
  }

  get fieldId(): string {
    return this.field.id;
  }

  /** The field's canonical unit; null for a word. */
  get unit(): string | null {
    return this.field.kind === 'word' ? null : this.field.unit ?? null;
  }
}

const EMPTY_ITEMS: readonly ItemNode[] = Object.freeze([]);

/**
 * Reads one item into a stated value in its field's canonical unit; problems met on the way are
 * appended to `issues` (`lineItems`, the items of its line, shape the fixes offered). Returns null
 * when there is nothing to state (unknown key, no value).
 */
export function readItem(item: ItemNode, section: SectionId, line: number, ctx: ReadContext, issues: ReadIssue[], lineItems: readonly ItemNode[] = EMPTY_ITEMS, lineText = ''): StatedValue | null {
  const field = item.field;
  if (!field) {
    if (item.key) {
      const issue = unknownKeyIssue(item, section, line, lineItems, lineText);
      if (issue) issues.push(issue);
    }
    return null;
  }
  // Read through the item's flat accessors: its value and unit are built only where needed.
  const kind = item.valueKind;
  if (kind === null) return null;

  if (field.kind === 'word') {
    // A field open to any word (a ventilator mode) still takes no number (`mode 10`).
    const text = item.value!.text;
    const word = field.openWords && (kind !== 'word' || isNumberText(text)) ? null : canonicalWord(field, text);
    if (word === null) {
      issues.push(unknownWordIssue(item, field, line, lineItems, lineText));
      return new Stated(field, section, line, item, null, null, null, null, false, null, false);
    }
    return new Stated(field, section, line, item, null, null, word, null, false, null, true);
  }

  if ((field.kind === 'pair') !== (kind === 'pair') || kind === 'word') return null; // shape problems are reported by the syntax checks
  const canonical = field.unit ? unitById(field.unit) : undefined;
  if (!canonical) return null;
  // A pair's numbers are read again from the line when asked for: read them once, as values only.
  const pairParts = kind === 'pair' ? pairNumbers(item.value as PairValue) : null;
  if (pairParts !== null && pairParts.length !== 2) return null; // `bp 120/80/60`: reported by the syntax checks
  // `target 88/92`, `bp 120-80`: a pair joined otherwise than its field's pairs are, reported by the syntax checks (PN102).
  if (pairParts !== null && (field.join === 'dash') !== isDashedPair(item.value as PairValue)) return null;
  const written = kind === 'number' ? item.number! : null;
  const first = written ?? pairParts?.[0] ?? 0;

  // Which unit was the number written in?
  let readUnit: UnitDef | undefined;
  let unitImplied = false;
  if (item.unitText !== null) {
    const candidates = unitsForSpelling(item.unitText);
    for (const u of candidates) if (field.units?.includes(u.id)) { readUnit = u; break; }
    if (!readUnit) {
      issues.push(candidates.length === 0 ? unknownUnitIssue(item, field, line) : unitNotAllowedIssue(item, field, line, candidates, written, lineItems));
      return new Stated(field, section, line, item, null, null, null, null, false, null, false);
    }
  } else {
    unitImplied = true;
    readUnit = bareUnit(field, first, ctx, canonical);
  }

  // `vt 6 mL/kg`: per kg of predicted body weight. No number in mL until the timeline reads one from
  // the PBW in force (`PerKgVolume`); until then shown as written and not used (PN325 says why).
  if (readUnit.dimension !== canonical.dimension) {
    return written === null ? null : new Stated(field, section, line, item, null, null, null, readUnit.id, false, null, false);
  }
  let value: number | null = null;
  let parts: number[] | null = null;
  // An impossible value feeds no calculation (the bounds checks report it).
  let usable = true;
  if (written !== null) {
    value = convert(written, readUnit, canonical);
    if (value === null) return null;
    if (field.hard && !within(value, field.hard)) usable = false;
  } else {
    // The pair's numbers, converted in place: a list of its own, of its exact length (an array grown
    // by push keeps room for 17 numbers, and a big note keeps thousands of these).
    parts = pairParts ?? [];
    for (let k = 0; k < parts.length; k++) {
      const c = convert(parts[k]!, readUnit, canonical);
      if (c === null) return null;
      if (field.hard && !within(c, field.hard)) usable = false;
      parts[k] = c;
    }
    // A range (`target 88-92`) has its lower end first and below its upper end: `92-88` or `92-92` is impossible as written (PN301).
    if (field.join === 'dash' && isReversedRange(parts)) usable = false;
  }

  // `spo2 0.94`: a saturation written as a fraction, not 0.94 %; reported (PN302, with the percentage offered), not used.
  if (usable && value !== null && written !== null && isSaturationFraction(field, written, item)) usable = false;
  // `altitude 1,650 m`: a thousands separator or a decimal comma? Reported by the parser (PN103), used by neither reading.
  let eitherReading = false;
  if (written !== null && kind === 'number' && item.hasDecimalComma()) {
    const number = item.value;
    if (number?.kind === 'number' && number.decimalComma && thousandsReading(field, number.text, item.unitText) !== null) {
      usable = false;
      eitherReading = true;
    }
  }
  // `height 5 ft 10 in`: the feet alone are not the height meant (the inches are reported by the parser, PN105).
  if (readUnit.id === 'ft' && field.id === 'height' && inchesAfterFeet(lineText, item.span.end) !== null) usable = false;
  let unitDoubt: string | null = null;
  // Nor is the unit of such a number doubted (PN204): that would take the decimal reading (`vt 1,000`
  // as 1.000 mL, "in L it would be ordinary") where PN103 offers both and prefers neither.
  if (unitImplied && value !== null && written !== null && !eitherReading) {
    const likely = otherUnitLikely(field, value, written, readUnit, canonical, ctx);
    if (likely) {
      usable = false;
      unitDoubt = likely.id;
      issues.push(otherUnitIssue(item, field, line, readUnit, likely));
    }
  }
  return new Stated(field, section, line, item, value, parts, null, readUnit.id, unitImplied, unitDoubt, usable);
}

/** Whether the two ends of a range are reversed or equal (`92-88`, `92-92`): a range's lower end comes first, below its upper end. */
export function isReversedRange(parts: readonly number[] | null): boolean {
  return parts !== null && parts.length === 2 && !(parts[0]! < parts[1]!);
}

/**
 * A saturation (in % of haemoglobin) written as a fraction: above 0 and at most 1, with decimals
 * (`spo2 0.94`, `sao2 .9`) and no unit written. As a percentage it would be far below anything
 * measured in a living patient; as a fraction it is an ordinary saturation.
 */
export function isSaturationFraction(field: FieldDef, written: number, item: ItemNode): boolean {
  if (field.unit !== '%sat' || item.unitText !== null || !(written > 0 && written <= 1)) return false;
  const text = item.value?.text ?? '';
  return text.includes('.') || text.includes(',');
}

/** Whether a value's text is a number and nothing else (`10`, `7.5`, `-2`). */
function isNumberText(text: string): boolean {
  return text.length > 0 && scanNumber(text) === text.length;
}

function unknownWordIssue(item: ItemNode, field: FieldDef, line: number, lineItems: readonly ItemNode[], lineText: string): ReadIssue {
  const value = item.value!;
  const known = [...new Set(Object.values(field.words ?? {}))];
  // `device room aor`: a device of several words with a word misspelt, the words after the first read as keys.
  const phrase = field.id === 'device' ? devicePhraseAt(value, lineItems, lineItems.indexOf(item) + 1, lineText) : null;
  if (phrase) {
    return {
      check: 'unknown-word',
      line,
      span: phrase.span,
      message: `\`${phrase.text}\` is not a known value for ${field.label.toLowerCase()}. Did you mean \`${phrase.device}\`?`,
      fixes: [phraseFix(phrase, lineText)],
    };
  }
  // Each word once, however many of its spellings are near (`mael`: `male` and `m`, both male).
  const near = [...new Set(closest(value.text, Object.keys(field.words ?? {})).map((w) => field.words?.[w] ?? w))];
  return {
    check: 'unknown-word',
    line,
    span: value.span,
    message: field.openWords
      ? `\`${value.text}\` is a number, not a ${field.label.toLowerCase()}: write a word, e.g. ${known.join(', ')}.`
      : `\`${value.text}\` is not a known value for ${field.label.toLowerCase()}; expected one of: ${known.join(', ')}.`,
    fixes: near.map((w) => ({ title: `Change to \`${w}\``, edits: renameKeepingColumns(lineText, value.span, w) })),
  };
}

function bareUnit(field: FieldDef, written: number, ctx: ReadContext, canonical: UnitDef): UnitDef {
  if (field.bare === 'gas') return unitById(ctx.gasUnit) ?? canonical;
  if (field.bare === 'fraction-or-percent') return (written > 1 ? unitById('%') : unitById('fraction')) ?? canonical;
  return canonical;
}

/** A unit (other than the one assumed) in which a bare number would be ordinary. */
function otherUnitLikely(field: FieldDef, canonicalValue: number, written: number, readUnit: UnitDef, canonical: UnitDef, ctx: ReadContext): UnitDef | null {
  if (field.bare === 'fraction-or-percent') return null;
  const plausible = doubtBoundsAt(field, ctx.barometricMmhg, ctx.ageYears) ?? field.hard;
  if (!plausible || within(canonicalValue, plausible)) return null;
  // Ordinary in the other unit: within the soft bounds there (not just plausible); a child's size for a child's height or weight.
  return unitsWithin(field, written, readUnit.id, ordinaryBoundsAt(field, ctx.barometricMmhg, ctx.ageYears) ?? plausible)[0] ?? null;
}

/**
 * A bare number doubted in the unit it was read in (PN204), taken in the likely unit and written
 * in the unit it was read in: `40` for a PaCO2 of 5.3 read in mmHg but likely kPa. Null when the
 * units do not convert. With the field's decimals, at least one when that unit is not canonical.
 */
export function inLikelyUnit(field: FieldDef, written: number, likely: UnitDef, readUnit: UnitDef): string | null {
  const inRead = convert(written, likely, readUnit);
  if (inRead === null) return null;
  const decimals = readUnit.id === field.unit ? field.decimals : Math.max(field.decimals, 1);
  return formatNumber(inRead, decimals);
}

function otherUnitIssue(item: ItemNode, field: FieldDef, line: number, readUnit: UnitDef, likely: UnitDef): ReadIssue {
  const value = item.value!;
  const written = value.kind === 'number' ? value.value : NaN;
  const inRead = inLikelyUnit(field, written, likely, readUnit);
  // In a shorthand gas a unit belongs after the whole group (it applies to both pressures),
  // so only the conversion is offered there.
  const fixes: LineFix[] = item.implied === 'shorthand'
    ? []
    : [{ title: `Mark as ${likely.id}`, edits: [{ span: { start: value.span.end, end: value.span.end }, newText: ` ${likely.id}` }], preferred: false }];
  if (inRead !== null) {
    fixes.push({ title: `Convert to ${inRead} ${readUnit.id}`, edits: [{ span: value.span, newText: inRead }] });
  }
  return {
    check: 'other-unit-likely',
    line,
    span: value.span,
    message: `${field.label} ${value.text} was read in ${unitInSentence(readUnit.id)}, where it is implausible; in ${unitInSentence(likely.id)} it would be ordinary. Add the unit (or convert); it is not used in calculations until then.`,
    fixes,
  };
}

function unknownKeyIssue(item: ItemNode, section: SectionId, line: number, lineItems: readonly ItemNode[], lineText: string): ReadIssue | null {
  const key = item.key!;
  if (section === 'vent') {
    const joined = simvTargetIssue(item, line, lineItems, lineText);
    if (joined !== null) return joined;
  }
  if (section === 'oxygen') {
    // The first words of an oxygen line are its device: a misspelt device of several words
    // (`oxygen room aor`, `oxygen rom air 2`) reads as unknown keys, and is reported once, on all
    // its words, with the device offered for them together; its later words are not reported again.
    // A device read from its first word with a later word misspelt (`oxygen nasal canula 2`) is the same.
    const first = lineItems[0];
    const deviceFirst = lineItems[1] === item && first?.field?.id === 'device' && first.implied === 'device' && first.value?.kind === 'word' ? first.value : null;
    const phrase = lineItems[0] === item ? devicePhraseAt(key, lineItems, 1, lineText) : deviceFirst ? devicePhraseAt(deviceFirst, lineItems, 1, lineText) : null;
    if (phrase) {
      const fix = phraseFix(phrase, lineText);
      return {
        check: 'unknown-key',
        line,
        span: phrase.span,
        message: `\`${phrase.text}\` is neither a device nor a key of oxygen lines. Did you mean \`${phrase.device}\`?`,
        fixes: [{ ...fix, preferred: safeKeyFix(squeezeBlanks(phrase.text.toLowerCase()), phrase.device.toLowerCase()) }],
      };
    }
    if (inDevicePhrase(item, lineItems, lineText)) return null;
  }
  // The first word of an oxygen line is its device: a misspelt one (`oxygen canula 2`) reads as an
  // unknown key, and is offered the devices it is near.
  const devices = section === 'oxygen' && lineItems[0] === item ? nearDevices(key.text) : [];
  const renamed = endExpiratoryName(key.text, section, lineItems);
  // No key of a pressure the device does not give is offered (it would be PN318): none beside a
  // device that gives no set airway pressure, no IPAP or EPAP beside `cpap`, no level beside `niv`.
  const lineDevice = section === 'oxygen' ? deviceOfLine(lineItems) : null;
  const candidates = lineDevice !== null ? keysInSection(section).filter((k) => isKeyGiven(k, lineDevice)) : keysInSection(section);
  const elsewhereFields = FIELDS.filter((f) => f.aliases.includes(key.text.toLowerCase()));
  const elsewhere = elsewhereFields.flatMap((f) => f.sections);
  // A key of another line is on the wrong line, not misspelt: no key of another quantity is
  // offered for it (`hb` on a vitals line is not the heart rate `hr`), but the line's own name.
  const usual = renamed !== null ? null : elsewhere.length > 0 ? wrongLineKeys(section, elsewhereFields) : usualKeysOf(key.text, section, lineItems, lineItems[0] === item) ?? zeroForLetterO(key.text, candidates);
  const keys = renamed !== null ? { near: [renamed], setAside: false } : usual ?? settingsBeforeReadings(key.text, section, closest(key.text, candidates, Infinity));
  const near = renamed !== null || usual !== null ? keys.near : [...devices, ...keys.near].slice(0, 3);
  const lines = [...new Set(elsewhere)];
  const where = lines.length > 0 ? ` (\`${key.text}\` belongs on ${/^[aeiou]/.test(lines[0]!) ? 'an' : 'a'} ${lines.join(' or ')} line)` : '';
  const said = usual?.said !== undefined && near.length === 1 ? `, ${usual.said}` : '';
  const hint = near.length > 0 ? ` Did you mean ${near.map((k) => `\`${k}\``).join(' or ')}${said}?` : '';
  // With a reading set aside the word was as near a key of another kind: never a fix applied unasked.
  const fixes = near.map((k) => ({ title: `Change to \`${k}\``, edits: renameKeepingColumns(lineText, key.span, k), preferred: near.length === 1 && !keys.setAside && safeKeyFix(key.text.toLowerCase(), k.toLowerCase()) }));
  if (section === 'vent' && isSupportKeyOnVentLine(key.text)) {
    const moved = supportOnVentIssue(item, line, lineItems, lineText, where, hint, renamed, fixes);
    if (moved !== null) return moved;
  }
  return {
    check: 'unknown-key',
    line,
    span: key.span,
    message: `\`${key.text}\` is ${devices.length > 0 ? 'neither a device nor a key' : 'not a key'} of ${section} lines${where}.${hint}`,
    fixes,
  };
}

/** The targets SIMV is written with, as a word after it: `VC` (volume-targeted) and `PC` (pressure-targeted). */
const SIMV_TARGETS: Readonly<Record<string, string>> = { vc: 'volume', pc: 'pressure' };

/**
 * `mode SIMV PC`: SIMV's target written after it with a blank, which reads as a key of its own. A
 * mode is one word: the finding offers, preferred, the two joined by a hyphen as written
 * (`SIMV-PC`, a mode of the pressure family; `SIMV-VC`, of the volume family). Only for a bare `VC`
 * or `PC` right after the mode word `SIMV`, with blanks alone between them; null otherwise.
 */
function simvTargetIssue(item: ItemNode, line: number, lineItems: readonly ItemNode[], lineText: string): ReadIssue | null {
  const key = item.key!;
  const target = SIMV_TARGETS[key.text.toLowerCase()];
  if (target === undefined || item.value !== null || item.unit !== null) return null;
  const before = lineItems[lineItems.indexOf(item) - 1];
  const mode = before?.field?.id === 'mode' ? before.value : null;
  if (mode === null || mode === undefined || mode.kind !== 'word' || mode.text.toLowerCase() !== 'simv' || before!.unit !== null) return null;
  if (lineText.slice(mode.span.end, key.span.start).trim() !== '') return null;
  const joined = `${mode.text}-${key.text}`;
  const span = { start: mode.span.start, end: key.span.end };
  return {
    check: 'unknown-key',
    line,
    span: key.span,
    message: `\`${key.text}\` is not a key of vent lines: a mode is one word, and SIMV run ${target}-targeted is written \`SIMV-${key.text.toUpperCase()}\`. Join them with a hyphen: write \`${joined}\`.`,
    fixes: [{ title: `Write the mode as \`${joined}\``, edits: renameKeepingColumns(lineText, span, joined), preferred: true }],
  };
}

/**
 * A pressure of NIV or CPAP (`ipap`, `epap`, `level`) or a device word (`niv`, `cpap 8`) on a vent
 * line (`supportLineMove`): where the line is plainly NIV or CPAP, the finding says that they are
 * written on oxygen lines and offers that line, preferred, and `peep` (for `epap` or `cpap`) only
 * where it alone leaves a clean vent line (the line holds no other pressure of the support, and does
 * not name NIV). Where the line names NIV but holds keys an oxygen line does not take, it says why
 * it is not moved, with the offers as before. Null where neither applies (today's finding).
 */
function supportOnVentIssue(item: ItemNode, line: number, lineItems: readonly ItemNode[], lineText: string, where: string, hint: string, renamed: string | null, fixes: readonly LineFix[]): ReadIssue | null {
  const move = supportLineMove(lineItems, lineText);
  if (move === null) return null;
  const key = item.key!;
  const base = `\`${key.text}\` is not a key of vent lines${where}`;
  if (move.kind === 'kept') {
    if (!move.named) return null;
    return {
      check: 'unknown-key',
      line,
      span: key.span,
      message: `${base}. NIV and CPAP are written on oxygen lines in this format, but this line also holds ${wordList(move.blockers.map((b) => `\`${b}\``))}, which an oxygen line does not take, so no fix moves it: write the NIV on an oxygen line (a vent line of readings beside it keeps what the device measured), or a ventilator's mode with the keys of a vent line (\`peep\`, \`ps\`).${hint}`,
      fixes,
    };
  }
  const peepToo = renamed !== null && lineItems.every((other) => other === item || !isSupportItem(other));
  return {
    check: 'unknown-key',
    line,
    span: key.span,
    message: `${base}: NIV and CPAP are written on oxygen lines in this format. Write this line as \`${move.shown}\`${peepToo ? `, or \`${renamed}\` for a ventilator's PEEP` : ''}.`,
    // The renamed key is offered after the move, never applied unasked.
    fixes: [{ title: `Write as \`${move.shown}\``, edits: [move.edit], preferred: true }, ...(peepToo ? fixes.map((f) => ({ ...f, preferred: false })) : [])],
  };
}

interface UsualKeys {
  readonly near: readonly string[];
  readonly setAside: boolean;
  /** What the one key offered is, said after it (`the ventilator's set rate`), where its name alone could mislead. */
  readonly said?: string;
}

/** Nothing offered, nothing applied unasked. */
const NO_KEY: UsualKeys = { near: [], setAside: true };

/**
 * A key written with the digit 0 for the letter o, which look alike (`pc02`, `sp02`), is the key it
 * spells so: offered alone, and not beside keys of other quantities as near by spelling (`fi02`,
 * FiO2, for `pc02`: a fix that would turn a PaCO2 into an FiO2). Null where it spells no key.
 */
function zeroForLetterO(written: string, candidates: readonly string[]): UsualKeys | null {
  const lower = written.toLowerCase();
  if (!lower.includes('0')) return null;
  const spelt = lower.replace(/0/g, 'o');
  for (let i = 0; i < candidates.length; i++) {
    if (candidates[i]!.toLowerCase() === spelt) return { near: [candidates[i]!], setAside: false };
  }
  return null;
}
/** What a key of another line is offered on this one (see `unknownKeyIssue`). */
const WRONG_LINE: UsualKeys = NO_KEY;

/**
 * Keys of another line commonly written for a quantity of this one, by field id: the key offered,
 * never applied unasked. `RR` is common shorthand for the set rate in a ventilator's settings
 * (common practice, no source): on a vent line the set rate is `rate`, while the measured rate
 * `rr` belongs on a vitals line, so the offer says which rate it is.
 */
const OWN_KEY_ON_LINE: Readonly<Partial<Record<SectionId, Readonly<Record<string, UsualKeys>>>>> = {
  vent: { rr: { near: ['rate'], setAside: true, said: "the ventilator's set rate" } },
};

/** What a key of another line (`fields`: the fields it is a key of) is offered on a line of `section`. */
function wrongLineKeys(section: SectionId, fields: readonly FieldDef[]): UsualKeys {
  const own = OWN_KEY_ON_LINE[section];
  if (own !== undefined) for (const f of fields) if (Object.hasOwn(own, f.id)) return own[f.id]!;
  return WRONG_LINE;
}

/**
 * Words commonly written for a key of a line that are not its aliases, because they also mean
 * something else: the keys they are offered, in the order a user would expect, in place of their
 * spelling neighbours, and never applied unasked (`setAside`). `ip` is commonly the set inspiratory
 * pressure (common practice, no source), and one letter from the measured peak `pip`; `pmax` is the
 * peak airway pressure in LOINC's naming (76531-3, "Pressure.max", the peak's code in the field
 * registry) but on some ventilators the set pressure limit (from memory): its spelling neighbours
 * `map` and `pmean` are the mean pressure, the opposite of a maximum, and are not offered.
 */
const USUAL_KEYS: Readonly<Partial<Record<SectionId, Readonly<Record<string, UsualKeys>>>>> = {
  vent: {
    ip: { near: ['pinsp', 'pip'], setAside: true },
    pmax: { near: ['peak'], setAside: true },
    // Times and the levels of APRV, which have no key: a key one letter away is another quantity
    // (`tinsp` is not `pinsp`, `plow` and `tlow` are not `flow`), so none is offered.
    tinsp: NO_KEY, ti: NO_KEY, te: NO_KEY, thigh: NO_KEY, tlow: NO_KEY, phigh: NO_KEY, plow: NO_KEY,
    // The I:E ratio has no key either, and the minute volume `ve` is one letter from `ie`.
    ie: NO_KEY,
  },
};

/**
 * Words commonly written for a device of an oxygen line that are not among its words, at the start
 * of the line: the device offered, never applied unasked. `bipap` and `bpap` are common shorthand
 * for bilevel noninvasive ventilation (common practice, no source), while their spelling neighbour
 * `cpap` is another support and `ipap` and `epap` are pressures, not devices.
 */
const DEVICE_SHORTHAND: Readonly<Record<string, UsualKeys>> = {
  bipap: { near: ['niv'], setAside: true, said: 'bilevel noninvasive ventilation' },
  bpap: { near: ['niv'], setAside: true, said: 'bilevel noninvasive ventilation' },
};

/** What an unknown word of a line is offered in place of its spelling neighbours (`first`: the line's first item), else null. */
function usualKeysOf(written: string, section: SectionId, lineItems: readonly ItemNode[], first: boolean): UsualKeys | null {
  const lower = written.toLowerCase();
  if (section === 'oxygen') {
    if (first && Object.hasOwn(DEVICE_SHORTHAND, lower)) return DEVICE_SHORTHAND[lower]!;
    return lower === 'ip' || lower === 'ep' ? supportKeys(lower, lineItems) : null;
  }
  const words = USUAL_KEYS[section];
  return words !== undefined && Object.hasOwn(words, lower) ? words[lower]! : null;
}

/**
 * `ip` and `ep` on an oxygen line, commonly written for the inspiratory and expiratory pressures of
 * NIV (common practice, no source): the line's own key by the support its device gives (the one
 * rule of noninvasive-support.ts; a line that names no device reads as NIV), `level` for `ep` on
 * a CPAP line, and nothing beside a device that gives no set pressure (an IPAP there is PN318).
 */
function supportKeys(written: 'ip' | 'ep', lineItems: readonly ItemNode[]): UsualKeys {
  const device = deviceOfLine(lineItems);
  if (givesNoSetPressure(device)) return NO_KEY;
  if (supportOfDevice(device) === 'cpap') return written === 'ep' ? CPAP_LEVEL : NO_KEY;
  return written === 'ip' ? NIV_IPAP : NIV_EPAP;
}

const NIV_IPAP: UsualKeys = { near: ['ipap'], setAside: true };
const NIV_EPAP: UsualKeys = { near: ['epap'], setAside: true };
const CPAP_LEVEL: UsualKeys = { near: ['level'], setAside: true };

/**
 * The keys offered for an unknown key of a setting line, nearest first, without the readings
 * (values measured on the device: `pip`, the peak pressure) that a setting is at least as near:
 * a fix that turns a setting into a reading changes what the number means (a set inspiratory
 * pressure of 18 read as a measured peak; our rule, no source). `pinp` is one letter from both
 * `pinsp` and `pip`, and is offered `pinsp` (and `peep`, two letters off), not `pip`. A reading
 * nearer than every setting stays (`ppeek`, `ppeak`). `setAside` says whether a reading was left out.
 */
function settingsBeforeReadings(written: string, section: SectionId, near: readonly string[]): { near: readonly string[]; setAside: boolean } {
  if (sectionById(section).kind !== 'setting' || near.length < 2) return { near, setAside: false };
  const w = written.toLowerCase();
  let nearestSetting = Infinity;
  for (const k of near) if (fieldFor(section, k)?.reading !== true) nearestSetting = Math.min(nearestSetting, editDistance(w, k.toLowerCase()));
  if (nearestSetting === Infinity) return { near, setAside: false };
  const kept = near.filter((k) => fieldFor(section, k)?.reading !== true || editDistance(w, k.toLowerCase()) < nearestSetting);
  return { near: kept, setAside: kept.length < near.length };
}

/**
 * The end-expiratory pressure has a name per line (format rule): `peep` on a vent line, in mode CPAP
 * too; `epap` on a NIV oxygen line; `level` on a CPAP oxygen line. For another of these names written
 * on a line that does not take it (`vent mode CPAP, cpap 8`, `oxygen niv ipap 14, peep 6`), the
 * line's own name (by the support rule: an oxygen line without a device takes `epap`); none beside a
 * device that gives no set airway pressure (`oxygen mask, peep 6`: an `epap` there is PN318); else null.
 */
function endExpiratoryName(key: string, section: SectionId, lineItems: readonly ItemNode[]): string | null {
  const lower = key.toLowerCase();
  if (section === 'vent') return lower === 'cpap' || lower === 'epap' ? 'peep' : null;
  if (section !== 'oxygen' || lower !== 'peep') return null;
  const device = deviceOfLine(lineItems);
  // A device that gives no set airway pressure has no name for one (an `epap` there is PN318).
  if (givesNoSetPressure(device)) return null;
  return supportOfDevice(device) === 'cpap' ? 'level' : 'epap';
}

/**
 * The canonical device word of an oxygen line (`nrb` → reservoir), written first or with its key
 * (`device mask`); the last one where a line writes two (PN206: the later is used). Null when none
 * is written (or the word is no device). Asked by the keys offered here and by completion.
 */
export function deviceOfLine(lineItems: readonly ItemNode[]): string | null {
  const field = fieldById('device');
  let device: string | null = null;
  for (const item of lineItems) if (item.keyName === 'device' && item.value?.kind === 'word' && field) device = canonicalWord(field, item.value.text);
  return device;
}

/** Whether a key of an oxygen line names no pressure of NIV or CPAP, or one that `device` gives. */
function isKeyGiven(key: string, device: string): boolean {
  const field = fieldFor('oxygen', key);
  return field === undefined || !SUPPORT_PRESSURE_FIELDS.includes(field.id) || givesPressure(device, field.id);
}

/** A run of words that is near a device of several words but not one: what it reads as, and where. */
interface DevicePhrase {
  /** The words as written (with the blanks between them). */
  readonly text: string;
  readonly span: Span;
  /** The device's spelling offered. */
  readonly device: string;
  /** How many items after the first word the phrase takes. */
  readonly items: number;
}

/**
 * The device of several words (`room air`) that the word `first` and the keys of the items from
 * `from` on are near (`nearDevicePhrase`): `room aor`, `rom air`. The words after the first must be
 * unknown keys, separated by blanks only (no comma), and all but the last without a value (the
 * last may have the flow: `rom air 2`). Null when there is none.
 */
function devicePhraseAt(first: { readonly text: string; readonly span: Span }, lineItems: readonly ItemNode[], from: number, lineText: string): DevicePhrase | null {
  let end = first.span.end;
  let count = 0;
  const phrase = nearDevicePhrase((j) => {
    if (j === 0) {
      end = first.span.end;
      count = 0;
      return first.text;
    }
    const next = lineItems[from + j - 1];
    const key = next?.key ?? null;
    // Only blanks since the word before: a comma or a value (`room 5 aor`) ends the run.
    if (!next || key === null || next.field !== null || next.implied !== null || key.span.start > lineText.length || lineText.slice(end, key.span.start).trim() !== '') return null;
    end = key.span.end;
    count = j;
    return key.text;
  });
  if (!phrase || count !== phrase.words.length - 1) return null;
  return { text: lineText.slice(first.span.start, end), span: { start: first.span.start, end }, device: phrase.device, items: count };
}

/** The fix that writes a device for the words near it. */
function phraseFix(phrase: DevicePhrase, lineText: string): LineFix {
  return { title: `Change to \`${phrase.device}\``, edits: renameKeepingColumns(lineText, phrase.span, phrase.device) };
}

/**
 * Whether an unknown key is a later word of a device phrase reported on its first word (by the
 * first item of the line, or by the word of a `device` key before it).
 */
function inDevicePhrase(item: ItemNode, lineItems: readonly ItemNode[], lineText: string): boolean {
  const at = lineItems.indexOf(item);
  for (let i = 0; i < at; i++) {
    const start = lineItems[i]!;
    let phrase: DevicePhrase | null = null;
    if (i === 0 && start.field === null && start.key !== null && start.value === null) phrase = devicePhraseAt(start.key, lineItems, 1, lineText);
    else if (start.field?.id === 'device' && (start.implied === null || start.implied === 'device') && start.value?.kind === 'word') phrase = devicePhraseAt(start.value, lineItems, i + 1, lineText);
    if (phrase && at <= i + phrase.items) return true;
  }
  return false;
}

/** The oxygen devices a word is near (`canula` → cannula), each by its usual name. */
function nearDevices(word: string): string[] {
  const words = FIELDS.find((f) => f.id === 'device')?.words ?? {};
  const out: string[] = [];
  for (const spelling of closest(word, Object.keys(words))) {
    const device = words[spelling];
    if (device !== undefined && !out.includes(device)) out.push(device);
  }
  return out;
}

/**
 * Whether changing key `written` to `known` is safe for "fix all": one letter away from a key of 4
 * letters or more, or a doubled letter (`rrr` → `rr`). A 1–3 letter key is one letter from many
 * keys (`p` → `k`, `x` → `t`), and changing it would state a value the writer never meant.
 */
function safeKeyFix(written: string, known: string): boolean {
  if (editDistance(written, known) !== 1) return false;
  if (written.length >= 4) return true;
  for (let i = 1; i < written.length; i++) {
    if (written[i] === written[i - 1] && written.slice(0, i) + written.slice(i + 1) === known) return true;
  }
  return false;
}

function unknownUnitIssue(item: ItemNode, field: FieldDef, line: number): ReadIssue {
  const unit = item.unit!;
  const allowed = (field.units ?? []).map(displayUnit);
  // Near a unit's symbol (within the usual distance), or one letter from another spelling it
  // accepts (`bpmm` → `bpm`); one suggestion per unit, in the spelling found. Other spellings are
  // many and short, so a looser match would suggest units nobody meant (`kpa2` → `hPa`).
  const near: string[] = [...closest(unit.text, allowed)];
  for (const id of field.units ?? []) {
    if (near.includes(displayUnit(id))) continue;
    const alias = unitById(id)?.aliases.find((a) => editDistance(unit.text.toLowerCase(), a.toLowerCase(), 1) === 1);
    if (alias !== undefined) near.push(alias);
  }
  return {
    check: 'unknown-unit',
    line,
    span: unit.span,
    message: `\`${unit.text}\` is not a unit Pneumark knows; ${field.label} takes ${wordList(allowed, 'or')}.`,
    fixes: near.map((u) => ({ title: `Change to ${u}`, edits: [{ span: unit.span, newText: u }] })),
  };
}

/**
 * A unit this field is never measured in. The message names every unit it takes; the fixes offer
 * only those in which the written number is possible (`fio2 45 mmHg` is offered %, not the
 * fraction 45). A pair, or a number possible in none of them, is offered them all.
 */
function unitNotAllowedIssue(item: ItemNode, field: FieldDef, line: number, candidates: readonly UnitDef[], written: number | null, lineItems: readonly ItemNode[]): ReadIssue {
  const unit = item.unit!;
  if (field.unit === 'ph') return unitOnPhIssue(item, field, line);
  const allowed = (field.units ?? []).map(displayUnit);
  const possible = written === null ? [] : unitsWithin(field, written, null, field.hard).map((u) => displayUnit(u.id));
  const offered = possible.length > 0 ? possible : allowed;
  const fixes: LineFix[] = offered.map((u) => ({ title: `Change to ${u}`, edits: [{ span: unit.span, newText: u }] }));
  const converted = convertedFix(item, field, candidates, written);
  if (converted) {
    if (converted.first) fixes.unshift(converted.fix);
    else fixes.push(converted.fix);
  }
  const fio2 = asFio2(item, candidates, written, lineItems);
  if (fio2) fixes.unshift(fio2);
  return {
    check: 'unit-not-allowed',
    line,
    span: unit.span,
    // The unit as the note spells it (`day`, `bpm`, `mbar`), quoted: the unit it was read as has
    // a name of its own (`d`, `/min`, `hPa`) that the note may not hold.
    message: `${field.label} is not measured in \`${unit.text}\`; it takes ${wordList(allowed, 'or')}.`,
    fixes,
  };
}

/**
 * A unit written after a pH, which has none: the message says so rather than name the unit `ph`
 * (the pH scale's name in the registry, which no note writes), and the fix removes the unit with
 * the blanks before it (`ph 7.4 mmHg` → `ph 7.4`).
 */
function unitOnPhIssue(item: ItemNode, field: FieldDef, line: number): ReadIssue {
  const unit = item.unit!;
  const from = item.value ? item.value.span.end : unit.span.start;
  return {
    check: 'unit-not-allowed',
    line,
    span: unit.span,
    message: `${field.label} is not measured in \`${unit.text}\`; it is written without a unit.`,
    fixes: [{ title: `Remove \`${unit.text}\``, edits: [{ span: { start: from, end: unit.span.end }, newText: '' }] }],
  };
}

/** Dimensions whose units convert the same whatever is measured (not concentrations, read by a molar mass). */
const CONVERTS_ALIKE: ReadonlySet<string> = new Set(['gas-pressure', 'airway-pressure', 'rate', 'flow', 'volume', 'temperature', 'length', 'mass']);

/**
 * A value written in a unit of the field's kind that the field does not take (`map 12 kPa`, `bp
 * 16/10.7 kPa`): the fix that keeps what was measured writes it converted to the field's unit
 * (`map 90 mmHg`), where the converted number (both of a pair) is possible. `Change to mmHg` alone
 * would read 12 mmHg. First (`first`) when the number as written would be unusual in the field's
 * unit; after `Change to …` when it would be ordinary there (a unit typed by mistake: `map 93 kPa`
 * is offered no conversion, 698 mmHg being impossible). Only where units convert by their
 * definitions alone (CONVERTS_ALIKE): a concentration's units are read by one substance's molar
 * mass (mg/dL is glucose's, mmol/L of haemoglobin Hb's), which would misread any other.
 */
function convertedFix(item: ItemNode, field: FieldDef, candidates: readonly UnitDef[], written: number | null): { fix: LineFix; first: boolean } | null {
  const value = item.value;
  const from = candidates.find((u) => u.dimension === field.dimension && CONVERTS_ALIKE.has(u.dimension));
  const to = field.unit ? unitById(field.unit) : undefined;
  if (!value || !from || !to || from === to) return null;
  const numbers = written !== null ? [written] : value.kind === 'pair' ? pairNumbers(value as PairValue) : [];
  if (numbers.length === 0) return null;
  const texts: string[] = [];
  let ordinaryAsWritten = true;
  let ordinaryConverted = true;
  for (const n of numbers) {
    const c = convert(n, from, to);
    if (c === null || !within(c, field.hard)) return null;
    texts.push(formatNumber(c, field.decimals));
    if (!within(n, field.soft)) ordinaryAsWritten = false;
    if (!within(c, field.soft)) ordinaryConverted = false;
  }
  const newValue = texts.join('/');
  const unitText = displayUnit(to.id);
  return {
    fix: { title: `Convert to ${newValue} ${unitText}`, edits: [{ span: value.span, newText: newValue }, { span: item.unit!.span, newText: unitText }] },
    first: !ordinaryAsWritten && ordinaryConverted,
  };
}

/**
 * A percentage after an oxygen device (`mask 40 %`, `cannula 28 %`) is the FiO2 the device
 * gives, not its flow: the fix that keeps what was meant writes the key (`mask fio2 40 %`),
 * offered first and before `Change to L/min`, which would read 40 L/min (after `venturi` and
 * `hfnc` the parser reads it as the FiO2 already: `venturiNumberKey`, `highFlowPercentIssue`). Null unless the number is
 * a possible FiO2 in percent and the line states no FiO2 of its own (it would then be stated twice).
 */
function asFio2(item: ItemNode, candidates: readonly UnitDef[], written: number | null, lineItems: readonly ItemNode[]): LineFix | null {
  if (item.implied !== 'device-flow' || written === null || !item.value) return null;
  for (let k = 0; k < lineItems.length; k++) if (lineItems[k]!.field?.id === 'fio2') return null;
  const percent = candidates.find((u) => u.id === '%');
  const fio2 = FIELDS.find((f) => f.id === 'fio2');
  const fraction = percent && fio2?.unit ? convert(written, percent, unitById(fio2.unit)!) : null;
  if (fraction === null || !within(fraction, fio2!.hard)) return null;
  const unit = item.unit!;
  return { title: `Write it as the FiO2: fio2 ${item.value.text}${unit.span.start === item.value.span.end ? '' : ' '}${unit.text}`, edits: [{ span: { start: item.value.span.start, end: item.value.span.start }, newText: 'fio2 ' }] };
}

/** How a unit id is written in a note (`fraction` and `%sat` are internal ids). */
/**
 * A unit as a sentence names it after "in": its display form, but `inches` for `in`, which a
 * sentence would otherwise read as the word (never "in in it would be ordinary").
 */
export function unitInSentence(id: string): string {
  return id === 'in' ? 'inches' : displayUnit(id);
}

export function displayUnit(id: string): string {
  if (id === 'fraction') return 'fraction';
  if (id === '%sat') return '%';
  if (id === HB_MMOL_PER_L) return 'mmol/L';
  return id;
}
