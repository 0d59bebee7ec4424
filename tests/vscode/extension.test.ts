// The extension's activation as a whole, with stand-ins for VS Code (fake-vscode.ts) and the
// language client: a server that cannot start, shutting down, what is handed to the client.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { activate as activateEditor, FakeEditor, FakeWebviewPanel, openEditor, resetFake, state, Uri } from './fake-vscode';

vi.mock('vscode', async () => (await import('./fake-vscode')).vscodeModule);

/** The language client as the extension uses it; `behaviour` sets how start and stop go. */
const behaviour = { startFails: false, stopFails: false, startsWhen: null as Promise<void> | null };
const clients: FakeClient[] = [];
class FakeClient {
  running = false;
  readonly notifications = new Map<string, (params: unknown) => void>();
  readonly options: Record<string, unknown>;
  readonly server: unknown;
  constructor(_id: string, _name: string, server: unknown, options: Record<string, unknown>) {
    this.options = options;
    this.server = server;
    clients.push(this);
  }
  /** The requests sent, by method and note. */
  readonly requests: { method: string; uri: unknown }[] = [];
  async start(): Promise<void> {
    if (behaviour.startsWhen) await behaviour.startsWhen;
    if (behaviour.startFails) throw new Error('spawn node ENOENT');
    this.running = true;
  }
  async stop(): Promise<void> {
    if (behaviour.stopFails) throw new Error("Client is not running and can't be stopped. It's current state is: startFailed");
    this.running = false;
  }
  async restart(): Promise<void> { await this.stop(); await this.start(); }
  isRunning(): boolean { return this.running; }
  private readonly stateListeners: ((e: { oldState: number; newState: number }) => void)[] = [];
  onDidChangeState(listener: (e: { oldState: number; newState: number }) => void): { dispose(): void } {
    this.stateListeners.push(listener);
    return { dispose: () => undefined };
  }
  private changeState(oldState: number, newState: number): void {
    for (const l of this.stateListeners) l({ oldState, newState });
  }
  /**
   * The server process stops on its own: the client asks the error handler what to do and, told
   * to restart, starts it again as vscode-languageclient does (running, stopped, starting, running).
   */
  async crash(): Promise<void> {
    const handler = this.options['errorHandler'] as { closed(): { action: number } };
    const { action } = handler.closed();
    this.running = false;
    this.changeState(2, 1);
    if (action !== 2) return;
    this.changeState(1, 3);
    try {
      await this.start();
      this.changeState(3, 2);
    } catch {
      this.changeState(3, 4);
    }
  }
  onNotification(method: string, handler: (params: unknown) => void): void { this.notifications.set(method, handler); }
  /** A server that knows no note but answers for the trends of any (one timepoint). */
  async sendRequest(method: string, params: { uri?: unknown }): Promise<unknown> {
    this.requests.push({ method, uri: params?.uri });
    if (method === 'pneumark/timepointSummary') return { label: 'start', text: 'P/F 175', tooltip: 'start' };
    if (method !== 'pneumark/trends') return null;
    return { uri: params.uri, version: 1, points: [{ timepoint: 0, label: 'start', line: 0, minutes: 480, values: { pao2: { value: 70, unit: 'mmHg' } }, carried: [] }] };
  }
}
vi.mock('vscode-languageclient/node', () => ({
  LanguageClient: FakeClient,
  ErrorAction: { Continue: 1, Shutdown: 2 },
  CloseAction: { DoNotRestart: 1, Restart: 2 },
  State: { Stopped: 1, Running: 2, Starting: 3, StartFailed: 4 },
  RevealOutputChannelOn: { Never: 4 },
  TransportKind: { stdio: 0 },
}));
const { activate, deactivate } = await import('../../client/src/extension');

/** The contexts handed to `activate`, whose subscriptions are disposed after each test as VS Code does after deactivating. */
const contexts: { subscriptions: { dispose(): void }[] }[] = [];
function context() {
  const made = { subscriptions: [] as { dispose(): void }[], extensionUri: Uri.file('/ext'), asAbsolutePath: (p: string) => `/ext/${p}` };
  contexts.push(made);
  return made;
}

afterEach(async () => {
  await deactivate();
  for (const c of contexts.splice(0)) for (const d of c.subscriptions) d.dispose();
});

beforeEach(() => {
  resetFake();
  clients.length = 0;
  behaviour.startFails = false;
  behaviour.stopFails = false;
  behaviour.startsWhen = null;
});

/** Activated, with one note open and its trends shown: the view, once it has had them. */
async function trendsOfOneNote() {
  await activate(context() as never);
  openEditor('/work/a.pneu', '@ 08:00\nabg 7.30/40/70/24');
  state.commands.get('pneumark.showTrends')!();
  const view = state.panels[0]!;
  await vi.waitFor(() => expect(view.postedOf('trends')).toHaveLength(1));
  return view;
}

describe('activation', () => {
  it('goes on when the server cannot start: the commands are there, and the user is told with a way out', async () => {
    behaviour.startFails = true;
    await activate(context() as never);
    expect([...state.commands.keys()]).toEqual(expect.arrayContaining(['pneumark.restartServer', 'pneumark.showTrends', 'pneumark.openCheckDocs']));
    expect(state.messages).toEqual([{ kind: 'error', message: 'The Pneumark language server could not be started, so notes are not checked.', items: ['Restart', 'Show Output'] }]);
    expect(state.outputLines).toContain('[error] the language server could not be started: spawn node ENOENT');
    expect(state.serializers.has('pneumark.trends')).toBe(true);
    // Shutting down a client that never started does not fail.
    behaviour.stopFails = true;
    await expect(deactivate()).resolves.toBeUndefined();
  });

  it('takes back a trend view restored after a reload at once, and gives it its note once the server runs', async () => {
    // Reloaded with only the trend view open: VS Code wakes the extension up for the view, and
    // hands the view over as soon as a serializer is registered, while the server still starts.
    let started!: () => void;
    behaviour.startsWhen = new Promise<void>((resolve) => { started = resolve; });
    state.files.set('file:///work/a.pneu', '@ 08:00\nabg 7.30/40/70/24');
    const activation = activate(context() as never);
    const serializer = state.serializers.get('pneumark.trends') as { deserializeWebviewPanel(panel: unknown, state: unknown): Promise<void> } | undefined;
    expect(serializer, 'registered before the server has started').toBeDefined();
    const restored = new FakeWebviewPanel('pneumark.trends', 'Trends: a.pneu', {});
    await serializer!.deserializeWebviewPanel(restored, { uri: 'file:///work/a.pneu' });
    // The page is there (waiting for the analysis), and the note is opened for the server.
    expect(restored.webview.html).toMatch(/Waiting for the note's analysis/);
    await vi.waitFor(() => expect(state.documents.map((d) => d.uri.toString())).toEqual(['file:///work/a.pneu']));
    // While the server starts, nothing is asked of it and no error is shown: the view waits.
    await new Promise((r) => setTimeout(r, 20));
    expect(clients[0]!.requests).toEqual([]);
    expect(restored.posted).toEqual([]);
    started();
    await activation;
    await vi.waitFor(() => expect(restored.postedOf('trends')).toHaveLength(1));
    expect(restored.postedOf('trends')[0]).toMatchObject({ uri: 'file:///work/a.pneu', note: 'a.pneu', closed: false, points: [{ values: { pao2: { value: 70, unit: 'mmHg' } } }] });
    expect(restored.postedOf('error')).toEqual([]);
    await deactivate();
  });

  it('keeps an open trend view waiting while the server restarts on request, and never says it is not running', async () => {
    await activate(context() as never);
    const editor = openEditor('/work/a.pneu', '@ 08:00\nabg 7.30/40/70/24');
    state.commands.get('pneumark.showTrends')!(editor.document.uri);
    const view = state.panels[0]!;
    await vi.waitFor(() => expect(view.postedOf('trends')).toHaveLength(1));
    let started!: () => void;
    behaviour.startsWhen = new Promise<void>((resolve) => { started = resolve; });
    const restart = state.commands.get('pneumark.restartServer')!() as Promise<boolean>;
    // The note is analysed again while the old server has stopped and the new one starts: the
    // view asks the new one once it runs.
    clients[0]!.notifications.get('pneumark/analysed')!({ uri: 'file:///work/a.pneu', version: 2, millis: 1 });
    await new Promise((r) => setTimeout(r, 400));
    expect(clients[0]!.isRunning()).toBe(false);
    expect(view.postedOf('error')).toEqual([]);
    started();
    await expect(restart).resolves.toBe(true);
    await vi.waitFor(() => expect(view.postedOf('trends')).toHaveLength(2));
    expect(view.postedOf('error')).toEqual([]);
    await deactivate();
  });

  it('keeps the trend view waiting while the server restarts after a crash, and never says it is not running', async () => {
    const view = await trendsOfOneNote();
    let started!: () => void;
    behaviour.startsWhen = new Promise<void>((resolve) => { started = resolve; });
    const restarted = clients[0]!.crash();
    // The user goes to another note while the server starts again.
    openEditor('/work/b.pneu', '@ 09:00\nabg 7.30/40/70/24');
    await new Promise((r) => setTimeout(r, 50));
    expect(view.postedOf('error')).toEqual([]);
    started();
    await restarted;
    await vi.waitFor(() => expect(view.postedOf('trends')).toHaveLength(2));
    expect(view.postedOf('trends')[1]).toMatchObject({ uri: 'file:///work/b.pneu' });
    expect(view.postedOf('error')).toEqual([]);
    await deactivate();
  });

  it('tells the trend view the server is not running when it fails to start again after a crash', async () => {
    const view = await trendsOfOneNote();
    let started!: () => void;
    behaviour.startsWhen = new Promise<void>((resolve) => { started = resolve; });
    behaviour.startFails = true;
    const restarted = clients[0]!.crash();
    openEditor('/work/b.pneu', '@ 09:00\nabg 7.30/40/70/24');
    await new Promise((r) => setTimeout(r, 20));
    expect(view.postedOf('error')).toEqual([]);
    started();
    await restarted;
    await vi.waitFor(() => expect(view.postedOf('error')).toEqual([{ type: 'error', message: 'the Pneumark language server is not running (run "Pneumark: Restart Language Server")' }]));
  });

  it('tells the trend view the server is not running once it has stopped for good after repeated crashes', async () => {
    const view = await trendsOfOneNote();
    for (let i = 0; i < 5; i++) await clients[0]!.crash();
    expect(clients[0]!.isRunning()).toBe(false);
    openEditor('/work/b.pneu', '@ 09:00\nabg 7.30/40/70/24');
    await vi.waitFor(() => expect(view.postedOf('error')).toEqual([{ type: 'error', message: 'the Pneumark language server is not running (run "Pneumark: Restart Language Server")' }]));
    await deactivate();
  });

  it('hides the status item once the server has stopped for good, rather than keep its last figures', async () => {
    await activate(context() as never);
    openEditor('/work/a.pneu', '@ 08:00\nabg 7.30/40/70/24');
    const item = state.statusItems[0]!;
    await vi.waitFor(() => expect(item.visible).toBe(true));
    expect(item.text).toBe('$(pulse) P/F 175');
    for (let i = 0; i < 5; i++) await clients[0]!.crash();
    expect(clients[0]!.isRunning()).toBe(false);
    // Without a keystroke or a move of the cursor.
    await vi.waitFor(() => expect(item.visible).toBe(false));
    await deactivate();
  });

  it('asks the restarted server again for trends that the stopping one failed to give', async () => {
    await activate(context() as never);
    const editor = openEditor('/work/a.pneu', '@ 08:00\nabg 7.30/40/70/24');
    const client = clients[0]!;
    // The first request is caught by a restart: it fails as the old server stops.
    const answer = client.sendRequest.bind(client);
    // Only the trend requests are counted: the status item asks for its own figures through the
    // same client when the server runs again, at a moment that depends on the machine's load.
    let calls = 0;
    let started!: () => void;
    let restart: Promise<boolean> | null = null;
    client.sendRequest = async (method, params) => {
      if (method !== 'pneumark/trends') return answer(method, params);
      if (++calls === 1) {
        behaviour.startsWhen = new Promise<void>((resolve) => { started = resolve; });
        restart = state.commands.get('pneumark.restartServer')!() as Promise<boolean>;
        setTimeout(() => started(), 50);
        throw new Error('Client is not running');
      }
      return answer(method, params);
    };
    state.commands.get('pneumark.showTrends')!(editor.document.uri);
    const view = state.panels[0]!;
    await vi.waitFor(() => expect(view.postedOf('trends')).toHaveLength(1));
    expect(calls).toBe(2);
    expect(view.postedOf('error')).toEqual([]);
    await expect(restart).resolves.toBe(true);
    await deactivate();
  });

  it('converts the gas units of a note asked for while the server still starts, rather than saying it is not running', async () => {
    // The note that woke the extension up is in front, and the user runs the command at once.
    let started!: () => void;
    behaviour.startsWhen = new Promise<void>((resolve) => { started = resolve; });
    const activation = activate(context() as never);
    const client = clients[0]!;
    const answer = client.sendRequest.bind(client);
    client.sendRequest = async (method, params) => {
      if (method !== 'pneumark/convertUnits') return answer(method, params);
      client.requests.push({ method, uri: params?.uri });
      return [{ range: { start: { line: 1, character: 12 }, end: { line: 1, character: 14 } }, newText: '9.3' }];
    };
    const editor = openEditor('/work/a.pneu', '@ 08:00\nabg 7.30/40/70/24');
    state.pick = 'kPa';
    const run = state.commands.get('pneumark.convertNoteUnits')!() as Promise<void>;
    await new Promise((r) => setTimeout(r, 20));
    started();
    await activation;
    await run;
    expect(state.messages.filter((m) => /not running/.test(m.message))).toEqual([]);
    expect(client.requests).toContainEqual({ method: 'pneumark/convertUnits', uri: 'file:///work/a.pneu' });
    expect(editor.document.lineAt(1).text).toBe('abg 7.30/40/9.3/24');
    await deactivate();
  });

  it('says the server is not running when a conversion is asked for after it failed to start', async () => {
    behaviour.startFails = true;
    await activate(context() as never);
    openEditor('/work/a.pneu', '@ 08:00\nabg 7.30/40/70/24');
    state.pick = 'kPa';
    state.messages.length = 0;
    await state.commands.get('pneumark.convertNoteUnits')!();
    expect(state.messages).toEqual([expect.objectContaining({ kind: 'warning', message: expect.stringMatching(/language server is not running/) })]);
    await deactivate();
  });

  it('shows the trends of the note the view shows when run with the focus in the view and two notes side by side', async () => {
    await activate(context() as never);
    const a = openEditor('/work/a.pneu', '@ 08:00\nabg 7.30/40/70/24');
    openEditor('/work/b.pneu', '@ 09:00\nabg 7.30/40/70/24');
    state.commands.get('pneumark.showTrends')!(a.document.uri);
    const view = state.panels[0]!;
    await vi.waitFor(() => expect(view.postedOf('trends')).toHaveLength(1));
    // The focus moves into the trend view (a webview: no text editor is active), and the command
    // is run from the palette.
    activateEditor(undefined);
    state.messages.length = 0;
    state.commands.get('pneumark.showTrends')!();
    expect(state.messages).toEqual([]);
    expect(state.panels).toHaveLength(1);
    expect(view.revealed).toHaveLength(1);
    expect(view.title).toBe('Trends: a.pneu');
    await deactivate();
  });

  it('asks which note to show when run with the focus outside any editor and several notes in view', async () => {
    await activate(context() as never);
    openEditor('/work/a.pneu', '@ 08:00\nabg 7.30/40/70/24');
    openEditor('/work/b.pneu', '@ 09:00\nabg 7.30/40/70/24');
    activateEditor(undefined);
    state.pick = 'b.pneu';
    await state.commands.get('pneumark.showTrends')!();
    expect(state.quickPicks.map((q) => q.items.map((i) => i.label))).toEqual([['a.pneu', 'b.pneu']]);
    expect(state.messages).toEqual([]);
    expect(state.panels[0]?.title).toBe('Trends: b.pneu');
    await deactivate();
  });

  it('names the notes it asks about as text: a file name never turns into an icon', async () => {
    await activate(context() as never);
    openEditor('/work/$(warning) a.pneu', '@ 08:00');
    openEditor('/work/b.pneu', '@ 09:00');
    activateEditor(undefined);
    await state.commands.get('pneumark.showTrends')!();
    expect(state.quickPicks[0]?.items.map((i) => i.label)).toEqual(['$\u200b(warning) a.pneu', 'b.pneu']);
  });

  it('shows the one note in view at once when it is split into two editors', async () => {
    await activate(context() as never);
    const a = openEditor('/work/a.pneu', '@ 08:00\nabg 7.30/40/70/24');
    state.visibleTextEditors.push(new FakeEditor(a.document, 0));
    activateEditor(undefined);
    state.commands.get('pneumark.showTrends')!();
    expect(state.quickPicks).toEqual([]);
    expect(state.messages).toEqual([]);
    expect(state.panels[0]?.title).toBe('Trends: a.pneu');
    await deactivate();
  });

  it('tells a restored trend view when the server could not start, with what to do', async () => {
    let started!: () => void;
    behaviour.startsWhen = new Promise<void>((resolve) => { started = resolve; });
    behaviour.startFails = true;
    state.files.set('file:///work/a.pneu', '@ 08:00');
    const activation = activate(context() as never);
    const serializer = state.serializers.get('pneumark.trends') as { deserializeWebviewPanel(panel: unknown, state: unknown): Promise<void> };
    const restored = new FakeWebviewPanel('pneumark.trends', 'Trends: a.pneu', {});
    await serializer.deserializeWebviewPanel(restored, { uri: 'file:///work/a.pneu' });
    started();
    await activation;
    await vi.waitFor(() => expect(restored.postedOf('error')).toEqual([{ type: 'error', message: 'the Pneumark language server is not running (run "Pneumark: Restart Language Server")' }]));
    await deactivate();
  });

  it('passes the trace channel and the settings filter to the language client', async () => {
    await activate(context() as never);
    const options = clients[0]!.options as { traceOutputChannel: { logLevel: number }; middleware: { workspace: { didChangeConfiguration: unknown } }; errorHandler: { closed: unknown } };
    expect(typeof options.middleware.workspace.didChangeConfiguration).toBe('function');
    expect(typeof options.errorHandler.closed).toBe('function');
    state.configuration.set('pneumark.trace.server', 'verbose');
    state.events.configuration.fire({ affectsConfiguration: (s) => 'pneumark.trace.server'.startsWith(s) });
    expect(options.traceOutputChannel.logLevel).toBe(1);
    await deactivate();
  });

  it('starts the server over stdio alone, also when the extension host is being debugged: no inspector port', async () => {
    await activate(context() as never);
    const server = clients[0]!.server as { run: unknown; debug: unknown };
    expect(server.run).toEqual({ module: '/ext/dist/server.js', transport: 0 });
    expect(server.debug).toEqual(server.run);
    expect(JSON.stringify(server)).not.toMatch(/inspect/);
    await deactivate();
  });
});
