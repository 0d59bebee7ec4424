/**
 * Text in, analysis out: parse, build the timeline, derive values. Checks then read this.
 */
import type { Settings } from '../settings';
import { parseNote } from '../syntax/parser';
import type { NoteTree } from '../syntax/tree';
import { deriveTimepoint } from '../derive/registry';
import type { TimepointDerivation } from '../derive/model';
import { buildTimeline, type Timeline } from './timeline';

export interface NoteAnalysis {
  readonly tree: NoteTree;
  readonly timeline: Timeline;
  /** Derived values and interpretations, one entry per timepoint (same order). */
  readonly derivations: readonly TimepointDerivation[];
}

export function analyseTree(tree: NoteTree, settings: Settings): NoteAnalysis {
  const timeline = buildTimeline(tree, settings);
  return { tree, timeline, derivations: timeline.timepoints.map((tp) => deriveTimepoint(tp, settings)) };
}

export function analyseText(text: string, settings: Settings): NoteAnalysis {
  return analyseTree(parseNote(text), settings);
}
