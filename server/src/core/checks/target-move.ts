/**
 * The quick fix of an SpO2 target written on a `patient` or `place` line (PN201: `target` belongs
 * on an oxygen line): the target moved to the oxygen line of the timepoint it applies to, and taken
 * off the line it was written on with its comma, so that both lines stay well-formed.
 *
 * The timepoint it applies to: the one whose lines hold it, or for a line before the first
 * timepoint (the note's header) the first timepoint, where a target written there would first be in
 * force. Its first oxygen line takes `, target …` after its last item; where the timepoint has no
 * oxygen line, `oxygen target …` is written on a new line right after the timepoint's `@` line (in
 * the canonical columns, as `pneumark fmt` writes it). The target is moved as written, up to the
 * comma after it (`target 88-92 %`, the `%` included, which a patient line reads as stray text).
 *
 * No fix where the oxygen line already states a target (which of the two is meant is the writer's
 * choice), nor where the note has no timepoint for it to apply to. Not preferred: it changes two
 * lines, and is applied only when asked for.
 */
import type { NoteAnalysis } from '../analysis/analyse';
import type { ItemNode, SectionLine, Span } from '../syntax/tree';
import { rangeBetween, toRange } from '../syntax/tree';
import { contentEnd, ITEM_COLUMN, lineInsertion } from '../syntax/layout';
import { isBlank } from '../syntax/blanks';
import { fieldById } from '../fields/registry';
import type { Fix, TextEdit } from '../types';

/** The sections whose lines a target is moved off. */
const HEADER_SECTIONS: ReadonlySet<string> = new Set(['patient', 'place']);

/** The keys of the SpO2 target, in lower case (`target`, `spo2_target`). */
const TARGET_KEYS: ReadonlySet<string> = new Set(fieldById('spo2_target')!.aliases.map((a) => a.toLowerCase()));

/**
 * The fixes of a PN201 finding at `line` whose key spans `keySpan`: the move, where the key is an
 * SpO2 target's on a patient or place line and a timepoint takes it; none otherwise.
 */
export function targetMoveFixes(analysis: NoteAnalysis, line: number, keySpan: Span): readonly Fix[] {
  const node = analysis.tree.lines[line];
  if (node === undefined || node.kind !== 'section' || !HEADER_SECTIONS.has(node.section)) return NO_FIXES;
  const item = node.items.find((i) => i.key !== null && i.key.span.start === keySpan.start);
  if (item === undefined || !TARGET_KEYS.has(item.key!.text.toLowerCase())) return NO_FIXES;
  const timepoints = analysis.timeline.timepoints;
  const tp = timepoints.find((t) => line >= t.startLine && line <= t.endLine) ?? (line < (timepoints[0]?.startLine ?? -1) ? timepoints[0] : undefined);
  if (tp === undefined) return NO_FIXES;

  const content = contentEnd(node);
  const start = keySpan.start;
  const next = node.items[node.items.indexOf(item) + 1];
  const end = segmentEnd(node.text, start, next !== undefined ? Math.min(next.span.start, content) : content);
  const moved = node.text.slice(start, end);
  if (!/\d/.test(moved)) return NO_FIXES;

  let oxygen: SectionLine | null = null;
  for (let l = tp.startLine + 1; l <= tp.endLine && oxygen === null; l++) {
    const other = analysis.tree.lines[l];
    if (other?.kind === 'section' && other.section === 'oxygen') oxygen = other;
  }
  if (oxygen !== null && oxygen.items.some(statesTarget)) return NO_FIXES;

  const edits: TextEdit[] = [removal(analysis, node, item, start, end, content)];
  let title: string;
  if (oxygen !== null) {
    const at = contentEnd(oxygen);
    const bare = oxygen.items.length === 0;
    edits.push({ range: toRange(oxygen.line, { start: at, end: at }), newText: bare ? ` ${moved}` : `, ${moved}` });
    title = `Move \`${moved}\` to the oxygen line (line ${oxygen.line + 1})`;
  } else {
    edits.push(lineInsertion(analysis.tree, tp.startLine + 1, `${'oxygen'.padEnd(ITEM_COLUMN)}${moved}`).edit);
    title = `Move \`${moved}\` to a new oxygen line (\`oxygen ${moved}\`) after line ${tp.startLine + 1}`;
  }
  return [{ title, edits }];
}

const NO_FIXES: readonly Fix[] = [];

/** Whether an item of an oxygen line is an SpO2 target. */
function statesTarget(item: ItemNode): boolean {
  return item.field?.id === 'spo2_target';
}

/** The end of the item written from `start`: before the next comma, or `limit` (the next item, the content's end), less the blanks before it. */
function segmentEnd(text: string, start: number, limit: number): number {
  const comma = text.indexOf(',', start);
  let end = comma >= 0 && comma < limit ? comma : limit;
  while (end > start && isBlank(text.charCodeAt(end - 1))) end--;
  return end;
}

/**
 * The edit that takes the target (`start` to `end`) off its line: with the comma before it (`age 70,
 * target 88-92` → `age 70`), or first on its line with the comma and blanks after it (`target 88-92,
 * sex male` → `sex male`); the whole line where it is the line's only item and no comment follows
 * (a `patient` line with nothing on it says nothing).
 */
function removal(analysis: NoteAnalysis, node: SectionLine, item: ItemNode, start: number, end: number, content: number): TextEdit {
  const text = node.text;
  const index = node.items.indexOf(item);
  const before = index > 0 ? node.items[index - 1]! : null;
  if (before !== null) {
    // Back over the blanks and the comma that end the item before it.
    let from = start;
    while (from > 0 && isBlank(text.charCodeAt(from - 1))) from--;
    if (text.charCodeAt(from - 1) === 0x2c /* , */) from--;
    while (from > before.span.end && isBlank(text.charCodeAt(from - 1))) from--;
    return { range: toRange(node.line, { start: from, end }), newText: '' };
  }
  let to = end;
  if (to < content && text.charCodeAt(to) === 0x2c /* , */) {
    to++;
    while (to < content && isBlank(text.charCodeAt(to))) to++;
    return { range: toRange(node.line, { start, end: to }), newText: '' };
  }
  if (node.comment === null) return wholeLine(analysis, node.line);
  return { range: toRange(node.line, { start: node.sectionToken.span.end, end: to }), newText: '' };
}

/** The removal of a whole line, with its line end (or, on the last line, the line end before it). */
function wholeLine(analysis: NoteAnalysis, line: number): TextEdit {
  const lines = analysis.tree.lines;
  if (line + 1 < lines.length) return { range: rangeBetween(line, 0, line + 1, 0), newText: '' };
  if (line === 0) return { range: toRange(line, { start: 0, end: lines[line]!.text.length }), newText: '' };
  return { range: rangeBetween(line - 1, lines[line - 1]!.text.length, line, lines[line]!.text.length), newText: '' };
}
