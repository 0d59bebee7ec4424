// The ROX index ((SpO2 ÷ FiO2) ÷ RR; Roca O et al., Am J Respir Crit Care Med 2019;199:1368–1376,
// from memory) needs the FiO2 the S/F ratio needs (SpO2 ÷ FiO2; Rice TW et al., Chest
// 2007;132:410–417, from memory): where it is missing, both ask for it in the same words, so
// `show` says it once.
import { describe, expect, it } from 'vitest';
import { paint } from '../../server/src/cli/colour';
import { renderShow } from '../../server/src/cli/render-show';
import { checkNote } from '../../server/src/core/check-note';
import { derivation } from './helpers';

describe('the FiO2 the ROX index needs', () => {
  const text = '@ 08:00\noxygen hfnc 50\nvitals spo2 94, rr 28';

  it('is asked for as the S/F ratio asks for it: on the high-flow line', () => {
    const missing = derivation(text).missing;
    expect(missing.find((m) => m.id === 'rox_index')?.needs).toEqual(['fio2 (on the hfnc line)']);
    expect(missing.find((m) => m.id === 'sf_ratio')?.needs).toEqual(['fio2 (on the hfnc line)']);
  });

  it('makes one line in `show`', () => {
    expect(renderShow('n.pneu', checkNote(text), paint(false))).toContain('missing  add fio2 (on the hfnc line) to get S/F, ROX');
  });
});
