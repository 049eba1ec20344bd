import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { createLeaseRunner, LeaseLostError, type HeldLease } from '../../server/jobs/job-lease.ts';
import { twoServerPools } from '../support/two-server-pools.ts';

/**
 * The cluster-wide job lease (issue #20 item 4). Two database pools stand for two app servers;
 * a simulated clock drives expiry, so no test waits for a TTL to pass.
 */
const pools = twoServerPools();

/** A lease name of its own per test, so tests sharing the database never meet. */
const leaseName = () => `test-${randomUUID().slice(0, 12)}`;

/** A clock that only moves when told. */
function simulatedClock(start = Date.UTC(2026, 11, 4, 12, 0, 0)) {
  let t = start;
  return { now: () => new Date(t), advance: (ms: number) => (t += ms) };
}

const TTL = 60_000;

describe('job lease', () => {
  it('two runners on one name at the same moment: exactly one runs, the other is told who holds it', async () => {
    for (let round = 0; round < 10; round++) {
      const name = leaseName();
      const clock = simulatedClock();
      const a = createLeaseRunner({ db: pools.serverA, holder: 'server-a', now: clock.now });
      const b = createLeaseRunner({ db: pools.serverB, holder: 'server-b', now: clock.now });
      let inside = 0;
      let maxInside = 0;
      const work = async () => {
        inside++;
        maxInside = Math.max(maxInside, inside);
        await new Promise((r) => setTimeout(r, 30));
        inside--;
        return 'done';
      };
      const results = await Promise.all([a.run(name, TTL, work), b.run(name, TTL, work)]);
      const ran = results.filter((r) => r.ran);
      expect(ran).toHaveLength(1);
      expect(maxInside).toBe(1);
      const skipped = results.find((r) => !r.ran);
      expect(skipped && !skipped.ran ? skipped.heldBy : null).toBe(results[0].ran ? 'server-a' : 'server-b');
      expect(ran[0].ran && ran[0].value).toBe('done');
    }
  });

  it('a held, unexpired lease refuses another holder; its holder may run again', async () => {
    const name = leaseName();
    const clock = simulatedClock();
    const a = createLeaseRunner({ db: pools.serverA, holder: 'server-a', now: clock.now });
    const b = createLeaseRunner({ db: pools.serverB, holder: 'server-b', now: clock.now });
    const outcome = await a.run(name, TTL, async () => {
      clock.advance(TTL - 1);
      const other = await b.run(name, TTL, async () => 'b ran');
      const again = await a.run(name, TTL, async (lease) => lease.fencing);
      return { other, again };
    });
    expect(outcome.ran && outcome.value.other).toEqual({ ran: false, heldBy: 'server-a' });
    expect(outcome.ran && outcome.value.again).toEqual({ ran: true, value: 1 });
  });

  it('a holder that stops renewing is replaced after expiry, with a higher fencing number; its renew and assertHeld throw LeaseLostError', async () => {
    const name = leaseName();
    const clock = simulatedClock();
    const a = createLeaseRunner({ db: pools.serverA, holder: 'server-a', now: clock.now });
    const b = createLeaseRunner({ db: pools.serverB, holder: 'server-b', now: clock.now });
    let staleLease: HeldLease | null = null;
    const outcome = await a.run(name, TTL, async (lease) => {
      staleLease = lease;
      await lease.assertHeld();
      clock.advance(TTL); // expires exactly now: no longer held
      await expect(lease.assertHeld()).rejects.toBeInstanceOf(LeaseLostError);
      const taken = await b.run(name, TTL, async (bLease) => {
        await bLease.assertHeld();
        // the stale holder wakes up while the other one works
        await expect(lease.renew()).rejects.toBeInstanceOf(LeaseLostError);
        await expect(lease.assertHeld()).rejects.toBeInstanceOf(LeaseLostError);
        await bLease.assertHeld();
        return bLease.fencing;
      });
      return { aFencing: lease.fencing, taken };
    });
    expect(outcome.ran).toBe(true);
    if (!outcome.ran) return;
    expect(outcome.value.taken.ran).toBe(true);
    if (!outcome.value.taken.ran) return;
    expect(outcome.value.taken.value).toBeGreaterThan(outcome.value.aFencing);
    // after b released, the stale holder still cannot act on its old fencing number
    await expect(staleLease!.renew()).rejects.toBeInstanceOf(LeaseLostError);
    await expect(staleLease!.assertHeld()).rejects.toThrow(/no longer held/);
  });

  it('renewing keeps the lease past its first expiry; others are refused until the renewed expiry', async () => {
    const name = leaseName();
    const clock = simulatedClock();
    const a = createLeaseRunner({ db: pools.serverA, holder: 'server-a', now: clock.now });
    const b = createLeaseRunner({ db: pools.serverB, holder: 'server-b', now: clock.now });
    const outcome = await a.run(name, TTL, async (lease) => {
      clock.advance(TTL - 1_000);
      await lease.renew(); // now expires at start + 2·TTL − 1 s
      clock.advance(2_000); // past the first expiry
      await lease.assertHeld();
      const refused = await b.run(name, TTL, async () => 'b ran');
      clock.advance(TTL); // past the renewed expiry
      const taken = await b.run(name, TTL, async (bLease) => bLease.fencing);
      return { refused, taken, fencing: lease.fencing };
    });
    expect(outcome.ran).toBe(true);
    if (!outcome.ran) return;
    expect(outcome.value.refused).toEqual({ ran: false, heldBy: 'server-a' });
    expect(outcome.value.taken).toEqual({ ran: true, value: outcome.value.fencing + 1 });
  });

  it('renewing on a clock that has not moved (same expiry written again) keeps the lease', async () => {
    const name = leaseName();
    const clock = simulatedClock();
    const a = createLeaseRunner({ db: pools.serverA, holder: 'server-a', now: clock.now });
    const outcome = await a.run(name, TTL, async (lease) => {
      await lease.renew();
      await lease.renew();
      await lease.assertHeld();
      return 'renewed';
    });
    expect(outcome).toEqual({ ran: true, value: 'renewed' });
  });

  it('release lets the other holder take the lease at once, and each change of holder raises the fencing number', async () => {
    const name = leaseName();
    const clock = simulatedClock();
    const a = createLeaseRunner({ db: pools.serverA, holder: 'server-a', now: clock.now });
    const b = createLeaseRunner({ db: pools.serverB, holder: 'server-b', now: clock.now });
    const seen: number[] = [];
    for (let i = 0; i < 3; i++) {
      for (const runner of [a, b]) {
        const r = await runner.run(name, TTL, async (lease) => lease.fencing);
        expect(r.ran).toBe(true);
        if (r.ran) seen.push(r.value);
      }
    }
    expect(seen).toEqual([1, 2, 3, 4, 5, 6]);
    const [row] = await pools.serverA('job_leases').where('name', name).select('holder', 'fencing');
    expect(row).toEqual({ holder: '', fencing: 6 });
  });

  it('a failing job still releases its lease, and the error reaches the caller', async () => {
    const name = leaseName();
    const clock = simulatedClock();
    const a = createLeaseRunner({ db: pools.serverA, holder: 'server-a', now: clock.now });
    const b = createLeaseRunner({ db: pools.serverB, holder: 'server-b', now: clock.now });
    await expect(
      a.run(name, TTL, async () => {
        throw new Error('the job broke');
      }),
    ).rejects.toThrow('the job broke');
    expect(await b.run(name, TTL, async () => 'b ran')).toEqual({ ran: true, value: 'b ran' });
  });

  it('refuses a bad TTL or holder with a clear error', async () => {
    const a = createLeaseRunner({ db: pools.serverA, holder: 'server-a' });
    await expect(a.run(leaseName(), 0, async () => 1)).rejects.toThrow(/ttlMs must be a positive/);
    expect(() => createLeaseRunner({ db: pools.serverA, holder: '' })).toThrow(/holder must be 1 to 128/);
  });

  it('with a wait, a runner polls with jittered pauses and runs once the holder releases; it gives up after the wait', async () => {
    const name = leaseName();
    const clock = simulatedClock();
    const a = createLeaseRunner({ db: pools.serverA, holder: 'server-a', now: clock.now });
    const b = createLeaseRunner({ db: pools.serverB, holder: 'server-b', now: clock.now });
    const pauses: number[] = [];
    let draws = 0;
    const random = () => [0, 0.5, 0.99][draws++ % 3];
    const outcome = await a.run(name, TTL, async () => {
      // b waits while a holds: every pause is recorded, none is slept for real
      const gaveUp = await b.run(name, TTL, async () => 'b ran', { waitMs: 500, pollMs: 100, random, sleep: async (ms) => void pauses.push(ms) });
      return gaveUp;
    });
    expect(outcome).toEqual({ ran: true, value: { ran: false, heldBy: 'server-a' } });
    expect(pauses.slice(0, 3)).toEqual([50, 100, 149]); // pollMs × [0.5, 1.5)
    expect(pauses.reduce((x, y) => x + y, 0)).toBe(500); // the last pause is cut to the wait left
    let released = false;
    const waited = await a.run(name, TTL, async () => {
      const waiting = b.run(name, TTL, async (lease) => ({ fencing: lease.fencing, afterRelease: released }), { waitMs: 5000, pollMs: 20 });
      await new Promise((r) => setTimeout(r, 150));
      released = true;
      return { waiting }; // wrapped: an async function returning the promise itself would wait for it
    });
    // a's run ends (and releases) only after its work returns the pending promise, so b gets the lease then
    expect(waited.ran).toBe(true);
    if (!waited.ran) return;
    expect(await waited.value.waiting).toMatchObject({ ran: true, value: { afterRelease: true } });
  });

  it('fence: a write on the lease row inside the caller’s transaction; refused (LeaseLostError, rolled back) after a takeover', async () => {
    const name = leaseName();
    const clock = simulatedClock();
    const a = createLeaseRunner({ db: pools.serverA, holder: 'server-a', now: clock.now });
    const b = createLeaseRunner({ db: pools.serverB, holder: 'server-b', now: clock.now });
    const writes = async () => Number((await pools.serverA('job_leases').where('name', name).first('fenced_writes')).fenced_writes);
    await a.run(name, TTL, async (lease) => {
      await pools.serverA.transaction((trx) => lease.fence(trx));
      await pools.serverA.transaction((trx) => lease.fence(trx));
      expect(await writes()).toBe(2); // a real change each time: under Galera the row is in the write set
      clock.advance(TTL);
      await b.run(name, TTL, async () => {
        const before = await writes();
        await expect(pools.serverA.transaction((trx) => lease.fence(trx))).rejects.toBeInstanceOf(LeaseLostError);
        expect(await writes()).toBe(before);
      });
    });
  });
});
