/**
 * Starts what a benchmark needs, on loopback only: a private MariaDB (throw-away data
 * folder and free port, via docker-free-scripts/mariadb.sh), the schema, and Lagbook's server
 * in a child process (so the load generator does not share its event loop).
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createDb, type Db } from '../../../server/db/create-db.ts';
import { migrateToLatest } from '../../../server/db/migrate.ts';
import type { Config } from '../../../server/config.ts';

const ROOT = join(import.meta.dirname, '..', '..', '..');

function freePorts(n: number): number[] {
  return execFileSync('node', [join(ROOT, 'docker-free-scripts/free-ports.mjs'), String(n)], { encoding: 'utf8' }).trim().split('\n').map(Number);
}

export interface BenchStack {
  db: Db;
  dbConfig: Config['db'];
  appUrl: string;
  app: ChildProcess;
  stop(): Promise<void>;
}

export async function startBenchStack(): Promise<BenchStack> {
  const [dbPort, appPort] = freePorts(2);
  const dir = mkdtempSync(join(tmpdir(), 'lagbook-bench-db-'));
  const env = { ...process.env, LAGBOOK_DB_DIR: dir, LAGBOOK_DB_PORT: String(dbPort), LAGBOOK_DB_NAME: 'lagbook_bench' };
  execFileSync('bash', [join(ROOT, 'docker-free-scripts/mariadb.sh'), 'start'], { env, stdio: 'ignore' });
  const dbConfig: Config['db'] = { host: '127.0.0.1', port: dbPort, user: 'lagbook', password: 'lagbook', database: 'lagbook_bench', poolMax: 10 };
  const db = createDb(dbConfig);
  await migrateToLatest(db);
  const app = spawn('node', ['--import', 'tsx', join(ROOT, 'tests/support/app-server-entry.ts')], {
    env: { ...env, APP_PORT: String(appPort), APP_DB: JSON.stringify(dbConfig) },
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
      execFileSync('bash', [join(ROOT, 'docker-free-scripts/mariadb.sh'), 'stop'], { env, stdio: 'ignore' });
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
