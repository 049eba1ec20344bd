import { describe, expect, it } from 'vitest';
import { evaluateUnusualReading, unusualScores, type UnusualParams } from './unusual-reading-rule.ts';
import { FRESH_MEMORY, type RuleReading } from './rule-step.ts';

// Simulated data for a behaviour test (not a numeric reference): a growth room read every
// 15 min, warm in the afternoon (a daily cycle of ±3 °C around 21 °C, peak at 15:00) plus
// seeded uniform noise of ±0.2 °C. The decomposition is the engine's STL (Cleveland et al.
// 1990, checked against R and statsmodels in server/analysis/stl.test.ts).
const STEP = 900_000;
const PER_DAY = 96;
const t0 = Date.UTC(2026, 5, 1);
const params: UnusualParams = { periodH: 24, k: 5, historyCycles: 3 };

/** A seeded linear congruential generator (Numerical Recipes constants). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

/** Three days of history and a function giving the usual reading of any later quarter-hour. */
function scenario(seed: number) {
  const rnd = lcg(seed);
  const usual = (i: number) => 21 + 3 * Math.cos((2 * Math.PI * (i - 60)) / PER_DAY) + 0.4 * (rnd() - 0.5);
  const history = { ts: [] as number[], values: [] as number[] };
  for (let i = 0; i < 3 * PER_DAY; i++) {
    history.ts.push(t0 + i * STEP);
    history.values.push(usual(i));
  }
  const reading = (i: number, value = usual(i)): RuleReading => ({ ts: t0 + i * STEP, value });
  return { history, usual, reading };
}

/** Feeds readings one at a time (as ingestion does), each judged with the history before it. */
function feed(s: ReturnType<typeof scenario>, readings: RuleReading[]) {
  const history = { ts: [...s.history.ts], values: [...s.history.values] };
  let memory = FRESH_MEMORY;
  const transitions = [];
  for (const r of readings) {
    const window = 3 * PER_DAY;
    const scores = unusualScores({ ts: history.ts.slice(-window), values: history.values.slice(-window) }, [r], STEP, PER_DAY);
    const step = evaluateUnusualReading(params, scores, memory, [r]);
    memory = step.memory;
    transitions.push(...step.transitions);
    history.ts.push(r.ts);
    history.values.push(r.value);
  }
  return transitions;
}

const D3 = 3 * PER_DAY;

describe('evaluateUnusualReading', () => {
  it('a normal day with its afternoon peak (≈ 24 °C at 15:00) raises nothing, for 12 seeds', () => {
    for (let seed = 1; seed <= 12; seed++) {
      const s = scenario(seed);
      const day = Array.from({ length: PER_DAY }, (_, j) => s.reading(D3 + j));
      expect(Math.max(...day.map((r) => r.value))).toBeGreaterThan(23.7);
      expect(feed(s, day), `seed ${seed}`).toEqual([]);
    }
  });

  it('the same 24 °C at 03:00 is unusual; the next usual reading resolves it', () => {
    const s = scenario(7);
    const spikeAt = D3 + 12; // 03:00 on day 4
    const readings = Array.from({ length: 40 }, (_, j) => (D3 + j === spikeAt ? s.reading(D3 + j, 24) : s.reading(D3 + j)));
    const transitions = feed(s, readings);
    expect(transitions.map((t) => [t.kind, (t.ts - t0) / STEP])).toEqual([
      ['open', spikeAt],
      ['resolve', spikeAt + 1],
    ]);
    expect(transitions[0].detail).toMatch(/^24 lies \d+(\.\d+)? robust SD above the usual pattern \(limit 5\)$/);
  });

  it('an abnormally high afternoon peak (27 °C at 15:00) is unusual', () => {
    const s = scenario(8);
    const peak = D3 + 60;
    const readings = Array.from({ length: 62 }, (_, j) => (D3 + j === peak ? s.reading(D3 + j, 27) : s.reading(D3 + j)));
    expect(feed(s, readings).map((t) => [t.kind, (t.ts - t0) / STEP])).toEqual([
      ['open', peak],
      ['resolve', peak + 1],
    ]);
  });

  it('judges nothing without three full cycles of history', () => {
    const s = scenario(9);
    const short = { ts: s.history.ts.slice(0, 3 * PER_DAY - 1), values: s.history.values.slice(0, 3 * PER_DAY - 1) };
    expect(unusualScores(short, [s.reading(3 * PER_DAY - 1, 99)], STEP, PER_DAY)).toBeNull();
    expect(evaluateUnusualReading(params, null, FRESH_MEMORY, [s.reading(0, 99)]).transitions).toEqual([]);
  });

  it('does not modify its inputs', () => {
    const s = scenario(10);
    const frozen = { ts: Object.freeze([...s.history.ts]), values: Object.freeze([...s.history.values]) };
    expect(() => unusualScores(frozen, Object.freeze([s.reading(D3)]), STEP, PER_DAY)).not.toThrow();
  });
});
