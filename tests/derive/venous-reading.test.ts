// The venous gas reading (PN414): what a venous gas stated without an arterial one can say.
// Sources (abstracts read):
// - Bloom BM, Grundlingh J, Bestwick JP, Harris T. The role of venous blood gas in the emergency
//   department: a systematic review and meta-analysis. Eur J Emerg Med 2014: venous minus arterial
//   pH −0.033, narrow limits of agreement; PCO2 +4.4 mmHg with limits −20.4 to +25.8 mmHg.
// - Kelly AM. Can venous blood gas analysis replace arterial in emergency medical care. Emerg Med
//   Australas 2010;22:493–498: arterio–venous pH difference 0.035.
// - Kelly AM, Kerr D, Middleton P. Validation of venous pCO2 to screen for arterial hypercarbia in
//   patients with chronic obstructive airways disease. J Emerg Med 2005;28:377–379: venous pCO2
//   above 45 mmHg caught every PaCO2 above 50 mmHg; none below 45 mmHg had one.
// Arterial pH reference interval 7.35–7.45: common practice, no source.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { allDerivations } from '../../server/src/core/analysis/analyse';
import { VENOUS_PCO2_SCREEN_MMHG, VENOUS_PH_BELOW_ARTERIAL, arterialPhFromVenous, venousPco2Screen } from '../../server/src/core/physiology';

const readings = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN414');
const venous = (text: string) => allDerivations(checkNote(text).analysis).flatMap((d) => d.interpretations.filter((i) => i.topic === 'venous'));

describe('venous pH and PCO2 against the arterial ones (physiology)', () => {
  it('a venous pH runs about 0.03 below the arterial one (pooled 0.033 and 0.035: Bloom 2014; Kelly 2010)', () => {
    expect(VENOUS_PH_BELOW_ARTERIAL).toBeGreaterThanOrEqual(0.03);
    expect(VENOUS_PH_BELOW_ARTERIAL).toBeLessThanOrEqual(0.035);
    expect(arterialPhFromVenous(7.3)).toBeCloseTo(7.33, 10);
    expect(arterialPhFromVenous(Number.NaN)).toBeNull();
    expect(arterialPhFromVenous(15)).toBeNull();
  });

  it('a venous PCO2 above 45 mmHg leaves arterial hypercapnia possible; at or below it, unlikely (Kelly, Kerr & Middleton 2005)', () => {
    expect(VENOUS_PCO2_SCREEN_MMHG).toBe(45);
    expect(venousPco2Screen(46)).toBe('hypercapnia-not-excluded');
    expect(venousPco2Screen(45)).toBe('hypercapnia-unlikely'); // the study's cut-off is "> 45 mmHg"
    expect(venousPco2Screen(38)).toBe('hypercapnia-unlikely');
    // 6.0 kPa written with one decimal stands for 44.6–45.4 mmHg: on the cut-off, not above it.
    expect(venousPco2Screen(6.0 * 7.50062, 0.375)).toBe('hypercapnia-unlikely');
    expect(venousPco2Screen(0)).toBeNull();
    expect(venousPco2Screen(Number.POSITIVE_INFINITY)).toBeNull();
  });
});

describe('the venous gas reading (PN414)', () => {
  it('reads acidaemia from the venous pH and keeps hypercapnia open above 45 mmHg', () => {
    const f = readings('@ 08:00\nvbg ph 7.24, pco2 68, hco3 28.5');
    expect(f).toHaveLength(1);
    expect(f[0]!.range.start.line).toBe(1);
    expect(f[0]!.severity).toBe('information');
    expect(f[0]!.message).toBe('Venous gas: pH 7.24 (arterial about 7.27): consistent with acidaemia, below 7.35; PvCO2 68 mmHg, above 45 mmHg: consistent with arterial hypercapnia, not proof of it (a venous PCO2 can differ from the arterial one by 20 mmHg either way; an arterial gas measures it).');
  });

  it('reads alkalaemia above 7.45 once the venous pH is taken about 0.03 up', () => {
    expect(readings('@ 08:00\nvbg ph 7.43')[0]?.message).toBe('Venous gas: pH 7.43 (arterial about 7.46): consistent with alkalaemia, above 7.45.');
  });

  it('reports nothing at the edges: venous pH 7.32 and 7.42 stand for 7.35 and 7.45, PvCO2 45 mmHg is not above 45', () => {
    expect(readings('@ 08:00\nvbg ph 7.32, pco2 45')).toEqual([]);
    expect(readings('@ 08:00\nvbg ph 7.42, pco2 40')).toEqual([]);
    expect(readings('@ 08:00\nvbg ph 7.31')).toHaveLength(1);
    expect(readings('@ 08:00\nvbg pco2 46')).toHaveLength(1);
  });

  it('a normal venous gas is still read (for show and hovers), as consistent with no arterial hypercapnia', () => {
    const [r] = venous('@ 08:00\nvbg ph 7.36, pco2 44');
    expect(r?.notable).toBe(false);
    expect(r?.text).toBe('Venous gas: pH 7.36 (arterial about 7.39): within 7.35–7.45; PvCO2 44 mmHg, not above 45 mmHg: consistent with no arterial hypercapnia (PaCO2 not above 50 mmHg).');
  });

  it('never reads a venous PO2 as oxygenation, and says so', () => {
    const [r] = venous('@ 08:00\nvbg ph 7.38, pco2 42, po2 32');
    expect(r?.text).toContain('PvO2 says nothing of arterial oxygenation: SpO2 or an arterial gas shows it');
    expect(checkNote('@ 08:00\nvbg ph 7.38, pco2 42, po2 32').findings.filter((f) => ['PN410', 'PN411', 'PN412', 'PN413'].includes(f.code))).toEqual([]);
  });

  it('writes kPa in a kPa note, and reads 6.0 kPa as on the 45 mmHg cut-off', () => {
    const [r] = venous('units gas kPa\n@ 08:00\nvbg ph 7.37, pco2 6.0');
    expect(r?.text).toBe('Venous gas: pH 7.37 (arterial about 7.40): within 7.35–7.45; PvCO2 6.0 kPa (45 mmHg), not above 6.0 kPa: consistent with no arterial hypercapnia (PaCO2 not above 6.7 kPa).');
    expect(venous('units gas kPa\n@ 08:00\nvbg pco2 8.1')[0]?.text).toContain('above 6.0 kPa: consistent with arterial hypercapnia, not proof of it (a venous PCO2 can differ from the arterial one by 2.7 kPa either way');
  });

  it('is not given beside an arterial gas at the same timepoint: the arterial gas is read instead', () => {
    const text = '@ 08:00\noxygen air\nvbg ph 7.20, pco2 70\nabg ph 7.24, pco2 62, po2 55, hco3 26';
    expect(readings(text)).toEqual([]);
    expect(checkNote(text).findings.some((f) => f.code === 'PN413')).toBe(true);
  });

  it('does not read a venous gas whose pH, PvCO2 and HCO3 disagree (PN402), and does not read carried or unusable values', () => {
    const text = '@ 08:00\nvbg ph 7.20, pco2 40, hco3 30';
    expect(checkNote(text).findings.map((f) => f.code)).toContain('PN402');
    expect(readings(text)).toEqual([]);
    expect(venous(text)[0]?.text).toBe('Venous gas not read: its pH, PvCO2 and HCO3 do not fit together (see PN402).');
    // The 09:00 timepoint states no venous gas: nothing is read there from the 08:00 one.
    expect(venous('@ 08:00\nvbg ph 7.25\n@ 09:00\nvitals hr 90').length).toBe(1);
    // A bare 6.1 in an mmHg note is in doubt (PN204) and not used: no PvCO2 reading.
    expect(venous('@ 08:00\nvbg pco2 6.1')).toEqual([]);
  });

  it('can be switched off like every check', () => {
    expect(checkNote('@ 08:00\nvbg ph 7.20', { disabledChecks: ['venous-gas-reading'] }).findings.filter((f) => f.code === 'PN414')).toEqual([]);
  });
});
