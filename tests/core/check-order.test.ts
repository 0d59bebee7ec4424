// The check registry lists its checks in the order of their codes, so the table of docs/checks.md,
// `pneumark docs`, the rules of a SARIF log and the choices of `pneumark.disabledChecks` list PN327
// after PN326, not after PN418. No computation here: a rule of the registry.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { CHECKS } from '../../server/src/core/checks/registry';

const sorted = (codes: readonly string[]) => [...codes].sort((a, b) => Number(a.slice(2)) - Number(b.slice(2)));

describe('the order of the checks', () => {
  it('is the order of their codes in the registry', () => {
    const codes = CHECKS.map((c) => c.code);
    expect(codes).toEqual(sorted(codes));
  });

  it('is the order of their codes in docs/checks.md, table and sections', () => {
    const doc = readFileSync('docs/checks.md', 'utf8');
    const table = [...doc.matchAll(/^\| \[(PN\d{3})\]/gm)].map((m) => m[1]!);
    const sections = [...doc.matchAll(/^## (PN\d{3}) /gm)].map((m) => m[1]!);
    expect(table).toEqual(sorted(table));
    expect(sections).toEqual(sorted(sections));
    expect(table).toHaveLength(CHECKS.length);
  });
});
