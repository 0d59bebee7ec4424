// Under NIV or CPAP of an oxygen line the tidal volume is measured, of its timepoint only, as under
// PS. Many notes on NIV never record one: asking for it at every gas ("add the measured vt at this
// timepoint to get VE, VR") repeated the same line at each timepoint, in `show`, the hovers and the
// JSON `missing`. It is asked for only where the timepoint writes a vent line, the support's own
// readings (`vent peak 16`, `vent ve 9`): there a volume is what the chart records and is missing.
// A respiratory rate among the vital signs is charted for every patient, on any support, and does
// not ask for it. Under a ventilator mode that measures the volume (PS, PC) it is asked as before.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';

const PATIENT = 'patient age 64 y, sex male, height 178 cm\n';
const NIV = `${PATIENT}@ 08:00\noxygen niv ipap 14, epap 6, fio2 0.4\n`;
const CPAP = `${PATIENT}@ 08:00\noxygen cpap 8, fio2 0.4\n`;
const PS = `${PATIENT}@ 08:00\nvent mode PS, ps 8, peep 6, fio2 0.4\n`;
const GAS = 'abg 7.30/60/70/28';

const missingAt = (text: string, tp: number): string[] => checkNote(text).analysis.derivation(tp).missing.map((m) => m.id);
const askingVolume = (text: string, tp: number): string[] =>
  checkNote(text).analysis.derivation(tp).missing.filter((m) => m.needs.includes('the measured vt at this timepoint')).map((m) => m.id);

describe('NIV or CPAP of an oxygen line: the measured tidal volume', () => {
  it('is not asked for at a gas with no vent line, at its timepoint or a later one', () => {
    expect(askingVolume(`${NIV}${GAS}`, 0)).toEqual([]);
    expect(askingVolume(`${NIV}${GAS}\n@ 09:00\n${GAS}`, 1)).toEqual([]);
    expect(askingVolume(`${CPAP}${GAS}`, 0)).toEqual([]);
    expect(missingAt(`${NIV}${GAS}`, 0)).not.toContain('ventilatory_ratio');
  });

  it('is not asked for where only the vital signs give a rate', () => {
    expect(askingVolume(`${NIV}vitals rr 24\n${GAS}`, 0)).toEqual([]);
    expect(missingAt(`${NIV}vitals rr 24\n${GAS}`, 0)).not.toContain('minute_ventilation');
  });

  it('is asked for where the timepoint writes the support\'s readings on a vent line', () => {
    // Not for the dynamic compliance, which is not worked out under NIV or CPAP (the patient's own effort moves the volume).
    expect(askingVolume(`${NIV}vitals rr 24\nvent peak 16\n${GAS}`, 0)).toEqual(['minute_ventilation', 'ventilatory_ratio']);
    expect(askingVolume(`${NIV}@ 09:00\nvent peak 16\n${GAS}`, 1)).toEqual(['ventilatory_ratio']);
    expect(askingVolume(`${CPAP}vent peak 12\n${GAS}`, 0)).toEqual(['ventilatory_ratio']);
  });

  it('a volume written there is used: VE from VT × RR, VR from it', () => {
    const text = `${NIV}vitals rr 24\nvent vt 500\n${GAS}`;
    const d = checkNote(text).analysis.derivation(0);
    // Minute ventilation = VT × RR ÷ 1000 (common practice, no source): 500 mL × 24 /min = 12 L/min.
    expect(d.derived.find((v) => v.id === 'minute_ventilation')?.value).toBeCloseTo(12, 10);
    expect(d.derived.some((v) => v.id === 'ventilatory_ratio')).toBe(true);
    expect(d.missing).toEqual([]);
  });

  it('a measured minute volume there gives VR without asking for a volume', () => {
    const d = checkNote(`${NIV}vent ve 9\n${GAS}`).analysis.derivation(0);
    expect(d.derived.some((v) => v.id === 'ventilatory_ratio')).toBe(true);
    expect(d.missing.filter((m) => m.needs.includes('the measured vt at this timepoint'))).toEqual([]);
  });
});

describe('a ventilator mode that measures the volume: asked as before', () => {
  it('PS: a gas at a later timepoint asks for the measured vt for VR, with or without a vent line', () => {
    expect(askingVolume(`${PS}@ 09:00\n${GAS}`, 1)).toEqual(['ventilatory_ratio']);
    expect(askingVolume(`${PS}@ 09:00\nvitals rr 20\n${GAS}`, 1)).toEqual(['minute_ventilation', 'ventilatory_ratio']);
  });
});

describe('what shows the list', () => {
  it('show names no missing volume at an NIV gas without a vent line', async () => {
    const { renderShow } = await import('../../server/src/cli/render-show');
    const { paint } = await import('../../server/src/cli/colour');
    const shown = renderShow('a.pneu', checkNote(`${NIV}vitals rr 24\n${GAS}`), paint(false));
    expect(shown).not.toContain('measured vt');
    expect(renderShow('a.pneu', checkNote(`${NIV}vitals rr 24\nvent peak 16\n${GAS}`), paint(false))).toContain('add the measured vt at this timepoint');
  });
});
