import { AnalysisInputError, armaCrossingChance, fitArma, forecastArma, selectArma, stl, type ArmaModel, type FitArmaResult } from '../../../analysis/index.ts';
import { normalQuantile } from '../../../analysis/normal-quantile.ts';
import { fillForDecomposition } from './fill-for-decomposition.ts';
import { cycleWords, MIN_CYCLES } from './find-cycle.ts';

/** A limit and the way of passing it that counts. */
export interface ProjectedLimit {
  limit: number;
  side: 'high' | 'low';
}

/** The chance of passing one limit within the horizon. */
export interface LimitCrossing extends ProjectedLimit {
  /** Share of simulated future paths that pass the limit at some step, and its Monte Carlo standard error. */
  chance: number;
  standardError: number;
  /** Median step (1-based) of the first crossing among paths that cross; null when none does. */
  medianStepsToCross: number | null;
}

/** The readings on a regular grid, the limit and how far ahead to look. */
export interface ProjectionInput {
  /** One value per grid cell, oldest first; NaN where a cell holds no reading. The last cell is the newest. */
  values: ArrayLike<number>;
  /** Epoch ms of the last cell (the time the projection starts from). */
  lastAt: number;
  stepMs: number;
  /** The limits to check: 'high' means rising above it, 'low' falling below it (a bounds rule has one or both). */
  limits: readonly ProjectedLimit[];
  /** Steps ahead (1…10,000). */
  horizonSteps: number;
  /** Steps per cycle to take off before the fit, or null for none. */
  period: number | null;
}

export interface ProjectionOptions {
  /** A fixed ARMA order instead of the selection (tests, reference checks). */
  order?: { p: number; q: number };
  /** Central interval level of the projected band (default 0.8). */
  level?: number;
  /** Simulated paths of the crossing chance (default 4,000) and their seed (default 1). */
  draws?: number;
  seed?: number;
}

/** A projection of a channel: the model, the band step by step and the chance of crossing the limit. */
export interface CrossingProjection {
  /** The model in words, e.g. "ARMA(1,1) on the remainder after the daily cycle". */
  model: string;
  order: { p: number; q: number };
  arma: ArmaModel;
  period: number | null;
  /** One per limit asked, in the same order. */
  crossings: LimitCrossing[];
  level: number;
  /** The seasonal part continued, per step (zeros without a cycle). */
  seasonalAhead: Float64Array;
  /** Per step k = 1…h (index k − 1): the projected value and the central band, in the channel's units. */
  mean: Float64Array;
  lower: Float64Array;
  upper: Float64Array;
  lastAt: number;
  stepMs: number;
}

/** Why a projection could not be made. */
export class ProjectionRefusal extends Error {
  constructor(
    readonly reason: 'too-little-history' | 'too-many-gaps' | 'no-model',
    message: string,
  ) {
    super(message);
    this.name = 'ProjectionRefusal';
  }
}

/** Most recent cells the ARMA model is fitted to (12 hours of one-minute cells): the present course, not last week's. */
export const FIT_CELLS = 720;
/** Fewest cells with readings in the fitted stretch. */
export const MIN_FIT_READINGS = 60;
/** At most this share of the fitted stretch may be empty. */
const MAX_GAP_SHARE = 0.25;

/** The fixed order's fit, or the AICc choice among the small models; a refusal when none fits. */
function chooseModel(stretch: Float64Array, order: { p: number; q: number } | undefined): { p: number; q: number; model: FitArmaResult } {
  try {
    if (order) return { ...order, model: fitArma(stretch, order) };
    const selected = selectArma(stretch, { maxP: 2, maxQ: 2, maxTotalOrder: 2 });
    return { p: selected.p, q: selected.q, model: selected.model };
  } catch (err) {
    if (err instanceof AnalysisInputError) throw new ProjectionRefusal('no-model', `no steady model fits the recent readings (${err.message})`);
    throw err;
  }
}

/**
 * Projects a channel's readings `horizonSteps` steps ahead and gives the chance that they pass a
 * limit on the way: forecasting by decomposition (Hyndman & Athanasopoulos, *Forecasting:
 * Principles and Practice*, 3rd ed., 2021, §3.6 and §5.7 — the method of R's `forecast::stlm`):
 *
 * 1. With a cycle (`period` steps), the seasonal part is taken off by STL with a periodic
 *    seasonal (Cleveland et al. 1990, J. Official Statistics 6(1):3–73; gaps filled for the
 *    decomposition only) and continued by repeating its last cycle (the seasonal naïve
 *    forecast of the seasonal part). Without one, the readings are modelled as they are.
 * 2. An ARMA(p, q) model with a mean is fitted by exact maximum likelihood to the last
 *    {@link FIT_CELLS} cells of what remains (the gaps left empty; the Kalman filter passes
 *    them), its order chosen by AICc among p ≤ 2, q ≤ 2, p + q ≤ 2 (`selectArma`, the search
 *    of the process-model work, narrowed to small models: a few hours ahead hinge on the
 *    short-lag persistence). Its mean is the level, held over the horizon: no trend is
 *    extrapolated, the model's persistence carries the present course and lets it fade at the
 *    rate the data show.
 * 3. The projection is the seasonal part continued plus the ARMA forecast, with the central
 *    `level` band μ̂ ± z σ̂_k (the ARMA's forecast standard errors, parameters taken as known, as
 *    R's `predict(arima(…), n.ahead = h)`). The chance of crossing is the share of simulated
 *    future paths of the ARMA part that pass the limit less the continued seasonal part at some
 *    step (`armaCrossingChance`), so a limit the daily cycle nears in the evening counts then.
 *
 * Pure: it reads no clock or database. Throws {@link ProjectionRefusal} when the fitted stretch
 * holds fewer than {@link MIN_FIT_READINGS} readings or too many gaps.
 *
 * Cost: the order search (six fits, each O(iterations · n)) dominates; STL is O(n).
 */
export function projectCrossing(input: ProjectionInput, options: ProjectionOptions = {}): CrossingProjection {
  const { stepMs, horizonSteps: h } = input;
  const level = options.level ?? 0.8;
  const n = input.values.length;
  const grid = Float64Array.from(input.values);
  const filled = fillForDecomposition(grid, input.period);
  if (!filled) throw new ProjectionRefusal('too-little-history', 'no readings to project from');

  let period = input.period !== null && input.period >= 2 && n >= MIN_CYCLES * input.period ? input.period : null;
  const seasonalAhead = new Float64Array(h);
  const adjusted = Float64Array.from(grid);
  if (period !== null) {
    const fit = stl(filled.values, { period, seasonalWindow: 'periodic' });
    for (let i = 0; i < n; i++) adjusted[i] = filled.filled[i] ? NaN : grid[i] - fit.seasonal[i];
    // Continued seasonal: the last cycle repeated (step k lands k steps after the last cell).
    for (let k = 1; k <= h; k++) seasonalAhead[k - 1] = fit.seasonal[n - period + ((k - 1) % period)];
  } else {
    period = null;
  }

  const stretch = adjusted.subarray(Math.max(0, n - FIT_CELLS));
  let present = 0;
  for (let i = 0; i < stretch.length; i++) if (!Number.isNaN(stretch[i])) present++;
  if (present < MIN_FIT_READINGS) {
    throw new ProjectionRefusal(
      'too-little-history',
      `only ${present} of the last ${stretch.length} steps hold readings; at least ${MIN_FIT_READINGS} are needed`,
    );
  }
  if (stretch.length - present > MAX_GAP_SHARE * stretch.length) {
    throw new ProjectionRefusal('too-many-gaps', `${stretch.length - present} of the last ${stretch.length} steps hold no reading`);
  }

  const chosen = chooseModel(stretch, options.order);
  const arma: ArmaModel = { ar: chosen.model.ar, ma: chosen.model.ma, mean: chosen.model.mean ?? 0, sigma2: chosen.model.sigma2 };
  const forecast = forecastArma(stretch, arma, h);
  const z = normalQuantile(0.5 + level / 2);
  const mean = new Float64Array(h);
  const lower = new Float64Array(h);
  const upper = new Float64Array(h);
  for (let k = 0; k < h; k++) {
    mean[k] = forecast.mean[k] + seasonalAhead[k];
    lower[k] = mean[k] - z * forecast.se[k];
    upper[k] = mean[k] + z * forecast.se[k];
  }
  const crossings = input.limits.map(({ limit, side }): LimitCrossing => {
    const c = armaCrossingChance(stretch, arma, {
      limit: Array.from(seasonalAhead, (s) => limit - s),
      side: side === 'high' ? 'above' : 'below',
      steps: h,
      draws: options.draws,
      seed: options.seed,
    });
    return { limit, side, chance: c.chance, standardError: c.standardError, medianStepsToCross: c.medianFirstStep };
  });
  const what = period === null ? 'on the readings' : `on the remainder after the ${cycleWords(period, stepMs)}`;
  return {
    model: `ARMA(${chosen.p},${chosen.q}) ${what}`,
    order: { p: chosen.p, q: chosen.q },
    arma,
    period,
    crossings,
    level,
    seasonalAhead,
    mean,
    lower,
    upper,
    lastAt: input.lastAt,
    stepMs,
  };
}
