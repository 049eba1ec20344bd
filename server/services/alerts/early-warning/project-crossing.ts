import {
  AnalysisInputError,
  adf,
  armaCrossingChance,
  fitArma,
  forecastArma,
  selectArma,
  stl,
  type ArmaForecast,
  type ArmaModel,
  type FitArmaResult,
} from '../../../analysis/index.ts';
import { armaSmallestRoot } from '../../../analysis/arma-smallest-root.ts';
import { integratedArmaForecast } from '../../../analysis/integrated-arma-forecast.ts';
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

/** The readings on a regular grid, the limits and how far ahead to look. */
export interface ProjectionInput {
  /** One value per grid cell, oldest first; NaN where a cell holds no reading. The last cell (the newest) must hold one. */
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
  /** A fixed model instead of the choice (tests, reference checks): ARMA orders and differences (0 or 1). */
  order?: { p: number; q: number; d: 0 | 1 };
  /** Central interval level of the projected band (default 0.8). */
  level?: number;
  /** Simulated paths of the crossing chance (default 4,000) and their seed (default 1). */
  draws?: number;
  seed?: number;
}

/** A projection of a channel: the model, the band step by step and the chance of crossing each limit. */
export interface CrossingProjection {
  /** The model in words, e.g. "ARIMA(1,1,0) on the remainder after the daily cycle". */
  model: string;
  order: { p: number; q: number; d: 0 | 1 };
  /** The fitted ARMA (of the changes when d = 1). */
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

/** Most recent cells the model is fitted to (six hours of one-minute cells): the present course, not last week's. */
export const FIT_CELLS = 360;
/** Fewest cells with readings in the fitted stretch. */
export const MIN_FIT_READINGS = 60;
/** At most this share of the fitted stretch may be empty. */
const MAX_GAP_SHARE = 0.25;
/** The small ARMA orders tried (p + q ≤ 2). */
const ORDERS: readonly [number, number][] = [
  [0, 0],
  [1, 0],
  [0, 1],
  [2, 0],
  [1, 1],
  [0, 2],
];

/** First differences, NaN where either value is missing. */
function changesOf(x: Float64Array): Float64Array {
  const z = new Float64Array(Math.max(0, x.length - 1));
  for (let i = 1; i < x.length; i++) z[i - 1] = x[i] - x[i - 1];
  return z;
}

/**
 * Lowest-AICc admissible ARMA without a mean among {@link ORDERS} for the changes of a level (as
 * R's `arima` fits d = 1: no mean), admissible as in `selectArma` (converged, roots ≥ 1.01).
 */
function chooseChangesModel(z: Float64Array): { p: number; q: number; fit: FitArmaResult } {
  let best: { p: number; q: number; fit: FitArmaResult } | null = null;
  for (const [p, q] of ORDERS) {
    const fit = fitArma(z, { p, q, includeMean: false });
    const ok = fit.converged && Number.isFinite(fit.aicc) && armaSmallestRoot(fit.ar, fit.ma) >= 1.01;
    if (ok && (best === null || fit.aicc < best.fit.aicc)) best = { p, q, fit };
  }
  if (!best) throw new AnalysisInputError('no admissible model of the changes');
  return best;
}

/**
 * The model of the fitted stretch: with d = 0 an ARMA with a mean (its order by AICc among
 * p + q ≤ 2, `selectArma`), with d = 1 an ARMA of the changes. Without a fixed order, d comes from
 * the augmented Dickey–Fuller test (constant, 5 %): a stretch that wanders without returning to a
 * level (a unit root not rejected — a room drifting warm) is modelled by its changes, so its
 * present level and direction carry on; otherwise around its level — the first step of the
 * Hyndman & Khandakar (2008, J. Stat. Softw. 27(3), §3.2) procedure, with ADF standing in for
 * their KPSS test.
 */
function chooseModel(stretch: Float64Array, filledStretch: Float64Array, order: ProjectionOptions['order']) {
  try {
    const d = order?.d ?? (adf(filledStretch).rejectsUnitRoot ? 0 : 1);
    if (d === 1) {
      const z = changesOf(stretch);
      if (order) return { d, p: order.p, q: order.q, fit: fitArma(z, { p: order.p, q: order.q, includeMean: false }) };
      return { d, ...chooseChangesModel(z) };
    }
    if (order) return { d, p: order.p, q: order.q, fit: fitArma(stretch, { p: order.p, q: order.q }) };
    const selected = selectArma(stretch, { maxP: 2, maxQ: 2, maxTotalOrder: 2 });
    return { d, p: selected.p, q: selected.q, fit: selected.model };
  } catch (err) {
    if (err instanceof AnalysisInputError) throw new ProjectionRefusal('no-model', `no steady model fits the recent readings (${err.message})`);
    throw err;
  }
}

/**
 * Projects a channel's readings `horizonSteps` steps ahead and gives the chance that they pass
 * each limit on the way: forecasting by decomposition (Hyndman & Athanasopoulos, *Forecasting:
 * Principles and Practice*, 3rd ed., 2021, §5.7 — the method of R's `forecast::stlm`):
 *
 * 1. With a cycle (`period` steps), the seasonal part is taken off by STL with a periodic
 *    seasonal (Cleveland et al. 1990, J. Official Statistics 6(1):3–73; gaps filled for the
 *    decomposition only) and continued by repeating its last cycle (the seasonal naïve
 *    forecast of the seasonal part). Without one, the readings are modelled as they are.
 * 2. The last {@link FIT_CELLS} cells of what remains (gaps left empty; the Kalman filter passes
 *    them) get a small model (see `chooseModel`): an ARMA around a level (the level held is its
 *    mean over the stretch), or, for a stretch that drifts, an ARIMA(p, 1, q) whose forecasts
 *    start from the newest level and carry its recent direction for as long as the changes'
 *    persistence lasts. No trend line is extrapolated beyond that.
 * 3. The projection is the seasonal part continued plus the model's forecast, with the central
 *    `level` band forecast ± z σ_k (parameters taken as known, as R's `predict(arima(…))`). The
 *    chance of crossing is the share of simulated future paths that pass the limit less the
 *    continued seasonal part at some step (`armaCrossingChance`), so a limit the daily cycle
 *    nears in the afternoon counts then.
 *
 * Pure: it reads no clock or database and changes none of its inputs. Throws
 * {@link ProjectionRefusal} when the fitted stretch holds fewer than {@link MIN_FIT_READINGS}
 * readings, too many gaps or an empty newest cell, or when no model fits.
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
  if (Number.isNaN(grid[n - 1])) throw new ProjectionRefusal('too-many-gaps', 'the newest step holds no reading');

  const period = input.period !== null && input.period >= 2 && n >= MIN_CYCLES * input.period ? input.period : null;
  const seasonalAhead = new Float64Array(h);
  const adjusted = Float64Array.from(grid);
  const adjustedFilled = Float64Array.from(filled.values);
  if (period !== null) {
    const fit = stl(filled.values, { period, seasonalWindow: 'periodic', robust: true });
    for (let i = 0; i < n; i++) {
      adjusted[i] = filled.filled[i] ? NaN : grid[i] - fit.seasonal[i];
      adjustedFilled[i] = filled.values[i] - fit.seasonal[i];
    }
    // Continued seasonal: the last cycle repeated (step k lands k steps after the last cell).
    for (let k = 1; k <= h; k++) seasonalAhead[k - 1] = fit.seasonal[n - period + ((k - 1) % period)];
  }

  const from = Math.max(0, n - FIT_CELLS);
  const stretch = adjusted.subarray(from);
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

  const chosen = chooseModel(stretch, adjustedFilled.subarray(from), options.order);
  const arma: ArmaModel = { ar: chosen.fit.ar, ma: chosen.fit.ma, mean: chosen.fit.mean ?? 0, sigma2: chosen.fit.sigma2 };
  const series = chosen.d === 1 ? changesOf(stretch) : stretch;
  const lastLevel = stretch[stretch.length - 1];
  const forecast: ArmaForecast = chosen.d === 1 ? integratedArmaForecast(series, arma, h, lastLevel) : forecastArma(series, arma, h);
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
    const c = armaCrossingChance(series, arma, {
      limit: Array.from(seasonalAhead, (s) => limit - s),
      side: side === 'high' ? 'above' : 'below',
      steps: h,
      draws: options.draws,
      seed: options.seed,
      integrateFrom: chosen.d === 1 ? lastLevel : undefined,
    });
    return { limit, side, chance: c.chance, standardError: c.standardError, medianStepsToCross: c.medianFirstStep };
  });
  const what = period === null ? 'on the readings' : `on the remainder after the ${cycleWords(period, stepMs)}`;
  const name = chosen.d === 1 ? `ARIMA(${chosen.p},1,${chosen.q})` : `ARMA(${chosen.p},${chosen.q})`;
  return {
    model: `${name} ${what}`,
    order: { p: chosen.p, q: chosen.q, d: chosen.d },
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
