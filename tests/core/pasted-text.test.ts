/**
 * Text pasted from elsewhere into a note: a word processor's dash for a minus sign, and a unit
 * written with a micro sign. Each is one clear finding that names what is there, never a key
 * without a value beside a stray word, nor a unit taken for a key.
 */
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { parseLine } from '../../server/src/core/syntax/parser';
import type { SectionLine } from '../../server/src/core/syntax/tree';

const section = (text: string): SectionLine => parseLine(text, 0) as SectionLine;

describe('a number that starts with a dash other than a minus sign', () => {
  // A word processor turns ` -5` into ` –5` (an en dash). The format's signs are `-`, `+` and `−`
  // (U+2212), so the dash is not read as a sign; it was two errors, "`be` has no value" and
  // "`–5` is not a key", neither of which named the dash.
  const CASES: readonly [string, string, string, string][] = [
    ['abg be –5, ph 7.3', '–5', 'an en dash (U+2013)', '-5'],
    ['abg be —2.5', '—2.5', 'an em dash (U+2014)', '-2.5'],
    ['abg be ‐.5', '‐.5', 'a hyphen (U+2010)', '-.5'],
    ['abg be －3 mmol/L', '－3', 'a fullwidth hyphen-minus (U+FF0D)', '-3'],
  ];
  for (const [text, written, dash, meant] of CASES) {
    it(`${text}: one finding on the number that names the dash, with a fix that reads the value`, () => {
      const node = section(text);
      expect(node.issues.map((i) => i.check)).toEqual(['stray-text']);
      const issue = node.issues[0]!;
      expect(issue.message).toBe(`\`${written}\` starts with ${dash}, which is not read as a minus sign, so \`be\` has no value; write \`${meant}\`.`);
      expect(text.slice(issue.span.start, issue.span.end)).toBe(written);
      const fix = issue.fixes[0]!;
      expect(fix.preferred).toBe(true);
      const edit = fix.edits[0]!;
      const fixed = text.slice(0, edit.span.start) + edit.newText + text.slice(edit.span.end);
      const after = section(fixed);
      expect(after.issues).toEqual([]);
      expect(after.items[0]!.number).toBe(Number(meant));
    });
  }

  it('the minus sign U+2212 is a sign of the format, read with no finding', () => {
    const result = checkNote('@ 08:00\nabg       be −5, ph 7.30\n');
    expect(result.findings.filter((f) => f.severity !== 'information')).toEqual([]);
    expect(result.analysis.timeline.timepoints[0]!.values.numberOf('base_excess')).toBe(-5);
  });

  it('a dash alone, or before a word, is stray text and the key has no value, as before', () => {
    expect(section('labs k –').issues.map((i) => i.check)).toEqual(['missing-value', 'stray-text']);
    expect(section('labs k –x').issues.map((i) => i.check)).toEqual(['missing-value', 'stray-text']);
  });

  it('a range joined by an en dash is still a range', () => {
    const node = section('oxygen cannula 2 L/min, target 88–92');
    expect(node.issues).toEqual([]);
  });
});

describe('a unit written with a micro sign or a Greek mu', () => {
  // `umol/L` was a unit Pneumark does not know (PN202, which says what the field takes) while
  // `µmol/L`, as a lab report or a word processor writes it, was taken for a key ("not a key of
  // labs lines"): a unit starts with µ (U+00B5) or μ (U+03BC) as it does with a letter.
  for (const unit of ['µmol/L', 'μmol/L', 'umol/L']) {
    it(`glucose 5 ${unit}: an unknown unit that says which units glucose takes`, () => {
      const result = checkNote(`@ 08:00\nlabs      glucose 5 ${unit}\n`);
      expect(result.findings.map((f) => [f.code, f.message])).toEqual([['PN202', `\`${unit}\` is not a unit Pneumark knows; Glucose takes mmol/L or mg/dL.`]]);
    });
  }

  it('glued to the number, as before', () => {
    expect(checkNote('@ 08:00\nlabs      glucose 5µmol/L\n').findings.map((f) => f.code)).toEqual(['PN202']);
  });
});

describe('a time on the 12-hour clock', () => {
  // `@ day 1 9:00 pm` was read as 09:00 with a label starting `pm`: the timepoint 12 hours early,
  // with no finding, and every value of it in the wrong place of the timeline and the exports.
  const timeOf = (text: string) => checkNote(`${text}\nvitals    hr 80\n`).analysis.timeline.timepoints[0]!.time;
  const CASES: readonly [string, string, string, number][] = [
    ['@ day 1 9:00 pm  evening', '9:00 pm', '21:00', 21 * 60],
    ['@ day 1 10:15pm', '10:15pm', '22:15', 22 * 60 + 15],
    ['@ day 2 12:30 AM  after midnight', '12:30 AM', '00:30', 1440 + 30],
    ['@ 9:00 p.m.', '9:00 p.m.', '21:00', 21 * 60],
    ['@ 11:45PM', '11:45PM', '23:45', 23 * 60 + 45],
  ];
  for (const [line, written, meant, minutes] of CASES) {
    it(`${line}: PN104, the time left unknown, and a fix that writes ${meant}`, () => {
      const result = checkNote(`${line}\nvitals    hr 80\n`);
      const bad = result.findings.filter((f) => f.code === 'PN104');
      expect(bad.map((f) => f.message)).toEqual([`\`${written}\` is a time on the 12-hour clock; Pneumark reads times on the 24-hour clock, where it is \`${meant}\` (the time is unknown until it is written so).`]);
      expect(result.analysis.timeline.timepoints[0]!.time.minutes).toBeNull();
      const fix = bad[0]!.fixes[0]!;
      expect(fix.preferred).toBe(true);
      const edit = fix.edits[0]!;
      const fixed = line.slice(0, edit.range.start.character) + edit.newText + line.slice(edit.range.end.character);
      const after = checkNote(`${fixed}\nvitals    hr 80\n`);
      expect(after.findings.filter((f) => f.severity !== 'information')).toEqual([]);
      expect(after.analysis.timeline.timepoints[0]!.time.minutes).toBe(minutes);
    });
  }

  it('a time both clocks read alike is read, its am or pm left in the label; so is a 24-hour time before pm', () => {
    for (const [line, minutes] of [['@ 8:00 am  round', 480], ['@ 12:15 pm', 735], ['@ 13:00 pm', 780], ['@ 0:30 am', 30]] as const) {
      expect(checkNote(`${line}\nvitals    hr 80\n`).findings.filter((f) => f.code === 'PN104'), line).toEqual([]);
      expect(timeOf(line).minutes, line).toBe(minutes);
    }
  });
});

describe('the degree Celsius and Fahrenheit signs (U+2103, U+2109)', () => {
  // A word processor or a monitor's export writes `℃`, one character; it was "not a key".
  it('are spellings of C and F, after a blank or glued', () => {
    const result = checkNote('@ 08:00\nvitals    temp 37.5 ℃, hr 80\n@ +1h\nvitals    temp 99.5℉\n');
    expect(result.findings).toEqual([]);
    const [first, second] = result.analysis.timeline.timepoints;
    expect(first!.values.numberOf('temp')).toBe(37.5);
    expect(second!.values.numberOf('temp')).toBeCloseTo(37.5, 10);
  });
});
