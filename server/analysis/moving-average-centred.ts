/**
 * Centred moving average over one full cycle, the trend filter of classical decomposition:
 * for an odd period p the mean of the p values centred on each position; for an even period
 * the "2×p" average, weights 1/(2p), 1/p, …, 1/p, 1/(2p) over p + 1 values, so that the
 * window stays centred. Positions whose window runs past either end or holds a NaN get NaN.
 *
 * Method: Brockwell & Davis (2016), Introduction to Time Series and Forecasting, 3rd ed.,
 * §1.5.2, the seasonal-trend estimate (1.5.12); the same filter as R's
 * `filter(x, c(0.5, rep(1, p - 1), 0.5) / p)` inside `decompose()`. One running sum with a
 * count of missing values gives O(n) time whatever the period. The input is only read.
 */
export function movingAverageCentred(x: Float64Array, period: number): Float64Array {
  const n = x.length;
  const out = new Float64Array(n).fill(NaN);
  const even = period % 2 === 0;
  const half = even ? period / 2 : (period - 1) / 2;
  // The running sum covers the full-weight core of the window: i - core .. i + core.
  const core = even ? half - 1 : half;
  if (2 * half + 1 > n) return out;
  let sum = 0;
  let missing = 0;
  const add = (v: number, sign: number) => {
    if (Number.isNaN(v)) missing += sign;
    else sum += sign * v;
  };
  for (let j = half - core; j <= half + core; j++) add(x[j], 1);
  for (let i = half; i < n - half; i++) {
    if (i > half) {
      add(x[i - core - 1], -1);
      add(x[i + core], 1);
    }
    if (missing > 0) continue;
    if (even) {
      const ends = 0.5 * (x[i - half] + x[i + half]);
      if (!Number.isNaN(ends)) out[i] = (sum + ends) / period;
    } else {
      out[i] = sum / period;
    }
  }
  return out;
}
