// The server's memory upkeep: garbage collected once idle after analyses, never during a burst.
import { getHeapSpaceStatistics } from 'node:v8';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { heapBudgetBytes, heapCeilingFor, IDLE_COLLECT_MS, IdleCollector, keepYoungGenerationSmall, lineLongerThan, maxLineChars, overHeapBudget, SMALL_NOTE_CHARS } from '../../server/src/server/memory';

afterEach(() => {
  vi.useRealTimers();
});

describe('IdleCollector', () => {
  it('collects once the server has been idle after the last analysis, not while analyses keep coming', () => {
    vi.useFakeTimers();
    const collect = vi.fn();
    const collector = new IdleCollector(collect, 1000);
    for (let i = 0; i < 5; i++) {
      collector.analysed();
      vi.advanceTimersByTime(600);
    }
    expect(collect).not.toHaveBeenCalled();
    vi.advanceTimersByTime(400);
    // Twice in a row: the second collection hands the freed pages back to the system.
    expect(collect).toHaveBeenCalledTimes(2);
    expect(collector.count).toBe(1);
    vi.advanceTimersByTime(10_000);
    expect(collect).toHaveBeenCalledTimes(2);
    collector.analysed();
    vi.advanceTimersByTime(1000);
    expect(collector.count).toBe(2);
  });

  it('does nothing without a collector, and stops on dispose', () => {
    vi.useFakeTimers();
    const none = new IdleCollector(null);
    none.analysed();
    vi.advanceTimersByTime(IDLE_COLLECT_MS * 2);
    expect(none.available).toBe(false);
    expect(none.count).toBe(0);
    const collect = vi.fn();
    const some = new IdleCollector(collect, 100);
    some.analysed();
    some.dispose();
    vi.advanceTimersByTime(1000);
    expect(collect).not.toHaveBeenCalled();
  });

  it('finds V8\'s collector on this Node, and it runs', () => {
    const collector = new IdleCollector();
    expect(collector.available).toBe(true);
  });
});

describe('young generation', () => {
  it('stays at its starting size after a burst of allocation once the growth factor is set', () => {
    keepYoungGenerationSmall();
    const before = getHeapSpaceStatistics().find((s) => s.space_name === 'new_space')!.space_size;
    const kept: object[] = [];
    for (let i = 0; i < 300_000; i++) kept.push({ i, nested: { i } });
    const after = getHeapSpaceStatistics().find((s) => s.space_name === 'new_space')!.space_size;
    expect(kept.length).toBe(300_000);
    expect(after).toBeLessThanOrEqual(before);
  });
});

describe('the heap budget of analyses', () => {
  it('is half of the heap limit, at most 1.5 GB, and collects before it says the heap is over it', () => {
    expect(heapBudgetBytes(400 * 1048576)).toBe(200 * 1048576);
    expect(heapBudgetBytes(8192 * 1048576)).toBe(1536 * 1048576);
    expect(maxLineChars(800_000)).toBe(1000);
    const collect = vi.fn();
    // A budget of one byte: over it after a collection too.
    expect(overHeapBudget(new IdleCollector(collect), 1)).toBe(true);
    expect(collect).toHaveBeenCalledTimes(2);
    // Without a collector the heap in use is taken as it is.
    expect(overHeapBudget(new IdleCollector(null), 1)).toBe(true);
    expect(overHeapBudget(new IdleCollector(collect), Number.MAX_SAFE_INTEGER)).toBe(false);
    expect(collect).toHaveBeenCalledTimes(2);
  });

  it('holds a big note to the budget, and a small one only to the budget plus half the room above it', () => {
    const MB = 1048576;
    expect(heapCeilingFor(SMALL_NOTE_CHARS + 1, 400 * MB)).toBe(200 * MB);
    expect(heapCeilingFor(SMALL_NOTE_CHARS, 400 * MB)).toBe(300 * MB);
    expect(heapCeilingFor(0, 8192 * MB)).toBe((1536 + (8192 - 1536) / 2) * MB);
    // Even a hostile small note (800 bytes of heap a character at most, see maxLineChars) fits
    // between its ceiling and V8's limit, down to a limit as small as 128 MB.
    expect(128 * MB - heapCeilingFor(SMALL_NOTE_CHARS, 128 * MB)).toBeGreaterThan(SMALL_NOTE_CHARS * 800 * 0.6);
  });

  it('finds the first line longer than a limit, with every line end (LF, CRLF, CR) counted as the editor counts it', () => {
    expect(lineLongerThan('short\nlines', 10)).toBeNull();
    expect(lineLongerThan(`a\r\nb\rc\n${'x'.repeat(11)}\nd`, 10)).toEqual({ line: 3, length: 11 });
    expect(lineLongerThan(`${'x'.repeat(10)}\r\n${'y'.repeat(10)}`, 10)).toBeNull();
    expect(lineLongerThan(`a\n${'z'.repeat(12)}`, 10)).toEqual({ line: 1, length: 12 });
  });
});
