/**
 * The blanks of the format: the characters that separate words on a line. This list is the one
 * definition: the lexer reads these characters as blanks (`isBlank`), the TextMate grammar is
 * built with them (grammar/build-grammar.mjs reads `BLANKS`), the format spec in grammar/README.md
 * lists them, and the check of unusual blanks (PN107) reports those other than a space or a tab.
 *
 * They are the characters Unicode gives the White_Space property, but for the line ends `\n` and
 * `\r` (a line never holds one), and the zero-width no-break space U+FEFF, a byte-order mark where
 * it opens a file and an invisible blank anywhere else. Zero-width characters without the property
 * (U+200B, U+2060) are not blanks: they are part of the word they stand in.
 */
export interface BlankChar {
  /** The character's UTF-16 code unit (every blank is in the Basic Multilingual Plane). */
  readonly code: number;
  /** How a message names it. */
  readonly name: string;
}

/** In the order of their codes. */
export const BLANKS: readonly BlankChar[] = Object.freeze([
  { code: 0x0009, name: 'tab' },
  { code: 0x000b, name: 'vertical tab' },
  { code: 0x000c, name: 'form feed' },
  { code: 0x0020, name: 'space' },
  { code: 0x0085, name: 'next-line control character' },
  { code: 0x00a0, name: 'no-break space' },
  { code: 0x1680, name: 'Ogham space mark' },
  { code: 0x2000, name: 'en quad' },
  { code: 0x2001, name: 'em quad' },
  { code: 0x2002, name: 'en space' },
  { code: 0x2003, name: 'em space' },
  { code: 0x2004, name: 'three-per-em space' },
  { code: 0x2005, name: 'four-per-em space' },
  { code: 0x2006, name: 'six-per-em space' },
  { code: 0x2007, name: 'figure space' },
  { code: 0x2008, name: 'punctuation space' },
  { code: 0x2009, name: 'thin space' },
  { code: 0x200a, name: 'hair space' },
  { code: 0x2028, name: 'line separator' },
  { code: 0x2029, name: 'paragraph separator' },
  { code: 0x202f, name: 'narrow no-break space' },
  { code: 0x205f, name: 'medium mathematical space' },
  { code: 0x3000, name: 'ideographic space' },
  { code: 0xfeff, name: 'zero-width no-break space (byte-order mark)' },
].map((b) => Object.freeze(b)));

/** The blanks a note is expected to hold: the others are reported (PN107). */
export function isPlainBlank(code: number): boolean {
  return code === 0x20 || code === 0x09;
}

/**
 * Blanks up to U+3000, by code (one read for each character the lexer looks at beyond ASCII); the
 * few beyond it are compared one by one.
 */
const TABLE_END = 0x3001;
const TABLE: Uint8Array = (() => {
  const table = new Uint8Array(TABLE_END);
  for (const b of BLANKS) if (b.code < TABLE_END) table[b.code] = 1;
  return table;
})();
const BEYOND_TABLE: readonly number[] = Object.freeze(BLANKS.filter((b) => b.code >= TABLE_END).map((b) => b.code));

export function isBlank(code: number): boolean {
  if (code < TABLE_END) return TABLE[code] === 1;
  for (let k = 0; k < BEYOND_TABLE.length; k++) if (BEYOND_TABLE[k] === code) return true;
  return false;
}

/** The name of a blank for messages, with its code (`no-break space (U+00A0)`). */
export function blankName(code: number): string {
  const hex = `U+${code.toString(16).toUpperCase().padStart(4, '0')}`;
  const known = BLANKS.find((b) => b.code === code);
  return known ? `${known.name} (${hex})` : hex;
}

/** A run of blanks, as a pattern made from `BLANKS` (only ever used by `replace`, which starts it afresh). */
const BLANK_RUN = new RegExp(`[${BLANKS.map((b) => `\\u${b.code.toString(16).padStart(4, '0')}`).join('')}]+`, 'g');

/** The text with each run of blanks written as one space (`mm\u00A0Hg` and `mm  Hg` as `mm Hg`). */
export function squeezeBlanks(text: string): string {
  return text.replace(BLANK_RUN, ' ');
}
