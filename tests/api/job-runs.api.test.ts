import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { createLeaseRunner, LeaseLostError } from '../../server/jobs/job-lease.ts';
import { cycleStart, jobCycles, JOB_RUNS_KEPT_MS, PRUNE_LIMIT } from '../../server/jobs/job-cycles.ts';
import { twoServerPools } from '../support/two-server-pools.ts';

/**
 * Once-per-cycle runs of scheduled jobs (`job_runs`, server/jobs/job-cycles.ts). Two database
 * pools stand for two app servers; a simulated clock drives the leases.
 */
const pools = twoServerPools();

/** A job name of its own per test, so tests sharing the database never meet. */
const jobName = () => `test-cycles-${randomUUID().slice(0, 12)}`;
const TTL = 60_000;
const CYCLE = 30_000;

function simulatedClock(start = Date.UTC(2026, 11, 4, 12, 0, 0)) {
  let t = start;
  return { now: () => new Date(t), ms: () => t, advance: (ms: number) => (t += ms) };
}

const rowsOf = (name: string) => pools.serverA('job_runs').where('name', name).orderBy('period_start');

describe('job cycles', () => {
  it('cycleStart floors to the interval in UTC', () => {
    expect(cycleStart(Date.UTC(2026, 11, 4, 12, 0, 29, 999), CYCLE).toISOString()).toBe('2026-12-04T12:00:00.000Z');
    expect(cycleStart(Date.UTC(2026, 11, 4, 12, 0, 30), CYCLE).toISOString()).toBe('2026-12-04T12:00:30.000Z');
    expect(() => cycleStart(0, 0)).toThrow(/cycleMs must be a whole number/);
  });

  it('two servers ticking in the same cycle at the same moment: exactly one claims it, one row, every round', async () => {
    const name = jobName();
    const clock = simulatedClock();
    const servers = [
      { runner: createLeaseRunner({ db: pools.serverA, holder: 'server-a', now: clock.now }), cycles: jobCycles(pools.serverA) },
      { runner: createLeaseRunner({ db: pools.serverB, holder: 'server-b', now: clock.now }), cycles: jobCycles(pools.serverB) },
    ];
    for (let round = 0; round < 8; round++) {
      const period = cycleStart(clock.ms(), CYCLE);
      const tick = (s: (typeof servers)[number]) =>
        s.runner.run(
          name,
          TTL,
          async (lease) => {
            if (!(await s.cycles.claim(lease, period, clock.now()))) return 'cycle-done';
            await s.cycles.finish(lease, period, clock.now());
            return 'ran';
          },
          { waitMs: 2000, pollMs: 20 },
        );
      const outcomes = await Promise.all(servers.map(tick));
      expect(outcomes.map((o) => (o.ran ? o.value : 'busy')).sort()).toEqual(['cycle-done', 'ran']);
      clock.advance(CYCLE);
    }
    const rows = await rowsOf(name);
    expect(rows).toHaveLength(8);
    expect(rows.every((r) => r.finished_at !== null)).toBe(true);
    expect(new Set(rows.map((r) => new Date(r.period_start).getTime())).size).toBe(8);
  });

  it('a stale holder can neither claim nor finish a cycle after a takeover; the new holder can', async () => {
    const name = jobName();
    const clock = simulatedClock();
    const a = createLeaseRunner({ db: pools.serverA, holder: 'server-a', now: clock.now });
    const b = createLeaseRunner({ db: pools.serverB, holder: 'server-b', now: clock.now });
    const cyclesA = jobCycles(pools.serverA);
    const cyclesB = jobCycles(pools.serverB);
    const period = cycleStart(clock.ms(), CYCLE);
    const outcome = await a.run(name, TTL, async (staleLease) => {
      expect(await cyclesA.claim(staleLease, period, clock.now())).toBe(true);
      clock.advance(TTL); // A stalls past its lease; B takes over in the next cycle
      const next = cycleStart(clock.ms(), CYCLE);
      return b.run(name, TTL, async (freshLease) => {
        await expect(cyclesA.claim(staleLease, next, clock.now())).rejects.toBeInstanceOf(LeaseLostError);
        await expect(cyclesA.finish(staleLease, period, clock.now())).rejects.toBeInstanceOf(LeaseLostError);
        expect(await cyclesB.claim(freshLease, next, clock.now())).toBe(true);
        expect(await cyclesB.finish(freshLease, next, clock.now())).toBe(true);
        return next;
      });
    });
    expect(outcome.ran && outcome.value.ran).toBe(true);
    const rows = await rowsOf(name);
    expect(rows.map((r) => [r.holder, r.finished_at === null])).toEqual([
      ['server-a', true], // claimed, never finished: A lost the lease mid-cycle
      ['server-b', false],
    ]);
    expect(Number(rows[1].fencing)).toBe(Number(rows[0].fencing) + 1);
  });

  it('pruning deletes cycles older than seven days, at most PRUNE_LIMIT rows per call', async () => {
    const name = jobName();
    const now = Date.UTC(2026, 11, 4, 12);
    const old = Array.from({ length: PRUNE_LIMIT + 205 }, (_, i) => ({
      name,
      period_start: new Date(now - JOB_RUNS_KEPT_MS - (i + 1) * 1000),
      holder: 'old',
      fencing: 1,
      started_at: new Date(now - JOB_RUNS_KEPT_MS),
    }));
    const recent = [1, 2, 3].map((i) => ({ name, period_start: new Date(now - i * CYCLE), holder: 'recent', fencing: 1, started_at: new Date(now) }));
    for (let i = 0; i < old.length; i += 500) await pools.serverA('job_runs').insert(old.slice(i, i + 500));
    await pools.serverA('job_runs').insert(recent);
    const cycles = jobCycles(pools.serverA);
    expect(await cycles.prune(name, now)).toBe(PRUNE_LIMIT);
    expect(await cycles.prune(name, now)).toBe(205);
    expect(await cycles.prune(name, now)).toBe(0);
    expect((await rowsOf(name)).map((r) => r.holder)).toEqual(['recent', 'recent', 'recent']);
  });
});
