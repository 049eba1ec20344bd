import { describe, expect, it } from 'vitest';
import { armaArToPacf } from './arma-ar-to-pacf.ts';
import { armaPacfToAr } from './arma-pacf-to-ar.ts';

describe('armaPacfToAr / armaArToPacf', () => {
  it('builds AR(2) from partial autocorrelations as Durbin–Levinson: φ1 = r1(1 − r2), φ2 = r2', () => {
    // Brockwell & Davis, Introduction to Time Series and Forecasting, 2nd ed., §2.5.3 (Durbin–Levinson).
    const [r1, r2] = [0.6, -0.3];
    const phi = armaPacfToAr([Math.atanh(r1), Math.atanh(r2)]);
    expect(phi[0]).toBeCloseTo(r1 * (1 - r2), 14);
    expect(phi[1]).toBeCloseTo(r2, 14);
  });

  it('round-trips for orders 1..5 and writes into a given array', () => {
    for (let p = 1; p <= 5; p++) {
      const u = Array.from({ length: p }, (_, i) => Math.sin(3 * i + p) * 1.5);
      const out = new Float64Array(p);
      expect(armaPacfToAr(u, out)).toBe(out);
      const back = armaArToPacf(out)!;
      for (let i = 0; i < p; i++) expect(back[i]).toBeCloseTo(u[i], 10);
    }
  });

  it('returns null for a non-stationary AR part (a root on or inside the unit circle)', () => {
    expect(armaArToPacf([1])).toBeNull();
    expect(armaArToPacf([0.5, 0.6])).toBeNull(); // φ1 + φ2 > 1 (Box, Jenkins, Reinsel & Ljung 2015, §3.2.4)
    expect(armaArToPacf([0.5, 0.3])).not.toBeNull();
    expect(armaArToPacf([])).toEqual(new Float64Array(0));
  });
});
