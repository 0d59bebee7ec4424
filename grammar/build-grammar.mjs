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
//   than with variable-length scans.
import { createRequire } from 'node:module';
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

// ── regex helpers ──────────────────────────────────────────────────────────

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
  const list = [...seen.values()].sort((a, b) => b.length - a.length || a.toLowerCase().localeCompare(b.toLowerCase()));
  return `(?:${list.map(ci).join('|')})`;
}

/** Preceded by the line start, a blank or a comma: where a chunk may start. */
const START = '(?<![^\\s,])';
/** Followed by the line end, a blank, a comma or a comment: where a chunk ends. */
const END = '(?![^\\s,#])';
/** A number as the lexer reads it: sign, digits, a decimal point or comma between digits, or `.5`. */
const NUM = '[-+−]?(?:[0-9]+(?:[.,][0-9]+)?|\\.[0-9]+)';
/** The start of a number (for "not followed by a number"). */
const NUM_START = '[-+−]?\\.?[0-9]';
/** A clock the parser accepts: 00:00 to 23:59, one or two hour digits. */
const CLOCK = '(?:[01]?[0-9]|2[0-3]):[0-5][0-9]';
/** An offset the parser accepts: +1d, +1d6h, +1d6h30, +1d30m, +2h, +2h30, +2h30m, +45m, +45min. */
const MIN = '(?:[mM][iI][nN]|[mM])';
const OFFSET = `\\+(?:[0-9]+[dD](?:[0-9]+[hH](?:[0-9]+${MIN}?)?|[0-9]+${MIN})?|[0-9]+[hH](?:[0-9]+${MIN}?)?|[0-9]+${MIN})`;
/** Prose: from a character that is not a blank to the last such character before a comment. */
const PROSE = '[^\\s#](?:[^#]*[^\\s#])?';

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
 * Unit spellings a note can write. Spellings with a blank (`mm hg`, `cm h2o`) are left out:
 * the lexer splits chunks at blanks, so the parser never reads them as one unit.
 */
export function unitSpellings(UNITS) {
  const out = [];
  for (const u of UNITS) for (const s of [u.id, ...u.aliases]) if (!/\s/.test(s)) out.push(s);
  return [...new Set(out)];
}

function deviceWords(FIELDS) {
  const device = FIELDS.find((f) => f.id === 'device');
  const oxygenKeys = new Set(keysOf(FIELDS, 'oxygen'));
  // As in the parser: a device word that is also a key of the oxygen section is read as the key.
  return Object.keys(device?.words ?? {}).filter((w) => !oxygenKeys.has(w));
}

// ── rule builders ──────────────────────────────────────────────────────────

const numeric = { name: sc('constant.numeric'), patterns: [{ include: '#decimal-comma' }] };
const unit = { name: sc('keyword.other.unit') };
const unknownUnit = { name: sc('keyword.other.unit.unknown') };

/**
 * What may follow a value after blanks: a known unit (always, as in the parser, even when the
 * word is also a key), or an unknown word that is not a key of the section and is not
 * followed by a number (the parser keeps it as the unit, to report it). Two capture groups.
 */
function spacedUnit(units, keys) {
  return `\\s+(?:(${units})${END}|(?!${keys}${END})([^\\s,#0-9.+\\-−][^\\s,#]{0,11})${END}(?!\\s+${NUM_START}))`;
}

function numberRule(units, keys) {
  return {
    comment: 'A number, with a unit glued to it (89%) or after blanks (89 %).',
    match: `${START}(${NUM})(?:(${units})${END}|([^\\s,#]+)|${spacedUnit(units, keys)})?`,
    captures: { 1: numeric, 2: unit, 3: unknownUnit, 4: unit, 5: unknownUnit },
  };
}

function slashRules(kind, units, keys) {
  const gas = kind === 'shorthand';
  const group = gas ? `${NUM}/${NUM}(?:/${NUM})?(?:/${NUM})?` : `${NUM}/${NUM}`;
  return [
    {
      comment: gas ? 'Shorthand gas: pH/PCO2/PO2/HCO3 (2 to 4 numbers), optionally a unit for the pressures.' : 'A pair of numbers, such as a blood pressure 96/58.',
      match: `${START}(${group})${END}(?:${spacedUnit(units, keys)})?`,
      captures: {
        1: { name: sc(gas ? 'meta.shorthand-gas' : 'meta.pair'), patterns: [{ include: gas ? '#shorthand-parts' : '#pair-parts' }] },
        2: unit,
        3: unknownUnit,
      },
    },
    {
      comment: gas ? 'Numbers joined by slashes that do not read as a shorthand gas (more than 4 numbers, or not numbers).' : 'Numbers joined by slashes that do not read as a pair.',
      match: `${START}${NUM}/[-+−.0-9][^\\s,#]*`,
      name: sc(gas ? 'invalid.illegal.shorthand-gas' : 'invalid.illegal.pair'),
    },
  ];
}

function wordItemRule(field, sectionKeys) {
  const known = Object.keys(field.words ?? {});
  const other = field.openWords ? 'constant.other.word' : 'constant.other.word.unknown';
  return {
    comment: `\`${field.aliases[0]}\` takes a word: ${[...new Set(Object.values(field.words ?? {}))].join(', ')}${field.openWords ? ', or any word' : ''}.`,
    match: `${START}(${alt(field.aliases)})${END}(?:\\s+(?:(${alt(known)})${END}|(?!${sectionKeys}${END})([^\\s,#]+)))?`,
    captures: { 1: { name: sc('variable.other.key') }, 2: { name: sc('constant.language') }, 3: { name: sc(other) } },
  };
}

function itemPatterns({ FIELDS }, sectionId, units) {
  const keyList = keysOf(FIELDS, sectionId);
  const keys = alt(keyList);
  const gas = sectionId === 'abg' || sectionId === 'vbg';
  const wordFields = FIELDS.filter((f) => f.kind === 'word' && sectionId !== null && f.sections.includes(sectionId));
  return [
    { include: '#comment' },
    { include: '#item-separator' },
    ...slashRules(gas ? 'shorthand' : 'pair', units, keys),
    ...wordFields.map((f) => wordItemRule(f, keys)),
    numberRule(units, keys),
    { comment: 'A key of this section.', match: `${START}${keys}${END}`, name: sc('variable.other.key') },
    { include: '#unknown-key' },
  ];
}

// ── the grammar ────────────────────────────────────────────────────────────

/**
 * Builds the TextMate grammar from the registries (`SECTIONS`, `FIELDS`, `UNITS` as exported by
 * the core). Pure: the same registries give the same object.
 */
export function buildGrammar({ SECTIONS, FIELDS, UNITS }) {
  const units = alt(unitSpellings(UNITS));
  const repository = {
    comment: {
      comment: '`#` starts a comment that runs to the end of the line, anywhere on the line.',
      match: '(#).*',
      name: sc('comment.line.number-sign'),
      captures: { 1: { name: sc('punctuation.definition.comment') } },
    },
    'decimal-comma': {
      comment: 'A comma between two digits is read as a decimal point and reported (PN103).',
      match: '[-+−]?[0-9]+,[0-9]+',
      name: sc('invalid.deprecated.decimal-comma'),
    },
    'item-separator': { match: ',', name: sc('punctuation.separator.item') },
    'unknown-key': {
      comment: 'A word in key position that is not a key of the section.',
      match: `${START}[^\\s,#0-9.+\\-−][^\\s,#]*`,
      name: sc('variable.other.key.unknown'),
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
    timepoint: {
      comment: 'A timepoint: `@`, then `day N [HH:MM]`, `HH:MM` or `+2h30`, then an optional label.',
      begin:
        `^\\s*(@)\\s*(?:` +
        `(${ci('day')})(?:\\s+([0-9]+)(?:\\s+(${CLOCK})(?![^\\s#]))?)?(?:\\s+([0-9][^\\s#:]*:[^\\s#]*))?(?![^\\s#])` +
        `|(${CLOCK})(?![^\\s#])` +
        `|(${OFFSET})(?![^\\s#])` +
        `|([0-9+][^\\s#]*)` +
        `)?`,
      beginCaptures: {
        1: { name: sc('keyword.operator.timepoint') },
        2: { name: sc('keyword.other.day') },
        3: { name: sc('constant.other.time') },
        4: { name: sc('constant.other.time') },
        5: { name: sc('invalid.illegal.time') },
        6: { name: sc('constant.other.time') },
        7: { name: sc('constant.other.time') },
        8: { name: sc('invalid.illegal.time') },
      },
      end: '$',
      name: sc('meta.timepoint'),
      patterns: [{ include: '#comment' }, { match: PROSE, name: sc('entity.name.section.timepoint') }],
    },
  };

  const patterns = [{ include: '#comment' }, { include: '#timepoint' }];
  for (const section of SECTIONS) {
    const names = alt(sectionNames(section));
    const ruleName = `section-${section.id}`;
    patterns.push({ include: `#${ruleName}` });
    const sectionWord = { name: sc('keyword.other.section') };
    if (section.kind === 'prose') {
      repository[ruleName] = {
        begin: `^\\s*(${names})${END}`,
        beginCaptures: { 1: sectionWord },
        end: '$',
        name: sc(`meta.line.${section.id}`),
        patterns: [{ include: '#comment' }, { match: PROSE, name: sc('string.unquoted.prose') }],
      };
      continue;
    }
    const itemsName = `items-${section.id}`;
    if (section.id === 'oxygen') {
      repository[ruleName] = {
        comment: 'An oxygen line starts with the device; a number right after it is its flow.',
        begin: `^\\s*(${names})${END}(?:\\s+(${alt(deviceWords(FIELDS))})${END})?`,
        beginCaptures: { 1: sectionWord, 2: { name: sc('constant.language') } },
        end: '$',
        name: sc(`meta.line.${section.id}`),
        patterns: [{ include: `#${itemsName}` }],
      };
    } else {
      repository[ruleName] = {
        begin: `^\\s*(${names})${END}`,
        beginCaptures: { 1: sectionWord },
        end: '$',
        name: sc(`meta.line.${section.id}`),
        patterns: [{ include: `#${itemsName}` }],
      };
    }
    repository[itemsName] = { patterns: itemPatterns({ FIELDS }, section.id, units) };
  }

  patterns.push({ include: '#unknown-line' });
  repository['unknown-line'] = {
    comment: 'A line that does not start with a section or `@`: the parser reports it (PN101); its items are still shown.',
    begin: '^\\s*([^\\s,#@][^\\s,#]*)',
    beginCaptures: { 1: { name: sc('variable.other.section.unknown') } },
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
    patterns,
    repository,
  };
}

// ── snippets ───────────────────────────────────────────────────────────────

/** Escapes a word for a snippet choice list (`,`, `|` and `\` are special there). */
function choice(words) {
  return words.map((w) => w.replace(/[\\,|$}]/g, '\\$&')).join(',');
}

/**
 * VS Code snippets. Placeholders for measured values are words, not numbers, so a snippet left
 * half-filled is reported by the checks instead of reading as plausible data.
 */
export function buildSnippets({ FIELDS }) {
  const words = (id) => [...new Set(Object.values(FIELDS.find((f) => f.id === id)?.words ?? {}))];
  const devices = words('device');
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
      body: [`${col('abg')}\${1:pH}/\${2:PaCO2}/\${3:PaO2}/\${4:HCO3}\${5: \${6|mmHg,kPa|}}\${7:, be \${8:BE}, lactate \${9:lactate}}`, '$0'],
      description: 'An arterial gas as pH/PaCO2/PaO2/HCO3 [unit], then further items',
    },
    'Pneumark: ventilator settings': {
      prefix: ['ventline', 'ventilator'],
      body: [`${col('vent')}mode \${1|${choice(modes)}|}, vt \${2:VT} mL, rate \${3:rate}, peep \${4:PEEP}, fio2 \${5:FiO2}\${6:, plateau \${7:Pplat}, peak \${8:Ppeak}}`, '$0'],
      description: 'A ventilator line: mode, tidal volume, rate, PEEP, FiO2 and the pressures read',
    },
    'Pneumark: patient header': {
      prefix: ['header', 'patientline'],
      body: [`${col('patient')}age \${1:age} y, sex \${2|female,male|}, height \${3:height} cm, weight \${4:weight} kg`, '$0'],
      description: 'The patient line of the header (no names or identifiers)',
    },
    'Pneumark: oxygen therapy': {
      prefix: ['oxyline', 'oxygenline'],
      body: [`${col('oxygen')}\${1|${choice(devices)}|}\${2: \${3:flow} L/min}\${4:, fio2 \${5:FiO2}}`, '$0'],
      description: 'An oxygen line: the device, its flow and FiO2 (delete the flow and FiO2 for room air)',
    },
    'Pneumark: vital signs': {
      prefix: ['vitalsline'],
      body: [`${col('vitals')}hr \${1:HR}, rr \${2:RR}, spo2 \${3:SpO2} %, temp \${4:temp} C, bp \${5:sys}/\${6:dia}`, '$0'],
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
