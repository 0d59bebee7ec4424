// The S/F ratio tracks the P/F ratio only where SpO2 is 97 % or less (Rice TW, Wheeler AP, Bernard
// GR, Hayden DL, Schoenfeld DA, Ware LB. Comparison of the SpO2/FIO2 ratio and the PaO2/FIO2 ratio
// in patients with acute lung injury or ARDS. Chest 2007;132(2):410–417, the limit read in its
// abstract). Above it the ratio is still worked out, as its hover and JSON note said; `show` and the
// inlay hint now say so beside the number too, where a reader of the number alone would miss it.
// Invented values.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { besideCaveat } from '../../server/src/core/derive/model';
import { inlayHints } from '../../server/src/core/service';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';

const note = (spo2: number) => `patient age 50 y\n@ 08:00\noxygen hfnc 40 L/min, fio2 0.4\nvitals rr 22, spo2 ${spo2} %\n`;

const sf = (spo2: number) => checkNote(note(spo2)).analysis.derivation(0).derived.find((d) => d.id === 'sf_ratio')!;
const oxygenationHints = (spo2: number) => {
  const result = checkNote(note(spo2));
  return inlayHints(result, { start: 0, end: result.analysis.tree.lines.length - 1 }, { categories: new Set(['oxygenation']) }).map((h) => h.label);
};

describe('an S/F ratio from an SpO2 above 97 %', () => {
  it('carries the caveat "SpO2 > 97 %" with its note; at 97 % and below none', () => {
    // 99 ÷ 0.4 = 247.5, shown 248; 97 ÷ 0.4 = 242.5.
    expect([sf(99).value, sf(99).caveat, sf(99).notes]).toEqual([247.5, 'SpO2 > 97 %', ['SpO2 above 97 %: the S/F ratio no longer tracks P/F (Rice 2007)']]);
    expect([sf(97).value, sf(97).caveat, sf(97).notes]).toEqual([242.5, null, []]);
  });

  it('says it beside the number in the inlay hint', () => {
    // 99 ÷ 0.4 ÷ 22 = 11.25 (ROX, Roca 2016: SpO2 ÷ FiO2 ÷ RR); 97 ÷ 0.4 = 242.5, shown 243.
    // High flow from the note's first timepoint: the ROX says its start is not in the note.
    expect(oxygenationHints(99)).toEqual(['S/F 248 (SpO2 > 97 %) · ROX 11.25 (start of high flow not in the note)']);
    expect(oxygenationHints(97)).toEqual(['S/F 243 · ROX 11.02 (start of high flow not in the note)']);
  });

  it('says it beside the number in `pneumark show`', async () => {
    const io = memoryIo({ stdin: note(99), env: { NO_COLOR: '1' }, tty: false });
    await run(['show', '-'], io);
    expect(io.out()).toContain(' S/F 248 (SpO2 > 97 %) · ');
  });
});

describe('a caveat is written beside a value in one way (`besideCaveat`), in `show` as in the inlay hint', () => {
  it('in parentheses after the text, or the text alone where there is none; after nothing, the caveat alone after a blank', () => {
    expect(besideCaveat('S/F 248', sf(99))).toBe('S/F 248 (SpO2 > 97 %)');
    expect(besideCaveat('S/F 243', sf(97))).toBe('S/F 243');
    expect(besideCaveat('', sf(99))).toBe(' (SpO2 > 97 %)');
    expect(besideCaveat('*', { caveat: '6 h: < 3.47' })).toBe('* (6 h: < 3.47)');
  });

  it('the hint and `show` write the same words around the same number', async () => {
    const io = memoryIo({ stdin: note(99), env: { NO_COLOR: '1' }, tty: false });
    await run(['show', '-'], io);
    const hint = oxygenationHints(99)[0]!.split(' · ')[0]!;
    expect(hint).toBe(besideCaveat('S/F 248', sf(99)));
    expect(io.out()).toContain(` ${hint} · `);
  });
});
