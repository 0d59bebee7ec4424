// The transports of the bundled language server other than stdio: `--node-ipc` (Node's IPC
// channel to the process that started it) and `--pipe` (a local socket, where the client
// listens), with the shutdown gate of the Language Server Protocol (3.17, "Shutdown
// Request": requests after shutdown fail with InvalidRequest) and stdio's exit statuses; `--socket`
// (TCP) refused, as Pneumark opens no network connection; and what the server does when started
// without a usable transport.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterEach, describe, expect, it } from 'vitest';
import {
  createClientPipeTransport,
  IPCMessageReader,
  IPCMessageWriter,
  createProtocolConnection,
  type MessageReader,
  type MessageWriter,
  type ProtocolConnection,
  type PublishDiagnosticsParams,
} from 'vscode-languageserver-protocol/node';
import { NO_SOCKET, NO_TRANSPORT, transportOf, TRANSPORT_PROBLEM_STATUS } from '../../server/src/server/transport';
import { errorCode, INVALID_REQUEST } from './lsp-client';

const WAIT_MS = 15000;

/** What a test started; stopped and removed after each test whatever happened. */
const started: { children: ChildProcess[]; closers: (() => void)[]; folders: string[] } = { children: [], closers: [], folders: [] };

afterEach(() => {
  for (const child of started.children.splice(0)) if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  for (const close of started.closers.splice(0)) close();
  for (const folder of started.folders.splice(0)) rmSync(folder, { recursive: true, force: true });
});

interface Server {
  readonly child: ChildProcess;
  /** The exit status, once the server has exited. */
  readonly exited: Promise<number | null>;
  stderr(): string;
}

function startServer(args: readonly string[], ipc = false): Server {
  const child = spawn(process.execPath, ['dist/server.js', ...args], { stdio: ipc ? ['pipe', 'pipe', 'pipe', 'ipc'] : 'pipe' });
  started.children.push(child);
  let stderr = '';
  child.stderr?.on('data', (d: Buffer) => { stderr += d.toString(); });
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  return { child, exited, stderr: () => stderr };
}

function within<T>(what: string, promise: Promise<T>, server: Server): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`${what} took over ${WAIT_MS} ms; server stderr: ${server.stderr()}`)), WAIT_MS);
    promise.then((v) => { clearTimeout(timer); resolve(v); }, (e: unknown) => { clearTimeout(timer); reject(e); });
  });
}

type Listening = {
  readonly args: readonly string[];
  /** The server is started with an IPC channel (`--node-ipc`). */
  readonly ipc?: boolean;
  onConnected(server: ChildProcess): Promise<[MessageReader, MessageWriter]>;
  /** Closes the client's end of the connection. */
  hangUp(server: ChildProcess, connection: ProtocolConnection): void;
};

/** The client's end for `--node-ipc`: the IPC channel of the server's process. */
function ipcListening(): Listening {
  return {
    args: ['--node-ipc'],
    ipc: true,
    onConnected: (child) => Promise.resolve([new IPCMessageReader(child), new IPCMessageWriter(child)]),
    hangUp: (child, connection) => { connection.dispose(); child.disconnect(); },
  };
}

/** The client's end for `--pipe`: a Unix domain socket in a temporary folder. */
async function pipeListening(form: 'equals' | 'separate'): Promise<Listening> {
  const folder = mkdtempSync(join(tmpdir(), 'pneumark-pipe-'));
  started.folders.push(folder);
  const name = join(folder, 'lsp.sock');
  const transport = await createClientPipeTransport(name);
  started.closers.push(() => transport.close());
  return { args: form === 'equals' ? [`--pipe=${name}`] : ['--pipe', name], onConnected: () => transport.onConnected(), hangUp: (_child, connection) => connection.dispose() };
}

/** Starts the server on the client's end, and initializes it over the connection it makes. */
async function connect(listening: Listening): Promise<{ server: Server; connection: ProtocolConnection; published: PublishDiagnosticsParams[]; hangUp(): void }> {
  const server = startServer(listening.args, listening.ipc);
  const [reader, writer] = await within('the server connecting', listening.onConnected(server.child), server);
  const connection = createProtocolConnection(reader, writer);
  started.closers.push(() => connection.dispose());
  const published: PublishDiagnosticsParams[] = [];
  connection.onNotification('textDocument/publishDiagnostics', (p: PublishDiagnosticsParams) => { published.push(p); });
  connection.onRequest('workspace/configuration', (p: { items: unknown[] }) => p.items.map(() => ({})));
  connection.listen();
  await within('initialize', connection.sendRequest('initialize', { processId: process.pid, rootUri: null, capabilities: { workspace: { configuration: true } } }), server);
  await connection.sendNotification('initialized', {});
  return { server, connection, published, hangUp: () => listening.hangUp(server.child, connection) };
}

async function diagnosticsOf(published: PublishDiagnosticsParams[], uri: string, server: Server): Promise<PublishDiagnosticsParams> {
  const deadline = Date.now() + WAIT_MS;
  for (;;) {
    const found = published.find((p) => p.uri === uri);
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no diagnostics for ${uri}; server stderr: ${server.stderr()}`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

const TRANSPORTS = [
  ['--node-ipc', () => Promise.resolve(ipcListening())],
  ['--pipe=NAME', () => pipeListening('equals')],
  ['--pipe NAME', () => pipeListening('separate')],
] as const;

describe.each(TRANSPORTS)('over %s', (_form, listen) => {
  it('checks notes, refuses requests after shutdown with InvalidRequest, and exits with status 0 on exit', async () => {
    const { server, connection, published } = await connect(await listen());
    const uri = pathToFileURL(join(process.cwd(), 'over-a-socket.pneu')).toString();
    await connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'pneumark', version: 1, text: '@ 08:00\nvitals spo2 104\n' } });
    const diagnostics = await diagnosticsOf(published, uri, server);
    expect(diagnostics.diagnostics.map((d) => d.code)).toEqual(['PN306']);
    const position = { textDocument: { uri }, position: { line: 1, character: 8 } };
    expect(await errorCode(connection.sendRequest('textDocument/hover', position))).toBeNull();

    expect(await errorCode(connection.sendRequest('shutdown'))).toBeNull();
    expect(await errorCode(connection.sendRequest('textDocument/hover', position))).toBe(INVALID_REQUEST);
    expect(await errorCode(connection.sendRequest('pneumark/noSuchRequest', {}))).toBe(INVALID_REQUEST);

    await connection.sendNotification('exit');
    expect(await within('exit', server.exited, server)).toBe(0);
  });

  it('exits with status 1 when the client closes the connection without a shutdown request', async () => {
    const { server, hangUp } = await connect(await listen());
    hangUp();
    expect(await within('exit', server.exited, server)).toBe(1);
  });

  it('exits with status 0 when the client closes the connection after a shutdown request', async () => {
    const { server, connection, hangUp } = await connect(await listen());
    await connection.sendRequest('shutdown');
    hangUp();
    expect(await within('exit', server.exited, server)).toBe(0);
  });

  it('exits with status 1 on exit without a shutdown request', async () => {
    const { server, connection } = await connect(await listen());
    await connection.sendNotification('exit');
    expect(await within('exit', server.exited, server)).toBe(1);
  });
});

describe('a server started without a usable transport', () => {
  it.each([
    [[], NO_TRANSPORT],
    [['--clientProcessId=1'], NO_TRANSPORT],
    [['--socket=6009'], NO_SOCKET],
    [['--socket', '6009'], NO_SOCKET],
    [['--pipe'], 'pneumark language server: --pipe got nothing: expected the name of a local socket or pipe'],
  ])('%j: says so in one line on stderr and exits with status 2', async (args, line) => {
    const server = startServer(args);
    let stdout = '';
    server.child.stdout?.on('data', (d: Buffer) => { stdout += d.toString(); });
    expect(await within('exit', server.exited, server)).toBe(TRANSPORT_PROBLEM_STATUS);
    expect(server.stderr()).toBe(`${line}\n`);
    expect(stdout).toBe('');
  });

  it('exits with status 1, saying where, when nothing listens on the pipe', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'pneumark-pipe-'));
    started.folders.push(folder);
    const name = join(folder, 'nobody-listens.sock');
    const server = startServer([`--pipe=${name}`]);
    expect(await within('exit', server.exited, server)).toBe(1);
    expect(server.stderr()).toMatch(/^pneumark language server: connection to .*nobody-listens\.sock: .*ENOENT.*\n$/);
  });
});

describe('transportOf', () => {
  it('reads the forms the protocol library reads; the first transport argument wins', () => {
    expect(transportOf(['--stdio'])).toEqual({ kind: 'stdio' });
    expect(transportOf(['--node-ipc', '--clientProcessId=42'])).toEqual({ kind: 'node-ipc' });
    expect(transportOf(['--clientProcessId', '42', '--pipe=/tmp/l.sock'])).toEqual({ kind: 'pipe', name: '/tmp/l.sock' });
    expect(transportOf(['--pipe=/run/user/1000/lsp-1.sock'])).toEqual({ kind: 'pipe', name: '/run/user/1000/lsp-1.sock' });
    expect(transportOf(['--pipe', '/tmp/a b.sock'])).toEqual({ kind: 'pipe', name: '/tmp/a b.sock' });
    expect(transportOf(['--stdio', '--node-ipc'])).toEqual({ kind: 'stdio' });
    expect(transportOf(['--node-ipc', '--stdio'])).toEqual({ kind: 'node-ipc' });
  });

  it('refuses a TCP socket in every form (the network), and what the library would read as no transport', () => {
    for (const args of [['--socket=6009'], ['--socket', '6009'], ['--socket'], ['--socket=0'], ['--socket', '6009', '--stdio'], ['--clientProcessId', '42', '--socket=6009']]) {
      expect(transportOf(args), args.join(' ')).toEqual({ problem: NO_SOCKET });
    }
    expect(transportOf(['--stdio', '--socket=6009'])).toEqual({ kind: 'stdio' });
    expect(transportOf(['--pipe='])).toHaveProperty('problem');
    expect(transportOf(['--port=6009'])).toEqual({ problem: NO_TRANSPORT });
  });

  it('takes on Windows only a pipe on this machine', () => {
    expect(transportOf(['--pipe=\\\\.\\pipe\\lsp-1-sock'], 'win32')).toEqual({ kind: 'pipe', name: '\\\\.\\pipe\\lsp-1-sock' });
    expect(transportOf(['--pipe=\\\\elsewhere\\pipe\\lsp-1-sock'], 'win32')).toHaveProperty('problem');
    expect(transportOf(['--pipe=C:\\temp\\lsp.sock'], 'win32')).toHaveProperty('problem');
  });
});
