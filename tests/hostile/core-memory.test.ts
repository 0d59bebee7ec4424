// The heap an editing session keeps for a hostile note: bare `@` lines, a timepoint and a finding
// (PN104) every two bytes, the most a note can make the core keep per byte. Measured after full
// collections, with V8's collector exposed as the language server exposes it (memory.ts).
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { describe, expect, it } from 'vitest';
import { NoteSession } from '../../server/src/core/session';

function collector(): () => void {
  setFlagsFromString('--expose-gc');
  const gc = runInNewContext('gc') as () => void;
  return () => { gc(); gc(); };
}

describe('the heap kept for a note of bare `@` lines', () => {
  it('stays under 560 bytes per byte of note, findings with the same message and no fix sharing them', () => {
    const collect = collector();
    const text = '@\n'.repeat(100_000);
    collect();
    const before = process.memoryUsage().heapUsed;
    const session = new NoteSession();
    const result = session.update(text);
    collect();
    const perByte = (process.memoryUsage().heapUsed - before) / text.length;
    expect(result.findings).toHaveLength(100_000);
    expect(result.findings.every((f) => f.code === 'PN104' && f.fixes.length === 0)).toBe(true);
    // The same (empty) list, not a copy per finding.
    expect(result.findings[1]!.message).toBe(result.findings[0]!.message);
    expect(result.findings[1]!.fixes).toBe(result.findings[0]!.fixes);
    // 637 bytes a byte before the empty lists and messages were shared (465 since): the limit
    // catches a return to the old cost with room for the heap's own noise between runs.
    expect(perByte).toBeLessThan(560);
    expect(session.update(text).findings).toHaveLength(100_000);
  });
});
