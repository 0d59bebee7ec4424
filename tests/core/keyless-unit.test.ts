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
});
