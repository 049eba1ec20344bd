import { describe, expect, it } from 'vitest';
import { createDiagnosticsConcurrency, DiagnosticsBusyError, DIAGNOSTICS_RETRY_AFTER_S } from './diagnostics-concurrency.ts';

/** A run held open until the test lets it finish (no timers). */
function held() {
  let finish!: () => void;
  const done = new Promise<void>((resolve) => (finish = resolve));
  return { done, finish };
}

/** Runs "work" under the gate the way the diagnostics route does: enter, await, leave in finally. */
async function runUnder(gate: ReturnType<typeof createDiagnosticsConcurrency>, person: number, what: string, work: Promise<void>): Promise<void> {
  const leave = gate.enter(person, what);
  try {
    await work;
  } finally {
    leave();
  }
}

const refusal = (fn: () => unknown): DiagnosticsBusyError => {
  try {
    fn();
  } catch (err) {
    if (err instanceof DiagnosticsBusyError) return err;
    throw err;
  }
  throw new Error('expected a DiagnosticsBusyError');
};

describe('createDiagnosticsConcurrency', () => {
  it('refuses a third run of one person while two are held, names them, and lets another person run', async () => {
    const gate = createDiagnosticsConcurrency({ maxPerPerson: 2 });
    const a = held();
    const b = held();
    const first = runUnder(gate, 7, "channel 'Air temperature'", a.done);
    const second = runUnder(gate, 7, "channel 'Soil moisture'", b.done);
    expect(gate.running(7)).toBe(2);

    const err = refusal(() => gate.enter(7, "channel 'Leaf wetness'"));
    expect(err.status).toBe(429);
    expect(err.code).toBe('diagnostics_busy');
    expect(err.retryAfterSeconds).toBe(DIAGNOSTICS_RETRY_AFTER_S);
    expect(err.message).toBe(
      "2 diagnostics runs of yours are still running (channel 'Air temperature', channel 'Soil moisture'); try again when one finishes.",
    );
    expect(gate.running(7)).toBe(2);

    // Someone else is not held back by person 7's runs.
    const other = held();
    const theirs = runUnder(gate, 8, "channel 'Air temperature'", other.done);
    expect(gate.running(8)).toBe(1);
    other.finish();
    await theirs;
    expect(gate.running(8)).toBe(0);

    // One of person 7's runs finishes: the next one is accepted.
    a.finish();
    await first;
    expect(gate.running(7)).toBe(1);
    const c = held();
    const third = runUnder(gate, 7, "channel 'Leaf wetness'", c.done);
    expect(gate.running(7)).toBe(2);
    b.finish();
    c.finish();
    await Promise.all([second, third]);
    expect(gate.running(7)).toBe(0);
  });

  it('gives the slot back when the run fails', async () => {
    const gate = createDiagnosticsConcurrency({ maxPerPerson: 1 });
    await expect(runUnder(gate, 3, "channel 'CO2'", Promise.reject(new Error('engine refused')))).rejects.toThrow('engine refused');
    expect(gate.running(3)).toBe(0);
    const leave = gate.enter(3, "channel 'CO2'");
    expect(refusal(() => gate.enter(3, "channel 'Humidity'")).message).toBe(
      "1 diagnostics run of yours is still running (channel 'CO2'); try again when one finishes.",
    );
    leave();
  });

  it('ignores a second release of the same slot', () => {
    const gate = createDiagnosticsConcurrency({ maxPerPerson: 2, retryAfterS: 9 });
    const leaveA = gate.enter(1, 'a');
    gate.enter(1, 'b');
    leaveA();
    leaveA();
    expect(gate.running(1)).toBe(1);
    gate.enter(1, 'c');
    const err = refusal(() => gate.enter(1, 'd'));
    expect(err.message).toContain('(b, c)');
    expect(err.retryAfterSeconds).toBe(9);
  });

  it.each([0, -1, 1.5, Number.NaN])('refuses maxPerPerson %s', (max) => {
    expect(() => createDiagnosticsConcurrency({ maxPerPerson: max })).toThrow(/maxPerPerson must be a whole number of at least 1/);
  });
});
