/**
 * Entry of the bundled language server (dist/server.js). The transport comes from the command
 * line: `--stdio` (as the VS Code extension and most editors start it) or `--node-ipc`.
 * On stdio the messages are written by our ASCII JSON encoder (see wire.ts). On both, requests
 * after a shutdown request are refused with InvalidRequest (shutdown-gate.ts). Logging goes to
 * the connection's console, never to stdout, which carries the protocol.
 */
import { format } from 'node:util';
import { keepYoungGenerationSmall } from './memory';

// Before anything sizable is allocated (see memory.ts).
keepYoungGenerationSmall();

import { createConnection, IPCMessageReader, IPCMessageWriter, ProposedFeatures, StreamMessageReader, StreamMessageWriter, type Connection } from 'vscode-languageserver/node';
import { startServer } from './server';
import { ShutdownGate } from './shutdown-gate';
import { asciiJsonEncoder } from './wire';

function stdioConnection(): Connection {
  // Requests after a shutdown request are refused there, for every handler (see shutdown-gate.ts).
  const gate = new ShutdownGate();
  const connection = createConnection(
    ProposedFeatures.all,
    gate.readerFor(new StreamMessageReader(process.stdin)),
    gate.writerFor(new StreamMessageWriter(process.stdout, { contentTypeEncoder: asciiJsonEncoder })),
  );
  // What the library does for `--stdio`, which it skips when given a reader and a writer: stray
  // console output goes to the client's log instead of corrupting the protocol stream, and the
  // server ends when the client closes its end (after a shutdown request, with status 0).
  let shutdown = false;
  connection.onShutdown(() => { shutdown = true; });
  const toLog = (send: (message: string) => void) => (...args: unknown[]) => send(format(...args));
  console.log = toLog((m) => connection.console.log(m));
  console.info = toLog((m) => connection.console.info(m));
  console.warn = toLog((m) => connection.console.warn(m));
  console.error = toLog((m) => connection.console.error(m));
  console.debug = toLog((m) => connection.console.log(m));
  const end = () => process.exit(shutdown ? 0 : 1);
  process.stdin.on('end', end);
  process.stdin.on('close', end);
  return connection;
}

/** Over Node's IPC channel (`--node-ipc`), with the same gate as on stdio. */
function ipcConnection(): Connection {
  const gate = new ShutdownGate();
  return createConnection(ProposedFeatures.all, gate.readerFor(new IPCMessageReader(process)), gate.writerFor(new IPCMessageWriter(process)));
}

startServer(
  process.argv.includes('--stdio') ? stdioConnection()
    : process.argv.includes('--node-ipc') ? ipcConnection()
      : createConnection(ProposedFeatures.all),
);
