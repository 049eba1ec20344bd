import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import type { Config } from '../../server/config.ts';

const ENTRY = join(import.meta.dirname, 'app-server-entry.ts');

/**
 * Lagbook's server in a child process (so a test can kill it), answering on 127.0.0.1:port.
 * `readDb` (same shape as `db`: host, port, user, password, database, poolMax) is the reader
 * for lag-tolerant reads, as LAGBOOK_DB_READ_* sets it in production; without it every read
 * uses `db`.
 */
export async function startAppProcess(
  db: Config['db'],
  port: number,
  sessionSecret: string,
  options: { readDb?: Config['db'] } = {},
): Promise<{ url: string; child: ChildProcess; stopped: Promise<void> }> {
  const child = spawn('node', ['--import', 'tsx', ENTRY], {
    env: {
      ...process.env,
      APP_PORT: String(port),
      APP_DB: JSON.stringify(db),
      APP_SESSION_SECRET: sessionSecret,
      ...(options.readDb ? { APP_READ_DB: JSON.stringify(options.readDb) } : {}),
    },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const stopped = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const url = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 300; i++) {
    if (child.exitCode !== null) throw new Error('the app process exited during start');
    try {
      if ((await fetch(`${url}/healthz`)).ok) return { url, child, stopped };
    } catch {
      /* not listening yet */
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  child.kill('SIGKILL');
  throw new Error('the app process did not answer within 30 s');
}

/** Stops an app process started by {@link startAppProcess}: SIGTERM, then SIGKILL after 5 s. */
export async function stopAppProcess(app: { child: ChildProcess; stopped: Promise<void> } | undefined): Promise<void> {
  if (!app) return;
  app.child.kill('SIGTERM');
  await Promise.race([app.stopped, new Promise((r) => setTimeout(r, 5000))]);
  if (app.child.exitCode === null) app.child.kill('SIGKILL');
}
