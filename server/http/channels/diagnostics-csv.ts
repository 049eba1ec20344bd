import { csvLine } from '../csv-field.ts';
import type { DiagnosticsReport } from '../../contract/diagnostics.ts';

/** Columns of the diagnostics CSV: one table, every row the same fields (RFC 4180 §2.4). */
export const DIAGNOSTICS_CSV_COLUMNS = [
  'section',
  'lag',
  'acf',
  'pacf',
  'white_noise_band',
  'bartlett_band',
  'ccf',
  'ccf_band',
  'ljung_box_statistic',
  'ljung_box_df',
  'ljung_box_p_value',
  'cell',
  'time_utc',
  'trend',
  'seasonal',
  'remainder',
  'robustness_weight',
  'remainder_outlier',
  'ccf_simultaneous_band',
  'term',
  'estimate',
  'standard_error',
  'interval_low',
  'interval_high',
  'aicc',
  'bic',
  'log_likelihood',
  'note',
] as const;

type Column = (typeof DIAGNOSTICS_CSV_COLUMNS)[number];
type Field = string | number | null | undefined;

const cell = (v: Field) => (v === null || v === undefined || (typeof v === 'number' && Number.isNaN(v)) ? '' : v);

/** One CSV line with the given fields and every other column empty. */
const row = (fields: Partial<Record<Column, Field>>) => csvLine(DIAGNOSTICS_CSV_COLUMNS.map((c) => cell(fields[c])));

/** The process model's rows: coefficients with standard errors, candidates, residual test. */
function* modelRows(report: DiagnosticsReport): Generator<string> {
  const m = report.processModel;
  if (!m.available) {
    yield row({ section: 'model', note: m.reason });
    return;
  }
  const on = m.fittedOn === 'remainder' ? `the series less its ${m.period}-step cycle` : 'the series';
  const note = `ARMA(${m.chosen.p},${m.chosen.q}) by exact maximum likelihood on ${on}, last ${m.cells} cells; chosen by lowest BIC`;
  const c = m.chosen;
  for (let i = 0; i < c.ar.length; i++)
    yield row({ section: 'model-coefficient', term: `ar${i + 1}`, estimate: c.ar[i], standard_error: c.standardErrors.ar[i], note });
  for (let i = 0; i < c.ma.length; i++)
    yield row({ section: 'model-coefficient', term: `ma${i + 1}`, estimate: c.ma[i], standard_error: c.standardErrors.ma[i], note });
  if (c.mean !== null) yield row({ section: 'model-coefficient', term: 'mean', estimate: c.mean, standard_error: c.standardErrors.mean, note });
  yield row({ section: 'model-coefficient', term: 'sigma2', estimate: c.sigma2, aicc: c.aicc, bic: c.bic, log_likelihood: c.logLik, note });
  yield row({
    section: 'model-coefficient',
    term: 'readings_per_independent',
    estimate: m.readingsPerIndependent,
    note: 'long-run over one-reading variance implied by the model',
  });
  for (const k of m.candidates) {
    const chosen = k.p === c.p && k.q === c.q;
    yield row({
      section: 'model-candidate',
      term: `ARMA(${k.p},${k.q})`,
      aicc: k.aicc,
      bic: k.bic,
      log_likelihood: k.logLik,
      note: chosen ? 'chosen' : k.admissible ? '' : 'not admissible (not converged, or a root within 1.01 of the unit circle)',
    });
  }
  const t = m.residualTest;
  yield row({
    section: 'model-residual-test',
    lag: t.lag,
    ljung_box_statistic: t.statistic,
    ljung_box_df: t.df,
    ljung_box_p_value: t.pValue,
    note: 'Ljung–Box on the model residuals, fitdf = p + q',
  });
}

/** The trend rows: slope per day with the Newey–West interval, then the naive OLS one. */
function* trendRows(report: DiagnosticsReport): Generator<string> {
  const t = report.trend;
  if (!t.available) {
    yield row({ section: 'trend', note: t.reason });
    return;
  }
  const unit = t.unit ? ` (${t.unit} per day)` : ' (per day)';
  const what = t.fittedOn === 'adjusted' ? 'least squares on the series less its seasonal component' : 'least squares on the series';
  const slope = (section: string, standardError: number, [low, high]: [number, number], note: string) =>
    row({ section, term: `slope${unit}`, estimate: t.perDay.slope, standard_error: standardError, interval_low: low, interval_high: high, note });
  yield slope('trend', t.perDay.hacStandardError, t.perDay.hacInterval, `${what}; Newey–West standard error, Bartlett lag ${t.lag}; alpha ${t.alpha}`);
  yield slope(
    'trend-independent',
    t.perDay.olsStandardError,
    t.perDay.olsInterval,
    'ordinary least-squares standard error, as if the readings were independent (for contrast)',
  );
}

/**
 * The diagnostics report as CSV lines: `correlogram` rows (lag 0..maxLag: ACF, PACF from lag 1,
 * the white-noise band and Bartlett's band from lag 1), `ccf` rows (prewhitened, with the
 * per-lag and the simultaneous band) and `ccf-raw` rows when a second channel was given,
 * `ljung-box` rows, the process model (`model-coefficient`, `model-candidate`,
 * `model-residual-test`), the trend (`trend` with the Newey–West interval, `trend-independent`
 * with the naive one), and one `decomposition` row per grid cell (time, trend, seasonal,
 * remainder, robustness weight of a robust STL, 1 for a remainder outlier) when there is a
 * decomposition. Empty fields where a column does not apply. The report should be built at full
 * resolution: a decomposition thinned for drawing gives rows for its kept cells only.
 */
export function* diagnosticsCsvLines(report: DiagnosticsReport): Generator<string> {
  yield csvLine([...DIAGNOSTICS_CSV_COLUMNS]);
  const { acf, pacf, bands } = report;
  for (let i = 0; i < acf.lags.length; i++) {
    const k = acf.lags[i];
    yield row({
      section: 'correlogram',
      lag: k,
      acf: acf.values[i],
      ...(k > 0 ? { pacf: pacf.values[k - 1], white_noise_band: bands.whiteNoise, bartlett_band: bands.bartlett[k - 1] } : {}),
    });
  }
  const ccf = report.crossCorrelation;
  if (ccf) {
    const note = ccf.prewhitening
      ? `prewhitened by the AR(${ccf.prewhitening.order}) filter of ${ccf.with.label}; simultaneous band ${ccf.simultaneousMethod}`
      : 'raw (no prewhitening)';
    for (let i = 0; i < ccf.lags.length; i++)
      yield row({ section: 'ccf', lag: ccf.lags[i], ccf: ccf.values[i], ccf_band: ccf.band, ccf_simultaneous_band: ccf.simultaneousBand, note });
    for (let i = 0; i < ccf.raw.lags.length; i++)
      yield row({
        section: 'ccf-raw',
        lag: ccf.raw.lags[i],
        ccf: ccf.raw.values[i],
        ccf_band: ccf.raw.band,
        note: 'not prewhitened: not a test of a relation between autocorrelated series',
      });
  }
  for (const b of report.ljungBox)
    yield row({ section: 'ljung-box', lag: b.lag, ljung_box_statistic: b.statistic, ljung_box_df: b.df, ljung_box_p_value: b.pValue });
  yield* modelRows(report);
  yield* trendRows(report);
  const d = report.decomposition;
  if (d.method === 'none') return;
  const outliers = new Set(d.outliers.indices);
  const { start, stepMs } = report.series;
  for (let j = 0; j < d.trend.length; j++) {
    const i = d.cells ? d.cells[j] : j;
    yield row({
      section: 'decomposition',
      cell: i,
      time_utc: new Date(start + i * stepMs).toISOString(),
      trend: d.trend[j],
      seasonal: d.seasonal[j],
      remainder: d.remainder[j],
      robustness_weight: d.weights ? d.weights[j] : '',
      remainder_outlier: outliers.has(i) ? 1 : 0,
    });
  }
}
