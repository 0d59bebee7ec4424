/**
 * Real headless Neovim as a client of the bundled server (dist/server.js), configured with the
 * Neovim configuration the README gives (read from README.md, so the two cannot drift apart).
 * tests/editors/driver.lua opens notes in it and writes what Neovim's own LSP client saw as JSON.
 * Needs `nvim` (the Debian package `neovim`; .ci/run installs it): without it the suite fails
 * and says how to install it.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';

export const REPO = resolve(__dirname, '..', '..');
export const SERVER = join(REPO, 'dist', 'server.js');
const DRIVER = join(REPO, 'tests', 'editors', 'driver.lua');
const MARKER = '<!-- neovim-0.7:';
const PLACEHOLDER = '/path/to/pneumark/dist/server.js';

/** The Neovim version on the PATH ("0.7.2"), or an error that says how to install it. */
export function neovimVersion(): string {
  const run = spawnSync('nvim', ['--version'], { encoding: 'utf8' });
  if (run.error || run.status !== 0) {
    throw new Error('nvim is not installed: these tests drive a real Neovim. Install it (Debian/Ubuntu: `sudo apt-get install neovim`) and run `npm run test:editors` again; .ci/run installs it.');
  }
  const version = /NVIM v(\d+\.\d+\.\d+)/.exec(run.stdout);
  if (!version) throw new Error(`nvim --version printed no version: ${run.stdout}`);
  return version[1]!;
}

/** The README's Neovim 0.7 configuration: the first ```lua block after the marker comment. */
export function readmeNeovimConfig(readme = readFileSync(join(REPO, 'README.md'), 'utf8')): string {
  const at = readme.indexOf(MARKER);
  if (at < 0) throw new Error(`README.md has no ${MARKER} marker before its Neovim configuration`);
  const block = /```lua\n([\s\S]*?)```/.exec(readme.slice(at));
  if (!block) throw new Error('README.md has no ```lua block after its Neovim marker');
  return block[1]!;
}

export interface NotePlan {
  readonly path: string;
  /** A code whose diagnostic to wait for before reading the diagnostics. */
  readonly waitFor?: string;
  /** Where to ask for hovers: [line, character] from 0. */
  readonly hovers?: readonly (readonly [number, number])[];
  /** Where to ask for completions ([line, character] from 0). */
  readonly complete?: readonly [number, number];
  /** Ask for the code actions of a line with its diagnostics and apply the first whose title holds `title`. */
  readonly action?: { readonly line: number; readonly title: string };
  /** Format the note with vim.lsp.buf.formatting_sync. */
  readonly format?: boolean;
  /**
   * Then write a file behind Neovim's back, or edit the note as typing would (the first `find` on
   * line `line` becomes `text`), and wait until no diagnostic has the code `waitGone` and one has `waitFor`.
   */
  readonly then?: {
    readonly write?: { readonly path: string; readonly text: string };
    readonly edit?: { readonly line: number; readonly find: string; readonly text: string };
    readonly waitGone?: string;
    readonly waitFor?: string;
  };
}

export interface SeenDiagnostic {
  readonly code: string | null;
  readonly message: string;
  readonly lnum: number;
  readonly col: number;
  readonly end_col: number;
  readonly severity: number;
  readonly source: string | null;
}

export interface SeenNote {
  readonly path: string;
  readonly filetype: string;
  readonly attached: boolean;
  readonly client?: { readonly root: string | null; readonly id: number };
  readonly diagnosticsArrived?: boolean;
  readonly diagnostics: readonly SeenDiagnostic[];
  readonly hovers: readonly (string | null)[];
  readonly formatted?: readonly string[];
  /** The words of the completions offered. */
  readonly completions?: readonly string[];
  /** The titles of the code actions offered, and the note's lines once one was applied. */
  readonly actions?: readonly string[];
  readonly acted?: readonly string[];
  /** After `then`: whether the diagnostics waited for came, and the diagnostics then. */
  readonly settled?: boolean;
  readonly after?: readonly SeenDiagnostic[];
}

export interface NeovimRun {
  readonly nvim: string;
  readonly notes: readonly SeenNote[];
}

/**
 * Runs headless Neovim with the README's configuration (the server's path put in for the
 * placeholder, and `edit` applied to it, if given) and the driver's plan; gives what it saw.
 */
export function runNeovim(notes: readonly NotePlan[], edit: (config: string) => string = (c) => c): NeovimRun {
  const dir = mkdtempSync(join(tmpdir(), 'pneumark-nvim-'));
  const readme = readmeNeovimConfig();
  if (!readme.includes(PLACEHOLDER)) throw new Error(`the README's Neovim configuration does not name ${PLACEHOLDER}`);
  const init = join(dir, 'init.lua');
  writeFileSync(init, edit(readme.replace(PLACEHOLDER, SERVER)));
  const out = join(dir, 'seen.json');
  const plan = join(dir, 'plan.json');
  writeFileSync(plan, JSON.stringify({ out, notes }));
  // `node` in the configuration is this Node; HOME and XDG folders are the test's own, so no
  // user configuration, shada or swap file of the machine takes part (--clean skips plugins).
  const env = {
    ...process.env,
    PATH: `${dirname(process.execPath)}:${process.env['PATH'] ?? ''}`,
    HOME: dir,
    XDG_CONFIG_HOME: join(dir, 'config'),
    XDG_DATA_HOME: join(dir, 'data'),
    XDG_STATE_HOME: join(dir, 'state'),
    XDG_CACHE_HOME: join(dir, 'cache'),
    PNEUMARK_NVIM_PLAN: plan,
  };
  const run = spawnSync('nvim', ['--headless', '--clean', '-n', '-u', init, '-c', `luafile ${DRIVER}`], { env, cwd: dir, encoding: 'utf8', timeout: 90_000 });
  let seen: string;
  try {
    seen = readFileSync(out, 'utf8');
  } catch {
    throw new Error(`Neovim wrote no results (status ${run.status}, signal ${run.signal}); stdout: ${run.stdout}; stderr: ${run.stderr}`);
  }
  return JSON.parse(seen) as NeovimRun;
}
