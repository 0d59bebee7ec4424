// The SpO2 target where people and programs read it: the hover on an SpO2 value (where it stands
// against the target in force), the hover on the target, completion of its key, and the CSV columns
// spo2_target_low_pct and spo2_target_high_pct read back. The targets: O'Driscoll BR, Howard LS,
// Earis J, Mak V, BTS guideline for oxygen use in adults in healthcare and emergency settings,
// Thorax 2017;72(Suppl 1):ii1–ii90 — 88–92 % and 94–98 % (read in its table 2 at thorax.bmj.com, December 2026). Invented notes only.
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { exportColumns, timepointRows, toCsv } from '../../server/src/core/export';
import { applyEdits, completionsAt, formatNote, hoverAt } from '../../server/src/core/service';
import { noteAt } from './cursor';

const plain = { redactProse: false, shiftDays: 0 } as const;

function markdown(marked: string, settings = {}): string {
  const { result, position } = noteAt(marked, settings);
  return hoverAt(result, position)?.markdown ?? '';
}

describe('the hover on an SpO2 value', () => {
  const note = (spo2: string) => `@ day 1 09:00\noxygen cannula 2 L/min, target 88-92\n@ 10:00\nvitals spo2 ${spo2}`;

  it('says where it stands against the target in force, and where the target comes from', () => {
    // 90 % is within 88–92 %, 95 % above it, 85 % below it (the ends belong to the range).
    expect(markdown(note('9|0'))).toContain('SpO2 target: **within** 88–92 % (in force since day 1 09:00, line 2).');
    expect(markdown(note('9|5'))).toContain('SpO2 target: **above** 88–92 %');
    expect(markdown(note('8|5'))).toContain('SpO2 target: **below** 88–92 %');
    expect(markdown(note('9|2'))).toContain('**within**');
  });

  it('names the setting\'s target where the note writes none, and says nothing with no target', () => {
    expect(markdown('@ day 1 09:00\nvitals spo2 9|5', { spo2Target: '94-98' })).toContain('SpO2 target: **within** 94–98 % (the spo2Target setting\'s).');
    expect(markdown('@ day 1 09:00\nvitals spo2 9|5')).not.toContain('SpO2 target');
  });

  it('on the target itself, says it carries until another target is written', () => {
    expect(markdown('@ day 1 09:00\noxygen cannula 2, tar|get 88-92')).toContain('Carries forward: yes, until another target is written; a new device, room air and a `vent` line leave it in force.');
  });
});

describe('a target written with blanks around its dash, or with a decimal end', () => {
  it('hovers as the range it is read as, on its key and on its numbers', () => {
    for (const marked of ['@ day 1 09:00\noxygen cannula 2, tar|get 88 - 92 %', '@ day 1 09:00\noxygen cannula 2, target 8|8 – 92', '@ day 1 09:00\noxygen cannula 2, target 88 – 9|2']) {
      const md = markdown(marked);
      expect(md, marked).toContain('SpO2 target');
      expect(md, marked).toContain('88–92 %');
      expect(md, marked).toContain('Carries forward: yes, until another target is written');
    }
  });

  it('is written `88-92` by the formatter, which reads back as the same range', () => {
    const text = '@ day 1 09:00\noxygen    cannula 2 L/min, target 88 – 92 %\noxygen    target 88 -92\noxygen    target 88–92';
    const formatted = formatNote(text);
    expect(formatted.split('\n').slice(1)).toEqual(['oxygen    cannula 2 L/min, target 88-92 %', 'oxygen    target 88-92', 'oxygen    target 88-92']);
    expect(formatNote(formatted)).toBe(formatted);
  });

  it('on an SpO2 under a target written before the first timepoint (no time), says the line as PN327 does', () => {
    expect(markdown('oxygen target 88-92\n@ day 1 09:00\noxygen cannula 2\nvitals spo2 9|5')).toContain('SpO2 target: **above** 88–92 % (in force since line 1).');
  });

  it('on an SpO2 beside a decimal target, the hover gives the ends as written, not rounded', () => {
    expect(markdown('@ day 1 09:00\noxygen cannula 2, target 88.5-92\nvitals spo2 8|8')).toContain('SpO2 target: **below** 88.5–92 % (written on line 2).');
  });

  it('a decimal target\'s quick fix writes the rounded range, after which nothing is reported', () => {
    const text = '@ day 1 09:00\noxygen cannula 2, target 88.5-92';
    const r = checkNote(text);
    const fix = r.findings.find((f) => f.code === 'PN302')!.fixes![0]!;
    const fixed = applyEdits(text, fix.edits);
    expect(fixed).toBe('@ day 1 09:00\noxygen cannula 2, target 89-92');
    expect(checkNote(fixed).findings).toEqual([]);
  });
});

describe('completion on an oxygen line', () => {
  it('offers the target by its short key, as the format\'s other keys are offered (`co`, not `cardiac_output`), after the device\'s own settings', () => {
    const { result, position } = noteAt('@ day 1 09:00\noxygen cannula 2, |');
    expect(completionsAt(result, position).map((c) => c.label)).toEqual(['fio2', 'target']);
  });

  it('completes `tar` to `target`, which reads a range typed after it', () => {
    const { result, position } = noteAt('@ day 1 09:00\noxygen cannula 2, tar|');
    const offered = completionsAt(result, position);
    expect(offered.map((c) => c.label)).toEqual(['target']);
    expect(offered[0]!.detail).toBe('SpO2 target · %');
    const text = applyEdits('@ day 1 09:00\noxygen cannula 2, tar', [{ range: offered[0]!.replace!, newText: offered[0]!.insertText }]);
    expect(text).toBe('@ day 1 09:00\noxygen cannula 2, target');
    expect(checkNote(`${text} 88-92`).findings).toEqual([]);
  });

  it('still reads the long key, which completion no longer offers', () => {
    expect(checkNote('@ day 1 09:00\noxygen cannula 2, spo2_target 88-92').findings).toEqual([]);
  });
});

describe('the CSV columns of the target', () => {
  it('give its two ends at each timepoint it is in force, carried too, and read back', () => {
    const text = '@ day 1 09:00\noxygen cannula 2 L/min\n@ 10:00\noxygen target 88-92\n@ 11:00\noxygen room air\nvitals spo2 93';
    const csv = toCsv(exportColumns(), timepointRows('a.pneu', checkNote(text), plain));
    const rows = parse(csv, { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => [r.spo2_target_low_pct, r.spo2_target_high_pct])).toEqual([['', ''], ['88', '92'], ['88', '92']]);
    // The last two columns, after every earlier one.
    expect(exportColumns().slice(-2).map((c) => c.name)).toEqual(['spo2_target_low_pct', 'spo2_target_high_pct']);
  });

  it('give the setting\'s target where the note writes none, and nothing for a target not used', () => {
    const rows = (text: string, settings = {}) => (parse(toCsv(exportColumns(), timepointRows('a.pneu', checkNote(text, settings), plain)), { columns: true }) as Record<string, string>[])
      .map((r) => [r.spo2_target_low_pct, r.spo2_target_high_pct]);
    expect(rows('@ day 1 09:00\nvitals spo2 93', { spo2Target: '92-96' })).toEqual([['92', '96']]);
    expect(rows('@ day 1 09:00\noxygen cannula 2, target 92-88')).toEqual([['', '']]);
  });

  it('give a range written with blanks as its ends, and a decimal end as written (PN302 says it)', () => {
    const rows = (text: string) => (parse(toCsv(exportColumns(), timepointRows('a.pneu', checkNote(text), plain)), { columns: true }) as Record<string, string>[])
      .map((r) => [r.spo2_target_low_pct, r.spo2_target_high_pct]);
    expect(rows('@ day 1 09:00\noxygen cannula 2, target 88 – 92 %')).toEqual([['88', '92']]);
    expect(rows('@ day 1 09:00\noxygen cannula 2, target 88.5-92')).toEqual([['88.5', '92']]);
  });
});
