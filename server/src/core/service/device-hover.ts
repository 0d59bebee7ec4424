/**
 * What an oxygen device is, for its hover: the device as Pneumark names it, the settings it takes
 * (`deviceSets` over `DEVICE_SETTING_FIELDS`) and how Pneumark gets its FiO2 (the one written, a
 * Venturi setting, the low-flow estimate with its rule's source, or room air's). All of it is read
 * from the registries that decide it, so the hover cannot say otherwise than the analysis does; the
 * carry text and the caution line are the field hover's own.
 */
import type { StatedValue } from '../analysis/model';
import { DEVICE_SETTING_FIELDS, deviceSets } from '../analysis/noninvasive-support';
import { ROOM_AIR_FIO2, shownFormula } from '../derive/context';
import { fio2Estimated, lowFlowFio2Rule } from '../derive/oxygen-transport';
import { venturiSetting } from '../checks/collected';
import { fieldById, type FieldDef } from '../fields/registry';
import { VENTURI_PERCENT } from '../syntax/parser';
import { formatNumber, wordList } from '../util/format';
import { closest } from '../util/suggest';
import { code, escapeMarkdown } from './markdown';

/** The canonical device words, in the registry's order. */
function deviceWords(field: FieldDef): string[] {
  return [...new Set(Object.values(field.words ?? {}))];
}

/**
 * The paragraphs about the device of `stated` (a value of the device field): what it is, or, for a
 * word Pneumark does not know, the devices near it and those it knows. `written`: the word as written.
 */
export function deviceParagraphs(field: FieldDef, stated: StatedValue | null, written: string): string[] {
  const device = stated?.word ?? null;
  if (device === null) return unknownDeviceParagraphs(field, written);
  return [settingsText(device, written), fio2Text(device)];
}

/**
 * A word Pneumark does not know as a device: said, then the devices near it (as PN201 offers them)
 * and those it knows.
 */
export function unknownDeviceParagraphs(field: FieldDef, written: string): string[] {
  const words = field.words ?? {};
  const near = [...new Set(closest(written, Object.keys(words)).map((w) => words[w] ?? w))];
  const meant = near.length > 0 ? ` Did you mean ${wordList(near.map(code), 'or')}?` : '';
  return [
    `${code(written)} is not a device Pneumark knows: it takes no settings and gives no FiO2.`,
    `${meant.trim()} Devices Pneumark knows: ${deviceWords(field).map(code).join(', ')}.`.trim(),
  ];
}

/**
 * `Settings it takes: Oxygen flow (`flow`), FiO2 (`fio2`).`, after the canonical name where the
 * device is written otherwise (`nasal high flow` is read as **hfnc**).
 */
function settingsText(device: string, written: string): string {
  const taken: string[] = [];
  for (const id of DEVICE_SETTING_FIELDS) {
    if (!deviceSets(device, id)) continue;
    const field = fieldById(id);
    if (field) taken.push(`${escapeMarkdown(field.label)} (${code(field.aliases[0] ?? field.id)})`);
  }
  const read = written.toLowerCase() === device ? '' : `${code(written)} is read as **${escapeMarkdown(device)}**. `;
  return `${read}${taken.length > 0 ? `Settings it takes: ${taken.join(', ')}` : 'It takes no settings: no oxygen is added'}.`;
}

/** How Pneumark gets the FiO2 of an oxygen line naming `device`. */
function fio2Text(device: string): string {
  if (device === 'room air') {
    return `FiO2: ${formatNumber(ROOM_AIR_FIO2, 2)}, the air's, where the line writes no oxygen flow and no FiO2 above it.`;
  }
  const written = deviceSets(device, 'fio2')
    ? `its setting, written as ${code('fio2')}`
    : `not set by the device: a ${code('fio2')} written beside it is a value stated, used as written`;
  if (device === 'venturi') {
    return `FiO2: ${written}; a bare ${VENTURI_PERCENT.min} to ${VENTURI_PERCENT.max} right after ${code('venturi')} is read as its setting in % (${venturiSetting.code}).`;
  }
  const rule = lowFlowFio2Rule(device);
  if (rule === null) return `FiO2: ${written}; none is estimated from the flow.`;
  // The formula as the derived value shows it (without the braces of its template).
  const formula = shownFormula(rule.formula);
  return `FiO2: ${written}; with none, estimated from the flow as ${escapeMarkdown(fio2Estimated.short)} = ${escapeMarkdown(formula)}, an estimate not used for P/F or the A–a gradient. Source: ${escapeMarkdown(rule.source)}`;
}
