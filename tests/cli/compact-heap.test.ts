// Between the check and the pages a build gives back the heap the check grew and no longer uses.
import { describe, expect, it } from 'vitest';
import { compactFromBytes, compactHeap } from '../../src/cli/compact-heap.ts';

describe('compacting the heap after the check', () => {
  it('frees what was dropped and hands the emptied heap back, keeping what is still held', () => {
    // Objects that live through collections (as a check's models do) land in the old generation; every tenth is kept,
    // so that the dropped ones leave holes on every page of the heap rather than whole empty pages.
    let all: Array<{ id: number; text: string }> | undefined = Array.from({ length: 600_000 }, (_, i) => ({ id: i, text: `step ${i} of a procedure` }));
    expect(compactHeap(0)).toBe(true);
    const kept = all.filter((_, i) => i % 10 === 0);
    all = undefined;
    const before = process.memoryUsage();
    expect(compactHeap(0)).toBe(true);
    const after = process.memoryUsage();
    // Source: common practice: V8 moves live objects together and returns emptied pages only in a compacting collection.
    expect(before.heapUsed - after.heapUsed).toBeGreaterThan(20 * 1024 * 1024);
    expect(before.heapTotal - after.heapTotal).toBeGreaterThan(20 * 1024 * 1024);
    expect(kept).toHaveLength(60_000);
    expect(kept[5_999].text).toBe('step 59990 of a procedure');
  });

  it('leaves a small heap alone', () => {
    expect(process.memoryUsage().heapTotal).toBeLessThan(compactFromBytes);
    expect(compactHeap()).toBe(false);
    expect(compactHeap(process.memoryUsage().heapTotal + 1)).toBe(false);
  });
});
