import { afterAll, describe, expect, it } from 'vitest';
import { AnalysisInputError, acf, channelDiagnostics } from '../analysis/index.ts';
import { createAnalysisPool } from './analysis-pool.ts';

describe('analysis worker pool (real piscina threads)', () => {
  const pool = createAnalysisPool({ maxThreads: 2 });
  afterAll(() => pool.close());

  it('runs engine functions on worker threads with the same results as in-process', async () => {
    const x = Array.from({ length: 500 }, (_, t) => Math.sin(t / 7) + ((t * 37) % 11) / 10);
    const [fromPool, bands] = await Promise.all([pool.run({ fn: 'acf', args: [x, { maxLag: 20 }] }), pool.run({ fn: 'ljungBox', args: [x, { lag: 5 }] })]);
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

  it('runs the whole channel diagnostics bundle as one task, equal to the in-process result', async () => {
    const timestamps = Array.from({ length: 300 }, (_, t) => t * 60_000);
    const values = timestamps.map((_, t) => Math.sin((2 * Math.PI * t) / 24) + ((t * 7919) % 13) / 10);
    const options = { step: 60_000, agg: 'mean' as const, period: 24, decomposition: 'stl' as const };
    const fromPool = await pool.run({ fn: 'channelDiagnostics', args: [{ timestamps, values }, options] });
    const local = channelDiagnostics({ timestamps, values }, options);
    expect(Array.from(fromPool.acf)).toEqual(Array.from(local.acf));
    expect(fromPool.identification.verdict).toBe(local.identification.verdict);
  });

  it('aborts a task when its signal fires, and keeps serving afterwards', async () => {
    const big = new Float64Array(400_000).map((_, t) => Math.sin(t / 50) + ((t * 7919) % 101) / 100);
    const controller = new AbortController();
    const running = pool.run({ fn: 'identifyProcess', args: [big] }, { signal: controller.signal });
    setTimeout(() => controller.abort(), 20);
    await expect(running).rejects.toMatchObject({ name: 'AbortError' });
    expect(Array.from(await pool.run({ fn: 'acf', args: [[1, 3, 2, 5, 4], { maxLag: 1 }] }))).toEqual(Array.from(acf([1, 3, 2, 5, 4], { maxLag: 1 })));
  });
});
