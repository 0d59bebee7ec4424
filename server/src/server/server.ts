/**
 * The Pneumark language server: wires LSP events to the core and translates results. No
 * physiology lives here. Analysis is incremental (one NoteSession per open note), debounced
 * after edits, read in steps when there is much to read (a note just opened, a big change), and
 * never published for a stale version. Whole-note requests (the outline, hints over a long range,
 * code actions, the trend view, the conversion of the note) run in slices (`inSlices`), and a
 * cancelled request is answered with RequestCancelled. Every handler is guarded: a failing request answers empty
 * and is logged, and the server goes on.
 */
import { existsSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import {
  type CancellationToken,
  type DocumentSymbol,
  LSPErrorCodes,
  ResponseError,
  DidChangeConfigurationNotification,
  DidChangeWatchedFilesNotification,
  type WorkspaceFolder,
  TextDocumentSyncKind,
  TextDocuments,
  type Connection,
  type Diagnostic,
  type InlayHint,
  type InitializeResult,
  type Range,
  type TextEdit,
  FoldingRangeKind,
} from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import type { NoteResult } from '../core/check-note';
import { codeActionSteps } from '../core/service/actions';
import { completionsAt } from '../core/service/complete';
import { formatEdits } from '../core/service/format';
import { tooLargeMessage } from './too-large-message';
import { inlayHints, inlayHintSteps } from '../core/service/hints';
import { hoverAt } from '../core/service/hover';
import { heldWhileTyping } from '../core/service/typing';
import { documentSymbolSteps, foldingRanges } from '../core/service/symbols';
import { convertNoteUnitSteps } from '../core/service/unit-conversion';
import { NoteSession } from '../core/session';
import { timepointSummary, trendPointSteps, type TrendPointData } from '../core/trends';
import type { Steps } from '../core/util/steps';
import {
  ANALYSED_NOTIFICATION,
  CONVERT_UNITS_REQUEST,
  type AnalysedParams,
  SUMMARY_REQUEST,
  TRENDS_REQUEST,
  type ConvertUnitsParams,
  type SummaryParams,
  type SummaryResult,
  type TrendsParams,
  type TrendsResult,
  type PlainTextEdit,
} from '../protocol';
import { notePathOf, ProjectConfigs, type FoundConfig } from '../node/project-config';
import { ConfigWatcher, filesToWatch, foldersToWatch, insideFolders } from './config-watch';
import { supersededMessage } from './config-problems';
import { DEFAULT_CLIENT_SETTINGS, effectiveSettings, readClientSettings, settingsKey, type ClientSettings, type EffectiveSettings } from './settings';
import { heapBudgetBytes, heapCeilingFor, IdleCollector, lineLongerThan, maxLineChars, overHeapBudget, SMALL_NOTE_CHARS } from './memory';
import { prepareJson } from './wire';
import { findingsToPublish, isHintRef, rangesOverlap, toCodeAction, toCompletionItem, toDiagnostic, toDocumentSymbol, toInlayHint, tooManyFindings } from './translate';

interface NoteState {
  session: NoteSession;
  key: string;
  settings: EffectiveSettings;
  /** The scheduled analysis, if any. */
  timer: { readonly cancel: () => void } | null;
  /** The version whose diagnostics were last published. */
  published: number | null;
  /**
   * While the note is read in steps: settled when they end (read, superseded or closed).
   * Requests about the note wait for it rather than read the rest of it at once.
   */
  reading: Promise<void> | null;
  /** Settles `reading`. */
  release: (() => void) | null;
  diagnostics: Diagnostic[];
  /** The project file the settings were last read from (null: none applies). */
  config: FoundConfig | null;
  /** The project file the last analysis was made with; undefined before the first. */
  analysedConfig: FoundConfig | null | undefined;
  /**
   * When an analysis of the note outgrew the heap budget (`overHeapBudget`): the length of the
   * text it had read then, and what the note says. A version at least as long is not read again.
   */
  refused: { readonly from: number; readonly message: string } | null;
  /** The last text looked at for a line too long to analyse, and what was found (see `tooLongLine`). */
  lineCheck: { readonly text: string; readonly message: string | null } | null;
  /**
   * Findings held back at the place being typed (see core/service/typing.ts), and the timer that
   * shows them once typing pauses: the diagnostics of every finding of that version.
   */
  held: { readonly version: number; readonly all: Diagnostic[]; readonly held: ReadonlySet<Diagnostic>; readonly cancel: () => void } | null;
  /**
   * The line being typed, from a keystroke until typing pauses (`typingPauseMs`), the note is
   * saved or an edit that is no keystroke: its inlay hints are left out meanwhile, as they would
   * follow each digit of a value half typed (`vt 4`, VT 0.1 mL/kg), and are asked for again after.
   */
  typing: { readonly version: number; readonly line: number; readonly cancel: () => void } | null;
}

/** Where a keystroke left the cursor: the end of the one change of an edit within a line. */
interface Keystroke {
  readonly version: number;
  readonly at: { readonly line: number; readonly character: number };
}

/** What of a project file decides an analysis: where it is and what it says. */
function configKey(found: FoundConfig | null | undefined): string {
  return found ? `${found.path}\0${JSON.stringify(found.config)}` : '';
}

/** The file-system paths of the workspace folders the client names (those that are `file:` URIs). */
export function workspacePaths(folders: readonly WorkspaceFolder[] | null | undefined, rootUri: string | null | undefined): string[] {
  const uris = folders ? folders.map((f) => f.uri) : rootUri ? [rootUri] : [];
  const paths: string[] = [];
  for (const uri of uris) {
    const path = notePathOf(uri);
    if (path !== null) paths.push(resolve(path));
  }
  return paths;
}

/** Requests about the note wait from now until `closeGate`. */
function openGate(state: NoteState): void {
  if (state.reading) return;
  state.reading = new Promise<void>((resolve) => { state.release = resolve; });
}

function closeGate(state: NoteState): void {
  const release = state.release;
  state.reading = null;
  state.release = null;
  release?.();
}

/** Where docs/checks.md lives next to the bundle (dist/../docs), for codeDescription links. */
function docsUri(): string {
  const candidates = [join(__dirname, '..', 'docs', 'checks.md'), join(__dirname, '..', '..', '..', 'docs', 'checks.md')];
  const found = candidates.find((p) => existsSync(p)) ?? candidates[0]!;
  return pathToFileURL(found).toString();
}

/**
 * The lines a range formatting request covers, both ends inclusive. An end at the start of a
 * line (a selection of whole lines, as editors make them) leaves that line out.
 */
export function formattedLines(range: Range): { start: number; end: number } | null {
  const start = range.start.line;
  let end = range.end.line;
  if (end > start && range.end.character === 0) end--;
  return end >= start && start >= 0 ? { start, end } : null;
}

/** Lines read in the first step of a big analysis, and the time each later step aims at. */
const FIRST_STEP_LINES = 500;
const STEP_BUDGET_MS = 25;
/** Lines formatted in one go; more are formatted in steps (`formatInSteps`), the first of this many. */
const FORMAT_STEP_LINES = 2000;
/**
 * How long whole-note work for a request (the outline, the trend view's points, every hint, the
 * conversion of the note, the fix-all edits) runs before the server takes a turn of its event
 * loop (`inSlices`), so that other requests are answered meanwhile.
 */
const SLICE_MS = 8;
/** Answers longer than this many items have their JSON made in slices too (`prepareJson` in wire.ts). */
const PREPARED_FROM_ITEMS = 500;
/** How many times formatting of a whole note starts again on a newer version before it gives up (ContentModified). */
const FORMAT_RESTARTS = 3;

/** The answer to a request cancelled by the client (LSP: RequestCancelled, -32800). */
function cancelled(): ResponseError<void> {
  return new ResponseError(LSPErrorCodes.RequestCancelled, 'request cancelled');
}

/** The answer to a request whose result would be about a version of the note that is gone (LSP: ContentModified, -32801). */
function contentModified(): ResponseError<void> {
  return new ResponseError(LSPErrorCodes.ContentModified, 'the note changed while the answer was made');
}

/** What a request's answer may be: the result, an error, or either later. */
type Answer<R> = R | ResponseError<void> | Promise<R | ResponseError<void>>;

/** The result with its JSON made in steps when it is long (see `prepareJson`). */
function* prepared<T extends object>(list: T[]): Steps<T[]> {
  if (list.length > PREPARED_FROM_ITEMS) yield* prepareJson(list);
  return list;
}

/**
 * The size of the next step: scaled to the budget by the last step's time, within limits, and at
 * least a sixteenth of the lines read so far. Each step also goes over what was read before it
 * (the session's update looks at every line and timepoint of the note so far), so on a note of
 * hundreds of thousands of lines steps held to the budget would shrink to a few lines each and
 * the reading would take minutes; with the floor the number of steps grows with the logarithm
 * of the note's length, and the whole reading stays linear in it.
 */
export function nextStepLines(lines: number, tookMs: number, readLines = 0): number {
  const scaled = tookMs > 0 ? (lines * STEP_BUDGET_MS) / tookMs : lines * 2;
  const budgeted = Math.min(lines * 2, Math.max(100, Math.min(8000, scaled)));
  return Math.round(Math.max(budgeted, readLines / 16));
}

/**
 * The size of a note in UTF-8 bytes, as `maxNoteSizeKb` counts it. Cheap when the UTF-16 length
 * decides (a code unit is 1 to 3 bytes): the bytes are counted only in between.
 */
export function exceedsBytes(text: string, maxBytes: number): boolean {
  if (text.length > maxBytes) return true;
  if (text.length * 3 <= maxBytes) return false;
  return Buffer.byteLength(text, 'utf8') > maxBytes;
}

/**
 * Why a note is not analysed, as its diagnostic says: `too-large` over `maxNoteSizeKb`,
 * `too-costly` when its analysis outgrew (or would outgrow) the heap budget.
 */
interface Refusal {
  readonly code: 'too-large' | 'too-costly';
  readonly message: string;
}

/** The diagnostic of a note that is not analysed, at its first line. */
function refusedDiagnostic({ code, message }: Refusal): Diagnostic {
  return { range: { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } }, severity: 3, source: 'pneumark', code, message };
}

function tooCostly(message: string): Refusal {
  return { code: 'too-costly', message };
}

export function startServer(connection: Connection, collector: IdleCollector = new IdleCollector()): void {
  /**
   * The place of each note's last edit, when it was a keystroke (one change within a line: a
   * character typed or deleted, a word completed); an edit that adds or removes lines (Enter, a
   * quick fix over lines) or pastes several words leaves none. Recorded as the documents apply the editor's
   * incremental changes.
   */
  const keystrokes = new Map<string, Keystroke>();
  const documents = new TextDocuments<TextDocument>({
    create: TextDocument.create,
    update: (doc, changes, version) => {
      const change = changes.length === 1 ? changes[0]! : null;
      const range = change && 'range' in change ? (change.range as Range) : null;
      // A character typed or deleted, or a word completed (no blank or comma in what is inserted: a
      // paste of several items is no keystroke).
      const start = change && range && range.start.line === range.end.line && (change.text.length <= 1 ? !/[\r\n]/.test(change.text) : !/[\s,]/.test(change.text)) ? doc.offsetAt(range.start) : -1;
      const updated = TextDocument.update(doc, changes, version);
      if (start >= 0) keystrokes.set(doc.uri, { version, at: updated.positionAt(start + change!.text.length) });
      else keystrokes.delete(doc.uri);
      return updated;
    },
  });
  const notes = new Map<string, NoteState>();
  const clientSettings = new Map<string, ClientSettings>();
  const configs = new ProjectConfigs();
  /** The problems last published on each pneumark.config.json that has had any (as JSON; '[]' once cleared). */
  const configDiagnostics = new Map<string, string>();
  const docs = docsUri();
  // A finding reused from the previous analysis keeps its translated diagnostic.
  const translated = new WeakMap<object, Diagnostic>();
  const diagnosticOf = (f: NoteResult['findings'][number], uri: string): Diagnostic => {
    const known = translated.get(f);
    if (known) return known;
    const d = toDiagnostic(f, uri, docs);
    translated.set(f, d);
    return d;
  };
  let canPullConfiguration = false;
  /** Settings the client pushed with `workspace/didChangeConfiguration` (when it cannot be asked). */
  let pushedSettings: ClientSettings | null = null;
  /** The client takes both an insert and a replace range for a completion. */
  let insertReplace = false;
  /** Problems with the editor's settings already logged (each once). */
  const loggedProblems = new Set<string>();
  /** The client fetches a hint's tooltip when it shows it (`inlayHint/resolve`). */
  let deferHintTooltips = false;
  /** The client asks again for the hints it shows when told to (`workspace/inlayHint/refresh`). */
  let canRefreshHints = false;
  /** The workspace folders (paths): the client's own watcher reports changes of project files inside them. */
  let workspaceFolders: string[] = [];
  /**
   * The client watches the files the server registers (`workspace.didChangeWatchedFiles` with
   * dynamic registration). One that does not (Neovim 0.7) reports no change of a project file, in
   * its workspace folders or elsewhere: the server then watches the folders inside them too.
   */
  let clientWatchesFiles = false;
  /** The folders whose project files the client's watcher reports: none when it watches nothing. */
  const clientWatchedFolders = (): string[] => (clientWatchesFiles ? workspaceFolders : []);
  /** The client tells of workspace folders added and removed. */
  let folderChanges = false;

  const log = (message: string) => connection.console.log(message);
  const guard = <P, R, T = never>(name: string, fallback: R, handler: (params: P, token?: T) => R) => (params: P, token?: T): R => {
    try {
      return handler(params, token);
    } catch (error) {
      connection.console.error(`pneumark: ${name} failed: ${error instanceof Error ? error.stack ?? error.message : String(error)}`);
      return fallback;
    }
  };

  connection.onInitialize((params): InitializeResult => {
    canPullConfiguration = params.capabilities.workspace?.configuration === true;
    deferHintTooltips = params.capabilities.textDocument?.inlayHint?.resolveSupport?.properties.includes('tooltip') === true;
    insertReplace = params.capabilities.textDocument?.completion?.completionItem?.insertReplaceSupport === true;
    canRefreshHints = params.capabilities.workspace?.inlayHint?.refreshSupport === true;
    folderChanges = params.capabilities.workspace?.workspaceFolders === true;
    workspaceFolders = workspacePaths(params.workspaceFolders, params.rootUri);
    clientWatchesFiles = params.capabilities.workspace?.didChangeWatchedFiles?.dynamicRegistration === true;
    return {
      capabilities: {
        // Saves are told of so that a project file above the workspace that could not be watched is looked at again.
        textDocumentSync: { openClose: true, change: TextDocumentSyncKind.Incremental, save: { includeText: false } },
        hoverProvider: true,
        completionProvider: { triggerCharacters: [' ', ',', '@'], resolveProvider: false },
        codeActionProvider: { codeActionKinds: ['quickfix', 'refactor.rewrite', 'source.fixAll'] },
        documentSymbolProvider: true,
        foldingRangeProvider: true,
        documentFormattingProvider: true,
        documentRangeFormattingProvider: true,
        inlayHintProvider: { resolveProvider: deferHintTooltips },
        workspace: { workspaceFolders: { supported: true, changeNotifications: true } },
      },
      serverInfo: { name: 'pneumark', version: '0.1.0' },
    };
  });

  connection.onInitialized(() => {
    // Only changes of Pneumark's own settings: a change of any other setting of the editor need not reach us.
    if (canPullConfiguration) void connection.client.register(DidChangeConfigurationNotification.type, { section: 'pneumark' }).catch(() => undefined);
    // Any client that can be told what to watch is (VS Code's extension also watches them itself:
    // a change reported twice is analysed once).
    if (clientWatchesFiles) void connection.client.register(DidChangeWatchedFilesNotification.type, { watchers: [{ globPattern: '**/pneumark.config.json' }] }).catch(() => undefined);
    if (folderChanges) {
      connection.workspace.onDidChangeWorkspaceFolders(guard('workspace folders', undefined, (e: { added: WorkspaceFolder[]; removed: WorkspaceFolder[] }) => {
        const removed = new Set(workspacePaths(e.removed, null));
        workspaceFolders = [...workspaceFolders.filter((f) => !removed.has(f)), ...workspacePaths(e.added, null)];
        // Folders the editor watched may now be the server's to watch, and the other way round.
        recheckConfigs();
      }));
    }
  });

  /** The editor's settings for a note: asked for it, else pushed by the client, else the defaults. */
  function clientSettingsOf(uri: string): ClientSettings {
    return clientSettings.get(uri) ?? pushedSettings ?? DEFAULT_CLIENT_SETTINGS;
  }

  /**
   * Reads settings from the client, dropping invalid keys; each problem, and each list of names in
   * `disabledChecks` that are no check's, is logged once (as a warning in the client's output).
   */
  function readSettings(raw: unknown): ClientSettings {
    const { settings, problem, unknownChecks } = readClientSettings(raw);
    const warnOnce = (message: string) => {
      if (loggedProblems.has(message)) return;
      loggedProblems.add(message);
      connection.console.warn(message);
    };
    if (problem) warnOnce(`pneumark: settings ignored (${problem}); the other settings apply`);
    if (unknownChecks) warnOnce(`pneumark: ${unknownChecks}`);
    return settings;
  }

  async function pullClientSettings(uri: string): Promise<ClientSettings> {
    if (!canPullConfiguration) return clientSettingsOf(uri);
    try {
      const raw: unknown = await connection.workspace.getConfiguration({ scopeUri: uri, section: 'pneumark' });
      const settings = readSettings(raw);
      // Kept only for a note still open (its close forgets them).
      if (documents.get(uri)) clientSettings.set(uri, settings);
      return settings;
    } catch {
      return DEFAULT_CLIENT_SETTINGS;
    }
  }

  function settingsFor(uri: string, found = configs.forNote(uri)): EffectiveSettings {
    publishConfigProblems(found?.path ?? null, found?.config.problems ?? []);
    return effectiveSettings(clientSettingsOf(uri), found?.config ?? null);
  }

  /**
   * Publishes the problems of a project file. `superseded`: no open note reads the file, and open
   * notes below it read a nearer one (see config-problems.ts).
   */
  function publishConfigProblems(path: string | null, problems: readonly { message: string; range: Diagnostic['range'] }[], superseded = false): void {
    if (!path) return;
    const uri = pathToFileURL(path).toString();
    // Sent when they change, not with every request about a note below the file.
    const diagnostics = problems.map((p) => ({ range: p.range, message: superseded ? supersededMessage(p.message) : p.message, severity: 1 as const, source: 'pneumark', code: 'config' }));
    const key = JSON.stringify(diagnostics);
    if (configDiagnostics.get(uri) === key || (problems.length === 0 && !configDiagnostics.has(uri))) return;
    configDiagnostics.set(uri, key);
    void connection.sendDiagnostics({ uri, diagnostics });
  }

  /**
   * Says the problems of each project file that no open note reads any more, while open notes below
   * it read a nearer one, of those notes (`settingsFor` publishes them as they are for a file a note
   * reads). A file with no open note below it keeps what it said last.
   */
  function refreshSupersededConfigs(): void {
    if (configDiagnostics.size === 0) return;
    const read = new Set<string>();
    const noteFolders: string[] = [];
    for (const uri of notes.keys()) {
      const found = configs.forNote(uri);
      if (found) read.add(found.path);
      const path = notePathOf(uri);
      if (path !== null) noteFolders.push(dirname(path));
    }
    for (const [uri, sent] of configDiagnostics) {
      if (sent === '[]') continue;
      const path = fileURLToPath(uri);
      if (read.has(path) || !noteFolders.some((dir) => insideFolders(dir, [dirname(path)]))) continue;
      const config = configs.file(path);
      if (config) publishConfigProblems(path, config.problems, true);
    }
  }

  function stateFor(doc: TextDocument): NoteState {
    const found = configs.forNote(doc.uri);
    const settings = settingsFor(doc.uri, found);
    const key = settingsKey(settings.analysis);
    let state = notes.get(doc.uri);
    if (!state) {
      state = { session: new NoteSession(settings.analysis), key, settings, timer: null, published: null, diagnostics: [], reading: null, release: null, config: found, analysedConfig: undefined, refused: null, lineCheck: null, held: null, typing: null };
      notes.set(doc.uri, state);
    } else if (state.key !== key) {
      state.session.setSettings(settings.analysis);
      state.key = key;
      // Other settings may make the note cheaper to analyse (checks switched off): it is read again.
      state.refused = null;
    }
    state.settings = settings;
    state.config = found;
    return state;
  }

  /**
   * Project files above the workspace: the editor reports changes inside its workspace folders
   * only, so the server watches the folders above them that open notes read (see config-watch.ts)
   * and looks at its notes' project files again when one of them changes.
   */
  const watcher = new ConfigWatcher(() => guard('project file change', undefined, recheckConfigs)(undefined), { log: (m) => connection.console.warn(m) });

  /**
   * Watches the folders outside the workspace whose project file would apply to the note (`found`
   * is what was read there), and the folder of the file it leads to when it is a link (or would
   * lead to, for a link on the way up that leads to nothing yet), and gives
   * the project file that applies. A file made in a folder between the lookup and the start of its
   * watch would go unnoticed: so when a watch starts, the folders are looked at once more.
   */
  function watchFoldersOf(uri: string, found: FoundConfig | null): FoundConfig | null {
    const path = notePathOf(uri);
    if (path === null) return found;
    const watched = clientWatchedFolders();
    const need = (file: FoundConfig | null) => watcher.need(uri, foldersToWatch(path, file?.path ?? null, watched), filesToWatch(file?.path ?? null, watched, path));
    if (!need(found)) return found;
    const again = configs.forPath(path, true);
    if (configKey(again) !== configKey(found)) need(again);
    return again;
  }

  /**
   * Looks again at the project files of open notes (`uris`; all of them by default) and analyses
   * again each note whose project file is another, or says something else, than the one its last
   * analysis read. So a change reported twice (by the editor and by a watch here) or reported
   * after an analysis already read it is analysed once. With `fresh`, only the notes named are
   * looked up again, each from its own folder up (after a save, where a watch failed); otherwise
   * everything read before is forgotten (after a reported change).
   */
  function recheckConfigs(uris: Iterable<string> = [...notes.keys()], fresh = false): void {
    if (!fresh) configs.invalidate();
    // A project file that is gone takes its problems with it (the notes below it now use the
    // editor's settings, or a file further up).
    for (const [uri, sent] of [...configDiagnostics]) {
      if (existsSync(fileURLToPath(uri))) continue;
      configDiagnostics.delete(uri);
      if (sent !== '[]') void connection.sendDiagnostics({ uri, diagnostics: [] });
    }
    let changed = false;
    for (const uri of uris) {
      const state = notes.get(uri);
      if (!state) continue;
      const found = watchFoldersOf(uri, configs.forNote(uri, fresh));
      // Before its first analysis a note has read nothing yet: that analysis reads the file as it is.
      if (state.analysedConfig === undefined || configKey(found) === configKey(state.analysedConfig)) continue;
      changed = true;
      schedule(uri, true);
    }
    refreshSupersededConfigs();
    if (changed) refreshHints();
  }

  /**
   * Why the note's text is not analysed: over `maxNoteSizeKb`, as long as a version whose analysis
   * outgrew the heap budget, or with a line too long to read within it; null when it is analysed.
   * The one rule of the analysis, the requests about the note and the trend view alike.
   */
  function notAnalysed(text: string, state: NoteState): Refusal | null {
    if (exceedsBytes(text, state.settings.maxNoteBytes)) return { code: 'too-large', message: tooLargeMessage(Buffer.byteLength(text, 'utf8'), state.settings.maxNoteBytes) };
    if (state.refused && text.length >= state.refused.from) return tooCostly(state.refused.message);
    const longLine = tooLongLine(text, state);
    return longLine === null ? null : tooCostly(longLine);
  }

  /**
   * Why a note with a line too long for the heap budget is not analysed (see `maxLineChars`): a
   * line is read in one step, so the heap could not be looked at before it was all read. Null
   * when no line is. A note longer than the limit is looked at once per text.
   */
  function tooLongLine(text: string, state: NoteState): string | null {
    const limit = maxLineChars();
    if (text.length <= limit) return null;
    if (state.lineCheck?.text === text) return state.lineCheck.message;
    const long = lineLongerThan(text, limit);
    const message = long && `Pneumark does not analyse this note: its line ${long.line + 1} is ${long.length.toLocaleString('en-GB')} characters long, and the analysis of a line that long could take more than the ${Math.round(heapBudgetBytes() / 1048576)} MB of memory the language server allows. Split the line, or run \`pneumark check\` on the note, which analyses a big note in a process of its own.`;
    state.lineCheck = { text, message };
    return message;
  }

  /** The analysis of a document's current text (reusing what did not change); null when it is not analysed. */
  function resultFor(doc: TextDocument, state = stateFor(doc)): NoteResult | null {
    const text = doc.getText();
    if (notAnalysed(text, state) !== null) return null;
    return state.session.update(text);
  }

  function tooCostlyMessage(read: number, length: number): string {
    const budget = Math.round(heapBudgetBytes() / 1048576);
    const share = Math.min(99, Math.floor((100 * read) / Math.max(1, length)));
    return `Pneumark stopped analysing this note: after ${share} % of it, its analysis held more than the ${budget} MB of memory the language server allows. Very many timepoints, items or findings (a bare \`@\` on every line, say) take the most; split it into smaller notes, or run \`pneumark check\` on it, which analyses a big note in a process of its own.`;
  }

  function heapFullMessage(): string {
    const budget = Math.round(heapBudgetBytes() / 1048576);
    return `Pneumark did not analyse this note for now: the notes open in the language server already hold far more than the ${budget} MB of memory it allows, though this note is small. Close the biggest of them (\`pneumark check\` analyses a big note in a process of its own); this note is analysed again at its next change.`;
  }

  /**
   * Drops the note's analysis when the heap is over its ceiling (see `heapCeilingFor` in
   * memory.ts), so that the server stays alive and answers. A big note is not read again while it
   * is at least as long as what was read then. A small note is held only to a higher ceiling,
   * since its own analysis cannot be what filled the heap: when even that is passed, the note says
   * that the other notes hold the memory, and its next version is read again. True when dropped.
   */
  function refusedForMemory(uri: string, state: NoteState, version: number, started: number, text: string): boolean {
    if (!overHeapBudget(collector, heapCeilingFor(text.length))) return false;
    const read = state.session.readLength;
    state.session = new NoteSession(state.settings.analysis);
    if (text.length <= SMALL_NOTE_CHARS) {
      publish(uri, state, version, started, [refusedDiagnostic(tooCostly(heapFullMessage()))]);
      collector.collectNow();
      return true;
    }
    state.refused = { from: Math.min(read, text.length), message: tooCostlyMessage(read, text.length) };
    publish(uri, state, version, started, [refusedDiagnostic(tooCostly(state.refused.message))]);
    collector.collectNow();
    return true;
  }

  /**
   * Analyses a note and publishes its diagnostics. A note the session has not read yet, or a
   * change of many lines, is read in steps (`NoteSession.steps`) with a turn of the event loop
   * between them, so a big note never holds up requests about others; requests about the note
   * itself wait until it is read (`afterReading`). A newer version cancels the steps left
   * (through `state.timer`, like a pending analysis) and its analysis goes on from what was read.
   */
  function analyseAndPublish(uri: string): void {
    const doc = documents.get(uri);
    if (!doc) return;
    const state = stateFor(doc);
    state.analysedConfig = state.config;
    const version = doc.version;
    const started = performance.now();
    const text = doc.getText();
    const refusal = notAnalysed(text, state);
    if (refusal !== null) {
      publish(uri, state, version, started, [refusedDiagnostic(refusal)]);
      return;
    }
    // Shorter than the version whose analysis outgrew the budget: read again.
    state.refused = null;
    // The first step is small (the code may not be compiled yet); then steps are sized to last
    // about STEP_BUDGET_MS each, from how long the last one took.
    const steps = state.session.steps(text, FIRST_STEP_LINES);
    const timing = { steps: 0, longestStepMillis: 0 };
    let lines = FIRST_STEP_LINES;
    /** Lines asked for so far (each step reads at least what it is asked, up to a timepoint line). */
    let read = 0;
    const endReading = () => closeGate(state);
    const step = () => {
      state.timer = null;
      // A newer version may have arrived meanwhile: its own analysis takes over.
      if (documents.get(uri)?.version !== version) { endReading(); return; }
      let next: IteratorResult<void, NoteResult>;
      const stepStarted = performance.now();
      try {
        next = timing.steps === 0 ? steps.next() : steps.next(lines);
      } catch (error) {
        endReading();
        connection.console.error(`pneumark: analysis failed: ${error instanceof Error ? error.stack ?? error.message : String(error)}`);
        return;
      }
      const took = performance.now() - stepStarted;
      timing.steps++;
      timing.longestStepMillis = Math.max(timing.longestStepMillis, took);
      read += lines;
      lines = nextStepLines(lines, took, read);
      if (refusedForMemory(uri, state, version, started, text)) { endReading(); return; }
      if (next.done) {
        const findings = next.value.findings;
        const shown = findingsToPublish(findings);
        const diagnostics = shown.map((f) => diagnosticOf(f, uri));
        if (shown.length < findings.length) diagnostics.push(tooManyFindings(findings.length, shown.length));
        const held = heldAtKeystroke(uri, state, version, text, shown);
        publish(uri, state, version, started, held.size === 0 ? diagnostics : diagnostics.filter((d) => !held.has(d)), timing);
        if (held.size > 0) holdUntilPause(uri, state, version, diagnostics, held);
        endReading();
        return;
      }
      openGate(state);
      const handle = setImmediate(step);
      state.timer = { cancel: () => { clearImmediate(handle); endReading(); } };
    };
    step();
  }

  /**
   * `answer()` now when the note's analysis is at hand or cheap (an edit); otherwise once the note
   * is read in steps, which this starts when no analysis is on its way (a request can come before
   * the note's first analysis). So a request about a big note waits its turn instead of holding
   * everything up while the rest of the note is read at once.
   */
  function afterReading<R>(uri: string, fallback: R, answer: () => Answer<R>, token?: CancellationToken): Answer<R> {
    const doc = documents.get(uri);
    if (!doc) return answer();
    const state = notes.get(uri) ?? guard('open', undefined, () => stateFor(doc))(undefined);
    if (state && !state.reading && wouldStep(state, doc)) schedule(uri, true);
    const reading = state?.reading;
    if (!reading) return answer();
    // A request cancelled while it waits is answered so at once, not once the note is read.
    return new Promise<R | ResponseError<void>>((resolve) => {
      const watch = token?.onCancellationRequested(() => resolve(cancelled()));
      reading.then(
        () => { watch?.dispose(); resolve(token?.isCancellationRequested ? cancelled() : afterReading(uri, fallback, answer, token)); },
        () => { watch?.dispose(); resolve(fallback); },
      );
    });
  }

  /**
   * Runs whole-note work (steps: see core/util/steps.ts) in slices of about SLICE_MS, with a turn
   * of the event loop between them, so that other requests (about this note or others) are
   * answered meanwhile. Between slices a request the client cancelled stops and is answered with
   * RequestCancelled. Work done within its first slice is answered at once. A failure is logged
   * and answered with `fallback`, as `guard` does.
   */
  function inSlices<R>(name: string, fallback: R, steps: Steps<R>, token?: CancellationToken): Answer<R> {
    const slice = (): IteratorResult<void, R> => {
      const until = performance.now() + SLICE_MS;
      for (;;) {
        const next = steps.next();
        if (next.done || performance.now() >= until) return next;
      }
    };
    const failed = (error: unknown): R => {
      connection.console.error(`pneumark: ${name} failed: ${error instanceof Error ? error.stack ?? error.message : String(error)}`);
      return fallback;
    };
    let first: IteratorResult<void, R>;
    try {
      first = slice();
    } catch (error) {
      return failed(error);
    }
    if (first.done) return first.value;
    return new Promise<R | ResponseError<void>>((resolve) => {
      const go = () => {
        if (token?.isCancellationRequested) { resolve(cancelled()); return; }
        try {
          const next = slice();
          if (next.done) resolve(next.value);
          else setImmediate(go);
        } catch (error) {
          resolve(failed(error));
        }
      };
      setImmediate(go);
    });
  }

  /**
   * Answers that are made of the whole note and asked for again and again while it does not
   * change (the outline at every edit's pause, the trend view's points), with their JSON: kept per
   * analysis (an unchanged text gives the same analysis object, and a change a new one).
   */
  const keptAnswers = new WeakMap<NoteResult, { symbols?: DocumentSymbol[]; trends?: TrendPointData[] }>();
  function keptFor(result: NoteResult): { symbols?: DocumentSymbol[]; trends?: TrendPointData[] } {
    let kept = keptAnswers.get(result);
    if (!kept) keptAnswers.set(result, (kept = {}));
    return kept;
  }

  function* symbolSteps(result: NoteResult): Steps<DocumentSymbol[]> {
    const kept = keptFor(result);
    if (kept.symbols) return kept.symbols;
    const infos = yield* documentSymbolSteps(result);
    const symbols: DocumentSymbol[] = [];
    for (let i = 0; i < infos.length; i++) {
      symbols.push(toDocumentSymbol(infos[i]!));
      if (i % 128 === 127) yield;
    }
    yield* prepared(symbols);
    kept.symbols = symbols;
    return symbols;
  }

  function* trendSteps(result: NoteResult): Steps<TrendPointData[]> {
    const kept = keptFor(result);
    if (kept.trends) return kept.trends;
    const points = yield* trendPointSteps(result);
    yield* prepared(points);
    kept.trends = points;
    return points;
  }

  /** Whether analysing the document's text now would take steps (a first read, a big change). */
  function wouldStep(state: NoteState, doc: TextDocument): boolean {
    const text = doc.getText();
    return notAnalysed(text, state) === null && state.session.wouldStep(text, FIRST_STEP_LINES);
  }

  /**
   * The diagnostics held back after a keystroke (the version analysed is the one it made): new
   * findings at the place typed (`heldWhileTyping`), so that a value or word half typed does not
   * flash an error at each key. None when `typingPauseMs` is 0.
   */
  function heldAtKeystroke(uri: string, state: NoteState, version: number, text: string, findings: readonly NoteResult['findings'][number][]): Set<Diagnostic> {
    const held = new Set<Diagnostic>();
    const keystroke = keystrokes.get(uri);
    if (state.settings.typingPauseMs === 0 || keystroke?.version !== version) return held;
    const doc = documents.get(uri);
    if (!doc) return held;
    const line = keystroke.at.line;
    const lineText = text.slice(doc.offsetAt({ line, character: 0 }), doc.offsetAt({ line, character: Number.MAX_SAFE_INTEGER }));
    const before = state.diagnostics;
    const shownBefore = (f: NoteResult['findings'][number]) => {
      const d = diagnosticOf(f, uri);
      return before.some((b) => b === d || (b.code === d.code && b.range.start.line === d.range.start.line && b.range.start.character === d.range.start.character));
    };
    for (const f of heldWhileTyping(findings, lineText, keystroke.at, shownBefore)) held.add(diagnosticOf(f, uri));
    return held;
  }

  /** Shows every diagnostic of `version` once the note has not changed for `typingPauseMs` (or at once when it is saved). */
  function holdUntilPause(uri: string, state: NoteState, version: number, all: Diagnostic[], held: ReadonlySet<Diagnostic>): void {
    const handle = setTimeout(() => showHeld(uri, state), state.settings.typingPauseMs);
    state.held = { version, all, held, cancel: () => clearTimeout(handle) };
  }

  /** Publishes the diagnostics held back, when the version they belong to is still the note's. */
  function showHeld(uri: string, state: NoteState): void {
    const held = state.held;
    if (!held) return;
    held.cancel();
    state.held = null;
    if (notes.get(uri) !== state || documents.get(uri)?.version !== held.version) return;
    state.diagnostics = held.all;
    void connection.sendDiagnostics({ uri, version: held.version, diagnostics: held.all });
  }

  function publish(uri: string, state: NoteState, version: number, started: number, diagnostics: Diagnostic[], timing = { steps: 1, longestStepMillis: performance.now() - started }): void {
    // Never publish over a newer version.
    if (documents.get(uri)?.version !== version) return;
    state.published = version;
    state.diagnostics = diagnostics;
    void connection.sendDiagnostics({ uri, version, diagnostics });
    const analysed: AnalysedParams = { uri, version, millis: performance.now() - started, ...timing };
    void connection.sendNotification(ANALYSED_NOTIFICATION, analysed);
    collector.analysed();
  }

  function schedule(uri: string, immediate: boolean): void {
    const state = notes.get(uri);
    state?.timer?.cancel();
    // What was held for the last version is superseded by the analysis of the next.
    if (state?.held) { state.held.cancel(); state.held = null; }
    // An analysis that will take steps: requests about the note wait for it from now on.
    const doc = documents.get(uri);
    if (state && doc && wouldStep(state, doc)) openGate(state);
    const delay = immediate ? 0 : (state?.settings.debounceMs ?? DEFAULT_CLIENT_SETTINGS.debounceMs);
    const run = () => {
      const s = notes.get(uri);
      if (s) s.timer = null;
      guard('analysis', undefined, analyseAndPublish)(uri);
      // Nothing left to do for it (done, or failed before its steps): requests need not wait.
      if (s && s.timer === null) closeGate(s);
    };
    // No debounce: right after the pending messages (a timer would wait a millisecond at least).
    if (delay === 0) {
      const handle = setImmediate(run);
      if (state) state.timer = { cancel: () => { clearImmediate(handle); closeGate(state); } };
      return;
    }
    const handle = setTimeout(run, delay);
    if (state) state.timer = { cancel: () => { clearTimeout(handle); closeGate(state); } };
  }

  documents.onDidOpen((e) => {
    void pullClientSettings(e.document.uri).then(() => {
      // Closed (or closed and opened again) while its settings were asked for: nothing to do for
      // this opening. Its folders would otherwise stay watched, and its state kept, for good.
      if (documents.get(e.document.uri) !== e.document) return;
      guard('open', undefined, () => {
        // The note's folders are looked at afresh (a file may have been made where no watch
        // was, or while no open note needed the folder watched), then watched.
        const found = configs.forNote(e.document.uri, true);
        stateFor(e.document);
        watchFoldersOf(e.document.uri, found);
        recheckUnwatched(e.document.uri);
        refreshSupersededConfigs();
      })(undefined);
      schedule(e.document.uri, true);
    });
  });
  documents.onDidSave((e) => {
    // Saving is a pause: what was held back at the place typed is shown now.
    const state = notes.get(e.document.uri);
    if (state?.held) guard('save', undefined, () => showHeld(e.document.uri, state))(undefined);
    if (state?.typing) guard('save', undefined, () => endTyping(state))(undefined);
    guard('save', undefined, recheckUnwatched)(undefined);
  });

  /** Notes that read a folder that could not be watched: their project files are looked at again (a stat per folder). */
  function recheckUnwatched(except?: string): void {
    const unwatched = watcher.unwatched().filter((uri) => uri !== except);
    if (unwatched.length > 0) recheckConfigs(unwatched, true);
  }
  documents.onDidChangeContent((e) => {
    if (!notes.has(e.document.uri)) return; // the open handler schedules the first analysis
    guard('typing', undefined, () => followTyping(e.document))(undefined);
    schedule(e.document.uri, false);
  });

  /** Notes the line a keystroke typed in (see `NoteState.typing`); an edit that is no keystroke ends it. */
  function followTyping(doc: TextDocument): void {
    const state = notes.get(doc.uri);
    if (!state) return;
    const typed = state.typing;
    state.typing?.cancel();
    state.typing = null;
    const keystroke = keystrokes.get(doc.uri);
    if (keystroke?.version !== doc.version || state.settings.typingPauseMs === 0) {
      // Another line was being typed: its hints come back now.
      if (typed) refreshHints();
      return;
    }
    const handle = setTimeout(() => endTyping(state), state.settings.typingPauseMs);
    state.typing = { version: doc.version, line: keystroke.at.line, cancel: () => clearTimeout(handle) };
    if (typed && typed.line !== keystroke.at.line) refreshHints();
  }

  /** Typing paused (or the note was saved): the hints of the line typed are asked for again. */
  function endTyping(state: NoteState): void {
    if (!state.typing) return;
    state.typing.cancel();
    state.typing = null;
    refreshHints();
  }
  documents.onDidClose((e) => {
    const state = notes.get(e.document.uri);
    state?.timer?.cancel();
    state?.held?.cancel();
    state?.typing?.cancel();
    keystrokes.delete(e.document.uri);
    notes.delete(e.document.uri);
    clientSettings.delete(e.document.uri);
    watcher.release(e.document.uri);
    void connection.sendDiagnostics({ uri: e.document.uri, diagnostics: [] });
    guard('close', undefined, refreshSupersededConfigs)(undefined);
  });

  /**
   * Hints follow the settings (hint categories, the gas unit), but an editor asks for them again
   * only when a note changes: after a change of settings it is told to (when it can be).
   */
  function refreshHints(): void {
    if (canRefreshHints) void connection.languages.inlayHint.refresh().catch(() => undefined);
  }

  connection.onDidChangeConfiguration((params: { settings?: unknown }) => {
    // Each note keeps the settings it has until the editor's answer about it comes (they are
    // replaced there): an edit or a request in between would otherwise be analysed with the
    // defaults, show checks the user switched off, and make the note be read afresh twice.
    if (!canPullConfiguration) {
      // A client that cannot be asked pushes its settings: `{ settings: { pneumark: { ... } } }`.
      const pushed: unknown = params?.settings;
      if (pushed && typeof pushed === 'object') pushedSettings = readSettings((pushed as Record<string, unknown>)['pneumark'] ?? {});
    }
    const pulled = documents.all().map((doc) => pullClientSettings(doc.uri).then(() => schedule(doc.uri, true)));
    void Promise.all(pulled).then(refreshHints, refreshHints);
  });

  connection.onDidChangeWatchedFiles(() => guard('watched files', undefined, recheckConfigs)(undefined));

  const withResult = <P extends { textDocument: { uri: string } }, R>(name: string, fallback: R, body: (result: NoteResult, doc: TextDocument, state: NoteState, params: P, token: CancellationToken) => Answer<R>) =>
    (params: P, token: CancellationToken): Answer<R> => afterReading(params.textDocument.uri, fallback, () => guard<P, Answer<R>>(name, fallback, (p) => {
      const doc = documents.get(p.textDocument.uri);
      if (!doc) return fallback;
      const state = stateFor(doc);
      const result = resultFor(doc, state);
      return result ? body(result, doc, state, p, token) : fallback;
    })(params), token);

  connection.onHover(withResult('hover', null, (result, _doc, _state, params) => {
    const hover = hoverAt(result, params.position);
    return hover ? { range: hover.range, contents: { kind: 'markdown', value: hover.markdown } } : null;
  }));

  connection.onCompletion(withResult('completion', [], (result, _doc, _state, params) =>
    completionsAt(result, params.position).map((c, i) => toCompletionItem(c, i, params.position, insertReplace))));

  connection.languages.inlayHint.on(withResult('inlay hints', [], (result, doc, state, params, token) => inSlices('inlay hints', [], (function* () {
    const all = yield* inlayHintSteps(result, { start: params.range.start.line, end: params.range.end.line }, { categories: state.settings.hints });
    const typing = state.typing?.version === doc.version ? state.typing.line : -1;
    const found = typing < 0 ? all : all.filter((h) => h.position.line !== typing);
    return yield* prepared(found.map((h) => toInlayHint(h, deferHintTooltips ? { uri: doc.uri, version: doc.version, line: h.position.line, category: h.category } : null)));
  })(), token)));

  // The tooltip of a hint sent without it: the same hint of the same version of the note.
  connection.languages.inlayHint.resolve((unresolved: InlayHint) => {
    const ref: unknown = unresolved.data;
    if (!isHintRef(ref)) return unresolved;
    return afterReading(ref.uri, unresolved, () => guard('inlay hint tooltip', unresolved, (hint: InlayHint): InlayHint => {
      const doc = documents.get(ref.uri);
      if (!doc || doc.version !== ref.version) return hint;
      const state = stateFor(doc);
      const result = resultFor(doc, state);
      if (!result) return hint;
      const found = inlayHints(result, { start: ref.line, end: ref.line }, { categories: state.settings.hints })
        .find((h) => h.category === ref.category && h.position.line === ref.line);
      return found ? { ...hint, tooltip: { kind: 'markdown', value: found.tooltipMarkdown } } : hint;
    })(unresolved));
  });

  connection.onCodeAction(withResult('code actions', [], (result, doc, state, params, token) => inSlices('code actions', [], (function* () {
    const all = yield* codeActionSteps(result, params.range);
    // A quick fix of problems held back while typed waits with them (`temp 38.` is no full stop
    // to remove while `38.2` is being typed).
    const held = state.held?.version === doc.version ? state.held.held : null;
    const actions = held ? all.filter((a) => a.kind !== 'quickfix' || !a.resolves || a.resolves.length === 0 || !a.resolves.every((f) => held.has(diagnosticOf(f, doc.uri)))) : all;
    const diagnostics = params.context.diagnostics.length > 0 ? params.context.diagnostics : state.diagnostics.filter((d) => rangesOverlap(d.range, params.range));
    const only = params.context.only;
    return actions
      .filter((a) => !only || only.some((k) => a.kind === k || a.kind.startsWith(`${k}.`)))
      .map((a) => toCodeAction(a, doc.uri, diagnostics));
  })(), token)));

  connection.onDocumentSymbol(withResult('symbols', [], (result, _doc, _state, _params, token) => inSlices('symbols', [], symbolSteps(result), token)));
  connection.onFoldingRanges(withResult('folding', [], (result) => foldingRanges(result).map((r) => (r.kind === 'region' ? { startLine: r.startLine, endLine: r.endLine, kind: FoldingRangeKind.Region } : { startLine: r.startLine, endLine: r.endLine }))));

  /** The note's text when it may be formatted: not over `maxNoteSizeKb` (like its analysis). */
  function formattable(uri: string): string | null {
    const doc = documents.get(uri);
    if (!doc) return null;
    const text = doc.getText();
    const maxBytes = (notes.get(uri)?.settings ?? settingsFor(uri)).maxNoteBytes;
    return exceedsBytes(text, maxBytes) ? null : text;
  }

  /**
   * The edits that format lines `first` to `last` of the note (both inclusive), as `formatEdits`
   * gives them. Many lines (a big note formatted whole, or a big paste formatted as it is pasted)
   * are formatted in steps of about STEP_BUDGET_MS, with a turn of the event loop between them, so
   * requests about other notes are answered meanwhile; lines are formatted one by one, so the
   * steps' edits together are those of one call. A request the client cancels is answered with
   * RequestCancelled between steps. When the note changes before the last step, the edits made
   * would be for a text that is gone: a whole note (`whole`) is formatted again as it is now, and
   * the edits are those of the text the editor holds (a client applies them to it; VS Code drops
   * an answer about a version that is gone, whatever it holds), at most FORMAT_RESTARTS times (a
   * note typed into all along gets ContentModified); a range, which named lines of the old text,
   * gets ContentModified at once. A note closed meanwhile gets no edits.
   */
  function formatInSteps(uri: string, text: string, first: number, last: number, token: CancellationToken | undefined, whole: boolean, restarts = 0): Answer<TextEdit[]> {
    if (last - first < FORMAT_STEP_LINES) return formatEdits(text, { start: first, end: last });
    const version = documents.get(uri)?.version;
    const edits: TextEdit[] = [];
    let from = first;
    let lines = FORMAT_STEP_LINES;
    return new Promise<TextEdit[] | ResponseError<void>>((resolve) => {
      const step = () => {
        if (token?.isCancellationRequested) { resolve(cancelled()); return; }
        const doc = documents.get(uri);
        if (!doc) { resolve([]); return; }
        if (doc.version !== version) {
          const again = whole && restarts < FORMAT_RESTARTS ? formattable(uri) : null;
          if (again === null) { resolve(whole && restarts < FORMAT_RESTARTS ? [] : contentModified()); return; }
          resolve(formatInSteps(uri, again, 0, doc.lineCount - 1, token, true, restarts + 1));
          return;
        }
        try {
          const started = performance.now();
          const to = Math.min(last, from + lines - 1);
          for (const e of formatEdits(text, { start: from, end: to })) edits.push(e);
          from = to + 1;
          lines = nextStepLines(lines, performance.now() - started);
        } catch (error) {
          connection.console.error(`pneumark: formatting failed: ${error instanceof Error ? error.stack ?? error.message : String(error)}`);
          resolve([]);
          return;
        }
        if (from > last) resolve(edits);
        else setImmediate(step);
      };
      step();
    });
  }

  connection.onDocumentFormatting(guard('formatting', [], (params: { textDocument: { uri: string } }, token?: CancellationToken): Answer<TextEdit[]> => {
    const text = formattable(params.textDocument.uri);
    const doc = documents.get(params.textDocument.uri);
    return text === null || !doc ? [] : formatInSteps(doc.uri, text, 0, doc.lineCount - 1, token, true);
  }));
  connection.onDocumentRangeFormatting(guard('range formatting', [], (params: { textDocument: { uri: string }; range: Range }, token?: CancellationToken): Answer<TextEdit[]> => {
    const text = formattable(params.textDocument.uri);
    const lines = formattedLines(params.range);
    return text === null || lines === null ? [] : formatInSteps(params.textDocument.uri, text, lines.start, lines.end, token, false);
  }));

  connection.onRequest<TrendsResult | null, void>(TRENDS_REQUEST, (params: TrendsParams, token: CancellationToken): Answer<TrendsResult | null> => afterReading(params.uri, null, () => guard('trends', null, (p: TrendsParams): Answer<TrendsResult | null> => {
    const doc = documents.get(p.uri);
    if (!doc) return null;
    const state = stateFor(doc);
    const text = doc.getText();
    // A note not analysed (too large, or too costly) says so, rather than reading as a note without timepoints.
    const why = notAnalysed(text, state);
    if (why !== null) return { uri: p.uri, version: doc.version, points: [], notAnalysed: why.message };
    const result = resultFor(doc, state);
    const { uri, version } = doc;
    if (!result) return { uri, version, points: [] };
    return inSlices('trends', null, (function* () {
      const points = yield* trendSteps(result);
      return { uri, version, points };
    })(), token);
  })(params), token));

  connection.onRequest<SummaryResult | null, void>(SUMMARY_REQUEST, (params: SummaryParams) => afterReading(params.uri, null, () => guard('summary', null, (p: SummaryParams): SummaryResult | null => {
    const doc = documents.get(p.uri);
    if (!doc) return null;
    const result = resultFor(doc);
    return result ? timepointSummary(result, p.line) : null;
  })(params)));

  connection.onRequest<PlainTextEdit[], void>(CONVERT_UNITS_REQUEST, (params: ConvertUnitsParams, token: CancellationToken): Answer<PlainTextEdit[]> => afterReading(params.uri, [], () => guard('convert units', [], (p: ConvertUnitsParams): Answer<PlainTextEdit[]> => {
    const doc = documents.get(p.uri);
    const to = p.to;
    if (!doc || (to !== 'mmHg' && to !== 'kPa')) return [];
    const result = resultFor(doc);
    return result ? inSlices('convert units', [], (function* () { return yield* prepared(yield* convertNoteUnitSteps(result, to)); })(), token) : [];
  })(params), token));

  documents.listen(connection);
  connection.listen();
  log('pneumark: language server started');
}
