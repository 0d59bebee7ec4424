// Total PEEP (`peep_total`, measured in an end-expiratory hold) and intrinsic PEEP (`autopeep`, the
// total above the set PEEP). Where a total PEEP is measured, driving pressure and static compliance
// use plateau − total PEEP, the elastic pressure across the respiratory system (the plateau less the
// end-expiratory pressure of the respiratory system, read in the abstract of a 2018 review, PMC6212354;
// Amato MBP et al., "Driving pressure and survival in the acute respiratory distress syndrome", NEJM
// 2015, define the driving pressure as plateau − PEEP: which PEEP is from memory).
// PN418: a total PEEP below the set PEEP, above the plateau, or an intrinsic PEEP that is not total −
// set, beyond 1 cmH2O of rounding (common practice, no source).
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { fieldFor } from '../../server/src/core/fields/registry';
import { completionsAt, hoverAt } from '../../server/src/core/service';
import { noteAt } from '../service/cursor';
import { derived } from './helpers';

const pn418 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN418');
const unknownKeys = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN201');

describe('total and intrinsic PEEP on the vent line', () => {
  it('reads the keys and their aliases (no PN201)', () => {
    expect(fieldFor('vent', 'peep_total')?.id).toBe('peep_total');
    expect(fieldFor('vent', 'tpeep')?.id).toBe('peep_total');
    expect(fieldFor('vent', 'totalpeep')?.id).toBe('peep_total');
    expect(fieldFor('vent', 'autopeep')?.id).toBe('autopeep');
    expect(fieldFor('vent', 'ipeep')?.id).toBe('autopeep');
    expect(fieldFor('vent', 'peepi')?.id).toBe('autopeep');
    expect(unknownKeys('@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, tpeep 12, autopeep 4')).toEqual([]);
  });

  it('driving pressure and static compliance use the total PEEP where it is measured, and name it', () => {
    const text = '@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, peep_total 12, plateau 27';
    const dp = derived(text, 'driving_pressure');
    // 27 − 12 = 15 cmH2O (not 27 − 8 = 19).
    expect(dp.value).toBe(15);
    expect(dp.formula).toContain('PEEPtot');
    const cstat = derived(text, 'compliance_static');
    // 450 ÷ (27 − 12) = 450 ÷ 15 = 30 mL/cmH2O.
    expect(cstat.value).toBe(30);
    expect(cstat.formula).toContain('PEEPtot');
  });

  it('keeps the set PEEP where no total is written', () => {
    const text = '@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, plateau 27';
    // 27 − 8 = 19; 450 ÷ 19 = 23.68… mL/cmH2O.
    expect(derived(text, 'driving_pressure').value).toBe(19);
    expect(derived(text, 'driving_pressure').formula).not.toContain('PEEPtot');
    expect(derived(text, 'compliance_static').value).toBeCloseTo(450 / 19, 6);
  });

  it('a total PEEP is a reading of its timepoint: not carried', () => {
    const text = '@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, tpeep 12, plateau 27\n@ 09:00\nvent plateau 25';
    // 25 − 8 = 17: the 08:00 total is not used at 09:00.
    expect(derived(text, 'driving_pressure').value).toBe(17);
  });
});

describe('PN418: total or intrinsic PEEP that cannot be', () => {
  it('fires on a total PEEP below the set PEEP beyond 1 cmH2O, as a warning', () => {
    const f = pn418('@ 08:00\nvent mode VC, vt 450, rate 16, peep 10, tpeep 7');
    expect(f).toHaveLength(1);
    expect(f[0]?.severity).toBe('warning');
    expect(f[0]?.message).toContain('below the set PEEP 10');
  });

  it('is silent within 1 cmH2O of rounding and for a total at or above the set PEEP', () => {
    expect(pn418('@ 08:00\nvent peep 10, tpeep 9')).toEqual([]);
    expect(pn418('@ 08:00\nvent peep 10, tpeep 14, plateau 25')).toEqual([]);
    expect(pn418('@ 08:00\nvent peep 8, tpeep 12, autopeep 4')).toEqual([]);
    // 12 − 8 = 4; 5 is within 1 cmH2O of it.
    expect(pn418('@ 08:00\nvent peep 8, tpeep 12, autopeep 5')).toEqual([]);
  });

  it('fires on a total PEEP above the plateau', () => {
    const f = pn418('@ 08:00\nvent peep 8, tpeep 20, plateau 18');
    expect(f).toHaveLength(1);
    expect(f[0]?.message).toContain('above the plateau pressure 18');
  });

  it('fires on an intrinsic PEEP that is not total − set', () => {
    // 14 − 8 = 6, but 2 is written: 4 cmH2O apart.
    const f = pn418('@ 08:00\nvent peep 8, tpeep 14, autopeep 2');
    expect(f).toHaveLength(1);
    expect(f[0]?.message).toContain('14 − 8 = 6');
  });
});

describe('editor support', () => {
  it('completion offers the keys on a vent line', () => {
    const { result, position } = noteAt('@ 08:00\nvent peep 8, |');
    const labels = completionsAt(result, position).map((c) => c.label);
    expect(labels).toContain('peep_total');
    expect(labels).toContain('autopeep');
  });

  it('hover on the key says what it is', () => {
    const { result, position } = noteAt('@ 08:00\nvent peep 8, tpe|ep 12');
    expect(hoverAt(result, position)?.markdown).toContain('Total PEEP');
  });
});

describe('PN407 names the total PEEP it compared with', () => {
  it('a plateau equal to the total PEEP is a breath with no rise above the total PEEP', () => {
    const f = checkNote('@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, tpeep 20, plateau 20').findings.filter((x) => x.code === 'PN407');
    expect(f).toHaveLength(1);
    expect(f[0]?.message).toContain('equals the total PEEP');
  });
});

// Where no total PEEP is written but an intrinsic PEEP is (a reading of the same end-expiratory
// hold), the total PEEP is the set PEEP plus the intrinsic PEEP: in a passive patient the pressure
// at the end of an expiratory hold is the set PEEP plus any intrinsic PEEP (respiratory mechanics,
// common practice, no source; the rule PN418 already holds total, set and intrinsic PEEP to). The
// formula says so: `Pplat − (PEEP + PEEPi)`, with both inputs named.
describe('the total PEEP as set + intrinsic PEEP where no total is written', () => {
  it('driving pressure 26 − (8 + 4) = 14 cmH2O, not 26 − 8 = 18; static compliance 380 ÷ 14 ≈ 27.1 mL/cmH2O', () => {
    const text = '@ 08:00\nvent mode VC, vt 380, rate 18, peep 8, autopeep 4, plateau 26';
    const dp = derived(text, 'driving_pressure');
    expect(dp.value).toBe(14);
    expect(dp.formula).toBe('Pplat − (PEEP + PEEPi)');
    expect(dp.substituted).toBe('26 − (8 + 4) = 14 cmH2O');
    expect(dp.inputs.map((t) => t.name)).toEqual(['Pplat', 'PEEP', 'PEEPi']);
    const cstat = derived(text, 'compliance_static');
    expect(cstat.value).toBeCloseTo(380 / 14, 9);
    expect(cstat.formula).toBe('VT ÷ (Pplat − (PEEP + PEEPi))');
    expect(cstat.substituted).toBe('380 ÷ (26 − (8 + 4)) = 27 mL/cmH2O');
  });

  it('a total PEEP written wins over the sum (it is what the hold measured): 26 − 12 = 14 with tpeep 12, autopeep 3', () => {
    const dp = derived('@ 08:00\nvent mode VC, vt 380, peep 8, tpeep 12, autopeep 3, plateau 26', 'driving_pressure');
    expect(dp.value).toBe(14);
    expect(dp.formula).toBe('Pplat − PEEPtot');
  });

  it('the intrinsic PEEP is a reading of its timepoint: not carried to the next plateau (26 − 8 = 18 there)', () => {
    const text = '@ 08:00\nvent mode VC, vt 380, peep 8, autopeep 4, plateau 26\n@ 09:00\nvent plateau 26';
    expect(derived(text, 'driving_pressure').value).toBe(18);
  });

  it('the set PEEP carried from an earlier timepoint is summed with the intrinsic PEEP written here', () => {
    const text = '@ 08:00\nvent mode VC, vt 380, peep 8\n@ 09:00\nvent autopeep 5, plateau 27';
    const dp = derived(text, 'driving_pressure');
    expect(dp.value).toBe(14);
    expect(dp.usesCarried).toBe(true);
  });

  it('not under NIV: an intrinsic PEEP beside an EPAP is not summed with it (an end-expiratory hold is a ventilator\'s manoeuvre)', () => {
    const dp = derived('@ 08:00\noxygen niv ipap 16, epap 6, fio2 0.4\nvent vt 450, plateau 16, autopeep 2', 'driving_pressure');
    expect(dp.formula).toBe('Pplat − EPAP');
    expect(dp.value).toBe(10);
  });

  it('dynamic compliance and mechanical power keep the set PEEP', () => {
    const text = '@ 08:00\nvent mode VC, vt 380, rate 18, peep 8, autopeep 4, plateau 26, peak 30';
    expect(derived(text, 'compliance_dynamic').value).toBeCloseTo(380 / 22, 9);
    expect(derived(text, 'mechanical_power').inputs.map((t) => t.name)).not.toContain('PEEPi');
  });

  it('PN407 names both where the plateau equals their sum', () => {
    const f = checkNote('@ 08:00\nvent mode VC, vt 380, peep 8, autopeep 3, plateau 11').findings.filter((x) => x.code === 'PN407');
    expect(f.map((x) => x.message)).toEqual(['Plateau pressure 11 cmH2O equals the set PEEP plus intrinsic PEEP with a tidal volume of 380 mL: a breath delivered with no rise in pressure, which no respiratory system allows; consistent with a transcription error in the plateau, the set PEEP or the intrinsic PEEP.']);
  });
});

describe('PN405 names the end-expiratory pressure the driving pressure took', () => {
  // Driving pressure above 15 cmH2O (common practice, no source; Amato et al., NEJM 2015, for driving
  // pressure and survival). 27 − 8 = 19, 30 − 12 = 18, 30 − (8 + 4) = 18 cmH2O.
  const pn405 = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN405').map((f) => f.message);

  it('the PEEP, a total PEEP of a hold, or the set plus intrinsic PEEP', () => {
    expect(pn405('@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, plateau 27')).toEqual(['Driving pressure is 19 cmH2O (plateau − PEEP), above 15 cmH2O.']);
    expect(pn405('@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, peep_total 12, plateau 30')).toEqual(['Driving pressure is 18 cmH2O (plateau − total PEEP), above 15 cmH2O.']);
    expect(pn405('@ 08:00\nvent mode VC, vt 450, rate 16, peep 8, autopeep 4, plateau 30')).toEqual(['Driving pressure is 18 cmH2O (plateau − (set PEEP + intrinsic PEEP)), above 15 cmH2O.']);
  });
});
