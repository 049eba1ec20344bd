import { createServer } from 'node:http';
import { loadConfig } from './config.ts';
import { createDb, databaseAnswers } from './db/create-db.ts';
import { createLogWriter } from './log-writer.ts';
import { discoverOidcEndpoints } from './integrations/identity/oidc-discovery.ts';
import { createMailer } from './integrations/mail/create-mailer.ts';
import { createStripeClient } from './integrations/billing/create-stripe-client.ts';
import { createApp } from './app.ts';
import { ConfigError } from './errors.ts';
import { migrateToLatest } from './db/migrate.ts';
import { createAnalysisPool } from './workers/analysis-pool.ts';
import { serverStorageFacts } from './db/server-storage-facts.ts';
import { checkHolePunching, logHolePunchFinding } from './services/storage/hole-punch-check.ts';

/**
 * Lagbook's entry point: validate configuration, check the database and identity provider,
 * optionally migrate (`--migrate`), listen. Any start-up problem prints one clear line and
 * exits with status 1 — never a stack trace.
 */
async function main(): Promise<void> {
  const config = loadConfig();
  const logger = createLogWriter();
  const db = createDb(config.db);
  if (!(await databaseAnswers(db))) {
    throw new ConfigError(
      `The database at ${config.db.host}:${config.db.port} (${config.db.database}) does not answer. ` +
        'Start it with docker-free-scripts/mariadb.sh start, or check the LAGBOOK_DB_* settings.',
    );
  }
  // The reader is optional; when set it must answer at start like the writer (a typo in its
  // address should stop the start, not hide behind the writer fallback for months).
  const readDb = config.dbRead ? createDb(config.dbRead, { reader: true }) : undefined;
  if (readDb && config.dbRead && !(await databaseAnswers(readDb))) {
    await Promise.all([readDb.destroy(), db.destroy()]);
    throw new ConfigError(
      `The database reader at ${config.dbRead.host}:${config.dbRead.port} (${config.dbRead.database}) does not answer. ` +
        'Check LAGBOOK_DB_READ_HOST and LAGBOOK_DB_READ_PORT, or unset both to read from the writer.',
    );
  }
  if (process.argv.includes('--migrate')) {
    const applied = await migrateToLatest(db);
    logger.info('migrations applied', { applied });
  }
  // Page compression saves disk only where the filesystem punches holes: say so at start if not (never stops the start).
  await serverStorageFacts(db)
    .then((facts) => checkHolePunching({ facts, databaseIsLocal: Boolean(config.db.socketPath) || ['127.0.0.1', 'localhost', '::1'].includes(config.db.host) }))
    .then((finding) => logHolePunchFinding(logger, finding))
    .catch((err: unknown) => logger.warn('storage: hole punching check failed', { err: String(err) }));
  const endpoints = await discoverOidcEndpoints(config.oidc.issuer);
  const mailer = createMailer(config.smtp);
  if (!(await mailer.verify())) logger.warn('the SMTP server does not answer yet; mail will be retried', { host: config.smtp.host, port: config.smtp.port });
  const billing = createStripeClient(config.stripe);
  const analysisPool = createAnalysisPool();
  const app = createApp({ config, db, readDb, logger, identity: { endpoints }, mailer, billing, analysisPool });

  const server = createServer(app);
  // Node ends any request after 5 minutes by default; a historical upload of a large export
  // file streams for longer. Headers must still arrive within a minute (slow-client guard).
  server.requestTimeout = config.requestTimeoutS * 1000;
  server.headersTimeout = 60_000;
  await new Promise<void>((resolve, reject) => {
    server.once('error', (err: NodeJS.ErrnoException) => {
      if (err.code === 'EADDRINUSE') reject(new ConfigError(`Port ${config.port} on ${config.host} is already in use; set LAGBOOK_PORT to a free port.`));
      else reject(err);
    });
    server.listen(config.port, config.host, resolve);
  });
  logger.info('Lagbook is listening', { url: config.publicUrl });
  const stopBackgroundJobs = (app.locals.startBackgroundJobs as () => () => Promise<void>)();

  const shutdown = () => {
    server.close(() => {
      void stopBackgroundJobs()
        .then(() => (app.locals.settleRequestWork as () => Promise<void>)())
        .then(() => {
          mailer.close();
          return Promise.all([analysisPool.close(), db.destroy(), readDb?.destroy()]);
        })
        .then(() => process.exit(0));
    });
    setTimeout(() => process.exit(0), 5000).unref();
  };
  process.once('SIGINT', shutdown);
  process.once('SIGTERM', shutdown);
}

main().catch((err: unknown) => {
  if (err instanceof ConfigError) {
    process.stderr.write(`lagbook: ${err.message}\n`);
  } else {
    process.stderr.write(`lagbook: could not start: ${(err as Error)?.message ?? String(err)}\n`);
  }
  process.exit(1);
});
