/**
 * cluster.sh without a cluster: the parts that need no database server. Its port layout as
 * `env` prints it (fixed by the interface the app and the fault test rely on), clear refusals
 * of bad input that start nothing, `status`/`writer`/`kill-node` on a folder where nothing runs,
 * and the health responder's answer for nodes that do not answer (503 on each node's health
 * port). The running cluster (start, failover, rejoin) is exercised by the cluster test group
 * (tests/cluster) and by docker-free-scripts/cluster/measure-failover.mjs.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';

const SCRIPT = join(import.meta.dirname, '..', 'cluster.sh');
const HEALTH = join(import.meta.dirname, 'node-health.mjs');

const dirs: string[] = [];
const procs: ChildProcess[] = [];
afterEach(() => {
  for (const p of procs.splice(0)) if (p.exitCode === null && p.signalCode === null) p.kill('SIGKILL');
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

function tempDir(): string {
  const dir = mkdtempSync(join(tmpdir(), 'lagbook-cluster-script-'));
  dirs.push(dir);
  return dir;
}

function run(args: string[], env: Record<string, string>): { status: number | null; stdout: string; stderr: string } {
  const result = spawnSync('bash', [SCRIPT, ...args], { encoding: 'utf8', env: { ...process.env, ...env }, timeout: 30_000 });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}

async function portFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const server = createServer();
    server.once('error', () => resolve(false));
    server.listen(port, '127.0.0.1', () => server.close(() => resolve(true)));
  });
}

/** A base port B whose three health ports (B+14, B+24, B+34) are free right now. */
async function freeBase(): Promise<number> {
  for (let attempt = 0; attempt < 50; attempt++) {
    const base = 30000 + Math.floor(Math.random() * 25000);
    const free = await Promise.all([14, 24, 34].map((offset) => portFree(base + offset)));
    if (free.every(Boolean)) return base;
  }
  throw new Error('no free block of ports found');
}

describe('cluster.sh', () => {
  it('prints the writer and reader listeners of its port layout as export lines', () => {
    const { status, stdout } = run(['env'], { LAGBOOK_CLUSTER_PORT: '5100', LAGBOOK_CLUSTER_DIR: tempDir() });
    expect(status).toBe(0);
    expect(stdout.trim().split('\n')).toEqual([
      'export LAGBOOK_DB_HOST=127.0.0.1',
      'export LAGBOOK_DB_PORT=5100',
      'export LAGBOOK_DB_READ_HOST=127.0.0.1',
      'export LAGBOOK_DB_READ_PORT=5101',
    ]);
  });

  it.each([
    [['kill-node', '4'], "the node number must be 1, 2 or 3 (got '4')"],
    [['start-node', ''], "the node number must be 1, 2 or 3 (got '')"],
    [['start-node', '1; rm -rf /'], "the node number must be 1, 2 or 3 (got '1; rm -rf /')"],
    [['restart'], 'usage:'],
  ])('refuses %j with exit 2 and one clear line, creating nothing', (args, message) => {
    const dir = tempDir();
    const { status, stderr } = run(args, { LAGBOOK_CLUSTER_PORT: '5100', LAGBOOK_CLUSTER_DIR: dir });
    expect(status).toBe(2);
    expect(stderr).toContain(message);
    expect(stderr.trim().split('\n')).toHaveLength(1);
    expect(readdirSync(dir)).toEqual([]);
  });

  it.each(['80', '70000', 'abc'])('refuses the base port %j', (port) => {
    const { status, stderr } = run(['env'], { LAGBOOK_CLUSTER_PORT: port, LAGBOOK_CLUSTER_DIR: tempDir() });
    expect(status).toBe(2);
    expect(stderr.trim()).toBe(`cluster: LAGBOOK_CLUSTER_PORT must be a port number from 1024 to 65490 (got '${port}')`);
  });

  it('reports every node down and exits 1 when nothing runs; writer and kill-node fail clearly', async () => {
    const env = { LAGBOOK_CLUSTER_PORT: String(await freeBase()), LAGBOOK_CLUSTER_DIR: tempDir() };
    const status = run(['status'], env);
    expect(status.status).toBe(1);
    expect(status.stdout).toContain('node 1: down');
    expect(status.stdout).toContain('node 2: down');
    expect(status.stdout).toContain('node 3: down');
    expect(status.stdout).toContain('writer: none');
    const writer = run(['writer'], env);
    expect(writer.status).toBe(1);
    expect(writer.stderr).toContain('the writer listener does not answer');
    const kill = run(['kill-node', '2'], env);
    expect(kill.status).toBe(1);
    expect(kill.stderr.trim()).toBe('cluster: node 2 is not running');
  });
});

describe('node-health.mjs', () => {
  it('answers 503 on each node health port when the node does not answer', async () => {
    const base = await freeBase();
    const proc = spawn('node', [HEALTH], {
      env: { ...process.env, LAGBOOK_CLUSTER_DIR: tempDir(), LAGBOOK_CLUSTER_PORT: String(base) },
      stdio: 'ignore',
    });
    procs.push(proc);
    const answers: Array<{ status: number; body: string }> = [];
    for (const node of [1, 2, 3]) {
      const url = `http://127.0.0.1:${base + 10 * node + 4}/`;
      let res: Response | undefined;
      for (let i = 0; i < 100 && !res; i++) {
        res = await fetch(url).catch(async () => {
          await new Promise((r) => setTimeout(r, 50));
          return undefined;
        });
      }
      if (!res) throw new Error(`no answer at ${url}`);
      answers.push({ status: res.status, body: await res.text() });
    }
    for (const [i, answer] of answers.entries()) {
      expect(answer.status).toBe(503);
      expect(answer.body).toMatch(new RegExp(`^node ${i + 1}: not available \\(no answer`));
    }
  });

  it('refuses to start without its settings', () => {
    const result = spawnSync('node', [HEALTH], { encoding: 'utf8', env: { ...process.env, LAGBOOK_CLUSTER_DIR: '', LAGBOOK_CLUSTER_PORT: '' } });
    expect(result.status).toBe(2);
    expect(result.stderr).toContain('LAGBOOK_CLUSTER_DIR and LAGBOOK_CLUSTER_PORT must be set');
  });
});
