import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';

/** A test reading as stored, with its channel's key and its sender's name. */
export interface StoredTestReading {
  id: number;
  loggerId: number;
  channelId: number;
  channelKey: string;
  ts: number;
  value: number;
  outsideRange: boolean;
  sentBy: { id: number; name: string } | null;
  /** Epoch ms on the service clock. */
  sentAt: number;
}

export interface TestReadingInput {
  loggerId: number;
  channelId: number;
  ts: number;
  value: number;
  outsideRange: boolean;
  sentBy: number;
  sentAt: number;
}

const COLUMNS = [
  'test_readings.id',
  'test_readings.logger_id as loggerId',
  'test_readings.channel_id as channelId',
  'channels.channel_key as channelKey',
  'test_readings.ts',
  'test_readings.value',
  'test_readings.outside_range as outsideRange',
  'test_readings.sent_by as sentById',
  'sender.display_name as sentByName',
  'test_readings.sent_at as sentAt',
];

const toRow = (r: Record<string, unknown>): StoredTestReading => ({
  id: Number(r.id),
  loggerId: Number(r.loggerId),
  channelId: Number(r.channelId),
  channelKey: String(r.channelKey),
  ts: Number(r.ts),
  value: Number(r.value),
  outsideRange: Boolean(r.outsideRange),
  sentBy: r.sentById === null || r.sentByName === null ? null : { id: Number(r.sentById), name: String(r.sentByName) },
  sentAt: Number(r.sentAt),
});

/**
 * Data access for one lab's `test_readings`: readings sent by hand from a logger's page, kept
 * apart from `readings` so that rollups, diagnostics, usage and alerts never see them.
 */
export function testReadingsRepo(scope: LabScope) {
  const selected = () =>
    scope
      .table('test_readings')
      .join('channels', (j) => j.on('channels.tenant_id', 'test_readings.tenant_id').andOn('channels.id', 'test_readings.channel_id'))
      .leftJoin('users as sender', 'sender.id', 'test_readings.sent_by')
      .select(COLUMNS);
  return {
    /** Keeps one test reading; answers it as stored. */
    async insert(input: TestReadingInput): Promise<StoredTestReading> {
      const id = newId();
      await scope.insert('test_readings', {
        id,
        logger_id: input.loggerId,
        channel_id: input.channelId,
        ts: input.ts,
        value: input.value,
        outside_range: input.outsideRange,
        sent_by: input.sentBy,
        sent_at: input.sentAt,
      });
      return (await this.find(input.loggerId, id))!;
    },

    /** One test reading of a logger, or undefined (also for another logger's). */
    async find(loggerId: number, id: number): Promise<StoredTestReading | undefined> {
      const row = await selected().where('test_readings.logger_id', loggerId).where('test_readings.id', id).first();
      return row ? toRow(row) : undefined;
    },

    /** The logger's latest test readings, newest sent first. */
    async recentForLogger(loggerId: number, limit: number): Promise<StoredTestReading[]> {
      const rows = await selected()
        .where('test_readings.logger_id', loggerId)
        .orderBy([
          { column: 'test_readings.sent_at', order: 'desc' },
          { column: 'test_readings.id', order: 'desc' },
        ])
        .limit(limit);
      return rows.map(toRow);
    },

    /** A channel's test readings with `from <= ts < to`, oldest first, at most `limit`. */
    async inRange(channelId: number, range: { from: number; to: number }, limit: number): Promise<StoredTestReading[]> {
      const rows = await selected()
        .where('test_readings.channel_id', channelId)
        .where('test_readings.ts', '>=', range.from)
        .where('test_readings.ts', '<', range.to)
        .orderBy([
          { column: 'test_readings.ts', order: 'asc' },
          { column: 'test_readings.id', order: 'asc' },
        ])
        .limit(limit);
      return rows.map(toRow);
    },

    /** Removes one test reading of a logger; answers whether a row was removed. */
    async remove(loggerId: number, id: number): Promise<boolean> {
      const n = await scope.table('test_readings').where('test_readings.logger_id', loggerId).where('test_readings.id', id).delete();
      return n > 0;
    },
  };
}
