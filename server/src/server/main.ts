/**
 * Entry of the bundled language server (dist/server.js). The transport comes from the command
 * line: `--stdio` (as the VS Code extension and most editors start it) or `--node-ipc`.
 * On stdio the messages are written by our ASCII JSON encoder (see wire.ts). Logging goes to
 * the connection's console, never to stdout, which carries the protocol.
 */
import { format } from 'node:util';
import { keepYoungGenerationSmall } from './memory';

// Before anything sizable is allocated (see memory.ts).
keepYoungGenerationSmall();

import { createConnection, ProposedFeatures, StreamMessageReader, StreamMessageWriter, type Connection } from 'vscode-languageserver/node';
import { startServer } from './server';
import { asciiJsonEncoder } from './wire';

function stdioConnection(): Connection {
  const connection = createConnection(
    ProposedFeatures.all,
    new StreamMessageReader(process.stdin),
    new StreamMessageWriter(process.stdout, { contentTypeEncoder: asciiJsonEncoder }),
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

startServer(process.argv.includes('--stdio') ? stdioConnection() : createConnection(ProposedFeatures.all));
