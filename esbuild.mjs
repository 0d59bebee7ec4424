// One bundler, one entry per artefact. `node esbuild.mjs [--production]`.
// The metafile of each bundle is written to dist/meta/ (inspected by the network-free test).
import { build } from 'esbuild';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';

const production = process.argv.includes('--production');

/**
 * No network in the editor side: `net` (pulled in by the protocol library for its socket helpers)
 * and the HTTP modules resolve to a stub that refuses, so no network module is reachable from the
 * bundles, with one exception: server/src/server/local-socket.ts, the language server's
 * connection to the editor for `--pipe` (a local socket path, never a host and port), gets the
 * real `net`.
 */
const LOCAL_SOCKET = new URL('./server/src/server/local-socket.ts', import.meta.url).pathname;
const noNetwork = {
  name: 'pneumark-no-network',
  setup(b) {
    b.onResolve({ filter: /^(node:)?(net|http|https|http2|tls|dgram|dns)$/ }, (args) =>
      args.importer === LOCAL_SOCKET && /^(node:)?net$/.test(args.path)
        ? { path: args.path, external: true }
        : { path: new URL('./server/src/node/no-network.ts', import.meta.url).pathname });
  },
};

/**
 * jsonc-parser's `main` is a UMD module whose `require` calls esbuild cannot follow (the bundle
 * would fail at run time with "Cannot find module './impl/format'"); its ES module build, the one
 * its `module` field names for bundlers, bundles whole.
 */
const jsoncParserAsModule = {
  name: 'pneumark-jsonc-parser-module',
  setup(b) {
    b.onResolve({ filter: /^jsonc-parser$/ }, () => ({ path: new URL('./node_modules/jsonc-parser/lib/esm/main.js', import.meta.url).pathname }));
  },
};

const artefacts = [
  { name: 'cli', entry: 'server/src/cli/main.ts' },
  { name: 'core', entry: 'server/src/core/index.ts' },
  { name: 'server', entry: 'server/src/server/main.ts' },
  { name: 'extension', entry: 'client/src/extension.ts', external: ['vscode'] },
  { name: 'webview/trends', entry: 'client/webview/trends.ts', platform: 'browser', format: 'iife' },
].filter((a) => existsSync(a.entry));

mkdirSync('dist/meta', { recursive: true });
await Promise.all(
  artefacts.map(async (a) => {
    const result = await build({
      entryPoints: [a.entry],
      outfile: `dist/${a.name}.js`,
      bundle: true,
      platform: a.platform ?? 'node',
      target: a.platform === 'browser' ? 'chrome120' : 'node20',
      format: a.format ?? 'cjs',
      sourcemap: !production,
      minify: production,
      external: a.external ?? [],
      metafile: true,
      logLevel: 'warning',
      plugins: [noNetwork, jsoncParserAsModule],
      // Some ESM dependencies read import.meta.url; in a CommonJS bundle it comes from __filename.
      ...(a.platform === 'browser' ? {} : {
        define: { 'import.meta.url': '__pneumarkImportMetaUrl' },
        banner: { js: "const __pneumarkImportMetaUrl = require('node:url').pathToFileURL(__filename).href;" },
      }),
      ...(a.banner ? { banner: { js: a.banner } } : {}),
    });
    writeFileSync(`dist/meta/${a.name.replace('/', '-')}.json`, JSON.stringify(result.metafile));
  }),
);

// The trend view's stylesheet: the charting library's own CSS, then ours.
mkdirSync('dist/webview', { recursive: true });
writeFileSync('dist/webview/trends.css', `${readFileSync('node_modules/uplot/dist/uPlot.min.css', 'utf8')}\n${readFileSync('client/webview/trends.css', 'utf8')}`);
