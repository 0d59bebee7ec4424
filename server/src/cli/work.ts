/**
 * What the CLI does with one note, the same in the main thread and in a worker: read it, check it
 * with the settings of its project (pneumark.config.json found upward), and keep what the chosen
 * output needs. Everything returned is plain data, so it crosses a worker boundary by structured clone.
 */
import { isAbsolute, join } from 'node:path';
import { checkNote, type NoteResult } from '../core/check-note';
import type { Settings } from '../core/settings';
import type { Finding } from '../core/types';
import { ProjectConfigs } from '../node/project-config';
import { readNote, type NoteInput } from './inputs';
import { timepointsJson } from './timepoints-json';

export type Task =
  | { readonly kind: 'check'; readonly timepoints: boolean }
  | { readonly kind: 'export'; readonly format: 'csv' | 'jsonl' | 'fhir'; readonly redactProse: boolean; readonly shiftDays: number; readonly anchor: string | null };

export interface FileReport {
  readonly path: string;
  readonly problem: string | null;
  readonly findings: readonly Finding[];
  /** `check --format json`: the timepoints with values, derived values and readings. */
  readonly timepoints?: unknown[];
  /** `export`: what the format needs for this note (rows, lines or a bundle). */
  readonly payload?: unknown;
}

export type ExportRenderer = (path: string, result: NoteResult, task: Extract<Task, { kind: 'export' }>) => unknown;

export class NoteWorker {
  private readonly configs = new ProjectConfigs();

  constructor(
    private readonly cwd: string,
    private readonly overrides: Partial<Settings>,
    private readonly exportRenderer: ExportRenderer | null = null,
  ) {}

  settingsFor(path: string): Partial<Settings> {
    if (path === '-' || path === '<stdin>') return this.overrides;
    const found = this.configs.forPath(isAbsolute(path) ? path : join(this.cwd, path));
    return { ...(found?.config.settings ?? {}), ...this.overrides };
  }

  run(path: string, task: Task, stdin: () => Buffer): FileReport {
    const note: NoteInput = readNote(path, this.cwd, stdin);
    if (note.text === null) return { path: note.path, problem: note.problem, findings: [] };
    const result = checkNote(note.text, this.settingsFor(path));
    if (task.kind === 'check') {
      return { path: note.path, problem: null, findings: result.findings, ...(task.timepoints ? { timepoints: timepointsJson(result) } : {}) };
    }
    return { path: note.path, problem: null, findings: result.findings, payload: this.exportRenderer?.(note.path, result, task) ?? null };
  }
}
