/**
 * Lagbook's real app in a process of its own, for benchmarks and crash tests, without the
 * outside services those do not exercise (no identity provider, mail or billing calls happen
 * on the paths they use). Heavy analysis runs on the worker pool, as in production. Settings:
 * APP_PORT, APP_DB (JSON of the database settings), APP_SESSION_SECRET, and optionally
 * APP_READ_DB (JSON in APP_DB's shape: the reader for lag-tolerant reads, LAGBOOK_DB_READ_*).
 */
import { createServer } from 'node:http';
import { createApp } from '../../server/app.ts';
import { createDb } from '../../server/db/create-db.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { loadConfig } from '../../server/config.ts';
import { createAnalysisPool } from '../../server/workers/analysis-pool.ts';

const port = Number(process.env.APP_PORT);
const dbConfig = JSON.parse(process.env.APP_DB!);
const secret = process.env.APP_SESSION_SECRET ?? 'bench-secret-bench-secret-bench-secret';
const config = loadConfig({
  LAGBOOK_PORT: String(port),
  LAGBOOK_SESSION_SECRET: secret,
  OIDC_ISSUER: 'http://127.0.0.1:9',
  OIDC_CLIENT_ID: 'bench',
  OIDC_CLIENT_SECRET: 'bench',
  STRIPE_SECRET_KEY: 'sk_test_bench',
  STRIPE_WEBHOOK_SECRET: 'whsec_bench',
});
const db = createDb({ ...dbConfig, poolMax: 20 });
const readConfig = process.env.APP_READ_DB ? { poolMax: 20, ...JSON.parse(process.env.APP_READ_DB) } : null;
const readDb = readConfig ? createDb(readConfig, { reader: true }) : undefined;
const app = createApp({
  config: { ...config, db: { ...dbConfig, poolMax: 20 }, dbRead: readConfig },
  db,
  readDb,
  logger: createLogWriter({ silent: true }),
  identity: {
    endpoints: {
      issuer: 'http://127.0.0.1:9',
      authorization_endpoint: 'http://127.0.0.1:9/a',
      token_endpoint: 'http://127.0.0.1:9/t',
      userinfo_endpoint: 'http://127.0.0.1:9/u',
    },
  },
  mailer: { send: async () => undefined, verify: async () => true, close: () => undefined },
  billing: {} as never,
  ingestRate: { perSecond: 10_000, burst: 10_000 },
  analysisPool: createAnalysisPool(),
});
const server = createServer(app);
server.requestTimeout = 0; // benchmarks stream uploads for as long as they take
server.listen(port, '127.0.0.1');
process.on('SIGTERM', () => process.exit(0));
