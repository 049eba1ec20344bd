import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { channelReadingsRepo } from '../../server/db/channel-readings.repo.ts';
import { inLab } from '../../server/db/tenant-scope.ts';
import { testConfig } from '../support/test-app.ts';
import { buildLabWithEverything } from '../support/lab-fixture.ts';

/**
 * Grid reads split into slices read concurrently (channelReadingsRepo's `sliceSteps`) must give
 * exactly the cells of one read: same times, same values, nothing doubled at a cut, for the
 * one-rollup-per-cell form, the grouped form and raw readings, with a range that does not
 * start on the grid.
 * Simulated minute rollups with gaps (behaviour check only).
 */
const MIN = 60_000;
const T0 = Date.UTC(2026, 2, 1, 6, 0, 0);
let db: Db;
let tenantId: number;
let channelId: number;

beforeAll(async () => {
  db = createDb(testConfig().db);
  const { lab, ids } = await buildLabWithEverything(db);
  tenantId = lab.id;
  channelId = ids.channelId;
  const rows = [];
  for (let m = 0; m < 240; m++) {
    if (m % 17 === 5 || (m >= 100 && m < 112)) continue; // scattered empty minutes and a 12-minute gap
    const value = 20 + Math.sin(m / 9) + (m % 5) / 10;
    rows.push({
      tenant_id: tenantId,
      channel_id: channelId,
      resolution_s: 60,
      bucket_start: T0 + m * MIN,
      min_value: value - 0.5,
      max_value: value + 0.5,
      sum_value: 3 * value,
      count_value: 3,
    });
  }
  await db('reading_rollups').insert(rows);
  // raw readings every 20 s with the same gaps, for the raw read
  const raw = [];
  for (let k = 0; k < 240 * 3; k++) {
    const m = Math.floor(k / 3);
    if (m % 17 === 5 || (m >= 100 && m < 112)) continue;
    raw.push({ tenant_id: tenantId, channel_id: channelId, ts: T0 + k * 20_000, value: 20 + Math.sin(k / 27) });
  }
  await db('readings').insert(raw);
});

afterAll(async () => {
  await db?.destroy();
});

describe('sliced grid reads', () => {
  const whole = () => channelReadingsRepo(inLab(db, tenantId), { sliceSteps: Number.POSITIVE_INFINITY });
  const sliced = () => channelReadingsRepo(inLab(db, tenantId), { sliceSteps: 11, maxSlices: 4 });
  const cases: Array<[string, number, 'mean' | 'min' | 'max']> = [
    ['one rollup per cell, mean', MIN, 'mean'],
    ['one rollup per cell, max', MIN, 'max'],
    ['five rollups per cell, mean', 5 * MIN, 'mean'],
    ['seven rollups per cell, min', 7 * MIN, 'min'],
  ];
  it('equal one read: raw readings for a grid, cut at whole steps', async () => {
    const from = T0 + 3 * MIN + 17_000;
    const to = T0 + 233 * MIN;
    const one = await whole().range(channelId, from, to);
    const parts = await sliced().rangeForGrid(channelId, from, to, MIN);
    expect(one.ts.length).toBeGreaterThan(500);
    expect(Array.from(parts.ts)).toEqual(Array.from(one.ts));
    expect(Array.from(parts.values)).toEqual(Array.from(one.values));
  });

  for (const [name, stepMs, agg] of cases) {
    it(`equal one read: ${name}`, async () => {
      const from = T0 + 3 * MIN + 17_000; // not on any grid
      const to = T0 + 233 * MIN;
      const one = await whole().cellsFromRollups(channelId, 60, from, to, stepMs, agg);
      const parts = await sliced().cellsFromRollups(channelId, 60, from, to, stepMs, agg);
      expect(one.ts.length).toBeGreaterThan(20);
      expect(Array.from(parts.ts)).toEqual(Array.from(one.ts));
      expect(Array.from(parts.values)).toEqual(Array.from(one.values));
      // strictly increasing cell times: no cell read twice at a cut
      for (let i = 1; i < parts.ts.length; i++) expect(parts.ts[i]).toBeGreaterThan(parts.ts[i - 1]);
    });
  }
});
