/**
 * A name in `disabledChecks` that is no check's, and the check it likely meant: a code typed with
 * a letter O for a zero (`PN41O`), as happens when codes are copied by hand from a printed list,
 * named nothing (it is one edit from ten codes), so the check stayed on with no hint why.
 */
import { describe, expect, it } from 'vitest';
import { unknownCheckNames } from '../../server/src/core/config';

const likely = (name: string) => unknownCheckNames([name])[0]?.likely;

describe('the check a mistyped code likely meant', () => {
  it('a letter O for a zero, an l or I for a one, among the digits of a code', () => {
    expect(likely('PN41O')).toEqual(['PN410 (oxygenation-reading)']);
    expect(likely('pn3O2')).toEqual(['PN302 (unusual-value)']);
    expect(likely('PN3l2')).toEqual(['PN312 (set-rate-zero)']);
    expect(likely('PNI01')).toEqual(['PN101 (unknown-section)']);
    expect(likely('PN 4O5')).toEqual(['PN405 (driving-pressure-high)']);
    expect(likely('41O')).toEqual(['PN410 (oxygenation-reading)']);
  });

  it('as before: a code with a space, and the fewest edits where no code is read', () => {
    expect(likely('PN 101')).toEqual(['PN101 (unknown-section)']);
    expect(likely('PN220')).toEqual(['PN202 (unknown-unit)', 'PN320 (pressure-unlike-altitude)']);
    expect(likely('PN30')).toEqual([]);
    // Letters alone are no code: an alias far from any is left without a guess.
    expect(likely('oil')).toEqual([]);
  });

  it('a code so read that is no check is not offered (PN40O: there is no PN400)', () => {
    expect(likely('PN40O')).toEqual([]);
  });
});
