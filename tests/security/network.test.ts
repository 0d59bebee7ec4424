// No network: the bundles the project ships must not be able to reach a network module or an
// HTTP client. Reads the esbuild metafiles written by the build (npm test builds first).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const META = 'dist/meta';
const LOCAL_SOCKET = 'server/src/server/local-socket.ts';
const NETWORK = /^(node:)?(net|http|https|http2|tls|dgram|dns|inspector)$/;

interface Metafile {
  readonly inputs: Record<string, { readonly imports?: readonly { readonly path: string; readonly external?: boolean }[] }>;
  readonly outputs: Record<string, unknown>;
}

const bundles = readdirSync(META).filter((f) => f.endsWith('.json')).map((f) => ({ name: f.replace(/\.json$/, ''), meta: JSON.parse(readFileSync(join(META, f), 'utf8')) as Metafile }));

describe('bundles make no network calls', () => {
  it('covers the server, the command line, the extension and the trend view', () => {
    expect(bundles.map((b) => b.name).sort()).toEqual(expect.arrayContaining(['cli', 'core', 'extension', 'server', 'webview-trends']));
  });

  it.each(bundles.map((b) => [b.name, b.meta] as const))('%s imports no network module (the server: only net, from local-socket.ts, for a local pipe)', (name, meta) => {
    const reached: string[] = [];
    for (const [file, info] of Object.entries(meta.inputs)) {
      for (const imp of info.imports ?? []) if (NETWORK.test(imp.path)) reached.push(`${imp.path} from ${file}`);
    }
    // The language server's connection to the editor for --pipe (a local socket; --socket is refused).
    expect(reached).toEqual(name === 'server' ? [`node:net from ${LOCAL_SOCKET}`] : []);
  });

  it('connects the language server only to a local socket path, never to a host and port', () => {
    // The code, its comments left out.
    const source = readFileSync(LOCAL_SOCKET, 'utf8').replace(/\/\*[\s\S]*?\*\//g, '').replace(/\/\/.*$/gm, '');
    const calls = [...source.matchAll(/createConnection\(([^)]*)\)/g)].map((m) => m[1]);
    expect(calls).toEqual(['{ path }']);
    expect(source).not.toMatch(/\b(host|port)\b/);
    expect(source).not.toMatch(/\b(connect|Socket|createServer|listen)\s*\(/);
  });

  it.each(bundles.map((b) => [b.name, b.meta] as const))('%s contains no HTTP client or socket use', (_name, meta) => {
    for (const output of Object.keys(meta.outputs)) {
      if (!output.endsWith('.js')) continue;
      const text = readFileSync(output, 'utf8');
      expect(text, output).not.toMatch(/\bfetch\s*\(/);
      expect(text, output).not.toMatch(/\bnew\s+(XMLHttpRequest|WebSocket|EventSource)\b/);
      expect(text, output).not.toMatch(/navigator\.sendBeacon/);
    }
  });

  it('never starts the language server with an inspector port, even when the extension host is debugged', () => {
    // (The language client's own list of debugging flags names them, without a port.)
    expect(readFileSync('dist/extension.js', 'utf8')).not.toMatch(/--inspect(-brk)?=\d/);
  });

  it('routes the protocol library’s own socket helpers to a stub that refuses', () => {
    const server = readFileSync('dist/server.js', 'utf8');
    expect(server).toContain('Pneumark makes no network connections');
    // Only local-socket.ts gets the real module: the bundle requires it once.
    expect(server.match(/require\("(node:)?net"\)/g)).toEqual(['require("node:net")']);
  });
});
