import type { Knex } from 'knex';

/** Whether quarantined_rows is already page-compressed. */
async function isCompressed(knex: Knex): Promise<boolean> {
  const [rows] = await knex.raw(
    "SELECT create_options AS o FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = 'quarantined_rows'",
  );
  return /page_compressed=('?1'?|on)/i.test(String((rows as Array<{ o: string }>)[0]?.o ?? ''));
}

/**
 * Quarantined rows are text that repeats (the batch reference, the reason, the channel name,
 * rows of one file that look alike): InnoDB page compression (`PAGE_COMPRESSED=1`, with the
 * server's `innodb_compression_algorithm`, zlib by default) stores their pages at a fraction of
 * the size where the filesystem punches holes. 50,000 bad rows through ingestion measured
 * 839 → 133 allocated bytes a row here (tests/bench/quarantine-storage.bench.ts). The table is
 * rebuilt online (ALGORITHM=INPLACE, LOCK=NONE): ingestion keeps quarantining meanwhile.
 */
export async function up(knex: Knex): Promise<void> {
  if (await isCompressed(knex)) return;
  // A server keeping every table in the system tablespace (innodb_file_per_table=0) refuses the
  // option: there the table stays as it is (the rows are still stored once, see 110305).
  const [perTable] = (await knex.raw('SELECT @@innodb_file_per_table AS on_')) as [Array<{ on_: number | string }>];
  if (Number(perTable[0]?.on_ ?? 0) !== 1) return;
  await knex.raw('ALTER TABLE quarantined_rows PAGE_COMPRESSED=1, ALGORITHM=INPLACE, LOCK=NONE');
}

export async function down(knex: Knex): Promise<void> {
  if (!(await isCompressed(knex))) return;
  await knex.raw('ALTER TABLE quarantined_rows PAGE_COMPRESSED=0, ALGORITHM=INPLACE, LOCK=NONE');
}
