// An age written in months is shown in years, the canonical unit, with the months as written
// beside it. A year is 12 months (a definition, no source needed): 8 months is 8 ÷ 12 = 0.67 y.
// Shown with the age field's whole years, an infant of 8 months read "age 1 y (8 mo)" and one of
// 30 months "age 3 y (30 mo)" (2.5 rounded up): a year or half a year off, in the age a reader
// checks first at a child's bedside. Years from months now keep two decimals, trailing zeros
// dropped, as the "no upper normal at age 0.67 y" of the A–a gradient already writes them.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core/check-note';
import { formatStated } from '../../server/src/core/present';

function statedAge(text: string): string {
  const age = checkNote(text).analysis.timeline.header.find((s) => s.fieldId === 'age');
  if (!age) throw new Error('no age stated');
  return formatStated(age);
}

describe('an age written in months is shown in years without rounding it to whole years (12 months = 1 year, by definition)', () => {
  it('8 months is 0.67 y, not 1 y', () => {
    expect(statedAge('patient age 8 mo\n@ 08:00\nvitals hr 120')).toBe('0.67 y');
  });

  it('30 months is 2.5 y, not 3 y; 18 months 1.5 y; 24 months 2 y', () => {
    expect(statedAge('patient age 30 mo\n@ 08:00\nvitals hr 110')).toBe('2.5 y');
    expect(statedAge('patient age 18 mo\n@ 08:00\nvitals hr 110')).toBe('1.5 y');
    expect(statedAge('patient age 24 mo\n@ 08:00\nvitals hr 110')).toBe('2 y');
  });

  it('`show` writes the header as "age 0.67 y (8 mo)"', async () => {
    const { renderShow } = await import('../../server/src/cli/render-show');
    const { paint } = await import('../../server/src/cli/colour');
    const text = 'patient age 8 mo, weight 8 kg\n@ 08:00\noxygen room air\nabg 7.38/36/70/21';
    expect(renderShow('infant.pneu', checkNote(text), paint(false))).toContain('age 0.67 y (8 mo)');
  });

  it('an age written in years is shown as before', () => {
    expect(statedAge('patient age 64 y\n@ 08:00\nvitals hr 80')).toBe('64 y');
    expect(statedAge('patient age 64\n@ 08:00\nvitals hr 80')).toBe('64 y');
  });
});
