/**
 * What the analysis makes of a note: timepoints with the values in force at each one,
 * where every value came from, and (from the physiology layer) derived values.
 */
import type { FieldDef } from '../fields/registry';
import type { SectionId } from '../fields/sections';
import type { ItemNode, Span } from '../syntax/tree';

/** Where an input came from. */
export type Origin =
  /** Stated at this timepoint. */
  | { readonly kind: 'here'; readonly line: number; readonly span: Span }
  /** Stated at an earlier timepoint and carried forward. */
  | {
    readonly kind: 'carried'; readonly line: number; readonly span: Span; readonly timepoint: number; readonly timepointLabel: string;
    /** The time of the timepoint it was stated at. */
    readonly fromTime: TimepointTime;
    /** The time of the timepoint it is in force at (where it was carried to). */
    readonly atTime: TimepointTime;
  }
  /** From the note's header (patient, place, units before the first timepoint). */
  | { readonly kind: 'header'; readonly line: number; readonly span: Span }
  /** A default convention (room air FiO2, RQ 0.8, ...). */
  | { readonly kind: 'default'; readonly description: string };

/** A value a note stated, read into the field's canonical unit. */
export interface StatedValue {
  readonly field: FieldDef;
  /** `field.id`. */
  readonly fieldId: string;
  readonly section: SectionId;
  readonly line: number;
  readonly item: ItemNode;
  /** Canonical number (numbers); null for words and pairs. */
  readonly value: number | null;
  /** Canonical numbers of a pair (blood pressure). */
  readonly parts: readonly number[] | null;
  /** Canonical word (word fields). */
  readonly word: string | null;
  /** Canonical unit id of `value`/`parts`. */
  readonly unit: string | null;
  /** The unit id the written number was read in (may differ from the canonical unit). */
  readonly readUnit: string | null;
  /** True when no unit was written and the unit came from a default. */
  readonly unitImplied: boolean;
  /** A unit the bare number more likely means (reported by PN204); null when none. */
  readonly unitDoubt: string | null;
  /** False when the value should not feed computations (unreadable unit, doubtful value). */
  readonly usable: boolean;
  /**
   * In force only where stated: a measurement (vitals, gases, labs) or a reading off a device in a
   * setting section (plateau, peak); not carried forward like a setting.
   */
  readonly hereOnly: boolean;
}

/** A value in force at a timepoint. */
export interface InputValue {
  readonly stated: StatedValue;
  readonly origin: Origin;
}

/** The values in force at a timepoint, by field id. */
export interface ValuesInForce extends ReadonlyMap<string, InputValue> {
  /** Where the value in force for a field came from (the `kind` of its origin), without building the value; null when none is in force. */
  originOf(id: string): Origin['kind'] | null;
  /** The usable number in force for a field (canonical unit), without building the value; null when none. */
  numberOf(id: string): number | null;
  /** The word of the value in force for a field, usable or not (`get(id)?.stated.word`), without building the value; null when none. */
  wordOf(id: string): string | null;
  /**
   * The setting (patient, place, oxygen or ventilator value) held for a field at the end of the
   * timepoint, the one later timepoints carry, also where a measurement stated here is the value in
   * force instead (a sampling FiO2 on a gas line beside a ventilator's FiO2); undefined when none.
   */
  heldSetting(id: string): InputValue | undefined;
}

export interface TimepointTime {
  /** Day number (1-based) when known. */
  readonly day: number | null;
  /** Minutes since day 1 00:00, when the timeline allows it. */
  readonly minutes: number | null;
}

export interface Timepoint {
  readonly index: number;
  /** The `@` line, or null for the implicit first timepoint of a note with lines before any `@`. */
  readonly line: number | null;
  readonly label: string;
  /** Lines that belong to this timepoint (inclusive; from its `@` line to before the next). */
  readonly startLine: number;
  readonly endLine: number;
  readonly time: TimepointTime;
  /** Values stated at this timepoint, in order. */
  readonly stated: readonly StatedValue[];
  /** Values in force here by field id: stated here, carried, or from the header. */
  readonly values: ValuesInForce;
  /** Barometric pressure in force (stated, or from altitude), mmHg; null when no place is given. */
  readonly barometricMmhg: number | null;
  /**
   * The gas unit in force at the end of the timepoint: the last `units gas` of the header or of
   * a timepoint up to this one, else the gasUnit setting. Gas pressures are shown in it (values
   * stay mmHg inside the core). A bare gas number is read in the unit in force at its own line, as
   * the note is read: a `units gas` line counts from its line on, also within a timepoint.
   */
  readonly gasUnit: 'mmHg' | 'kPa';
  /**
   * The unit gas pressures are shown in at this timepoint (hints, hovers, readings): the unit the
   * gas pressures stated here were read in when they all agree (`abg 7.32/6.1/9.4/22 kPa` in a
   * note read in mmHg shows kPa), else `gasUnit`.
   */
  readonly shownGasUnit: 'mmHg' | 'kPa';
  /**
   * The age (years) the timepoint's lines were read with: the last age its patient lines state,
   * wherever it is written, else the one carried to it; null for none, or for one not used. It is
   * the age in force here (`values.numberOf('age')`), worked out once, before the lines are read
   * (a bare height written before the age reads with it), and what PN302 judges a body size by.
   */
  readonly ageYears: number | null;
}

/**
 * How the line numbers of a note's previous text map to those of its new text after an edit that
 * added or removed lines in one stretch: a line before `head` keeps its number, a line from `end`
 * on moves by `delta` (the count of lines added, negative for lines removed), and a line from
 * `head` to before `end` was changed (it has no number in the new text).
 */
export interface LineShift {
  readonly head: number;
  readonly end: number;
  readonly delta: number;
}

/** Where a line of the previous text is in the new one; null for a changed line. */
export function shiftedLine(shift: LineShift, line: number): number | null {
  return line < shift.head ? line : line >= shift.end ? line + shift.delta : null;
}

/**
 * A text (a message, a fix's title) written for the previous text, with the lines it names moved
 * through `shift`; null when it names a changed line, or when a line number may be part of text
 * quoted from the note (between backticks, as messages quote it). Messages write line numbers for
 * people as `line N` (1-based), and nothing else of theirs has that shape: a copy moved so says
 * what a fresh run writes.
 */
export function moveLineNames(shift: LineShift, text: string): string | null {
  let out = '';
  let copied = 0;
  for (let at = 0; at < text.length; at++) {
    const c = text.charCodeAt(at);
    if (c !== 0x6c && c !== 0x4c) continue; // l, L
    if (text.slice(at, at + 4).toLowerCase() !== 'line' || (at > 0 && isWordChar(text.charCodeAt(at - 1)))) continue;
    // `line N` or `lines N`, with blanks between (read without a regular expression, in one pass).
    let i = at + 4;
    if (text[i] === 's' || text[i] === 'S') i++;
    const blanks = i;
    while (i < text.length && /\s/.test(text[i]!)) i++;
    const digits = i;
    while (i < text.length && text.charCodeAt(i) >= 0x30 && text.charCodeAt(i) <= 0x39) i++;
    if (blanks === digits || digits === i) continue;
    const line = Number(text.slice(digits, i)) - 1;
    if (line < shift.head) continue;
    const moved = shiftedLine(shift, line);
    if (moved === null || quoted(text, at)) return null;
    out += `${text.slice(copied, digits)}${moved + 1}`;
    copied = i;
    at = i - 1;
  }
  return copied === 0 ? text : out + text.slice(copied);
}

/** Any shift: every line from the first on moves. */
const EVERY_LINE_MOVES: LineShift = { head: 0, end: 0, delta: 1 };

/**
 * Whether `text` holds a line number as messages write one (`line N`), which `moveLineNames` would
 * move: note text that has that shape (a timepoint labelled `see line 7`) and goes into a message
 * unquoted cannot be told from a line number the message wrote.
 */
export function namesLine(text: string): boolean {
  return moveLineNames(EVERY_LINE_MOVES, text) !== text;
}

function isWordChar(c: number): boolean {
  return (c >= 0x30 && c <= 0x39) || (c >= 0x41 && c <= 0x5a) || (c >= 0x61 && c <= 0x7a) || c === 0x5f;
}

/** Whether `text[at]` lies between backticks (an odd count of them before it). */
function quoted(text: string, at: number): boolean {
  let count = 0;
  for (let i = text.indexOf('`'); i !== -1 && i < at; i = text.indexOf('`', i + 1)) count++;
  return count % 2 === 1;
}
