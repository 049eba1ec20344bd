/**
 * Period search benchmark: detection rates of `detectPeriod` on seeded simulated logger series
 * (the issue #16 scenarios, with more replicates than the unit simulation test) and its time at
 * n = 100,000. Reports; never asserts.
 *
 * Run: npx tsx tests/bench/analysis-period.bench.ts   (BENCH_PERIOD_SCALE=0.2 for a quick look)
 *
 * Scenario conventions (server/analysis/period-scenarios.testkit.ts): noise SD is the marginal
 * SD of the AR(1) noise; a cycle of amplitude A is A·sin(2πt/P + phase); φ is per 5-minute
 * step, scaled to other steps as φ₅^(step/5 min).
 */
import { detectPeriod } from '../../server/analysis/detect-period.ts';
import { DAY_MS, MINUTE_MS, ar1Noise, cycleSeries, stormLevel } from '../../server/analysis/period-scenarios.testkit.ts';
import { seededNormal, seededUniform, simulateArma } from '../../server/analysis/seeded-simulation.testkit.ts';
import { timeMedian } from './bench-helpers.ts';

const SCALE = Number(process.env.BENCH_PERIOD_SCALE ?? 1);
const reps = (count: number) => Math.max(10, Math.round(count * SCALE));

interface Scenario {
  name: string;
  stepMinutes: number;
  replicates: number;
  make: (seed: number) => Float64Array;
  /** The right answer: the period in steps, or null for "no cycle". */
  truth: number | null;
}

function weatherDay(stepMinutes: number) {
  return (seed: number) => {
    const draw = seededUniform(1000 * stepMinutes + seed);
    return cycleSeries({ stepMinutes, days: 14, amplitude: 1 + 2 * draw(), phi5: 0.5 + 0.45 * draw() }, seed);
  };
}

const scenarios: Scenario[] = [
  ...[1, 5, 10, 15, 60].map((step) => ({
    name: `day, ${step}-min steps, 14 days, A 1–3 SD, φ₅ 0.5–0.95`,
    stepMinutes: step,
    replicates: reps(step === 1 ? 300 : 1000),
    make: weatherDay(step),
    truth: 1440 / step,
  })),
  ...[0.5, 0.9, 0.95, 0.98].flatMap((phi) =>
    [14, 30].map((days) => ({
      name: `AR(1) φ ${phi}, ${days} days of 5-min steps, no cycle`,
      stepMinutes: 5,
      replicates: reps(500),
      make: (seed: number) => ar1Noise(days * 288, phi, 1, seededNormal(seed)),
      truth: null,
    })),
  ),
  ...[7, 14, 30, 90].map((days) => ({
    name: `storm-driven level, ${days} days of 5-min steps, no cycle`,
    stepMinutes: 5,
    replicates: reps(days === 90 ? 200 : 500),
    make: (seed: number) => stormLevel(days * 288, 5, seed),
    truth: null,
  })),
  {
    name: 'weak day: cycle SD 0.3 noise SD (A ≈ 0.42), φ 0.97, 30 days',
    stepMinutes: 5,
    replicates: reps(500),
    make: (seed) => cycleSeries({ stepMinutes: 5, days: 30, amplitude: 0.3 * Math.SQRT2, phi5: 0.97 }, seed),
    truth: 288,
  },
  {
    name: 'weak day: amplitude 0.3 noise SD, φ 0.97, 30 days',
    stepMinutes: 5,
    replicates: reps(500),
    make: (seed) => cycleSeries({ stepMinutes: 5, days: 30, amplitude: 0.3, phi5: 0.97 }, seed),
    truth: 288,
  },
  // Short records and cycles that are not a pure sine (the harmonic rule and whole-hour parts of a day).
  ...[3, 4, 5, 7].flatMap((days) =>
    [5, 10].map((step) => ({
      name: `daylight arch, ${step}-min steps, ${days} days, A 2–4 SD, φ₅ 0.90–0.99`,
      stepMinutes: step,
      replicates: reps(500),
      make: (seed: number) => {
        const draw = seededUniform(7000 + 1000 * step + seed);
        return cycleSeries({ stepMinutes: step, days, amplitude: 2 + 2 * draw(), phi5: 0.9 + 0.09 * draw(), shape: 'daylight' }, seed);
      },
      truth: 1440 / step,
    })),
  ),
  ...[3, 4, 7].map((days) => ({
    name: `half-day sine (144 steps), 5-min steps, ${days} days, A 1–3 SD, φ₅ 0.5–0.95`,
    stepMinutes: 5,
    replicates: reps(500),
    make: (seed: number) => {
      const draw = seededUniform(9500 + seed);
      return cycleSeries({ stepMinutes: 5, days, amplitude: 1 + 2 * draw(), phi5: 0.5 + 0.45 * draw(), period: 144 }, seed);
    },
    truth: 144,
  })),
  ...[3, 5].flatMap((days) =>
    [0.9, 0.98].map((phi) => ({
      name: `AR(1) φ ${phi}, ${days} days of 5-min steps, no cycle`,
      stepMinutes: 5,
      replicates: reps(500),
      make: (seed: number) => ar1Noise(days * 288, phi, 1, seededNormal(seed)),
      truth: null,
    })),
  ),
];

console.log(`detectPeriod detection rates (seeds 1..N; "exact" = best equals the truth; with stepMs, and without it for comparison)`);
console.log(`${'scenario'.padEnd(62)} ${'N'.padStart(5)}  ${'with stepMs'.padStart(12)}  ${'without'.padStart(9)}  most frequent wrong answers (with stepMs)`);
for (const s of scenarios) {
  let right = 0;
  let rightRaw = 0;
  const wrong = new Map<string, number>();
  for (let seed = 1; seed <= s.replicates; seed++) {
    const x = s.make(seed);
    const best = detectPeriod(x, { stepMs: s.stepMinutes * MINUTE_MS }).best;
    if (best === s.truth) right++;
    else wrong.set(String(best), (wrong.get(String(best)) ?? 0) + 1);
    if (detectPeriod(x).best === s.truth) rightRaw++;
  }
  const pct = (k: number) => `${((100 * k) / s.replicates).toFixed(1)} %`;
  const top = [...wrong.entries()]
    .sort((a, b) => b[1] - a[1])
    .slice(0, 4)
    .map(([k, v]) => `${k}×${v}`)
    .join(' ');
  console.log(`${s.name.padEnd(62)} ${String(s.replicates).padStart(5)}  ${pct(right).padStart(12)}  ${pct(rightRaw).padStart(9)}  ${top}`);
}

// Stability: the last 7, 30 and 90 days of one simulated 90-day channel.
const perDay = DAY_MS / (5 * MINUTE_MS);
const channels: [string, (seed: number) => Float64Array, number | null][] = [
  ['water bath: AR(1) φ 0.96', (seed) => ar1Noise(90 * perDay, 0.96, 1, seededNormal(seed)), null],
  ['glasshouse: day 1.5 SD, φ₅ 0.9', (seed) => cycleSeries({ stepMinutes: 5, days: 90, amplitude: 1.5, phi5: 0.9 }, seed), 288],
  ['cold store: day 1.2 SD, φ₅ 0.99', (seed) => cycleSeries({ stepMinutes: 5, days: 90, amplitude: 1.2, phi5: 0.99 }, seed), 288],
  ['stream gauge: storms', (seed) => stormLevel(90 * perDay, 5, seed), null],
];
console.log('\nSame verdict on the last 7, 30 and 90 days of one channel (5-min steps, stepMs given)');
for (const [name, make, truth] of channels) {
  const n = reps(100);
  let same = 0;
  let right = 0;
  for (let seed = 1; seed <= n; seed++) {
    const whole = make(seed);
    const verdicts = [7, 30, 90].map((days) => detectPeriod(whole.subarray(whole.length - days * perDay), { stepMs: 5 * MINUTE_MS }).best);
    if (verdicts.every((v) => v === verdicts[0])) same++;
    if (verdicts.every((v) => v === truth)) right++;
  }
  console.log(`${name.padEnd(40)} N ${n}: same verdict ${((100 * same) / n).toFixed(1)} %, all three right ${((100 * right) / n).toFixed(1)} %`);
}

// Time at n = 100,000 (a daily cycle in 5-minute steps plus AR(1) noise, as the other engine benches).
const big = simulateArma({ ar: [0.8] }, 100_000, 2024).map((v, t) => v + 2 * Math.sin((2 * Math.PI * t) / 288));
const runs = { runs: 21, warmup: 3 };
console.log('\ndetectPeriod at n = 100,000 (median of 21 runs after 3 warm-up runs)');
console.log(`  without stepMs: ${(1000 * timeMedian(() => detectPeriod(big), runs)).toFixed(1)} ms`);
console.log(`  with stepMs (3 calendar periods tested): ${(1000 * timeMedian(() => detectPeriod(big, { stepMs: 5 * MINUTE_MS }), runs)).toFixed(1)} ms`);
