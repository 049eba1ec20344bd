import { describe, expect, it } from 'vitest';
import { seededNormalStream } from './seeded-normal-stream.ts';

describe('seededNormalStream', () => {
  it('repeats for the same seed and differs between seeds', () => {
    const a = seededNormalStream(7);
    const b = seededNormalStream(7);
    const c = seededNormalStream(8);
    const first = Array.from({ length: 5 }, a);
    expect(Array.from({ length: 5 }, b)).toEqual(first);
    expect(Array.from({ length: 5 }, c)).not.toEqual(first);
  });

  it('has the moments of a standard normal and its tail shares (100,000 draws; sampling error bounds)', () => {
    const draw = seededNormalStream(2026);
    const n = 100_000;
    let sum = 0;
    let squares = 0;
    let beyond196 = 0;
    for (let i = 0; i < n; i++) {
      const z = draw();
      sum += z;
      squares += z * z;
      if (Math.abs(z) > 1.959964) beyond196++;
    }
    // Mean: SE 1/√n ≈ 0.0032; variance: SE √(2/n) ≈ 0.0045; P(|Z| > 1.96) = 0.05, SE ≈ 0.0007 (common practice: 4 SE bounds).
    expect(Math.abs(sum / n)).toBeLessThan(0.013);
    expect(Math.abs(squares / n - 1)).toBeLessThan(0.018);
    expect(Math.abs(beyond196 / n - 0.05)).toBeLessThan(0.0028);
  });
});
