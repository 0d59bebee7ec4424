/**
 * Completions from the registries, by where the cursor is on its line:
 * - at the start of a line (or in its first word): sections, `@` timepoint snippets, a gas-line
 *   and a vent-line snippet;
 * - after `@`: time snippets; after `@ day N`: a clock time snippet;
 * - after a section word or a comma: the section's keys not yet used on the line (an oxygen
 *   line starts with its device; a gas line may start with a shorthand);
 * - after a key that takes a word (`mode`, `sex`, `gas`, `device`): its words;
 * - after a key and a number (or a shorthand gas, or a device's flow): the units it takes (for a
 *   gas pressure the note's gas unit first, as a bare number is read in it; for the set rate
 *   under HFOV, Hz first, as an oscillator's frequency is written), then
 *   the keys that may follow (a unit may be left out); on an oxygen line, the keys of its device
 *   (no flow on room air; IPAP and EPAP for NIV, a level for CPAP);
 * - after the first word of a unit of two words the key takes (`po2 80 mm |`): that unit, whole.
 * Completions are narrowed to those whose label starts with the text typed before the cursor, and
 * replace the whole word under the cursor (the part after it too: `sp|2` becomes `spo2`). Nothing
 * is offered where it would break what follows the cursor: in front of a number, a unit, a
 * timepoint's `@` or its time; and no snippet of a whole line in front of a section word.
 */
import type { NoteResult } from '../check-note';
import { deviceOfLine, displayUnit } from '../analysis/read-value';
import { fieldFor, fieldsInSection, isHyphenSpelling, type FieldDef } from '../fields/registry';
import { SECTIONS, sectionByName, type SectionDef, type SectionId } from '../fields/sections';
import { squeezeBlanks } from '../syntax/blanks';
import { chunkLine, isBlank, leadingNumber } from '../syntax/lexer';
import { unitById } from '../fields/units';
import { parseLine } from '../syntax/parser';
import type { ItemNode, LineNode } from '../syntax/tree';
import type { Position, Range } from '../types';
import { ITEM_COLUMN } from './format';
import { DEVICE_SETTING_FIELDS, deviceSets, supportOfDevice, SUPPORT_PRESSURES, type NoninvasiveSupport } from '../analysis/noninvasive-support';
import { NONE } from '../util/lists';
import { isValidPosition, itemAt, lineAt, lineRange, timepointOfLine } from './locate';
import { OSCILLATION_MODE } from '../physiology/mechanics';
import type { StatedValue } from '../analysis/model';
import type { GasUnit } from './unit-conversion';
import type { CompletionInfo } from './types';

const KIND_DETAIL: Readonly<Record<SectionDef['kind'], string>> = {
  header: 'header line: holds for the whole note',
  setting: 'settings: carry forward until restated',
  measure: 'measurements at this timepoint',
  prose: 'free text',
};

/** What a header section offered inside a timepoint is: a restatement, from there on. */
const RESTATED_HEADER_DETAIL = 'restates a header line: holds from this timepoint on';

export function completionsAt(result: NoteResult, position: Position): CompletionInfo[] {
  if (!isValidPosition(position)) return [];
  const node = lineAt(result, position.line);
  if (!node || position.character > node.text.length) return [];
  const first = result.analysis.timeline.timepoints[0];
  const inTimepoint = first !== undefined && position.line > first.startLine;
  return keepNextWord(node, position.character, completionsOnLine(node, position, (field) => firstUnitOf(result, position.line, field), inTimepoint));
}

function completionsOnLine(node: LineNode, position: Position, firstUnit: FirstUnit, inTimepoint: boolean): CompletionInfo[] {
  const text = node.text;
  const ch = position.character;
  const hash = text.indexOf('#');
  if (hash >= 0 && ch > hash) return [];
  const line = position.line;

  let wordStart = ch;
  while (wordStart > 0 && !isBlank(text.charCodeAt(wordStart - 1)) && text.charAt(wordStart - 1) !== ',') wordStart--;
  let wordEnd = ch;
  while (wordEnd < text.length && !isBlank(text.charCodeAt(wordEnd)) && text.charAt(wordEnd) !== ',' && text.charAt(wordEnd) !== '#') wordEnd++;
  const typed = text.slice(wordStart, ch);
  const before = text.slice(0, wordStart);
  const chunks = chunkLine(before);
  const first = chunks[0];

  if (!first) {
    const restOfLine = text.slice(wordEnd).trim();
    return narrow(lineStartCompletions(restOfLine === '', lineRange(line, wordStart, wordEnd), inTimepoint), typed);
  }
  if (first.text.startsWith('@')) {
    // A time written after the cursor (`@ |day 1 08:00`, `@ day 1 |08:00`) stays as it is: a
    // snippet put in front of it, or in place of its first word, would leave two times on the line.
    if (text.slice(typed === '' ? ch : wordEnd, hash >= 0 ? hash : text.length).trim() !== '') return [];
    if (chunks.length === 1 && first.text === '@') return narrow(timeCompletions(lineRange(line, wordStart, wordEnd)), typed);
    // `@ day 2 |`: the clock time comes next (a day alone leaves the time unknown).
    if (isDayWithoutTime(chunks)) return narrow([CLOCK_AFTER_DAY(lineRange(line, wordStart, wordEnd))], typed);
    return [];
  }
  const section = sectionByName(first.text);
  if (!section || section.id === 'note') return [];

  // A number being typed with a unit glued to it: `71mm|`.
  const number = leadingNumber(typed);
  let unitTyped = typed;
  let unitStart = wordStart;
  let afterNumber = false;
  if (number.length > 0) {
    if (number.length === typed.length) return [];
    unitTyped = typed.slice(number.length);
    unitStart = wordStart + number.length;
    afterNumber = true;
  }

  // The whole word under the cursor is replaced, also the part after it (`sp|2` becomes `spo2`).
  const replace = lineRange(line, wordStart, wordEnd);
  const lineItems = node.kind === 'section' ? node.items : [];
  const used = usedFields(section.id, lineItems, wordStart);
  // The keys that go with the line's device: room air has no flow (PN310) and no pressure, and
  // only NIV has IPAP and EPAP, only CPAP a level.
  const device = section.id === 'oxygen' ? deviceOfLine(lineItems) : null;
  if (section.id === 'oxygen') for (const id of notForDevice(device)) used.add(id);
  const keysFirst = keysFirstFor(device);
  // Right after a comma (`hr 80,|`, a trigger character), a key is written after a blank, as the formatter writes it.
  const glued = wordStart > 0 && text.charCodeAt(wordStart - 1) === 0x2c;
  const keys = () => narrow(keyCompletions(section.id, used, replace, keysFirst), typed).map((c) => (glued ? { ...c, insertText: ` ${c.insertText}` } : c));
  const last = chunks[chunks.length - 1]!;
  const afterComma = before.slice(last.span.end).includes(',');
  if (chunks.length === 1) {
    if (afterNumber) return [];
    if (section.id === 'oxygen') return narrow(deviceCompletions(typed, replace), typed);
    const shorthand = section.id === 'abg' || section.id === 'vbg' ? [shorthandSnippet(section.id, replace)] : [];
    return narrow([...keyCompletions(section.id, used, replace), ...shorthand], typed);
  }
  if (afterComma) return afterNumber ? [] : keys();
  // A pair or a spaced shorthand gas being typed (`bp 120 / |`, `abg 7.3 / 56 / |`): numbers come next.
  if (last.text.endsWith('/')) return [];
  if (section.id === 'oxygen' && !afterNumber) {
    // A device of two words being typed (`oxygen room a|`, `device room a|`): the lead so far, from
    // the first word after the section, or after the key `device`.
    const leadStart = deviceLeadStart(chunks);
    const devices = leadDeviceCompletions(text, leadStart, ch, lineRange(line, leadStart, wordEnd));
    if (devices) return devices;
  }

  const prefix = parseLine(before, line);
  const items = prefix.kind === 'section' ? prefix.items : [];
  const item = items[items.length - 1];
  // `po2 80 mm |`, `peep 8 cm H|`, `abg 7.3/40/80/24 mm |`: the second word of a unit of two words
  // is being typed; a key in its place (`mm hco3`) would leave the first word behind as a unit no
  // field takes. (A shorthand gas keeps its unit on its pressures, not on its last number.)
  const unitBefore = afterNumber ? undefined : items.find((i) => i.unit !== null && i.unit.span.end === last.span.end);
  const unitBeforeField = unitBefore ? fieldFor(section.id, unitBefore.keyName) : undefined;
  if (unitBefore?.unit && unitBeforeField) {
    const rest = secondWordCompletions(unitBeforeField, unitBefore.unit.text, typed, lineRange(line, unitBefore.unit.span.start, wordEnd));
    if (rest.length > 0) return rest;
  }
  if (!item || item.span.end !== last.span.end) return afterNumber ? [] : keys();
  const field = fieldFor(section.id, item.keyName);
  const unitRange = lineRange(line, unitStart, wordEnd);

  if (afterNumber) {
    // `key 71mm|`: the number belongs to the last key, which has no value yet.
    if (item.key && !item.value && field && field.kind !== 'word' && !isFraction(field, number.value)) return narrow(unitCompletions(field, unitRange, firstUnit), unitTyped);
    return [];
  }
  if (!item.value) {
    if (!field) return [];
    if (field.kind === 'word') return narrow(field.id === 'device' ? deviceCompletions(typed, replace) : wordCompletions(field, replace), typed);
    return [];
  }
  if (item.unit === null && item.value.kind !== 'word' && !(field && item.number !== null && isFraction(field, item.number))) {
    // Its units first, then the next keys: a unit may be left out (`hr 80 rr 18`).
    const unitField = item.implied === 'shorthand' ? shorthandUnitField(section.id, items) : field;
    const units = unitField ? narrow(unitCompletions(unitField, replace, firstUnit), typed) : [];
    return [...units, ...keys()];
  }
  return keys();
}

/**
 * The units of two words a field takes (`mm Hg`, `cm H2O`) whose first word is `first` and whose
 * second starts with `typed`, written whole in place of both words.
 */
function secondWordCompletions(field: FieldDef, first: string, typed: string, replace: Range): CompletionInfo[] {
  const out: CompletionInfo[] = [];
  const lead = `${first.toLowerCase()} `;
  const t = typed.toLowerCase();
  for (const id of field.units ?? []) {
    for (const spelling of unitById(id)?.aliases ?? []) {
      const lower = spelling.toLowerCase();
      if (lower.startsWith(lead) && lower.slice(lead.length).startsWith(t) && !out.some((c) => c.label === spelling)) {
        out.push({ label: spelling, kind: 'unit', detail: `${field.label} · ${unitLabel(id)}`, insertText: spelling, replace });
      }
    }
  }
  return out;
}

/**
 * Whether a bare number of a field read as a fraction or a percentage (FiO2) is a fraction: up to
 * 1 it is (`fio2 0.4`), and no unit can follow it (`0.4 %` is 0.4 %, below room air).
 */
function isFraction(field: FieldDef, value: number): boolean {
  return field.bare === 'fraction-or-percent' && value <= 1;
}

type Role = 'section' | 'key' | 'unit' | 'word' | 'number' | 'timepoint';

const ROLE_OF_KIND: Readonly<Record<CompletionInfo['kind'], Role | null>> = { section: 'section', key: 'key', unit: 'unit', word: 'word', snippet: null };

/** What the word starting at `ch` is on its line: a section word, a key, a unit, a word value or a number. */
function roleAt(node: LineNode, ch: number): Role | null {
  if (node.kind === 'timepoint') return node.marker.span.start === ch ? 'timepoint' : null;
  if (node.kind !== 'section') return null;
  if (node.sectionToken.span.start === ch) return 'section';
  const hit = itemAt(node, ch);
  if (!hit || hit.span.start !== ch) return null;
  if (hit.part === 'value') return hit.item.valueKind === 'word' ? 'word' : 'number';
  return hit.part;
}

/**
 * With nothing typed before the cursor and a word right after it (`hr 80 |rr 18`), a completion
 * replaces that word only when it is the same kind of thing (a key for a key, a unit for a unit,
 * a mode for a mode); anything else is inserted before the word with a blank after it, so that
 * the word stays (`hr 80 /min rr 18`, never `hr 80 /min 18`). Before a number, a unit or the `@`
 * of a timepoint nothing else is offered: whatever went in front would take the number for its
 * own (`oxygen cannula fio2 2`), part a unit from its number (`peep 8 rate cmH2O`) or turn the
 * timepoint into another line. Nor is a snippet of a whole line offered in front of a section word:
 * the line would be read into the snippet's (`@ 08:00  label vitals hr 80`: the values become the
 * new timepoint's label, prose that nothing reports).
 */
function keepNextWord(node: LineNode, ch: number, items: CompletionInfo[]): CompletionInfo[] {
  let role: Role | null | undefined;
  const out: CompletionInfo[] = [];
  for (const c of items) {
    const r = c.replace;
    if (!r || r.start.character !== ch || r.end.character <= ch) { out.push(c); continue; }
    role ??= roleAt(node, ch);
    if (role !== null && ROLE_OF_KIND[c.kind] === role) out.push(c);
    else if (role !== 'number' && role !== 'unit' && role !== 'timepoint' && !(role === 'section' && c.kind === 'snippet')) out.push({ ...c, insertText: `${c.insertText} `, replace: lineRange(r.start.line, ch, ch) });
  }
  return out;
}

/**
 * Where a device being typed starts: after the last key `device` written before the cursor with a
 * word after it (`oxygen fio2 0.21, device room a|`), else at the first word after the section.
 */
function deviceLeadStart(chunks: readonly { readonly text: string; readonly span: { readonly start: number } }[]): number {
  for (let k = chunks.length - 2; k >= 1; k--) if (fieldFor('oxygen', chunks[k]!.text)?.id === 'device') return chunks[k + 1]!.span.start;
  return chunks[1]!.span.start;
}

/**
 * Devices of more than one word (`room air`) while they are typed: `oxygen room a|` offers
 * `room air` in place of `room a`. Null when the text from the first word to the cursor is not
 * the start of such a device.
 */
function leadDeviceCompletions(text: string, leadStart: number, ch: number, replace: Range): CompletionInfo[] | null {
  const lead = squeezeBlanks(text.slice(leadStart, ch)).toLowerCase();
  if (!lead.includes(' ') || lead.includes(',')) return null;
  const field = fieldFor('oxygen', 'device');
  const words = field?.words ?? {};
  // Words that already name a device, then a blank (`oxygen nasal |`): a flow or a key may come
  // next as well as the rest of a longer name, so the usual offers stand.
  if (lead.endsWith(' ') && words[lead.trimEnd()] !== undefined) return null;
  const found = Object.keys(words)
    .filter((w) => w.includes(' ') && w.startsWith(lead) && !isHyphenSpelling(w))
    .map((w): CompletionInfo => ({ label: w, kind: 'word', detail: w === words[w] ? field!.label : `${field!.label}: ${words[w]}`, insertText: w, replace }));
  return found.length > 0 ? found : null;
}

// ── what is offered ─────────────────────────────────────────────────────

/**
 * The sections, then the snippets. Inside a timepoint (below its `@` line) the timepoint's own
 * sections come first, and a header section (a place the patient moved to, a weight taken again)
 * is said to hold from there on.
 */
function lineStartCompletions(emptyRest: boolean, replace: Range, inTimepoint: boolean): CompletionInfo[] {
  const ordered = inTimepoint ? [...SECTIONS.filter((s) => s.kind !== 'header'), ...SECTIONS.filter((s) => s.kind === 'header')] : SECTIONS;
  const sections: CompletionInfo[] = ordered.map((s) => ({
    label: s.id,
    kind: 'section',
    detail: inTimepoint && s.kind === 'header' ? RESTATED_HEADER_DETAIL : KIND_DETAIL[s.kind],
    documentation: s.description,
    insertText: emptyRest ? `${s.id.padEnd(ITEM_COLUMN - 1)} ` : s.id,
    replace,
  }));
  // Placeholders are words (a value's in angle brackets, `<VT>`), never plausible numbers or times:
  // a stop left unfilled is reported (as in grammar/snippets.json) instead of reading as a normal gas or a real time.
  const snippets: CompletionInfo[] = [
    { label: '@ day N HH:MM  label', kind: 'snippet', detail: 'timepoint on a given day', documentation: `A timepoint: the day of the note (day 1 is the first), the clock time, and a label. ${PLACEHOLDERS}`, insertText: '@ day ${1:N} ${2:HH:MM}  ${3:label}', isSnippet: true, replace },
    { label: '@ HH:MM  label', kind: 'snippet', detail: 'timepoint at a clock time', documentation: `A timepoint at a clock time: the same day as the previous one, or the next day when the clock is earlier. ${PLACEHOLDERS}`, insertText: '@ ${1:HH:MM}  ${2:label}', isSnippet: true, replace },
    { label: '@ +interval', kind: 'snippet', detail: 'timepoint after an interval', documentation: `A timepoint an interval after the previous one: \`+2h30\`, \`+45m\`, \`+1d\`. ${PLACEHOLDERS}`, insertText: '@ +${1:interval}', isSnippet: true, replace },
    { label: 'abg pH/PaCO2/PaO2/HCO3', kind: 'snippet', detail: 'arterial gas, shorthand', documentation: `A full arterial gas in shorthand: pH / PaCO2 / PaO2 / HCO3. ${PLACEHOLDERS}`, insertText: `${'abg'.padEnd(ITEM_COLUMN)}${ARTERIAL_SHORTHAND}`, isSnippet: true, replace },
    { label: 'vent mode, vt, rate, peep, fio2', kind: 'snippet', detail: 'ventilator settings', documentation: `A ventilator line with its main settings. ${PLACEHOLDERS}`, insertText: `${'vent'.padEnd(ITEM_COLUMN)}mode ${modeChoice()}, vt \${2:<VT>} mL, rate \${3:<rate>}, peep \${4:<PEEP>}, fio2 \${5:<FiO2>}`, isSnippet: true, replace },
  ];
  return [...sections, ...snippets];
}

const PLACEHOLDERS = 'Every placeholder of a value is a word in angle brackets (`<VT>`): one left unfilled is reported.';
const ARTERIAL_SHORTHAND = '${1:<pH>}/${2:<PaCO2>}/${3:<PaO2>}/${4:<HCO3>}';
const VENOUS_SHORTHAND = '${1:<pH>}/${2:<PvCO2>}/${3:<PvO2>}/${4:<HCO3>}';

/** The first tab stop of the vent snippet: a choice of the ventilator modes of the registry. */
function modeChoice(): string {
  const words = [...new Set(Object.values(fieldFor('vent', 'mode')?.words ?? {}))].filter((w) => /^[A-Za-z0-9]+$/.test(w));
  return words.length > 0 ? `\${1|${words.join(',')}|}` : '${1:mode}';
}

function timeCompletions(replace: Range): CompletionInfo[] {
  return [
    { label: 'day N HH:MM', kind: 'snippet', detail: 'day and clock time', insertText: 'day ${1:N} ${2:HH:MM}  ${3:label}', isSnippet: true, replace },
    { label: 'HH:MM', kind: 'snippet', detail: 'clock time', insertText: '${1:HH:MM}  ${2:label}', isSnippet: true, replace },
    { label: '+interval', kind: 'snippet', detail: 'interval after the previous timepoint', insertText: '+${1:interval}', isSnippet: true, replace },
  ];
}

/** The words before the cursor are `@ day N` (or `@day N`), with no time yet. */
function isDayWithoutTime(chunks: readonly { readonly text: string }[]): boolean {
  const words = chunks[0]!.text === '@' ? chunks.slice(1) : [{ text: chunks[0]!.text.slice(1) }, ...chunks.slice(1)];
  return words.length === 2 && words[0]!.text.toLowerCase() === 'day' && /^[0-9]+$/.test(words[1]!.text);
}

const CLOCK_AFTER_DAY = (replace: Range): CompletionInfo => ({ label: 'HH:MM', kind: 'snippet', detail: 'clock time on that day', insertText: '${1:HH:MM}  ${2:label}', isSnippet: true, replace });

function shorthandSnippet(section: SectionId, replace: Range): CompletionInfo {
  const venous = section === 'vbg';
  return {
    label: venous ? 'pH/PvCO2/PvO2/HCO3' : 'pH/PaCO2/PaO2/HCO3',
    kind: 'snippet',
    detail: 'shorthand gas',
    documentation: `pH, PCO2, PO2 and HCO3 in that order. ${PLACEHOLDERS}`,
    insertText: venous ? VENOUS_SHORTHAND : ARTERIAL_SHORTHAND,
    isSnippet: true,
    replace,
  };
}

/** The oxygen-line fields some devices do not take (`deviceSets`): the flow, and the pressures of the supports (an FiO2 is offered beside any, see below). */
const SETTINGS_BY_DEVICE: readonly string[] = DEVICE_SETTING_FIELDS.filter((id) => id !== 'fio2');

/**
 * Oxygen-line fields that do not go with a device, by the one table of `deviceSets`: the pressures
 * of another support than the device's (none for a device that gives no set airway pressure: PN318,
 * by the one rule of `noninvasiveSupport`), and for room air the flow too. An FiO2 is offered beside
 * any device (one written beside a cannula is a value stated, not a setting of it).
 */
function notForDevice(device: string | null): readonly string[] {
  if (device === null) return [];
  return SETTINGS_BY_DEVICE.filter((id) => !deviceSets(device, id));
}

/**
 * Oxygen-line fields offered first beside a device: under NIV or CPAP (by the one rule of
 * `noninvasiveSupport`) the support's pressures and the FiO2, which set it, before the flow (oxygen
 * bled in, where the FiO2 is not set); none before the others beside another device or none.
 */
function keysFirstFor(device: string | null): readonly string[] {
  const support = supportOfDevice(device);
  return support === null ? NONE : SUPPORT_KEYS_FIRST[support];
}

const SUPPORT_KEYS_FIRST: Readonly<Record<NoninvasiveSupport, readonly string[]>> = {
  niv: [...SUPPORT_PRESSURES.niv, 'fio2'],
  cpap: [...SUPPORT_PRESSURES.cpap, 'fio2'],
};

/** Field ids stated on the line, except the item at the cursor (the one being typed). */
function usedFields(section: SectionId, items: readonly ItemNode[], cursor: number): Set<string> {
  const used = new Set<string>();
  for (const item of items) {
    if (item.key && cursor >= item.key.span.start && cursor <= item.key.span.end) continue;
    const field = fieldFor(section, item.keyName);
    if (field) used.add(field.id);
  }
  return used;
}

function unitLabel(id: string): string {
  return id === '%sat' ? '%' : displayUnit(id);
}

function keyDetail(field: FieldDef): string {
  if (field.kind === 'word') {
    const words = [...new Set(Object.values(field.words ?? {}))];
    return `${field.label} · ${words.slice(0, 4).join(', ')}${words.length > 4 || field.openWords ? ', …' : ''}`;
  }
  const first = field.units?.[0];
  if (field.bare === 'gas') return `${field.label} · mmHg or kPa (bare: the note's gas unit)`;
  if (field.bare === 'fraction-or-percent') return `${field.label} · fraction or %`;
  if (!first || first === 'ph') return field.label;
  return `${field.label} · ${unitLabel(first)}`;
}

/**
 * The keys of a section not yet used on the line: those of `first` in its order (the keys that set
 * the line's device, `keysFirstFor`), then the section's own fields (a vent line's mode and settings
 * before the FiO2 and end-tidal CO2 it shares with other lines), each group in registry order.
 */
function keyCompletions(section: SectionId, used: ReadonlySet<string>, replace: Range, first: readonly string[] = NONE): CompletionInfo[] {
  const fields = fieldsInSection(section).filter((f) => !used.has(f.id));
  const leading: FieldDef[] = [];
  for (const id of first) {
    const f = fields.find((x) => x.id === id);
    if (f) leading.push(f);
  }
  const rest = leading.length === 0 ? fields : fields.filter((f) => !leading.includes(f));
  return [...leading, ...rest.filter((f) => f.sections[0] === section), ...rest.filter((f) => f.sections[0] !== section)]
    .map((f) => ({ label: f.aliases[0] ?? f.id, kind: 'key' as const, detail: keyDetail(f), documentation: f.description, insertText: f.aliases[0] ?? f.id, replace }));
}

/**
 * The devices offered for the word being typed: each device once, by its usual name; once a
 * hyphen is typed (`nasal-c`), the spellings with a hyphen instead (`nasal-cannula`, the name of
 * several words joined by hyphens, `high-flow`), each with the device it is.
 */
function deviceCompletions(typed: string, replace: Range): CompletionInfo[] {
  const field = fieldFor('oxygen', 'device');
  if (!typed.includes('-') || !field?.words) return wordCompletions(field, replace);
  const words = field.words;
  return Object.keys(words)
    .filter((w) => w.includes('-') && !w.includes(' '))
    .map((w): CompletionInfo => ({ label: w, kind: 'word', detail: `${field.label}: ${words[w]}`, insertText: w, replace }));
}

function wordCompletions(field: FieldDef | undefined, replace: Range): CompletionInfo[] {
  if (!field?.words) return [];
  const words = [...new Set(Object.values(field.words))];
  return words.map((w) => ({ label: w, kind: 'word' as const, detail: field.label, insertText: w, replace }));
}

/**
 * The units a field takes, the one a bare number is read in first: the field's default unit, or
 * for a gas pressure the note's gas unit where the line is (kPa after `units gas kPa`).
 */
function unitCompletions(field: FieldDef, replace: Range, firstUnit: FirstUnit): CompletionInfo[] {
  const out: CompletionInfo[] = [];
  const seen = new Set<string>();
  const units = field.units ?? [];
  const chosen = firstUnit(field);
  const first = chosen !== null && units.includes(chosen.unit) ? chosen.unit : units[0];
  for (const id of first === undefined ? units : [first, ...units.filter((u) => u !== first)]) {
    if (id === 'fraction' || id === 'ph') continue;
    const label = unitLabel(id);
    if (seen.has(label)) continue;
    seen.add(label);
    const note = id === first && chosen !== null && chosen.unit === id ? ` (${chosen.why})` : id === (field.bare === 'gas' ? first : units[0]) ? ' (default unit)' : '';
    out.push({ label, kind: 'unit', detail: `${field.label}${note}`, insertText: label, replace });
  }
  return out;
}

/** The unit offered first for a field on the cursor's line, and why; null: the field's default unit. */
type FirstUnit = (field: FieldDef) => { readonly unit: string; readonly why: string } | null;

/**
 * The unit to offer first: for a gas pressure the note's gas unit, in which a bare one is read;
 * for the set rate under HFOV (the mode in force at the line's timepoint) Hz, as an oscillator's
 * frequency is written (a bare rate reads in /min, and 6 /min in HFOV is PN302).
 */
function firstUnitOf(result: NoteResult, line: number, field: FieldDef): { readonly unit: string; readonly why: string } | null {
  if (field.bare === 'gas') return { unit: gasUnitOfLine(result, line), why: "the note's gas unit" };
  if (field.id === 'vent_rate' && timepointOfLine(result, line)?.values.get('mode')?.stated.word === OSCILLATION_MODE) return { unit: 'Hz', why: 'the frequency of an oscillator, in HFOV' };
  return null;
}

/**
 * The gas unit bare gas pressures are read in on a line, as the timeline reads them: that of the
 * last `units gas` line above it (in the header or at any timepoint), else the gasUnit setting.
 */
function gasUnitOfLine(result: NoteResult, line: number): GasUnit {
  const { header, timepoints } = result.analysis.timeline;
  let unit: GasUnit = result.settings.gasUnit;
  let at = -1;
  const consider = (stated: readonly StatedValue[]) => {
    for (const s of stated) {
      if (s.fieldId === 'gas_unit' && s.line < line && s.line > at && (s.word === 'kPa' || s.word === 'mmHg')) { unit = s.word; at = s.line; }
    }
  };
  consider(header);
  for (const tp of timepoints) {
    if (tp.startLine >= line) break;
    consider(tp.stated);
  }
  return unit;
}

/** The unit after a shorthand applies to its two pressures. */
function shorthandUnitField(section: SectionId, items: readonly ItemNode[]): FieldDef | undefined {
  const pressure = items.find((i) => i.implied === 'shorthand' && (i.keyName === 'pco2' || i.keyName === 'po2'));
  return pressure ? fieldFor(section, pressure.keyName) : undefined;
}

/** Keeps completions whose label starts with the typed text (case-insensitive). */
function narrow(items: CompletionInfo[], typed: string): CompletionInfo[] {
  if (!typed) return items;
  const t = typed.toLowerCase();
  return items.filter((c) => c.label.toLowerCase().startsWith(t));
}
