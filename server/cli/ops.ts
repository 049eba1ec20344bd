/**
 * Lagbook's operator command line, for scripts and operators: `npm run ops -- <command>`.
 * Reads the LAGBOOK_DB_* settings (and LAGBOOK_PUBLIC_URL for links) from the environment.
 */
import { parseArgs } from 'node:util';
import { loadDatabaseConfig } from '../config.ts';
import { createDb } from '../db/create-db.ts';
import { AppError, ConfigError } from '../errors.ts';
import { createLabCommand, mintTokenCommand, registerLoggerCommand, type CommandResult } from './ops-commands.ts';
import { seedDemo } from './seed-demo.ts';
import { BackupError, backupCommand, restoreCommand } from './backup-commands.ts';
import { storageReport, storageReportText } from '../services/storage/storage-report.ts';

const HELP = `Lagbook operator commands

Usage: npm run ops -- <command> [options] [--json]

Commands:
  create-lab --name <name> --admin <email> [--slug <slug>]
      Create a lab. The admin joins at once if they have signed in before;
      otherwise an admin invitation link is printed (valid 7 days, single use).

  register-logger --lab <slug> --name <name> --interval <seconds>
                  [--timezone <IANA zone, default UTC>] [--site <text>] [--serial <text>]
                  [--channel <key>[:<label>[:<unit>[:<min>:<max>]]]]...
      Register a logger with its channels and print its ingest key (shown once).
      Example: --channel air_t:"Air temperature":°C:-40:60 --channel rh:Humidity:%:0:100

  mint-token --lab <slug> --email <member e-mail> --name <name> [--days <1-365, default 90>]
      Make a personal API token (read routes only) for a scientist, technician or admin
      of the lab and print it (shown once). They can revoke it on their tokens page.

  seed-demo [--issuer <OIDC issuer>] [--force]
      Load the demo lab (tenants/demo) with its members as the local identity provider's
      dev accounts. Idempotent. Refused when NODE_ENV=production unless --force.

  backup --out <file.sql.gz> [--force]
      Write a consistent, gzip-compressed dump of the whole database (taken in one
      transaction, so loggers keep posting). Refuses an existing file unless --force.
      Needs mariadb-dump (Debian's mariadb-client).

  restore --from <file.sql.gz> [--database <name>] [--force]
      Load a backup into LAGBOOK_DB_NAME, or into --database (created if missing).
      Refuses a database that already holds tables unless --force (then each table in
      the backup replaces the one of that name). Stop the app before restoring over
      its live database.

  storage
      Show how readings and rollups are stored: the month partitions of each table
      (approximate rows) and the rebuild of closed months (status, rows, last error).

Options:
  --json    print the result as JSON (for scripts)
  --help    this text

Settings (environment): LAGBOOK_DB_HOST, LAGBOOK_DB_PORT, LAGBOOK_DB_USER,
LAGBOOK_DB_PASSWORD, LAGBOOK_DB_NAME, LAGBOOK_PUBLIC_URL.
`;

function fail(message: string): never {
  process.stderr.write(`ops: ${message}\n`);
  process.exit(2);
}

function need(values: Record<string, unknown>, name: string): string {
  const v = values[name];
  if (typeof v !== 'string' || v === '') fail(`--${name} is required (see --help)`);
  return v;
}

async function run(argv: string[]): Promise<CommandResult | null> {
  const [command, ...rest] = argv;
  if (!command || command === '--help' || command === 'help') {
    process.stdout.write(HELP);
    return null;
  }
  const { values } = parseArgs({
    args: rest,
    options: {
      name: { type: 'string' },
      slug: { type: 'string' },
      admin: { type: 'string' },
      lab: { type: 'string' },
      interval: { type: 'string' },
      timezone: { type: 'string', default: 'UTC' },
      site: { type: 'string' },
      serial: { type: 'string' },
      channel: { type: 'string', multiple: true, default: [] },
      json: { type: 'boolean', default: false },
      help: { type: 'boolean', default: false },
      issuer: { type: 'string' },
      force: { type: 'boolean', default: false },
      email: { type: 'string' },
      days: { type: 'string', default: '90' },
      out: { type: 'string' },
      from: { type: 'string' },
      database: { type: 'string' },
    },
    strict: true,
  });
  if (values.help) {
    process.stdout.write(HELP);
    return null;
  }
  const config = loadDatabaseConfig();
  const db = createDb(config);
  try {
    switch (command) {
      case 'create-lab':
        return await createLabCommand(db, config.publicUrl, { name: need(values, 'name'), slug: values.slug, adminEmail: need(values, 'admin') });
      case 'register-logger': {
        const interval = Number(need(values, 'interval'));
        return await registerLoggerCommand(db, {
          lab: need(values, 'lab'),
          name: need(values, 'name'),
          intervalS: interval,
          timezone: values.timezone!,
          site: values.site,
          serial: values.serial,
          channels: values.channel as string[],
        });
      }
      case 'mint-token':
        return await mintTokenCommand(db, { lab: need(values, 'lab'), email: need(values, 'email'), name: need(values, 'name'), days: Number(values.days) });
      case 'seed-demo': {
        if (process.env.NODE_ENV === 'production' && !values.force) fail('seed-demo refuses to run in production without --force');
        const issuer = values.issuer ?? process.env.OIDC_ISSUER;
        if (!issuer) fail('seed-demo needs --issuer or OIDC_ISSUER (the identity provider the demo members sign in with)');
        const { DEV_ACCOUNTS } = await import('../../tenants/demo/people.ts');
        const result = await seedDemo(db, {
          issuer: issuer.replace(/\/$/, ''),
          people: DEV_ACCOUNTS.map((a) => ({ email: a.email, name: a.name, subject: a.sub })),
          log: (line) => process.stderr.write(`${line}\n`),
        });
        return { text: result.text, json: { ...result } };
      }
      case 'backup':
        return await backupCommand(config, { out: need(values, 'out'), force: values.force! });
      case 'restore':
        return await restoreCommand(db, config, { from: need(values, 'from'), database: values.database, force: values.force! });
      case 'storage': {
        const report = await storageReport(db, new Date());
        return { text: storageReportText(report), json: { ...report } };
      }
      default:
        fail(`unknown command "${command}" (see --help)`);
    }
  } finally {
    await db.destroy();
  }
}

const wantsJson = process.argv.includes('--json');
run(process.argv.slice(2)).then(
  (result) => {
    if (result) process.stdout.write(wantsJson ? `${JSON.stringify(result.json)}\n` : `${result.text}\n`);
  },
  (err: unknown) => {
    if (err instanceof AppError || err instanceof ConfigError || err instanceof BackupError) fail(err.message);
    if ((err as { code?: string }).code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION') fail(`${(err as Error).message} (see --help)`);
    fail(`failed: ${(err as Error).message}`);
  },
);
