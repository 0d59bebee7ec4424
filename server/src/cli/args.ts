/**
 * What every command shares: the I/O seam (so tests can run commands in memory), exit codes,
 * help texts, and strict option parsing validated with zod.
 */
import { sep } from 'node:path';
import { parseArgs } from 'node:util';
import { z } from 'zod';
import { SUPPORTS } from '../core/checks/docs';
import { wordList } from '../core/util/format';
import { visible } from './visible';

export interface Io {
  readonly cwd: string;
  readonly env: NodeJS.ProcessEnv;
  /** Text, or bytes written as they are (`fmt -` passing through a note it leaves alone). */
  readonly stdout: { write(s: string | Uint8Array): unknown; isTTY?: boolean };
  readonly stderr: NodeJS.WritableStream & { isTTY?: boolean };
  readonly stdin: () => Buffer;
}

export const EXIT = { ok: 0, findings: 1, usage: 2 } as const;

export const CAUTION = SUPPORTS;

export const HELP: Readonly<Record<string, string>> = {
  main: `pneumark — checks, exports and formats structured respiratory notes (.pneu)

Usage:
  pneumark show FILE [options]         the note as Pneumark reads it: values, derived values, readings, findings
  pneumark check PATH... [options]     findings for notes
  pneumark export PATH... [options]    one row per timepoint (CSV, JSON Lines) or FHIR R4 bundles
  pneumark fmt PATH... [options]       canonical layout (the editor's formatter)
  pneumark docs [CHECK...]             the documentation of every check, or of those named
  pneumark help [COMMAND]              this help, or a command's (as COMMAND --help)
  pneumark --version                   the version

PATH is a file, a folder (every .pneu below it, in any case; hidden folders and files and
node_modules are skipped), a glob pattern in quotes ("notes/**/*.pneu"; its .pneu in any case
too) or - for standard input. A path that exists is read as a path even when it holds [ ] or
( ). --exclude PATTERN and .pneuignore files leave notes out (gitignore syntax); a .pneuignore
applies below its own folder, as a .gitignore does: the working folder's, and those in the
folders on the way to each note. --stdin-name PATH (check, export, fmt, show) names the note read
from - as the file PATH, which need not exist (--stdin-name without - among the inputs is a usage
error); check, export and fmt leave the note alone when PATH is excluded, as they would the file
(one line on standard error; exit 0; fmt writes it out unchanged), show shows it.
Run \`pneumark COMMAND --help\` for a command's options.

Exit codes: 0 clean; 1 findings at error level, more warnings than --max-warnings, or notes that
fmt --check would change; 2 a usage error, inputs that hold no note (an empty folder, a pattern
that matches nothing; in check, show and export, a note that is empty or has only blank lines, as
standard input with nothing piped in is), a note that could not be read, or analysed in the memory
one note is given, or that fmt --write would not rewrite, a folder below those named that cannot
be listed, an invalid pneumark.config.json (one line per problem on standard error; the run goes
on with the defaults for that file), or standard output closed early (e.g. by head) or not writable
(a full disk).

${CAUTION}`,
  show: `Usage: pneumark show FILE [--stdin-name PATH]

Prints the note as Pneumark reads it (FILE may be - for standard input): a first line with the
file, its number of timepoints and its findings by severity; the header (patient, place and
units lines before the first @ line: they hold for the whole note); then each timepoint (@, its
time, its label and its line number) with
  SECTION    each line's values, normalised, with units (the other unit system in brackets)
  carried    values in force from an earlier timepoint, with the line they were stated on
  target     the SpO2 target the spo2Target setting gives a note that writes none (one written
             is shown on its oxygen line, and carried as other values are)
  derived    values computed from those in force
  change     at an arterial gas, each value against the previous arterial gas (PaO2, PaCO2, pH,
             P/F; FiO2, O2 flow, PEEP, IPAP, EPAP, CPAP; the oxygen device where it changed): the
             difference and what it was; gas values only where stated at both gases, settings
             and P/F as in force (* where a setting was carried; FiO2 est, a low-flow estimate)
  withheld   values a finding keeps back (e.g. P/F when PaO2 is above the alveolar PO2), with why
  n/a        values whose formula does not hold here, though their inputs are (e.g. the upper
             normal A–a gradient of a child), with why
  missing    what to add (as keys written in a note) to get the ones that could not be computed
  reading    what the values are consistent with
and each finding (error, warning or info) under the line it belongs to. A legend at the end
explains every short name and mark used above (P/F, *, (not used) ...), with names and units.
Colour on a terminal; set NO_COLOR to turn it off. Exit code 1 when a finding is an error.

Options:
  --stdin-name PATH          with FILE -, the path of the note read from standard input: the first
                             line names the note so, and pneumark.config.json is looked up from its
                             folder, as for a file there (which need not exist); the note is shown
                             even when .pneuignore or --exclude would leave it out, as a FILE is`,
  check: `Usage: pneumark check PATH... [options]

Options:
  --format text|json|sarif   output format (default text); sarif is SARIF 2.1.0 for code-scanning tools;
                             json is indented on a terminal, else compact (a line per note)
  --json-version 1|2         json: the shape's version (default 1); 2 writes each derived value's
                             formula and source once, in a table of the run at the end, and leaves
                             out the null members of origins (see README.md, "JSON output")
  --json-detail KIND         json: what each note's entry holds, KIND full (the default): its
                             findings and its timepoints with every value, derived value and
                             reading; or findings: its path, problem and findings alone (a small
                             output for continuous integration; the summary is the same)
  --indented                 json: indent it even when standard output is not a terminal (a file
                             or a pager for people to read)
  --quiet                    list error findings only (text, json and sarif; totals count all)
  --redact                   keep the notes' own words out of the output, for sharing a report of a
                             dataset: name each note by its place in the run (note-00001 …, paths
                             sorted) instead of its path; in messages, write [redacted] for what
                             they quote of a note that is not a key, a unit, a known word or a
                             number (all they quote in privacy findings), for its timepoint labels
                             and for a mode Pneumark does not know; leave out fixes (json, sarif);
                             in json, labels and such words of the timepoints too. Standard error
                             still names notes by their paths
  --max-warnings N           exit 1 when there are more than N warnings (N a whole number, 0 or more)
  --exclude PATTERN          leave out paths matching PATTERN (gitignore syntax), or a
                             path (absolute, or from ./ or ../); repeatable
  --jobs N                   worker threads (0 or 1: none); default one per core, up to 4, from 2000 notes
  --no-progress              no progress bar, even on a terminal
  --stdin-name PATH          the path of the note read from - (standard input), for editors and
                             pipelines: output names the note so, and pneumark.config.json is
                             looked up from its folder, as for a file there (which need not exist);
                             when PATH is excluded by .pneuignore or --exclude, the note is not
                             read: one line on standard error says so, and the run is that of the
                             other inputs (none: no findings, exit 0)`,
  export: `Usage: pneumark export PATH... --format csv|jsonl|fhir [options]

Options:
  --format csv|jsonl|fhir    csv: one row per timepoint with a header; jsonl: one JSON object per
                             timepoint; fhir: one FHIR R4 Bundle of Observations per note (a JSON array)
  --redact                   keep only Pneumark's own words: drop timepoint labels, write a mode
                             it does not know as [redacted], in JSON Lines the check's title for
                             each finding's message, and name each note by its place in the run
                             (note-00001 …, paths sorted) instead of its file name
  --shift-days N             add N days to every day number and time (day, FHIR times; not
                             offset_minutes), for de-identification;
                             N a whole number from -100000 to 100000, e.g. --shift-days -3
  --anchor DATETIME          FHIR only: the ISO date-time of day 1 00:00 (its time must be 00:00, e.g.
                             2026-01-05T00:00:00Z), to give observations a time
  --spreadsheet-safe         CSV only: an apostrophe before text starting with = + - @ tab, carriage
                             return, line feed or ' (undo by removing one), and a byte-order mark;
                             for files opened in spreadsheet programs (the default output stays exact)
  --exclude PATTERN          leave out paths matching PATTERN (gitignore syntax), or a
                             path (absolute, or from ./ or ../); repeatable
  --jobs N                   worker threads (0 or 1: none); default one per core, up to 4, from 2000 notes
  --no-progress              no progress bar, even on a terminal
  --stdin-name PATH          the path of the note read from - (standard input), for editors and
                             pipelines: its file column, FHIR identifier and FHIR ids are made
                             from it as for a file of that path (so ids stay the same when the text
                             is edited; with --redact, its place in the run is that of such a file), and
                             pneumark.config.json is looked up from its folder (it need not exist);
                             when PATH is excluded by .pneuignore or --exclude, the note is not
                             read: one line on standard error says so, and the output is that of
                             the other inputs (none: a CSV header alone, or an empty array)
Columns are listed in README.md ("Export columns").`,
  fmt: `Usage: pneumark fmt PATH... [--check | --write] [--force] [--exclude PATTERN] [--stdin-name PATH]

Without --check or --write, prints the formatted note (one file only).

Options:
  --check                    list notes whose layout would change; exit 1 if any
  --write                    rewrite notes in place, atomically, keeping their permissions, owner
                             and group; a note with syntax errors is left alone unless --force, and
                             a read-only note, one changed on disk while being formatted, one with
                             several names (hard links) or one whose owner the new file could not
                             keep is never overwritten
  --force                    with --write: also rewrite notes that have syntax errors (their broken
                             lines are kept as they are)
  --exclude PATTERN          leave out paths matching PATTERN (gitignore syntax), or a
                             path (absolute, or from ./ or ../); repeatable
  --stdin-name PATH          the path of the note read from - (standard input), as messages name it
                             (it need not exist); when PATH is excluded by .pneuignore or --exclude,
                             the note is written out unchanged and --check passes it (one line on
                             standard error says so; exit 0)`,
  docs: `Usage: pneumark docs [CHECK...] [--write FILE] [--grammar FILE] [--readme FILE]

Prints (or writes) the documentation of every check, generated from the check registry, or of
the checks named, by code or alias (pneumark docs PN405 oxygenation-reading).

Options:
  --write FILE               write it to FILE instead of standard output
  --grammar FILE             regenerate the generated tables in FILE (grammar/README.md)
  --readme FILE              regenerate the export columns and the settings in FILE (README.md)`,
};

export class UsageError extends Error {}

/**
 * An empty argument (`check "$NOTES"` with the variable unset) would resolve to the working
 * folder and take in every note under it (`fmt --write ""` would rewrite them all): a usage error.
 */
export function refuseEmptyPaths(paths: readonly string[]): void {
  if (paths.some((p) => p === '')) throw new UsageError('an empty argument is not a path (is a variable unset?); name a file, folder or pattern, or . for the working folder');
}

/**
 * An option that takes a whole number: only plain decimal digits (with a sign when `signed`), in
 * `min`–`max`. Anything else (an empty string, `0x10`, `1e3`, `1.5`, spaces) is refused with
 * `message` rather than read as some number: an option such as --shift-days must never silently
 * mean 0.
 */
export function wholeNumberOption(min: number, max: number, message: string, signed = false): z.ZodType<number, string> {
  const digits = signed ? /^[+-]?\d{1,15}$/ : /^\d{1,15}$/;
  return z.string({ message })
    .regex(digits, { message })
    .transform(Number)
    .pipe(z.number().int({ message }).min(min, { message }).max(max, { message }));
}

/**
 * `--stdin-name PATH` (check, export, fmt, show): the path of the note read from `-`. Any path a file
 * could have, existing or not; not a folder's (ending in a slash), not `-`, and no NUL character,
 * which no path holds.
 */
export const stdinNameOption = z.string()
  .min(1, { message: 'must not be empty (name the file the note read from - stands for)' })
  .max(4096, { message: 'is too long for a path (at most 4096 characters)' })
  .refine((p) => !p.includes('\u0000'), { message: 'holds a NUL character, which no path holds' })
  .refine((p) => p !== '-', { message: 'names standard input itself; give the path of the file the note stands for' })
  .refine((p) => !p.endsWith('/') && !(sep === '\\' && p.endsWith('\\')), { message: 'ends in a slash: name a file, not a folder' })
  .optional();

/** `--jobs N`: worker threads for check and export (0 or 1: this thread only). */
export const jobsOption = wholeNumberOption(0, 64, 'expected a whole number from 0 to 64').optional();

/**
 * The most `**` one exclusion pattern may hold. Each one more multiplies the time a pattern takes
 * to be matched against a path by the depth of the path (the pattern is matched as a regular
 * expression that tries every split of the path): fourteen `**`, each before a folder name, took
 * ten seconds for each note 30 folders deep.
 */
export const MAX_GLOBSTARS = 2;

/** How many `**` a pattern holds. */
export function globstarsIn(pattern: string): number {
  let count = 0;
  for (let at = pattern.indexOf('**'); at >= 0; at = pattern.indexOf('**', at + 2)) count++;
  return count;
}

/** `--exclude` patterns: each a gitignore pattern with at most `MAX_GLOBSTARS` `**`. */
export const excludeOption = z.array(z.string().min(1).max(500).refine((p) => globstarsIn(p) <= MAX_GLOBSTARS, { message: `holds more than ${MAX_GLOBSTARS} \`**\`, which makes matching take too long on deep folders` })).max(100).default([]);

type OptionSpec = Record<string, { type: 'string' | 'boolean'; short?: string; multiple?: boolean }>;

/** A number with a minus sign (`-3`, `-0.5`): after an option that takes a value, that value. */
const NEGATIVE_NUMBER = /^-\d/;

/**
 * Parses options strictly; each command validates the values with zod. A negative number right
 * after an option that takes a value is that option's value (`--shift-days -3`), as
 * `--shift-days=-3` would be; an option that takes one value may be given once. Errors are one
 * line that names the option as typed.
 */
export function parse(args: readonly string[], options: OptionSpec): { positionals: string[]; values: Record<string, string | boolean | string[] | undefined> } {
  const joined: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg === '--') { joined.push(...args.slice(i)); break; }
    const next = args[i + 1];
    const name = arg.startsWith('--') && !arg.includes('=') ? arg.slice(2) : null;
    if (name !== null && options[name]?.type === 'string' && next !== undefined && NEGATIVE_NUMBER.test(next)) {
      joined.push(`${arg}=${next}`);
      i++;
    } else {
      joined.push(arg);
    }
  }
  try {
    const parsed = parseArgs({ args: joined, options: { help: { type: 'boolean', short: 'h' }, ...options }, allowPositionals: true, strict: true, tokens: true });
    twice(parsed.tokens, options);
    return { positionals: parsed.positionals, values: parsed.values as Record<string, string | boolean | string[] | undefined> };
  } catch (error) {
    if (error instanceof UsageError) throw error;
    throw new UsageError(optionProblem(error, joined));
  }
}

/**
 * An option that takes one value, given more than once (`--format json … --format sarif`), is a
 * usage error rather than the last one silently winning: in a script, one of the two is a mistake.
 */
function twice(tokens: ReturnType<typeof parseArgs>['tokens'], options: OptionSpec): void {
  const seen = new Map<string, string>();
  for (const token of tokens ?? []) {
    if (token.kind !== 'option' || options[token.name]?.type !== 'string' || options[token.name]?.multiple) continue;
    const before = seen.get(token.name);
    if (before !== undefined) throw new UsageError(`--${token.name} is given twice (${JSON.stringify(before)}, then ${JSON.stringify(token.value ?? '')}); give it once`);
    seen.set(token.name, token.value ?? '');
  }
}

/** Node's parseArgs error, in one line of our own words (`args`: the arguments it was given). */
function optionProblem(error: unknown, args: readonly string[]): string {
  const message = error instanceof Error ? error.message : String(error);
  const code = (error as { code?: unknown } | null)?.code;
  const option = /'(-{1,2}[^'\s=<]+)/.exec(message)?.[1] ?? 'an option';
  if (code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION') {
    // `check -notes.pneu` reads as the options -n, -o, …: name the way to a note named so.
    const note = args.find((a) => a.startsWith(option) && /\.pneu$/i.test(a));
    const shown = note === undefined ? '' : visible(note);
    return note === undefined ? `unknown option ${option} (see --help)` : `unknown option ${option} (see --help); for a note named ${shown}, write ./${shown} or put -- before it`;
  }
  if (code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE') {
    if (/argument missing/.test(message)) return `${option} needs a value`;
    if (/does not take an argument/.test(message)) return `${option} takes no value`;
    if (/ambiguous/.test(message)) return `${option} needs a value (write ${option}=VALUE for a value that starts with -)`;
  }
  return message.split('\n')[0] ?? message;
}

/** The option a schema key stands for, as typed: `maxWarnings` is `--max-warnings`. */
function optionName(key: PropertyKey | undefined, names: Readonly<Record<string, string>>): string {
  if (typeof key !== 'string') return 'an option';
  return names[key] ?? `--${key.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`;
}

/** Plain wording for an option's value that has no message of its own in the schema. */
function plainProblem(issue: z.core.$ZodRawIssue): string {
  switch (issue.code) {
    case 'too_small':
      return issue.origin === 'string' ? 'must not be empty' : issue.origin === 'array' ? `must be given at least ${String(issue.minimum)} times` : `must be at least ${String(issue.minimum)}`;
    case 'too_big':
      return issue.origin === 'string' ? `is too long (at most ${String(issue.maximum)} characters)` : issue.origin === 'array' ? `can be given at most ${String(issue.maximum)} times` : `must be at most ${String(issue.maximum)}`;
    case 'invalid_value':
      return `must be one of ${wordList(issue.values.map(String), 'or')}`;
    case 'invalid_type':
      return issue.expected === 'string' || issue.expected === 'number' ? 'needs a value' : 'is not valid here';
    default:
      return 'is not valid';
  }
}

/**
 * Validates a command's options. A problem is one line per option that names it as typed (`names`
 * for those that are not the schema key in kebab case, such as `--no-progress`) and quotes the
 * value given.
 */
export function validate<T>(schema: z.ZodType<T>, input: Readonly<Record<string, unknown>>, names: Readonly<Record<string, string>> = {}): T {
  const parsed = schema.safeParse(input, { error: plainProblem });
  if (parsed.success) return parsed.data;
  const lines = new Map<string, string>();
  for (const issue of parsed.error.issues) {
    const [key, index] = issue.path;
    const option = optionName(key, names);
    if (lines.has(option)) continue;
    const given: unknown = typeof key === 'string' ? input[key] : undefined;
    const value = typeof index === 'number' && Array.isArray(given) ? (given as unknown[])[index] : given;
    lines.set(option, `${option}: ${issue.message}${typeof value === 'string' ? ` (got ${JSON.stringify(value)})` : ''}`);
  }
  throw new UsageError([...lines.values()].join('; '));
}
