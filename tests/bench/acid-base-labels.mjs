// Records the short label of every acid–base reading, and every acid–base inlay hint, over the
// bench corpus, the samples, every .pneu under tests/ and a set of invented gases covering every
// branch of the reading (in mmHg and in kPa), under the default settings and a kPa note's. Used to
// show that a change of how the label is made leaves every label as it was: run it before and
// after, and compare the two records (`diff`). Prints one line per reading, as JSON.
//
//   node tests/bench/acid-base-labels.mjs [--notes N] > labels.jsonl
//
// Works with the label made from the reading's typed finding (`reading.acidBase`) and, for a
// tree from before it, from the reading's text.
import { readdirSync, readFileSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';
import { generateNote } from './generate.mjs';
import { option } from './two-builds.mjs';

const require = createRequire(import.meta.url);
const root = new URL('../../', import.meta.url).pathname;
const NOTES = option('--notes', 2000);

const bundle = join(tmpdir(), `pneumark-labels-${process.pid}.cjs`);
await build({
  stdin: {
    contents: [
      "export { checkNote } from './server/src/core/check-note';",
      "export { inlayHints, acidBaseLabel } from './server/src/core/service/hints';",
      "export { HINT_CATEGORIES } from './server/src/core/service/types';",
    ].join('\n'),
    resolveDir: root,
    loader: 'ts',
  },
  bundle: true,
  platform: 'node',
  format: 'cjs',
  outfile: bundle,
  logLevel: 'error',
});
const core = require(bundle);
rmSync(bundle, { force: true });

/** Invented gases, one timepoint each: every branch of the acid–base reading. */
const GASES = [
  // metabolic acidosis: response as expected, gap high, normal, mixed; PaCO2 above and below the expected range
  'abg 7.28/26/95/12',
  'abg 7.28/26/95/12\nlabs na 140, cl 100',
  'abg 7.28/26/95/12\nlabs na 140, cl 116',
  'abg 7.28/26/95/12\nlabs na 140, cl 110',
  'abg 7.25/23/96/9.8\nlabs na 140, cl 112, hco3 10, albumin 2.0',
  'abg 7.09/40/90/12',
  'abg 7.09/40/90/12\nlabs na 140, cl 100',
  'abg 7.34/15/110/8',
  'abg 7.33/38/95/20\nlabs na 140, cl 95, hco3 20',
  // metabolic alkalosis: as expected, fully compensated, PaCO2 above and below, with a high gap
  'abg 7.47/47/90/34',
  'abg 7.43/46/90/30',
  'abg 7.47/56/80/40',
  'abg 7.54/38/90/32',
  'abg 7.47/47/90/34\nlabs na 145, cl 95',
  // respiratory acidosis: acute, chronic, fully compensated, between, too little and too much HCO3, with a gap
  'abg 7.25/60/70/26',
  'abg 7.30/70/60/34',
  'abg 7.35/60/70/33',
  'abg 7.27/70/60/31.5',
  'abg 7.20/60/70/23',
  'abg 7.39/80/60/48',
  'abg 7.37/100/60/57',
  'abg 7.25/60/70/26\nlabs na 140, cl 95',
  'abg 7.29/62/58/29.7',
  'abg 7.37/46/90/26.2',
  // respiratory alkalosis: acute, chronic, fully compensated, acute or chronic, between, too much and too little HCO3
  'abg 7.56/25/95/22',
  'abg 7.49/20/100/15',
  'abg 7.42/25/95/16',
  'abg 7.49/28/45/21',
  'abg 7.65/15/110/16.5',
  'abg 7.40/15/110/9.2',
  'abg 7.42/15/110/9.5',
  'abg 7.55/30/95/26',
  // mixed
  'abg 7.10/60/90/18',
  'abg 7.10/60/90/18\nlabs na 140, cl 95',
  'abg 7.10/60/90/18\nlabs na 140, cl 110',
  'abg 7.10/60/90/18\nlabs na 140, cl 106',
  'abg 7.61/30/90/30',
  'abg 7.61/30/90/30\nlabs na 145, cl 100',
  // normal, and normal by pH, PaCO2 and HCO3 with a gap that adds disorders
  'abg 7.40/40/95/24',
  'abg 7.36/44/90/24.4\nlabs na 138, cl 100, albumin 2.0',
  'abg 7.38/38/90/22.1\nlabs na 140, cl 100, hco3 24',
  'abg 7.38/38/90/22.1\nlabs na 140, cl 104',
  // pH just below 7.35 with PaCO2 and HCO3 at their limits (no gas whose pH, PaCO2 and HCO3 fit
  // together is undetermined: a pH that neither moves would need an HCO3 PN402 refuses); not read (PN402)
  'abg 7.34/45/90/23.5',
  'abg 7.33/44/90/22.5',
  'abg 7.30/40/90/35',
];

/** The same readings in a kPa note (1 kPa = 7.50062 mmHg), and gases written on a kPa limit. */
const KPA_GASES = [
  'abg 7.25/8.0/9.3/26',
  'abg 7.30/9.3/8.0/34',
  'abg 7.35/8.0/9.3/33',
  'abg 7.27/9.3/8.0/31.5',
  'abg 7.28/3.5/12.7/12\nlabs na 140, cl 100',
  'abg 7.09/5.3/12/12',
  'abg 7.47/6.3/12/34',
  'abg 7.56/3.3/12.7/22',
  'abg 7.10/8.0/12/18\nlabs na 140, cl 106',
  'abg 7.61/4.0/12/30',
  'abg 7.36/5.9/12/24.4\nlabs na 138, cl 100, albumin 2.0',
  'abg 7.35/5.3/10.7/24',
  'abg 7.28/9.1/7.9/31.5',
  'abg 7.07/4.7/12.7/10',
  'abg 7.34/6.0/12/23.5',
  'abg 7.40/5.3/12/15',
];

const notes = [];
for (const gas of GASES) notes.push([`gas ${gas}`, `@ 08:00\noxygen room air\n${gas}\n`]);
for (const gas of KPA_GASES) notes.push([`kPa gas ${gas}`, `units gas kPa\n@ 08:00\noxygen room air\n${gas}\n`]);
const files = (dir) => readdirSync(join(root, dir), { recursive: true }).filter((f) => String(f).endsWith('.pneu')).sort().map((f) => [`${dir}/${f}`, readFileSync(join(root, dir, String(f)), 'utf8')]);
notes.push(...files('samples'), ...files('tests'));
for (let i = 0; i < NOTES; i++) notes.push([`bench note ${i}`, generateNote(5 + (i % 31), i + 1)]);

const SETTINGS = [{}, { gasUnit: 'kPa' }];
const categories = { categories: new Set(['acid-base']) };
let readingsSeen = 0;
for (const [name, text] of notes) {
  for (const settings of SETTINGS) {
    const result = core.checkNote(text, settings);
    const { analysis } = result;
    for (const tp of analysis.timeline.timepoints) {
      for (const r of analysis.derivation(tp.index).interpretations) {
        if (r.topic !== 'acid-base') continue;
        readingsSeen++;
        const label = r.acidBase !== undefined ? core.acidBaseLabel(r.acidBase) : core.acidBaseLabel(r.text);
        console.log(JSON.stringify({ note: name, settings, line: r.line, notable: r.notable, label, text: r.text }));
      }
    }
    const lines = analysis.tree.lines.length;
    for (const h of core.inlayHints(result, { start: 0, end: lines - 1 }, categories)) {
      console.log(JSON.stringify({ note: name, settings, line: h.position.line, hint: h.label }));
    }
  }
}
console.error(`${notes.length} notes, ${readingsSeen} acid–base readings`);
