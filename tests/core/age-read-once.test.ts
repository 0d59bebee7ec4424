// One reader of the age. The timeline works out the age a header or a timepoint is read with from
// all its lines before reading them (an age written after a height reads as one written before
// it), and the usual minimum of a body size (PN302) needs the same age. The timeline keeps the age
// it read each block with (`Timeline.headerAgeYears`, `Timepoint.ageYears`), and PN302 asks it,
// rather than reading the age again from the stated values. The age a timepoint was read with is
// the age in force there (`values.numberOf('age')`): the last one stated there, else the one
// carried to it; one stated but not used (impossible, or its unit in doubt) is no age.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';

const timelineOf = (text: string) => checkNote(text).analysis.timeline;

describe('the age a header or a timepoint was read with is kept by the timeline', () => {
  it('the header\'s: its last age, wherever it is written; null for none or one not used', () => {
    expect(timelineOf('patient height 70\npatient age 8 mo').headerAgeYears).toBe(8 / 12);
    expect(timelineOf('patient age 8 mo, height 70\npatient age 30 y').headerAgeYears).toBe(30);
    expect(timelineOf('patient age 6 y\npatient age 250 y').headerAgeYears).toBeNull();
    expect(timelineOf('patient height 170').headerAgeYears).toBeNull();
    expect(timelineOf('@ 08:00\npatient age 40 y').headerAgeYears).toBeNull();
  });

  it('a timepoint\'s: its last age, else the one carried to it', () => {
    const t = timelineOf('patient age 3 d\n@ day 1 08:00\nvitals hr 140\n@ day 2 08:00\npatient height 50\npatient age 4 d\n@ day 3 08:00\npatient age 500 y');
    expect(t.headerAgeYears).toBe(3 / 365.25);
    expect(t.timepoints.map((tp) => tp.ageYears)).toEqual([3 / 365.25, 4 / 365.25, null]);
  });

  it('the implicit first timepoint is read with the header\'s age', () => {
    const t = timelineOf('patient age 8 mo\nvitals hr 130');
    expect(t.timepoints.map((tp) => tp.ageYears)).toEqual([8 / 12]);
  });

  it('PN302 judges a body size with the age the line was read with (an age after the height counts)', () => {
    const codes = (text: string) => checkNote(text).findings.map((f) => `${f.code} ${f.range.start.line + 1}`);
    expect(codes('patient height 116 cm, weight 21 kg\npatient age 6 y')).toEqual([]);
    expect(codes('@ day 1 08:00\npatient height 116 cm, weight 21 kg\npatient age 6 y')).toEqual([]);
    expect(codes('patient age 6 y\n@ day 1 08:00\npatient height 116 cm\npatient age 30 y')).toEqual(['PN302 3']);
  });

  it('in every fixture and sample, a timepoint\'s age read is the age in force there', () => {
    const notes: string[] = [];
    const walk = (dir: string) => {
      for (const e of readdirSync(dir, { withFileTypes: true })) {
        if (e.isDirectory()) walk(join(dir, e.name));
        else if (e.name.endsWith('.pneu')) notes.push(readFileSync(join(dir, e.name), 'utf8'));
      }
    };
    walk('tests/fixtures');
    walk('samples');
    let ages = 0;
    for (const text of notes) {
      for (const tp of timelineOf(text).timepoints) {
        expect(tp.ageYears).toBe(tp.values.numberOf('age'));
        if (tp.ageYears !== null) ages++;
      }
    }
    expect(ages).toBeGreaterThan(20);
  });
});
