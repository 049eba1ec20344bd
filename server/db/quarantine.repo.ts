import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';
import { readCopies, storedCopies } from './quarantine-copies.ts';

/** Where a reading came in: the ingest API, a file upload, or a re-submit from quarantine. */
export type ReadingSource = 'api' | 'upload' | 'resubmit';

export interface QuarantineInput {
  loggerId: number | null;
  source: ReadingSource;
  batchRef: string;
  rowIndex: number;
  reasonCode: string;
  reason: string;
  channelKey?: string | null;
  tsRaw?: string | null;
  valueRaw?: string | null;
  raw?: string | null;
}

export interface QuarantinedRow {
  id: number;
  loggerId: number | null;
  source: ReadingSource;
  batchRef: string | null;
  rowIndex: number;
  reasonCode: string;
  reason: string;
  channelKey: string | null;
  tsRaw: string | null;
  valueRaw: string | null;
  raw: string | null;
  receivedAt: Date;
}

const cut = (s: string | null | undefined, n: number) => (s === null || s === undefined ? null : s.length > n ? s.slice(0, n) : s);

const COLUMNS = [
  'quarantined_rows.id',
  'quarantined_rows.logger_id as loggerId',
  'quarantined_rows.source',
  'quarantined_rows.batch_ref as batchRef',
  'quarantined_rows.row_index as rowIndex',
  'quarantined_rows.reason_code as reasonCode',
  'quarantined_rows.reason',
  'quarantined_rows.channel_key as channelKey',
  'quarantined_rows.ts_raw as tsRaw',
  'quarantined_rows.value_raw as valueRaw',
  'quarantined_rows.raw',
  'quarantined_rows.copied_fields as copiedFields',
  'quarantined_rows.received_at as receivedAt',
];

/** A selected row as a QuarantinedRow: the time and value read back from `raw` where they are copies of it (quarantine-copies.ts). */
const toRow = (r: Record<string, unknown>): QuarantinedRow => {
  const { copiedFields, ...rest } = r;
  const raw = (r.raw as string | null) ?? null;
  const copies = readCopies({
    raw,
    tsRaw: (r.tsRaw as string | null) ?? null,
    valueRaw: (r.valueRaw as string | null) ?? null,
    copiedFields: Number(copiedFields ?? 0),
  });
  return {
    ...(rest as unknown as QuarantinedRow),
    id: Number(r.id),
    loggerId: r.loggerId === null ? null : Number(r.loggerId),
    rowIndex: Number(r.rowIndex),
    tsRaw: copies.tsRaw,
    valueRaw: copies.valueRaw,
  };
};

/** Where a page of the quarantine list ends: the sort key of its last row. */
export interface QuarantineCursor {
  receivedAt: Date;
  rowIndex: number;
  id: number;
}

export interface QuarantineFilter {
  loggerId?: number;
  reasonCode?: string;
  /** The channel name as received. */
  channelKey?: string;
  source?: string;
  /** Received at or after. */
  receivedFrom?: Date;
  /** Received before. */
  receivedTo?: Date;
}

/** The list's order: newest first, a batch's rows in their order (matches the `quarantine_*recent_index` indexes). */
const LIST_ORDER: Array<{ column: string; order: 'asc' | 'desc' }> = [
  { column: 'quarantined_rows.received_at', order: 'desc' },
  { column: 'quarantined_rows.row_index', order: 'asc' },
  { column: 'quarantined_rows.id', order: 'asc' },
];

/** A count of matching rows stops here, so a list request never walks a large quarantine (the page says "10,000 or more"). */
export const QUARANTINE_COUNT_LIMIT = 10_000;

/**
 * Data access for one lab's quarantined rows. `add` and `remove` also keep the lab's
 * `lab_billing.quarantined_count` in step, in the caller's transaction, so the plan's
 * quarantine cap is checked and shown without counting rows.
 */
export function quarantineRepo(scope: LabScope) {
  const filtered = (filter: QuarantineFilter) => {
    const q = scope.table('quarantined_rows');
    if (filter.loggerId) q.where('quarantined_rows.logger_id', filter.loggerId);
    if (filter.reasonCode) q.where('quarantined_rows.reason_code', filter.reasonCode);
    if (filter.channelKey) q.where('quarantined_rows.channel_key', filter.channelKey);
    if (filter.source) q.where('quarantined_rows.source', filter.source);
    if (filter.receivedFrom) q.where('quarantined_rows.received_at', '>=', filter.receivedFrom);
    if (filter.receivedTo) q.where('quarantined_rows.received_at', '<', filter.receivedTo);
    return q;
  };

  return {
    /**
     * Writes quarantined rows and adds them to the lab's count (the billing row exists once plan
     * limits counted the batch). The row's text is kept once: a time or value that is a plain
     * copy of a field of it is not stored again (see quarantine-copies.ts).
     */
    async add(rows: QuarantineInput[]): Promise<void> {
      for (let i = 0; i < rows.length; i += 1000) {
        await scope.insert(
          'quarantined_rows',
          rows.slice(i, i + 1000).map((r) => {
            const kept = storedCopies(cut(r.raw, 4000), cut(r.tsRaw, 191), cut(r.valueRaw, 191));
            return {
              id: newId(),
              logger_id: r.loggerId,
              source: r.source,
              batch_ref: r.batchRef,
              row_index: r.rowIndex,
              reason_code: r.reasonCode,
              reason: cut(r.reason, 255),
              channel_key: cut(r.channelKey, 191),
              ts_raw: kept.tsRaw,
              value_raw: kept.valueRaw,
              raw: kept.raw,
              copied_fields: kept.copiedFields,
            };
          }),
        );
      }
      if (rows.length > 0) await scope.table('lab_billing').increment('quarantined_count', rows.length);
    },

    /**
     * One page of the list, newest first and a batch's rows in their order, after `cursor`
     * (keyset pagination on `(received_at DESC, row_index, id)`, read from the
     * `quarantine_*recent_index` indexes however deep the page). `nextCursor` is null on the
     * last page.
     */
    async page(
      filter: QuarantineFilter & { after?: QuarantineCursor; pageSize: number },
    ): Promise<{ rows: QuarantinedRow[]; nextCursor: QuarantineCursor | null }> {
      const q = filtered(filter);
      const c = filter.after;
      if (c) {
        q.where('quarantined_rows.received_at', '<=', c.receivedAt).andWhere((w) =>
          w
            .where('quarantined_rows.received_at', '<', c.receivedAt)
            .orWhere((same) =>
              same
                .where('quarantined_rows.row_index', '>', c.rowIndex)
                .orWhere((tie) => tie.where('quarantined_rows.row_index', c.rowIndex).andWhere('quarantined_rows.id', '>', c.id)),
            ),
        );
      }
      const rows = (
        await q
          .orderBy(LIST_ORDER)
          .limit(filter.pageSize + 1)
          .select(COLUMNS)
      ).map(toRow);
      const more = rows.length > filter.pageSize;
      if (more) rows.length = filter.pageSize;
      const last = rows[rows.length - 1];
      return { rows, nextCursor: more ? { receivedAt: last.receivedAt, rowIndex: last.rowIndex, id: last.id } : null };
    },

    /**
     * Matching rows, counted from the index up to `QUARANTINE_COUNT_LIMIT` (`atLeast` when the
     * count stopped there), so a lab with a huge backlog never makes the list scan it all.
     */
    async countUpTo(filter: QuarantineFilter): Promise<{ count: number; atLeast: boolean }> {
      const inner = filtered(filter).select('quarantined_rows.id').limit(QUARANTINE_COUNT_LIMIT);
      const row = await scope.table('quarantined_rows').client.queryBuilder().count({ n: '*' }).from(inner.as('matching')).first();
      const count = Number(row?.n ?? 0);
      return { count, atLeast: count >= QUARANTINE_COUNT_LIMIT };
    },

    async findMany(ids: number[], opts: { lock?: boolean } = {}): Promise<QuarantinedRow[]> {
      const found: QuarantinedRow[] = [];
      for (let i = 0; i < ids.length; i += 1000) {
        const q = scope
          .table('quarantined_rows')
          .whereIn('quarantined_rows.id', ids.slice(i, i + 1000))
          .select(COLUMNS);
        if (opts.lock) q.forUpdate();
        found.push(...(await q).map(toRow));
      }
      return found;
    },

    /**
     * The ids of the rows matching `filter`, in the list's order, at most `limit` of them (ask
     * for one more than you accept to tell "too many").
     */
    async idsMatching(filter: QuarantineFilter, limit: number): Promise<number[]> {
      const rows = await filtered(filter).orderBy(LIST_ORDER).limit(limit).select('quarantined_rows.id');
      return rows.map((r: { id: unknown }) => Number(r.id));
    },

    /** Locks the lab's billing row, which keeps the count of quarantined rows, until the transaction ends. */
    async lockCount(): Promise<void> {
      await scope.table('lab_billing').forUpdate().first('lab_billing.tenant_id');
    },

    /**
     * Deletes rows and takes them off the lab's count. The lab's billing row is locked first,
     * in the same order an ingest batch takes its locks, so a removal and a batch never deadlock.
     */
    async remove(ids: number[]): Promise<number> {
      if (ids.length === 0) return 0;
      await this.lockCount();
      let removed = 0;
      for (let i = 0; i < ids.length; i += 1000) {
        removed += Number(
          await scope
            .table('quarantined_rows')
            .whereIn('quarantined_rows.id', ids.slice(i, i + 1000))
            .delete(),
        );
      }
      if (removed > 0) {
        const taken = await scope.table('lab_billing').where('lab_billing.quarantined_count', '>=', removed).decrement('quarantined_count', removed);
        if (!taken) await scope.table('lab_billing').update({ quarantined_count: 0 });
      }
      return removed;
    },

    /** Every quarantined row of the lab, counted (tests and operators; the billing page reads the kept count). */
    async count(): Promise<number> {
      const [{ n }] = await scope.table('quarantined_rows').count({ n: '*' });
      return Number(n);
    },
  };
}

export type QuarantineRepo = ReturnType<typeof quarantineRepo>;
