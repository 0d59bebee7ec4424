// A blood pressure with its measured mean in brackets (`bp 120/80 (93)`) is a common way of writing
// it on a monitor or a chart. It used to be a syntax error (`(93)` reported as stray text, PN105)
// and the measured mean was lost. The bracketed number is read as the measured mean arterial
// pressure (`mean_bp`, mmHg), as `bp 120/80, map 93` would be on a vitals line.
import { describe, expect, it } from 'vitest';
import { checkNote } from '../../server/src/core';
import { formatNote, hoverAt } from '../../server/src/core/service';
import { parseNote } from '../../server/src/core/syntax/parser';
import type { SectionLine } from '../../server/src/core/syntax/tree';
import { noteAt } from '../service/cursor';

const valuesOf = (text: string) => checkNote(text).analysis.timeline.timepoints[0]!.values;

describe('a blood pressure with its mean in brackets', () => {
  it('reads the bracketed number as the measured mean arterial pressure, with no finding', () => {
    const text = '@ 08:00\nvitals bp 120/80 (93), hr 80';
    expect(checkNote(text).findings).toEqual([]);
    const values = valuesOf(text);
    expect(values.get('mean_bp')?.stated.value).toBe(93);
    expect(values.get('bp')?.stated.usable).toBe(true);
    expect(values.get('hr')?.stated.value).toBe(80);
  });

  it('reads as `bp 120/80, map 93` does: the same values, the same derived values', () => {
    const bracketed = checkNote('@ 08:00\nvitals bp 120/80 (93) mmHg, spo2 95');
    const written = checkNote('@ 08:00\nvitals bp 120/80 mmHg, map 93, spo2 95');
    expect(bracketed.analysis.timeline.timepoints[0]!.values.get('mean_bp')?.stated.value).toBe(93);
    const derived = (r: typeof bracketed) => r.analysis.derivation(0).derived.map((d) => [d.id, d.value]);
    expect(derived(bracketed)).toEqual(derived(written));
  });

  it('keeps the span of the number inside the brackets, with the key implied by its place', () => {
    const line = parseNote('vitals bp 120/80mmHg (93)').lines[0] as SectionLine;
    const mean = line.items[1]!;
    expect(mean.key).toBeNull();
    expect(mean.implied).toBe('bracketed-mean');
    expect(mean.field?.id).toBe('mean_bp');
    expect(mean.value?.text).toBe('93');
    expect(mean.span).toMatchObject({ start: 22, end: 24 });
    expect(line.issues).toEqual([]);
  });

  it('checks the mean like any other value (an impossible one is reported)', () => {
    expect(checkNote('@ 08:00\nvitals bp 120/80 (930)').findings.map((f) => f.code)).toContain('PN301');
  });

  it('is not read after anything but a blood pressure, nor after a comma', () => {
    expect(checkNote('@ 08:00\nvitals hr 80 (93)').findings.map((f) => f.code)).toEqual(['PN105']);
    expect(checkNote('@ 08:00\nvitals bp 120/80, (93)').findings.map((f) => f.code)).toEqual(['PN105']);
    expect(valuesOf('@ 08:00\nvitals bp 120/80, (93)').get('mean_bp')).toBeUndefined();
  });

  it('is laid out by the formatter and kept as written (idempotent)', () => {
    const once = formatNote('vitals  bp 120/80   (93)  hr 80');
    expect(once).toBe('vitals    bp 120/80 (93), hr 80');
    expect(formatNote(once)).toBe(once);
    expect(formatNote('vitals bp 120 / 80 mmHg (93),hr 80')).toBe('vitals    bp 120 / 80 mmHg (93), hr 80');
  });
});

describe('hover on the mean in brackets', () => {
  it('names the measured mean arterial pressure and where it is written', () => {
    const { result, position } = noteAt('@ 08:00\nvitals bp 120/80 (9|3)');
    const md = hoverAt(result, position)?.markdown ?? '';
    expect(md).toContain('**Mean arterial pressure** — the number in brackets after the blood pressure on this `vitals` line');
    expect(md).toContain('93');
  });
});
