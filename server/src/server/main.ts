/**
 * Entry of the bundled language server (dist/server.js). The transport comes from the command
 * line: `--stdio` or `--node-ipc` (as VS Code starts it). Logging goes to the connection's
 * console, never to stdout, which carries the protocol.
 */
import { createConnection, ProposedFeatures } from 'vscode-languageserver/node';
import { startServer } from './server';

startServer(createConnection(ProposedFeatures.all));
