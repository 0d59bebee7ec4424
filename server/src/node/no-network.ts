/**
 * Stands in for Node's `net` module (and the HTTP modules) in every bundle. The protocol library's
 * own socket and named-pipe helpers land here, so they fail loudly; the language server's
 * `--pipe` transport connects through server/src/server/local-socket.ts, the one module the
 * build gives the real `net` (a local socket path only; `--socket` is refused). The bundle test
 * (tests/security/network.test.ts) checks that no other network module is reachable.
 */
function refuse(): never {
  throw new Error('Pneumark makes no network connections (its language server talks to the editor over stdio, Node IPC or a local pipe).');
}

export const createServer = refuse;
export const createConnection = refuse;
export const connect = refuse;
export class Socket {
  constructor() {
    refuse();
  }
}
