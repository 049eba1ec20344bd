import type { LabScope } from './tenant-scope.ts';

/** What a lab uses, against which plans are limited. */
export interface UsageCounts {
  readings: number;
  loggers: number;
  members: number;
}

/** One day of the usage trend. */
export interface UsageSnapshot extends UsageCounts {
  /** UTC day, `YYYY-MM-DD`. */
  day: string;
}

const dayOf = (v: unknown): string => (v instanceof Date ? v.toISOString().slice(0, 10) : String(v).slice(0, 10));

/** Data access for one lab's usage: exact counts and the daily snapshots. */
export function usageRepo(scope: LabScope) {
  return {
    /**
     * Stored readings, exactly: the sum of the lab's per-channel counters
     * (`channels.stored_readings`), which the ingestion transaction keeps equal to each
     * channel's rows in `readings` (and whatever deletes readings moves down in its own
     * transaction). A keyed read of the lab's channel rows — the primary key leads with
     * `tenant_id` — so it touches one row per channel, never the readings or their rollups.
     */
    async storedReadings(): Promise<number> {
      const row = await scope.table('channels').sum({ n: 'channels.stored_readings' }).first();
      return Number(row?.n ?? 0);
    },

    /** Loggers registered and not retired. */
    async activeLoggers(): Promise<number> {
      const row = await scope.table('loggers').whereNull('loggers.retired_at').count({ n: '*' }).first();
      return Number(row?.n ?? 0);
    },

    /** Members plus invitations still pending (each may become a member). */
    async seatsTaken(now: Date): Promise<number> {
      const members = await scope.table('memberships').count({ n: '*' }).first();
      const pending = await scope
        .table('invitations')
        .whereNull('invitations.accepted_at')
        .whereNull('invitations.revoked_at')
        .where('invitations.expires_at', '>', now)
        .count({ n: '*' })
        .first();
      return Number(members?.n ?? 0) + Number(pending?.n ?? 0);
    },

    /** Writes (or overwrites) the lab's snapshot for one UTC day. */
    async saveSnapshot(day: string, counts: UsageCounts): Promise<void> {
      await scope
        .insert('usage_snapshots', { day, readings: counts.readings, loggers: counts.loggers, members: counts.members })
        .onConflict(['tenant_id', 'day'])
        .merge(['readings', 'loggers', 'members']);
    },

    /** Snapshots from `fromDay` (inclusive), oldest first. */
    async snapshotsSince(fromDay: string): Promise<UsageSnapshot[]> {
      const rows = await scope
        .table('usage_snapshots')
        .where('usage_snapshots.day', '>=', fromDay)
        .orderBy('usage_snapshots.day')
        .select('usage_snapshots.day', 'readings', 'loggers', 'members');
      // DATE comes back as UTC midnight (the pool runs with timezone 'Z')
      return rows.map((r: Record<string, unknown>) => ({
        day: dayOf(r.day),
        readings: Number(r.readings),
        loggers: Number(r.loggers),
        members: Number(r.members),
      }));
    },
  };
}

export type UsageRepo = ReturnType<typeof usageRepo>;
