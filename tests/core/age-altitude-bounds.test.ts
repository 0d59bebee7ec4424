// Usual (soft) bounds of age and altitude, and the unit a finding offers for them. Sources, as in
// the field registry: the oldest verified age is 122 years (read in the Wikipedia article on Jeanne Calment), and above 110 years is
// unusual (common practice, no source); the highest permanently inhabited places are about
// 5,100 m (from memory), the lowest dry land, the Dead Sea shore, about −430 m (from memory).
// A unit is offered (PN204, PN301, PN302) only where the number is usual in it, not merely
// possible. Conversions are the units' definitions: 1 ft = 0.3048 m; 1 mo = 1/12 y.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { applyEdits, codeActions } from '../../server/src/core/service';
import type { Finding } from '../../server/src/core/types';

const findings = (text: string) => checkNote(text).findings.map((f) => [f.code, f.fixes.map((x) => x.title)] as const);

/** The quick fixes the editor is offered on a finding, through the core's code actions. */
function quickFixes(text: string, f: Finding): { title: string; preferred: boolean; fixed: string }[] {
  return codeActions(checkNote(text), f.range)
    .filter((a) => a.kind === 'quickfix' && a.findingCodes?.includes(f.code))
    .map((a) => ({ title: a.title, preferred: a.preferred === true, fixed: applyEdits(text, a.edits) }));
}

describe('altitude: usual up to about 5,100 m', () => {
  it('an ordinary altitude, in m or ft, has no finding', () => {
    expect(findings('place altitude 4000 m')).toEqual([]);
    expect(findings('place altitude 4000')).toEqual([]);
    expect(findings('place altitude 13000 ft')).toEqual([]);
  });

  it('above the highest inhabited places is unusual (PN302), and still estimates the barometric pressure', () => {
    // 6,000 ft (1,829 m) is usual: offered, not preferred, since 6,000 m is possible.
    const text = 'place altitude 6000 m';
    const [f] = checkNote(text).findings;
    expect(f?.message).toBe('Altitude 6000 m is unusual (usually -450 m to 5100 m): check the unit and the transcription. As `6000 ft` it would be usual.');
    expect(quickFixes(text, f!).map((x) => [x.title, x.preferred, x.fixed])).toEqual([['Write ft instead of m', false, 'place altitude 6000 ft']]);
    // West's model atmosphere at 6 km: exp(6.63268 − 0.6672 − 0.05364) ≈ 369 mmHg (West JB, J Appl Physiol 1996, its equation read in a reproduction).
    expect(checkNote('place altitude 6000 m\n@ 08:00\nvitals hr 90').analysis.timeline.timepoints[0]!.barometricMmhg).toBeCloseTo(369, 0);
    // In ft the same bound: 17,000 ft is 5,182 m; as metres 17,000 would be impossible, so nothing is offered.
    expect(findings('place altitude 17000 ft')).toEqual([['PN302', []]]);
  });

  it('16000 with no unit reads as feet (4,877 m is usual), and is not used until the unit is written', () => {
    const text = 'place altitude 16000';
    const [f] = checkNote(text).findings;
    expect(f?.code).toBe('PN204');
    expect(quickFixes(text, f!).map((x) => [x.title, x.preferred, x.fixed])).toEqual([
      ['Mark as ft', false, 'place altitude 16000 ft'],
      ['Convert to 4877 m', false, 'place altitude 4877'],
    ]);
    expect(findings('place altitude 16000 ft')).toEqual([]);
  });

  it('16000 m is impossible, and offered ft, in which it is usual', () => {
    const text = 'place altitude 16000 m';
    const [f] = checkNote(text).findings;
    expect(f?.message).toBe('Altitude 16000 m is impossible (expected -500 m to 9000 m); it is not used in calculations. In ft it would be ordinary.');
    const fixes = quickFixes(text, f!);
    expect(fixes.map((x) => [x.title, x.preferred, x.fixed])).toEqual([['Write ft instead of m', false, 'place altitude 16000 ft']]);
    expect(checkNote(fixes[0]!.fixed).findings).toEqual([]);
  });

  it('offers no unit in which the number is possible but unusual: 25,000 ft is 7,620 m', () => {
    for (const text of ['place altitude 25000 m', 'place altitude 25000']) {
      const [f] = checkNote(text).findings;
      expect(f?.code, text).toBe('PN301');
      expect(f?.message, text).toBe('Altitude 25000 m is impossible (expected -500 m to 9000 m); it is not used in calculations.');
      expect(quickFixes(text, f!), text).toEqual([]);
    }
    // Bare 17000 likewise: 17,000 ft (5,182 m) is unusual, so it is not doubted as feet but impossible as metres.
    expect(findings('place altitude 17000')).toEqual([['PN301', []]]);
  });

  it('a bare altitude that is possible in metres is read in metres, unusual or not (a camp at 6,000 m stays in the estimate)', () => {
    const r = checkNote('place altitude 6000\n@ 08:00\nvitals hr 90');
    expect(r.findings.map((f) => f.code)).toEqual(['PN302']);
    expect(r.analysis.timeline.header.find((s) => s.fieldId === 'altitude')?.usable).toBe(true);
  });
});

describe('age: usual up to 110 years', () => {
  it('an ordinary age, in y or mo, has no finding; 900 mo is 75 years, an odd way to write it but an ordinary age', () => {
    expect(findings('patient age 75 y')).toEqual([]);
    expect(findings('patient age 18 mo')).toEqual([]);
    expect(findings('patient age 900 mo')).toEqual([]);
  });

  it('900 with no unit reads as months (75 years); 900 y is impossible and offered mo', () => {
    const bare = 'patient age 900';
    const [doubt] = checkNote(bare).findings;
    expect(doubt?.code).toBe('PN204');
    expect(quickFixes(bare, doubt!).map((x) => [x.title, x.fixed])).toEqual([['Mark as mo', 'patient age 900 mo'], ['Convert to 75 y', 'patient age 75']]);
    const text = 'patient age 900 y';
    const [f] = checkNote(text).findings;
    expect(f?.code).toBe('PN301');
    expect(quickFixes(text, f!).map((x) => [x.title, x.preferred, x.fixed])).toEqual([['Write mo instead of y', false, 'patient age 900 mo']]);
  });

  it('above 110 years is unusual (PN302); months are offered where they give a usual age, and never for a bare number', () => {
    const text = 'patient age 125 y';
    const [f] = checkNote(text).findings;
    expect(f?.message).toBe('Age 125 y is unusual (usually at most 110 y): check the unit and the transcription. As `125 mo` it would be usual.');
    expect(quickFixes(text, f!).map((x) => [x.title, x.preferred, x.fixed])).toEqual([['Write mo instead of y', false, 'patient age 125 mo']]);
    // A bare 115 is read as years (possible), flagged, and kept.
    const bare = checkNote('patient age 115');
    expect(bare.findings.map((x) => [x.code, x.fixes.length])).toEqual([['PN302', 0]]);
    expect(bare.analysis.timeline.header.find((s) => s.fieldId === 'age')?.usable).toBe(true);
  });

  it('offers no unit in which the number is possible but unusual: 1,400 mo is 116.7 years', () => {
    expect(findings('patient age 1400 y')).toEqual([['PN301', []]]);
    expect(findings('patient age 1400')).toEqual([['PN301', []]]);
    // 1500 mo is 125 years: unusual, and as years impossible, so nothing is offered.
    expect(findings('patient age 1500 mo')).toEqual([['PN302', []]]);
  });
});
