import type { Knex } from 'knex';

/**
 * Tables whose rows belong to one lab and carry `tenant_id`. Adding a lab-owned table
 * means adding its name here; nothing else may query it.
 */
export type LabOwnedTable =
  | 'memberships'
  | 'invitations'
  | 'audit_events'
  | 'loggers'
  | 'channels'
  | 'ingest_keys'
  | 'readings'
  | 'reading_rollups'
  | 'quarantined_rows'
  | 'alert_rules'
  | 'alert_subscriptions'
  | 'alerts'
  | 'notification_outbox'
  | 'personal_tokens'
  | 'lab_billing'
  | 'usage_snapshots';

export type DbOrTrx = Knex | Knex.Transaction;

/**
 * The one choke point for lab-owned data: every query on a lab-owned table starts here,
 * already limited to one lab, and every insert gets that lab's id stamped on. Routes and
 * services never write `where('tenant_id', …)` themselves.
 */
export function inLab(db: DbOrTrx, tenantId: number) {
  if (!Number.isSafeInteger(tenantId) || tenantId <= 0) {
    throw new Error(`inLab: tenantId must be a positive integer (got ${String(tenantId)})`);
  }
  return {
    tenantId,
    /** A query builder on `table`, limited to this lab's rows. */
    table(table: LabOwnedTable): Knex.QueryBuilder {
      return db(table).where(`${table}.tenant_id`, tenantId);
    },
    /** Inserts rows into `table` with this lab's tenant_id (any tenant_id given is overwritten). */
    insert(table: LabOwnedTable, rows: Record<string, unknown> | Record<string, unknown>[]) {
      const list = Array.isArray(rows) ? rows : [rows];
      return db(table).insert(list.map((r) => ({ ...r, tenant_id: tenantId })));
    },
  };
}

export type LabScope = ReturnType<typeof inLab>;
