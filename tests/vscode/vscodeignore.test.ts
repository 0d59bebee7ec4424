// What goes into the .vsix: every file .vscodeignore lets through by name exists once the
// extension is built (a line naming a missing file hides a packaging mistake), and the icon
// package.json names, when it names one, is among them.
import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

const ROOT = new URL('../../', import.meta.url);
const kept = readFileSync(new URL('.vscodeignore', ROOT), 'utf8').split('\n')
  .map((line) => line.trim())
  .filter((line) => line.startsWith('!'))
  .map((line) => line.slice(1));
const manifest = JSON.parse(readFileSync(new URL('package.json', ROOT), 'utf8')) as { icon?: string };
/** Files the build makes (`npm run build`), absent from a fresh checkout. */
const BUILT = /^dist\//;

describe('.vscodeignore', () => {
  it('names only files that exist (the built ones aside)', () => {
    expect(kept.length).toBeGreaterThan(0);
    const missing = kept.filter((path) => !/[*?[]/.test(path) && !BUILT.test(path) && !existsSync(new URL(path, ROOT)));
    expect(missing).toEqual([]);
  });

  it('keeps the icon package.json names, and names no icon when package.json has none', () => {
    const icons = kept.filter((path) => /(^|\/)icon\.[a-z]+$/i.test(path));
    if (manifest.icon === undefined) expect(icons).toEqual([]);
    else {
      expect(kept).toContain(manifest.icon);
      expect(existsSync(new URL(manifest.icon, ROOT))).toBe(true);
    }
  });
});
