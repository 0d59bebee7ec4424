// A modest rise of the anion gap in a primary metabolic alkalosis comes from the alkalaemia itself
// (albumin's net negative charge rises, and volume contraction concentrates it) and is commonly not
// an added high-gap acidosis: Madias NE, Ayus JC, Adrogué HJ. Increased anion gap in metabolic
// alkalosis: the role of plasma-protein equivalency. N Engl J Med 1979;300:1421–1423 (from memory).
// The margin, a gap up to 4 mmol/L above the upper normal 12 mmol/L so read: common practice, no
// source. Gases invented; pH 7.52, PaCO2 50, HCO3 38 agree by Henderson–Hasselbalch (0.0307 × 50 ×
// 10^1.42 = 40.4 mmol/L, within 10 %), and the PaCO2 is within 40 + 0.7 × (38 − 24) ± 2 = 47.8–51.8
// mmHg (Berend 2014).
import { describe, expect, it } from 'vitest';
import { ALKALOSIS_ANION_GAP_MARGIN_MMOL_L, classifyAcidBase } from '../../server/src/core/physiology/acid-base';
import { derivation, readings } from './helpers';

const alkalosis = (labs: string) => `@ 08:00\nabg 7.52/50/90/38\nlabs ${labs}`;
const finding = (text: string) => derivation(text).interpretations.find((i) => i.topic === 'acid-base')!.acidBase!;

describe('anion gap beside a primary metabolic alkalosis', () => {
  it('with an alkalaemia, a gap up to 4 mmol/L above 12 is read as the alkalaemia\'s own, not an added metabolic acidosis (Madias 1979; margin common practice, no source)', () => {
    expect(ALKALOSIS_ANION_GAP_MARGIN_MMOL_L).toBe(4);
    const gap14 = classifyAcidBase({ ph: 7.52, paco2Mmhg: 50, hco3MmolL: 38, anionGapMmolL: 14 })!;
    expect(gap14.primary).toBe('metabolic-alkalosis');
    expect(gap14.disorders).toEqual(['metabolic-alkalosis']);
    expect(gap14.anionGap?.high).toBe(true);
    expect(gap14.anionGap?.raisedByAlkalosis).toBe(true);
    // On the margin's end (12 + 4 = 16) still so; above it, an added acidosis as before.
    expect(classifyAcidBase({ ph: 7.52, paco2Mmhg: 50, hco3MmolL: 38, anionGapMmolL: 16 })!.disorders).toEqual(['metabolic-alkalosis']);
    const gap17 = classifyAcidBase({ ph: 7.52, paco2Mmhg: 50, hco3MmolL: 38, anionGapMmolL: 16.5 })!;
    expect(gap17.disorders).toEqual(['metabolic-alkalosis', 'metabolic-acidosis']);
    expect(gap17.anionGap?.raisedByAlkalosis).toBe(false);
  });

  it('AG 14 with pH 7.52, PaCO2 50, HCO3 38: the reading says so, and adds no acidosis', () => {
    // Na 140 − (Cl 88 + HCO3 38) = 14 mmol/L.
    const text = alkalosis('na 140, cl 88');
    expect(readings(text)['acid-base']).toBe(
      'Consistent with metabolic alkalosis (pH 7.52, PaCO2 50 mmHg, HCO3 38.0 mmol/L), with the expected respiratory response (PaCO2 within the expected 48–52 mmHg); anion gap 14 mmol/L, above 12 mmol/L by no more than 4: consistent with the alkalaemia itself raising the gap rather than an added metabolic acidosis.',
    );
    expect(finding(text).added).toEqual([]);
  });

  it('AG 22 with the same gas: the added metabolic acidosis is kept, as before', () => {
    // Na 140 − (Cl 80 + HCO3 38) = 22 mmol/L, 10 above 12: beyond the margin.
    const text = alkalosis('na 140, cl 80');
    expect(readings(text)['acid-base']).toBe(
      'Consistent with metabolic alkalosis (pH 7.52, PaCO2 50 mmHg, HCO3 38.0 mmol/L), with the expected respiratory response (PaCO2 within the expected 48–52 mmHg); also consistent with an added metabolic acidosis (anion gap 22 mmol/L, above 12 mmol/L).',
    );
    expect(finding(text).added).toEqual(['metabolic-acidosis']);
    // Just above the margin (140 − (85.7 + 38) = 16.3): shown with the decimal that keeps it above 16.
    expect(readings(alkalosis('na 140, cl 85.7'))['acid-base']).toContain('also consistent with an added metabolic acidosis (anion gap 16.3 mmol/L, above 12 mmol/L)');
  });

  it('a metabolic acidosis with a gap of 14 is read as before: a high-gap acidosis (the margin is for a primary alkalosis only)', () => {
    // pH 7.25, PaCO2 23, HCO3 9.8 (0.0307 × 23 × 10^1.15 = 9.97); Na 140 − (Cl 116.2 + 9.8) = 14.
    const text = '@ 08:00\nabg 7.25/23/96/9.8\nlabs na 140, cl 116.2';
    expect(finding(text).primary).toBe('metabolic-acidosis');
    expect(finding(text).anionGap).toBe('mixed-anion-gap');
    expect(readings(text)['acid-base']).not.toContain('alkalaemia itself');
    const cls = classifyAcidBase({ ph: 7.25, paco2Mmhg: 23, hco3MmolL: 9.8, anionGapMmolL: 14 })!;
    expect(cls.anionGap?.raisedByAlkalosis).toBe(false);
    expect(cls.anionGap?.metabolicAcidosisKind).toBe('mixed-anion-gap');
  });

  it('a metabolic alkalosis without an alkalaemia keeps its added acidosis: nothing raises the charge of albumin at a normal pH', () => {
    // pH 7.43, PaCO2 46, HCO3 30 (0.0307 × 46 × 10^1.33 = 30.2): a compensated metabolic alkalosis, pH within 7.35–7.45.
    const cls = classifyAcidBase({ ph: 7.43, paco2Mmhg: 46, hco3MmolL: 30, anionGapMmolL: 14 })!;
    expect(cls.primary).toBe('metabolic-alkalosis');
    expect(cls.phStatus).toBe('normal');
    expect(cls.additional).toContain('metabolic-acidosis');
    expect(cls.anionGap?.raisedByAlkalosis).toBe(false);
    // Na 140 − (Cl 96 + HCO3 30) = 14.
    expect(readings('@ 08:00\nabg 7.43/46/90/30\nlabs na 140, cl 96')['acid-base']).toContain('also consistent with an added metabolic acidosis (anion gap 14 mmol/L, above 12 mmol/L)');
  });

  it('a respiratory alkalosis with a gap of 14 keeps its added metabolic acidosis (the margin is for a primary metabolic alkalosis only)', () => {
    // pH 7.50, PaCO2 30, HCO3 23 (0.0307 × 30 × 10^1.4 = 23.1).
    const cls = classifyAcidBase({ ph: 7.5, paco2Mmhg: 30, hco3MmolL: 23, anionGapMmolL: 14 })!;
    expect(cls.primary).toBe('respiratory-alkalosis');
    expect(cls.additional).toContain('metabolic-acidosis');
    expect(cls.anionGap?.raisedByAlkalosis).toBe(false);
  });
});
