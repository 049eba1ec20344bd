import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { loessEstimate } from './loess-estimate.ts';
import { loessSmooth } from './loess-smooth.ts';
import { stlSubseriesSmooth } from './stl-subseries-smooth.ts';

/**
 * The definition (Cleveland et al. 1990, §2.2 step 2; `stlss` in stl.f): smooth each
 * cycle-subseries on its own, extend it by one fit at each end, lay the results out in time.
 */
function bySubseries(y: number[], period: number, span: number, degree: number, jump: number, w: number[] | null): number[] {
  const n = y.length;
  const out = new Array<number>(n + 2 * period);
  for (let phase = 0; phase < period; phase++) {
    const sub = Float64Array.from(y.filter((_, t) => t % period === phase));
    const subW = w ? Float64Array.from(w.filter((_, t) => t % period === phase)) : null;
    const k = sub.length;
    const smooth = new Float64Array(k + 2);
    loessSmooth(sub, k, span, degree, jump, subW, smooth, 1);
    const before = loessEstimate(sub, k, span, degree, -1, 0, Math.min(span, k) - 1, subW);
    const after = loessEstimate(sub, k, span, degree, k, Math.max(0, k - span), k - 1, subW);
    smooth[0] = Number.isNaN(before) ? smooth[1] : before;
    smooth[k + 1] = Number.isNaN(after) ? smooth[k] : after;
    smooth.forEach((v, m) => (out[m * period + phase] = v));
  }
  return out;
}

describe('stlSubseriesSmooth', () => {
  // Covers both layouts: windows shorter than every subseries with a fit at each position
  // (computed in time order) and the rest (each subseries copied out).
  it('equals smoothing each cycle-subseries on its own', () => {
    fc.assert(
      fc.property(
        fc.record({
          period: fc.integer({ min: 2, max: 7 }),
          cycles: fc.integer({ min: 2, max: 15 }),
          extra: fc.nat(6),
          span: fc.integer({ min: 3, max: 13 }),
          degree: fc.constantFrom(0, 1),
          jump: fc.constantFrom(1, 1, 2, 3),
          robust: fc.boolean(),
          seed: fc.integer({ min: 1, max: 2147483646 }),
        }),
        ({ period, cycles, extra, span, degree, jump, robust, seed }) => {
          const n = period * cycles + (extra % period);
          let state = seed;
          const next = () => (state = (state * 48271) % 2147483647) / 2147483647;
          const y = Array.from({ length: n }, (_, t) => Math.sin(t) * 10 + next());
          const w = robust ? Array.from({ length: n }, () => (next() < 0.1 ? 0 : next())) : null;
          const out = new Float64Array(n + 2 * period);
          const scratch = { values: new Float64Array(0), weights: new Float64Array(0), smooth: new Float64Array(0) };
          stlSubseriesSmooth(Float64Array.from(y), n, period, span, degree, jump, w && Float64Array.from(w), out, scratch);
          const expected = bySubseries(y, period, span, degree, jump, w);
          expected.forEach((v, t) => expect(Math.abs(out[t] - v), `t = ${t}`).toBeLessThan(1e-9));
        },
      ),
      { numRuns: 300 },
    );
  });
});
