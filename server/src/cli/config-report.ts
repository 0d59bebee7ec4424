/**
 * Problems of the `pneumark.config.json` files a run uses, for standard error: the problems the
 * core's validation finds (not JSON, unknown keys, values out of range: the file's settings are
 * then not used, as in the editor) and names in `disabledChecks` that are no check's code or alias
 * (they switch nothing off). Each file is reported once per run, one line per problem, and the run
 * ends with exit code 2: CI must not pass with other settings than the team wrote.
 */
import { dirname, isAbsolute, join, relative } from 'node:path';
import { CONFIG_FILE_NAME, type ConfigProblem } from '../core/config';
import type { SarifConfigurationProblem } from '../core/export/sarif';
import { ProjectConfigs, type FoundConfig } from '../node/project-config';
import type { Io } from './args';
import { visible } from './visible';

/** `pneumark: FILE:LINE:COLUMN: MESSAGE` (the file named once, not again at the start of the message). */
export function configProblemLine(shownPath: string, problem: ConfigProblem): string {
  let message = problem.message;
  if (message.startsWith(`${CONFIG_FILE_NAME}: `)) message = message.slice(CONFIG_FILE_NAME.length + 2);
  else if (message.startsWith(`${CONFIG_FILE_NAME} `)) message = message.slice(CONFIG_FILE_NAME.length + 1);
  const at = `${problem.range.start.line + 1}:${problem.range.start.character + 1}`;
  return visible(`pneumark: ${shownPath}:${at}: ${message.replace(/\s+/g, ' ').trim()}`);
}

/**
 * The project files of the notes of a run, each looked for once per folder (for standard input,
 * upward from the folder of its `--stdin-name` path, else from the working folder, as
 * `NoteWorker.settingsFor` does), and their problems.
 */
export class ConfigReport {
  private readonly configs = new ProjectConfigs();
  private readonly folders = new Set<string>();
  private readonly files = new Map<string, readonly ConfigProblem[]>();

  /** `stdinName`: the `--stdin-name` path of the note read from standard input, whose folder it is looked up from; null when not given. */
  constructor(private readonly cwd: string, private readonly stdinName: string | null = null) {}

  /** Notes as a command lists them: paths relative to the working folder or absolute, or `-`. */
  notes(paths: readonly string[]): this {
    for (const path of paths) this.note(path);
    return this;
  }

  note(path: string): this {
    const named = path === '-' ? this.stdinName : path;
    const folder = named === null ? this.cwd : dirname(isAbsolute(named) ? named : join(this.cwd, named));
    if (this.folders.has(folder)) return this;
    this.folders.add(folder);
    const found: FoundConfig | null = this.configs.forPath(join(folder, '-'));
    if (found && !this.files.has(found.path)) this.files.set(found.path, found.config.problems);
    return this;
  }

  /** One line per problem, each file once, in the order the files were found. */
  lines(): string[] {
    const lines: string[] = [];
    for (const [path, problems] of this.files) {
      const shown = this.shown(path);
      for (const p of problems) lines.push(configProblemLine(shown, p));
    }
    return lines;
  }

  /** The same problems for a SARIF log (tool configuration notifications): the file, its 1-based line and column, the message. */
  sarifProblems(): SarifConfigurationProblem[] {
    const out: SarifConfigurationProblem[] = [];
    for (const [path, problems] of this.files) {
      const shown = this.shown(path);
      for (const p of problems) out.push({ path: shown, line: p.range.start.line + 1, column: p.range.start.character + 1, message: p.message.replace(/\s+/g, ' ').trim() });
    }
    return out;
  }

  /** A file as output names it: relative to the working folder when inside it, else absolute. */
  private shown(path: string): string {
    const rel = relative(this.cwd, path);
    return rel === '' || isAbsolute(rel) ? path : rel;
  }
}

/**
 * Writes a line on standard error for each problem of the project files a run used; true when
 * there was one (the run then ends with exit code 2, after its output).
 */
export function reportConfigProblems(report: ConfigReport, io: Pick<Io, 'stderr'>): boolean {
  const lines = report.lines();
  for (const line of lines) io.stderr.write(`${line}\n`);
  return lines.length > 0;
}
