import { afterAll, describe, expect, it } from 'vitest';
import { AnalysisInputError, acf } from '../analysis/index.ts';
import { createAnalysisPool } from './analysis-pool.ts';

describe('analysis worker pool (real piscina threads)', () => {
  const pool = createAnalysisPool({ maxThreads: 2 });
  afterAll(() => pool.close());

  it('runs engine functions on worker threads with the same results as in-process', async () => {
    const x = Array.from({ length: 500 }, (_, t) => Math.sin(t / 7) + ((t * 37) % 11) / 10);
    const [fromPool, bands] = await Promise.all([
      pool.run({ fn: 'acf', args: [x, { maxLag: 20 }] }),
      pool.run({ fn: 'ljungBox', args: [x, { lag: 5 }] }),
    ]);
    expect(Array.from(fromPool)).toEqual(Array.from(acf(x, { maxLag: 20 })));
    expect(bands.df).toBe(5);
  });

  it('turns bad input into an AnalysisInputError with the engine message', async () => {
    await expect(pool.run({ fn: 'pacf', args: [[1]] })).rejects.toThrow(AnalysisInputError);
    await expect(pool.run({ fn: 'pacf', args: [[1]] })).rejects.toThrow('pacf requires at least 2 data points (got 1)');
  });

  it('refuses an unknown function name', async () => {
    await expect(pool.run({ fn: 'nope', args: [] } as never)).rejects.toThrow('unknown analysis function: nope');
  });

  it('keeps the calling thread free while a heavy task runs', async () => {
    const big = new Float64Array(200_000).map((_, t) => Math.sin(t / 50) + ((t * 7919) % 101) / 100);
    let ticks = 0;
    const timer = setInterval(() => ticks++, 5);
    await pool.run({ fn: 'identifyProcess', args: [big] });
    clearInterval(timer);
    expect(ticks).toBeGreaterThan(0);
  });
});
