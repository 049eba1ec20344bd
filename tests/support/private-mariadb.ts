/**
 * A private MariaDB server for tests and benchmarks that must stop, restart or reconfigure
 * their database: a throw-away data folder and a free port on 127.0.0.1, run by
 * docker-free-scripts/mariadb.sh (the same script developers use), with root reachable
 * only through its socket.
 */
import { execFile, execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import type { Config } from '../../server/config.ts';

const ROOT = join(import.meta.dirname, '..', '..');
const SCRIPT = join(ROOT, 'docker-free-scripts/mariadb.sh');
const run = promisify(execFile);

/** `n` free TCP ports on 127.0.0.1. */
export function freePorts(n: number): number[] {
  return execFileSync('node', [join(ROOT, 'docker-free-scripts/free-ports.mjs'), String(n)], { encoding: 'utf8' })
    .trim()
    .split('\n')
    .map(Number);
}

export interface PrivateMariaDb {
  /** Settings for the `lagbook` user on the server's database. */
  dbConfig: Config['db'];
  /** Environment that points mariadb.sh at this server. */
  env: NodeJS.ProcessEnv;
  /** Runs SQL as root through the socket; resolves with the tab-separated output. */
  asRoot(sql: string): Promise<string>;
  /** Clean shutdown (mariadb.sh stop). */
  stop(): Promise<void>;
  /** Starts it again on the same folder and port (mariadb.sh start). */
  start(): Promise<void>;
  /** Stops it and deletes its folder; safe to call twice or after a failed start. */
  destroy(): Promise<void>;
}

/**
 * Initialises and starts a private server whose database is `database` (must match `lagbook_%`);
 * `serverArgs` are extra mariadbd options (e.g. a capped tablespace).
 */
export async function startPrivateMariaDb(database: string, opts: { serverArgs?: string[] } = {}): Promise<PrivateMariaDb> {
  const [port] = freePorts(1);
  const dir = mkdtempSync(join(tmpdir(), 'lagbook-private-db-'));
  const env = {
    ...process.env,
    LAGBOOK_DB_DIR: dir,
    LAGBOOK_DB_PORT: String(port),
    LAGBOOK_DB_NAME: database,
    LAGBOOK_DB_EXTRA_ARGS: (opts.serverArgs ?? []).join(' '),
  };
  const script = async (action: 'start' | 'stop') => void (await run('bash', [SCRIPT, action], { env }));
  let destroyed = false;
  const server: PrivateMariaDb = {
    dbConfig: { host: '127.0.0.1', port, user: 'lagbook', password: 'lagbook', database, poolMax: 10 },
    env,
    async asRoot(sql) {
      const { stdout } = await run('mariadb', ['--no-defaults', `--socket=${join(dir, 'mysqld.sock')}`, '-uroot', '--batch', '--skip-column-names', '-e', sql]);
      return stdout;
    },
    stop: () => script('stop'),
    start: () => script('start'),
    async destroy() {
      if (destroyed) return;
      destroyed = true;
      await script('stop').catch(() => undefined);
      rmSync(dir, { recursive: true, force: true });
    },
  };
  try {
    await server.start();
  } catch (err) {
    await server.destroy();
    throw err;
  }
  return server;
}
