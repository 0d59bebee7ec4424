#!/usr/bin/env node
/**
 * The `pneumark` command. It only translates between the terminal and the core: options are
 * validated with zod, notes are found and read, the core checks them (in parallel for large
 * folders), and the results are rendered. Exit codes: 0 clean, 1 findings at error level (or
 * more warnings than --max-warnings, or notes `fmt --check` would change), 2 usage or I/O error.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { isMainThread, parentPort, workerData } from 'node:worker_threads';
import { z } from 'zod';
import { checkNote } from '../core/check-note';
import { wordList } from '../core/util/format';
import { PNEUMARK_VERSION } from '../core/version';
import { CAUTION, excludeOption, EXIT, HELP, jobsOption, parse, refuseEmptyPaths, stdinNameOption, UsageError, validate, wholeNumberOption, type Io } from './args';
import { ConfigReport, reportConfigProblems } from './config-report';
import { checkNamed, renderCheckDocs, renderChecksDocs } from '../core/checks/docs';
import { unknownCheckNames } from '../core/config';
import { replaceBetween, withGeneratedTables } from '../core/fields/docs';
import { COLUMNS_END, COLUMNS_START, renderColumnTable } from '../core/export/docs';
import { renderSettingsTable, SETTINGS_END, SETTINGS_START } from '../core/settings-docs';
import { colourWanted, paint, type Paint } from './colour';
import { runExport, exportRenderer } from './export-command';
import { runFmt } from './fmt-command';
import { isBlankNote, listInputs, MAX_NOTE_BYTES, NO_NOTE, readNote, readUpTo, redactedProblem, shownFilePath, shownPath, STDIN_NAME_WITHOUT_STDIN, stdinExcludedLine } from './inputs';
import { REDACTED_WORD } from '../core/export/columns';
import { notePseudonym } from '../core/export/pseudonym';
import { aloneLimits } from './analyse-alone';
import { gather, type BatchDone, type WorkDone, type WorkItem } from './pool';
import { CheckJsonWriter, countOutcome, jsonFileEntryOrProblem, writeCheckSarif, writeCheckText, type FileOutcome, type JsonLayout } from './render-check';
import type { SeverityCounts } from './render-show';
import { renderShow } from './render-show';
import { Output } from './output';
import { visible } from './visible';
import { NoteWorker, packReport, written, type FileReport, type Task } from './work';

export async function run(argv: readonly string[], io: Io): Promise<number> {
  const [command, ...rest] = argv;
  try {
    switch (command) {
      case 'show': return show(rest, io);
      case 'check': return await check(rest, io);
      case 'export': return await runExport(rest, io);
      case 'fmt': return runFmt(rest, io);
      case 'docs': return docs(rest, io);
      case '-h':
      case '--help':
        io.stdout.write(`${HELP.main}\n`);
        return EXIT.ok;
      case 'help': return help(rest, io);
      case '--version':
        if (rest.length > 0) throw new UsageError(`takes no arguments (got ${rest.map((a) => JSON.stringify(a)).join(', ')})`);
        io.stdout.write(`pneumark ${PNEUMARK_VERSION}\n`);
        return EXIT.ok;
      case undefined:
        io.stderr.write(`${HELP.main}\n`);
        return EXIT.usage;
      default:
        io.stderr.write(`pneumark: unknown command \`${visible(command)}\`; run \`pneumark --help\`\n`);
        return EXIT.usage;
    }
  } catch (error) {
    if (error instanceof UsageError) {
      // The message may quote what was typed (a path, an option's value).
      io.stderr.write(`pneumark ${command ?? ''}: ${visible(error.message)}\n`);
      return EXIT.usage;
    }
    throw error;
  }
}

/** The commands `help COMMAND` knows, in the order the main help lists them. */
const COMMANDS = ['show', 'check', 'export', 'fmt', 'docs'] as const;

/** `pneumark help [COMMAND]`: the main help, or that command's, as `COMMAND --help` prints it. */
function help(args: readonly string[], io: Io): number {
  if (args.length === 0) {
    io.stdout.write(`${HELP.main}\n`);
    return EXIT.ok;
  }
  if (args.length > 1) throw new UsageError(`takes one command (got ${args.map((a) => JSON.stringify(a)).join(', ')})`);
  const command = args[0]!;
  // help is a command too, and has --help as every command has: its help is the main one.
  if (command === 'help' || command === '--help' || command === '-h') {
    io.stdout.write(`${HELP.main}\n`);
    return EXIT.ok;
  }
  if (!(COMMANDS as readonly string[]).includes(command)) throw new UsageError(`unknown command \`${command}\`; the commands are ${wordList(COMMANDS, 'and')}`);
  io.stdout.write(`${HELP[command]}\n`);
  return EXIT.ok;
}

const showOptions = z.object({ stdinName: stdinNameOption });

function show(args: readonly string[], io: Io): number {
  const { positionals, values } = parse(args, { 'stdin-name': { type: 'string' } });
  if (values.help) { io.stdout.write(`${HELP.show}\n`); return EXIT.ok; }
  const opts = validate(showOptions, { stdinName: values['stdin-name'] });
  if (positionals.length !== 1) throw new UsageError('show takes exactly one file (use `check` for several)');
  refuseEmptyPaths(positionals);
  const stdinName = opts.stdinName === undefined ? null : shownFilePath(opts.stdinName, io.cwd);
  if (stdinName !== null && positionals[0] !== '-') throw new UsageError(STDIN_NAME_WITHOUT_STDIN);
  const note = readNote(positionals[0]!, io.cwd, io.stdin, { stdinName });
  if (note.text === null) {
    io.stderr.write(`pneumark: ${visible(note.path)}: ${visible(note.problem ?? '')}\n`);
    return EXIT.usage;
  }
  if (isBlankNote(note.text)) {
    io.stderr.write(`pneumark: ${visible(note.path)}: ${NO_NOTE}\n`);
    return EXIT.usage;
  }
  // show analyses and renders in this thread: a note that check would analyse in a worker of its
  // own (analyse-alone.ts) is too big to show safely (a hostile one would exhaust the heap) or usefully.
  const most = aloneLimits(io.env).fromBytes;
  const bytes = Buffer.byteLength(note.text, 'utf8');
  if (bytes > most) {
    io.stderr.write(`pneumark: ${visible(note.path)}: too large to show (${sizeText(bytes)}; show takes notes up to ${sizeText(most)}): check or export it instead\n`);
    return EXIT.usage;
  }
  const worker = new NoteWorker(io.cwd, {}, null, stdinName);
  const result = checkNote(note.text, worker.settingsFor(positionals[0]!));
  io.stdout.write(`${renderShow(note.path, result, paint(colourWanted(io.stdout, io.env)))}\n\n${CAUTION}\n`);
  if (reportConfigProblems(new ConfigReport(io.cwd, stdinName).note(positionals[0]!), io)) return EXIT.usage;
  return result.findings.some((f) => f.severity === 'error') ? EXIT.findings : EXIT.ok;
}

/** A size as people read it: MB to one decimal from 1 MB, else whole KB. */
function sizeText(bytes: number): string {
  return bytes >= 1048576 ? `${(bytes / 1048576).toFixed(1)} MB` : `${Math.ceil(bytes / 1024)} KB`;
}

const checkOptions = z.object({
  format: z.enum(['text', 'json', 'sarif']).default('text'),
  quiet: z.boolean().default(false),
  maxWarnings: wholeNumberOption(0, 1_000_000_000, 'expected a whole number from 0 to 1,000,000,000').optional(),
  exclude: excludeOption,
  jobs: jobsOption,
  progress: z.boolean().default(true),
  stdinName: stdinNameOption,
  redact: z.boolean().default(false),
  jsonVersion: z.enum(['1', '2']).optional(),
  jsonDetail: z.enum(['findings', 'full']).optional(),
  indented: z.boolean().default(false),
});

/**
 * A report as `check --redact` writes it: named by the note's place in the run (`index` from 0),
 * its problem without a path. What a worker sends is so already; a report made elsewhere (a worker
 * that failed, a note analysed alone that ran out of memory) is not.
 */
function redactedReport(report: FileReport, index: number): FileReport {
  return { ...report, path: notePseudonym(index + 1), problem: report.problem === null ? null : redactedProblem(report.problem, REDACTED_WORD) };
}

async function check(args: readonly string[], io: Io): Promise<number> {
  const { positionals, values } = parse(args, { format: { type: 'string' }, quiet: { type: 'boolean' }, 'max-warnings': { type: 'string' }, exclude: { type: 'string', multiple: true }, jobs: { type: 'string' }, 'no-progress': { type: 'boolean' }, 'stdin-name': { type: 'string' }, redact: { type: 'boolean' }, 'json-version': { type: 'string' }, 'json-detail': { type: 'string' }, indented: { type: 'boolean' } });
  if (values.help) { io.stdout.write(`${HELP.check}\n`); return EXIT.ok; }
  const opts = validate(checkOptions, { format: values.format, quiet: values.quiet, maxWarnings: values['max-warnings'], exclude: values.exclude, jobs: values.jobs, progress: !values['no-progress'], stdinName: values['stdin-name'], redact: values.redact, jsonVersion: values['json-version'], jsonDetail: values['json-detail'], indented: values.indented }, { progress: '--no-progress' });
  if (opts.format !== 'json') {
    const jsonOnly = opts.jsonVersion !== undefined ? '--json-version' : opts.jsonDetail !== undefined ? '--json-detail' : opts.indented ? '--indented' : null;
    if (jsonOnly !== null) throw new UsageError(`${jsonOnly} applies to --format json only`);
  }
  // Indented for people (a terminal, or --indented), compact for programs: the same JSON value.
  // `--json-detail findings`: each note's findings alone, no timepoints made or sent.
  const detail = opts.jsonDetail ?? 'full';
  const layout: JsonLayout = { version: opts.jsonVersion === '2' ? 2 : 1, indented: opts.indented || io.stdout.isTTY === true, detail };
  if (positionals.length === 0) throw new UsageError('check needs at least one file, folder, pattern or - (stdin)');
  const stdinName = opts.stdinName === undefined ? null : shownFilePath(opts.stdinName, io.cwd);
  const { files, problems, stdinExcluded } = listInputs(positionals, io.cwd, opts.exclude, stdinName);
  // Left alone, as the file of that name would be in a folder checked: one line says so, and the
  // run is that of the other inputs (none: an empty run, exit 0).
  if (stdinExcluded !== null) io.stderr.write(`pneumark: ${visible(stdinExcludedLine(stdinExcluded, 'checked'))}\n`);
  const configs = new ConfigReport(io.cwd, stdinName).notes(files);
  const worker = new NoteWorker(io.cwd, {}, null, stdinName);
  // Standard error names each note by its path, for whoever runs the command; with --redact,
  // standard output (what is shared) names a note by its place in the run, and an input that
  // brought in no note by [redacted].
  const redact = opts.redact;
  const unread: FileOutcome[] = problems.map((p) => ({ path: redact ? REDACTED_WORD : p.path, findings: [], problem: redact && p.problem !== null ? redactedProblem(p.problem, REDACTED_WORD) : p.problem }));
  const named = (report: FileReport, index: number): FileReport => (redact ? redactedReport(report, index) : report);
  // JSON (with every timepoint, unless --json-detail findings) is written a note at a time as the
  // notes come in, in their order, and each note's timepoints are let go once written.
  const output = new Output(io.stdout);
  const json = opts.format === 'json' ? new CheckJsonWriter(output, opts.quiet, layout) : null;
  if (json) for (const o of unread) json.file(o);
  const streaming = json ? {
    inOrder: (r: FileReport, i: number): FileReport => written(r, json.file(named(r, i))),
    ready: () => output.ready(),
  } : undefined;
  const reports = await gather(files, { kind: 'check', timepoints: json !== null && detail === 'full', errorsOnly: opts.quiet, redact, layout }, io, worker, opts.progress && !(json && io.stdout.isTTY), 'checking', opts.jobs, streaming);
  const outcomes: FileOutcome[] = [...unread, ...(json ? reports : reports.map(named))];
  const p: Paint = paint(colourWanted(io.stdout, io.env));
  if (json) {
    json.end();
    output.write('\n');
  } else if (opts.format === 'sarif') {
    await writeCheckSarif(outcomes, opts.quiet, output, configs.sarifProblems().map((p) => (redact ? { ...p, path: REDACTED_WORD } : p)));
    output.write('\n');
  } else {
    await writeCheckText(outcomes, p, opts.quiet, output);
  }
  const badConfig = reportConfigProblems(configs, io);
  const pathOf = (o: FileOutcome, k: number): string => (!redact ? o.path : k < problems.length ? problems[k]!.path : shownPath(files[k - problems.length]!, stdinName));
  const problemOf = (o: FileOutcome, k: number): string | null => (redact && k < problems.length ? problems[k]!.problem : o.problem);
  outcomes.forEach((o, k) => { if (o.problem) io.stderr.write(`pneumark: ${visible(pathOf(o, k))}: ${visible(problemOf(o, k) ?? o.problem)}\n`); });
  if (badConfig || outcomes.some((o) => o.problem)) return EXIT.usage;
  const total: SeverityCounts = { error: 0, warning: 0, information: 0, hint: 0 };
  for (const o of outcomes) countOutcome(o, total);
  if (total.error > 0) return EXIT.findings;
  const warnings = total.warning;
  if (opts.maxWarnings !== undefined && warnings > opts.maxWarnings) {
    io.stderr.write(`pneumark: ${warnings} warning${warnings === 1 ? '' : 's'}, more than --max-warnings ${opts.maxWarnings}\n`);
    return EXIT.findings;
  }
  return EXIT.ok;
}

const docsOptions = z.object({
  write: z.string().min(1).optional(),
  grammar: z.string().min(1).optional(),
  readme: z.string().min(1).optional(),
});

function docs(args: readonly string[], io: Io): number {
  const { positionals, values } = parse(args, { write: { type: 'string' }, grammar: { type: 'string' }, readme: { type: 'string' } });
  if (values.help) { io.stdout.write(`${HELP.docs}\n`); return EXIT.ok; }
  // `pneumark docs PN405 oxygenation-reading`: the sections of those checks alone.
  const named = positionals.map((name) => {
    const check = checkNamed(name);
    if (check !== null) return check;
    const likely = unknownCheckNames([name])[0]?.likely ?? [];
    throw new UsageError(`${JSON.stringify(name)} is not the code or alias of a check${likely.length > 0 ? `; did you mean ${wordList(likely, 'or')}?` : ' (`pneumark docs` lists them all)'}`);
  });
  const opts = validate(docsOptions, { write: values.write, grammar: values.grammar, readme: values.readme });
  const at = (path: string) => resolve(io.cwd, path);
  // Files to update are read first, so a path that cannot be read leaves every file as it was.
  const grammar = opts.grammar === undefined ? null : { path: opts.grammar, text: withGeneratedTables(readText(at(opts.grammar), opts.grammar, '--grammar')) };
  const readme = opts.readme === undefined ? null : { path: opts.readme, text: replaceBetween(replaceBetween(readText(at(opts.readme), opts.readme, '--readme'), COLUMNS_START, COLUMNS_END, renderColumnTable()), SETTINGS_START, SETTINGS_END, renderSettingsTable()) };
  const text = named.length > 0 ? renderChecksDocs(named) : renderCheckDocs();
  if (opts.write !== undefined) writeText(at(opts.write), opts.write, text, '--write');
  else io.stdout.write(text);
  if (grammar) writeText(at(grammar.path), grammar.path, grammar.text, '--grammar');
  if (readme) writeText(at(readme.path), readme.path, readme.text, '--readme');
  return EXIT.ok;
}

/** A file-system error in a few words: `no such file or folder`, `permission denied`, ... */
function fileProblem(error: unknown): string {
  const code = (error as NodeJS.ErrnoException | null)?.code;
  if (code === 'ENOENT') return 'no such file or folder';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied';
  if (code === 'EISDIR') return 'is a folder';
  if (code === 'ENOTDIR') return 'a part of the path is not a folder';
  return `${code ?? (error instanceof Error ? error.message : String(error))}`;
}

/** A file `docs` updates, read whole; a usage error (one line) when it cannot be. */
function readText(path: string, shown: string, option: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (error) {
    throw new UsageError(`${option} ${visible(JSON.stringify(shown))}: cannot be read (${fileProblem(error)})`);
  }
}

/** A file `docs` writes; a usage error (one line) when it cannot be written. */
function writeText(path: string, shown: string, text: string, option: string): void {
  try {
    writeFileSync(path, text);
  } catch (error) {
    throw new UsageError(`${option} ${visible(JSON.stringify(shown))}: cannot be written (${fileProblem(error)})`);
  }
}

/**
 * Worker thread: analyses the batches of notes it is sent and posts each batch's reports back. A
 * pool worker hands back a note of more than `aloneFrom` bytes unanalysed (a null report), to be
 * analysed in a worker of its own (analyse-alone.ts), which is this same code with `aloneFrom` null.
 */
function workerMain(): void {
  const data = workerData as { cwd: string; overrides: object; task: Task; aloneFrom: number | null; stdinName: string | null };
  const worker = new NoteWorker(data.cwd, data.overrides, exportRenderer, data.stdinName);
  // JSON output: the worker writes out each note's entry (see jsonFileEntry).
  const withEntry = (r: FileReport): FileReport => {
    if (r.timepoints === undefined && r.timepointTexts === undefined) return r;
    const { timepoints: _inEntry, timepointTexts: _written, ...rest } = r;
    const check = data.task.kind === 'check' ? data.task : null;
    const { entry, problem } = jsonFileEntryOrProblem(r, check?.errorsOnly === true, check?.layout);
    return { ...rest, entry, problem };
  };
  const noStdin = (): Buffer => Buffer.alloc(0);
  parentPort?.on('message', (batch: WorkItem[]) => {
    const started = performance.now();
    const done: WorkDone[] = batch.map((m) => {
      try {
        // Bytes sent along (standard input, or a big note the main thread has read) stand for the note.
        const bytes = m.bytes;
        const read = bytes === undefined ? worker.read(m.f, noStdin) : { path: worker.shown(m.f), bytes: Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength), problem: null };
        if (data.aloneFrom !== null && read.bytes !== null && read.bytes.length > data.aloneFrom) return { i: m.i, report: null };
        return { i: m.i, report: packReport(withEntry(worker.analyse(m.f, read, data.task, m.i + 1))) };
      } catch (error) {
        return { i: m.i, report: packReport({ path: worker.shown(m.f), problem: `could not be analysed (${error instanceof Error ? error.message : String(error)})`, findings: [] }) };
      }
    });
    const answer: BatchDone = { done, millis: performance.now() - started };
    parentPort?.postMessage(answer);
  });
}

if (!isMainThread && (workerData as { pneumarkWorker?: boolean } | null)?.pneumarkWorker) {
  workerMain();
} else if (require.main === module) {
  // A reader that stops early (`| head`) closes the pipe: stop at once and quietly, as other
  // command-line tools do, with the exit code of an I/O error. Any other failure to write (a full
  // disk, ENOSPC) leaves the output cut off: one line says so, with the same exit code, since 1
  // would read as "error findings", which a folder with one broken note always gives.
  process.stdout.on('error', (error: NodeJS.ErrnoException) => {
    if (error.code !== 'EPIPE') process.stderr.write(`pneumark: could not write to standard output (${error.code ?? error.message}): the output is incomplete\n`);
    process.exit(EXIT.usage);
  });
  void run(process.argv.slice(2), {
    cwd: process.cwd(),
    env: process.env,
    stdout: process.stdout,
    stderr: process.stderr,
    stdin: () => readUpTo(0, MAX_NOTE_BYTES + 1),
  }).then((code) => {
    process.exitCode = code;
  });
}
