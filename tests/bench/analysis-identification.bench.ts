/**
 * Process identification benchmark: simulated ARMA series of known order, generated fresh by R
 * (tests/reference/identification.R: arima.sim with seeds, and forecast::auto.arima(x, d = 0,
 * seasonal = FALSE) on each), scored for Lagbook's identifyProcess and for auto.arima. Prints a
 * table; never asserts. Needs Rscript with the forecast package (npm test installs them).
 *
 *   npx tsx tests/bench/analysis-identification.bench.ts [series per process at n=300] [at n=2000]
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { scoreIdentification, totals, type IdentificationCase } from '../reference/identification-scoring.ts';

const reps300 = Number(process.argv[2] ?? 50);
const reps2000 = Number(process.argv[3] ?? 20);
const out = join(mkdtempSync(join(tmpdir(), 'lagbook-ident-')), 'cases.json');
try {
  execFileSync('Rscript', ['--vanilla', 'tests/reference/identification.R', String(reps300), String(reps2000), out], {
    stdio: ['ignore', 'ignore', 'inherit'],
  });
} catch {
  console.log('Rscript with the forecast package is needed (npm test installs it); skipped.');
  process.exit(0);
}
const cases = (JSON.parse(readFileSync(out, 'utf8')) as { cases: IdentificationCase[] }).cases;
const started = performance.now();
const rows = scoreIdentification(cases);
const seconds = (performance.now() - started) / 1000;
const pct = (k: number, n: number) => `${((100 * k) / n).toFixed(0)} %`;
console.log(
  `Process identification on ${cases.length} simulated series (${reps300} per process at n = 300, ${reps2000} at n = 2000), ${seconds.toFixed(1)} s for identifyProcess`,
);
console.log('| process | n | class right: Lagbook | auto.arima | exact (p, q): Lagbook | auto.arima |');
console.log('|---|---|---|---|---|---|');
for (const r of rows) {
  console.log(
    `| ${r.process} | ${r.n} | ${pct(r.classRight, r.series)} | ${pct(r.autoArimaClassRight, r.series)} | ${pct(r.ordersRight, r.series)} | ${pct(r.autoArimaOrdersRight, r.series)} |`,
  );
}
const all = totals(rows);
console.log(
  `| all | | ${pct(all.classRight, all.series)} | ${pct(all.autoArimaClassRight, all.series)} | ${pct(all.ordersRight, all.series)} | ${pct(all.autoArimaOrdersRight, all.series)} |`,
);
