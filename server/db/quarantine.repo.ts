import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';

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
  'quarantined_rows.received_at as receivedAt',
];

const toRow = (r: Record<string, unknown>): QuarantinedRow => ({
  ...(r as unknown as QuarantinedRow),
  id: Number(r.id),
  loggerId: r.loggerId === null ? null : Number(r.loggerId),
  rowIndex: Number(r.rowIndex),
});

/** Data access for one lab's quarantined rows. */
export function quarantineIn(scope: LabScope) {
  return {
    async add(rows: QuarantineInput[]): Promise<void> {
      for (let i = 0; i < rows.length; i += 1000) {
        await scope.insert(
          'quarantined_rows',
          rows.slice(i, i + 1000).map((r) => ({
            id: newId(),
            logger_id: r.loggerId,
            source: r.source,
            batch_ref: r.batchRef,
            row_index: r.rowIndex,
            reason_code: r.reasonCode,
            reason: cut(r.reason, 255),
            channel_key: cut(r.channelKey, 191),
            ts_raw: cut(r.tsRaw, 191),
            value_raw: cut(r.valueRaw, 191),
            raw: cut(r.raw, 4000),
          })),
        );
      }
    },

    async list(filter: { loggerId?: number; reasonCode?: string; page: number; pageSize: number }): Promise<{ rows: QuarantinedRow[]; total: number }> {
      const filtered = () => {
        const q = scope.table('quarantined_rows');
        if (filter.loggerId) q.where('quarantined_rows.logger_id', filter.loggerId);
        if (filter.reasonCode) q.where('quarantined_rows.reason_code', filter.reasonCode);
        return q;
      };
      const [{ n }] = await filtered().count({ n: '*' });
      const rows = await filtered()
        .orderBy([{ column: 'quarantined_rows.received_at', order: 'desc' }, { column: 'quarantined_rows.row_index', order: 'asc' }])
        .limit(filter.pageSize)
        .offset((filter.page - 1) * filter.pageSize)
        .select(COLUMNS);
      return { rows: rows.map(toRow), total: Number(n) };
    },

    async findMany(ids: number[]): Promise<QuarantinedRow[]> {
      if (ids.length === 0) return [];
      return (await scope.table('quarantined_rows').whereIn('quarantined_rows.id', ids).select(COLUMNS)).map(toRow);
    },

    async remove(ids: number[]): Promise<number> {
      if (ids.length === 0) return 0;
      return scope.table('quarantined_rows').whereIn('quarantined_rows.id', ids).delete();
    },

    async count(): Promise<number> {
      const [{ n }] = await scope.table('quarantined_rows').count({ n: '*' });
      return Number(n);
    },
  };
}

export type QuarantineRepo = ReturnType<typeof quarantineIn>;
