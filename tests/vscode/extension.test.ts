// The extension's activation as a whole, with stand-ins for VS Code (fake-vscode.ts) and the
// language client: a server that cannot start, shutting down, what is handed to the client.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { resetFake, state, Uri } from './fake-vscode';

vi.mock('vscode', async () => (await import('./fake-vscode')).vscodeModule);

/** The language client as the extension uses it; `behaviour` sets how start and stop go. */
const behaviour = { startFails: false, stopFails: false };
const clients: FakeClient[] = [];
class FakeClient {
  running = false;
  readonly notifications = new Map<string, (params: unknown) => void>();
  readonly options: Record<string, unknown>;
  constructor(_id: string, _name: string, _server: unknown, options: Record<string, unknown>) {
    this.options = options;
    clients.push(this);
  }
  async start(): Promise<void> {
    if (behaviour.startFails) throw new Error('spawn node ENOENT');
    this.running = true;
  }
  async stop(): Promise<void> {
    if (behaviour.stopFails) throw new Error("Client is not running and can't be stopped. It's current state is: startFailed");
    this.running = false;
  }
  async restart(): Promise<void> { await this.stop(); await this.start(); }
  isRunning(): boolean { return this.running; }
  onNotification(method: string, handler: (params: unknown) => void): void { this.notifications.set(method, handler); }
  async sendRequest(): Promise<null> { return null; }
}
vi.mock('vscode-languageclient/node', () => ({
  LanguageClient: FakeClient,
  ErrorAction: { Continue: 1, Shutdown: 2 },
  CloseAction: { DoNotRestart: 1, Restart: 2 },
  RevealOutputChannelOn: { Never: 4 },
  TransportKind: { stdio: 0 },
}));
const { activate, deactivate } = await import('../../client/src/extension');

function context() {
  return { subscriptions: [] as { dispose(): void }[], extensionUri: Uri.file('/ext'), asAbsolutePath: (p: string) => `/ext/${p}` };
}

beforeEach(() => {
  resetFake();
  clients.length = 0;
  behaviour.startFails = false;
  behaviour.stopFails = false;
});

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
});
