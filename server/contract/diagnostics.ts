import { z } from 'zod';
import type { IsoTime } from './common.ts';
import type { AppliedNote } from './notes.ts';
import { MAX_RANGE_MS, rangeFields, resolveRange, timeParam, wholeNumber, type TimeRange } from './channels.ts';
import { DIAGNOSTICS_REASONS } from './words/diagnostics.ts';

/**
 * Diagnostics and the before/after comparison of a channel: the query schemas (whose inferred
 * types are THE parameter types of the routes, the diagnostics service and the client's forms)
 * and the answers as JSON carries them (number arrays; a missing value or a non-finite figure
 * is null; times are epoch ms unless said otherwise). Pure zod, so the client may import it.
 */

/** How the readings of one grid cell are summarised. */
export const AGGREGATES = ['mean', 'median', 'last', 'min', 'max'] as const;
export type Aggregate = (typeof AGGREGATES)[number];

/** How the series is split into trend, seasonal part and remainder ('none': not at all). */
export const DECOMPOSITIONS = ['stl', 'stl-robust', 'classical', 'none'] as const;
export type DecompositionChoice = (typeof DECOMPOSITIONS)[number];

const aggregate = z.enum(AGGREGATES, { error: DIAGNOSTICS_REASONS.aggregate }).default('mean');
const alpha = z.coerce.number({ error: 'must be a number' }).gt(0, 'must be above 0').max(0.5, 'must be at most 0.5').default(0.05);
/** Resampling step in seconds: 1 s to 31 days. */
const step = wholeNumber(1, 31 * 86_400);

const periodParam = z
  .string()
  .trim()
  .transform((s, ctx) => {
    if (s === 'auto' || s === 'none') return s;
    const n = /^\d+$/.test(s) ? Number(s) : NaN;
    if (!Number.isInteger(n) || n < 2 || n > 100_000) {
      ctx.addIssue({ code: 'custom', message: DIAGNOSTICS_REASONS.period });
      return z.NEVER;
    }
    return n;
  });

/** `GET …/channels/:channelId/diagnostics?…` (and diagnostics.csv). */
export const diagnosticsQuery = (now: () => number = Date.now) =>
  z
    .object({
      ...rangeFields,
      step: step.optional(),
      agg: aggregate,
      difference: wholeNumber(0, 2).default(0),
      seasonalDifference: wholeNumber(0, 1).default(0),
      maxLag: wholeNumber(1, 10_000).optional(),
      period: periodParam.default('auto'),
      decomposition: z.enum(DECOMPOSITIONS, { error: DIAGNOSTICS_REASONS.decomposition }).default('stl'),
      alpha,
      ccfWith: wholeNumber(1, Number.MAX_SAFE_INTEGER).optional(),
      /** Cross-correlation lag window in steps (only with `ccfWith`); absent: ⌊10·log10(n/2)⌋. */
      ccfMaxLag: wholeNumber(1, 10_000).optional(),
    })
    .refine((q) => !(q.seasonalDifference > 0 && q.period === 'none'), {
      path: ['seasonalDifference'],
      message: DIAGNOSTICS_REASONS.seasonalNeedsPeriod,
    })
    .refine((q) => q.ccfMaxLag === undefined || q.ccfWith !== undefined, { path: ['ccfMaxLag'], message: DIAGNOSTICS_REASONS.ccfLagNeedsPartner })
    .transform((q, ctx) => resolveRange(q, ctx, now));

/**
 * The diagnostics parameters, defaults filled in: what the route parses, the service computes
 * with and caches under, the report echoes and the client's panel sends. `step` is in seconds
 * (absent: the channel's expected interval, else its logger's).
 */
export type DiagnosticsParams = z.infer<ReturnType<typeof diagnosticsQuery>>;

/** A time that must be given. */
const requiredTime = z.string({ error: DIAGNOSTICS_REASONS.timeRequired }).pipe(timeParam);

/** Checks one comparison range: start before end, at most 20 years. */
function checkRange(from: number, to: number, path: string, ctx: z.RefinementCtx): void {
  if (!(from < to)) ctx.addIssue({ code: 'custom', path: [path], message: DIAGNOSTICS_REASONS.rangeOrder });
  else if (to - from > MAX_RANGE_MS) ctx.addIssue({ code: 'custom', path: [path], message: DIAGNOSTICS_REASONS.rangeLength });
}

/**
 * `GET …/channels/:channelId/comparison?aFrom&aTo&bFrom&bTo…`: range a of this channel against
 * range b of `otherChannel` (this channel when left out).
 */
export const comparisonQuery = z
  .object({
    aFrom: requiredTime,
    aTo: requiredTime,
    bFrom: requiredTime,
    bTo: requiredTime,
    step: step.optional(),
    agg: aggregate,
    otherChannel: wholeNumber(1, Number.MAX_SAFE_INTEGER).optional(),
    alpha,
  })
  .superRefine((q, ctx) => {
    checkRange(q.aFrom, q.aTo, 'aTo', ctx);
    checkRange(q.bFrom, q.bTo, 'bTo', ctx);
  });

/** The comparison parameters, defaults filled in (times in epoch ms, `step` in seconds). */
export type ComparisonParams = z.infer<typeof comparisonQuery>;

/** What a report says about a channel: ids, names, unit and its logger. */
export interface ReportChannel {
  id: number;
  key: string;
  label: string;
  unit: string | null;
  quantity: string | null;
  logger: { id: number; name: string; site: string | null; timezone: string };
}

/** Where the grid values came from: raw readings, or exact cell summaries of a rollup resolution. */
export type GridSource = { kind: 'readings' } | { kind: 'rollups'; resolutionS: number };

/** Every STL parameter as run (Cleveland et al. 1990 §3). */
export interface StlSettings {
  period: number;
  periodic: boolean;
  seasonalWindow: number;
  seasonalDegree: number;
  seasonalJump: number;
  trendWindow: number;
  trendDegree: number;
  trendJump: number;
  lowpassWindow: number;
  lowpassDegree: number;
  lowpassJump: number;
  inner: number;
  outer: number;
}

/** The parameters as the engine resolved them. */
export interface ResolvedParameters extends TimeRange {
  stepS: number;
  agg: Aggregate;
  source: GridSource;
  difference: number;
  seasonalDifference: number;
  period: number | null;
  periodSource: 'manual' | 'detected' | 'none';
  maxLag: number;
  alpha: number;
  decomposition: DecompositionChoice;
  stl: StlSettings | null;
  outlierRule: string | null;
  ljungBoxLags: number[];
  ccfMaxLag: number | null;
  modelCells: number | null;
  trendLag: number | null;
}

/** A period the search considered (in steps; `periodS` in seconds). */
export interface PeriodCandidate {
  period: number;
  periodS: number;
  /** The raw estimate before rounding or calendar snapping. */
  exactPeriod: number;
  /** The calendar period the raw estimate was snapped to ('days': a whole number of days from 2 to 6; 'hours': 12, 8, 6, 4, 3 or 2 hours), or null. */
  calendar: 'hour' | 'day' | 'week' | 'days' | 'hours' | null;
  acf: number;
  backgroundAcf: number;
  acfBand: number;
  peakRatio: number;
  backgroundOrder: number;
  pValue: number;
  /** 'harmonics': the cycle's own harmonics stand out too (support for a cycle seen only a few times). */
  sources: Array<'periodogram' | 'acf' | 'harmonics'>;
  significant: boolean;
  /** The longer candidate this one is a harmonic of (part of that cycle's shape, never significant itself), or null. */
  harmonicOf: number | null;
  /** How the length was read, e.g. "288 steps = 1 day (raw estimate 289.4, …)". */
  note: string;
}

/** One row of a Ljung–Box table. */
export interface LjungBoxRow {
  lag: number;
  statistic: number;
  df: number;
  pValue: number;
}

/**
 * Remainder outliers: |remainder − median| > threshold · 1.4826 · MAD, median and MAD taken over
 * the remainder at the same position in the cycle (± `pooledPhases` positions).
 */
export interface Outliers {
  threshold: number;
  /** Median of the whole remainder (for display; each cell is judged at its position in the cycle). */
  median: number;
  /** 1.4826 · MAD of the whole remainder (for display). */
  robustSd: number;
  /** Positions in the cycle pooled on each side of a cell's own when its median and spread are taken. */
  pooledPhases?: number;
  /** Grid cells (0 = first cell of the series), their times and remainder values. */
  indices: number[];
  times: number[];
  values: Array<number | null>;
}

/** The decomposition, or why there is none. */
export type Decomposition =
  | { method: 'none'; reason: string }
  | {
      method: 'stl' | 'stl-robust' | 'classical';
      period: number;
      /** Grid cell of each value when the parts were thinned for drawing; null when every cell is there. */
      cells: number[] | null;
      /** What thinning kept, in the server's words; null when nothing was thinned. */
      thinned: { cells: number; of: number; bucketCells: number; note: string } | null;
      /**
       * The grid values at the same cells, whole: null only for a cell without a reading. Draw the
       * observed panel from this; trend + seasonal + remainder is undefined wherever the trend is
       * (the classical trend's half cycle at each end, as R's decompose() returns NA there).
       * The server always sends it; optional only so that clients and fixtures written before it still type-check.
       */
      observed?: Array<number | null>;
      trend: Array<number | null>;
      seasonal: Array<number | null>;
      remainder: Array<number | null>;
      /** STL robustness weights (robust fit only). */
      weights: Array<number | null> | null;
      outliers: Outliers;
    };

/** The strongest lag of a cross-correlation; `significant`: beyond the simultaneous band (raw: the per-lag band). */
export interface CcfStrongest {
  lag: number;
  lagMs: number;
  value: number;
  significant: boolean;
}

/**
 * Cross-correlation with a partner channel. `lags`/`values`/`band`/`strongest`/`explanation`
 * describe the prewhitened CCF (when `method` is 'prewhitened'); the CCF of the unfiltered pair
 * stays beside it as `raw`, for contrast (no test).
 */
export interface CrossCorrelation {
  with: ReportChannel;
  method: 'prewhitened' | 'raw';
  /** AR filter of the partner (the input), applied to both series. */
  prewhitening: { order: number; coefficients: number[] } | null;
  pairs: number;
  lags: number[];
  values: Array<number | null>;
  band: number;
  /** Band over all lags together. */
  simultaneousBand: number;
  /** How the simultaneous band was made, e.g. 'Šidák over 145 lags'. */
  simultaneousMethod: string;
  strongest: CcfStrongest | null;
  explanation: string;
  raw: { lags: number[]; values: Array<number | null>; band: number; strongest: CcfStrongest | null };
}

/** One fitted ARMA(p, q) model: coefficients with standard errors (null where not defined) and its fit criteria. */
export interface ArmaFitSummary {
  p: number;
  q: number;
  ar: number[];
  ma: number[];
  mean: number | null;
  standardErrors: { ar: Array<number | null>; ma: Array<number | null>; mean: number | null };
  sigma2: number;
  logLik: number;
  aicc: number;
  converged: boolean;
}

/** One order tried; `admissible`: converged with every root at least 1.01 from the unit circle (a pure AR model: stationary). */
export interface ArmaCandidate {
  p: number;
  q: number;
  aicc: number | null;
  bic: number | null;
  logLik: number | null;
  converged: boolean;
  admissible: boolean;
}

/** The model behind the identification's verdict. */
export interface IdentifiedModel extends ArmaFitSummary {
  fittedOn: 'series' | 'remainder';
  start: number;
  cells: number;
  bic: number;
  candidates: ArmaCandidate[];
  lowestAicc: { p: number; q: number };
  residualTest: LjungBoxRow;
  readingsPerIndependent: number;
  /** Smallest modulus of the AR roots; null (Infinity) without AR terms. */
  smallestArRoot: number | null;
  criterionNote: string | null;
}

export type ProcessVerdict = 'white-noise' | 'ar' | 'ma' | 'arma' | 'needs-differencing' | 'seasonal';
export type CorrelogramPattern = 'none' | 'cuts-off' | 'tails-off';

/** What the identification read from the correlogram and the unit-root test. */
export interface ProcessEvidence {
  n: number;
  maxLag: number;
  acf: Array<number | null>;
  pacf: Array<number | null>;
  significantAcfLags: number[];
  significantPacfLags: number[];
  acfCutoff: number;
  pacfCutoff: number;
  acfPattern: CorrelogramPattern;
  pacfPattern: CorrelogramPattern;
  ljungBox: LjungBoxRow;
  /** Augmented Dickey–Fuller with a constant; null when the series is too short. */
  unitRoot: { statistic: number; lags: number; nobs: number; criticalValues: { '1%': number; '5%': number; '10%': number }; rejectsUnitRoot: boolean } | null;
  period: number | null;
  correlogram: { verdict: ProcessVerdict; p?: number; q?: number };
}

/** The engine's process identification. */
export interface Identification {
  verdict: ProcessVerdict;
  p?: number;
  q?: number;
  period?: number;
  explanation: string;
  evidence: ProcessEvidence;
  model: IdentifiedModel | null;
  modelNote: string | null;
  gapsFilled: boolean;
  fittedOn: 'series' | 'remainder' | null;
}

/** The ARMA model chosen by BIC for the series (or its remainder after the seasonal component), or why there is none. */
export type ProcessModel =
  | { available: false; reason: string }
  | {
      available: true;
      /** 'remainder': fitted to the remainder after the seasonal component (channel has a period). */
      fittedOn: 'series' | 'remainder';
      period: number | null;
      /** Cells the fit used (the most recent ones when the range is longer than the fitting cap). */
      cells: number;
      /** Epoch ms of the first cell fitted. */
      fittedFrom: number;
      /** Epoch ms just after the last cell fitted. */
      fittedTo: number;
      candidates: ArmaCandidate[];
      chosen: ArmaFitSummary & { bic: number };
      residualTest: LjungBoxRow;
      /** Readings per independent piece of information the model implies (1 for white noise); null when an AR root lies within 1 % of the unit circle. */
      readingsPerIndependent: number | null;
      lowestAicc: { p: number; q: number };
      /** Set when the lowest-BIC choice differs from the lowest AICc, saying so. */
      criterionNote: string | null;
      /** A caution about the model (e.g. the unit-root test could not clear the series), or null. */
      note: string | null;
      /** Plain sentence written by the server. */
      sentence: string;
    };

/** A slope with both standard errors and intervals, in the channel's unit per day or per year. */
export interface SlopeFigures {
  slope: number;
  hacStandardError: number;
  olsStandardError: number;
  hacInterval: [number, number];
  olsInterval: [number, number];
}

/** A least-squares slope with its autocorrelation-robust (Newey–West) and naive intervals, or why there is none. */
export type TrendAnswer =
  | { available: false; reason: string }
  | {
      available: true;
      /** 'adjusted': the series less its seasonal component. */
      fittedOn: 'series' | 'adjusted';
      unit: string | null;
      n: number;
      /** Newey–West lag used. */
      lag: number;
      perDay: SlopeFigures;
      perYear: SlopeFigures;
      pValueHac: number;
      alpha: number;
      sentence: string;
    };

/** The effective sample size of the range and the interval of its mean. */
export interface EffectiveSampleSize {
  n: number;
  ess: number;
  tau: number;
  lagsUsed: number;
  mean: number;
  standardError: number;
  confidenceInterval: [number, number];
  alpha: number;
}

/** The report of one diagnostics run, as the service builds (and caches) it. */
export interface DiagnosticsReport {
  channel: ReportChannel;
  method: {
    /** The parameters as requested, defaults filled in (`from`/`to` as ISO 8601). */
    parameters: Omit<DiagnosticsParams, 'from' | 'to'> & { from: IsoTime; to: IsoTime };
    resolved: ResolvedParameters;
    notes: string[];
    /** Notes marked "leave out of analysis" whose cells were made missing before the analysis. */
    excludedNotes: AppliedNote[];
    references: string[];
  };
  series: {
    start: number;
    stepMs: number;
    /** Grid cells (steps) from the first to the last cell holding a reading. */
    n: number;
    /** Cells holding no reading. */
    missing: number;
    /** Readings behind the cells (several per cell when the step is longer than the logging interval). */
    readings: number;
    emptyCells: number[];
  };
  analysed: { n: number; missing: number };
  period: {
    /** The one period (in steps) every section of the report used; null when none. */
    used: number | null;
    source: 'manual' | 'detected' | 'none';
    /** The spectral peak's unrounded estimate behind a detected period (not a second period); null otherwise. Always sent; optional for older fixtures. */
    rawEstimate?: number | null;
    /** One sentence stating the period used and, when detected, the raw estimate as such. Always sent; optional for older fixtures. */
    statement?: string;
    candidates: PeriodCandidate[];
  };
  acf: { lags: number[]; values: Array<number | null> };
  pacf: { lags: number[]; values: Array<number | null> };
  bands: { alpha: number; z: number; whiteNoise: number; bartlett: Array<number | null> };
  ljungBox: LjungBoxRow[];
  identification: Identification;
  processModel: ProcessModel;
  trend: TrendAnswer;
  effectiveSampleSize: EffectiveSampleSize;
  decomposition: Decomposition;
  crossCorrelation: CrossCorrelation | null;
}

/** `GET …/channels/:channelId/diagnostics`: the report, and whether it came from the result cache. */
export interface DiagnosticsAnswer extends DiagnosticsReport {
  cached: boolean;
}

/** One range's mean and spread with its effective sample size n/τ. */
export interface RangeSummary extends TimeRange {
  n: number;
  mean: number;
  sd: number;
  effectiveN: number;
  autocorrelationTime: number;
}

/** A standard error of mean(b) − mean(a), its degrees of freedom and interval. */
export interface DifferenceInterval {
  standardError: number;
  df: number;
  interval: [number, number];
}

/** `GET …/channels/:channelId/comparison`: difference of means with a dependence-aware interval and the naive Welch one beside it. */
export interface ComparisonAnswer {
  channel: ReportChannel;
  other: ReportChannel | null;
  a: RangeSummary;
  b: RangeSummary;
  /** mean(b) − mean(a), in the channel's unit. */
  difference: number;
  alpha: number;
  /** From effective sample sizes. */
  dependent: DifferenceInterval;
  /** Naive, independence assumed (R's t.test(b, a)). */
  welch: DifferenceInterval;
  /** Set when a range is short for its autocorrelation, else null. */
  caution: string | null;
  sentence: string;
  method: {
    stepS: number;
    agg: Aggregate;
    statement: string;
    /** Notes marked "leave out of analysis" whose cells were made missing, per range. */
    excludedNotes: { a: AppliedNote[]; b: AppliedNote[] };
    references: string[];
  };
}
