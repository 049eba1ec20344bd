/**
 * Inference engine benchmark: how often the conclusions are right on seeded simulations with
 * known truth. Reports; never asserts.
 *
 * 1. Cross-correlation claims (issue #16 targets): on independent AR(1) pairs (φ = 0.9, n = 1,000)
 *    how often a lead/lag is claimed — prewhitened CCF beyond its Šidák band over all lags, against
 *    the raw CCF read with its per-lag ±z/√n band; on a delayed response
 *    y_t = 0.9·y_{t−1} + 0.5·x_{t−6} + e_t with x AR(1) φ = 0.7 (n = 1,000) how often the named lag
 *    is the true delay 6.
 * 2. Before/after intervals: coverage of the true difference 0 by the naive Welch interval and
 *    the effective-sample-size interval (`compareMeans`), nominal 95 %, on pairs of AR(1) ranges
 *    with equal means.
 * 3. Trend intervals: coverage of slope 0 by the OLS and the Newey–West interval (`trendTest`)
 *    on AR(1) noise, at the default lag and at Andrews' plug-in lag the diagnostics use.
 *
 * Run: npx tsx tests/bench/analysis-inference.bench.ts   (BENCH_PAIRS=3000 for narrower margins)
 */
import { performance } from 'node:perf_hooks';
import { andrewsBartlettLag } from '../../server/analysis/andrews-bartlett-lag.ts';
import { compareMeans } from '../../server/analysis/compare-means.ts';
import { crossCorrelation } from '../../server/analysis/cross-correlation.ts';
import { defaultMaxLag } from '../../server/analysis/default-max-lag.ts';
import { normalQuantile } from '../../server/analysis/normal-quantile.ts';
import { prewhitenedCcf } from '../../server/analysis/prewhitened-ccf.ts';
import { seededNormal, simulateArma } from '../../server/analysis/seeded-simulation.testkit.ts';
import { trendTest } from '../../server/analysis/trend-test.ts';

/** Seeded pairs per cell; BENCH_PAIRS overrides (e.g. 3000 to narrow the margins). */
const PAIRS = Number(process.env.BENCH_PAIRS ?? 500);
const N = 1000;
const DELAY = 6;

const pct = (k: number, of: number) => `${((100 * k) / of).toFixed(1)} %`;
/** Half-width of a binomial 95 % interval for a rate near p from `of` trials (normal approximation). */
const margin = (k: number, of: number) => `±${(196 * Math.sqrt(((k / of) * (1 - k / of)) / of)).toFixed(1)}`;

function printTable(title: string, header: string[], rows: string[][]): void {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  console.log(`\n${title}`);
  console.log(line(header));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const r of rows) console.log(line(r));
}

/** The delayed response: y_t = 0.9·y_{t−1} + 0.5·x_{t−d} + e_t, N(0, 1) shocks. */
function delayedResponse(input: Float64Array, delay: number, seed: number): Float64Array {
  const e = seededNormal(seed);
  const y = new Float64Array(input.length);
  for (let t = 0; t < input.length; t++) y[t] = (t > 0 ? 0.9 * y[t - 1] : 0) + (t >= delay ? 0.5 * input[t - delay] : 0) + e();
  return y;
}

/** Largest |value| and its lag. */
function strongestOf(lags: Int32Array, values: Float64Array): { lag: number; value: number } {
  let best = 0;
  for (let i = 1; i < values.length; i++) if (Math.abs(values[i]) > Math.abs(values[best])) best = i;
  return { lag: lags[best], value: values[best] };
}

function ccfRates(): void {
  const z = normalQuantile(0.975);
  const rows: string[][] = [];
  for (const maxLag of [defaultMaxLag(N, 2), 100]) {
    let white = 0;
    let whitePerLag = 0;
    let raw = 0;
    let rawSimultaneous = 0;
    let hitWhite = 0;
    let hitRaw = 0;
    let hitSwapped = 0;
    const start = performance.now();
    for (let s = 0; s < PAIRS; s++) {
      // Null: two independent AR(1) series, φ = 0.9.
      const a = simulateArma({ ar: [0.9] }, N, 100_000 + s);
      const b = simulateArma({ ar: [0.9] }, N, 200_000 + s);
      const pw = prewhitenedCcf(a, b, { maxLag });
      if (pw.strongest?.significant) white++;
      if (pw.strongest && Math.abs(pw.strongest.value) > pw.band) whitePerLag++;
      const r = crossCorrelation(a, b, { maxLag });
      const top = strongestOf(r.lags, r.values);
      if (Math.abs(top.value) > z / Math.sqrt(N)) raw++;
      if (Math.abs(top.value) > pw.simultaneousBand * Math.sqrt(pw.pairs / N)) rawSimultaneous++;

      // Delayed response: channel = response (first argument), partner = input (second).
      const driver = simulateArma({ ar: [0.7] }, N + 200, 300_000 + s);
      const input = driver.subarray(200);
      const response = delayedResponse(driver, DELAY, 400_000 + s).subarray(200);
      const hit = prewhitenedCcf(response, input, { maxLag });
      if (hit.strongest?.significant && hit.strongest.lag === DELAY) hitWhite++;
      const rawHit = crossCorrelation(response, input, { maxLag });
      const rawTop = strongestOf(rawHit.lags, rawHit.values);
      if (rawTop.lag === DELAY && Math.abs(rawTop.value) > z / Math.sqrt(N)) hitRaw++;
      const swapped = prewhitenedCcf(input, response, { maxLag });
      if (swapped.strongest?.significant && swapped.strongest.lag === -DELAY) hitSwapped++;
    }
    const seconds = (performance.now() - start) / 1000;
    rows.push(
      [`maxLag ${maxLag}: prewhitened, simultaneous (Šidák) band`, pct(white, PAIRS), margin(white, PAIRS), pct(hitWhite, PAIRS), margin(hitWhite, PAIRS)],
      [`maxLag ${maxLag}: prewhitened, per-lag band (not a claim)`, pct(whitePerLag, PAIRS), margin(whitePerLag, PAIRS), '', ''],
      [`maxLag ${maxLag}: raw CCF, per-lag ±z/√n band`, pct(raw, PAIRS), margin(raw, PAIRS), pct(hitRaw, PAIRS), margin(hitRaw, PAIRS)],
      [`maxLag ${maxLag}: raw CCF, Šidák band`, pct(rawSimultaneous, PAIRS), margin(rawSimultaneous, PAIRS), '', ''],
      [`maxLag ${maxLag}: prewhitened, roles swapped (filter from response)`, '', '', pct(hitSwapped, PAIRS), margin(hitSwapped, PAIRS)],
    );
    console.log(`  (maxLag ${maxLag}: ${PAIRS} null pairs + ${PAIRS} response pairs in ${seconds.toFixed(1)} s)`);
  }
  printTable(
    `Cross-correlation on ${PAIRS} seeded pairs each, n = ${N} (targets: claims on independent pairs ≤ 5 %; named lag = ${DELAY} in ≥ 80 %)`,
    ['method', 'claims, independent AR(1) φ=0.9', '95 % ±', `named lag = ${DELAY}, delayed response`, '95 % ±'],
    rows,
  );
}

function coverageOfMeans(): void {
  const rows: string[][] = [];
  for (const phi of [0, 0.5, 0.9]) {
    for (const n of [100, 500, 2000]) {
      let naive = 0;
      let effective = 0;
      let cautioned = 0;
      let widthRatio = 0;
      for (let s = 0; s < PAIRS; s++) {
        const a = simulateArma(phi ? { ar: [phi] } : {}, n, 500_000 + s);
        const b = simulateArma(phi ? { ar: [phi] } : {}, n, 600_000 + s);
        const r = compareMeans(a, b);
        if (r.welch.interval[0] <= 0 && r.welch.interval[1] >= 0) naive++;
        if (r.effective.interval[0] <= 0 && r.effective.interval[1] >= 0) effective++;
        if (r.caution) cautioned++;
        widthRatio += (r.effective.interval[1] - r.effective.interval[0]) / (r.welch.interval[1] - r.welch.interval[0]);
      }
      rows.push([
        `AR(1) φ = ${phi}`,
        String(n),
        pct(naive, PAIRS),
        pct(effective, PAIRS),
        margin(effective, PAIRS),
        (widthRatio / PAIRS).toFixed(2),
        pct(cautioned, PAIRS),
      ]);
    }
  }
  printTable(
    `Before/after (compareMeans), ${PAIRS} pairs of independent ranges with equal means: coverage of 0 at nominal 95 %`,
    ['noise', 'n each', 'naive Welch', 'effective size', '95 % ±', 'width ratio', 'cautioned'],
    rows,
  );
}

function coverageOfTrend(): void {
  const rows: string[][] = [];
  for (const phi of [0, 0.5, 0.9]) {
    for (const n of [200, 1000]) {
      let ols = 0;
      let hac = 0;
      let lag = 0;
      let andrews = 0;
      let andrewsLags = 0;
      for (let s = 0; s < PAIRS; s++) {
        const x = simulateArma(phi ? { ar: [phi] } : {}, n, 700_000 + s);
        const r = trendTest(x);
        if (r.intervalOls[0] <= 0 && r.intervalOls[1] >= 0) ols++;
        if (r.interval[0] <= 0 && r.interval[1] >= 0) hac++;
        lag = r.lag;
        // The diagnostics' choice: Andrews' AR(1) plug-in lag on the residuals, never below the default.
        const residuals = x.map((v, i) => v - (r.intercept + r.slope * (i + 1)));
        const wide = trendTest(x, { lag: andrewsBartlettLag(residuals, r.lag) });
        if (wide.interval[0] <= 0 && wide.interval[1] >= 0) andrews++;
        andrewsLags += wide.lag;
      }
      rows.push([
        `AR(1) φ = ${phi}`,
        String(n),
        pct(ols, PAIRS),
        `${pct(hac, PAIRS)} ${margin(hac, PAIRS)} (lag ${lag})`,
        `${pct(andrews, PAIRS)} ${margin(andrews, PAIRS)} (mean lag ${(andrewsLags / PAIRS).toFixed(1)})`,
      ]);
    }
  }
  printTable(
    `Trend (trendTest), ${PAIRS} series without trend: coverage of slope 0 at nominal 95 %`,
    ['noise', 'n', 'OLS', 'Newey–West, default lag ⌊4 (n/100)^(2/9)⌋', 'Newey–West, Andrews lag (andrewsBartlettLag)'],
    rows,
  );
}

console.log(`Inference benchmark (Node ${process.version}); seeded simulations, fixed seeds, figures only.`);
ccfRates();
coverageOfMeans();
coverageOfTrend();
