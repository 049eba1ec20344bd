import type { ArmaFitSummary, CrossCorrelation, DiagnosticsAnswer, IdentifiedModel } from '@shared/contract/diagnostics.ts';

/**
 * A diagnostics answer in the API's documented shape, for component tests only. The numbers are
 * invented (they only have to be shown faithfully); z = 1.959964 is the standard normal 97.5%
 * quantile (R: qnorm(0.975)).
 */
export const FROM = Date.parse('2026-06-01T00:00:00Z');
export const TO = Date.parse('2026-06-08T00:00:00Z');

export const REPORT: DiagnosticsAnswer = {
  cached: true,
  channel: { id: 5, key: 'soil_vwc', label: 'Soil moisture', unit: '%', quantity: null, logger: { id: 2, name: 'Row 7 mast', site: null, timezone: 'UTC' } },
  method: {
    parameters: {
      from: '2026-06-01T00:00:00.000Z',
      to: '2026-06-08T00:00:00.000Z',
      step: 300,
      agg: 'mean',
      difference: 0,
      seasonalDifference: 0,
      period: 'auto',
      decomposition: 'none',
      alpha: 0.05,
    },
    resolved: {
      from: FROM,
      to: TO,
      stepS: 300,
      agg: 'mean',
      source: { kind: 'readings' },
      difference: 0,
      seasonalDifference: 0,
      period: null,
      periodSource: 'none',
      maxLag: 4,
      alpha: 0.05,
      decomposition: 'none',
      stl: null,
      outlierRule: null,
      ljungBoxLags: [5],
      ccfMaxLag: null,
      modelCells: null,
      trendLag: null,
    },
    notes: ['Readings were put on a regular grid of 300 s cells.'],
    excludedNotes: [],
    references: ['Ljung & Box (1978), Biometrika 65:297–303 — portmanteau test'],
  },
  series: { start: FROM, stepMs: 300_000, n: 4, missing: 0, readings: 4, emptyCells: [] },
  analysed: { n: 4, missing: 0 },
  period: { used: null, source: 'none', candidates: [] },
  acf: { lags: [0, 1, 2, 3, 4], values: [1, 0.6, 0.3, 0.1, 0] },
  pacf: { lags: [1, 2, 3, 4], values: [0.6, -0.1, 0, 0.05] },
  bands: { alpha: 0.05, z: 1.959964, whiteNoise: 0.2, bartlett: [0.2, 0.25, 0.26, 0.26] },
  ljungBox: [{ lag: 5, statistic: 12.5, df: 5, pValue: 0.0285 }],
  identification: {
    verdict: 'ar',
    p: 1,
    explanation: 'The PACF cuts off after lag 1 while the ACF dies down: an AR(1) process.',
    evidence: {
      n: 4,
      maxLag: 4,
      acf: [0.6, 0.3, 0.1, 0],
      pacf: [0.6, -0.1, 0, 0.05],
      significantAcfLags: [1, 2],
      significantPacfLags: [1],
      acfCutoff: 2,
      pacfCutoff: 1,
      acfPattern: 'tails-off',
      pacfPattern: 'cuts-off',
      ljungBox: { lag: 5, statistic: 12.5, df: 5, pValue: 0.0285 },
      unitRoot: null,
      period: null,
      correlogram: { verdict: 'ar', p: 1 },
    },
    gapsFilled: false,
    model: null,
    modelNote: null,
    fittedOn: null,
  },
  effectiveSampleSize: { n: 2016, ess: 504, tau: 4, lagsUsed: 10, mean: 10, standardError: 0.5, confidenceInterval: [9.020018, 10.979982], alpha: 0.05 },
  decomposition: { method: 'none', reason: 'no seasonal period' },
  crossCorrelation: null,
  processModel: { available: false, reason: 'invented reason: too few cells for a model' },
  trend: { available: false, reason: 'invented reason: the series is constant' },
};

const FIT: ArmaFitSummary & { bic: number } = {
  p: 1,
  q: 0,
  ar: [0.8213],
  ma: [],
  mean: 21.42,
  standardErrors: { ar: [0.0312], ma: [], mean: 0.587 },
  sigma2: 0.0441,
  logLik: 512.3,
  aicc: -1018.58,
  bic: -1005.4,
  converged: true,
};

/** A process model fitted to the remainder after a 288-step (1-day at 300 s) cycle; invented numbers. */
export const PROCESS_MODEL: DiagnosticsAnswer['processModel'] = {
  available: true,
  fittedOn: 'remainder',
  period: 288,
  cells: 2016,
  fittedFrom: FROM,
  fittedTo: TO,
  candidates: [
    { p: 0, q: 0, aicc: 1200.5, bic: 1209.3, logLik: -598.2, converged: true, admissible: true },
    { p: 1, q: 0, aicc: -1018.58, bic: -1005.4, logLik: 512.3, converged: true, admissible: true },
    { p: 1, q: 1, aicc: -1016.6, bic: -999.0, logLik: 512.31, converged: true, admissible: true },
    { p: 3, q: 3, aicc: null, bic: null, logLik: null, converged: false, admissible: false },
  ],
  criterionNote: null,
  note: null,
  chosen: FIT,
  residualTest: { lag: 20, statistic: 18.7, df: 19, pValue: 0.476 },
  readingsPerIndependent: 10.19,
  lowestAicc: { p: 1, q: 0 },
  sentence: 'Invented sentence: readings carry over from one 5-minute step to the next with φ = 0.82.',
};

/** A trend whose HAC interval is wider than the OLS one; invented numbers. */
export const TREND: DiagnosticsAnswer['trend'] = {
  available: true,
  fittedOn: 'adjusted',
  unit: '%',
  n: 2016,
  lag: 8,
  perDay: { slope: 0.0123, hacInterval: [-0.0101, 0.0347], olsInterval: [0.0081, 0.0165], hacStandardError: 0.01143, olsStandardError: 0.00214 },
  perYear: { slope: 4.4926, hacInterval: [-3.6865, 12.6655], olsInterval: [2.9565, 6.0231], hacStandardError: 4.172, olsStandardError: 0.781 },
  pValueHac: 0.2821,
  alpha: 0.05,
  sentence: 'Invented sentence: no drift that the autocorrelation cannot explain.',
};

/** A prewhitened cross-correlation with its raw CCF beside it, 5-minute steps; invented numbers. */
export const CCF: CrossCorrelation = {
  with: {
    id: 9,
    key: 'irrigation_flow',
    label: 'Irrigation flow',
    unit: 'L/min',
    quantity: null,
    logger: { id: 3, name: 'Pump house', site: null, timezone: 'UTC' },
  },
  pairs: 2016,
  lags: [-2, -1, 0, 1, 2],
  values: [0.01, -0.02, 0.03, 0.05, 0.31],
  band: 0.0437,
  strongest: { lag: 2, lagMs: 600_000, value: 0.31, significant: true },
  explanation: 'Invented sentence: this channel follows irrigation flow by 10 min.',
  method: 'prewhitened',
  prewhitening: { order: 2, coefficients: [1.2, -0.35] },
  simultaneousBand: 0.0712,
  simultaneousMethod: 'Šidák over 5 lags',
  raw: { lags: [-2, -1, 0, 1, 2], values: [-0.6, -0.62, -0.64, -0.6, -0.55], band: 0.0437, strongest: { lag: 0, lagMs: 0, value: -0.64, significant: true } },
};

/** The model behind the identification's verdict when PROCESS_MODEL is fitted (the same invented fit). */
export const IDENTIFIED_MODEL: IdentifiedModel = {
  ...FIT,
  fittedOn: 'remainder',
  start: 0,
  cells: 2016,
  candidates: [],
  lowestAicc: { p: 1, q: 0 },
  residualTest: { lag: 20, statistic: 18.7, df: 19, pValue: 0.476 },
  readingsPerIndependent: 10.19,
  smallestArRoot: 1.2176,
  criterionNote: null,
};
