/**
 * The outside services an app server started from server/main.ts needs (identity provider,
 * Stripe stand-in, mail capture). Inside `npm test` they are already running (test-env.sh
 * exports their addresses) and are used as they are; a benchmark run on its own starts
 * docker-free-scripts/dev-services.ts on free ports and stops it afterwards.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, openSync, closeSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { freePorts } from './private-mariadb.ts';
import { logTail } from './cluster-app-servers.ts';

const ROOT = join(import.meta.dirname, '..', '..');

export interface OutsideServices {
  /** Settings the app servers need to reach them (merged into their environment). */
  env: NodeJS.ProcessEnv;
  /** Where the captured mail is read (GET /messages). */
  mailCaptureUrl: string;
  stop(): Promise<void>;
}

/** Uses the services test-env.sh started, or starts dev-services.ts when there are none. */
export async function outsideServices(): Promise<OutsideServices> {
  if (process.env.OIDC_ISSUER && process.env.LAGBOOK_MAIL_CAPTURE_URL && process.env.SMTP_PORT) {
    return { env: {}, mailCaptureUrl: process.env.LAGBOOK_MAIL_CAPTURE_URL, stop: async () => undefined };
  }
  const [issuerPort, stripePort, smtpPort, mailHttpPort] = freePorts(4);
  const dir = mkdtempSync(join(tmpdir(), 'lagbook-outside-services-'));
  const readyFile = join(dir, 'services.json');
  const env: NodeJS.ProcessEnv = {
    OIDC_ISSUER: `http://127.0.0.1:${issuerPort}`,
    OIDC_CLIENT_ID: 'lagbook-cluster-bench',
    OIDC_CLIENT_SECRET: 'lagbook-cluster-bench-secret',
    STRIPE_API_BASE: `http://127.0.0.1:${stripePort}`,
    STRIPE_SECRET_KEY: 'sk_test_lagbook_cluster_bench',
    STRIPE_WEBHOOK_SECRET: 'whsec_lagbook_cluster_bench',
    SMTP_PORT: String(smtpPort),
    LAGBOOK_MAIL_HTTP_PORT: String(mailHttpPort),
  };
  const logFile = join(dir, 'dev-services.log');
  const log = openSync(logFile, 'a');
  const child: ChildProcess = spawn('node', ['--import', 'tsx', join(ROOT, 'docker-free-scripts/dev-services.ts')], {
    cwd: ROOT,
    env: { ...process.env, ...env, LAGBOOK_SERVICES_READY_FILE: readyFile },
    stdio: ['ignore', log, log],
  });
  closeSync(log);
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const stop = async () => {
    if (child.exitCode === null && child.signalCode === null) {
      child.kill('SIGTERM');
      await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
    }
    rmSync(dir, { recursive: true, force: true });
  };
  for (let i = 0; i < 300 && !existsSync(readyFile); i++) {
    if (child.exitCode !== null) break;
    await new Promise((r) => setTimeout(r, 100));
  }
  if (!existsSync(readyFile)) {
    const tail = logTail(logFile);
    await stop();
    throw new Error(`the outside services did not start:\n${tail}`);
  }
  return { env, mailCaptureUrl: `http://127.0.0.1:${mailHttpPort}`, stop };
}
