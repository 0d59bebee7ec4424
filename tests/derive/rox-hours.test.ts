// The ROX index ((SpO2 ÷ FiO2) ÷ RR) read against its thresholds by the hours of high flow. Source:
// Roca O, Caralt B, Messika J, et al. An index combining respiratory rate and oxygenation to predict
// outcome of nasal high-flow therapy. Am J Respir Crit Care Med 2019;199(11):1368–1376 (thresholds
// read in its abstract): ROX ≥ 4.88 at 2, 6 or 12 h of high flow associated with success; < 2.85 at
// 2 h, < 3.47 at 6 h and < 3.85 at 12 h with failure. A ROX within 1 h of 2, 6 or 12 h of high flow
// is read against that hour's thresholds (common practice, no source). Invented patients and times.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { highFlowHoursAt, onHighFlow, roxAtHour } from '../../server/src/core/derive/high-flow';
import { deviceInForce } from '../../server/src/core/analysis/noninvasive-support';
import { roxSideAt, roxThresholdHour } from '../../server/src/core/physiology';
import { derivedHover } from '../../server/src/core/service';
import { run } from '../../server/src/cli/main';
import { memoryIo } from '../helpers/memory-io';
import { derivation } from './helpers';
import { NoteSession } from '../../server/src/core/session';
import { sameAsJson, snapshot } from '../core/session-snapshot';

const ROCA_NOTE = '≥ 4.88 at 2, 6 or 12 h of high flow was associated with success; below 2.85 at 2 h, 3.47 at 6 h and 3.85 at 12 h with failure (Roca 2019)';

/** Room air at 07:00, high flow from 09:00 (FiO2 0.6, carried), then `rest`. */
const started = (rest: string) => `patient age 62 y\n@ 07:00 on the ward\noxygen room air\nvitals rr 24, spo2 93 %\n@ 09:00 high flow started\noxygen hfnc 50 L/min, fio2 0.6\n${rest}`;

const rox = (text: string) => derivation(text).derived.find((d) => d.id === 'rox_index')!;
const hoursAt = (text: string, index = -1) => {
  const tps = checkNote(text).analysis.timeline.timepoints;
  return highFlowHoursAt(tps, index < 0 ? tps.length + index : index);
};

describe('the hours of high flow at a timepoint', () => {
  it('count from the time of the timepoint where the run began, with the FiO2 carried', () => {
    // 09:00 to 15:00: 6 h.
    expect(hoursAt(started('@ 15:00\nvitals rr 45, spo2 88 %\n'))).toEqual({ hours: 6, atLeast: false });
    // 09:00 to 13:30: 4.5 h.
    expect(hoursAt(started('@ 13:30\nvitals rr 30, spo2 90 %\n'))).toEqual({ hours: 4.5, atLeast: false });
  });

  it('go on where high flow is named again, and start again after another device', () => {
    // Named again at 15:00 with a new FiO2: the run still began at 09:00, so 21:00 is 12 h.
    expect(hoursAt(started('@ 15:00\noxygen hfnc 50 L/min, fio2 0.5\n@ 21:00\nvitals rr 25, spo2 92 %\n'))).toEqual({ hours: 12, atLeast: false });
    // A mask at 11:00, high flow again at 13:00: at 15:00 the run is 2 h old.
    expect(hoursAt(started('@ 11:00\noxygen mask 10 L/min\n@ 13:00\noxygen hfnc 50 L/min, fio2 0.6\n@ 15:00\nvitals rr 45, spo2 88 %\n'))).toEqual({ hours: 2, atLeast: false });
    // Room air at 11:00, high flow again at 12:00: at 15:00, 3 h.
    expect(hoursAt(started('@ 11:00\noxygen room air\n@ 12:00\noxygen hfnc 40 L/min, fio2 0.5\n@ 15:00\nvitals rr 30, spo2 90 %\n'))).toEqual({ hours: 3, atLeast: false });
  });

  it('are "at least" where high flow is in force from the note\'s first timepoint', () => {
    // 08:00 to 14:00: at least 6 h (high flow may have begun before the note).
    expect(hoursAt('@ 08:00\noxygen hfnc 50 L/min, fio2 0.6\n@ 14:00\nvitals rr 30, spo2 90 %\n')).toEqual({ hours: 6, atLeast: true });
  });

  it('are unknown where a time is unknown, and none off high flow', () => {
    // The start has no time (a label only): unknown.
    expect(hoursAt('@ 07:00\noxygen room air\n@ after the round\noxygen hfnc 50 L/min, fio2 0.6\n@ review\nvitals rr 30, spo2 90 %\n')).toBeNull();
    expect(hoursAt(started('@ 11:00\noxygen mask 10 L/min\nvitals rr 30, spo2 90 %\n'))).toBeNull();
  });
});

describe('the ROX index read against the thresholds of its hour (Roca 2019)', () => {
  it('at 6 h: below 3.47 is associated with failure, and says so in its note and beside its number', () => {
    // 88 ÷ 0.6 = 146.67; ÷ 45 = 3.259, shown 3.26 < 3.47 (the 6 h threshold of failure).
    const r = rox(started('@ 15:00\nvitals rr 45, spo2 88 %\n'));
    expect(r.value).toBeCloseTo(3.259, 3);
    expect(r.notes).toEqual([ROCA_NOTE, 'ROX 3.26 after 6 h of high flow, read at 6 h: below 3.47, the 6 h threshold associated with failure of high flow (Roca 2019)']);
    expect(r.caveat).toBe('6 h: < 3.47');
  });

  it('at 2 h: the same ROX is between 2.85 and 4.88 (a device change restarted the run)', () => {
    // 88 ÷ 0.6 ÷ 45 = 3.26: ≥ 2.85 (failure at 2 h) and < 4.88 (success).
    const r = rox(started('@ 11:00\noxygen mask 10 L/min\n@ 13:00\noxygen hfnc 50 L/min, fio2 0.6\n@ 15:00\nvitals rr 45, spo2 88 %\n'));
    expect(r.notes[1]).toBe('ROX 3.26 after 2 h of high flow, read at 2 h: between 2.85 and 4.88, the 2 h thresholds associated with failure and with success of high flow (Roca 2019)');
    expect(r.caveat).toBe('2 h: 2.85–4.88');
  });

  it('at 12 h: 4.88 or more is associated with success', () => {
    // 92 ÷ 0.5 = 184; ÷ 25 = 7.36 ≥ 4.88.
    const r = rox(started('@ 15:00\noxygen hfnc 50 L/min, fio2 0.5\n@ 21:00\nvitals rr 25, spo2 92 %\n'));
    expect(r.value).toBeCloseTo(7.36, 2);
    expect(r.notes[1]).toBe('ROX 7.36 after 12 h of high flow, read at 12 h: 4.88 or more, the threshold associated with success of high flow (Roca 2019)');
    expect(r.caveat).toBe('12 h: ≥ 4.88');
  });

  it('within 1 h of the hour: at 1 h 30 min it is read at 2 h; at 12 h 45 min at 12 h, against 3.85', () => {
    // 09:00 to 10:30 = 1.5 h; 90 ÷ 0.6 = 150, ÷ 40 = 3.75: between 2.85 and 4.88.
    expect(rox(started('@ 10:30\nvitals rr 40, spo2 90 %\n')).caveat).toBe('2 h: 2.85–4.88');
    // 09:00 to 21:45 = 12.75 h; 3.75 < 3.85 (failure at 12 h).
    expect(rox(started('@ 21:45\nvitals rr 40, spo2 90 %\n')).caveat).toBe('12 h: < 3.85');
  });

  it('is not read against a threshold at 4 h, where hours are at least, or unknown', () => {
    // 09:00 to 13:00 = 4 h: no threshold (the windows are 1–3, 5–7 and 11–13 h).
    const at4 = rox(started('@ 13:00\nvitals rr 45, spo2 88 %\n'));
    expect([at4.notes, at4.caveat]).toEqual([[ROCA_NOTE], null]);
    // At least 6 h: not read, and said why (tests below).
    const atLeast = rox('@ 08:00\noxygen hfnc 50 L/min, fio2 0.6\n@ 14:00\nvitals rr 45, spo2 88 %\n');
    expect([atLeast.notes.length, atLeast.caveat]).toEqual([2, 'start of high flow not in the note']);
    const unknown = rox('@ 07:00\noxygen room air\n@ after the round\noxygen hfnc 50 L/min, fio2 0.6\n@ review\nvitals rr 45, spo2 88 %\n');
    expect([unknown.notes, unknown.caveat]).toEqual([[ROCA_NOTE], null]);
  });

  it('compares the number shown: 3.4649 (shown 3.46) is below 3.47, 3.4651 (shown 3.47) is not', () => {
    const six = { hours: 6, atLeast: false };
    expect(roxAtHour(3.4649, six)!.caveat).toBe('6 h: < 3.47');
    expect(roxAtHour(3.4651, six)!.caveat).toBe('6 h: 3.47–4.88');
    expect(roxAtHour(4.875, six)!.caveat).toBe('6 h: ≥ 4.88');
    expect(roxAtHour(5, { hours: 6, atLeast: true })?.caveat).toBe('start of high flow not in the note');
  });

  it('hours and sides at the edges of the windows', () => {
    expect([1, 3, 5, 7, 11, 13].map(roxThresholdHour)).toEqual([2, 2, 6, 6, 12, 12]);
    expect([0.5, 4, 7.5, 10, 13.5, Number.NaN].map(roxThresholdHour)).toEqual([null, null, null, null, null, null]);
    // Roca 2019: failure below 2.85 / 3.47 / 3.85 at 2 / 6 / 12 h; success from 4.88.
    expect([roxSideAt(2.84, 2), roxSideAt(2.85, 2), roxSideAt(3.84, 12), roxSideAt(3.85, 12), roxSideAt(4.88, 6), roxSideAt(4, 4)]).toEqual(['failure', 'between', 'failure', 'between', 'success', null]);
  });
});

describe('the reading by the hours of high flow is shown', () => {
  const text = started('@ 15:00\nvitals rr 45, spo2 88 %\n');
  const reading = 'ROX 3.26 after 6 h of high flow, read at 6 h: below 3.47, the 6 h threshold associated with failure of high flow (Roca 2019)';

  it('in the hover of the ROX value', () => {
    expect(derivedHover(rox(text))).toContain('below 3.47, the 6 h threshold associated with failure of high flow');
  });

  it('beside the number in `pneumark show`', async () => {
    const io = memoryIo({ stdin: text, env: { NO_COLOR: '1' }, tty: false });
    await run(['show', '-'], io);
    expect(io.out()).toContain('ROX 3.26* (6 h: < 3.47)');
  });

  it('in the JSON of `pneumark check`', async () => {
    const io = memoryIo({ stdin: text, env: { NO_COLOR: '1' }, tty: false });
    await run(['check', '--format', 'json', '-'], io);
    expect(io.out()).toContain(reading);
  });
});

describe('the hours of high flow in an open note', () => {
  it('follow an edit of the time the run began, which changes no value of the later timepoint', () => {
    // Air at 07:00, high flow from 09:00 (or 11:00 after the edit), vitals at 15:00: ROX read at
    // 6 h, then at 4 h (no threshold). (97 ÷ 0.5) ÷ 30 = 6.47 (Roca 2016: SpO2 ÷ FiO2 ÷ RR).
    const note = (start: string) => `@ day 1 07:00\noxygen room air\nvitals rr 24, spo2 90 %\n@ day 1 ${start}\noxygen hfnc 50 L/min, fio2 0.5\n@ day 1 15:00\nvitals rr 30, spo2 97 %\n`;
    const session = new NoteSession();
    // And an edit of the device before the run, which makes the run begin at the note's first timepoint.
    const earlier = note('09:00').replace('oxygen room air', 'oxygen hfnc 40 L/min, fio2 0.5');
    for (const text of [note('09:00'), note('11:00'), note('09:00'), earlier, note('09:00')]) {
      const r = session.update(text);
      expect(sameAsJson(snapshot(r), snapshot(checkNote(text)))).toBe(true);
    }
    const rox = (text: string) => session.update(text).analysis.derivation(2).derived.find((d) => d.id === 'rox_index')!;
    expect(rox(note('09:00')).caveat).toBe('6 h: ≥ 4.88');
    expect(rox(note('11:00')).caveat).toBeNull();
  });
});

describe('high flow in force is read as the rest of the core reads the device (`deviceInForce`)', () => {
  it('a device carried from an earlier timepoint, and kept by an oxygen line that names none, is high flow at every timepoint after', () => {
    // High flow from 09:00; at 12:00 an oxygen line with a new FiO2 and no device keeps it
    // (`deviceSets`); at 15:00 only vitals. 09:00 to 15:00: 6 h, the run unbroken.
    const text = started('@ 12:00\noxygen fio2 0.5\n@ 15:00\nvitals rr 30, spo2 95 %\n');
    const tps = checkNote(text).analysis.timeline.timepoints;
    expect(tps.map((tp) => tp.values.originOf('device'))).toEqual(['here', 'here', 'carried', 'carried']);
    expect(tps.map((tp) => deviceInForce(tp.values))).toEqual(['room air', 'hfnc', 'hfnc', 'hfnc']);
    expect(tps.map(onHighFlow)).toEqual(tps.map((tp) => deviceInForce(tp.values) === 'hfnc'));
    expect(tps.map(onHighFlow)).toEqual([false, true, true, true]);
    expect(hoursAt(text)).toEqual({ hours: 6, atLeast: false });
    expect(hoursAt(text, 2)).toEqual({ hours: 3, atLeast: false });
  });

  it('a mask carried after high flow ends the run at every timepoint it is in force', () => {
    const text = started('@ 11:00\noxygen mask 10 L/min\n@ 12:00\nvitals rr 30, spo2 95 %\n');
    const tps = checkNote(text).analysis.timeline.timepoints;
    expect(tps.map(onHighFlow)).toEqual([false, true, false, false]);
    expect(hoursAt(text)).toBeNull();
  });
});

// Why no threshold is read where high flow is in force from the note's first timepoint: when it began
// is not in the note (it may have begun before), so its hours are "at least" (by design). Said in
// plain words in the hover and JSON (a note) and beside the value in `show` and the inlay hint (a
// caveat), with how to write the start: what the patient had before, at an earlier timepoint.
describe('a run of high flow from the note\'s first timepoint', () => {
  const FROM_FIRST = '@ 08:00\noxygen hfnc 50 L/min, fio2 0.6\nvitals rr 30, spo2 90 %\n@ 14:00\nvitals rr 45, spo2 88 %\n';

  it('says why the ROX is not read against the thresholds, and how to write the start', () => {
    const r = rox(FROM_FIRST);
    expect(r.caveat).toBe('start of high flow not in the note');
    expect(r.notes[1]).toBe("not read against the 2, 6 or 12 h thresholds (Roca 2019): high flow is in force from the note's first timepoint, 6 h before this one, and may have begun before it, so its hours are not known. To have them counted, write what the patient had before high flow at an earlier timepoint (`oxygen room air` or `oxygen cannula 2 L/min`, with its time): high flow then counts from the first timepoint that names it");
    // At the first timepoint itself.
    expect(derivation(FROM_FIRST, {}, 0).derived.find((d) => d.id === 'rox_index')!.notes[1]).toMatch(/^not read against the 2, 6 or 12 h thresholds \(Roca 2019\): high flow is in force from the note's first timepoint and may have begun before it/);
  });

  it('following the advice gives the reading: room air at 07:30, high flow from 08:00, at 14:00 6 h (3.26 < 3.47)', () => {
    // 88 ÷ 0.6 ÷ 45 = 3.26: below the 6 h failure threshold 3.47 (Roca 2019).
    const r = rox(`@ 07:30\noxygen room air\n${FROM_FIRST}`);
    expect(r.caveat).toBe('6 h: < 3.47');
  });

  it('says nothing of it where the hours are at least past the last window (13 h): no threshold could be read', () => {
    const r = rox('@ 08:00\noxygen hfnc 50 L/min, fio2 0.6\n@ 22:00\nvitals rr 30, spo2 90 %\n');
    expect([r.notes, r.caveat]).toEqual([[ROCA_NOTE], null]);
  });

  it('the hover and `show` say so', async () => {
    const d = derivation(FROM_FIRST);
    const value = d.derived.find((x) => x.id === 'rox_index')!;
    const io = memoryIo({ stdin: FROM_FIRST });
    await run(['show', '-'], io);
    // The FiO2 is carried from 08:00 (`*`).
    expect(io.out()).toContain('ROX 3.26* (start of high flow not in the note)');
    expect(derivedHover(value)).toContain('write what the patient had before high flow at an earlier timepoint');
  });
});
