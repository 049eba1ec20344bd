/**
 * Test-only generators of logger-like series with a known truth, for the period-search
 * simulation test and benchmark (nothing in the engine imports this file). All are seeded.
 *
 * Conventions (stated here once, used in the figures of tests/bench/README.md):
 * - "noise SD" is the marginal (stationary) standard deviation of the AR(1) noise, so an AR(1)
 *   with φ has innovations of SD √(1 − φ²);
 * - a cycle of amplitude A is A·sin(2πt/P + phase) with a random phase;
 * - φ is given per 5-minute step and scaled to other steps so that the noise forgets at the
 *   same rate in real time: φ_step = φ₅^(step / 5 min).
 */
import { seededNormal, seededUniform } from './seeded-simulation.testkit.ts';

export const MINUTE_MS = 60_000;
export const DAY_MS = 24 * 60 * MINUTE_MS;

/** AR(1) noise of marginal SD `sd`, started from its stationary distribution. */
export function ar1Noise(n: number, phi: number, sd: number, normal: () => number): Float64Array {
  const out = new Float64Array(n);
  const innovation = sd * Math.sqrt(1 - phi * phi);
  let e = sd * normal();
  for (let t = 0; t < n; t++) {
    e = phi * e + innovation * normal();
    out[t] = e;
  }
  return out;
}

export interface CycleScenario {
  /** Grid step in minutes. */
  stepMinutes: number;
  /** Length of the series in days. */
  days: number;
  /** Cycle amplitude in noise SDs. */
  amplitude: number;
  /** AR(1) coefficient per 5-minute step (scaled to the grid step). */
  phi5: number;
  /** Cycle length in steps (default: one day). */
  period?: number;
  /** Add a linear drift of this many noise SDs over the whole range. */
  drift?: number;
  /**
   * Shape of the cycle: `sine` (default), or `daylight` — an arch A·max(0, sin θ)^1.3 that is
   * zero for half of each cycle, as light or sun-driven temperature is at night. The arch is
   * rich in harmonics (its second harmonic holds about a fifth of its variance), the case where
   * a search can mistake half the cycle for the period.
   */
  shape?: 'sine' | 'daylight';
}

/** The daylight arch of {@link CycleScenario.shape} at phase θ, 0…1. */
function daylightArch(theta: number): number {
  const s = Math.sin(theta);
  return s > 0 ? Math.pow(s, 1.3) : 0;
}

/** φ per grid step of `stepMinutes` for a persistence of `phi5` per 5 minutes. */
export function phiForStep(phi5: number, stepMinutes: number): number {
  return Math.pow(phi5, stepMinutes / 5);
}

/** A cycle (default one day) plus AR(1) "weather" noise of SD 1, with a random phase. */
export function cycleSeries(s: CycleScenario, seed: number): Float64Array {
  const n = Math.round((s.days * DAY_MS) / (s.stepMinutes * MINUTE_MS));
  const period = s.period ?? DAY_MS / (s.stepMinutes * MINUTE_MS);
  const normal = seededNormal(seed);
  const phase = 2 * Math.PI * seededUniform(seed ^ 0x5bd1e995)();
  const noise = ar1Noise(n, phiForStep(s.phi5, s.stepMinutes), 1, normal);
  const drift = s.drift ?? 0;
  const wave = s.shape === 'daylight' ? daylightArch : Math.sin;
  return noise.map((v, t) => v + s.amplitude * wave((2 * Math.PI * t) / period + phase) + (drift * t) / n);
}

/**
 * A storm-driven level (a shot-noise process): a base level receding linearly, storms arriving
 * at random (probability `rate` per step) that each raise the level by 15–50 units and decay
 * exponentially with a time constant of `decayHours`, plus AR(1) noise (φ 0.6, SD 0.3) —
 * no cycle. Our own scenario for a stream gauge.
 */
export function stormLevel(n: number, stepMinutes: number, seed: number, rate = 0.0015, decayHours = 20): Float64Array {
  const uniform = seededUniform(seed);
  const normal = seededNormal(seed ^ 0x2545f491);
  const decay = Math.exp(-stepMinutes / (decayHours * 60));
  const noise = ar1Noise(n, phiForStep(0.6, stepMinutes), 0.3, normal);
  const out = new Float64Array(n);
  let storm = 0;
  for (let t = 0; t < n; t++) {
    if (uniform() < rate) storm += 15 + 35 * uniform();
    storm *= decay;
    out[t] = 38 - (8 * t) / n + storm + noise[t];
  }
  return out;
}
