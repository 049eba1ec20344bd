import { describe, expect, it } from 'vitest';
import { AnalysisInputError } from './analysis-input-error.ts';
import { logBeta } from './log-beta.ts';
import { studentTQuantile } from './student-t-quantile.ts';
import { studentTTail } from './student-t-tail.ts';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('logBeta, studentTTail and studentTQuantile against R 4.2.2 (lbeta, pt, qt)', () => {
  it('logBeta: lbeta(a, b), including a large a beside b = ½', () => {
    // R 4.2.2: lbeta(0.5, 0.5), lbeta(50, 0.5), lbeta(5e6, 0.5), lbeta(3.3, 7.7), lbeta(0.3, 0.1), lbeta(100, 200)
    const cases: [number, number, number][] = [
      [0.5, 0.5, 1.1447298858494004],
      [50, 0.5, -1.3811466014510412],
      [5e6, 0.5, -7.1401092672744877],
      [3.3, 7.7, -6.1907726389117759],
      [0.3, 0.1, 2.5518328288504977],
      [100, 200, -192.13419227497894],
    ];
    for (const [a, b, r] of cases) expect(Math.abs(logBeta(a, b) - r), `lbeta(${a}, ${b})`).toBeLessThan(1e-13 * Math.max(1, Math.abs(r)));
  });

  it('studentTTail: pt(q, df, lower.tail = FALSE), whole and fractional df, both tails', () => {
    // R 4.2.2: pt(q, df, lower.tail = FALSE)
    const cases: [number, number, number][] = [
      [2.1, 1, 0.14146302812150899],
      [2.1, 2.5, 0.072251222377421903],
      [2.1, 17.776, 0.025138235591438487],
      [2.1, 1234.5, 0.017965675423965863],
      [0.01, 9, 0.49611972276816263],
      [-30, 5, 0.99999961406756899],
      [30, 9, 1.2418523520791315e-10],
      [30, 100.3, 3.3912355448295437e-52],
    ];
    for (const [q, df, r] of cases) expect(rel(studentTTail(q, df), r), `pt(${q}, ${df})`).toBeLessThan(1e-13);
    expect(studentTTail(0, 4)).toBe(0.5);
  });

  it('studentTQuantile: qt(p, df), symmetric', () => {
    // R 4.2.2: qt(p, df)
    const cases: [number, number, number][] = [
      [0.975, 1, 12.706204736174694],
      [0.975, 2.5, 3.5746548420036919],
      [0.975, 9, 2.2621571627982049],
      [0.975, 100.3, 1.983898854287923],
      [0.995, 3.2, 5.4932572588688782],
      [0.6, 3, 0.27667066233268983],
      [0.025, 7, -2.3646242515927844],
    ];
    for (const [p, df, r] of cases) expect(rel(studentTQuantile(p, df), r), `qt(${p}, ${df})`).toBeLessThan(1e-13);
    expect(studentTQuantile(0.5, 3)).toBe(0);
  });

  it('refuses impossible arguments', () => {
    expect(() => studentTQuantile(1, 3)).toThrow(new AnalysisInputError('t distribution: probability must be between 0 and 1 (got 1)'));
    expect(() => studentTTail(1, 0)).toThrow(new AnalysisInputError('t distribution: degrees of freedom must be a positive number (got 0)'));
    expect(() => studentTQuantile(0.9, Number.NaN)).toThrow('degrees of freedom must be a positive number (got NaN)');
  });
});
