import { csvLine } from '../csv-field.ts';
import type { DiagnosticsReport } from '../../services/diagnostics-report.ts';

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
];

/** Empty fields for the decomposition columns of a row from another section. */
const NO_CELL = ['', '', '', '', '', '', ''];

const cell = (v: number | null | undefined) => (v === null || v === undefined || Number.isNaN(v) ? '' : v);

/**
 * The diagnostics report as CSV lines: `correlogram` rows (lag 0..maxLag: ACF, PACF from lag 1,
 * the white-noise band and Bartlett's band from lag 1), `ccf` rows when a second channel was
 * given, `ljung-box` rows, and one `decomposition` row per grid cell (time, trend, seasonal,
 * remainder, robustness weight of a robust STL, 1 for a remainder outlier) when there is a
 * decomposition. Empty fields where a column does not apply. The report should be built at full
 * resolution: a decomposition thinned for drawing gives rows for its kept cells only.
 */
export function* diagnosticsCsvLines(report: DiagnosticsReport): Generator<string> {
  yield csvLine(DIAGNOSTICS_CSV_COLUMNS);
  const { acf, pacf, bands } = report;
  for (let i = 0; i < acf.lags.length; i++) {
    const k = acf.lags[i];
    yield csvLine(['correlogram', k, cell(acf.values[i]), k > 0 ? cell(pacf.values[k - 1]) : '', k > 0 ? bands.whiteNoise : '', k > 0 ? cell(bands.bartlett[k - 1]) : '', '', '', '', '', '', ...NO_CELL]);
  }
  const ccf = report.crossCorrelation;
  if (ccf) {
    for (let i = 0; i < ccf.lags.length; i++) yield csvLine(['ccf', ccf.lags[i], '', '', '', '', cell(ccf.values[i]), ccf.band, '', '', '', ...NO_CELL]);
  }
  for (const b of report.ljungBox) yield csvLine(['ljung-box', b.lag, '', '', '', '', '', '', b.statistic, b.df, b.pValue, ...NO_CELL]);
  const d = report.decomposition;
  if (d.method === 'none') return;
  const outliers = new Set(d.outliers.indices);
  const { start, stepMs } = report.series;
  for (let j = 0; j < d.trend.length; j++) {
    const i = d.cells ? d.cells[j] : j;
    const weight = d.weights ? cell(d.weights[j]) : '';
    yield csvLine(['decomposition', '', '', '', '', '', '', '', '', '', '', i, new Date(start + i * stepMs).toISOString(), cell(d.trend[j]), cell(d.seasonal[j]), cell(d.remainder[j]), weight, outliers.has(i) ? 1 : 0]);
  }
}
