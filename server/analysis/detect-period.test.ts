import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { arYuleWalker } from './ar-yule-walker.ts';
import { detectPeriod } from './detect-period.ts';
import { removeLinearTrend } from './remove-linear-trend.ts';
import { cycleSeries } from './period-scenarios.testkit.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

const MINUTE = 60_000;

/** Simulation (not a reference value): 14 days of 5-minute readings, daily sine plus AR(1) noise. */
function dailyCycle(seed: number): Float64Array {
  const noise = simulateArma({ ar: [0.8] }, 288 * 14, seed);
  return noise.map((v, t) => v + 2 * Math.sin((2 * Math.PI * t) / 288) + 0.001 * t);
}

const correlationFixture = JSON.parse(readFileSync('tests/reference/fixtures/correlation-r.json', 'utf8')) as { series: Record<string, number[]> };
const classicalFixture = JSON.parse(readFileSync('tests/reference/fixtures/decomposition-classical.json', 'utf8')) as {
  cases: { name: string; input: number[] }[];
};

/** R 4.2.2 datasets::lynx (annual Canadian lynx trappings 1821–1934), printed by `cat(lynx, sep = ",")`. */
const LYNX = [
  269, 321, 585, 871, 1475, 2821, 3928, 5943, 4950, 2577, 523, 98, 184, 279, 409, 2285, 2685, 3409, 1824, 409, 151, 45, 68, 213, 546, 1033, 2129, 2536, 957,
  361, 377, 225, 360, 731, 1638, 2725, 2871, 2119, 684, 299, 236, 245, 552, 1623, 3311, 6721, 4254, 687, 255, 473, 358, 784, 1594, 1676, 2251, 1426, 756, 299,
  201, 229, 469, 736, 2042, 2811, 4431, 2511, 389, 73, 39, 49, 59, 188, 377, 1292, 4031, 3495, 587, 105, 153, 387, 758, 1307, 3465, 6991, 6313, 3794, 1836, 345,
  382, 808, 1388, 2713, 3800, 3091, 2985, 3790, 674, 81, 80, 108, 229, 399, 1132, 2432, 3574, 2935, 1537, 529, 485, 662, 1000, 1590, 2657, 3396,
];

describe('detectPeriod', () => {
  it('finds the 288-sample day in 5-minute data: within the spectral resolution without a step, exactly 288 with one', () => {
    for (const seed of [1, 2, 3]) {
      const raw = detectPeriod(dailyCycle(seed));
      expect(raw.best).not.toBeNull();
      // One Fourier bin at n = 4032 spans 288²/4032 ≈ 20.6 steps of period.
      expect(Math.abs((raw.best ?? 0) - 288)).toBeLessThanOrEqual(3);
      expect(raw.candidates[0].sources).toEqual(['periodogram', 'acf']);
      expect(raw.candidates[0].calendar).toBeNull();
      expect(raw.candidates[0].note).toContain('no grid step given');

      const snapped = detectPeriod(dailyCycle(seed), { stepMs: 5 * MINUTE });
      expect(snapped.best).toBe(288);
      const day = snapped.candidates[0];
      expect([day.period, day.calendar, day.significant]).toEqual([288, 'day', true]);
      expect(day.exactPeriod).toBeCloseTo(raw.candidates[0].exactPeriod, 10);
      expect(day.note).toMatch(/^288 steps = 1 day \(raw estimate \d+(\.\d)?, within the spectral resolution/);
      expect(snapped.calendarPeriods.map((c) => c.steps)).toEqual([12, 288, 2016]);
    }
  });

  it('snaps only within one Fourier bin: a 300-step cycle stays 300 at n = 8640 (day 3.1 bins away)', () => {
    const noise = simulateArma({ ar: [0.5] }, 8640, 11);
    const x = noise.map((v, t) => v + 2 * Math.sin((2 * Math.PI * t) / 300));
    const result = detectPeriod(x, { stepMs: 5 * MINUTE });
    expect(result.best).toBe(300);
    expect(result.candidates[0].calendar).toBeNull();
    expect(result.candidates[0].note).toContain('no calendar period within the spectral resolution');
  });

  it('finds a daily cycle under a drift that is no straight line (a probe drifting away over the last 10 of 30 days)', () => {
    // Simulation: 2-minute steps (a day is 720), daily sine of 0.15 in AR(1) noise (φ 0.3, SD ≈ 0.13), ramp of 5 over the last third.
    const n = 30 * 720;
    const noise = simulateArma({ ar: [0.3] }, n, 21);
    const x = noise.map((v, t) => 0.12 * v + 0.15 * Math.sin((2 * Math.PI * t) / 720) + (t > 20 * 720 ? (5 * (t - 20 * 720)) / (10 * 720) : 0));
    const result = detectPeriod(x, { stepMs: 2 * MINUTE });
    expect(result.best).toBe(720);
    // The drift makes the AR(5) fit nearly a unit root, far above the spectrum near one day.
    expect(result.candidates[0].note).toContain('scaled down to it');
  });

  it('reports no period for white noise, AR(1), AR(2) with real roots or MA(1)', () => {
    for (const seed of [1, 2, 3]) {
      expect(detectPeriod(simulateArma({}, 2000, seed)).best).toBeNull();
      expect(detectPeriod(simulateArma({ ar: [0.7] }, 2000, seed)).best).toBeNull();
      expect(detectPeriod(simulateArma({ ar: [0.5, 0.3] }, 2000, seed)).best).toBeNull();
      expect(detectPeriod(simulateArma({ ma: [0.6] }, 2000, seed)).best).toBeNull();
      expect(detectPeriod(simulateArma({ ar: [0.97] }, 4032, seed), { stepMs: 5 * MINUTE }).best).toBeNull();
    }
  });

  it('finds 12 in monthly data with a yearly cycle and a trend (no noise at all)', () => {
    const noise = simulateArma({ ar: [0.5] }, 240, 4);
    const x = noise.map((_v, t) => 0.05 * t + 3 * Math.cos((2 * Math.PI * t) / 12));
    expect(detectPeriod(x).best).toBe(12);
  });

  it('judges peaks against the AR(≤5) Yule–Walker fit of the detrended series, as arYuleWalker (R ar.yw) gives it', () => {
    const x = dailyCycle(7);
    const fit = arYuleWalker(removeLinearTrend(x), { maxOrder: 5 });
    const { background } = detectPeriod(x);
    expect(background.order).toBe(fit.order);
    background.coefficients.forEach((c, j) => expect(c).toBeCloseTo(fit.coefficients[j], 9));
    expect(background.variance / fit.variance).toBeCloseTo(1, 9);
  });

  it('datasets shipped with R: the periods documented in their help pages', () => {
    // co2, nottem: monthly series with a yearly cycle (R's ?co2, ?nottem: frequency 12).
    expect(detectPeriod(correlationFixture.series.co2).best).toBe(12);
    expect(detectPeriod(classicalFixture.cases.find((c) => c.name === 'nottem-additive')!.input).best).toBe(12);
    // sunspot.year: the ~11-year solar cycle (R's ?sunspot.year; the cycle length is common knowledge).
    const sunspots = detectPeriod(correlationFixture.series['sunspot.year']);
    expect(sunspots.best).toBe(11);
    expect(sunspots.candidates[0].calendar).toBeNull();
    // lynx: the ~10-year cycle of the trappings (R's ?lynx names Campbell & Walker 1977, who studied it; period from memory of that literature).
    expect(detectPeriod(LYNX).best).toBe(10);
    expect(detectPeriod(LYNX.map(Math.log10)).best).toBe(10);
    // LakeHuron, Nile, lh: no cycle described in their help pages; judged persistent, not periodic.
    expect(detectPeriod(correlationFixture.series.LakeHuron).best).toBeNull();
    expect(detectPeriod(correlationFixture.series.Nile).best).toBeNull();
    expect(detectPeriod(correlationFixture.series.lh).best).toBeNull();
  });

  it('refuses a step that is not a positive number of milliseconds', () => {
    expect(() => detectPeriod(dailyCycle(1), { stepMs: 0 })).toThrow('detectPeriod: stepMs must be a positive number of milliseconds (got 0)');
    expect(() => detectPeriod(dailyCycle(1), { stepMs: Number.NaN })).toThrow('detectPeriod: stepMs must be a positive number of milliseconds (got NaN)');
  });

  it('reports a cycle of whole days (watering every other day) as exactly 576 five-minute steps, with the raw estimate', () => {
    const noise = simulateArma({ ar: [0.9] }, 8640, 17);
    const x = noise.map((v, t) => v + 2 * Math.sin((2 * Math.PI * t) / 576 + 0.4));
    const result = detectPeriod(x, { stepMs: 300_000 });
    expect(result.best).toBe(576);
    const c = result.candidates.find((k) => k.period === 576)!;
    expect(c.calendar).toBe('days');
    expect(c.note).toMatch(/^576 steps = 2 days \(raw estimate [\d.]+, within the spectral resolution/);
    // without the grid step nothing is snapped
    expect(detectPeriod(x).candidates[0].calendar).toBeNull();
  });

  it('reports a daylight-shaped day seen 5 times as the day, and its strong half-day harmonic as part of it, not as a period', () => {
    // Simulation (not a reference value): an arch zero at night, amplitude 4 noise SD, under
    // AR(1) φ₅ 0.99, five days of 5-minute steps. Before the harmonic rule the search answered
    // 143 steps (the half-day harmonic, ACF −0.42 there) and left the day unsupported (5 cycles,
    // ACF 0.64 inside Bartlett's band under so persistent a background).
    const x = cycleSeries({ stepMinutes: 5, days: 5, amplitude: 4, phi5: 0.99, shape: 'daylight' }, 1);
    const found = detectPeriod(x, { stepMs: 5 * MINUTE });
    expect(found.best).toBe(288);
    const day = found.candidates.find((c) => c.period === 288)!;
    expect(day).toMatchObject({ significant: true, harmonicOf: null });
    expect(day.sources).toEqual(['periodogram', 'harmonics']);
    expect(day.note).toContain('its harmonics stand out too');
    const half = found.candidates.find((c) => c.period === 144)!;
    expect(half).toMatchObject({ significant: false, harmonicOf: 288, calendar: 'hours' });
    expect(half.pValue).toBeLessThan(0.01);
    expect(half.acf).toBeLessThan(0);
    expect(half.note).toContain('a harmonic of the 288-step cycle');
  });

  it('does not call a true half-day cycle a harmonic of the day when the day is not there', () => {
    // Simulation: a 144-step sine (12 h of 5-minute steps), amplitude 2 noise SD, AR(1) φ 0.8, 7 days.
    const x = cycleSeries({ stepMinutes: 5, days: 7, amplitude: 2, phi5: 0.8, period: 144 }, 5);
    const found = detectPeriod(x, { stepMs: 5 * MINUTE });
    expect(found.best).toBe(144);
    expect(found.candidates[0]).toMatchObject({ period: 144, harmonicOf: null, calendar: 'hours' });
  });
});
