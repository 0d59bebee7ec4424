/**
 * The lexer and the grammar read the same characters as blanks, from one list (`BLANKS` in
 * server/src/core/syntax/blanks.ts): checked over every UTF-16 code unit, in the lexer, in the
 * parser and in the grammar's patterns as ECMAScript and as Oniguruma read them.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { blankClassBody, withBlanks } from '../../grammar/build-grammar.mjs';
import { BLANKS, isBlank, isPlainBlank, parseLine } from '../../server/src/core/index';
import { squeezeBlanks } from '../../server/src/core/syntax/blanks';
import { wordsOf } from '../../server/src/core/syntax/lexer';
import { GRAMMAR_FILE, scopesOf, tokenizeLine } from './tokenize';

/** Unicode's White_Space property (Unicode 15, PropList.txt), from memory, but for the line ends. */
const WHITE_SPACE = [0x09, 0x0b, 0x0c, 0x20, 0x85, 0xa0, 0x1680, ...Array.from({ length: 11 }, (_, k) => 0x2000 + k), 0x2028, 0x2029, 0x202f, 0x205f, 0x3000];

const allCodeUnits = Array.from({ length: 0x10000 }, (_, c) => c);

describe('the blanks of the format', () => {
  it('are the White_Space characters but the line ends, and U+FEFF', () => {
    expect(BLANKS.map((b) => b.code)).toEqual([...WHITE_SPACE, 0xfeff]);
    expect(BLANKS.filter((b) => isPlainBlank(b.code)).map((b) => b.name)).toEqual(['tab', 'space']);
  });

  it('are exactly what isBlank accepts, over every code unit', () => {
    const codes = new Set(BLANKS.map((b) => b.code));
    expect(allCodeUnits.filter((c) => isBlank(c) !== codes.has(c))).toEqual([]);
    expect(isBlank(Number.NaN)).toBe(false);
  });

  it('separate words for the lexer and the parser, each of them', () => {
    for (const { code, name } of BLANKS) {
      const b = String.fromCharCode(code);
      expect(wordsOf(`hr${b}80${b}bpm`).map((w) => w.text), name).toEqual(['hr', '80', 'bpm']);
      const node = parseLine(`vitals${b}hr${b}80${b}bpm`, 0);
      expect(node.kind === 'section' && node.items.map((i) => [i.keyName, i.number, i.unitText]), name).toEqual([['hr', 80, 'bpm']]);
      expect(squeezeBlanks(`mm${b}${b}Hg`), name).toBe('mm Hg');
    }
  });

  it('are what a blank of the grammar matches, over every code unit (and the line ends the engine adds)', () => {
    const body = blankClassBody(BLANKS);
    const blank = new RegExp(`^[${body}]$`);
    const expected = new Set([0x0a, 0x0d, ...BLANKS.map((b) => b.code)]);
    expect(allCodeUnits.filter((c) => blank.test(String.fromCharCode(c)) !== expected.has(c))).toEqual([]);
  });

  it('replace every \\s of the grammar, which no pattern keeps', () => {
    const body = blankClassBody(BLANKS);
    expect(withBlanks('(?<![^\\s,])x\\s+y', body)).toBe(`(?<![^${body},])x[${body}]+y`);
    expect(withBlanks('[\\]\\s]\\\\s', body)).toBe(`[\\]${body}]\\\\s`);
    expect(() => withBlanks('\\S', body)).toThrow();
    // No pattern of the committed grammar has a `\s` left: rewriting one more time changes none.
    const patterns: string[] = [];
    const walk = (value: unknown, key = ''): void => {
      if (typeof value === 'string') {
        if (key === 'match' || key === 'begin' || key === 'end') patterns.push(value);
      } else if (value && typeof value === 'object') {
        for (const [k, v] of Object.entries(value)) walk(v, k);
      }
    };
    walk(JSON.parse(readFileSync(GRAMMAR_FILE, 'utf8')));
    expect(patterns.length).toBeGreaterThan(40);
    expect(patterns.filter((p) => withBlanks(p, '<blank>') !== p)).toEqual([]);
  });

  it('are blanks for the grammar as Oniguruma reads it, U+FEFF and U+0085 included', async () => {
    for (const { code, name } of BLANKS) {
      const line = `vitals hr${String.fromCharCode(code)}80`;
      const tokens = await tokenizeLine(line);
      expect(scopesOf(line, tokens, 'hr'), name).toContain('variable.other.key.pneumark');
      expect(scopesOf(line, tokens, '80'), name).toContain('constant.numeric.pneumark');
    }
    // Characters that are not blanks stay in their word for both (U+200B is no White_Space).
    const line = 'vitals hr\u200b80';
    const node = parseLine(line, 0);
    expect(node.kind === 'section' ? node.items.map((i) => [i.keyName, i.number]) : null).toEqual([['hr\u200b80', null]]);
    expect(scopesOf(line, await tokenizeLine(line), 'hr')).toContain('variable.other.key.unknown.pneumark');
  });
});
