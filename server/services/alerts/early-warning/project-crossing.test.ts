/**
 * projectCrossing on seeded simulated series with known truth. The first-passage chances are
 * checked against an independent simulation written here (Mulberry32 + Box–Muller from the test
 * kit, not the engine's generator): for an AR(1) the future depends on the last value alone, so
 * x_{n+k} − μ = φ (x_{n+k−1} − μ) + σ ε_k simulated from x_n is the exact Gaussian first-passage
 * process. The projected mean and standard errors are checked against the AR(1) closed forms
 * μ + φ^k (x_n − μ) and σ √((1 − φ^{2k}) / (1 − φ²)) (Brockwell & Davis, *Introduction to Time
 * Series and Forecasting*, 2nd ed., §3.3 — from memory).
 */
import { describe, expect, it } from 'vitest';
import { seededNormal } from '../../../analysis/seeded-simulation.testkit.ts';
import { normalQuantile } from '../../../analysis/normal-quantile.ts';
import { projectCrossing, ProjectionRefusal } from './project-crossing.ts';

/** An AR(1) around `mu` with coefficient `phi` and innovation sd `sigma`, plus an optional seasonal part. */
function simulateAr1(n: number, mu: number, phi: number, sigma: number, seed: number, seasonal: (t: number) => number = () => 0): number[] {
  const e = seededNormal(seed);
  const x: number[] = [];
  let d = (e() * sigma) / Math.sqrt(1 - phi * phi);
  for (let t = 0; t < n; t++) {
    d = phi * d + sigma * e();
    x.push(mu + seasonal(t) + d);
  }
  return x;
}

/** Share of `paths` AR(1) paths from x_n (plus the continued seasonal part) that pass `limit` above within `h` steps. */
function firstPassageAbove(
  xn: number,
  seasonalNow: number,
  mu: number,
  phi: number,
  sigma: number,
  limit: number,
  seasonalAhead: ArrayLike<number>,
  h: number,
  paths: number,
  seed: number,
) {
  const e = seededNormal(seed);
  let crossed = 0;
  for (let i = 0; i < paths; i++) {
    let d = xn - seasonalNow - mu;
    for (let k = 0; k < h; k++) {
      d = phi * d + sigma * e();
      if (mu + d + seasonalAhead[k] > limit) {
        crossed++;
        break;
      }
    }
  }
  return crossed / paths;
}

describe('projectCrossing: AR(1) drifting towards a limit (no cycle)', () => {
  const mu = 4;
  const phi = 0.95;
  const sigma = 0.15;
  const x = simulateAr1(360, mu, phi, sigma, 2207);
  const xn = x[x.length - 1];
  const limit = xn + 0.4;
  const h = 30;
  const p = projectCrossing(
    { values: x, lastAt: 0, stepMs: 60_000, limits: [{ limit, side: 'high' }], horizonSteps: h, period: null },
    { order: { p: 1, q: 0, d: 0 }, draws: 20_000 },
  );

  it('fits the model that made the series (within three standard errors of the truth)', () => {
    expect(p.order).toEqual({ p: 1, q: 0, d: 0 });
    expect(Math.abs(Number(p.arma.ar[0]) - phi)).toBeLessThan(3 * Math.sqrt((1 - phi * phi) / 360));
    expect(Math.abs(Math.sqrt(p.arma.sigma2) - sigma)).toBeLessThan(3 * (sigma / Math.sqrt(2 * 360)));
    expect(p.model).toBe('ARMA(1,0) on the readings');
  });

  it('projects the AR(1) closed forms: mean μ̂ + φ̂^k (x_n − μ̂), band ± z(0.9) σ̂ √((1 − φ̂^{2k}) / (1 − φ̂²))', () => {
    const f = Number(p.arma.ar[0]);
    const s = Math.sqrt(p.arma.sigma2);
    const z = normalQuantile(0.9);
    for (let k = 1; k <= h; k++) {
      const mean = p.arma.mean + f ** k * (xn - p.arma.mean);
      const se = s * Math.sqrt((1 - f ** (2 * k)) / (1 - f * f));
      expect(p.mean[k - 1]).toBeCloseTo(mean, 9);
      expect(p.upper[k - 1] - p.mean[k - 1]).toBeCloseTo(z * se, 9);
      expect(p.mean[k - 1] - p.lower[k - 1]).toBeCloseTo(z * se, 9);
    }
  });

  it('gives the exact first-passage chance of its own model, by an independent simulation (four standard errors)', () => {
    const truth = firstPassageAbove(xn, 0, p.arma.mean, Number(p.arma.ar[0]), Math.sqrt(p.arma.sigma2), limit, new Float64Array(h), h, 100_000, 77);
    const c = p.crossings[0];
    expect(c.chance).toBeGreaterThan(0.05);
    expect(c.chance).toBeLessThan(0.95);
    expect(Math.abs(c.chance - truth)).toBeLessThan(4 * Math.sqrt(c.standardError ** 2 + (truth * (1 - truth)) / 100_000));
  });

  it('and is near the chance under the true parameters (estimation error only)', () => {
    // φ̂, μ̂ and σ̂ from 360 readings differ from the truth; the chance moves with them (measured 0.04 when written)
    const truth = firstPassageAbove(xn, 0, mu, phi, sigma, limit, new Float64Array(h), h, 100_000, 78);
    expect(Math.abs(p.crossings[0].chance - truth)).toBeLessThan(0.1);
  });
});

describe('projectCrossing: a daily cycle taken off and continued', () => {
  const period = 24;
  const cycle = (t: number) => 3 * Math.sin((2 * Math.PI * t) / period);
  const x = simulateAr1(period * 8, 10, 0.6, 0.3, 9031, cycle);
  const n = x.length;
  const h = 12;
  const limit = 12.5;
  const p = projectCrossing(
    { values: x, lastAt: 0, stepMs: 3_600_000, limits: [{ limit, side: 'high' }], horizonSteps: h, period },
    { order: { p: 1, q: 0, d: 0 }, draws: 20_000 },
  );

  it('continues the cycle that made the series', () => {
    expect(p.period).toBe(24);
    expect(p.model).toBe('ARMA(1,0) on the remainder after the daily cycle');
    for (let k = 1; k <= h; k++) expect(Math.abs(p.seasonalAhead[k - 1] - cycle(n - 1 + k))).toBeLessThan(0.35);
  });

  it('counts a crossing against the limit less the continued cycle, step by step (independent simulation)', () => {
    const phi = Number(p.arma.ar[0]);
    const truth = firstPassageAboveFromForecast(p, limit, h, phi);
    const c = p.crossings[0];
    expect(c.chance).toBeGreaterThan(0.05);
    expect(Math.abs(c.chance - truth)).toBeLessThan(4 * Math.sqrt(c.standardError ** 2 + (truth * (1 - truth)) / 100_000));
    // against a flat limit (the cycle ignored) the chance would differ clearly
    const flat = firstPassageAbove(p.mean[0], 0, p.arma.mean, phi, Math.sqrt(p.arma.sigma2), limit, new Float64Array(h), h, 20_000, 92);
    expect(Math.abs(flat - c.chance)).toBeGreaterThan(0.1);
  });
});

/**
 * First passage of an AR(1) remainder started from its one-step forecast: the remainder's last
 * value d_n follows from the projected mean, (mean_1 − seasonal_1 − μ) = φ d_n.
 */
function firstPassageAboveFromForecast(p: ReturnType<typeof projectCrossing>, limit: number, h: number, phi: number): number {
  const mu = p.arma.mean;
  const dn = (p.mean[0] - p.seasonalAhead[0] - mu) / phi;
  return firstPassageAbove(mu + dn, 0, mu, phi, Math.sqrt(p.arma.sigma2), limit, p.seasonalAhead, h, 100_000, 91);
}

describe('projectCrossing: gaps and refusals', () => {
  const x = simulateAr1(400, 5, 0.8, 0.2, 515);

  it('projects across gaps, including right before the newest cell', () => {
    const gapped = x.map((v, i) => (i % 17 === 3 || (i > 390 && i < 399) ? NaN : v));
    const p = projectCrossing({
      values: gapped,
      lastAt: 0,
      stepMs: 60_000,
      limits: [
        { limit: 6, side: 'high' },
        { limit: 4, side: 'low' },
      ],
      horizonSteps: 10,
      period: null,
    });
    expect(p.crossings.map((c) => c.side)).toEqual(['high', 'low']);
    for (const c of p.crossings) expect(c.chance).toBeGreaterThanOrEqual(0);
    expect(p.mean.every(Number.isFinite)).toBe(true);
  });

  it('refuses with a reason when too few cells hold readings', () => {
    const sparse = x.map((v, i) => (i % 10 === 9 ? v : NaN));
    const run = () => projectCrossing({ values: sparse, lastAt: 0, stepMs: 60_000, limits: [{ limit: 6, side: 'high' }], horizonSteps: 10, period: null });
    expect(run).toThrow(ProjectionRefusal);
    expect(run).toThrow('only 36 of the last 360 steps hold readings; at least 60 are needed');
  });

  it('refuses when the recent stretch is mostly gaps', () => {
    const holey = x.map((v, i) => (i % 3 === 1 ? NaN : v));
    expect(() => projectCrossing({ values: holey, lastAt: 0, stepMs: 60_000, limits: [{ limit: 6, side: 'high' }], horizonSteps: 10, period: null })).toThrow(
      '120 of the last 360 steps hold no reading',
    );
  });

  it('refuses when the newest step is empty (it is where the projection starts)', () => {
    expect(() =>
      projectCrossing({ values: [...x, NaN], lastAt: 0, stepMs: 60_000, limits: [{ limit: 6, side: 'high' }], horizonSteps: 10, period: null }),
    ).toThrow('the newest step holds no reading');
  });

  it('refuses an empty grid and leaves its input unchanged', () => {
    expect(() => projectCrossing({ values: [NaN, NaN], lastAt: 0, stepMs: 1, limits: [{ limit: 1, side: 'high' }], horizonSteps: 1, period: null })).toThrow(
      'no readings to project from',
    );
    const frozen = Object.freeze([...x]);
    projectCrossing(
      { values: frozen, lastAt: 0, stepMs: 60_000, limits: [{ limit: 6, side: 'high' }], horizonSteps: 5, period: null },
      { order: { p: 1, q: 0, d: 0 } },
    );
    expect(frozen).toEqual(x);
  });
});
