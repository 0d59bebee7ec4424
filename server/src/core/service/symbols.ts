/**
 * The outline of a note and its folding ranges. Timepoints are the outline: each names its
 * label, shows its time (an offset with the time it gives, a clock time written alone with its
 * day past the first: `07:00 (day 2)`, one that could not be read as written: `25:10 (not read)`,
 * `day 1 (25:10 not read)`), spans its lines (trailing blank lines excluded) and holds
 * its section lines as children. Lines before the first timepoint that describe the patient, the
 * place and the units form a "header" symbol. Each timepoint spanning more than one line folds, and so
 * does each `# region` … `# endregion` pair of comment lines.
 *
 * A note of more than OUTLINE_SECTION_LINES section lines (a thousand hourly timepoints and more) is
 * outlined by its timepoints and header alone, each with its name, time and lines as always but
 * without its section lines: past that, the section lines were three quarters of the answer (about
 * 10 MB for a note of 50,000 lines, which held the server while it was written) and a list of tens
 * of thousands of `vitals` and `abg` entries that nobody scrolls through; the lines stay one fold away.
 */
import type { NoteResult } from '../check-note';
import type { Timepoint } from '../analysis/model';
import { sectionById } from '../fields/sections';
import type { LineNode, SectionLine } from '../syntax/tree';
import { clockText, unreadTime, writtenTime } from './hover';
import { contentEnd, contentStart } from './locate';
import type { FoldingRangeInfo, SymbolInfo } from './types';
import { ITEMS_PER_STEP, runSteps, type Steps } from '../util/steps';

/** The most section lines an outline lists (see the header of this file). */
export const OUTLINE_SECTION_LINES = 5000;

/** Whether the outline lists the note's section lines: it has at most OUTLINE_SECTION_LINES of them. */
function listsSectionLines(lines: readonly LineNode[]): boolean {
  let count = 0;
  for (let i = 0; i < lines.length; i++) {
    if (lines[i]!.kind === 'section' && ++count > OUTLINE_SECTION_LINES) return false;
  }
  return true;
}

function isContent(node: LineNode): boolean {
  return node.kind === 'section' || node.kind === 'timepoint' || node.kind === 'unknown';
}

/** The last line from `start` to `end` (inclusive) that is not blank (comment lines count). */
function lastFilledLine(lines: readonly LineNode[], start: number, end: number): number {
  let last = end;
  while (last > start && lines[last]?.kind === 'blank' && lines[last]?.comment === null) last--;
  return last;
}

function wholeLines(lines: readonly LineNode[], start: number, end: number) {
  return { start: { line: start, character: 0 }, end: { line: end, character: lines[end]?.text.length ?? 0 } };
}

function sectionSymbol(node: SectionLine): SymbolInfo {
  const from = node.items[0]?.span.start ?? node.prose?.span.start ?? null;
  const detail = from === null ? '' : node.text.slice(from, contentEnd(node));
  const selection = { start: { line: node.line, character: node.sectionToken.span.start }, end: { line: node.line, character: node.sectionToken.span.end } };
  return {
    name: node.section,
    detail,
    kind: 'section',
    range: { start: { line: node.line, character: contentStart(node) }, end: { line: node.line, character: Math.max(contentEnd(node), node.sectionToken.span.end) } },
    selectionRange: selection,
    children: [],
  };
}

function timeDetail(result: NoteResult, tp: Timepoint): string {
  if (tp.line === null) return 'values before the first timepoint';
  const node = tp.line === null ? null : result.analysis.tree.lines[tp.line];
  const written = node?.kind === 'timepoint' && node.time ? node.time.text : null;
  const computed = tp.time.minutes !== null ? clockText(tp.time.minutes) : tp.time.day !== null ? `day ${tp.time.day}` : null;
  // Part of the time not read (`@ day 1 25:10` reads as day 1 alone) is named, as its hover names it.
  const unreadPart = node?.kind === 'timepoint' ? unreadTime(node, contentEnd(node)) : '';
  if (written && unreadPart) return `${written} (${unreadPart} not read)`;
  if (written && computed && written.startsWith('+')) return `${written} (${computed})`;
  // A clock time alone falls on the day the timeline gives it: past the first day, say which
  // (`07:00 (day 2)` after `@ day 1 23:30`), so the outline of a note of several days reads true;
  // one written with its day (`day 2 02:00`) says it already.
  if (written && node?.kind === 'timepoint' && node.time?.kind === 'clock' && node.time.day === null && tp.time.day !== null && tp.time.day > 1) return `${written} (day ${tp.time.day})`;
  // A time that could not be read is named as written, as its hover and its findings name it.
  const unread = node?.kind === 'timepoint' && !node.time ? writtenTime(node, contentEnd(node)) : '';
  if (unread) return `${unread} (not read)`;
  return written ?? computed ?? 'time unknown';
}

/**
 * The header: the header-section lines (patient, place, units) before the first timepoint's first
 * line of values, from the first line written to the last; and where the values of an implicit first
 * timepoint (values before any `@`) start.
 */
function headerOf(result: NoteResult): { implicitStart: number | null; header: { start: number; end: number; lines: SectionLine[] } | null } {
  const lines = result.analysis.tree.lines;
  const timepoints = result.analysis.timeline.timepoints;
  const firstTpLine = timepoints.find((t) => t.line !== null)?.line ?? lines.length;
  const implicitStart = timepoints[0]?.line === null ? firstValueLine(lines, firstTpLine) : null;
  const headerEnd = (implicitStart ?? firstTpLine) - 1;
  const headerLines = lines.filter((l): l is SectionLine => l.line <= headerEnd && l.kind === 'section' && sectionById(l.section).kind === 'header');
  const firstHeader = lines.find((l) => l.line <= headerEnd && isContent(l));
  if (headerLines.length === 0 || !firstHeader) return { implicitStart, header: null };
  return { implicitStart, header: { start: firstHeader.line, end: lastFilledLine(lines, firstHeader.line, headerEnd), lines: headerLines } };
}

/** The outline of a note (see the header of this file). */
export function documentSymbols(result: NoteResult): SymbolInfo[] {
  return runSteps(documentSymbolSteps(result));
}

/** `documentSymbols` in steps, yielding after every ITEMS_PER_STEP timepoints (see util/steps.ts). */
export function* documentSymbolSteps(result: NoteResult): Steps<SymbolInfo[]> {
  const lines = result.analysis.tree.lines;
  const timepoints = result.analysis.timeline.timepoints;
  const symbols: SymbolInfo[] = [];
  const withSections = listsSectionLines(lines);

  const { implicitStart, header } = headerOf(result);
  if (header) {
    symbols.push({
      name: 'header',
      detail: [...new Set(header.lines.map((l) => l.section))].join(', '),
      kind: 'header',
      range: wholeLines(lines, header.start, header.end),
      selectionRange: wholeLines(lines, header.start, header.start),
      children: withSections ? header.lines.map(sectionSymbol) : [],
    });
  }

  for (let t = 0; t < timepoints.length; t++) {
    if (t > 0 && t % ITEMS_PER_STEP === 0) yield;
    const tp = timepoints[t]!;
    const start = tp.line ?? implicitStart ?? tp.startLine;
    const end = lastFilledLine(lines, start, Math.max(start, tp.endLine));
    const children: SymbolInfo[] = [];
    for (let i = start; withSections && i <= end; i++) {
      const node = lines[i];
      if (node?.kind === 'section') children.push(sectionSymbol(node));
    }
    symbols.push({
      name: tp.label.trim() || `timepoint ${tp.index + 1}`,
      detail: timeDetail(result, tp),
      kind: 'timepoint',
      range: wholeLines(lines, start, end),
      selectionRange: wholeLines(lines, start, start),
      children,
    });
  }
  return symbols;
}

/** First line before `before` that states measurements or settings (opens the implicit timepoint). */
function firstValueLine(lines: readonly LineNode[], before: number): number | null {
  for (const node of lines) {
    if (node.line >= before) break;
    if (node.kind === 'section' && (sectionById(node.section).kind === 'measure' || sectionById(node.section).kind === 'setting')) return node.line;
  }
  return null;
}

/** A folding range: a timepoint's lines, or (kind `region`) a `# region` … `# endregion` pair. */
export interface FoldingInfo extends FoldingRangeInfo {
  readonly kind?: 'region';
}

/** `# region` and `# endregion` comments (the markers of grammar/language-configuration.json). */
const REGION_START = /^#\s*region\b/;
const REGION_END = /^#\s*endregion\b/;

export function foldingRanges(result: NoteResult): FoldingInfo[] {
  const lines = result.analysis.tree.lines;
  const out: FoldingInfo[] = [];
  // The header folds as a timepoint does, from its first line to its last header line, when that
  // takes more than one line.
  const { header } = headerOf(result);
  const regions = regionRanges(lines);
  const headerEnd = header ? outsideRegions(lines, regions, header.start, header.lines[header.lines.length - 1]?.line ?? -1) : -1;
  if (header && headerEnd > header.start) out.push({ startLine: header.start, endLine: headerEnd });
  const firstTpLine = result.analysis.timeline.timepoints.find((t) => t.line !== null)?.line ?? lines.length;
  for (const tp of result.analysis.timeline.timepoints) {
    const start = tp.line ?? firstValueLine(lines, firstTpLine) ?? tp.startLine;
    const end = outsideRegions(lines, regions, start, lastFilledLine(lines, start, Math.max(start, tp.endLine)));
    if (end > start) out.push({ startLine: start, endLine: end });
  }
  if (regions.length === 0) return out;
  // A region marked around exactly the header (or a timepoint) folds once, as the region.
  const plain = out.filter((r) => !regions.some((g) => g.startLine === r.startLine && g.endLine === r.endLine));
  return [...plain, ...regions].sort((a, b) => a.startLine - b.startLine || b.endLine - a.endLine);
}

/**
 * The last line of a fold from `start` to `end` (a timepoint's, the header's) that crosses no region: a timepoint's lines run
 * to the next timepoint, comment lines included, and where regions are written around timepoints
 * (`# endregion`, `# region day 2` between two of them) the markers belong to the regions. An
 * editor drops one of two folds that cross, so the timepoint's fold ends before a region that
 * opens inside it and closes after it, or that opened before it and closes inside it.
 */
function outsideRegions(lines: readonly LineNode[], regions: readonly FoldingInfo[], start: number, end: number): number {
  let last = end;
  // Each cut can only shorten the fold; one more pass finds a region the shorter fold crosses.
  for (let moved = true; moved;) {
    moved = false;
    for (const g of regions) {
      const cut = g.startLine > start && g.startLine <= last && g.endLine > last ? g.startLine - 1
        : g.startLine < start && g.endLine >= start && g.endLine < last ? g.endLine - 1 : last;
      if (cut < last) {
        last = lastFilledLine(lines, start, Math.max(start, cut));
        moved = true;
      }
    }
  }
  return last;
}

/**
 * `# region` … `# endregion` pairs on comment-only lines, nested as written: an end closes the
 * latest open region; an end with none open, and a region never closed, fold nothing.
 */
function regionRanges(lines: readonly LineNode[]): FoldingInfo[] {
  const out: FoldingInfo[] = [];
  const open: number[] = [];
  for (let i = 0; i < lines.length; i++) {
    const node = lines[i]!;
    if (node.kind !== 'blank' || node.comment === null) continue;
    const comment = node.comment.text;
    if (REGION_END.test(comment)) {
      const start = open.pop();
      if (start !== undefined && i > start) out.push({ startLine: start, endLine: i, kind: 'region' });
    } else if (REGION_START.test(comment)) {
      open.push(i);
    }
  }
  return out;
}
