/**
 * `npm run bench:cluster` — Lagbook on one MariaDB against the three-node Galera cluster, in one run.
 *
 * The same workload runs on (a) one single MariaDB (mariadb.sh in a throw-away folder) with two
 * app servers reached directly, and (b) the cluster (cluster.sh: three nodes, HAProxy) with two
 * app servers behind HAProxy's HTTP listener, writing through the writer listener and reading
 * through the reader listener. On each, LOGGERS growth-chamber loggers first post batches of
 * BATCH readings back to back (PAUSE_MS between) for CAPACITY_SECONDS, nobody browsing: the
 * acknowledged readings/s is the ingest capacity. Then the loggers post a steady LOAD_BATCH
 * readings every LOAD_PAUSE_MS each while PEOPLE people read chart series of those channels and
 * the (warmed) diagnostics of a two-day reference channel for BROWSE_SECONDS: browse p50/p99 per
 * kind. On the cluster the writer node is then killed under that steady load (SIGKILL), the gap
 * to the first accepted batch timed, and the node started again (rejoin time). Every run checks
 * that the stored readings equal the acknowledged ones. Prints a table and appends it, dated, to
 * the "Cluster" section of tests/bench/README.md (BENCH_CLUSTER_NO_README=1 skips that).
 *
 * Targets (issue #21): cluster ingest ≥ 0.5 × single; browse p99 through the reader ≤ 500 ms
 * under load; failover gap ≤ 10 s. Reports; asserts nothing. Demo data (simulated chambers).
 *
 * Settings (environment, BENCH_CLUSTER_…): CAPACITY_SECONDS (30), BROWSE_SECONDS (30), LOGGERS
 * (20), BATCH (200), PAUSE_MS (0), LOAD_BATCH (100), LOAD_PAUSE_MS (1000), PEOPLE (4),
 * BROWSE_PAUSE_MS (200).
 */
import { execFileSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { startClusterTarget, startSingleTarget, type LoadTarget } from '../support/cluster-stack.ts';
import { setUpWorkloadLab, type WorkloadLab } from '../support/cluster-workload.ts';
import { acknowledgedReadings, firstAcceptedAfter, startLoggers, type LoggerSchedule, type PostingTally } from '../support/cluster-loggers.ts';
import { percentile, startBrowsing, type BrowseTally } from '../support/cluster-browser.ts';
import { compareStoredWithLedgers } from '../support/cluster-checks.ts';

const setting = (name: string, fallback: number) => Number(process.env[name] ?? fallback);
const CAPACITY_SECONDS = setting('BENCH_CLUSTER_CAPACITY_SECONDS', 30);
const BROWSE_SECONDS = setting('BENCH_CLUSTER_BROWSE_SECONDS', 30);
const LOGGERS = setting('BENCH_CLUSTER_LOGGERS', 20);
const BATCH = setting('BENCH_CLUSTER_BATCH', 200);
const PAUSE_MS = setting('BENCH_CLUSTER_PAUSE_MS', 0);
const LOAD_BATCH = setting('BENCH_CLUSTER_LOAD_BATCH', 100);
const LOAD_PAUSE_MS = setting('BENCH_CLUSTER_LOAD_PAUSE_MS', 1000);
const PEOPLE = setting('BENCH_CLUSTER_PEOPLE', 4);
const BROWSE_PAUSE_MS = setting('BENCH_CLUSTER_BROWSE_PAUSE_MS', 200);
const ROOT = join(import.meta.dirname, '..', '..');
const README = join(ROOT, 'tests/bench/README.md');
const HOUR = 3_600_000;

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

interface Figures {
  /** Capacity phase: readings/s acknowledged with loggers posting back to back, nobody browsing. */
  readingsPerS: number;
  /** Browse phase: readings/s the steady loggers got acknowledged meanwhile. */
  loadReadingsPerS: number;
  acknowledged: number;
  /** Acknowledged readings with no row, rows nobody was told about, wrong values, half-stored batches (must be 0). */
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
const loggerErrors = (t: PostingTally) => Object.entries(t.statuses).reduce((n, [s, c]) => n + (s === '200' ? 0 : c), 0) + t.networkErrors;
/** Readings/s acknowledged from the first request sent to `until` (performance.now()). */
const rate = (t: PostingTally, batch: number, from: number, until: number) =>
  (t.acks.filter((a) => a.answeredAt <= until).length * batch) / ((until - from) / 1000);

/** Asks for the reference channel's diagnostics a few times through every URL, so browsing meets warm caches as people would. */
async function warmDiagnostics(lab: WorkloadLab, urls: string[]): Promise<void> {
  const { from, to } = lab.referenceRange;
  for (const url of urls)
    for (let i = 0; i < 4; i++) {
      const res = await fetch(`${url}/api/v1/labs/${lab.slug}/channels/${lab.referenceChannelId}/diagnostics?from=${from}&to=${to}&step=60`, {
        headers: { cookie: lab.cookie },
      });
      if (!res.ok) throw new Error(`diagnostics warm-up: ${res.status} ${await res.text()}`);
    }
}

/**
 * On `target`: the capacity phase (loggers back to back for CAPACITY_SECONDS), then the browse
 * phase (loggers at a steady LOAD_BATCH readings every LOAD_PAUSE_MS each, people browsing, for
 * BROWSE_SECONDS); on the cluster, the writer is then killed under that load and started again.
 */
async function measure(target: LoadTarget): Promise<Figures> {
  const lab = await setUpWorkloadLab(target, { chambers: LOGGERS, alertRule: false });
  await warmDiagnostics(lab, target.browseUrls);
  const now = Math.floor(Date.now() / 1000) * 1000;
  // the two phases write disjoint hours: capacity from 8 h ago onwards, steady load from 16 h ago
  const capacity: LoggerSchedule = { batchSize: BATCH, stepMs: 1000, startTs: now - 8 * HOUR, pauseMs: PAUSE_MS, retryMs: 250, warmEvery: 0 };
  const steady: LoggerSchedule = { batchSize: LOAD_BATCH, stepMs: 1000, startTs: now - 16 * HOUR, pauseMs: LOAD_PAUSE_MS, retryMs: 250, warmEvery: 0 };

  const flat = startLoggers(lab.chambers, target.ingestUrls, capacity);
  const flatFrom = performance.now();
  await sleep(CAPACITY_SECONDS * 1000);
  const flatUntil = performance.now();
  const flatRun = await flat.stop();

  const loggers = startLoggers(lab.chambers, target.ingestUrls, steady);
  const browsing = startBrowsing(lab, target.browseUrls, { people: PEOPLE, pauseMs: BROWSE_PAUSE_MS, seriesFrom: steady.startTs });
  const loadFrom = performance.now();
  await sleep(BROWSE_SECONDS * 1000);
  const loadUntil = performance.now();
  const l = { series: [...browsing.tally.latenciesMs.series], diagnostics: [...browsing.tally.latenciesMs.diagnostics] };
  const figures: Figures = {
    readingsPerS: rate(flatRun.tally, BATCH, flatFrom, flatUntil),
    loadReadingsPerS: rate(loggers.tally, LOAD_BATCH, loadFrom, loadUntil),
    acknowledged: 0,
    lostOrExtra: 0,
    loggerErrors: loggerErrors(flatRun.tally) + loggerErrors(loggers.tally),
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
    await cluster.killNode(killed);
    const killAt = performance.now(); // from when kill-node returned: the SIGKILL has been sent
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
  const runs = [
    { run: flatRun, schedule: capacity },
    { run, schedule: steady },
  ];
  const stored = await compareStoredWithLedgers(target.db, lab.tenantId, lab.chambers, runs);
  figures.acknowledged = acknowledgedReadings(flatRun, capacity) + acknowledgedReadings(run, steady);
  figures.lostOrExtra = stored.missing + stored.unknown + stored.wrongValue + stored.unacknowledged.partial + stored.partlyDuplicateAnswers;
  return figures;
}

const ms = (v: number) => (Number.isFinite(v) ? `${v.toFixed(1)} ms` : 'n/a');
const perS = (v: number) => `${Math.round(v).toLocaleString('en')}/s`;

function table(single: Figures, cluster: Figures): string {
  const ratio = cluster.readingsPerS / single.readingsPerS;
  const rows: Array<[string, string, string]> = [
    [
      'ingest capacity, readings acknowledged (loggers back to back)',
      perS(single.readingsPerS),
      `${perS(cluster.readingsPerS)} (**${ratio.toFixed(2)} ×** single; target ≥ 0.5)`,
    ],
    ['steady load while browsing (readings acknowledged)', perS(single.loadReadingsPerS), perS(cluster.loadReadingsPerS)],
    ['series p50 / p99', `${ms(single.seriesP50)} / ${ms(single.seriesP99)}`, `${ms(cluster.seriesP50)} / ${ms(cluster.seriesP99)}`],
    ['diagnostics p50 / p99', `${ms(single.diagnosticsP50)} / ${ms(single.diagnosticsP99)}`, `${ms(cluster.diagnosticsP50)} / ${ms(cluster.diagnosticsP99)}`],
    ['browse p99 (both kinds) under the steady load', ms(single.browseP99), `**${ms(cluster.browseP99)}** (target ≤ 500 ms)`],
    ['errors before the failover: loggers / browsing', `${single.loggerErrors} / ${single.browseErrors}`, `${cluster.loggerErrors} / ${cluster.browseErrors}`],
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
  const workload = `${LOGGERS} loggers; capacity: ${BATCH} readings a batch, ${PAUSE_MS} ms pause, ${CAPACITY_SECONDS} s; steady load: ${LOAD_BATCH} readings a batch every ${LOAD_PAUSE_MS} ms each with ${PEOPLE} people browsing (${BROWSE_PAUSE_MS} ms pause), ${BROWSE_SECONDS} s`;
  console.log(`cluster bench: ${workload}`);
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
    `Commit \`${commit}\` (plus any uncommitted work in the tree); ${workload}; load average at start / between / end: ${load.map((v) => v.toFixed(1)).join(' / ')} (2 cores).`,
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
