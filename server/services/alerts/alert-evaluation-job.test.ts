import { describe, expect, it } from 'vitest';
import { createLogWriter } from '../../log-writer.ts';
import type { EvaluationSummary } from './alert-evaluator.ts';
import { alertEvaluationJob, PENDING_TICKS_KEPT } from './alert-triggers.ts';

const done: EvaluationSummary = { ran: true, opened: 0, resolved: 0, reminders: 0, sent: 0, failed: 0, errors: 0 };

/** An evaluator whose runs end only when the test lets them, recording the time each run was given. */
function heldEvaluator() {
  const runs: number[] = [];
  const waiting: Array<() => void> = [];
  let cycles = false;
  return {
    runs,
    cycles: () => cycles,
    finishOne: () => waiting.shift()?.(),
    evaluator: {
      runOnce: (at: number) => {
        runs.push(at);
        return new Promise<EvaluationSummary>((resolve) => waiting.push(() => resolve(done)));
      },
      takeCyclesFromNudges: (on: boolean) => void (cycles = on),
    },
  };
}

const settle = () => new Promise((resolve) => setTimeout(resolve, 0));

describe('the scheduled alert job', () => {
  it('a tick that comes during a run waits and then runs with its own time (its own cycle), oldest first', async () => {
    const e = heldEvaluator();
    let clock = 1_000;
    const job = alertEvaluationJob({ evaluator: e.evaluator, logger: createLogWriter({ silent: true }), everyS: 5, now: () => clock });
    const first = job.tickNow();
    clock = 6_000;
    void job.tickNow();
    clock = 11_000;
    void job.tickNow();
    await settle();
    expect(e.runs).toEqual([1_000]); // one run at a time
    e.finishOne();
    await settle();
    expect(e.runs).toEqual([1_000, 6_000]);
    e.finishOne();
    await settle();
    e.finishOne();
    await first;
    expect(e.runs).toEqual([1_000, 6_000, 11_000]);
  });

  it(`keeps at most ${PENDING_TICKS_KEPT} waiting ticks (the newest), and turns nudge cycles on while it runs`, async () => {
    const e = heldEvaluator();
    let clock = 0;
    const job = alertEvaluationJob({ evaluator: e.evaluator, logger: createLogWriter({ silent: true }), everyS: 3600, now: () => clock });
    job.start();
    expect(e.cycles()).toBe(true);
    const all = job.tickNow();
    for (let i = 1; i <= 5; i++) {
      clock = i * 5_000;
      void job.tickNow();
    }
    for (let i = 0; i < 4; i++) {
      e.finishOne();
      await settle();
    }
    await all;
    expect(e.runs).toEqual([0, 15_000, 20_000, 25_000]);
    await job.stop();
    expect(e.cycles()).toBe(false);
  });
});
