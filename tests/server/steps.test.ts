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

  it('reads at least a sixteenth of what was read so far, so a huge note takes few steps', () => {
    expect(nextStepLines(100, 80, 160_000)).toBe(10_000);
    expect(nextStepLines(8000, 1, 320_000)).toBe(20_000);
    expect(nextStepLines(1000, 25, 8_000)).toBe(1000);
    // The number of steps to read a note grows with the logarithm of its length.
    const stepsFor = (total: number) => {
      let read = 0;
      let lines = 500;
      let steps = 0;
      while (read < total) {
        read += lines;
        lines = nextStepLines(lines, 200, read); // a slow machine: every step over budget
        steps++;
      }
      return steps;
    };
    expect(stepsFor(300_000)).toBeLessThan(110);
    expect(stepsFor(600_000)).toBeLessThan(stepsFor(300_000) + 15);
  });
});
