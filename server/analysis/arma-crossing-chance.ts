import { AnalysisInputError, type Series } from './analysis-input-error.ts';
import { type ArmaModel, armaFilteredState } from './arma-forecast.ts';
import { seededNormalStream } from './seeded-normal-stream.ts';

export interface CrossingChanceOptions {
  /**
   * The limit, in the series' units: one number for every step, or one per step (`steps` of
   * them; step k's limit at index k − 1), e.g. a fixed limit minus a seasonal part continued.
   */
  limit: number | ArrayLike<number>;
  /** Which way counts as crossing: a value above the limit, or below it. */
  side: 'above' | 'below';
  /** Horizon in steps (1…10,000): the chance of crossing at any of the next `steps` steps. */
  steps: number;
  /**
   * When set, the series is the changes (first differences) of a level that stands at this value
   * now, and the limit applies to the level: each path's level is this value plus the sum of its
   * simulated changes (an ARIMA(p, 1, q) model of the level).
   */
  integrateFrom?: number;
  /** Simulated paths (default 4,000; 500…200,000). */
  draws?: number;
  /** Seed of the simulation (default 1), so the same inputs give the same answer. */
  seed?: number;
}

export interface CrossingChance {
  /** Share of simulated future paths that cross the limit within the horizon. */
  chance: number;
  /** Monte Carlo standard error of `chance`, √(p(1 − p)/draws). */
  standardError: number;
  draws: number;
  /** Median step (1-based) of the first crossing among the paths that cross, or null when none does. */
  medianFirstStep: number | null;
}

/**
 * Lower Cholesky factor of a symmetric positive semi-definite r × r matrix (row-major), with
 * columns whose pivot is not positive (a direction the state cannot move in) set to zero.
 */
function semidefiniteCholesky(m: Float64Array, r: number): Float64Array {
  const l = new Float64Array(r * r);
  const tolerance = 1e-14 * Math.max(1e-300, ...Array.from({ length: r }, (_, i) => Math.abs(m[i * r + i])));
  for (let j = 0; j < r; j++) {
    let d = m[j * r + j];
    for (let k = 0; k < j; k++) d -= l[j * r + k] * l[j * r + k];
    if (!(d > tolerance)) continue;
    const pivot = Math.sqrt(d);
    l[j * r + j] = pivot;
    for (let i = j + 1; i < r; i++) {
      let v = m[i * r + j];
      for (let k = 0; k < j; k++) v -= l[i * r + k] * l[j * r + k];
      l[i * r + j] = v / pivot;
    }
  }
  return l;
}

/** The limit of each of the `steps` steps, checked: a single number is repeated. */
function limitPerStep(fn: string, limit: number | ArrayLike<number>, steps: number): Float64Array {
  if (typeof limit === 'number') {
    if (!Number.isFinite(limit)) throw new AnalysisInputError(`${fn}: limit must be a finite number (got ${limit})`);
    return new Float64Array(steps).fill(limit);
  }
  if (limit == null || typeof limit.length !== 'number' || limit.length !== steps) {
    throw new AnalysisInputError(`${fn}: a limit per step needs exactly ${steps} values (got ${limit == null ? 'none' : limit.length})`);
  }
  const out = Float64Array.from(limit);
  const bad = out.findIndex((v) => !Number.isFinite(v));
  if (bad >= 0) throw new AnalysisInputError(`${fn}: the limit of step ${bad + 1} must be a finite number (got ${out[bad]})`);
  return out;
}

/**
 * The chance that a series following a fitted ARMA(p, q) model crosses a limit at some step of
 * the next `steps` steps, given everything observed so far. The future values are jointly normal
 * (forecast errors of a Gaussian linear model), but the chance that their maximum passes a limit
 * has no closed form beyond one step, so it is estimated by simulating future sample paths from
 * the filtered state (the state-space recursions of Durbin & Koopman, *Time Series Analysis by
 * State Space Methods*, 2nd ed., 2012, ch. 4; simulated future paths as in Hyndman &
 * Athanasopoulos, *Forecasting: Principles and Practice*, 3rd ed., 2021, §5.5 — section number
 * from memory): the state one step ahead is drawn from N(T a, σ²(T P T′ + R R′)) of the filter
 * ({@link armaFilteredState}; P is kept in units of σ²), each later state as T s + R σ ε with
 * ε ~ N(0, 1), and a path's value is μ + (first state element). The parameters are taken as
 * known, as in the forecast intervals. The limit may differ by step (a seasonal part continued
 * and taken off a fixed limit, so the chance is computed on the remainder); with `integrateFrom`
 * the model describes the changes of a level and the limit applies to the level (ARIMA(p, 1, q);
 * Box, Jenkins, Reinsel & Ljung, *Time Series Analysis*, 5th ed., 2015, §4.1).
 * The estimate's Monte Carlo standard error is returned with it; the default 4,000 paths give at
 * most ±0.008. Seeded, so repeatable.
 *
 * Checked against R 4.2.2 with forecast 8.20's `simulate(fit, nsim = h, future = TRUE)` and, for
 * one step, the exact normal tail (tests/reference/forecast.reference.test.ts).
 *
 * Cost: O(n·r²) for the filter plus O(draws · steps · r).
 */
export function armaCrossingChance(x: Series, model: ArmaModel, options: CrossingChanceOptions): CrossingChance {
  const fn = 'armaCrossingChance';
  const { side, steps, draws = 4000, seed = 1 } = options;
  if (side !== 'above' && side !== 'below') throw new AnalysisInputError(`${fn}: side must be 'above' or 'below' (got ${String(side)})`);
  if (!(Number.isInteger(steps) && steps >= 1 && steps <= 10_000))
    throw new AnalysisInputError(`${fn}: steps must be a whole number from 1 to 10000 (got ${steps})`);
  if (!(Number.isInteger(draws) && draws >= 500 && draws <= 200_000))
    throw new AnalysisInputError(`${fn}: draws must be a whole number from 500 to 200000 (got ${draws})`);
  const limits = limitPerStep(fn, options.limit, steps);
  const integrateFrom = options.integrateFrom;
  if (integrateFrom !== undefined && !Number.isFinite(integrateFrom))
    throw new AnalysisInputError(`${fn}: integrateFrom must be a finite number (got ${integrateFrom})`);
  const state = armaFilteredState(x, model, fn);
  const { r, phi, loading } = state;
  state.advance();
  const start = Float64Array.from(state.a);
  const factor = semidefiniteCholesky(state.P, r);
  const sigma = Math.sqrt(model.sigma2);
  const normal = seededNormalStream(seed);
  const sign = side === 'above' ? 1 : -1;
  const z = new Float64Array(r);
  const s = new Float64Array(r);
  const firstSteps: number[] = [];
  for (let d = 0; d < draws; d++) {
    for (let i = 0; i < r; i++) z[i] = normal();
    for (let i = 0; i < r; i++) {
      let v = 0;
      for (let k = 0; k <= i; k++) v += factor[i * r + k] * z[k];
      s[i] = start[i] + sigma * v;
    }
    let level = integrateFrom ?? 0;
    for (let k = 1; k <= steps; k++) {
      if (k > 1) {
        const e = sigma * normal();
        const s0 = s[0];
        for (let i = 0; i < r; i++) s[i] = phi[i] * s0 + (i + 1 < r ? s[i + 1] : 0) + loading[i] * e;
      }
      const value = integrateFrom === undefined ? model.mean + s[0] : (level += model.mean + s[0]);
      if (sign * (value - limits[k - 1]) > 0) {
        firstSteps.push(k);
        break;
      }
    }
  }
  const chance = firstSteps.length / draws;
  firstSteps.sort((u, v) => u - v);
  return {
    chance,
    standardError: Math.sqrt((chance * (1 - chance)) / draws),
    draws,
    medianFirstStep: firstSteps.length ? firstSteps[(firstSteps.length - 1) >> 1] : null,
  };
}
