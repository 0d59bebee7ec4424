/**
 * Entry of the bundled language server (dist/server.js). The transport comes from the command
 * line (transport.ts): `--stdio` (as the VS Code extension and most editors start it),
 * `--node-ipc` or `--pipe=NAME` (a local socket or named pipe); with none of them, with
 * `--socket` (Pneumark opens no network connection) or a pipe that is not local, the server says
 * so in one line on stderr and exits with status 2.
 * On stdio and pipes the messages are written by our ASCII JSON encoder (see wire.ts).
 * On every transport, requests after a shutdown request are refused with InvalidRequest
 * (shutdown-gate.ts), and the server exits with status 0 on `exit` after `shutdown` (1 without
 * it: the library's exit handler); when the client closes its end of stdio, the IPC channel or a pipe,
 * the server ends with the same statuses. Logging goes to the connection's console, never to
 * stdout, which on stdio carries the protocol.
 */
import { format } from 'node:util';
import { keepYoungGenerationSmall } from './memory';

// Before anything sizable is allocated (see memory.ts).
keepYoungGenerationSmall();

import {
  createConnection,
  IPCMessageReader,
  IPCMessageWriter,
  ProposedFeatures,
  SocketMessageReader,
  SocketMessageWriter,
  StreamMessageReader,
  StreamMessageWriter,
  type Connection,
  type MessageReader,
  type MessageWriter,
} from 'vscode-languageserver/node';
import { connectToEditor } from './local-socket';
import { startServer } from './server';
import { ShutdownGate } from './shutdown-gate';
import { isTransportProblem, transportOf, TRANSPORT_PROBLEM_STATUS, type Transport } from './transport';
import { asciiJsonEncoder } from './wire';

/**
 * A connection over `reader` and `writer` behind the shutdown gate: requests after a shutdown
 * request are refused there, for every handler (see shutdown-gate.ts). `end` ends the server as
 * a transport's close does: status 0 after a shutdown request, 1 without.
 */
function gatedConnection(reader: MessageReader, writer: MessageWriter): { readonly connection: Connection; readonly end: () => never } {
  const gate = new ShutdownGate();
  const connection = createConnection(ProposedFeatures.all, gate.readerFor(reader), gate.writerFor(writer));
  let shutdown = false;
  connection.onShutdown(() => { shutdown = true; });
  return { connection, end: () => process.exit(shutdown ? 0 : 1) };
}

function stdioConnection(): Connection {
  const { connection, end } = gatedConnection(new StreamMessageReader(process.stdin), new StreamMessageWriter(process.stdout, { contentTypeEncoder: asciiJsonEncoder }));
  // What the library does for `--stdio`, which it skips when given a reader and a writer: stray
  // console output goes to the client's log instead of corrupting the protocol stream, and the
  // server ends when the client closes its end (after a shutdown request, with status 0).
  const toLog = (send: (message: string) => void) => (...args: unknown[]) => send(format(...args));
  console.log = toLog((m) => connection.console.log(m));
  console.info = toLog((m) => connection.console.info(m));
  console.warn = toLog((m) => connection.console.warn(m));
  console.error = toLog((m) => connection.console.error(m));
  console.debug = toLog((m) => connection.console.log(m));
  process.stdin.on('end', end);
  process.stdin.on('close', end);
  return connection;
}

/**
 * Over Node's IPC channel (`--node-ipc`), with the same gate as on stdio; and as on stdio, the
 * server ends when the process that started it closes the channel (status 0 after a shutdown
 * request, 1 without), rather than waiting on a channel no message will come through.
 */
function ipcConnection(): Connection {
  const { connection, end } = gatedConnection(new IPCMessageReader(process), new IPCMessageWriter(process));
  process.on('disconnect', end);
  return connection;
}

/**
 * Over a connection to the editor's local socket (`--pipe`), with the same gate and encoder as on
 * stdio. The library's exit handler ends the server on `exit`; when the editor closes the
 * connection first, the server ends as on stdio: status 0 after a shutdown request, 1 without.
 * A connection that cannot be made (nothing listens there) or breaks is said in one line on
 * stderr, and ends the server the same way.
 */
function pipeConnection(path: string): Connection {
  const socket = connectToEditor(path);
  const { connection, end } = gatedConnection(new SocketMessageReader(socket), new SocketMessageWriter(socket, { contentTypeEncoder: asciiJsonEncoder }));
  socket.on('error', (e: Error) => {
    process.stderr.write(`pneumark language server: connection to ${path}: ${e.message}\n`);
    end();
  });
  socket.on('close', end);
  return connection;
}

function connectionFor(transport: Transport): Connection {
  switch (transport.kind) {
    case 'stdio': return stdioConnection();
    case 'node-ipc': return ipcConnection();
    case 'pipe': return pipeConnection(transport.name);
  }
}

const transport = transportOf(process.argv.slice(2));
if (isTransportProblem(transport)) {
  process.stderr.write(`${transport.problem}\n`);
  process.exit(TRANSPORT_PROBLEM_STATUS);
} else {
  startServer(connectionFor(transport));
}
