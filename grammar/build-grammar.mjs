// Generates the editor files of the `.pneu` format from the core's registries:
//   grammar/pneumark.tmLanguage.json  (TextMate grammar, scope source.pneumark)
//   grammar/snippets.json             (VS Code snippets; choice lists come from the registry)
//
//   npm run build && node grammar/build-grammar.mjs           # write both files
//   npm run build && node grammar/build-grammar.mjs --check   # exit 1 when a file is stale
//
// `buildGrammar` and `buildSnippets` are pure: registries in, plain objects out. The test
// tests/grammar/grammar-up-to-date.test.ts calls them with the registries from the sources.
//
// Regex rules kept here (a ReDoS check reads every regex of the project):
// - every pattern is valid in both Oniguruma and ECMAScript: no \G, \h, (?i), atomic groups
//   or possessive quantifiers; case-insensitivity is spelled out as [aA] classes;
// - no group repeated by *, + or {n,m} contains a quantifier (only `?` wraps quantifiers);
// - tokens are delimited with one-character lookarounds (chunk start / chunk end) rather
//   than with variable-length scans;
// - `\s` in the patterns below stands for a blank of the format: `withBlanks` writes each one as
//   the class of the core's `BLANKS` (blanks.ts), so the grammar and the lexer share one list
//   (`\s` itself differs between engines: Oniguruma's has no U+FEFF, ECMAScript's no U+0085).
import { createRequire } from 'node:module';
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

// ── regex helpers ──────────────────────────────────────────────────────────

/** `\uHHHH`: a code unit as both Oniguruma and ECMAScript (without flags) read it in a pattern. */
function hex4(code) {
  return `\\u${code.toString(16).toUpperCase().padStart(4, '0')}`;
}

/**
 * The inside of a character class of the format's blanks (`BLANKS` of the core), with the line
 * ends `\n` and `\r`: a line never holds one, but the TextMate engine gives each line with a
 * `\n` after it, which no chunk may take in. Runs of consecutive codes are written as ranges.
 */
export function blankClassBody(blanks) {
  const codes = [...new Set([0x0a, 0x0d, ...blanks.map((b) => b.code)])].sort((a, b) => a - b);
  let out = '';
  for (let i = 0; i < codes.length; ) {
    let j = i;
    while (j + 1 < codes.length && codes[j + 1] === codes[j] + 1) j++;
    out += j === i ? hex4(codes[i]) : j === i + 1 ? hex4(codes[i]) + hex4(codes[j]) : `${hex4(codes[i])}-${hex4(codes[j])}`;
    i = j + 1;
  }
  return out;
}

/**
 * A pattern with each `\s` written as the format's blanks: inside a character class (`[^\s,#]`)
 * as the class's body, elsewhere as a class of its own. Reads escapes and classes once; `\S` is
 * refused (write `[^\s]`).
 */
export function withBlanks(source, body) {
  let out = '';
  let inClass = false;
  for (let i = 0; i < source.length; i++) {
    const c = source[i];
    if (c === '\\') {
      const next = source[i + 1];
      if (next === 'S') throw new Error(`\\S in a pattern: write [^\\s] instead (${source})`);
      out += next === 's' ? (inClass ? body : `[${body}]`) : c + next;
      i++;
      continue;
    }
    if (!inClass && c === '[') {
      inClass = true;
      // A `]` right after `[` or `[^` is a character of the class, not its end.
      const lead = source.startsWith('[^', i) ? 2 : 1;
      const head = source.slice(i, i + lead + (source[i + lead] === ']' ? 1 : 0));
      out += head;
      i += head.length - 1;
      continue;
    }
    if (inClass && c === ']') inClass = false;
    out += c;
  }
  return out;
}

/** A grammar rule (and the rules inside it) with `withBlanks` applied to its patterns. */
function blanksInRule(rule, body) {
  if (Array.isArray(rule)) return rule.map((r) => blanksInRule(r, body));
  if (rule === null || typeof rule !== 'object') return rule;
  const out = {};
  for (const [key, value] of Object.entries(rule)) {
    out[key] = (key === 'match' || key === 'begin' || key === 'end') && typeof value === 'string' ? withBlanks(value, body) : blanksInRule(value, body);
  }
  return out;
}

/** Escapes regex syntax characters (the same set works for Oniguruma and ECMAScript). */
function esc(text) {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/** A literal word matched case-insensitively without flags: `pco2` → `[pP][cC][oO]2`; blanks → `\s+`. */
export function ci(word) {
  let out = '';
  for (const ch of word) {
    if (/\s/.test(ch)) {
      if (!out.endsWith('\\s+')) out += '\\s+';
      continue;
    }
    const lo = ch.toLowerCase();
    const up = ch.toUpperCase();
    out += lo !== up && lo.length === 1 && up.length === 1 ? `[${lo}${up}]` : esc(ch);
  }
  return out;
}

/** Case-insensitive alternation of words, longest first, duplicates (ignoring case) removed. */
function alt(words) {
  const seen = new Map();
  for (const w of words) {
    const key = w.toLowerCase().replace(/\s+/g, ' ');
    if (!seen.has(key)) seen.set(key, w);
  }
  // Longest first; ties in code-unit order (not locale order, so the output is the same everywhere).
  const list = [...seen.values()].sort((a, b) => b.length - a.length || (a.toLowerCase() < b.toLowerCase() ? -1 : a.toLowerCase() > b.toLowerCase() ? 1 : 0));
  return `(?:${list.map(ci).join('|')})`;
}

/**
 * Where a chunk starts: after the line start, a blank or a comma, except a comma between two
 * digits (a decimal comma, which the lexer keeps inside the chunk).
 */
const START = '(?<![^\\s,])(?!(?<=[0-9],)[0-9])';
/**
 * Where a chunk ends: the line end, a blank, a comma or a comment, except a comma between two
 * digits, which the lexer keeps inside the chunk (a decimal comma).
 */
const END = '(?![^\\s,#]|(?<=[0-9]),[0-9])';
/**
 * Where a full stop ends the items of a line: before blanks and a comment, or the line end. The
 * parser cuts it from the word it ends (`hr 80.`, `temp 38.4 C.`, `mode VC.`) and reports it.
 */
const FULL_STOP = '\\.(?=\\s*(?:#|$))';
const FULL_STOP_AHEAD = `(?=${FULL_STOP})`;
/**
 * Where a chunk read as a key, a value or a unit ends: as END, but never just after a full stop
 * that ends the line, and also just before one (the parser reads `80.` there as `80`).
 */
const VALUE_END = `(?:${END}(?!(?<=\\.)\\s*(?:#|$))|${FULL_STOP_AHEAD})`;
/** The rest of a chunk, decimal commas included. */
const CHUNK_REST = '(?:[^\\s,#]|(?<=[0-9]),(?=[0-9]))*';
/** A number as the lexer reads it: sign, digits, a decimal point or comma between digits, or `.5`. */
const NUM = '[-+−]?(?:[0-9]+(?:[.,][0-9]+)?|\\.[0-9]+)';
/** The start of a number: a chunk that starts so is a value, never a key or a unit. */
const NUM_START = '[-+−]?\\.?[0-9]';
/**
 * How a key starts, as the parser reads one: a letter. The parser takes any letter that has a
 * case (`startsLikeKey`); here the Latin, Greek and Cyrillic ones, written out as characters
 * (no \\p{L} or \\x{...}, so the class reads the same in Oniguruma and ECMAScript). A chunk in
 * key position that starts otherwise (`/`, `-`, `(sitting)`, `°C`) is stray text for the parser.
 */
const KEY_START = '[A-Za-zµÀ-ÖØ-öø-ɏͰ-ϿЀ-ԯ]';
/** A number read as far as the lexer reads it (a shorter number would leave digits behind). */
const NUM_MAX = '[-+−]?(?:[0-9]+[.,][0-9]+|\\.[0-9]+|[0-9]+(?![.,][0-9]))(?![0-9])';
/**
 * A chunk that starts with a number but is no value for the parser: what follows the number
 * starts with a character and a digit, and the chunk holds a slash (`96/58mmHg`, `1/2/x`).
 */
const UNREADABLE = `${NUM_MAX}(?=[^\\s#][0-9])(?=(?:[^\\s,#/]|,(?=[0-9]))*/)[^\\s#]${CHUNK_REST}`;
/** A clock the parser accepts: 00:00 to 23:59, one or two hour digits. */
const CLOCK = '(?:[01]?[0-9]|2[0-3]):[0-5][0-9]';
/** Three or four digits that make a time of day without its colon (`0800`, `745`), as the parser reports them after a day. */
/**
 * A time on the 12-hour clock that the 24-hour clock reads otherwise (`9:00 pm`, `10:15pm`,
 * `12:30 a.m.`): the parser reports it (PN104) and leaves the time unknown.
 */
const TWELVE_HOUR = '(?:(?:0?[1-9]|1[01]):[0-5][0-9]\\s*[pP]\\.?[mM]\\.?|12:[0-5][0-9]\\s*[aA]\\.?[mM]\\.?)';
const CLOCK_WITHOUT_COLON = '(?:[01][0-9]|2[0-3]|[0-9])[0-5][0-9]';
/**
 * An offset the parser accepts: +1d, +1d6h, +1d6h30, +1d30m, +2h, +2h30, +2h30m, +45m, +45min. A
 * part after a larger one stays within it (hours after days 0–23, minutes 0–59, two digits at most).
 */
const MIN = '(?:[mM][iI][nN]|[mM])';
const HOURS_IN_DAY = '(?:[01]?[0-9]|2[0-3])';
const MINUTES_IN_HOUR = '[0-5]?[0-9]';
const OFFSET = `\\+(?:[0-9]+[dD](?:${HOURS_IN_DAY}[hH](?:${MINUTES_IN_HOUR}${MIN}?)?|${MINUTES_IN_HOUR}${MIN})?|[0-9]+[hH](?:${MINUTES_IN_HOUR}${MIN}?)?|[0-9]+${MIN})`;
/** Prose: from a character that is not a blank to the last such character before a comment. */
const PROSE = '[^\\s#](?:[^#]*[^\\s#])?';
/** Blanks and commas before the first chunk of a line (the lexer skips both). */
const LEAD = '^[\\s,]*';

const sc = (name) => `${name}.pneumark`;

// ── registry queries ───────────────────────────────────────────────────────

function sectionNames(section) {
  return [section.id, ...section.aliases];
}

function keysOf(FIELDS, sectionId) {
  const keys = [];
  for (const f of FIELDS) if (sectionId === null || f.sections.includes(sectionId)) keys.push(...f.aliases);
  return [...new Set(keys)];
}

/**
 * Unit spellings a note can write. Spellings with a blank (`mm hg`, `cm h2o`) are left out unless
 * `twoWords`; the parser reads them after blanks (`80 mm Hg`) and glued to a number (`80mm Hg`).
 */
export function unitSpellings(UNITS, twoWords = false) {
  const out = [];
  for (const u of UNITS) for (const s of [u.id, ...u.aliases]) if (twoWords || !/\s/.test(s)) out.push(s);
  return [...new Set(out)];
}

function deviceWords(FIELDS, kind = null) {
  const device = FIELDS.find((f) => f.id === 'device');
  const oxygenKeys = new Set(keysOf(FIELDS, 'oxygen'));
  // As in the parser: a device word that is also a key of the oxygen section is read as the key.
  // `kind`: only the words of a high-flow device ('hfnc'), of a Venturi mask ('venturi'), or of
  // the others ('other'); every word with none.
  const of = (canonical) => (canonical === 'hfnc' || canonical === 'venturi' ? canonical : 'other');
  return Object.entries(device?.words ?? {}).filter(([w, canonical]) => !oxygenKeys.has(w) && (kind === null || of(canonical) === kind)).map(([w]) => w);
}

// ── rule builders ──────────────────────────────────────────────────────────
//
// A rule's regex and its captures are assembled together: `cap(scope, regex)` is a capture
// group, numbered in the order the groups open, so the numbers never drift from the regex.

function cap(capture, regex) {
  return { capture: typeof capture === 'string' ? { name: sc(capture) } : capture, regex };
}

/** Joins strings and `cap` parts into `{ regex, captures }`. Plain strings hold no capture groups. */
function assemble(...parts) {
  const captures = {};
  let count = 0;
  const walk = (part) => {
    if (typeof part === 'string') {
      if (/(^|[^\\])\((?!\?)/.test(part)) throw new Error(`capture group in a plain part: ${part}`);
      return part;
    }
    if (Array.isArray(part)) return part.map(walk).join('');
    const index = ++count;
    captures[index] = part.capture;
    return `(${walk(part.regex)})`;
  };
  const regex = parts.map(walk).join('');
  return { regex, captures };
}

const numeric = { name: sc('constant.numeric'), patterns: [{ include: '#decimal-comma' }] };
/** Text the parser reports as stray (PN105): a value with no key, or punctuation where a key goes. */
const STRAY = 'invalid.illegal.stray';
const strayNumber = { name: `${sc('constant.numeric')} ${sc(STRAY)}`, patterns: [{ include: '#decimal-comma' }] };

/**
 * A unit after blanks: a known unit (one of two words too, `mm Hg`), unless it is also a key of
 * the section and a number follows it (then it is that key, as in the parser: `pco2 40 ph 7.4`),
 * or an unknown word of at most 12 characters that is not a key of the section and is not
 * followed by a number (the parser keeps it as the unit, to report it).
 */
function spacedUnit(units, keys) {
  return [
    '\\s+(?:',
    // A unit spelling that is also a key of the section, with a number after it, is that key (`pco2 40 ph 7.4`).
    `(?!${keys}${END}\\s+${NUM_START})`, cap('keyword.other.unit', units.spaced), VALUE_END,
    // Up to 12 characters of one chunk, a comma between digits included (`mmol/l(9,5)`), as the lexer cuts it.
    `|(?!${keys}${VALUE_END})(?=[A-Za-z%°µμ])`, cap('keyword.other.unit.unknown', '(?:[^\\s,#]|(?<=[0-9]),(?=[0-9])){1,12}'), VALUE_END, `(?!\\s+${NUM_START})`,
    ')',
  ];
}

/**
 * A number with its unit: glued (`89%`, `38.4C`, `80mm Hg`) or after blanks (`89 %`). The unit may
 * be left out unless `required` (`8 L/min`: a Venturi mask's second number, which must have one).
 */
function numberWithUnit(units, keys, required = false) {
  return [
    cap(numeric, NUM),
    '(?:',
    cap('keyword.other.unit', units.glued), VALUE_END,
    '|', cap('keyword.other.unit.unknown', `[^\\s,#]${CHUNK_REST}`), VALUE_END,
    '|', spacedUnit(units, keys),
    required ? ')' : ')?',
  ];
}

/** A number with a percentage, glued or after blanks (`60%`, `60 %`): after `hfnc`, its FiO2. */
function numberWithPercent(percent) {
  return [cap(numeric, NUM), '\\s*', cap('keyword.other.unit', percent), VALUE_END];
}

/**
 * The numbers after a high-flow device without a key, as the parser reads them: a flow and a
 * percentage (its FiO2), in either order (`hfnc 40 L/min 60 %`, `hfnc 60 % 40`), or one of them.
 */
function highFlowNumbers(units, keys, percent) {
  const notPercent = `(?!${NUM}\\s*${percent}${VALUE_END})`;
  return [
    '(?:', numberWithPercent(percent), '(?:\\s+', notPercent, numberWithUnit(units, keys), ')?',
    '|', numberWithUnit(units, keys), '(?:\\s+', numberWithPercent(percent), ')?', ')',
  ];
}

/**
 * A bare number after `venturi` that the parser reads as its FiO2 (`venturiNumberKey`): a fraction
 * above 0 up to 1, or one of the percentages of the Venturi settings, 24 to 60 (`VENTURI_PERCENT`
 * in the parser; the agreement test of the grammar and the parser compares the two).
 */
const VENTURI_BARE_FIO2 = '\\+?(?:0*\\.[0-9]*[1-9][0-9]*|0+,[0-9]*[1-9][0-9]*|0*1(?:[.,]0+)?|0*(?:2[4-9]|[3-5][0-9])(?:[.,][0-9]+)?|0*60(?:[.,]0+)?)';

/**
 * The numbers after a Venturi mask without a key, as the parser reads them: its FiO2 and its flow,
 * each said by its unit, in either order (`venturi 28 % 8 L/min`, `venturi 8 L/min 28 %`), a flow
 * in L/min after a bare setting too (`venturi 28 8 L/min`), or one number. A second number of the
 * same kind as the first, or a bare one, is not read.
 */
function venturiNumbers(units, keys, percent) {
  const notPercent = `(?!${NUM}\\s*${percent}${VALUE_END})`;
  return [
    '(?:', numberWithPercent(percent), '(?:\\s+', notPercent, numberWithUnit(units, keys, true), ')?',
    '|', cap(numeric, VENTURI_BARE_FIO2), '\\s+', notPercent, numberWithUnit(units, keys, true),
    '|', `(?!${VENTURI_BARE_FIO2}${VALUE_END})`, numberWithUnit(units, keys), '\\s+', numberWithPercent(percent),
    '|', numberWithUnit(units, keys), ')',
  ];
}

/** Blanks and commas between the section word and the lead value (commas scoped as separators). */
const leadGap = cap({ patterns: [{ include: '#item-separator' }] }, '[\\s,]+');

const pair = (scope) => ({ name: sc(scope), patterns: [{ include: '#pair-parts' }] });
const shorthand = { name: sc('meta.shorthand-gas'), patterns: [{ include: '#shorthand-parts' }] };

/**
 * `min` to `max` numbers joined by slashes (optional parts nest, so no group repeats a
 * quantifier). `sep` is `/` within one chunk, or a slash with blanks around it (`120 / 80`),
 * which the parser reads for a pair's key and for a shorthand gas.
 */
function slashGroup(min, max, sep = '/') {
  let optional = '';
  for (let i = max; i > min; i--) optional = `(?:${sep}${NUM}${optional})?`;
  return Array.from({ length: min }, () => NUM).join(sep) + optional;
}
const SPACED = '\\s+/\\s+';
const SHORTHAND = slashGroup(2, 4);
const SHORTHAND_SPACED = slashGroup(2, 4, SPACED);
const PAIR = slashGroup(2, 2);
const PAIR_SPACED = slashGroup(2, 2, SPACED);
/** A slash group the parser reads as a pair but no field uses: 3 or more numbers. */
const LONG_PAIR = slashGroup(3, 12);
const LONG_PAIR_SPACED = slashGroup(3, 12, SPACED);

/**
 * What may follow a slash group: a unit glued to its last number (`120/80mmHg`; it starts with a
 * letter, `%`, `°` or a micro sign and holds no slash, as the parser reads it), or the end of the chunk and a
 * unit after blanks.
 */
function groupTail(units, keys) {
  return [
    '(?:', cap('keyword.other.unit', units.glued), VALUE_END,
    '|', cap('keyword.other.unit.unknown', '[A-Za-z%°µμ][^\\s,#/]*'), VALUE_END,
    '|', VALUE_END, '(?:', spacedUnit(units, keys), ')?',
    ')',
  ];
}

/** The lead of an abg or vbg line: a shorthand gas and the unit of its pressures. */
function shorthandLead(units, keys) {
  return ['(?:', leadGap, '(?:', cap(shorthand, SHORTHAND), groupTail(units, keys), '|', cap(shorthand, SHORTHAND_SPACED), groupTail(units, keys), '))?'];
}

/**
 * The unit spellings that one key of the section alone takes (`L/min` on an oxygen line, the
 * flow's), as the parser tells them (`onlyKeyTaking`): a number with such a unit after blanks and
 * no key is one stray text, its unit included (`oxygen 4 L/min`). Spellings are compared without
 * case, as the parser looks them up; null where there is none.
 */
function unitsOfOneKey(FIELDS, UNITS, sectionId) {
  if (sectionId === null) return null;
  const fold = (s) => s.toLowerCase().replace(/\s+/g, ' ');
  const unitsOf = new Map();
  for (const u of UNITS) for (const spelling of [u.id, ...u.aliases]) {
    const key = fold(spelling);
    unitsOf.set(key, [...(unitsOf.get(key) ?? []), u.id]);
  }
  const out = [];
  for (const u of UNITS) for (const spelling of [u.id, ...u.aliases]) {
    const ids = unitsOf.get(fold(spelling));
    // A range (`target 88-92`, `join: 'dash'`) is never one number: it owns no unit here.
    const owners = FIELDS.filter((f) => f.sections.includes(sectionId) && f.join !== 'dash' && ids.some((id) => f.units?.includes(id)));
    if (owners.length === 1) out.push(spelling);
  }
  return out.length === 0 ? null : alt(out);
}

/** Values written where no key comes before them (the parser reports them), or a misplaced shorthand. */
function strayRules(gas, units, keys, owned) {
  const slash = assemble(START, cap(STRAY, gas ? SHORTHAND : PAIR), END);
  // The number keeps its scope, with the stray scope innermost so that themes show it as invalid.
  // The parser reports the whole chunk, a unit glued to the number included (`80mmHg`, `0.0/1e3`),
  // and a unit after blanks that one key of the section alone takes (`4 L/min` on an oxygen line).
  const strayUnit = { name: `${sc('keyword.other.unit')} ${sc(STRAY)}` };
  const spacedOwned = owned === null ? [] : ['|\\s+', `(?!${keys}${END}\\s+${NUM_START})`, cap(strayUnit, owned), VALUE_END];
  const number = assemble(START, cap(strayNumber, NUM), '(?:', cap(strayUnit, units.glued), END, '|', cap(STRAY, `[^\\s,#]${CHUNK_REST}`), ...spacedOwned, ')?');
  const punctuation = assemble(START, `(?!${NUM_START})(?!${KEY_START})`, cap(STRAY, `[^\\s,#]${CHUNK_REST}`), VALUE_END);
  return [
    {
      comment: gas ? 'A shorthand gas not at the start of the line: stray text for the parser (PN105).' : 'Numbers joined by a slash with no key before them: stray text for the parser (PN105).',
      match: slash.regex,
      captures: slash.captures,
    },
    {
      comment: gas ? 'Numbers joined by slashes that do not read as a shorthand gas (more than 4 numbers, or not numbers).' : 'A chunk that starts with a number but does not read as a value.',
      match: `${START}(?:${LONG_PAIR}${END}|${UNREADABLE})`,
      name: sc(gas ? 'invalid.illegal.shorthand-gas' : 'invalid.illegal.pair'),
    },
    { comment: 'A number with no key before it: stray text for the parser (PN105).', match: number.regex, captures: number.captures },
    { comment: 'A chunk in key position that does not start with a letter (`/`, `-`, `(sitting)`): never a key, stray text for the parser (PN105).', match: punctuation.regex, captures: punctuation.captures },
  ];
}

/** `key value [unit]`: a key of the section (or an unknown word in key position) and its value. */
function keyValueRule(units, keys) {
  const rule = assemble(
    START,
    '(?:', cap('variable.other.key', keys), VALUE_END, '|', `(?=${KEY_START})`, cap('variable.other.key.unknown', `[^\\s,#]${CHUNK_REST}`), VALUE_END, ')',
    '(?:\\s+(?:',
    cap(pair('meta.pair'), PAIR), groupTail(units, keys),
    '|', cap('invalid.illegal.pair', LONG_PAIR), groupTail(units, keys),
    '|', cap('invalid.illegal.pair', UNREADABLE),
    '|', numberWithUnit(units, keys),
    '))?',
  );
  return { comment: 'An item: a key, then its value: a number, or two numbers joined by a slash (bp 96/58), then a unit.', match: rule.regex, captures: rule.captures };
}

/**
 * Two numbers joined by one hyphen or en dash, the range a key whose pair is so joined takes
 * (`target 88-92`, the field registry's `join: 'dash'`); no sign after the dash, as the parser
 * reads it. Blanks may stand around the dash (`88 - 92`, `88 – 92`), the first number then starting
 * with a digit, as the parser reads it too (`readSpacedDashGroup`).
 */
const RANGE_NUMBER = '(?:[0-9]+(?:[.,][0-9]+)?|\\.[0-9]+)';
const RANGE = `(?:${RANGE_NUMBER}[-–]|[0-9]+(?:[.,][0-9]+)?\\s*[-–]\\s*)[0-9]+(?:[.,][0-9]+)?`;
const range = { name: sc('meta.pair'), patterns: [{ include: '#range-parts' }] };

/** A key that takes a range (`target 88-92`, `target 88–92 %`), its unit glued to it or after blanks. */
function rangeRule(rangeKeys, units, keys) {
  const rule = assemble(START, cap('variable.other.key', rangeKeys), END, '\\s+', cap(range, RANGE), groupTail(units, keys));
  return { comment: 'A range: two numbers joined by a hyphen or an en dash (target 88-92).', match: rule.regex, captures: rule.captures };
}

/** A key that takes a pair, with the pair written with blanks around its slash (`bp 120 / 80`). */
function spacedPairRule(pairKeys, units, keys) {
  const rule = assemble(
    START, cap('variable.other.key', pairKeys), END,
    '\\s+(?:',
    cap(pair('meta.pair'), PAIR_SPACED), groupTail(units, keys),
    '|', cap('invalid.illegal.pair', LONG_PAIR_SPACED), groupTail(units, keys),
    ')',
  );
  return { comment: 'A pair written with blanks around its slash (bp 120 / 80).', match: rule.regex, captures: rule.captures };
}

/**
 * A number in brackets as the parser reads one (`bracketAt`): `(`, blanks, a number, a unit
 * (glued or after blanks, any word: the parser reports an unknown one), blanks and `)` at the end
 * of a chunk.
 */
const BRACKET_CLOSED = `\\(\\s*${NUM_MAX}(?:\\s*[^\\s,#\\(\\)]+)?\\s*\\)${VALUE_END}`;
/**
 * A bracket whose `)` has more glued to it (`(93)x`, `(93)(94)`): the parser reads no mean from it
 * and reports it as one word, to the end of its chunk.
 */
const BRACKET_GLUED = `\\(\\s*${NUM_MAX}(?:\\s*[^\\s,#\\(\\)]+)?\\s*\\)(?=[^\\s,#])${CHUNK_REST}`;
/**
 * A bracket the parser reads as not closed: a number after `(` that no `)` follows after its word
 * (`(93`, `(93 mmHg`, `(93 hr 80`). The parser's finding takes a known unit after the number when
 * it is no key of the section, and the rest of the chunk it ends in.
 */
function bracketUnclosed(units, keys) {
  return `\\(\\s*${NUM_MAX}(?!(?:\\s*[^\\s,#\\(\\)]+)?\\s*\\))(?:\\s*(?!${keys}${END})${units.spaced}(?=[\\s,\\(\\)#]|$))?${CHUNK_REST}`;
}

/** A number in brackets where the parser reads none: after a value that is no blood pressure, or after a comma (PN105). */
function strayBracketRule(units, keys) {
  const rule = assemble(START, cap(STRAY, `(?:${BRACKET_CLOSED}|${BRACKET_GLUED}|${bracketUnclosed(units, keys)})`));
  return { comment: 'A number in brackets that follows no blood pressure (hr 80 (93)): stray text for the parser (PN105).', match: rule.regex, captures: rule.captures };
}

/**
 * A blood pressure with its measured mean in brackets (`bp 120/80 (93)`, `bp 120 / 80 mmHg (93)`,
 * `bp 120/80 (93 mmHg)`, `bp 120/80(93)`, `bp 120/80 ( 93 )`): the parser reads the number in
 * brackets as the mean arterial pressure, with its unit. The bracket may be glued to the pair or to
 * its unit; one not closed (`bp 120/80 (93`) or with more glued after its `)` (`bp 120/80 (93)x`)
 * is reported (PN105) after a pair that is read.
 */
function bracketedMeanRule(pairKeys, units, keys) {
  const rule = assemble(
    START, cap('variable.other.key', pairKeys), END,
    '\\s+(?:', cap(pair('meta.pair'), PAIR), '|', cap(pair('meta.pair'), PAIR_SPACED), ')',
    // The pair's unit: glued to its last number (cut where the bracket starts), or after blanks.
    '(?:', cap('keyword.other.unit', units.glued), `(?=\\s*\\()`,
    '|', cap('keyword.other.unit.unknown', '[A-Za-z%°µμ][^\\s,#/\\(\\)]*'),
    '|\\s+(?:', cap('keyword.other.unit', units.spaced), `(?=\\s*\\()`,
    `|(?!${keys}${VALUE_END})`, cap('keyword.other.unit.unknown', '[A-Za-z%°µμ][^\\s,#\\(\\)]{0,11}'),
    '))?',
    '\\s*(?:',
    cap('punctuation.definition.mean.begin', '\\('), '\\s*', cap(numeric, NUM_MAX),
    '(?:\\s*(?:', cap('keyword.other.unit', units.spaced), '(?=\\s*\\))', '|', cap('keyword.other.unit.unknown', '[^\\s,#\\(\\)]+'), '))?',
    '\\s*', cap('punctuation.definition.mean.end', '\\)'), VALUE_END,
    '|', cap(STRAY, bracketUnclosed(units, keys)),
    '|', cap(STRAY, BRACKET_GLUED),
    ')',
  );
  return { comment: 'A blood pressure with its measured mean in brackets (bp 120/80 (93), bp 120/80 (93 mmHg)).', match: rule.regex, captures: rule.captures };
}

/** A key that takes a word (`sex female`, `mode VC`, `gas kPa`, `device cannula`). */
function wordItemRule(field, sectionKeys) {
  const known = Object.keys(field.words ?? {});
  const rule = assemble(
    START, cap('variable.other.key', alt(field.aliases)), VALUE_END,
    '(?:\\s+(?:',
    cap('constant.language', alt(known)), VALUE_END,
    `|(?!${sectionKeys}${VALUE_END})`, cap(field.openWords ? 'constant.other.word' : 'constant.other.word.unknown', `[^\\s,#]${CHUNK_REST}`), VALUE_END,
    '))?',
  );
  return {
    comment: `\`${field.aliases[0]}\` takes a word: ${[...new Set(Object.values(field.words ?? {}))].join(', ')}${field.openWords ? ', or any word' : ''}.`,
    match: rule.regex,
    captures: rule.captures,
  };
}

function itemPatterns({ FIELDS, UNITS }, sectionId, units) {
  const keys = alt(keysOf(FIELDS, sectionId));
  const gas = sectionId === 'abg' || sectionId === 'vbg';
  const wordFields = FIELDS.filter((f) => f.kind === 'word' && sectionId !== null && f.sections.includes(sectionId));
  const pairKeys = [...new Set(FIELDS.filter((f) => f.kind === 'pair' && f.join !== 'dash' && sectionId !== null && f.sections.includes(sectionId)).flatMap((f) => f.aliases))];
  const rangeKeys = [...new Set(FIELDS.filter((f) => f.kind === 'pair' && f.join === 'dash' && sectionId !== null && f.sections.includes(sectionId)).flatMap((f) => f.aliases))];
  return [
    { include: '#comment' },
    { include: '#item-separator' },
    { include: '#full-stop' },
    strayBracketRule(units, keys),
    ...strayRules(gas, units, keys, unitsOfOneKey(FIELDS, UNITS, sectionId)),
    ...wordFields.map((f) => wordItemRule(f, keys)),
    ...(pairKeys.length > 0 ? [bracketedMeanRule(alt(pairKeys), units, keys), spacedPairRule(alt(pairKeys), units, keys)] : []),
    ...(rangeKeys.length > 0 ? [rangeRule(alt(rangeKeys), units, keys)] : []),
    keyValueRule(units, keys),
  ];
}

/** A timepoint: `@`, then `day N [HH:MM]`, `HH:MM` or an offset, then an optional label. */
function timepointRule() {
  const GAP = '[\\s,]+';
  const begin = assemble(
    LEAD, cap('keyword.operator.timepoint', '@'), '[\\s,]*(?:',
    // day N [HH:MM]; after `day`, a chunk that is no day number, or no clock after it, is marked
    cap('keyword.other.day', ci('day')), '(?:', GAP, '(?:',
    cap('constant.other.time', '[0-9]+'), '(?:', GAP, '(?:', cap('invalid.illegal.time', TWELVE_HOUR), END, '|', cap('constant.other.time', CLOCK), VALUE_END, '|', cap('invalid.illegal.time', `[0-9][^\\s,#:]*:${CHUNK_REST}`),
    // a time of day without its colon (`@ day 2 0800`): reported with a fix, not read as the label
    '|', cap('invalid.illegal.time', CLOCK_WITHOUT_COLON), END, '))?', VALUE_END,
    '|', cap('invalid.illegal.time', `[^\\s,#]${CHUNK_REST}`),
    '))?', VALUE_END,
    // a time may end the line with a full stop glued on (`@ 08:00.`): read without it, as after items
    '|', cap('invalid.illegal.time', TWELVE_HOUR), END,
    '|', cap('constant.other.time', CLOCK), VALUE_END,
    '|', cap('constant.other.time', OFFSET), VALUE_END,
    // an offset, clock or date that does not read, or any chunk starting with a digit
    '|', cap('invalid.illegal.time', `[0-9+]${CHUNK_REST}`),
    ')?',
  );
  return {
    comment: 'A timepoint: `@`, then `day N [HH:MM]`, `HH:MM` or `+2h30`, then an optional label. Times the parser does not accept are marked.',
    begin: begin.regex,
    beginCaptures: begin.captures,
    end: '$',
    name: sc('meta.timepoint'),
    // A full stop right after the time is the one the parser leaves out; one after a label is prose.
    // A comma right after the time separates it from the label and is not part of it (`@ 08:00, arrival`).
    patterns: [
      { include: '#comment' },
      { match: `\\G${FULL_STOP}`, name: sc('punctuation.terminator.full-stop') },
      { match: '\\G\\s*(,)', captures: { 1: { name: sc('punctuation.separator.item') } } },
      { match: PROSE, name: sc('entity.name.section.timepoint') },
    ],
  };
}

function unknownBegin() {
  const begin = assemble(LEAD, cap('variable.other.section.unknown', `[^\\s,#@]${CHUNK_REST}`));
  return { begin: begin.regex, beginCaptures: begin.captures };
}

// ── the grammar ────────────────────────────────────────────────────────────

/**
 * Builds the TextMate grammar from the registries (`SECTIONS`, `FIELDS`, `UNITS` and `BLANKS` as
 * exported by the core). Pure: the same registries give the same object.
 */
export function buildGrammar({ SECTIONS, FIELDS, UNITS, BLANKS }) {
  if (!Array.isArray(BLANKS) || BLANKS.length === 0) throw new Error('buildGrammar needs the blanks of the format (BLANKS of the core)');
  const blanks = blankClassBody(BLANKS);
  // A unit may be of two words (`mm Hg`), glued to its number or after blanks, as the parser reads it.
  const spellings = alt(unitSpellings(UNITS, true));
  const units = { glued: spellings, spaced: spellings };
  // The spellings of a percentage (`%`, `percent`, `pct`), as the parser tells one (`isPercent`).
  const percent = alt(UNITS.filter((u) => u.id === '%').flatMap((u) => [u.id, ...u.aliases]));
  const repository = {
    comment: {
      comment: '`#` starts a comment that runs to the end of the line, anywhere on the line.',
      match: '(#).*',
      name: sc('comment.line.number-sign'),
      captures: { 1: { name: sc('punctuation.definition.comment') } },
    },
    'decimal-comma': {
      comment: 'A comma between two digits is read as a decimal point and reported (PN103).',
      match: '(?<![0-9])[-+−]?[0-9]+,[0-9]+',
      name: sc('invalid.deprecated.decimal-comma'),
    },
    'item-separator': { match: ',', name: sc('punctuation.separator.item') },
    'full-stop': {
      comment: 'A full stop that ends the items of a line: read without it, and reported lightly (PN105).',
      match: FULL_STOP,
      name: sc('punctuation.terminator.full-stop'),
    },
    'shorthand-parts': {
      patterns: [
        { match: NUM, captures: { 0: numeric } },
        { match: '/', name: sc('punctuation.separator.shorthand') },
      ],
    },
    'pair-parts': {
      patterns: [
        { match: NUM, captures: { 0: numeric } },
        { match: '/', name: sc('punctuation.separator.pair') },
      ],
    },
    'range-parts': {
      patterns: [
        { match: '[0-9]+(?:[.,][0-9]+)?|\\.[0-9]+', captures: { 0: numeric } },
        { match: '[-–]', name: sc('punctuation.separator.range') },
      ],
    },
    timepoint: timepointRule(),
  };

  const patterns = [{ include: '#comment' }, { include: '#timepoint' }];
  for (const section of SECTIONS) {
    const names = alt(sectionNames(section));
    const ruleName = `section-${section.id}`;
    patterns.push({ include: `#${ruleName}` });
    const sectionWord = cap('keyword.other.section', names);
    if (section.kind === 'prose') {
      const begin = assemble(LEAD, sectionWord, END);
      repository[ruleName] = {
        begin: begin.regex,
        beginCaptures: begin.captures,
        end: '$',
        name: sc(`meta.line.${section.id}`),
        patterns: [{ include: '#comment' }, { match: PROSE, name: sc('string.unquoted.prose') }],
      };
      continue;
    }
    const itemsName = `items-${section.id}`;
    const keys = alt(keysOf(FIELDS, section.id));
    const lead = {
      // An oxygen line starts with the device; a number right after it is its flow (or CPAP level).
      // After `hfnc`, a percentage is its FiO2, beside its flow (`hfnc 40 L/min 60 %`); after
      // `venturi`, its FiO2 and its flow, each said by its unit (`venturi 28 8 L/min`).
      oxygen: ['(?:', leadGap, '(?:',
        cap('constant.language', alt(deviceWords(FIELDS, 'hfnc'))), VALUE_END, '(?:\\s+', highFlowNumbers(units, keys, percent), ')?',
        '|', cap('constant.language', alt(deviceWords(FIELDS, 'venturi'))), VALUE_END, '(?:\\s+', venturiNumbers(units, keys, percent), ')?',
        '|', cap('constant.language', alt(deviceWords(FIELDS, 'other'))), VALUE_END, '(?:\\s+', numberWithUnit(units, keys), ')?', '))?'],
      abg: shorthandLead(units, keys),
      vbg: shorthandLead(units, keys),
    }[section.id];
    const begin = assemble(LEAD, sectionWord, END, lead ?? '');
    repository[ruleName] = {
      ...(section.id === 'oxygen' ? { comment: 'An oxygen line starts with the device; a number right after it is its flow (or CPAP level); after hfnc, a flow and a percentage, its FiO2; after venturi, its FiO2 and its flow.' } : {}),
      ...(lead && section.id !== 'oxygen' ? { comment: 'A blood gas line may start with the shorthand pH/PCO2/PO2/HCO3 and the unit of its pressures.' } : {}),
      begin: begin.regex,
      beginCaptures: begin.captures,
      end: '$',
      name: sc(`meta.line.${section.id}`),
      patterns: [{ include: `#${itemsName}` }],
    };
    repository[itemsName] = { patterns: itemPatterns({ FIELDS, UNITS }, section.id, units) };
  }

  patterns.push({ include: '#unknown-line' });
  repository['unknown-line'] = {
    comment: 'A line that does not start with a section or `@`: the parser reports it (PN101); its items are still shown.',
    ...unknownBegin(),
    end: '$',
    name: sc('meta.line.unknown'),
    patterns: [{ include: '#items-any' }],
  };
  repository['items-any'] = { patterns: itemPatterns({ FIELDS }, null, units) };

  return {
    $schema: 'https://raw.githubusercontent.com/martinring/tmlanguage/master/tmlanguage.json',
    information_for_contributors: [
      'Generated by grammar/build-grammar.mjs from the registries in server/src/core/fields/.',
      'Do not edit by hand: run `npm run build && node grammar/build-grammar.mjs`.',
    ],
    name: 'Pneumark',
    scopeName: 'source.pneumark',
    fileTypes: ['pneu'],
    patterns: blanksInRule(patterns, blanks),
    repository: blanksInRule(repository, blanks),
  };
}

// ── snippets ───────────────────────────────────────────────────────────────

/** Escapes a word for a snippet choice list (`,`, `|` and `\` are special there). */
function choice(words) {
  return words.map((w) => w.replace(/[\\,|$}]/g, '\\$&')).join(',');
}

/**
 * VS Code snippets. Placeholders for measured values are words in angle brackets (`<VT>`), not
 * numbers, so a snippet left half-filled is reported (one PN102 finding per placeholder) instead of
 * reading as plausible data.
 */
export function buildSnippets({ FIELDS }) {
  const words = (id) => [...new Set(Object.values(FIELDS.find((f) => f.id === id)?.words ?? {}))];
  // Devices with a flow first (the snippet goes on with the flow); room air last.
  const devices = [...words('device').filter((w) => w !== 'room air'), 'room air'];
  const modes = words('mode');
  const col = (section) => section.padEnd(10);
  return {
    'Pneumark: timepoint (day and clock)': {
      prefix: ['tpday', 'timepoint'],
      body: [`@ day \${1:N} \${2:$CURRENT_HOUR:$CURRENT_MINUTE}  \${3:label}`, '$0'],
      description: 'A new timepoint on a relative day: @ day N HH:MM  label',
    },
    'Pneumark: timepoint (offset)': {
      prefix: ['tpoffset', 'timepoint'],
      body: ['@ +${1|30m,1h,2h,2h30,6h,12h,1d|}  ${2:label}', '$0'],
      description: 'A new timepoint after the previous one: @ +2h30  label',
    },
    'Pneumark: arterial gas (shorthand)': {
      prefix: ['abgshort', 'gasline'],
      body: [`${col('abg')}\${1:<pH>}/\${2:<PaCO2>}/\${3:<PaO2>}/\${4:<HCO3>}\${5: \${6|mmHg,kPa|}}\${7:, be \${8:<BE>}, lactate \${9:<lactate>}}`, '$0'],
      description: 'An arterial gas as pH/PaCO2/PaO2/HCO3 [unit], then further items',
    },
    'Pneumark: ventilator settings': {
      prefix: ['ventline', 'ventilator'],
      body: [`${col('vent')}mode \${1|${choice(modes)}|}, vt \${2:<VT>} mL, rate \${3:<rate>}, peep \${4:<PEEP>}, fio2 \${5:<FiO2>}\${6:, plateau \${7:<Pplat>}, peak \${8:<Ppeak>}}`, '$0'],
      description: 'A ventilator line: mode, tidal volume, rate, PEEP, FiO2 and the pressures read',
    },
    'Pneumark: patient header': {
      prefix: ['header', 'patientline'],
      body: [`${col('patient')}age \${1:<age>} y, sex \${2|female,male|}, height \${3:<height>} cm, weight \${4:<weight>} kg`, '$0'],
      description: 'The patient line of the header (no names or identifiers)',
    },
    'Pneumark: oxygen therapy': {
      prefix: ['oxyline', 'oxygenline'],
      body: [`${col('oxygen')}\${1|${choice(devices)}|}\${2: \${3:<flow>} L/min}\${4:, fio2 \${5:<FiO2>}}`, '$0'],
      description: 'An oxygen line: the device, its flow and FiO2 (delete the flow and FiO2 for room air)',
    },
    'Pneumark: vital signs': {
      prefix: ['vitalsline'],
      body: [`${col('vitals')}hr \${1:<HR>}, rr \${2:<RR>}, spo2 \${3:<SpO2>} %, temp \${4:<temp>} C, bp \${5:<sys>}/\${6:<dia>}`, '$0'],
      description: 'A vitals line: heart rate, respiratory rate, SpO2, temperature, blood pressure',
    },
  };
}

// ── files ──────────────────────────────────────────────────────────────────

/** The text written to a JSON file: two-space indentation and a final newline. */
export function toJsonText(value) {
  return `${JSON.stringify(value, null, 2)}\n`;
}

const here = dirname(fileURLToPath(import.meta.url));
export const GRAMMAR_PATH = join(here, 'pneumark.tmLanguage.json');
export const SNIPPETS_PATH = join(here, 'snippets.json');

/** Expected contents of the generated files, by path. */
export function generatedFiles(registries) {
  return [
    { path: GRAMMAR_PATH, text: toJsonText(buildGrammar(registries)) },
    { path: SNIPPETS_PATH, text: toJsonText(buildSnippets(registries)) },
  ];
}

function main() {
  const require = createRequire(import.meta.url);
  let core;
  try {
    core = require(join(here, '..', 'dist', 'core.js'));
  } catch {
    console.error('dist/core.js is missing: run `npm run build` first.');
    process.exit(2);
  }
  const check = process.argv.includes('--check');
  let stale = 0;
  for (const file of generatedFiles(core)) {
    let current = null;
    try {
      current = readFileSync(file.path, 'utf8');
    } catch {
      current = null;
    }
    if (current === file.text) continue;
    if (check) {
      console.error(`${file.path} is out of date: run \`node grammar/build-grammar.mjs\`.`);
      stale++;
    } else {
      writeFileSync(file.path, file.text);
      console.log(`wrote ${file.path}`);
    }
  }
  process.exit(stale > 0 ? 1 : 0);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) main();
