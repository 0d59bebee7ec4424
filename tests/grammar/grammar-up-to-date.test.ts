/**
 * The committed grammar and snippets are what grammar/build-grammar.mjs makes from the
 * registries: a key, alias, unit, device word or mode added to the registry must reach the
 * editor files too (run `npm run build && node grammar/build-grammar.mjs`).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildGrammar, generatedFiles } from '../../grammar/build-grammar.mjs';
import { BLANKS, FIELDS, SECTIONS, UNITS } from '../../server/src/core/index';

const registries = { SECTIONS, FIELDS, UNITS, BLANKS };

describe('generated editor files', () => {
  for (const file of generatedFiles(registries)) {
    const name = file.path.replace(/^.*[\\/]grammar[\\/]/, 'grammar/');
    it(`${name} is up to date with the registries`, () => {
      const committed = readFileSync(file.path, 'utf8');
      // Compare parsed first for a readable diff, then byte for byte (formatting, final newline).
      expect(JSON.parse(committed)).toEqual(JSON.parse(file.text));
      expect(committed).toBe(file.text);
    });
  }

  it('is the same for the same registries (pure)', () => {
    expect(buildGrammar(registries)).toEqual(buildGrammar(registries));
  });

});
