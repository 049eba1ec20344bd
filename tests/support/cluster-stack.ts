/**
 * Everything a run on the cluster needs, started in order and stopped in reverse even when a
 * step fails: the outside services, the three-node cluster with HAProxy (cluster.sh), the
 * schema (migrated once, through the writer listener, as one app server does at start) and two
 * app servers behind HAProxy's HTTP listener. The same two app servers on one single MariaDB
 * (mariadb.sh) form the baseline the benchmark compares against.
 */
import { copyFileSync, existsSync, mkdirSync, readdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { defineCluster, type ClusterControl } from './cluster-control.ts';
import { startClusterAppServer, stopClusterAppServer, type ClusterAppServer, type ClusterAppSettings } from './cluster-app-servers.ts';
import { outsideServices, type OutsideServices } from './cluster-outside-services.ts';
import { freePorts, startPrivateMariaDb, type PrivateMariaDb } from './private-mariadb.ts';

export const CLUSTER_SESSION_SECRET = 'cluster-runs-session-secret-0123456789abcdef';

/** Where a workload runs: the database (writer) for setup and checks, and the URLs to send requests to. */
export interface LoadTarget {
  kind: 'single' | 'cluster';
  /** A pool on the writer (the cluster's writer listener, or the single server). */
  db: Db;
  /** Where loggers post: the HTTP listener, or each app server in turn for the single server. */
  ingestUrls: string[];
  /** Where people browse (same rule). */
  browseUrls: string[];
  mailCaptureUrl: string;
  sessionSecret: string;
  apps: ClusterAppServer[];
  /** Set for the cluster target. */
  cluster?: ClusterControl;
  /** Stops everything started; never throws; safe to call twice. */
  stop(): Promise<void>;
}

export interface StackOptions {
  /** Database name on the servers (letters, digits, _). */
  database: string;
  /** Extra settings for the app servers (LAGBOOK_ALERT_EVALUATE_EVERY_S, …). */
  appEnv?: NodeJS.ProcessEnv;
  /** Progress lines (console.log by default). */
  say?: (line: string) => void;
  /** A folder to copy the logs into when stopping (app servers, HAProxy, health checker, each node's error log). */
  keepLogsIn?: string;
}

/** Copies the cluster's logs (`*.log` at its top, `nodeN/mysqld.err`) into `to`. */
function copyLogs(from: string, to: string): void {
  mkdirSync(to, { recursive: true });
  for (const name of readdirSync(from)) if (name.endsWith('.log')) copyFileSync(join(from, name), join(to, name));
  for (const n of [1, 2, 3]) {
    const err = join(from, `node${n}`, 'mysqld.err');
    if (existsSync(err)) copyFileSync(err, join(to, `node${n}-mysqld.err`));
  }
}

/** Runs the stop steps in order, logging (never throwing) a step that fails. */
function stopper(steps: Array<() => Promise<unknown>>): () => Promise<void> {
  let stopped = false;
  return async () => {
    if (stopped) return;
    stopped = true;
    for (const step of steps.reverse()) await step().catch((err: unknown) => console.error(`stopping: ${(err as Error).message}`));
  };
}

/** Polls `url` until it answers 200 or `seconds` pass. */
async function waitForOk(url: string, seconds: number, what: string): Promise<void> {
  const deadline = Date.now() + seconds * 1000;
  for (;;) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      /* not yet */
    }
    if (Date.now() > deadline) throw new Error(`${what} did not answer 200 at ${url} within ${seconds} s`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

async function startApps(ports: number[], settings: ClusterAppSettings, into: ClusterAppServer[]): Promise<void> {
  const started = await Promise.allSettled(ports.map((p) => startClusterAppServer(p, settings)));
  for (const s of started) if (s.status === 'fulfilled') into.push(s.value);
  const failed = started.find((s) => s.status === 'rejected');
  if (failed) throw (failed as PromiseRejectedResult).reason;
}

/** The cluster, its schema and two app servers behind HAProxy. */
export async function startClusterTarget(opts: StackOptions): Promise<LoadTarget> {
  const say = opts.say ?? console.log;
  const steps: Array<() => Promise<unknown>> = [];
  const stop = stopper(steps);
  const apps: ClusterAppServer[] = [];
  try {
    if (opts.keepLogsIn) rmSync(opts.keepLogsIn, { recursive: true, force: true }); // only this run's logs
    const outside: OutsideServices = await outsideServices();
    steps.push(() => outside.stop());
    const appPorts = freePorts(2);
    const cluster = await defineCluster({ appPorts, database: opts.database });
    steps.push(() => cluster.destroy());
    if (opts.keepLogsIn) steps.push(async () => copyLogs(cluster.dir, opts.keepLogsIn!));
    let t = Date.now();
    await cluster.start();
    say(`cluster: three nodes and HAProxy up in ${((Date.now() - t) / 1000).toFixed(1)} s (ports from ${cluster.basePort}, state ${cluster.dir})`);
    const db = createDb(cluster.writer);
    steps.push(() => db.destroy());
    t = Date.now();
    await migrateToLatest(db);
    say(`cluster: schema migrated through the writer in ${((Date.now() - t) / 1000).toFixed(1)} s`);
    steps.push(() => Promise.all(apps.map(stopClusterAppServer)));
    t = Date.now();
    await startApps(
      appPorts,
      {
        writer: cluster.writer,
        reader: cluster.reader,
        publicUrl: cluster.httpUrl,
        sessionSecret: CLUSTER_SESSION_SECRET,
        logDir: cluster.dir,
        extraEnv: { ...outside.env, ...opts.appEnv },
      },
      apps,
    );
    await waitForOk(`${cluster.httpUrl}/healthz`, 30, "HAProxy's HTTP listener");
    say(`cluster: two app servers behind ${cluster.httpUrl} in ${((Date.now() - t) / 1000).toFixed(1)} s`);
    return {
      kind: 'cluster',
      db,
      ingestUrls: [cluster.httpUrl],
      browseUrls: [cluster.httpUrl],
      mailCaptureUrl: outside.mailCaptureUrl,
      sessionSecret: CLUSTER_SESSION_SECRET,
      apps,
      cluster,
      stop,
    };
  } catch (err) {
    await stop();
    throw err;
  }
}

/** The baseline: one MariaDB (mariadb.sh, throw-away folder), its schema and the same two app servers, reached directly. */
export async function startSingleTarget(opts: StackOptions): Promise<LoadTarget> {
  const say = opts.say ?? console.log;
  const steps: Array<() => Promise<unknown>> = [];
  const stop = stopper(steps);
  const apps: ClusterAppServer[] = [];
  try {
    const outside = await outsideServices();
    steps.push(() => outside.stop());
    const server: PrivateMariaDb = await startPrivateMariaDb(opts.database);
    steps.push(() => server.destroy());
    const db = createDb(server.dbConfig);
    steps.push(() => db.destroy());
    await migrateToLatest(db);
    steps.push(() => Promise.all(apps.map(stopClusterAppServer)));
    const appPorts = freePorts(2);
    const urls = appPorts.map((p) => `http://127.0.0.1:${p}`);
    await startApps(
      appPorts,
      {
        writer: server.dbConfig,
        publicUrl: urls[0],
        sessionSecret: CLUSTER_SESSION_SECRET,
        logDir: server.env.LAGBOOK_DB_DIR!,
        extraEnv: { ...outside.env, ...opts.appEnv },
      },
      apps,
    );
    say(`single server: MariaDB on port ${server.dbConfig.port} and two app servers up`);
    return {
      kind: 'single',
      db,
      ingestUrls: urls,
      browseUrls: urls,
      mailCaptureUrl: outside.mailCaptureUrl,
      sessionSecret: CLUSTER_SESSION_SECRET,
      apps,
      stop,
    };
  } catch (err) {
    await stop();
    throw err;
  }
}
