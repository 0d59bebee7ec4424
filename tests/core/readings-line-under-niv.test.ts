// A vent line that carries only readings off a device (peak pressure, measured minute volume,
// end-tidal CO2; under NIV or CPAP also the exhaled tidal volume) states no ventilator setting: it
// starts no ventilation, so it does not end the non-invasive support in force (format rule,
// grammar/README.md: a vent line ends oxygen-line therapy when it states a ventilator setting).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import type { Timepoint } from '../../server/src/core/analysis/model';
import { hoverAt } from '../../server/src/core/service';
import { noteAt } from '../service/cursor';

const NIV = 'patient sex male, height 178 cm\n@ 08:00\noxygen niv ipap 14, epap 6, fio2 0.4\n';

const timepoints = (text: string) => checkNote(text).analysis.timeline.timepoints;
function inForce(tp: Timepoint | undefined, id: string): number | string | null | undefined {
  const v = tp?.values.get(id);
  return v ? (v.stated.word ?? v.stated.value) : undefined;
}
const codes = (text: string) => checkNote(text).findings.map((f) => f.code);

describe('a vent line of readings only under NIV', () => {
  it('keeps the NIV in force at its timepoint and after it', () => {
    const tps = timepoints(`${NIV}@ 10:00\nvent peak 15, ve 8\n@ 12:00\nabg 7.38/44/80/25`);
    for (const tp of [tps[1], tps[2]]) {
      expect([inForce(tp, 'device'), inForce(tp, 'ipap'), inForce(tp, 'epap'), inForce(tp, 'fio2')]).toEqual(['niv', 14, 6, 0.4]);
      expect(tp?.values.get('device')?.origin.kind).toBe('carried');
    }
    // The readings belong to their timepoint.
    expect([inForce(tps[1], 'peak'), inForce(tps[1], 'minute_volume')]).toEqual([15, 8]);
    expect([inForce(tps[2], 'peak'), inForce(tps[2], 'minute_volume')]).toEqual([undefined, undefined]);
    expect(codes(`${NIV}@ 10:00\nvent peak 15, ve 8`)).toEqual([]);
  });

  it('reads a tidal volume there as the exhaled volume of that timepoint, not as a ventilator setting', () => {
    const tps = timepoints(`${NIV}@ 10:00\nvent vt 520, peak 16\n@ 12:00\nvitals rr 22`);
    expect([inForce(tps[1], 'device'), inForce(tps[1], 'vt')]).toEqual(['niv', 520]);
    expect(tps[1]?.values.get('vt')?.stated.hereOnly).toBe(true);
    // Not carried: the next timepoint has NIV and no tidal volume.
    expect([inForce(tps[2], 'device'), inForce(tps[2], 'vt')]).toEqual(['niv', undefined]);
    // VT/PBW is worked out from it: 520 ÷ (50 + 0.91 × (178 − 152.4)) (ARDS Network, NEJM 2000;342:1301–1308).
    const d = checkNote(`${NIV}@ 10:00\nvent vt 520, peak 16`).analysis.derivation(1);
    expect(d?.derived.find((v) => v.id === 'vt_per_kg_pbw')?.value).toBeCloseTo(520 / 73.296, 9);
  });

  it('at the timepoint of the NIV line, is no vent line that ends it (no PN311)', () => {
    const text = `${NIV}vent peak 15, vt 480`;
    expect(codes(text)).not.toContain('PN311');
    const [tp] = timepoints(text);
    expect([inForce(tp, 'device'), inForce(tp, 'fio2'), inForce(tp, 'vt')]).toEqual(['niv', 0.4, 480]);
    // Its hover says the oxygen line is in force, with no word of its being ended.
    const { result, position } = noteAt(`${NIV.replace('ipap 14', 'ipap 1|4')}vent peak 15, vt 480`);
    expect(hoverAt(result, position)?.markdown ?? '').not.toMatch(/PN311/);
  });

  it('a tidal volume says in its hover that it is not carried', () => {
    const { result, position } = noteAt(`${NIV}@ 10:00\nvent vt 52|0, peak 16`);
    expect(hoverAt(result, position)?.markdown ?? '').toMatch(/Carries forward: no/);
  });

  it('a vent line with a setting still ends the NIV and starts ventilation', () => {
    const tps = timepoints(`${NIV}@ 10:00\nvent mode PS, ps 8, peep 6, fio2 0.35, peak 15`);
    expect([inForce(tps[1], 'device'), inForce(tps[1], 'ipap'), inForce(tps[1], 'mode'), inForce(tps[1], 'fio2')]).toEqual([undefined, undefined, 'PS', 0.35]);
    // At one timepoint, such a line still ends the oxygen line above it (PN311).
    expect(codes(`${NIV}vent mode PS, ps 8, peep 6, fio2 0.35`)).toContain('PN311');
  });

  it('after a mask, a tidal volume on a vent line is a ventilator setting, as before', () => {
    const tps = timepoints('@ 08:00\noxygen mask, fio2 0.5\n@ 09:00\nvent vt 450, peak 20\n@ 10:00\nvitals rr 20');
    expect([inForce(tps[1], 'device'), inForce(tps[1], 'vt')]).toEqual([undefined, 450]);
    expect([inForce(tps[2], 'device'), inForce(tps[2], 'vt')]).toEqual([undefined, 450]);
  });
});

describe('exported', () => {
  it('a tidal volume measured under NIV gets no LOINC code of a ventilator setting', async () => {
    const { toFhirBundle } = await import('../../server/src/core/export');
    const bundle = JSON.stringify(toFhirBundle('n.pneu', checkNote(`${NIV}@ 10:00\nvent vt 520, peak 16`), { redactProse: false, shiftDays: 0 }));
    expect(bundle).toContain('"text":"Tidal volume"');
    expect(bundle).not.toContain('20112-9');
    // Set on a ventilator in VC, it keeps the code of the setting.
    expect(JSON.stringify(toFhirBundle('n.pneu', checkNote('@ 08:00\nvent mode VC, vt 450'), { redactProse: false, shiftDays: 0 }))).toContain('20112-9');
  });
});

describe('mechanics of a readings line under NIV or CPAP', () => {
  // Dynamic compliance VT ÷ (Ppeak − PEEP) (standard respiratory mechanics, common practice, no
  // source) is the respiratory system's only for breaths the ventilator alone delivers: under NIV,
  // CPAP or PS the patient's own effort moves part of the volume, so it is not worked out there, and
  // says why (tests/derive/dynamic-compliance-own-effort.test.ts); PEEP is not asked for either.
  it('under NIV it is not worked out, and neither PEEP nor anything else is asked for to get it', () => {
    const d = checkNote(`${NIV}@ 10:00\nvent vt 480, peak 16`).analysis.derivation(1)!;
    expect(d.missing.map((m) => m.id)).not.toContain('compliance_dynamic');
    expect(d.derived.find((v) => v.id === 'compliance_dynamic')).toBeUndefined();
    expect(d.notApplicable.find((n) => n.id === 'compliance_dynamic')?.reason).toMatch(/^not worked out under NIV: .*VT ÷ \(Ppeak − EPAP\)/);
  });

  it('on CPAP, likewise', () => {
    const d = checkNote('@ 08:00\noxygen cpap level 8, fio2 0.4\n@ 09:00\nvent vt 400, peak 12').analysis.derivation(1)!;
    expect(d.derived.find((v) => v.id === 'compliance_dynamic')).toBeUndefined();
    expect(d.notApplicable.find((n) => n.id === 'compliance_dynamic')?.reason).toMatch(/^not worked out under CPAP: /);
  });

  it('on the ventilator under VC, PEEP as before', () => {
    const cdyn = checkNote('@ 08:00\nvent mode VC, vt 450, peep 5, peak 15').analysis.derivation(0)!.derived.find((v) => v.id === 'compliance_dynamic');
    expect(cdyn?.substituted).toBe('450 ÷ (15 − 5) = 45 mL/cmH2O');
  });
});
