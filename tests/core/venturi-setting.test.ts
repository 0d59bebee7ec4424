// A Venturi (fixed-performance, air-entrainment) mask is set by the oxygen fraction it gives, not
// by a flow: its settings give about 24, 28, 31, 35, 40 and 60 % oxygen, each at an oxygen flow the
// device names, of some 2 to 15 L/min (O'Driscoll BR, Howard LS, Earis J, Mak V, on behalf of the
// British Thoracic Society Emergency Oxygen Guideline Group, "BTS guideline for oxygen use in adults
// in healthcare and emergency settings", Thorax 2017;72(Suppl 1):ii1–ii90: the citation read in its
// National Guideline Clearinghouse summary, the settings and flows from memory); Venturi masks set the inspired oxygen concentration, colour-coded from 24 to 60 %
// (European Respiratory Society, European Lung White Book, "Principles of respiratory therapy",
// figure 2, read). `oxygen venturi 0.4` was read as an oxygen flow of 0.4 L/min, which no Venturi
// mask runs at, and its FiO2 was lost: no P/F, no A–a gradient, and the export gave the flow 0.4.
// A number after `venturi` is now read as the FiO2 where it can only be one (a fraction up to 1, or
// a percentage written with `%`), as a flow where it is written in L/min, and a bare number in the
// range of the Venturi settings (24–60) as the FiO2 in %, reported (PN321, information) with a fix
// that writes which was read.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { formatNote } from '../../server/src/core/service';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';
import { derived } from '../derive/helpers';

const PATIENT = 'patient age 60 y, sex female, height 165 cm\n';
const note = (oxygen: string) => `${PATIENT}@ day 1 08:00\n${oxygen}\nabg ph 7.40, pco2 40, po2 80\n`;
const valuesOf = (text: string) => checkNote(text).analysis.timeline.timepoints[0]!.values;
const findingsOn = (text: string, line: number) => checkNote(text).findings.filter((f) => f.range.start.line === line).map((f) => f.code);

describe('the number after `venturi`', () => {
  it('a fraction up to 1 is the FiO2, not a flow, and feeds P/F and the A–a gradient like a stated FiO2', () => {
    const text = note('oxygen venturi 0.4');
    const values = valuesOf(text);
    expect(values.numberOf('fio2')).toBe(0.4);
    expect(values.numberOf('o2_flow')).toBeNull();
    expect(findingsOn(text, 2)).toEqual([]);
    // P/F = PaO2 ÷ FiO2 = 80 ÷ 0.4 = 200 (Horowitz index; ARDS Definition Task Force, Ranieri VM et
    // al., "Acute respiratory distress syndrome: the Berlin Definition", JAMA 2012;307:2526–2533).
    expect(derived(text, 'pf_ratio').value).toBeCloseTo(200, 6);
    // Simplified alveolar gas equation, PAO2 = FiO2 × (760 − 47) − PaCO2 ÷ 0.8 = 0.4 × 713 − 50 =
    // 235.2 mmHg, A–a = 235.2 − 80 = 155.2 (common practice, no source).
    expect(derived(text, 'aa_gradient').value).toBeCloseTo(155.2, 1);
    // The same as the FiO2 written with its key.
    expect(derived(note('oxygen venturi, fio2 0.4'), 'pf_ratio').value).toBeCloseTo(200, 6);
  });

  it('a percentage is the FiO2, without a finding (it was PN203, a flow in %)', () => {
    const text = note('oxygen venturi 40 %');
    expect(valuesOf(text).numberOf('fio2')).toBe(0.4);
    expect(valuesOf(text).numberOf('o2_flow')).toBeNull();
    expect(findingsOn(text, 2)).toEqual([]);
    expect(valuesOf(note('oxygen venturi 28%')).numberOf('fio2')).toBeCloseTo(0.28, 10);
  });

  it('a number in L/min is the flow, and a bare number outside the Venturi settings stays the flow', () => {
    for (const [line, flow] of [['oxygen venturi 8 L/min', 8], ['oxygen venturi 28 L/min', 28], ['oxygen venturi 8', 8], ['oxygen venturi 15', 15], ['oxygen venturi 2, fio2 24 %', 2]] as const) {
      const values = valuesOf(note(line));
      expect(values.numberOf('o2_flow'), line).toBe(flow);
      expect(findingsOn(note(line), 2).filter((c) => c === 'PN321'), line).toEqual([]);
    }
    expect(valuesOf(note('oxygen venturi 8')).numberOf('fio2')).toBeNull();
  });

  it('a bare number of a Venturi setting (24–60) is read as the FiO2 in %, and PN321 says so with a fix that writes it', () => {
    const text = note('oxygen venturi 28');
    expect(valuesOf(text).numberOf('fio2')).toBeCloseTo(0.28, 10);
    expect(valuesOf(text).numberOf('o2_flow')).toBeNull();
    const found = checkNote(text).findings.filter((f) => f.code === 'PN321');
    expect(found).toHaveLength(1);
    expect(found[0]!.severity).toBe('information');
    expect(found[0]!.range).toEqual({ start: { line: 2, character: 15 }, end: { line: 2, character: 17 } });
    expect(found[0]!.message).toBe('`28` after `venturi` is read as the FiO2 it gives, 28 % (a Venturi mask is set by its oxygen fraction, 24–60 %), not as a flow of 28 L/min. Write `fio2 28 %` to say so, or `28 L/min` for a flow.');
    expect(found[0]!.fixes.map((f) => f.title)).toEqual(['Write `fio2 28 %`', 'Write `28 L/min`']);
    const asFio2 = applyEdits(text, found[0]!.fixes[0]!.edits);
    expect(asFio2.split('\n')[2]).toBe('oxygen venturi fio2 28 %');
    expect(valuesOf(asFio2).numberOf('fio2')).toBeCloseTo(0.28, 10);
    const asFlow = applyEdits(text, found[0]!.fixes[1]!.edits);
    expect(asFlow.split('\n')[2]).toBe('oxygen venturi 28 L/min');
    expect(valuesOf(asFlow).numberOf('o2_flow')).toBe(28);
    for (const fixed of [asFio2, asFlow]) expect(checkNote(fixed).findings.filter((f) => f.code === 'PN321')).toEqual([]);
    // Each end of the range, and not beyond it.
    expect(valuesOf(note('oxygen venturi 24')).numberOf('fio2')).toBeCloseTo(0.24, 10);
    expect(valuesOf(note('oxygen venturi 60')).numberOf('fio2')).toBeCloseTo(0.6, 10);
    expect(valuesOf(note('oxygen venturi 61')).numberOf('o2_flow')).toBe(61);
    expect(valuesOf(note('oxygen venturi 23')).numberOf('o2_flow')).toBe(23);
  });

  it('other devices keep reading the number as their flow', () => {
    expect(valuesOf(note('oxygen cannula 0.5')).numberOf('o2_flow')).toBe(0.5);
    expect(valuesOf(note('oxygen hfnc 40')).numberOf('o2_flow')).toBe(40);
    expect(valuesOf(note('oxygen mask 28')).numberOf('o2_flow')).toBe(28);
  });

  it('the export gives the FiO2 and no flow', async () => {
    const io = memoryIo({ stdin: note('oxygen venturi 0.4') });
    await run(['export', '-', '--format', 'csv'], io);
    const [header, row] = io.out().trim().split('\n');
    const cells = Object.fromEntries(header!.split(',').map((h, i) => [h, row!.split(',')[i]]));
    expect(cells['o2_flow_L_min']).toBe('');
    expect(cells['fio2_fraction']).toBe('0.4');
    expect(Number(cells['pf_ratio'])).toBeCloseTo(200, 6);
  });

  it('the formatter keeps the number after the device, and naming another device keeps it the FiO2', () => {
    expect(formatNote('@ day 1 08:00\noxygen   venturi   0.4').split('\n')[1]).toMatch(/^oxygen +venturi 0\.4$/);
    const text = '@ day 1 08:00\noxygen venturi 0.4, epap 6';
    const pn318 = checkNote(text).findings.find((f) => f.code === 'PN318')!;
    const toNiv = pn318.fixes.find((f) => f.title === 'Change the device to `niv`')!;
    const fixed = applyEdits(text, toNiv.edits);
    expect(fixed.split('\n')[1]).toBe('oxygen niv fio2 0.4, epap 6');
    expect(valuesOf(fixed).numberOf('fio2')).toBe(0.4);
  });
});
