/** fast-check generators of notes: valid, nearly valid, and arbitrary text. */
import fc from 'fast-check';
import { FIELDS } from '../../server/src/core/fields/registry';
import { SECTIONS } from '../../server/src/core/fields/sections';
import { UNITS } from '../../server/src/core/fields/units';

const words = [...SECTIONS.map((s) => s.id), ...FIELDS.flatMap((f) => f.aliases), ...UNITS.map((u) => u.id), 'room', 'air', 'cannula', 'VC', 'female', 'day', 'kPa'];

export const token = fc.oneof(
  fc.constantFrom(...words),
  fc.double({ min: -1000, max: 1000, noNaN: true }).map((n) => String(Math.round(n * 100) / 100)),
  fc.constantFrom('7,35', '96/58', '7.28/56/71/26', '1/2/3/4/5', '@', '#', ',', '%', '+2h30', '07:40', '25:99', '−3', '.5', '\t', '\uFEFF', '😀', 'é', '\u00A0'),
  fc.string({ maxLength: 6 }),
);

export const noteLine = fc.tuple(fc.array(token, { maxLength: 12 }), fc.constantFrom(' ', ', ', '  ', ',')).map(([t, sep]) => t.join(sep));

export const eol = fc.constantFrom('\n', '\r\n', '\r');

/** A note made of plausible tokens in random order (nearly valid). */
export const nearlyValidNote = fc.tuple(fc.array(noteLine, { maxLength: 30 }), eol).map(([lines, e]) => lines.join(e));

/** Arbitrary text, including unpaired surrogates and control characters. */
export const anyText = fc.oneof(fc.string({ maxLength: 400, unit: 'binary' }), fc.string({ maxLength: 400 }), nearlyValidNote);
