import express, { type Express } from 'express';
import type Stripe from 'stripe';
import type { Config } from './config.ts';
import type { Db } from './db/create-db.ts';
import { createReadReplica } from './db/read-replica.ts';
import type { LogWriter } from './log-writer.ts';
import type { Mailer } from './integrations/mail/create-mailer.ts';
import type { OidcEndpoints } from './integrations/identity/oidc-discovery.ts';
import { usersRepo } from './db/users.repo.ts';
import { crossLabRepo } from './db/cross-lab.repo.ts';
import { createSignInService } from './services/sign-in.service.ts';
import { createMeService } from './services/me.service.ts';
import { securityHeaders } from './http/middleware/security-headers.ts';
import { sessionMiddleware } from './http/middleware/session.ts';
import { sameOriginWrites } from './http/middleware/same-origin-writes.ts';
import { errorHandler } from './http/middleware/error-handler.ts';
import { bodyEncodingGuard, refuseDeepJson } from './http/middleware/body-encoding.ts';
import { createPassport } from './http/auth/passport-setup.ts';
import { authRouter } from './http/auth/auth.router.ts';
import { meRoutes } from './http/me.routes.ts';
import { healthRoutes } from './http/health.routes.ts';
import { staticClient } from './http/static-client.ts';
import { NotFoundError } from './errors.ts';
import { createLabsService } from './services/labs.service.ts';
import { createMembersService } from './services/members.service.ts';
import { createInvitationsService } from './services/invitations.service.ts';
import { createAuditService } from './services/audit.service.ts';
import { createLabGuard } from './http/middleware/lab-guard.ts';
import { mountRoutes } from './http/routes/mount-routes.ts';
import { labRouteSummaries, runsBeforeSession, type LabRouteSummary, type Route } from './http/routes/route.ts';
import { labRoutes } from './http/labs/labs.routes.ts';
import { memberRoutes } from './http/labs/members.routes.ts';
import { invitationAcceptanceRoutes, invitationRoutes } from './http/labs/invitations.routes.ts';
import { auditRoutes } from './http/labs/audit.routes.ts';
import { createLabExportService } from './services/lab-export/lab-export.service.ts';
import { createLabDeletionService } from './services/lab-deletion/lab-deletion.service.ts';
import { createLabDeletionJob } from './services/lab-deletion/lab-deletion-job.ts';
import { overviewRoutes } from './http/labs/overview.routes.ts';
import { createLabOverviewService } from './services/lab-overview.service.ts';
import { createLoggersService } from './services/loggers.service.ts';
import { createQuarantineService } from './services/quarantine.service.ts';
import { createIngestService } from './services/ingest/ingest.service.ts';
import { startBackgroundJobs, type BackgroundJob } from './jobs/background-jobs.ts';
import { composeIngestHooks } from './services/ingest/ingest-hooks.ts';
import { quarantineCapHook } from './services/ingest/quarantine-cap.ts';
import { createTestReadingService } from './services/test-reading.service.ts';
import { loggerRoutes } from './http/loggers/loggers.routes.ts';
import { quarantineRoutes } from './http/loggers/quarantine.routes.ts';
import { ingestRoutes } from './http/ingest/ingest.routes.ts';
import { uploadRoutes } from './http/loggers/uploads.routes.ts';
import { createUploadsService } from './services/uploads.service.ts';
import { createChannelsService } from './services/channels.service.ts';
import { createDiagnosticsService } from './services/diagnostics.service.ts';
import { createDiagnosticsConcurrency } from './services/diagnostics-concurrency.ts';
import { channelRoutes } from './http/channels/channels.routes.ts';
import { noteRoutes } from './http/channels/notes.routes.ts';
import { createNotesService } from './services/notes/notes.service.ts';
import { createPersonalTokensService } from './services/personal-tokens.service.ts';
import { tokenRoutes } from './http/tokens/tokens.routes.ts';
import { alertRoutes } from './http/alerts/alerts.routes.ts';
import { createAlertsFeature } from './services/alerts/alerts-feature.ts';
import { loadPlanCatalog } from './services/billing/plan-catalog.ts';
import { createPlanLimits } from './services/billing/plan-limits.ts';
import { createUsageJob, USAGE_JOB_INTERVAL_MS } from './services/billing/usage-job.ts';
import { createBillingService } from './services/billing/billing.service.ts';
import { createStripeWebhooks } from './services/billing/stripe-webhooks.service.ts';
import { billingRoutes } from './http/billing/billing.routes.ts';
import { retentionRoutes } from './http/billing/retention.routes.ts';
import { createRetentionJob } from './services/retention/retention-job.ts';
import { createStorageMaintenanceJob } from './services/storage/storage-maintenance-job.ts';
import { createRetentionView } from './services/retention/retention-view.ts';
import { processHolderName } from './jobs/job-lease.ts';
import { stripeWebhookRoutes } from './http/billing/stripe-webhooks.routes.ts';
import { buildOpenApiDocument } from './http/openapi/openapi-document.ts';
import { openApiRoutes } from './http/openapi/openapi.routes.ts';
import type { AnalysisPool } from './workers/analysis-pool.ts';
import { resolveRateLimits, type RateLimits } from './http/middleware/rate-limits.ts';

/** Everything the app talks to, handed in so tests can build it with stand-ins. */
export interface AppDeps {
  config: Config;
  db: Db;
  /**
   * The reader (LAGBOOK_DB_READ_*) for reads that tolerate a replica's small lag: charts,
   * diagnostics input, exports, channel lists. Default: the writer `db`. See db/read-replica.ts.
   */
  readDb?: Db;
  logger: LogWriter;
  identity: { endpoints: OidcEndpoints };
  mailer: Mailer;
  billing: Stripe;
  /** The clock services use (tests move it to check expiry). */
  now?: () => Date;
  /** Per-logger ingest allowance (requests per second, burst); defaults to 20/s, burst 40. */
  ingestRate?: { perSecond: number; burst: number };
  /**
   * Worker threads for channel diagnostics, created once by the entry point (which also closes
   * it). Without one, diagnostics run on the request thread (fine for tests and tools).
   */
  analysisPool?: AnalysisPool;
  /** Limits on sign-in redirects (per IP) and invitation mail (per admin); defaults in rate-limits.ts. */
  rateLimits?: Partial<RateLimits>;
  /** Called when a route answers a status its table entry does not document (the test app fails on it). */
  onUndocumentedStatus?: (where: string, status: number) => void;
}

/**
 * Builds the Express app. Order matters: security headers → health (no session needed) →
 * session → passport → CSRF guard → routers → JSON 404 for the API → built client → errors.
 */
export function createApp(deps: AppDeps): Express {
  const { config, db, logger } = deps;
  const limits = resolveRateLimits(deps.rateLimits);
  // The plan catalog is read and validated at start: a bad file stops the server (ConfigError).
  const plans = loadPlanCatalog(config.stripe.plansFile);
  const planLimits = createPlanLimits({ db, catalog: plans, logger, now: deps.now });
  // Each 15-minute cycle reconciles once across app servers (claimed in job_runs).
  const usageJob = createUsageJob({
    db,
    catalog: plans,
    mailer: deps.mailer,
    logger,
    publicUrl: config.publicUrl,
    now: deps.now,
    cycleMs: USAGE_JOB_INTERVAL_MS,
  });
  const app = express();
  app.disable('x-powered-by');
  if (config.secureCookies) app.set('trust proxy', 1);

  const users = usersRepo(db);
  const labs = crossLabRepo(db);
  const signIn = createSignInService({ users });
  const me = createMeService({ labs, users });
  const passport = createPassport({ config, endpoints: deps.identity.endpoints, users, signIn });
  const labsService = createLabsService({ db, caps: config.labCreation, catalog: plans, now: deps.now });
  const members = createMembersService({ db });
  const invitations = createInvitationsService({ db, mailer: deps.mailer, publicUrl: config.publicUrl, now: deps.now, planLimits });
  const audit = createAuditService({ db });
  const nowMs = deps.now ? () => deps.now!().getTime() : undefined;
  // Lag-tolerant reads go to the reader when it has caught up; everything that must see its own
  // writes (sign-in, sessions, ingestion, forms, billing, alerts, the lab guard) keeps using `db`.
  const reads = createReadReplica({
    writer: db,
    reader: deps.readDb ?? null,
    onReaderDown: (err) => logger.warn('database reader does not answer; reads use the writer for now', { err: String(err) }),
  });
  const loggers = createLoggersService({ db, now: deps.now, planLimits });
  const alerts = createAlertsFeature({ db, mailer: deps.mailer, logger, config, now: nowMs });
  // Every way a reading comes in (API, upload, re-submit, test reading) runs the same hooks.
  const ingestHooks = composeIngestHooks([
    // more than 1,000 rows of one batch to quarantine: 422 before the plan's quarantine cap is even asked
    quarantineCapHook(),
    planLimits.ingestHooks,
    alerts.ingestHooks,
  ]);
  /** Scheduled work main.ts starts after listening (tests drive each job directly instead). */
  // Removes deleted labs' rows in batches; a deletion request starts a run at once.
  const labDeletions = createLabDeletionService({ db, stripe: deps.billing, now: deps.now, onRequested: () => labDeletionJob.kick() });
  const labDeletionJob = createLabDeletionJob({ db, logger, now: deps.now, beforeRun: labDeletions.settleStalled });
  const retentionJob = createRetentionJob({ db, catalog: plans, logger, holder: processHolderName(), now: deps.now });
  // Month partitions ahead and the rebuild of closed months (lease 'storage-maintenance').
  const storageJob = createStorageMaintenanceJob({ db, logger, holder: processHolderName(), now: deps.now });
  const backgroundJobs: BackgroundJob[] = [usageJob.job, alerts.job, labDeletionJob.job, retentionJob.job, storageJob.job];
  const quarantine = createQuarantineService({ db, now: nowMs, hooks: ingestHooks, logger });
  // Half the database pool at most for logger batches; the rest stays free for people browsing.
  const ingest = createIngestService({ db, now: nowMs, hooks: ingestHooks, maxConcurrentBatches: Math.max(1, Math.ceil(config.db.poolMax / 2)) });
  const channels = createChannelsService({ db, reads, now: nowMs });
  const notes = createNotesService({ db, now: nowMs });
  const diagnostics = createDiagnosticsService({ db, reads, channels, pool: deps.analysisPool });
  const tokens = createPersonalTokensService({ db, now: deps.now });
  const billingService = createBillingService({ db, stripe: deps.billing, catalog: plans, publicUrl: config.publicUrl, now: deps.now });
  /** The route table: every API route with its auth, input schemas and answers (see http/routes/). */
  let openApiDocument: object = {};
  const routes: Route[] = [
    ...healthRoutes({ db, reads }),
    // the API document is built from this table (right below)
    ...openApiRoutes({ document: () => openApiDocument }),
    ...meRoutes({ me }),
    ...labRoutes({
      labs: labsService,
      exports: createLabExportService({ db, channels, notes, now: deps.now }),
      deletions: labDeletions,
    }),
    ...memberRoutes({ members }),
    ...invitationRoutes({ invitations, sendLimit: limits.invitations }),
    ...invitationAcceptanceRoutes({ invitations }),
    ...auditRoutes({ audit }),
    ...loggerRoutes({ loggers, testReadings: createTestReadingService({ db, now: nowMs }) }),
    ...quarantineRoutes({ quarantine }),
    ...uploadRoutes({ uploads: createUploadsService({ db, now: nowMs, hooks: ingestHooks }), logger }),
    // Loggers authenticate with their key, not a session: 'ingest-key' mounts it before the session
    // middleware and the JSON parser; it takes its own (larger) body limit.
    ...ingestRoutes({ ingest, rate: deps.ingestRate }),
    ...channelRoutes({
      channels,
      diagnostics,
      now: nowMs,
      billing: billingService,
      // At most this many diagnostics runs in flight per person (per process): one person cannot hog the workers.
      diagnosticsRuns: createDiagnosticsConcurrency({ maxPerPerson: config.diagnostics.runsPerPerson }),
    }),
    ...alertRoutes({ alerts: alerts.service, now: nowMs }),
    ...noteRoutes({ notes }),
    ...tokenRoutes({ tokens }),
    ...billingRoutes({ billing: billingService }),
    ...retentionRoutes({ retention: createRetentionView({ db, catalog: plans, now: deps.now }) }),
    ...overviewRoutes({ overview: createLabOverviewService({ db, reads, billing: billingService, now: nowMs }) }),
    // Stripe signs the raw body: 'webhook-signature' mounts it before sessions and JSON parsing.
    ...stripeWebhookRoutes({
      webhooks: createStripeWebhooks({
        db,
        stripe: deps.billing,
        catalog: plans,
        mailer: deps.mailer,
        logger,
        webhookSecret: config.stripe.webhookSecret,
        graceDays: config.stripe.graceDays,
        publicUrl: config.publicUrl,
      }),
    }),
  ];
  // built at start, so a schema the document cannot describe stops the server instead of a request
  openApiDocument = buildOpenApiDocument(routes, { serverUrl: config.publicUrl });
  const mountContext = { guard: createLabGuard(db, { tokens }), onUndocumentedStatus: deps.onUndocumentedStatus };
  // The lab routes, for the role × route test (every lab route and its permission).
  app.locals.labRoutes = labRouteSummaries(routes) satisfies LabRouteSummary[];
  // Which connection answered the lag-tolerant reads (tests, and a health answer that reports the reader).
  app.locals.readReplica = reads;
  app.locals.startBackgroundJobs = (): (() => Promise<void>) => startBackgroundJobs(backgroundJobs, logger);
  // Work started by requests that must end before the process does (main.ts and the test app call it).
  app.locals.settleRequestWork = (): Promise<void> => alerts.settleNudges();

  app.use(securityHeaders({ secure: config.secureCookies }));
  // Unsupported Content-Encoding or charset: 415 before any body parser runs, on every route.
  app.use(bodyEncodingGuard());
  app.use(mountRoutes(routes.filter(runsBeforeSession), mountContext));
  app.use(sessionMiddleware({ db, secret: config.sessionSecret, secure: config.secureCookies }));
  app.use(passport.session());
  app.use(sameOriginWrites(config.publicUrl));
  app.use(express.json({ limit: '1mb', verify: refuseDeepJson }));

  app.use(authRouter({ passport, logger, signInLimit: limits.signIn }));
  app.use(
    mountRoutes(
      routes.filter((r) => !runsBeforeSession(r)),
      mountContext,
    ),
  );

  app.use(['/api', '/auth'], (req, _res, next) => next(new NotFoundError(`No route for ${req.method} ${req.originalUrl.split('?')[0]}.`)));
  if (config.clientDir) app.use(staticClient(config.clientDir));
  app.use((req, _res, next) => next(new NotFoundError(`No route for ${req.method} ${req.path}.`)));
  app.use(errorHandler(logger));
  return app;
}
