import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { KEEP_EVERYTHING, partitionMayGo, planRetention, removalHorizon, removalStartsAt, type PartitionForPlan } from './retention-plan.ts';
import { planInForceSince } from './plan-in-force-since.ts';
import type { LabBilling } from '../../db/lab-billing.repo.ts';

const DAY_MS = 86_400_000;
const monthStart = (ms: number) => Date.UTC(new Date(ms).getUTCFullYear(), new Date(ms).getUTCMonth(), 1);
const nextMonth = (ms: number) => Date.UTC(new Date(ms).getUTCFullYear(), new Date(ms).getUTCMonth() + 1, 1);

describe('removalHorizon', () => {
  const now = Date.UTC(2026, 11, 4, 13, 27, 5); // 2026-12-04T13:27:05Z

  it('keeps everything on a plan that does not remove', () => {
    expect(removalHorizon({ historyDays: 90, readingRemoval: { enabled: false, exportDays: 30 } }, now)).toBe(KEEP_EVERYTHING);
  });

  it('is the UTC day start of now minus history and export days', () => {
    // 90 + 30 = 120 days before 2026-12-04T13:27:05Z is 2026-08-06T13:27:05Z (calendar arithmetic, common practice); its day starts at 00:00Z
    expect(new Date(removalHorizon({ historyDays: 90, readingRemoval: { enabled: true, exportDays: 30 } }, now)).toISOString()).toBe(
      '2026-08-06T00:00:00.000Z',
    );
    expect(new Date(removalHorizon({ historyDays: 1, readingRemoval: { enabled: true, exportDays: 0 } }, now)).toISOString()).toBe('2026-12-03T00:00:00.000Z');
  });

  it('never lies after now minus the history plus export days, and no rollup bucket of a minute, an hour or a day straddles it', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: Date.UTC(2000, 0, 1), max: Date.UTC(2100, 0, 1) }),
        fc.integer({ min: 1, max: 7300 }),
        fc.integer({ min: 0, max: 3650 }),
        (nowMs, historyDays, exportDays) => {
          const h = removalHorizon({ historyDays, readingRemoval: { enabled: true, exportDays } }, nowMs);
          expect(h).toBeLessThanOrEqual(nowMs - (historyDays + exportDays) * DAY_MS);
          expect(h).toBeGreaterThan(nowMs - (historyDays + exportDays + 1) * DAY_MS);
          for (const res of [60_000, 3_600_000, DAY_MS]) expect(h % res).toBe(0);
        },
      ),
      { seed: 20261204, numRuns: 500 },
    );
  });

  it('removes nothing until the export days have passed since the plan took effect (a lab just moved onto a removing plan)', () => {
    const policy = { historyDays: 90, readingRemoval: { enabled: true, exportDays: 30 } };
    const since = now - 10 * DAY_MS;
    expect(removalStartsAt({ ...policy, inForceSinceMs: since })).toBe(since + 30 * DAY_MS);
    expect(removalHorizon({ ...policy, inForceSinceMs: since }, now)).toBe(KEEP_EVERYTHING);
    expect(removalHorizon({ ...policy, inForceSinceMs: since }, since + 30 * DAY_MS - 1)).toBe(KEEP_EVERYTHING);
    expect(removalHorizon({ ...policy, inForceSinceMs: since }, since + 30 * DAY_MS)).toBe(removalHorizon(policy, since + 30 * DAY_MS));
    expect(removalHorizon({ ...policy, inForceSinceMs: now - 31 * DAY_MS }, now)).toBe(removalHorizon(policy, now));
  });
});

describe('planInForceSince', () => {
  const base: LabBilling = {
    tenantId: 1,
    planKey: 'seedling',
    status: 'none',
    stripeCustomerId: null,
    stripeSubscriptionId: null,
    graceUntil: null,
    stateAt: 0,
    readingsCount: 0,
    quarantinedCount: 0,
    reconciledAt: null,
    warnedPercent: 0,
  };
  const row = (over: Pick<LabBilling, 'stateAt'> & Partial<Pick<LabBilling, 'graceUntil'>>): LabBilling => ({ ...base, ...over });

  it('is −∞ for a lab that never changed plan, else the later of the last state change (Stripe seconds) and the end of a payment grace', () => {
    expect(planInForceSince(null)).toBe(Number.NEGATIVE_INFINITY);
    expect(planInForceSince(row({ stateAt: 0 }))).toBe(Number.NEGATIVE_INFINITY);
    expect(planInForceSince(row({ stateAt: 1_790_000_000 }))).toBe(1_790_000_000_000);
    expect(planInForceSince(row({ stateAt: 1_790_000_000, graceUntil: new Date(1_791_000_000_000) }))).toBe(1_791_000_000_000);
    expect(planInForceSince(row({ stateAt: 1_792_000_000, graceUntil: new Date(1_791_000_000_000) }))).toBe(1_792_000_000_000);
  });
});

describe('partitionMayGo', () => {
  const p = (labIds: number[], monthEnd = Date.UTC(2026, 0, 1), kind: PartitionForPlan['kind'] = 'month'): PartitionForPlan => ({
    name: 'p202512',
    kind,
    monthEnd,
    labIds,
  });
  const horizons = new Map([
    [1, Date.UTC(2026, 0, 1)],
    [2, Date.UTC(2025, 11, 15)],
    [3, KEEP_EVERYTHING],
  ]);

  it('goes when it ends at or before the horizon of every lab holding rows in it', () => {
    expect(partitionMayGo(p([1]), horizons)).toBe(true);
    expect(partitionMayGo(p([1], Date.UTC(2025, 11, 1), 'before'), horizons)).toBe(true);
  });

  it('stays when one lab holding rows has its horizon inside or before it, keeps everything, or is unknown', () => {
    expect(partitionMayGo(p([1, 2]), horizons)).toBe(false);
    expect(partitionMayGo(p([1, 3]), horizons)).toBe(false);
    expect(partitionMayGo(p([1, 99]), horizons)).toBe(false);
  });

  it('leaves empty partitions and the future catch-all alone', () => {
    expect(partitionMayGo(p([]), horizons)).toBe(false);
    expect(partitionMayGo(p([1], Date.UTC(2000, 0, 1), 'future'), horizons)).toBe(false);
  });
});

/** A reading of the simulated store. */
interface Row {
  lab: number;
  ts: number;
}

/** Splits simulated readings into month partitions (with the catch-alls) as reading-partitions.ts lays them out. */
function partitionsOf(rows: readonly Row[], firstMonth: number, lastMonth: number): Array<PartitionForPlan & { holds: (ts: number) => boolean }> {
  const parts: Array<PartitionForPlan & { holds: (ts: number) => boolean }> = [];
  const labsIn = (from: number, to: number) => [...new Set(rows.filter((r) => r.ts >= from && r.ts < to).map((r) => r.lab))];
  parts.push({ name: 'p_before', kind: 'before', monthEnd: firstMonth, labIds: labsIn(-Infinity, firstMonth), holds: (ts) => ts < firstMonth });
  for (let m = firstMonth; m <= lastMonth; m = nextMonth(m)) {
    const end = nextMonth(m);
    const start = m;
    parts.push({ name: `p${m}`, kind: 'month', monthEnd: end, labIds: labsIn(start, end), holds: (ts) => ts >= start && ts < end });
  }
  const last = nextMonth(lastMonth);
  parts.push({ name: 'p_future', kind: 'future', monthEnd: Number.MAX_SAFE_INTEGER, labIds: labsIn(last, Infinity), holds: (ts) => ts >= last });
  return parts;
}

describe('planRetention (property: random plans, labs and readings across months)', () => {
  const lab = fc.record({
    historyDays: fc.integer({ min: 1, max: 900 }),
    exportDays: fc.integer({ min: 0, max: 90 }),
    removes: fc.boolean(),
    /** A lab without a horizon stands for a deleted lab (the deletion job's rows). */
    known: fc.boolean(),
    readings: fc.array(fc.integer({ min: 0, max: 1100 * DAY_MS }), { minLength: 0, maxLength: 40 }),
  });

  it('removes every reading before a removing lab’s horizon and none at or after any lab’s horizon; keep-everything and unknown labs lose nothing', () => {
    fc.assert(
      fc.property(fc.array(lab, { minLength: 1, maxLength: 6 }), fc.integer({ min: 0, max: 400 * DAY_MS }), (labs, nowShift) => {
        const now = Date.UTC(2026, 11, 4) + nowShift;
        const origin = now - 1000 * DAY_MS;
        const rows: Row[] = labs.flatMap((l, i) => l.readings.map((offset) => ({ lab: i + 1, ts: origin + offset })));
        const horizons = new Map<number, number>();
        labs.forEach((l, i) => {
          if (l.known)
            horizons.set(i + 1, removalHorizon({ historyDays: l.historyDays, readingRemoval: { enabled: l.removes, exportDays: l.exportDays } }, now));
        });
        // month partitions from a random first month (older rows fall in p_before) to a month past now
        const firstMonth = monthStart(origin + (nowShift % (400 * DAY_MS)));
        const parts = partitionsOf(rows, firstMonth, monthStart(now + 40 * DAY_MS));
        const plan = planRetention({ horizons, partitions: parts });

        // carry the plan out on the simulated store: drop partitions whole, then prune by lab
        const dropped = parts.filter((p) => plan.dropPartitions.includes(p.name));
        let left = rows.filter((r) => !dropped.some((p) => p.holds(r.ts)));
        for (const { labId, beforeMs } of plan.prune) left = left.filter((r) => !(r.lab === labId && r.ts < beforeMs));

        const kept = new Set(left);
        labs.forEach((l, i) => {
          const id = i + 1;
          const mine = rows.filter((r) => r.lab === id);
          // the horizon computed again here from the plan's own terms, not through the planner
          const horizon = l.known && l.removes ? Math.floor((now - (l.historyDays + l.exportDays) * DAY_MS) / DAY_MS) * DAY_MS : -Infinity;
          for (const r of mine) {
            if (r.ts >= horizon) expect(kept.has(r), `lab ${id} lost a reading at or after its horizon`).toBe(true);
            else expect(kept.has(r), `lab ${id} kept a reading before its horizon`).toBe(false);
          }
        });
        // dropped partitions are listed oldest first
        const ends = dropped.map((p) => p.monthEnd);
        expect(ends).toEqual([...ends].sort((a, b) => a - b));
      }),
      { seed: 4242, numRuns: 400 },
    );
  });

  it('drops a month only every lab of which is past it, and prunes the rest by lab', () => {
    const now = Date.UTC(2026, 11, 4);
    const horizons = new Map([
      [1, Date.UTC(2026, 5, 10)],
      [2, Date.UTC(2026, 2, 1)],
      [3, KEEP_EVERYTHING],
    ]);
    const parts: PartitionForPlan[] = [
      { name: 'p202601', kind: 'month', monthEnd: Date.UTC(2026, 1, 1), labIds: [1, 2] },
      { name: 'p202602', kind: 'month', monthEnd: Date.UTC(2026, 2, 1), labIds: [2] },
      { name: 'p202603', kind: 'month', monthEnd: Date.UTC(2026, 3, 1), labIds: [1, 2] },
      { name: 'p202604', kind: 'month', monthEnd: Date.UTC(2026, 4, 1), labIds: [1] },
      { name: 'p202605', kind: 'month', monthEnd: Date.UTC(2026, 5, 1), labIds: [1, 3] },
      { name: 'p_future', kind: 'future', monthEnd: Number.MAX_SAFE_INTEGER, labIds: [] },
    ];
    expect(now).toBeGreaterThan(Date.UTC(2026, 5, 10));
    expect(planRetention({ horizons, partitions: parts })).toEqual({
      dropPartitions: ['p202601', 'p202602', 'p202604'],
      prune: [
        { labId: 1, beforeMs: Date.UTC(2026, 5, 10) },
        { labId: 2, beforeMs: Date.UTC(2026, 2, 1) },
      ],
    });
  });
});
