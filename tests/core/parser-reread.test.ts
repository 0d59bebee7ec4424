// What the parser reads again instead of keeping (numbers of pairs, where an item ends and where
// its number starts, a word's text) must read as what was written.
import { describe, expect, it } from 'vitest';
import { releaseWords, scanNumber, scanWord, SCANNED, wordsOf } from '../../server/src/core/syntax/lexer';
import { pairNumbers, parseNote } from '../../server/src/core/syntax/parser';
import type { PairValue, SectionLine } from '../../server/src/core/syntax/tree';

function items(text: string): SectionLine['items'] {
  const node = parseNote(text).lines[0];
  if (node?.kind !== 'section') throw new Error('expected a section line');
  return node.items;
}

describe('words read in their line', () => {
  it('cuts a word text out of its line when read, equal to the slice of its span', () => {
    const body = 'vitals hr 80, temp 38.4C  note prose here';
    const words = wordsOf(body);
    expect(words.map((w) => w.text)).toEqual(words.map((w) => body.slice(w.start, w.end)));
    releaseWords();
  });

  it('scans a number in its line as in its own text, also a sign before a separating comma', () => {
    for (const body of ['hr -,5', 'hr +,5 x', 'hr 80,x', 'x 7,35', 'x 12.', 'x −4.5kPa', 'x .5', 'x -', 'x 1234567890123456789']) {
      for (const word of wordsOf(body)) {
        const inLine = scanWord(word);
        const inLineValue = SCANNED.value;
        const own = scanNumber(word.text);
        expect([body, word.text, inLine]).toEqual([body, word.text, own]);
        if (own > 0) expect(inLineValue).toBe(SCANNED.value);
      }
      releaseWords();
    }
  });
});

describe('values read again from their line', () => {
  it('gives the numbers of a pair as written, glued or spaced, with a glued unit or a full stop after them', () => {
    const cases: [string, number[]][] = [
      ['vitals bp 120/80', [120, 80]],
      ['vitals bp 120 / 80mmHg', [120, 80]],
      ['vitals bp 120/80.', [120, 80]],
      ['vitals bp 1,5/80', [1.5, 80]],
      ['vitals bp −12/+8mm Hg', [-12, 8]],
    ];
    for (const [text, numbers] of cases) {
      const value = items(text)[0]!.value as PairValue;
      expect(value.parts.map((p) => p.value)).toEqual(numbers);
      expect(pairNumbers(value)).toEqual(numbers);
      expect(value.parts.map((p) => p.text)).toEqual(value.parts.map((p) => text.slice(p.span.start, p.span.end)));
    }
  });

  it('reads the parts of a shorthand gas as the numbers between its slashes', () => {
    const text = 'abg 7.28 / 56 / 71 / 26 kPa';
    expect(items(text).map((i) => [i.keyName, i.number, i.value?.text, i.unit?.text ?? null])).toEqual([
      ['ph', 7.28, '7.28', null], ['pco2', 56, '56', 'kPa'], ['po2', 71, '71', 'kPa'], ['hco3', 26, '26', null],
    ]);
  });

  it('ends an item after its unit, value or key, and starts its number after the blanks after its key', () => {
    const spans = (text: string) => items(text).map((i) => [text.slice(i.span.start, i.span.end), i.value ? text.slice(i.value.span.start, i.value.span.end) : null]);
    expect(spans('vitals hr \t 80 /min, spo2 92%, temp, bp 120/80 mmHg')).toEqual([['hr \t 80 /min', '80'], ['spo2 92%', '92'], ['temp', null], ['bp 120/80 mmHg', '120/80']]);
    expect(spans('vent mode VC, peep 5cm H2O')).toEqual([['mode VC', 'VC'], ['peep 5cm H2O', '5']]);
    expect(spans('oxygen room air 2 L/min')).toEqual([['room air', 'room air'], ['2 L/min', '2']]);
    // A part of a shorthand gas ends with its number: the unit after the gas is not in its span.
    const gas = 'abg 7.28/56/71/26 kPa';
    expect(items(gas).map((i) => gas.slice(i.span.start, i.span.end))).toEqual(['7.28', '56', '71', '26']);
  });
});

describe('the list of lines', () => {
  it('has one node per line, whatever the line ends', () => {
    for (const text of ['', 'a', 'a\n', 'a\r\nb\rc\n\n', '\r\r\n\n\r', 'x\r']) {
      const lines = parseNote(text).lines;
      expect(lines.length).toBe(text.split(/\r\n|\r|\n/).length);
      expect(lines.every((l, i) => l !== undefined && l.line === i)).toBe(true);
    }
  });
});
