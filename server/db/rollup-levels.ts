/**
 * Which rollup levels a channel keeps. A rollup bucket summarises the readings inside it; a
 * level no wider than the channel's reporting interval holds one row per reading (or none), so
 * it costs more than the readings it stands for and saves no reading time. A channel therefore
 * keeps only the levels strictly coarser than its interval: under 60 s → minute, hour and day;
 * under an hour → hour and day; under a day → day; otherwise none, and every reader answers
 * from the raw readings.
 *
 * The finest level kept is stored per channel (`channels.finest_rollup_s`, NULL for none);
 * every coarser level is kept too. Pure functions, no database access.
 */

/** Rollup resolutions in seconds, finest first; each is computed from the one before it. */
export const ROLLUP_RESOLUTIONS_S = [60, 3600, 86400] as const;
export type RollupResolutionS = (typeof ROLLUP_RESOLUTIONS_S)[number];

/**
 * The finest rollup level worth keeping for a channel reporting every `intervalS` seconds: the
 * finest resolution strictly coarser than the interval, or null when no level is. O(levels).
 */
export function finestRollupFor(intervalS: number): RollupResolutionS | null {
  if (!Number.isFinite(intervalS) || intervalS <= 0) throw new Error(`finestRollupFor: interval must be a positive number of seconds (got ${intervalS})`);
  return ROLLUP_RESOLUTIONS_S.find((r) => intervalS < r) ?? null;
}

/** The levels kept above `floor` (the channel's finest level), finest first; none for null. */
export function keptLevels(floor: number | null): RollupResolutionS[] {
  return floor === null ? [] : ROLLUP_RESOLUTIONS_S.filter((r) => r >= floor);
}

/** Whether the level `resolutionS` exists for a channel whose finest kept level is `floor`. */
export function isKept(resolutionS: number, floor: number | null): boolean {
  return floor !== null && resolutionS >= floor;
}

/**
 * The level to read buckets of `widthMs` from when `wanted` is the level the caller would read
 * with every level present: `wanted` itself when kept, else the finest kept coarser level whose
 * buckets tile `widthMs` exactly (so every bucket is still an exact sum of whole rollups), else
 * null — read the raw readings. Either way the buckets' min, max, sum and count are the same.
 */
export function levelForBuckets(wanted: number | null, floor: number | null, widthMs: number): RollupResolutionS | null {
  if (wanted === null) return null;
  return ROLLUP_RESOLUTIONS_S.find((r) => r >= wanted && isKept(r, floor) && widthMs % (r * 1000) === 0) ?? null;
}

/**
 * The same choice as {@link finestRollupFor} as a SQL CASE over the interval expression `interval`
 * (a column expression, never user input), for statements that set many channels' floors at once.
 */
export function finestRollupSql(interval: string): string {
  return `CASE ${ROLLUP_RESOLUTIONS_S.map((r) => `WHEN ${interval} < ${r} THEN ${r}`).join(' ')} ELSE NULL END`;
}
