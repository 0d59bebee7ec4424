/**
 * Stands in for Node's `net` module in the language server and extension bundles. The protocol
 * library offers socket and named-pipe transports that Pneumark never uses (it talks over stdio or
 * IPC), so the bundles carry no way to open a network connection: any attempt fails loudly.
 * The bundle test (tests/security/network.test.ts) checks that no network module is reachable.
 */
function refuse(): never {
  throw new Error('Pneumark makes no network connections (socket and pipe transports are not available).');
}

export const createServer = refuse;
export const createConnection = refuse;
export const connect = refuse;
export class Socket {
  constructor() {
    refuse();
  }
}
