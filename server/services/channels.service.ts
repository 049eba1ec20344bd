import type { Db } from '../db/create-db.ts';
import { inLab, type DbOrTrx } from '../db/tenant-scope.ts';
import { createReadReplica, type ReadReplica } from '../db/read-replica.ts';
import { channelStateRepo, type ChannelWithState } from '../db/channel-state.repo.ts';
import { channelReadingsRepo, type BucketRow } from '../db/channel-readings.repo.ts';

type ChannelReadingsRepo = ReturnType<typeof channelReadingsRepo>;
import { ROLLUP_RESOLUTIONS_S } from '../db/readings.repo.ts';
import { levelForBuckets } from '../db/rollup-levels.ts';
import { NotFoundError } from '../errors.ts';
import type { LabContext } from './lab-context.ts';
import type { ChannelStatus, Series, SeriesQuery } from '../contract/channels.ts';

/** A channel is silent after this many expected intervals without a reading. */
export const SILENT_AFTER_INTERVALS = 3;
const HOUR_MS = 3_600_000;
const SPARKLINE_HOURS = 24;

export interface ChannelOverview extends ChannelWithState {
  status: ChannelStatus;
  /** Seconds between readings the status is judged by (the channel's, else its logger's). */
  intervalS: number;
  /** Hourly means of the last 24 hours (oldest first; the last entry is the current hour), null where empty. */
  sparkline: { startHour: number; means: Array<number | null> };
}

export interface ChannelDetail extends ChannelWithState {
  status: ChannelStatus;
  intervalS: number;
  firstReadingTs: number | null;
  readingCount: number;
}

/**
 * The status shown beside a channel: `no-data` before its first reading; `silent` once more than
 * 3 × its expected interval has passed without one (common practice: a single late reading is
 * jitter, three missed ones are an outage); `out-of-range` when the last value lies outside the
 * valid range; else `live`. Silence wins over range: the last value of a dead logger is old news.
 */
export function channelStatus(c: ChannelWithState, nowMs: number): { status: ChannelStatus; intervalS: number } {
  const intervalS = c.expectedIntervalS ?? c.logger.expectedIntervalS;
  if (c.lastReadingTs === null || c.lastReadingValue === null) return { status: 'no-data', intervalS };
  if (nowMs - c.lastReadingTs > SILENT_AFTER_INTERVALS * intervalS * 1000) return { status: 'silent', intervalS };
  const v = c.lastReadingValue;
  if ((c.validMin !== null && v < c.validMin) || (c.validMax !== null && v > c.validMax)) return { status: 'out-of-range', intervalS };
  return { status: 'live', intervalS };
}

/** Fills `count` buckets of `widthMs` from `start` with the rows found (null where a bucket is empty). */
function bucketSeries(rows: BucketRow[], start: number, widthMs: number, count: number) {
  const t = Array.from({ length: count }, (_, i) => start + i * widthMs);
  const min: Array<number | null> = new Array(count).fill(null);
  const max: Array<number | null> = new Array(count).fill(null);
  const mean: Array<number | null> = new Array(count).fill(null);
  const n: number[] = new Array(count).fill(0);
  for (const r of rows) {
    const i = Math.round((r.start - start) / widthMs);
    if (i < 0 || i >= count || r.count === 0) continue;
    min[i] = r.min;
    max[i] = r.max;
    mean[i] = r.sum / r.count;
    n[i] = r.count;
  }
  return { t, min, max, mean, count: n };
}

/**
 * Browsing a lab's channels: the overview with status and sparkline, one channel's detail, its
 * series for a chart (downsampled so that extremes survive) and its readings for export.
 * The channel row (and so its data version) always comes from the writer `db`; the readings
 * behind a chart, a detail's extent or an export page come through `reads` (the reader when it
 * has caught up with that version, see read-replica.ts), and the overview's list from the
 * reader when its list of channels and loggers is the writer's. Without `reads`, everything
 * runs on `db`.
 */
export function createChannelsService(deps: { db: Db; reads?: ReadReplica; now?: () => number }) {
  const now = deps.now ?? Date.now;
  const reads = deps.reads ?? createReadReplica({ writer: deps.db });
  const scoped = (lab: LabContext, db: DbOrTrx = deps.db) => {
    const scope = inLab(db, lab.id);
    return { state: channelStateRepo(scope), readings: channelReadingsRepo(scope) };
  };

  async function requireChannel(lab: LabContext, channelId: number): Promise<ChannelWithState> {
    const channel = await scoped(lab).state.find(channelId);
    if (!channel) throw new NotFoundError('No such channel in this lab.');
    return channel;
  }

  return {
    requireChannel,

    /** Every channel in use with its status and sparkline: two statements whatever the count (with a reader, plus its list check). */
    async overview(lab: LabContext): Promise<ChannelOverview[]> {
      const at = now();
      const startHour = Math.floor(at / HOUR_MS) * HOUR_MS - (SPARKLINE_HOURS - 1) * HOUR_MS;
      const { channels, means } = await reads.listRead(lab.id, async (db) => {
        const { state, readings } = scoped(lab, db);
        const channels = await state.listActive();
        const means = await readings.hourlyMeans(
          channels.map((c) => c.id),
          startHour,
          startHour + SPARKLINE_HOURS * HOUR_MS,
        );
        return { channels, means };
      });
      const lines = new Map<number, Array<number | null>>(channels.map((c) => [c.id, new Array(SPARKLINE_HOURS).fill(null)]));
      for (const m of means) {
        const line = lines.get(m.channelId);
        if (line) line[(m.hour - startHour) / HOUR_MS] = m.mean;
      }
      return channels.map((c) => ({ ...c, ...channelStatus(c, at), sparkline: { startHour, means: lines.get(c.id)! } }));
    },

    async detail(lab: LabContext, channelId: number): Promise<ChannelDetail> {
      const channel = await requireChannel(lab, channelId);
      const extent = await reads.channelRead(lab.id, [channel], (db) => scoped(lab, db).readings.extent(channelId));
      return { ...channel, ...channelStatus(channel, now()), firstReadingTs: extent.firstTs, readingCount: extent.count };
    },

    /**
     * The readings of [from, to) for a chart of about `points` points. When the range holds at
     * most `points` readings they come back as they are, with a null inserted where two
     * neighbours lie more than 3 expected intervals apart (a gap to draw). Otherwise the range is
     * cut into ⌊points/2⌋ buckets (each drawn as its min and max, so a one-reading spike stays
     * visible: the min/max envelope keeps every extreme, unlike averaging or decimation) whose
     * width is rounded up to a multiple of the coarsest rollup resolution not wider than it
     * (read from that level, a coarser one that tiles the width, or the raw readings, as the
     * channel keeps levels: see rollup-levels.ts);
     * buckets are aligned to whole multiples of their width since the epoch, so the first and
     * last may reach past from/to (the answer's from/to say what was covered). Empty buckets
     * are null.
     */
    async series(lab: LabContext, channelId: number, q: SeriesQuery): Promise<Series> {
      const channel = await requireChannel(lab, channelId);
      return reads.channelRead(lab.id, [channel], (db) => seriesOn(scoped(lab, db).readings, channel, q));
    },

    /**
     * Raw readings of [from, to) in time order, a page of up to 10,000 at a time (for streaming
     * exports; the caller has checked the channel with `requireChannel`). The channel's data
     * version is read from the writer once; each page is one read through `reads`, so a reader
     * that falls behind or goes away mid-export hands the next page to the writer.
     */
    async *readingPages(lab: LabContext, channelId: number, q: { from: number; to: number }): AsyncGenerator<{ ts: Float64Array; values: Float64Array }> {
      const channel = await requireChannel(lab, channelId);
      let from = q.from;
      for (;;) {
        const start = from;
        const page = await reads.channelRead(lab.id, [channel], (db) => scoped(lab, db).readings.range(channelId, start, q.to, 10_000));
        if (page.ts.length === 0) return;
        yield page;
        if (page.ts.length < 10_000) return;
        from = page.ts[page.ts.length - 1] + 1;
      }
    },
  };
}

/** See `series` above: the answer for `channel` read from `readings` (on the connection the caller chose). */
async function seriesOn(readings: ChannelReadingsRepo, channel: ChannelWithState, q: SeriesQuery): Promise<Series> {
  const channelId = channel.id;
  const raw = await readings.range(channelId, q.from, q.to, q.points + 1);
  if (raw.ts.length <= q.points) {
    const gapMs = SILENT_AFTER_INTERVALS * channelStatus(channel, 0).intervalS * 1000;
    const t: number[] = [];
    const value: Array<number | null> = [];
    for (let i = 0; i < raw.ts.length; i++) {
      if (i > 0 && raw.ts[i] - raw.ts[i - 1] > gapMs) {
        t.push(raw.ts[i - 1] + gapMs);
        value.push(null);
      }
      t.push(raw.ts[i]);
      value.push(raw.values[i]);
    }
    return { shape: 'readings', source: 'raw', resolutionS: null, bucketMs: null, from: q.from, to: q.to, t, value };
  }
  const target = (q.to - q.from) / Math.floor(q.points / 2);
  const ideal = [...ROLLUP_RESOLUTIONS_S].reverse().find((r) => r * 1000 <= target) ?? null;
  const unit = ideal ? ideal * 1000 : 1;
  const widthMs = Math.ceil(target / unit) * unit;
  const start = Math.floor(q.from / widthMs) * widthMs;
  const count = Math.ceil((q.to - start) / widthMs);
  const end = start + count * widthMs;
  // The width is chosen as if every level were kept, so the buckets are the same whichever
  // level (or the raw readings, where the channel keeps no level that tiles them) fills them.
  const floor = (await readings.rollupFloors([channelId])).get(channelId) ?? null;
  const resolutionS = levelForBuckets(ideal, floor, widthMs);
  const rows = resolutionS
    ? await readings.rollupBuckets(channelId, resolutionS, start, end, widthMs)
    : await readings.rawBuckets(channelId, start, end, widthMs);
  return {
    shape: 'buckets',
    source: resolutionS ? 'rollup' : 'raw',
    resolutionS,
    bucketMs: widthMs,
    from: start,
    to: end,
    ...bucketSeries(rows, start, widthMs, count),
  };
}

export type ChannelsService = ReturnType<typeof createChannelsService>;
