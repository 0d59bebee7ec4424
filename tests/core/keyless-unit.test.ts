// A number written with its unit and no key, as a hurried note writes oxygen (`oxygen 4 L/min`,
// "on 4 litres"): where one key of the line's section alone takes that unit, the line has one
// finding over the number and its unit (PN105), not one for the number and another for the unit
// read as an unknown key (PN201), with a fix that writes the key. Where several keys take the unit
// (`cmH2O` on a vent line), nothing is guessed. Common practice, no source: the format's own rule.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { applyEdits, codeActions } from '../../server/src/core/service';

const at = '@ day 1 08:00\n';
function findings(line: string) {
  return checkNote(at + line).findings.map((f) => ({ code: f.code, from: f.range.start.character, to: f.range.end.character, message: f.message }));
}
function fixed(line: string): string[] {
  const result = checkNote(at + line);
  return result.findings.flatMap((f) => codeActions(result, f.range).filter((a) => a.kind === 'quickfix' && a.preferred === true).map((a) => applyEdits(at + line, a.edits).split('\n')[1]!));
}

describe('a number with a unit and no key', () => {
  it('`oxygen 4 L/min` is one finding over `4 L/min`, with `flow` offered', () => {
    expect(findings('oxygen 4 L/min')).toEqual([{ code: 'PN105', from: 7, to: 14, message: '`4 L/min` has no key; the only key of this line that takes its unit is `flow`: write `flow 4 L/min`.' }]);
    expect(fixed('oxygen 4 L/min')).toEqual(['oxygen flow 4 L/min']);
  });

  it('a glued unit, another spelling, and after a comma that ends a device', () => {
    expect(findings('oxygen 4lpm').map((f) => [f.code, f.from, f.to])).toEqual([['PN105', 7, 11]]);
    expect(fixed('oxygen cannula, 2 L/min')).toEqual(['oxygen cannula, flow 2 L/min']);
  });

  it('`vent 450 mL` offers `vt`; `vitals 37.2 C` offers `temp`', () => {
    expect(fixed('vent 450 mL')).toEqual(['vent vt 450 mL']);
    expect(fixed('vitals 37.2 C')).toEqual(['vitals temp 37.2 C']);
  });

  it('a unit several keys take is not guessed: `vent 5 cmH2O` keeps its two findings, with no fix', () => {
    expect(findings('vent 5 cmH2O').map((f) => f.code)).toEqual(['PN105', 'PN201']);
    expect(fixed('vent 5 cmH2O')).toEqual([]);
  });

  it('the line fixed reads the value: the flow of the cannula in force is updated', () => {
    const text = '@ day 1 08:00\noxygen cannula 2 L/min\n@ 10:00\noxygen flow 4 L/min\n';
    const tp = checkNote(text).analysis.timeline.timepoints[1]!;
    expect(tp.values.numberOf('o2_flow')).toBe(4);
    expect(tp.values.wordOf('device')).toBe('cannula');
  });

  // Cardiac output is the only key of a vitals line in L/min, but a bare flow there is far more
  // often an oxygen flow written in the wrong section (`vitals 4 L/min`, "on 4 litres") than a
  // cardiac output, which is measured only with a monitor that gives it (common practice, no
  // source): the oxygen line is offered first, `co` second, neither preferred (a guess either way).
  const titles = (line: string) => {
    const result = checkNote(at + line);
    return result.findings.flatMap((f) => codeActions(result, f.range).filter((a) => a.kind === 'quickfix').map((a) => `${a.title}${a.preferred === true ? ' (preferred)' : ''}`));
  };
  const applied = (line: string, title: string) => {
    const result = checkNote(at + line);
    const action = result.findings.flatMap((f) => codeActions(result, f.range)).find((a) => a.title === title);
    return action === undefined ? null : applyEdits(at + line, action.edits).split('\n')[1]!;
  };

  it('`vitals 4 L/min` says it is likely an oxygen flow, and offers the oxygen line first and `co` second', () => {
    expect(findings('vitals 4 L/min')).toEqual([{ code: 'PN105', from: 7, to: 14, message: '`4 L/min` has no key; a flow in L/min on a vitals line is more likely an oxygen flow written in the wrong section than a cardiac output: write it on an oxygen line, `oxygen flow 4 L/min`, or as `co 4 L/min` if it is a cardiac output.' }]);
    expect(titles('vitals 4 L/min')).toEqual(['Make this an oxygen line: `oxygen flow 4 L/min`', 'Write `co 4 L/min`']);
    expect(fixed('vitals 4 L/min')).toEqual([]);
    expect(applied('vitals 4 L/min', 'Make this an oxygen line: `oxygen flow 4 L/min`')).toBe('oxygen flow 4 L/min');
    expect(applied('vitals 4 L/min', 'Write `co 4 L/min`')).toBe('vitals co 4 L/min');
  });

  it('the oxygen line made reads the flow, keeps a comment in its column, and takes any name of the section', () => {
    const text = `${at}oxygen    cannula 2 L/min\n@ 10:00\nvitals    4 L/min        # on arrival\n`;
    const result = checkNote(text);
    const action = result.findings.flatMap((f) => codeActions(result, f.range)).find((a) => a.title.startsWith('Make this an oxygen line'))!;
    const after = applyEdits(text, action.edits);
    expect(after.split('\n')[3]).toBe('oxygen    flow 4 L/min   # on arrival');
    const tp = checkNote(after).analysis.timeline.timepoints[1]!;
    expect(tp.values.numberOf('o2_flow')).toBe(4);
    expect(tp.values.wordOf('device')).toBe('cannula');
    expect(applied('obs 3 lpm', 'Make this an oxygen line: `oxygen flow 3 lpm`')).toBe('oxygen flow 3 lpm');
  });

  it('among other items the message says the same; only `co` is offered, not preferred', () => {
    expect(findings('vitals hr 80, 4 L/min, spo2 94')).toEqual([{ code: 'PN105', from: 14, to: 21, message: '`4 L/min` has no key; a flow in L/min on a vitals line is more likely an oxygen flow written in the wrong section than a cardiac output: write it on an oxygen line, `oxygen flow 4 L/min`, or as `co 4 L/min` if it is a cardiac output.' }]);
    expect(titles('vitals hr 80, 4 L/min, spo2 94')).toEqual(['Write `co 4 L/min`']);
  });

  it('beside a cardiac output already written, it is not read, and the oxygen line is named', () => {
    expect(findings('vitals co 5 L/min, 4 L/min').map((f) => f.message)).toEqual(['`4 L/min` has no key and is not read; a flow in L/min on a vitals line is more likely an oxygen flow written in the wrong section: write it on an oxygen line, `oxygen flow 4 L/min` (the line gives its cardiac output already).']);
    expect(titles('vitals co 5 L/min, 4 L/min')).toEqual([]);
  });
});
