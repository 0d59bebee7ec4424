/**
 * Problems of the `pneumark.config.json` files a run uses, for standard error: the problems the
 * core's validation finds (not JSON, unknown keys, values out of range: the file's settings are
 * then not used, as in the editor) and names in `disabledChecks` that are no check's code or alias
 * (they switch nothing off). Each file is reported once per run, one line per problem, and the run
 * ends with exit code 2: CI must not pass with other settings than the team wrote.
 */
import { readFileSync, statSync } from 'node:fs';
import { dirname, isAbsolute, join, relative } from 'node:path';
import { CHECKS } from '../core/checks/registry';
import { CONFIG_FILE_NAME, type ConfigProblem, type ParsedConfig } from '../core/config';
import { settingsSchema } from '../core/settings';
import type { Range } from '../core/types';
import { ProjectConfigs, type FoundConfig } from '../node/project-config';
import type { Io } from './args';
import { visible } from './visible';

/** Check codes (lower case) and aliases, as `disabledChecks` matches them (see `runChecks`). */
const CHECK_NAMES = new Set(CHECKS.flatMap((c) => [c.code.toLowerCase(), c.alias]));

/** Project files larger than this are not read (the core's reader refuses them too). */
const MOST_CONFIG_BYTES = 1024 * 1024;

/**
 * Names in `disabledChecks` that switch off no check, with where they are written. The core's
 * runner ignores them, so without a word a typo (`PN 101`) leaves the check on. They are looked for
 * even when another setting of the file is invalid, so that one run reports every problem.
 */
export function unknownDisabledChecks(text: string): ConfigProblem[] {
  let data: unknown;
  try {
    data = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch {
    return []; // the core's validation reports a file that is not JSON
  }
  if (typeof data !== 'object' || data === null || !Object.prototype.hasOwnProperty.call(data, 'disabledChecks')) return [];
  const listed = settingsSchema.shape.disabledChecks.safeParse((data as { disabledChecks?: unknown }).disabledChecks);
  if (!listed.success) return []; // reported by the core's validation
  return listed.data
    .filter((name) => !CHECK_NAMES.has(name.toLowerCase()))
    .map((name) => ({
      message: `${CONFIG_FILE_NAME}: \`disabledChecks\`: ${JSON.stringify(name)} is not the code or alias of a check (see docs/checks.md), so it switches nothing off.`,
      range: rangeOf(text, JSON.stringify(name)),
    }));
}

/** Where `needle` first is in the text (UTF-16 columns), or the first character. */
function rangeOf(text: string, needle: string): Range {
  const at = text.indexOf(needle);
  if (at < 0) return { start: { line: 0, character: 0 }, end: { line: 0, character: 1 } };
  const before = text.slice(0, at).split(/\r\n|\r|\n/);
  const line = before.length - 1;
  const character = before[line]!.length;
  return { start: { line, character }, end: { line, character: character + needle.length } };
}

/** Every problem of a project file: the core's validation, then unknown check names. */
export function configProblems(path: string, config: ParsedConfig): ConfigProblem[] {
  let text: string | null = null;
  try {
    if (statSync(path).size <= MOST_CONFIG_BYTES) text = readFileSync(path, 'utf8');
  } catch {
    // the core's reader has reported a file that cannot be read
  }
  return [...config.problems, ...(text === null ? [] : unknownDisabledChecks(text))];
}

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
 * upward from the working folder, as `NoteWorker.settingsFor` does), and their problems.
 */
export class ConfigReport {
  private readonly configs = new ProjectConfigs();
  private readonly folders = new Set<string>();
  private readonly files = new Map<string, readonly ConfigProblem[]>();

  constructor(private readonly cwd: string) {}

  /** Notes as a command lists them: paths relative to the working folder or absolute, or `-`. */
  notes(paths: readonly string[]): this {
    for (const path of paths) this.note(path);
    return this;
  }

  note(path: string): this {
    const folder = path === '-' ? this.cwd : dirname(isAbsolute(path) ? path : join(this.cwd, path));
    if (this.folders.has(folder)) return this;
    this.folders.add(folder);
    const found: FoundConfig | null = this.configs.forPath(join(folder, '-'));
    if (found && !this.files.has(found.path)) this.files.set(found.path, configProblems(found.path, found.config));
    return this;
  }

  /** One line per problem, each file once, in the order the files were found. */
  lines(): string[] {
    const lines: string[] = [];
    for (const [path, problems] of this.files) {
      const rel = relative(this.cwd, path);
      const shown = rel === '' || isAbsolute(rel) ? path : rel;
      for (const p of problems) lines.push(configProblemLine(shown, p));
    }
    return lines;
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
