// Whether the oxygen line in force is non-invasive support that gives breaths (NIV or CPAP) is
// decided in three places: the timeline (a tidal volume on a vent line of readings is then the
// exhaled volume the device measured, not a ventilator setting), mechanical power (not worked out
// under NIV or CPAP, with the reason said) and the FHIR export (no LOINC code of a set tidal
// volume on a measured one). They must answer alike. They did not on an oxygen line that names no
// device: the timeline read NIV from an IPAP alone, mechanical power read nothing from it (and
// asked for `peep`), and the export looked at the device word only.
//
// The reading of an IPAP without a device or an EPAP as NIV: IPAP is the inspiratory pressure of
// bilevel support, which raises the pressure on each breath; CPAP holds one pressure and has none
// (common practice, no source).
import { describe, expect, it } from 'vitest';
import { noninvasiveSupport } from '../../server/src/core/analysis/noninvasive-support';
import { checkNote } from '../../server/src/core/check-note';
import { toFhirBundle } from '../../server/src/core/export';
import { loincMismatch } from '../../server/src/core/export/fhir';
import { fieldById } from '../../server/src/core/fields/registry';
import { hoverAt } from '../../server/src/core/service';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';
import { noteAt } from '../service/cursor';
import { derivation } from '../derive/helpers';

const PATIENT = 'patient sex female, height 165 cm\n';
/**
 * An oxygen line, then a vent line of readings (a tidal volume, peak and plateau) and a measured
 * rate, at the next timepoint or (`sameTime`) at the oxygen line's.
 */
const withReadings = (oxygen: string, sameTime = false): string =>
  `${PATIENT}@ 08:00\n${oxygen}\n${sameTime ? '' : '@ 09:00\n'}vent vt 450, peak 18, plateau 16\nvitals rr 22`;
const IPAP_ALONE = withReadings('oxygen ipap 12, fio2 0.4');

/** Where the simplified mechanical power is not worked out under the support in force, the support named; else null. */
function powerReason(text: string): string | null {
  const na = derivation(text).notApplicable.find((n) => n.id === 'mechanical_power');
  const named = na?.reason.match(/under (NIV|CPAP)\b/);
  return named ? named[1]! : null;
}

/** Whether the tidal volume of the last timepoint is read as a measurement of its timepoint. */
function vtMeasured(text: string): boolean | undefined {
  return checkNote(text).analysis.timeline.timepoints.at(-1)?.values.get('vt')?.stated.hereOnly;
}

/** Whether the FHIR export gives the tidal volume the LOINC code of a ventilator setting (20112-9). */
function vtCodedAsSetting(text: string): boolean {
  return JSON.stringify(toFhirBundle('n.pneu', checkNote(text), { redactProse: false, shiftDays: 0 })).includes('20112-9');
}

describe('an IPAP without a device or an EPAP (a bilevel setting): NIV everywhere', () => {
  it('the timeline reads the tidal volume on the vent line of readings as measured, and carries it nowhere', () => {
    const tps = checkNote(IPAP_ALONE).analysis.timeline.timepoints;
    expect(tps[1]?.values.get('vt')?.stated.hereOnly).toBe(true);
    expect(tps[1]?.values.numberOf('ipap')).toBe(12);
  });

  // Mechanical power, simplified: 0.098 × RR × VT (L) × (Ppeak − ½ × (Pplat − PEEP)) (Gattinoni L,
  // Tonetti T, Cressoni M, et al., "Ventilator-related causes of lung injury: the mechanical power",
  // Intensive Care Med 2016;42:1567–1575, from memory) describes constant-flow volume control, not
  // pressure-supported breaths (Becher T et al., "Calculation of mechanical power for
  // pressure-controlled ventilation", Intensive Care Med 2019, letter).
  it('mechanical power names NIV as the reason it is not worked out, and asks for no peep', () => {
    const d = derivation(IPAP_ALONE);
    expect(d.derived.find((v) => v.id === 'mechanical_power')).toBeUndefined();
    expect(d.missing.find((m) => m.id === 'mechanical_power')).toBeUndefined();
    const na = d.notApplicable.find((n) => n.id === 'mechanical_power');
    expect(na?.reason).toMatch(/^the simplified equation is for volume control with a constant flow, the airway pressure rising in a straight line through inspiration; under NIV the breaths are pressure-supported/);
    expect(na?.explained).toBe(true);
  });

  it('the hover of the peak pressure gives that reason', () => {
    const { result, position } = noteAt(IPAP_ALONE.replace('peak 18', 'peak 1|8'));
    const md = hoverAt(result, position)?.markdown ?? '';
    expect(md).toContain('Not worked out here: MP — the simplified equation is for volume control with a constant flow, the airway pressure rising in a straight line through inspiration; under NIV the breaths are pressure-supported');
    expect(md).not.toMatch(/add peep to get[^\n]*\bMP\b/);
  });

  it('`show` prints it as not applicable, not as missing', async () => {
    const io = memoryIo({ stdin: IPAP_ALONE });
    await run(['show', '-'], io);
    const shown = io.out();
    expect(shown).toMatch(/\n {2}n\/a {6}MP: the simplified equation is for volume control with a constant flow, the airway pressure rising in a straight line through inspiration; under NIV the breaths are pressure-supported/);
    expect(shown).not.toMatch(/missing +add peep to get [^\n]*\bMP\b/);
  });

  it('the FHIR export gives the measured tidal volume no code of a set one', () => {
    expect(vtCodedAsSetting(IPAP_ALONE)).toBe(false);
  });
});

describe('the timeline, mechanical power and the FHIR export agree on every oxygen line', () => {
  const devices = ['', 'niv ', 'bilevel ', 'cpap ', 'mask, ', 'hfnc 40, ', 'cannula 2, '];
  const pressures = ['', 'ipap 12, ', 'epap 5, ', 'level 8, ', 'ipap 12, epap 5, ', 'epap 5, level 8, ', 'ipap 12, level 8, '];
  for (const sameTime of [false, true]) for (const device of devices) {
    for (const pressure of pressures) {
      const oxygen = `oxygen ${device}${pressure}fio2 0.4`;
      it(`${oxygen}, the vent line ${sameTime ? 'at the same timepoint' : 'an hour later'}`, () => {
        const text = withReadings(oxygen, sameTime);
        const measured = vtMeasured(text);
        const reason = powerReason(text);
        // The tidal volume is measured exactly where mechanical power names NIV or CPAP …
        expect(reason !== null, `vt measured: ${measured}, power reason: ${reason}`).toBe(measured === true);
        // … and exactly there the export refuses it the code of a setting.
        expect(vtCodedAsSetting(text)).toBe(measured !== true);
      });
    }
  }

  it('which support each reads: the device decides; without one, IPAP or EPAP is NIV, a CPAP level alone CPAP', () => {
    expect(powerReason(withReadings('oxygen niv fio2 0.4'))).toBe('NIV');
    expect(powerReason(withReadings('oxygen bilevel fio2 0.4'))).toBe('NIV');
    expect(powerReason(withReadings('oxygen cpap 8, fio2 0.4'))).toBe('CPAP');
    expect(powerReason(withReadings('oxygen mask, epap 5, fio2 0.4'))).toBeNull();
    expect(powerReason(withReadings('oxygen epap 5, fio2 0.4'))).toBe('NIV');
    expect(powerReason(withReadings('oxygen ipap 12, level 8, fio2 0.4'))).toBe('NIV');
    expect(powerReason(withReadings('oxygen level 8, fio2 0.4'))).toBe('CPAP');
    expect(powerReason(withReadings('oxygen fio2 0.4'))).toBeNull();
  });
});

describe('the rule itself (noninvasiveSupport)', () => {
  const held = (...ids: string[]) => new Set(ids);
  it('a device named decides, whatever pressures are written beside it', () => {
    expect(noninvasiveSupport('niv', held())).toBe('niv');
    expect(noninvasiveSupport('cpap', held('ipap', 'epap'))).toBe('cpap');
    for (const device of ['mask', 'hfnc', 'cannula', 'venturi', 'reservoir', 'room air']) {
      expect(noninvasiveSupport(device, held('ipap', 'epap', 'cpap_level')), device).toBeNull();
    }
  });

  it('with no device: IPAP or EPAP is NIV (IPAP alone too: a bilevel setting), else a CPAP level is CPAP, else none', () => {
    expect(noninvasiveSupport(null, held('ipap'))).toBe('niv');
    expect(noninvasiveSupport(null, held('epap'))).toBe('niv');
    expect(noninvasiveSupport(null, held('ipap', 'epap'))).toBe('niv');
    expect(noninvasiveSupport(null, held('ipap', 'cpap_level'))).toBe('niv');
    expect(noninvasiveSupport(null, held('epap', 'cpap_level'))).toBe('niv');
    expect(noninvasiveSupport(null, held('cpap_level'))).toBe('cpap');
    expect(noninvasiveSupport(null, held('fio2', 'o2_flow'))).toBeNull();
    expect(noninvasiveSupport(null, held())).toBeNull();
  });

  it('asks nothing of the pressures where a device is named', () => {
    const asked: string[] = [];
    noninvasiveSupport('mask', { has: (id) => (asked.push(id), true) });
    expect(asked).toEqual([]);
  });

  it('the export names the support when it refuses the code of a set tidal volume', () => {
    const vt = fieldById('vt')!;
    const under = (support: 'niv' | 'cpap' | null) => loincMismatch(vt.loinc!, vt, 'vent', { key: 'vt', device: null, mode: null, support });
    expect(under('niv')).toBe('20112-9 is a set tidal volume, and NIV sets none');
    expect(under('cpap')).toBe('20112-9 is a set tidal volume, and CPAP sets none');
    expect(under(null)).toBeNull();
  });
});

// Driving pressure Pplat − PEEP (Amato MBP et al., "Driving pressure and survival in the acute
// respiratory distress syndrome", NEJM 2015;372:747–755), static compliance VT ÷ (Pplat − PEEP) and
// dynamic compliance VT ÷ (Ppeak − PEEP) (standard respiratory mechanics, common practice, no
// source) take the end-expiratory pressure in force: EPAP under NIV, the CPAP level under CPAP.
// Where it is missing, what to add is that line's key: a `peep` would go on a vent line, and a vent
// line with a setting ends the non-invasive support (and with it the pressures read under it).
describe('what to add for the end-expiratory pressure follows the support in force', () => {
  const needsOf = (text: string, id: string) => derivation(text).missing.find((m) => m.id === id)?.needs;
  const mechanics = ['driving_pressure', 'compliance_static', 'compliance_dynamic'];

  for (const [oxygen, need] of [
    ['oxygen ipap 12, fio2 0.4', 'epap (on the oxygen line)'],
    ['oxygen niv ipap 14, fio2 0.4', 'epap (on the oxygen line)'],
    ['oxygen bilevel fio2 0.4', 'epap (on the oxygen line)'],
    ['oxygen cpap, fio2 0.4', 'level (on the oxygen line)'],
    ['oxygen mask, fio2 0.4', 'peep'],
  ] as const) {
    it(`${oxygen}: add ${need}`, () => {
      const text = withReadings(oxygen);
      // Under NIV or CPAP the dynamic compliance is not worked out (the patient's own effort moves the volume): nothing to add for it.
      for (const id of need === 'peep' ? mechanics : mechanics.slice(0, 2)) expect(needsOf(text, id), id).toEqual([need]);
      if (need !== 'peep') expect(needsOf(text, 'compliance_dynamic')).toBeUndefined();
    });
  }

  it('`show` says so for an IPAP alone, and following it gives the values: ΔP 16 − 5 = 11 cmH2O', async () => {
    const io = memoryIo({ stdin: IPAP_ALONE });
    await run(['show', '-'], io);
    expect(io.out()).toContain('missing  add epap (on the oxygen line) to get ΔP, Cstat\n');
    expect(io.out()).toContain('n/a      Cdyn: not worked out under NIV: ');
    const d = derivation(withReadings('oxygen ipap 12, epap 5, fio2 0.4'));
    expect(d.derived.find((v) => v.id === 'driving_pressure')?.value).toBe(11);
    // Cstat 450 ÷ (16 − 5); no Cdyn under NIV.
    expect(d.derived.find((v) => v.id === 'compliance_static')?.value).toBeCloseTo(450 / 11, 9);
    expect(d.derived.find((v) => v.id === 'compliance_dynamic')).toBeUndefined();
    expect(d.missing.filter((m) => mechanics.includes(m.id))).toEqual([]);
  });

  it('on the ventilator, and with no therapy named, peep as before', () => {
    expect(needsOf(`${PATIENT}@ 08:00\nvent mode VC, vt 450, rate 20, fio2 0.4\nvent plateau 16, peak 18`, 'driving_pressure')).toEqual(['peep']);
    expect(needsOf(`${PATIENT}@ 08:00\nvent vt 450, plateau 16, peak 18`, 'compliance_static')).toEqual(['peep']);
  });
});
