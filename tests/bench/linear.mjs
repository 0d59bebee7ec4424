// Linear time on hostile shapes: doubles the input and prints how the time grows (a ratio near
// 2 is linear; near 4 would be quadratic). Shapes: one very long line, many timepoints, deep
// garbage (random characters), a long run of high flow whose timepoints share one time (each asks
// its hours of high flow, for its ROX index). Prints figures; asserts nothing. `npm run
// bench:linear`; `node tests/bench/linear.mjs --core OLD.js` times another bundle of the core
// (`npx esbuild server/src/core/index.ts --bundle --platform=node --format=cjs --outfile=OLD.js`),
// `--only TEXT` the shapes whose name contains TEXT.
import { createRequire } from 'node:module';
import path from 'node:path';

const require = createRequire(import.meta.url);
const argAfter = (name) => { const i = process.argv.indexOf(name); return i < 0 ? null : process.argv[i + 1] ?? null; };
const corePath = argAfter('--core');
const only = argAfter('--only');
const core = require(corePath === null ? '../../dist/core.js' : path.resolve(corePath));

let seed = 7;
const rand = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
const garbageChars = 'abc ,./@#%:+-0123456789\t\u00e9\u20ac😀';
const shapes = {
  'one long line (characters)': (n) => `vitals ${'hr 80, rr 16, spo2 97 %, '.repeat(Math.ceil(n / 24))}`.slice(0, n),
  'many timepoints (lines)': (n) => Array.from({ length: n }, (_, i) => (i % 3 === 0 ? `@ +1h t${i}` : i % 3 === 1 ? 'vitals hr 80, spo2 95 %' : 'abg 7.40/40/90/24.4')).join('\n'),
  'deep garbage (characters)': (n) => Array.from({ length: n }, () => garbageChars[Math.floor(rand() * garbageChars.length)]).join(''),
  'high flow at one time (timepoints)': (n) => `patient age 64 y\n${Array.from({ length: n }, (_, i) => `@ day 1 08:00 round ${i}\n${i === 0 ? 'oxygen hfnc 50 L/min, fio2 0.5\n' : ''}vitals rr 24, spo2 95 %`).join('\n')}\n`,
};
const sizes = { 'one long line (characters)': 25000, 'many timepoints (lines)': 2500, 'deep garbage (characters)': 25000, 'high flow at one time (timepoints)': 1000 };

/** Shapes timed with every timepoint's derived values read, as `show` and the exports read them. */
const derivedToo = new Set(['high flow at one time (timepoints)']);

const timeOf = (text, derived) => {
  let best = Infinity;
  for (let r = 0; r < 3; r++) {
    const t = performance.now();
    const result = core.checkNote(text);
    if (derived) for (const tp of result.analysis.timeline.timepoints) result.analysis.derivation(tp.index).derived.length;
    best = Math.min(best, performance.now() - t);
  }
  return best;
};

console.log(`${'shape'.padEnd(34)} ${'size'.padStart(9)} ${'ms'.padStart(9)} ${'× prev'.padStart(7)}`);
for (const [name, make] of Object.entries(shapes)) {
  if (only !== null && !name.includes(only)) continue;
  let previous = null;
  for (let k = 0; k < 4; k++) {
    const n = sizes[name] * 2 ** k;
    const ms = timeOf(make(n), derivedToo.has(name));
    console.log(`${name.padEnd(34)} ${String(n).padStart(9)} ${ms.toFixed(1).padStart(9)} ${previous ? (ms / previous).toFixed(2).padStart(7) : '—'.padStart(7)}`);
    previous = ms;
  }
}
