// The SpO2 target where people and programs read it: the hover on an SpO2 value (where it stands
// against the target in force), the hover on the target, completion of its key, and the CSV columns
// spo2_target_low_pct and spo2_target_high_pct read back. The targets: O'Driscoll BR, Howard LS,
// Earis J, Mak V, BTS guideline for oxygen use in adults in healthcare and emergency settings,
// Thorax 2017;72(Suppl 1):ii1–ii90 — 88–92 % and 94–98 % (read in its table 2 at thorax.bmj.com, December 2026). Invented notes only.
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { exportColumns, timepointRows, toCsv } from '../../server/src/core/export';
import { completionsAt, hoverAt } from '../../server/src/core/service';
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
    expect(markdown(note('9|0'))).toContain('SpO2 target: **within** target 88–92 % (in force since day 1 09:00, line 2).');
    expect(markdown(note('9|5'))).toContain('SpO2 target: **above** target 88–92 %');
    expect(markdown(note('8|5'))).toContain('SpO2 target: **below** target 88–92 %');
    expect(markdown(note('9|2'))).toContain('**within**');
  });

  it('names the setting\'s target where the note writes none, and says nothing with no target', () => {
    expect(markdown('@ day 1 09:00\nvitals spo2 9|5', { spo2Target: '94-98' })).toContain('SpO2 target: **within** target 94–98 % (the spo2Target setting\'s).');
    expect(markdown('@ day 1 09:00\nvitals spo2 9|5')).not.toContain('SpO2 target');
  });

  it('on the target itself, says it carries until another target is written', () => {
    expect(markdown('@ day 1 09:00\noxygen cannula 2, tar|get 88-92')).toContain('Carries forward: yes, until another target is written; a new device, room air and a `vent` line leave it in force.');
  });
});

describe('completion on an oxygen line', () => {
  it('offers the target by its key, after the device\'s own settings', () => {
    const { result, position } = noteAt('@ day 1 09:00\noxygen cannula 2, |');
    expect(completionsAt(result, position).map((c) => c.label)).toEqual(['fio2', 'spo2_target']);
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
});
