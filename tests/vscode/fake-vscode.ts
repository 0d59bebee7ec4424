/**
 * A small stand-in for the `vscode` module, enough to run the extension's client code in unit
 * tests without VS Code: editors, documents, the status bar, messages, quick picks, webview
 * panels, events. Each test file mocks `vscode` with `vscodeModule` and calls `resetFake()`
 * before each test. It records what the user would have seen (messages, the status bar item,
 * what was posted to a webview) for the tests to read.
 */
type Listener<T> = (value: T) => unknown;

export class EventEmitter<T> {
  private listeners: Listener<T>[] = [];
  readonly event = (listener: Listener<T>): { dispose(): void } => {
    this.listeners.push(listener);
    return { dispose: () => { this.listeners = this.listeners.filter((l) => l !== listener); } };
  };
  fire(value: T): void {
    for (const l of [...this.listeners]) l(value);
  }
  dispose(): void {
    this.listeners = [];
  }
  get count(): number {
    return this.listeners.length;
  }
}

export class Uri {
  readonly authority = '';
  readonly query = '';
  private constructor(readonly scheme: string, readonly path: string, readonly fragment = '') {}
  toJSON(): string {
    return this.toString();
  }
  static file(path: string): Uri {
    return new Uri('file', path);
  }
  static parse(value: string, _strict?: boolean): Uri {
    const m = /^([a-z][a-z0-9+.-]*):(?:\/\/)?([^#]*)(?:#(.*))?$/i.exec(value);
    if (!m) throw new Error(`not a URI: ${value}`);
    return new Uri(m[1]!, m[2]!, m[3] ?? '');
  }
  static joinPath(base: Uri, ...parts: string[]): Uri {
    return new Uri(base.scheme, [base.path, ...parts].join('/'), '');
  }
  with(change: { fragment?: string }): Uri {
    return new Uri(this.scheme, this.path, change.fragment ?? this.fragment);
  }
  get fsPath(): string {
    return this.path;
  }
  toString(): string {
    return `${this.scheme}:${this.scheme === 'file' ? '//' : ''}${this.path}${this.fragment ? `#${this.fragment}` : ''}`;
  }
}

export class Position {
  constructor(readonly line: number, readonly character: number) {}
}

export class Range {
  readonly start: Position;
  readonly end: Position;
  constructor(a: Position | number, b: Position | number, c?: number, d?: number) {
    if (typeof a === 'number') {
      this.start = new Position(a, b as number);
      this.end = new Position(c!, d!);
    } else {
      this.start = a;
      this.end = b as Position;
    }
  }
}

export class Selection extends Range {
  get active(): Position {
    return this.end;
  }
}

export class SnippetString {
  constructor(readonly value: string) {}
}

export class WorkspaceEdit {
  readonly edits: { uri: Uri; range: Range; newText: string }[] = [];
  replace(uri: Uri, range: Range, newText: string): void {
    this.edits.push({ uri, range, newText });
  }
}

export enum StatusBarAlignment { Left = 1, Right = 2 }
export enum ViewColumn { Active = -1, Beside = -2, One = 1, Two = 2, Three = 3 }
export enum LogLevel { Off = 0, Trace = 1, Debug = 2, Info = 3, Warning = 4, Error = 5 }

/** A document: its text in lines, a version bumped by every change. */
export class FakeDocument {
  version = 1;
  isClosed = false;
  readonly isUntitled: boolean;
  readOnly = false;
  private lines: string[];
  constructor(readonly uri: Uri, text: string, public languageId = 'pneumark') {
    this.lines = text.split('\n');
    this.isUntitled = uri.scheme === 'untitled';
  }
  get lineCount(): number {
    return this.lines.length;
  }
  lineAt(line: number): { text: string; range: Range; isEmptyOrWhitespace: boolean } {
    const text = this.lines[line] ?? '';
    return { text, range: new Range(line, 0, line, text.length), isEmptyOrWhitespace: text.trim() === '' };
  }
  getText(): string {
    return this.lines.join('\n');
  }
  /** Replaces text between two positions (as an edit in the editor would). */
  replace(range: Range, newText: string): void {
    const text = this.getText();
    const offset = (p: Position) => this.lines.slice(0, p.line).reduce((n, l) => n + l.length + 1, 0) + p.character;
    this.lines = (text.slice(0, offset(range.start)) + newText + text.slice(offset(range.end))).split('\n');
    this.version++;
  }
}

export class FakeEditor {
  selection: Selection;
  viewColumn: ViewColumn | undefined = ViewColumn.One;
  readonly snippets: { snippet: string; position: Position }[] = [];
  constructor(readonly document: FakeDocument, line = 0) {
    this.selection = new Selection(line, 0, line, 0);
  }
  async insertSnippet(snippet: SnippetString, position: Position): Promise<boolean> {
    if (this.document.readOnly) return false;
    this.snippets.push({ snippet: snippet.value, position });
    // Placeholders and choices as their first option, for a text to read back.
    const text = snippet.value.replace(/\$\{\d+\|([^,|]*)[^}]*\}/g, '$1').replace(/\$\{\d+:([^}]*)\}/g, '$1').replace(/\$\d+/g, '');
    this.document.replace(new Range(position, position), text);
    return true;
  }
}

export interface FakeStatusItem {
  id: string;
  name: string | undefined;
  text: string;
  tooltip: string | undefined;
  command: string | undefined;
  accessibilityInformation: { label: string; role?: string } | undefined;
  visible: boolean;
  /** Times the item was shown or hidden, or its text changed: a flicker shows up here. */
  changes: string[];
  show(): void;
  hide(): void;
  dispose(): void;
}

function statusItem(id: string): FakeStatusItem {
  let text = '';
  const item: FakeStatusItem = {
    id, name: undefined, tooltip: undefined, command: undefined, accessibilityInformation: undefined, visible: false, changes: [],
    get text() { return text; },
    set text(value: string) { text = value; item.changes.push(`text ${value}`); },
    show() { if (!item.visible) item.changes.push('show'); item.visible = true; },
    hide() { if (item.visible) item.changes.push('hide'); item.visible = false; },
    dispose() { item.visible = false; },
  };
  return item;
}

export class FakeWebviewPanel {
  title: string;
  viewColumn: ViewColumn | undefined = ViewColumn.Two;
  disposed = false;
  readonly posted: unknown[] = [];
  readonly revealed: (ViewColumn | undefined)[] = [];
  private readonly disposeEmitter = new EventEmitter<void>();
  private readonly messageEmitter = new EventEmitter<unknown>();
  readonly onDidDispose = this.disposeEmitter.event;
  /**
   * A page VS Code has not shown yet (a panel being restored): as in VS Code, a message posted
   * to it is answered only once it is shown (`load`).
   */
  initializing = false;
  private readonly waiting: (() => void)[] = [];
  load(): void {
    this.initializing = false;
    for (const resolve of this.waiting.splice(0)) resolve();
  }
  readonly webview = {
    html: '',
    options: {} as Record<string, unknown>,
    cspSource: 'https://fake.vscode-cdn.net',
    asWebviewUri: (uri: Uri) => Uri.parse(`https://fake.vscode-cdn.net${uri.path}`),
    postMessage: async (message: unknown) => {
      this.posted.push(message);
      if (this.initializing) await new Promise<void>((resolve) => this.waiting.push(resolve));
      return true;
    },
    onDidReceiveMessage: this.messageEmitter.event,
  };
  constructor(readonly viewType: string, title: string, readonly options: Record<string, unknown>) {
    this.title = title;
  }
  reveal(column?: ViewColumn): void {
    this.revealed.push(column);
  }
  /** The page sends a message. */
  receive(message: unknown): void {
    this.messageEmitter.fire(message);
  }
  dispose(): void {
    if (this.disposed) return;
    this.disposed = true;
    this.disposeEmitter.fire();
  }
  /** What was posted of one type. */
  postedOf(type: string): Record<string, unknown>[] {
    return this.posted.filter((m): m is Record<string, unknown> => (m as { type?: string }).type === type);
  }
}

export interface Shown {
  kind: 'info' | 'warning' | 'error';
  message: string;
  items: string[];
}

export const state = {
  activeTextEditor: undefined as FakeEditor | undefined,
  visibleTextEditors: [] as FakeEditor[],
  documents: [] as FakeDocument[],
  messages: [] as Shown[],
  /** The answer to the next message with buttons, by button title. */
  messageAnswer: undefined as string | undefined,
  /** Picks the item of a quick pick (by label); undefined cancels. */
  pick: undefined as string | undefined,
  quickPicks: [] as { items: { label: string }[]; options: unknown }[],
  statusItems: [] as FakeStatusItem[],
  panels: [] as FakeWebviewPanel[],
  commands: new Map<string, (...args: unknown[]) => unknown>(),
  executed: [] as { command: string; args: unknown[] }[],
  /** Commands that fail when executed (as one from a disabled extension would). */
  failingCommands: new Set<string>(),
  shownDocuments: [] as { uri: string; options: Record<string, unknown> | undefined }[],
  appliedEdits: [] as WorkspaceEdit[],
  files: new Map<string, string>(),
  configuration: new Map<string, unknown>(),
  serializers: new Map<string, unknown>(),
  outputLines: [] as string[],
  events: {
    selection: new EventEmitter<{ textEditor: FakeEditor }>(),
    activeEditor: new EventEmitter<FakeEditor | undefined>(),
    openDocument: new EventEmitter<FakeDocument>(),
    closeDocument: new EventEmitter<FakeDocument>(),
    configuration: new EventEmitter<{ affectsConfiguration(section: string): boolean }>(),
  },
};

export function resetFake(): void {
  state.activeTextEditor = undefined;
  state.visibleTextEditors = [];
  state.documents = [];
  state.messages = [];
  state.messageAnswer = undefined;
  state.pick = undefined;
  state.quickPicks = [];
  state.statusItems = [];
  state.panels = [];
  state.commands = new Map();
  state.executed = [];
  state.failingCommands = new Set();
  state.shownDocuments = [];
  state.appliedEdits = [];
  state.files = new Map();
  state.configuration = new Map();
  state.serializers = new Map();
  state.outputLines = [];
  for (const e of Object.values(state.events)) e.dispose();
}

/** Opens a note in an editor and makes it the active one. */
export function openEditor(path: string, text: string, options: { line?: number; languageId?: string; scheme?: string } = {}): FakeEditor {
  const uri = options.scheme === 'untitled' ? Uri.parse(`untitled:${path}`) : Uri.file(path);
  const document = new FakeDocument(uri, text, options.languageId ?? 'pneumark');
  state.documents.push(document);
  state.events.openDocument.fire(document);
  const editor = new FakeEditor(document, options.line ?? 0);
  state.visibleTextEditors.push(editor);
  activate(editor);
  return editor;
}

export function activate(editor: FakeEditor | undefined): void {
  state.activeTextEditor = editor;
  state.events.activeEditor.fire(editor);
}

export function moveCursor(editor: FakeEditor, line: number): void {
  editor.selection = new Selection(line, 0, line, 0);
  state.events.selection.fire({ textEditor: editor });
}

export function closeDocument(document: FakeDocument): void {
  document.isClosed = true;
  state.documents = state.documents.filter((d) => d !== document);
  state.visibleTextEditors = state.visibleTextEditors.filter((e) => e.document !== document);
  if (state.activeTextEditor?.document === document) activate(undefined);
  state.events.closeDocument.fire(document);
}

/**
 * Changes a document's language mode as VS Code tells extensions of it: the same document is
 * closed, takes the new language, and is opened again.
 */
export function changeLanguage(document: FakeDocument, languageId: string): void {
  state.events.closeDocument.fire(document);
  document.languageId = languageId;
  state.events.openDocument.fire(document);
}

function show(kind: Shown['kind']) {
  return async (message: string, ...items: unknown[]): Promise<string | undefined> => {
    const titles = items.filter((i): i is string => typeof i === 'string');
    state.messages.push({ kind, message, items: titles });
    return titles.includes(state.messageAnswer ?? '\0') ? state.messageAnswer : undefined;
  };
}

const disposable = { dispose: () => undefined };

export const vscodeModule = {
  EventEmitter, Uri, Position, Range, Selection, SnippetString, WorkspaceEdit, StatusBarAlignment, ViewColumn, LogLevel,
  window: {
    createOutputChannel: (name: string) => {
      const lines: string[] = [];
      state.outputLines = lines;
      const log = (level: string) => (m: unknown) => { lines.push(`[${level}] ${String(m)}`); };
      return {
        name, logLevel: LogLevel.Info, onDidChangeLogLevel: new EventEmitter<LogLevel>().event,
        trace: log('trace'), debug: log('debug'), info: log('info'), warn: log('warning'), error: log('error'),
        append: log('info'), appendLine: log('info'), replace: () => undefined, clear: () => undefined,
        show: () => undefined, hide: () => undefined, dispose: () => undefined,
      };
    },
    get activeTextEditor() { return state.activeTextEditor; },
    get visibleTextEditors() { return state.visibleTextEditors; },
    onDidChangeTextEditorSelection: (l: Listener<{ textEditor: FakeEditor }>) => state.events.selection.event(l),
    onDidChangeActiveTextEditor: (l: Listener<FakeEditor | undefined>) => state.events.activeEditor.event(l),
    createStatusBarItem: (id: string) => {
      const item = statusItem(id);
      state.statusItems.push(item);
      return item;
    },
    showInformationMessage: show('info'),
    showWarningMessage: show('warning'),
    showErrorMessage: show('error'),
    showQuickPick: async <T extends { label: string }>(items: T[], options: unknown): Promise<T | undefined> => {
      state.quickPicks.push({ items, options });
      return items.find((i) => i.label === state.pick);
    },
    showTextDocument: async (uri: Uri, options?: Record<string, unknown>) => {
      const document = state.documents.find((d) => d.uri.toString() === uri.toString());
      if (!document && uri.scheme === 'untitled') throw new Error('closed untitled note');
      state.shownDocuments.push({ uri: uri.toString(), options });
      return document;
    },
    createWebviewPanel: (viewType: string, title: string, _column: unknown, options: Record<string, unknown>) => {
      const panel = new FakeWebviewPanel(viewType, title, options);
      state.panels.push(panel);
      return panel;
    },
    registerWebviewPanelSerializer: (viewType: string, serializer: unknown) => {
      state.serializers.set(viewType, serializer);
      return disposable;
    },
  },
  workspace: {
    createFileSystemWatcher: () => disposable,
    get textDocuments() { return state.documents; },
    onDidOpenTextDocument: (l: Listener<FakeDocument>) => state.events.openDocument.event(l),
    onDidCloseTextDocument: (l: Listener<FakeDocument>) => state.events.closeDocument.event(l),
    onDidChangeConfiguration: (l: Listener<{ affectsConfiguration(section: string): boolean }>) => state.events.configuration.event(l),
    getConfiguration: (section: string) => ({
      get: <T>(key: string, fallback: T): T => (state.configuration.has(`${section}.${key}`) ? state.configuration.get(`${section}.${key}`) as T : fallback),
    }),
    asRelativePath: (uri: Uri) => uri.path.replace(/^\/work\//, ''),
    applyEdit: async (edit: WorkspaceEdit) => {
      const document = state.documents.find((d) => d.uri.toString() === edit.edits[0]?.uri.toString());
      if (!document || document.readOnly) return false;
      // From the end, so earlier edits do not move later ones.
      for (const e of [...edit.edits].reverse()) document.replace(e.range, e.newText);
      state.appliedEdits.push(edit);
      return true;
    },
    openTextDocument: async (uri: Uri) => {
      const known = state.documents.find((d) => d.uri.toString() === uri.toString());
      if (known) return known;
      const text = state.files.get(uri.toString());
      if (text === undefined) throw new Error(`cannot open ${uri.toString()}`);
      const document = new FakeDocument(uri, text);
      state.documents.push(document);
      state.events.openDocument.fire(document);
      return document;
    },
    fs: {
      readFile: async (uri: Uri) => {
        const text = state.files.get(uri.toString());
        if (text === undefined) throw new Error(`no file ${uri.toString()}`);
        return new TextEncoder().encode(text);
      },
    },
  },
  commands: {
    registerCommand: (id: string, run: (...args: unknown[]) => unknown) => {
      state.commands.set(id, run);
      return disposable;
    },
    executeCommand: async (command: string, ...args: unknown[]) => {
      state.executed.push({ command, args });
      if (state.failingCommands.has(command)) throw new Error(`command '${command}' not found`);
      return state.commands.get(command)?.(...args);
    },
  },
};
