/**
 * Hovers: what the note says at a position, and what the core made of it.
 * - a section word: what the section holds, whether it carries forward, its keys;
 * - a key, value or unit: the field, the value as read and in the other unit system, the unit
 *   it was read in (written or implied), where it came from, what it feeds, LOINC, carrying;
 * - a timepoint line: its time, the values carried into it, derived values and readings;
 * - a gas value of an abg line and a timepoint line: the change since the previous arterial gas.
 * Hovers with clinical content end with the caution line.
 */
import type { NoteResult } from '../check-note';
import type { StatedValue, Timepoint } from '../analysis/model';
import { displayUnit } from '../analysis/read-value';
import { PER_KG_PBW } from '../analysis/per-kg-volume';
import { deviceWithoutPressure, nivPressureBesideLevel, noninvasiveSupport, supportOfDevice, SUPPORT_NAMES, type NoninvasiveSupport } from '../analysis/noninvasive-support';
import { withheldText, type DerivedValue, type NotApplicable, type TimepointDerivation } from '../derive/model';
import { derivedDef, withheldByReason } from '../derive/registry';
import { shortAsName } from '../derive/context';
import { fieldFor, fieldsInSection, loincFor, type FieldDef } from '../fields/registry';
import { FAMILY_MEANING, measuredByMode, modeFamily, SIMV_UNTARGETED } from '../fields/modes';
import { sectionById, type SectionId } from '../fields/sections';
import { dayAndClock, describeInput, formatAlternative, formatStated, readUnitName, statedInKpa, timeText } from '../present';
import { SPO2_TARGET_FIELD, standing, targetInForce, targetText } from '../analysis/spo2-target';
import type { SectionLine, TimepointLine } from '../syntax/tree';
import type { Position } from '../types';
import { formatNumber, formatShort, wordList } from '../util/format';
import { unitsForSpelling } from '../fields/units';
import { isBlank } from '../syntax/lexer';
import { derivedValueText, otherSystemText } from './derived-hover';
import { deviceParagraphs, unknownDeviceParagraphs } from './device-hover';
import { gasChangeParagraph } from './gas-change-hover';
import { CHANGE_KEYS } from '../gas-change';
import { allStated, contentEnd, contentStart, isValidPosition, itemAt, lineAt, lineRange, showsKpaOnLine, spanContains, statedOf, timepointOfLine, type ItemHit } from './locate';
import { cautionLine, code, describedMarkdown, escapeMarkdown, paragraphs } from './markdown';
import type { HoverInfo } from './types';

export { derivedHover } from './derived-hover';

export function hoverAt(result: NoteResult, position: Position): HoverInfo | null {
  if (!isValidPosition(position)) return null;
  const node = lineAt(result, position.line);
  if (!node) return null;
  const ch = position.character;
  if (ch > node.text.length) return null;
  if (node.comment && ch >= node.comment.span.start && !(ch === node.comment.span.start && ch === contentEnd(node))) return null;
  if (node.kind === 'timepoint') {
    const start = contentStart(node);
    const end = contentEnd(node);
    if (ch < start || ch > end) return null;
    return timepointHover(result, node, start, end);
  }
  if (node.kind !== 'section') return null;
  if (spanContains(node.sectionToken.span, ch)) {
    return { range: lineRange(node.line, node.sectionToken.span.start, node.sectionToken.span.end), markdown: sectionMarkdown(node.section) };
  }
  const hit = itemAt(node, ch);
  if (!hit) return null;
  const markdown = hit.part === 'unit' && hit.item.implied === 'shorthand' ? shorthandUnitMarkdown(result, node, hit) : fieldMarkdown(result, node, hit);
  return markdown ? { range: lineRange(node.line, hit.span.start, hit.span.end), markdown } : null;
}

// ── sections ────────────────────────────────────────────────────────────

const KIND_WORDS = {
  header: 'Header values hold for the whole note until restated.',
  setting: 'Settings carry forward to later timepoints until restated.',
  measure: 'Measurements belong to their timepoint and do not carry forward.',
  prose: 'Free text; not read for values.',
} as const;

export function sectionMarkdown(id: SectionId): string {
  const section = sectionById(id);
  const aliases = section.aliases.length > 0 ? ` (also written ${section.aliases.map(code).join(', ')})` : '';
  const keys = fieldsInSection(id).map((f) => `${code(f.aliases[0] ?? f.id)} ${escapeMarkdown(f.label)}`);
  return paragraphs([
    `**${code(id)} line**${aliases}`,
    describedMarkdown(section.description),
    KIND_WORDS[section.kind],
    keys.length > 0 ? `Keys: ${keys.join(' · ')}` : null,
  ]);
}

// ── fields ──────────────────────────────────────────────────────────────

function fieldMarkdown(result: NoteResult, node: SectionLine, hit: ItemHit): string | null {
  const field = fieldFor(node.section, hit.item.keyName);
  if (!field) {
    const keys = fieldsInSection(node.section).map((f) => code(f.aliases[0] ?? f.id));
    const written = hit.item.key?.text ?? hit.item.keyName;
    // The first word of an oxygen line may be a device misspelt (`oxygen canula 2`), as PN201 says.
    const device = node.section === 'oxygen' && node.items[0] === hit.item ? fieldFor('oxygen', 'device') : undefined;
    if (device) return paragraphs([`${code(written)} is neither a device nor a key of ${code(node.section)} lines.`, ...unknownDeviceParagraphs(device, written).slice(1), keys.length > 0 ? `Keys: ${keys.join(', ')}` : null]);
    return paragraphs([`${code(written)} is not a key of ${code(node.section)} lines.`, keys.length > 0 ? `Keys: ${keys.join(', ')}` : null]);
  }
  const stated = statedOf(result, node.line, hit.item);
  const keyWords = hit.item.implied === 'shorthand'
    ? `the ${shorthandPosition(hit.item.keyName)} number of the shorthand gas`
    : hit.item.implied === 'device' ? 'the device, written first'
      : hit.item.implied === 'device-flow' ? 'the number after the device'
        : hit.item.implied === 'bracketed-mean' ? 'the number in brackets after the blood pressure'
          : `${code(hit.item.key?.text ?? field.aliases[0] ?? field.id)}`;
  const head = `**${escapeMarkdown(field.label)}** — ${keyWords} on this ${code(node.section)} line`;
  const parts: (string | null)[] = [head, describedMarkdown(field.description)];
  if (stated) {
    parts.push(valueText(stated, showsKpaOnLine(result, stated.line)), modeFamilyText(stated));
    if (field.id === 'device') parts.push(...deviceParagraphs(field, stated, stated.item.value?.text ?? ''));
    parts.push(unitText(result, stated, field), originText(result, stated), usableText(stated, field), notGivenText(result, stated), feedsText(result, stated), gasValueChange(result, stated), targetStandingText(result, stated));
  } else if (hit.item.value) {
    parts.push(`${code(hit.item.value.text)} could not be read as ${escapeMarkdown(field.label)}.`);
  }
  const values = stated ? timepointOfLine(result, stated.line)?.values : undefined;
  const mode = values?.wordOf('mode') ?? null;
  parts.push(carryText(field, node.section, stated, mode, mode === null && values !== undefined ? noninvasiveSupport(values.wordOf('device'), values) : null));
  parts.push(loincText(field, node.section, hit.item.keyName));
  parts.push(cautionLine());
  return paragraphs(parts);
}

/**
 * The LOINC code of the value as written here (its key, its section) and where it was checked: the
 * page's title, not its address (a hover is read at a glance; grammar/README.md lists the addresses).
 */
function loincText(field: FieldDef, section: SectionId, key: string): string | null {
  const loinc = loincFor(field, section, key);
  if (!loinc) return null;
  const provenance = loinc.fromMemory ? ' (code recalled, not checked against the LOINC table)'
    : loinc.source ? ` (checked on: ${sourceTitle(loinc.source)})` : '';
  return `LOINC ${loinc.code} — ${escapeMarkdown(loinc.display)}${escapeMarkdown(provenance)}`;
}

/** A registry source without its address: `title — https://…` gives the title. */
function sourceTitle(source: string): string {
  const cut = source.lastIndexOf(' — https://');
  return cut < 0 ? source : source.slice(0, cut);
}

/**
 * The unit written after a shorthand gas (`abg 7.30/6.4/9.3/23 kPa`) belongs to both its
 * pressures: each with its value as read, rather than the first of them alone.
 */
function shorthandUnitMarkdown(result: NoteResult, node: SectionLine, hit: ItemHit): string {
  const values: string[] = [];
  for (const item of node.items) {
    if (item.implied !== 'shorthand' || item.unit?.span.start !== hit.span.start) continue;
    const field = fieldFor(node.section, item.keyName);
    const stated = statedOf(result, node.line, item);
    if (!field || !stated) continue;
    values.push(`- ${escapeMarkdown(field.label)}: ${shownValue(stated, showsKpaOnLine(result, stated.line))}`);
  }
  return paragraphs([`**${code(hit.item.unit?.text ?? '')}** — the unit of the shorthand gas on this ${code(node.section)} line, for both its pressures`, values.join('\n'), cautionLine()]);
}

function shorthandPosition(key: string): string {
  return key === 'ph' ? 'first' : key === 'pco2' ? 'second' : key === 'po2' ? 'third' : 'fourth';
}

function alternativeText(s: StatedValue): string | null {
  if (s.unit === 'fraction' && s.value !== null) return `${formatShort(s.value * 100, 1)} %`;
  return formatAlternative(s);
}

/**
 * `Value: **71 mmHg** = 9.5 kPa`; where gas pressures are shown in kPa first (`showsKpa`, at a
 * timepoint or on a header line), a gas pressure in kPa first: `Value: **9.5 kPa** = 71 mmHg`.
 */
function valueText(s: StatedValue, kpaFirst: boolean): string {
  return `Value: ${shownValue(s, kpaFirst)}`;
}

/** The value of `valueText`: `**71 mmHg** = 9.5 kPa`. */
function shownValue(s: StatedValue, kpaFirst: boolean): string {
  if (s.word !== null) return `**${escapeMarkdown(s.word)}**`;
  if (s.readUnit === PER_KG_PBW) return perKgValue(s);
  if (s.value === null && !s.parts) return `${code(s.item.value?.text ?? '')} (not read)`;
  const kpa = kpaFirst ? statedInKpa(s) : null;
  if (kpa) return `**${escapeMarkdown(kpa)}** = ${escapeMarkdown(formatStated(s))}`;
  const shown = formatStated(s);
  const alt = alternativeText(s);
  const asFraction = s.unit === 'fraction' ? ' (a fraction)' : '';
  return `**${escapeMarkdown(shown)}**${asFraction}${alt ? ` = ${escapeMarkdown(alt)}` : ''}`;
}

/**
 * A tidal volume written per kg of predicted body weight: `**423 mL** = 6 mL/kg × PBW 70.6 kg
 * (ARDS Network 2000 equation)` where it was read in mL, `**6 mL/kg** (not read in mL)` where not.
 */
function perKgValue(s: StatedValue): string {
  const written = `${s.item.value?.text ?? ''} mL/kg`;
  const perKg = s.item.number;
  if (!s.usable || s.value === null || perKg === null || !(perKg > 0)) return `**${escapeMarkdown(written)}** (not read in mL)`;
  return `**${escapeMarkdown(formatStated(s))}** = ${escapeMarkdown(written)} × PBW ${formatNumber(s.value / perKg, 1)} kg (ARDS Network 2000 equation)`;
}

function unitText(result: NoteResult, s: StatedValue, field: FieldDef): string | null {
  if (s.word !== null || s.unit === 'ph') return null;
  if (!s.readUnit) {
    if (!s.item.unit) return null;
    const allowed = escapeMarkdown(wordList((field.units ?? []).map(displayUnit), 'or'));
    // A unit Pneumark knows that measures something else (`temp 37 mmHg`), or no unit at all (`mmhgg`).
    return unitsForSpelling(s.item.unit.text).length > 0
      ? `Unit ${code(s.item.unit.text)} does not measure ${escapeMarkdown(field.label)}, which takes ${allowed}.`
      : `Unit ${code(s.item.unit.text)} is not a unit Pneumark knows; ${escapeMarkdown(field.label)} takes ${allowed}.`;
  }
  const read = s.readUnit === 'fraction' ? 'a fraction' : readUnitName(s);
  if (!s.unitImplied) return `Written in ${escapeMarkdown(read)}.`;
  let why = "the field's default unit";
  if (field.bare === 'gas') {
    const source = gasUnitLine(result, s.line);
    why = source === null ? 'the default gas unit (no `units gas` line before it)' : `the note's gas unit (${code(`units gas`)}, line ${source + 1})`;
  } else if (field.bare === 'fraction-or-percent') {
    why = 'a bare number up to 1 is a fraction, above 1 a percentage';
  }
  return `No unit written: read in ${escapeMarkdown(read)} — ${why}.`;
}

function gasUnitLine(result: NoteResult, line: number): number | null {
  let found: number | null = null;
  for (const s of allStated(result)) if (s.fieldId === 'gas_unit' && s.word !== null && s.line < line && (found === null || s.line > found)) found = s.line;
  return found;
}

function timepointName(tp: Timepoint): string {
  return `‘${escapeMarkdown(tp.label)}’${tp.time.minutes !== null ? ` (${clockText(tp.time.minutes)})` : ''}`;
}

function originText(result: NoteResult, s: StatedValue): string {
  const tp = timepointOfLine(result, s.line);
  if (!tp || result.analysis.timeline.header.includes(s)) return `From the header, line ${s.line + 1}.`;
  const inForce = tp.values.get(s.fieldId);
  // The same stated value may be another object in force: an open note keeps a setting held as
  // before where it reads the same (same line, same item), after lines are added or removed above it.
  const replaced = inForce && !(inForce.stated === s || (inForce.stated.item === s.item && inForce.stated.line === s.line)) && inForce.stated.section === s.section && inForce.origin.kind === 'here'
    ? ` A later value at this timepoint replaces it (line ${inForce.stated.line + 1}).`
    : '';
  return `Stated on line ${s.line + 1}, at timepoint ${timepointName(tp)}.${replaced}${endedText(tp, s)}`;
}

/**
 * A setting of an oxygen or vent line that a later line of the other therapy at the same
 * timepoint ends (PN311): it is neither in force there nor carried.
 */
function endedText(tp: Timepoint, s: StatedValue): string {
  if ((s.section !== 'oxygen' && s.section !== 'vent') || s.hereOnly) return '';
  const other = s.section === 'oxygen' ? 'vent' : 'oxygen';
  let ender = -1;
  // A vent line of readings only ends no oxygen line: only a line with a setting ends the other therapy.
  for (const t of tp.stated) if (t.section === other && t.line > s.line && !t.hereOnly) ender = Math.max(ender, t.line);
  return ender < 0 ? '' : ` The ${code(other)} line below it (line ${ender + 1}) ends this ${code(s.section)} line at the same timepoint, so this value is not in force here nor carried (PN311).`;
}

function usableText(s: StatedValue, field: FieldDef): string | null {
  if (s.usable) return null;
  if (s.unitDoubt) return `Not used in calculations: implausible in ${escapeMarkdown(displayUnit(s.readUnit ?? ''))}, ordinary in ${escapeMarkdown(displayUnit(s.unitDoubt))} — write the unit.`;
  // A word field keeps no word it does not know (`device canula`): its value is null, like a number without a unit.
  if (field.kind === 'word') return 'Not used in calculations: the word is not known.';
  if (!s.readUnit) return `Not used in calculations: the unit is not one ${escapeMarkdown(field.label)} takes.`;
  if (s.readUnit === PER_KG_PBW) return 'Not used in calculations: no predicted body weight to read it in mL by, or a number impossible per kg (see the PN325 finding on this line).';
  return 'Not used in calculations: the value is outside what is possible.';
}

/** An IPAP, an EPAP or a CPAP level beside a device that does not give it, or a CPAP level beside an IPAP or an EPAP with no device (PN318): why it is not used. */
function notGivenText(result: NoteResult, s: StatedValue): string | null {
  if (!s.usable || s.section !== 'oxygen') return null;
  const tp = timepointOfLine(result, s.line);
  const device = tp ? deviceWithoutPressure(tp.stated, s) : null;
  if (device === null) {
    // No device named: a CPAP level beside an IPAP or an EPAP, which make the line NIV.
    const niv = tp ? nivPressureBesideLevel(tp.stated, s) : null;
    return niv === null ? null : `Not used in calculations: with no device named, the ${niv.fieldId === 'ipap' ? 'IPAP' : 'EPAP'} on this line makes it NIV, which gives an IPAP and an EPAP, not one CPAP level (PN318).`;
  }
  const support = supportOfDevice(device.word);
  const gives = support === null ? 'gives no set airway pressure' : support === 'cpap' ? `gives one pressure, its level, and no ${s.fieldId === 'ipap' ? 'IPAP' : 'EPAP'}` : 'gives an IPAP and an EPAP, not one CPAP level';
  return `Not used in calculations: the device ${code(device.word ?? '')} ${gives} (PN318).`;
}

function derivationOf(result: NoteResult, tp: Timepoint): TimepointDerivation | null {
  return result.analysis.derivation(tp.index);
}

function feedsText(result: NoteResult, s: StatedValue): string | null {
  const tp = timepointOfLine(result, s.line);
  if (!tp) return null;
  const derivation = derivationOf(result, tp);
  if (!derivation) return null;
  const uses = derivation.derived.filter((d) => d.inputs.some((t) => t.fieldId === s.fieldId && t.origin.kind !== 'derived' && t.origin.kind !== 'default' && t.origin.line === s.line));
  // Values this one would feed (it is one of their main inputs, on their line) but a finding withholds.
  const withheld = derivation.notApplicable.filter((n) => n.withheldBy !== null && n.line === s.line && (derivedDef(n.id)?.anchors.includes(s.fieldId) ?? false));
  // Values whose formula does not hold for the treatment in force (mechanical power in PC): why.
  const explained = derivation.notApplicable.filter((n) => n.explained === true && n.withheldBy === null && n.line === s.line && (derivedDef(n.id)?.anchors.includes(s.fieldId) ?? false));
  const parts = [
    uses.length > 0 ? `Used here for: ${uses.map((d) => `${escapeMarkdown(d.short)} ${escapeMarkdown(derivedValueText(d, tp))}`).join(' · ')}` : null,
    ...withheldParagraphs(withheld),
    ...explained.map((n) => `Not worked out here: ${escapeMarkdown(derivedDef(n.id)?.short ?? n.label)} — ${escapeMarkdown(n.reason)}.`),
  ].filter((p): p is string => p !== null);
  return parts.length > 0 ? parts.join('\n\n') : null;
}

const COMPARED: ReadonlySet<string> = new Set(CHANGE_KEYS);

/** On an arterial gas line, for a value compared with the previous gas (PaO2, PaCO2, pH, a sampling FiO2): the change since it. */
function gasValueChange(result: NoteResult, s: StatedValue): string | null {
  if (s.section !== 'abg' || !COMPARED.has(s.fieldId)) return null;
  const tp = timepointOfLine(result, s.line);
  return tp ? gasChangeParagraph(result, tp.index) : null;
}

/**
 * The family of a ventilator mode (fields/modes.ts) and what it sets and measures, which decides
 * whether the other values of its vent lines are settings or measurements; null for another field.
 */
function modeFamilyText(stated: StatedValue): string | null {
  if (stated.fieldId !== 'mode' || stated.word === null) return null;
  const family = modeFamily(stated.word);
  if (family === null) return 'Family: none that Pneumark knows: each value on its vent lines is a setting or a reading as its field says (a tidal volume a setting).';
  const untargeted = stated.word.toUpperCase() === SIMV_UNTARGETED ? ' Plain SIMV is read as volume-targeted; write `SIMV-PC` for SIMV run pressure-targeted, `SIMV-VC` to say it is volume-targeted.' : '';
  return `Family: **${family}** — ${FAMILY_MEANING[family]}.${untargeted}`;
}

/**
 * Where an SpO2 stands against the SpO2 target in force at its timepoint (written, carried, or the
 * spo2Target setting's): `within target 88–92 %`, `above`, `below`; null for another value, one not
 * used, or where no target is in force.
 */
function targetStandingText(result: NoteResult, s: StatedValue): string | null {
  if (s.fieldId !== 'spo2' || !s.usable || s.value === null) return null;
  const tp = timepointOfLine(result, s.line);
  const target = tp ? targetInForce(tp.values, result.settings) : null;
  if (target === null) return null;
  const origin = target.input?.origin;
  const from = origin === undefined ? 'the spo2Target setting\'s'
    // As PN327 and PN328 say it; a target of the implicit first timepoint (before any `@`) has no time.
    : origin.kind === 'carried' ? `in force since ${timeText(origin.fromTime) === null ? '' : `${timeText(origin.fromTime)}, `}line ${origin.line + 1}`
      : origin.kind === 'default' ? '' : `written on line ${origin.line + 1}`;
  const where = standing(s.value, target);
  return `SpO2 target: **${where}** ${targetText(target)}${from ? ` (${from})` : ''}.`;
}

function carryText(field: FieldDef, section: SectionId, stated: StatedValue | null, mode: string | null, support: NoninvasiveSupport | null): string {
  const kind = sectionById(section).kind;
  if (field.id === SPO2_TARGET_FIELD) return 'Carries forward: yes, until another target is written; a new device, room air and a `vent` line leave it in force.';
  // A value the breaths in force measure rather than set (fields/modes.ts: a tidal volume under PS,
  // or with no mode on a vent line of readings under NIV or CPAP, the volume the device measured).
  if (kind === 'setting' && stated?.hereOnly === true && measuredByMode(field, mode, support)) {
    const label = escapeMarkdown(field.label.toLowerCase());
    if (mode !== null) return `Carries forward: no — under ${escapeMarkdown(mode)} the ${label} is measured, not set: that mode does not set it, so it is in force at this timepoint only; the settings on this line carry forward.`;
    return `Carries forward: no — under ${SUPPORT_NAMES[support!]} the ${label} is measured, not set: the device measured it at this timepoint, and it is in force there only; a \`vent\` line of readings does not end the support in force.`;
  }
  // The mean airway pressure an oscillator is set to.
  if (kind === 'setting' && field.reading && stated !== null && !stated.hereOnly) {
    return 'Carries forward: yes, in HFOV the mean airway pressure is set: until restated, a change of mode or an `oxygen` line.';
  }
  if (kind === 'header') return section === 'place' ? 'Carries forward: yes, until a later `place` line replaces the place.' : 'Carries forward: yes, for the whole note until restated.';
  if (kind === 'setting' && !field.reading) {
    return section === 'oxygen'
      ? 'Carries forward: yes, until the next `oxygen` line (which replaces it, but for one that names no device and restates only settings of the device in force, or of NIV or CPAP written by its pressures, at a later timepoint or below it at its own, which updates those, as does one below it at its own timepoint that names the same device again) or a `vent` line with a setting (one of readings only ends nothing).'
      : 'Carries forward: yes, until restated (a new `mode` keeps only PEEP and FiO2; a change to or from HFOV only FiO2), or until an `oxygen` line.';
  }
  // "Reading" names Pneumark's interpretations elsewhere: a value measured on a device is a measurement.
  if (kind === 'setting') return 'Carries forward: no — a value measured on the device belongs to its timepoint; the settings on this line carry forward.';
  return 'Carries forward: no — a measurement belongs to its timepoint.';
}

// ── timepoints ──────────────────────────────────────────────────────────

/** `day 2, 08:00`: minutes since day 1 00:00 as a day and clock. */
export function clockText(minutes: number): string {
  if (!Number.isFinite(minutes)) return 'time unknown';
  const { day, clock } = dayAndClock(minutes);
  return `day ${day}, ${clock}`;
}

/** The time as written after `@` (also one that could not be read), without the label. */
export function writtenTime(node: TimepointLine, end: number): string {
  if (node.time) return node.time.text;
  return trimmed(node.text.slice(node.marker.span.end, node.label ? node.label.span.start : end), ',');
}

/**
 * Text between a time that was read and the label (`@ day 1 25:10`, `@ day 2 0800`): part of the
 * time that was not; '' when there is none (or no time was read). `end`: where the content ends.
 */
export function unreadTime(node: TimepointLine, end: number): string {
  return node.time ? trimmed(node.text.slice(node.time.span.end, node.label ? node.label.span.start : end), ',.') : '';
}

/** The text without blanks (and the punctuation given) at either end; a loop, not a regex, so long runs of blanks cost nothing. */
function trimmed(text: string, punctuation: string): string {
  const cut = (i: number) => isBlank(text.charCodeAt(i)) || /\s/.test(text.charAt(i)) || punctuation.includes(text.charAt(i));
  let start = 0;
  let end = text.length;
  while (start < end && cut(start)) start++;
  while (end > start && cut(end - 1)) end--;
  return text.slice(start, end);
}

function timeParagraph(node: TimepointLine, tp: Timepoint | null, written: string): string {
  const t = tp?.time;
  if (!node.time) return written ? `Time: unknown — ${code(written)} is not a time Pneumark reads.` : 'Time: unknown — no time is written after `@`.';
  if (!t || (t.minutes === null && t.day === null)) {
    return node.time.kind === 'offset' ? 'Time: unknown — an offset after a timepoint whose time is unknown.' : 'Time: unknown.';
  }
  if (node.time.kind === 'day' && t.day !== null) return `Time: day ${t.day}, no time of day.`;
  if (t.minutes === null) return `Time: day ${t.day ?? '?'}.`;
  const since = t.minutes < 0 ? `${formatNumber(-t.minutes, 0)} min before day 1 00:00` : `${formatNumber(t.minutes, 0)} min after day 1 00:00`;
  const offset = node.time.kind === 'offset' && node.time.minutes !== null ? `${formatNumber(node.time.minutes, 0)} min after the previous timepoint; ` : '';
  return `Time: ${clockText(t.minutes)} (${offset}${since}).`;
}

/** `Withheld here: P/F, a/A — the PaO2 is above … (see PN401).`, one paragraph per reason. */
function withheldParagraphs(withheld: readonly NotApplicable[]): string[] {
  return [...withheldByReason(withheld)].map(([why, names]) => `Withheld here: ${escapeMarkdown(names.join(', '))} — ${escapeMarkdown(why)}.`);
}

function derivedLine(d: DerivedValue, tp: Timepoint): string {
  const marks = [d.estimate ? 'estimate' : null, d.usesCarried ? 'uses a carried value' : null].filter((m): m is string => m !== null);
  return `- ${escapeMarkdown(d.label)} (${escapeMarkdown(d.short)}): **${escapeMarkdown(derivedValueText(d, tp))}**${escapeMarkdown(otherSystemText(d, tp))}${marks.length > 0 ? ` — _${marks.join(', ')}_` : ''}`;
}

/** `add fio2 to get PiO2, PAO2, P/F`: missing values grouped by what to add. */
function missingGroups(d: TimepointDerivation): string[] {
  const groups = new Map<string, string[]>();
  for (const m of d.missing) {
    const key = wordList(m.needs);
    const short = derivedDef(m.id)?.short;
    const what = short !== undefined ? shortAsName(short) : m.label;
    const list = groups.get(key);
    if (list) list.push(what);
    else groups.set(key, [what]);
  }
  return [...groups].map(([needs, what]) => `add ${needs} to get ${what.join(', ')}`);
}

function timepointHover(result: NoteResult, node: TimepointLine, start: number, end: number): HoverInfo {
  const tp = result.analysis.timeline.timepoints.find((t) => t.line === node.line) ?? null;
  const written = writtenTime(node, end);
  const title = `**${code(written ? `@ ${written}` : '@')}**${node.label ? ` — ${escapeMarkdown(node.label.text)}` : ''}`;
  const unread = unreadTime(node, end);
  const parts: (string | null)[] = [title, timeParagraph(node, tp, written), unread ? `${code(unread)} after it is not a time Pneumark reads.` : null];
  if (tp) {
    const carried = [...tp.values.values()]
      .filter((v) => v.origin.kind === 'carried' || v.origin.kind === 'header')
      .sort((a, b) => a.stated.line - b.stated.line || a.stated.item.span.start - b.stated.item.span.start);
    parts.push(carried.length > 0 ? `**Carried into this timepoint**\n${carried.map((v) => `- ${escapeMarkdown(describeInput(v, tp))}`).join('\n')}` : 'Nothing carried in from earlier timepoints or the header.');
    const derivation = derivationOf(result, tp);
    if (derivation) {
      const shown = derivation.derived.filter((d) => d.id !== 'barometric' || d.inputs[0]?.origin.kind !== 'default');
      if (shown.length > 0) parts.push(`**Derived here**\n${shown.map((d) => derivedLine(d, tp)).join('\n')}`);
      const withheld = derivation.notApplicable.filter((n) => n.withheldBy !== null);
      if (withheld.length > 0) parts.push(`**Withheld**\n${withheld.map((n) => `- ${escapeMarkdown(n.label)} (${escapeMarkdown(derivedDef(n.id)?.short ?? n.id)}): ${escapeMarkdown(withheldText(n))}`).join('\n')}`);
      if (derivation.interpretations.length > 0) parts.push(`**Readings**\n${derivation.interpretations.map((i) => `- ${escapeMarkdown(i.text)}`).join('\n')}`);
      const missing = missingGroups(derivation);
      if (missing.length > 0) parts.push(`**Could be derived**\n${missing.map((m) => `- ${escapeMarkdown(m)}`).join('\n')}`);
    }
    parts.push(gasChangeParagraph(result, tp.index));
  }
  parts.push(cautionLine());
  return { range: lineRange(node.line, start, end), markdown: paragraphs(parts) };
}
