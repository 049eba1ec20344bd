import { thinForDrawing, type ChannelDiagnostics } from '../analysis/index.ts';
import type { ChannelWithState } from '../db/channel-state.repo.ts';

/** The diagnostics parameters as the request chose them, defaults filled in. */
export interface DiagnosticsParams {
  from: number;
  to: number;
  /** Seconds; default the channel's expected interval (else its logger's). */
  step?: number;
  agg: 'mean' | 'median' | 'last' | 'min' | 'max';
  difference: number;
  seasonalDifference: number;
  maxLag?: number;
  period: 'auto' | 'none' | number;
  decomposition: 'stl' | 'stl-robust' | 'classical' | 'none';
  alpha: number;
  ccfWith?: number;
  ccfMaxLag?: number;
}

/**
 * 'drawing' thins a long decomposition to what a chart can show (the page and the JSON answer);
 * 'full' keeps every cell (the CSV export).
 */
export type DecompositionResolution = 'drawing' | 'full';

/** Above this many cells the JSON answer carries the decomposition thinned for drawing. */
export const MAX_DRAWN_CELLS = 4000;

/** Where the grid values came from: raw readings, or exact cell summaries of a rollup resolution. */
export type GridSource = { kind: 'readings' } | { kind: 'rollups'; resolutionS: number };

const REFERENCES = [
  'Box, Jenkins, Reinsel & Ljung (2015), Time Series Analysis: Forecasting and Control, 5th ed. — ACF, PACF, Bartlett bands, identification, CCF',
  'Brockwell & Davis (2016), Introduction to Time Series and Forecasting, 3rd ed. — sample ACF/PACF, mean of a dependent series, classical decomposition',
  'Ljung & Box (1978), Biometrika 65:297–303 — portmanteau test',
  'Cleveland, Cleveland, McRae & Terpenning (1990), Journal of Official Statistics 6:3–73 — STL',
  'Geyer (1992), Statistical Science 7:473–483 — initial monotone sequence for the effective sample size',
  'Said & Dickey (1984), Biometrika 71:599–607 — augmented Dickey–Fuller test in the identification',
  'Rousseeuw & Croux (1993), JASA 88:1273–1283 — 1.4826 · MAD as a robust SD for the outlier rule',
  'Jugel, Jerzak, Hackenbroich & Markl (2014), Proc. VLDB Endowment 7:797–808 — min/max per bucket when a long decomposition is thinned for drawing',
];

type Plain<T> = T extends Float64Array | Int32Array ? number[] : T extends object ? { [K in keyof T]: Plain<T[K]> } : T;

/** Typed arrays → plain arrays, deeply (JSON would turn a typed array into an object). NaN stays NaN: JSON writes it as null. */
function plain<T>(value: T): Plain<T> {
  if (value instanceof Float64Array || value instanceof Int32Array) return Array.from(value) as Plain<T>;
  if (Array.isArray(value)) return value.map(plain) as Plain<T>;
  if (value && typeof value === 'object' && !(value instanceof Date)) {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, plain(v)])) as Plain<T>;
  }
  return value as Plain<T>;
}

/** The decomposition's parts at the cells worth drawing (every cell for 'full' or a short series). */
function decompositionParts(dec: Extract<ChannelDiagnostics['decomposition'], { trend: Float64Array }>, resolution: DecompositionResolution) {
  const n = dec.trend.length;
  const parts = (pick: (a: Float64Array) => number[]) => ({
    trend: pick(dec.trend),
    seasonal: pick(dec.seasonal),
    remainder: pick(dec.remainder),
    weights: dec.weights ? pick(dec.weights) : null,
  });
  if (resolution === 'full' || n <= MAX_DRAWN_CELLS) return { cells: null, thinned: null, ...parts(plain) };
  const { cells, bucketCells } = thinForDrawing([dec.trend, dec.seasonal, dec.remainder], n, { maxPoints: MAX_DRAWN_CELLS, always: dec.outliers.indices });
  const kept = cells.length;
  return {
    cells: Array.from(cells),
    thinned: {
      cells: kept,
      of: n,
      bucketCells,
      note: `Thinned for drawing: ${kept.toLocaleString('en')} of ${n.toLocaleString('en')} cells (in each run of ${bucketCells} cells the first, the last and those holding the lowest and highest trend, seasonal and remainder value, plus every remainder outlier: min/max per bucket, Jugel et al. 2014). The CSV export holds every cell.`,
    },
    ...parts((a) => Array.from(cells, (i) => a[i])),
  };
}

/** Indices of the grid cells without a reading (the cells gap filling interpolated). */
function emptyCellsOf(values: Float64Array): number[] {
  const out: number[] = [];
  for (let i = 0; i < values.length; i++) if (Number.isNaN(values[i])) out.push(i);
  return out;
}

const channelSummary = (c: ChannelWithState) => ({
  id: c.id,
  key: c.key,
  label: c.label,
  unit: c.unit,
  quantity: c.quantity,
  logger: { id: c.logger.id, name: c.logger.name, site: c.logger.site, timezone: c.logger.timezone },
});

/**
 * The JSON report of one diagnostics run: what was computed, from what, and how — every number
 * the engine produced, the parameters as requested and as resolved, the steps taken with the
 * data (gap filling, differencing) and the published methods, so a figure can be reproduced
 * and cited. Missing values come out as null. A decomposition longer than MAX_DRAWN_CELLS is
 * thinned for drawing unless `resolution` is 'full': `decomposition.cells` then lists the cell
 * index of each value and `decomposition.thinned` says what was kept (both null when every cell
 * is there).
 */
export function diagnosticsReport(input: {
  channel: ChannelWithState;
  partner: ChannelWithState | null;
  params: DiagnosticsParams;
  range: { from: number; to: number };
  stepS: number;
  source: GridSource;
  result: ChannelDiagnostics;
  /** Default 'drawing'. */
  resolution?: DecompositionResolution;
}) {
  const { result: r, params, stepS } = input;
  const stepMs = stepS * 1000;
  const dec = r.decomposition;
  const notes = [
    `Readings of [${new Date(input.range.from).toISOString()}, ${new Date(input.range.to).toISOString()}) were put on a regular grid of ${stepS} s cells aligned to whole steps of UTC, each cell the ${params.agg} of its readings` +
      (input.source.kind === 'rollups' ? ` (computed exactly from the ${input.source.resolutionS} s rollups).` : '.'),
    'ACF, PACF, Ljung–Box, the effective sample size and the CCF skip empty cells as R does with na.action = na.pass.',
    `Ordinary differences: ${params.difference}; seasonal differences: ${params.seasonalDifference}${r.period.used !== null && params.seasonalDifference ? ` (lag ${r.period.used})` : ''}. The decomposition and the effective sample size use the undifferenced grid; the CCF differences both channels alike.`,
  ];
  if (r.grid.missing > 0) {
    notes.push(`${r.grid.missing} of ${r.grid.n} cells were empty; STL, period detection and process identification filled them by linear interpolation between the neighbouring cells (the classical decomposition leaves them missing).`);
  }
  return {
    channel: channelSummary(input.channel),
    method: {
      parameters: { ...params, from: new Date(params.from).toISOString(), to: new Date(params.to).toISOString() },
      resolved: {
        from: input.range.from,
        to: input.range.to,
        stepS,
        agg: params.agg,
        source: input.source,
        difference: params.difference,
        seasonalDifference: params.seasonalDifference,
        period: r.period.used,
        periodSource: r.period.source,
        maxLag: r.maxLag,
        alpha: r.bands.alpha,
        decomposition: dec.method,
        stl: dec.method === 'none' ? null : dec.stl,
        outlierRule: dec.method === 'none' ? null : `|remainder − median| > ${dec.outliers.threshold} × 1.4826 × MAD of the remainder`,
        ljungBoxLags: r.ljungBox.map((b) => b.lag),
      },
      notes,
      references: REFERENCES,
    },
    series: { start: r.grid.start, stepMs, n: r.grid.n, missing: r.grid.missing, readings: r.grid.readings, emptyCells: emptyCellsOf(r.grid.values) },
    analysed: { n: r.analysed.n, missing: r.analysed.missing },
    period: {
      used: r.period.used,
      source: r.period.source,
      candidates: r.period.candidates.map((c) => ({ ...c, periodS: c.period * stepS })),
    },
    acf: { lags: Array.from({ length: r.acf.length }, (_, k) => k), values: plain(r.acf) },
    pacf: { lags: Array.from({ length: r.pacf.length }, (_, k) => k + 1), values: plain(r.pacf) },
    bands: { alpha: r.bands.alpha, z: r.bands.z, whiteNoise: r.bands.whiteNoise, bartlett: plain(r.bands.bartlett) },
    ljungBox: r.ljungBox,
    identification: plain(r.identification),
    effectiveSampleSize: plain(r.effectiveSampleSize),
    decomposition:
      dec.method === 'none'
        ? { method: 'none' as const, reason: dec.reason }
        : {
            method: dec.method,
            period: dec.period,
            ...decompositionParts(dec, input.resolution ?? 'drawing'),
            outliers: {
              ...dec.outliers,
              times: dec.outliers.indices.map((i) => r.grid.start + i * stepMs),
              values: dec.outliers.indices.map((i) => dec.remainder[i]),
            },
          },
    crossCorrelation:
      r.crossCorrelation && input.partner
        ? { with: channelSummary(input.partner), ...plain(r.crossCorrelation) }
        : null,
  };
}

export type DiagnosticsReport = ReturnType<typeof diagnosticsReport>;
