/**
 * Fixture notes carry their own expectations: a trailing comment `# expect: PN201 PN204`
 * names the codes that must fire on that line. Every other line must stay silent.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

export interface LineExpectation {
  readonly line: number;
  readonly codes: readonly string[];
}

export function expectationsOf(text: string): LineExpectation[] {
  const out: LineExpectation[] = [];
  text.split(/\r\n|\r|\n/).forEach((line, i) => {
    const m = /#.*\bexpect:\s*((?:PN\d{3}\s*)+)$/.exec(line);
    if (m?.[1]) out.push({ line: i, codes: m[1].trim().split(/\s+/).sort() });
  });
  return out;
}

export function fixtureFiles(...dirs: string[]): { path: string; text: string }[] {
  return dirs.flatMap((dir) =>
    readdirSync(dir)
      .filter((f) => f.endsWith('.pneu'))
      .sort()
      .map((f) => ({ path: join(dir, f), text: readFileSync(join(dir, f), 'utf8') })),
  );
}

/** Codes per line (0-based) from a list of findings. */
export function codesByLine(findings: readonly { code: string; range: { start: { line: number } } }[]): Map<number, string[]> {
  const map = new Map<number, string[]>();
  for (const f of findings) {
    const list = map.get(f.range.start.line) ?? [];
    list.push(f.code);
    map.set(f.range.start.line, list);
  }
  for (const list of map.values()) list.sort();
  return map;
}
