/**
 * Starts what a benchmark needs, on loopback only: a private MariaDB (throw-away data
 * folder and free port, see tests/support/private-mariadb.ts), the schema, and Lagbook's server
 * in a child process (so the load generator does not share its event loop).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { readFileSync } from 'node:fs';
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
  /** The private MariaDB server's process id (for CPU accounting). */
  dbPid: number;
  /** Runs SQL as the server's root user (see PrivateMariaDb.asRoot). */
  asRoot(sql: string): Promise<string>;
  stop(): Promise<void>;
}

/** The private database, its schema and one app process; `stop()` removes all three. */
export async function startBenchStack(): Promise<BenchStack> {
  // BENCH_DB_ARGS passes extra mariadbd options, e.g. "--performance-schema=ON" to see where its time goes.
  const server = await startPrivateMariaDb('lagbook_bench', { serverArgs: (process.env.BENCH_DB_ARGS ?? '').split(' ').filter(Boolean) });
  // Through MariaDB's Unix socket, as `npm start` runs the server (LAGBOOK_DB_SOCKET).
  const dbConfig = { ...server.dbConfig, socketPath: join(server.env.LAGBOOK_DB_DIR!, 'mysqld.sock') };
  const db = createDb(dbConfig);
  await migrateToLatest(db);
  const [appPort] = freePorts(1);
  // The app runs with the production server's V8 flags (package.json "config.serverNodeFlags");
  // BENCH_APP_NODE_ARGS adds more, e.g. "--cpu-prof --cpu-prof-dir=/tmp/p" to profile it.
  const serverFlags = (JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { config: { serverNodeFlags: string } }).config.serverNodeFlags;
  const extraArgs = `${serverFlags} ${process.env.BENCH_APP_NODE_ARGS ?? ''}`.split(' ').filter(Boolean);
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
    asRoot: (sql) => server.asRoot(sql),
    dbPid: Number(readFileSync(join(server.env.LAGBOOK_DB_DIR!, 'mysqld.pid'), 'utf8').trim()),
    async stop() {
      app.kill('SIGTERM');
      await db.destroy();
      await server.destroy();
    },
  };
}
