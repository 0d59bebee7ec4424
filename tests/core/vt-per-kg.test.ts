// A tidal volume written per kg of predicted body weight (`vt 6 mL/kg`) is read in mL from the PBW
// in force: PBW male 50 + 0.91 × (height cm − 152.4), female 45.5 + 0.91 × (height cm − 152.4), for
// adults (The Acute Respiratory Distress Syndrome Network, Ventilation with lower tidal volumes as
// compared with traditional tidal volumes for acute lung injury and the acute respiratory distress
// syndrome, N Engl J Med 2000;342:1301–1308, as SOURCES['ardsnet-2000'] cites it: the slope 0.91
// from memory, the protocol card's 2.3 per inch read in its reproduction). Its lung-protective
// range, 4 to 8 mL/kg, from the same source. The 30 mL/kg hard bound is common practice, no source.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { derivedValueOf } from '../../server/src/core/derive/registry';
import { PBW_ADULT_FROM_YEARS } from '../../server/src/core/derive/mechanics';
import { PER_KG_ADULT_FROM_YEARS } from '../../server/src/core/analysis/per-kg-volume';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { completionsAt, hoverAt } from '../../server/src/core/service';
import { formatStated } from '../../server/src/core/present';
import { noteAt } from '../service/cursor';
import { bundleObservations, timepointRows, toFhirBundle } from '../../server/src/core/export';

const codes = (text: string) => checkNote(text).findings.map((f) => f.code);
const findings = (text: string, code: string) => checkNote(text).findings.filter((f) => f.code === code);

function derived(text: string, id: string, tp = 0): number | null {
  const result = checkNote(text);
  return derivedValueOf(result.analysis.derivation(tp), id)?.value ?? null;
}

function vtInForce(text: string, tp = 0) {
  return checkNote(text).analysis.timeline.timepoints[tp]!.values.get('vt')!.stated;
}

// Male, 175 cm: PBW = 50 + 0.91 × (175 − 152.4) = 50 + 20.566 = 70.566 kg; 6 mL/kg × 70.566 kg = 423.396 mL.
const MALE = 'patient age 60, sex male, height 175 cm\n@ 08:00\nvent mode VC, vt 6 mL/kg, rate 16, peep 8, plateau 20';
// Female, 160 cm: PBW = 45.5 + 0.91 × (160 − 152.4) = 45.5 + 6.916 = 52.416 kg; 7 mL/kg × 52.416 kg = 366.912 mL.
const FEMALE = 'patient sex female, height 160 cm\n@ 08:00\nvent mode VC, vt 7 ml/kg, rate 20';

describe('a tidal volume in mL/kg, read in mL from the predicted body weight', () => {
  it('male: 6 mL/kg at 175 cm is 423.396 mL, used by every derived value, with no finding', () => {
    expect(codes(MALE)).toEqual([]);
    const vt = vtInForce(MALE);
    expect(vt.usable).toBe(true);
    expect(vt.value).toBeCloseTo(423.396, 9);
    expect(derived(MALE, 'predicted_body_weight')).toBeCloseTo(70.566, 9);
    expect(derived(MALE, 'vt_per_kg_pbw')).toBeCloseTo(6, 12);
    // VE = 423.396 mL × 16 /min ÷ 1000 = 6.774336 L/min; Cstat = 423.396 ÷ (20 − 8) = 35.283 mL/cmH2O.
    expect(derived(MALE, 'minute_ventilation')).toBeCloseTo(6.774336, 9);
    expect(derived(MALE, 'compliance_static')).toBeCloseTo(35.283, 9);
    expect(formatStated(vt)).toBe('423 mL');
  });

  it('female, height and sex carried from the header: 7 ml/kg at 160 cm is 366.912 mL', () => {
    expect(codes(FEMALE)).toEqual([]);
    expect(vtInForce(FEMALE).value).toBeCloseTo(366.912, 9);
    expect(derived(FEMALE, 'vt_per_kg_pbw')).toBeCloseTo(7, 12);
    // 366.912 × 20 ÷ 1000 = 7.33824 L/min.
    expect(derived(FEMALE, 'minute_ventilation')).toBeCloseTo(7.33824, 9);
  });

  it('is carried forward in mL, as read where it was written', () => {
    const text = `${MALE}\n@ 09:00\nvent rate 18`;
    expect(vtInForce(text, 1).value).toBeCloseTo(423.396, 9);
    // 423.396 mL × 18 /min ÷ 1000 = 7.621128 L/min.
    expect(derived(text, 'minute_ventilation', 1)).toBeCloseTo(7.621128, 9);
  });

  it('derived values name where the volume came from: the number written × PBW', () => {
    const result = checkNote(MALE);
    const ve = derivedValueOf(result.analysis.derivation(0), 'minute_ventilation')!;
    const vt = ve.inputs.find((t) => t.fieldId === 'vt')!;
    expect(vt.note).toBe('6 mL/kg × PBW 70.6 kg, ARDS Network 2000 equation');
    const { result: r, position } = noteAt('patient age 60, sex male, height 175 cm\n@ 08:00\nvent mode VC, vt 6| mL/kg, rate 16');
    expect(hoverAt(r, position)?.markdown).toContain('Value: **423 mL** = 6 mL/kg × PBW 70.6 kg (ARDS Network 2000 equation)');
    const unread = noteAt('@ 08:00\nvent mode VC, vt 6| mL/kg, rate 16');
    const shown = hoverAt(unread.result, unread.position)?.markdown ?? '';
    expect(shown).toContain('Value: **6 mL/kg** (not read in mL)');
    expect(shown).toContain('see the PN325 finding on this line');
  });
});

describe('where no predicted body weight is worked out (PN325)', () => {
  it('without a height: shown as written, not used, and the finding asks for the height (no fix invents one)', () => {
    const text = 'patient sex male\n@ 08:00\nvent mode VC, vt 6 mL/kg, rate 16';
    const [f] = findings(text, 'PN325');
    expect(f?.message).toBe('Tidal volume 6 mL/kg is per kg of predicted body weight, which needs the height on a patient line; it is not used in calculations until then (or write it in mL).');
    expect(f?.fixes).toEqual([]);
    expect(codes(text)).toEqual(['PN325']);
    expect(vtInForce(text).usable).toBe(false);
    expect(formatStated(vtInForce(text))).toBe('6 mL/kg');
    expect(derived(text, 'minute_ventilation')).toBeNull();
  });

  it('without a sex, or without both', () => {
    expect(findings('patient height 170 cm\n@ 08:00\nvent vt 6 mL/kg', 'PN325')[0]?.message).toContain('which needs the sex on a patient line;');
    expect(findings('@ 08:00\nvent vt 6 mL/kg', 'PN325')[0]?.message).toContain('which needs the height and sex on a patient line;');
  });

  it('a child: the ARDS Network equation is for adults', () => {
    const text = 'patient age 8, sex female, height 128 cm\n@ 08:00\nvent mode VC, vt 6 mL/kg, rate 24';
    expect(findings(text, 'PN325')[0]?.message).toBe('Tidal volume 6 mL/kg is per kg of predicted body weight, which is not worked out at age 8 y: the ARDS Network equation is for adults (18 years or more); it is not used in calculations until then (or write it in mL).');
    expect(derived(text, 'minute_ventilation')).toBeNull();
    expect(PER_KG_ADULT_FROM_YEARS).toBe(PBW_ADULT_FROM_YEARS);
  });
});

describe('bounds of a tidal volume per kg', () => {
  const at = (perKg: string) => `patient age 60, sex male, height 175 cm\n@ 08:00\nvent mode VC, vt ${perKg} mL/kg, rate 16`;

  it('4 to 8 mL/kg is the usual lung-protective range (ARDS Network 2000): no finding at either end', () => {
    expect(codes(at('4'))).toEqual([]);
    expect(codes(at('8'))).toEqual([]);
  });

  it('below 4 mL/kg: PN325; above 8 mL/kg: PN403, from the VT/PBW it gives', () => {
    expect(findings(at('3.5'), 'PN325')[0]?.message).toBe('Tidal volume 3.5 mL/kg of predicted body weight is below the lung-protective 4–8 mL/kg: check the transcription.');
    expect(codes(at('9'))).toEqual(['PN403']);
    // In HFOV 1–3 mL/kg is usual: no finding.
    expect(codes('patient age 60, sex male, height 175 cm\n@ 08:00\nvent mode HFOV, vt 2 mL/kg, rate 5 Hz')).not.toContain('PN325');
  });

  it('a volume in mL written with mL/kg (`vt 450 mL/kg`) is impossible, not used, and offered mL', () => {
    const text = at('450');
    const [f] = findings(text, 'PN325');
    expect(f?.message).toBe('Tidal volume 450 mL/kg is impossible per kg of predicted body weight (at most 30 mL/kg): a volume in mL (450 mL)? It is not used in calculations.');
    expect(codes(text)).toEqual(['PN325']);
    expect(derived(text, 'minute_ventilation')).toBeNull();
    expect(f?.fixes.map((x) => x.title)).toEqual(['Write 450 mL']);
    const fixed = applyEdits(text, f!.fixes[0]!.edits);
    expect(fixed).toBe(at('450').replace('450 mL/kg', '450 mL'));
    expect(codes(fixed)).toEqual([]);
  });

  it('a number above the largest tidal volume in mL (3000 mL, the field\'s hard maximum) is offered no volume in mL either', () => {
    const [f] = findings(at('3500'), 'PN325');
    expect(f?.message).toContain('impossible per kg of predicted body weight (at most 30 mL/kg)');
    expect(f?.message).not.toContain('a volume in mL');
    expect(f?.fixes).toEqual([]);
    expect(findings(at('3000'), 'PN325')[0]?.fixes.map((x) => x.title)).toEqual(['Write 3000 mL']);
  });

  it('30 mL/kg is read (PN403 reports it), 31 and 0 are impossible; 0 is offered nothing', () => {
    expect(codes(at('30'))).toEqual(['PN403']);
    expect(findings(at('31'), 'PN325')[0]?.message).toContain('(at most 30 mL/kg): a volume in mL (31 mL)?');
    const [zero] = findings(at('0'), 'PN325');
    expect(zero?.message).toBe('Tidal volume 0 mL/kg is impossible per kg of predicted body weight (above 0 mL/kg). It is not used in calculations.');
    expect(zero?.fixes).toEqual([]);
  });
});

describe('exports of a tidal volume per kg', () => {
  const plain = { redactProse: false, shiftDays: 0 } as const;

  it('CSV and JSON Lines: vt_mL is the volume read in mL, empty where none was read', () => {
    const [row] = timepointRows('note.pneu', checkNote(MALE), plain);
    expect(row?.vt_mL).toBeCloseTo(423.396, 9);
    expect(row?.vt_per_kg_pbw_mL_kg).toBeCloseTo(6, 12);
    const [unread] = timepointRows('note.pneu', checkNote('@ 08:00\nvent mode VC, vt 6 mL/kg, rate 16'), plain);
    expect(unread?.vt_mL ?? null).toBeNull();
  });

  it('FHIR: the tidal volume Observation in mL where it was read, none where it was not', () => {
    const vtOf = (text: string) => bundleObservations(toFhirBundle('note.pneu', checkNote(text), plain)).filter((r) => r.code.coding?.[0]?.code === '20112-9') ?? [];
    const [obs] = vtOf(MALE);
    expect(obs?.valueQuantity?.unit).toBe('mL');
    expect(obs?.valueQuantity?.value).toBeCloseTo(423.396, 9);
    expect(vtOf('@ 08:00\nvent mode VC, vt 6 mL/kg, rate 16')).toEqual([]);
  });
});

describe('in the editor', () => {
  it('completion offers mL/kg after a tidal volume number', () => {
    const { result, position } = noteAt('@ 08:00\nvent vt 6 |');
    expect(completionsAt(result, position).map((c) => c.label)).toContain('mL/kg');
  });
});
