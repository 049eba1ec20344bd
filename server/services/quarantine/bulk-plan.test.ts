import { describe, expect, it } from 'vitest';
import type { QuarantinedRow } from '../../db/quarantine.repo.ts';
import { groupReasons, incomingOf, planBulk, type BulkLogger } from './bulk-plan.ts';

const NOW = Date.UTC(2026, 10, 24, 12, 0, 0);
const berlin: BulkLogger = { id: 1, name: 'Roof', timezone: 'Europe/Berlin' };
const other: BulkLogger = { id: 2, name: 'Cellar', timezone: 'UTC' };
const loggers = new Map([
  [1, berlin],
  [2, other],
]);

const row = (over: Partial<QuarantinedRow> = {}): QuarantinedRow => ({
  id: 10,
  loggerId: 1,
  source: 'upload',
  batchRef: 'b',
  rowIndex: 0,
  reasonCode: 'bad_time',
  reason: 'ts: …',
  channelKey: 'air_t',
  tsRaw: '24.11.2026 00:00',
  valueRaw: '4.5',
  raw: '24.11.2026 00:00;4.5',
  receivedAt: new Date(NOW),
  ...over,
});

const ingestPlan = (plan: ReturnType<typeof planBulk>) => {
  if (plan.kind !== 'ingest') throw new Error('expected an ingest plan');
  return plan;
};

describe('planBulk', () => {
  it('refuses an empty selection for every action', () => {
    expect(() => planBulk({ kind: 'discard', reason: 'gone' }, [], loggers, null, NOW)).toThrow(
      'Rows to repair: no quarantined rows match; change the filters or choose rows.',
    );
  });

  it('discards rows of no logger, but refuses to re-ingest them', () => {
    expect(planBulk({ kind: 'discard', reason: 'unplugged' }, [row({ loggerId: null })], loggers, null, NOW)).toEqual({ kind: 'discard', reason: 'unplugged' });
    expect(() => planBulk({ kind: 'reread', timeFormat: 'iso' }, [row({ loggerId: null })], loggers, null, NOW)).toThrow(
      'Rows to repair: 1 row belongs to no logger and can only be discarded',
    );
  });

  it("re-reads in the logger's zone unless a zone is named; a day-first text then reads as Berlin wall clock", () => {
    const plan = ingestPlan(planBulk({ kind: 'reread', timeFormat: 'day-first-dot' }, [row()], loggers, null, NOW));
    expect(plan.readingFor(berlin)).toEqual({ timeFormat: 'auto', timeLayout: 'day-first-dot', timeZone: 'Europe/Berlin' });
    const named = ingestPlan(planBulk({ kind: 'reread', timeFormat: 'day-first-dot', timeZone: 'America/New_York' }, [row()], loggers, null, NOW));
    expect(named.readingFor(berlin).timeZone).toBe('America/New_York');
    expect(plan.channelOf(row())).toBe('air_t');
  });

  it('refuses a custom pattern it cannot read, naming the pattern field', () => {
    expect(() => planBulk({ kind: 'reread', timeFormat: 'pattern', timePattern: 'dd.QQ.yyyy' }, [row()], loggers, null, NOW)).toThrow(
      /^Pattern of the times: /,
    );
  });

  it('shifts by the offset in ms, and refuses a shift that would move a row past now', () => {
    // 2026-11-24T10:00:00Z read as ingestion does, an hour later is 11:00Z: before NOW (12:00Z)
    const early = row({ tsRaw: '2026-11-24T10:00:00Z' });
    const plan = ingestPlan(planBulk({ kind: 'shift', offsetMinutes: 60 }, [early], loggers, null, NOW));
    expect(plan.readingFor(berlin)).toEqual({ timeFormat: 'auto', timeZone: 'Europe/Berlin', timeShiftMs: 3_600_000 });
    expect(() => planBulk({ kind: 'shift', offsetMinutes: 180 }, [early, row({ id: 11, tsRaw: 'not a time' })], loggers, null, NOW)).toThrow(
      // 10:00Z + 3 h = 13:00Z, one hour past NOW (12:00Z)
      'Shift (minutes): would move 1 row into the future (the latest by 60 minutes); use a smaller shift or narrow the selection.',
    );
  });

  it('maps to a channel of the rows’ own logger only, and never to a retired one', () => {
    const air = { id: 5, loggerId: 1, key: 'air_t', retiredAt: null };
    const plan = ingestPlan(planBulk({ kind: 'map-channel', channelId: 5 }, [row({ channelKey: 'air_temp' })], loggers, air, NOW));
    expect(plan.channelOf(row({ channelKey: 'air_temp' }))).toBe('air_t');
    expect(() => planBulk({ kind: 'map-channel', channelId: 5 }, [row(), row({ id: 11, loggerId: 2 })], loggers, air, NOW)).toThrow(
      'Channel to store them under: "air_t" belongs to logger "Roof", but 1 selected row comes from another logger; filter the selection by that logger first.',
    );
    expect(() => planBulk({ kind: 'map-channel', channelId: 5 }, [row()], loggers, { ...air, retiredAt: new Date(NOW) }, NOW)).toThrow(
      'Channel to store them under: "air_t" is retired',
    );
    expect(() => planBulk({ kind: 'map-channel', channelId: 9 }, [row()], loggers, null, NOW)).toThrow(
      'Channel to store them under: is not a channel of this lab',
    );
  });
});

describe('incomingOf', () => {
  it('carries the kept texts and the row as first received', () => {
    expect(incomingOf(row(), 'rh', 3)).toEqual({ index: 3, channel: 'rh', ts: '24.11.2026 00:00', value: '4.5', raw: '24.11.2026 00:00;4.5' });
    expect(incomingOf(row({ tsRaw: null, valueRaw: null, raw: null }), null, 0)).toEqual({
      index: 0,
      channel: undefined,
      ts: undefined,
      value: undefined,
      raw: undefined,
    });
  });
});

describe('groupReasons', () => {
  it('counts by code, biggest group first, with the first reason as example', () => {
    expect(
      groupReasons([
        { code: 'bad_value', reason: 'value: a' },
        { code: 'bad_time', reason: 'ts: x' },
        { code: 'bad_value', reason: 'value: b' },
      ]),
    ).toEqual([
      { code: 'bad_value', count: 2, example: 'value: a' },
      { code: 'bad_time', count: 1, example: 'ts: x' },
    ]);
  });
});
