/**
 * The one module of the editor side that may use Node's `net`: it opens the connection of the
 * `--pipe` transport to the editor that started the server, and nothing else: a local socket
 * path (on Windows a pipe on this machine; transport.ts refuses one on another machine), never a
 * host and port (`--socket` is refused, transport.ts). Everywhere else
 * `net` resolves to the refusing stub (esbuild.mjs, no-network.ts), including the protocol
 * library's own socket helpers; tests/security/network.test.ts checks that this file is the only
 * importer of a network module in any bundle.
 */
import { createConnection, type Socket } from 'node:net';

/** A connection to the editor listening on the local socket (or pipe) `path`. */
export function connectToEditor(path: string): Socket {
  return createConnection({ path });
}
