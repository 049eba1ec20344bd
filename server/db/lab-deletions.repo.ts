import type { DbOrTrx, LabOwnedTable, LabScope } from './tenant-scope.ts';

/** One lab deletion as recorded outside the lab (table `lab_deletions`, not lab-owned). */
export interface LabDeletionRecord {
  id: number;
  labId: number;
  labSlug: string;
  labName: string;
  requestedByUserId: number | null;
  requestedByName: string;
  requestedByEmail: string;
  requestedAt: Date;
  stripeSubscriptionId: string | null;
  /** When the job may start removing rows (the subscription is settled); null while the request runs. */
  readyAt: Date | null;
  /** Rows removed so far, per lab-owned table (the job adds each batch in the batch's transaction). */
  rowsRemoved: Record<string, number>;
  finishedAt: Date | null;
  lastError: string | null;
}

const toRecord = (r: Record<string, unknown>): LabDeletionRecord => ({
  id: Number(r.id),
  labId: Number(r.lab_id),
  labSlug: r.lab_slug as string,
  labName: r.lab_name as string,
  requestedByUserId: r.requested_by_user_id === null ? null : Number(r.requested_by_user_id),
  requestedByName: r.requested_by_name as string,
  requestedByEmail: r.requested_by_email as string,
  requestedAt: r.requested_at as Date,
  stripeSubscriptionId: (r.stripe_subscription_id as string | null) ?? null,
  readyAt: (r.ready_at as Date | null) ?? null,
  rowsRemoved: JSON.parse(String(r.rows_removed)) as Record<string, number>,
  finishedAt: (r.finished_at as Date | null) ?? null,
  lastError: (r.last_error as string | null) ?? null,
});

/**
 * Data access for `lab_deletions`, the record of deleted labs kept outside any lab (on `db`, a
 * connection or a transaction), and the lab-row end of a deletion.
 */
export function labDeletionsRepo(db: DbOrTrx) {
  return {
    /** Records a deletion just requested (not ready for the job yet, no rows removed); returns its id. */
    async insert(input: Omit<LabDeletionRecord, 'id' | 'stripeSubscriptionId' | 'readyAt' | 'rowsRemoved' | 'finishedAt' | 'lastError'>): Promise<number> {
      const [id] = await db('lab_deletions').insert({
        lab_id: input.labId,
        lab_slug: input.labSlug,
        lab_name: input.labName,
        requested_by_user_id: input.requestedByUserId,
        requested_by_name: input.requestedByName,
        requested_by_email: input.requestedByEmail,
        requested_at: input.requestedAt,
        rows_removed: '{}',
      });
      return Number(id);
    },

    /** Hands the deletion to the job, noting the subscription cancelled (if any). */
    async markReady(id: number, at: Date, stripeSubscriptionId: string | null): Promise<void> {
      await db('lab_deletions').where({ id }).update({ ready_at: at, stripe_subscription_id: stripeSubscriptionId });
    },

    /** Forgets a deletion the request could not complete (Stripe failed before anything was removed). */
    async withdraw(id: number): Promise<void> {
      await db('lab_deletions').where({ id }).whereNull('ready_at').delete();
    },

    /** Deletions whose request stopped before handing them to the job (requested before `before`, still not ready). */
    async stalled(before: Date): Promise<LabDeletionRecord[]> {
      return (await db('lab_deletions').whereNull('ready_at').where('requested_at', '<', before).orderBy('id')).map(toRecord);
    },

    /** Deletions ready for the job whose rows are not all removed yet, oldest first: the deletion job's work list. */
    async unfinished(): Promise<LabDeletionRecord[]> {
      return (await db('lab_deletions').whereNotNull('ready_at').whereNull('finished_at').orderBy('id')).map(toRecord);
    },

    /** Every deletion recorded for a lab id (normally one). */
    async forLab(labId: number): Promise<LabDeletionRecord[]> {
      return (await db('lab_deletions').where({ lab_id: labId }).orderBy('id')).map(toRecord);
    },

    /** Adds `count` rows of `table` to the record's tally (locks the record row until the transaction ends). */
    async addRemoved(id: number, table: string, count: number): Promise<void> {
      const row = await db('lab_deletions').where({ id }).forUpdate().first('rows_removed');
      const tally = JSON.parse(String(row.rows_removed)) as Record<string, number>;
      tally[table] = (tally[table] ?? 0) + count;
      await db('lab_deletions')
        .where({ id })
        .update({ rows_removed: JSON.stringify(tally) });
    },

    /** Notes why the last run stopped (kept until the job finishes the deletion). */
    async setError(id: number, message: string): Promise<void> {
      await db('lab_deletions')
        .where({ id })
        .update({ last_error: message.slice(0, 2000) });
    },

    /** Marks the deletion finished at `at`. */
    async finish(id: number, at: Date): Promise<void> {
      await db('lab_deletions').where({ id }).update({ finished_at: at, last_error: null });
    },

    /** Removes the `labs` row of a lab marked deleted (never a lab in use); false if it is gone already. */
    async removeDeletedLab(labId: number): Promise<boolean> {
      return (await db('labs').where({ id: labId }).whereNotNull('deleted_at').delete()) === 1;
    },
  };
}

/**
 * The lab-owned end of a deletion, on one lab's scope: removes up to `limit` of the lab's rows
 * of `table` in one statement (`DELETE … LIMIT`: row locks on this lab's index range only, so
 * other labs keep working), and tells whether any are left.
 */
export function labRowsRepo(scope: LabScope) {
  return {
    /** Removes at most `limit` rows of the lab from `table`; returns how many went. */
    async removeBatch(table: LabOwnedTable, limit: number): Promise<number> {
      const [result] = await scope.raw('DELETE FROM ?? WHERE ??.tenant_id = :lab LIMIT ?', [table, table, limit]);
      return Number((result as { affectedRows?: number }).affectedRows ?? 0);
    },

    /** Whether the lab still has any row in `table`. */
    async hasRows(table: LabOwnedTable): Promise<boolean> {
      return (await scope.table(table).first(scope.db.raw('1 as present'))) !== undefined;
    },
  };
}
