// The parser knows the words of the format (section names, keys, units) by reading a word of a
// line in place, a character at a time: a word is known whatever it starts with and however long it
// is, and a word that only starts like one, or goes on past one, is not.
import { describe, expect, it } from 'vitest';
import { parseNote } from '../../server/src/core/syntax/parser';

function read(text: string): unknown[] {
  const node = parseNote(text).lines[0]!;
  if (node.kind !== 'section') return [node.kind, node.issues.map((i) => i.check)];
  return [node.section, ...node.items.map((i) => [i.keyName, i.field?.id ?? null, i.valueKind, i.number, i.unitText]), node.issues.map((i) => i.check)];
}

describe('words of the format', () => {
  it('knows keys, units and sections written in full, of any length or first character', () => {
    expect(read('vitals spo2 95 %, hr 80 /min, temp 37 °C')).toEqual(['vitals', ['spo2', 'spo2', 'number', 95, '%'], ['hr', 'hr', 'number', 80, '/min'], ['temp', 'temp', 'number', 37, '°C'], []]);
    expect(read('vent minute_volume 8 L/min, peep_total 9 cmH2O')).toEqual(['vent', ['minute_volume', 'minute_volume', 'number', 8, 'L/min'], ['peep_total', 'peep_total', 'number', 9, 'cmH2O'], []]);
    expect(read('obs HR 80')).toEqual(['vitals', ['hr', 'hr', 'number', 80, null], []]);
  });

  it('does not know a word that only starts like one or goes on past one', () => {
    expect(read('vitals hrs 80')).toEqual(['vitals', ['hrs', null, 'number', 80, null], []]);
    expect(read('labs lactat 2, lactates 3')).toEqual(['labs', ['lactat', null, 'number', 2, null], ['lactates', null, 'number', 3, null], []]);
    expect(read('vita hr 80')[0]).toBe('unknown');
    expect(read('vitalss hr 80')[0]).toBe('unknown');
  });

  it('reads a word with a character beyond ASCII, or a number, as no word of the format', () => {
    expect(read('vitals ｈr 80')).toEqual(['vitals', ['ｈr', null, 'number', 80, null], []]);
    expect(read('vitals 80 hr')).toEqual(['vitals', ['hr', 'hr', null, null, null], ['stray-text', 'missing-value']]);
  });
});

describe('decimal commas, looked for only on a line where a digit follows a comma', () => {
  it('reports one inside a word and one right after a separating comma (`(,5)`), and none after a lone sign', () => {
    const spans = (text: string) => parseNote(text).lines[0]!.issues.filter((i) => i.check === 'decimal-comma').map((i) => [i.span.start, i.span.end]);
    expect(spans('vitals temp 37,5 C')).toEqual([[12, 16]]);
    expect(spans('abg 7,35/40/80/24')).toEqual([[4, 8]]);
    expect(spans('vitals bp 120/80,5')).toEqual([[14, 18]]);
    expect(spans('vitals hr 80,rr 7,5')).toEqual([[16, 19]]);
    expect(spans('vitals bp 120/80 (,5)')).toEqual([[18, 20]]);
    expect(spans('vitals hr -,5')).toEqual([]);
  });
});
