// The message for a note over pneumark.maxNoteSizeKb: the note's size in a unit that shows it is
// over the limit (a note of 22 KB over a limit of 16 KB is not "0.0 MB"), and what to do.
import { describe, expect, it } from 'vitest';
import { tooLargeMessage } from '../../server/src/server/too-large-message';

const KB = 1024;
const MB = 1024 * 1024;

describe('the message for a note over the size limit', () => {
  it('gives a note under 1 MB in KB, so that a lowered limit reads sensibly', () => {
    expect(tooLargeMessage(22_500, 16 * KB)).toBe('Pneumark does not analyse notes over 16 KB (this one is 22 KB): split it into smaller notes, or raise pneumark.maxNoteSizeKb.');
  });

  it('keeps the size over the limit where rounding to whole KB would make it equal', () => {
    // 16 KB and 100 bytes is 16.1 KB: "16 KB" beside "over 16 KB" would contradict it.
    expect(tooLargeMessage(16 * KB + 100, 16 * KB)).toMatch(/over 16 KB \(this one is 16\.1 KB\)/);
  });

  it('gives a note of 1 MB or more in MB', () => {
    expect(tooLargeMessage(Math.round(3.1 * MB), 2048 * KB)).toBe('Pneumark does not analyse notes over 2048 KB (this one is 3.1 MB): split it into smaller notes, or raise pneumark.maxNoteSizeKb.');
    // 2 MB and 1 KB over a limit of 2048 KB (2 MB): more decimals rather than "2.0 MB".
    expect(tooLargeMessage(2 * MB + KB, 2048 * KB)).toMatch(/over 2048 KB \(this one is 2\.001 MB\)/);
  });

  it('at the largest limit, offers pneumark check rather than a higher limit', () => {
    expect(tooLargeMessage(20 * MB, 4096 * KB)).toBe('Pneumark does not analyse notes over 4096 KB (this one is 20.0 MB), the most pneumark.maxNoteSizeKb allows: split it into smaller notes, or run `pneumark check` on it.');
  });
});
