// An age may be written in weeks or days, as neonatal and paediatric notes give it (`age 6 weeks`,
// `age 3 days`, `age 10 d`). Definitions, no source needed: UCUM's year `a` is the Julian year of
// 365.25 days, its week `wk` 7 days, its day `d` (UCUM, The Unified Code for Units of Measure,
// Schadow and McDonald, the table of units: `a`, `wk`, `d`, `mo` = a/12, read in its text).
// The value in force is the age in years (fractional), wherever it is used: a child's window for a
// bare height or weight, the usual minimum of a body size (PN302), the adult rules (ARDS Network
// predicted body weight, the A–a normal by age).
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import type { StatedValue } from '../../server/src/core';
import { formatStated } from '../../server/src/core/present';
import { completionsAt, hoverAt } from '../../server/src/core/service';
import { noteAt } from '../service/cursor';
import { unitsForSpelling } from '../../server/src/core/fields/units';
import { exportColumns, timepointRows, toCsv, toFhirBundle } from '../../server/src/core/export';

const codes = (text: string) => checkNote(text).findings.map((f) => `${f.code} ${f.range.start.line + 1}`);

function headerAge(text: string): StatedValue {
  const age = checkNote(text).analysis.timeline.header.find((s) => s.fieldId === 'age');
  if (!age) throw new Error('no age stated');
  return age;
}

const DAYS_PER_YEAR = 365.25;
const PLAIN = { redactProse: false, shiftDays: 0 } as const;

describe('an age in weeks or days is read in years (a year is 365.25 days, a week 7 days: UCUM)', () => {
  it('every spelling a clinician writes reads as the unit', () => {
    for (const w of ['wk', 'wks', 'week', 'weeks']) {
      const age = headerAge(`patient age 6 ${w}`);
      expect([age.readUnit, age.usable, age.value], w).toEqual(['wk', true, (6 * 7) / DAYS_PER_YEAR]);
    }
    for (const d of ['d', 'day', 'days']) {
      const age = headerAge(`patient age 3 ${d}`);
      expect([age.readUnit, age.usable, age.value], d).toEqual(['d', true, 3 / DAYS_PER_YEAR]);
    }
    expect(codes('patient age 6 weeks\npatient age 10 d\npatient age 3 days')).toEqual(['PN206 2', 'PN206 3']);
  });

  it('the spellings name an age and nothing else: no other unit of the format is spelt so', () => {
    for (const s of ['wk', 'wks', 'week', 'weeks', 'd', 'day', 'days']) expect(unitsForSpelling(s).map((u) => u.id), s).toEqual([s.startsWith('w') ? 'wk' : 'd']);
  });

  it('weeks and days are written, never guessed: a doubtful age is offered months alone, as before', () => {
    // 900 wk (17 y) and 900 d (2.5 y) are ordinary ages too, but nearly any large number is one in weeks or days.
    const bare = checkNote('patient age 900').findings;
    expect(bare.map((f) => [f.code, f.fixes.map((x) => x.title)])).toEqual([['PN204', ['Mark as mo', 'Convert to 75 y']]]);
    expect(checkNote('patient age 125 y').findings.map((f) => [f.code, f.fixes.map((x) => x.title)])).toEqual([['PN302', ['Write mo instead of y']]]);
    // `1,650` is 1.65 years: as a thousands separator it would be an age only in weeks or days.
    expect(checkNote('patient age 1,650').findings.map((f) => f.message)).toEqual(['`1,650` uses a decimal comma; Pneumark reads it as 1.650, but a comma also separates items, so write a decimal point.']);
    // A unit the age never takes is offered the units a number may be guessed in.
    expect(checkNote('patient age 3 kg').findings.flatMap((f) => f.fixes.map((x) => x.title))).toEqual(['Change to y', 'Change to mo']);
  });

  it('`day` and `d` keep their meaning in a timepoint\'s time', () => {
    const timeline = checkNote('patient age 3 days\n@ day 2 08:00\nvitals hr 150\n@ +1d\nvitals hr 148').analysis.timeline;
    expect(timeline.timepoints.map((t) => [t.time.day, t.time.minutes])).toEqual([[2, 1920], [3, 3360]]);
  });

  it('an age in weeks or days is a child\'s: a bare newborn length and weight are read in cm and kg', () => {
    expect(codes('patient age 3 wk, height 50, weight 3.4')).toEqual([]);
    expect(codes('patient age 10 d, height 49, weight 3.1')).toEqual([]);
    // Written with units, no adult usual minimum (PN302) either.
    expect(codes('patient age 6 weeks, height 55 cm, weight 4.5 kg')).toEqual([]);
  });

  it('a timepoint reads its bare height with an age in days stated there or carried to it', () => {
    expect(codes('patient age 2 d\n@ day 1 08:00\npatient height 48, weight 3\nvitals hr 140')).toEqual([]);
    expect(codes('@ day 1 08:00\npatient height 48, weight 3, age 2 d\nvitals hr 140')).toEqual([]);
  });

  it('an age of 900 days is 2.5 years, a child still; 1,000 weeks is 19 years, an adult', () => {
    expect(headerAge('patient age 900 d').value).toBeCloseTo(2.464, 3);
    expect(codes('patient age 900 d, height 86')).toEqual([]);
    expect(codes('patient age 1000 wk, height 70')).toEqual(['PN204 1']);
  });

  it('the adult rules are not applied to an age in weeks: no predicted body weight from a tidal volume per kg', () => {
    const text = 'patient age 30 wk, sex male, height 68 cm, weight 8 kg\n@ day 1 08:00\nvent mode VC, vt 6 mL/kg, rate 30, peep 5, fio2 0.4';
    const tp = checkNote(text).analysis.timeline.timepoints[0]!;
    expect(tp.values.numberOf('vt')).toBeNull();
    const pn325 = checkNote(text).findings.filter((f) => f.code === 'PN325');
    expect(pn325.map((f) => f.range.start.line + 1)).toEqual([3]);
    expect(pn325[0]!.message).toContain('is not worked out at age 0.57 y');
  });

  it('shown in years to two significant digits under a year: 3 days is 0.0082 y, 6 weeks 0.11 y, not 0 y', () => {
    expect(formatStated(headerAge('patient age 3 days'))).toBe('0.0082 y');
    expect(formatStated(headerAge('patient age 6 wk'))).toBe('0.11 y');
    expect(formatStated(headerAge('patient age 8 mo'))).toBe('0.67 y');
    expect(formatStated(headerAge('patient age 1 d'))).toBe('0.0027 y');
  });
});

describe('exports of an age in weeks or days', () => {
  const text = 'patient age 3 days, weight 3.2 kg\n@ day 1 08:00\nvitals hr 150';

  it('the CSV age column stays in years, at the exports\' 12 significant digits: 3 days is not 0', () => {
    const [head, row] = parse(toCsv(exportColumns(), timepointRows('n.pneu', checkNote(text), PLAIN)), { bom: true }) as string[][];
    const age = row![head!.indexOf('age_y')];
    expect(age).toBe('0.008213552361');
    expect(Number(age)).toBeGreaterThan(0);
  });

  it('FHIR gives the age in the unit written, with its UCUM code (wk, d, mo, a)', () => {
    const ageOf = (note: string) => {
      const bundle = toFhirBundle('n.pneu', checkNote(note), PLAIN);
      const obs = bundle.entry?.map((e) => e.resource).find((r) => r.resourceType === 'Observation' && r.code.text === 'Age');
      return obs && 'valueQuantity' in obs ? obs.valueQuantity : null;
    };
    expect(ageOf(text)).toEqual({ value: 3, unit: 'd', system: 'http://unitsofmeasure.org', code: 'd' });
    expect(ageOf('patient age 6 weeks\n@ 08:00\nvitals hr 150')).toEqual({ value: 6, unit: 'wk', system: 'http://unitsofmeasure.org', code: 'wk' });
    expect(ageOf('patient age 8 mo\n@ 08:00\nvitals hr 150')).toEqual({ value: 8, unit: 'mo', system: 'http://unitsofmeasure.org', code: 'mo' });
    expect(ageOf('patient age 64\n@ 08:00\nvitals hr 80')).toEqual({ value: 64, unit: 'y', system: 'http://unitsofmeasure.org', code: 'a' });
    expect(ageOf('patient age 64 years\n@ 08:00\nvitals hr 80')).toEqual({ value: 64, unit: 'y', system: 'http://unitsofmeasure.org', code: 'a' });
  });
});

describe('the editor offers and explains an age in weeks or days', () => {
  it('completion after `age N` offers the four units of an age', () => {
    const { result, position } = noteAt('patient age 6 |');
    expect(completionsAt(result, position).filter((c) => c.kind === 'unit').map((c) => c.label)).toEqual(['y', 'mo', 'wk', 'd']);
  });

  it('the hover of an age in days gives it in years, with the days as written', () => {
    const { result, position } = noteAt('patient age 3 d|ays\n@ 08:00\nvitals hr 150');
    const md = hoverAt(result, position)?.markdown ?? '';
    expect(md).toContain('0.0082 y');
    expect(md).toContain('**0.0082 y** = 3 d');
  });
});
