// Hovers on section words, keys, values, units and timepoint lines, and the derived-value
// explanation shared with inlay hints.
import { describe, expect, it } from 'vitest';
import { allDerivations } from '../../server/src/core/analysis/analyse';
import { checkNote } from '../../server/src/core/check-note';
import { NoteSession } from '../../server/src/core/session';
import { CAUTION, derivedHover, hoverAt } from '../../server/src/core/service';
import { derivedBody } from '../../server/src/core/service/derived-hover';
import { note, noteAt } from './cursor';
import { SECTIONS } from '../../server/src/core/fields/sections';
import { FIELDS } from '../../server/src/core/fields/registry';
import { SOURCES } from '../../server/src/core/physiology';
import { derivedDef } from '../../server/src/core/derive/registry';

function hover(marked: string) {
  const { result, position } = noteAt(marked);
  return hoverAt(result, position);
}

function markdown(marked: string): string {
  const h = hover(marked);
  expect(h, marked).not.toBeNull();
  return h!.markdown;
}

const endsWithCaution = (md: string) => expect(md.trimEnd().endsWith(`_${CAUTION}_`)).toBe(true);

describe('hover on a section word', () => {
  it('says what the section holds, whether it carries, and its keys', () => {
    const h = hover('ab|g       po2 71');
    expect(h?.range).toEqual({ start: { line: 0, character: 0 }, end: { line: 0, character: 3 } });
    expect(h?.markdown).toContain('Arterial blood gas');
    expect(h?.markdown).toContain('do not carry forward');
    expect(h?.markdown).toContain('`po2` PaO2');
    expect(markdown('o2| cannula 2')).toContain('carry forward to later timepoints until restated');
  });

  it('writes the code in a description as code, not as escaped backticks', () => {
    const md = markdown('uni|ts gas kPa');
    expect(md).toContain('Default unit for gas pressures written without one (`gas mmHg` or `gas kPa`).');
    expect(md).not.toContain('\\`');
    // Every description opens as many code spans as it closes.
    for (const d of [...SECTIONS, ...FIELDS].map((x) => x.description)) expect(d.split('`').length % 2, d).toBe(1);
  });
});

describe('hover on a key, value or unit', () => {
  it('names the field, the value in both unit systems, the implied unit, where it came from and LOINC', () => {
    const md = markdown(note('@ day 1 08:00  arrival', 'abg       p|o2 71'));
    expect(md).toContain('**PaO2**');
    expect(md).toContain('Arterial partial pressure of oxygen.');
    expect(md).toContain('**71 mmHg** = 9.5 kPa');
    expect(md).toContain('No unit written: read in mmHg — the default gas unit');
    expect(md).toContain('Stated on line 2, at timepoint ‘arrival’ (day 1, 08:00)');
    expect(md).toContain('LOINC 2703-7');
    expect(md).toContain('Carries forward: no');
    endsWithCaution(md);
  });

  it('gives the LOINC code of the value as written (its line, its key) and where the code was checked', () => {
    // Sodium from a blood gas is whole blood, from the laboratory serum or plasma; tco2 is total CO2.
    expect(markdown('abg n|a 137')).toContain('LOINC 2947-0 — Sodium \\[Moles/volume\\] in Blood (checked on: LOINC group LG11363-5 (sodium, substance concentration), LOINC 2.73)');
    // The page's title only: its address is in grammar/README.md, a hover stays short.
    expect(markdown('abg n|a 137')).not.toContain('https://');
    expect(markdown('labs n|a 140')).toContain('LOINC 2951-2 — Sodium \\[Moles/volume\\] in Serum or Plasma (checked on: ');
    expect(markdown('labs tc|o2 25')).toContain('LOINC 2028-9 — Carbon dioxide, total');
    expect(markdown('vent mode VC, fio|2 0.5')).toContain('LOINC 19994-3 — Oxygen/Total gas setting');
    expect(markdown('vbg p|h 7.31')).toContain('LOINC 2746-6 — pH of Venous blood (checked on: DICOM PS3.16 CID 3528 Blood pH');
    expect(markdown('vbg hc|o3 24')).toContain('LOINC 14627-4 — Bicarbonate \\[Moles/volume\\] in Venous blood (checked on: Elexis LOINC table');
    expect(markdown('vent pla|teau 22')).toContain('LOINC 76259-1 — Pressure.plateau Respiratory system airway --on ventilator (checked on: MII ICU module');
    expect(markdown('vent ra|te 14')).not.toContain('LOINC'); // no code found for the set rate
  });

  it('gives the same hover on the value and on the unit, with the unit as written', () => {
    const onValue = hover('abg po2 9|.5 kPa');
    const onUnit = hover('abg po2 9.5 kP|a');
    expect(onValue?.range).toEqual({ start: { line: 0, character: 8 }, end: { line: 0, character: 11 } });
    expect(onUnit?.range).toEqual({ start: { line: 0, character: 12 }, end: { line: 0, character: 15 } });
    // Written in kPa, so shown in kPa first (see kpa-notes.test.ts).
    expect(onUnit?.markdown).toContain('**9.5 kPa** = 71 mmHg');
    expect(onUnit?.markdown).toContain('Written in kPa.');
  });

  it("names the note's `units gas` line for a bare gas pressure", () => {
    const md = markdown(note('units gas kPa', '@ 08:00', 'abg 7.28/7.5/9|.5/26'));
    expect(md).toContain('the third number of the shorthand gas');
    expect(md).toContain('read in kPa — the note\'s gas unit (`units gas`, line 1)');
    // In a kPa note the value leads in kPa, as written (9.5 kPa = 71.3 mmHg; 1 kPa = 7.50062 mmHg).
    expect(md).toContain('**9.5 kPa** = 71 mmHg');
  });

  it('names both pressures on the unit written after a shorthand gas, which applies to both', () => {
    // 6.4 kPa = 48 mmHg, 9.3 kPa = 69.8 mmHg (1 kPa = 7.50062 mmHg).
    const h = hover('@ 08:00\nabg 7.30/6.4/9.3/23 k|Pa');
    expect(h?.range).toEqual({ start: { line: 1, character: 20 }, end: { line: 1, character: 23 } });
    expect(h?.markdown).toContain('**`kPa`** — the unit of the shorthand gas on this `abg` line, for both its pressures');
    expect(h?.markdown).toContain('- PaCO2: **6.4 kPa** = 48 mmHg');
    expect(h?.markdown).toContain('- PaO2: **9.3 kPa** = 70 mmHg');
    expect(h?.markdown).not.toContain('the second number');
    endsWithCaution(h!.markdown);
    // On the numbers, each its own field as before.
    expect(markdown('@ 08:00\nabg 7.30/6.|4/9.3/23 kPa')).toContain('**PaCO2** — the second number of the shorthand gas');
    expect(markdown('@ 08:00\nabg 7.30/6.4/9.|3/23 kPa')).toContain('**PaO2** — the third number of the shorthand gas');
    // A venous gas names its own pressures.
    expect(markdown('@ 08:00\nvbg 7.30/50/40 mm|Hg')).toContain('- PvO2: **40 mmHg**');
  });

  it('shows a stated value with at least the decimals it was written with', () => {
    // The finding quotes 7.5; the hover no longer rounds it to 8 (7.5 mmHg = 1.0 kPa).
    const pco2 = markdown('abg pco2 7.|5');
    expect(pco2).toContain('**7.5 mmHg** = 1.0 kPa');
    expect(pco2).not.toContain('**8 mmHg**');
    expect(markdown('vent fio2 0.35|5')).toContain('**0.355** (a fraction) = 35.5 %');
    // 35.5 % is 0.355: the decimals move with the power of ten between the units.
    expect(markdown('vent fio2 35.|5 %')).toContain('**0.355** (a fraction) = 35.5 %');
    // Never fewer than the unit's usual decimals, and no more than written where those are fewer.
    expect(markdown('abg po2 7|1')).toContain('**71 mmHg** = 9.5 kPa');
    expect(markdown('vent fio2 0.|4')).toContain('**0.40** (a fraction) = 40 %');
    expect(markdown(note('units gas kPa', '@ 08:00', 'abg pco2 7.2|5'))).toContain('**7.25 kPa** = 54 mmHg');
  });

  it('shows FiO2 as a fraction and a percentage, temperature in °C and °F, Hb in g/dL and g/L', () => {
    const fio2 = markdown('vent fio2 0.4|');
    expect(fio2).toContain('**0.40** (a fraction) = 40 %');
    expect(fio2).toContain('a bare number up to 1 is a fraction, above 1 a percentage');
    expect(markdown('vent fio2 4|0 %')).toContain('Written in %.');
    expect(markdown('vitals temp 38|.4')).toContain('**38.4 C** = 101.1 F');
    expect(markdown('labs hb 11|.8')).toContain('**11.8 g/dL** = 118 g/L');
  });

  it('says whether a value carries forward', () => {
    expect(markdown('vent pe|ep 8')).toContain('Carries forward: yes');
    expect(markdown('vent plat|eau 27')).toContain('Carries forward: no — a value measured on the device belongs to its timepoint; the settings on this line carry forward.');
    expect(markdown('place alti|tude 1650 m')).toContain('until a later `place` line replaces the place');
  });

  it('describes the set inspiratory pressure as a setting above PEEP that carries forward', () => {
    const md = markdown('vent mode PC, pin|sp 18, peep 8');
    expect(md).toContain('**Set inspiratory pressure**');
    expect(md).toContain('above PEEP');
    expect(md).toContain('**18 cmH2O**');
    expect(md).toContain('Carries forward: yes');
    expect(md).not.toContain('LOINC'); // no code found on a LOINC or HL7 page
  });

  it('says a header value comes from the header, and what a value feeds', () => {
    expect(markdown(note('patient ag|e 64 y', '@ 08:00'))).toContain('From the header, line 1.');
    const md = markdown(note('@ 08:00', 'oxygen room air', 'abg po|2 71, pco2 40'));
    expect(md).toContain('Used here for:');
    expect(md).toContain('P/F 338 mmHg');
  });

  it('says when a value is kept out of calculations, or replaced by a later one', () => {
    expect(markdown('abg po2 9.|1')).toContain('Not used in calculations: implausible in mmHg, ordinary in kPa');
    expect(markdown(note('@ 08:00', 'abg po2 7|1', 'abg po2 64'))).toContain('A later value at this timepoint replaces it (line 3)');
  });

  it('names no later value for a setting in force, also after lines are added above it while the note is open', () => {
    // The session keeps a setting held as before (same line, same item) where it reads the same:
    // the value in force is then another object for the same stated value.
    const lines = ['@ day 1 08:00  one', 'vent      mode VC, peep 8', '@ +2h  two', 'vent      peep 10, plateau 28'];
    const session = new NoteSession();
    session.update(lines.join('\n'));
    for (const text of [note('note      moved down', ...lines), note('', '', ...lines)]) {
      const moved = session.update(text);
      const fresh = checkNote(text);
      const at = text.split('\n').indexOf(lines[1]!);
      for (const character of [11, 20]) {
        const md = hoverAt(moved, { line: at, character })?.markdown;
        expect(md).toContain(`Stated on line ${at + 1}, at timepoint ‘one’`);
        expect(md).not.toContain('replaces it');
        expect(md).toBe(hoverAt(fresh, { line: at, character })?.markdown);
      }
    }
  });

  it('says why a value is not used: a word it does not know, a unit of something else, a unit it does not know', () => {
    const word = markdown('oxygen device can|ula');
    expect(word).toContain('Not used in calculations: the word is not known.');
    expect(word).not.toContain('unit');
    const otherUnit = markdown('vitals temp 3|7 mmHg');
    expect(otherUnit).toContain('Unit `mmHg` does not measure Temperature, which takes C or F.');
    expect(otherUnit).toContain('Not used in calculations: the unit is not one Temperature takes.');
    expect(markdown('abg po2 7|1 mmhgg')).toContain('Unit `mmhgg` is not a unit Pneumark knows; PaO2 takes mmHg or kPa.');
  });

  it('names the device once: it is written first on the oxygen line', () => {
    expect(markdown('oxygen can|nula 2')).toContain('**Oxygen device** — the device, written first on this `oxygen` line');
  });

  it('explains a key that is not a key of its section', () => {
    const md = markdown('vitals rr|r 18');
    expect(md).toContain('`rrr` is not a key of `vitals` lines');
    expect(md).toContain('`rr`');
  });

  it('quotes a key holding an invisible character with it shown escaped, as messages do', () => {
    // `h<ZWJ>r` looks like `hr` but is not the key: the hover must not quote it as `hr`.
    const md = markdown('vitals h\u200d|r 80');
    expect(md).toContain('`h\\u{200D}r` is not a key of `vitals` lines');
  });
});

describe('hover on a timepoint line', () => {
  const text = note(
    'patient   age 58 y, sex female, height 165 cm',
    '@ day 1 22:15  admitted',
    'vent      mode VC, vt 420 mL, rate 20, peep 8, fio2 0.8',
    'abg       ph 7.29, pco2 49, po2 74, hco3 23',
    '',
    '@ +3h45  |PEEP raised',
    'vent      peep 12, plateau 27',
    'abg       7.31/47/88/23.2',
  );

  it('gives the time, the values carried in and where from, derived values and readings', () => {
    const h = hover(text)!;
    expect(h.range).toEqual({ start: { line: 5, character: 0 }, end: { line: 5, character: 20 } });
    const md = h.markdown;
    expect(md).toContain('Time: day 2, 02:00 (225 min after the previous timepoint; 1560 min after day 1 00:00)');
    expect(markdown(note('@ day 0 0|9:00'))).toContain('Time: day 0, 09:00 (900 min before day 1 00:00).');
    expect(md).toContain('**Carried into this timepoint**');
    expect(md).toContain('Age 58 y (header, line 1)');
    // Carried across midnight: the day and time it was written are named.
    expect(md).toContain('FiO2 0.80 (carried from admitted, day 1 22:15, line 3)');
    expect(md).toContain('**Derived here**');
    expect(md).toContain('P/F ratio (P/F): **110 mmHg** = 14.7 kPa — _uses a carried value_');
    expect(md).toContain('Driving pressure (ΔP): **15 cmH2O**');
    expect(md).toMatch(/- [^\n]*consistent with/i);
    endsWithCaution(md);
  });

  it('names a time it could not read as written, never as `?` or as a day with no time', () => {
    const bad = markdown('@ 25:|10  handover');
    expect(bad).toContain('**`@ 25:10`** — handover');
    expect(bad).toContain('Time: unknown — `25:10` is not a time Pneumark reads.');
    expect(bad).not.toContain('?');
    const part = markdown('@ day 1 25:10  hand|over');
    expect(part).toContain('Time: day 1, no time of day.');
    expect(part).toContain('`25:10` after it is not a time Pneumark reads.');
    expect(markdown('@ day 2 08|00')).toContain('`0800` after it is not a time Pneumark reads.');
    expect(markdown('@|')).toContain('Time: unknown — no time is written after `@`.');
    // A comma or full stop after a time that was read is not part of it.
    expect(markdown('@ 08:00, arr|ival')).not.toContain('not a time');
    expect(markdown('@ 08:00.|')).not.toContain('not a time');
  });

  it('counts UTF-16 columns after emoji and non-ASCII prose', () => {
    const h = hover('@ 07:40  café 😀 revi|ew   # note');
    expect(h?.range.end.character).toBe('@ 07:40  café 😀 review'.length);
    expect(hover('vitals hr 80 😀, r|r 20')?.range).toEqual({ start: { line: 0, character: 17 }, end: { line: 0, character: 19 } });
    expect(hover('vitals hr 80 😀, r|r 20')?.markdown).toContain('Respiratory rate');
  });

  it('works on CRLF notes', () => {
    const h = hover('@ 08:00\r\nvitals hr 80\r\nabg p|o2 71\r\n');
    expect(h?.range).toEqual({ start: { line: 2, character: 4 }, end: { line: 2, character: 7 } });
  });
});

describe('hover where there is nothing to say', () => {
  it('returns null in comments, blanks, broken lines, prose, and past the end', () => {
    expect(hover('vitals hr 80  # a com|ment')).toBeNull();
    expect(hover('|')).toBeNull();
    expect(hover('vit|ls hr 100')).toBeNull();
    expect(hover('note free pr|ose')).toBeNull();
    const result = checkNote('vitals hr 80\nabg po2 71');
    expect(hoverAt(result, { line: 0, character: 200 })).toBeNull();
    expect(hoverAt(result, { line: 9, character: 0 })).toBeNull();
    expect(hoverAt(result, { line: -1, character: 0 })).toBeNull();
    expect(hoverAt(result, { line: 0, character: -3 })).toBeNull();
    expect(hoverAt(result, { line: 0.5, character: 1 })).toBeNull();
  });
});

describe('derivedHover', () => {
  const result = checkNote(note('patient age 40 y', '@ 08:00', 'oxygen cannula 2', 'vent peep 5', '@ 09:00', 'oxygen room air', 'abg ph 7.31, pco2 41, po2 71, hco3 20'));
  const derived = allDerivations(result.analysis).flatMap((d) => d.derived);
  const byId = (id: string) => derived.find((d) => d.id === id)!;

  it('explains a value: label, value, formula in words and with numbers, inputs and origins, source, caution', () => {
    const md = derivedHover(byId('pf_ratio'));
    expect(md).toContain('**P/F ratio** (P/F): **338 mmHg**');
    expect(md).toContain('Formula: `PaO2 ÷ FiO2`');
    expect(md).toContain('With the numbers: `71 ÷ 0.21 = 338 mmHg`');
    expect(md).toContain('- PaO2 71 mmHg — line 7');
    expect(md).toContain('- FiO2 0.21 (room air) — line 6');
    expect(md).toContain('Source: ');
    endsWithCaution(md);
  });

  it('marks an estimate, shows ranges, and names derived inputs', () => {
    const est = derivedHover(checkNote('@ 08:00\noxygen cannula 3').analysis.derivation(0).derived.find((d) => d.id === 'fio2_estimated')!);
    expect(est).toContain('_estimate_');
    const aa = derivedHover(byId('aa_gradient'));
    expect(aa).toContain('- PAO2 98 mmHg — computed here: Alveolar PO2');
    expect(derivedHover(byId('paco2_expected'))).toContain('(PaCO2 expected): **36–40 mmHg**');
  });

  it('never prints NaN, Infinity or undefined', () => {
    for (const d of derived) expect(derivedHover(d)).not.toMatch(/NaN|Infinity|undefined/);
  });
});

describe('hover on a value written in a unit other than the canonical one', () => {
  it('shows the number as written beside the canonical value, for units without a pair of their own', () => {
    // 5.9 ft = 179.8 cm and 154 lb = 69.9 kg (1 ft = 30.48 cm, 1 lb = 0.45359237 kg: the units' definitions).
    expect(markdown('patient height 5.|9 ft, weight 154 lb')).toContain('Value: **180 cm** = 5.9 ft');
    expect(markdown('patient height 5.9 ft, weight 15|4 lb')).toContain('Value: **69.9 kg** = 154 lb');
    // A value written in the canonical unit keeps the other unit system (there is none for cm).
    expect(markdown('patient height 18|0 cm')).toMatch(/Value: \*\*180 cm\*\*\n/);
    expect(markdown('vitals temp 101.|1 F')).toContain('Value: **38.4 C** = 101.1 F');
  });
});

describe('inputs written in another unit than the formula takes', () => {
  // 5,000 ft × 0.3048 = 1,524 m (NIST SP 811, 2008, exact factor); 40 % is the fraction 0.40.
  const result = checkNote('place altitude 5000 ft\n@ 08:00\noxygen venturi fio2 40 %\nabg 7.40/40/70/24');
  const tp = result.analysis.timeline.timepoints[0]!;
  const body = (id: string) => derivedBody(result.analysis.derivation(0).derived.find((d) => d.id === id)!, { timepoint: tp });

  it('names the number and unit the note wrote beside the one used', () => {
    expect(body('barometric')).toContain('altitude 1524 m (written 5000 ft)');
  });

  it('leaves a percentage used as a fraction as it is (FiO2 40 % is 0.40 at a glance)', () => {
    expect(body('pf_ratio')).toMatch(/FiO2 0\.40? — /);
  });

  it('says nothing more for an input written in the unit the formula takes', () => {
    expect(body('pf_ratio')).not.toMatch(/PaO2 70 mmHg \(written/);
  });
});

describe('hover on an oxygen device', () => {
  const carry = 'Carries forward: yes, until the next `oxygen` line';
  const settings = (marked: string) => markdown(marked).split('\n\n').find((p) => p.includes('Settings it takes') || p.includes('It takes no settings'));
  const fio2 = (marked: string) => markdown(marked).split('\n\n').find((p) => p.startsWith('FiO2: '));

  it('says what each device takes and how Pneumark gets its FiO2, then how it carries, with the caution line', () => {
    expect(settings('oxygen hf|nc 40, fio2 0.5')).toBe('Settings it takes: Oxygen flow (`flow`), FiO2 (`fio2`).');
    expect(fio2('oxygen hf|nc 40, fio2 0.5')).toBe('FiO2: its setting, written as `fio2`; none is estimated from the flow.');
    expect(settings('oxygen can|nula 2')).toBe('Settings it takes: Oxygen flow (`flow`).');
    expect(settings('oxygen ven|turi 28')).toBe('Settings it takes: Oxygen flow (`flow`), FiO2 (`fio2`).');
    expect(fio2('oxygen ven|turi 28')).toBe('FiO2: its setting, written as `fio2`; a bare 24 to 60 right after `venturi` is read as its setting in % (PN321).');
    expect(settings('oxygen n|rb 15')).toBe('`nrb` is read as **reservoir**. Settings it takes: Oxygen flow (`flow`).');
    expect(fio2('oxygen n|rb 15')).toBe('FiO2: not set by the device: a `fio2` written beside it is a value stated, used as written; none is estimated from the flow.');
    expect(settings('oxygen n|iv ipap 12, epap 6')).toBe('Settings it takes: Oxygen flow (`flow`), FiO2 (`fio2`), IPAP (`ipap`), EPAP (`epap`).');
    expect(settings('oxygen cp|ap level 8')).toBe('Settings it takes: Oxygen flow (`flow`), FiO2 (`fio2`), CPAP (`level`).');
    expect(settings('oxygen room a|ir')).toBe('It takes no settings: no oxygen is added.');
    expect(fio2('oxygen room a|ir')).toBe("FiO2: 0.21, the air's, where the line writes no oxygen flow and no FiO2 above it.");
    for (const marked of ['oxygen hf|nc 40', 'oxygen can|nula 2', 'oxygen ven|turi 28', 'oxygen n|rb 15', 'oxygen n|iv ipap 12, epap 6', 'oxygen cp|ap level 8', 'oxygen room a|ir']) {
      const md = markdown(marked);
      expect(md, marked).toContain(carry);
      endsWithCaution(md);
    }
  });

  it('gives the low-flow estimate of a cannula and a simple mask with the rule and the source its value states', () => {
    expect(fio2('oxygen can|nula 2')).toBe(`FiO2: not set by the device: a \`fio2\` written beside it is a value stated, used as written; with none, estimated from the flow as FiO2 est = 0.21 + 0.04 × flow, an estimate not used for P/F or the A–a gradient. Source: ${SOURCES['nasal-cannula-fio2']}`);
    expect(fio2('oxygen ma|sk 6')).toContain(`estimated from the flow as FiO2 est = 0.35 + 0.04 × (flow − 5), an estimate not used for P/F or the A–a gradient. Source: ${SOURCES['simple-mask-fio2']}`);
    // The same rule and source as the derived value of that line.
    const { result } = noteAt('@ 08:00\noxygen cannula 2|');
    const estimate = result.analysis.derivation(0)?.derived.find((d) => d.id === 'fio2_estimated');
    expect(estimate?.formula).toBe('0.21 + 0.04 × flow');
    expect(fio2('oxygen can|nula 2')).toContain(`FiO2 est = ${estimate?.formula}`);
    expect(derivedDef('fio2_estimated')?.source).toContain(SOURCES['nasal-cannula-fio2']);
  });

  it('names a device written in words or with hyphens by its canonical name', () => {
    expect(settings('oxygen nasal hi|gh flow 30')).toBe('`nasal high flow` is read as **hfnc**. Settings it takes: Oxygen flow (`flow`), FiO2 (`fio2`).');
    expect(settings('oxygen non-rebr|eather-mask 15')).toBe('`non-rebreather-mask` is read as **reservoir**. Settings it takes: Oxygen flow (`flow`).');
  });

  it('says a misspelt device is none it knows, the device meant and those it knows', () => {
    const keyed = markdown('oxygen device can|ula');
    expect(keyed).toContain('`canula` is not a device Pneumark knows: it takes no settings and gives no FiO2.');
    expect(keyed).toContain('Did you mean `cannula`? Devices Pneumark knows: `room air`, `cannula`, `mask`, `venturi`, `reservoir`, `hfnc`, `niv`, `cpap`.');
    expect(keyed).not.toContain('Settings it takes');
    endsWithCaution(keyed);
    // Written first without a key, the word is read as a key, as PN201 says: neither a device nor a key.
    const first = markdown('oxygen can|ula 2');
    expect(first).toContain('`canula` is neither a device nor a key of `oxygen` lines.');
    expect(first).toContain('Did you mean `cannula`?');
    // A word that is not first on the line is no device.
    expect(markdown('oxygen flow 2, fi|o 0.4')).toContain('`fio` is not a key of `oxygen` lines.');
  });
});
