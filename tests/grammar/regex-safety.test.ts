/**
 * Every regex of the editor files (grammar patterns, word pattern, folding markers) is written to
 * be safe from catastrophic backtracking, and to read the same in Oniguruma (VS Code's grammar
 * engine) and in ECMAScript (the word pattern, and ReDoS checkers):
 * - it compiles as an ECMAScript regex, without flags;
 * - no group that repeats (`*`, `+`, `{n,}`, `{n,m}` with m > 1) contains a quantifier;
 * - it answers quickly on long adversarial lines (a smoke test, not a proof).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

interface Rule {
  match?: string;
  begin?: string;
  end?: string;
  patterns?: Rule[];
  captures?: Record<string, Rule>;
  beginCaptures?: Record<string, Rule>;
  repository?: Record<string, Rule>;
}

function grammarRegexes(): { where: string; source: string }[] {
  const grammar = JSON.parse(readFileSync('grammar/pneumark.tmLanguage.json', 'utf8')) as Rule;
  const out: { where: string; source: string }[] = [];
  const walk = (rule: Rule, where: string) => {
    for (const key of ['match', 'begin', 'end'] as const) if (rule[key] !== undefined) out.push({ where: `${where}.${key}`, source: rule[key] });
    rule.patterns?.forEach((p, i) => walk(p, `${where}.patterns[${i}]`));
    for (const key of ['captures', 'beginCaptures', 'repository'] as const) {
      for (const [k, v] of Object.entries(rule[key] ?? {})) walk(v, `${where}.${key}.${k}`);
    }
  };
  walk(grammar, 'grammar');
  return out;
}

function configRegexes(): { where: string; source: string }[] {
  const config = JSON.parse(readFileSync('grammar/language-configuration.json', 'utf8')) as { wordPattern: string; folding: { markers: { start: string; end: string } } };
  return [
    { where: 'wordPattern', source: config.wordPattern },
    { where: 'folding.markers.start', source: config.folding.markers.start },
    { where: 'folding.markers.end', source: config.folding.markers.end },
  ];
}

const all = [...grammarRegexes(), ...configRegexes()];

/**
 * Finds a repeated group that holds a quantifier. Reads the source once: escapes, character
 * classes and group openings are skipped over; `?` and `{0,1}`/`{1}` do not count as repetition.
 */
function nestedQuantifier(source: string): string | null {
  const stack: { start: number; hasQuantifier: boolean }[] = [{ start: 0, hasQuantifier: false }];
  const quantifierAt = (i: number): { length: number; repeats: boolean } | null => {
    const c = source[i];
    if (c === '*' || c === '+') return { length: 1 + (source[i + 1] === '?' ? 1 : 0), repeats: true };
    if (c === '?') return { length: 1 + (source[i + 1] === '?' ? 1 : 0), repeats: false };
    if (c === '{') {
      const m = /^\{(\d+)(,(\d*))?\}/.exec(source.slice(i));
      if (!m) return null;
      const max = m[2] === undefined ? Number(m[1]) : m[3] === '' ? Infinity : Number(m[3]);
      return { length: m[0].length, repeats: max > 1 };
    }
    return null;
  };
  let i = 0;
  while (i < source.length) {
    const c = source[i]!;
    let atomEnd: number;
    if (c === '\\') {
      atomEnd = i + 2;
    } else if (c === '[') {
      let j = i + 1;
      if (source[j] === '^') j++;
      if (source[j] === ']') j++;
      while (j < source.length && source[j] !== ']') j += source[j] === '\\' ? 2 : 1;
      atomEnd = j + 1;
    } else if (c === '(') {
      stack.push({ start: i, hasQuantifier: false });
      i += source.startsWith('(?<=', i) || source.startsWith('(?<!', i) ? 4 : source[i + 1] === '?' ? 3 : 1;
      continue;
    } else if (c === ')') {
      const group = stack.pop()!;
      const q = quantifierAt(i + 1);
      const parent = stack[stack.length - 1]!;
      if (q?.repeats && group.hasQuantifier) return source.slice(group.start, i + 1 + q.length);
      if (q || group.hasQuantifier) parent.hasQuantifier = true;
      i += 1 + (q?.length ?? 0);
      continue;
    } else {
      atomEnd = i + 1;
    }
    const q = quantifierAt(atomEnd);
    if (q) stack[stack.length - 1]!.hasQuantifier = true;
    i = atomEnd + (q?.length ?? 0);
  }
  return null;
}

describe('regexes of the editor files', () => {
  it('are found', () => {
    expect(all.length).toBeGreaterThan(40);
  });

  it('compile as ECMAScript regexes (no Oniguruma-only syntax)', () => {
    const bad = all.filter(({ source }) => {
      try {
        new RegExp(source);
        return false;
      } catch {
        return true;
      }
    });
    expect(bad.map((b) => b.where)).toEqual([]);
  });

  it('repeat no group that holds a quantifier', () => {
    expect(nestedQuantifier('(a+)+')).toBe('(a+)+');
    expect(nestedQuantifier('(?:a|b*)*')).toBe('(?:a|b*)*');
    expect(nestedQuantifier('(?:x(?:y+)?)*')).not.toBeNull();
    expect(nestedQuantifier('(?:[a+]|\\+)*')).toBeNull();
    expect(nestedQuantifier('a+(?:b*)?c{1,3}')).toBeNull();
    const found = all.map((r) => ({ where: r.where, nested: nestedQuantifier(r.source) })).filter((r) => r.nested !== null);
    expect(found).toEqual([]);
  });

  it('answer quickly on long adversarial lines', () => {
    const n = 3000;
    const inputs = [
      ' '.repeat(n) + 'x',
      '1'.repeat(n) + 'x',
      '1,'.repeat(n) + 'x',
      '1/'.repeat(n) + 'x',
      '1.1/'.repeat(n) + 'x',
      'a'.repeat(n) + '!',
      'a1,'.repeat(n),
      'room '.repeat(n),
      'vitals hr ' + '1 '.repeat(n) + '%x',
      '@ ' + '+1d'.repeat(n),
      '@ day ' + '1 '.repeat(n) + ':',
      'note ' + 'a '.repeat(n) + '\t',
      ',' .repeat(n) + '#',
      '\t'.repeat(n) + '@',
      // The blanks beyond ASCII are in the same classes as the space (blanks.ts): long runs of
      // them, mixed with spaces, between words and before a unit of two words.
      '\u00A0'.repeat(n) + 'x',
      '\uFEFF \u2009'.repeat(n) + '#',
      'vitals hr' + '\u3000'.repeat(n) + '80' + '\u202F'.repeat(n) + 'mm',
      'abg po2 80 mm' + ' \u0085'.repeat(n) + '!',
      '@\u2028day' + '\u00A01'.repeat(n) + ':',
    ];
    const slow: string[] = [];
    for (const { where, source } of all) {
      const regex = new RegExp(source);
      for (const input of inputs) {
        // The least of up to three runs: a run of a few milliseconds may be stretched by another
        // process taking the processor meanwhile (a loaded CI machine), while a regex that
        // backtracks catastrophically on such a line is slow every time.
        let ms = Infinity;
        for (let run = 0; run < 3 && ms > 250; run++) {
          const t0 = performance.now();
          regex.test(input);
          ms = Math.min(ms, performance.now() - t0);
        }
        if (ms > 250) slow.push(`${where} on ${JSON.stringify(input.slice(0, 12))}…: ${ms.toFixed(0)} ms`);
      }
    }
    expect(slow).toEqual([]);
  });
});
