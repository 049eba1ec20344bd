import { z } from 'zod';
import { ConfigError } from './errors.ts';

/**
 * Lagbook's configuration, read from the environment once at start and validated, so a
 * missing or malformed setting stops the process with one clear message instead of
 * failing later on a request.
 */
const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  LAGBOOK_HOST: z.string().min(1).default('127.0.0.1'),
  LAGBOOK_PORT: z.coerce.number().int().min(0).max(65535).default(4310),
  /** The URL people reach Lagbook at; used for OIDC redirects and links in mail. */
  LAGBOOK_PUBLIC_URL: z.url().optional(),
  /** Folder of the built client (vite build) served by the production server. */
  LAGBOOK_CLIENT_DIR: z.string().optional(),
  /** Longest a request may take, in seconds (uploads of large files stream for a long time). */
  LAGBOOK_REQUEST_TIMEOUT_S: z.coerce.number().int().min(60).max(86400).default(3600),

  LAGBOOK_DB_HOST: z.string().min(1).default('127.0.0.1'),
  LAGBOOK_DB_PORT: z.coerce.number().int().min(1).max(65535).default(4306),
  LAGBOOK_DB_USER: z.string().min(1).default('lagbook'),
  LAGBOOK_DB_PASSWORD: z.string().default('lagbook'),
  LAGBOOK_DB_NAME: z
    .string()
    .regex(/^[A-Za-z0-9_]+$/, 'letters, digits and _ only')
    .default('lagbook'),
  LAGBOOK_DB_POOL_MAX: z.coerce.number().int().min(1).max(200).default(10),
  LAGBOOK_DB_SOCKET: z.string().min(1).optional(),
  /**
   * An optional second address for reads that tolerate a replica's small lag (charts, diagnostics,
   * exports, channel lists): a replica or a load balancer's reader listener. Set both or neither.
   * User, password and database name are the writer's.
   */
  LAGBOOK_DB_READ_HOST: z.string().min(1).optional(),
  LAGBOOK_DB_READ_PORT: z.coerce.number().int().min(1).max(65535).optional(),
  /** Connections to the reader (default: LAGBOOK_DB_POOL_MAX). */
  LAGBOOK_DB_READ_POOL_MAX: z.coerce.number().int().min(1).max(200).optional(),

  /** Signs the session cookie; at least 32 characters. */
  LAGBOOK_SESSION_SECRET: z.string().min(32, 'must be at least 32 characters'),

  /** Any standard OpenID Connect issuer; its endpoints are read from its discovery document. */
  OIDC_ISSUER: z.url(),
  OIDC_CLIENT_ID: z.string().min(1),
  OIDC_CLIENT_SECRET: z.string().min(1),

  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(4325),
  SMTP_SECURE: z.stringbool().default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().min(3).default('Lagbook <lagbook@localhost>'),
  /** Seconds between scheduled alert evaluations (silence, reminders, queued mail). */
  LAGBOOK_ALERT_EVALUATE_EVERY_S: z.coerce.number().int().min(5).max(3600).default(30),
  /** Minutes an alert stays open before its first reminder, when its rule sets none (0: no reminders). */
  LAGBOOK_ALERT_REMINDER_AFTER_MIN: z.coerce.number().int().min(0).max(10080).default(60),

  STRIPE_SECRET_KEY: z.string().regex(/^sk_(test|live)_/, 'must start with sk_test_ or sk_live_'),
  /** Set only in development and tests: the base URL of the local Stripe stand-in. */
  STRIPE_API_BASE: z.url().optional(),
  /** Signing secret of the Stripe webhook endpoint (Stripe dashboard → the endpoint's signing secret). */
  STRIPE_WEBHOOK_SECRET: z.string().regex(/^whsec_\w+$/, 'must start with whsec_'),
  /** Days a lab keeps its paid plan after a failed payment before it is treated as free. */
  LAGBOOK_BILLING_GRACE_DAYS: z.coerce.number().int().min(0).max(60).default(7),
  /** The plan catalog (limits and Stripe price lookup keys). */
  LAGBOOK_PLANS_FILE: z.string().min(1).default('tenants/plans.json'),
  /** Labs one person may create. */
  LAGBOOK_MAX_LABS_PER_ACCOUNT: z.coerce.number().int().min(1, 'must be at least 1').max(1000, 'must be at most 1000').default(3),
  /** Labs one person may create when they are admin of a lab on a paid plan. */
  LAGBOOK_MAX_LABS_PER_PAID_ADMIN: z.coerce.number().int().min(1, 'must be at least 1').max(1000, 'must be at most 1000').default(10),
  /** Diagnostics runs one person may have in flight at once, per app process. */
  LAGBOOK_DIAGNOSTICS_RUNS_PER_PERSON: z.coerce.number().int().min(1, 'must be at least 1').max(64, 'must be at most 64').default(2),
});

export interface Config {
  env: 'development' | 'production' | 'test';
  host: string;
  port: number;
  publicUrl: string;
  clientDir: string | null;
  requestTimeoutS: number;
  /** `socketPath`, when set, is MariaDB's Unix socket on this machine and replaces host and port. */
  db: { host: string; port: number; socketPath?: string; user: string; password: string; database: string; poolMax: number };
  /**
   * The reader for lag-tolerant reads (same user, password and database as `db`), or null when
   * LAGBOOK_DB_READ_HOST/PORT are unset and every read uses the writer.
   */
  dbRead: { host: string; port: number; user: string; password: string; database: string; poolMax: number } | null;
  sessionSecret: string;
  /** Cookies carry the Secure flag when Lagbook is reached over TLS. */
  secureCookies: boolean;
  oidc: { issuer: string; clientId: string; clientSecret: string; redirectUri: string };
  smtp: { host: string; port: number; secure: boolean; user?: string; password?: string; from: string };
  alerts: { evaluateEveryS: number; reminderAfterMin: number };
  stripe: { secretKey: string; apiBase: URL | null; webhookSecret: string; graceDays: number; plansFile: string };
  /** Labs a person may create: `perAccount`, or `perPaidAdmin` once they administer a lab on a paid plan. */
  labCreation: { perAccount: number; perPaidAdmin: number };
  /** Diagnostics runs one person may have in flight at once (per app process). */
  diagnostics: { runsPerPerson: number };
}

/** Only the database settings (for operator commands that need nothing else). */
export function loadDatabaseConfig(env: NodeJS.ProcessEnv = process.env): Config['db'] & { publicUrl: string } {
  const parsed = envSchema
    .pick({
      LAGBOOK_DB_HOST: true,
      LAGBOOK_DB_PORT: true,
      LAGBOOK_DB_USER: true,
      LAGBOOK_DB_PASSWORD: true,
      LAGBOOK_DB_NAME: true,
      LAGBOOK_DB_POOL_MAX: true,
      LAGBOOK_DB_SOCKET: true,
      LAGBOOK_PUBLIC_URL: true,
      LAGBOOK_HOST: true,
      LAGBOOK_PORT: true,
    })
    .safeParse(env);
  if (!parsed.success) {
    throw new ConfigError(`Invalid configuration:\n${parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n')}`);
  }
  const e = parsed.data;
  return {
    host: e.LAGBOOK_DB_HOST,
    port: e.LAGBOOK_DB_PORT,
    user: e.LAGBOOK_DB_USER,
    password: e.LAGBOOK_DB_PASSWORD,
    database: e.LAGBOOK_DB_NAME,
    poolMax: e.LAGBOOK_DB_POOL_MAX,
    ...(e.LAGBOOK_DB_SOCKET ? { socketPath: e.LAGBOOK_DB_SOCKET } : {}),
    publicUrl: (e.LAGBOOK_PUBLIC_URL ?? `http://${e.LAGBOOK_HOST}:${e.LAGBOOK_PORT}`).replace(/\/$/, ''),
  };
}

/**
 * The reader's settings: host and port must come together (one without the other is a typo, not
 * a choice), and a reader pool size means nothing without a reader. Null when no reader is set.
 */
function readerSettings(e: z.infer<typeof envSchema>): Config['dbRead'] {
  const host = e.LAGBOOK_DB_READ_HOST;
  const port = e.LAGBOOK_DB_READ_PORT;
  const problems: string[] = [];
  if (host !== undefined && port === undefined) problems.push('  LAGBOOK_DB_READ_PORT: required when LAGBOOK_DB_READ_HOST is set');
  if (port !== undefined && host === undefined) problems.push('  LAGBOOK_DB_READ_HOST: required when LAGBOOK_DB_READ_PORT is set');
  if (host === undefined && port === undefined && e.LAGBOOK_DB_READ_POOL_MAX !== undefined) {
    problems.push('  LAGBOOK_DB_READ_POOL_MAX: set only together with LAGBOOK_DB_READ_HOST and LAGBOOK_DB_READ_PORT');
  }
  if (problems.length > 0) throw new ConfigError(`Invalid configuration:\n${problems.join('\n')}`);
  if (host === undefined || port === undefined) return null;
  return {
    host,
    port,
    user: e.LAGBOOK_DB_USER,
    password: e.LAGBOOK_DB_PASSWORD,
    database: e.LAGBOOK_DB_NAME,
    poolMax: e.LAGBOOK_DB_READ_POOL_MAX ?? e.LAGBOOK_DB_POOL_MAX,
  };
}

/** Parses and validates the environment; throws ConfigError listing every problem at once. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${/received undefined/.test(i.message) ? 'required but not set' : i.message}`);
    throw new ConfigError(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  if (e.NODE_ENV === 'production' && e.STRIPE_API_BASE) {
    throw new ConfigError('Invalid configuration:\n  STRIPE_API_BASE: the Stripe stand-in cannot be used in production');
  }
  if (e.LAGBOOK_MAX_LABS_PER_PAID_ADMIN < e.LAGBOOK_MAX_LABS_PER_ACCOUNT) {
    throw new ConfigError(
      `Invalid configuration:\n  LAGBOOK_MAX_LABS_PER_PAID_ADMIN: must be at least LAGBOOK_MAX_LABS_PER_ACCOUNT (${e.LAGBOOK_MAX_LABS_PER_ACCOUNT})`,
    );
  }
  const publicUrl = (e.LAGBOOK_PUBLIC_URL ?? `http://${e.LAGBOOK_HOST}:${e.LAGBOOK_PORT}`).replace(/\/$/, '');
  const dbRead = readerSettings(e);
  return {
    env: e.NODE_ENV,
    host: e.LAGBOOK_HOST,
    port: e.LAGBOOK_PORT,
    publicUrl,
    clientDir: e.LAGBOOK_CLIENT_DIR ?? null,
    requestTimeoutS: e.LAGBOOK_REQUEST_TIMEOUT_S,
    db: {
      host: e.LAGBOOK_DB_HOST,
      port: e.LAGBOOK_DB_PORT,
      user: e.LAGBOOK_DB_USER,
      password: e.LAGBOOK_DB_PASSWORD,
      database: e.LAGBOOK_DB_NAME,
      poolMax: e.LAGBOOK_DB_POOL_MAX,
      ...(e.LAGBOOK_DB_SOCKET ? { socketPath: e.LAGBOOK_DB_SOCKET } : {}),
    },
    dbRead,
    sessionSecret: e.LAGBOOK_SESSION_SECRET,
    secureCookies: publicUrl.startsWith('https://'),
    oidc: {
      issuer: e.OIDC_ISSUER.replace(/\/$/, ''),
      clientId: e.OIDC_CLIENT_ID,
      clientSecret: e.OIDC_CLIENT_SECRET,
      redirectUri: `${publicUrl}/auth/callback`,
    },
    smtp: {
      host: e.SMTP_HOST,
      port: e.SMTP_PORT,
      secure: e.SMTP_SECURE,
      user: e.SMTP_USER,
      password: e.SMTP_PASSWORD,
      from: e.MAIL_FROM,
    },
    alerts: { evaluateEveryS: e.LAGBOOK_ALERT_EVALUATE_EVERY_S, reminderAfterMin: e.LAGBOOK_ALERT_REMINDER_AFTER_MIN },
    stripe: {
      secretKey: e.STRIPE_SECRET_KEY,
      apiBase: e.STRIPE_API_BASE ? new URL(e.STRIPE_API_BASE) : null,
      webhookSecret: e.STRIPE_WEBHOOK_SECRET,
      graceDays: e.LAGBOOK_BILLING_GRACE_DAYS,
      plansFile: e.LAGBOOK_PLANS_FILE,
    },
    labCreation: { perAccount: e.LAGBOOK_MAX_LABS_PER_ACCOUNT, perPaidAdmin: e.LAGBOOK_MAX_LABS_PER_PAID_ADMIN },
    diagnostics: { runsPerPerson: e.LAGBOOK_DIAGNOSTICS_RUNS_PER_PERSON },
  };
}
