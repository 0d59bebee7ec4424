/**
 * Which transport the language server talks over, from its command line. The forms are those the
 * protocol library reads (vscode-languageserver's `createConnection` when given no streams), so an
 * editor that starts a server built on it can start Pneumark's the same way:
 *
 *   --stdio                          standard input and output
 *   --node-ipc                       Node's IPC channel to the process that started the server
 *   --socket=PORT, --socket PORT     a TCP connection to PORT on 127.0.0.1, where the editor listens
 *   --pipe=NAME, --pipe NAME         a connection to the local socket (on Windows, named pipe) NAME
 *
 * The first of them on the command line wins, as in the library; other arguments (such as
 * `--clientProcessId`, which the library reads itself) are ignored here. Unlike the library, a
 * port that is not a whole number from 1 to 65535, or a pipe name that is not local, is refused
 * with a one-line problem instead of falling through to "no transport".
 */
import { z } from 'zod';

export type Transport =
  | { readonly kind: 'stdio' }
  | { readonly kind: 'node-ipc' }
  | { readonly kind: 'socket'; readonly port: number }
  | { readonly kind: 'pipe'; readonly name: string };

/** What the server says on stderr (one line) before it exits with `TRANSPORT_PROBLEM_STATUS`. */
export interface TransportProblem {
  readonly problem: string;
}

/** The exit status of a server started with no transport or a wrong one (as the CLI's usage errors). */
export const TRANSPORT_PROBLEM_STATUS = 2;

export const NO_TRANSPORT = 'pneumark language server: no transport given: start it with --stdio, --node-ipc, --socket=PORT or --pipe=NAME';

const PORT_MESSAGE = 'expected a whole number from 1 to 65535';

const portSchema = z.string()
  .regex(/^\d{1,5}$/, { message: PORT_MESSAGE })
  .transform(Number)
  .pipe(z.number().int().min(1, { message: PORT_MESSAGE }).max(65535, { message: PORT_MESSAGE }));

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
    const value = eq < 0 ? argv[i + 1] : arg.slice(eq + 1);
    if (name === '--socket') {
      const port = portSchema.safeParse(value ?? '');
      return port.success ? { kind: 'socket', port: port.data } : problem(name, value, port.error.issues[0]?.message ?? PORT_MESSAGE);
    }
    const pipe = pipeSchema(platform).safeParse(value ?? '');
    return pipe.success ? { kind: 'pipe', name: pipe.data } : problem(name, value, pipe.error.issues[0]?.message ?? 'expected a local pipe name');
  }
  return { problem: NO_TRANSPORT };
}

export function isTransportProblem(t: Transport | TransportProblem): t is TransportProblem {
  return 'problem' in t;
}
