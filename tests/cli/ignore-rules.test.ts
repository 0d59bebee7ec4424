// `.pneuignore` rules matched a segment at a time (server/src/cli/ignore-rules.ts) answer as the
// `ignore` package does, which the command line used for every file before: checked here on
// generated rules and paths, with two `**` and folders deep enough that the package's expressions
// slow down. The package also answers for a path's folders (a folder left out leaves out what it
// holds); `IgnoreFiles` does that for the segment rules, so the comparison does it too.
import fc from 'fast-check';
import ignore from 'ignore';
import { describe, expect, it } from 'vitest';
import { plainRules, type PathRules, type RuleVerdict } from '../../server/src/cli/ignore-rules';

/** What the rules say of `path`, its folders first (as the package's `test` does). */
function withFolders(rules: PathRules, path: string): RuleVerdict {
  const parts = path.split('/').filter((p) => p !== '');
  for (let i = 1; i < parts.length; i++) {
    const verdict = rules.test(`${parts.slice(0, i).join('/')}/`);
    if (verdict.ignored) return verdict;
  }
  return rules.test(path);
}

const patternSegment = fc.constantFrom('a', 'B', 'ab', '*', '**', 'a*', '*b', '?b', '*-*-*', '*.pneu', 'x.pneu', 'a?', '*a*');
const pattern = fc.tuple(fc.boolean(), fc.boolean(), fc.array(patternSegment, { minLength: 1, maxLength: 5 }), fc.boolean())
  .map(([negative, rooted, parts, dirOnly]) => `${negative ? '!' : ''}${rooted ? '/' : ''}${parts.join('/')}${dirOnly ? '/' : ''}`);
const pathSegment = fc.constantFrom('a', 'A', 'ab', 'b', 'x-y-z', 'x.pneu', 'a-b', 'ba', 'q.PNEU', 'a.pneu');
const path = fc.tuple(fc.array(pathSegment, { minLength: 1, maxLength: 8 }), fc.boolean()).map(([parts, dir]) => `${parts.join('/')}${dir ? '/' : ''}`);

describe('.pneuignore rules matched a segment at a time', () => {
  it('answer as the ignore package on generated rules and paths', () => {
    fc.assert(fc.property(fc.array(pattern, { minLength: 1, maxLength: 4 }), fc.array(path, { minLength: 1, maxLength: 6 }), (lines, paths) => {
      const mine = plainRules(lines);
      expect(mine).not.toBeNull();
      const theirs = ignore().add(lines);
      for (const p of paths) {
        const expected = theirs.test(p);
        expect({ path: p, ...withFolders(mine!, p) }).toEqual({ path: p, ignored: expected.ignored, unignored: expected.unignored });
      }
    }), { numRuns: 2000 });
  });

  it('answer as the ignore package 150 folders down, with two `**`', () => {
    const deep = Array.from({ length: 150 }, (_, i) => `x-y-z-${i}`).join('/');
    const lines = ['**/*-*-*/**/*.pneu', '!**/x-y-z-149/**/keep.pneu', '# a comment', '', 'other/  '];
    const mine = plainRules(lines)!;
    const theirs = ignore().add(lines);
    for (const p of [`${deep}/note.pneu`, `${deep}/keep.pneu`, `${deep}/`, `${deep}/note.txt`, 'x-y-z/note.pneu', 'note.pneu', `${deep}/other/`]) {
      const expected = theirs.test(p);
      expect({ path: p, ...withFolders(mine, p) }).toEqual({ path: p, ignored: expected.ignored, unignored: expected.unignored });
    }
    expect(mine.test(`${deep}/note.pneu`).ignored).toBe(true);
    expect(mine.test(`${deep}/keep.pneu`).unignored).toBe(true);
  });

  it('answer as the ignore package for long names and patterns with many `*`', () => {
    const lines = ['**/*a*a*a*a*a*b/**/*x*x*x*x*y', '!*A*?*a*.PNEU'];
    const mine = plainRules(lines)!;
    const theirs = ignore().add(lines);
    const long = 'a'.repeat(250);
    for (const p of [`${long}b/${long}/${'x'.repeat(250)}y`, `${long}/${long}/${'x'.repeat(250)}`, `${long}b/${'x'.repeat(250)}`, `z/${long}.pneu`, `Aa.pneu`, `ax.pneu`]) {
      const expected = theirs.test(p);
      expect({ path: p, ...withFolders(mine, p) }).toEqual({ path: p, ignored: expected.ignored, unignored: expected.unignored });
    }
  });

  it('leave files with other forms (classes, escapes, spaces inside, runs of three `*`) to the ignore package', () => {
    for (const line of ['[ab].pneu', 'a\\ b', 'a b', '***/x', 'a**b', './a', '\\#x']) expect(plainRules([line])).toBeNull();
    expect(plainRules(['*.pneu', '!keep.pneu', 'old/'])).not.toBeNull();
  });
});
