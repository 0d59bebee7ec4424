// Differential check for speed work: do two builds of the core give the same results?
// Runs `checkNote` of an old core bundle and of the core in this tree over the same notes and
// compares a canonical form of everything the result holds: the syntax tree (lines, tokens,
// items, spans, issues with their fixes), the timeline (timepoints, stated values, values in
// force with their origins), every timepoint's derivation (derived values with their inputs,
// formulas, substituted formulas and sources; missing and withheld values; interpretations) and
// the findings (codes, severities, messages, ranges, fixes, related places). Getters are read,
// so values built on first read are compared too. Prints counts; exits 1 on any difference.
//
//   node tests/bench/same-results.mjs [old-core.js] [--notes N] [--mutants N] [--new-member NAME]...
//
// A member the typed results gained since the old build (a field of a reading, say) differs in
// every result that has it: `--new-member NAME` leaves members of that name out of both builds'
// canonical form, so that everything else is still compared (the old build has none, and what
// the new member holds is for the change's own tests to show).
//
// The old bundle is made from an older commit, e.g. from a worktree of it:
//   npx esbuild server/src/core/index.ts --bundle --platform=node --format=cjs --outfile=/tmp/pn-old-core.js
// Notes compared: the generated bench corpus (10,000 notes by default, as `npm run bench:cli`),
// the samples, every .pneu under tests/, and randomly mutated copies of them (characters cut,
// duplicated, swapped or replaced, lines duplicated or dropped; a fixed seed), each under the
// default settings and a few others (kPa, the full alveolar equation, some checks disabled).
import { readdirSync, readFileSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { generateNote } from './generate.mjs';
import { args, buildCore, oldPath, option } from './two-builds.mjs';

const require = createRequire(import.meta.url);
const NEW_MEMBERS = new Set(args.filter((_a, i) => args[i - 1] === '--new-member'));
const NOTES = option('--notes', 10000);
const MUTANTS = option('--mutants', 3000);

const root = new URL('../../', import.meta.url).pathname;
const newPath = join(tmpdir(), `pneumark-same-${process.pid}.cjs`);
await buildCore(newPath);
const NEW = require(newPath);
rmSync(newPath, { force: true });
const OLD = require(oldPath);

// Canonical text of a value: objects with their keys sorted, own properties and getters of their
// classes alike; `undefined` members kept (a member present but undefined is not one absent);
// -0 and NaN spelt out; field definitions by their id (they are the registry's constants);
// maps as their entries in order; an object met before as a reference to the first.
const fieldDefs = new Set([...OLD.FIELDS, ...NEW.FIELDS]);
// The public members of the kinds of object whose classes keep private state besides (carried
// state, flags, raw text): only these are compared, as the typed API names them.
const LINE = ['line', 'text', 'comment', 'issues', 'kind'];
const PUBLIC = [
  [(v) => 'keyName' in v, ['key', 'keyName', 'implied', 'field', 'value', 'unit', 'span', 'valueKind', 'number', 'unitText']],
  [(v) => 'fieldId' in v && 'item' in v, ['field', 'fieldId', 'section', 'line', 'item', 'value', 'parts', 'word', 'unit', 'readUnit', 'unitImplied', 'unitDoubt', 'usable', 'hereOnly']],
  [(v) => 'startLine' in v && 'stated' in v, ['index', 'line', 'label', 'startLine', 'endLine', 'time', 'stated', 'values', 'barometricMmhg', 'gasUnit', 'shownGasUnit']],
  [(v) => 'timepoints' in v && 'readIssues' in v, ['timepoints', 'readIssues', 'header', 'headerGasUnit']],
  [(v) => 'interpretations' in v && 'notApplicable' in v, ['timepoint', 'derived', 'missing', 'notApplicable', 'interpretations']],
  [(v) => v.kind === 'number' && 'span' in v, ['kind', 'text', 'value', 'span', 'decimalComma']],
  [(v) => v.kind === 'pair' && 'span' in v, ['kind', 'text', 'parts', 'span']],
  [(v) => v.kind === 'word' && 'span' in v, ['kind', 'text', 'span']],
  [(v) => (v.kind === 'clock' || v.kind === 'offset' || v.kind === 'day') && 'span' in v, ['kind', 'day', 'minutes', 'span', 'text']],
  [(v) => !('kind' in v) && 'span' in v && 'text' in v && !('keyName' in v), ['text', 'span']],
  [(v) => v.kind === 'blank' && 'issues' in v, LINE],
  [(v) => v.kind === 'timepoint' && 'issues' in v, [...LINE, 'marker', 'time', 'label']],
  [(v) => v.kind === 'section' && 'issues' in v, [...LINE, 'section', 'sectionToken', 'items', 'prose']],
  [(v) => v.kind === 'unknown' && 'issues' in v, [...LINE, 'first', 'rest']],
];
const generic = new Set();
const GETTERS = new WeakMap();
function gettersOf(proto) {
  let names = GETTERS.get(proto);
  if (names === undefined) {
    names = [];
    for (let p = proto; p && p !== Object.prototype; p = Object.getPrototypeOf(p)) {
      for (const [k, d] of Object.entries(Object.getOwnPropertyDescriptors(p))) if (d.get) names.push(k);
    }
    GETTERS.set(proto, names);
  }
  return names;
}
function keysOf(value) {
  const keys = membersOf(value);
  return NEW_MEMBERS.size === 0 ? keys : keys.filter((k) => !NEW_MEMBERS.has(k));
}
function membersOf(value) {
  for (const [is, keys] of PUBLIC) if (is(value)) return keys;
  const proto = Object.getPrototypeOf(value);
  const own = Object.keys(value);
  const getters = proto === Object.prototype ? [] : gettersOf(proto);
  const sorted = getters.length === 0 ? own.sort() : [...new Set([...own, ...getters])].sort();
  if (process.env.SAME_KEYS) generic.add(sorted.join(' '));
  return sorted;
}
// Writes the canonical text of `value` into `out` (a list of pieces joined at the end).
function canonical(value, seen, out) {
  if (value === undefined) { out.push('u'); return; }
  if (value === null) { out.push('n'); return; }
  switch (typeof value) {
    case 'number': out.push(Object.is(value, -0) ? '-0' : String(value)); return;
    case 'string': out.push(JSON.stringify(value)); return;
    case 'boolean': out.push(value ? 't' : 'f'); return;
    case 'function': out.push('fn'); return;
    case 'object': break;
    default: out.push(`?${typeof value}`); return;
  }
  if (fieldDefs.has(value)) { out.push(`field:${value.id}`); return; }
  // An object met before in this result is written as a reference to its first appearance (the
  // builds walk the same results in the same order, so equal results number objects alike).
  const before = seen.get(value);
  if (before !== undefined) { out.push(`#${before}`); return; }
  seen.set(value, seen.size);
  if (Array.isArray(value)) {
    out.push('[');
    for (const v of value) { canonical(v, seen, out); out.push(','); }
    out.push(']');
  } else if (value instanceof Map || (typeof value.entries === 'function' && typeof value.get === 'function')) {
    out.push(`M${value.size}{`);
    for (const [k, v] of value.entries()) { canonical(k, seen, out); out.push(':'); canonical(v, seen, out); out.push(','); }
    out.push('}');
  } else {
    out.push('{');
    // A member present but undefined is told from one absent.
    for (const k of keysOf(value)) { out.push(k in value ? k : `${k}!`, ':'); canonical(value[k], seen, out); out.push(','); }
    // An item's one method that takes no argument.
    if (typeof value.hasDecimalComma === 'function') out.push(`hasDecimalComma():${value.hasDecimalComma()}`);
    out.push('}');
  }
}

function resultText(core, text, settings) {
  const result = core.checkNote(text, settings);
  const { analysis } = result;
  const derivations = analysis.timeline.timepoints.map((tp) => analysis.derivation(tp.index));
  const seen = new Map();
  const out = [];
  canonical(analysis.tree, seen, out);
  canonical(analysis.timeline, seen, out);
  canonical(derivations, seen, out);
  canonical(result.findings, seen, out);
  canonical(result.settings, seen, out);
  // The pieces, compared one by one: joined, the text of a big result is slow to make.
  return out;
}

// Notes.
const notes = [];
for (let i = 0; i < NOTES; i++) notes.push(['bench', generateNote(5 + (i % 31), i + 1), `bench note ${i}`]);
const files = (dir) => readdirSync(join(root, dir), { recursive: true }).filter((f) => String(f).endsWith('.pneu')).map((f) => [`${dir}/${f}`, readFileSync(join(root, dir, String(f)), 'utf8')]);
const real = [...files('samples'), ...files('tests')];
notes.push(...real.map(([name, t]) => ['file', t, name]));

let seed = 20261204;
const rand = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
const pick = (n) => Math.floor(rand() * n);
const ALPHABET = ' ,./:@#-()%\n\t0123456789abcdefghijklmnopqrstuvwxyzAKPLVO\u00a0µ°é';
function mutate(text) {
  let t = text;
  const edits = 1 + pick(6);
  for (let e = 0; e < edits && t.length > 1; e++) {
    const at = pick(t.length);
    const len = 1 + pick(4);
    switch (pick(6)) {
      case 0: t = t.slice(0, at) + t.slice(at + len); break; // cut
      case 1: t = t.slice(0, at + len) + t.slice(at, at + len) + t.slice(at + len); break; // duplicate
      case 2: if (at + 1 < t.length) t = t.slice(0, at) + t[at + 1] + t[at] + t.slice(at + 2); break; // swap
      case 3: t = t.slice(0, at) + ALPHABET[pick(ALPHABET.length)] + t.slice(at + 1); break; // replace
      case 4: t = t.slice(0, at) + ALPHABET[pick(ALPHABET.length)] + t.slice(at); break; // insert
      default: { // a whole line duplicated or dropped
        const lines = t.split('\n');
        const l = pick(lines.length);
        if (rand() < 0.5) lines.splice(l, 0, lines[l]); else lines.splice(l, 1);
        t = lines.join('\n');
      }
    }
  }
  return t;
}
const sources = [...real.map(([, t]) => t), ...notes.slice(0, 200).map(([, t]) => t)];
for (let i = 0; i < MUTANTS; i++) notes.push(['mutant', mutate(sources[i % sources.length]), `mutant ${i}`]);

const SETTINGS = [
  {},
  { gasUnit: 'kPa', alveolarEquation: 'full', waterVapour: 'body-temperature', barometricModel: 'standard' },
  { aaGradientRule: 'mellemgaard', respiratoryQuotient: 1, hufnerConstant: 1.39, privacyChecks: false, disabledChecks: ['PN301', 'PN204'] },
];

const counts = new Map();
let compared = 0;
let differences = 0;
const started = performance.now();
notes.forEach(([kind, text, name], n) => {
  // Every note under the default settings; the real ones, one mutated note in 4 and one bench
  // note in 50 under the other settings too.
  const settingsList = (kind === 'bench' && n % 50 !== 0) || (kind === 'mutant' && n % 4 !== 0) ? SETTINGS.slice(0, 1) : SETTINGS;
  for (const settings of settingsList) {
    compared++;
    counts.set(kind, (counts.get(kind) ?? 0) + 1);
    const a = resultText(OLD, text, settings);
    const b = resultText(NEW, text, settings);
    let i = 0;
    const length = Math.min(a.length, b.length);
    while (i < length && a[i] === b[i]) i++;
    if (i < length || a.length !== b.length) {
      differences++;
      if (differences <= 5) {
        console.log(`difference in ${name} (settings ${JSON.stringify(settings)}) at piece ${i}:`);
        console.log(`  old …${a.slice(Math.max(0, i - 60), i + 60).join('')}…`);
        console.log(`  new …${b.slice(Math.max(0, i - 60), i + 60).join('')}…`);
      }
    }
  }
});
if (process.env.SAME_KEYS) for (const k of generic) console.log(`members: ${k}`);
if (NEW_MEMBERS.size > 0) console.log(`members left out as new: ${[...NEW_MEMBERS].join(', ')}`);
console.log(`compared ${compared} results (${[...counts].map(([k, c]) => `${c} ${k}`).join(', ')}) in ${((performance.now() - started) / 1000).toFixed(0)} s: ${differences} differences`);
process.exit(differences === 0 ? 0 : 1);
