// A snippet's placeholders left unfilled (Pneumark's snippets write a value's placeholder in angle
// brackets: `<VT>`, `<sys>/<dia>`, a shorthand gas `<pH>/<PaCO2>/<PaO2>/<HCO3>`): one PN102 finding
// each, the unit after it included, where the words used to give a key without a value, a stray word
// and a unit read as a key. A format rule of Pneumark's own: no source applies.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';

const errors = (line: string) => checkNote(`@ 08:00\n${line}`).findings
  .filter((f) => f.severity === 'error' || f.severity === 'warning')
  .map((f) => ({ code: f.code, message: f.message, from: f.range.start.character, to: f.range.end.character }));

describe('a placeholder left unfilled', () => {
  it('after its key: one finding over the key, the placeholder and its unit', () => {
    expect(errors('vent      vt <VT> mL, rate 14')).toEqual([
      { code: 'PN102', message: '`vt` has no value: `<VT>` is a placeholder left unfilled; write the value in its place.', from: 10, to: 20 },
    ]);
  });

  it('after its key, joined by a slash: one finding that names them', () => {
    expect(errors('vitals    bp <sys>/<dia>, hr 80')).toEqual([
      { code: 'PN102', message: '`bp` has no value: `<sys>/<dia>` holds placeholders left unfilled; write the values in their places.', from: 10, to: 24 },
    ]);
  });

  it('with no key (a device\'s flow, a shorthand gas begun): one finding, its unit included', () => {
    expect(errors('oxygen    cannula <flow> L/min')).toEqual([
      { code: 'PN102', message: '`<flow>` is a placeholder left unfilled; write the value in its place.', from: 18, to: 30 },
    ]);
    expect(errors('abg       7.31/<PaCO2>/<PaO2>/<HCO3> kPa').map((e) => [e.code, e.message])).toEqual([
      ['PN102', '`7.31/<PaCO2>/<PaO2>/<HCO3>` holds placeholders left unfilled; write the values in their places.'],
    ]);
  });

  it('leaves the other values of the line read', () => {
    const tp = checkNote('@ 08:00\nvent      vt <VT> mL, rate 14, peep 8').analysis.timeline.timepoints[0]!;
    expect(tp.values.get('vent_rate')?.stated.value).toBe(14);
    expect(tp.values.get('peep')?.stated.value).toBe(8);
    expect(tp.values.get('vt')?.stated.value ?? null).toBeNull();
  });

  it('is only a word in angle brackets: `<2` and `< 88` are read as before, as is a word with no brackets', () => {
    for (const line of ['labs      lactate <2', 'vitals    spo2 < 88', 'vent      vt VT mL']) {
      expect(errors(line).some((e) => /placeholder/.test(e.message)), line).toBe(false);
      expect(errors(line).length, line).toBeGreaterThan(0);
    }
  });
});
