/**
 * What every command shares: the I/O seam (so tests can run commands in memory), exit codes,
 * help texts, and strict option parsing validated with zod.
 */
import { parseArgs } from 'node:util';
import { z } from 'zod';

export interface Io {
  readonly cwd: string;
  readonly env: NodeJS.ProcessEnv;
  readonly stdout: { write(s: string): unknown; isTTY?: boolean };
  readonly stderr: NodeJS.WritableStream & { isTTY?: boolean };
  readonly stdin: () => Buffer;
}

export const EXIT = { ok: 0, findings: 1, usage: 2 } as const;

export const CAUTION = 'Pneumark supports, never replaces, clinical judgement: defer to local protocols and licensed practice.';

export const HELP: Readonly<Record<string, string>> = {
  main: `pneumark — checks, exports and formats structured respiratory notes (.pneu)

Usage:
  pneumark show FILE                   the note as Pneumark reads it: values, derived values, readings, findings
  pneumark check PATH... [options]     findings for notes
  pneumark export PATH... [options]    one row per timepoint (CSV, JSON Lines) or FHIR R4 bundles
  pneumark fmt PATH... [options]       canonical layout (the editor's formatter)
  pneumark docs [--write FILE]         the documentation of every check

PATH is a file, a folder (every .pneu below it), a glob pattern in quotes ("notes/**/*.pneu")
or - for standard input. A .pneuignore file in the working folder excludes paths (gitignore syntax).
Run \`pneumark COMMAND --help\` for a command's options.

Exit codes: 0 clean; 1 findings at error level, more warnings than --max-warnings, or notes that
fmt --check would change; 2 a usage error, a note that could not be read, or standard output
closed early (e.g. by head).

${CAUTION}`,
  show: `Usage: pneumark show FILE

Prints each timepoint with the values Pneumark understood (normalised, with units), the values
carried in from earlier timepoints and where they were stated, derived values with what is
missing to compute others, readings ("consistent with ..."), and each finding under its line.
Colour on a terminal; set NO_COLOR to turn it off.`,
  check: `Usage: pneumark check PATH... [options]

Options:
  --format text|json|sarif   output format (default text); sarif is SARIF 2.1.0 for code-scanning tools
  --quiet                    report errors only (text and sarif)
  --max-warnings N           exit 1 when there are more than N warnings
  --exclude PATTERN          leave out paths matching PATTERN (gitignore syntax; repeatable)
  --jobs N                   worker threads (0 or 1: none); default one per core, up to 4, from 200 notes
  --no-progress              no progress bar, even on a terminal`,
  export: `Usage: pneumark export PATH... --format csv|jsonl|fhir [options]

Options:
  --format csv|jsonl|fhir    csv: one row per timepoint with a header; jsonl: one JSON object per
                             timepoint; fhir: one FHIR R4 Bundle of Observations per note (a JSON array)
  --redact                   drop free text (timepoint labels) from the export
  --shift-days N             add N days to every day number and time offset (de-identification)
  --anchor DATETIME          FHIR only: the ISO date-time of day 1 00:00, to give observations a time
  --exclude PATTERN          leave out paths matching PATTERN (repeatable)
  --jobs N                   worker threads (0 or 1: none); default one per core, up to 4, from 200 notes
  --no-progress              no progress bar, even on a terminal
Columns are listed in README.md ("Export columns").`,
  fmt: `Usage: pneumark fmt PATH... [--check | --write] [--force]

Without --check or --write, prints the formatted note (one file only).
  --check      list notes whose layout would change; exit 1 if any
  --write      rewrite notes in place, atomically; a note with syntax errors is left alone unless
               --force, and a note changed on disk while being formatted is never overwritten
  --force      also rewrite notes that have syntax errors (their broken lines are kept as they are)
  --exclude PATTERN   leave out paths matching PATTERN (repeatable)`,
  docs: `Usage: pneumark docs [--write FILE] [--grammar FILE]

Prints (or writes) the documentation of every check, generated from the check registry.`,
};

export class UsageError extends Error {}

const JOBS = { message: 'expected a whole number from 0 to 64' };

/** `--jobs N`: worker threads for check and export (0 or 1: this thread only). */
export const jobsOption = z.coerce.number(JOBS).int(JOBS).min(0, JOBS).max(64, JOBS).optional();

type OptionSpec = Record<string, { type: 'string' | 'boolean'; short?: string; multiple?: boolean }>;

/** Parses options strictly; each command validates the values with zod. */
export function parse(args: readonly string[], options: OptionSpec): { positionals: string[]; values: Record<string, string | boolean | string[] | undefined> } {
  try {
    const parsed = parseArgs({ args: [...args], options: { help: { type: 'boolean', short: 'h' }, ...options }, allowPositionals: true, strict: true });
    return { positionals: parsed.positionals, values: parsed.values as Record<string, string | boolean | string[] | undefined> };
  } catch (error) {
    throw new UsageError(error instanceof Error ? error.message : String(error));
  }
}

export function validate<T>(schema: z.ZodType<T>, input: unknown): T {
  const parsed = schema.safeParse(input);
  if (!parsed.success) throw new UsageError(parsed.error.issues.map((i) => `--${i.path.join('.')}: ${i.message}`).join('; '));
  return parsed.data;
}

