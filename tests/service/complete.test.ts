// Completions by cursor position: sections and snippets at the start of a line, keys after a
// section word or a comma, words after word keys, units (then keys) after a number.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { SECTIONS } from '../../server/src/core/fields/sections';
import { applyEdits, completionsAt, type CompletionInfo } from '../../server/src/core/service';
import { noteAt } from './cursor';

function complete(marked: string): CompletionInfo[] {
  const { result, position } = noteAt(marked);
  return completionsAt(result, position);
}

const labels = (marked: string) => complete(marked).map((c) => c.label);

describe('at the start of a line', () => {
  it('offers every section with its description, padded so items start in column 10', () => {
    const items = complete('|');
    const sections = items.filter((c) => c.kind === 'section');
    expect(sections.map((c) => c.label)).toEqual(SECTIONS.map((s) => s.id));
    const vitals = sections.find((c) => c.label === 'vitals');
    expect(vitals?.documentation).toBe('Bedside observations at this timepoint.');
    expect(vitals?.insertText).toBe('vitals    ');
  });

  it('offers timepoint, gas-line and vent-line snippets', () => {
    const snippets = complete('|').filter((c) => c.kind === 'snippet');
    expect(snippets.every((c) => c.isSnippet)).toBe(true);
    const texts = snippets.map((c) => c.insertText);
    expect(texts).toContain('@ day ${1:N} ${2:HH:MM}  ${3:label}');
    expect(texts).toContain('@ +${1:interval}');
    expect(texts).toContain('abg       ${1:<pH>}/${2:<PaCO2>}/${3:<PaO2>}/${4:<HCO3>}');
    expect(texts.some((t) => t.startsWith('vent      mode ${1|VC,PC,PRVC,PS,SIMV,APRV,CPAP,HFOV|}, vt ${2:<VT>} mL'))).toBe(true);
  });

  it('fills every snippet with words, so that a snippet left unfilled is reported on its line', () => {
    // Each snippet as it reads when every stop is left as it is (a choice keeps its first word).
    const unfilled = (snippet: string) => snippet
      .replace(/\$\{\d+\|([^,|}]*)[^}]*\}/g, '$1')
      .replace(/\$\{\d+:([^}]*)\}/g, '$1')
      .replace(/\$\d+/g, '');
    const snippets = (marked: string) => complete(marked).filter((c) => c.kind === 'snippet');
    const lines = [
      ...snippets('|').map((c) => unfilled(c.insertText)),
      ...snippets('@ |').map((c) => `@ ${unfilled(c.insertText)}`),
      ...snippets('abg |').map((c) => `abg ${unfilled(c.insertText)}`),
      ...snippets('vbg |').map((c) => `vbg ${unfilled(c.insertText)}`),
    ];
    expect(lines.length).toBe(10);
    expect(lines.every((l) => !/[$]/.test(l))).toBe(true);
    // After a real timepoint, so that the gas and vent lines are read as at a timepoint.
    const text = ['@ day 1 08:00  arrival', ...lines].join('\n');
    const findings = checkNote(text).findings.filter((f) => f.severity === 'error' || f.severity === 'warning');
    lines.forEach((line, i) => {
      expect(findings.some((f) => f.range.start.line === i + 1), `no finding on the unfilled snippet \`${line}\``).toBe(true);
    });
    // A value's placeholder (`<VT>`) left unfilled is one PN102 finding that says so, its unit
    // included: not a key without a value, a stray word and a unit read as a key.
    lines.forEach((line, i) => {
      if (line.startsWith('@')) return;
      const here = findings.filter((f) => f.range.start.line === i + 1);
      const words = line.split(/[\s,]+/).filter((w) => /<[A-Za-z]/.test(w)).length;
      expect(words, line).toBeGreaterThan(0);
      expect(here.map((f) => f.code), line).toEqual(Array(words).fill('PN102'));
      expect(here.every((f) => /placeholders? left unfilled/.test(f.message)), line).toBe(true);
    });
  });

  it('narrows to a partly typed first word and replaces it', () => {
    const items = complete('vi|');
    expect(items.map((c) => c.label)).toEqual(['vitals']);
    expect(items[0]?.replace).toEqual({ start: { line: 0, character: 0 }, end: { line: 0, character: 2 } });
    expect(labels('@|').every((l) => l.startsWith('@'))).toBe(true);
    expect(labels('@|').length).toBe(3);
  });

  it('inserts the bare section word when the line already has items', () => {
    expect(complete('vit| hr 80').find((c) => c.label === 'vitals')?.insertText).toBe('vitals');
  });

  it('offers times after `@`', () => {
    expect(labels('@ |')).toEqual(['day N HH:MM', 'HH:MM', '+interval']);
    expect(labels('@ 08:00 |')).toEqual([]);
  });

  it('offers a clock time after `@ day N`, and nothing once the time is there', () => {
    for (const marked of ['@ day 2 |', '@day 2 |', '@ DAY 12 |']) {
      expect(complete(marked).map((c) => [c.label, c.insertText]), marked).toEqual([['HH:MM', '${1:HH:MM}  ${2:label}']]);
    }
    expect(labels('@ day 2 08:00 |')).toEqual([]);
    expect(labels('@ day |')).toEqual([]);
    expect(labels('@ day x |')).toEqual([]);
  });
});

describe('keys', () => {
  it('after a section word: the keys of that section with their label and default unit', () => {
    const items = complete('vitals    |');
    expect(items.map((c) => c.label)).toEqual(['hr', 'rr', 'spo2', 'temp', 'bp', 'map', 'etco2', 'co']);
    expect(items[0]).toMatchObject({ kind: 'key', detail: 'Heart rate · /min', documentation: 'Heart rate.', insertText: 'hr' });
    expect(complete('abg |').find((c) => c.label === 'po2')?.detail).toBe("PaO2 · mmHg or kPa (bare: the note's gas unit)");
  });

  it('after a comma: the keys not yet used on the line', () => {
    expect(labels('vitals hr 80, |')).toEqual(['rr', 'spo2', 'temp', 'bp', 'map', 'etco2', 'co']);
    expect(labels('vitals hr 80, | , spo2 95 %')).toEqual(['rr', 'temp', 'bp', 'map', 'etco2', 'co']);
    expect(labels('vitals hr 80, r|')).toEqual(['rr']);
    expect(labels('vitals hr|')).toContain('hr'); // the key being typed does not count as used
  });

  it('right after a comma, with a blank before the key', () => {
    const { text, result, position } = noteAt('vitals hr 80,|');
    const rr = completionsAt(result, position).find((c) => c.label === 'rr')!;
    expect(applyEdits(text, [{ range: rr.replace!, newText: rr.insertText }])).toBe('vitals hr 80, rr');
    const typed = noteAt('vitals hr 80,s|p');
    const spo2 = completionsAt(typed.result, typed.position).find((c) => c.label === 'spo2')!;
    expect(applyEdits(typed.text, [{ range: spo2.replace!, newText: spo2.insertText }])).toBe('vitals hr 80, spo2');
    expect(complete('vitals hr 80, |').find((c) => c.label === 'rr')?.insertText).toBe('rr');
  });

  it('after a complete item without a comma (commas are optional)', () => {
    expect(labels('vitals hr 80 bpm |')).toContain('rr');
    expect(labels('abg 7.28/56/71/26 kPa |')).toContain('be');
  });

  it('offers a shorthand snippet first on a gas line', () => {
    const shorthand = complete('abg |').find((c) => c.kind === 'snippet');
    expect(shorthand?.insertText).toBe('${1:<pH>}/${2:<PaCO2>}/${3:<PaO2>}/${4:<HCO3>}');
    expect(complete('vbg |').find((c) => c.kind === 'snippet')?.insertText).toBe('${1:<pH>}/${2:<PvCO2>}/${3:<PvO2>}/${4:<HCO3>}');
  });
});

describe('the set inspiratory pressure', () => {
  it('is offered on a vent line as `pinsp`, described as above PEEP, and never on an oxygen line', () => {
    const items = complete('vent mode PC, |');
    const pinsp = items.find((c) => c.label === 'pinsp');
    expect(pinsp, 'pinsp offered').toBeDefined();
    expect(pinsp?.documentation).toContain('above PEEP');
    // Its aliases are not offered as keys of their own: one entry per field.
    expect(items.map((c) => c.label)).not.toContain('insp_pressure');
    expect(labels('vent mode PC, pin|')).toContain('pinsp');
    expect(labels('oxygen niv, |')).not.toContain('pinsp');
  });
});

describe('words', () => {
  it('modes after `mode`, sexes after `sex`, gas units after `units gas`, devices first on an oxygen line', () => {
    expect(labels('vent mode |')).toEqual(['VC', 'PC', 'PRVC', 'PS', 'SIMV', 'SIMV-VC', 'SIMV-PC', 'APRV', 'CPAP', 'HFOV']);
    expect(labels('vent mode simv-|')).toEqual(['SIMV-VC', 'SIMV-PC']);
    expect(labels('patient age 60 y, sex |')).toEqual(['female', 'male']);
    expect(labels('units gas |')).toEqual(['mmHg', 'kPa']);
    expect(labels('oxygen |')).toEqual(['room air', 'cannula', 'mask', 'venturi', 'reservoir', 'hfnc', 'niv', 'cpap']);
    expect(labels('oxygen ca|')).toEqual(['cannula']);
  });
});

describe('units', () => {
  it('after a key and a number: the units that key takes, then the keys that may follow (a unit may be left out)', () => {
    const units = (marked: string) => complete(marked).filter((c) => c.kind === 'unit').map((c) => c.label);
    expect(units('abg po2 71 |')).toEqual(['mmHg', 'kPa']);
    expect(units('vitals temp 38.2 |')).toEqual(['C', 'F']);
    expect(units('vent fio2 40 |')).toEqual(['%']);
    expect(units('labs hb 11 |')).toEqual(['g/dL', 'g/L', 'mmol/L']);
    expect(complete('abg po2 71 |')[0]).toMatchObject({ kind: 'unit', detail: "PaO2 (the note's gas unit)" });
    expect(complete('vitals temp 38.2 |')[0]).toMatchObject({ kind: 'unit', detail: 'Temperature (default unit)' });
    // Units first, then keys not yet on the line.
    const items = complete('vitals hr 80 |');
    const firstKey = items.findIndex((c) => c.kind === 'key');
    expect(items.slice(0, firstKey).every((c) => c.kind === 'unit')).toBe(true);
    expect(items.slice(firstKey).every((c) => c.kind === 'key')).toBe(true);
    expect(items.map((c) => c.label)).toContain('rr');
    expect(items.map((c) => c.label)).not.toContain('hr');
  });

  it('after a shorthand gas or a device flow', () => {
    expect(labels('abg 7.28/56/71/26 |').slice(0, 2)).toEqual(['mmHg', 'kPa']);
    expect(labels('oxygen cannula 2 |')[0]).toBe('L/min');
    expect(labels('oxygen cpap 8 |').slice(0, 2)).toEqual(['cmH2O', 'mbar']);
  });

  it("offers a gas pressure's units with the note's gas unit first, where bare numbers are read in it", () => {
    const first = (marked: string, settings = {}) => {
      const { result, position } = noteAt(marked, settings);
      return completionsAt(result, position).filter((c) => c.kind === 'unit').map((c) => [c.label, c.detail]);
    };
    const kpaFirst = [['kPa', "PaO2 (the note's gas unit)"], ['mmHg', 'PaO2']];
    expect(first('units gas kPa\n@ 08:00\nabg po2 9.5 |')).toEqual(kpaFirst);
    expect(first('@ 08:00\nunits gas kPa\nabg po2 9.5 |')).toEqual(kpaFirst);
    expect(first('@ 08:00\nabg po2 9.5 |', { gasUnit: 'kPa' })).toEqual(kpaFirst);
    expect(first('units gas kPa\nabg 7.31/5.9/8.1/28 |').map(([l]) => l)).toEqual(['kPa', 'mmHg']);
    // A header line follows the header's gas unit.
    // A barometric pressure also takes hPa, as weather stations give it: offered after the gas units.
    expect(first('units gas kPa\nplace pb 90 |').map(([l]) => l)).toEqual(['kPa', 'mmHg', 'hPa']);
    expect(first('units gas kPa\n@ 08:00\nunits gas mmHg\nabg po2 71 |').map(([l]) => l)).toEqual(['mmHg', 'kPa']);
    // As the note is read: a `units gas` line counts from its line on, also within a timepoint.
    expect(first('@ 08:00\nabg po2 80 |\nunits gas kPa\nabg pco2 5.3').map(([l]) => l)).toEqual(['mmHg', 'kPa']);
    expect(first('place pb 90 |\nunits gas kPa\n@ 08:00').map(([l]) => l)).toEqual(['mmHg', 'kPa', 'hPa']);
  });

  it('offers a set rate in Hz first where the mode in force is HFOV, whose rate is a frequency (a bare one reads in /min, PN302)', () => {
    const units = (marked: string) => complete(marked).filter((c) => c.kind === 'unit').map((c) => [c.label, c.detail]);
    const hzFirst = [['Hz', 'Set rate (the frequency of an oscillator, in HFOV)'], ['/min', 'Set rate (default unit)']];
    expect(units('@ 08:00\nvent mode HFOV, rate 6 |')).toEqual(hzFirst);
    expect(units('@ 08:00\nvent rate 6 |, mode HFOV')).toEqual(hzFirst);
    // The mode carried from an earlier timepoint.
    expect(units('@ 08:00\nvent mode HFOV, rate 6 Hz, map 20\n@ 09:00\nvent rate 7 |')).toEqual(hzFirst);
    // Glued to the number too.
    expect(complete('@ 08:00\nvent mode HFOV, rate 6H|').map((c) => c.label)).toEqual(['Hz']);
    // Other modes: breaths per minute first.
    expect(units('@ 08:00\nvent mode VC, rate 16 |').map(([l]) => l)).toEqual(['/min', 'Hz']);
    expect(units('@ 08:00\nvent mode HFOV\n@ 09:00\nvent mode PC, rate 16 |').map(([l]) => l)).toEqual(['/min', 'Hz']);
    // What the first unit gives is no finding.
    const { result, position } = noteAt('@ 08:00\nvent mode HFOV, rate 6 |');
    const [hz] = completionsAt(result, position);
    const text = applyEdits(result.analysis.tree.lines.map((l) => l.text).join('\n'), [{ range: hz!.replace!, newText: hz!.insertText }]);
    expect(checkNote(text).findings).toEqual([]);
  });

  it('a unit being typed glued to its number replaces only the unit', () => {
    const items = complete('abg po2 71k|');
    expect(items.map((c) => c.label)).toEqual(['kPa']);
    expect(items[0]?.replace).toEqual({ start: { line: 0, character: 10 }, end: { line: 0, character: 11 } });
  });

  it('offers no unit after a FiO2 written as a fraction (`0.4 %` would read as 0.4 %), only the next keys', () => {
    expect(labels('vent fio2 0.4 |')).not.toContain('%');
    expect(labels('vent fio2 0.4 |')).toContain('peep');
    expect(labels('abg fio2 1 |')).not.toContain('%');
    expect(labels('oxygen venturi, fio2 .28 |')).toEqual(['flow', 'target']);
    expect(labels('vent fio2 0.4%|')).toEqual([]);
    // A percentage still gets its unit.
    expect(labels('vent fio2 40 |')[0]).toBe('%');
    expect(labels('vent fio2 40%|')).toEqual(['%']);
  });

  it('offers the keys of the line\'s device: IPAP and EPAP for NIV, a level for CPAP, neither for others (and the SpO2 target last, beside any device)', () => {
    // NIV and CPAP are set by their pressures and FiO2: those first, the flow (a bleed-in of oxygen) last.
    expect(labels('oxygen niv |')).toEqual(['ipap', 'epap', 'fio2', 'flow', 'target']);
    expect(labels('oxygen cpap |')).toEqual(['level', 'fio2', 'flow', 'target']);
    expect(labels('oxygen cpap 8 |')).toEqual(['cmH2O', 'mbar', 'fio2', 'flow', 'target']);
    expect(labels('oxygen niv ipap 14, |')).toEqual(['epap', 'fio2', 'flow', 'target']);
    expect(labels('oxygen device niv, |')).toEqual(['ipap', 'epap', 'fio2', 'flow', 'target']);
    // Devices that set a flow keep the flow first.
    expect(labels('oxygen cannula |')).toEqual(['flow', 'fio2', 'target']);
    expect(labels('oxygen hfnc 50 |')).toEqual(['L/min', 'fio2', 'target']);
    expect(labels('oxygen mask, |')).toEqual(['flow', 'fio2', 'target']);
  });

  it('offers no pressure of NIV or CPAP beside any device that gives none (PN318 would report it), however the device is written', () => {
    for (const device of ['cannula', 'nc', 'mask', 'venturi', 'reservoir', 'nrb', 'hfnc', 'highflow', 'room air', 'ra']) {
      const offered = labels(`oxygen ${device}, |`);
      for (const key of ['ipap', 'epap', 'level', 'pressure']) expect(offered, `${device}: ${key}`).not.toContain(key);
    }
    expect(labels('oxygen bilevel |')).toEqual(['ipap', 'epap', 'fio2', 'flow', 'target']);
  });

  it('offers a section\'s own keys first, then those it shares with other lines', () => {
    expect(labels('vent |')).toEqual(['mode', 'vt', 'rate', 'peep', 'peep_total', 'autopeep', 'plateau', 'peak', 'flow', 'map', 'amplitude', 'ps', 'pinsp', 've', 'etco2', 'fio2']);
    expect(labels('abg |').slice(0, 4)).toEqual(['ph', 'pco2', 'po2', 'hco3']);
  });

  it('offers no flow or pressure on a room-air line (room air has no device to set)', () => {
    expect(labels('oxygen room air |')).toEqual(['fio2', 'target']);
    expect(labels('oxygen ra, |')).toEqual(['fio2', 'target']);
    expect(labels('oxygen air fio2 21 |')[0]).toBe('%');
    expect(labels('oxygen air fio2 21 |')).not.toContain('flow');
    expect(labels('oxygen cannula |')).toContain('flow');
  });

  it('falls back to keys when the typed word is not a unit', () => {
    expect(labels('vitals hr 80 rr|')).toEqual(['rr']);
  });

  it('finishes a unit of two words after its first word (`mm Hg`, `cm H2O`), never a key in its place', () => {
    // `po2 80 mm H|` is `mm Hg` being typed: a key there (`mm hco3`) would leave `mm`, no unit, behind.
    const items = complete('abg po2 80 mm H|');
    expect(items.map((c) => c.label)).toEqual(['mm Hg']);
    expect(items[0]?.replace).toEqual({ start: { line: 0, character: 11 }, end: { line: 0, character: 15 } });
    expect(applyEdits('abg po2 80 mm H', [{ range: items[0]!.replace!, newText: items[0]!.insertText }])).toBe('abg po2 80 mm Hg');
    expect(checkNote('abg po2 80 mm Hg').findings.filter((f) => f.code === 'PN202')).toEqual([]);
    expect(labels('abg po2 80 mm |')).toEqual(['mm Hg']);
    expect(labels('vent peep 8 cm |')).toEqual(['cm H2O']);
    expect(labels('vent peep 8 CM h|')).toEqual(['cm H2O']);
    expect(labels('abg 7.3/40/80/24 mm |')).toEqual(['mm Hg']);
    // Not the first word of a unit this key takes: the keys, as after any unit.
    expect(labels('vitals hr 80 mm |')).toContain('rr');
  });
});

describe('in the middle of a word', () => {
  it('narrows by the text before the cursor and replaces the whole word', () => {
    const items = complete('vitals    hr 80, s|p2 90');
    const spo2 = items.find((c) => c.label === 'spo2');
    expect(spo2?.replace).toEqual({ start: { line: 0, character: 17 }, end: { line: 0, character: 20 } });
    expect(items.map((c) => c.label)).toEqual(['spo2']);
    expect(complete('vi|ts hr 80')[0]).toMatchObject({ label: 'vitals', insertText: 'vitals', replace: { start: { line: 0, character: 0 }, end: { line: 0, character: 4 } } });
    expect(complete('vent mode V|X')[0]).toMatchObject({ label: 'VC', replace: { start: { line: 0, character: 10 }, end: { line: 0, character: 12 } } });
    expect(complete('abg po2 71k|p, pco2 40')[0]).toMatchObject({ label: 'kPa', replace: { start: { line: 0, character: 10 }, end: { line: 0, character: 12 } } });
    // The word ends at a comment.
    expect(complete('vitals hr 80, r|x# note')[0]?.replace?.end.character).toBe(16);
  });
});

describe('right before a word', () => {
  it('replaces the word after the cursor only with the same kind of thing', () => {
    expect(complete('vent mode |VC')[0]).toMatchObject({ label: 'VC', insertText: 'VC', replace: { start: { line: 0, character: 10 }, end: { line: 0, character: 12 } } });
    expect(complete('abg po2 71 |mmHg').find((c) => c.label === 'kPa')?.replace).toEqual({ start: { line: 0, character: 11 }, end: { line: 0, character: 15 } });
    expect(complete('vitals hr 80, |rr 18').find((c) => c.label === 'spo2')?.replace).toEqual({ start: { line: 0, character: 14 }, end: { line: 0, character: 16 } });
  });

  it('inserts anything else before the word, with a blank, so the word stays', () => {
    const { text, result, position } = noteAt('@ 08:00\nvitals hr 80 |rr 18');
    const unit = completionsAt(result, position).find((c) => c.label === '/min');
    expect(unit).toMatchObject({ insertText: '/min ', replace: { start: { line: 1, character: 13 }, end: { line: 1, character: 13 } } });
    expect(applyEdits(text, [{ range: unit!.replace!, newText: unit!.insertText }])).toBe('@ 08:00\nvitals hr 80 /min rr 18');
    const kpa = complete('abg po2 71 |pco2 40').find((c) => c.label === 'kPa');
    expect(kpa).toMatchObject({ insertText: 'kPa ', replace: { start: { line: 0, character: 11 }, end: { line: 0, character: 11 } } });
  });

  it('offers nothing else before a number or a unit: it would take the number or part the unit from it', () => {
    // A key in front of a device's flow would take the flow for its value (`oxygen cannula fio2 2 L/min`).
    expect(complete('oxygen    cannula |2 L/min')).toEqual([]);
    expect(complete('abg |7.31/56/71/26')).toEqual([]);
    // Before a unit, only units (in its place), never a key in front of it (`peep 8 rate cmH2O`).
    expect(labels('vent peep 8 |cm')).toEqual(['cmH2O', 'mbar']);
    expect(labels('oxygen cannula 2 |L/min')).toEqual(['L/min']);
    expect(labels('vitals hr 80 |/min, rr 18')).toEqual(['/min']);
    // A number without a key waits for one: the keys go in front of it.
    const { text, result, position } = noteAt('vitals    |118');
    const hr = completionsAt(result, position).find((c) => c.label === 'hr');
    expect(applyEdits(text, [{ range: hr!.replace!, newText: hr!.insertText }])).toBe('vitals    hr 118');
  });

  it('offers no line snippet in front of a section word: the line after it would become a label or a broken gas', () => {
    // `@ HH:MM  label vitals hr 80` would make the values part of the new timepoint's label, read as prose.
    const { text, result, position } = noteAt('@ 08:00\n|vitals    hr 80');
    const items = completionsAt(result, position);
    expect(items.filter((c) => c.kind === 'snippet')).toEqual([]);
    // Another section word takes its place (the same kind of thing), keeping the values.
    const abg = items.find((c) => c.label === 'abg');
    expect(applyEdits(text, [{ range: abg!.replace!, newText: abg!.insertText }])).toBe('@ 08:00\nabg    hr 80');
    expect(complete('|vent mode VC').filter((c) => c.kind === 'snippet')).toEqual([]);
    // In front of anything else at the start of a line, or on a blank line, the snippets stay.
    expect(complete('|').filter((c) => c.kind === 'snippet')).toHaveLength(5);
    expect(complete('|hello there').filter((c) => c.kind === 'snippet')).toHaveLength(5);
  });

  it('offers nothing in front of a timepoint, or in front of its time or in place of part of it', () => {
    for (const marked of ['|@ day 1 08:00  arrival', '|@', '@ |day 1 08:00', '@ d|ay 1 08:00', '@ day 1 |08:00', '@ |08:00  arrival', '@ |+2h']) {
      expect(complete(marked), marked).toEqual([]);
    }
    // With nothing after the cursor but a comment, times are offered as before.
    expect(labels('@ | # later')).toEqual(['day N HH:MM', 'HH:MM', '+interval']);
    expect(labels('@ d|')).toEqual(['day N HH:MM']);
  });
});

describe('while a value of several parts is typed', () => {
  it('offers nothing after the slash of a pair or a spaced shorthand gas: a number comes next', () => {
    expect(complete('abg 7.3 / 56 / |')).toEqual([]);
    expect(complete('vitals bp 120 / |')).toEqual([]);
    expect(labels('abg 7.3 / 56 / 71 / 26 |').slice(0, 3)).toEqual(['mmHg', 'kPa', 'be']);
  });

  it('completes a device of two words from its first word on', () => {
    for (const marked of ['oxygen room |', 'oxygen room a|', 'oxygen ROOM  A|']) {
      const items = complete(marked);
      expect(items.map((c) => c.label), marked).toEqual(['room air']);
      expect(items[0]?.replace, marked).toEqual({ start: { line: 0, character: 7 }, end: { line: 0, character: marked.length - 1 } });
    }
    expect(labels('oxygen room air |')).toContain('fio2');
  });

  it('completes a device named in several words (`nasal c|`, `simple face |`), each with the device it is', () => {
    expect(labels('oxygen nasal c|')).toEqual(['nasal cannula']);
    expect(complete('oxygen nasal c|')[0]?.detail).toBe('Oxygen device: cannula');
    expect(labels('oxygen simple f|')).toEqual(['simple face mask']);
    expect(labels('oxygen non-rebreather m|')).toEqual(['non-rebreather mask']);
    const applied = applyEdits('oxygen simple fa 6 L/min', [{ range: complete('oxygen simple fa|')[0]!.replace!, newText: 'simple face mask' }]);
    expect(applied).toBe('oxygen simple face mask 6 L/min');
    expect(checkNote(applied).findings.map((f) => f.code)).toEqual([]);
    // Words that already name a device (`nasal` is a cannula), then a blank: its flow and keys are offered as after any device.
    expect(labels('oxygen nasal |')).toContain('flow');
  });

  it('offers the names joined by hyphens once a hyphen is typed (`nasal-c|`), and only the spaced names otherwise', () => {
    expect(labels('oxygen nasal-c|')).toEqual(['nasal-cannula']);
    expect(complete('oxygen nasal-c|')[0]?.detail).toBe('Oxygen device: cannula');
    expect(labels('oxygen device face-|')).toEqual(['face-mask']);
    expect(labels('oxygen non-rebreather-|')).toEqual(['non-rebreather-mask']);
    const applied = applyEdits('oxygen nasal-ca 2 L/min', [{ range: complete('oxygen nasal-ca|')[0]!.replace!, newText: 'nasal-cannula' }]);
    expect(checkNote(applied).findings.map((f) => f.code)).toEqual([]);
    // The spaced lead offers the row's names, not every mix of blanks and hyphens.
    expect(labels('oxygen simple f|')).toEqual(['simple face mask']);
    expect(labels('oxygen nasal h|')).toEqual(['nasal high flow']);
    expect(labels('oxygen |')).toEqual(['room air', 'cannula', 'mask', 'venturi', 'reservoir', 'hfnc', 'niv', 'cpap']);
  });

  it('completes a device of two words after its key too (`device room a|`, also after other items)', () => {
    for (const marked of ['oxygen device room |', 'oxygen device room a|', 'oxygen fio2 0.21, device ROOM  A|']) {
      const items = complete(marked);
      expect(items.map((c) => c.label), marked).toEqual(['room air']);
      const start = marked.toLowerCase().indexOf('room');
      expect(items[0]?.replace, marked).toEqual({ start: { line: 0, character: start }, end: { line: 0, character: marked.length - 1 } });
      const applied = applyEdits(marked.slice(0, -1), [{ range: items[0]!.replace!, newText: items[0]!.insertText }]);
      expect(checkNote(applied).findings.map((f) => f.code), applied).toEqual([]);
    }
    // The key's own word is not a device: after it, the devices of one word are offered as before.
    expect(labels('oxygen device |')).toContain('room air');
  });
});

describe('where there is nothing to offer', () => {
  it('in comments, prose, broken lines, numbers being typed, and past the end', () => {
    expect(complete('vitals hr 80 # |')).toEqual([]);
    expect(complete('note some |')).toEqual([]);
    expect(complete('vitls |')).toEqual([]);
    expect(complete('vitals hr 8|')).toEqual([]);
    const result = checkNote('vitals hr 80');
    expect(completionsAt(result, { line: 0, character: 99 })).toEqual([]);
    expect(completionsAt(result, { line: 7, character: 0 })).toEqual([]);
    expect(completionsAt(result, { line: -1, character: 0 })).toEqual([]);
  });
});

describe('columns and line endings', () => {
  it('counts UTF-16 columns after emoji and non-ASCII text', () => {
    const items = complete('vitals hr 80 😀, r|');
    expect(items[0]?.replace).toEqual({ start: { line: 0, character: 17 }, end: { line: 0, character: 18 } });
    expect(complete('vitals temp 37 °C, s|')[0]?.replace?.start.character).toBe(19);
  });

  it('works on CRLF notes', () => {
    expect(labels('vitals hr 80\r\nabg po2 71 |\r\n').slice(0, 2)).toEqual(['mmHg', 'kPa']);
  });
});
