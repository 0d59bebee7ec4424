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
