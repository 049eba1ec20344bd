/**
 * The throw-away MariaDB server `npm run bench:storage` measures on: started by
 * docker-free-scripts/mariadb.sh (through tests/support/private-mariadb.ts: a temporary
 * LAGBOOK_DB_DIR and a free port on 127.0.0.1, removed at the end), so the benchmark can read
 * what the server costs from outside it — the allocated size of each table's `.ibd` files and
 * the server process's CPU time.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { startPrivateMariaDb, type PrivateMariaDb } from '../../support/private-mariadb.ts';
import { processCpuSeconds } from './process-cpu.ts';

export interface StorageServer {
  server: PrivateMariaDb;
  /** The server's data directory (one folder per database inside it). */
  datadir: string;
  /** The Unix socket (the app and the benchmark's loads both use it, as `npm start` does). */
  socketPath: string;
  /** mariadbd's process id, from its pid file. */
  pid: number;
  /** CPU seconds (user + system, all threads) mariadbd has used so far. */
  cpuSeconds(): number;
  /** Writes every dirty page of the buffer pool to its file and waits until none is left. */
  flushDirtyPages(): Promise<void>;
  /** Bytes of one table's `.ibd` files (every partition), allocated on disk and apparent. */
  tableFiles(database: string, table: string): TableFiles;
}

export interface TableFiles {
  /** Blocks the filesystem allocated (stat blocks × 512, what `du --block-size=1` prints): holes punched by page compression are not counted. */
  allocated: number;
  /** Apparent file size (what `ls -l` prints): every page at full size. */
  apparent: number;
  files: number;
}

/**
 * Starts a private server whose first database is `database` (it must match `lagbook_%`; the
 * lagbook user may also create `<database>_…`). `compression` picks InnoDB's page compression
 * algorithm; 'lz4' needs Debian's mariadb-plugin-provider-lz4, which this loads.
 */
export async function startStorageServer(database: string, compression: 'zlib' | 'lz4'): Promise<StorageServer> {
  const serverArgs = compression === 'lz4' ? ['--plugin-load-add=provider_lz4', '--innodb-compression-algorithm=lz4'] : ['--innodb-compression-algorithm=zlib'];
  const server = await startPrivateMariaDb(database, { serverArgs });
  const dir = server.env.LAGBOOK_DB_DIR!;
  const pid = Number(readFileSync(join(dir, 'mysqld.pid'), 'utf8').trim());
  const datadir = join(dir, 'data');
  const active = (await server.asRoot('SELECT @@innodb_compression_algorithm')).trim();
  if (active !== compression) {
    await server.destroy();
    throw new Error(`the benchmark server runs page compression with ${active}, not ${compression}`);
  }
  return {
    server,
    datadir,
    socketPath: join(dir, 'mysqld.sock'),
    pid,
    cpuSeconds: () => processCpuSeconds(pid),
    async flushDirtyPages() {
      // Page compression happens when a page is written to its file, so sizes on disk (and the
      // CPU that compression costs) are only complete once the buffer pool holds no dirty page.
      // The page cleaner writes at most innodb_io_capacity pages a second (200 by default), which
      // would make this wait most of a phase; it writes as fast as the disk allows for the wait.
      const before = (await server.asRoot('SELECT @@innodb_max_dirty_pages_pct, @@innodb_io_capacity, @@innodb_io_capacity_max'))
        .trim()
        .split('\t')
        .map(Number);
      await server.asRoot('SET GLOBAL innodb_io_capacity_max = 100000; SET GLOBAL innodb_io_capacity = 50000; SET GLOBAL innodb_max_dirty_pages_pct = 0');
      try {
        for (let i = 0; i < 1200; i++) {
          const dirty = Number((await server.asRoot("SHOW GLOBAL STATUS LIKE 'Innodb_buffer_pool_pages_dirty'")).split('\t')[1]);
          if (dirty === 0) return;
          await new Promise((r) => setTimeout(r, 250));
        }
        throw new Error('dirty pages were still left in the buffer pool after 5 minutes');
      } finally {
        await server.asRoot(
          `SET GLOBAL innodb_max_dirty_pages_pct = ${before[0]}; SET GLOBAL innodb_io_capacity = ${before[1]}; SET GLOBAL innodb_io_capacity_max = ${before[2]}`,
        );
      }
    },
    tableFiles(db, table) {
      const folder = join(datadir, db);
      const out: TableFiles = { allocated: 0, apparent: 0, files: 0 };
      for (const name of readdirSync(folder)) {
        // a plain table is <table>.ibd; each partition of a partitioned one is <table>#P#<partition>.ibd
        if (name !== `${table}.ibd` && !(name.startsWith(`${table}#P#`) && name.endsWith('.ibd'))) continue;
        const st = statSync(join(folder, name));
        out.allocated += st.blocks * 512;
        out.apparent += st.size;
        out.files++;
      }
      return out;
    },
  };
}
