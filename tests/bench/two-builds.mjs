// What tests/bench/compare.mjs and tests/bench/same-results.mjs share: their command line (an old
// core bundle, `--name N` options) and a bundle of the core in this tree.
import { build } from 'esbuild';
import { join } from 'node:path';

export const args = process.argv.slice(2);

/** The number after `--name`, or `fallback`. */
export function option(name, fallback) {
  const i = args.indexOf(name);
  return i >= 0 ? Number(args[i + 1]) : fallback;
}

/** The old core bundle: the first argument that is not an option or an option's value. */
export const oldPath = args.find((a, i) => !a.startsWith('--') && (i === 0 || !args[i - 1].startsWith('--'))) ?? '/tmp/pn-old-core.js';

const root = new URL('../../', import.meta.url).pathname;

/** Bundles the core of this tree to `outfile` (CommonJS, for `require`). */
export async function buildCore(outfile) {
  await build({ entryPoints: [join(root, 'server/src/core/index.ts')], bundle: true, platform: 'node', format: 'cjs', outfile, logLevel: 'error' });
}
