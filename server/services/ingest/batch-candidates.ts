import type { ReadingBatchColumns } from '../../db/readings.repo.ts';

/** What became of a reading offered to a batch's candidates. */
export type Offer = 'added' | 'duplicate' | 'conflict';

/** The candidates of a batch in primary-key order, with where each came from. */
export interface SortedCandidates {
  /** Sorted by channel id, then time; no (channel, time) twice. */
  columns: ReadingBatchColumns;
  /** `rowAt[i]`: the position, in the rows given to the batch, of the reading at `i`. */
  rowAt: Int32Array;
  /** One run per channel: the readings at `from` (inclusive) to `to` (exclusive). */
  runs: Array<{ channelId: number; from: number; to: number }>;
}

/**
 * The readings of one batch that passed every check, kept in columns (typed arrays) instead of
 * one object per reading: a 5,000-reading batch then allocates a handful of arrays rather than
 * thousands of short-lived objects, which is most of what the ingestion path spends on garbage
 * collection.
 *
 * Within the batch, a second reading for a (channel, time) already offered is a duplicate when
 * its value is the same and a conflict otherwise; the first one stays. Loggers send each
 * channel's readings in time order, so while a channel's times only rise no reading can repeat
 * an earlier one and only the newest time is compared; the first time a channel's times go
 * back, a (time → value) map is built from that channel's readings so far and used from then on.
 */
export class BatchCandidates {
  length = 0;
  private readonly slot: Int32Array;
  private readonly ts: Float64Array;
  private readonly value: Float64Array;
  private readonly rowAt: Int32Array;
  /** Per slot: the channel id, the newest time so far, and (once times went back) every time seen. */
  private readonly channelIds: number[] = [];
  private readonly newest: number[] = [];
  private readonly seen: Array<Map<number, number> | undefined> = [];
  private readonly slotOf = new Map<number, number>();

  constructor(capacity: number) {
    this.slot = new Int32Array(capacity);
    this.ts = new Float64Array(capacity);
    this.value = new Float64Array(capacity);
    this.rowAt = new Int32Array(capacity);
  }

  /** Offers a checked reading; `row` is its position in the rows given to the batch. */
  offer(channelId: number, ts: number, value: number, row: number): Offer {
    let s = this.slotOf.get(channelId);
    if (s === undefined) {
      s = this.channelIds.length;
      this.slotOf.set(channelId, s);
      this.channelIds.push(channelId);
      this.newest.push(ts);
      this.seen.push(undefined);
    } else if (ts > this.newest[s]) {
      this.newest[s] = ts;
      this.seen[s]?.set(ts, value);
    } else {
      const seen = this.seenOf(s);
      const first = seen.get(ts);
      if (first !== undefined) return Object.is(first, value) || first === value ? 'duplicate' : 'conflict';
      seen.set(ts, value);
    }
    const i = this.length++;
    this.slot[i] = s;
    this.ts[i] = ts;
    this.value[i] = value;
    this.rowAt[i] = row;
    return 'added';
  }

  private seenOf(s: number): Map<number, number> {
    let seen = this.seen[s];
    if (!seen) {
      seen = new Map();
      for (let i = 0; i < this.length; i++) if (this.slot[i] === s) seen.set(this.ts[i], this.value[i]);
      this.seen[s] = seen;
    }
    return seen;
  }

  /**
   * The candidates in primary-key order (channel id, then time), so each channel's rows go into
   * one place of the index. A counting sort by channel keeps arrival order within a channel,
   * which is already time order for a logger that sends in order; only a channel whose times
   * went back is sorted by time.
   */
  sorted(): SortedCandidates {
    const slots = this.channelIds.map((id, s) => ({ id, s })).sort((a, b) => a.id - b.id);
    const start = new Int32Array(slots.length + 1);
    const rank = new Int32Array(slots.length);
    slots.forEach(({ s }, r) => (rank[s] = r));
    for (let i = 0; i < this.length; i++) start[rank[this.slot[i]] + 1]++;
    for (let r = 0; r < slots.length; r++) start[r + 1] += start[r];
    const order = new Int32Array(this.length);
    const next = start.slice(0, slots.length);
    for (let i = 0; i < this.length; i++) order[next[rank[this.slot[i]]]++] = i;

    const runs: SortedCandidates['runs'] = [];
    for (let r = 0; r < slots.length; r++) {
      const from = start[r];
      const to = start[r + 1];
      if (this.seen[slots[r].s]) order.subarray(from, to).sort((a, b) => this.ts[a] - this.ts[b]);
      runs.push({ channelId: slots[r].id, from, to });
    }

    const columns: ReadingBatchColumns = {
      length: this.length,
      channelId: new Float64Array(this.length),
      ts: new Float64Array(this.length),
      value: new Float64Array(this.length),
    };
    const rowAt = new Int32Array(this.length);
    for (const run of runs) {
      for (let k = run.from; k < run.to; k++) {
        const i = order[k];
        columns.channelId[k] = run.channelId;
        columns.ts[k] = this.ts[i];
        columns.value[k] = this.value[i];
        rowAt[k] = this.rowAt[i];
      }
    }
    return { columns, rowAt, runs };
  }
}
