/**
 * Starts what a benchmark needs, on loopback only: a private MariaDB (throw-away data
 * folder and free port, see tests/support/private-mariadb.ts), the schema, and Lagbook's server
 * in a child process (so the load generator does not share its event loop).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { createDb, type Db } from '../../../server/db/create-db.ts';
import { migrateToLatest } from '../../../server/db/migrate.ts';
import type { Config } from '../../../server/config.ts';
import { freePorts, startPrivateMariaDb } from '../../support/private-mariadb.ts';

const ROOT = join(import.meta.dirname, '..', '..', '..');

export interface BenchStack {
  db: Db;
  dbConfig: Config['db'];
  appUrl: string;
  app: ChildProcess;
  stop(): Promise<void>;
}

/** The private database, its schema and one app process; `stop()` removes all three. */
export async function startBenchStack(): Promise<BenchStack> {
  const server = await startPrivateMariaDb('lagbook_bench');
  const dbConfig = server.dbConfig;
  const db = createDb(dbConfig);
  await migrateToLatest(db);
  const [appPort] = freePorts(1);
  // BENCH_APP_NODE_ARGS passes extra flags to the app's node, e.g. "--cpu-prof --cpu-prof-dir=/tmp/p" to profile it.
  const extraArgs = (process.env.BENCH_APP_NODE_ARGS ?? '').split(' ').filter(Boolean);
  const app = spawn('node', [...extraArgs, '--import', 'tsx', join(ROOT, 'tests/support/app-server-entry.ts')], {
    env: { ...server.env, APP_PORT: String(appPort), APP_DB: JSON.stringify(dbConfig) },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  const appUrl = `http://127.0.0.1:${appPort}`;
  for (let i = 0; i < 200; i++) {
    try {
      if ((await fetch(`${appUrl}/healthz`)).ok) break;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    db,
    dbConfig,
    appUrl,
    app,
    async stop() {
      app.kill('SIGTERM');
      await db.destroy();
      await server.destroy();
    },
  };
}

