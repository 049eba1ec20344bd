import type { ReadingRemoval } from '../billing/plan-catalog.ts';

const DAY_MS = 86_400_000;

/** The horizon of a lab whose plan keeps every reading: nothing lies before it. */
export const KEEP_EVERYTHING = Number.NEGATIVE_INFINITY;

/** What decides a lab's horizon: its effective plan's history and removal policy. */
export interface HorizonPolicy {
  historyDays: number;
  readingRemoval: ReadingRemoval;
  /**
   * When the lab's effective plan took effect (epoch ms; see `planInForceSince`). Removal waits
   * the plan's export days after it, so a lab that has just moved onto a removing plan (a
   * downgrade, a payment grace ending) has that long to export before anything goes. Omitted:
   * the plan has always been in force.
   */
  inForceSinceMs?: number;
}

/** The first moment a removing plan may remove anything for a lab: its export days after the plan took effect. */
export function removalStartsAt(policy: HorizonPolicy): number {
  return (policy.inForceSinceMs ?? Number.NEGATIVE_INFINITY) + policy.readingRemoval.exportDays * DAY_MS;
}

/**
 * The removal horizon of a lab: readings strictly before it may be removed from storage, none at
 * or after it ever is. For a plan that removes, the start of the UTC day holding
 * `now − (historyDays + exportDays)` days — rounded down to a whole UTC day so that no rollup
 * bucket (a minute, an hour, a day: all divide a day and start on multiples of their length
 * from the epoch) straddles it, and the rollups before it can go whole while the ones after it stay
 * exact. `KEEP_EVERYTHING` (−∞) for a plan that keeps every reading, and until the plan's export
 * days have passed since it took effect (`removalStartsAt`).
 */
export function removalHorizon(policy: HorizonPolicy, nowMs: number): number {
  if (!policy.readingRemoval.enabled) return KEEP_EVERYTHING;
  if (nowMs < removalStartsAt(policy)) return KEEP_EVERYTHING;
  const cut = nowMs - (policy.historyDays + policy.readingRemoval.exportDays) * DAY_MS;
  return Math.floor(cut / DAY_MS) * DAY_MS;
}

/** A partition of `readings` as the planner needs it: its upper bound and the labs holding rows in it. */
export interface PartitionForPlan {
  name: string;
  kind: 'before' | 'month' | 'future';
  /** Exclusive upper bound of the partition's times (epoch ms). */
  monthEnd: number;
  /** Labs with at least one reading in the partition. */
  labIds: readonly number[];
}

/** What one retention run does, in order: drop these partitions whole, then prune these labs by batches. */
export interface RetentionPlan {
  /** Partitions (oldest first) every reading of which lies before the horizon of the lab it belongs to. */
  dropPartitions: string[];
  /** Labs whose plan removes, with the time before which their remaining readings go. */
  prune: Array<{ labId: number; beforeMs: number }>;
}

/**
 * Whether a whole partition may be dropped: it is a month (or the catch-all below the months),
 * holds rows, and its end lies at or before the horizon of every lab holding rows in it. A lab
 * missing from `horizons` (deleted, or unknown) counts as keeping everything, so its rows hold
 * the partition: the lab deletion job removes those, not retention.
 */
export function partitionMayGo(partition: PartitionForPlan, horizons: ReadonlyMap<number, number>): boolean {
  if (partition.kind === 'future' || partition.labIds.length === 0) return false;
  return partition.labIds.every((labId) => partition.monthEnd <= (horizons.get(labId) ?? KEEP_EVERYTHING));
}

/**
 * Plans one retention run from each lab's horizon and the partitions of `readings` (pure: the
 * job reads the inputs and carries the plan out). Whole partitions go first, by `DROP PARTITION`
 * (milliseconds whatever their size); then each lab whose plan removes is pruned of the readings
 * still before its horizon (partial months, and months another lab's horizon keeps).
 * Invariant (property-tested): no reading at or after its lab's horizon is ever planned away,
 * and after both steps no reading of a removing lab is left before its horizon.
 */
export function planRetention(input: { horizons: ReadonlyMap<number, number>; partitions: readonly PartitionForPlan[] }): RetentionPlan {
  const dropPartitions = [...input.partitions]
    .sort((a, b) => a.monthEnd - b.monthEnd)
    .filter((p) => partitionMayGo(p, input.horizons))
    .map((p) => p.name);
  const prune = [...input.horizons.entries()]
    .filter(([, horizon]) => Number.isFinite(horizon))
    .sort(([a], [b]) => a - b)
    .map(([labId, beforeMs]) => ({ labId, beforeMs }));
  return { dropPartitions, prune };
}
