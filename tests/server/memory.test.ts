// The server's memory upkeep: garbage collected once idle after analyses, never during a burst.
import { getHeapSpaceStatistics } from 'node:v8';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { IDLE_COLLECT_MS, IdleCollector, keepYoungGenerationSmall } from '../../server/src/server/memory';

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
