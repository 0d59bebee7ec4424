/**
 * Which transport the language server talks over, from its command line. The forms are those the
 * protocol library reads (vscode-languageserver's `createConnection` when given no streams), so an
 * editor that starts a server built on it can start Pneumark's the same way:
 *
 *   --stdio                          standard input and output
 *   --node-ipc                       Node's IPC channel to the process that started the server
 *   --pipe=NAME, --pipe NAME         a connection to the local socket (on Windows, named pipe) NAME
 *
 * The library's fourth form, `--socket=PORT` (a TCP connection to a port where the editor
 * listens), is refused with a one-line problem: it would take the network stack, and Pneumark
 * opens no network connection, not even to 127.0.0.1; a local pipe does the same job.
 *
 * The first of them on the command line wins, as in the library; other arguments (such as
 * `--clientProcessId`, which the library reads itself) are ignored here. Unlike the library, a
 * pipe name that is not local is refused with a one-line problem instead of falling through to
 * "no transport".
 */
import { z } from 'zod';

export type Transport =
  | { readonly kind: 'stdio' }
  | { readonly kind: 'node-ipc' }
  | { readonly kind: 'pipe'; readonly name: string };

/** What the server says on stderr (one line) before it exits with `TRANSPORT_PROBLEM_STATUS`. */
export interface TransportProblem {
  readonly problem: string;
}

/** The exit status of a server started with no transport or a wrong one (as the CLI's usage errors). */
export const TRANSPORT_PROBLEM_STATUS = 2;

export const NO_TRANSPORT = 'pneumark language server: no transport given: start it with --stdio, --node-ipc or --pipe=NAME';

/** Why `--socket` is refused. */
export const NO_SOCKET = 'pneumark language server: --socket is not offered: Pneumark opens no network connection, not even to 127.0.0.1; start it with --stdio, --node-ipc or --pipe=NAME';

/**
 * A local socket's path, or on Windows a pipe on this machine (`\\.\pipe\…`): a pipe name of the
 * form `\\server\pipe\…` would reach another machine.
 */
function pipeSchema(platform: NodeJS.Platform) {
  const windows = platform === 'win32';
  return z.string()
    .min(1, { message: 'expected the name of a local socket or pipe' })
    .max(4096, { message: 'is longer than a path can be' })
    .refine((name) => !name.includes('\0'), { message: 'holds a NUL character' })
    .refine((name) => !windows || /^\\\\[.?]\\pipe\\[^\\]/i.test(name), { message: 'expected a pipe on this machine (\\\\.\\pipe\\NAME)' });
}

function problem(option: string, value: string | undefined, issue: string): TransportProblem {
  const shown = value === undefined ? 'nothing' : JSON.stringify(value);
  return { problem: `pneumark language server: ${option} got ${shown}: ${issue}` };
}

/** The transport `argv` (the arguments after the script) asks for, or what is wrong with it. */
export function transportOf(argv: readonly string[], platform: NodeJS.Platform = process.platform): Transport | TransportProblem {
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i] ?? '';
    if (arg === '--stdio') return { kind: 'stdio' };
    if (arg === '--node-ipc') return { kind: 'node-ipc' };
    const eq = arg.indexOf('=');
    const name = eq < 0 ? arg : arg.slice(0, eq);
    if (name !== '--socket' && name !== '--pipe') continue;
    if (name === '--socket') return { problem: NO_SOCKET };
    const value = eq < 0 ? argv[i + 1] : arg.slice(eq + 1);
    const pipe = pipeSchema(platform).safeParse(value ?? '');
    return pipe.success ? { kind: 'pipe', name: pipe.data } : problem(name, value, pipe.error.issues[0]?.message ?? 'expected a local pipe name');
  }
  return { problem: NO_TRANSPORT };
}

export function isTransportProblem(t: Transport | TransportProblem): t is TransportProblem {
  return 'problem' in t;
}
