// The language server's process as the extension looks after it: crashes, restarts on request,
// and the trace setting. With stand-ins for VS Code (fake-vscode.ts) and the language client.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { EventEmitter, LogLevel, resetFake, state } from './fake-vscode';

vi.mock('vscode', async () => (await import('./fake-vscode')).vscodeModule);
vi.mock('vscode-languageclient/node', () => ({
  ErrorAction: { Continue: 1, Shutdown: 2 },
  CloseAction: { DoNotRestart: 1, Restart: 2 },
}));
const { crashHandler, pneumarkSettingsOnly, restartServer, traceChannel, MAX_RESTARTS } = await import('../../client/src/server-process');

/** The Pneumark output as a log channel that records its lines. */
function output() {
  const lines: string[] = [];
  const levelChanged = new EventEmitter<LogLevel>();
  const channel = {
    name: 'Pneumark',
    logLevel: LogLevel.Info,
    onDidChangeLogLevel: levelChanged.event,
    shown: 0,
    trace: (m: string) => lines.push(`[trace] ${m}`),
    debug: (m: string) => lines.push(`[debug] ${m}`),
    info: (m: string) => lines.push(`[info] ${m}`),
    warn: (m: string) => lines.push(`[warning] ${m}`),
    error: (m: string | Error) => lines.push(`[error] ${String(m)}`),
    append: (m: string) => lines.push(m),
    appendLine: (m: string) => lines.push(`[info] ${m}`),
    replace: () => undefined,
    clear: () => undefined,
    show: () => { channel.shown++; },
    hide: () => undefined,
    dispose: () => undefined,
  };
  return { channel, lines, levelChanged };
}

beforeEach(() => resetFake());

describe('when the server stops', () => {
  it('restarts it quietly the first time, warns after that, and after repeated crashes stops with one message', async () => {
    const { channel, lines } = output();
    let now = 0;
    const handler = crashHandler(channel as never, () => now);
    expect(handler.closed()).toMatchObject({ action: 2, handled: true });
    expect(state.messages).toEqual([]);
    now += 1000;
    expect(handler.closed()).toMatchObject({ action: 2, handled: true });
    expect(state.messages.map((m) => m.kind)).toEqual(['warning']);
    for (let i = 2; i < MAX_RESTARTS; i++) handler.closed();
    state.messages.length = 0;
    // `handled` keeps the language client from showing a second message of its own.
    expect(handler.closed()).toMatchObject({ action: 1, handled: true });
    expect(state.messages).toEqual([{ kind: 'error', message: expect.stringMatching(/stopped 5 times in 3 minutes and was not restarted/), items: ['Restart', 'Show Output'] }]);
    expect(lines.filter((l) => l.startsWith('[warning]'))).toHaveLength(5);
  });

  it('says a restart is coming each time it restarts the server, and not when it leaves it stopped', () => {
    const { channel } = output();
    let restarts = 0;
    const handler = crashHandler(channel as never, () => 0, () => { restarts++; });
    for (let i = 0; i < MAX_RESTARTS; i++) expect((handler.closed() as { action: number }).action).toBe(2);
    expect(restarts).toBe(MAX_RESTARTS);
    expect((handler.closed() as { action: number }).action).toBe(1);
    expect(restarts).toBe(MAX_RESTARTS);
  });

  it('counts only the crashes of the last three minutes', () => {
    const { channel } = output();
    let now = 0;
    const handler = crashHandler(channel as never, () => now);
    for (let i = 0; i < 10; i++) {
      now += 60_000;
      expect((handler.closed() as { action: number }).action).toBe(2);
    }
  });

  it('starts afresh after a restart on request: the next crash is restarted', async () => {
    const { channel } = output();
    const handler = crashHandler(channel as never, () => 0);
    for (let i = 0; i <= MAX_RESTARTS; i++) handler.closed();
    const client = { restart: vi.fn(async () => undefined), start: vi.fn(async () => undefined) };
    expect(await restartServer(client, handler, channel as never)).toBe(true);
    expect((handler.closed() as { action: number }).action).toBe(2);
  });

  it('starts a server that failed to start, where the client refuses to restart it', async () => {
    const { channel } = output();
    const client = {
      restart: vi.fn(async () => { throw new Error("Client is not running and can't be stopped. It's current state is: startFailed"); }),
      start: vi.fn(async () => undefined),
    };
    expect(await restartServer(client, crashHandler(channel as never), channel as never)).toBe(true);
    expect(client.start).toHaveBeenCalledOnce();
  });

  it('says so, with the way to the output, when it cannot be started', async () => {
    const { channel, lines } = output();
    const client = { restart: async () => { throw new Error('x'); }, start: async () => { throw new Error('node not found'); } };
    state.messageAnswer = 'Show Output';
    expect(await restartServer(client, crashHandler(channel as never), channel as never)).toBe(false);
    expect(state.messages[0]).toMatchObject({ kind: 'error', message: 'The Pneumark language server could not be started: node not found' });
    expect(lines).toContain('[error] the language server could not be started: node not found');
    expect(channel.shown).toBe(1);
  });
});

describe('the trace setting', () => {
  it('turns the trace on by itself, and the trace is written where the output shows it', () => {
    const { channel, lines } = output();
    const trace = traceChannel(channel as never);
    const levels: LogLevel[] = [];
    trace.onDidChangeLogLevel((l) => levels.push(l));
    // The language client traces only while its trace channel is at the Trace level.
    expect(trace.logLevel).toBe(LogLevel.Info);
    state.configuration.set('pneumark.trace.server', 'messages');
    state.events.configuration.fire({ affectsConfiguration: (s) => 'pneumark.trace.server'.startsWith(s) });
    expect(trace.logLevel).toBe(LogLevel.Trace);
    expect(levels).toEqual([LogLevel.Trace]);
    trace.trace("Sending request 'textDocument/hover - (4)'.");
    expect(lines).toEqual(["[info] Sending request 'textDocument/hover - (4)'."]);
    state.configuration.set('pneumark.trace.server', 'off');
    state.events.configuration.fire({ affectsConfiguration: (s) => 'pneumark.trace.server'.startsWith(s) });
    expect(levels).toEqual([LogLevel.Trace, LogLevel.Info]);
    trace.dispose();
  });

  it('also traces while the Pneumark output itself is set to Trace', () => {
    const { channel, levelChanged } = output();
    const trace = traceChannel(channel as never);
    channel.logLevel = LogLevel.Trace;
    levelChanged.fire(LogLevel.Trace);
    expect(trace.logLevel).toBe(LogLevel.Trace);
    trace.dispose();
  });
});

describe('settings changes sent to the server', () => {
  it('are only those of pneumark.*: another setting does not make the server analyse every note again', async () => {
    const filter = pneumarkSettingsOnly();
    const sent: (string[] | undefined)[] = [];
    const next = async (sections: string[] | undefined) => { sent.push(sections); };
    const change = (section: string) => state.events.configuration.fire({ affectsConfiguration: (s) => section === s || section.startsWith(`${s}.`) });
    change('editor.fontSize');
    await filter.middleware(undefined, next);
    expect(sent).toEqual([]);
    change('pneumark.gasUnit');
    await filter.middleware(undefined, next);
    change('pneumark.hints.mechanics');
    await filter.middleware(undefined, next);
    expect(sent).toEqual([undefined, undefined]);
    // The language client's listener may run before ours for the same change.
    const early = filter.middleware(undefined, next);
    change('editor.tabSize');
    await early;
    const late = filter.middleware(undefined, next);
    change('pneumark.debounceMs');
    await late;
    expect(sent).toEqual([undefined, undefined, undefined]);
    filter.dispose();
  });
});
