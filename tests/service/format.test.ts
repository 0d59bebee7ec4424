// The formatter: canonical layout, what it never touches, minimal edits, and properties on
// generated notes (idempotence, never throwing, the meaning of every line kept).
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { isBlank } from '../../server/src/core/syntax/lexer';
import { BLANKS } from '../../server/src/core/syntax/blanks';
import { parseNote, splitLines } from '../../server/src/core/syntax/parser';
import type { LineNode } from '../../server/src/core/syntax/tree';
import { applyEdits, editsOverlap, formatEdits, formatNote } from '../../server/src/core/service';
import { anyText } from '../helpers/arbitraries';
import { note } from './cursor';
import { messyNote } from './note-arbitraries';

export const FORMAT_RUNS = 400;

describe('canonical layout', () => {
  it('pads the section word so items start in column 10 and joins items with ", "', () => {
    expect(formatNote('vitals hr 118 rr 26   spo2 89 %')).toBe('vitals    hr 118, rr 26, spo2 89 %');
    expect(formatNote('  abg ph 7.31,pco2 41 ,po2 71  mmHg')).toBe('abg       ph 7.31, pco2 41, po2 71 mmHg');
    expect(formatNote('ventilator mode VC vt 430 mL')).toBe('ventilator mode VC, vt 430 mL');
  });

  it('writes every blank of the format as a plain space, so no unusual blank (PN107) is left between items', () => {
    for (const { code, name } of BLANKS) {
      const b = String.fromCharCode(code);
      // A byte-order mark that opens the text is the file's, and kept.
      const bom = code === 0xfeff ? b : '';
      expect(formatNote(`${b}vitals${b}hr${b}118${b}bpm${b}rr 26${b}`), name).toBe(`${bom}vitals    hr 118 bpm, rr 26`);
      expect(formatNote(`@ 08:00\n${b}vitals${b}hr${b}118`), name).toBe('@ 08:00\nvitals    hr 118');
      expect(formatNote(`oxygen room${b}air, fio2 0.21\nabg 7.3${b}/${b}40${b}/${b}80${b}kPa`), name).toBe('oxygen    room air, fio2 0.21\nabg       7.3 / 40 / 80 kPa');
      expect(formatNote(`abg po2 80 mm${b}Hg`), name).toBe('abg       po2 80 mm Hg');
    }
  });

  it('writes a known glued unit apart, and keeps an unknown one glued', () => {
    expect(formatNote('vitals spo2 89%, temp 38.4C')).toBe('vitals    spo2 89 %, temp 38.4 C');
    expect(formatNote('abg po2 80mm Hg, pco2 40')).toBe('abg       po2 80 mm Hg, pco2 40');
    expect(formatNote('vent peep 5cm H2O')).toBe('vent      peep 5 cm H2O');
    expect(formatNote('abg po2 71mmhgg')).toBe('abg       po2 71mmhgg');
  });

  it('keeps the shorthand gas and the oxygen device as written, in their position', () => {
    expect(formatNote('abg 7.28/56/71/26 kPa  be -2')).toBe('abg       7.28/56/71/26 kPa be -2');
    expect(formatNote('abg 7.28/56/71/26,be -2')).toBe('abg       7.28/56/71/26, be -2');
    expect(formatNote('oxygen room   air')).toBe('oxygen    room air');
    expect(formatNote('o2 cannula 4L/min')).toBe('o2        cannula 4 L/min');
    expect(formatNote('oxygen niv ipap 18 epap 5')).toBe('oxygen    niv ipap 18, epap 5');
    expect(formatNote('oxygen venturi,fio2 28 %')).toBe('oxygen    venturi, fio2 28 %');
  });

  it('writes timepoints as `@ <time>  <label>` and never changes a label', () => {
    expect(formatNote('@day 1   07:40   arrival  on the ward')).toBe('@ day 1 07:40  arrival  on the ward');
    expect(formatNote('  @+2h30')).toBe('@ +2h30');
    expect(formatNote('@07:40 😀 naïve')).toBe('@ 07:40  😀 naïve');
  });

  it('never changes prose, spellings, case or decimal commas', () => {
    expect(formatNote('note    free   prose,  kept   ')).toBe('note      free   prose,  kept');
    expect(formatNote('VITALS HR 118, SpO2 89 PCT')).toBe('VITALS    HR 118, SpO2 89 PCT');
    expect(formatNote('abg  ph 7,35, pco2 41')).toBe('abg  ph 7,35, pco2 41'); // decimal comma: a syntax issue, the line is left alone
  });

  it('keeps a comma at the end of prose or a label', () => {
    expect(formatNote('note awaiting review, then')).toBe('note      awaiting review, then');
    expect(formatNote('note awaiting review, then,')).toBe('note      awaiting review, then,');
    expect(formatNote('@ day 1 08:00 arrival, then ward,')).toBe('@ day 1 08:00  arrival, then ward,');
    expect(formatNote('@ 09:00 bed 4,  # side room')).toBe('@ 09:00  bed 4,  # side room');
  });

  it('keeps a comma after the last item, and one after a time, glued to what it follows', () => {
    expect(formatNote('vitals hr 80 ,rr 18 ,')).toBe('vitals    hr 80, rr 18,');
    expect(formatNote('abg 7.28/56/71/26 kPa,  # later')).toBe('abg       7.28/56/71/26 kPa,  # later');
    expect(formatNote('oxygen room air ,')).toBe('oxygen    room air,');
    expect(formatNote('@ 08:00, arrival')).toBe('@ 08:00, arrival');
    expect(formatNote('@08:00 ,ward')).toBe('@ 08:00, ward');
    expect(formatNote('@ day 2 08:00 ,')).toBe('@ day 2 08:00,');
  });

  it('leaves a line with a full stop or a comma that separates nothing as it is (both are reported)', () => {
    const untouched = ['vitals hr 80.', 'vitals hr 80, rr 18.', 'vitals  temp 38.4 C.  # ok', 'vent mode VC.', ', vitals hr 80', 'vitals , hr 80', 'vitals hr 80,, rr 18', ',@ 08:00', '@, 08:00', 'note, settled', ',', 'patient ,', 'note ,', '@ 08:00.'];
    for (const line of untouched) expect(formatNote(line), line).toBe(line);
  });

  it('keeps a comment in its column when there is room, else two spaces after the content', () => {
    const aligned = `${'vitals hr 118'.padEnd(30)}# settled`;
    expect(formatNote(aligned)).toBe(`${'vitals    hr 118'.padEnd(30)}# settled`);
    expect(formatNote('vitals   hr 118 # settled   ')).toBe('vitals    hr 118  # settled');
    expect(formatNote('@ 07:40 arrival # 😀 first')).toBe('@ 07:40  arrival  # 😀 first');
  });

  it('leaves blank lines, comment-only lines and broken lines exactly as they are', () => {
    const untouched = ['', '   ', '\t', '  # just a comment   ', 'vitls hr 100   ', 'vitals hr, rr 18  ', 'abg 7.28/56/71/26/-2', '@ 25:10  handover ', 'vitals hr 88 120'];
    for (const line of untouched) expect(formatNote(line)).toBe(line);
  });

  it('keeps each line ending as written (LF, CRLF, CR, mixed) and a byte-order mark', () => {
    expect(formatNote('vitals hr 80\r\nabg po2 71\r\n')).toBe('vitals    hr 80\r\nabg       po2 71\r\n');
    expect(formatNote('vitals hr 80\rabg po2 71\nlabs na 140')).toBe('vitals    hr 80\rabg       po2 71\nlabs      na 140');
    expect(formatNote('\uFEFFvitals hr 80')).toBe('\uFEFFvitals    hr 80');
  });

  it('leaves the samples as they are (they are in the canonical layout)', () => {
    for (const file of readdirSync('samples').filter((f) => f.endsWith('.pneu'))) {
      const text = readFileSync(join('samples', file), 'utf8');
      expect(formatEdits(text), file).toEqual([]);
    }
  });
});

describe('minimal edits', () => {
  it('edits only the lines that change, and only the part that changes', () => {
    const text = note('patient   age 64 y', 'vitals hr 118', '', '# comment');
    const edits = formatEdits(text);
    expect(edits).toEqual([{ range: { start: { line: 1, character: 7 }, end: { line: 1, character: 7 } }, newText: '   ' }]);
    expect(applyEdits(text, edits)).toBe(formatNote(text));
  });

  it('never splits a surrogate pair', () => {
    const text = '@07:40 😀x';
    for (const e of formatEdits(text)) {
      const line = text;
      for (const c of [e.range.start.character, e.range.end.character]) {
        const before = line.charCodeAt(c - 1);
        expect(before >= 0xd800 && before <= 0xdbff, `edit at ${c}`).toBe(false);
      }
    }
  });

  it('formats only the requested lines', () => {
    const text = note('vitals hr 1', 'vitals hr 2', 'vitals hr 3');
    expect(formatEdits(text, { start: 1, end: 1 }).map((e) => e.range.start.line)).toEqual([1]);
  });

  it('formats requested lines as the whole-note formatter does, whatever the line endings, and past the end', () => {
    const text = 'vitals hr 1\r\nvitals hr 2\rvitals hr 3\n\uFEFFvitals hr 4\r\n\r\nvitals hr 6';
    const all = formatEdits(text);
    for (let start = 0; start <= 7; start++) {
      for (let end = start; end <= 8; end++) {
        expect(formatEdits(text, { start, end }), `${start}-${end}`).toEqual(all.filter((e) => e.range.start.line >= start && e.range.start.line <= end));
      }
    }
    expect(formatEdits('\uFEFFvitals hr 1', { start: 0, end: 0 })).toEqual(formatEdits('\uFEFFvitals hr 1'));
    expect(formatEdits(text, { start: 3, end: 2 })).toEqual([]);
    expect(formatEdits('', { start: 0, end: 3 })).toEqual([]);
  });
});

// ── properties ─────────────────────────────────────────────────────────

/** Characters that carry meaning: everything but blanks, whitespace and (unless `commas`) commas. */
function inked(line: string, commas = false): string {
  let out = '';
  for (const ch of line) if (!isBlank(ch.charCodeAt(0)) && !/\s/.test(ch) && (commas || ch !== ',')) out += ch;
  return out;
}

/** Whether `part` can be had from `whole` by leaving characters out (the formatter may add commas between items, never remove one). */
function isSubsequence(part: string, whole: string): boolean {
  let k = 0;
  for (let i = 0; i < whole.length && k < part.length; i++) if (whole[i] === part[k]) k++;
  return k === part.length;
}

function words(text: string): string[] {
  return text.split(/[\s\u00A0\uFEFF]+/).filter((w) => w.length > 0);
}

/**
 * What a line says, as a sorted list of tagged tokens: section word, keys, values, units,
 * prose and label words, time words, and the comment (without trailing blanks). A line with
 * syntax issues, a blank line and a comment-only line are compared whole, byte for byte.
 */
function meaning(node: LineNode): string[] {
  const comment = node.comment ? [`C:${node.comment.text.replace(/[\s\u00A0\uFEFF]+$/, '')}`] : [];
  if (node.issues.length > 0 || node.kind === 'blank' || node.kind === 'unknown') return [`RAW:${node.text}`];
  if (node.kind === 'timepoint') {
    return [...words(node.time?.text ?? '').map((w) => `T:${w}`), ...words(node.label?.text ?? '').map((w) => `L:${w}`), ...comment].sort();
  }
  const out = [`S:${node.sectionToken.text}`, ...comment, ...words(node.prose?.text ?? '').map((w) => `P:${w}`)];
  const units = new Set<unknown>(); // a shorthand's unit token is shared by its two pressures
  for (const item of node.items) {
    if (item.key) out.push(`K:${item.key.text}`);
    if (item.value) out.push(`V:${item.value.text}`);
    if (item.unit && !units.has(item.unit)) {
      units.add(item.unit);
      out.push(`U:${item.unit.text}`);
    }
  }
  return out.sort();
}

function endings(text: string): string[] {
  const { lines } = splitLines(text);
  return lines.map((l, i) => text.slice(l.offset + l.text.length, lines[i + 1]?.offset ?? text.length));
}

const notes = fc.oneof({ weight: 4, arbitrary: messyNote }, { weight: 1, arbitrary: anyText });

describe('formatter properties', () => {
  it(`is idempotent: format(format(x)) = format(x) (${FORMAT_RUNS} generated notes)`, () => {
    fc.assert(fc.property(notes, (text) => {
      const once = formatNote(text);
      expect(formatNote(once)).toBe(once);
    }), { numRuns: FORMAT_RUNS });
  });

  it(`never throws, and its edits are minimal, one per changed line and never overlapping (${FORMAT_RUNS} generated notes)`, () => {
    fc.assert(fc.property(notes, (text) => {
      const edits = formatEdits(text);
      expect(editsOverlap(edits)).toBe(false);
      const lines = edits.map((e) => e.range.start.line);
      expect(new Set(lines).size).toBe(lines.length);
      for (const e of edits) expect(e.range.end.line).toBe(e.range.start.line);
      expect(applyEdits(text, edits)).toBe(formatNote(text));
      const before = splitLines(text).lines;
      const after = splitLines(formatNote(text)).lines;
      before.forEach((l, i) => {
        if (!lines.includes(i)) expect(after[i]?.text).toBe(l.text);
        else expect(after[i]?.text).not.toBe(l.text);
      });
    }), { numRuns: FORMAT_RUNS });
  });

  it(`keeps every line's keys, values, units, comments, prose and label words, and its line ending (${FORMAT_RUNS} generated notes)`, () => {
    fc.assert(fc.property(notes, (text) => {
      const formatted = formatNote(text);
      const a = parseNote(text).lines;
      const b = parseNote(formatted).lines;
      expect(b.length).toBe(a.length);
      expect(endings(formatted)).toEqual(endings(text));
      a.forEach((node, i) => {
        const other = b[i]!;
        expect(meaning(other), `line ${i + 1}: ${JSON.stringify(node.text)} → ${JSON.stringify(other.text)}`).toEqual(meaning(node));
        expect(inked(other.text)).toBe(inked(node.text));
        expect(isSubsequence(inked(node.text, true), inked(other.text, true)), `a comma removed: ${JSON.stringify(node.text)} → ${JSON.stringify(other.text)}`).toBe(true);
        if (other.text !== node.text) expect(isBlank(other.text.charCodeAt(other.text.length - 1)), 'trailing blank').toBe(false);
      });
    }), { numRuns: FORMAT_RUNS });
  });

  it(`formats a span of lines as the whole-note formatter formats them (${FORMAT_RUNS} generated notes)`, () => {
    fc.assert(fc.property(notes, fc.nat(40), fc.nat(40), (text, a, b) => {
      const span = { start: Math.min(a, b), end: Math.max(a, b) };
      const whole = formatEdits(text).filter((e) => e.range.start.line >= span.start && e.range.start.line <= span.end);
      expect(formatEdits(text, span)).toEqual(whole);
    }), { numRuns: FORMAT_RUNS });
  });

  it(`does not change what the checks find on each line (${FORMAT_RUNS} generated notes)`, () => {
    // But for unusual blanks (PN107), which the formatter writes as plain ones: it may leave fewer, never more.
    const codesByLine = (text: string, unusual: boolean) => checkNote(text).findings.filter((f) => (f.code === 'PN107') === unusual).map((f) => `${f.range.start.line}:${f.code}`).sort();
    fc.assert(fc.property(messyNote, (text) => {
      const formatted = formatNote(text);
      expect(codesByLine(formatted, false)).toEqual(codesByLine(text, false));
      expect(codesByLine(formatted, true).length).toBeLessThanOrEqual(codesByLine(text, true).length);
    }), { numRuns: FORMAT_RUNS });
  });
});

describe('the canonical layout as grammar/README.md describes it ("The canonical layout")', () => {
  it('lays out the lines the spec quotes, leaves a line with a parser finding as it is, and lays out one with an unknown key', () => {
    const text = 'vitals hr 80 rr 18\n@ day 1 07:40 arrival\n@ 08:00 , arrival\nvitals spo2 89%\nabg 7,4/40/90/24\nvitals hr 80.\nvitals hrr 80   mmhgg\n';
    expect(formatNote(text).split('\n')).toEqual([
      'vitals    hr 80, rr 18', // items from column 11, joined by `, `
      '@ day 1 07:40  arrival', // two spaces before the label
      '@ 08:00, arrival', // a comma after the time kept, glued to it
      'vitals    spo2 89 %', // a known unit glued to its number written apart
      'abg 7,4/40/90/24', // a decimal comma (PN103): left as it is
      'vitals hr 80.', // a full stop that ends the items (PN105): left as it is
      'vitals    hrr 80 mmhgg', // an unknown key and an unknown unit (PN201, PN202) are laid out
      '',
    ]);
  });
});
