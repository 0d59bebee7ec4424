/**
 * What an editor holds back while a note is typed. A person typing `spo2 95` passes through
 * `spo2` (no value), `spo2 9` (unusual) and a key half typed (`sp`, not a key): findings that
 * say nothing about the note being written, and that would flash on and off at each keystroke.
 * So a finding that was not shown before, on the line of the last keystroke, within the item
 * the keystroke was in (from the comma before it to the comma after it, or the whole line when
 * it has none: a timepoint line, a gas written with slashes), is held back; the server shows it
 * once typing pauses, the line is left (Enter) or the note is saved. Nothing here changes what
 * is found: `pneumark check` and every other request see all findings.
 */
import type { Finding, Position } from '../types';

/** The stretch of a line a keystroke at `character` belongs to: [start, end] in UTF-16 characters. */
export function typedItem(lineText: string, character: number): { readonly start: number; readonly end: number } {
  // The comma just typed closes the item before it, which still counts as the one typed.
  const before = lineText.lastIndexOf(',', character - 2);
  const after = lineText.indexOf(',', character);
  return { start: before + 1, end: after < 0 ? lineText.length : after };
}

/**
 * The findings to hold back after a keystroke at `at` (the end of what it typed, or where it
 * deleted): those starting on its line whose range meets the item typed, unless `shownBefore`
 * says the editor already shows them (a finding shown stays shown as typing goes on).
 */
export function heldWhileTyping(findings: readonly Finding[], lineText: string, at: Position, shownBefore: (f: Finding) => boolean): Finding[] {
  const { start, end } = typedItem(lineText, at.character);
  const held: Finding[] = [];
  for (let i = 0; i < findings.length; i++) {
    const f = findings[i]!;
    if (f.range.start.line !== at.line) continue;
    const fEnd = f.range.end.line === at.line ? f.range.end.character : lineText.length;
    if (f.range.start.character > end || fEnd < start) continue;
    if (shownBefore(f)) continue;
    held.push(f);
  }
  return held;
}
