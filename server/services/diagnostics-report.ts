import { describeDuration, describeModel, NEAR_UNIT_ROOT, thinForDrawing, type ChannelDiagnostics } from '../analysis/index.ts';
import type { ChannelWithState } from '../db/channel-state.repo.ts';
import type { Decomposition, DiagnosticsParams, DiagnosticsReport, GridSource, ProcessModel, ReportChannel, TrendAnswer } from '../contract/diagnostics.ts';
import type { AppliedNote } from '../contract/notes.ts';
import { durationWords } from '../contract/words/diagnostics.ts';

/**
 * 'drawing' thins a long decomposition to what a chart can show (the page and the JSON answer);
 * 'full' keeps every cell (the CSV export).
 */
export type DecompositionResolution = 'drawing' | 'full';

/** Above this many cells the JSON answer carries the decomposition thinned for drawing. */
export const MAX_DRAWN_CELLS = 4000;

const REFERENCES = [
  'Box, Jenkins, Reinsel & Ljung (2015), Time Series Analysis: Forecasting and Control, 5th ed. — ACF, PACF, Bartlett bands, identification, CCF',
  'Brockwell & Davis (2016), Introduction to Time Series and Forecasting, 3rd ed. — sample ACF/PACF, mean of a dependent series, classical decomposition',
  'Ljung & Box (1978), Biometrika 65:297–303 — portmanteau test',
  'Cleveland, Cleveland, McRae & Terpenning (1990), Journal of Official Statistics 6:3–73 — STL',
  'Geyer (1992), Statistical Science 7:473–483 — initial monotone sequence for the effective sample size',
  'Said & Dickey (1984), Biometrika 71:599–607 — augmented Dickey–Fuller test in the identification',
  'Rousseeuw & Croux (1993), JASA 88:1273–1283 — 1.4826 · MAD as a robust SD for the outlier rule; Hampel (1974), JASA 69:383–393, and Pearson (2002), IEEE Trans. Control Systems Technology 10:55–63 — the Hampel identifier over a window, here the position in the cycle',
  'Jugel, Jerzak, Hackenbroich & Markl (2014), Proc. VLDB Endowment 7:797–808 — min/max per bucket when a long decomposition is thinned for drawing',
  'Gardner, Harvey & Phillips (1980), Applied Statistics 29:311–322 — exact ARMA likelihood by the Kalman filter',
  'Hurvich & Tsai (1989), Biometrika 76:297–307 — AICc; Burnham & Anderson (2002), Model Selection and Multimodel Inference, 2nd ed., §2.6 — models within 2 AICc',
  'Haugh (1976), JASA 71:378–385, and Box, Jenkins, Reinsel & Ljung (2015) §12.2 — prewhitened cross-correlation; Šidák (1967), JASA 62:626–633 — simultaneous band',
  'Newey & West (1987), Econometrica 55:703–708 — HAC standard error of the trend; Andrews (1991), Econometrica 59:817–858 — its data-driven lag',
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
function decompositionParts(
  dec: Extract<ChannelDiagnostics['decomposition'], { trend: Float64Array }>,
  observed: Float64Array,
  resolution: DecompositionResolution,
): Pick<Extract<Decomposition, { period: number }>, 'cells' | 'thinned' | 'trend' | 'seasonal' | 'remainder' | 'weights'> & { observed: number[] } {
  const n = dec.trend.length;
  const parts = (pick: (a: Float64Array) => number[]) => ({
    observed: pick(observed),
    trend: pick(dec.trend),
    seasonal: pick(dec.seasonal),
    remainder: pick(dec.remainder),
    weights: dec.weights ? pick(dec.weights) : null,
  });
  if (resolution === 'full' || n <= MAX_DRAWN_CELLS) return { cells: null, thinned: null, ...parts(plain) };
  const { cells, bucketCells } = thinForDrawing([observed, dec.trend, dec.seasonal, dec.remainder], n, {
    maxPoints: MAX_DRAWN_CELLS,
    always: dec.outliers.indices,
  });
  const kept = cells.length;
  return {
    cells: Array.from(cells),
    thinned: {
      cells: kept,
      of: n,
      bucketCells,
      note: `Thinned for drawing: ${kept.toLocaleString('en')} of ${n.toLocaleString('en')} cells (in each run of ${bucketCells} cells the first, the last and those holding the lowest and highest observed, trend, seasonal and remainder value, plus every remainder outlier: min/max per bucket, Jugel et al. 2014). The CSV export holds every cell.`,
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

/** What a report says about a channel: ids, names, unit and its logger. */
export const channelSummary = (c: ChannelWithState): ReportChannel => ({
  id: c.id,
  key: c.key,
  label: c.label,
  unit: c.unit,
  quantity: c.quantity,
  logger: { id: c.logger.id, name: c.logger.name, site: c.logger.site, timezone: c.logger.timezone },
});

/** A number with `digits` significant digits, without exponent for everyday sizes. */
function sig(x: number, digits = 3): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  const magnitude = Math.floor(Math.log10(Math.abs(x)));
  const decimals = Math.max(0, digits - 1 - magnitude);
  return decimals > 12 ? x.toExponential(digits - 1) : x.toFixed(decimals);
}

/** A calendar period in words, for the period statement. */
const CALENDAR_WORDS = { hour: 'an hour', day: 'a day', week: 'a week', days: 'a whole number of days', hours: 'a whole-hour part of a day' } as const;

/**
 * The one period the report uses, stated once: the period every section ran with, and — when it
 * was detected — the spectral peak's raw estimate named as such, so a figure such as 287.1 next
 * to a period of 288 steps reads as the estimate behind it, not as a second period.
 */
function periodStatement(r: ChannelDiagnostics, stepMs: number): { rawEstimate: number | null; statement: string } {
  const used = r.period.used;
  if (used === null) return { rawEstimate: null, statement: 'No seasonal period was used.' };
  const length = `${used} steps (${durationWords((used * stepMs) / 1000)})`;
  if (r.period.source === 'manual') return { rawEstimate: null, statement: `Period used everywhere in this report: ${length}, set by hand.` };
  const found = r.period.candidates.find((c) => c.period === used) ?? null;
  if (found === null) return { rawEstimate: null, statement: `Period used everywhere in this report: ${length}, detected.` };
  const raw = Number(found.exactPeriod.toFixed(1));
  const how = found.calendar
    ? `the spectral peak's raw estimate, ${raw} steps, lies within one frequency step of ${CALENDAR_WORDS[found.calendar]} and is reported as exactly that`
    : `the spectral peak's raw estimate, ${raw} steps, rounded to whole steps`;
  return { rawEstimate: found.exactPeriod, statement: `Period used everywhere in this report: ${length}, detected (${how}).` };
}

/** The process model section: the chosen ARMA model, its candidates, residual test and a plain sentence. */
function processModelSection(r: ChannelDiagnostics, stepMs: number, label: string): ProcessModel {
  const m = r.identification.model;
  if (!m) return { available: false as const, reason: r.identification.modelNote ?? 'No model was fitted.' };
  const offset = r.grid.n - r.analysed.n;
  const fittedFrom = r.grid.start + (offset + m.start) * stepMs;
  const step = describeDuration(stepMs);
  const ratio = m.readingsPerIndependent;
  const information =
    m.smallestArRoot < NEAR_UNIT_ROOT
      ? `the model sits at the edge of a wandering level, so it cannot say how many readings are independent (the effective sample size of the range is about ${Math.max(1, Math.round(r.effectiveSampleSize.ess)).toLocaleString('en')})`
      : ratio < 1.5
        ? 'nearly every reading is independent information'
        : `about 1 in ${ratio < 10 ? ratio.toFixed(1) : Math.round(ratio).toLocaleString('en')} readings is independent information`;
  const what = m.fittedOn === 'remainder' ? `Once its ${describeDuration((r.period.used ?? 0) * stepMs)} cycle is removed, ${label}` : label;
  let behaviour: string;
  if (m.p === 0 && m.q === 0) behaviour = `${what} behaves like independent noise from one ${step} step to the next`;
  else if (m.q === 0 && m.p === 1) behaviour = `${what} carries over from one ${step} step to the next with φ = ${m.ar[0].toFixed(2)}`;
  else if (m.p === 0) behaviour = `in ${label} a disturbance echoes for ${m.q} step${m.q === 1 ? '' : 's'} of ${step} and is then forgotten`;
  else behaviour = `${what} follows ${describeModel(m)} on its ${step} steps`;
  const sentence = `${behaviour.charAt(0).toUpperCase()}${behaviour.slice(1)}; ${information}${m.smallestArRoot < NEAR_UNIT_ROOT ? '' : ' about the mean'}.`;
  return {
    available: true as const,
    fittedOn: m.fittedOn,
    period: m.fittedOn === 'remainder' ? r.period.used : null,
    cells: m.cells,
    fittedFrom,
    fittedTo: fittedFrom + m.cells * stepMs,
    candidates: m.candidates,
    chosen: {
      p: m.p,
      q: m.q,
      ar: m.ar,
      ma: m.ma,
      mean: m.mean,
      standardErrors: m.standardErrors,
      sigma2: m.sigma2,
      logLik: m.logLik,
      aicc: m.aicc,
      bic: m.bic,
      converged: m.converged,
    },
    residualTest: m.residualTest,
    readingsPerIndependent: m.smallestArRoot < NEAR_UNIT_ROOT ? null : ratio,
    lowestAicc: m.lowestAicc,
    criterionNote: m.criterionNote,
    note: r.identification.modelNote,
    sentence,
  };
}

/** The trend section: slope per day and per year with the Newey–West and naive intervals, and a sentence. */
function trendSection(r: ChannelDiagnostics, stepMs: number, label: string, unit: string | null): TrendAnswer {
  const t = r.trend;
  if (!t.available) return t;
  const scale = (factor: number) => ({
    slope: t.slope * factor,
    hacStandardError: t.standardErrorHac * factor,
    olsStandardError: t.standardErrorOls * factor,
    hacInterval: [t.interval[0] * factor, t.interval[1] * factor] as [number, number],
    olsInterval: [t.intervalOls[0] * factor, t.intervalOls[1] * factor] as [number, number],
  });
  const perDay = scale(86_400_000 / stepMs);
  const perYear = scale((365.25 * 86_400_000) / stepMs);
  const u = unit ? ` ${unit}` : '';
  const level = `${Math.round((1 - r.bands.alpha) * 100)} %`;
  const [lo, hi] = perDay.hacInterval;
  const verdict =
    lo > 0 || hi < 0
      ? `a drift ${perDay.slope > 0 ? 'upwards' : 'downwards'} that noise alone does not explain`
      : 'no drift distinguishable from the channel’s own slow wandering';
  const widening = perDay.olsInterval[1] > perDay.olsInterval[0] ? (hi - lo) / (perDay.olsInterval[1] - perDay.olsInterval[0]) : NaN;
  const naive =
    Number.isFinite(widening) && widening > 1.2
      ? ` Assuming independent readings would give ${sig(perDay.olsInterval[0])} to ${sig(perDay.olsInterval[1])}${u} per day, an interval ${widening.toFixed(1)} times too narrow.`
      : '';
  const adjusted = t.fittedOn === 'adjusted' ? ' (after removing the seasonal cycle)' : '';
  // Simulated coverage of this interval falls short of nominal on strongly persistent series
  // (≈ 87 % at AR(1) φ = 0.9, n = 1,000; tests/bench/README.md), so say so when the range holds few independent readings.
  const persistent =
    r.effectiveSampleSize.ess < 100
      ? ` The range holds only about ${Math.max(1, Math.round(r.effectiveSampleSize.ess))} independent readings' worth of information, so even this interval is likely somewhat too narrow; a longer range gives a firmer answer.`
      : '';
  return {
    available: true as const,
    fittedOn: t.fittedOn,
    unit,
    n: t.n,
    lag: t.lag,
    perDay,
    perYear,
    pValueHac: t.pValueHac,
    alpha: r.bands.alpha,
    sentence:
      `Allowing for autocorrelation, ${label}${adjusted} changes by ${sig(perDay.slope)}${u} per day ` +
      `(${level} interval ${sig(lo)} to ${sig(hi)}${u} per day; least squares with a Newey–West standard error, lag ${t.lag}): ${verdict}.${naive}${persistent}`,
  };
}

/**
 * One sentence for a method section naming the notes whose spans were left out of an analysis
 * (kind, span, cells removed, text), so a reader can tell which readings the figures ignore.
 */
export function excludedNotesSentence(notes: AppliedNote[]): string {
  const total = notes.reduce((sum, n) => sum + n.cellsRemoved, 0);
  const listed = notes.map(
    (n) =>
      `${n.kind} [${new Date(n.from).toISOString()}, ${new Date(n.to).toISOString()})${n.channelId === null ? ' on the whole logger' : ''}: ${n.cellsRemoved} cell${n.cellsRemoved === 1 ? '' : 's'} — “${n.text}”`,
  );
  return (
    `Left out of the analysis by ${notes.length} note${notes.length === 1 ? '' : 's'} marked "leave out of analysis" (${total} cell${total === 1 ? '' : 's'} with readings made missing; ` +
    `a cell partly under a note goes whole): ${listed.join('; ')}.`
  );
}

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
  /** Readings behind the grid (rollup counts summed when the cells come from rollups); default: the values the engine was given. */
  readings?: number;
  result: ChannelDiagnostics;
  /** Default 'drawing'. */
  resolution?: DecompositionResolution;
  /** Notes whose cells were made missing before the run (none when left out). */
  excludedNotes?: AppliedNote[];
}): DiagnosticsReport {
  const { result: r, params, stepS } = input;
  const stepMs = stepS * 1000;
  const dec = r.decomposition;
  const notes = [
    `Readings of [${new Date(input.range.from).toISOString()}, ${new Date(input.range.to).toISOString()}) were put on a regular grid of ${stepS} s cells aligned to whole steps of UTC, each cell the ${params.agg} of its readings` +
      (input.source.kind === 'rollups' ? ` (computed exactly from the ${input.source.resolutionS} s rollups).` : '.'),
    'ACF, PACF, Ljung–Box, the effective sample size and the CCF skip empty cells: each lag uses only the pairs of cells that both hold a value, and nothing is filled in.',
    `Ordinary differences: ${params.difference}; seasonal differences: ${params.seasonalDifference}${r.period.used !== null && params.seasonalDifference ? ` (lag ${r.period.used})` : ''}. The decomposition and the effective sample size use the undifferenced grid; the CCF differences both channels alike.`,
  ];
  const model = r.identification.model;
  if (model) {
    notes.push(
      `Process model: every ARMA(p, q) with p, q ≤ 3 and a mean fitted by exact Gaussian maximum likelihood (Kalman filter; Gardner, Harvey & Phillips 1980) to the last ${model.cells} cells of ${model.fittedOn === 'remainder' ? 'the series less its seasonal component' : 'the analysed series'}; ` +
        'the verdict follows the lowest BIC among admissible fits (converged, every root at least 1.01 from the unit circle; a pure AR model only needs to be stationary), and AICc is listed beside it.',
    );
  }
  if (r.crossCorrelation) {
    const c = r.crossCorrelation;
    notes.push(
      `Cross-correlation: both channels filtered by the AR(${c.prewhitening?.order ?? 0}) model of the partner (Yule–Walker, order chosen by AIC), then the CCF of the filtered pair over ±${c.lags.length >> 1} lags; ` +
        `a lag counts as a relation only beyond the band that holds for all lags together (${c.simultaneousMethod}). The raw CCF is kept under crossCorrelation.raw for contrast and is no test.`,
    );
  }
  if (r.trend.available) {
    notes.push(
      `Trend: least squares against the step number on ${r.trend.fittedOn === 'adjusted' ? 'the series less its seasonal component' : 'the series'}, with a Newey–West standard error (Bartlett kernel, lag ${r.trend.lag} from Andrews' AR(1) plug-in rule, never below Newey & West's (1994) ⌊4(n/100)^(2/9)⌋); the ordinary least-squares interval is given beside it for contrast.`,
    );
  }
  const excluded = input.excludedNotes ?? [];
  if (excluded.length > 0) notes.push(excludedNotesSentence(excluded));
  if (r.grid.missing > 0) {
    notes.push(
      `${r.grid.missing} of ${r.grid.n} cells were empty; STL, period detection and process identification filled them by linear interpolation between the neighbouring cells (the classical decomposition leaves them missing).`,
    );
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
        outlierRule:
          dec.method === 'none'
            ? null
            : `|remainder − median| > ${dec.outliers.threshold} × 1.4826 × MAD, both taken over the remainder at the same position in the ${dec.period}-step cycle (±${dec.outliers.pooledPhases} position${dec.outliers.pooledPhases === 1 ? '' : 's'} pooled)`,
        ljungBoxLags: r.ljungBox.map((b) => b.lag),
        ccfMaxLag: r.crossCorrelation ? r.crossCorrelation.lags.length >> 1 : null,
        modelCells: r.identification.model?.cells ?? null,
        trendLag: r.trend.available ? r.trend.lag : null,
      },
      notes,
      excludedNotes: excluded,
      references: REFERENCES,
    },
    series: {
      start: r.grid.start,
      stepMs,
      n: r.grid.n,
      missing: r.grid.missing,
      readings: input.readings ?? r.grid.readings,
      emptyCells: emptyCellsOf(r.grid.values),
    },
    analysed: { n: r.analysed.n, missing: r.analysed.missing },
    period: {
      used: r.period.used,
      source: r.period.source,
      ...periodStatement(r, stepMs),
      candidates: r.period.candidates.map((c) => ({ ...c, periodS: c.period * stepS })),
    },
    acf: { lags: Array.from({ length: r.acf.length }, (_, k) => k), values: plain(r.acf) },
    pacf: { lags: Array.from({ length: r.pacf.length }, (_, k) => k + 1), values: plain(r.pacf) },
    bands: { alpha: r.bands.alpha, z: r.bands.z, whiteNoise: r.bands.whiteNoise, bartlett: plain(r.bands.bartlett) },
    ljungBox: r.ljungBox,
    identification: { ...plain(r.identification), fittedOn: r.identification.model?.fittedOn ?? null },
    processModel: processModelSection(r, stepMs, input.channel.label),
    trend: trendSection(r, stepMs, input.channel.label, input.channel.unit),
    effectiveSampleSize: plain(r.effectiveSampleSize),
    decomposition:
      dec.method === 'none'
        ? { method: 'none' as const, reason: dec.reason }
        : {
            method: dec.method,
            period: dec.period,
            ...decompositionParts(dec, r.grid.values, input.resolution ?? 'drawing'),
            outliers: {
              threshold: dec.outliers.threshold,
              median: dec.outliers.median,
              robustSd: dec.outliers.robustSd,
              pooledPhases: dec.outliers.pooledPhases,
              indices: dec.outliers.indices,
              times: dec.outliers.indices.map((i) => r.grid.start + i * stepMs),
              values: dec.outliers.indices.map((i) => dec.remainder[i]),
            },
          },
    crossCorrelation: r.crossCorrelation && input.partner ? { with: channelSummary(input.partner), ...plain(r.crossCorrelation) } : null,
  };
}
