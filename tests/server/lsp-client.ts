/**
 * A real JSON-RPC client for protocol-level tests: starts the bundled server (dist/server.js)
 * as a child process over stdio, and waits on conditions (diagnostics for a version), never on
 * fixed sleeps.
 */
import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { pathToFileURL } from 'node:url';
import {
  createProtocolConnection,
  ResponseError,
  StreamMessageReader,
  StreamMessageWriter,
  type ProtocolConnection,
  type PublishDiagnosticsParams,
  type InitializeResult,
} from 'vscode-languageserver-protocol/node';
import { afterAll, beforeAll } from 'vitest';
import { ANALYSED_NOTIFICATION, type AnalysedParams } from '../../server/src/protocol';

export interface LspClient {
  readonly connection: ProtocolConnection;
  readonly process: ChildProcessWithoutNullStreams;
  readonly initialize: InitializeResult;
  /** Settings the client answers `workspace/configuration` with (section `pneumark`). */
  settings: Record<string, unknown>;
  /** Every publishDiagnostics received, in order. */
  readonly published: PublishDiagnosticsParams[];
  /** Every `pneumark/analysed` notification received, in order. */
  readonly analysed: AnalysedParams[];
  /** Every `window/logMessage` and `window/showMessage` received, in order. */
  readonly messages: readonly ServerMessage[];
  /** Every capability the server registered (`client/registerCapability`), in order. */
  readonly registrations: readonly { method: string; registerOptions?: unknown }[];
  /** How many times the server asked the client to refresh its inlay hints. */
  readonly hintRefreshes: () => number;
  /** Resolves once the server has asked for a refresh of inlay hints more than `after` times in all. */
  hintRefresh(after: number, timeoutMs?: number): Promise<void>;
  stderr: string;
  open(path: string, text: string, version?: number): string;
  change(uri: string, text: string, version: number): void;
  save(uri: string): void;
  /** Resolves with the first diagnostics for `uri` matching `accept` (already received or future). */
  diagnostics(uri: string, accept?: (p: PublishDiagnosticsParams) => boolean, timeoutMs?: number): Promise<PublishDiagnosticsParams>;
  /** Resolves with the first message matching `accept` (already received or future). */
  message(accept: (m: ServerMessage) => boolean, timeoutMs?: number): Promise<ServerMessage>;
  /** Resolves with the first `pneumark/analysed` for `uri` (already received or future). */
  analysedOf(uri: string): Promise<AnalysedParams>;
  /** Resolves once the client has answered a `workspace/configuration` request about `uri`. */
  configured(uri: string): Promise<void>;
  close(): Promise<number | null>;
}

/** A message for the user: `window/logMessage` (the client's output) or `window/showMessage`; type 1 error, 2 warning, 3 info, 4 log. */
export interface ServerMessage {
  readonly method: 'window/logMessage' | 'window/showMessage';
  readonly type: number;
  readonly message: string;
}

export interface ClientOptions {
  /** Whether the client answers `workspace/configuration` (default true); without it, settings are pushed. */
  readonly pullConfiguration?: boolean;
  /** `textDocument.completion` client capabilities (none by default). */
  readonly completion?: Record<string, unknown>;
  /** Whether the client can be asked to refresh its inlay hints (`workspace.inlayHint.refreshSupport`; default false). */
  readonly refreshHints?: boolean;
  /** The command that starts the server, and its arguments before `--stdio` (default: this Node on dist/server.js). */
  readonly server?: { readonly command: string; readonly args: readonly string[] };
  /** The workspace folders (paths) the client names; none by default (`rootUri` null). */
  readonly workspaceFolders?: readonly string[];
  /**
   * Whether the client watches files the server registers (`workspace.didChangeWatchedFiles`
   * with dynamic registration), as VS Code does (default true); Neovim 0.7 does not.
   */
  readonly watchFiles?: boolean;
}

export async function startClient(settings: Record<string, unknown> = {}, options: ClientOptions = {}): Promise<LspClient> {
  const server = options.server ?? { command: process.execPath, args: ['dist/server.js'] };
  const child = spawn(server.command, [...server.args, '--stdio'], { stdio: 'pipe' });
  const connection = createProtocolConnection(new StreamMessageReader(child.stdout), new StreamMessageWriter(child.stdin));
  const published: PublishDiagnosticsParams[] = [];
  const waiters: { uri: string; accept: (p: PublishDiagnosticsParams) => boolean; resolve: (p: PublishDiagnosticsParams) => void }[] = [];
  const client: Partial<LspClient> & { settings: Record<string, unknown>; stderr: string } = { settings, stderr: '' };
  child.stderr.on('data', (d: Buffer) => { client.stderr += d.toString(); });
  connection.onNotification('textDocument/publishDiagnostics', (p: PublishDiagnosticsParams) => {
    published.push(p);
    for (const w of [...waiters]) {
      if (w.uri === p.uri && w.accept(p)) {
        waiters.splice(waiters.indexOf(w), 1);
        w.resolve(p);
      }
    }
  });
  const messages: ServerMessage[] = [];
  const messageWaiters: { accept: (m: ServerMessage) => boolean; resolve: (m: ServerMessage) => void }[] = [];
  const heard = (method: ServerMessage['method']) => (p: { type: number; message: string }) => {
    const m: ServerMessage = { method, type: p.type, message: p.message };
    messages.push(m);
    for (const w of messageWaiters.filter((x) => x.accept(m))) {
      messageWaiters.splice(messageWaiters.indexOf(w), 1);
      w.resolve(m);
    }
  };
  connection.onNotification('window/logMessage', heard('window/logMessage'));
  connection.onNotification('window/showMessage', heard('window/showMessage'));
  const analysed: AnalysedParams[] = [];
  const analysedWaiters: { uri: string; resolve: (p: AnalysedParams) => void }[] = [];
  connection.onNotification(ANALYSED_NOTIFICATION, (p: AnalysedParams) => {
    analysed.push(p);
    for (const w of analysedWaiters.filter((x) => x.uri === p.uri)) {
      analysedWaiters.splice(analysedWaiters.indexOf(w), 1);
      w.resolve(p);
    }
  });
  const configWaiters: { uri: string; resolve: () => void }[] = [];
  connection.onRequest('workspace/configuration', (params: { items: { scopeUri?: string; section?: string }[] }) => {
    for (const w of [...configWaiters]) {
      if (params.items.some((i) => i.scopeUri === w.uri)) {
        configWaiters.splice(configWaiters.indexOf(w), 1);
        setImmediate(w.resolve); // after the answer is on its way
      }
    }
    return params.items.map(() => client.settings);
  });
  const registrations: { method: string; registerOptions?: unknown }[] = [];
  connection.onRequest('client/registerCapability', (p: { registrations: { method: string; registerOptions?: unknown }[] }) => {
    registrations.push(...p.registrations);
    return null;
  });
  let refreshes = 0;
  const refreshWaiters: { after: number; resolve: () => void }[] = [];
  connection.onRequest('workspace/inlayHint/refresh', () => {
    refreshes++;
    for (const w of refreshWaiters.filter((x) => refreshes > x.after)) {
      refreshWaiters.splice(refreshWaiters.indexOf(w), 1);
      w.resolve();
    }
    return null;
  });
  connection.listen();
  const initialize = await connection.sendRequest<InitializeResult>('initialize', {
    processId: process.pid,
    rootUri: options.workspaceFolders?.[0] !== undefined ? pathToFileURL(options.workspaceFolders[0]).toString() : null,
    ...(options.workspaceFolders ? { workspaceFolders: options.workspaceFolders.map((f) => ({ uri: pathToFileURL(f).toString(), name: f })) } : {}),
    capabilities: {
      workspace: {
        ...(options.workspaceFolders ? { workspaceFolders: true } : {}),
        configuration: options.pullConfiguration ?? true,
        ...(options.watchFiles ?? true ? { didChangeWatchedFiles: { dynamicRegistration: true } } : {}),
        didChangeConfiguration: { dynamicRegistration: options.pullConfiguration ?? true },
        ...(options.refreshHints ? { inlayHint: { refreshSupport: true } } : {}),
      },
      textDocument: { inlayHint: { resolveSupport: { properties: ['tooltip'] } }, publishDiagnostics: { versionSupport: true }, ...(options.completion ? { completion: options.completion } : {}) },
    },
  });
  await connection.sendNotification('initialized', {});
  return Object.assign(client, {
    connection,
    process: child,
    initialize,
    published,
    analysed,
    open(path: string, text: string, version = 1) {
      const uri = path.startsWith('untitled:') ? path : pathToFileURL(path).toString();
      void connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'pneumark', version, text } });
      return uri;
    },
    change(uri: string, text: string, version: number) {
      void connection.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: [{ text }] });
    },
    save(uri: string) {
      void connection.sendNotification('textDocument/didSave', { textDocument: { uri } });
    },
    diagnostics(uri: string, accept: (p: PublishDiagnosticsParams) => boolean = () => true, timeoutMs = 15000) {
      const known = published.find((p) => p.uri === uri && accept(p));
      if (known) return Promise.resolve(known);
      return new Promise<PublishDiagnosticsParams>((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error(`no diagnostics for ${uri} within ${timeoutMs} ms; stderr: ${client.stderr}`)), timeoutMs);
        waiters.push({ uri, accept, resolve: (p) => { clearTimeout(timer); resolve(p); } });
      });
    },
    messages,
    message(accept: (m: ServerMessage) => boolean, timeoutMs = 15000) {
      const known = messages.find(accept);
      if (known) return Promise.resolve(known);
      return new Promise<ServerMessage>((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error(`no such message within ${timeoutMs} ms; messages: ${JSON.stringify(messages)}`)), timeoutMs);
        messageWaiters.push({ accept, resolve: (m) => { clearTimeout(timer); resolve(m); } });
      });
    },
    analysedOf(uri: string) {
      const known = analysed.find((p) => p.uri === uri);
      return known ? Promise.resolve(known) : new Promise<AnalysedParams>((resolve) => analysedWaiters.push({ uri, resolve }));
    },
    hintRefreshes: () => refreshes,
    registrations,
    hintRefresh(after: number, timeoutMs = 15000) {
      if (refreshes > after) return Promise.resolve();
      return new Promise<void>((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error(`no inlay hint refresh within ${timeoutMs} ms`)), timeoutMs);
        refreshWaiters.push({ after, resolve: () => { clearTimeout(timer); resolve(); } });
      });
    },
    configured(uri: string) {
      return new Promise<void>((resolve) => configWaiters.push({ uri, resolve }));
    },
    async close() {
      const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
      try {
        await connection.sendRequest('shutdown');
        await connection.sendNotification('exit');
      } catch {
        child.kill();
      }
      const code = await exited;
      connection.dispose();
      return code;
    },
  }) as LspClient;
}

/**
 * One server for a test file: started before its first test and shut down after its last. The
 * client returned stands for the started one (each member is read from it, or set on it, when
 * used), so the file's tests use it as they would the client itself.
 */
export function serverForTests(settings: Record<string, unknown> = {}, options: ClientOptions = {}): LspClient {
  let started: LspClient | null = null;
  beforeAll(async () => {
    started = await startClient(settings, options);
  });
  afterAll(async () => {
    await started?.close();
  });
  const client = (): LspClient => {
    if (started === null) throw new Error('the server starts before the first test of the file');
    return started;
  };
  return new Proxy({} as LspClient, {
    get: (_target, member) => Reflect.get(client(), member),
    // `client.settings = …`: what the server is answered when it asks for its configuration.
    set: (_target, member, value) => Reflect.set(client(), member, value),
  });
}

/** The code of InvalidRequest, the answer to a request after shutdown (LSP 3.17, "Shutdown Request"). */
export const INVALID_REQUEST = -32600;

/** The error code a request was answered with; null when it was answered without an error. */
export async function errorCode(request: Promise<unknown>): Promise<number | null> {
  try {
    await request;
    return null;
  } catch (e) {
    if (!(e instanceof ResponseError)) throw e;
    return e.code;
  }
}
