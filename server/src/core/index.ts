/**
 * Pneumark's core as a library: text and settings in, typed results out. No editor, LSP or
 * file-system imports below this folder. The CLI and the language server use only this API
 * (and the modules it names).
 */
export { checkNote, checkTree, runChecks, type NoteResult } from './check-note';
export { NoteSession, type SessionStats } from './session';
export { parseNote, parseLine, splitLines } from './syntax/parser';
export { BLANKS, isBlank, isPlainBlank, type BlankChar } from './syntax/blanks';
export type * from './syntax/tree';
export type * from './analysis/model';
export type * from './derive/model';
export type { Finding, Fix, Position, Range, Severity, TextEdit } from './types';
export { DEFAULT_SETTINGS, settingsSchema, withDefaults, type Settings } from './settings';
export { CHECKS, checkByCodeOrAlias, docAnchor } from './checks/registry';
export { DERIVED } from './derive/registry';
export { FIELDS, fieldById, fieldFor } from './fields/registry';
export { SECTIONS } from './fields/sections';
export { UNITS } from './fields/units';
