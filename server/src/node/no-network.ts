/**
 * Stands in for Node's `net` module (and the HTTP modules) in every bundle. The protocol library's
 * own socket and named-pipe helpers land here, so they fail loudly; the language server's
 * `--socket` and `--pipe` transports connect through server/src/server/local-socket.ts, the one
 * module the build gives the real `net` (127.0.0.1 or a local socket only). The bundle test
 * (tests/security/network.test.ts) checks that no other network module is reachable.
 */
function refuse(): never {
  throw new Error('Pneumark makes no network connections (its language server connects to the editor only through local-socket.ts).');
}

export const createServer = refuse;
export const createConnection = refuse;
export const connect = refuse;
export class Socket {
  constructor() {
    refuse();
  }
}
