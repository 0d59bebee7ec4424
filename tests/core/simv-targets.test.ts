// SIMV is run volume-targeted or pressure-targeted: `SIMV-VC` is of the volume family (the tidal
// volume set, carried), `SIMV-PC` of the pressure family (a pressure set, the tidal volume measured,
// of its timepoint only). Pressure control: Scottish Intensive Care Society, SICS induction modules,
// "Ventilation – pressure control ventilation" (the pressure and the rate set, the tidal volume
// following the compliance; read on scottishintensivecare.org.uk). Plain `SIMV` read as
// volume-targeted: common practice, no source.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import type { Timepoint } from '../../server/src/core/analysis/model';
import { hoverAt } from '../../server/src/core/service';
import { applyEdits } from '../../server/src/core/service/text-edits';
import { modeFamily } from '../../server/src/core/fields/modes';
import { noteAt } from '../service/cursor';

const PATIENT = 'patient sex female, height 165 cm\n';
const timepoints = (text: string): readonly Timepoint[] => checkNote(text).analysis.timeline.timepoints;
const word = (tp: Timepoint | undefined, id: string) => tp?.values.get(id)?.stated.word;
const number = (tp: Timepoint | undefined, id: string) => tp?.values.get(id)?.stated.value;

describe('SIMV-VC and SIMV-PC', () => {
  it('are modes of the volume and the pressure family, in any case; plain SIMV stays volume', () => {
    expect(['SIMV-VC', 'SIMV-PC', 'simv-pc', 'Simv-Vc', 'SIMV'].map(modeFamily)).toEqual(['volume', 'pressure', 'pressure', 'volume', 'volume']);
  });

  it('are read as the canonical words, with no finding', () => {
    const text = `${PATIENT}@ 08:00\nvent mode simv-pc, pinsp 14, peep 6, rate 14, fio2 0.4`;
    expect(word(timepoints(text)[0], 'mode')).toBe('SIMV-PC');
    expect(checkNote(text).findings.map((f) => f.code)).toEqual([]);
    expect(word(timepoints(`${PATIENT}@ 08:00\nvent mode Simv-Vc, vt 420, rate 14`)[0], 'mode')).toBe('SIMV-VC');
  });

  it('under SIMV-PC a tidal volume is measured: not carried, and asked for at the next gas', () => {
    const text = `${PATIENT}@ 08:00\nvent mode SIMV-PC, pinsp 14, peep 6, rate 14, vt 420, fio2 0.4\n@ 10:00\nvent peak 20\nabg ph 7.38, pco2 42, po2 80`;
    const tps = timepoints(text);
    expect([number(tps[0], 'vt'), tps[0]?.values.get('vt')?.stated.hereOnly]).toEqual([420, true]);
    expect(number(tps[1], 'vt')).toBeUndefined();
    expect(checkNote(text).analysis.derivation(1)?.missing.find((m) => m.id === 'compliance_dynamic')?.message).toBe('add the measured vt at this timepoint to get Cdyn');
  });

  it('under SIMV-VC and plain SIMV a tidal volume is a setting: carried', () => {
    for (const mode of ['SIMV-VC', 'SIMV']) {
      const tps = timepoints(`${PATIENT}@ 08:00\nvent mode ${mode}, vt 420, peep 6, rate 14, fio2 0.4\n@ 10:00\nabg ph 7.38, pco2 42, po2 80`);
      expect(number(tps[1], 'vt'), mode).toBe(420);
      expect(tps[1]?.values.get('vt')?.origin.kind, mode).toBe('carried');
    }
  });

  it('deliver set breaths: a set rate of 0 is reported (PN312) under each', () => {
    for (const mode of ['SIMV-VC', 'SIMV-PC']) {
      expect(checkNote(`@ 08:00\nvent mode ${mode}, rate 0, peep 5`).findings.map((f) => f.code), mode).toContain('PN312');
    }
  });

  it('a change from SIMV-VC to SIMV-PC is a change of mode: the tidal volume set before is dropped', () => {
    const tps = timepoints(`${PATIENT}@ 08:00\nvent mode SIMV-VC, vt 420, peep 6, rate 14\n@ 10:00\nvent mode SIMV-PC, pinsp 14, rate 14`);
    expect([number(tps[1], 'vt'), number(tps[1], 'peep')]).toEqual([undefined, 6]);
  });
});

describe('`SIMV PC` with a blank', () => {
  for (const [written, joined] of [['SIMV PC', 'SIMV-PC'], ['simv vc', 'simv-vc']] as const) {
    it(`\`${written}\` is offered \`${joined}\`, preferred; applied, the line reads as that mode`, () => {
      const text = `@ 08:00\nvent mode ${written}, peep 5, rate 14`;
      const found = checkNote(text).findings.filter((f) => f.code === 'PN201');
      expect(found).toHaveLength(1);
      expect(found[0]!.message).toContain(`write \`${joined}\``);
      expect(found[0]!.message).not.toContain('Did you mean `ps`');
      expect(found[0]!.fixes[0]!.title).toBe(`Write the mode as \`${joined}\``);
      expect(found[0]!.fixes[0]!.preferred).toBe(true);
      const fixed = applyEdits(text, found[0]!.fixes[0]!.edits);
      expect(fixed).toBe(`@ 08:00\nvent mode ${joined}, peep 5, rate 14`);
      expect(checkNote(fixed).findings.map((f) => f.code)).toEqual([]);
    });
  }

  it('only right after the mode SIMV, and only a bare word: `PC` elsewhere is an unknown key as before', () => {
    const after = checkNote('@ 08:00\nvent mode VC, pc, rate 14').findings.find((f) => f.code === 'PN201');
    expect(after?.message).not.toContain('SIMV');
    const valued = checkNote('@ 08:00\nvent mode SIMV pc 14, rate 14').findings.find((f) => f.code === 'PN201');
    expect(valued?.message).not.toContain('SIMV-');
  });
});

describe('the hover of a mode says its family', () => {
  it.each([
    ['SIMV-P|C', 'pressure'],
    ['SIMV-V|C', 'volume'],
    ['SI|MV', 'volume'],
    ['P|S', 'spontaneous'],
  ])('%s: %s', (written, family) => {
    const { result, position } = noteAt(`@ 08:00\nvent mode ${written}, peep 5`);
    expect(hoverAt(result, position)?.markdown ?? '').toContain(`Family: **${family}**`);
  });

  it('plain SIMV says it is read as volume-targeted, and a word outside the list says it has no family', () => {
    const simv = noteAt('@ 08:00\nvent mode SI|MV, peep 5');
    expect(hoverAt(simv.result, simv.position)?.markdown ?? '').toContain('`SIMV-PC`');
    const asv = noteAt('@ 08:00\nvent mode AS|V, peep 5');
    expect(hoverAt(asv.result, asv.position)?.markdown ?? '').toContain('Family: none that Pneumark knows');
  });
});
