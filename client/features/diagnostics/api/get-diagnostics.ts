import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';

/**
 * What the diagnostics panel asks for; optional fields fall back to the server's defaults.
 * Mirrors the server's `DiagnosticsParams`: importing it (even as a type) would pull the numeric
 * engine's typings into the client's type-check. The answer types below are checked against the
 * server's report in tests/contracts/wire-types.typecheck.ts.
 */
export interface DiagnosticsParams {
  from: number;
  to: number;
  step?: number;
  agg: 'mean' | 'median' | 'last' | 'min' | 'max';
  difference: number;
  seasonalDifference: number;
  maxLag?: number;
  period: 'auto' | 'none' | number;
  decomposition: 'stl' | 'stl-robust' | 'classical' | 'none';
  alpha: number;
  ccfWith?: number;
  /** Cross-correlation lag window in steps (only with `ccfWith`); absent: the server's default. */
  ccfMaxLag?: number;
}

export interface ReportChannel {
  id: number;
  key: string;
  label: string;
  unit: string | null;
  quantity: string | null;
  logger: { id: number; name: string; site: string | null; timezone: string };
}

export interface PeriodCandidate {
  period: number;
  periodS: number;
  exactPeriod: number;
  acf: number;
  peakRatio: number;
  pValue: number;
  sources: string[];
  significant: boolean;
  /** The calendar period the raw estimate was snapped to, if any ('days': a whole number of days from 2 to 6). */
  calendar?: 'hour' | 'day' | 'week' | 'days' | null;
  /** How the length was read, e.g. "288 steps = 1 day (raw estimate 289.4, …)". */
  note?: string;
}

export interface LjungBoxRow {
  lag: number;
  statistic: number;
  df: number;
  pValue: number;
}

export interface Outliers {
  threshold: number;
  median: number;
  robustSd: number;
  indices: number[];
  times: number[];
  values: number[];
}

export type Decomposition =
  | { method: 'none'; reason: string }
  | {
      method: 'stl' | 'stl-robust' | 'classical';
      period: number;
      /** Grid cell of each value when the parts were thinned for drawing; null when every cell is there. */
      cells: number[] | null;
      /** What thinning kept, in the server's words; null when nothing was thinned. */
      thinned: { cells: number; of: number; bucketCells: number; note: string } | null;
      trend: Array<number | null>;
      seasonal: Array<number | null>;
      remainder: Array<number | null>;
      weights: Array<number | null> | null;
      outliers: Outliers;
    };

/**
 * Cross-correlation with a partner channel. `lags`/`values`/`band`/`strongest`/`explanation`
 * describe the prewhitened CCF (when `method` is 'prewhitened'); `strongest.significant` means
 * beyond the simultaneous band. The CCF of the unfiltered pair stays beside it as `raw`.
 */
export interface CrossCorrelation {
  with: ReportChannel;
  pairs: number;
  lags: number[];
  values: Array<number | null>;
  band: number;
  strongest: { lag: number; lagMs: number; value: number; significant: boolean } | null;
  explanation: string;
  method: 'prewhitened' | 'raw';
  /** AR filter of the partner (the input), applied to both series. */
  prewhitening: { order: number; coefficients: number[] } | null;
  /** Band over all lags together. */
  simultaneousBand: number;
  /** How the simultaneous band was made, e.g. 'Šidák over 145 lags'. */
  simultaneousMethod: string;
  raw: { lags: number[]; values: Array<number | null>; band: number; strongest: { lag: number; lagMs: number; value: number; significant: boolean } | null };
}

/** One fitted ARMA(p, q) model: coefficients with standard errors and its fit criteria. */
export interface ArmaFitSummary {
  p: number;
  q: number;
  ar: number[];
  ma: number[];
  mean: number | null;
  standardErrors: { ar: number[]; ma: number[]; mean: number | null };
  sigma2: number;
  logLik: number;
  aicc: number;
  converged: boolean;
}

/** The ARMA model chosen by AICc for the series (or its remainder after the seasonal component), or why there is none. */
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
      /** `admissible`: converged with every root at least 1.01 from the unit circle (a pure AR model: stationary). */
      candidates: Array<{ p: number; q: number; aicc: number | null; bic: number | null; logLik: number | null; converged: boolean; admissible: boolean }>;
      /** Set when the lowest-BIC choice differs from the lowest AICc, saying so. */
      criterionNote: string | null;
      /** A caution about the model (e.g. the unit-root test could not clear the series), or null. */
      note: string | null;
      chosen: ArmaFitSummary;
      residualTest: { lag: number; statistic: number; df: number; pValue: number };
      /** Readings per independent piece of information the model implies (1 for white noise); null when an AR root lies within 1 % of the unit circle. */
      readingsPerIndependent: number | null;
      /** Plain sentence written by the server. */
      sentence: string;
    };

/** A least-squares slope with its autocorrelation-robust (Newey–West) and naive intervals, or why there is none. */
export type TrendAnswer =
  | { available: false; reason: string }
  | {
      available: true;
      unit: string | null;
      n: number;
      /** Newey–West lag used. */
      lag: number;
      perDay: { slope: number; hacInterval: [number, number]; olsInterval: [number, number]; hacStandardError: number; olsStandardError: number };
      perYear: { slope: number; hacInterval: [number, number]; olsInterval: [number, number]; hacStandardError: number; olsStandardError: number };
      pValueHac: number;
      alpha: number;
      sentence: string;
    };

/** The diagnostics answer; every number comes from the server's engine (see the API README). */
export interface DiagnosticsReport {
  cached: boolean;
  channel: ReportChannel;
  method: {
    parameters: Record<string, unknown>;
    resolved: Record<string, unknown> & { from: number; to: number; stepS: number; maxLag: number; alpha: number; period: number | null; periodSource: string };
    notes: string[];
    references: string[];
  };
  series: { start: number; stepMs: number; n: number; missing: number; readings: number; emptyCells: number[] };
  analysed: { n: number; missing: number };
  period: { used: number | null; source: string; candidates: PeriodCandidate[] };
  acf: { lags: number[]; values: Array<number | null> };
  pacf: { lags: number[]; values: Array<number | null> };
  bands: { alpha: number; z: number; whiteNoise: number; bartlett: number[] };
  ljungBox: LjungBoxRow[];
  identification: {
    verdict: 'white-noise' | 'ar' | 'ma' | 'arma' | 'needs-differencing' | 'seasonal';
    p?: number;
    q?: number;
    period?: number;
    explanation: string;
    evidence: Record<string, unknown>;
    gapsFilled: boolean;
    model: ArmaFitSummary | null;
    fittedOn: 'series' | 'remainder' | null;
  };
  effectiveSampleSize: {
    n: number;
    ess: number;
    tau: number;
    lagsUsed: number;
    mean: number;
    standardError: number;
    confidenceInterval: [number, number];
    alpha: number;
  };
  decomposition: Decomposition;
  crossCorrelation: CrossCorrelation | null;
  processModel: ProcessModel;
  trend: TrendAnswer;
}

const base = (slug: string, channelId: number) => `/api/v1/labs/${encodeURIComponent(slug)}/channels/${channelId}`;

/** The query string of a diagnostics request; parameters left out take the server's defaults. */
export function diagnosticsSearch(p: DiagnosticsParams): string {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries(p)) if (v !== undefined && v !== '') q.set(k, String(v));
  return q.toString();
}

/** `GET …/channels/:channelId/diagnostics?…`; aborting `signal` drops the request, and the server then cancels the work. */
export function getDiagnostics(slug: string, channelId: number, params: DiagnosticsParams, signal?: AbortSignal): Promise<DiagnosticsReport> {
  return apiFetch(`${base(slug, channelId)}/diagnostics?${diagnosticsSearch(params)}`, { signal });
}

/** Links to the diagnostics as JSON (the answer itself) and as the server's CSV table. */
export function diagnosticsExportUrls(slug: string, channelId: number, params: DiagnosticsParams): { json: string; csv: string } {
  const search = diagnosticsSearch(params);
  return { json: `${base(slug, channelId)}/diagnostics?${search}`, csv: `${base(slug, channelId)}/diagnostics.csv?${search}` };
}

export const diagnosticsQueryOptions = (slug: string, channelId: number, params: DiagnosticsParams | null) =>
  queryOptions({
    queryKey: ['labs', slug, 'diagnostics', channelId, params],
    queryFn: ({ signal }) => getDiagnostics(slug, channelId, params!, signal),
    enabled: params !== null,
    staleTime: 5 * 60_000,
  });

/** The diagnostics for `params`, fetched only once `params` is set (the "Analyse" button). */
export function useDiagnostics(slug: string, channelId: number, params: DiagnosticsParams | null) {
  return useQuery(diagnosticsQueryOptions(slug, channelId, params));
}
