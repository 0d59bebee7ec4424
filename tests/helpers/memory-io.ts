/** The command line's streams in memory, for tests that call `run` directly. */
import { Writable } from 'node:stream';
import type { Io } from '../../server/src/cli/args';

export interface MemoryIo extends Io {
  /** Everything written to standard output so far. */
  out(): string;
  /** Everything written to standard error so far. */
  err(): string;
}

export interface MemoryIoOptions {
  readonly cwd?: string;
  readonly stdin?: string | Buffer;
  /** NO_COLOR by default. */
  readonly env?: NodeJS.ProcessEnv;
  /** Whether standard output claims to be a terminal. */
  readonly tty?: boolean;
}

export function memoryIo(options: MemoryIoOptions = {}): MemoryIo {
  let out = '';
  let err = '';
  const stdin = options.stdin ?? '';
  return {
    cwd: options.cwd ?? process.cwd(),
    env: options.env ?? { NO_COLOR: '1' },
    stdout: { write: (s: string | Uint8Array) => { out += typeof s === 'string' ? s : Buffer.from(s).toString('utf8'); return true; }, isTTY: options.tty ?? false },
    stderr: new Writable({ write(chunk: Buffer, _encoding, done) { err += chunk.toString(); done(); } }),
    stdin: () => (typeof stdin === 'string' ? Buffer.from(stdin) : stdin),
    out: () => out,
    err: () => err,
  };
}
