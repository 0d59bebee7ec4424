// A tidal volume has a usual minimum: 2 mL per kg of body size (the smaller of the weight and the
// predicted body weight in force), or 50 mL where the note gives neither (2 mL/kg of the 25 kg soft
// minimum of weight). The figure is half the 4 mL/kg PBW at the bottom of the ARDS Network range
// (ARDS Network, Ventilation with lower tidal volumes…, NEJM 2000;342:1301–1308); halving it is
// common practice, no source. So `vt 5 L` (impossible) is not offered mL: 5 mL is a usual tidal
// volume only for the smallest infants. 1 L = 1000 mL by definition.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { applyEdits } from '../../server/src/core/service/text-edits';

const findings = (text: string, code: string) => checkNote(text).findings.filter((f) => f.code === code);

describe('PN301 offers another unit only where the value is usual there', () => {
  it('`vt 5 L` is impossible, and not offered mL (5 mL is no usual tidal volume)', () => {
    const [f] = findings('@ 08:00\nvent mode VC, vt 5 L, rate 20', 'PN301');
    expect(f?.message).toBe('Tidal volume 5 L is impossible (expected 0 L to 3 L); it is not used in calculations.');
    expect(f?.fixes).toEqual([]);
  });

  it('`vt 450 L` is offered mL, and the fixed note reads 450 mL', () => {
    const text = '@ 08:00\nvent mode VC, vt 450 L, rate 20';
    const [f] = findings(text, 'PN301');
    expect(f?.message).toMatch(/In mL it would be ordinary\.$/);
    const fixed = applyEdits(text, f!.fixes[0]!.edits);
    expect(fixed).toBe('@ 08:00\nvent mode VC, vt 450 mL, rate 20');
    expect(checkNote(fixed).findings).toEqual([]);
  });

  it('follows the body size: 50 mL is usual for no stated size (50 mL floor) and for 3 kg, not for 82 kg', () => {
    expect(findings('@ 08:00\nvent vt 50 L', 'PN301')[0]?.fixes.map((x) => x.title)).toEqual(['Write mL instead of L']);
    // 82 kg × 2 mL/kg = 164 mL.
    expect(findings('patient weight 82 kg\n@ 08:00\nvent vt 50 L', 'PN301')[0]?.fixes).toEqual([]);
    // 3 kg × 2 mL/kg = 6 mL: 15 mL is usual (5 mL/kg), 5 mL is not (1.7 mL/kg).
    expect(findings('patient weight 3 kg\n@ 08:00\nvent vt 15 L', 'PN301')[0]?.fixes.map((x) => x.title)).toEqual(['Write mL instead of L']);
    expect(findings('patient weight 3 kg\n@ 08:00\nvent vt 5 L', 'PN301')[0]?.fixes).toEqual([]);
  });

  it('uses the predicted body weight when it is the smaller size', () => {
    // Female, 165 cm: PBW = 45.5 + 0.91 × (165 − 152.4) = 56.97 kg (ARDS Network 2000), floor 114 mL;
    // by the 120 kg weight alone the floor would be 240 mL.
    const note = 'patient sex female, height 165 cm, weight 120 kg\n@ 08:00\nvent vt 200 mL';
    expect(findings(note, 'PN302')).toEqual([]);
    expect(findings(note.replace('200', '100'), 'PN302')[0]?.message).toBe('Tidal volume 100 mL is unusual (usually 114 mL to 1200 mL): check the unit and the transcription.');
  });

  it('keeps the other fields\' suggestions: PaO2 in kPa vs mmHg, temperature in F', () => {
    // 56 kPa = 420 mmHg (1 kPa = 7.50062 mmHg), impossible; 56 mmHg is an ordinary PaCO2.
    expect(findings('@ 08:00\nabg pco2 56 kPa', 'PN301')[0]?.fixes.map((x) => x.title)).toEqual(['Write mmHg instead of kPa']);
    // 400 kPa = 3000 mmHg, impossible; 400 mmHg is a usual PaO2 on oxygen.
    expect(findings('@ 08:00\nabg po2 400 kPa', 'PN301')[0]?.fixes.map((x) => x.title)).toEqual(['Write mmHg instead of kPa']);
    // 30 kPa = 225 mmHg, an impossible end-tidal CO2; 30 mmHg is usual.
    expect(findings('@ 08:00\nvitals etco2 30 kPa', 'PN301')[0]?.fixes.map((x) => x.title)).toEqual(['Write mmHg instead of kPa']);
  });
});

describe('a tidal volume below its usual minimum', () => {
  it('bare `vt 0.45` is doubted as mL and offered L (450 mL)', () => {
    const [f] = findings('@ 08:00\nvent mode VC, vt 0.45, rate 20', 'PN204');
    expect(f?.message).toBe('Tidal volume 0.45 was read in mL, where it is implausible; in L it would be ordinary. Add the unit (or convert); it is not used in calculations until then.');
    expect(f?.fixes.map((x) => x.title)).toContain('Mark as L');
  });

  it('`vt 0.45 mL` and `vt 40 mL` are unusual (PN302), as is 100 mL for an 82 kg patient; 400 mL is not', () => {
    expect(findings('@ 08:00\nvent vt 0.45 mL', 'PN302')[0]?.message).toBe('Tidal volume 0.45 mL is unusual (usually 50 mL to 1200 mL): check the unit and the transcription. As `0.45 L` it would be usual.');
    expect(findings('@ 08:00\nvent vt 40 mL', 'PN302')).toHaveLength(1);
    expect(findings('patient weight 82 kg\n@ 08:00\nvent vt 100 mL', 'PN302')[0]?.message).toBe('Tidal volume 100 mL is unusual (usually 164 mL to 1200 mL): check the unit and the transcription.');
    expect(findings('patient weight 82 kg\n@ 08:00\nvent vt 400 mL', 'PN302')).toEqual([]);
    // The 3 kg weight is unusual itself (PN302 on the patient line); 20 mL is not (6.7 mL/kg).
    expect(findings('patient weight 3 kg\n@ 08:00\nvent vt 20 mL', 'PN302').map((f) => f.range.start.line)).toEqual([0]);
  });
});

describe('high-frequency oscillation', () => {
  // HFOV moves 1–3 mL/kg a breath (common practice, no source): 150 mL for 82 kg is 1.8 mL/kg,
  // below the 164 mL usual minimum of conventional breaths, and usual in HFOV.
  const note = (mode: string) => `patient weight 82 kg\n@ 08:00\nvent mode ${mode}, vt 150 mL`;

  it('keeps a tidal volume of 1–3 mL/kg quiet in HFOV, and reports it in volume control', () => {
    expect(findings(note('HFOV'), 'PN302')).toEqual([]);
    expect(findings(note('VC'), 'PN302')).toHaveLength(1);
  });

  it('still reports a tidal volume above the usual maximum in HFOV', () => {
    expect(findings('@ 08:00\nvent mode HFOV, vt 2500 mL', 'PN302')).toHaveLength(1);
  });
});

describe('PN302 offers the unit in which an unusual value is usual', () => {
  it('`vt 0.45 mL` is offered L (0.45 L = 450 mL), not as the preferred fix, and the fixed note is clean', () => {
    const text = '@ 08:00\nvent mode VC, vt 0.45 mL, rate 16';
    const [f] = findings(text, 'PN302');
    expect(f?.fixes.map((x) => [x.title, x.preferred ?? false])).toEqual([['Write L instead of mL', false]]);
    expect(checkNote(applyEdits(text, f!.fixes[0]!.edits)).findings).toEqual([]);
  });

  it('offers nothing where no other unit makes the number usual (`vt 40 mL` is 0.04 mL or 40 L)', () => {
    expect(findings('@ 08:00\nvent vt 40 mL', 'PN302')[0]?.fixes).toEqual([]);
  });
});
