import type { Knex } from 'knex';

/**
 * Indexes for keyset pagination of a lab's quarantine (newest first, a batch's rows in their
 * order): `(tenant_id, [logger_id | reason_code,] received_at DESC, row_index, id)` matches the
 * list's ORDER BY, so a page is read straight from the index however deep it is, instead of
 * skipping OFFSET rows. They replace the two `(…, received_at)` indexes, whose order they cover.
 */
const INDEXES = [
  { name: 'quarantine_recent_index', columns: 'tenant_id, received_at DESC, row_index, id' },
  { name: 'quarantine_logger_recent_index', columns: 'tenant_id, logger_id, received_at DESC, row_index, id' },
  { name: 'quarantine_reason_recent_index', columns: 'tenant_id, reason_code, received_at DESC, row_index, id' },
];
const OLD = [
  { name: 'quarantine_logger_index', columns: ['tenant_id', 'logger_id', 'received_at'] },
  { name: 'quarantine_reason_index', columns: ['tenant_id', 'reason_code', 'received_at'] },
];

async function hasIndex(knex: Knex, name: string): Promise<boolean> {
  const [rows] = await knex.raw('SHOW INDEX FROM quarantined_rows WHERE Key_name = ?', [name]);
  return (rows as unknown[]).length > 0;
}

export async function up(knex: Knex): Promise<void> {
  for (const ix of INDEXES) if (!(await hasIndex(knex, ix.name))) await knex.raw(`CREATE INDEX ${ix.name} ON quarantined_rows (${ix.columns})`);
  for (const ix of OLD) if (await hasIndex(knex, ix.name)) await knex.raw(`DROP INDEX ${ix.name} ON quarantined_rows`);
}

export async function down(knex: Knex): Promise<void> {
  for (const ix of OLD) if (!(await hasIndex(knex, ix.name))) await knex.raw(`CREATE INDEX ${ix.name} ON quarantined_rows (${ix.columns.join(', ')})`);
  for (const ix of INDEXES) if (await hasIndex(knex, ix.name)) await knex.raw(`DROP INDEX ${ix.name} ON quarantined_rows`);
}
