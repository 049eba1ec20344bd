import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { loadConfig, type Config } from '../../server/config.ts';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { createApp } from '../../server/app.ts';
import type { ReadCounts, ReadReplica } from '../../server/db/read-replica.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { discoverOidcEndpoints } from '../../server/integrations/identity/oidc-discovery.ts';
import { createMailer } from '../../server/integrations/mail/create-mailer.ts';
import { createStripeClient } from '../../server/integrations/billing/create-stripe-client.ts';

/**
 * Builds the real app against the real MariaDB and the local stand-ins that
 * docker-free-scripts/test.sh started (their addresses come from the environment).
 * `readDb` is the reader for lag-tolerant reads (the caller creates and destroys it); without
 * it, a reader configured in the environment (LAGBOOK_DB_READ_*) is opened here and closed by
 * `close`, and with neither every read uses the writer.
 */
export async function buildTestApp(overrides: Partial<Config> = {}, options: { readDb?: Db } = {}) {
  const config: Config = { ...testConfig(), ...overrides };
  const db = createDb(config.db);
  await migrateToLatest(db);
  const ownReader = !options.readDb && config.dbRead ? createDb(config.dbRead, { reader: true }) : null;
  const readDb = options.readDb ?? ownReader ?? undefined;
  const endpoints = await discoverOidcEndpoints(config.oidc.issuer);
  const mailer = createMailer(config.smtp);
  const billing = createStripeClient(config.stripe);
  // every answer a route gives must be documented in its route-table entry (and so in the API document)
  const undocumented = new Set<string>();
  const onUndocumentedStatus = (where: string, status: number) => undocumented.add(`${where} answered ${status}`);
  const app = createApp({ config, db, readDb, logger: createLogWriter({ silent: true }), identity: { endpoints }, mailer, billing, onUndocumentedStatus });
  let server: Server | null = null;
  return {
    app,
    db,
    config,
    /** Which connection answered the lag-tolerant reads so far (db/read-replica.ts). */
    readCounts: (): ReadCounts => (app.locals.readReplica as ReadReplica).counts(),
    /** Listens on the configured port (the one registered as redirect URI at the provider). */
    async listen(): Promise<string> {
      server = createServer(app);
      await new Promise<void>((resolve, reject) => {
        server!.once('error', reject);
        server!.listen(config.port, config.host, resolve);
      });
      const { port } = server.address() as AddressInfo;
      return `http://127.0.0.1:${port}`;
    },
    async close(): Promise<void> {
      if (server) {
        server.closeAllConnections();
        await new Promise<void>((r) => server!.close(() => r()));
      }
      // after-ingest alert runs still going would hold the evaluator's lease past this file's end
      await (app.locals.settleRequestWork as () => Promise<void>)();
      mailer.close();
      await Promise.all([db.destroy(), ownReader?.destroy()]);
      if (undocumented.size > 0) {
        throw new Error(`Routes answered statuses their route-table entries do not document (add them to \`errors\`):\n${[...undocumented].join('\n')}`);
      }
    },
  };
}

/** The configuration test.sh exported; fails with a clear hint when run outside it. */
export function testConfig(): Config {
  if (!process.env.OIDC_ISSUER || !process.env.LAGBOOK_DB_PORT) {
    throw new Error('API and browser tests need the services started by `npm test` (docker-free-scripts/test.sh).');
  }
  return loadConfig(process.env);
}

export type TestApp = Awaited<ReturnType<typeof buildTestApp>>;
export type { Db };
