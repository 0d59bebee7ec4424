/**
 * The one module of the editor side that may use Node's `net`: it opens the connection of the
 * `--socket` and `--pipe` transports to the editor that started the server, and nothing else.
 * A socket goes to 127.0.0.1 only (the host is fixed here, never read from anywhere), a pipe to
 * a local socket path (transport.ts refuses a Windows pipe on another machine). Everywhere else
 * `net` resolves to the refusing stub (esbuild.mjs, no-network.ts), including the protocol
 * library's own socket helpers; tests/security/network.test.ts checks that this file is the only
 * importer of a network module in any bundle.
 */
import { createConnection, type Socket } from 'node:net';

export const LOOPBACK = '127.0.0.1';

/** A connection to the editor listening on `port` of 127.0.0.1, or on the local socket `path`. */
export function connectToEditor(target: { readonly port: number } | { readonly path: string }): Socket {
  return 'port' in target ? createConnection({ host: LOOPBACK, port: target.port }) : createConnection({ path: target.path });
}
