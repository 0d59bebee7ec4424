// Linear time on hostile shapes: doubles the input and prints how the time grows (a ratio near
// 2 is linear; near 4 would be quadratic). Shapes: one very long line, many timepoints, deep
// garbage (random characters). Prints figures; asserts nothing. `npm run bench:linear`.
import { createRequire } from 'node:module';

const require = createRequire(import.meta.url);
const core = require('../../dist/core.js');

let seed = 7;
const rand = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
const garbageChars = 'abc ,./@#%:+-0123456789\t\u00e9\u20ac😀';
const shapes = {
  'one long line (characters)': (n) => `vitals ${'hr 80, rr 16, spo2 97 %, '.repeat(Math.ceil(n / 24))}`.slice(0, n),
  'many timepoints (lines)': (n) => Array.from({ length: n }, (_, i) => (i % 3 === 0 ? `@ +1h t${i}` : i % 3 === 1 ? 'vitals hr 80, spo2 95 %' : 'abg 7.40/40/90/24.4')).join('\n'),
  'deep garbage (characters)': (n) => Array.from({ length: n }, () => garbageChars[Math.floor(rand() * garbageChars.length)]).join(''),
};
const sizes = { 'one long line (characters)': 25000, 'many timepoints (lines)': 2500, 'deep garbage (characters)': 25000 };

const timeOf = (text) => {
  let best = Infinity;
  for (let r = 0; r < 3; r++) { const t = performance.now(); core.checkNote(text); best = Math.min(best, performance.now() - t); }
  return best;
};

console.log(`${'shape'.padEnd(30)} ${'size'.padStart(9)} ${'ms'.padStart(9)} ${'× prev'.padStart(7)}`);
for (const [name, make] of Object.entries(shapes)) {
  let previous = null;
  for (let k = 0; k < 4; k++) {
    const n = sizes[name] * 2 ** k;
    const ms = timeOf(make(n));
    console.log(`${name.padEnd(30)} ${String(n).padStart(9)} ${ms.toFixed(1).padStart(9)} ${previous ? (ms / previous).toFixed(2).padStart(7) : '—'.padStart(7)}`);
    previous = ms;
  }
}
