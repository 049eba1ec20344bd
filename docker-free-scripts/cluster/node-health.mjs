// Health responder for the Galera nodes of docker-free-scripts/cluster.sh: one process answering
// HTTP on each node's health port (B+10N+4, 127.0.0.1) so HAProxy can check more than the MySQL
// handshake (its own mysql-check only sees that the server greets). Each request runs
//   SHOW GLOBAL STATUS WHERE Variable_name IN ('wsrep_local_state', 'wsrep_ready', 'wsrep_cluster_status')
// on the node (as root, through its Unix socket) and answers 200 only when the node is Synced
// (wsrep_local_state = 4), ready (wsrep_ready = ON) and in the primary component; otherwise 503.
// A node that does not answer within 800 ms counts as down, so a hung node is taken out too.
//
// Settings: LAGBOOK_CLUSTER_DIR (node sockets under node1/ node2/ node3/), LAGBOOK_CLUSTER_PORT (B).
import http from 'node:http';
import path from 'node:path';
import mysql from 'mysql2/promise';

const clusterDir = process.env.LAGBOOK_CLUSTER_DIR;
const base = Number(process.env.LAGBOOK_CLUSTER_PORT || NaN);
if (!clusterDir || !Number.isInteger(base) || base < 1024 || base > 65490) {
  console.error('node-health: LAGBOOK_CLUSTER_DIR and LAGBOOK_CLUSTER_PORT must be set');
  process.exit(2);
}
const QUERY_TIMEOUT_MS = 800;
const SYNCED = '4';

/** One reused connection per node; dropped after any error and opened again at the next check. */
class NodeProbe {
  /** @param {number} node */
  constructor(node) {
    this.node = node;
    this.socketPath = path.join(clusterDir, `node${node}`, 'mysqld.sock');
    /** @type {import('mysql2/promise').Connection | null} */
    this.connection = null;
  }

  /** @returns {Promise<{ healthy: boolean, detail: string }>} */
  async check() {
    try {
      this.connection ??= await withTimeout(mysql.createConnection({ socketPath: this.socketPath, user: 'root', connectTimeout: QUERY_TIMEOUT_MS }));
      const [rows] = await withTimeout(
        this.connection.query("SHOW GLOBAL STATUS WHERE Variable_name IN ('wsrep_local_state', 'wsrep_ready', 'wsrep_cluster_status')"),
      );
      const status = Object.fromEntries(/** @type {Array<{ Variable_name: string, Value: string }>} */ (rows).map((r) => [r.Variable_name, r.Value]));
      const healthy = status.wsrep_local_state === SYNCED && status.wsrep_ready === 'ON' && status.wsrep_cluster_status === 'Primary';
      return {
        healthy,
        detail: `state ${status.wsrep_local_state ?? '?'}, ready ${status.wsrep_ready ?? '?'}, ${status.wsrep_cluster_status ?? '?'}`,
      };
    } catch (error) {
      const broken = this.connection;
      this.connection = null;
      broken?.destroy();
      return { healthy: false, detail: `no answer (${error instanceof Error ? error.message : String(error)})` };
    }
  }
}

/**
 * @template T
 * @param {Promise<T>} promise
 * @returns {Promise<T>}
 */
function withTimeout(promise) {
  let timer;
  const timeout = new Promise((_, reject) => {
    timer = setTimeout(() => reject(new Error(`no answer within ${QUERY_TIMEOUT_MS} ms`)), QUERY_TIMEOUT_MS);
  });
  promise.catch(() => undefined);
  return Promise.race([promise, timeout]).finally(() => clearTimeout(timer));
}

for (const node of [1, 2, 3]) {
  const probe = new NodeProbe(node);
  const port = base + 10 * node + 4;
  // Checks from the writer and the reader listeners arrive together; they share one query.
  /** @type {Promise<{ healthy: boolean, detail: string }> | null} */
  let running = null;
  let lastDetail = '';
  const server = http.createServer((_req, res) => {
    running ??= probe.check().finally(() => {
      running = null;
    });
    running.then(({ healthy, detail }) => {
      const summary = `${healthy ? 'synced' : 'not available'} (${detail})`;
      if (summary !== lastDetail) console.log(`${new Date().toISOString()} node ${node}: ${summary}`);
      lastDetail = summary;
    });
    running.then(({ healthy, detail }) => {
      res.writeHead(healthy ? 200 : 503, { 'content-type': 'text/plain', connection: 'close' });
      res.end(`node ${node}: ${healthy ? 'synced' : 'not available'} (${detail})\n`);
    });
  });
  server.on('error', (error) => {
    console.error(`node-health: cannot listen on 127.0.0.1:${port} for node ${node}: ${error.message}`);
    process.exit(1);
  });
  server.listen(port, '127.0.0.1');
}

for (const signal of ['SIGTERM', 'SIGINT']) process.on(signal, () => process.exit(0));
