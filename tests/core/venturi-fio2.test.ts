// An FiO2 above what a Venturi mask gives (PN322). Venturi settings give 24 to 60 % oxygen:
// European Respiratory Society, European Lung White Book, Principles of respiratory therapy,
// figure 2 (colour-coded 24 to 60 %); O'Driscoll BR et al., BTS guideline for oxygen use in adults
// in healthcare and emergency settings, Thorax 2017, not read; the settings 24 to 60 % read in a
// teaching table of Venturi colour codes at md3.info/skills/oxygen/amplified.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { allDerivations } from '../../server/src/core/analysis/analyse';

const found = (text: string) => checkNote(text).findings.filter((f) => f.code === 'PN322');

describe('FiO2 above what a Venturi mask gives (PN322)', () => {
  it('is reported on the FiO2 of a venturi line above 60 %, however it is written', () => {
    const f = found('@ 08:00\noxygen venturi 0.8');
    expect(f).toHaveLength(1);
    expect(f[0]!.severity).toBe('warning');
    expect(f[0]!.range).toEqual({ start: { line: 1, character: 15 }, end: { line: 1, character: 18 } });
    expect(f[0]!.message).toBe('FiO2 0.80 from a Venturi mask, whose settings give 24 to 60 % oxygen (up to 0.60): name the device that gives this FiO2 (a reservoir mask, high flow, NIV), or write the Venturi setting given. The FiO2 is used as written meanwhile.');
    expect(found('@ 08:00\noxygen venturi, fio2 90 %')).toHaveLength(1);
    expect(found('@ 08:00\noxygen venturi 8 L/min, fio2 0.61')).toHaveLength(1);
    expect(found('@ 08:00\noxygen venturi 1')).toHaveLength(1);
  });

  it('is silent at 60 % and below, on other devices, and where the line only carries', () => {
    expect(found('@ 08:00\noxygen venturi 0.6')).toEqual([]);
    expect(found('@ 08:00\noxygen venturi 60 %')).toEqual([]);
    expect(found('@ 08:00\noxygen venturi 28')).toEqual([]);
    expect(found('@ 08:00\noxygen reservoir 15, fio2 0.8')).toEqual([]);
    expect(found('@ 08:00\noxygen hfnc 50, fio2 0.8')).toEqual([]);
    // Reported once, where the line is written, not at the timepoint it carries to.
    expect(found('@ 08:00\noxygen venturi 0.8\n@ 09:00\nvitals hr 80')).toHaveLength(1);
  });

  it('leaves the FiO2 in use: the P/F is worked out from it', () => {
    const d = allDerivations(checkNote('@ 08:00\noxygen venturi 0.8\nabg 7.40/40/200/24').analysis).at(-1)!;
    expect(d.derived.find((x) => x.id === 'pf_ratio')?.value).toBeCloseTo(250, 6);
  });
});
