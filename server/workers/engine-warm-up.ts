import { channelDiagnostics } from '../analysis/index.ts';

/** Points of the synthetic series: long enough for every path the JIT should compile. */
const WARM_UP_POINTS = 20_000;

/**
 * Runs the diagnostics bundle a few times on a synthetic series (a daily cycle of one-minute
 * steps with AR(1) noise, a gap and a partner channel), so that V8 has compiled the engine's
 * hot loops before the first real request: without it the first requests to a new worker take
 * 2–4 times as long as later ones while the optimising compiler catches up. Deterministic and
 * self-contained; never throws (a warm-up failure must not stop the worker).
 */
export function warmUpEngine(rounds = 3): void {
  try {
    const step = 60_000;
    const timestamps = new Float64Array(WARM_UP_POINTS);
    const values = new Float64Array(WARM_UP_POINTS);
    const partner = new Float64Array(WARM_UP_POINTS);
    let state = 1;
    let noise = 0;
    for (let i = 0; i < WARM_UP_POINTS; i++) {
      state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
      noise = 0.8 * noise + state / 2 ** 32 - 0.5;
      timestamps[i] = i * step;
      values[i] = i >= 5_000 && i < 5_010 ? NaN : 10 + 3 * Math.sin((2 * Math.PI * i) / 1440) + noise;
      partner[i] = 2 * values[(i + WARM_UP_POINTS - 30) % WARM_UP_POINTS] + noise;
    }
    for (let r = 0; r < rounds; r++) {
      channelDiagnostics({ timestamps, values }, { step, agg: 'mean', alpha: 0.05 }, r === 0 ? { timestamps, values: partner } : undefined);
    }
  } catch {
    // The worker serves requests either way; only the first ones are slower.
  }
}
