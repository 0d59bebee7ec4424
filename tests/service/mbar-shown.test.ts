// Airway pressures written in mbar are shown in cmH2O with a decimal more than written, since the
// two units are only about 2 % apart: 1 mbar = 100 Pa, 1 cmH2O = 98.0665 Pa (the units' definitions,
// cross-checked below with @lhncbc/ucum-lhc, a general-purpose UCUM library: `mbar` to `cm[H2O]`).
// Shown to as many decimals as written, 25 mbar would read "25 cmH2O" and 10 mbar "10 cmH2O", and a
// driving pressure of 15.3 cmH2O worked out from them would look like a wrong sum.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { hoverAt } from '../../server/src/core/service';
import { formatStated } from '../../server/src/core/present';
import { noteAt } from './cursor';
import { UcumLhcUtils } from '@lhncbc/ucum-lhc';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';

/** `value` mbar in cmH2O by the UCUM library, rounded as the expectation is written. */
function ucumCmh2o(value: number, decimals: number): string {
  const r = UcumLhcUtils.getInstance().convertUnitTo('mbar', value, 'cm[H2O]');
  if (r.status !== 'succeeded' || r.toVal === null) throw new Error(`UCUM: ${r.msg.join('; ')}`);
  return r.toVal.toFixed(decimals);
}

const NOTE = '@ 08:00\nvent mode VC, vt 450 mL, rate 16, plateau 25 mbar, peep 10 mbar, fio2 0.4';

describe('airway pressures in mbar, shown in cmH2O', () => {
  const values = checkNote(NOTE).analysis.timeline.timepoints[0]!.values;

  it('are shown with one decimal more than written, so their difference adds up', () => {
    expect(ucumCmh2o(25, 1)).toBe('25.5');
    expect(ucumCmh2o(10, 1)).toBe('10.2');
    expect(ucumCmh2o(15, 1)).toBe('15.3');
    expect(formatStated(values.get('plateau')!.stated)).toBe('25.5 cmH2O');
    expect(formatStated(values.get('peep')!.stated)).toBe('10.2 cmH2O');
    // 25 mbar − 10 mbar = 15 mbar = 15.3 cmH2O: the driving pressure shown is that difference.
    const pn405 = checkNote(NOTE).findings.find((f) => f.code === 'PN405');
    expect(pn405?.message).toContain('15.3 cmH2O');
  });

  it('keeps the decimals written, plus one (25.5 mbar is 26.00 cmH2O)', () => {
    expect(ucumCmh2o(25.5, 2)).toBe('26.00');
    const v = checkNote(NOTE.replace('25 mbar', '25.5 mbar')).analysis.timeline.timepoints[0]!.values;
    expect(formatStated(v.get('plateau')!.stated)).toBe('26.00 cmH2O');
  });

  it('a pressure written in cmH2O is shown as written', () => {
    const v = checkNote(NOTE.replace('25 mbar', '25 cmH2O')).analysis.timeline.timepoints[0]!.values;
    expect(formatStated(v.get('plateau')!.stated)).toBe('25 cmH2O');
  });

  it('the hover gives the same number', () => {
    const { result, position } = noteAt(NOTE.replace('plateau 25', 'plateau 2|5'));
    expect(hoverAt(result, position)?.markdown ?? '').toContain('25.5 cmH2O');
  });
});

// A millibar and a hectopascal are both 100 Pa (the units' definitions): a barometric pressure
// written in mbar, as some barometers give it, is read as hPa, and an airway pressure written in hPa
// as mbar. What people read names the unit as the note wrote it.
describe('a unit written by its other name of the same size', () => {
  const hover = (marked: string) => { const { result, position } = noteAt(marked); return hoverAt(result, position)?.markdown ?? ''; };
  const NOTE_PB = 'place barometric 1013 mbar\n@ 08:00\nabg 7.40/40/90/24';

  it('the hover of a barometric pressure written in mbar says mbar', () => {
    const text = hover(NOTE_PB.replace('1013', '10|13'));
    expect(text).toContain('Value: **760 mmHg** = 1013 mbar');
    expect(text).toContain('Written in mbar.');
    expect(text).not.toContain('hPa');
    // Written in hPa (or `hpa`), it says hPa.
    expect(hover(NOTE_PB.replace('1013 mbar', '10|13 hPa'))).toContain('Value: **760 mmHg** = 1013 hPa');
    expect(hover(NOTE_PB.replace('1013 mbar', '10|13 hpa'))).toContain('Written in hPa.');
  });

  it('the hover of an airway pressure written in hPa says hPa', () => {
    const text = hover('@ 08:00\nvent mode VC, peep |8 hPa');
    expect(text).toContain('Value: **8.2 cmH2O** = 8 hPa');
    expect(text).toContain('Written in hPa.');
    expect(hover('@ 08:00\nvent mode VC, peep |8 mbar')).toContain('Written in mbar.');
  });

  it('`show` names it as written too', async () => {
    const io = memoryIo({ stdin: NOTE_PB });
    await run(['show', '-'], io);
    expect(io.out()).toContain('PB 760 mmHg (1013 mbar)');
  });
});

describe('a finding about a value written by the other name of its unit', () => {
  it('names the unit as written, in the value and in the bounds', () => {
    // Barometric pressure 150–3000 mmHg (the registry's hard bounds): 150 mmHg is 200 hPa (= 200 mbar).
    const pn301 = checkNote('place barometric 150 mbar\n@ 08:00\nabg 7.40/40/90/24').findings.find((f) => f.code === 'PN301');
    expect(pn301?.message).toBe('Barometric pressure 150 mbar is impossible (expected 200 mbar to 4000 mbar); it is not used in calculations.');
    const pn302 = checkNote('@ 08:00\nvent mode VC, peep 40 hPa').findings.find((f) => f.code === 'PN302');
    expect(pn302?.message).toMatch(/^PEEP 40 hPa is unusual \(usually at most 24\.5 hPa\)/);
  });
});
