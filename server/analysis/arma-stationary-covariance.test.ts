import { describe, expect, it } from 'vitest';
import { armaLinearSolve } from './arma-linear-solve.ts';
import { armaStationaryCovariance } from './arma-stationary-covariance.ts';

describe('armaStationaryCovariance', () => {
  it('gives 1/(1 − φ²) for AR(1) and [[1 + θ², θ], [θ, θ²]] for MA(1) (Gardner et al. 1980 §2)', () => {
    const out = new Float64Array(4);
    const work = new Float64Array(16);
    expect(armaStationaryCovariance([0.8], [], 1, out, work)).toBe(true);
    expect(out[0]).toBeCloseTo(1 / (1 - 0.64), 12);
    expect(armaStationaryCovariance([], [0.5], 2, out, work)).toBe(true);
    expect(Array.from(out)).toEqual([expect.closeTo(1.25, 12), expect.closeTo(0.5, 12), expect.closeTo(0.5, 12), expect.closeTo(0.25, 12)]);
  });

  it('gives the ARMA(1,1) variance (1 + 2φθ + θ²)/(1 − φ²) (Brockwell & Davis 2002, Example 3.2.1)', () => {
    const out = new Float64Array(4);
    expect(armaStationaryCovariance([0.6], [0.3], 2, out, new Float64Array(16))).toBe(true);
    expect(out[0]).toBeCloseTo((1 + 2 * 0.6 * 0.3 + 0.09) / (1 - 0.36), 12);
  });

  it('reports a unit root as singular', () => {
    expect(armaStationaryCovariance([1], [], 1, new Float64Array(1), new Float64Array(1))).toBe(false);
  });
});

describe('armaLinearSolve', () => {
  it('solves a pivoting 3 × 3 system with two right-hand sides and refuses a singular one', () => {
    // A = [[0, 2, 1], [1, 1, 0], [3, 0, 1]], X = [[1, 2], [0, 1], [−1, 3]] → B = A X.
    const a = Float64Array.from([0, 2, 1, 1, 1, 0, 3, 0, 1]);
    const b = Float64Array.from([-1, 5, 1, 3, 2, 9]);
    expect(armaLinearSolve(a, b, 3, 2)).toBe(true);
    expect(Array.from(b)).toEqual([1, 2, 0, 1, -1, 3].map((v) => expect.closeTo(v, 12)));
    expect(armaLinearSolve(Float64Array.from([1, 2, 2, 4]), new Float64Array(2), 2, 1)).toBe(false);
  });
});
