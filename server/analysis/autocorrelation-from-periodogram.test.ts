import { describe, expect, it } from 'vitest';
import { autocorrelation } from './autocorrelation.ts';
import { autocorrelationFromPeriodogram } from './autocorrelation-from-periodogram.ts';
import { periodogram } from './periodogram.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

// R 4.2.2, datasets::lh (48 luteinizing hormone samples; Diggle 1990):
//   sprintf("%.17g", as.numeric(lh)); sprintf("%.17g", acf(lh, lag.max = 25, plot = FALSE)$acf)
const LH = [
  2.4, 2.4, 2.4, 2.2, 2.1, 1.5, 2.3, 2.3, 2.5, 2, 1.9, 1.7, 2.2, 1.8, 3.2, 3.2, 2.7, 2.2, 2.2, 1.9, 1.9, 1.8, 2.7, 3, 2.3, 2, 2, 2.9, 2.9, 2.7, 2.7, 2.3, 2.6,
  2.4, 1.8, 1.7, 1.5, 1.4, 2.1, 3.3, 3.5, 3.5, 3.1, 2.6, 2.1, 3.4, 3, 2.9,
];
const LH_ACF = [
  0.99999999999999978, 0.5755244755244755, 0.18181818181818182, -0.14475524475524471, -0.17482517482517487, -0.14965034965034971, -0.020979020979021035,
  -0.020279720279720321, -0.004195804195804299, -0.13566433566433569, -0.1538461538461538, -0.097202797202797148, 0.048951048951048924, 0.11958041958041953,
  0.086713286713286694, 0.11888111888111885, 0.15104895104895094, 0.12937062937062929, 0.081118881118881062, -0.066433566433566446, -0.18671328671328669,
  -0.23076923076923081, -0.1818181818181818, -0.030769230769230771, 0.099999999999999992, 0.16223776223776221,
];

/** The ordinate at frequency 0 of the mean-corrected series, as the period search passes it. */
function zeroPower(x: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < x.length; i++) sum += x[i];
  const mean = sum / x.length;
  let c = 0;
  for (let i = 0; i < x.length; i++) c += x[i] - mean;
  return (c * c) / x.length;
}

describe('autocorrelationFromPeriodogram', () => {
  it("matches R's acf on the lh series, from a periodogram padded 4×", () => {
    const { power, size } = periodogram(LH, 4 * LH.length);
    const r = autocorrelationFromPeriodogram(power, size, zeroPower(LH), LH.length, 25);
    expect(r.length).toBe(26);
    for (let k = 0; k <= 25; k++) expect(Math.abs(r[k] - LH_ACF[k])).toBeLessThan(1e-12);
  });

  it('equals the direct autocorrelation of a long series to rounding (a thinned grid)', () => {
    const x = simulateArma({ ar: [0.8] }, 5000, 11).map((v, t) => v + Math.sin((2 * Math.PI * t) / 96));
    const { power, size } = periodogram(x, 4 * x.length);
    const r = autocorrelationFromPeriodogram(power, size, zeroPower(x), x.length, 2501);
    const direct = autocorrelation(x, { maxLag: 2501 });
    for (let k = 0; k <= 2501; k++) expect(Math.abs(r[k] - direct[k])).toBeLessThan(1e-12);
  });

  it('refuses a grid too short for the lags, and a series without variation', () => {
    const { power, size } = periodogram(LH, LH.length);
    expect(() => autocorrelationFromPeriodogram(power, size, 0, LH.length, 40)).toThrow(RangeError);
    const flat = periodogram([1, 1, 1, 1, 1, 1, 1, 1], 32);
    expect(() => autocorrelationFromPeriodogram(flat.power, flat.size, 0, 8, 4)).toThrow('acf: the series is constant, so its autocorrelation is undefined');
  });
});
