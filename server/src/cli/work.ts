/**
 * What the CLI does with one note, the same in the main thread and in a worker: read it, check it
 * with the settings of its project (pneumark.config.json found upward), and keep what the chosen
 * output needs. Everything returned is plain data, so it crosses a worker boundary by structured clone.
 */
import { dirname, isAbsolute, join } from 'node:path';
import { checkNote, type CheckOptions, type NoteResult } from '../core/check-note';
import type { Settings } from '../core/settings';
import type { Finding, Severity } from '../core/types';
import { notePseudonym } from '../core/export/pseudonym';
import { REDACTED_WORD } from '../core/export/columns';
import { noteOwnWords, redactedFinding, redactedJson } from '../core/export/redact';
import { NONE } from '../core/util/lists';
import { ProjectConfigs } from '../node/project-config';
import { isBlankNote, noteFromBytes, NO_NOTE, readNoteBytes, redactedProblem, shownPath, type NoteBytes, type NoteInput } from './inputs';
import { countSeverities, type SeverityCounts } from './render-show';
import { INDENTED_V1, timepointText, type JsonLayout } from './render-check';
import { timepointsJson, timepointsJsonV2, timepointV2, type JsonTimepoint, type KeyedDefinition } from './timepoints-json';

export type Task =
  | {
    readonly kind: 'check'; readonly timepoints: boolean; /** `--quiet`: the JSON entries list error findings only. */ readonly errorsOnly?: boolean;
    /** `--redact`: the note named by its place in the run, and its own words left out of what is written (see core/export/redact.ts). */
    readonly redact?: boolean;
    /** How the JSON is written (version, indentation); version 1 indented when not given. */
    readonly layout?: JsonLayout;
  }
  | { readonly kind: 'export'; readonly format: 'csv' | 'jsonl' | 'fhir'; readonly redactProse: boolean; readonly shiftDays: number; readonly anchor: string | null; /** `--spreadsheet-safe` (CSV). */ readonly spreadsheetSafe: boolean };

export interface FileReport {
  readonly path: string;
  readonly problem: string | null;
  /**
   * The note's findings; with `counts`, only its errors (`check --quiet`); for an export, only its
   * first error finding, if any (all the exit code needs).
   */
  readonly findings: readonly Finding[];
  /** Every finding of the note by severity, when `findings` keeps only the errors. */
  readonly counts?: SeverityCounts;
  /** `check --format json`: the timepoints with values, derived values and readings. */
  readonly timepoints?: unknown[];
  /** `check --format json`: the same, each written as nested in the note's entry (what `analyse` gives). */
  readonly timepointTexts?: readonly string[];
  /** `check --format json` in a worker: the note's entry in the output, written out (the timepoints left out above). */
  readonly entry?: string;
  /** `check --format json --json-version 2`: the definitions the note's derived values point to. */
  readonly definitions?: readonly KeyedDefinition[];
  /** `export`: what the format needs for this note (rows, lines or a bundle). */
  readonly payload?: unknown;
}

const KEEP_DERIVATIONS: CheckOptions = { keepDerivations: true };

export type ExportRenderer = (path: string, result: NoteResult, task: Extract<Task, { kind: 'export' }>) => unknown;

export class NoteWorker {
  private readonly configs = new ProjectConfigs();
  /** The settings of the notes of each folder seen so far. */
  private readonly settings = new Map<string, Partial<Settings>>();

  /**
   * `stdinName`: the path `--stdin-name` gave the note read from standard input (as
   * `shownFilePath` writes it), which names it in output and says where it lives; null when not given.
   */
  constructor(
    private readonly cwd: string,
    private readonly overrides: Partial<Settings>,
    private readonly exportRenderer: ExportRenderer | null = null,
    readonly stdinName: string | null = null,
  ) {}

  /**
   * The settings of the project file found upward from the note's folder; for standard input,
   * upward from the folder of its `--stdin-name` path (the file need not exist), else from the
   * working folder (so `cat note | pneumark check -` reads the note as `pneumark check note` would
   * there).
   */
  settingsFor(path: string): Partial<Settings> {
    // `-` (standard input) without a name stands for a note in the working folder.
    const named = path === '-' && this.stdinName !== null ? this.stdinName : path;
    const abs = isAbsolute(named) ? named : join(this.cwd, named);
    // Once per folder: a run reads each project file once, and notes of one folder share their
    // settings (looking up a folder that has a project file costs a stat of that file each time).
    const folder = dirname(abs);
    let settings = this.settings.get(folder);
    if (settings === undefined) {
      const found = this.configs.forPath(abs);
      settings = { ...(found?.config.settings ?? {}), ...this.overrides };
      this.settings.set(folder, settings);
    }
    return settings;
  }

  run(path: string, task: Task, stdin: () => Buffer, place: number): FileReport {
    return this.analyse(path, this.read(path, stdin), task, place);
  }

  /** The note's bytes (or why they cannot be read), so a big note can be sent elsewhere before it is analysed. */
  read(path: string, stdin: () => Buffer): NoteBytes {
    return readNoteBytes(path, this.cwd, stdin, this.stdinName);
  }

  /** How output names the note at `path` (`-`: standard input, by its `--stdin-name` path when given). */
  shown(path: string): string {
    return shownPath(path, this.stdinName);
  }

  /**
   * What `task` needs of the note at `path`, from its bytes as `read` gave them. `place`: the note's
   * place among the notes of the run, from 1 (in their sorted order, standard input last), which
   * names it in a redacted export in place of its path.
   */
  analyse(path: string, read: NoteBytes, task: Task, place: number): FileReport {
    const note: NoteInput = noteFromBytes(read);
    // `check --redact` names the note by its place in the run (`note-00001`), as a redacted export does.
    const redact = task.kind === 'check' && task.redact === true;
    const shown = redact ? notePseudonym(place) : note.path;
    if (note.text === null) return { path: shown, problem: redact ? redactedProblem(note.problem ?? '', REDACTED_WORD) : note.problem, findings: [] };
    if (isBlankNote(note.text)) return { path: shown, problem: NO_NOTE, findings: [] };
    // An export reads every timepoint's derived values: it finishes the derivations the checks began.
    const result = checkNote(note.text, this.settingsFor(path), task.kind === 'export' ? KEEP_DERIVATIONS : undefined);
    if (task.kind === 'check') {
      // Each timepoint written out at once: a note of thousands of timepoints keeps a string each
      // until its entry is written, not the objects they are written from.
      // Redacted, the note's own words (quoted, its labels, a mode of its own) are left out of
      // the findings and the timepoints' texts (see core/export/redact.ts).
      // Redacted, version 2 is made from version 1's object after redaction: a definition's key is
      // made from its text as written.
      const own = redact ? noteOwnWords(result) : null;
      const layout = task.layout ?? INDENTED_V1;
      const used = layout.version === 2 ? new Map<string, KeyedDefinition>() : null;
      const text = (json: unknown): string => timepointText(json, layout.indented);
      const texts = (): string[] => {
        if (own !== null) return timepointsJson(result, (json) => text(used === null ? redactedJson(json, own) : timepointV2(redactedJson(json, own) as JsonTimepoint, used)));
        return used === null ? timepointsJson(result, text) : timepointsJsonV2(result, used, text);
      };
      const timepoints = task.timepoints ? { timepointTexts: texts(), ...(used === null ? {} : { definitions: [...used.values()] }) } : {};
      // `--quiet` shows errors only and counts the rest: only the counts of the others are kept
      // (and cross back from a worker), not a hundred thousand findings of a big folder.
      const kept = task.errorsOnly ? result.findings.filter((f) => f.severity === 'error') : result.findings;
      const findings = own === null ? kept : kept.map((f) => redactedFinding(f, own));
      if (task.errorsOnly) return { path: shown, problem: null, findings, counts: countSeverities(result.findings), ...timepoints };
      return { path: shown, problem: null, findings, ...timepoints };
    }
    // An export's output is the payload; its findings only decide the exit code (an error or not),
    // so one error stands for them all rather than every finding crossing back from a worker.
    const error = result.findings.find((f) => f.severity === 'error');
    // Redacted, a note is named by its place in the run (`note-00001`): a file name can carry
    // identifiers, and so can anything made from it (a FHIR id is a hash of what names the note).
    const name = task.redactProse ? notePseudonym(place) : note.path;
    return { path: note.path, problem: null, findings: error ? [error] : [], payload: this.exportRenderer?.(name, result, task) ?? null };
  }
}

/**
 * What a command keeps of a report once the note's output is written (see `inOrder` in the pool):
 * its path, its problem (the writing may have found one) and its findings (and counts), for the
 * exit code.
 */
export function written(report: FileReport, problem: string | null): FileReport {
  return { path: report.path, problem, findings: report.findings, ...(report.counts ? { counts: report.counts } : {}) };
}

/**
 * A note's findings as they cross from a worker to the main thread: the four numbers of each range
 * in one typed array and the four strings of each finding in one list, plus the rare fixes and
 * related places by index. A structured clone copies a typed array in one piece but a finding's
 * six objects one by one; a folder of notes has over a hundred thousand findings.
 */
export interface PackedFindings {
  /** Start line, start character, end line, end character of each finding. */
  readonly ranges: Int32Array;
  /** Code, severity, message and documentation anchor of each finding. */
  readonly strings: readonly string[];
  /** Findings with fixes or related places: their index and those parts. */
  readonly extras: readonly { readonly index: number; readonly fixes: Finding['fixes']; readonly related?: Finding['related'] }[];
}

export function packFindings(findings: readonly Finding[]): PackedFindings {
  const ranges = new Int32Array(4 * findings.length);
  const strings = new Array<string>(4 * findings.length);
  const extras: { index: number; fixes: Finding['fixes']; related?: Finding['related'] }[] = [];
  findings.forEach((f, k) => {
    const r = f.range;
    ranges[4 * k] = r.start.line;
    ranges[4 * k + 1] = r.start.character;
    ranges[4 * k + 2] = r.end.line;
    ranges[4 * k + 3] = r.end.character;
    strings[4 * k] = f.code;
    strings[4 * k + 1] = f.severity;
    strings[4 * k + 2] = f.message;
    strings[4 * k + 3] = f.docAnchor;
    if (f.fixes.length > 0 || f.related) extras.push({ index: k, fixes: f.fixes, ...(f.related ? { related: f.related } : {}) });
  });
  return { ranges, strings, extras };
}

/**
 * One copy of each code, severity and documentation anchor (a few hundred strings, from the check
 * registry), so the main thread keeps one string for each rather than three more objects per
 * finding of the run: the copies a structured clone makes then die young instead of filling the
 * old generation that every collection goes over.
 */
const SHARED = new Map<string, string>();

function shared(text: string): string {
  const known = SHARED.get(text);
  if (known !== undefined) return known;
  SHARED.set(text, text);
  return text;
}

export function unpackFindings(packed: PackedFindings): Finding[] {
  const { ranges, strings } = packed;
  const findings = new Array<Finding>(ranges.length / 4);
  let e = 0;
  for (let k = 0; k < findings.length; k++) {
    const extra = packed.extras[e]?.index === k ? packed.extras[e++] : undefined;
    findings[k] = {
      code: shared(strings[4 * k]!),
      severity: shared(strings[4 * k + 1]!) as Severity,
      message: strings[4 * k + 2]!,
      range: { start: { line: ranges[4 * k]!, character: ranges[4 * k + 1]! }, end: { line: ranges[4 * k + 2]!, character: ranges[4 * k + 3]! } },
      fixes: extra?.fixes ?? NONE,
      docAnchor: shared(strings[4 * k + 3]!),
      ...(extra?.related ? { related: extra.related } : {}),
    };
  }
  return findings;
}

/** A report as a worker sends it (its findings packed). */
export type PackedReport = Omit<FileReport, 'findings'> & { readonly findings: PackedFindings };

export function packReport(report: FileReport): PackedReport {
  return { ...report, findings: packFindings(report.findings) };
}

export function unpackReport(report: PackedReport): FileReport {
  return { ...report, findings: unpackFindings(report.findings) };
}
