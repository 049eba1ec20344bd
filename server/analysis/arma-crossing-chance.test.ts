import { describe, expect, it } from 'vitest';
import { armaCrossingChance } from './arma-crossing-chance.ts';
import { seededNormal } from './seeded-simulation.testkit.ts';

const e = seededNormal(31);
const x: number[] = [];
for (let t = 0, d = 0; t < 300; t++) x.push(2 + (d = 0.7 * d + e()));
const model = { ar: [0.7], ma: [], mean: 2, sigma2: 1 };

describe('armaCrossingChance with a limit per step', () => {
  it('gives exactly the constant-limit answer when every step has the same limit', () => {
    const options = { side: 'above' as const, steps: 12, draws: 2000, seed: 5 };
    expect(armaCrossingChance(x, model, { ...options, limit: new Array(12).fill(3.5) })).toEqual(armaCrossingChance(x, model, { ...options, limit: 3.5 }));
  });

  it('only the steps whose limit is reachable count: a limit out of reach after step 1 gives the one-step normal tail', () => {
    // one-step forecast 2 + 0.7 (x_n − 2), standard error 1: P(x_{n+1} > L) = 1 − Φ(L − forecast) (exact, common practice)
    const f = 2 + 0.7 * (x[x.length - 1] - 2);
    const limits = [f + 0.5, 1e9, 1e9, 1e9];
    const r = armaCrossingChance(x, model, { limit: limits, side: 'above', steps: 4, draws: 100_000, seed: 2 });
    const exact = 0.3085375387259869; // 1 − Φ(0.5), R 4.2.2: pnorm(0.5, lower.tail = FALSE)
    expect(Math.abs(r.chance - exact)).toBeLessThan(4 * r.standardError);
    expect(r.medianFirstStep).toBe(1);
  });

  it('refuses a per-step limit of the wrong length or with a non-finite value', () => {
    expect(() => armaCrossingChance(x, model, { limit: [1, 2], side: 'above', steps: 3 })).toThrow(
      'armaCrossingChance: a limit per step needs exactly 3 values (got 2)',
    );
    expect(() => armaCrossingChance(x, model, { limit: [1, NaN, 2], side: 'above', steps: 3 })).toThrow(
      'armaCrossingChance: the limit of step 2 must be a finite number (got NaN)',
    );
    expect(() => armaCrossingChance(x, model, { limit: NaN, side: 'above', steps: 3 })).toThrow('armaCrossingChance: limit must be a finite number (got NaN)');
  });
});
