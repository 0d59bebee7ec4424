// An SpO2 target written on a patient or place line is PN201: the target belongs on an oxygen line
// (format rule, grammar/README.md: `target` is a key of oxygen lines, in force from where it is
// written). Its quick fix moves it to the oxygen line of the timepoint it applies to, or writes a new
// `oxygen target …` line where that timepoint has none, and leaves the line it was on well-formed.
// Applied through the core's code actions, as the editor applies them; the result is checked again,
// read (the target in force), and formatted (`pneumark fmt`): formatting it twice changes nothing more.
// Invented notes.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { applyEdits, codeActions, formatNote } from '../../server/src/core/service';
import { targetInForce } from '../../server/src/core/analysis/spo2-target';

/** The PN201 finding of `target` and the move it is offered (null where none is). */
function move(text: string) {
  const result = checkNote(text);
  const finding = result.findings.find((f) => f.code === 'PN201' && f.message.startsWith('`target`') || f.code === 'PN201' && f.message.startsWith('`spo2_target`'));
  if (!finding) throw new Error('no PN201 of a target');
  const action = codeActions(result, finding.range).find((a) => a.title.startsWith('Move `'));
  return action ? { title: action.title, text: applyEdits(text, action.edits), preferred: action.preferred === true } : null;
}

const codes = (text: string) => checkNote(text).findings.map((f) => f.code);
/** The target written in force at timepoint `tp` (`88–92`), or null (the `spo2Target` setting is `none` by default). */
const targetAt = (text: string, tp = 0) => {
  const result = checkNote(text);
  const target = targetInForce(result.analysis.timeline.timepoints[tp]!.values, result.settings);
  return target === null || target.input === null ? null : `${target.lowPct}–${target.highPct}`;
};

describe('a target on a patient or place line, moved to an oxygen line', () => {
  it('to the first oxygen line of the first timepoint, the patient line keeping its commas', () => {
    const text = 'patient   age 70 y, target 88-92 %, sex male\n@ 08:00\noxygen    cannula 2 L/min\nvitals    spo2 90 %\n';
    const m = move(text)!;
    expect(m.title).toBe('Move `target 88-92 %` to the oxygen line (line 3)');
    expect(m.preferred).toBe(false);
    expect(m.text).toBe('patient   age 70 y, sex male\n@ 08:00\noxygen    cannula 2 L/min, target 88-92 %\nvitals    spo2 90 %\n');
    // Before: PN201 on `target`, PN105 on the `%` a patient line cannot read. After: neither.
    expect(codes(text)).toEqual(expect.arrayContaining(['PN201', 'PN105']));
    expect(codes(m.text)).toEqual([]);
    expect(targetAt(m.text)).toBe('88–92');
  });

  it('first on its line: the comma and blank after it go with it; last: the comma before it', () => {
    const first = move('patient   target 94-98, age 50 y\n@ 08:00\noxygen    mask 6 L/min\n')!;
    expect(first.text).toBe('patient   age 50 y\n@ 08:00\noxygen    mask 6 L/min, target 94-98\n');
    const last = move('place     altitude 1200 m, target 94–98 %\n@ 08:00\noxygen    mask 6 L/min\n')!;
    expect(last.text).toBe('place     altitude 1200 m\n@ 08:00\noxygen    mask 6 L/min, target 94–98 %\n');
  });

  it('alone on its line: the line goes', () => {
    const m = move('patient   age 50 y\nplace     target 88-92\n@ 08:00\noxygen    cannula 1 L/min\n')!;
    expect(m.text).toBe('patient   age 50 y\n@ 08:00\noxygen    cannula 1 L/min, target 88-92\n');
  });

  it('a trailing comment stays in its column (the editor keeps it, as for every fix)', () => {
    const text = 'patient   age 70 y, target 88-92     # from the clinic letter\n@ 08:00\noxygen    cannula 2 L/min   # nasal\n';
    const m = move(text)!;
    expect(m.text).toBe('patient   age 70 y                   # from the clinic letter\n@ 08:00\noxygen    cannula 2 L/min, target 88-92  # nasal\n');
    expect(codes(m.text)).toEqual([]);
  });

  it('no oxygen line at that timepoint: a new `oxygen target …` line right after the `@` line', () => {
    const text = 'patient   age 70 y, target 88-92\n@ 08:00\nvitals    spo2 90 %, rr 18\n@ 09:00\noxygen    cannula 2 L/min\n';
    const m = move(text)!;
    expect(m.title).toBe('Move `target 88-92` to a new oxygen line (`oxygen target 88-92`) after line 2');
    expect(m.text).toBe('patient   age 70 y\n@ 08:00\noxygen    target 88-92\nvitals    spo2 90 %, rr 18\n@ 09:00\noxygen    cannula 2 L/min\n');
    expect(codes(m.text)).toEqual([]);
    expect(targetAt(m.text, 0)).toBe('88–92');
    // In force through the change of device at 09:00.
    expect(targetAt(m.text, 1)).toBe('88–92');
  });

  it('the `@` line last in the note, with no line end: the new line after it', () => {
    const m = move('patient   target 88-92, age 70 y\n@ 08:00')!;
    expect(m.text).toBe('patient   age 70 y\n@ 08:00\noxygen    target 88-92');
  });

  it('in CRLF notes, in CRLF', () => {
    const m = move('patient   age 70 y, target 88-92\r\n@ 08:00\r\nvitals    spo2 90 %\r\n')!;
    expect(m.text).toBe('patient   age 70 y\r\n@ 08:00\r\noxygen    target 88-92\r\nvitals    spo2 90 %\r\n');
  });

  it('a patient line inside a timepoint: to the oxygen line of that timepoint', () => {
    const text = '@ 08:00\noxygen    room air\n@ 10:00\npatient   age 70 y, target 88-92\noxygen    cannula 2 L/min\n';
    const m = move(text)!;
    expect(m.text).toBe('@ 08:00\noxygen    room air\n@ 10:00\npatient   age 70 y\noxygen    cannula 2 L/min, target 88-92\n');
    expect(targetAt(m.text, 0)).toBeNull();
    expect(targetAt(m.text, 1)).toBe('88–92');
  });

  it('the key `spo2_target` too', () => {
    expect(move('patient   spo2_target 88-92, age 70 y\n@ 08:00\noxygen    cannula 2 L/min\n')!.text).toBe('patient   age 70 y\n@ 08:00\noxygen    cannula 2 L/min, spo2_target 88-92\n');
  });

  it('not offered where that oxygen line already states a target, nor where no timepoint follows', () => {
    expect(move('patient   age 70 y, target 88-92\n@ 08:00\noxygen    cannula 2 L/min, target 94-98\n')).toBeNull();
    expect(move('patient   age 70 y, target 88-92\n')).toBeNull();
  });

  it('a key of another line on a vitals line is not offered the move (only patient and place lines)', () => {
    const result = checkNote('@ 08:00\nvitals    spo2 90 %, target 88-92\n');
    const f = result.findings.find((x) => x.code === 'PN201')!;
    expect(codeActions(result, f.range).some((a) => a.title.startsWith('Move `'))).toBe(false);
  });
});

describe('the moved note under `pneumark fmt`', () => {
  const CASES = [
    'patient age 70 y, target 88-92 %, sex male\n@ 08:00\noxygen cannula 2 L/min\nvitals spo2 90 %\n',
    'patient   age 70 y, target 88-92\n@ 08:00\nvitals    spo2 90 %, rr 18\n',
    'patient target 88-92 # letter\n@ 08:00\noxygen nc 2   # nasal\n',
    'place     altitude 1200 m, target 94-98\n@ 08:00\n',
  ];

  it.each(CASES)('formats to a fixed point, with the target on its oxygen line: %j', (text) => {
    const m = move(text)!;
    const once = formatNote(m.text);
    expect(formatNote(once)).toBe(once);
    expect(codes(once).filter((c) => c === 'PN201' || c === 'PN105')).toEqual([]);
    expect(targetAt(once)).not.toBeNull();
  });

  it('a note in the canonical layout stays in it once moved (formatting changes nothing)', () => {
    const text = 'patient   age 70 y, target 88-92 %, sex male\n@ 08:00\noxygen    cannula 2 L/min\n';
    expect(formatNote(text.replace(', target 88-92 %', ''))).toBe(text.replace(', target 88-92 %', ''));
    const m = move(text)!;
    expect(formatNote(m.text)).toBe(m.text);
    const created = move('patient   age 70 y, target 88-92\n@ 08:00\nvitals    spo2 90 %\n')!;
    expect(formatNote(created.text)).toBe(created.text);
  });
});
