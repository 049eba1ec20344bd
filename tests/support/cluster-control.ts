/**
 * A throw-away three-node Galera cluster with HAProxy in front, for the fault test and the
 * cluster benchmark, driven through docker-free-scripts/cluster.sh (the same script operators
 * use). The cluster gets its own state folder and a block of free ports on 127.0.0.1, so it
 * disturbs no other test run or developer cluster.
 *
 * Port layout (cluster.sh's contract): writer listener B, reader listener B+1, HTTP listener
 * B+2, HAProxy stats B+3; node N (1..3): SQL B+10N, replication B+10N+1, IST B+10N+2,
 * SST B+10N+3, health check B+10N+4.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import type { Config } from '../../server/config.ts';

const ROOT = join(import.meta.dirname, '..', '..');
const SCRIPT = join(ROOT, 'docker-free-scripts/cluster.sh');
const run = promisify(execFile);

export type NodeNumber = 1 | 2 | 3;
export const NODES: readonly NodeNumber[] = [1, 2, 3];

/** The offsets from the base port that cluster.sh listens on. */
export function clusterPortOffsets(): number[] {
  const offsets = [0, 1, 2, 3];
  for (const n of NODES) for (let k = 0; k < 5; k++) offsets.push(10 * n + k);
  return offsets;
}

/** Whether `port` on 127.0.0.1 can be listened on right now. */
function portIsFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const server = createServer();
    server.once('error', () => resolve(false));
    server.listen(port, '127.0.0.1', () => server.close(() => resolve(true)));
  });
}

/**
 * A base port B whose whole block (B … B+34 at cluster.sh's offsets) is free, chosen at random
 * in 20000–59000 so parallel runs rarely meet; `avoid` lists ports already handed out.
 */
export async function freeClusterBasePort(avoid: readonly number[] = []): Promise<number> {
  for (let attempt = 0; attempt < 50; attempt++) {
    const base = 20_000 + 10 * Math.floor(Math.random() * 3_900);
    const ports = clusterPortOffsets().map((o) => base + o);
    if (ports.some((p) => avoid.includes(p))) continue;
    const free = await Promise.all(ports.map(portIsFree));
    if (free.every(Boolean)) return base;
  }
  throw new Error('no free block of ports for the cluster was found in 50 tries');
}

/**
 * Last resort when `cluster.sh stop` fails: SIGKILL to the processes named in this cluster's own
 * pid files (the nodes, HAProxy, the health responder), so no server outlives its deleted folder.
 */
function killFromPidFiles(dir: string): void {
  const files = ['haproxy.pid', 'health.pid', ...NODES.map((n) => join(`node${n}`, 'mysqld.pid'))];
  for (const file of files) {
    try {
      const pid = Number(readFileSync(join(dir, file), 'utf8').trim());
      if (Number.isInteger(pid) && pid > 1) process.kill(pid, 'SIGKILL');
    } catch {
      /* no such file or process */
    }
  }
}

/** cluster.sh failed: the action, its exit code and the tail of what it printed. */
export class ClusterScriptError extends Error {
  constructor(action: string, detail: string) {
    super(`cluster.sh ${action} failed: ${detail}`);
    this.name = 'ClusterScriptError';
  }
}

export interface ClusterControl {
  /** State folder (node data, HAProxy config and logs). */
  dir: string;
  basePort: number;
  database: string;
  /** Address of the writer listener (every connection to one healthy node). */
  writer: Config['db'];
  /** Address of the reader listener (balanced over synced nodes). */
  reader: Config['db'];
  /** Direct address of one node's SQL port, bypassing HAProxy (to check a rejoined node). */
  node(n: NodeNumber): Config['db'];
  /** HAProxy's HTTP listener in front of the app servers. */
  httpUrl: string;
  /** Environment cluster.sh runs with (state folder, ports, app ports, database). */
  env: NodeJS.ProcessEnv;
  start(): Promise<void>;
  /** SIGKILL to node N's server; returns at once. */
  killNode(n: NodeNumber): Promise<void>;
  /** Starts node N again and resolves when it is Synced. */
  startNode(n: NodeNumber): Promise<void>;
  /** The node the writer listener sends new connections to. */
  writerNode(): Promise<NodeNumber>;
  /** cluster.sh status output. */
  status(): Promise<string>;
  /** Stops HAProxy, the health checker and the nodes, then removes the state folder; never throws. */
  destroy(): Promise<void>;
}

/**
 * A cluster definition on a free block of ports with its own temporary state folder (nothing
 * started yet). `appPorts` are the app servers HAProxy's HTTP listener balances over.
 */
export async function defineCluster(opts: { appPorts: number[]; database: string }): Promise<ClusterControl> {
  const basePort = await freeClusterBasePort(opts.appPorts);
  const dir = mkdtempSync(join(tmpdir(), 'lagbook-cluster-'));
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    LAGBOOK_CLUSTER_DIR: dir,
    LAGBOOK_CLUSTER_PORT: String(basePort),
    LAGBOOK_CLUSTER_HTTP_PORT: String(basePort + 2),
    LAGBOOK_CLUSTER_APP_PORTS: opts.appPorts.join(' '),
    LAGBOOK_DB_NAME: opts.database,
    // a short run writes far less than cluster.sh's default 256 MB write-set cache per node
    LAGBOOK_CLUSTER_GCACHE: process.env.LAGBOOK_CLUSTER_GCACHE ?? '64M',
  };
  const script = async (timeoutMs: number, action: string, ...args: string[]): Promise<string> => {
    try {
      const { stdout } = await run('bash', [SCRIPT, action, ...args], { env, cwd: ROOT, timeout: timeoutMs, maxBuffer: 1 << 24 });
      return stdout;
    } catch (err) {
      const e = err as { code?: number | string; stdout?: string; stderr?: string; killed?: boolean };
      const tail = `${e.stdout ?? ''}\n${e.stderr ?? ''}`.trim().split('\n').slice(-15).join('\n');
      throw new ClusterScriptError(`${action} ${args.join(' ')}`.trim(), `${e.killed ? `no answer within ${timeoutMs / 1000} s` : `exit ${e.code}`}\n${tail}`);
    }
  };
  const sql = (port: number): Config['db'] => ({ host: '127.0.0.1', port, user: 'lagbook', password: 'lagbook', database: opts.database, poolMax: 10 });
  let destroyed = false;
  return {
    dir,
    basePort,
    database: opts.database,
    writer: sql(basePort),
    reader: sql(basePort + 1),
    node: (n) => sql(basePort + 10 * n),
    httpUrl: `http://127.0.0.1:${basePort + 2}`,
    env,
    start: async () => void (await script(300_000, 'start')),
    killNode: async (n) => void (await script(30_000, 'kill-node', String(n))),
    startNode: async (n) => void (await script(240_000, 'start-node', String(n))),
    async writerNode() {
      const out = (await script(30_000, 'writer')).trim();
      const n = Number(out.split('\n').pop());
      if (n !== 1 && n !== 2 && n !== 3) throw new ClusterScriptError('writer', `printed "${out}", not a node number`);
      return n;
    },
    status: () => script(30_000, 'status'),
    async destroy() {
      if (destroyed) return;
      destroyed = true;
      await script(120_000, 'stop').catch((err: Error) => {
        console.error(err.message);
        killFromPidFiles(dir);
      });
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
