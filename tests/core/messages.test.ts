// The wording of check messages: a number a message names carries its unit, numbers are never
// rounded onto the wrong side of the value they are compared with, and lists read as sentences.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { CHECKS } from '../../server/src/core/checks/registry';
import { DERIVED } from '../../server/src/core/derive/registry';

function messages(text: string, code: string): string[] {
  return checkNote(text).findings.filter((f) => f.code === code).map((f) => f.message);
}

describe('a number in a message carries its unit', () => {
  it('impossible and unusual values are named with the unit they were read in', () => {
    expect(messages('labs na 250', 'PN301')).toEqual(['Sodium 250 mmol/L is impossible (expected 80 mmol/L to 200 mmol/L); it is not used in calculations.']);
    expect(messages('vitals hr 236', 'PN302')).toEqual(['Heart rate 236 /min is unusual (usually 30 /min to 220 /min): check the unit and the transcription.']);
    expect(messages('abg pco2 5 mmHg', 'PN302')).toEqual(['PaCO2 5 mmHg is unusual (usually 15 mmHg to 150 mmHg): check the unit and the transcription. As `5 kPa` it would be usual.']);
    // pH has no unit, and none is made up for it.
    expect(messages('abg ph 8.4', 'PN301')).toEqual(['pH (arterial) 8.4 is impossible (expected 6.30 to 8.00); it is not used in calculations.']);
    expect(messages('abg ph 6.5', 'PN302')).toEqual(['pH (arterial) 6.5 is unusual (usually 6.80 to 7.80): check the transcription.']);
  });

  it('ventilator pressures out of order name both pressures in cmH2O', () => {
    expect(messages('@ 08:00\nvent peep 14, plateau 12', 'PN303')).toEqual(['PEEP 14 cmH2O is above the plateau pressure 12 cmH2O; plateau pressure includes PEEP.']);
    expect(messages('@ 08:00\nvent plateau 28, peak 25', 'PN304')).toEqual(['Plateau pressure 28 cmH2O is above the peak pressure 25 cmH2O; were they swapped?']);
  });

  it('non-invasive pressures out of order (EPAP above IPAP) name both in cmH2O; equal ones or in order are fine', () => {
    // Bilevel ventilation: IPAP = EPAP + pressure support, so IPAP ≥ EPAP (common practice, no source).
    expect(messages('@ 08:00\noxygen niv ipap 6, epap 14, fio2 0.4', 'PN315')).toEqual(['EPAP 14 cmH2O is above the IPAP 6 cmH2O; the inspiratory pressure is the higher of the two. Were they swapped?']);
    expect(messages('@ 08:00\noxygen niv ipap 14, epap 6, fio2 0.4', 'PN315')).toEqual([]);
    expect(messages('@ 08:00\noxygen niv ipap 8, epap 8, fio2 0.4', 'PN315')).toEqual([]);
    // Reported once, where the line is written, not at the timepoints it carries to.
    const once = checkNote('@ 08:00\noxygen niv ipap 5, epap 6, fio2 0.4\n@ 09:00\nvitals hr 80').findings.filter((f) => f.code === 'PN315');
    expect(once.map((f) => f.range.start.line)).toEqual([1]);
  });

  it('a pressure just above the other keeps the decimals that tell them apart', () => {
    expect(messages('@ 08:00\nvent peep 10.004, plateau 10', 'PN303')).toEqual(['PEEP 10.004 cmH2O is above the plateau pressure 10 cmH2O; plateau pressure includes PEEP.']);
  });

  it('a blood pressure written the wrong way round names its unit', () => {
    expect(messages('@ 08:00\nvitals bp 58/96', 'PN305')).toEqual(['Blood pressure 58/96 mmHg: the systolic value is below the diastolic.']);
  });

  it('HCO3 that does not fit the pH and PaCO2 is in mmol/L', () => {
    expect(messages('@ 08:00\nabg 7.40/40/90/15', 'PN402')).toEqual([
      'HCO3 15.0 mmol/L does not fit pH 7.40 and PaCO2 40 mmHg, which give 24.5 mmol/L: a transcription error, or values from different samples?',
    ]);
  });

  it('so is a venous gas checked, by the same Henderson–Hasselbalch equation, and named as venous (standard physiology)', () => {
    // pH 7.28 and PvCO2 52 mmHg give 0.0307 × 52 × 10^1.18 ≈ 24.2 mmol/L, not 35.
    expect(messages('@ 08:00\nvbg 7.28/52/35/35', 'PN402')).toEqual([
      'HCO3 35.0 mmol/L does not fit the venous pH 7.28 and PvCO2 52 mmHg, which give 24.2 mmol/L: a transcription error, or values from different samples?',
    ]);
    // A venous gas that fits (0.0307 × 52 × 10^1.18 ≈ 24.2 for 24.5) is not reported, nor is an arterial
    // gas checked against a venous one stated beside it.
    expect(messages('@ 08:00\nvbg 7.28/52/35/24.5\nabg 7.40/40/90/24.4', 'PN402')).toEqual([]);
  });
});

describe('FiO2 outside 0.21–1.0 (PN307) is compared in the unit it was read in', () => {
  it('a bare number above 1 says it was read as a percentage, and is compared with 21 %', () => {
    expect(messages('oxygen mask, fio2 4', 'PN307')).toEqual(['FiO2 4 (read as 4 %) is below 21 % (room air); it is not used in calculations.']);
  });

  it('a percentage with its sign, and a fraction, are compared in their own unit', () => {
    expect(messages('oxygen hfnc 60 L/min, fio2 101 %', 'PN307')).toEqual(['FiO2 101 % is above 100 % (pure oxygen); it is not used in calculations.']);
    expect(messages('oxygen venturi, fio2 0.2', 'PN307')).toEqual(['FiO2 0.2 is below 0.21 (room air); it is not used in calculations.']);
  });
});

describe('gas pressures in a note read in kPa', () => {
  it('are given in kPa first, with mmHg beside them', () => {
    const kpa = 'units gas kPa\n@ 08:00\noxygen room air';
    expect(messages(`${kpa}\nabg ph 7.40, pco2 5.3, po2 21.3`, 'PN401')).toEqual([
      'PaO2 21.3 kPa (160 mmHg) is above the alveolar PO2 of 13.3 kPa (100 mmHg) that FiO2 0.21 allows here: check the FiO2, the unit, and whether the sample had an air bubble.',
    ]);
    expect(messages(`${kpa}\nabg ph 7.40, pco2 5.3, po2 12, hco3 15`, 'PN402')).toEqual([
      'HCO3 15.0 mmol/L does not fit pH 7.40 and PaCO2 5.3 kPa (40 mmHg), which give 24.4 mmol/L: a transcription error, or values from different samples?',
    ]);
  });
});

describe('a stated gas pressure is quoted back as it was written', () => {
  // 1 kPa = 7.50062 mmHg (definition of the units): 21.35 kPa = 160.1 mmHg, 5.33 kPa = 40.0 mmHg.
  it('in kPa, with its own decimals', () => {
    const kpa = 'units gas kPa\n@ 08:00\noxygen room air';
    expect(messages(`${kpa}\nabg ph 7.40, pco2 5.3, po2 21.35`, 'PN401')).toEqual([
      'PaO2 21.35 kPa (160 mmHg) is above the alveolar PO2 of 13.3 kPa (100 mmHg) that FiO2 0.21 allows here: check the FiO2, the unit, and whether the sample had an air bubble.',
    ]);
    expect(messages(`${kpa}\nabg ph 7.40, pco2 5.33, po2 12, hco3 15`, 'PN402')).toEqual([
      'HCO3 15.0 mmol/L does not fit pH 7.40 and PaCO2 5.33 kPa (40 mmHg), which give 24.5 mmol/L: a transcription error, or values from different samples?',
    ]);
  });

  it('in mmHg, with its own decimals', () => {
    expect(messages('@ 08:00\nabg 7.40/40.5/90/15', 'PN402')).toEqual([
      'HCO3 15.0 mmol/L does not fit pH 7.40 and PaCO2 40.5 mmHg, which give 24.8 mmol/L: a transcription error, or values from different samples?',
    ]);
  });
});

describe('lists in messages read as sentences', () => {
  it('the units a field takes are a choice: "mmHg or kPa"', () => {
    expect(messages('abg po2 71 mmhgg', 'PN202')).toEqual(['`mmhgg` is not a unit Pneumark knows; PaO2 takes mmHg or kPa.']);
    expect(messages('vitals temp 37 mmHg', 'PN203')).toEqual(['Temperature is not measured in `mmHg`; it takes C or F.']);
    expect(messages('vitals hr 80 mmHg', 'PN203')).toEqual(['Heart rate is not measured in `mmHg`; it takes /min.']);
  });

  it('a unit the field does not take is named as the note spells it, not by the unit it was read as', () => {
    // `day` is the unit d, `bpm` /min, `celsius` C, `mbar` read as hPa for a blood pressure: the
    // message quoted the unit's name (`not measured in d`), which the note does not hold.
    expect(messages('vitals hr 80 day', 'PN203')).toEqual(['Heart rate is not measured in `day`; it takes /min.']);
    expect(messages('vitals temp 37 bpm', 'PN203')).toEqual(['Temperature is not measured in `bpm`; it takes C or F.']);
    expect(messages('vitals rr 20 celsius', 'PN203')).toEqual(['Respiratory rate is not measured in `celsius`; it takes /min.']);
    expect(messages('vitals bp 120/80 mbar', 'PN203')).toEqual(['Blood pressure is not measured in `mbar`; it takes mmHg.']);
    expect(messages('oxygen fio2 40 %sat', 'PN203')).toEqual(['FiO2 is not measured in `%sat`; it takes fraction or %.']);
    expect(messages('vitals map 90 mm Hg', 'PN203')).toEqual([]);
    expect(messages('labs na 140 kPa', 'PN203')).toEqual(['Sodium is not measured in `kPa`; it takes mmol/L or mEq/L.']);
  });

  it('a pH, which has no unit, is not said to take one: not the unit name `ph`, which no note writes; the fix removes the unit written', () => {
    // It said "pH (arterial) is not measured in mmHg; it takes ph." and offered "Change to ph".
    const [f] = checkNote('@ 08:00\nabg ph 7.4 mmHg, pco2 40').findings.filter((x) => x.code === 'PN203');
    expect(f?.message).toBe('pH (arterial) is not measured in `mmHg`; it is written without a unit.');
    expect(f?.fixes.map((x) => x.title)).toEqual(['Remove `mmHg`']);
    expect(f?.fixes[0]?.edits.map((e) => [e.range.start.character, e.range.end.character, e.newText])).toEqual([[10, 15, '']]);
    expect(messages('@ 08:00\nvbg ph 7.35 kPa', 'PN203')).toEqual(['pH (venous) is not measured in `kPa`; it is written without a unit.']);
  });
});

describe('privacy messages', () => {
  it('give the age and the relative day as examples, not as values worked out from the note', () => {
    expect(messages('note DOB 12/03/1961', 'PN502')).toEqual(['`12/03/1961` looks like a date of birth (after `DOB`); write the age on the patient line instead (e.g. `patient age 64 y`).']);
    expect(messages('note seen on 4 March 2026', 'PN503')).toEqual(['`4 March 2026` is a calendar date; write a relative day instead (e.g. `@ day 2 08:00`), which keeps dates of care out of shared notes.']);
  });
});

describe('sources', () => {
  it('run one citation after another as sentences, never with a semicolon after a full stop', () => {
    for (const c of CHECKS) expect(c.source, c.code).not.toMatch(/\.[;,]|\.\s*\(/);
    for (const d of DERIVED) expect(d.source, d.id).not.toMatch(/\.[;,]|\.\s*\(/);
  });
});
