/**
 * Correlation engine benchmark: ACF (n = 1 000 000, 200 lags) and PACF (n = 100 000, 50 lags),
 * each against R's stats and statsmodels on the very same numbers (written to a temporary
 * little-endian float64 file that every tool reads). Reports; never asserts.
 *
 * Run: npm run bench:analysis   (or: npx tsx tests/bench/analysis-correlation.bench.ts)
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { acf, pacf } from '../../server/analysis/index.ts';
import { simulateArma } from '../../server/analysis/seeded-simulation.testkit.ts';
import { printRatioLine, referenceAvailable, timeMedian, timeReference, type ReferenceTiming } from './bench-helpers.ts';

const ACF_N = 1_000_000;
const ACF_LAGS = 200;
const PACF_N = 100_000;
const PACF_LAGS = 50;

/** Simulated logger-like data: a daily cycle in 5-minute steps plus AR(1) noise (fixed seed). */
const series = simulateArma({ ar: [0.8] }, ACF_N, 2024).map((v, t) => v + 2 * Math.sin((2 * Math.PI * t) / 288));
const shortSeries = series.slice(0, PACF_N);

const dir = mkdtempSync(join(tmpdir(), 'lagbook-bench-data-'));
const dataFile = join(dir, 'series.f64');
writeFileSync(dataFile, Buffer.from(series.buffer, series.byteOffset, series.byteLength));

/** R timing script: median of `runs` after one warm-up call. */
function rScript(call: string, runs: number): string {
  return `
x <- readBin(${JSON.stringify(dataFile)}, what = "double", n = ${ACF_N}, size = 8, endian = "little")
y <- x[1:${PACF_N}]
invisible(${call})
times <- replicate(${runs}, system.time(${call})[["elapsed"]])
cat(median(times), "\\n")
`;
}

/** statsmodels timing script: median of `runs` after `warmup` calls. */
function pyScript(setup: string, call: string, runs: number, warmup = 1): string {
  return `
import time, numpy as np
${setup}
x = np.fromfile(${JSON.stringify(dataFile)}, dtype="<f8")
y = x[:${PACF_N}].copy()
for _ in range(${warmup}):
    ${call}
times = []
for _ in range(${runs}):
    t = time.perf_counter(); ${call}; times.append(time.perf_counter() - t)
print(sorted(times)[len(times) // 2])
`;
}

function reference(name: string, tool: 'R' | 'statsmodels', script: string): ReferenceTiming {
  const available = referenceAvailable(tool);
  if (!available.ok) return { name, seconds: null, missing: `${tool} not installed: ${available.hint}` };
  return { name, seconds: timeReference(tool, script) };
}

try {
  console.log(`Correlation benchmark (Node ${process.version}); medians of 5 runs after warm-up unless noted.`);

  const oursAcf = timeMedian(() => acf(series, { maxLag: ACF_LAGS }));
  printRatioLine(`acf n=${ACF_N} lags=${ACF_LAGS}`, oursAcf, [
    reference('R acf', 'R', rScript(`acf(x, lag.max = ${ACF_LAGS}, plot = FALSE)`, 5)),
    reference('statsmodels acf(fft=True)', 'statsmodels', pyScript('from statsmodels.tsa.stattools import acf', `acf(x, nlags=${ACF_LAGS}, fft=True)`, 5)),
  ]);

  const oursPacf = timeMedian(() => pacf(shortSeries, { maxLag: PACF_LAGS }), { runs: 9, warmup: 3 });
  printRatioLine(`pacf n=${PACF_N} lags=${PACF_LAGS}`, oursPacf, [
    reference('R pacf', 'R', rScript(`pacf(y, lag.max = ${PACF_LAGS}, plot = FALSE)`, 9)),
    // pacf(method='ldb') computes its ACF by direct O(n²) correlation: one timed run only.
    reference(
      'statsmodels pacf(ldb, 1 run)',
      'statsmodels',
      pyScript('from statsmodels.tsa.stattools import pacf', `pacf(y, nlags=${PACF_LAGS}, method="ldb")`, 1, 0),
    ),
    // The same Levinson–Durbin method on statsmodels' FFT autocovariance: its fastest equivalent.
    reference(
      'statsmodels levinson_durbin(acovf fft)',
      'statsmodels',
      pyScript(
        'from statsmodels.tsa.stattools import acovf, levinson_durbin',
        `levinson_durbin(acovf(y, fft=True, nlag=${PACF_LAGS}), nlags=${PACF_LAGS}, isacov=True)`,
        9,
      ),
    ),
  ]);
} finally {
  rmSync(dir, { recursive: true, force: true });
}
