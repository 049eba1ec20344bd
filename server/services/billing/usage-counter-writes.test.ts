import { describe, expect, it } from 'vitest';
import { createUsageCounterWrites } from './usage-counter-writes.ts';

/** A write whose completion the test controls. */
function heldWrites() {
  const calls: Array<{ labId: number; count: number; done: () => void; fail: (err: Error) => void }> = [];
  const write = (labId: number, count: number) =>
    new Promise<void>((resolve, reject) => calls.push({ labId, count, done: resolve, fail: reject }));
  return { calls, write };
}
const tick = () => new Promise((resolve) => setImmediate(resolve));

describe('usage counter writes', () => {
  it('writes the first bump at once and sums the bumps that arrive while it is on its way', async () => {
    const { calls, write } = heldWrites();
    const writes = createUsageCounterWrites(write, () => undefined);
    writes.add(7, 5000);
    writes.add(7, 3000);
    writes.add(7, 2000);
    expect(calls.map((c) => [c.labId, c.count])).toEqual([[7, 5000]]);
    expect(writes.pending(7)).toBe(10_000);

    calls[0].done();
    await tick();
    expect(calls.map((c) => [c.labId, c.count])).toEqual([
      [7, 5000],
      [7, 5000],
    ]);
    expect(writes.pending(7)).toBe(5000);
    calls[1].done();
    await writes.settled();
    expect(writes.pending(7)).toBe(0);
    expect(calls).toHaveLength(2);
  });

  it('keeps labs apart: one lab’s write in flight never holds back another’s', () => {
    const { calls, write } = heldWrites();
    const writes = createUsageCounterWrites(write, () => undefined);
    writes.add(1, 10);
    writes.add(2, 20);
    expect(calls.map((c) => [c.labId, c.count])).toEqual([
      [1, 10],
      [2, 20],
    ]);
    expect(writes.pending(1)).toBe(10);
    expect(writes.pending(2)).toBe(20);
    expect(writes.pending(3)).toBe(0);
  });

  it('reports a failed write, drops that bump and goes on with the next', async () => {
    const { calls, write } = heldWrites();
    const failures: Array<[number, string]> = [];
    const writes = createUsageCounterWrites(write, (labId, err) => failures.push([labId, (err as Error).message]));
    writes.add(4, 100);
    writes.add(4, 1);
    calls[0].fail(new Error('database went away'));
    await tick();
    expect(failures).toEqual([[4, 'database went away']]);
    expect(calls[1].count).toBe(1);
    expect(writes.pending(4)).toBe(1);
    calls[1].done();
    await writes.settled();
    expect(writes.pending(4)).toBe(0);
  });

  it('ignores a bump of nothing', () => {
    const { calls, write } = heldWrites();
    const writes = createUsageCounterWrites(write, () => undefined);
    writes.add(9, 0);
    expect(calls).toHaveLength(0);
    return writes.settled();
  });
});
