import type { Db } from './create-db.ts';

/** What the database server says about where and how it stores files (for the start-up storage check). */
export interface ServerStorageFacts {
  /** `@@datadir`, as the server sees it. */
  dataDir: string;
  /** `Innodb_have_punch_hole`: the server was built able to punch holes (page compression needs it to save space). */
  serverCanPunch: boolean;
  /** `@@innodb_compression_algorithm` (zlib unless a provider plugin is configured). */
  compressionAlgorithm: string;
}

/** Reads the facts; needs no privilege beyond a connection. */
export async function serverStorageFacts(db: Db): Promise<ServerStorageFacts> {
  const [vars] = (await db.raw('SELECT @@datadir AS dataDir, @@innodb_compression_algorithm AS algorithm')) as [Array<{ dataDir: string; algorithm: string }>];
  const [status] = (await db.raw("SHOW GLOBAL STATUS LIKE 'Innodb_have_punch_hole'")) as [Array<{ Value: string }>];
  return { dataDir: vars[0].dataDir, serverCanPunch: status[0]?.Value === 'ON', compressionAlgorithm: vars[0].algorithm };
}
