// The SpO2 target (`oxygen target 88-92`): how it is read, how it carries, and the checks that compare
// with it (PN327 above it on oxygen, PN328 below it, PN329 hypercapnia under an ordinary target).
// The targets themselves: O'Driscoll BR, Howard LS, Earis J, Mak V, BTS guideline for oxygen use in
// adults in healthcare and emergency settings, Thorax 2017;72(Suppl 1):ii1–ii90 — 94–98 % for most
// acutely ill adults, 88–92 % for those at risk of hypercapnic respiratory failure (read in its table 2
// at thorax.bmj.com); and Beasley R et al., Thoracic Society of Australia and New Zealand oxygen
// guidelines for acute oxygen use in adults, Respirology 2015;20:1182–1191 — 92–96 % (read in the
// abstract of its authors' letter of 2016 at ahro.austin.org.au); see tests/physiology/sources-read.test.ts.
// Invented notes only.
import { describe, expect, it } from 'vitest';
import { checkNote, type Settings } from '../../server/src/core';
import { targetInForce } from '../../server/src/core/analysis/spo2-target';

const codes = (text: string, settings: Partial<Settings> = {}) => checkNote(text, settings).findings.map((f) => f.code);
const findings = (text: string, code: string, settings: Partial<Settings> = {}) => checkNote(text, settings).findings.filter((f) => f.code === code);

/** The target in force at each timepoint, as `low-high`, or null. */
function targets(text: string, settings: Partial<Settings> = {}): (string | null)[] {
  const r = checkNote(text, settings);
  return r.analysis.timeline.timepoints.map((tp) => {
    const t = targetInForce(tp.values, { spo2Target: 'none', ...settings });
    return t === null ? null : `${t.lowPct}-${t.highPct}`;
  });
}

describe('the SpO2 target field', () => {
  it('reads two whole percentages joined by a hyphen or an en dash, with or without %', () => {
    // BTS 2017 (read in its table 2): 88–92 % at risk of hypercapnic respiratory failure, 94–98 % otherwise.
    for (const written of ['target 88-92', 'target 88-92 %', 'target 88-92%', 'target 88–92', 'spo2_target 88–92 %']) {
      const text = `@ day 1 09:00\noxygen cannula 2 L/min, ${written}`;
      expect(codes(text), written).toEqual([]);
      expect(targets(text), written).toEqual(['88-92']);
    }
  });

  it('reports a target in another shape (one number, a slash) as a value of the wrong shape, and reads none', () => {
    for (const written of ['target 92', 'target 88/92']) {
      const text = `@ day 1 09:00\noxygen cannula 2, ${written}`;
      expect(codes(text), written).toEqual(['PN102']);
      expect(targets(text), written).toEqual([null]);
    }
  });

  it('reports a reversed or an equal range as impossible (PN301), offers the ends swapped, and uses neither', () => {
    const reversed = checkNote('@ day 1 09:00\noxygen cannula 2, target 92-88\nvitals spo2 85');
    const f = reversed.findings.filter((x) => x.code === 'PN301');
    expect(f).toHaveLength(1);
    expect(f[0]!.message).toBe('SpO2 target 92-88 % is impossible as written: a range gives its lower end first, below its upper end; it is not used in calculations.');
    expect(f[0]!.fixes?.[0]?.edits[0]?.newText).toBe('88-92');
    // Not used: no SpO2 is judged against it.
    expect(reversed.findings.map((x) => x.code)).not.toContain('PN328');
    expect(codes('@ day 1 09:00\noxygen cannula 2, target 92-92')).toEqual(['PN301']);
  });

  it('reports an end outside 70–100 % as impossible (PN301), and uses none', () => {
    // 70 %: below it an oximeter reads poorly (the SpO2 field's usual minimum); above 100 % no saturation is.
    const f = findings('@ day 1 09:00\noxygen cannula 2, target 60-92\nvitals spo2 65', 'PN301');
    expect(f.map((x) => x.message)).toEqual(['SpO2 target 60-92 % is impossible (expected 70 % to 100 %); it is not used in calculations.']);
    expect(codes('@ day 1 09:00\noxygen cannula 2, target 94-101')).toEqual(['PN301']);
    expect(targets('@ day 1 09:00\noxygen cannula 2, target 60-92')).toEqual([null]);
  });
});

describe('a target written with blanks around its dash', () => {
  it('reads as the same range, with a hyphen or an en dash, blanks on both sides or one, the unit glued or apart', () => {
    for (const written of ['target 88 - 92', 'target 88 – 92', 'target 88 - 92 %', 'target 88 – 92%', 'target 88 -92', 'target 88- 92 %', 'target 88  -  92', 'spo2_target 88 – 92']) {
      const text = `@ day 1 09:00\noxygen cannula 2 L/min, ${written}, fio2 0.3`;
      expect(codes(text), written).toEqual([]);
      expect(targets(text), written).toEqual(['88-92']);
    }
  });

  it('keeps the range\'s own place on the line: the pair spans the two numbers, the unit after them', () => {
    const line = checkNote('@ day 1 09:00\noxygen cannula 2, target 88 – 92 %').analysis.tree.lines[1]!;
    const item = line.kind === 'section' ? line.items.find((i) => i.keyName === 'target') : undefined;
    expect(item?.value?.kind).toBe('pair');
    expect(item?.value?.text).toBe('88 – 92');
    expect(item?.unit?.text).toBe('%');
    expect(item?.value?.kind === 'pair' ? item.value.parts.map((p) => p.text) : null).toEqual(['88', '92']);
  });

  it('is impossible reversed as glued (PN301), and offered swapped in the canonical shape', () => {
    const f = findings('@ day 1 09:00\noxygen cannula 2, target 92 - 88', 'PN301');
    expect(f.map((x) => x.fixes?.[0]?.edits[0]?.newText)).toEqual(['88-92']);
  });

  it('reads no range from a dash with no number after it, or a sign after it: not read (PN102), the rest stray (PN105)', () => {
    for (const written of ['target 88 -', 'target 88 - -92', 'target 88 -, 92']) {
      const text = `@ day 1 09:00\noxygen cannula 2, ${written}`;
      expect(codes(text), written).toContain('PN102');
      expect(targets(text), written).toEqual([null]);
    }
  });
});

describe('a target with a decimal end (PN302)', () => {
  // Targets are prescribed in whole percents, as oximeters show SpO2: common practice, no source.
  it('is a warning, used as written, with the rounded range offered', () => {
    const r = checkNote('@ day 1 09:00\noxygen cannula 2, target 88.5-92\nvitals spo2 88');
    const f = r.findings.filter((x) => x.code === 'PN302');
    expect(f).toHaveLength(1);
    expect(f[0]!.severity).toBe('warning');
    expect(f[0]!.message).toBe('SpO2 target 88.5-92 % is not written in whole percents, as SpO2 targets are prescribed and oximeters show SpO2; it is used as written (88.5–92 %). Check the transcription: rounded, it is 89-92.');
    expect(f[0]!.fixes?.map((x) => [x.title, x.edits[0]!.newText])).toEqual([['Write `89-92`', '89-92']]);
    expect(f[0]!.range).toEqual({ start: { line: 1, character: 25 }, end: { line: 1, character: 32 } });
    // Used as written: 88 % is below 88.5 %, and the message does not round the end onto the SpO2.
    expect(targets('@ day 1 09:00\noxygen cannula 2, target 88.5-92')).toEqual(['88.5-92']);
    expect(r.findings.filter((x) => x.code === 'PN328').map((x) => x.message)).toEqual(['SpO2 88 % on oxygen (cannula) is below the target 88.5–92 % written at this timepoint.']);
  });

  it('quotes an SpO2 with the decimals the note wrote, never rounded onto an end (92.4 is not 92 above 88–92 %)', () => {
    expect(findings('@ day 1 09:00\noxygen cannula 2, target 88-92\nvitals spo2 92.4', 'PN327').map((x) => x.message))
      .toEqual(['SpO2 92.4 % on oxygen (cannula) is above the target 88–92 % written at this timepoint.']);
    expect(findings('@ day 1 09:00\noxygen cannula 2, target 88.5-92\nvitals spo2 88.4', 'PN328').map((x) => x.message))
      .toEqual(['SpO2 88.4 % on oxygen (cannula) is below the target 88.5–92 % written at this timepoint.']);
    // A whole SpO2 stays whole where that keeps its side: 88 beside 88.5–92 %.
    expect(findings('@ day 1 09:00\noxygen cannula 2, target 88.5-92\nvitals spo2 88', 'PN328').map((x) => x.message))
      .toEqual(['SpO2 88 % on oxygen (cannula) is below the target 88.5–92 % written at this timepoint.']);
  });

  it('offers no rounding that would make the ends equal or reversed, and says nothing of whole ends written with a decimal point', () => {
    const f = findings('@ day 1 09:00\noxygen cannula 2, target 91.6-92.4', 'PN302');
    expect(f).toHaveLength(1);
    expect(f[0]!.fixes ?? []).toEqual([]);
    expect(f[0]!.message.endsWith('Check the transcription.')).toBe(true);
    expect(codes('@ day 1 09:00\noxygen cannula 2, target 88.0-92')).toEqual([]);
  });

  it('is left to PN301 where the range is not used (reversed or out of bounds)', () => {
    expect(codes('@ day 1 09:00\noxygen cannula 2, target 92.5-88')).toEqual(['PN301']);
    expect(codes('@ day 1 09:00\noxygen cannula 2, target 69.5-92')).toEqual(['PN301']);
  });

  it('rounds the ends with blanks and a decimal comma too (PN103 says the comma)', () => {
    const r = checkNote('@ day 1 09:00\noxygen cannula 2, target 88,5 - 92 %');
    expect(r.findings.map((x) => x.code)).toEqual(['PN103', 'PN302']);
    expect(r.findings[1]!.fixes?.[0]?.edits[0]?.newText).toBe('89-92');
  });
});

describe('a target before the first timepoint', () => {
  it('on an oxygen line there, which opens the implicit first timepoint (`start`), is in force from it on', () => {
    const note = 'patient age 71 y\noxygen target 88-92\n@ day 1 09:00\noxygen cannula 2 L/min\nvitals spo2 95\n@ 10:00\noxygen target 94-98\nvitals spo2 95';
    expect(targets(note)).toEqual(['88-92', '88-92', '94-98']);
    // It overrides the setting, and a later target overrides it.
    expect(targets(note, { spo2Target: '94-98' })).toEqual(['88-92', '88-92', '94-98']);
    expect(findings(note, 'PN327').map((f) => f.message)).toEqual(['SpO2 95 % on oxygen (cannula) is above the target 88–92 % in force since line 2.']);
  });

  it('on a header line (patient, place, units), where it is no key: reported as an unknown key that belongs on an oxygen line (PN201), never ignored in silence', () => {
    for (const line of ['patient age 71 y, target 88-92', 'place altitude 300 m, target 88-92', 'units gas kPa, target 88-92']) {
      const f = findings(`${line}\n@ day 1 09:00\noxygen cannula 2\nvitals spo2 95`, 'PN201');
      expect(f.map((x) => x.message), line).toEqual([`\`target\` is not a key of ${line.split(' ')[0]} lines (\`target\` belongs on an oxygen line).`]);
      expect(targets(`${line}\n@ day 1 09:00\noxygen cannula 2`), line).toEqual([null]);
    }
  });
});

describe('the SpO2 target in force', () => {
  it('carries to later timepoints until another target is written, through room air, a new device and ventilation', () => {
    const note = [
      '@ day 1 09:00', 'oxygen cannula 2 L/min, target 88-92',
      '@ 10:00', 'oxygen room air',
      '@ 11:00', 'oxygen mask 5 L/min',
      '@ 12:00', 'vent mode VC, vt 450, rate 14, peep 5, fio2 0.4',
      '@ 13:00', 'oxygen target 94-98',
      '@ 14:00', 'vitals hr 80',
    ].join('\n');
    expect(targets(note)).toEqual(['88-92', '88-92', '88-92', '88-92', '94-98', '94-98']);
  });

  it('a line of a target alone leaves the therapy in force as it is', () => {
    const r = checkNote('@ day 1 09:00\noxygen cannula 2 L/min\n@ 10:00\noxygen target 88-92\n@ 11:00\noxygen flow 3, target 88-92');
    const tps = r.analysis.timeline.timepoints;
    expect(tps[1]!.values.wordOf('device')).toBe('cannula');
    expect(tps[1]!.values.numberOf('o2_flow')).toBe(2);
    expect(tps[1]!.values.originOf('spo2_target')).toBe('here');
    // A flow beside a target still updates the cannula (the target is no setting of the device).
    expect(tps[2]!.values.wordOf('device')).toBe('cannula');
    expect(tps[2]!.values.numberOf('o2_flow')).toBe(3);
  });

  it('written twice at one timepoint, is reported as any value stated twice (PN206), and the later is used', () => {
    const text = '@ day 1 09:00\noxygen cannula 2, target 88-92\noxygen target 94-98';
    const f = findings(text, 'PN206');
    expect(f.map((x) => x.message)).toEqual(['SpO2 target is stated twice at this timepoint; the later value is used.']);
    expect(f[0]!.range.start.line).toBe(2);
    expect(targets(text)).toEqual(['94-98']);
    // At later timepoints a new target simply replaces the one in force.
    expect(codes('@ day 1 09:00\noxygen cannula 2, target 88-92\n@ 10:00\noxygen target 94-98')).toEqual([]);
  });

  it('comes from the spo2Target setting where the note writes none (default none), and a target written overrides it', () => {
    const note = '@ day 1 09:00\noxygen cannula 2\n@ 10:00\noxygen target 94-98';
    expect(targets(note)).toEqual([null, '94-98']);
    expect(targets(note, { spo2Target: '88-92' })).toEqual(['88-92', '94-98']);
    expect(targets(note, { spo2Target: '92-96' })).toEqual(['92-96', '94-98']);
  });
});

describe('SpO2 above the target on oxygen (PN327)', () => {
  it('fires on oxygen, names the device and where the target was written, and points there', () => {
    const f = findings('@ day 1 09:00\noxygen cannula 2 L/min, target 88-92\n@ 10:00\nvitals spo2 97', 'PN327');
    expect(f).toHaveLength(1);
    expect(f[0]!.severity).toBe('warning');
    expect(f[0]!.message).toBe('SpO2 97 % on oxygen (cannula) is above the target 88–92 % in force since day 1 09:00, line 2.');
    expect(f[0]!.range.start.line).toBe(3);
    expect(f[0]!.related?.[0]?.range.start.line).toBe(1);
  });

  it('fires on an FiO2 above 0.21 with no device (a ventilator)', () => {
    const f = findings('@ day 1 09:00\noxygen target 88-92\nvent mode VC, vt 450, rate 14, peep 5, fio2 0.4\nvitals spo2 96', 'PN327');
    expect(f.map((x) => x.message)).toEqual(['SpO2 96 % on oxygen (FiO2 0.40) is above the target 88–92 % written at this timepoint.']);
  });

  it('stays silent on room air, within the target, at its upper end, and with no target', () => {
    expect(codes('@ day 1 09:00\noxygen room air, target 88-92\nvitals spo2 97')).toEqual([]);
    expect(codes('@ day 1 09:00\noxygen cannula 1, target 88-92\nvitals spo2 92')).toEqual([]);
    expect(codes('@ day 1 09:00\noxygen cannula 1\nvitals spo2 97')).toEqual([]);
  });

  it('compares with the setting\'s target where the note writes none', () => {
    const note = '@ day 1 09:00\noxygen cannula 2\nvitals spo2 96';
    expect(codes(note)).toEqual([]);
    expect(findings(note, 'PN327', { spo2Target: '88-92' }).map((x) => x.message)).toEqual(['SpO2 96 % on oxygen (cannula) is above the target 88–92 % of the spo2Target setting.']);
    expect(findings(note, 'PN327', { spo2Target: '88-92' })[0]!.related).toBeUndefined();
  });
});

describe('SpO2 below the target (PN328)', () => {
  it('fires on air and on oxygen, and says which', () => {
    expect(findings('@ day 1 09:00\noxygen room air, target 94-98\nvitals spo2 91', 'PN328').map((f) => f.message))
      .toEqual(['SpO2 91 % on room air is below the target 94–98 % written at this timepoint.']);
    expect(findings('@ day 1 09:00\noxygen cannula 2, target 88-92\n@ 10:00\nvitals spo2 86', 'PN328').map((f) => f.message))
      .toEqual(['SpO2 86 % on oxygen (cannula) is below the target 88–92 % in force since day 1 09:00, line 2.']);
  });

  it('names NIV, CPAP and high flow as the rest of Pneumark does, in capitals', () => {
    expect(findings('@ day 1 09:00\noxygen niv, ipap 16, epap 6, fio2 0.35, target 88-92\nvitals spo2 86', 'PN328').map((f) => f.message))
      .toEqual(['SpO2 86 % on oxygen (NIV) is below the target 88–92 % written at this timepoint.']);
    expect(findings('@ day 1 09:00\noxygen hfnc 40 L/min, fio2 0.4, target 88-92\nvitals spo2 97', 'PN327').map((f) => f.message))
      .toEqual(['SpO2 97 % on oxygen (HFNC) is above the target 88–92 % written at this timepoint.']);
  });

  it('says so where the note names neither oxygen nor air', () => {
    expect(findings('@ day 1 09:00\nvitals spo2 90', 'PN328', { spo2Target: '94-98' }).map((f) => f.message))
      .toEqual(['SpO2 90 % (neither oxygen nor room air written) is below the target 94–98 % of the spo2Target setting.']);
  });

  it('stays silent at the lower end and with no target', () => {
    expect(codes('@ day 1 09:00\noxygen cannula 2, target 88-92\nvitals spo2 88')).toEqual([]);
    expect(codes('@ day 1 09:00\noxygen cannula 2\nvitals spo2 80')).not.toContain('PN328');
  });
});

describe('an SpO2 written with decimals (PN327, PN328)', () => {
  it('is quoted as written, never rounded onto the end of the target it is reported outside', () => {
    // 92.4 % is above a target of 88–92 % and 87.5 % below it (BTS 2017, from memory): the messages
    // say 92.4 and 87.5, not "92 % is above the target 88–92 %" nor "88 % is below" it.
    const above = findings('@ 08:00\noxygen cannula 2 L/min, target 88-92\nvitals spo2 92.4', 'PN327');
    expect(above).toHaveLength(1);
    expect(above[0]!.message).toBe('SpO2 92.4 % on oxygen (cannula) is above the target 88–92 % written at this timepoint.');
    const below = findings('@ 08:00\noxygen cannula 2 L/min, target 88-92\nvitals spo2 87.5', 'PN328');
    expect(below).toHaveLength(1);
    expect(below[0]!.message).toBe('SpO2 87.5 % on oxygen (cannula) is below the target 88–92 % written at this timepoint.');
    expect(findings('@ 08:00\noxygen cannula 2 L/min, target 88-92\nvitals spo2 97', 'PN327')[0]!.message).toMatch(/^SpO2 97 % on oxygen/);
  });
});

describe('hypercapnia under an ordinary target (PN329)', () => {
  const gas = 'abg 7.31/62/68/30';

  it('fires where a target whose lower end is 92 % or more is in force, as information, and points to the target', () => {
    // PaCO2 62 mmHg is above the hypercapnia threshold of 50 mmHg (the setting's default).
    const f = findings(`@ day 1 09:00\noxygen mask 5 L/min, target 94-98\n@ 10:00\n${gas}`, 'PN329');
    expect(f).toHaveLength(1);
    expect(f[0]!.severity).toBe('information');
    expect(f[0]!.message).toBe('PaCO2 62 mmHg is above 50 mmHg under the target 94–98 % in force since day 1 09:00, line 2: consistent with hypercapnic respiratory failure; BTS 2017 suggests a target of 88–92 % for patients at risk of it — review the target under local protocol.');
    expect(f[0]!.related?.[0]?.range.start.line).toBe(1);
    expect(findings(`@ day 1 09:00\noxygen mask 5 L/min, target 92-96\n${gas}`, 'PN329')).toHaveLength(1);
  });

  it('stays silent with no target, under 88–92 %, and without hypercapnia', () => {
    expect(findings(`@ day 1 09:00\noxygen mask 5 L/min\n${gas}`, 'PN329')).toEqual([]);
    expect(findings(`@ day 1 09:00\noxygen mask 5 L/min, target 88-92\n${gas}`, 'PN329')).toEqual([]);
    expect(findings('@ day 1 09:00\noxygen mask 5 L/min, target 94-98\nabg 7.40/45/80/26', 'PN329')).toEqual([]);
    // The threshold is the hypercapniaAboveMmhg setting's.
    expect(findings(`@ day 1 09:00\noxygen mask 5 L/min, target 94-98\n${gas}`, 'PN329', { hypercapniaAboveMmhg: 65 })).toEqual([]);
  });

  it('reads a PaCO2 in kPa at the resolution it was written with, as the ventilation reading (PN411) does', () => {
    // 6.7 kPa (50.25 mmHg) stands for 6.65–6.75 kPa, which holds 50 mmHg: on the threshold, not above
    // it, so neither PN411 nor PN329 speaks (the threshold: the hypercapniaAboveMmhg setting, 50 mmHg
    // by default; 1 kPa = 7.50062 mmHg, from memory).
    const onIt = checkNote('@ day 1 09:00\noxygen mask 5 L/min, target 92-96\nabg 7.30/6.7/9.0 kPa').findings.map((f) => f.code);
    expect(onIt).not.toContain('PN411');
    expect(onIt).not.toContain('PN329');
    // 6.70 kPa is written to the hundredth (6.695–6.705 kPa, 50.22–50.29 mmHg): above 50 mmHg, for both.
    const above = checkNote('@ day 1 09:00\noxygen mask 5 L/min, target 92-96\nabg 7.30/6.70/9.0 kPa').findings;
    expect(above.map((f) => f.code)).toContain('PN411');
    const f = above.filter((x) => x.code === 'PN329');
    expect(f).toHaveLength(1);
    // Each number on its side of the threshold, as PN411 writes them, never "50 mmHg is above 50 mmHg".
    expect(f[0]!.message).toMatch(/^PaCO2 6\.70 kPa \(50\.3 mmHg\) is above 6\.67 kPa under the target 92–96 % written at this timepoint: /);
    expect(findings('@ day 1 09:00\noxygen mask 5 L/min, target 92-96\nabg 7.30/6.8/9.0 kPa', 'PN329')[0]!.message).toMatch(/^PaCO2 6\.8 kPa \(51 mmHg\) is above 6\.7 kPa under /);
  });

  it('takes the setting\'s target where the note writes none', () => {
    expect(findings(`@ day 1 09:00\noxygen mask 5 L/min\n${gas}`, 'PN329', { spo2Target: '94-98' })).toHaveLength(1);
    expect(findings(`@ day 1 09:00\noxygen mask 5 L/min\n${gas}`, 'PN329', { spo2Target: '88-92' })).toEqual([]);
  });
});
