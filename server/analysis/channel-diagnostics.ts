import { AnalysisInputError, type Series } from './analysis-input-error.ts';
import { autocorrelation } from './autocorrelation.ts';
import { autocorrelationBands } from './autocorrelation-bands.ts';
import { crossCorrelation } from './cross-correlation.ts';
import { decomposeClassical } from './decompose-classical.ts';
import { defaultMaxLag } from './default-max-lag.ts';
import { describeDuration } from './describe-duration.ts';
import { detectPeriod, type PeriodCandidate } from './detect-period.ts';
import { difference } from './difference.ts';
import { durbinLevinson } from './durbin-levinson.ts';
import { effectiveSampleSize, type EffectiveSampleSizeResult } from './effective-sample-size.ts';
import { identifyProcess, type ProcessIdentification } from './identify-process.ts';
import { ljungBox } from './ljung-box.ts';
import { normalQuantile } from './normal-quantile.ts';
import { prewhitenedCcf } from './prewhitened-ccf.ts';
import { regularize, type RegularizeAggregate } from './regularize.ts';
import { remainderOutliers, type RemainderOutlierList } from './remainder-outliers.ts';
import { trendTest, type TrendTestResult } from './trend-test.ts';
import { andrewsBartlettLag } from './andrews-bartlett-lag.ts';
import { stl } from './stl.ts';
import { stlParameters, type StlSettings } from './stl-parameters.ts';

/** Readings of one channel as the database returns them (epoch ms, values). */
export interface ChannelReadings {
  timestamps: Series;
  values: Series;
}

export type DiagnosticsAggregate = Extract<RegularizeAggregate, 'mean' | 'median' | 'last' | 'min' | 'max'>;
export type DecompositionMethod = 'stl' | 'stl-robust' | 'classical' | 'none';

export interface ChannelDiagnosticsOptions {
  /** Resampling step in milliseconds; cells line up with whole steps of UTC (origin 0). */
  step: number;
  agg: DiagnosticsAggregate;
  /** Ordinary differences (lag 1) applied before the correlation analysis: 0, 1 or 2. */
  difference?: number;
  /** Seasonal differences (lag = period) applied after the ordinary ones: 0 or 1. */
  seasonalDifference?: number;
  /** Highest ACF/PACF lag; default R's ⌊10·log10 n⌋, raised to 2 periods (at most n/4) when a period is known. */
  maxLag?: number;
  /** Seasonal period in steps, 'auto' (detected) or 'none'. */
  period?: number | 'auto' | 'none';
  decomposition?: DecompositionMethod;
  /** STL seasonal window (odd, ≥ 7) or 'periodic' (default). */
  stlSeasonalWindow?: number | 'periodic';
  /** 1 − confidence level of every band and interval (default 0.05). */
  alpha?: number;
  /** Remainder outliers lie beyond this many robust SDs of the remainder at their position in the cycle (default 3). */
  outlierThreshold?: number;
  /** Highest CCF lag in each direction; default R's ⌊10·log10(n/2)⌋. */
  ccfMaxLag?: number;
  /** The process model is fitted to at most this many of the most recent cells (default 1,000). */
  modelCells?: number;
  /** Names used in the plain-language CCF sentence. */
  labels?: { channel: string; partner: string };
}

export interface LjungBoxRow {
  lag: number;
  statistic: number;
  df: number;
  pValue: number;
}

/** Remainder outliers, each cell judged against the remainder's robust spread at its position in the cycle (`remainderOutliers`). */
export type OutlierList = RemainderOutlierList;

export type DecompositionOutcome =
  | { method: 'none'; reason: string }
  | {
      method: 'stl' | 'stl-robust' | 'classical';
      period: number;
      /** STL only: every window, degree, jump and pass as run (Cleveland et al. 1990 §3). */
      stl: StlSettings | null;
      trend: Float64Array;
      seasonal: Float64Array;
      remainder: Float64Array;
      /** STL robustness weights (robust fit only). */
      weights: Float64Array | null;
      outliers: OutlierList;
    };

export interface CcfStrongest {
  lag: number;
  lagMs: number;
  value: number;
  significant: boolean;
}

export interface CrossCorrelationOutcome {
  /** 'prewhitened': both channels filtered by the partner's AR model first; 'raw' when that could not be done. */
  method: 'prewhitened' | 'raw';
  /** The partner's AR filter (order chosen by AIC, Yule–Walker), or null for a raw CCF. */
  prewhitening: { order: number; coefficients: number[] } | null;
  /** Times where both (filtered) channels have a value (the n of the bands). */
  pairs: number;
  lags: Int32Array;
  values: Float64Array;
  /** ±z(1 − α/2)/√pairs: the per-lag white-noise band of a CCF (Box, Jenkins & Reinsel §12.1.3). */
  band: number;
  /** The band that all lags together stay inside with probability 1 − α when there is no relation. */
  simultaneousBand: number;
  simultaneousMethod: string;
  /** The strongest lag; `significant` means beyond the simultaneous band. */
  strongest: CcfStrongest | null;
  explanation: string;
  /** The CCF of the unfiltered channels with its per-lag band: shown for contrast, not a test. */
  raw: { lags: Int32Array; values: Float64Array; band: number; strongest: CcfStrongest | null };
}

/** A least-squares trend with its Newey–West (HAC) and naive OLS standard errors, per step (`trendTest`'s figures). */
export type TrendOutcome =
  | { available: false; reason: string }
  | ({
      available: true;
      /** 'adjusted': the series less its seasonal component. */
      fittedOn: 'series' | 'adjusted';
      n: number;
    } & Pick<TrendTestResult, 'slope' | 'intercept' | 'standardErrorOls' | 'standardErrorHac' | 'lag' | 'pValueHac' | 'interval' | 'intervalOls'>);

export interface ChannelDiagnostics {
  grid: {
    /** Epoch ms of the first cell; cell i covers [start + i·step, start + (i+1)·step). */
    start: number;
    step: number;
    /** Cells from the first to the last cell holding a reading. */
    n: number;
    /** Cells holding no reading (filled by linear interpolation where a method needs it). */
    missing: number;
    readings: number;
    /** The regularised values (NaN = empty cell). */
    values: Float64Array;
  };
  /** The series the correlation analysis ran on, after differencing. */
  analysed: { n: number; missing: number; values: Float64Array };
  period: { used: number | null; source: 'manual' | 'detected' | 'none'; candidates: PeriodCandidate[] };
  maxLag: number;
  acf: Float64Array;
  pacf: Float64Array;
  bands: { alpha: number; z: number; whiteNoise: number; bartlett: Float64Array };
  ljungBox: LjungBoxRow[];
  /** `identifyProcess` on the analysed series; `gapsFilled` when its gaps were interpolated first. */
  identification: ProcessIdentification & { gapsFilled: boolean };
  effectiveSampleSize: EffectiveSampleSizeResult;
  decomposition: DecompositionOutcome;
  crossCorrelation: CrossCorrelationOutcome | null;
  trend: TrendOutcome;
}

/** Cells the process model is fitted to by default: enough for the orders and coefficients, cheap enough for a request. */
export const DEFAULT_MODEL_CELLS = 1000;

/** Counts NaN entries. */
function countMissing(x: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < x.length; i++) if (Number.isNaN(x[i])) m++;
  return m;
}

/**
 * Fills interior NaN runs by straight lines between their neighbours (leading or trailing NaN
 * take the nearest value). Returns the input itself when nothing is missing.
 */
function fillGapsLinear(x: Float64Array): Float64Array {
  if (countMissing(x) === 0) return x;
  const out = Float64Array.from(x);
  let previous = -1;
  for (let i = 0; i <= out.length; i++) {
    if (i < out.length && Number.isNaN(out[i])) continue;
    for (let j = previous + 1; j < i; j++) {
      if (previous < 0) out[j] = out[i];
      else if (i >= out.length) out[j] = out[previous];
      else out[j] = out[previous] + ((out[i] - out[previous]) * (j - previous)) / (i - previous);
    }
    previous = i;
  }
  return out;
}

/** Puts a regularised series on another grid of the same step (NaN outside its own span). */
function alignTo(series: { start: number; step: number; values: Float64Array }, start: number, n: number): Float64Array {
  const out = new Float64Array(n).fill(NaN);
  const offset = Math.round((series.start - start) / series.step);
  for (let i = 0; i < series.values.length; i++) {
    const j = i + offset;
    if (j >= 0 && j < n) out[j] = series.values[i];
  }
  return out;
}

/** Ordinary then seasonal differences, as chosen. */
function differenced(x: Float64Array, d: number, seasonal: number, period: number | null): Float64Array {
  let y = x;
  if (d > 0) y = difference(y, { lag: 1, order: d });
  if (seasonal > 0) {
    if (period === null) {
      throw new AnalysisInputError('seasonalDifference needs a seasonal period, and none was given or detected', { reason: 'no-period' });
    }
    y = difference(y, { lag: period, order: seasonal });
  }
  return y;
}

/** The lag with the largest |value| (NaN skipped), with whether it clears `band`. */
function strongestLag(lags: Int32Array, values: Float64Array, band: number, stepMs: number): CcfStrongest | null {
  let best = -1;
  for (let i = 0; i < values.length; i++) if (!Number.isNaN(values[i]) && (best < 0 || Math.abs(values[i]) > Math.abs(values[best]))) best = i;
  if (best < 0) return null;
  return { lag: lags[best], lagMs: lags[best] * stepMs, value: values[best], significant: Math.abs(values[best]) > band };
}

/**
 * Default CCF window: R's ⌊10·log10(n/2)⌋ raised to reach physical delays — 12 hours or a
 * quarter of the range, whichever is shorter (our rule), never beyond n − 1 lags.
 */
export function defaultCcfMaxLag(n: number, stepMs: number): number {
  const halfDay = Math.ceil(43_200_000 / stepMs);
  return Math.max(1, Math.min(n - 1, Math.max(defaultMaxLag(n, 2), Math.min(halfDay, Math.floor(n / 4)))));
}

/** Plain sentence of a CCF outcome (R's sign convention: a positive lag means the channel follows its partner). */
function ccfSentence(
  strongest: CcfStrongest | null,
  bandText: string,
  method: 'prewhitened' | 'raw',
  labels: { channel: string; partner: string },
  arOrder: number | null,
): string {
  const how =
    method === 'prewhitened'
      ? `After both channels were filtered by the AR(${arOrder}) model of ${labels.partner} (prewhitening, so that each channel's own persistence cannot pass for a relation)`
      : 'Without prewhitening (the AR filter of the partner could not be fitted)';
  if (!strongest) return `${how}, no lag has a defined cross-correlation.`;
  const { lag, value } = strongest;
  const at = `${value.toFixed(3)} at lag ${lag}${lag !== 0 ? ` (${describeDuration(Math.abs(strongest.lagMs))})` : ''}`;
  if (!strongest.significant) {
    return `${how}, the strongest cross-correlation, ${at}, stays inside the ${bandText}: no lead or lag between ${labels.channel} and ${labels.partner} stands out from noise in this range.`;
  }
  const span = describeDuration(Math.abs(strongest.lagMs));
  const timing =
    lag > 0
      ? `${labels.channel} follows ${labels.partner} by about ${span}`
      : lag < 0
        ? `${labels.partner} follows ${labels.channel} by about ${span}`
        : `${labels.channel} and ${labels.partner} move within the same step`;
  const direction = value >= 0 ? 'in the same direction' : 'in opposite directions (one rises as the other falls)';
  return `${how}, the strongest cross-correlation, ${at}, lies beyond the ${bandText}: ${timing}, and the two move ${direction}.`;
}

function crossCorrelationOf(
  x: Float64Array,
  y: Float64Array,
  stepMs: number,
  alpha: number,
  maxLag: number | undefined,
  labels: { channel: string; partner: string },
): CrossCorrelationOutcome {
  let pairs = 0;
  for (let i = 0; i < x.length; i++) if (!Number.isNaN(x[i]) && !Number.isNaN(y[i])) pairs++;
  if (pairs < 4)
    throw new AnalysisInputError(`ccf requires at least 4 times where both channels have a value (got ${pairs})`, {
      reason: 'too-few-pairs',
      need: 4,
      got: pairs,
    });
  const window = Math.min(maxLag ?? defaultCcfMaxLag(x.length, stepMs), x.length - 1);
  const raw = crossCorrelation(x, y, { maxLag: window });
  const rawBand = normalQuantile(1 - alpha / 2) / Math.sqrt(pairs);
  const rawOutcome = { lags: raw.lags, values: raw.values, band: rawBand, strongest: strongestLag(raw.lags, raw.values, rawBand, stepMs) };
  const convention = `Lag k pairs ${labels.channel} at time t + k with ${labels.partner} at time t, so a peak at a positive lag means ${labels.channel} follows ${labels.partner}.`;
  // The partner is the input: its AR model filters both channels (Box, Jenkins, Reinsel & Ljung 2015, §12.2).
  const white = prewhitenedCcf(x, y, { maxLag: window, alpha });
  const simultaneousMethod = `Šidák over ${white.lags.length} lags`;
  const strongest = white.strongest ? { ...white.strongest, lagMs: white.strongest.lag * stepMs } : null;
  const bandText = `±${white.simultaneousBand.toFixed(3)} band that holds for all ${white.lags.length} lags together (${simultaneousMethod})`;
  return {
    method: 'prewhitened',
    prewhitening: { order: white.ar.order, coefficients: Array.from(white.ar.coefficients) },
    pairs: white.pairs,
    lags: white.lags,
    values: white.values,
    band: white.band,
    simultaneousBand: white.simultaneousBand,
    simultaneousMethod,
    strongest,
    explanation: `${ccfSentence(strongest, bandText, 'prewhitened', labels, white.ar.order)} ${convention}`,
    raw: rawOutcome,
  };
}

/**
 * Least-squares trend of the (seasonally adjusted) grid with its Newey–West standard error at
 * Andrews' data-driven lag (never below R's ⌊4 (n/100)^{2/9}⌋), beside the naive OLS one.
 */
function trendOf(values: Float64Array, fittedOn: 'series' | 'adjusted', alpha: number): TrendOutcome {
  let present = 0;
  for (let i = 0; i < values.length; i++) if (!Number.isNaN(values[i])) present++;
  if (present < 10) return { available: false, reason: `a trend needs at least 10 cells with readings (got ${present})` };
  // The line first (lag 0 costs no lagged sums), then its residuals choose the Newey–West lag.
  const line = trendTest(values, { lag: 0, alpha });
  const residuals = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) residuals[i] = values[i] - (line.intercept + line.slope * (i + 1));
  const defaultLag = Math.floor(4 * (present / 100) ** (2 / 9)); // R's NeweyWest default, trendTest's too
  const t = trendTest(values, { lag: andrewsBartlettLag(residuals, defaultLag), alpha });
  return {
    available: true,
    fittedOn,
    n: present,
    slope: t.slope,
    intercept: t.intercept,
    standardErrorOls: t.standardErrorOls,
    standardErrorHac: t.standardErrorHac,
    lag: t.lag,
    pValueHac: t.pValueHac,
    interval: t.interval,
    intervalOls: t.intervalOls,
  };
}

function decompositionOf(
  grid: Float64Array,
  filled: Float64Array,
  method: DecompositionMethod,
  period: number | null,
  seasonalWindow: number | 'periodic',
  threshold: number,
): DecompositionOutcome {
  if (method === 'none') return { method, reason: 'no decomposition was asked for' };
  if (period === null) return { method: 'none', reason: 'no seasonal period was given or detected, so there is nothing to decompose by' };
  if (method === 'classical') {
    const c = decomposeClassical(grid, { period, type: 'additive' });
    return {
      method,
      period,
      stl: null,
      trend: c.trend,
      seasonal: c.seasonal,
      remainder: c.remainder,
      weights: null,
      outliers: remainderOutliers(c.remainder, { period, threshold }),
    };
  }
  const options = { period, seasonalWindow, robust: method === 'stl-robust' };
  const settings = stlParameters(filled.length, options);
  const s = stl(filled, options);
  return {
    method,
    period,
    stl: settings,
    trend: s.trend,
    seasonal: s.seasonal,
    remainder: s.remainder,
    weights: method === 'stl-robust' ? s.weights : null,
    outliers: remainderOutliers(s.remainder, { period, threshold }),
  };
}

/**
 * The whole diagnostics bundle of one channel (and optionally its cross-correlation with a
 * second channel), as one call so it runs as one worker-pool task:
 *
 * 1. readings → regular grid (`regularize`, origin 0), from the first to the last cell with a reading;
 * 2. seasonal period: given, or detected (`detectPeriod` on the gap-filled grid), or none;
 * 3. ordinary (lag 1) and seasonal (lag = period) differences (`difference`);
 * 4. ACF, PACF (R's na.pass rule for gaps) with white-noise and Bartlett bands (`acfBands`),
 *    Ljung–Box at lags 5, 10, 15, 20 and, for a seasonal series, the period and twice it
 *    (h = 10 and h = 2m: Hyndman & Athanasopoulos, *Forecasting: Principles and Practice*,
 *    3rd ed., §5.4), each below the series length;
 * 5. process identification (`identifyProcess`) on the differenced series, gaps filled linearly
 *    (its period and unit-root checks need a gap-free series);
 * 6. effective sample size and the autocorrelation-corrected CI of the mean of the undifferenced
 *    grid (`effectiveSampleSize`);
 * 7. decomposition of the undifferenced grid: STL (`stl`, gaps filled linearly) or classical
 *    (`decomposeClassical`, additive, gaps left missing), with remainder outliers beyond
 *    `outlierThreshold` robust SDs (1.4826 · MAD; Hampel 1974; Rousseeuw & Croux 1993) of the
 *    remainder at the same position in the cycle (`remainderOutliers`);
 * 8. cross-correlation (`ccf`) with the partner channel put on the same grid and differenced
 *    alike, with its white-noise band and the lag of the strongest correlation.
 *
 * Throws AnalysisInputError (with the engine's message) when a step cannot work with the data.
 * Cost: dominated by STL, O(n · window/jump) per pass, and by the FFTs, O(n log n).
 */
export function channelDiagnostics(readings: ChannelReadings, options: ChannelDiagnosticsOptions, partner?: ChannelReadings): ChannelDiagnostics {
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) throw new AnalysisInputError(`channelDiagnostics: alpha must be between 0 and 1 (got ${alpha})`);
  const d = options.difference ?? 0;
  const D = options.seasonalDifference ?? 0;
  if (![0, 1, 2].includes(d)) throw new AnalysisInputError(`channelDiagnostics: difference must be 0, 1 or 2 (got ${d})`);
  if (![0, 1].includes(D)) throw new AnalysisInputError(`channelDiagnostics: seasonalDifference must be 0 or 1 (got ${D})`);
  const threshold = options.outlierThreshold ?? 3;

  const reg = regularize(readings.timestamps, readings.values, { step: options.step, agg: options.agg });
  const grid = reg.values;
  const n = grid.length;
  const missing = countMissing(grid);
  if (n - missing < 8)
    throw new AnalysisInputError(`channelDiagnostics requires readings in at least 8 cells of the grid (got ${n - missing})`, {
      reason: 'too-few-cells',
      need: 8,
      got: n - missing,
    });
  const filled = fillGapsLinear(grid);

  const detection = detectPeriod(filled, { stepMs: options.step });
  const requested = options.period ?? 'auto';
  let period: number | null;
  let source: 'manual' | 'detected' | 'none';
  if (typeof requested === 'number') {
    if (!Number.isInteger(requested) || requested < 2 || requested > Math.floor(n / 2)) {
      throw new AnalysisInputError(
        `channelDiagnostics: period must be a whole number of steps from 2 to ${Math.floor(n / 2)} for ${n} cells (got ${requested})`,
        { reason: 'period-too-long', need: Math.floor(n / 2), got: requested },
      );
    }
    [period, source] = [requested, 'manual'];
  } else if (requested === 'auto') {
    [period, source] = detection.best === null ? [null, 'none'] : [detection.best, 'detected'];
  } else {
    [period, source] = [null, 'none'];
  }

  const analysed = differenced(grid, d, D, period);
  const nA = analysed.length;
  const presentA = nA - countMissing(analysed);
  if (presentA < 30)
    throw new AnalysisInputError(`channelDiagnostics requires at least 30 values after differencing (got ${presentA})`, {
      reason: d + D > 0 ? 'too-few-after-differencing' : 'too-few-values',
      need: 30,
      got: presentA,
      ...(D > 0 && period !== null ? { period } : {}),
    });
  const seasonalLags = period !== null ? Math.min(2 * period, Math.floor(nA / 4)) : 0;
  const maxLag = options.maxLag ?? Math.max(defaultMaxLag(nA), seasonalLags);
  const acfValues = autocorrelation(analysed, { maxLag });
  // The PACF is the Durbin–Levinson recursion on this same ACF (what `partialAutocorrelation` computes).
  const pacfValues = durbinLevinson(acfValues, maxLag, { keepCoefficients: false }).partial;
  const white = autocorrelationBands(acfValues, { n: presentA, alpha, kind: 'white-noise' });
  const bartlett = autocorrelationBands(acfValues, { n: presentA, alpha, kind: 'bartlett' });

  const boxLags = [...new Set([5, 10, 15, 20, ...(period !== null ? [period, 2 * period] : [])])].filter((h) => h < presentA).sort((a, b) => a - b);
  const ljung = boxLags.map((lag) => ({ lag, ...ljungBox(analysed, lag <= maxLag ? { lag, acf: acfValues } : { lag }) }));

  const decomposition = decompositionOf(grid, filled, options.decomposition ?? 'stl', period, options.stlSeasonalWindow ?? 'periodic', threshold);
  // The seasonal component the model and the trend are fitted without: the decomposition's when
  // it is complete, else periodic STL computed inside identifyProcess.
  const seasonal = decomposition.method !== 'none' && !decomposition.seasonal.some(Number.isNaN) ? decomposition.seasonal : undefined;

  const filledAnalysed = fillGapsLinear(analysed);
  const identified = identifyProcess(filledAnalysed, {
    alpha,
    // the period in use (given or detected); a seasonal difference has removed it
    knownPeriod: D > 0 ? null : period,
    // without gaps it is the series whose ACF was just computed
    ...(filledAnalysed === analysed ? { acf: acfValues } : {}),
    ...(options.maxLag !== undefined ? { maxLag: Math.max(2, Math.min(options.maxLag, Math.floor(nA / 4))) } : {}),
    ...(d === 0 && D === 0 && seasonal ? { seasonal } : {}),
    fitCells: options.modelCells ?? DEFAULT_MODEL_CELLS,
  });

  const ess = effectiveSampleSize(grid, analysed === grid ? { alpha, acf: acfValues } : { alpha });

  let cross: CrossCorrelationOutcome | null = null;
  if (partner) {
    const other = regularize(partner.timestamps, partner.values, { step: options.step, agg: options.agg });
    const y = differenced(alignTo(other, reg.start, n), d, D, period);
    cross = crossCorrelationOf(
      analysed,
      y,
      options.step,
      alpha,
      options.ccfMaxLag,
      options.labels ?? { channel: 'this channel', partner: 'the other channel' },
    );
  }

  let trend: TrendOutcome;
  if (seasonal) {
    const adjusted = new Float64Array(n);
    for (let i = 0; i < n; i++) adjusted[i] = grid[i] - seasonal[i];
    trend = trendOf(adjusted, 'adjusted', alpha);
  } else {
    trend = trendOf(grid, 'series', alpha);
  }

  return {
    grid: { start: reg.start, step: reg.step, n, missing, readings: readings.timestamps.length, values: grid },
    analysed: { n: nA, missing: nA - presentA, values: analysed },
    period: { used: period, source, candidates: detection.candidates.slice(0, 5) },
    maxLag,
    acf: acfValues,
    pacf: pacfValues,
    bands: { alpha, z: white.z, whiteNoise: white.limits[0], bartlett: bartlett.limits },
    ljungBox: ljung,
    identification: { ...identified, gapsFilled: filledAnalysed !== analysed },
    effectiveSampleSize: ess,
    decomposition,
    crossCorrelation: cross,
    trend,
  };
}
