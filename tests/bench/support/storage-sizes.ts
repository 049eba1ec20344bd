/**
 * What the readings and rollups of one database cost: exact row counts, InnoDB's data + index
 * bytes (information_schema.TABLES after ANALYZE TABLE — pages at their full 16 kB, so page
 * compression does not show there) and the bytes the `.ibd` files take on disk (where it does).
 */
import type { StorageServer, TableFiles } from './storage-server.ts';

export const MEASURED_TABLES = ['readings', 'reading_rollups'] as const;
export type MeasuredTable = (typeof MEASURED_TABLES)[number];

export interface TableCost {
  rows: number;
  /** DATA_LENGTH + INDEX_LENGTH after ANALYZE TABLE. */
  dataIndex: number;
  files: TableFiles;
}

export type StorageCost = Record<MeasuredTable, TableCost>;

/** Flushes dirty pages, then counts and sizes both tables of `database`. */
export async function measureStorage(srv: StorageServer, database: string): Promise<StorageCost> {
  await srv.flushDirtyPages();
  const out = {} as StorageCost;
  for (const table of MEASURED_TABLES) {
    const q = `\`${database}\`.\`${table}\``;
    await srv.server.asRoot(`ANALYZE TABLE ${q}`);
    const [rows] = (await srv.server.asRoot(`SELECT COUNT(*) FROM ${q}`)).trim().split('\t').map(Number);
    const [data, index] = (
      await srv.server.asRoot(`SELECT DATA_LENGTH, INDEX_LENGTH FROM information_schema.TABLES WHERE TABLE_SCHEMA = '${database}' AND TABLE_NAME = '${table}'`)
    )
      .trim()
      .split('\t')
      .map(Number);
    out[table] = { rows, dataIndex: data + index, files: srv.tableFiles(database, table) };
  }
  return out;
}

/** Bytes per reading of one figure: `bytes` over the number of readings stored. */
export const perReading = (bytes: number, readings: number): number => (readings > 0 ? bytes / readings : Number.NaN);
