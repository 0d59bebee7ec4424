import { describe, expect, it } from 'vitest';
import { parseNote, readClock, readOffset, splitLines } from '../../server/src/core/syntax/parser';
import type { ItemNode, LineNode, SectionLine, TimepointLine } from '../../server/src/core/syntax/tree';

function line(text: string): LineNode {
  const node = parseNote(text).lines[0];
  if (!node) throw new Error('no line');
  return node;
}
function section(text: string): SectionLine {
  const node = line(text);
  if (node.kind !== 'section') throw new Error(`expected a section line, got ${node.kind}`);
  return node;
}
function timepoint(text: string): TimepointLine {
  const node = line(text);
  if (node.kind !== 'timepoint') throw new Error(`expected a timepoint, got ${node.kind}`);
  return node;
}
/** The text a span covers, so range assertions read like the note. */
function at(text: string, span: { start: number; end: number } | undefined): string {
  return span ? text.slice(span.start, span.end) : '<none>';
}
function summary(text: string, item: ItemNode): string {
  return [item.keyName, at(text, item.value?.span), at(text, item.unit?.span ?? undefined)].join(' | ');
}

describe('lines and line ends', () => {
  it('splits on LF, CRLF and CR as LSP does, remembering the first line end', () => {
    expect(splitLines('a\nb').lines.map((l) => l.text)).toEqual(['a', 'b']);
    const crlf = splitLines('a\r\nb\r\n');
    expect(crlf.lines.map((l) => l.text)).toEqual(['a', 'b', '']);
    expect(crlf.eol).toBe('\r\n');
    expect(crlf.lines[1]?.offset).toBe(3);
    expect(splitLines('a\rb').lines.map((l) => l.text)).toEqual(['a', 'b']);
  });

  it('gives every line a node, blank and comment lines included', () => {
    const tree = parseNote('# only a comment\n\nvitals hr 80');
    expect(tree.lines.map((l) => l.kind)).toEqual(['blank', 'blank', 'section']);
    expect(tree.lines[0]?.comment?.text).toBe('# only a comment');
  });

  it('treats a byte-order mark and tabs as blanks, keeping UTF-16 columns', () => {
    const text = '\uFEFFvitals\thr\t80';
    const node = section(text);
    expect(node.sectionToken.span.start).toBe(1);
    expect(summary(text, node.items[0]!)).toBe('hr | 80 | <none>');
  });

  it('counts columns in UTF-16 code units after non-ASCII prose', () => {
    const text = 'vitals hr 80 # 😀 naïve';
    const node = section(text);
    expect([node.comment?.span.start, node.comment?.span.end]).toEqual([13, text.length]);
    const note = section('note   café ☕ — breathing easier 🙂');
    expect(note.prose?.text).toBe('café ☕ — breathing easier 🙂');
  });
});

describe('section lines', () => {
  it('reads key value unit items, comma separated, with exact spans', () => {
    const text = 'vitals    hr 118, rr 26, spo2 89 %, temp 38.4 C, bp 96/58';
    const node = section(text);
    expect(node.section).toBe('vitals');
    expect(node.items.map((i) => summary(text, i))).toEqual([
      'hr | 118 | <none>',
      'rr | 26 | <none>',
      'spo2 | 89 | %',
      'temp | 38.4 | C',
      'bp | 96/58 | <none>',
    ]);
    expect(node.issues).toEqual([]);
  });

  it('accepts items without commas, glued units and upper-case keys', () => {
    const text = 'VITALS HR 118 RR 26 SpO2 89% temp 38.4C';
    const node = section(text);
    expect(node.items.map((i) => summary(text, i))).toEqual(['hr | 118 | <none>', 'rr | 26 | <none>', 'spo2 | 89 | %', 'temp | 38.4 | C']);
  });

  it('reads a unit glued to a pair or a shorthand gas (`120/80mmHg`, `7.28/56/71/26mmHg`), as the grammar allows', () => {
    const vitals = 'vitals bp 120/80mmHg, hr 80';
    const v = section(vitals);
    expect(v.items.map((i) => summary(vitals, i))).toEqual(['bp | 120/80 | mmHg', 'hr | 80 | <none>']);
    expect(v.issues).toEqual([]);
    const gas = 'abg 7.28/7.5/9.5/26kPa';
    const g = section(gas);
    expect(g.items.map((i) => summary(gas, i))).toEqual(['ph | 7.28 | <none>', 'pco2 | 7.5 | kPa', 'po2 | 9.5 | kPa', 'hco3 | 26 | <none>']);
    expect(g.issues).toEqual([]);
    // Only after the last number, and only a unit-like word: `120mmHg/80` is no pair.
    expect(section('vitals bp 120mmHg/80').items[0]?.valueKind).toBe('number');
  });

  it('reads a pair or a shorthand gas written with blanks around its slashes (`120 / 80`, `7.28 / 56 / 71 / 26`)', () => {
    const vitals = 'vitals bp 120 / 80 mmHg, hr 80';
    const v = section(vitals);
    expect(v.items.map((i) => summary(vitals, i))).toEqual(['bp | 120 / 80 | mmHg', 'hr | 80 | <none>']);
    expect(v.issues).toEqual([]);
    const value = v.items[0]!.value;
    expect(value?.kind === 'pair' ? value.parts.map((p) => p.value) : null).toEqual([120, 80]);
    const gas = 'abg 7.28 / 56 / 71 / 26, be -2';
    const g = section(gas);
    expect(g.items.map((i) => summary(gas, i))).toEqual(['ph | 7.28 | <none>', 'pco2 | 56 | <none>', 'po2 | 71 | <none>', 'hco3 | 26 | <none>', 'be | -2 | <none>']);
    expect(g.issues).toEqual([]);
    // A lone slash after a number that is not a pair's: still not a key of its own.
    const hr = 'vitals hr 80 / 90';
    expect(section(hr).items.map((i) => i.keyName)).not.toContain('/');
  });

  it('reads a unit spelling that is also a key of the line as that key when a number follows (commas are optional)', () => {
    const gas = 'abg pco2 40 ph 7.4';
    expect(section(gas).items.map((i) => summary(gas, i))).toEqual(['pco2 | 40 | <none>', 'ph | 7.4 | <none>']);
    const vent = 'vent peep 5 f 20';
    expect(section(vent).items.map((i) => [i.keyName, i.field?.id])).toEqual([['peep', 'peep'], ['f', 'vent_rate']]);
    const temp = 'vitals temp 98.6 f';
    expect(section(temp).items.map((i) => summary(temp, i))).toEqual(['temp | 98.6 | f']);
  });

  it('never reads punctuation as a unit: `hr 80 / rr 20` keeps both items and reports the slash', () => {
    const text = 'vitals hr 80 / rr 20';
    const node = section(text);
    expect(node.items.map((i) => summary(text, i))).toEqual(['hr | 80 | <none>', 'rr | 20 | <none>']);
    expect(node.issues.map((i) => [i.check, at(text, i.span)])).toEqual([['stray-text', '/']]);
  });

  it('reports a value of the wrong shape for its key instead of dropping it in silence', () => {
    const one = 'vitals bp 120, hr 80';
    expect(section(one).issues.map((i) => [i.check, at(one, i.span), i.message])).toEqual([
      ['missing-value', 'bp 120', '`bp` takes two numbers joined by a slash (`bp 120/80`); `120` is one, so it is not read.'],
    ]);
    const two = 'vitals hr 80/90';
    expect(section(two).issues.map((i) => [i.check, at(two, i.span), i.message])).toEqual([
      ['missing-value', 'hr 80/90', '`hr` takes one number; `80/90` is two numbers, so it is not read.'],
    ]);
    const three = 'vitals bp 120/80/60 mmHg, hr 80';
    expect(section(three).issues.map((i) => [i.check, at(three, i.span), i.message])).toEqual([
      ['missing-value', 'bp 120/80/60', '`bp` takes two numbers joined by a slash (`bp 120/80`); `120/80/60` is three, so it is not read.'],
    ]);
    expect(section('vitals bp 120 / 80 / 60').issues.map((i) => i.check)).toEqual(['missing-value']);
  });

  it('reads a unit with a slash glued to the last number of a shorthand gas as its unit (`26mmol/L`), not the whole as stray text', () => {
    const text = 'abg 7.28/56/71/26mmol/L, be -2';
    const node = section(text);
    expect(node.issues).toEqual([]);
    expect(node.items.map((i) => summary(text, i))).toEqual(['ph | 7.28 | <none>', 'pco2 | 56 | mmol/L', 'po2 | 71 | mmol/L', 'hco3 | 26 | <none>', 'be | -2 | <none>']);
    const one = 'labs hco3 24mmol/L';
    expect(section(one).items.map((i) => summary(one, i))).toEqual(['hco3 | 24 | mmol/L']);
    expect(section(one).issues).toEqual([]);
    expect(section('vitals bp 120/80mm/x').issues.map((i) => i.check)).toEqual(['missing-value', 'stray-text']);
  });

  it('gives a gas its shape: `abg 7.28/56` is a shorthand, not a key with two numbers', () => {
    expect(section('abg 7.28/56/71/26').issues).toEqual([]);
  });

  it('gives a section word at the start of a line one token shared by such lines, with its span', () => {
    const a = section('vitals hr 80');
    const b = section('vitals rr 16');
    expect(a.sectionToken).toBe(b.sectionToken);
    expect([a.sectionToken.text, a.sectionToken.span.start, a.sectionToken.span.end]).toEqual(['vitals', 0, 6]);
    const indented = section('  vitals hr 80');
    expect([indented.sectionToken.text, indented.sectionToken.span.start, indented.sectionToken.span.end]).toEqual(['vitals', 2, 8]);
    const upper = section('VITALS hr 80');
    expect([upper.sectionToken.text, upper.section]).toEqual(['VITALS', 'vitals']);
  });

  it('reads section aliases', () => {
    expect(section('obs hr 80').section).toBe('vitals');
    expect(section('ventilator peep 5').section).toBe('vent');
  });

  it('reads the shorthand gas in order pH/PCO2/PO2/HCO3, with an optional pressure unit', () => {
    const text = 'abg 7.28/7.5/9.5/26 kPa, be -2';
    const node = section(text);
    expect(node.items.map((i) => summary(text, i))).toEqual([
      'ph | 7.28 | <none>',
      'pco2 | 7.5 | kPa',
      'po2 | 9.5 | kPa',
      'hco3 | 26 | <none>',
      'be | -2 | <none>',
    ]);
    expect(node.items.slice(0, 4).every((i) => i.implied === 'shorthand' && i.key === null)).toBe(true);
  });

  it('accepts a two-part shorthand and rejects five parts', () => {
    expect(section('vbg 7.31/52').items.map((i) => i.keyName)).toEqual(['ph', 'pco2']);
    expect(section('abg 1/2/3/4/5').issues.map((i) => i.check)).toEqual(['bad-shorthand']);
  });

  it('reads an oxygen device first, with its flow and further settings', () => {
    const cases: [string, string[]][] = [
      ['oxygen room air', ['device | room air | <none>']],
      ['oxygen cannula 4 L/min', ['device | cannula | <none>', 'flow | 4 | L/min']],
      ['oxygen mask 10 L/min', ['device | mask | <none>', 'flow | 10 | L/min']],
      ['oxygen hfnc 50 L/min fio2 60 %', ['device | hfnc | <none>', 'flow | 50 | L/min', 'fio2 | 60 | %']],
      ['oxygen niv ipap 14 epap 6 fio2 40 %', ['device | niv | <none>', 'ipap | 14 | <none>', 'epap | 6 | <none>', 'fio2 | 40 | %']],
      ['oxygen cpap 8', ['device | cpap | <none>', 'level | 8 | <none>']],
      ['oxygen device cannula, flow 2', ['device | cannula | <none>', 'flow | 2 | <none>']],
    ];
    for (const [text, expected] of cases) expect(section(text).items.map((i) => summary(text, i)), text).toEqual(expected);
  });

  it('reads word values (mode, sex, gas unit)', () => {
    const text = 'vent mode VC, vt 430 mL, peep 10';
    expect(section(text).items.map((i) => summary(text, i))).toEqual(['mode | VC | <none>', 'vt | 430 | mL', 'peep | 10 | <none>']);
    const units = 'units gas kPa';
    expect(section(units).items.map((i) => summary(units, i))).toEqual(['gas | kPa | <none>']);
  });

  it('keeps note prose verbatim, up to a comment', () => {
    const node = section('note   free prose, with commas: 7,35 and @ signs # a comment');
    expect(node.prose?.text).toBe('free prose, with commas: 7,35 and @ signs');
    expect(node.items).toEqual([]);
    expect(node.comment?.text).toBe('# a comment');
  });

  it('keeps a comma that ends note prose (it is prose, not a separator between items)', () => {
    expect(section('note hello, world,').prose?.text).toBe('hello, world,');
    expect(section('note waiting for review,   # asked at 08:00').prose?.text).toBe('waiting for review,');
    const text = 'note  a, b,';
    expect(at(text, section(text).prose?.span)).toBe('a, b,');
  });

  it('reads a unit of two words after a number (`mm Hg`, `cm H2O`)', () => {
    const text = 'abg po2 80 mm Hg, pco2 40 MM  hg be -2';
    expect(section(text).items.map((i) => summary(text, i))).toEqual(['po2 | 80 | mm Hg', 'pco2 | 40 | MM  hg', 'be | -2 | <none>']);
    const vent = 'vent peep 5 cm H2O rate 20';
    expect(section(vent).items.map((i) => summary(vent, i))).toEqual(['peep | 5 | cm H2O', 'rate | 20 | <none>']);
    const gas = 'abg 7.31/41/80/24 mm Hg';
    expect(section(gas).items.map((i) => summary(gas, i))).toEqual(['ph | 7.31 | <none>', 'pco2 | 41 | mm Hg', 'po2 | 80 | mm Hg', 'hco3 | 24 | <none>']);
    const height = 'patient height 170 cm, weight 70';
    expect(section(height).items.map((i) => summary(height, i))).toEqual(['height | 170 | cm', 'weight | 70 | <none>']);
  });

  it('reads a unit of two words glued to its number (`80mm Hg`, `5cm H2O`) as it reads it after a blank', () => {
    const cases: [string, string[]][] = [
      ['abg po2 80mm Hg, pco2 40', ['po2 | 80 | mm Hg', 'pco2 | 40 | <none>']],
      ['vent peep 5cm H2O rate 20', ['peep | 5 | cm H2O', 'rate | 20 | <none>']],
      ['vent peep 5CM h2o', ['peep | 5 | CM h2o']],
      ['vitals bp 120/80mm Hg', ['bp | 120/80 | mm Hg']],
      ['vitals bp 120 / 80mm Hg', ['bp | 120 / 80 | mm Hg']],
      ['abg 7.31/41/80/24mm Hg', ['ph | 7.31 | <none>', 'pco2 | 41 | mm Hg', 'po2 | 80 | mm Hg', 'hco3 | 24 | <none>']],
      ['oxygen cpap 8cm H2O', ['device | cpap | <none>', 'level | 8 | cm H2O']],
    ];
    for (const [text, expected] of cases) {
      expect(section(text).items.map((i) => summary(text, i)), text).toEqual(expected);
      expect(section(text).issues, text).toEqual([]);
    }
    // Only words that make a unit together: `5cm` then a key stays the unit `cm` and the key.
    const height = 'patient height 170cm hr';
    expect(section(height).items.map((i) => summary(height, i))).toEqual(['height | 170 | cm', 'hr | <none> | <none>']);
    const comma = 'abg po2 80mm, Hg';
    expect(section(comma).items.map((i) => summary(comma, i))[0]).toBe('po2 | 80 | mm');
  });

  it('keeps an unknown unit as the unit, for the unit check to name', () => {
    const text = 'abg po2 71 mmhgg, pco2 40';
    expect(section(text).items.map((i) => summary(text, i))).toEqual(['po2 | 71 | mmhgg', 'pco2 | 40 | <none>']);
  });

  it('reports a decimal comma with a fix that writes a point', () => {
    const text = 'abg ph 7,35, pco2 41';
    const node = section(text);
    expect(node.items.map((i) => summary(text, i))).toEqual(['ph | 7,35 | <none>', 'pco2 | 41 | <none>']);
    const issue = node.issues.find((i) => i.check === 'decimal-comma');
    expect(issue?.fixes[0]?.edits[0]?.newText).toBe('7.35');
    expect(at(text, issue?.span)).toBe('7,35');
  });

  it('reports a comma before three digits as a thousands separator or a decimal comma where both readings are possible, offering both and preferring neither', () => {
    const text = 'place altitude 1,650 m';
    const issue = section(text).issues.find((i) => i.check === 'decimal-comma');
    expect(at(text, issue?.span)).toBe('1,650');
    expect(issue?.message).toContain('thousands separator');
    expect(issue?.fixes.map((f) => [f.edits[0]?.newText, f.preferred ?? false])).toEqual([['1650', false], ['1.650', false]]);
    // Bare: possible in a unit the field takes (1000 mL).
    expect(section('vent vt 1,000').issues[0]?.fixes.map((f) => f.edits[0]?.newText)).toEqual(['1000', '1.000']);
    // Where the thousands reading is impossible, the comma is a decimal comma as in any number.
    for (const plain of ['abg ph 7,352', 'vitals hr 1,000', 'vitals temp 38,400', 'place altitude 12,345 m']) {
      expect(section(plain).issues.map((i) => [i.check, i.fixes.length, i.fixes[0]?.preferred])).toEqual([['decimal-comma', 1, true]]);
    }
  });

  it('reads a pair as written: its text, span and numbers, the same on every read', () => {
    const text = 'vitals hr 80, bp 120/80, temp 37.1 C';
    const bp = section(text).items.find((i) => i.keyName === 'bp')!;
    expect(bp.value?.kind).toBe('pair');
    if (bp.value?.kind !== 'pair') return;
    expect(bp.value.text).toBe('120/80');
    expect(at(text, bp.value.span)).toBe('120/80');
    expect(bp.value.parts.map((p) => [p.value, p.text, at(text, p.span), p.decimalComma])).toEqual([[120, '120', '120', false], [80, '80', '80', false]]);
    expect(bp.value.parts).toEqual(bp.value.parts);
  });

  it('reports each decimal comma inside a pair, with its own fix', () => {
    const text = 'vitals bp 120,5/80,5';
    const node = section(text);
    const issues = node.issues.filter((i) => i.check === 'decimal-comma');
    expect(issues.map((i) => at(text, i.span))).toEqual(['120,5', '80,5']);
    expect(issues.map((i) => i.fixes[0]?.edits[0]?.newText)).toEqual(['120.5', '80.5']);
  });

  it('points a bad shorthand at the whole group', () => {
    const text = 'abg 1/2/3/4/5';
    expect(at(text, section(text).issues[0]?.span)).toBe('1/2/3/4/5');
  });

  it('keeps a key as written and names it in lower case; implied keys have no written key', () => {
    const keyed = section('vitals HR 80, Spo2 97 %').items;
    expect(keyed.map((i) => [i.key?.text, i.keyName, i.implied])).toEqual([['HR', 'hr', null], ['Spo2', 'spo2', null]]);
    const implied = section('oxygen cannula 2 L/min').items;
    expect(implied.map((i) => [i.key, i.keyName, i.implied])).toEqual([[null, 'device', 'device'], [null, 'flow', 'device-flow']]);
    expect(section('abg 7,31/52').items.map((i) => [i.keyName, i.implied, (i.value?.kind === 'number' && i.value.decimalComma)])).toEqual([['ph', 'shorthand', true], ['pco2', 'shorthand', false]]);
  });

  it('reports a key without a value and a value without a key', () => {
    expect(section('vitals hr, rr 12').issues.map((i) => i.check)).toEqual(['missing-value']);
    expect(section('vitals hr 80 90').issues.map((i) => i.check)).toEqual(['stray-text']);
    expect(section('vitals 80').issues.map((i) => i.check)).toEqual(['stray-text']);
  });

  it('reports an unknown section and offers the near section or the owner of a key', () => {
    const node = line('vitls hr 80');
    expect(node.kind).toBe('unknown');
    expect(node.issues[0]?.fixes.map((f) => f.title)).toContain('Change to `vitals`');
    const bare = line('hr 118');
    expect(bare.issues[0]?.fixes.map((f) => f.title)).toContain('Start the line with `vitals`');
  });
});

describe('a full stop at the end of the items', () => {
  it('reads the value before it, and reports the full stop lightly with a fix that removes it', () => {
    const text = 'vitals hr 80.';
    const node = section(text);
    expect(node.items.map((i) => summary(text, i))).toEqual(['hr | 80 | <none>']);
    expect(node.items[0]?.number).toBe(80);
    expect(node.issues.map((i) => [i.check, i.severity, at(text, i.span), i.message])).toEqual([
      ['stray-text', 'information', '.', '`80.` is read as `80`: a full stop at the end of the line is left out.'],
    ]);
    expect(node.issues[0]?.fixes).toEqual([{ title: 'Remove the full stop', edits: [{ span: { start: 12, end: 13 }, newText: '' }], preferred: true }]);
  });

  it('reads the last item of a list, a unit, a pair, a word, a device or a shorthand gas before it', () => {
    const cases: [string, string[]][] = [
      ['vitals hr 80, rr 18.', ['hr | 80 | <none>', 'rr | 18 | <none>']],
      ['vitals spo2 94%.', ['spo2 | 94 | %']],
      ['vitals temp 38.4 C.', ['temp | 38.4 | C']],
      ['abg po2 80 mm Hg.', ['po2 | 80 | mm Hg']],
      ['vitals bp 120/80.', ['bp | 120/80 | <none>']],
      ['vent mode VC.', ['mode | VC | <none>']],
      ['patient sex female.', ['sex | female | <none>']],
      ['oxygen room air.', ['device | room air | <none>']],
      ['oxygen cannula 2.', ['device | cannula | <none>', 'flow | 2 | <none>']],
      ['abg 7.28/56/71/26.', ['ph | 7.28 | <none>', 'pco2 | 56 | <none>', 'po2 | 71 | <none>', 'hco3 | 26 | <none>']],
      ['vitals hr 80.  # settled', ['hr | 80 | <none>']],
      ['vitals hr 80 .', ['hr | 80 | <none>']],
    ];
    for (const [text, expected] of cases) {
      const node = section(text);
      expect(node.items.map((i) => summary(text, i)), text).toEqual(expected);
      expect(node.issues.map((i) => [i.check, i.severity, at(text, i.span)]), text).toEqual([['stray-text', 'information', '.']]);
    }
    expect(section('vitals hr 80 .').issues[0]?.message).toBe('A full stop at the end of the line is not part of any item; the line is read without it.');
  });

  it('reads a time with a full stop glued to its end the same way; a label keeps its full stop', () => {
    const timeOf = (text: string): TimepointLine => {
      const node = parseNote(text).lines[0];
      if (node?.kind !== 'timepoint') throw new Error(`not a timepoint: ${text}`);
      return node;
    };
    const cases: [string, string, number | null, number | null][] = [
      ['@ 08:00.', 'clock', null, 480],
      ['@08:00.', 'clock', null, 480],
      ['@ +2h.', 'offset', null, 120],
      ['@ day 2.', 'day', 2, null],
      ['@ day 2 08:00.', 'clock', 2, 480],
    ];
    for (const [text, kind, day, minutes] of cases) {
      const node = timeOf(text);
      expect([node.time?.kind, node.time?.day, node.time?.minutes, node.label], text).toEqual([kind, day, minutes, null]);
      expect(node.issues.map((i) => [i.check, i.severity, i.span.start, i.span.end]), text).toEqual([['stray-text', 'information', text.length - 1, text.length]]);
    }
    expect(timeOf('@ 08:00.').issues[0]?.message).toBe('`08:00.` is read as `08:00`: a full stop at the end of the line is left out.');
    const labelled = timeOf('@ 08:00 arrived.');
    expect([labelled.time?.minutes, labelled.label?.text, labelled.issues]).toEqual([480, 'arrived.', []]);
    // Not a time without the full stop either: still an unreadable time.
    expect(timeOf('@ 25:00.').issues.map((i) => i.check)).toEqual(['bad-time']);
  });

  it('never changes a number: a decimal point followed by digits is part of it', () => {
    expect(section('vitals temp 37.5').items[0]?.number).toBe(37.5);
    expect(section('vitals temp 37.5').issues).toEqual([]);
    expect(section('abg be .5').items[0]?.number).toBe(0.5);
    expect(section('abg be .5.').items[0]?.number).toBe(0.5);
    expect(section('vitals temp 37.5.').items[0]?.number).toBe(37.5);
    expect(section('abg ph 7.').items[0]?.number).toBe(7);
  });

  it('is read only at the end of the line: in the middle it is still an unknown unit, and prose keeps its own', () => {
    const text = 'vitals hr 80. rr 18';
    expect(section(text).items.map((i) => summary(text, i))).toEqual(['hr | 80 | .', 'rr | 18 | <none>']);
    expect(section(text).issues).toEqual([]);
    expect(section('note settled overnight.').prose?.text).toBe('settled overnight.');
    expect(section('note settled overnight.').issues).toEqual([]);
    expect(timepoint('@ 08:00 arrival.').label?.text).toBe('arrival.');
    expect(line('vitals.').kind).toBe('unknown');
  });
});

describe('commas that separate nothing', () => {
  const reported = (text: string) => line(text).issues.filter((i) => i.check === 'stray-text').map((i) => [i.severity, at(text, i.span), i.fixes.map((f) => f.title)]);

  it('reports a comma at the start of a line or right after its first word, and reads the line without it', () => {
    expect(reported(', vitals hr 80')).toEqual([['information', ',', ['Remove the comma']]]);
    expect(reported('vitals , hr 80')).toEqual([['information', ',', ['Remove the comma']]]);
    expect(reported('vitals,hr 80')).toEqual([['information', ',', ['Remove the comma']]]);
    expect(reported('oxygen, cannula 2')).toEqual([['information', ',', ['Remove the comma']]]);
    expect(reported('note, settled')).toEqual([['information', ',', ['Remove the comma']]]);
    expect(reported(',, @ 08:00 ward')).toEqual([['information', ',,', ['Remove the commas']]]);
    expect(reported('@, 08:00 ward')).toEqual([['information', ',', ['Remove the comma']]]);
    expect(reported(' , ')).toEqual([['information', ',', ['Remove the comma']]]);
    // No fix that would empty the line: between the `\r` and `\n` of a note it would join two lines.
    expect(reported(', ,')).toEqual([['information', ', ,', []]]);
    const text = ', vitals hr 80';
    expect(section(text).items.map((i) => summary(text, i))).toEqual(['hr | 80 | <none>']);
    expect(line(text).issues[0]?.message).toBe('A comma at the start of the line separates nothing; the line is read without it.');
    expect(line('vitals , hr 80').issues[0]?.message).toBe('A comma right after `vitals` separates nothing; the line is read without it.');
    expect(line(text).issues[0]?.fixes[0]?.edits).toEqual([{ span: { start: 0, end: 1 }, newText: '' }]);
  });

  it('leaves a blank where the comma was glued to words on both sides, so they stay apart (`vitals,hr` is not `vitalshr`)', () => {
    expect(line('vitals,hr 80').issues[0]?.fixes[0]?.edits).toEqual([{ span: { start: 6, end: 7 }, newText: ' ' }]);
    expect(line('patient,7,35').issues.find((i) => i.check === 'stray-text')?.fixes[0]?.edits).toEqual([{ span: { start: 7, end: 8 }, newText: ' ' }]);
    // With a blank on either side, the comma goes alone.
    expect(line('vitals ,hr 80').issues[0]?.fixes[0]?.edits).toEqual([{ span: { start: 7, end: 8 }, newText: '' }]);
  });

  it('reports commas after a section word with nothing after them (`patient ,`), which the formatter would otherwise drop', () => {
    expect(reported('patient ,')).toEqual([['information', ',', ['Remove the comma']]]);
    expect(reported('patient ,,')).toEqual([['information', ',,', ['Remove the commas']]]);
    expect(reported('note ,')).toEqual([['information', ',', ['Remove the comma']]]);
    expect(reported('vitals ,  # later')).toEqual([['information', ',', ['Remove the comma']]]);
    expect(line('patient ,').issues[0]?.message).toBe('A comma right after `patient` separates nothing; the line is read without it.');
    // A comma after the last item is a separator the grammar allows.
    expect(reported('vitals hr 80,')).toEqual([]);
  });

  it('reports a second comma between two items (is a value missing?), and removes only the extra one', () => {
    const text = 'vitals hr 80, , rr 18';
    expect(section(text).items.map((i) => summary(text, i))).toEqual(['hr | 80 | <none>', 'rr | 18 | <none>']);
    expect(reported(text)).toEqual([['information', ',', ['Remove the extra comma']]]);
    expect(line(text).issues[0]?.fixes[0]?.edits).toEqual([{ span: { start: 14, end: 15 }, newText: '' }]);
    expect(reported('vitals hr 80,,, rr 18')).toEqual([['information', ',,', ['Remove the extra commas']]]);
    expect(reported('vitals hr 80,,')).toEqual([['information', ',', ['Remove the extra comma']]]);
    expect(reported('oxygen venturi,, fio2 28 %')).toEqual([['information', ',', ['Remove the extra comma']]]);
  });

  it('accepts one comma between items, after a lead, after the last item, and between a time and its label', () => {
    for (const text of ['vitals hr 80, rr 18', 'vitals hr 80, rr 18,', 'oxygen venturi, fio2 28 %', 'abg 7.28/56/71/26, be -2', '@ 08:00, ward', '@ day 2, 08:00', 'vitals hr 7,5']) {
      expect(reported(text), text).toEqual([]);
    }
  });
});

describe('timepoints', () => {
  it('reports a time written without its colon after `day N`, with a fix, instead of taking it into the label', () => {
    const text = '@ day 2 0800 handover';
    const node = timepoint(text);
    expect(node.label?.text).toBe('handover');
    expect(node.issues.map((i) => [i.check, at(text, i.span), i.fixes.map((f) => f.edits[0]?.newText)])).toEqual([['bad-time', '0800', ['08:00']]]);
    expect(timepoint('@ day 2 745').issues[0]?.fixes[0]?.edits[0]?.newText).toBe('07:45');
    expect(timepoint('@ day 2 2500 review').issues).toEqual([]);
  });

  it('reads `@ day N HH:MM label`', () => {
    const node = timepoint('@ day 2 07:40  arrival on the ward');
    expect(node.time).toMatchObject({ kind: 'clock', day: 2, minutes: 460, text: 'day 2 07:40' });
    expect(node.label?.text).toBe('arrival on the ward');
  });

  it('keeps a comma that ends a label, and the label runs to the comment', () => {
    const text = '@ day 1 08:00 arrival, then ward,  # ok';
    const node = timepoint(text);
    expect(node.label?.text).toBe('arrival, then ward,');
    expect(at(text, node.label?.span)).toBe('arrival, then ward,');
    expect(timepoint('@ 09:00 bed 4, side room,').label?.text).toBe('bed 4, side room,');
    expect(timepoint('@ 09:00,').label).toBeNull();
  });

  it('reads a day number written without a sign, and keeps the label as written', () => {
    const read = (text: string) => { const node = timepoint(text); return [node.time?.day ?? null, node.time?.text ?? null, node.label?.text ?? null, node.label && [node.label.span.start, node.label.span.end], node.issues.map((i) => i.message)]; };
    const noDay = ['After `day` write the day number, e.g. `@ day 2 08:00`.'];
    expect(read('@ day 02  ward round, then x-ray')).toEqual([2, 'day 02', 'ward round, then x-ray', [10, 32], []]);
    expect(read('@ day +2')).toEqual([null, null, null, null, noDay]);
    expect(read('@ day -1')).toEqual([null, null, null, null, noDay]);
    expect(read('@ day 2.5')).toEqual([null, null, null, null, noDay]);
    expect(read('@ day 2x')).toEqual([null, null, null, null, noDay]);
    // Whole numbers not written as integers are not day numbers either (the spec: `day` integer).
    for (const day of ['2.0', '2,0', '.0', '\u22120', '1e1']) expect(read(`@ day ${day}`), day).toEqual([null, null, null, null, noDay]);
  });

  it('reads `@ HH:MM`, `@HH:MM`, `@ day N` and offsets', () => {
    expect(timepoint('@ 07:40').time).toMatchObject({ kind: 'clock', day: null, minutes: 460 });
    expect(timepoint('@07:40 x').time).toMatchObject({ kind: 'clock', minutes: 460 });
    expect(timepoint('@ day 3').time).toMatchObject({ kind: 'day', day: 3, minutes: null });
    expect(timepoint('@ +2h30 later').time).toMatchObject({ kind: 'offset', minutes: 150 });
  });

  it('keeps each time form\'s text and span as written, a comment after it or not', () => {
    const cases: [string, string][] = [['@ day 2 07:40  ward', 'day 2 07:40'], ['@ 07:40', '07:40'], ['@07:40 x', '07:40'], ['@ day 3 # first day', 'day 3'], ['@  +2h30  later', '+2h30']];
    for (const [text, written] of cases) {
      const time = timepoint(text).time;
      expect(time?.text, text).toBe(written);
      expect(text.slice(time?.span.start, time?.span.end), text).toBe(written);
    }
  });

  it('reads offsets in days, hours and minutes', () => {
    expect(readOffset('+2h30')).toBe(150);
    expect(readOffset('+2h')).toBe(120);
    expect(readOffset('+45m')).toBe(45);
    expect(readOffset('+45min')).toBe(45);
    expect(readOffset('+1d')).toBe(1440);
    expect(readOffset('+1d6h')).toBe(1800);
    expect(readOffset('+90')).toBeNull();
    expect(readOffset('+h')).toBeNull();
    expect(readOffset('+30m2h')).toBeNull();
    expect(readOffset('+1d2h30')).toBe(1590);
    expect(readOffset('+36h')).toBe(2160);
    expect(readOffset('+90m')).toBe(90);
  });

  it('refuses an offset whose later part runs over (`+2h90`), and offers what it adds up to', () => {
    expect(readOffset('+2h90')).toBeNull();
    expect(readOffset('+1d30h')).toBeNull();
    expect(readOffset('+1d75m')).toBeNull();
    expect(readOffset('+2h059')).toBeNull();
    expect(readOffset('+2h59')).toBe(179);
    expect(readOffset('+1d23h59m')).toBe(2879);
    const text = '@ +2h90  review';
    const node = timepoint(text);
    expect(node.time).toBeNull();
    expect(node.issues.map((i) => [i.check, at(text, i.span), i.fixes.map((f) => f.edits[0]?.newText)])).toEqual([['bad-time', '+2h90', ['+3h30']]]);
    expect(node.issues[0]?.message).toBe('`+2h90` runs over: hours after days go from 0 to 23 and minutes after hours or days from 0 to 59. Did you mean `+3h30`?');
    expect(timepoint('@ +1d30h').issues[0]?.fixes[0]?.edits[0]?.newText).toBe('+2d6h');
    expect(timepoint('@ +1d90m').issues[0]?.fixes[0]?.edits[0]?.newText).toBe('+1d1h30m');
  });

  it('warns of an offset split by a blank (`+2h 30m`), which would read as +2h with a label, and offers it joined', () => {
    const text = '@ +2h 30m  walk';
    const node = timepoint(text);
    // The line still reads: the offset as written, the rest as the label.
    expect(node.time?.minutes).toBe(120);
    expect(node.label?.text).toBe('30m  walk');
    expect(node.issues.map((i) => [i.check, i.severity, at(text, i.span), i.fixes.map((f) => f.edits[0]?.newText)])).toEqual([['bad-time', 'warning', '+2h 30m', ['+2h30m']]]);
    expect(timepoint('@ +1d 2h').issues[0]?.fixes[0]?.edits[0]?.newText).toBe('+1d2h');
    // Not when the word is no offset part, when a comma separates it, or when joined it would not read.
    expect(timepoint('@ +2h 30 min later').issues).toEqual([]);
    expect(timepoint('@ +2h, 30m later').issues).toEqual([]);
    expect(timepoint('@ +90m 2h').issues).toEqual([]);
  });

  it('reports extra commas between a time and its label (information), as on item lines, and keeps one', () => {
    const text = '@ 08:00,, arrival';
    const node = timepoint(text);
    expect(node.label?.text).toBe('arrival');
    expect(node.issues.map((i) => [i.check, i.severity, at(text, i.span), i.fixes[0]?.edits[0]?.newText])).toEqual([['stray-text', 'information', ',', '']]);
    expect(timepoint('@ 09:00 , , review').issues.map((i) => i.check)).toEqual(['stray-text']);
    expect(timepoint('@ 10:00, review, then ward').issues).toEqual([]);
  });

  it('reads clock times and refuses impossible ones', () => {
    expect(readClock('00:00')).toBe(0);
    expect(readClock('7:05')).toBe(425);
    expect(readClock('23:59')).toBe(1439);
    expect(readClock('24:00')).toBeNull();
    expect(readClock('12:60')).toBeNull();
    expect(readClock('1200')).toBeNull();
  });

  it('reports a missing or unreadable time and a calendar date', () => {
    expect(timepoint('@').issues.map((i) => i.check)).toEqual(['bad-time']);
    expect(timepoint('@ 25:10').issues.map((i) => i.check)).toEqual(['bad-time']);
    expect(timepoint('@ +soon').issues.map((i) => i.check)).toEqual(['bad-time']);
    const date = timepoint('@ 2026-03-04 08:00');
    expect(date.issues[0]?.message).toMatch(/relative days/);
    expect(timepoint('@ day x').issues.map((i) => i.check)).toEqual(['bad-time']);
  });
});

describe('numbers typed with digits of another script', () => {
  // Fullwidth digits come from East Asian input methods, Arabic-Indic and Devanagari ones from
  // keyboards of those scripts. They are not read as numbers (the format's numbers are 0–9), and
  // were reported as "not a key", which named nothing the writer could recognise.
  const CASES: readonly [string, string, string][] = [
    ['vitals hr ８０', '８０', '80'],
    ['vitals rr ١٨', '١٨', '18'],
    ['vitals spo2 ९५%', '९५', '95'],
    ['vitals temp ３７．５ C', '３７．５', '37.5'],
    ['vitals bp １２０／８０', '１２０／８０', '120/80'],
    ['abg ph ٧٫٤', '٧٫٤', '7.4'],
    ['abg 7.4/40/٩٠', '7.4/40/٩٠', '7.4/40/90'],
    ['vitals hr 𝟖𝟎', '𝟖𝟎', '80'],
    ['vitals hr ٨٠, rr 18', '٨٠', '80'],
  ];
  for (const [text, written, meant] of CASES) {
    it(`${text}: says which digits, and offers to write ${meant}, which reads the value`, () => {
      const node = section(text);
      const issue = node.issues.find((i) => i.message.includes('digits other than 0–9'));
      expect(issue?.message).toBe(`\`${written}\` is written with digits other than 0–9, which are not read as a number; write \`${meant}\`.`);
      expect(at(text, issue!.span)).toBe(written);
      const fix = issue!.fixes[0]!;
      expect(fix.preferred).toBe(true);
      const fixed = text.slice(0, fix.edits[0]!.span.start) + fix.edits[0]!.newText + text.slice(fix.edits[0]!.span.end);
      const after = section(fixed);
      expect(after.issues.filter((i) => i.check !== 'stray-text' || !i.message.includes('full stop'))).toEqual([]);
      expect(after.items.every((i) => i.value !== null)).toBe(true);
    });
  }

  it('a word without such digits is not a key, as before', () => {
    // A number in brackets is stray text that says where such a bracket is read (after a blood pressure).
    expect(section('vitals hr 80, (80)').issues.map((i) => i.message)).toEqual(['`(80)` is not read: a number in brackets is read only right after a blood pressure, with no comma between, as its measured mean (`bp 120/80 (93)`). Write other values as `key value`, e.g. `map 93`.']);
    expect(section('vitals hr 80, (a0)').issues.map((i) => i.message)).toEqual(['`(a0)` is not a key; write items as `key value`, e.g. `hr 118`.']);
  });
});
