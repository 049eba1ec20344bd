import { describe, expect, it } from 'vitest';
import { checkRows, MAX_FUTURE_MS, readRowTime, type CheckedChannel, type CheckedRows, type IncomingReading } from './check-rows.ts';

// Times are ISO 8601 (Z = UTC); their epoch milliseconds come from Date.UTC, independent of the parser.
const NOW = Date.UTC(2026, 2, 1, 12, 0, 0);
const T1 = '2026-03-01T10:00:00Z';
const T1_MS = Date.UTC(2026, 2, 1, 10, 0, 0);
const T2_MS = Date.UTC(2026, 2, 1, 10, 1, 0);

const channels: ReadonlyMap<string, CheckedChannel> = new Map([
  ['air_t', { id: 31, retiredAt: null }],
  ['soil_m', { id: 7, retiredAt: null }],
  ['old_rh', { id: 12, retiredAt: new Date(Date.UTC(2026, 0, 5)) }],
]);

const rowsOf = (...list: Array<Omit<IncomingReading, 'index'>>): IncomingReading[] =>
  Object.freeze(list.map((r, index) => Object.freeze({ index, ...r }))) as IncomingReading[];
const verdicts = (c: CheckedRows) => c.rejected.map((r) => [r.row.index, r.code, r.reason, r.ts]);
const candidates = (c: CheckedRows) => {
  const { columns, rowAt } = c.candidates.sorted();
  return Array.from({ length: columns.length }, (_, i) => [columns.channelId[i], columns.ts[i], columns.value[i], rowAt[i]]);
};

describe('checkRows', () => {
  it('sends each unreadable row to quarantine with its code and `field: reason`, and keeps the rest as candidates', async () => {
    const rows = rowsOf(
      { channel: ' air_t ', ts: T1, value: 21.5 },
      { channel: '', ts: T1, value: 1 },
      { channel: 42, ts: T1, value: 1 },
      { channel: 'leaf_w', ts: T1, value: 1 },
      { channel: 'old_rh', ts: T1, value: 1 },
      { channel: 'air_t', ts: 'yesterday', value: 1 },
      { channel: 'air_t', ts: '1969-12-31T23:59:59Z', value: 1 },
      { channel: 'soil_m', ts: T1, value: 'wet' },
      { channel: 'soil_m', ts: T2_MS, value: '0.31' },
    );
    const checked = await checkRows(rows, channels, { now: NOW });
    expect(verdicts(checked)).toEqual([
      [1, 'missing_channel', 'channel: missing', undefined],
      [2, 'missing_channel', 'channel: missing', undefined],
      [3, 'unknown_channel', 'channel: no channel "leaf_w" on this logger', undefined],
      [4, 'retired_channel', 'channel: "old_rh" is retired', undefined],
      [5, 'bad_time', expect.stringMatching(/^ts: /), undefined],
      [6, 'time_out_of_range', 'ts: before 1970', -1000],
      [7, 'bad_value', 'value: must be a finite number', T1_MS],
    ]);
    // primary-key order: channel 7 before channel 31
    expect(candidates(checked)).toEqual([
      [7, T2_MS, 0.31, 8],
      [31, T1_MS, 21.5, 0],
    ]);
    expect(checked.duplicatesInBatch).toBe(0);
  });

  it('accepts a time up to 24 hours ahead of the clock and refuses one beyond (a logger clock that is off)', async () => {
    const rows = rowsOf({ channel: 'air_t', ts: NOW + MAX_FUTURE_MS, value: 1 }, { channel: 'air_t', ts: NOW + MAX_FUTURE_MS + 1, value: 2 });
    const checked = await checkRows(rows, channels, { now: NOW });
    expect(MAX_FUTURE_MS).toBe(86_400_000);
    expect(candidates(checked)).toEqual([[31, NOW + MAX_FUTURE_MS, 1, 0]]);
    expect(verdicts(checked)).toEqual([[1, 'time_out_of_range', 'ts: more than 24 hours in the future (check the logger clock)', NOW + MAX_FUTURE_MS + 1]]);
  });

  it('keeps the first value of a channel and time: the same value again is a duplicate, another value goes to quarantine', async () => {
    const rows = rowsOf(
      { channel: 'air_t', ts: T1_MS, value: 20 },
      { channel: 'air_t', ts: T1, value: '20' },
      { channel: 'air_t', ts: T1_MS, value: 20.5 },
      { channel: 'soil_m', ts: T1_MS, value: 20.5 },
    );
    const checked = await checkRows(rows, channels, { now: NOW });
    expect(checked.duplicatesInBatch).toBe(1);
    expect(verdicts(checked)).toEqual([[2, 'conflict_in_batch', 'ts: this batch has another value for the same channel and time', T1_MS]]);
    expect(candidates(checked)).toEqual([
      [7, T1_MS, 20.5, 3],
      [31, T1_MS, 20, 0],
    ]);
  });

  it('reads local times in the time zone given (Europe/Berlin is UTC+1 in March before the switch, IANA tz database)', async () => {
    const rows = rowsOf({ channel: 'air_t', ts: '2026-03-01 11:00:00', value: 3 });
    const checked = await checkRows(rows, channels, { now: NOW, timeZone: 'Europe/Berlin' });
    expect(candidates(checked)).toEqual([[31, T1_MS, 3, 0]]);
  });

  it('accounts for every row of a batch larger than one turn, and lets other work run while it checks', async () => {
    const n = 25_000;
    const rows = Array.from({ length: n }, (_, i): IncomingReading => ({
      index: i,
      channel: i % 5 === 0 ? 'nope' : 'air_t',
      ts: T1_MS + (i % 20_000) * 1000,
      value: i % 20_000,
    }));
    let otherWorkRan = false;
    setImmediate(() => (otherWorkRan = true));
    const checked = await checkRows(rows, channels, { now: NOW }).then((c) => ({ c, otherWorkRan }));
    const { columns } = checked.c.candidates.sorted();
    // rows 20,000–24,999 repeat rows 0–4,999 with the same value: duplicates (4,000 of them on air_t)
    expect(checked.c.rejected).toHaveLength(n / 5);
    expect(checked.c.duplicatesInBatch).toBe(4000);
    expect(columns.length + checked.c.duplicatesInBatch + checked.c.rejected.length).toBe(n);
    expect(checked.otherWorkRan).toBe(true);
  });
});

describe('readRowTime and timeShiftMs', () => {
  it('shifts a time once read; an unreadable time stays unreadable', () => {
    expect(readRowTime(T1, { timeShiftMs: -3_600_000 })).toEqual({ ok: true, ts: T1_MS - 3_600_000 });
    expect(readRowTime('yesterday', { timeShiftMs: 60_000 }).ok).toBe(false);
  });

  it("reads a layout's wall clock in the zone: 24.11.2026 00:00 in Europe/Berlin is 23:00 UTC the day before (CET, UTC+1; IANA tz database)", () => {
    expect(readRowTime('24.11.2026 00:00', { timeLayout: 'day-first-dot', timeZone: 'Europe/Berlin' })).toEqual({
      ok: true,
      ts: Date.UTC(2026, 10, 23, 23, 0, 0),
    });
  });

  it('checks the range on the shifted time: a shift past 24 h ahead quarantines the row as time_out_of_range', async () => {
    const shifted = await checkRows(rowsOf({ channel: 'air_t', ts: T1, value: 1 }), channels, { now: NOW, timeShiftMs: MAX_FUTURE_MS + 3 * 3_600_000 });
    expect(verdicts(shifted)).toEqual([
      [0, 'time_out_of_range', 'ts: more than 24 hours in the future (check the logger clock)', T1_MS + MAX_FUTURE_MS + 3 * 3_600_000],
    ]);
    const back = await checkRows(rowsOf({ channel: 'air_t', ts: T1, value: 1 }), channels, { now: NOW, timeShiftMs: -60_000 });
    expect(candidates(back)).toEqual([[31, T1_MS - 60_000, 1, 0]]);
  });
});
