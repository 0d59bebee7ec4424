// The transports of the bundled language server other than stdio: `--socket` (TCP on 127.0.0.1,
// where the client listens) and `--pipe` (a local socket), with the shutdown gate of the Language
// Server Protocol (3.17, "Shutdown Request": requests after shutdown fail with InvalidRequest) and
// stdio's exit statuses; and what the server does when started without a usable transport.
import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterEach, describe, expect, it } from 'vitest';
import {
  createClientPipeTransport,
  createClientSocketTransport,
  createProtocolConnection,
  ResponseError,
  type MessageReader,
  type MessageWriter,
  type ProtocolConnection,
  type PublishDiagnosticsParams,
} from 'vscode-languageserver-protocol/node';
import { NO_TRANSPORT, transportOf, TRANSPORT_PROBLEM_STATUS } from '../../server/src/server/transport';

const INVALID_REQUEST = -32600;
const WAIT_MS = 15000;

/** What a test started; stopped and removed after each test whatever happened. */
const started: { children: ChildProcessWithoutNullStreams[]; closers: (() => void)[]; folders: string[] } = { children: [], closers: [], folders: [] };

afterEach(() => {
  for (const child of started.children.splice(0)) if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  for (const close of started.closers.splice(0)) close();
  for (const folder of started.folders.splice(0)) rmSync(folder, { recursive: true, force: true });
});

interface Server {
  readonly child: ChildProcessWithoutNullStreams;
  /** The exit status, once the server has exited. */
  readonly exited: Promise<number | null>;
  stderr(): string;
}

function startServer(args: readonly string[]): Server {
  const child = spawn(process.execPath, ['dist/server.js', ...args], { stdio: 'pipe' });
  started.children.push(child);
  let stderr = '';
  child.stderr.on('data', (d: Buffer) => { stderr += d.toString(); });
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  return { child, exited, stderr: () => stderr };
}

function within<T>(what: string, promise: Promise<T>, server: Server): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`${what} took over ${WAIT_MS} ms; server stderr: ${server.stderr()}`)), WAIT_MS);
    promise.then((v) => { clearTimeout(timer); resolve(v); }, (e: unknown) => { clearTimeout(timer); reject(e); });
  });
}

type Listening = { readonly args: readonly string[]; onConnected(): Promise<[MessageReader, MessageWriter]>; close(): void };

/** The client's end for `--socket`: a TCP server on 127.0.0.1, on a port the system picks. */
async function socketListening(form: 'equals' | 'separate'): Promise<Listening> {
  const transport = await createClientSocketTransport(0);
  started.closers.push(() => transport.close());
  const port = String(transport.port());
  return { args: form === 'equals' ? [`--socket=${port}`] : ['--socket', port], onConnected: () => transport.onConnected(), close: () => transport.close() };
}

/** The client's end for `--pipe`: a Unix domain socket in a temporary folder. */
async function pipeListening(form: 'equals' | 'separate'): Promise<Listening> {
  const folder = mkdtempSync(join(tmpdir(), 'pneumark-pipe-'));
  started.folders.push(folder);
  const name = join(folder, 'lsp.sock');
  const transport = await createClientPipeTransport(name);
  started.closers.push(() => transport.close());
  return { args: form === 'equals' ? [`--pipe=${name}`] : ['--pipe', name], onConnected: () => transport.onConnected(), close: () => transport.close() };
}

/** Starts the server on the client's end, and initializes it over the connection it makes. */
async function connect(listening: Listening): Promise<{ server: Server; connection: ProtocolConnection; published: PublishDiagnosticsParams[] }> {
  const server = startServer(listening.args);
  const [reader, writer] = await within('the server connecting', listening.onConnected(), server);
  const connection = createProtocolConnection(reader, writer);
  started.closers.push(() => connection.dispose());
  const published: PublishDiagnosticsParams[] = [];
  connection.onNotification('textDocument/publishDiagnostics', (p: PublishDiagnosticsParams) => { published.push(p); });
  connection.onRequest('workspace/configuration', (p: { items: unknown[] }) => p.items.map(() => ({})));
  connection.listen();
  await within('initialize', connection.sendRequest('initialize', { processId: process.pid, rootUri: null, capabilities: { workspace: { configuration: true } } }), server);
  await connection.sendNotification('initialized', {});
  return { server, connection, published };
}

/** The error code a request was answered with; null when it was answered without an error. */
async function errorCode(request: Promise<unknown>): Promise<number | null> {
  try {
    await request;
    return null;
  } catch (e) {
    expect(e).toBeInstanceOf(ResponseError);
    return (e as ResponseError<unknown>).code;
  }
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
  ['--socket=PORT', () => socketListening('equals')],
  ['--socket PORT', () => socketListening('separate')],
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
    const { server, connection } = await connect(await listen());
    connection.dispose();
    expect(await within('exit', server.exited, server)).toBe(1);
  });

  it('exits with status 0 when the client closes the connection after a shutdown request', async () => {
    const { server, connection } = await connect(await listen());
    await connection.sendRequest('shutdown');
    connection.dispose();
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
    [['--socket=0'], 'pneumark language server: --socket got "0": expected a whole number from 1 to 65535'],
    [['--socket', '80x'], 'pneumark language server: --socket got "80x": expected a whole number from 1 to 65535'],
    [['--pipe'], 'pneumark language server: --pipe got nothing: expected the name of a local socket or pipe'],
  ])('%j: says so in one line on stderr and exits with status 2', async (args, line) => {
    const server = startServer(args);
    let stdout = '';
    server.child.stdout.on('data', (d: Buffer) => { stdout += d.toString(); });
    expect(await within('exit', server.exited, server)).toBe(TRANSPORT_PROBLEM_STATUS);
    expect(server.stderr()).toBe(`${line}\n`);
    expect(stdout).toBe('');
  });

  it('exits with status 1, saying where, when nothing listens on the port', async () => {
    const transport = await createClientSocketTransport(0);
    const port = transport.port();
    transport.close(); // nothing listens there any more
    const server = startServer([`--socket=${port}`]);
    expect(await within('exit', server.exited, server)).toBe(1);
    expect(server.stderr()).toMatch(new RegExp(`^pneumark language server: connection to 127\\.0\\.0\\.1:${port}: .*ECONNREFUSED.*\\n$`));
  });
});

describe('transportOf', () => {
  it('reads the forms the protocol library reads; the first transport argument wins', () => {
    expect(transportOf(['--stdio'])).toEqual({ kind: 'stdio' });
    expect(transportOf(['--node-ipc', '--clientProcessId=42'])).toEqual({ kind: 'node-ipc' });
    expect(transportOf(['--clientProcessId', '42', '--socket=6009'])).toEqual({ kind: 'socket', port: 6009 });
    expect(transportOf(['--socket', '6009', '--stdio'])).toEqual({ kind: 'socket', port: 6009 });
    expect(transportOf(['--pipe=/run/user/1000/lsp-1.sock'])).toEqual({ kind: 'pipe', name: '/run/user/1000/lsp-1.sock' });
    expect(transportOf(['--pipe', '/tmp/a b.sock'])).toEqual({ kind: 'pipe', name: '/tmp/a b.sock' });
    expect(transportOf(['--stdio', '--node-ipc'])).toEqual({ kind: 'stdio' });
    expect(transportOf(['--node-ipc', '--stdio'])).toEqual({ kind: 'node-ipc' });
  });

  it('refuses what the library would read as some other port, or as no transport', () => {
    for (const port of ['', '0', '65536', '1e3', '0x10', ' 80', '-1', '80.5', '6009abc']) {
      expect(transportOf([`--socket=${port}`]), port).toHaveProperty('problem');
    }
    expect(transportOf(['--socket'])).toEqual({ problem: 'pneumark language server: --socket got nothing: expected a whole number from 1 to 65535' });
    expect(transportOf(['--socket', '--stdio'])).toHaveProperty('problem');
    expect(transportOf(['--pipe='])).toHaveProperty('problem');
    expect(transportOf(['--port=6009'])).toEqual({ problem: NO_TRANSPORT });
  });

  it('takes on Windows only a pipe on this machine', () => {
    expect(transportOf(['--pipe=\\\\.\\pipe\\lsp-1-sock'], 'win32')).toEqual({ kind: 'pipe', name: '\\\\.\\pipe\\lsp-1-sock' });
    expect(transportOf(['--pipe=\\\\elsewhere\\pipe\\lsp-1-sock'], 'win32')).toHaveProperty('problem');
    expect(transportOf(['--pipe=C:\\temp\\lsp.sock'], 'win32')).toHaveProperty('problem');
  });
});
