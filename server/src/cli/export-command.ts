/**
 * `pneumark export`: one row per timepoint (CSV, JSON Lines) or one FHIR R4 Bundle per note.
 * Each note is rendered where it was analysed (in a worker for large folders) and the pieces are
 * written in the order of the notes, so the output never depends on the parallelism.
 */
import { z } from 'zod';
import type { NoteResult } from '../core/check-note';
import { csvCells, csvHeader } from '../core/export/csv';
import { exportColumns, timepointCells } from '../core/export/columns';
import { anchorProblem, stdinNoteKey, toFhirBundle, type FhirOptions } from '../core/export/fhir';
import { toJsonl } from '../core/export/jsonl';
import { wordList } from '../core/util/format';
import { excludeOption, EXIT, HELP, jobsOption, parse, stdinNameOption, UsageError, validate, wholeNumberOption, type Io } from './args';
import { ConfigReport, reportConfigProblems } from './config-report';
import { listInputs, shownFilePath, STDIN_NAME, stdinExcludedLine } from './inputs';
import { Output } from './output';
import { visible } from './visible';
import { gather } from './pool';
import { NoteWorker, written, type ExportRenderer, type FileReport } from './work';

const EXPORT_FORMATS = ['csv', 'jsonl', 'fhir'] as const;

const exportOptions = z.object({
  // A value not among them gets `validate`'s wording; a missing one names them too.
  format: z.enum(EXPORT_FORMATS, { error: (issue) => (issue.input === undefined ? `is required: ${wordList(EXPORT_FORMATS, 'or')}` : undefined) }),
  redact: z.boolean().default(false),
  spreadsheetSafe: z.boolean().default(false),
  shiftDays: wholeNumberOption(-100000, 100000, 'expected a whole number of days from -100000 to 100000', true).optional(),
  anchor: z.string().max(64, { message: 'is too long for a date-time' }).nullable().default(null).superRefine((a, ctx) => {
    const problem = a === null ? null : anchorProblem(a);
    if (problem === null) return;
    // A time other than 00:00 is a date-time all the same: say what is wrong with it.
    const notMidnight = problem.includes('is 00:00 of day 1');
    // Written as a date-time, but no such day or time (`2026-02-30`, `24:00`, `+15:00`).
    const noSuchDate = problem.includes('is not a valid date and time');
    ctx.addIssue({
      code: 'custom',
      message: notMidnight ? 'is 00:00 of day 1 (the note\'s clock times are added to it): write its time as 00:00, e.g. 2026-01-05T00:00:00Z'
        : noSuchDate ? 'no such date, time or zone offset (offsets go from -14:00 to +14:00), e.g. 2026-01-05T00:00:00Z'
          : 'not an ISO 8601 date-time with a zone, e.g. 2026-01-05T00:00:00Z',
    });
  }),
  exclude: excludeOption,
  jobs: jobsOption,
  progress: z.boolean().default(true),
  stdinName: stdinNameOption,
});

type ExportTask = Parameters<ExportRenderer>[2];

/**
 * What one note contributes to the export, as the text written for it: CSV records, JSON Lines,
 * or the note's FHIR bundle as written in the array (null when it is more JSON than one string can
 * hold). Text, made where the note was analysed: a string crosses back from a worker in one copy,
 * where a bundle's objects would be cloned one by one and then written out by the main thread.
 */
export const exportRenderer: ExportRenderer = (path: string, result: NoteResult, task: ExportTask) => {
  const options = { redactProse: task.redactProse, shiftDays: task.shiftDays };
  if (task.format === 'csv') {
    const csv = { spreadsheetSafe: task.spreadsheetSafe };
    return timepointCells(path, result, options).map((cells) => csvCells(cells, csv)).join('');
  }
  if (task.format === 'jsonl') return toJsonl(path, result, options);
  const fhir = { ...options, ...(task.anchor ? { anchor: task.anchor } : {}) };
  if (task.redactProse) return redactedBundleText(path, result, fhir);
  const noteKey = path === STDIN_NAME ? { noteKey: stdinNoteKey(result) } : {};
  return bundleText(toFhirBundle(path, result, { ...fhir, ...noteKey }));
};

/**
 * A redacted note's bundle (`pseudonym`: its name in the run, `note-00001`), with ids made from
 * nothing that is not in the output, so no part of the file name: each Observation's from the
 * pseudonym and the Observation as written, the Bundle's from the pseudonym and its entries' ids.
 * The same note in the same place gets the same ids on every run; a corrected value gives its
 * Observation (and the Bundle) a new id and leaves the others' as they were; the notes in the same
 * place of two exports share an Observation id only where the Observations are the same in every
 * member written. Null as `bundleText` says.
 */
function redactedBundleText(pseudonym: string, result: NoteResult, options: FhirOptions): string | null {
  return bundleText(toFhirBundle(pseudonym, result, { ...options, noteKey: pseudonym, bundleIdFromEntries: true, pseudonymous: true }));
}

/** Why a note's FHIR bundle is left out of the export. */
export const TOO_BIG_BUNDLE = 'its FHIR bundle is more JSON than one string can hold; export it with --format jsonl or csv';

/** A note's FHIR bundle as written in the array, or null when it is more JSON than one string can hold. */
export function bundleText(payload: unknown): string | null {
  try {
    return JSON.stringify(payload, null, 2);
  } catch (error) {
    if (!(error instanceof RangeError)) throw error;
    return null;
  }
}

export async function runExport(args: readonly string[], io: Io): Promise<number> {
  const { positionals, values } = parse(args, {
    format: { type: 'string' }, redact: { type: 'boolean' }, 'spreadsheet-safe': { type: 'boolean' }, 'shift-days': { type: 'string' }, anchor: { type: 'string' },
    exclude: { type: 'string', multiple: true }, jobs: { type: 'string' }, 'no-progress': { type: 'boolean' }, 'stdin-name': { type: 'string' },
  });
  if (values.help) { io.stdout.write(`${HELP.export}\n`); return EXIT.ok; }
  const opts = validate(exportOptions, { format: values.format, redact: values.redact, spreadsheetSafe: values['spreadsheet-safe'], shiftDays: values['shift-days'], anchor: values.anchor ?? null, exclude: values.exclude, jobs: values.jobs, progress: !values['no-progress'], stdinName: values['stdin-name'] }, { progress: '--no-progress' });
  if (opts.anchor && opts.format !== 'fhir') throw new UsageError('--anchor only applies to --format fhir');
  if (opts.spreadsheetSafe && opts.format !== 'csv') throw new UsageError('--spreadsheet-safe only applies to --format csv (JSON Lines and FHIR keep text exact)');
  if (positionals.length === 0) throw new UsageError('export needs at least one file, folder, pattern or - (stdin)');
  const stdinName = opts.stdinName === undefined ? null : shownFilePath(opts.stdinName, io.cwd);
  const { files, problems, stdinExcluded } = listInputs(positionals, io.cwd, opts.exclude, stdinName);
  if (stdinExcluded !== null) io.stderr.write(`pneumark: ${visible(stdinExcludedLine(stdinExcluded, 'exported'))}\n`);
  const configs = new ConfigReport(io.cwd, stdinName).notes(files);
  const task: ExportTask = { kind: 'export', format: opts.format, redactProse: opts.redact, shiftDays: opts.shiftDays ?? 0, anchor: opts.anchor, spreadsheetSafe: opts.spreadsheetSafe };
  // Each note's piece is written as soon as it and the notes before it are in, then let go: an
  // export of a big folder is larger than one string can hold, and need not sit in memory.
  const output = new Output(io.stdout);
  let bundles = 0;
  /** Writes a note's piece; returns the note's problem (a FHIR bundle too big for one string is one). */
  const write = (r: FileReport): string | null => {
    const payload = r.payload;
    if (opts.format === 'csv') {
      if (typeof payload === 'string') output.write(payload);
    } else if (opts.format === 'jsonl') {
      if (typeof payload === 'string' && payload.length > 0) {
        output.write(payload);
        if (!payload.endsWith('\n')) output.write('\n');
      }
    } else if (typeof payload === 'string') {
      // Apart: the two together would be copied into one string as long as the bundle.
      if (bundles++ > 0) output.write(',\n');
      output.write(payload);
    } else if (payload === null && r.problem === null) {
      return TOO_BIG_BUNDLE;
    }
    return r.problem;
  };
  output.write(opts.format === 'csv' ? csvHeader(exportColumns(), { spreadsheetSafe: opts.spreadsheetSafe }) : opts.format === 'fhir' ? '[\n' : '');
  const reports = await gather(files, task, io, new NoteWorker(io.cwd, {}, exportRenderer, stdinName), opts.progress && !io.stdout.isTTY, 'exporting', opts.jobs, {
    inOrder: (r) => written(r, write(r)),
    ready: () => output.ready(),
  });
  if (opts.format === 'fhir') output.write('\n]\n');
  const badConfig = reportConfigProblems(configs, io);
  for (const p of [...problems, ...reports.filter((r) => r.problem)]) io.stderr.write(`pneumark: ${visible(p.path)}: ${visible(p.problem ?? '')}\n`);
  if (badConfig || problems.length > 0 || reports.some((r) => r.problem)) return EXIT.usage;
  return reports.some((r) => r.findings.some((f) => f.severity === 'error')) ? EXIT.findings : EXIT.ok;
}
