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

/** The history readings in the time window [from, to), as the evaluator reads them. */
function within(history: { ts: number[]; values: number[] }, from: number, to: number) {
  const keep = history.ts.map((t, i) => (t >= from && t < to ? i : -1)).filter((i) => i >= 0);
  return { ts: keep.map((i) => history.ts[i]), values: keep.map((i) => history.values[i]) };
}

/**
 * Feeds readings one at a time (as ingestion does), each judged with the history of the three
 * cycles of time before it — a time window, as the evaluator reads it, so missing readings
 * leave empty cells.
 */
function feed(s: ReturnType<typeof scenario>, readings: RuleReading[]) {
  const history = { ts: [...s.history.ts], values: [...s.history.values] };
  let memory = FRESH_MEMORY;
  const transitions = [];
  for (const r of readings) {
    const from = r.ts - 3 * PER_DAY * STEP;
    const scoring = unusualScores(within(history, from, r.ts), [r], STEP, PER_DAY, { from, to: r.ts });
    const step = evaluateUnusualReading(params, scoring.scores ? scoring : null, memory, [r]);
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
    // the reading at its own resolution, the usual value at the same, the distance as a rough multiple
    expect(transitions[0].detail).toMatch(
      /^24, about \d+(\.\d)? times the usual spread above the usual 1\d for this time of day \(limit 5 times the spread\)$/,
    );
    expect(transitions[1].detail).toMatch(/^\d+(\.\d+)? fits the usual pattern again \(the usual \d+(\.\d+)? for this time of day\)$/);
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

  it('judges nothing without three full cycles of history, and says why', () => {
    const s = scenario(9);
    const short = { ts: s.history.ts.slice(0, 3 * PER_DAY - 1), values: s.history.values.slice(0, 3 * PER_DAY - 1) };
    const scoring = unusualScores(short, [s.reading(3 * PER_DAY - 1, 99)], STEP, PER_DAY);
    expect(scoring.scores).toBeNull();
    expect(scoring.notJudged).toEqual({
      reason: 'too-little-history',
      detail: 'The history spans 287 steps; three full cycles (288 steps) are needed to learn the usual pattern.',
    });
    expect(unusualScores({ ts: [], values: [] }, [s.reading(0, 99)], STEP, PER_DAY).notJudged?.reason).toBe('no-history');
    expect(evaluateUnusualReading(params, null, FRESH_MEMORY, [s.reading(0, 99)]).transitions).toEqual([]);
  });

  // Gaps: the logger was silent for some steps. Each row removes history readings (offsets in
  // quarter-hours from the start of the three-day history) and sends a reading of about 24 °C
  // early on day 4 (usual there: 18–20 °C) at `spikeAt`; the readings between the history's end
  // and the spike never arrived. It must open an alert whatever the cells right before it hold
  // (before this rule filled end gaps, every row here was left unjudged).
  const GAP_CASES: { name: string; missing: number[]; spikeAt: number }[] = [
    { name: 'one step (00:00 of day 4) missing right before the spike', missing: [], spikeAt: D3 + 1 },
    { name: 'six steps (1.5 h) missing right before the spike', missing: [], spikeAt: D3 + 6 },
    { name: 'thirty steps (7.5 h) missing right before the spike', missing: [], spikeAt: D3 + 30 },
    { name: 'the first step of the history missing', missing: [0], spikeAt: D3 + 12 },
    { name: 'the first 20 steps (5 h) of the history missing', missing: Array.from({ length: 20 }, (_, i) => i), spikeAt: D3 + 12 },
    { name: 'interior gaps of 1 and 8 steps', missing: [100, ...Array.from({ length: 8 }, (_, i) => 200 + i)], spikeAt: D3 + 12 },
    { name: 'gaps at both ends', missing: [0, 1, 2, D3 - 1, D3 - 2], spikeAt: D3 + 12 },
  ];
  for (const c of GAP_CASES) {
    it(`judges a spike after gaps: ${c.name}`, () => {
      const s = scenario(11);
      const gone = new Set(c.missing);
      const history = { ts: s.history.ts.filter((_, i) => !gone.has(i)), values: s.history.values.filter((_, i) => !gone.has(i)) };
      const spike = { ts: t0 + c.spikeAt * STEP, value: 24 + (c.spikeAt % PER_DAY) / 100 };
      const from = spike.ts - 3 * PER_DAY * STEP;
      const scoring = unusualScores(within(history, from, spike.ts), [spike], STEP, PER_DAY, { from, to: spike.ts });
      expect(scoring.notJudged).toBeNull();
      expect(scoring.scores![0]).toBeGreaterThan(params.k);
      const step = evaluateUnusualReading(params, scoring.scores ? scoring : null, FRESH_MEMORY, [spike]);
      expect(step.transitions.map((t) => t.kind)).toEqual(['open']);
    });
  }

  it('a usual reading right after a gap is judged usual (the filled cells do not widen or narrow the spread into a false alarm)', () => {
    for (let seed = 1; seed <= 12; seed++) {
      const s = scenario(seed);
      const at = D3 + 10; // 02:30 of day 4, after 10 silent steps
      const reading = s.reading(at);
      const from = reading.ts - 3 * PER_DAY * STEP;
      const scoring = unusualScores(within(s.history, from, reading.ts), [reading], STEP, PER_DAY, { from, to: reading.ts });
      expect(Math.abs(scoring.scores![0]), `seed ${seed}`).toBeLessThan(params.k);
    }
  });

  it('says so instead of guessing when a whole cycle or more than a fifth of the history is missing', () => {
    const s = scenario(12);
    const spike = s.reading(D3 + PER_DAY + 5, 24); // a whole day after the history ended
    const from = spike.ts - 3 * PER_DAY * STEP;
    expect(unusualScores(within(s.history, from, spike.ts), [spike], STEP, PER_DAY, { from, to: spike.ts }).notJudged?.reason).toBe('too-many-gaps');
    const holey = { ts: s.history.ts.filter((_, i) => i % 4 !== 0), values: s.history.values.filter((_, i) => i % 4 !== 0) };
    const next = s.reading(D3, 24);
    const scoring = unusualScores(holey, [next], STEP, PER_DAY, { from: next.ts - D3 * STEP, to: next.ts });
    expect(scoring.notJudged).toEqual({
      reason: 'too-many-gaps',
      detail: 'Too much of the history is missing (more than a fifth of it, or a whole cycle at one end) to learn the usual pattern.',
    });
  });

  it('a channel whose readings begin inside the window has too little history (not too many gaps)', () => {
    const s = scenario(13);
    const next = s.reading(D3, 24);
    const lastDay = { ts: s.history.ts.slice(2 * PER_DAY), values: s.history.values.slice(2 * PER_DAY) };
    expect(unusualScores(lastDay, [next], STEP, PER_DAY, { from: next.ts - D3 * STEP, to: next.ts }).notJudged).toEqual({
      reason: 'too-little-history',
      detail: `The history holds readings for only the last ${PER_DAY} of its ${D3} steps; at least ${D3 - PER_DAY + 1} are needed to learn the usual pattern.`,
    });
  });

  it('does not modify its inputs', () => {
    const s = scenario(10);
    const frozen = { ts: Object.freeze([...s.history.ts]), values: Object.freeze([...s.history.values]) };
    expect(() => unusualScores(frozen, Object.freeze([s.reading(D3)]), STEP, PER_DAY)).not.toThrow();
  });
});
