/**
 * Lagbook's production entry point (server/main.ts) run as separate app processes on the
 * cluster: writes through HAProxy's writer listener, lag-tolerant reads through its reader
 * listener (LAGBOOK_DB_READ_*), the real mailer and the background jobs (alert evaluator,
 * usage job, …) — as `LAGBOOK_CLUSTER=1 npm start` runs them. Each process logs to a file in
 * the cluster's state folder, so a failed start can show why.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { openSync, readFileSync, closeSync } from 'node:fs';
import { join } from 'node:path';
import type { Config } from '../../server/config.ts';

const ROOT = join(import.meta.dirname, '..', '..');
const ENTRY = join(ROOT, 'server/main.ts');

export interface ClusterAppServer {
  url: string;
  port: number;
  child: ChildProcess;
  logFile: string;
  exited: Promise<void>;
}

export interface ClusterAppSettings {
  writer: Config['db'];
  /** The reader listener; without it every read uses the writer (the single-server baseline). */
  reader?: Config['db'];
  /** The address people and loggers reach (HAProxy's HTTP listener): links in mail, same-origin check. */
  publicUrl: string;
  sessionSecret: string;
  /** Folder for the processes' logs. */
  logDir: string;
  /** Extra settings (e.g. LAGBOOK_ALERT_EVALUATE_EVERY_S). */
  extraEnv?: NodeJS.ProcessEnv;
}

/** The last lines of a log file, for error messages. */
export function logTail(file: string, lines = 20): string {
  try {
    return readFileSync(file, 'utf8').trim().split('\n').slice(-lines).join('\n');
  } catch {
    return '(no log)';
  }
}

/** Whether a child process has ended (by itself or by a signal). */
export const hasExited = (child: ChildProcess) => child.exitCode !== null || child.signalCode !== null;

/** The production server's V8 flags (package.json "config.serverNodeFlags"). */
function serverNodeFlags(): string[] {
  const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { config: { serverNodeFlags: string } };
  return pkg.config.serverNodeFlags.split(' ').filter(Boolean);
}

/** The environment of one app process: the caller's (outside services) with the cluster's database settings. */
function appEnv(port: number, s: ClusterAppSettings): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    LAGBOOK_HOST: '127.0.0.1',
    LAGBOOK_PORT: String(port),
    LAGBOOK_PUBLIC_URL: s.publicUrl,
    LAGBOOK_SESSION_SECRET: s.sessionSecret,
    LAGBOOK_DB_HOST: s.writer.host,
    LAGBOOK_DB_PORT: String(s.writer.port),
    LAGBOOK_DB_USER: s.writer.user,
    LAGBOOK_DB_PASSWORD: s.writer.password,
    LAGBOOK_DB_NAME: s.writer.database,
    ...s.extraEnv,
  };
  if (s.reader) {
    env.LAGBOOK_DB_READ_HOST = s.reader.host;
    env.LAGBOOK_DB_READ_PORT = String(s.reader.port);
  } else {
    delete env.LAGBOOK_DB_READ_HOST;
    delete env.LAGBOOK_DB_READ_PORT;
  }
  // through HAProxy, never the single server's socket; no built client needed for API traffic
  delete env.LAGBOOK_DB_SOCKET;
  delete env.LAGBOOK_CLIENT_DIR;
  return env;
}

/** Starts one app process on `port` and resolves once its /healthz answers 200 (within 60 s). */
export async function startClusterAppServer(port: number, s: ClusterAppSettings): Promise<ClusterAppServer> {
  const logFile = join(s.logDir, `app-${port}.log`);
  const log = openSync(logFile, 'a');
  const child = spawn('node', [...serverNodeFlags(), '--import', 'tsx', ENTRY], { cwd: ROOT, env: appEnv(port, s), stdio: ['ignore', log, log] });
  closeSync(log);
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const url = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 600; i++) {
    if (hasExited(child)) throw new Error(`the app server on port ${port} exited during start:\n${logTail(logFile)}`);
    try {
      if ((await fetch(`${url}/healthz`)).ok) return { url, port, child, logFile, exited };
    } catch {
      /* not listening yet */
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  child.kill('SIGKILL');
  throw new Error(`the app server on port ${port} did not answer within 60 s:\n${logTail(logFile)}`);
}

/** SIGTERM (main.ts drains its jobs and exits), SIGKILL after 8 s; never throws. */
export async function stopClusterAppServer(app: ClusterAppServer | undefined): Promise<void> {
  if (!app || hasExited(app.child)) return;
  app.child.kill('SIGTERM');
  await Promise.race([app.exited, new Promise((r) => setTimeout(r, 8000))]);
  if (!hasExited(app.child)) {
    app.child.kill('SIGKILL');
    await app.exited;
  }
}
