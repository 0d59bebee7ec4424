// Sweeps every fixture note (tests/fixtures and samples): each line marked `# expect: CODE...`
// raises exactly those codes, and unmarked lines raise none. Information findings (readings)
// are compared only in fixtures that opt in with a `# sweep: all severities` line, so demo
// notes stay free of markers for their readings.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { CHECKS } from '../../server/src/core/checks/registry';
import { codesByLine, expectationsOf, fixtureFiles } from '../helpers/expectations';

const fixtures = fixtureFiles('tests/fixtures', 'tests/fixtures/bedside', 'samples');

describe('fixture notes carry their expected findings', () => {
  for (const { path, text } of fixtures) {
    it(path, () => {
      const all = text.includes('# sweep: all severities');
      const findings = checkNote(text).findings.filter((f) => all || f.severity === 'error' || f.severity === 'warning');
      const actual = Object.fromEntries([...codesByLine(findings)].map(([l, c]) => [l + 1, c]));
      const expected = Object.fromEntries(expectationsOf(text).map((e) => [e.line + 1, [...e.codes]]));
      expect(actual).toEqual(expected);
    });
  }

  it('every check except the internal one fires somewhere in the fixtures', () => {
    const fired = new Set(fixtures.flatMap(({ text }) => expectationsOf(text).flatMap((e) => e.codes)));
    // Information checks must fire in an opted-in fixture to count.
    const missing = CHECKS.filter((c) => !c.tags.includes('internal') && !fired.has(c.code)).map((c) => c.code);
    expect(missing).toEqual([]);
  });
});
