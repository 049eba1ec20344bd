/**
 * ARMA order-selection benchmark: `selectArma` (p, q ≤ 3, exact ML for all 16 candidates) on
 * seeded ARMA(1,1) series of 1 000 and 10 000 values, beside R's
 * `forecast::auto.arima(x, d = 0, seasonal = FALSE, stepwise = FALSE, approximation = FALSE)`
 * on the very same numbers (a temporary little-endian float64 file R reads), timed inside R with
 * `system.time` in the same run. Prints a table; never asserts.
 *
 * Run: npx tsx tests/bench/analysis-arma.bench.ts
 * (BENCH_ARMA_RUNS sets the timed runs at n = 1 000, default 3, and the median is reported;
 * n = 10 000 is timed once on each side, after one untimed warm-up run of selectArma.)
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { selectArma } from '../../server/analysis/index.ts';
import { simulateArma } from '../../server/analysis/seeded-simulation.testkit.ts';
import { referenceAvailable, timeMedian } from './bench-helpers.ts';

const SIZES = [1_000, 10_000];
const RUNS = Number(process.env.BENCH_ARMA_RUNS ?? 3);
const TRUTH = { ar: [0.6], ma: [0.3] };

const dir = mkdtempSync(join(tmpdir(), 'lagbook-bench-arma-'));

/** R's auto.arima on the file: median elapsed seconds of `runs` and the chosen orders. */
function timeR(file: string, n: number, runs: number): { seconds: number; order: string } | { missing: string } {
  const available = referenceAvailable('R');
  if (!available.ok) return { missing: `R not installed: ${available.hint}` };
  const script = `
suppressMessages(library(forecast))
x <- readBin(${JSON.stringify(file)}, what = "double", n = ${n}, size = 8, endian = "little")
call <- function() auto.arima(x, d = 0, seasonal = FALSE, stepwise = FALSE, approximation = FALSE)
times <- replicate(${runs}, system.time(fit <<- call())[["elapsed"]])
o <- arimaorder(fit)
cat(sprintf("ARMA(%d,%d)%s", o[1], o[3], if ("intercept" %in% names(coef(fit))) " + mean" else ""), "\\n")
cat(median(times), "\\n")
`;
  const scriptFile = join(dir, 'bench.R');
  writeFileSync(scriptFile, script);
  try {
    const lines = execFileSync('Rscript', ['--vanilla', scriptFile], { encoding: 'utf8' }).trim().split('\n');
    return { seconds: Number(lines[lines.length - 1]), order: lines[lines.length - 2].trim() };
  } catch (error) {
    return { missing: `R run failed (is the forecast package installed?): ${(error as Error).message.split('\n')[0]}` };
  }
}

try {
  console.log(`ARMA selection benchmark (Node ${process.version}); truth ARMA(1,1) φ = 0.6, θ = 0.3; median of ${RUNS} runs at n = 1 000, one at n = 10 000`);
  const rows: string[][] = [['n', 'lagbook selectArma', 'chosen', 'R auto.arima (full search)', 'chosen', 'ratio lagbook / R']];
  for (const n of SIZES) {
    const series = simulateArma(TRUTH, n, 20_000 + n);
    const file = join(dir, `series-${n}.f64`);
    writeFileSync(file, Buffer.from(series.buffer, series.byteOffset, series.byteLength));
    const runs = n >= 10_000 ? 1 : RUNS;
    let chosen = '';
    const ours = timeMedian(
      () => {
        const result = selectArma(series, { maxP: 3, maxQ: 3 });
        chosen = `ARMA(${result.p},${result.q}) + mean`;
      },
      { runs, warmup: 1 },
    );
    const r = timeR(file, n, runs);
    rows.push(
      'missing' in r
        ? [String(n), `${ours.toFixed(2)} s`, chosen, r.missing, '', 'n/a']
        : [String(n), `${ours.toFixed(2)} s`, chosen, `${r.seconds.toFixed(2)} s`, r.order, (ours / r.seconds).toFixed(2)],
    );
  }
  const widths = rows[0].map((_, c) => Math.max(...rows.map((row) => row[c].length)));
  for (const row of rows) console.log(row.map((cell, c) => cell.padEnd(widths[c])).join(' | '));
  console.log('auto.arima searches p, q ≤ 5 with p + q ≤ 5, with and without a mean; selectArma p, q ≤ 3 with a mean.');
} finally {
  rmSync(dir, { recursive: true, force: true });
}
