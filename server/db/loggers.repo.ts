import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';

export interface Logger {
  id: number;
  name: string;
  serial: string | null;
  site: string | null;
  timezone: string;
  expectedIntervalS: number;
  createdAt: Date;
  retiredAt: Date | null;
  lastSeenAt: number | null;
}

export interface LoggerInput {
  name: string;
  serial?: string | null;
  site?: string | null;
  timezone: string;
  expectedIntervalS: number;
}

const COLUMNS = [
  'loggers.id',
  'loggers.name',
  'loggers.serial',
  'loggers.site',
  'loggers.timezone',
  'loggers.expected_interval_s as expectedIntervalS',
  'loggers.created_at as createdAt',
  'loggers.retired_at as retiredAt',
  'loggers.last_seen_at as lastSeenAt',
];

const toLogger = (r: Record<string, unknown>): Logger => ({
  id: Number(r.id),
  name: r.name as string,
  serial: (r.serial as string | null) ?? null,
  site: (r.site as string | null) ?? null,
  timezone: r.timezone as string,
  expectedIntervalS: Number(r.expectedIntervalS),
  createdAt: r.createdAt as Date,
  retiredAt: (r.retiredAt as Date | null) ?? null,
  lastSeenAt: r.lastSeenAt === null || r.lastSeenAt === undefined ? null : Number(r.lastSeenAt),
});

/** Data access for one lab's `loggers`. */
export function loggersRepo(scope: LabScope) {
  return {
    async list(opts: { includeRetired?: boolean } = {}): Promise<Logger[]> {
      const q = scope.table('loggers').orderBy('loggers.name').select(COLUMNS);
      if (!opts.includeRetired) q.whereNull('loggers.retired_at');
      return (await q).map(toLogger);
    },

    async find(id: number, opts: { lock?: boolean } = {}): Promise<Logger | null> {
      const q = scope.table('loggers').where('loggers.id', id).select(COLUMNS);
      const row = await (opts.lock ? q.forUpdate() : q).first();
      return row ? toLogger(row) : null;
    },

    async insert(input: LoggerInput): Promise<number> {
      const id = newId();
      await scope.insert('loggers', {
        id,
        name: input.name,
        serial: input.serial ?? null,
        site: input.site ?? null,
        timezone: input.timezone,
        expected_interval_s: input.expectedIntervalS,
      });
      return id;
    },

    async update(id: number, input: Partial<LoggerInput>): Promise<void> {
      const patch: Record<string, unknown> = { updated_at: new Date() };
      if (input.name !== undefined) patch.name = input.name;
      if (input.serial !== undefined) patch.serial = input.serial;
      if (input.site !== undefined) patch.site = input.site;
      if (input.timezone !== undefined) patch.timezone = input.timezone;
      if (input.expectedIntervalS !== undefined) patch.expected_interval_s = input.expectedIntervalS;
      await scope.table('loggers').where('loggers.id', id).update(patch);
    },

    async retire(id: number, at: Date): Promise<void> {
      await scope.table('loggers').where('loggers.id', id).update({ retired_at: at, updated_at: at });
    },

    /** Records that the logger reported (epoch ms), never moving the time backwards. */
    async markSeen(id: number, atMs: number): Promise<void> {
      await scope
        .table('loggers')
        .where('loggers.id', id)
        .where((w) => w.whereNull('loggers.last_seen_at').orWhere('loggers.last_seen_at', '<', atMs))
        .update({ last_seen_at: atMs });
    },
  };
}

export type LoggersRepo = ReturnType<typeof loggersRepo>;
