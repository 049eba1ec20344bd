import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';
import { finestRollupSql } from './rollup-levels.ts';

export interface Channel {
  id: number;
  loggerId: number;
  key: string;
  label: string;
  unit: string;
  quantity: string;
  validMin: number | null;
  validMax: number | null;
  expectedIntervalS: number | null;
  seasonalPeriodHint: number | null;
  retiredAt: Date | null;
}

export interface ChannelInput {
  key: string;
  label: string;
  unit?: string;
  quantity?: string;
  validMin?: number | null;
  validMax?: number | null;
  expectedIntervalS?: number | null;
  seasonalPeriodHint?: number | null;
}

/** The channel columns every channel query selects (shared with channel-state.repo.ts). */
export const CHANNEL_COLUMNS = [
  'channels.id',
  'channels.logger_id as loggerId',
  'channels.channel_key as key',
  'channels.label',
  'channels.unit',
  'channels.quantity',
  'channels.valid_min as validMin',
  'channels.valid_max as validMax',
  'channels.expected_interval_s as expectedIntervalS',
  'channels.seasonal_period_hint as seasonalPeriodHint',
  'channels.retired_at as retiredAt',
];

const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));
/** A selected row as a Channel. */
export const toChannel = (r: Record<string, unknown>): Channel => ({
  id: Number(r.id),
  loggerId: Number(r.loggerId),
  key: r.key as string,
  label: r.label as string,
  unit: r.unit as string,
  quantity: r.quantity as string,
  validMin: num(r.validMin),
  validMax: num(r.validMax),
  expectedIntervalS: num(r.expectedIntervalS),
  seasonalPeriodHint: num(r.seasonalPeriodHint),
  retiredAt: (r.retiredAt as Date | null) ?? null,
});

function columnsOf(input: Partial<ChannelInput>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  if (input.key !== undefined) out.channel_key = input.key;
  if (input.label !== undefined) out.label = input.label;
  if (input.unit !== undefined) out.unit = input.unit;
  if (input.quantity !== undefined) out.quantity = input.quantity;
  if (input.validMin !== undefined) out.valid_min = input.validMin;
  if (input.validMax !== undefined) out.valid_max = input.validMax;
  if (input.expectedIntervalS !== undefined) out.expected_interval_s = input.expectedIntervalS;
  if (input.seasonalPeriodHint !== undefined) out.seasonal_period_hint = input.seasonalPeriodHint;
  return out;
}

/** Data access for one lab's `channels`. */
export function channelsRepo(scope: LabScope) {
  return {
    async listForLogger(loggerId: number, opts: { includeRetired?: boolean } = {}): Promise<Channel[]> {
      const q = scope.table('channels').where('channels.logger_id', loggerId).orderBy('channels.channel_key').select(CHANNEL_COLUMNS);
      if (!opts.includeRetired) q.whereNull('channels.retired_at');
      return (await q).map(toChannel);
    },

    async list(): Promise<Channel[]> {
      return (await scope.table('channels').whereNull('channels.retired_at').orderBy('channels.label').select(CHANNEL_COLUMNS)).map(toChannel);
    },

    async find(id: number): Promise<Channel | null> {
      const row = await scope.table('channels').where('channels.id', id).first(CHANNEL_COLUMNS);
      return row ? toChannel(row) : null;
    },

    /**
     * Adds a channel. Its finest kept rollup level follows its reporting interval (its own, else
     * its logger's) from the start: a new channel has no readings, so no level needs building.
     */
    async insert(loggerId: number, input: ChannelInput): Promise<number> {
      const id = newId();
      await scope.insert('channels', { id, logger_id: loggerId, ...columnsOf({ unit: '', quantity: '', ...input }) });
      await scope.raw(
        `UPDATE channels c JOIN loggers l ON l.tenant_id = c.tenant_id AND l.id = c.logger_id
         SET c.finest_rollup_s = ${finestRollupSql('COALESCE(c.expected_interval_s, l.expected_interval_s)')}
         WHERE c.tenant_id = :lab AND c.id = ?`,
        [id],
      );
      return id;
    },

    async update(id: number, input: Partial<ChannelInput>): Promise<void> {
      await scope
        .table('channels')
        .where('channels.id', id)
        .update({ ...columnsOf(input), updated_at: new Date() });
    },

    async retire(id: number, at: Date): Promise<void> {
      await scope.table('channels').where('channels.id', id).update({ retired_at: at, updated_at: at });
    },
  };
}

export type ChannelsRepo = ReturnType<typeof channelsRepo>;
