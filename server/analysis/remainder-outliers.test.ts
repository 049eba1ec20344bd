/**
 * Seeded simulations with known truth (no outliers but the ones injected): a week of 5-minute
 * cells with a daily cycle, decomposed by periodic STL as the diagnostics do, and the remainder
 * judged by `remainderOutliers`. The rule itself is Hampel's median ± k · 1.4826 · MAD
 * (Hampel 1974; Rousseeuw & Croux 1993), taken at each position in the cycle.
 */
import { describe, expect, it } from 'vitest';
import { AnalysisInputError } from './analysis-input-error.ts';
import { remainderOutliers } from './remainder-outliers.ts';
import { seededNormal, seededUniform } from './seeded-simulation.testkit.ts';
import { stl } from './stl.ts';

const DAY = 288; // 5-minute cells per day
const N = 7 * DAY;

/** Daylight arch 0…1 between 06:00 and 18:00 (a light or glasshouse temperature cycle). */
const arch = (i: number) => {
  const h = ((i % DAY) / DAY) * 24;
  return h > 6 && h < 18 ? Math.sin((Math.PI * (h - 6)) / 12) : 0;
};

/** Noise SD of a clean week: 0.1 at night, rising to 0.5 at the daily peak (a sensor noisier in sunlight). */
const noiseSd = (i: number) => 0.1 + 0.4 * arch(i);

/**
 * A clean week: the daily arch, its height changing from day to day by up to ±2.5 %, plus
 * N(0, noiseSd²) noise. Nothing in it is an outlier.
 */
function cleanWeek(seed: number): Float64Array {
  const z = seededNormal(seed);
  const u = seededUniform(seed + 1000);
  const heights = Array.from({ length: 7 }, () => 1 + 0.05 * (u() - 0.5));
  return Float64Array.from({ length: N }, (_, i) => 15 + 8 * heights[Math.floor(i / DAY)] * arch(i) + noiseSd(i) * z());
}

const remainderOf = (x: Float64Array) => stl(x, { period: DAY, seasonalWindow: 'periodic' }).remainder;

/** The old rule, one median and one MAD for the whole remainder, for contrast. */
function wholeRemainderFlags(r: Float64Array, k: number): number {
  const sorted = Array.from(r).sort((a, b) => a - b);
  const median = (sorted[N / 2 - 1] + sorted[N / 2]) / 2;
  const dev = Array.from(r, (v) => Math.abs(v - median)).sort((a, b) => a - b);
  const sd = 1.4826 * ((dev[N / 2 - 1] + dev[N / 2]) / 2);
  return r.filter((v) => Math.abs(v - median) > k * sd).length;
}

describe('remainderOutliers', () => {
  it('flags at most 1 % of a clean week whose noise is larger by day than by night (20 seeds)', () => {
    let worstNew = 0;
    let worstOld = 0;
    for (let seed = 1; seed <= 20; seed++) {
      const r = remainderOf(cleanWeek(seed));
      const flagged = remainderOutliers(r, { period: DAY, threshold: 3 }).indices.length;
      worstNew = Math.max(worstNew, flagged);
      worstOld = Math.max(worstOld, wholeRemainderFlags(r, 3));
    }
    expect(worstNew).toBeLessThanOrEqual(0.01 * N);
    // one spread for the whole remainder judged the daytime noise against the quiet night
    // (168–186 cells here when measured; the assertion only needs it well above 1 %)
    expect(worstOld).toBeGreaterThan(0.05 * N);
  });

  it('flags at most 1 % of a steady cycle with plain noise (20 seeds)', () => {
    for (let seed = 21; seed <= 40; seed++) {
      const z = seededNormal(seed);
      const x = Float64Array.from({ length: N }, (_, i) => 20 + 3 * Math.sin((2 * Math.PI * i) / DAY) + 0.3 * z());
      expect(remainderOutliers(remainderOf(x), { period: DAY, threshold: 3 }).indices.length).toBeLessThanOrEqual(0.01 * N);
    }
  });

  it('still flags a spike of 8 noise SDs at the daily peak and at night (20 seeds)', () => {
    for (let seed = 1; seed <= 20; seed++) {
      const x = cleanWeek(seed);
      const noon = 3 * DAY + DAY / 2;
      const night = 4 * DAY + 20;
      x[noon] += 8 * noiseSd(noon);
      x[night] -= 8 * noiseSd(night);
      const found = remainderOutliers(remainderOf(x), { period: DAY, threshold: 3 }).indices;
      expect(found).toContain(noon);
      expect(found).toContain(night);
    }
  });

  it('pools neighbouring positions until each holds 60 values, wrapping the cycle’s end onto its start', () => {
    const z = seededNormal(50);
    const r = Float64Array.from({ length: N }, () => z());
    const out = remainderOutliers(r, { period: DAY, threshold: 3 });
    expect(out.pooledPhases).toBe(4); // 7 values per position: 9 positions hold 63 ≥ 60
    // position 0 pools positions 284…287 and 0…4: check its median against a direct count
    const pool = Array.from(r).filter((_, i) => (i % DAY) + 4 >= DAY || i % DAY <= 4);
    expect(pool).toHaveLength(63);
    const sorted = [...pool].sort((a, b) => a - b);
    expect(out.phaseMedian[0]).toBe(sorted[31]);
    const dev = pool.map((v) => Math.abs(v - sorted[31])).sort((a, b) => a - b);
    expect(out.phaseSpread[0]).toBe(1.4826 * dev[31]);
    // each flagged cell is beyond its position's band, each other cell inside it
    for (let i = 0; i < N; i++) {
      const beyond = Math.abs(r[i] - out.phaseMedian[i % DAY]) > 3 * out.phaseSpread[i % DAY];
      expect(out.indices.includes(i)).toBe(beyond);
    }
  });

  it('skips missing cells (the classical trend’s ends) and flags nothing where the spread is 0', () => {
    const r = new Float64Array(4 * 12).fill(0);
    for (let i = 0; i < 6; i++) r[i] = NaN;
    r[30] = 5; // alone among zeros: the spread there is 0, so nothing can be judged
    const out = remainderOutliers(r, { period: 12, threshold: 3 });
    expect(out.indices).toEqual([]);
    expect(out.phaseSpread.every((s) => s === 0)).toBe(true);
  });

  it('refuses a bad period, threshold or pool size', () => {
    const r = new Float64Array(20);
    expect(() => remainderOutliers(r, { period: 1, threshold: 3 })).toThrow(AnalysisInputError);
    expect(() => remainderOutliers(r, { period: 2.5, threshold: 3 })).toThrow('remainderOutliers: period must be a whole number of at least 2 (got 2.5)');
    expect(() => remainderOutliers(r, { period: 4, threshold: 0 })).toThrow('remainderOutliers: threshold must be positive (got 0)');
    expect(() => remainderOutliers(r, { period: 4, threshold: 3, minPool: 0 })).toThrow(AnalysisInputError);
  });
});
