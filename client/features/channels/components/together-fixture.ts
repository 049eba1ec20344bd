import type { ChannelOverviewRow, Series } from '@shared/contract/channels.ts';

/*
 * Channels of an invented fen research station (demo data, not from any real site), in the
 * channels overview's documented shape, for the channels-together tests only.
 */
export const FEN_NOW = Date.parse('2026-03-29T12:00:00Z');

/** A channel row of the overview; `logger` names the logger and its zone. */
export function fenChannel(
  id: number,
  label: string,
  unit: string | null,
  logger: { id: number; name: string; timezone: string },
  extra: Partial<ChannelOverviewRow> = {},
): ChannelOverviewRow {
  return {
    id,
    loggerId: logger.id,
    key: `ch_${id}`,
    label,
    unit,
    quantity: null,
    validMin: null,
    validMax: null,
    expectedIntervalS: null,
    seasonalPeriodHint: null,
    retiredAt: null,
    logger: { ...logger, site: 'Reed bed', expectedIntervalS: 600 },
    status: 'live',
    statusIntervalS: 600,
    lastReading: null,
    dataVersion: 1,
    sparkline: { startHour: FEN_NOW - 23 * 3600_000, stepS: 3600, means: new Array(24).fill(null) },
    ...extra,
  };
}

export const WEIR = { id: 1, name: 'Weir mast', timezone: 'Europe/Berlin' };
export const BOARDWALK = { id: 2, name: 'Boardwalk box', timezone: 'America/New_York' };

/** Raw readings at `t` with `value` (null = the server's gap marker). */
export function readings(t: number[], value: Array<number | null>): Series {
  return { shape: 'readings', source: 'raw', resolutionS: null, bucketMs: null, from: t[0] ?? 0, to: (t.at(-1) ?? 0) + 1, t, value };
}

/** Buckets of `bucketMs` from `start` with the given means (min/max around them). */
export function buckets(start: number, bucketMs: number, mean: Array<number | null>): Series {
  return {
    shape: 'buckets',
    source: 'rollup',
    resolutionS: 600,
    bucketMs,
    from: start,
    to: start + mean.length * bucketMs,
    t: mean.map((_, i) => start + i * bucketMs),
    min: mean.map((m) => (m === null ? null : m - 1)),
    max: mean.map((m) => (m === null ? null : m + 1)),
    mean,
    count: mean.map((m) => (m === null ? 0 : 3)),
  };
}
