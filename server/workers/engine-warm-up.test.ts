import { afterEach, describe, expect, it, vi } from 'vitest';
import * as analysis from '../analysis/index.ts';
import { warmUpEngine } from './engine-warm-up.ts';

vi.mock('../analysis/index.ts', async (importOriginal) => {
  const actual = await importOriginal<typeof analysis>();
  return { ...actual, channelDiagnostics: vi.fn(actual.channelDiagnostics) };
});

afterEach(() => vi.mocked(analysis.channelDiagnostics).mockClear());

describe('warmUpEngine', () => {
  it('runs the whole diagnostics bundle, once with a partner channel, on data the engine accepts', () => {
    warmUpEngine(2);
    const spy = vi.mocked(analysis.channelDiagnostics);
    expect(spy).toHaveBeenCalledTimes(2);
    expect(spy.mock.calls[0][2]).toBeDefined();
    expect(spy.mock.calls[1][2]).toBeUndefined();
    const result = spy.mock.results[0];
    expect(result.type).toBe('return');
    const bundle = result.value as analysis.ChannelDiagnostics;
    // the paths the JIT should see: a detected daily period, a decomposition, a cross-correlation
    expect(Math.abs(bundle.period.used! - 1440)).toBeLessThanOrEqual(14); // the synthetic daily cycle, within 1%
    expect(bundle.decomposition.method).toBe('stl');
    expect(bundle.crossCorrelation).not.toBeNull();
  });

  it('never throws: a failing engine only leaves the worker cold', () => {
    vi.mocked(analysis.channelDiagnostics).mockImplementationOnce(() => {
      throw new Error('engine broke');
    });
    expect(() => warmUpEngine(1)).not.toThrow();
  });
});
