// One rule decides whether a value on a vent line is a measurement of its timepoint or a held
// setting: the field registry's row for the family of the breaths in force (fields/modes.ts). The
// family is the ventilator mode's; with no mode, that of the NIV or CPAP of the oxygen line in force
// (spontaneous breaths, as under PS: common practice, no source). A line that states only what those
// breaths measure is a line of readings and ends nothing; any other ends the support. The wording of
// what to add is the same under NIV as under PS ("the measured vt at this timepoint").
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import type { Timepoint } from '../../server/src/core/analysis/model';
import { hoverAt } from '../../server/src/core/service';
import { fieldById } from '../../server/src/core/fields/registry';
import { familyInForce, isMeasuredUnder } from '../../server/src/core/fields/modes';
import { noteAt } from '../service/cursor';

const NIV = 'patient sex male, height 178 cm\n@ 08:00\noxygen niv ipap 14, epap 6, fio2 0.4\n';
const PS = 'patient sex male, height 178 cm\n@ 08:00\nvent mode PS, ps 8, peep 6, fio2 0.4\n';

const timepoints = (text: string): readonly Timepoint[] => checkNote(text).analysis.timeline.timepoints;
function inForce(tp: Timepoint | undefined, id: string): number | string | null | undefined {
  const v = tp?.values.get(id);
  return v ? (v.stated.word ?? v.stated.value) : undefined;
}
const missingOf = (text: string, tp: number, id: string) => checkNote(text).analysis.derivation(tp)?.missing.find((m) => m.id === id)?.message;

describe('the family of the breaths in force', () => {
  it('is the mode\'s; with no mode, NIV and CPAP of an oxygen line give spontaneous breaths; an unlisted mode has none', () => {
    expect([familyInForce('PC', null), familyInForce(null, 'niv'), familyInForce(null, 'cpap'), familyInForce(null, null)]).toEqual(['pressure', 'spontaneous', 'spontaneous', null]);
    // A mode decides where one is in force (a vent line with a setting ends the oxygen line anyway).
    expect([familyInForce('VC', 'niv'), familyInForce('ASV', 'niv')]).toEqual(['volume', null]);
  });

  it('a tidal volume is measured under NIV and CPAP as under PS; a set rate stays a setting', () => {
    const vt = fieldById('vt')!;
    expect([isMeasuredUnder(vt, null, 'niv'), isMeasuredUnder(vt, null, 'cpap'), isMeasuredUnder(vt, 'PS'), isMeasuredUnder(vt, null)]).toEqual([true, true, true, false]);
    expect(isMeasuredUnder(fieldById('vent_rate')!, null, 'niv')).toBe(false);
  });
});

describe('the same wording under NIV as under PS', () => {
  it('a peak with no tidal volume asks for no vt to get Cdyn under NIV or PS, where Cdyn is not worked out', () => {
    // Dynamic compliance VT ÷ (Ppeak − PEEP or EPAP) holds only for breaths the ventilator alone
    // delivers (respiratory mechanics, common practice, no source): under the spontaneous family it
    // is withheld with its reason (derive/mechanics.ts `ownEffort`), and nothing is asked to get it.
    expect(missingOf(`${NIV}@ 10:00\nvent peak 16`, 1, 'compliance_dynamic')).toBeUndefined();
    expect(missingOf(`${PS}@ 10:00\nvent peak 16`, 1, 'compliance_dynamic')).toBeUndefined();
    expect(missingOf(`${NIV}vent vt 480\n@ 10:00\nvent peak 16`, 1, 'compliance_dynamic')).toBeUndefined();
  });

  it('with no support and no mode, plain vt as before', () => {
    expect(missingOf('patient sex male, height 178 cm\n@ 08:00\noxygen mask, fio2 0.5\nvent peak 16, peep 5', 0, 'compliance_dynamic')).toBe('add vt to get Cdyn');
  });

  it('the hover of a tidal volume under NIV says it is measured and names the support', () => {
    const { result, position } = noteAt(`${NIV}@ 10:00\nvent vt 52|0, peak 16`);
    const md = hoverAt(result, position)?.markdown ?? '';
    expect(md).toContain('Carries forward: no — under NIV the tidal volume is measured, not set');
    expect(md).toContain('does not end the support in force');
  });
});

describe('what a line of readings is follows the rule', () => {
  it('under NIV, an inspiratory flow read off the device is a measurement too: the support stays', () => {
    // A change the one rule brings: a flow is measured under spontaneous breaths (fields/modes.ts).
    const tps = timepoints(`${NIV}@ 10:00\nvent vt 480, flow 40\n@ 12:00\nvitals rr 20`);
    expect([inForce(tps[1], 'device'), inForce(tps[1], 'insp_flow'), tps[1]?.values.get('insp_flow')?.stated.hereOnly]).toEqual(['niv', 40, true]);
    expect([inForce(tps[2], 'device'), inForce(tps[2], 'insp_flow')]).toEqual(['niv', undefined]);
  });

  it('under NIV, a vent line with a set rate ends the support, and its tidal volume is a setting (no mode): carried', () => {
    const tps = timepoints(`${NIV}@ 10:00\nvent vt 450, rate 14\n@ 12:00\nvitals rr 20`);
    expect([inForce(tps[1], 'device'), inForce(tps[1], 'vt'), tps[1]?.values.get('vt')?.stated.hereOnly]).toEqual([undefined, 450, false]);
    expect(inForce(tps[2], 'vt')).toBe(450);
  });
});
