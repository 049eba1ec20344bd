import type { Knex } from 'knex';
import { executeArrays } from './execute-arrays.ts';

/**
 * Tables whose rows belong to one lab and carry `tenant_id`. Adding a lab-owned table means
 * adding its name here; nothing else may query it. The migrations API test checks that this
 * list is exactly the set of tables with a `tenant_id` column, and the isolation suite compares
 * every one of them byte for byte.
 */
export const LAB_OWNED_TABLES = [
  'memberships',
  'invitations',
  'audit_events',
  'loggers',
  'channels',
  'ingest_keys',
  'readings',
  'reading_rollups',
  'quarantined_rows',
  'quarantine_bulk_runs',
  'alert_rules',
  'alert_subscriptions',
  'alerts',
  'notification_outbox',
  'personal_tokens',
  'lab_billing',
  'usage_snapshots',
  'test_readings',
  'note_kinds',
  'notes',
] as const;

export type LabOwnedTable = (typeof LAB_OWNED_TABLES)[number];

export type DbOrTrx = Knex | Knex.Transaction;

/**
 * The placeholder that stands for the lab's id in raw SQL run through a scope
 * (`WHERE readings.tenant_id = :lab AND …`). The scope binds the id there; a repo never passes it.
 */
export const LAB_PLACEHOLDER = ':lab';

/** `:lab` as a whole word, a `?`/`??` placeholder, or a `\?` (knex's escaped question mark). */
const PLACEHOLDERS = /\\\?|\?\??|:lab\b/g;
/** A tenant column compared with a hand-passed value: what `:lab` replaces. */
const HAND_BOUND_TENANT = /tenant_id\s*(?:=|<=>|IN\s*\()\s*\?/i;

/**
 * Turns SQL that names the lab as `:lab` into SQL with `?` there and the lab's id inserted into
 * `bindings` at the matching positions. Throws when the statement never names the lab, binds a
 * tenant column by hand, or has more or fewer `?` than `bindings` — a raw statement on lab-owned
 * tables cannot forget its lab or take someone else's.
 */
export function bindLab(sql: string, bindings: readonly unknown[], tenantId: number): { sql: string; bindings: unknown[] } {
  if (HAND_BOUND_TENANT.test(sql)) throw new Error('scope.raw: compare tenant_id with :lab, not with a bound value');
  const out: unknown[] = [];
  let next = 0;
  let named = 0;
  const text = sql.replace(PLACEHOLDERS, (token) => {
    if (token === LAB_PLACEHOLDER) {
      named++;
      out.push(tenantId);
      return '?';
    }
    if (token !== '\\?') {
      if (next >= bindings.length) throw new Error(`scope.raw: the statement has more placeholders than the ${bindings.length} binding(s) given`);
      out.push(bindings[next++]);
    }
    return token;
  });
  if (named === 0) throw new Error('scope.raw: the statement must name the lab as :lab');
  if (next !== bindings.length) throw new Error(`scope.raw: ${bindings.length} binding(s) given for ${next} placeholder(s)`);
  return { sql: text, bindings: out };
}

/**
 * The one choke point for lab-owned data: every query on a lab-owned table starts here,
 * already limited to one lab, and every insert gets that lab's id stamped on. The scope carries
 * its connection or transaction (`db`), so a repo built on it needs nothing else. Routes and
 * services never write `where('tenant_id', …)`, and repos never bind a tenant id by hand.
 */
export function inLab(db: DbOrTrx, tenantId: number) {
  if (!Number.isSafeInteger(tenantId) || tenantId <= 0) {
    throw new Error(`inLab: tenantId must be a positive integer (got ${String(tenantId)})`);
  }
  return {
    tenantId,
    /** The connection or transaction this scope's statements run on. */
    db,
    /** A query builder on `table`, limited to this lab's rows. */
    table(table: LabOwnedTable): Knex.QueryBuilder {
      return db(table).where(`${table}.tenant_id`, tenantId);
    },
    /** Inserts rows into `table` with this lab's tenant_id (any tenant_id given is overwritten). */
    insert(table: LabOwnedTable, rows: Record<string, unknown> | Record<string, unknown>[]) {
      const list = Array.isArray(rows) ? rows : [rows];
      return db(table).insert(list.map((r) => ({ ...r, tenant_id: tenantId })));
    },
    /**
     * A raw statement (text protocol) on this scope's connection, with `:lab` bound to this
     * lab's id (see {@link bindLab}); `?` take `bindings` in order, as with `knex.raw`.
     */
    raw(sql: string, bindings: readonly unknown[] = []): Knex.Raw {
      const bound = bindLab(sql, bindings, tenantId);
      return db.raw(bound.sql, bound.bindings as Knex.RawBinding[]);
    },
    /**
     * A read as a prepared statement whose rows come back as arrays (binary protocol: exact
     * doubles, see execute-arrays.ts), with `:lab` bound to this lab's id like {@link raw}.
     */
    arrays(sql: string, bindings: readonly unknown[] = []): Promise<unknown[][]> {
      const bound = bindLab(sql, bindings, tenantId);
      return executeArrays(db, bound.sql, bound.bindings);
    },
  };
}

export type LabScope = ReturnType<typeof inLab>;
