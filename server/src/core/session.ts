/**
 * A note that changes over time (an open editor document). `update` returns what `checkNote`
 * returns on the new text, reusing what did not change:
 * - lines: a line whose text is unchanged keeps its parsed items (found by matching the
 *   unchanged lines at the start and at the end of the note);
 * - timepoints: a timepoint whose lines and incoming carried values are unchanged keeps its
 *   values and derived values (see `buildTimelineIncremental`).
 * - findings: timepoint-scoped checks keep their findings for a reused timepoint; the few
 *   note-scoped checks run over the whole note each time.
 */
import { runChecks, type NoteResult, type TimepointFindingsCache } from './check-note';
import { buildTimelineIncremental, type TimelineCache } from './analysis/timeline';
import { deriveTimepoint } from './derive/registry';
import type { Timepoint } from './analysis/model';
import type { TimepointDerivation } from './derive/model';
import { withDefaults, type Settings } from './settings';
import { parseLine, splitLines } from './syntax/parser';
import type { LineNode, NoteTree } from './syntax/tree';

export interface SessionStats {
  /** Lines parsed anew by the last update. */
  readonly parsedLines: number;
  /** Timepoints whose values and derived values were reused. */
  readonly reusedTimepoints: number;
  readonly timepoints: number;
}

export class NoteSession {
  private settings: Settings;
  private last: NoteResult | null = null;
  private lastText: string | null = null;
  private timelineCache: TimelineCache | null = null;
  private derivations = new WeakMap<Timepoint, TimepointDerivation>();
  private findings: TimepointFindingsCache = new WeakMap();
  private statsValue: SessionStats = { parsedLines: 0, reusedTimepoints: 0, timepoints: 0 };

  constructor(settings: Partial<Settings> = {}) {
    this.settings = withDefaults(settings);
  }

  setSettings(settings: Partial<Settings>): void {
    this.settings = withDefaults(settings);
    this.lastText = null;
    this.timelineCache = null;
    this.derivations = new WeakMap();
    this.findings = new WeakMap();
  }

  get result(): NoteResult | null {
    return this.last;
  }

  get stats(): SessionStats {
    return this.statsValue;
  }

  update(text: string): NoteResult {
    if (this.last && text === this.lastText) return this.last;
    const { tree, parsed } = this.parse(text);
    const { timeline, cache } = buildTimelineIncremental(tree, this.settings, this.timelineCache);
    this.timelineCache = cache;
    const derivations = timeline.timepoints.map((tp) => {
      const known = this.derivations.get(tp);
      if (known) return known;
      const d = deriveTimepoint(tp, this.settings);
      this.derivations.set(tp, d);
      return d;
    });
    this.last = runChecks({ tree, timeline, derivations }, this.settings, undefined, this.findings);
    this.lastText = text;
    this.statsValue = { parsedLines: parsed, reusedTimepoints: cache.reused, timepoints: timeline.timepoints.length };
    return this.last;
  }

  private parse(text: string): { tree: NoteTree; parsed: number } {
    const { lines, eol } = splitLines(text);
    const before = this.last?.analysis.tree.lines ?? [];
    const n = lines.length;
    const m = before.length;
    // Unchanged lines at the start keep their number; unchanged lines at the end move by n − m.
    let head = 0;
    while (head < n && head < m && lines[head]!.text === before[head]!.text) head++;
    let tail = 0;
    while (tail < n - head && tail < m - head && lines[n - 1 - tail]!.text === before[m - 1 - tail]!.text) tail++;
    let parsed = 0;
    const nodes: LineNode[] = lines.map((l, i) => {
      const old = i < head ? before[i] : i >= n - tail ? before[i - n + m] : undefined;
      if (!old) {
        parsed++;
        return parseLine(l.text, i, l.offset);
      }
      return old.line === i && old.offset === l.offset ? old : { ...old, line: i, offset: l.offset };
    });
    return { tree: { lines: nodes, eol }, parsed };
  }
}
