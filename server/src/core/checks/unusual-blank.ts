/**
 * Blanks other than a space or a tab (a no-break space, a thin space, a byte-order mark inside the
 * note): the parser reads them as blanks (blanks.ts), so nothing is misread, but they look like a
 * space or like nothing, and a search for `hr 80`, a diff or a spreadsheet takes them for
 * characters. Reported lightly, where they separate what is read (not in comments, prose or a
 * timepoint's label, which are free text), with a fix that writes a plain space.
 */
import { BLANKS, blankName, isBlank, isPlainBlank } from '../syntax/blanks';
import { lineFixToFix, toRange, type LineFix, type LineNode } from '../syntax/tree';
import { defineCheck, forHeaderLines, forTimepointLines, type CheckContext } from './check';

/** The first unusual blank of a text, found natively before any character is looked at one by one. */
const UNUSUAL = new RegExp(`[${BLANKS.filter((b) => !isPlainBlank(b.code)).map((b) => `\\u${b.code.toString(16).padStart(4, '0')}`).join('')}]`);

function isUnusual(code: number): boolean {
  return isBlank(code) && !isPlainBlank(code);
}

/** Where the part of a line the parser reads as words ends: at free text (prose, a label) or a comment. */
function readEnd(node: LineNode): number {
  const free = node.kind === 'section' ? node.prose : node.kind === 'timepoint' ? node.label : null;
  if (free) return free.span.start;
  return node.comment ? node.comment.span.start : node.text.length;
}

function message(text: string, start: number, end: number): string {
  if (end - start === 1) return `A ${blankName(text.charCodeAt(start))} is read here as a blank: it looks like a space or like nothing, but other tools take it for a character. Write a plain space.`;
  const names: string[] = [];
  for (let i = start; i < end; i++) {
    const name = blankName(text.charCodeAt(i));
    if (!names.includes(name)) names.push(name);
  }
  return `${end - start} unusual blanks (${names.join(', ')}) are read here as one blank: they look like spaces or like nothing, but other tools take them for characters. Write a plain space.`;
}

function visit(ctx: CheckContext, node: LineNode): void {
  const text = node.text;
  const end = readEnd(node);
  let i = text.search(UNUSUAL);
  if (i < 0 || i >= end) return;
  for (; i < end; i++) {
    if (!isUnusual(text.charCodeAt(i))) continue;
    // The byte-order mark that opens a note is a mark of the file, not a blank of the note.
    if (i === 0 && node.line === 0 && text.charCodeAt(0) === 0xfeff) continue;
    const start = i;
    while (i + 1 < end && isUnusual(text.charCodeAt(i + 1))) i++;
    const stop = i + 1;
    // A space where the run alone separates two words, or where it is the whole line (an empty line
    // between the `\r` and the `\n` of a note would make one line end of two, and join the lines
    // around it); nothing where a blank is already next to it, or where nothing comes before or
    // after it on the line but other text does.
    const alone = start > 0 && stop < text.length && !isBlank(text.charCodeAt(start - 1)) && !isBlank(text.charCodeAt(stop));
    const space = alone || (start === 0 && stop === text.length);
    const fix: LineFix = {
      title: space ? 'Write a plain space' : 'Remove the unusual blank',
      edits: [{ span: { start, end: stop }, newText: space ? ' ' : '' }],
      preferred: true,
    };
    ctx.report({ range: toRange(node.line, { start, end: stop }), message: message(text, start, stop), fixes: [lineFixToFix(node.line, fix)] });
  }
}

export const unusualBlank = defineCheck({
  code: 'PN107',
  alias: 'unusual-blank',
  title: 'Unusual blank',
  severity: 'information',
  tags: ['syntax'],
  doc: {
    fires: 'A blank other than a space or a tab separates what a line says: a no-break space, a narrow no-break space, a thin, hair, figure or ideographic space, a byte-order mark (U+FEFF) inside the note, or another of the blanks grammar/README.md lists (in the example, a no-break space between `hr` and `118`). It is read as a blank, so nothing is misread, but it looks like a space or like nothing, and a search, a diff or a spreadsheet takes it for a character. Comments, prose and timepoint labels are free text and are not looked at; nor is the byte-order mark that opens a file.',
    example: 'vitals hr\u00a0118',
    fix: 'Write a plain space; the quick fix does it (or removes the blank where a space is already next to it, or where nothing comes before or after it but other text does; a line of unusual blanks alone becomes one plain space), also for the whole note.',
  },
  source: 'format rule (grammar/README.md)',
  run(ctx) {
    forHeaderLines(ctx, visit);
  },
  runTimepoint(ctx) {
    forTimepointLines(ctx, visit);
  },
});
