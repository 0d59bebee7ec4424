/**
 * The grammar and the parser read lines alike: wherever the parser finds a section word, a key,
 * a value, a unit, a timepoint part, a label, prose or a comment, the grammar gives that text the
 * matching scope. Checked on the samples, the fixtures, the grammar fixtures and generated messy
 * lines. (The other direction is looser on purpose: the grammar also colours what the parser
 * rejects, such as the label after an unreadable time.)
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fieldFor } from '../../server/src/core/fields/registry';
import { unitsForSpelling } from '../../server/src/core/fields/units';
import { BLANKS, isBlank, parseLine, splitLines, type LineNode } from '../../server/src/core/index';
import type { Span } from '../../server/src/core/syntax/tree';
import { messyLine } from '../service/note-arbitraries';
import { scopesAt, tokenizeLines, type ScopedToken } from './tokenize';

const S = (name: string) => `${name}.pneumark`;
const NUMBER_START = /^[-+−]?\.?[0-9]/u;

/** Everything in the line the grammar disagrees with the parser about. */
function disagreements(node: LineNode, tokens: readonly ScopedToken[]): string[] {
  const out: string[] = [];
  const text = node.text;
  const expectSpan = (span: Span, what: string, ...anyOf: string[]) => {
    for (let i = span.start; i < span.end; i++) {
      // Blanks as the lexer knows them carry no scope of their own.
      if (isBlank(text.charCodeAt(i))) continue;
      const scopes = scopesAt(tokens, i);
      if (!anyOf.some((s) => scopes.includes(s))) {
        out.push(`${what} \`${text.slice(span.start, span.end)}\` at ${span.start}: expected ${anyOf.join(' or ')}, got ${scopes.join(' ')}`);
        return;
      }
    }
  };
  if (node.comment) expectSpan(node.comment.span, 'comment', S('comment.line.number-sign'));
  switch (node.kind) {
    case 'blank':
      break;
    case 'unknown':
      expectSpan(node.first.span, 'unknown section', S('variable.other.section.unknown'));
      break;
    case 'timepoint':
      expectSpan(node.marker.span, 'marker', S('keyword.operator.timepoint'));
      if (node.time) expectSpan(node.time.span, 'time', S('constant.other.time'), S('keyword.other.day'));
      // A part of the time the parser reports (outside the label, which keeps what it could not read)
      // is invalid; but for a day or an offset beyond what a note can span (`day 100001`), a limit
      // the grammar does not count to.
      for (const issue of node.issues) {
        if (issue.check !== 'bad-time' || issue.span.start === node.marker.span.start) continue;
        if (/beyond the last day|longer than a note can span/u.test(issue.message)) continue;
        if (node.label && issue.span.start >= node.label.span.start) continue;
        expectSpan(issue.span, 'unreadable time', S('invalid.illegal.time'));
      }
      if (node.label) {
        // After `@`, a chunk that is no time is reported (PN104) and kept in the label by the
        // parser; the grammar marks it as an unreadable time when it starts with a digit.
        const bad = node.issues.filter((i) => i.check === 'bad-time').map((i) => i.span);
        let from = node.label.span.start;
        for (const span of bad) {
          if (span.start < from || span.start >= node.label.span.end) continue;
          expectSpan({ start: from, end: span.start }, 'label', S('entity.name.section.timepoint'));
          expectSpan(span, 'unreadable time', S('invalid.illegal.time'), S('entity.name.section.timepoint'));
          from = span.end;
        }
        expectSpan({ start: from, end: node.label.span.end }, 'label', S('entity.name.section.timepoint'));
      }
      break;
    case 'section': {
      expectSpan(node.sectionToken.span, 'section', S('keyword.other.section'));
      if (node.prose) expectSpan(node.prose.span, 'prose', S('string.unquoted.prose'));
      for (const item of node.items) {
        if (item.key && NUMBER_START.test(item.key.text)) {
          // A chunk that starts like a number but reads as no value (`96/58mmHg`): the parser
          // takes it for a key with no value; the grammar marks it as unreadable.
          expectSpan(item.key.span, 'unreadable value', S('invalid.illegal.pair'), S('invalid.illegal.shorthand-gas'));
        } else if (item.key) {
          const known = fieldFor(node.section, item.key.text) !== undefined;
          expectSpan(item.key.span, 'key', S(known ? 'variable.other.key' : 'variable.other.key.unknown'));
        }
        const value = item.value;
        if (value?.kind === 'number') {
          expectSpan(value.span, 'number', S(value.decimalComma ? 'invalid.deprecated.decimal-comma' : 'constant.numeric'));
          if (item.implied === 'shorthand') expectSpan(value.span, 'shorthand part', S('meta.shorthand-gas'));
        } else if (value?.kind === 'pair') {
          // A slash group after a key is a pair (bp 96/58); a shorthand gas is read as its parts.
          const whole = value.parts.length === 2 ? S('meta.pair') : S('invalid.illegal.pair');
          expectSpan(value.span, 'pair', whole);
          if (!whole.startsWith('invalid')) for (const part of value.parts) expectSpan(part.span, 'pair part', S(part.decimalComma ? 'invalid.deprecated.decimal-comma' : 'constant.numeric'));
        } else if (value?.kind === 'word') {
          const field = fieldFor(node.section, item.keyName);
          const known = field?.words?.[value.text.toLowerCase().replace(/\s+/gu, ' ')] !== undefined;
          expectSpan(value.span, 'word', S(known ? 'constant.language' : field?.openWords ? 'constant.other.word' : 'constant.other.word.unknown'));
        }
        if (item.unit) expectSpan(item.unit.span, 'unit', S(unitsForSpelling(item.unit.text).length > 0 ? 'keyword.other.unit' : 'keyword.other.unit.unknown'));
      }
      // Text the parser reports as stray (a value with no key, punctuation where a key goes) is
      // invalid for the grammar too, never a key or a plain value.
      for (const issue of node.issues) {
        if (issue.check !== 'stray-text' || issue.severity !== undefined) continue;
        expectSpan(issue.span, 'stray text', S('invalid.illegal.stray'), S('invalid.illegal.pair'), S('invalid.illegal.shorthand-gas'));
      }
      break;
    }
  }
  return out;
}

async function check(texts: readonly string[]): Promise<string[]> {
  const failures: string[] = [];
  for (const text of texts) {
    // Editors drop a byte-order mark at the start of a file before highlighting; anywhere else,
    // U+FEFF is a blank for the grammar as for the lexer.
    const lines = splitLines(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text).lines.map((l) => l.text);
    const tokens = await tokenizeLines(lines);
    lines.forEach((line, i) => {
      for (const d of disagreements(parseLine(line, i), tokens[i]!)) failures.push(`${JSON.stringify(line)}: ${d}`);
    });
  }
  return failures;
}

const pneuFiles = (dir: string) => readdirSync(dir).filter((f) => f.endsWith('.pneu')).sort().map((f) => join(dir, f));

describe('grammar and parser agree', () => {
  it('on the samples and the fixtures', async () => {
    const files = [...pneuFiles('samples'), ...pneuFiles('tests/fixtures')];
    expect(files.length).toBeGreaterThan(3);
    expect(await check(files.map((f) => readFileSync(f, 'utf8')))).toEqual([]);
  });

  it('on the source lines of the grammar fixtures', async () => {
    const files = pneuFiles('tests/grammar');
    // Assertion lines (`#  ^^^ scope`, `# <-- scope`) are not part of the tested text.
    const sources = files.map((f) => readFileSync(f, 'utf8').split('\n').slice(1).filter((l) => !/^#\s*(?:\^|<~*-+)/u.test(l)).join('\n'));
    expect(await check(sources)).toEqual([]);
  });

  it('on the numbers after `venturi`: its FiO2 and its flow, each said by its unit, in either order', async () => {
    // The parser reads the number after `venturi` as its FiO2 where it is a percentage, a fraction
    // above 0 up to 1 or a bare Venturi setting (24–60), else as its flow; a second number only
    // where its unit says it is the other setting (tests/core/venturi-flow-and-setting.test.ts).
    const lines = [
      'oxygen venturi 28 8 L/min', 'oxygen venturi 28 8L/min', 'oxygen venturi 28 % 8 L/min', 'oxygen venturi 0.28 8 L/min',
      'oxygen venturi 8 L/min 28 %', 'oxygen venturi 8 28 %', 'oxygen venturi 8 L/min 28%', 'oxygen venturi 28 8',
      'oxygen venturi 8 L/min 28', 'oxygen venturi 28 28 %', 'oxygen venturi 0.4 8 %', 'oxygen venturi 28 % 35 %',
      'oxygen venturi 8 L/min 10 L/min', 'oxygen venturi 61 8 L/min', 'oxygen venturi 23 8 L/min', 'oxygen venturi 60 8 L/min',
      'oxygen venturi 60.5 8 L/min', 'oxygen venturi 24.5 8 L/min', 'oxygen venturi 1 8 L/min', 'oxygen venturi 1.01 8 L/min',
      'oxygen venturi 0 8 L/min', 'oxygen venturi 0,5 8 L/min', 'oxygen venturi 28 8 cmH2O', 'oxygen venturi 28 8 xyz',
      'oxygen venturi 28 fio2 0.28', 'oxygen venturi 28 8 L/min, fio2 0.28', 'oxygen venturi 28, 8 L/min', 'oxygen venturi 40 %, fio2 0.4',
    ];
    expect(await check([lines.join('\n')])).toEqual([]);
  });

  it('on units written with a micro sign (U+00B5) or a Greek mu (U+03BC), glued or after a blank: units Pneumark does not know, not keys', async () => {
    const lines = [
      'labs glucose 5 µmol/L, na 140 μmol/L', 'labs glucose 5µmol/L, k 4μmol/L', 'vitals bp 120/80µmmHg', 'vitals bp 120/80 µmmHg',
      'vitals bp 120/80µ(93)', 'labs k 4 µ', 'labs na 140 µmol/L, k 4',
    ];
    expect(await check([lines.join('\n')])).toEqual([]);
  });

  it('on times on the 12-hour clock: those the 24-hour clock reads otherwise are unreadable times, the others times and labels', async () => {
    const lines = [
      '@ day 1 9:00 pm  evening', '@ day 1 10:15pm', '@ day 2 12:30 AM after midnight', '@ 9:00 p.m.', '@ 11:45PM', '@ day 3 09:05 PM later',
      '@ 9:00 pm, evening', '@ 9:00 pm # a comment', '@ 8:00 am  round', '@ 12:15 pm', '@ 13:00 pm', '@ 0:30 am', '@ 9:00, pm', '@ 3:00pmx', '@ 9:00 pmx',
    ];
    expect(await check([lines.join('\n')])).toEqual([]);
  });

  it('on generated messy lines', async () => {
    const lines = fc.sample(messyLine, { numRuns: 1500, seed: 20250101 });
    expect(await check([lines.join('\n')])).toEqual([]);
  });

  it('on lines with each blank of the format at the start, in the middle and at the end', async () => {
    // Every character the lexer reads as a blank (blanks.ts, which the grammar is built from), in
    // every place a blank separates something: before the section word, between the section word
    // and the first key, between a key and its value, between a value and its unit (also inside a
    // unit of two words), around a spaced slash, in a timepoint, in prose, at the end of the line
    // and before a comment.
    const lines = (b: string) => [
      `${b}vitals hr 80, rr 20`,
      `${b}${b}vitals${b}${b}hr${b}${b}80${b}${b}`,
      `vitals${b}hr 80,${b}rr 20`,
      `vitals hr${b}80, rr${b}20`,
      `vitals spo2 94${b}%, temp 38.4${b}C, hr 80`,
      `abg po2 71${b}mmHg, pco2 40 mm${b}Hg, ph 7.4`,
      `abg${b}7.28/56/71/26${b}kPa, be${b}-2`,
      `abg 7.28${b}/${b}56${b}/${b}71 mmHg`,
      `vitals bp 120${b}/${b}80${b}mmHg`,
      `vent mode${b}VC, vt${b}430${b}mL, peep 10${b}cmH2O`,
      `oxygen${b}nasal${b}2${b}L/min, fio2${b}0.3`,
      `oxygen room${b}air${b}`,
      `patient sex${b}female, age 60${b}y`,
      `vitals hr 80${b}`,
      `vitals hr 80 bpm${b}`,
      `vitals hr 80${b}# after${b}the value`,
      `vitals hr 80.${b}`,
      `@${b}day${b}2${b}08:00${b}arrival${b}`,
      `@${b}+2h30${b}`,
      `@ 08:00,${b}handover${b}# note`,
      `note${b}feels${b}better${b}`,
      `${b}# a comment`,
      `vitls${b}hr 80`,
      `vitals 80${b}120`,
    ];
    expect(BLANKS.length).toBeGreaterThan(20);
    const failures: string[] = [];
    for (const blank of BLANKS) {
      const b = String.fromCharCode(blank.code);
      for (const f of await check([lines(b).join('\n')])) failures.push(`${blank.name}: ${f}`);
    }
    expect(failures).toEqual([]);
  });
});
