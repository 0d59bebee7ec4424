// A set rate written in Hz under a conventional mode. Hz belongs to oscillators (HFOV, 3–15 Hz:
// common practice, from memory); 1 Hz = 60 /min (UCUM: Hz = 1/s). Under a conventional mode a rate
// in Hz is likely a unit slip for /min (`rate 14 Hz` meant as 14 /min), and such a rate is set in
// whole breaths a minute (common practice, no source): a number with decimals in Hz (`rate 1.004
// Hz`, 60.24 /min) is no slip for /min, where 1.004 breaths a minute means nothing.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { codeActions, hoverAt } from '../../server/src/core/service';
import { formatStated } from '../../server/src/core/present';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { noteAt } from './cursor';

const VC = (rate: string) => `@ 08:00\nvent mode VC, vt 400 mL, rate ${rate}, peep 8`;
const pn302 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN302');
function actionsAt(text: string, marker: string) {
  const { result, range } = noteAt(text.replace(marker, marker.slice(0, 1) + '|' + marker.slice(1)));
  return codeActions(result, range);
}

describe('a rate in Hz under a conventional mode', () => {
  it('`rate 1.004 Hz` in VC: reported, with no offer to write 1.004 /min', () => {
    const [f] = pn302(VC('1.004 Hz'));
    expect(f?.message).toBe('Set rate 1.004 Hz is unusual (usually at most 1 Hz, or 60 /min): check the unit and the transcription. A rate in Hz is usual in HFOV; the mode in force here is VC.');
    expect(f?.fixes).toEqual([]);
    expect(actionsAt(VC('1.004 Hz'), '1.004').map((a) => a.title)).not.toContain('Write /min instead of Hz');
  });

  it('`rate 14 Hz` in VC: 14 /min is still offered, a whole number of breaths a minute', () => {
    const [f] = pn302(VC('14 Hz'));
    expect(f?.fixes.map((x) => x.title)).toEqual(['Write /min instead of Hz']);
    // Also `rate 1.5 Hz` (90 /min) is not offered 1.5 /min.
    expect(pn302(VC('1.5 Hz'))[0]?.fixes).toEqual([]);
  });

  it('the rate is shown in /min with the decimals that give back the number written: 1.004 Hz is 60.24 /min, not 60', () => {
    const s = checkNote(VC('1.004 Hz')).analysis.timeline.timepoints[0]!.values.get('vent_rate')!.stated;
    expect(formatStated(s)).toBe('60.24 /min');
    const { result, position } = noteAt(VC('1.0|04 Hz'));
    expect(hoverAt(result, position)?.markdown ?? '').toContain('**60.24 /min** = 1.004 Hz');
    // 5.5 Hz is 330 /min, 0.25 Hz 15 /min: no decimals added where none are needed.
    expect(formatStated(checkNote(VC('0.25 Hz')).analysis.timeline.timepoints[0]!.values.get('vent_rate')!.stated)).toBe('15 /min');
  });

  it('the value under the cursor can be written in /min, keeping the value', () => {
    const text = VC('0.25 Hz');
    const action = actionsAt(text, '0.25').find((a) => a.title.startsWith('Write rate in /min'));
    expect(action?.title).toBe('Write rate in /min: 15 /min');
    expect(applyEdits(text, action!.edits)).toBe(VC('15 /min'));
    const odd = actionsAt(VC('1.004 Hz'), '1.004').find((a) => a.title.startsWith('Write rate in /min'));
    expect(applyEdits(VC('1.004 Hz'), odd!.edits)).toBe(VC('60.24 /min'));
  });

  it('in HFOV a rate in Hz is not offered /min, nor a rate in /min under VC offered Hz', () => {
    expect(actionsAt('@ 08:00\nvent mode HFOV, rate 5 Hz, fio2 0.6', '5 Hz').map((a) => a.title).filter((t) => t.includes('/min'))).toEqual([]);
    expect(actionsAt(VC('14 /min'), '14').map((a) => a.title).filter((t) => t.includes('Hz'))).toEqual([]);
  });
});
