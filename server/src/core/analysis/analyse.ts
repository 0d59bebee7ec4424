/**
 * Text in, analysis out: parse, build the timeline, derive values. Checks then read this.
 */
import type { Settings } from '../settings';
import { parseNote } from '../syntax/parser';
import type { NoteTree } from '../syntax/tree';
import { buildTimeline, type Timeline } from './timeline';

export interface NoteAnalysis {
  readonly tree: NoteTree;
  readonly timeline: Timeline;
}

export function analyseTree(tree: NoteTree, settings: Settings): NoteAnalysis {
  return { tree, timeline: buildTimeline(tree, settings) };
}

export function analyseText(text: string, settings: Settings): NoteAnalysis {
  return analyseTree(parseNote(text), settings);
}
