/**
 * The language service: the editor features of Pneumark as pure functions over a checked
 * note (`checkNote(text, settings)` → `NoteResult`) or over its text. Plain data in, plain
 * data out; positions are LSP-style (0-based lines, UTF-16 characters). The LSP server only
 * translates these results into protocol objects, and the CLI may call the same functions.
 *
 * What lives here: one feature per file (format, hover, hints, complete, actions, symbols),
 * their shared helpers (locate, markdown, derived-hover, unit-conversion, text-edits) and the
 * editor-neutral types (types.ts). May import: the rest of the core; never `vscode`,
 * `vscode-languageserver*` or Node's `fs`. Adding a feature: a new file exporting a function
 * of `NoteResult` (or text), its types in types.ts, an export below, tests in tests/service/.
 */
export * from './types';
export { applyEdits, editsOverlap, lineTable, offsetAt, OverlappingEditsError, type LineTable } from './text-edits';
export { formatNote, formatEdits, formatLine, ITEM_COLUMN, COMMENT_GAP } from './format';
export { hoverAt, sectionMarkdown, clockText } from './hover';
export { derivedHover, derivedBody, derivedValueText } from './derived-hover';
export { inlayHints, inlayHintSteps, acidBaseLabel, carriedInputs, CARRIED_MARK, HINT_PICKS, ACID_BASE_READING_ID, type HintOptions } from './hints';
export { completionsAt } from './complete';
export { codeActions, codeActionSteps, keepsValues } from './actions';
export { convertNoteUnits, convertNoteUnitSteps, type GasUnit } from './unit-conversion';
export { documentSymbols, documentSymbolSteps, foldingRanges, OUTLINE_SECTION_LINES } from './symbols';
export { heldWhileTyping, typedItem } from './typing';
