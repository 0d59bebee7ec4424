#!/usr/bin/env node
/**
 * The `pneumark` command. It only translates between the terminal and the core:
 * options are validated with zod, notes are read, the core checks them, output is rendered.
 * Exit codes: 0 no errors, 1 findings at error level, 2 usage or input errors.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { z } from 'zod';
import { checkNote } from '../core/check-note';
import { renderCheckDocs } from '../core/checks/docs';
import { withGeneratedTables } from '../core/fields/docs';
import { colourWanted, paint } from './colour';
import { listInputs, readNote } from './inputs';
import { renderCheckJson, renderCheckText, type FileOutcome } from './render-check';
import { renderShow } from './render-show';
import { timepointsJson } from './timepoints-json';

export interface Io {
  readonly cwd: string;
  readonly env: NodeJS.ProcessEnv;
  readonly stdout: { write(s: string): unknown; isTTY?: boolean };
  readonly stderr: { write(s: string): unknown; isTTY?: boolean };
  readonly stdin: () => Buffer;
}

const HELP = `pneumark — checks structured respiratory notes (.pneu)

Usage:
  pneumark show FILE                    the note as Pneumark reads it, with findings
  pneumark check PATH... [options]      findings for files, folders (every .pneu inside) or - (stdin)
  pneumark docs [--write FILE]          the documentation of every check, as Markdown

Options for check:
  --format text|json    output format (default text)
  --quiet               only errors in text output
Exit codes: 0 no errors, 1 findings at error level, 2 usage or input errors.

Pneumark supports, never replaces, clinical judgement: defer to local protocols and licensed practice.`;

const checkOptions = z.object({
  format: z.enum(['text', 'json']).default('text'),
  quiet: z.boolean().default(false),
});

export function run(argv: readonly string[], io: Io): number {
  const [command, ...rest] = argv;
  const p = paint(colourWanted(io.stdout, io.env));
  try {
    switch (command) {
      case 'show': return show(rest, io, p);
      case 'check': return check(rest, io);
      case 'docs': return docs(rest, io);
      case undefined:
      case '-h':
      case '--help':
      case 'help':
        io.stdout.write(`${HELP}\n`);
        return command === undefined ? 2 : 0;
      default:
        io.stderr.write(`pneumark: unknown command \`${command}\`\n\n${HELP}\n`);
        return 2;
    }
  } catch (error) {
    if (error instanceof UsageError) {
      io.stderr.write(`pneumark: ${error.message}\n`);
      return 2;
    }
    throw error;
  }
}

class UsageError extends Error {}

type OptionSpec = Record<string, { type: 'string' | 'boolean'; short?: string }>;

/** Parses options strictly; what comes back is still validated with zod by each command. */
function parse(args: readonly string[], options: OptionSpec): { positionals: string[]; values: Record<string, string | boolean | undefined> } {
  try {
    const parsed = parseArgs({ args: [...args], options: { help: { type: 'boolean', short: 'h' }, ...options }, allowPositionals: true, strict: true });
    return { positionals: parsed.positionals, values: parsed.values as Record<string, string | boolean | undefined> };
  } catch (error) {
    throw new UsageError(error instanceof Error ? error.message : String(error));
  }
}

function show(args: readonly string[], io: Io, p: ReturnType<typeof paint>): number {
  const { positionals, values } = parse(args, {});
  if (values.help) { io.stdout.write('Usage: pneumark show FILE\n'); return 0; }
  if (positionals.length !== 1) throw new UsageError('show takes exactly one file (use `check` for several)');
  const note = readNote(positionals[0]!, io.cwd, io.stdin);
  if (note.text === null) {
    io.stderr.write(`pneumark: ${note.path}: ${note.problem}\n`);
    return 2;
  }
  const result = checkNote(note.text);
  io.stdout.write(`${renderShow(note.path, result, p)}\n`);
  return result.findings.some((f) => f.severity === 'error') ? 1 : 0;
}

function check(args: readonly string[], io: Io): number {
  const { positionals, values } = parse(args, { format: { type: 'string' }, quiet: { type: 'boolean' } });
  if (values.help) { io.stdout.write(`${HELP}\n`); return 0; }
  const parsed = checkOptions.safeParse({ format: values.format, quiet: values.quiet });
  if (!parsed.success) throw new UsageError(`invalid option: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
  if (positionals.length === 0) throw new UsageError('check needs at least one file, folder or - (stdin)');
  const opts = parsed.data;
  const { files, problems } = listInputs(positionals, io.cwd);
  const outcomes: FileOutcome[] = problems.map((pr) => ({ path: pr.path, result: null, problem: pr.problem }));
  for (const file of files) {
    const note = readNote(file, io.cwd, io.stdin);
    outcomes.push(note.text === null ? { path: note.path, result: null, problem: note.problem } : { path: note.path, result: checkNote(note.text), problem: null });
  }
  if (opts.format === 'json') io.stdout.write(`${renderCheckJson(outcomes, (o) => (o.result ? { timepoints: timepointsJson(o.result) } : {}))}\n`);
  else io.stdout.write(`${renderCheckText(outcomes, paint(colourWanted(io.stdout, io.env)), opts.quiet)}\n`);
  for (const o of outcomes) if (o.problem) io.stderr.write(`pneumark: ${o.path}: ${o.problem}\n`);
  if (outcomes.some((o) => o.problem)) return 2;
  if (outcomes.some((o) => o.result?.findings.some((f) => f.severity === 'error'))) return 1;
  return 0;
}

function docs(args: readonly string[], io: Io): number {
  const { values } = parse(args, { write: { type: 'string' }, grammar: { type: 'string' } });
  const text = renderCheckDocs();
  if (typeof values.write === 'string') writeFileSync(values.write, text);
  else io.stdout.write(text);
  if (typeof values.grammar === 'string') writeFileSync(values.grammar, withGeneratedTables(readFileSync(values.grammar, 'utf8')));
  return 0;
}

if (require.main === module) {
  const code = run(process.argv.slice(2), {
    cwd: process.cwd(),
    env: process.env,
    stdout: process.stdout,
    stderr: process.stderr,
    stdin: () => readFileSync(0),
  });
  process.exitCode = code;
}
