// Blanks other than a space or a tab (PN107): read as blanks, reported lightly where they separate
// what a line says, with a safe fix that writes a plain space. The rule is the format's own
// (grammar/README.md, blanks.ts); common practice, no source.
import { describe, expect, it } from 'vitest';
import { BLANKS, checkNote, isPlainBlank } from '../../server/src/core';
import { applyEdits } from '../../server/src/core/service';
import type { Finding } from '../../server/src/core/types';

const unusual = (text: string): Finding[] => checkNote(text).findings.filter((f) => f.code === 'PN107');

/** The text with the first fix of each finding applied (one line each, so offsets do not move between findings of different lines). */
function fixed(text: string): string {
  const lines = text.split('\n');
  const edits = unusual(text).flatMap((f) => f.fixes[0]!.edits).sort((a, b) => b.range.start.character - a.range.start.character);
  for (const e of edits) {
    const line = lines[e.range.start.line]!;
    lines[e.range.start.line] = line.slice(0, e.range.start.character) + e.newText + line.slice(e.range.end.character);
  }
  return lines.join('\n');
}

describe('unusual blanks (PN107)', () => {
  it('fires for every blank but a space and a tab, at information level, naming it', () => {
    for (const { code, name } of BLANKS) {
      const findings = unusual(`@ 08:00\nvitals    hr${String.fromCharCode(code)}80\n`);
      if (isPlainBlank(code)) {
        expect(findings, name).toEqual([]);
        continue;
      }
      expect(findings.map((f) => [f.severity, f.range.start.line, f.range.start.character, f.range.end.character]), name).toEqual([['information', 1, 12, 13]]);
      expect(findings[0]!.message, name).toContain(`${name} (U+${code.toString(16).toUpperCase().padStart(4, '0')})`);
      expect(findings[0]!.fixes.map((f) => [f.title, f.preferred, f.edits[0]!.newText]), name).toEqual([['Write a plain space', true, ' ']]);
    }
  });

  it('reads the line as if plain spaces were written: the fix changes no value', () => {
    const text = '@ 08:00\nvitals\u00a0hr\u2009 80,\u202frr 18\u3000bpm\nabg       po2 71\u00a0mm\u2009Hg, pco2 40\n';
    const before = checkNote(text).findings.filter((f) => f.code !== 'PN107');
    const after = fixed(text);
    expect(after).toBe('@ 08:00\nvitals hr 80, rr 18 bpm\nabg       po2 71 mm Hg, pco2 40\n');
    expect(unusual(after)).toEqual([]);
    expect(checkNote(after).findings.map((f) => f.code)).toEqual(before.map((f) => f.code));
  });

  it('removes a blank where a plain one is next to it or nothing comes before or after it', () => {
    const text = '@ 08:00\n\u00a0vitals hr 80\u2009\nvitals    rr 18 \u202f\n';
    expect(unusual(text).map((f) => f.fixes[0]!.title)).toEqual(['Remove the unusual blank', 'Remove the unusual blank', 'Remove the unusual blank']);
    expect(fixed(text)).toBe('@ 08:00\nvitals hr 80\nvitals    rr 18 \n');
  });

  it('writes a plain space for a line of unusual blanks alone, so no line end joins the next (a lone CR before it)', () => {
    // Removing the blank would leave `\r\n`: one line end of two, and a line fewer.
    const text = '@07:40\r\ufeff\n';
    expect(unusual(text).map((f) => f.fixes[0]!.title)).toEqual(['Write a plain space']);
    const after = applyEdits(text, unusual(text).flatMap((f) => f.fixes[0]!.edits));
    expect(after).toBe('@07:40\r \n');
    expect(checkNote(after).analysis.tree.lines).toHaveLength(checkNote(text).analysis.tree.lines.length);
    expect(fixed('@ 08:00\n\u00a0\u2009\nvitals hr 80\n')).toBe('@ 08:00\n \nvitals hr 80\n');
  });

  it('gives a run of unusual blanks one finding, with each kind named once', () => {
    const findings = unusual('@ 08:00\nvitals    hr\u00a0\u00a0\u2009118\n');
    expect(findings).toHaveLength(1);
    expect(findings[0]!.message).toMatch(/^3 unusual blanks \(no-break space \(U\+00A0\), thin space \(U\+2009\)\)/u);
  });

  it('looks at the time of a timepoint and the gap before free text, not at comments, prose or labels', () => {
    const text = [
      '@\u00a0day 1 08:00\u2009handover\u00a0done',
      'note      feels\u00a0better',
      'note\u00a0calmer',
      'vitals    hr 80  # a\u00a0comment',
    ].join('\n');
    expect(unusual(text).map((f) => [f.range.start.line, f.range.start.character])).toEqual([[0, 1], [0, 13], [2, 4]]);
  });

  it('leaves the byte-order mark that opens a note alone, and reports one anywhere else', () => {
    expect(unusual('\ufeff@ 08:00\nvitals    hr 80\n')).toEqual([]);
    const inside = unusual('@ 08:00\n\ufeffvitals    hr 80\nvitals    hr\ufeff82\n');
    expect(inside.map((f) => [f.range.start.line, f.range.start.character])).toEqual([[1, 0], [2, 12]]);
    expect(inside[1]!.message).toContain('byte-order mark');
  });

  it('is silent on notes written with spaces and tabs', () => {
    expect(unusual('patient\tage 60 y\n@ 08:00\nvitals\thr 80,\trr 18\n')).toEqual([]);
  });
});
