import { loessSmooth } from './loess-smooth.ts';
import { movingAverage } from './moving-average.ts';

/**
 * Low-pass filter of the cycle-subseries, STL's step 3: moving averages of length `period`,
 * `period` and 3, then a loess smoother, turning the `n + 2·period` extended subseries values
 * into `n` values of the low-frequency part that is then removed from the seasonal.
 *
 * Method: Cleveland, Cleveland, McRae & Terpenning (1990), J. Official Statistics
 * 6(1):3–73, §2.2 step 3 (`stlfts` and `stless` in netlib's stl.f). `scratch` and `out` must
 * hold `n + 2·period` values; `extended` is only read. Cost: O(n·span / jump + n).
 */
export function stlLowPass(
  extended: Float64Array,
  n: number,
  period: number,
  span: number,
  degree: number,
  jump: number,
  out: Float64Array,
  scratch: Float64Array,
): void {
  movingAverage(extended, n + 2 * period, period, scratch);
  movingAverage(scratch, n + period + 1, period, out);
  movingAverage(out, n + 2, 3, scratch);
  loessSmooth(scratch, n, span, degree, jump, null, out, 0);
}
