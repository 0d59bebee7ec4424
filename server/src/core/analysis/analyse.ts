/**
 * Text in, analysis out: parse, build the timeline, derive values. Checks then read this.
 */
import type { Settings } from '../settings';
import { parseNote } from '../syntax/parser';
import type { NoteTree } from '../syntax/tree';
import { derivationOf, deriveTimepoint } from '../derive/registry';
import type { TimepointDerivation } from '../derive/model';
import { HighFlowRuns } from '../derive/high-flow';
import { buildTimeline, type Timeline } from './timeline';

export interface NoteAnalysis {
  readonly tree: NoteTree;
  readonly timeline: Timeline;
  /**
   * Derived values and interpretations of the timepoint at `index`, computed when asked and not
   * kept: they are a pure function of the timepoint and the settings, cheap for one timepoint,
   * and a big note would otherwise hold tens of thousands of them. Callers ask for the
   * timepoints they show (a hover, the visible hints, one export row at a time). A result of
   * `checkNote` with `keepDerivations` (an export's) answers with the derivations its checks made.
   */
  readonly derivation: (index: number) => TimepointDerivation;
}

export function analyseTree(tree: NoteTree, settings: Settings): NoteAnalysis {
  const timeline = buildTimeline(tree, settings);
  return { tree, timeline, derivation: deriverFor(timeline, settings) };
}

/**
 * `NoteAnalysis.derivation` for a timeline. The hours of high flow (`HighFlowRuns`) are worked out
 * for the whole timeline once, the first time a value reads them, and kept with this analysis.
 */
export function deriverFor(timeline: Timeline, settings: Settings): (index: number) => TimepointDerivation {
  let runs: HighFlowRuns | null = null;
  return (index) => {
    const tp = timeline.timepoints[index];
    return tp ? deriveTimepoint(tp, settings, () => (runs ??= new HighFlowRuns(timeline.timepoints)).at(index)) : derivationOf(index);
  };
}

/** Every timepoint's derivation, in order (for whole-note output; computes them all). */
export function allDerivations(analysis: NoteAnalysis): TimepointDerivation[] {
  return analysis.timeline.timepoints.map((tp) => analysis.derivation(tp.index));
}

export function analyseText(text: string, settings: Settings): NoteAnalysis {
  return analyseTree(parseNote(text), settings);
}
