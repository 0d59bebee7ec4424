/**
 * fast-check generators of notes built from the registries (sections, keys, units, device and
 * mode words) with the mess people type: odd spacing, tabs and no-break spaces, optional and
 * doubled commas, glued units, case variants, decimal commas, comments, prose with emoji,
 * timepoints in every form, broken lines, blank lines, and mixed line endings; commas where
 * they separate nothing (at the start of a line, after its first word, at its end), and a full
 * stop that ends a line; a number in brackets after a value (a blood pressure's mean, or stray).
 */
import fc from 'fast-check';
import { fieldsInSection, type FieldDef } from '../../server/src/core/fields/registry';
import { SECTIONS, type SectionId } from '../../server/src/core/fields/sections';
import { UNITS } from '../../server/src/core/fields/units';
import { noteLine } from '../helpers/arbitraries';

const blank = fc.constantFrom(' ', ' ', ' ', '  ', '   ', '\t', '\u00A0', ' \t ');
const gap = fc.array(blank, { minLength: 1, maxLength: 2 }).map((b) => b.join(''));
const maybeGap = fc.array(blank, { maxLength: 2 }).map((b) => b.join(''));

/** A word in its spelling, or upper- or title-cased (spellings must survive formatting). */
const cased = (word: string) => fc.constantFrom(word, word.toUpperCase(), word.charAt(0).toUpperCase() + word.slice(1));

const proseWord = fc.oneof(
  fc.constantFrom('arrival', 'on', 'the', 'ward', 'review', 'after', 'café', 'naïve', '😀', 'x²', '—', '7.5', 'ok?', 'a,b', 'plan:', '(stable)', '→'),
  fc.string({ minLength: 1, maxLength: 5 }).filter((s) => !/[#\r\n\s]/.test(s)),
);
const prose = fc.array(proseWord, { minLength: 1, maxLength: 5 }).chain((ws) => fc.array(gap, { minLength: ws.length, maxLength: ws.length }).map((gs) => ws.map((w, i) => (i === 0 ? w : gs[i]! + w)).join('')));

export const comment = fc.tuple(fc.constantFrom('#', '# ', '#  '), fc.oneof(prose, fc.constant(''), fc.constant('expect: PN201')), fc.constantFrom('', ' ', '  ', '\t')).map(([h, t, tail]) => `${h}${t}${tail}`);

const number = fc.oneof(
  fc.integer({ min: 0, max: 300 }).map(String),
  fc.double({ min: -30, max: 800, noNaN: true }).map((n) => n.toFixed(1)),
  fc.double({ min: 0, max: 1, noNaN: true }).map((n) => n.toFixed(2)),
  fc.constantFrom('7.35', '7,35', '.5', '-2', '+3', '0.21', '100', '9.5', '1e3'),
);

function unitSpellings(field: FieldDef): string[] {
  const ids = field.units ?? [];
  const spellings = UNITS.filter((u) => ids.includes(u.id)).flatMap((u) => [u.id === '%sat' ? '%' : u.id, ...u.aliases]);
  return spellings.length > 0 ? spellings : ['mmHg'];
}

function valueOf(field: FieldDef): fc.Arbitrary<string> {
  if (field.kind === 'word') return fc.constantFrom(...Object.keys(field.words ?? { x: 'x' }), 'Unknownword').chain(cased);
  if (field.kind === 'pair') return fc.tuple(number, number).map(([a, b]) => `${a}/${b}`);
  return number;
}

const unknownUnit = fc.constantFrom('mmhgg', 'µg', 'bananas', 'kpa2');

function itemOf(field: FieldDef): fc.Arbitrary<string> {
  const key = fc.constantFrom(...field.aliases).chain(cased);
  const unit = field.kind === 'word' ? fc.constant('') : fc.oneof(
    { weight: 3, arbitrary: fc.constant('') },
    { weight: 3, arbitrary: fc.tuple(gap, fc.constantFrom(...unitSpellings(field))).map(([g, u]) => g + u) },
    { weight: 1, arbitrary: fc.constantFrom(...unitSpellings(field)) }, // glued: 89%
    { weight: 1, arbitrary: fc.tuple(gap, unknownUnit).map(([g, u]) => g + u) },
  );
  // A number in brackets after the value: the measured mean after a blood pressure (`bp 120/80 (93)`,
  // with a unit, glued, with blanks inside, not closed), stray text after any other value.
  const bracket = field.kind === 'word' ? fc.constant('') : fc.oneof(
    { weight: 12, arbitrary: fc.constant('') },
    { weight: 1, arbitrary: fc.tuple(maybeGap, fc.constantFrom('(93)', '(93 mmHg)', '(93mmHg)', '( 93 )', '(12 kPa)', '(93', '(93 mmHg', '(9,5)', '(93 mm Hg)', '(93)x')).map(([g, b]) => g + b) },
  );
  return fc.tuple(key, gap, valueOf(field), unit, bracket).map(([k, g, v, u, b]) => `${k}${g}${v}${u}${b}`);
}

/** Before a line's first word, or between it and the next: blanks, sometimes a comma that separates nothing. */
const indentOrComma = fc.oneof({ weight: 8, arbitrary: maybeGap }, { weight: 1, arbitrary: fc.constantFrom(',', ' , ', ',,') });
const gapOrComma = fc.oneof({ weight: 8, arbitrary: gap }, { weight: 1, arbitrary: fc.constantFrom(',', ', ', ' ,') });
/** How the items of a line end: mostly as they are; sometimes a comma or a full stop. */
const itemsEnd = fc.oneof({ weight: 8, arbitrary: fc.constant('') }, { weight: 1, arbitrary: fc.constantFrom(',', ' ,', '.', ' .', '..') });

const separator = fc.oneof({ weight: 4, arbitrary: fc.constantFrom(', ', ',', ' , ') }, { weight: 2, arbitrary: gap }, { weight: 1, arbitrary: fc.constantFrom(',, ', ' ,  ,') });

const SECTION_WORDS: Readonly<Record<string, readonly string[]>> = Object.fromEntries(SECTIONS.map((s) => [s.id, [s.id, ...s.aliases]]));

function lead(section: SectionId): fc.Arbitrary<string> {
  if (section === 'abg' || section === 'vbg') {
    return fc.oneof(
      { weight: 2, arbitrary: fc.constant('') },
      { weight: 2, arbitrary: fc.tuple(fc.array(number, { minLength: 2, maxLength: 4 }), fc.constantFrom('', ' kPa', ' mmHg', ' kpa')).map(([ns, u]) => `${ns.join('/')}${u}`) },
    );
  }
  if (section === 'oxygen') {
    const device = fc.constantFrom('room air', 'room   air', 'air', 'cannula', 'mask', 'venturi', 'hfnc', 'niv', 'cpap', 'nc');
    const flow = fc.oneof(
      fc.constant(''),
      fc.tuple(gap, fc.integer({ min: 1, max: 60 }).map(String), fc.constantFrom('', ' L/min', 'L/min', ' lpm', ' cmH2O')).map((p) => p.join('')),
    );
    return fc.oneof(
      { weight: 1, arbitrary: fc.constant('') },
      { weight: 3, arbitrary: fc.tuple(device, flow).map(([d, f]) => `${d}${f}`) },
    );
  }
  return fc.constant('');
}

const sectionIds = SECTIONS.map((s) => s.id).filter((id) => id !== 'note');

export const sectionLine: fc.Arbitrary<string> = fc.constantFrom(...sectionIds).chain((section) => {
  const fields = fieldsInSection(section).filter((f) => f.id !== 'device');
  const items = fields.length > 0 ? fc.array(fc.constantFrom(...fields).chain(itemOf), { maxLength: 5 }) : fc.constant([] as string[]);
  return fc.tuple(indentOrComma, fc.constantFrom(...(SECTION_WORDS[section] ?? [section])).chain(cased), gapOrComma, lead(section), items, fc.array(separator, { minLength: 6, maxLength: 6 }), itemsEnd, fc.oneof(fc.constant(''), fc.tuple(maybeGap, comment).map(([g, c]) => `${g} ${c}`)), maybeGap)
    .map(([indent, word, g, l, its, seps, end, c, tail]) => {
      const parts = [l, ...its].filter((p) => p.length > 0);
      const body = parts.map((p, i) => (i === 0 ? p : seps[i % seps.length]! + p)).join('');
      return `${indent}${word}${body ? g + body + end : ''}${c}${tail}`;
    });
});

export const noteProseLine = fc.tuple(indentOrComma, fc.constantFrom('note', 'text', 'comment', 'NOTE'), gapOrComma, prose, fc.oneof(fc.constant(''), comment.map((c) => `  ${c}`)), maybeGap).map((p) => p.join(''));

const time = fc.oneof(
  fc.tuple(fc.constantFrom('day', 'Day', 'DAY'), gap, fc.integer({ min: 0, max: 9 }).map(String), fc.oneof(fc.constant(''), fc.tuple(gap, fc.constantFrom('07:40', '8:05', '23:59', '00:00', '25:10')).map((p) => p.join('')))).map((p) => p.join('')),
  fc.constantFrom('07:40', '14:50', '0:15', '+2h30', '+45m', '+1d', '+90min', '+2h', '+x', '2024-01-02'),
);

export const timepointLine = fc.tuple(indentOrComma, fc.constantFrom('@', '@ ', '@  ', '@\t', '@,', '@ , '), time, fc.oneof(fc.constant(''), fc.tuple(gapOrComma, prose).map((p) => p.join('')), fc.constantFrom(',', ' ,')), fc.oneof(fc.constant(''), comment.map((c) => `   ${c}`)), maybeGap).map(([i, at, t, l, c, tail]) => `${i}${at}${t}${l}${c}${tail}`);

const otherLine = fc.oneof(
  fc.constantFrom('', '', '   ', '\t', ',', ' , ,', '# a comment', '   # indented comment  ', 'vitls hr 100', 'hr 118, rr 26', 'vitals hr, rr 18', 'abg 7.28/56/71/26/-2', 'vitals hr 88 120'),
  noteLine,
);

export const messyLine = fc.oneof(
  { weight: 6, arbitrary: sectionLine },
  { weight: 2, arbitrary: timepointLine },
  { weight: 1, arbitrary: noteProseLine },
  { weight: 2, arbitrary: otherLine },
);

const eolChoice = fc.constantFrom('\n', '\r\n', '\r');

/** A note of generated lines with one line ending, or (sometimes) a mix of them. */
export const messyNote: fc.Arbitrary<string> = fc.tuple(fc.array(messyLine, { maxLength: 25 }), eolChoice, fc.boolean(), fc.array(eolChoice, { minLength: 25, maxLength: 25 }), fc.boolean())
  .map(([lines, e, mixed, eols, bom]) => {
    const text = lines.map((l, i) => (i === 0 ? l : (mixed ? eols[i]! : e) + l)).join('');
    return bom ? `\uFEFF${text}` : text;
  });
