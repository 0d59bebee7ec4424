// Every quick fix the editor offers does what it says: applied to the note, the finding it fixes
// is gone and no new error appears. Checked on every fixture note and sample (every finding,
// every fix and fix-all offered at it) and on generated messy notes.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkNote, type NoteResult } from '../../server/src/core/check-note';
import { within } from '../../server/src/core/analysis/bounds';
import { convert, unitById } from '../../server/src/core/fields/units';
import { applyEdits, codeActions, type ActionInfo } from '../../server/src/core/service';
import type { Finding } from '../../server/src/core/types';
import { noteAt } from './cursor';
import { messyNote } from './note-arbitraries';

export const QUICK_FIX_RUNS = 300;

const notesIn = (dir: string) => readdirSync(dir).filter((f) => f.endsWith('.pneu')).sort().map((f) => ({ name: join(dir, f), text: readFileSync(join(dir, f), 'utf8') }));
const NOTES = [...notesIn('tests/fixtures'), ...notesIn('samples')];

const where = (f: Finding) => `${f.code} line ${f.range.start.line + 1}:${f.range.start.character + 1}`;

/** The fixes offered at each finding (each action once), with what they claim to resolve. */
function offeredFixes(result: NoteResult): ActionInfo[] {
  const seen = new Set<string>();
  const out: ActionInfo[] = [];
  for (const f of result.findings) {
    for (const a of codeActions(result, f.range)) {
      if (a.kind === 'refactor.rewrite') continue;
      const key = `${a.title}\n${JSON.stringify(a.edits)}`;
      if (seen.has(key)) continue;
      seen.add(key);
      out.push(a);
    }
  }
  return out;
}

/** What is wrong with the note after the action, as readable lines (empty when nothing is). */
function problemsAfter(text: string, result: NoteResult, action: ActionInfo): string[] {
  const after = applyEdits(text, action.edits);
  const again = checkNote(after);
  const problems: string[] = [];
  expect(again.analysis.tree.lines.length, `${action.title} keeps the number of lines`).toBe(result.analysis.tree.lines.length);
  // A line may hold several findings of one kind with one message (two doubled commas): each one
  // a fix resolves takes one away.
  const kind = (f: Finding) => `${f.code}@${f.range.start.line}:${f.message}`;
  const count = (list: readonly Finding[], k: string) => list.filter((f) => kind(f) === k).length;
  for (const k of new Set((action.resolves ?? []).map(kind))) {
    const resolved = count(action.resolves ?? [], k);
    const left = count(again.findings, k);
    if (left > count(result.findings, k) - resolved) problems.push(`${action.title}: ${k} is still reported ${left} time(s)`);
  }
  for (const g of again.findings) {
    if (g.severity !== 'error') continue;
    if (result.findings.some((f) => f.severity === 'error' && f.code === g.code && f.range.start.line === g.range.start.line)) continue;
    if (revealed(g, again, result)) continue;
    problems.push(`${action.title}: new error ${where(g)}: ${g.message}`);
  }
  return problems;
}

/**
 * An error about a value as the note wrote it, which the fix let be read rather than made: the
 * value's text is on the line before the fix (`vitals co 100..` with its full stop removed reads
 * as 100 L/min, impossible; `sex patient` started with `patient` reads `patient` as a sex; a unit
 * as written that the value does not take). An impossible value whose unit the fix wrote is the
 * fix's doing when another unit of the field would have made it possible (`temp 37 mmHg` → `37 F`).
 */
function revealed(g: Finding, again: NoteResult, before: NoteResult): boolean {
  const node = again.analysis.tree.lines[g.range.start.line];
  // A decimal comma is read as a point (and reported) until it is fixed.
  const points = (text: string) => text.replace(/(\d),(\d)/g, '$1.$2');
  const beforeLine = points(before.analysis.tree.lines[g.range.start.line]?.text ?? '');
  if (node?.kind !== 'section') return false;
  const at = g.range.start.character;
  const on = (t: { span: { start: number; end: number } } | null) => t !== null && t.span.start <= at && at < t.span.end;
  const item = node.items.find((i) => on(i.value) || on(i.unit));
  if (!item?.value) return false;
  const token = on(item.value) ? item.value : item.unit!;
  if (!beforeLine.includes(points(token.text))) return false;
  if (g.code === 'PN301' && item.unit !== null && item.field && item.number !== null && !beforeLine.includes(points(node.text.slice(item.value.span.start, item.unit.span.end)))) {
    // The fix wrote the unit: its doing when another unit of the field would make the value possible.
    const field = item.field;
    const possibleIn = (id: string) => {
      const v = convert(item.number!, unitById(id)!, unitById(field.unit!)!);
      return v !== null && within(v, field.hard);
    };
    return !(field.units ?? []).some(possibleIn);
  }
  return true;
}

describe('quick fixes on the fixture notes and samples', () => {
  it('offers fixes on them at all (the sweep below has something to check)', () => {
    const count = NOTES.reduce((n, note) => n + offeredFixes(checkNote(note.text)).length, 0);
    expect(count).toBeGreaterThan(10);
  });

  for (const note of NOTES) {
    it(`${note.name}: every fix offered at a finding removes it and adds no error`, () => {
      const result = checkNote(note.text);
      const problems = offeredFixes(result).flatMap((a) => {
        expect(a.resolves?.length ?? 0, `${a.title} names the findings it fixes`).toBeGreaterThan(0);
        return problemsAfter(note.text, result, a);
      });
      expect(problems).toEqual([]);
    });
  }
});

describe('quick fixes on generated notes', () => {
  it(`every fix offered at a finding removes it and adds no error (${QUICK_FIX_RUNS} generated notes)`, () => {
    fc.assert(fc.property(messyNote, (text) => {
      const result = checkNote(text);
      const problems = offeredFixes(result).flatMap((a) => problemsAfter(text, result, a));
      expect(problems).toEqual([]);
    }), { numRuns: QUICK_FIX_RUNS });
  }, 60_000);
});

describe('a fix that would trade one problem for another', () => {
  it('is mended at its source: the comma of `patient,7,35` is replaced by a blank, which keeps the section word apart from the number', () => {
    const { result, range } = noteAt('patient,|7,35');
    expect(result.findings.map((f) => f.code)).toContain('PN105');
    const remove = codeActions(result, range).find((a) => a.title === 'Remove the comma');
    expect(remove?.edits.map((e) => e.newText)).toEqual([' ']);
    // With a blank after the comma, removing it is safe.
    const spaced = noteAt('patient,| age 70');
    expect(codeActions(spaced.result, spaced.range).map((a) => a.title)).toContain('Remove the comma');
  });
});

describe('a fix that would make a value impossible', () => {
  it('is not offered: temp 37 mmHg is offered 37 C, not 37 F', () => {
    const { result, range } = noteAt('@ 08:00\nvitals    temp 37 mm|Hg');
    const titles = codeActions(result, range).map((a) => a.title);
    expect(titles).toContain('Change to C');
    expect(titles).not.toContain('Change to F');
    // 99 mmHg is possible in F (37.2 °C), not in C.
    const f = noteAt('@ 08:00\nvitals    temp 99 mm|Hg');
    const fTitles = codeActions(f.result, f.range).map((a) => a.title);
    expect(fTitles).toContain('Change to F');
    expect(fTitles).not.toContain('Change to C');
    expect(result.findings.map((x) => x.code)).toEqual(['PN203']);
  });
});
