/**
 * grammar/language-configuration.json and grammar/snippets.json: the word pattern selects the
 * tokens of a note as single words, the folding markers read, and every snippet is well formed.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { FIELDS, parseLine } from '../../server/src/core/index';

interface LanguageConfiguration {
  comments: { lineComment: string };
  wordPattern: string;
  folding: { markers: { start: string; end: string } };
}
interface Snippet {
  prefix: string | string[];
  body: string[];
  description: string;
}

const config = JSON.parse(readFileSync('grammar/language-configuration.json', 'utf8')) as LanguageConfiguration;
const snippets = JSON.parse(readFileSync('grammar/snippets.json', 'utf8')) as Record<string, Snippet>;

/** Example values for the placeholders of the snippets. */
const EXAMPLE: Readonly<Record<string, string>> = {
  N: '2', label: 'review', pH: '7.40', PaCO2: '40', PaO2: '95', HCO3: '24', BE: '-1', lactate: '1.1',
  VT: '420', rate: '16', PEEP: '8', FiO2: '0.4', Pplat: '24', Ppeak: '30',
  age: '64', height: '163', weight: '71', flow: '2', HR: '80', RR: '16', SpO2: '96', temp: '37.2', sys: '120', dia: '80',
};

/** Expands a snippet body as VS Code would when every stop is accepted: first choices, default texts. */
function expand(body: string, fill: boolean): string {
  let text = body.replace(/\$CURRENT_HOUR/g, '08').replace(/\$CURRENT_MINUTE/g, '05');
  const innermost = /\$\{(\d+)(?::([^${}]*)|\|([^|]*)\|)\}/;
  for (let m = innermost.exec(text); m; m = innermost.exec(text)) {
    const name = m[2]?.replace(/^<(.*)>$/, '$1');
    const value = m[3] !== undefined ? m[3].split(',')[0]! : fill && name !== undefined && EXAMPLE[name] !== undefined ? EXAMPLE[name]! : (m[2] ?? '');
    text = text.slice(0, m.index) + value + text.slice(m.index + m[0].length);
  }
  return text.replace(/\$0/g, '');
}

/** The word at a column, found as VS Code finds it: the match of the word pattern that covers it. */
function wordAt(line: string, column: number): string | null {
  const pattern = new RegExp(config.wordPattern, 'g');
  for (const m of line.matchAll(pattern)) {
    if (m.index <= column && column < m.index + m[0].length) return m[0];
  }
  return null;
}

function words(line: string): string[] {
  return [...line.matchAll(new RegExp(config.wordPattern, 'g'))].map((m) => m[0]);
}

describe('language configuration', () => {
  it('comments with #', () => {
    expect(config.comments.lineComment).toBe('#');
  });

  it('selects keys, numbers, negative numbers and units as whole words', () => {
    const line = 'abg       ph 7.35, pco2 41, be -2, fio2 0.4, po2 71 mmHg  # oxygen 4 L/min, peep 10 cmH2O';
    for (const word of ['pco2', 'fio2', '7.35', '-2', 'L/min', 'cmH2O', 'mmHg', '0.4']) {
      const at = line.indexOf(word);
      for (let c = at; c < at + word.length; c++) expect(wordAt(line, c), `${word} at ${c}`).toBe(word);
    }
  });

  it('splits a shorthand gas into its numbers, and a glued unit from its number', () => {
    expect(words('abg 7.28/56/71/26')).toEqual(['abg', '7.28', '56', '71', '26']);
    expect(words('bp 96/58')).toEqual(['bp', '96', '58']);
    expect(words('spo2 89%, temp 38.4C, hr 118/min')).toEqual(['spo2', '89', '%', 'temp', '38.4', 'C', 'hr', '118', '/min']);
    expect(words('ph 7,35')).toEqual(['ph', '7', '35']);
  });

  it('keeps times, keys with underscores and accented prose words whole', () => {
    expect(words('@ day 1 07:40  arrival')).toEqual(['day', '1', '07:40', 'arrival']);
    expect(words('@ +2h30  after')).toEqual(['+2h30', 'after']);
    expect(words('abg base_excess −3')).toEqual(['abg', 'base_excess', '−3']);
    expect(words('note café')).toEqual(['note', 'café']);
  });

  it('never matches an empty string (VS Code would loop on it)', () => {
    for (const text of ['', ' ', ',', '#', '@', '/', '.', '-', '+', ':']) {
      for (const m of text.matchAll(new RegExp(config.wordPattern, 'g'))) expect(m[0].length).toBeGreaterThan(0);
    }
  });

  it('folds between # region and # endregion comments (timepoint folding comes from the language server)', () => {
    const start = new RegExp(config.folding.markers.start);
    const end = new RegExp(config.folding.markers.end);
    expect(start.test('# region day 1')).toBe(true);
    expect(start.test('  #region')).toBe(true);
    expect(end.test('# endregion')).toBe(true);
    expect(start.test('# endregion')).toBe(false);
    expect(start.test('note # region')).toBe(false);
    expect(start.test('@ day 1 07:40')).toBe(false);
  });
});

describe('snippets', () => {
  const entries = Object.entries(snippets);

  it('parse, and each has a prefix, a description and a non-empty body of lines', () => {
    expect(entries.length).toBeGreaterThanOrEqual(6);
    for (const [name, s] of entries) {
      expect(Array.isArray(s.body), name).toBe(true);
      expect(s.body.length, name).toBeGreaterThan(0);
      expect(s.body.every((l) => typeof l === 'string'), name).toBe(true);
      expect(s.body.join('').trim().length, name).toBeGreaterThan(0);
      const prefixes = Array.isArray(s.prefix) ? s.prefix : [s.prefix];
      expect(prefixes.length, name).toBeGreaterThan(0);
      for (const p of prefixes) expect(p, name).toMatch(/^[a-z][a-z0-9]*$/);
      expect(s.description.length, name).toBeGreaterThan(0);
    }
  });

  it('cover the timepoints, the shorthand gas, the ventilator, the patient header and oxygen', () => {
    const bodies = entries.map(([, s]) => s.body[0]!);
    expect(bodies.some((b) => b.startsWith('@ day '))).toBe(true);
    expect(bodies.some((b) => b.startsWith('@ +'))).toBe(true);
    expect(bodies.some((b) => /^abg\s+\$\{1:<pH>\}\/\$\{2:<PaCO2>\}\/\$\{3:<PaO2>\}\/\$\{4:<HCO3>\}/.test(b))).toBe(true);
    expect(bodies.some((b) => /^vent\s+mode /.test(b))).toBe(true);
    expect(bodies.some((b) => /^patient\s+age /.test(b))).toBe(true);
    expect(bodies.some((b) => /^oxygen\s+\$\{1\|cannula,.*,room air\|\}/.test(b))).toBe(true);
  });

  it('offer the device and mode words of the registry as choices', () => {
    const canonical = (id: string) => [...new Set(Object.values(FIELDS.find((f) => f.id === id)?.words ?? {}))];
    const text = JSON.stringify(snippets);
    const devices = canonical('device');
    expect(text).toContain(`|${[...devices.filter((d) => d !== 'room air'), 'room air'].join(',')}|`);
    expect(text).toContain(`|${canonical('mode').join(',')}|`);
  });

  it('filled with example values, give lines the parser reads without a finding', () => {
    for (const [name, s] of entries) {
      for (const line of expand(s.body.join('\n'), true).split('\n')) {
        expect(parseLine(line, 0).issues.map((i) => `${i.check}: ${i.message}`), `${name}: ${line}`).toEqual([]);
      }
    }
  });

  it('left unfilled, give data lines the parser reports (placeholders are words, not plausible numbers)', () => {
    const withData = entries.filter(([, s]) => [...s.body.join('').matchAll(/\$\{\d+:<?([A-Za-z0-9]+)>?\}/g)].some((m) => /^[-\d.]+$/.test(EXAMPLE[m[1]!] ?? '')));
    expect(withData.length).toBeGreaterThanOrEqual(5);
    for (const [name, s] of withData) {
      const issues = expand(s.body.join('\n'), false).split('\n').flatMap((line) => parseLine(line, 0).issues);
      expect(issues.length, name).toBeGreaterThan(0);
    }
  });

  it('left unfilled, give one finding (PN102) for each value placeholder, its unit included, and none besides', () => {
    for (const [name, s] of entries) {
      for (const line of expand(s.body.join('\n'), false).split('\n')) {
        if (line.startsWith('@') || line.trim() === '') continue;
        // Placeholders joined by slashes (`<sys>/<dia>`, a shorthand gas) are one word, so one finding.
        const words = line.split(/[\s,]+/).filter((w) => /<[A-Za-z]/.test(w)).length;
        const issues = parseLine(line, 0).issues;
        expect(issues.map((i) => i.check), `${name}: ${line}`).toEqual(Array(words).fill('missing-value'));
        expect(issues.every((i) => /placeholders? left unfilled/.test(i.message)), `${name}: ${line}`).toBe(true);
      }
    }
  });

  it('use well-formed tab stops: balanced braces, numbered placeholders, a final $0', () => {
    for (const [name, s] of entries) {
      const body = s.body.join('\n');
      let depth = 0;
      for (let i = 0; i < body.length; i++) {
        if (body[i] === '$' && body[i + 1] === '{') depth++;
        else if (body[i] === '}' && depth > 0) depth--;
      }
      expect(depth, name).toBe(0);
      for (const m of body.matchAll(/\$\{([^:|}]+)[:|]/g)) expect(m[1], name).toMatch(/^\d+$/);
      expect(body.endsWith('$0'), name).toBe(true);
    }
  });
});
