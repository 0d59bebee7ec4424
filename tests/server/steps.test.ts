// How the server sizes the steps a big analysis is read in (see NoteSession.steps).
import { describe, expect, it } from 'vitest';
import { nextStepLines } from '../../server/src/server/server';

describe('nextStepLines', () => {
  it('scales the next step to the time budget (25 ms) by how long the last one took', () => {
    expect(nextStepLines(1000, 50)).toBe(500);
    expect(nextStepLines(1000, 25)).toBe(1000);
    expect(nextStepLines(1000, 20)).toBe(1250);
  });

  it('at most doubles a step, and keeps between 100 and 8,000 lines', () => {
    expect(nextStepLines(500, 1)).toBe(1000);
    expect(nextStepLines(500, 0)).toBe(1000);
    expect(nextStepLines(6000, 1)).toBe(8000);
    expect(nextStepLines(500, 10_000)).toBe(100);
  });
});
