/** ANSI colour for terminal output; off when not a terminal, or when NO_COLOR is set. */
export interface Paint {
  readonly bold: (s: string) => string;
  readonly dim: (s: string) => string;
  readonly red: (s: string) => string;
  readonly yellow: (s: string) => string;
  readonly blue: (s: string) => string;
  readonly cyan: (s: string) => string;
  readonly green: (s: string) => string;
  readonly magenta: (s: string) => string;
}

const wrap = (open: number, close: number) => (s: string) => `\u001b[${open}m${s}\u001b[${close}m`;
const plain = (s: string) => s;

export function paint(enabled: boolean): Paint {
  if (!enabled) return { bold: plain, dim: plain, red: plain, yellow: plain, blue: plain, cyan: plain, green: plain, magenta: plain };
  return { bold: wrap(1, 22), dim: wrap(2, 22), red: wrap(31, 39), yellow: wrap(33, 39), blue: wrap(34, 39), cyan: wrap(36, 39), green: wrap(32, 39), magenta: wrap(35, 39) };
}

export function colourWanted(stream: { isTTY?: boolean }, env: NodeJS.ProcessEnv): boolean {
  if (env.NO_COLOR !== undefined && env.NO_COLOR !== '') return false;
  if (env.FORCE_COLOR !== undefined && env.FORCE_COLOR !== '0') return true;
  return stream.isTTY === true;
}
