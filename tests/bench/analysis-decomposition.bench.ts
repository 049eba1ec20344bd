/**
 * Benchmark of Lagbook's STL against R's stats::stl (Fortran) and statsmodels' STL (Cython)
 * on identical data: n = 100,000 and 1,000,000 hourly readings, period 24, seasonal window 7,
 * plain (2 inner passes) and robust (1 inner + 15 robustness passes).
 *
 *   npm run bench:analysis      (or: npx tsx tests/bench/analysis-decomposition.bench.ts)
 *
 * statsmodels' STL has other defaults than R's stl (its trend window, jumps and low-pass
 * degree differ), so it is given R's resolved parameters explicitly: seasonal 7 (degree 0,
 * jump 1), trend 47 (degree 1, jump 5), low-pass 25 (degree 1, jump 3). Each figure is the
 * median wall time of several runs after a warm-up (statsmodels, by far the slowest, runs
 * once at n = 1,000,000); the series goes to the references as raw float64 so all three read
 * the same numbers. The whole run takes about two minutes. A benchmark reports; it never fails.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { stl } from '../../server/analysis/stl.ts';
import { stlParameters, type StlOptions } from '../../server/analysis/stl-parameters.ts';
import { printRatioLine, referenceAvailable, timeMedian, timeReference, type ReferenceTiming } from './bench-helpers.ts';

const PERIOD = 24;
const SEASONAL_WINDOW = 7;

/**
 * Demo data only: a fictional incubator logger, hourly, with a daily cycle, a slow drift,
 * noise and an occasional door-opening spike (so the robust passes have outliers to find).
 */
function incubatorSeries(n: number): Float64Array {
  const x = new Float64Array(n);
  let state = 20240611;
  const uniform = () => {
    state = (state * 48271) % 2147483647;
    return state / 2147483647;
  };
  for (let i = 0; i < n; i++) {
    const daily = 0.4 * Math.sin((2 * Math.PI * i) / PERIOD) + 0.15 * Math.cos((4 * Math.PI * i) / PERIOD);
    const drift = 0.02 * Math.sin((2 * Math.PI * i) / (24 * 365));
    const spike = uniform() < 0.002 ? 3 * uniform() : 0;
    x[i] = 37 + daily + drift + 0.1 * (uniform() - 0.5) + spike;
  }
  return x;
}

function rScript(file: string, n: number, robust: boolean, runs: number): string {
  return `
x <- ts(readBin(${JSON.stringify(file)}, what = "double", n = ${n}, size = 8, endian = "little"), frequency = ${PERIOD})
invisible(stl(x, s.window = ${SEASONAL_WINDOW}, robust = ${robust ? 'TRUE' : 'FALSE'}))
times <- replicate(${runs}, system.time(stl(x, s.window = ${SEASONAL_WINDOW}, robust = ${robust ? 'TRUE' : 'FALSE'}))[["elapsed"]])
cat(median(times), "\\n")
`;
}

function statsmodelsScript(file: string, robust: boolean, runs: number, warmup: boolean, options: StlOptions, n: number): string {
  const s = stlParameters(n, options);
  return `
import time, statistics
import numpy as np
from statsmodels.tsa.seasonal import STL
x = np.fromfile(${JSON.stringify(file)}, dtype="<f8")
def run():
    STL(x, period=${PERIOD}, seasonal=${s.seasonalWindow}, trend=${s.trendWindow}, low_pass=${s.lowpassWindow},
        seasonal_deg=${s.seasonalDegree}, trend_deg=${s.trendDegree}, low_pass_deg=${s.lowpassDegree},
        seasonal_jump=${s.seasonalJump}, trend_jump=${s.trendJump}, low_pass_jump=${s.lowpassJump},
        robust=${robust ? 'True' : 'False'}).fit(inner_iter=${s.inner}, outer_iter=${s.outer})
${warmup ? 'run()' : ''}
times = []
for _ in range(${runs}):
    t = time.perf_counter(); run(); times.append(time.perf_counter() - t)
print(statistics.median(times))
`;
}

function reference(name: 'R' | 'statsmodels', script: string): ReferenceTiming {
  const available = referenceAvailable(name);
  if (!available.ok) return { name, seconds: null, missing: available.hint };
  return { name, seconds: timeReference(name, script) };
}

function main(): void {
  const dir = mkdtempSync(join(tmpdir(), 'lagbook-stl-bench-'));
  try {
    const first = stlParameters(100_000, { period: PERIOD, seasonalWindow: SEASONAL_WINDOW });
    console.log(
      `STL, period ${PERIOD}, seasonal window ${SEASONAL_WINDOW}: windows s/t/l ${first.seasonalWindow}/` +
        `${first.trendWindow}/${first.lowpassWindow}, degrees ${first.seasonalDegree}/${first.trendDegree}/` +
        `${first.lowpassDegree}, jumps ${first.seasonalJump}/${first.trendJump}/${first.lowpassJump}` +
        ' (statsmodels configured to the same)',
    );
    for (const n of [100_000, 1_000_000]) {
      const x = incubatorSeries(n);
      const file = join(dir, `series-${n}.f64`);
      writeFileSync(file, Buffer.from(x.buffer, x.byteOffset, x.byteLength));
      for (const robust of [false, true]) {
        const options: StlOptions = { period: PERIOD, seasonalWindow: SEASONAL_WINDOW, robust };
        const large = n >= 1_000_000;
        const runs = large ? 3 : 5;
        const ours = timeMedian(() => stl(x, options), { runs, warmup: large ? 1 : 2 });
        // statsmodels is an order of magnitude slower than both others here (about 40 s for
        // the robust fit at n = 1,000,000), so it gets fewer runs; its time is compiled code
        // from the first call on.
        const refs = [
          reference('R', rScript(file, n, robust, runs)),
          reference('statsmodels', statsmodelsScript(file, robust, large ? 1 : 3, !large, options, n)),
        ];
        printRatioLine(`stl n=${n.toLocaleString('en')} ${robust ? 'robust' : 'plain'}`, ours, refs);
      }
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

main();
