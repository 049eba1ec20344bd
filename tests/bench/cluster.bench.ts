/**
 * `npm run bench:cluster` — Lagbook on one MariaDB against the three-node Galera cluster, in one run.
 *
 * The same workload runs on (a) one single MariaDB (mariadb.sh in a throw-away folder) with two
 * app servers reached directly, and (b) the cluster (cluster.sh: three nodes, HAProxy) with two
 * app servers behind HAProxy's HTTP listener, writing through the writer listener and reading
 * through the reader listener: LOGGERS growth-chamber loggers post batches of BATCH readings in a
 * closed loop (PAUSE_MS between batches) while PEOPLE people read chart series and diagnostics.
 * After SECONDS it reports acknowledged readings/s and browse p50/p99 per kind; on the cluster
 * it then kills the writer node under the same load (SIGKILL) and times the gap to the first
 * accepted batch, and starts the node again (rejoin time). Every run also checks that the
 * stored readings equal the acknowledged ones. Prints a table and appends it, dated, to the
 * "Cluster" section of tests/bench/README.md (BENCH_CLUSTER_NO_README=1 skips that).
 *
 * Targets (issue #21): cluster ingest ≥ 0.5 × single; browse p99 through the reader ≤ 500 ms
 * under that load; failover gap ≤ 10 s. Reports; asserts nothing. Demo data (simulated chambers).
 *
 * Settings: BENCH_CLUSTER_SECONDS (45), BENCH_CLUSTER_LOGGERS (20), BENCH_CLUSTER_PEOPLE (4),
 * BENCH_CLUSTER_BATCH (200), BENCH_CLUSTER_PAUSE_MS (100), BENCH_CLUSTER_BROWSE_PAUSE_MS (200).
 */
import { execFileSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { startClusterTarget, startSingleTarget, type LoadTarget } from '../support/cluster-stack.ts';
import { setUpWorkloadLab } from '../support/cluster-workload.ts';
import { acknowledgedReadings, firstAcceptedAfter, startLoggers, type LoggerSchedule } from '../support/cluster-loggers.ts';
import { percentile, startBrowsing, type BrowseTally } from '../support/cluster-browser.ts';
import { compareStoredWithLedgers } from '../support/cluster-checks.ts';

const setting = (name: string, fallback: number) => Number(process.env[name] ?? fallback);
const SECONDS = setting('BENCH_CLUSTER_SECONDS', 45);
const LOGGERS = setting('BENCH_CLUSTER_LOGGERS', 20);
const PEOPLE = setting('BENCH_CLUSTER_PEOPLE', 4);
const BATCH = setting('BENCH_CLUSTER_BATCH', 200);
const PAUSE_MS = setting('BENCH_CLUSTER_PAUSE_MS', 100);
const BROWSE_PAUSE_MS = setting('BENCH_CLUSTER_BROWSE_PAUSE_MS', 200);
const ROOT = join(import.meta.dirname, '..', '..');
const README = join(ROOT, 'tests/bench/README.md');

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

interface Figures {
  readingsPerS: number;
  acknowledged: number;
  /** Acknowledged readings with no row, or rows nobody was told about (must be 0). */
  lostOrExtra: number;
  loggerErrors: number;
  seriesP50: number;
  seriesP99: number;
  diagnosticsP50: number;
  diagnosticsP99: number;
  browseP99: number;
  browseErrors: number;
  failoverGapS?: number | null;
  unavailable503?: number;
  rejoinS?: number;
}

const browseErrors = (b: BrowseTally) =>
  b.networkErrors +
  (['series', 'diagnostics'] as const).reduce((n, k) => n + Object.entries(b.statuses[k]).reduce((m, [s, c]) => m + (s === '200' ? 0 : c), 0), 0);

/** Runs the workload on `target` for SECONDS; on the cluster, then the failover under the same load. */
async function measure(target: LoadTarget): Promise<Figures> {
  const lab = await setUpWorkloadLab(target, { chambers: LOGGERS, alertRule: false });
  const schedule: LoggerSchedule = {
    batchSize: BATCH,
    stepMs: 1000,
    startTs: Math.floor(Date.now() / 1000) * 1000 - 6 * 3_600_000,
    pauseMs: PAUSE_MS,
    retryMs: 250,
    warmEvery: 0,
  };
  const loggers = startLoggers(lab.chambers, target.ingestUrls, schedule);
  const browsing = startBrowsing(lab, target.browseUrls, { people: PEOPLE, pauseMs: BROWSE_PAUSE_MS, seriesFrom: schedule.startTs });
  await sleep(SECONDS * 1000);
  // steady-state figures, before any failover
  const seconds = (performance.now() - (loggers.tally.acks[0]?.sentAt ?? performance.now())) / 1000;
  const ackedSteady = loggers.tally.acks.length * BATCH;
  const loggerErrorsSteady = Object.entries(loggers.tally.statuses).reduce((n, [s, c]) => n + (s === '200' ? 0 : c), 0) + loggers.tally.networkErrors;
  const l = { series: [...browsing.tally.latenciesMs.series], diagnostics: [...browsing.tally.latenciesMs.diagnostics] };
  const figures: Figures = {
    readingsPerS: ackedSteady / seconds,
    acknowledged: 0,
    lostOrExtra: 0,
    loggerErrors: loggerErrorsSteady,
    seriesP50: percentile(l.series, 50),
    seriesP99: percentile(l.series, 99),
    diagnosticsP50: percentile(l.diagnostics, 50),
    diagnosticsP99: percentile(l.diagnostics, 99),
    browseP99: percentile([...l.series, ...l.diagnostics], 99),
    browseErrors: browseErrors(browsing.tally),
  };
  if (target.cluster) {
    const cluster = target.cluster;
    const killed = await cluster.writerNode();
    const unavailableBefore = loggers.tally.statuses[503] ?? 0;
    const killAt = performance.now();
    await cluster.killNode(killed);
    while (firstAcceptedAfter(loggers.tally, killAt) === null && performance.now() < killAt + 60_000) await sleep(100);
    const accepted = firstAcceptedAfter(loggers.tally, killAt);
    figures.failoverGapS = accepted === null ? null : (accepted - killAt) / 1000;
    figures.unavailable503 = (loggers.tally.statuses[503] ?? 0) - unavailableBefore;
    await sleep(3000);
    const rejoinFrom = performance.now();
    await cluster.startNode(killed);
    figures.rejoinS = (performance.now() - rejoinFrom) / 1000;
  }
  const run = await loggers.stop();
  await browsing.stop();
  const stored = await compareStoredWithLedgers(target.db, lab.tenantId, lab.chambers, run, schedule);
  figures.acknowledged = acknowledgedReadings(run, schedule);
  figures.lostOrExtra = stored.missing + stored.unknown + stored.wrongValue + stored.unacknowledged.partial;
  return figures;
}

const ms = (v: number) => (Number.isFinite(v) ? `${v.toFixed(1)} ms` : 'n/a');
const perS = (v: number) => `${Math.round(v).toLocaleString('en')}/s`;

function table(single: Figures, cluster: Figures): string {
  const ratio = cluster.readingsPerS / single.readingsPerS;
  const rows: Array<[string, string, string]> = [
    ['ingest, readings acknowledged', perS(single.readingsPerS), `${perS(cluster.readingsPerS)} (**${ratio.toFixed(2)} ×** single; target ≥ 0.5)`],
    ['series p50 / p99', `${ms(single.seriesP50)} / ${ms(single.seriesP99)}`, `${ms(cluster.seriesP50)} / ${ms(cluster.seriesP99)}`],
    ['diagnostics p50 / p99', `${ms(single.diagnosticsP50)} / ${ms(single.diagnosticsP99)}`, `${ms(cluster.diagnosticsP50)} / ${ms(cluster.diagnosticsP99)}`],
    ['browse p99 (both kinds)', ms(single.browseP99), `**${ms(cluster.browseP99)}** (target ≤ 500 ms)`],
    ['errors under load: loggers / browsing', `${single.loggerErrors} / ${single.browseErrors}`, `${cluster.loggerErrors} / ${cluster.browseErrors}`],
    [
      'failover: kill of the writer → first accepted batch',
      '—',
      cluster.failoverGapS == null ? '**none within 60 s**' : `**${cluster.failoverGapS.toFixed(2)} s** (target ≤ 10 s), ${cluster.unavailable503} × 503`,
    ],
    ['rejoin of the killed node (start → Synced)', '—', cluster.rejoinS === undefined ? 'n/a' : `${cluster.rejoinS.toFixed(1)} s`],
    ['acknowledged readings lost, doubled or wrong', String(single.lostOrExtra), `${cluster.lostOrExtra} (of ${cluster.acknowledged.toLocaleString('en')})`],
  ];
  return ['| figure | one MariaDB | three-node cluster through HAProxy |', '|---|---|---|', ...rows.map((r) => `| ${r.join(' | ')} |`)].join('\n');
}

/** Appends the dated table to the README's "Cluster" section (made at the end when missing). */
function appendToReadme(body: string): void {
  let text = readFileSync(README, 'utf8');
  if (!/^## Cluster$/m.test(text)) text = `${text.trimEnd()}\n\n## Cluster\n`;
  const start = text.search(/^## Cluster$/m);
  const next = text.slice(start + 1).search(/^## /m);
  const at = next === -1 ? text.length : start + 1 + next;
  text = `${text.slice(0, at).trimEnd()}\n\n${body.trim()}\n${next === -1 ? '' : `\n${text.slice(at)}`}`;
  writeFileSync(README, text.endsWith('\n') ? text : `${text}\n`);
}

async function main(): Promise<void> {
  const started = new Date();
  const commit = execFileSync('git', ['rev-parse', '--short', 'HEAD'], { cwd: ROOT, encoding: 'utf8' }).trim();
  console.log(
    `cluster bench: ${LOGGERS} loggers × ${BATCH} readings per batch (pause ${PAUSE_MS} ms), ${PEOPLE} people browsing (pause ${BROWSE_PAUSE_MS} ms), ${SECONDS} s per target`,
  );
  const load = [loadavg()[0]];
  let single: Figures;
  const a = await startSingleTarget({ database: 'lagbook_bench_single' });
  try {
    single = await measure(a);
    console.log(`one MariaDB: ${JSON.stringify(single)}`);
  } finally {
    await a.stop();
  }
  load.push(loadavg()[0]);
  let cluster: Figures;
  const b = await startClusterTarget({ database: 'lagbook_bench_cluster' });
  try {
    cluster = await measure(b);
    console.log(`cluster: ${JSON.stringify(cluster)}`);
  } finally {
    await b.stop();
  }
  load.push(loadavg()[0]);
  const out = table(single, cluster);
  console.log(out);
  const section = [
    `### ${started.toISOString().slice(0, 16).replace('T', ' ')} UTC — \`npm run bench:cluster\``,
    `Commit \`${commit}\` (plus any uncommitted work in the tree); ${LOGGERS} loggers × ${BATCH} readings a batch, ${PAUSE_MS} ms pause, ${PEOPLE} people browsing, ${SECONDS} s a target; load average at start / between / end: ${load.map((v) => v.toFixed(1)).join(' / ')} (2 cores).`,
    '',
    out,
  ].join('\n');
  if (process.env.BENCH_CLUSTER_NO_README !== '1') {
    appendToReadme(section);
    console.log(`appended to ${README}`);
  }
}

main().catch((err: unknown) => {
  console.error(`cluster bench failed: ${(err as Error).stack ?? String(err)}`);
  process.exit(1);
});
