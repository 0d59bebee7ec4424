// An oxygen line at a later timepoint that names no device, where an oxygen line with a device is
// in force, and whose every key is a setting of that device (`oxygen flow 4 L/min` after `oxygen
// cannula 2 L/min`): it updates the therapy in force. The device and the settings it does not
// restate carry, with their origins; the ones it writes replace theirs. Before, any oxygen line
// replaced the one before it whole, so the device was lost (no FiO2 estimate, no device for P/F).
// Any other device-less oxygen line replaces as before; lines of one timepoint keep their pairing.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import type { Timepoint } from '../../server/src/core/analysis/model';
import { deviceSets } from '../../server/src/core/analysis/noninvasive-support';
import { applyEdits, hoverAt } from '../../server/src/core/service';
import { NoteSession } from '../../server/src/core/session';
import { derived } from '../derive/helpers';
import { noteAt } from '../service/cursor';
import { sameAsJson, snapshot } from './session-snapshot';
import { bundleObservations, timepointRows, toFhirBundle } from '../../server/src/core/export';

const plain = { redactProse: false, shiftDays: 0 } as const;
const PATIENT = 'patient   age 60 y, sex female, height 165 cm\n';

const timepoints = (text: string): readonly Timepoint[] => checkNote(text).analysis.timeline.timepoints;
/** The value in force of `id` at timepoint `tp` (a word or a number) and where it came from. */
const inForce = (text: string, tp: number, id: string): [string | number | null, string | null, number | null] => {
  const v = timepoints(text)[tp]!.values.get(id);
  if (!v) return [null, null, null];
  return [v.stated.word ?? v.stated.value, v.origin.kind, 'line' in v.origin ? v.origin.line : null];
};
const codes = (text: string, code: string) => checkNote(text).findings.filter((f) => f.code === code);

/** The brief's first example: the cannula's flow went up to 4 L/min at 10:00. */
const CANNULA = [
  '@ day 1 08:00',
  'oxygen    cannula 2 L/min',
  '@ day 1 10:00',
  'oxygen    flow 4 L/min',
  'abg       7.40/40/70/24',
].join('\n');

const HIGH_FLOW = [
  PATIENT.trimEnd(),
  '@ day 1 08:00',
  'oxygen    hfnc 50 L/min, fio2 0.6',
  '@ day 1 12:00',
  'oxygen    fio2 0.4',
  'abg       7.40/40/70/24',
].join('\n');

const NIV = [
  PATIENT.trimEnd(),
  '@ day 1 08:00',
  'oxygen    niv ipap 14, epap 6, fio2 0.5',
  '@ day 1 12:00',
  'oxygen    ipap 16',
  'abg       7.40/40/70/24',
].join('\n');

describe('which settings each device takes (one table, in noninvasive-support.ts)', () => {
  it('a flow for every device but room air; an FiO2 for those that set one; the pressures of the support', () => {
    const devices = ['room air', 'cannula', 'mask', 'venturi', 'reservoir', 'hfnc', 'niv', 'cpap'];
    const table = Object.fromEntries(devices.map((d) => [d, ['o2_flow', 'fio2', 'ipap', 'epap', 'cpap_level'].filter((id) => deviceSets(d, id))]));
    expect(table).toEqual({
      'room air': [],
      cannula: ['o2_flow'],
      mask: ['o2_flow'],
      venturi: ['o2_flow', 'fio2'],
      reservoir: ['o2_flow'],
      hfnc: ['o2_flow', 'fio2'],
      niv: ['o2_flow', 'fio2', 'ipap', 'epap'],
      cpap: ['o2_flow', 'fio2', 'cpap_level'],
    });
    // Not a setting of any device: the device itself, or a field of another section.
    expect(deviceSets('niv', 'device')).toBe(false);
    expect(deviceSets('niv', 'peep')).toBe(false);
  });
});

describe('a later oxygen line that names no device updates the therapy in force', () => {
  it('a cannula whose flow went up: the device carries, with its origin, the flow is the new one', () => {
    expect(inForce(CANNULA, 1, 'device')).toEqual(['cannula', 'carried', 1]);
    expect(inForce(CANNULA, 1, 'o2_flow')).toEqual([4, 'here', 3]);
    // FiO2 estimate of a nasal cannula, 0.21 + 0.04 × 4 L/min = 0.37 (common practice, no source:
    // physiology/oxygen-transport.ts `nasal-cannula-fio2`), from the carried device and the new flow.
    const estimate = derived(CANNULA, 'fio2_estimated', {}, 1);
    expect(estimate.value).toBeCloseTo(0.37, 10);
    // The estimate rests on the device as well as the flow (the rule differs by device): the device
    // is among its inputs, carried from line 2.
    expect(estimate.inputs.map((t) => [t.name, t.word ?? t.value, t.origin.kind, 'line' in t.origin ? t.origin.line : null])).toEqual([['device', 'cannula', 'carried', 1], ['flow', 4, 'here', 3]]);
    expect(estimate.usesCarried).toBe(true);
    // P/F asks for the FiO2 of a cannula, not for the device line it had lost.
    const missing = checkNote(CANNULA).analysis.derivation(1)!.missing.find((m) => m.id === 'pf_ratio')!.message;
    expect(missing).toContain("a cannula's FiO2 is only an estimate");
  });

  it('high flow weaned: the device and its flow carry, the FiO2 is the new one (P/F on it)', () => {
    expect(inForce(HIGH_FLOW, 1, 'device')).toEqual(['hfnc', 'carried', 2]);
    expect(inForce(HIGH_FLOW, 1, 'o2_flow')).toEqual([50, 'carried', 2]);
    expect(inForce(HIGH_FLOW, 1, 'fio2')).toEqual([0.4, 'here', 4]);
    // P/F = PaO2 ÷ FiO2 = 70 ÷ 0.4 = 175 (ARDS Definition Task Force, Ranieri VM et al., "Acute
    // respiratory distress syndrome: the Berlin Definition", JAMA 2012;307:2526–2533).
    expect(derived(HIGH_FLOW, 'pf_ratio', {}, 1).value).toBeCloseTo(175, 10);
  });

  it('NIV: a new IPAP keeps the EPAP, the FiO2 and the device', () => {
    expect(inForce(NIV, 1, 'device')).toEqual(['niv', 'carried', 2]);
    expect(inForce(NIV, 1, 'ipap')).toEqual([16, 'here', 4]);
    expect(inForce(NIV, 1, 'epap')).toEqual([6, 'carried', 2]);
    expect(inForce(NIV, 1, 'fio2')).toEqual([0.5, 'carried', 2]);
  });

  it('a Venturi mask given a flow keeps its setting; CPAP given a new level keeps its FiO2', () => {
    const venturi = '@ day 1 08:00\noxygen venturi 28\n@ day 1 10:00\noxygen flow 10\nabg 7.40/40/70/24';
    expect(inForce(venturi, 1, 'device')).toEqual(['venturi', 'carried', 1]);
    expect(inForce(venturi, 1, 'fio2')).toEqual([0.28, 'carried', 1]);
    expect(inForce(venturi, 1, 'o2_flow')).toEqual([10, 'here', 3]);
    const cpap = '@ day 1 08:00\noxygen cpap 8, fio2 0.5\n@ day 1 10:00\noxygen level 10\n';
    expect(inForce(cpap, 1, 'device')).toEqual(['cpap', 'carried', 1]);
    expect(inForce(cpap, 1, 'cpap_level')).toEqual([10, 'here', 3]);
    expect(inForce(cpap, 1, 'fio2')).toEqual([0.5, 'carried', 1]);
  });

  it('updates a therapy already updated, and carries on to later timepoints', () => {
    const text = `${CANNULA}\n@ day 1 12:00\noxygen flow 5\n@ day 1 14:00\nvitals spo2 95`;
    expect(inForce(text, 2, 'device')).toEqual(['cannula', 'carried', 1]);
    expect(inForce(text, 2, 'o2_flow')).toEqual([5, 'here', 6]);
    expect(inForce(text, 3, 'device')).toEqual(['cannula', 'carried', 1]);
    expect(inForce(text, 3, 'o2_flow')).toEqual([5, 'carried', 6]);
  });

  it('does not carry what the line before held that is no setting of its device (an FiO2 beside a cannula, a pressure beside a mask)', () => {
    const cannula = '@ day 1 08:00\noxygen cannula 2, fio2 0.28\n@ day 1 10:00\noxygen flow 4\n';
    expect(inForce(cannula, 1, 'device')).toEqual(['cannula', 'carried', 1]);
    expect(inForce(cannula, 1, 'fio2')).toEqual([null, null, null]);
    const mask = '@ day 1 08:00\noxygen mask 8, epap 6\n@ day 1 10:00\noxygen flow 10\n';
    expect(inForce(mask, 1, 'device')).toEqual(['mask', 'carried', 1]);
    expect(inForce(mask, 1, 'epap')).toEqual([null, null, null]);
  });

  it('a ventilator line of readings under NIV carried this way still reads its volume as measured', () => {
    const text = `${NIV}\nvent vt 480, peak 18\n@ day 1 13:00\nvitals rr 20`;
    expect(inForce(text, 1, 'vt')).toEqual([480, 'here', 6]);
    expect(timepoints(text)[1]!.values.get('vt')!.stated.hereOnly).toBe(true);
    expect(inForce(text, 2, 'vt')).toEqual([null, null, null]);
    expect(inForce(text, 2, 'device')).toEqual(['niv', 'carried', 2]);
  });
});

describe('NIV or CPAP written by its pressures alone: the support counts as the device in force', () => {
  const second = (first: string, then: string) => `@ day 1 08:00\n${first}\n@ day 1 10:00\n${then}\n`;

  it('NIV by an IPAP and an EPAP, then a higher IPAP: the EPAP carries with its origin, and no device is made up', () => {
    const text = second('oxygen ipap 14, epap 6', 'oxygen ipap 16');
    expect(inForce(text, 1, 'ipap')).toEqual([16, 'here', 3]);
    expect(inForce(text, 1, 'epap')).toEqual([6, 'carried', 1]);
    expect(inForce(text, 1, 'device')).toEqual([null, null, null]);
    expect([...timepoints(text)[1]!.values.values()].map((v) => v.stated.fieldId).sort()).toEqual(['epap', 'ipap']);
    // Still NIV by its pressures (the one rule): its EPAP is the end-expiratory pressure.
    expect(checkNote(text).findings.filter((f) => f.code === 'PN318')).toEqual([]);
  });

  it('CPAP by its level, then a new level: the level is the new one, nothing else is made up', () => {
    const text = second('oxygen level 8, fio2 0.4', 'oxygen level 10');
    expect(inForce(text, 1, 'cpap_level')).toEqual([10, 'here', 3]);
    expect(inForce(text, 1, 'fio2')).toEqual([0.4, 'carried', 1]);
    expect(inForce(text, 1, 'device')).toEqual([null, null, null]);
  });

  it('a level after NIV by its pressures is a switch to CPAP: it replaces, as a level is no setting of NIV', () => {
    const text = second('oxygen ipap 14, epap 6', 'oxygen level 8');
    expect(inForce(text, 1, 'cpap_level')).toEqual([8, 'here', 3]);
    expect(inForce(text, 1, 'epap')).toEqual([null, null, null]);
    expect(inForce(text, 1, 'ipap')).toEqual([null, null, null]);
    // And an IPAP after CPAP by its level is a switch to NIV.
    expect(inForce(second('oxygen level 8', 'oxygen ipap 14'), 1, 'cpap_level')).toEqual([null, null, null]);
  });

  it('an FiO2 after NIV by its pressures updates it (NIV sets an FiO2): the pressures carry', () => {
    const text = second('oxygen ipap 14, epap 6', 'oxygen fio2 0.4');
    expect(inForce(text, 1, 'fio2')).toEqual([0.4, 'here', 3]);
    expect(inForce(text, 1, 'ipap')).toEqual([14, 'carried', 1]);
    expect(inForce(text, 1, 'epap')).toEqual([6, 'carried', 1]);
    expect(inForce(text, 1, 'device')).toEqual([null, null, null]);
  });

  it('a pressure written beside the support that it does not give (PN318) is not carried through the update', () => {
    const text = second('oxygen ipap 14, epap 6, level 8', 'oxygen ipap 16');
    expect(inForce(text, 1, 'epap')).toEqual([6, 'carried', 1]);
    expect(inForce(text, 1, 'cpap_level')).toEqual([null, null, null]);
  });

  it('lines of one timepoint: the later updates the earlier, as across timepoints (the setting written twice is PN206)', () => {
    const one = '@ day 1 08:00\noxygen ipap 14, epap 6\noxygen ipap 16\n';
    expect(inForce(one, 0, 'epap')).toEqual([6, 'here', 1]);
    expect(inForce(one, 0, 'ipap')).toEqual([16, 'here', 2]);
    expect(codes(one, 'PN206').map((f) => f.range.start.line)).toEqual([2]);
    expect(inForce('@ day 1 08:00\noxygen level 8\noxygen fio2 0.4\n', 0, 'cpap_level')).toEqual([8, 'here', 1]);
  });

  it('hover, show and the exports give the carried pressure and no device', async () => {
    const text = `${PATIENT}${second('oxygen ipap 14, epap 6', 'oxygen ipap 16\nabg 7.40/40/70/24')}`;
    const { renderShow } = await import('../../server/src/cli/render-show');
    const { paint } = await import('../../server/src/cli/colour');
    const shown = renderShow('a.pneu', checkNote(text), paint(false));
    expect(shown).toContain('carried  EPAP 6 cmH2O (carried from day 1 08:00, line 3)');
    expect(shown).not.toMatch(/device niv/);
    const rows = timepointRows('a.pneu', checkNote(text, {}, { keepDerivations: true }), plain);
    expect([rows[1]!.device, rows[1]!.ipap_cmH2O, rows[1]!.epap_cmH2O]).toEqual([null, 16, 6]);
    expect(String(rows[1]!.carried_fields).split(';')).toEqual(['epap']);
    const { result, position } = noteAt(text.replace('@ day 1 10:00', '@ day 1 10:0|0'));
    const hover = hoverAt(result, position)?.markdown ?? '';
    expect(hover).toMatch(/EPAP[^\n]*carried from day 1 08:00, line 3/);
    expect(hover).not.toMatch(/device[^\n]*niv/i);
  });
});

describe('any other device-less oxygen line replaces the therapy, as before', () => {
  const second = (first: string, then: string) => `@ day 1 08:00\n${first}\n@ day 1 10:00\n${then}\n`;

  it('an FiO2 after a cannula or a simple mask (no setting of theirs: a stated FiO2 is not what they are set to)', () => {
    expect(inForce(second('oxygen cannula 2', 'oxygen fio2 0.3'), 1, 'device')).toEqual([null, null, null]);
    const mask = second('oxygen mask 8', 'oxygen flow 10, fio2 0.5');
    expect(inForce(mask, 1, 'device')).toEqual([null, null, null]);
    expect(inForce(mask, 1, 'o2_flow')).toEqual([10, 'here', 3]);
  });

  it('pressures after a cannula switch to NIV; a level after NIV switches to CPAP; an IPAP after CPAP to NIV', () => {
    const niv = second('oxygen cannula 2', 'oxygen ipap 14, epap 6');
    expect(inForce(niv, 1, 'device')).toEqual([null, null, null]);
    expect(inForce(niv, 1, 'o2_flow')).toEqual([null, null, null]);
    expect(inForce(second('oxygen niv ipap 14, epap 6', 'oxygen level 8'), 1, 'epap')).toEqual([null, null, null]);
    expect(inForce(second('oxygen cpap 8', 'oxygen ipap 14'), 1, 'cpap_level')).toEqual([null, null, null]);
  });

  it('after room air, under ventilation, after a line naming no device, and with a key it does not read', () => {
    expect(inForce(second('oxygen room air', 'oxygen flow 2'), 1, 'device')).toEqual([null, null, null]);
    const vent = second('vent mode VC, vt 420, rate 16, peep 8, fio2 0.5', 'oxygen flow 4');
    expect([inForce(vent, 1, 'device'), inForce(vent, 1, 'peep')]).toEqual([[null, null, null], [null, null, null]]);
    // A word not read (a misspelt device?) leaves the line as written: it replaces.
    expect(inForce(second('oxygen hfnc 50, fio2 0.6', 'oxygen canula, flow 3'), 1, 'device')).toEqual([null, null, null]);
    // Nothing read at all: as before, the line ends the therapy.
    expect(inForce(second('oxygen hfnc 50, fio2 0.6', 'oxygen canula 3'), 1, 'device')).toEqual([null, null, null]);
  });

  it('lines of one timepoint: a second line that names no device replaces where it is no update (a key the device does not take)', () => {
    const one = '@ day 1 08:00\noxygen cannula 2\noxygen fio2 0.3\n';
    expect(inForce(one, 0, 'device')).toEqual([null, null, null]);
    expect(inForce('@ day 1 08:00\noxygen niv ipap 14, epap 6\noxygen level 8\n', 0, 'epap')).toEqual([null, null, null]);
    const paired = '@ day 1 08:00\noxygen venturi 28\noxygen fio2 0.28\n';
    expect(inForce(paired, 0, 'device')).toEqual(['venturi', 'here', 1]);
  });

  it('two update lines at one later timepoint: the later value of a setting, stated twice (PN206)', () => {
    const text = '@ day 1 08:00\noxygen cannula 2\n@ day 1 10:00\noxygen flow 4\noxygen flow 5\n';
    expect(inForce(text, 1, 'device')).toEqual(['cannula', 'carried', 1]);
    expect(inForce(text, 1, 'o2_flow')).toEqual([5, 'here', 4]);
    expect(codes(text, 'PN206').map((f) => f.range.start.line)).toEqual([4]);
  });

  it('a device named at the later timepoint after an update line there: as two oxygen lines of one timepoint', () => {
    const text = '@ day 1 08:00\noxygen venturi 28\n@ day 1 10:00\noxygen fio2 0.35\noxygen venturi 28\n';
    expect(inForce(text, 1, 'device')).toEqual(['venturi', 'here', 4]);
    expect(inForce(text, 1, 'fio2')).toEqual([0.35, 'here', 3]);
    expect(codes(text, 'PN206')).toHaveLength(1);
  });
});

// Lines of one timepoint describe one moment. A later oxygen line there that names no device and
// writes only settings of the device in force updates it, as at a later timepoint: before, it
// replaced the line above it whole (`oxygen hfnc 50 L/min` then `oxygen fio2 0.6` lost the device
// and its flow), and NIV by its pressures restated in full at a timepoint (every value it held of
// that timepoint) was replaced whole by a further line there (`oxygen fio2 0.4` lost both pressures).
describe('a later oxygen line of the same timepoint that names no device updates the therapy stated there', () => {
  it('high flow, then its FiO2 on a line of its own: the device and flow stay, the FiO2 is used for P/F', () => {
    const text = `${PATIENT}@ day 1 08:00\noxygen hfnc 50 L/min\noxygen fio2 0.6\nabg 7.40/40/90/24\n`;
    expect(inForce(text, 0, 'device')).toEqual(['hfnc', 'here', 2]);
    expect(inForce(text, 0, 'o2_flow')).toEqual([50, 'here', 2]);
    expect(inForce(text, 0, 'fio2')).toEqual([0.6, 'here', 3]);
    // P/F = PaO2 ÷ FiO2 (common practice, no source): 90 / 0.6 = 150.
    expect(derived(text, 'pf_ratio')?.value).toBeCloseTo(150, 6);
    expect(codes(text, 'PN206')).toEqual([]);
  });

  it('NIV named, then a further line of its FiO2: the pressures stay', () => {
    const text = '@ day 1 08:00\noxygen niv ipap 14, epap 6\noxygen fio2 0.4\n';
    expect(inForce(text, 0, 'device')).toEqual(['niv', 'here', 1]);
    expect(inForce(text, 0, 'ipap')).toEqual([14, 'here', 1]);
    expect(inForce(text, 0, 'epap')).toEqual([6, 'here', 1]);
    expect(inForce(text, 0, 'fio2')).toEqual([0.4, 'here', 2]);
  });

  it('NIV by its pressures restated in full at a later timepoint, then its FiO2 there: the pressures stay', () => {
    const text = '@ day 1 08:00\noxygen ipap 14, epap 6\n@ day 1 10:00\noxygen ipap 16, epap 8\noxygen fio2 0.4\n';
    expect(inForce(text, 1, 'ipap')).toEqual([16, 'here', 3]);
    expect(inForce(text, 1, 'epap')).toEqual([8, 'here', 3]);
    expect(inForce(text, 1, 'fio2')).toEqual([0.4, 'here', 4]);
    expect(inForce(text, 1, 'device')).toEqual([null, null, null]);
  });

  it('NIV by its pressures at one timepoint, then its FiO2 there: the pressures stay, no device is made up', () => {
    const text = '@ day 1 08:00\noxygen ipap 14, epap 6\noxygen fio2 0.4\n';
    expect([inForce(text, 0, 'ipap'), inForce(text, 0, 'epap'), inForce(text, 0, 'device')]).toEqual([[14, 'here', 1], [6, 'here', 1], [null, null, null]]);
  });

  it('a cannula, then a new flow at the same timepoint: the cannula stays at the later flow (stated twice, PN206)', () => {
    const text = '@ day 1 08:00\noxygen cannula 2\noxygen flow 3\n';
    expect(inForce(text, 0, 'device')).toEqual(['cannula', 'here', 1]);
    expect(inForce(text, 0, 'o2_flow')).toEqual([3, 'here', 2]);
    expect(codes(text, 'PN206').map((f) => f.range.start.line)).toEqual([2]);
  });

  it('a line naming the same device again there updates it too: the pressures stay, and the device is not stated twice', () => {
    const text = '@ day 1 08:00\noxygen niv ipap 14, epap 6\noxygen niv fio2 0.4\n';
    expect([inForce(text, 0, 'device'), inForce(text, 0, 'ipap'), inForce(text, 0, 'epap'), inForce(text, 0, 'fio2')])
      .toEqual([['niv', 'here', 2], [14, 'here', 1], [6, 'here', 1], [0.4, 'here', 2]]);
    expect(codes(text, 'PN206')).toEqual([]);
  });

  it('the update carries on to later timepoints as the one line would', () => {
    const text = '@ day 1 08:00\noxygen niv ipap 14, epap 6\noxygen fio2 0.4\n@ day 1 10:00\noxygen ipap 16\n';
    expect([inForce(text, 1, 'device'), inForce(text, 1, 'epap'), inForce(text, 1, 'fio2'), inForce(text, 1, 'ipap')])
      .toEqual([['niv', 'carried', 1], [6, 'carried', 1], [0.4, 'carried', 2], [16, 'here', 4]]);
  });
});

describe('what reads the oxygen in force', () => {
  it('PN322: an FiO2 above every Venturi setting, written on a line that updates a Venturi mask', () => {
    const text = '@ day 1 08:00\noxygen venturi 28\n@ day 1 10:00\noxygen fio2 0.8\n';
    const f = codes(text, 'PN322');
    expect(f.map((x) => x.range.start.line)).toEqual([3]);
    // Not at a later timepoint it carries to, and not where the line replaces the mask.
    expect(codes(`${text}@ day 1 11:00\nvitals spo2 95\n`, 'PN322')).toHaveLength(1);
    expect(codes('@ day 1 08:00\noxygen cannula 2\n@ day 1 10:00\noxygen fio2 0.8\n', 'PN322')).toEqual([]);
  });

  it('PN318 is not reported for a pressure the carried device gives', () => {
    expect(codes(NIV, 'PN318')).toEqual([]);
    expect(codes('@ day 1 08:00\noxygen cpap 8\n@ day 1 10:00\noxygen level 10\n', 'PN318')).toEqual([]);
  });

  it('PN326: a device carried from long before is no stale setting where a line that updates it was written within the limit', () => {
    // A hypercapnic gas without hypoxaemia on a device with no FiO2 known (PaCO2 60 above the
    // default hypercapnia threshold of the settings, 50 mmHg; PaO2 80 above the hypoxaemia one, 60
    // mmHg): the reading of respiratory failure rests on the device ("type 2 ... on oxygen by cannula").
    const gas = 'abg 7.30/60/80/29';
    const text = `@ day 1 08:00\noxygen cannula 2 L/min\n@ day 2 04:00\noxygen flow 4 L/min\n${gas}`;
    expect(checkNote(text).analysis.derivation(1)!.interpretations.some((r) => r.basis.includes('device'))).toBe(true);
    expect(codes(text, 'PN326')).toEqual([]);
    // Updated within the limit, at a timepoint before the gas: not reported either.
    const within = `@ day 1 08:00\noxygen cannula 2 L/min\n@ day 2 00:00\noxygen flow 4 L/min\n@ day 2 04:00\n${gas}`;
    expect(codes(within, 'PN326')).toEqual([]);
    // Updated, but that too long before (16 h): the device is named, with the line it was named on.
    const stale = `@ day 1 08:00\noxygen cannula 2 L/min\n@ day 1 12:00\noxygen flow 4 L/min\n@ day 2 04:00\n${gas}`;
    const f = codes(stale, 'PN326');
    expect(f.map((x) => x.message)).toEqual(['The readings here rest on oxygen device cannula, stated at day 1 08:00 (line 2), 20 h before this timepoint: check that it still held at this timepoint, and write it here if so, or the one that did.']);
    // The device named at the gas's timepoint is reported as before: not at all.
    expect(codes(`@ day 1 08:00\noxygen cannula 2 L/min\n@ day 2 04:00\noxygen cannula 4 L/min\n${gas}`, 'PN326')).toEqual([]);
  });

  it('PN326: a setting the update did not restate is as old as its own line (NIV\'s EPAP, carried 20 h)', () => {
    const niv = `${PATIENT}@ day 1 08:00\noxygen niv ipap 14, epap 6, fio2 0.5\n@ day 2 04:00\noxygen ipap 16, fio2 0.5\nabg 7.40/40/70/24`;
    const g = codes(niv, 'PN326');
    expect(g).toHaveLength(1);
    expect(g[0]!.message).toContain('EPAP 6 cmH2O, stated at day 1 08:00 (line 3), 20 h before');
    expect(g[0]!.message).not.toContain('oxygen device');
  });

  it('show lists the carried device and settings with their origins', async () => {
    const { renderShow } = await import('../../server/src/cli/render-show');
    const { paint } = await import('../../server/src/cli/colour');
    const shown = renderShow('a.pneu', checkNote(HIGH_FLOW), paint(false));
    expect(shown).toContain('carried  device hfnc · flow 50.0 L/min (carried from day 1 08:00, line 3)');
  });

  it('the hover of the new flow names the carried device it updates', () => {
    const { result, position } = noteAt(CANNULA.replace('flow 4 L/min', 'flow 4 L/m|in'));
    const hover = hoverAt(result, position)?.markdown ?? '';
    expect(hover).toContain('Value: **4.0 L/min**');
    expect(hover).toContain('restates only settings of the device in force, or of NIV or CPAP written by its pressures, at a later timepoint or below it at its own, which updates those');
    const tp = noteAt(CANNULA.replace('@ day 1 10:00', '@ day 1 10:0|0'));
    expect(hoverAt(tp.result, tp.position)?.markdown ?? '').toMatch(/cannula[^\n]*carried from day 1 08:00, line 2|carried from day 1 08:00, line 2[^\n]*cannula/);
  });

  it('CSV and JSON Lines give the carried device, listed among the carried fields', () => {
    const rows = timepointRows('a.pneu', checkNote(HIGH_FLOW, {}, { keepDerivations: true }), plain);
    expect([rows[1]!.device, rows[1]!.o2_flow_L_min, rows[1]!.fio2_fraction]).toEqual(['hfnc', 50, 0.4]);
    expect(String(rows[1]!.carried_fields).split(';')).toEqual(expect.arrayContaining(['device', 'o2_flow']));
    expect(String(rows[1]!.carried_fields).split(';')).not.toContain('fio2');
  });

  it('FHIR: the flow written on a line that updates high flow is a total gas flow, not coded as the oxygen flow', () => {
    const text = `${PATIENT}@ day 1 08:00\noxygen hfnc 50 L/min, fio2 0.6\n@ day 1 12:00\noxygen flow 40 L/min\n`;
    const bundle = toFhirBundle('a.pneu', checkNote(text, {}, { keepDerivations: true }), plain);
    const flows = bundleObservations(bundle).filter((o) => /^obs-\d+-o2-flow/.test(o.id));
    expect(flows.map((o) => o.valueQuantity?.value)).toEqual([50, 40]);
    for (const o of flows) expect(o.code.coding ?? []).toEqual([]);
  });
});

describe('the FiO2 estimate names the device it rests on', () => {
  it('its hover and show mark the carried device; the JSON inputs give it as a word with its origin', async () => {
    const d = derived(CANNULA, 'fio2_estimated', {}, 1);
    const { derivedHover } = await import('../../server/src/core/service/derived-hover');
    const hover = derivedHover(d);
    expect(hover).toContain('- device cannula — carried from day 1 08:00, line 2');
    expect(hover).toContain('- flow 4.0 L/min — line 4');
    expect(hover).toContain('Uses a value carried forward');
    const { renderShow } = await import('../../server/src/cli/render-show');
    const { paint } = await import('../../server/src/cli/colour');
    expect(renderShow('a.pneu', checkNote(CANNULA), paint(false))).toContain('FiO2 est 0.37*');
    const { timepointsJson, timepointV2 } = await import('../../server/src/cli/timepoints-json');
    const json = timepointsJson(checkNote(CANNULA, {}, { keepDerivations: true }));
    const inputs = json[1]!.derived.find((v) => v.id === 'fio2_estimated')!.inputs;
    expect(inputs.map((t) => [t.name, t.value, t.unit, t.origin.kind, t.origin.line])).toEqual([['device', 'cannula', '', 'carried', 2], ['flow', 4, 'L/min', 'here', 4]]);
    const v2 = timepointV2(json[1]!, new Map()) as { derived: { id: string; inputs: { name: string; value: unknown; origin: { kind: string; line?: number } }[] }[] };
    expect(v2.derived.find((v) => v.id === 'fio2_estimated')!.inputs.map((t) => [t.name, t.value, t.origin.kind, t.origin.line])).toEqual([['device', 'cannula', 'carried', 2], ['flow', 4, 'here', 4]]);
  });

  it('stated with its flow, the device is an input stated here, and nothing is marked carried', () => {
    const d = derived('@ day 1 08:00\noxygen cannula 2 L/min\nabg 7.40/40/70/24', 'fio2_estimated', {}, 0);
    expect(d.inputs.map((t) => [t.name, t.origin.kind])).toEqual([['device', 'here'], ['flow', 'here']]);
    expect(d.usesCarried).toBe(false);
  });

  it('PN326: a device carried from long before with its flow restated within the limit is still not named', () => {
    const text = '@ day 1 08:00\noxygen cannula 2 L/min\n@ day 2 04:00\noxygen flow 4 L/min\nabg 7.40/40/70/24';
    expect(derived(text, 'fio2_estimated', {}, 1).inputs.map((t) => t.origin.kind)).toEqual(['carried', 'here']);
    expect(codes(text, 'PN326')).toEqual([]);
  });
});

describe('an open note', () => {
  it('gives what a fresh analysis gives, as lines are edited, added and removed', () => {
    const session = new NoteSession();
    const edits = [
      CANNULA,
      CANNULA.replace('cannula 2 L/min', 'hfnc 40 L/min, fio2 0.5'),
      CANNULA.replace('cannula 2 L/min', 'hfnc 40 L/min, fio2 0.5').replace('flow 4 L/min', 'fio2 0.4'),
      `@ day 1 07:00\nvitals hr 80\n${CANNULA}`,
      CANNULA.replace('oxygen    flow 4 L/min', 'oxygen    fio2 0.4'),
      CANNULA,
    ];
    for (const text of edits) {
      const r = session.update(text);
      expect(sameAsJson(snapshot(r), snapshot(checkNote(text)))).toBe(true);
    }
  });
});

// Two oxygen lines of one timepoint that name a device describe one moment. Naming the device in
// force again there (or NIV or CPAP named where its pressures made it so) continues that therapy,
// as a line naming no device does: before, it replaced the line above it whole, and
// `oxygen niv ipap 14, epap 6` then `oxygen niv fio2 0.4` held no pressure, with a PN206 that said
// only that the device was stated twice. Naming another device there replaces, and PN206 names
// the settings that are no longer in force, with fixes that keep either line.
describe('a line naming a device at the timepoint where an oxygen line is in force', () => {
  const at = (...lines: string[]) => `@ day 1 08:00\n${lines.join('\n')}\n`;

  it('NIV by its pressures, then NIV named with its FiO2: one therapy, nothing reported', () => {
    const text = at('oxygen ipap 14, epap 6', 'oxygen niv fio2 0.4');
    expect([inForce(text, 0, 'device'), inForce(text, 0, 'ipap'), inForce(text, 0, 'epap'), inForce(text, 0, 'fio2')])
      .toEqual([['niv', 'here', 2], [14, 'here', 1], [6, 'here', 1], [0.4, 'here', 2]]);
    expect(codes(text, 'PN206')).toEqual([]);
  });

  it('high flow named again with a new FiO2: the flow stays; the FiO2 stated twice is reported, the later used', () => {
    const text = at('oxygen hfnc 50 L/min, fio2 0.6', 'oxygen hfnc fio2 0.4');
    expect([inForce(text, 0, 'o2_flow'), inForce(text, 0, 'fio2')]).toEqual([[50, 'here', 1], [0.4, 'here', 2]]);
    const f = codes(text, 'PN206');
    expect(f.map((x) => [x.range.start.line, x.message])).toEqual([[2, 'FiO2 is stated twice at this timepoint; the later value is used.']]);
  });

  it('a cannula named again at a new flow: the later flow, reported as the flow stated twice (not the device)', () => {
    const text = at('oxygen cannula 2', 'oxygen cannula 3');
    expect([inForce(text, 0, 'device'), inForce(text, 0, 'o2_flow')]).toEqual([['cannula', 'here', 2], [3, 'here', 2]]);
    expect(codes(text, 'PN206').map((x) => x.message)).toEqual(['Oxygen flow is stated twice at this timepoint; the later value is used.']);
  });

  it('carries on to a later timepoint as the one line would', () => {
    const text = `${at('oxygen niv ipap 14, epap 6', 'oxygen niv fio2 0.4')}@ day 1 10:00\nvitals spo2 95\n`;
    expect([inForce(text, 1, 'ipap'), inForce(text, 1, 'fio2')]).toEqual([[14, 'carried', 1], [0.4, 'carried', 2]]);
  });

  it('another device replaces: PN206 names the settings of the line above no longer in force, and offers to keep either line', () => {
    const text = at('oxygen    niv ipap 14, epap 6, fio2 0.5', 'oxygen    hfnc 50 L/min');
    expect([inForce(text, 0, 'device'), inForce(text, 0, 'ipap'), inForce(text, 0, 'fio2')]).toEqual([['hfnc', 'here', 2], [null, null, null], [null, null, null]]);
    const f = codes(text, 'PN206');
    expect(f).toHaveLength(1);
    expect(f[0]!.range.start.line).toBe(2);
    expect(f[0]!.message).toBe('Oxygen device is stated twice at this timepoint; the later value is used. This line replaces the oxygen above it: the IPAP, EPAP and FiO2 of line 2 are no longer in force.');
    expect((f[0]!.related ?? []).map((r) => [r.range.start.line, r.range.start.character, r.message])).toEqual([
      [1, 10, 'first stated here'],
      [1, 14, 'no longer in force: replaced by line 3'],
      [1, 23, 'no longer in force: replaced by line 3'],
      [1, 31, 'no longer in force: replaced by line 3'],
    ]);
    // One fix, not preferred: the device of line 2 written on line 3, which then continues that
    // therapy (every value written is kept; removing a line would lose what it says).
    expect(f[0]!.fixes.map((x) => [x.title, applyEdits(text, x.edits)])).toEqual([
      ['Write `niv` here, as on line 2 (one therapy: the settings above stay in force)', at('oxygen    niv ipap 14, epap 6, fio2 0.5', 'oxygen    niv 50 L/min')],
    ]);
    expect(f[0]!.fixes.some((x) => x.preferred)).toBe(false);
    const fixed = applyEdits(text, f[0]!.fixes[0]!.edits);
    expect([inForce(fixed, 0, 'device'), inForce(fixed, 0, 'ipap'), inForce(fixed, 0, 'o2_flow')]).toEqual([['niv', 'here', 2], [14, 'here', 1], [50, 'here', 2]]);
    expect(codes(fixed, 'PN206')).toEqual([]);
    // Of three devices, the fix writes the one in force (the last above), whose settings are lost.
    const three = at('oxygen cannula 2', 'oxygen niv ipap 14, epap 6', 'oxygen hfnc 40 L/min');
    const g = codes(three, 'PN206').filter((x) => x.range.start.line === 3 && x.message.startsWith('Oxygen device'));
    expect(g.map((x) => x.message)).toEqual(['Oxygen device is stated twice at this timepoint; the later value is used. This line replaces the oxygen above it: the IPAP and EPAP of line 3 are no longer in force.']);
    expect(g[0]!.fixes.map((x) => x.title)).toEqual(['Write `niv` here, as on line 3 (one therapy: the settings above stay in force)']);
    // Not where the line writes what the first device does not take: an FiO2 after a cannula.
    expect(codes(at('oxygen cannula 2', 'oxygen hfnc fio2 0.6'), 'PN206').flatMap((x) => x.fixes)).toEqual([]);
  });

  it('a device with a flow replaced by one restating its flow: only what is not restated is named', () => {
    const text = at('oxygen hfnc 50 L/min, fio2 0.6', 'oxygen mask 10');
    // (The flow, restated, is reported as stated twice as before: the later is used.)
    expect(codes(text, 'PN206').map((x) => x.message).filter((m) => m.startsWith('Oxygen device'))).toEqual(['Oxygen device is stated twice at this timepoint; the later value is used. This line replaces the oxygen above it: the FiO2 of line 2 is no longer in force.']);
    // Settings of two lines (a device, then a line of its own that updates it), named by line.
    const two = at('oxygen niv ipap 14, epap 6', 'oxygen fio2 0.4', 'oxygen mask 10');
    expect(codes(two, 'PN206').map((x) => x.message)).toEqual(['Oxygen device is stated twice at this timepoint; the later value is used. This line replaces the oxygen above it: the IPAP and EPAP of line 2 and the FiO2 of line 3 are no longer in force.']);
    // Nothing left to lose: the plain message.
    expect(codes(at('oxygen cannula 2', 'oxygen mask 8'), 'PN206').map((x) => x.message).filter((m) => m.startsWith('Oxygen device'))).toEqual(['Oxygen device is stated twice at this timepoint; the later value is used.']);
  });

  it('the same device on a line with a word it does not read still updates it: the device is named, so the word is no device misspelt', () => {
    // Before, such a line replaced the therapy, and a fix that wrote the device again (PN206's
    // "Write `venturi` here") left its finding in place on a line with a word half read.
    const text = at('oxygen niv ipap 14, epap 6', 'oxygen niv fio2 0.4, fooo 3');
    expect([inForce(text, 0, 'ipap'), inForce(text, 0, 'fio2')]).toEqual([[14, 'here', 1], [0.4, 'here', 2]]);
    expect(codes(text, 'PN206')).toEqual([]);
    expect(codes(text, 'PN201')).toHaveLength(1);
    // The fix offered where another device replaced the therapy, on a line with a unit not read.
    const other = at('oxygen venturi, fio2 0.35', 'oxygen room air, flow 1e3 L/min');
    const fix = codes(other, 'PN206').flatMap((x) => x.fixes).find((x) => x.title.startsWith('Write `venturi` here'))!;
    expect(fix).toBeDefined();
    const fixed = applyEdits(other, fix.edits);
    expect(codes(fixed, 'PN206')).toEqual([]);
    expect(inForce(fixed, 0, 'fio2')).toEqual([0.35, 'here', 1]);
  });
  it('a line naming no device, with a word it does not read, still replaces (the word may be a device misspelt)', () => {
    const text = `@ day 1 08:00\noxygen cannula 2\n@ day 1 09:00\noxygen flow 3, canula\n`;
    expect(inForce(text, 1, 'device')).toEqual([null, null, null]);
  });

  it('a vent line between ends the oxygen line: the device named again starts afresh, and nothing is named as lost', () => {
    const text = at('oxygen niv ipap 14, epap 6', 'vent mode PC, pinsp 20, peep 8', 'oxygen niv fio2 0.4');
    expect([inForce(text, 0, 'ipap'), inForce(text, 0, 'device')]).toEqual([[null, null, null], ['niv', 'here', 3]]);
    expect(codes(text, 'PN206').map((x) => x.message)).toEqual(['Oxygen device is stated twice at this timepoint; the later value is used.']);
  });

  it('at a later timepoint a line naming the device still replaces the therapy in force (unchanged)', () => {
    const text = '@ day 1 08:00\noxygen niv ipap 14, epap 6\n@ day 1 10:00\noxygen niv fio2 0.4\n';
    expect([inForce(text, 1, 'device'), inForce(text, 1, 'ipap'), inForce(text, 1, 'fio2')]).toEqual([['niv', 'here', 3], [null, null, null], [0.4, 'here', 3]]);
    expect(codes(text, 'PN206')).toEqual([]);
  });

  it('vent lines of one timepoint update the settings as they always did: a further line of its FiO2 keeps the mode and pressures', () => {
    const text = at('vent mode PC, pinsp 20, peep 8', 'vent fio2 0.5');
    expect([inForce(text, 0, 'mode'), inForce(text, 0, 'insp_pressure'), inForce(text, 0, 'peep'), inForce(text, 0, 'fio2')])
      .toEqual([['PC', 'here', 1], [20, 'here', 1], [8, 'here', 1], [0.5, 'here', 2]]);
    expect(codes(text, 'PN206')).toEqual([]);
  });
});
