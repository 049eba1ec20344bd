import { describe, expect, it } from 'vitest';
import { bfgsMinimize } from './bfgs-minimize.ts';
import { numericalHessian } from './numerical-hessian.ts';

const rosenbrock = (x: Float64Array): number => 100 * (x[1] - x[0] ** 2) ** 2 + (1 - x[0]) ** 2;

describe('bfgsMinimize', () => {
  it('finds the Rosenbrock minimum (1, 1) from (−1.2, 1) (Nocedal & Wright 2006, Exercise 2.1; Moré et al. 1981)', () => {
    const result = bfgsMinimize(rosenbrock, [-1.2, 1], { relativeTolerance: 1e-14, gradientStep: 1e-6 });
    expect(result.converged).toBe(true);
    expect(result.x[0]).toBeCloseTo(1, 4);
    expect(result.x[1]).toBeCloseTo(1, 4);
    expect(result.value).toBeLessThan(1e-8);
  });

  it('works on scaled parameters and steps around inadmissible points', () => {
    // Minimum at (1000, 0.001), f = Infinity for x0 < 0.
    const f = (x: Float64Array): number => (x[0] < 0 ? Infinity : ((x[0] - 1000) / 100) ** 2 + ((x[1] - 0.001) / 0.0001) ** 2);
    const result = bfgsMinimize(f, [10, 0], { scale: [100, 0.0001] });
    expect(result.converged).toBe(true);
    expect(result.x[0]).toBeCloseTo(1000, 3);
    expect(result.x[1]).toBeCloseTo(0.001, 7);
  });

  it('says so when it runs out of iterations, returning its best point', () => {
    const result = bfgsMinimize(rosenbrock, [-1.2, 1], { maxIterations: 3 });
    expect(result.converged).toBe(false);
    expect(result.value).toBeLessThan(rosenbrock(Float64Array.from([-1.2, 1])));
    expect(() => bfgsMinimize(() => NaN, [0])).toThrow('bfgsMinimize: f is not finite at the starting point');
  });
});

describe('numericalHessian', () => {
  it('recovers the matrix of a quadratic and the Rosenbrock Hessian at (1, 1), [[802, −400], [−400, 200]]', () => {
    const quadratic = (x: Float64Array): number => 0.5 * (4 * x[0] ** 2 + 2 * x[0] * x[1] * 1.5 + 3 * x[1] ** 2);
    const h = numericalHessian(quadratic, [0.3, -2], [1e-3, 1e-3]);
    expect(Array.from(h)).toEqual([4, 1.5, 1.5, 3].map((v) => expect.closeTo(v, 6)));
    const r = numericalHessian(rosenbrock, [1, 1], [1e-4, 1e-4]);
    expect(Array.from(r)).toEqual([802, -400, -400, 200].map((v) => expect.closeTo(v, 2)));
    expect(Number.isNaN(numericalHessian((x) => (x[0] > 0 ? Infinity : 0), [0], [1e-3])[0])).toBe(true);
  });
});
