/**
 * The diagnostics bundle against R 4.2.2 `stats` on datasets that ship with R (fixtures written by
 * tests/reference/correlation.R and decomposition.R; see tests/reference/README.md), fed in as
 * channel readings on a regular grid. Tolerances are those of the engine's own reference tests.
 */
import { describe, expect, it } from 'vitest';
import { AnalysisInputError, acf, ccf, effectiveSampleSize, identifyProcess, ljungBox, pacf } from './index.ts';
import { channelDiagnostics, defaultCcfMaxLag, type ChannelReadings } from './channel-diagnostics.ts';
import { prewhitenedCcf } from './prewhitened-ccf.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';
import { loadReferenceFixture, type ReferenceJson as Json } from '../../tests/reference/reference-fixture.ts';

const load = loadReferenceFixture;
const R = load('correlation-r.json');
const STL = load('decomposition-stl.json');
const CLASSICAL = load('decomposition-classical.json');

const HOUR = 3_600_000;
const T0 = Date.UTC(2026, 0, 1);

/** A series as readings one step apart (the step is arbitrary: only the spacing matters). */
function asReadings(values: number[], step = HOUR, skip: Set<number> = new Set()): ChannelReadings & { timestamps: number[]; values: number[] } {
  const kept = values.map((v, i) => [T0 + i * step, v]).filter((_, i) => !skip.has(i));
  return { timestamps: kept.map((r) => r[0]), values: kept.map((r) => r[1]) };
}

function expectAllClose(actual: ArrayLike<number>, expected: ArrayLike<number | null>, tol: number): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    const e = expected[i];
    if (e === null) expect(Number.isNaN(actual[i]), `index ${i}: expected missing`).toBe(true);
    else expect(Math.abs(actual[i] - e), `index ${i}: ${actual[i]} vs ${e}`).toBeLessThanOrEqual(tol);
  }
}

const find = (list: Json[], pred: (c: Json) => boolean): Json => {
  const hit = list.find(pred);
  if (!hit) throw new Error('fixture case missing');
  return hit;
};

describe('channelDiagnostics against R (lh: acf, pacf, plot.acf bands, Box.test)', () => {
  const lh: number[] = R.series.lh;
  const result = channelDiagnostics(asReadings(lh), { step: HOUR, agg: 'mean', maxLag: 20, period: 'none', decomposition: 'none' });

  it('puts 48 readings on 48 cells and reports no gaps', () => {
    expect(result.grid).toMatchObject({ start: T0, step: HOUR, n: 48, missing: 0, readings: 48 });
  });

  it('ACF and PACF equal acf(lh, 20) and pacf(lh, 20) (R 4.2.2, tol 1e-10)', () => {
    expectAllClose(result.acf, find(R.acf, (c) => c.series === 'lh' && c.type === 'correlation').values, 1e-10);
    expectAllClose(result.pacf, find(R.pacf, (c) => c.series === 'lh').values, 1e-10);
  });

  it('the white-noise and Bartlett bands equal plot.acf(ci.type = "white" / "ma") (R 4.2.2, tol 1e-10)', () => {
    const bands = find(R.bands, (c) => c.series === 'lh');
    expect(Math.abs(result.bands.whiteNoise - bands.white[0])).toBeLessThan(1e-10);
    expectAllClose(result.bands.bartlett, bands.bartlett, 1e-10);
  });

  it('the Ljung–Box row at lag 10 equals Box.test(lh, 10, "Ljung-Box") (R 4.2.2, rel tol 1e-10)', () => {
    const box = find(R.box, (c) => c.series === 'lh' && c.type === 'Ljung-Box');
    const row = result.ljungBox.find((b) => b.lag === 10)!;
    expect(row.df).toBe(10);
    expect(Math.abs(row.statistic - box.statistic[0])).toBeLessThan(1e-10 * box.statistic[0]);
    expect(Math.abs(row.pValue - box.pValueUpperTail[0])).toBeLessThan(1e-10 * box.pValueUpperTail[0]);
    expect(result.ljungBox.map((b) => b.lag)).toEqual([5, 10, 15, 20]);
  });

  it('identification and effective sample size are the engine functions on the same grid', () => {
    const direct = identifyProcess(lh, { alpha: 0.05, maxLag: 12 });
    expect(result.identification.verdict).toBe(direct.verdict);
    expect(result.identification.explanation).toBe(direct.explanation);
    expect(result.effectiveSampleSize).toEqual(effectiveSampleSize(lh, { alpha: 0.05 }));
    expect(result.decomposition).toEqual({ method: 'none', reason: 'no decomposition was asked for' });
  });
});

describe('channelDiagnostics: cross-correlation in R’s sign convention', () => {
  it('keeps the raw CCF equal to ccf(LakeHuron, Nile, 12) over 1875–1970 (R 4.2.2, tol 1e-10) and prewhitens with the partner’s AR model', () => {
    const ref = find(R.ccf, (c) => c.x === 'LakeHuron.1875to1970');
    const lake = R.series['LakeHuron.1875to1970'] as number[];
    const nile = R.series['Nile.1875to1970'] as number[];
    const out = channelDiagnostics(
      asReadings(lake),
      {
        step: HOUR,
        agg: 'mean',
        period: 'none',
        decomposition: 'none',
        ccfMaxLag: 12,
        labels: { channel: 'Lake level', partner: 'River flow' },
      },
      asReadings(nile),
    );
    const cross = out.crossCorrelation!;
    expect(Array.from(cross.raw.lags)).toEqual(ref.lags);
    expectAllClose(cross.raw.values, ref.values, 1e-10);
    // R's strongest |ccf| in this fixture sits at lag −4 (value 0.3926)
    expect(cross.raw.strongest).toMatchObject({ lag: -4, lagMs: -4 * HOUR, significant: true });
    expect(cross.raw.band).toBeCloseTo(1.959963984540054 / Math.sqrt(96), 12); // qnorm(0.975) from R 4.2.2 (from memory)
    // the headline CCF is the prewhitened one (its R check is prewhitened-ccf's reference test)
    const white = prewhitenedCcf(lake, nile, { maxLag: 12 });
    expect(cross.method).toBe('prewhitened');
    expect(Array.from(cross.values)).toEqual(Array.from(white.values));
    expect(cross.prewhitening).toEqual({ order: white.ar.order, coefficients: Array.from(white.ar.coefficients) });
    expect(cross.simultaneousBand).toBe(white.simultaneousBand);
    expect(cross.simultaneousMethod).toBe('Šidák over 25 lags');
    expect(cross.explanation).toContain(`filtered by the AR(${white.ar.order}) model of River flow`);
  });

  it('a channel that repeats another 3 steps later peaks at lag +3 beyond the simultaneous band (follows from the definition cor(x[t+k], y[t]))', () => {
    const base = R.series['sunspot.year'].slice(0, 200) as number[];
    const late = base.map((_, i) => (i >= 3 ? base[i - 3] : base[0]));
    const out = channelDiagnostics(
      asReadings(late, 600_000),
      { step: 600_000, agg: 'mean', period: 'none', decomposition: 'none', labels: { channel: 'B', partner: 'A' } },
      asReadings(base, 600_000),
    );
    expect(out.crossCorrelation!.strongest).toMatchObject({ lag: 3, lagMs: 1_800_000, significant: true });
    expect(out.crossCorrelation!.explanation).toContain('B follows A by about 30 min, and the two move in the same direction');
  });

  it('claims no relation between two independent persistent series where the raw CCF does (prewhitening, Box, Jenkins, Reinsel & Ljung §12.2)', () => {
    let claimedRaw = 0;
    let claimedWhite = 0;
    for (let seed = 1; seed <= 6; seed++) {
      const a = simulateArma({ ar: [0.9] }, 1000, 100 + seed);
      const b = simulateArma({ ar: [0.9] }, 1000, 200 + seed);
      const out = channelDiagnostics(
        asReadings(Array.from(a), 600_000),
        { step: 600_000, agg: 'mean', period: 'none', decomposition: 'none' },
        asReadings(Array.from(b), 600_000),
      );
      if (out.crossCorrelation!.raw.strongest!.significant) claimedRaw++;
      if (out.crossCorrelation!.strongest!.significant) claimedWhite++;
    }
    expect(claimedRaw).toBeGreaterThanOrEqual(4);
    expect(claimedWhite).toBeLessThanOrEqual(1);
  }, 120_000);

  it('defaults the CCF window to 12 hours of steps when that is shorter than a quarter of the range', () => {
    expect(defaultCcfMaxLag(8640, 300_000)).toBe(144);
    expect(defaultCcfMaxLag(200, 300_000)).toBe(50);
    expect(defaultCcfMaxLag(96, 3_600_000)).toBe(16); // R's ⌊10·log10(96/2)⌋ = 16 is longer than 12 h
  });

  it('differences both channels alike before the CCF', () => {
    const x = R.series.mdeaths as number[];
    const y = R.series.fdeaths as number[];
    const out = channelDiagnostics(
      asReadings(x),
      { step: HOUR, agg: 'mean', difference: 1, period: 'none', decomposition: 'none', ccfMaxLag: 5 },
      asReadings(y),
    );
    const dx = x.slice(1).map((v, i) => v - x[i]);
    const dy = y.slice(1).map((v, i) => v - y[i]);
    expect(Array.from(out.crossCorrelation!.raw.values)).toEqual(Array.from(ccf(dx, dy, { maxLag: 5 }).values));
    expect(Array.from(out.crossCorrelation!.values)).toEqual(Array.from(prewhitenedCcf(dx, dy, { maxLag: 5 }).values));
  });
});

describe('channelDiagnostics: decomposition', () => {
  it('STL equals stl(co2, "periodic") (R 4.2.2, tol 1e-8 × range, as the engine’s reference test)', () => {
    const ref = find(STL.cases, (c) => c.name === 'co2-periodic');
    const out = channelDiagnostics(asReadings(ref.input), { step: HOUR, agg: 'mean', period: 12, decomposition: 'stl' });
    if (out.decomposition.method === 'none') throw new Error('expected a decomposition');
    const range = Math.max(...ref.input) - Math.min(...ref.input);
    expectAllClose(out.decomposition.seasonal, ref.expected.seasonal, 1e-8 * range);
    expectAllClose(out.decomposition.trend, ref.expected.trend, 1e-8 * range);
    expectAllClose(out.decomposition.remainder, ref.expected.remainder, 1e-8 * range);
    expect(out.decomposition.stl).toMatchObject({ period: 12, trendWindow: ref.windows[1], lowpassWindow: ref.windows[2] });
    expect(out.period).toMatchObject({ used: 12, source: 'manual' });
  });

  it('classical equals decompose(co2, "additive") (R 4.2.2, tol 1e-10)', () => {
    const ref = find(CLASSICAL.cases, (c) => c.name === 'co2-additive');
    const out = channelDiagnostics(asReadings(ref.input), { step: HOUR, agg: 'mean', period: 12, decomposition: 'classical' });
    if (out.decomposition.method === 'none') throw new Error('expected a decomposition');
    expectAllClose(out.decomposition.trend, ref.expected.trend, 1e-10);
    expectAllClose(out.decomposition.seasonal, ref.expected.seasonal, 1e-10);
  });

  it('detects the 12-month cycle of co2 by itself, and marks remainder cells beyond 3 robust SDs of their month', () => {
    const ref = find(STL.cases, (c) => c.name === 'co2-periodic');
    const spiked = [...ref.input];
    spiked[200] += 15; // an injected disturbance (behaviour check, not a reference value)
    const out = channelDiagnostics(asReadings(spiked), { step: HOUR, agg: 'mean', decomposition: 'stl-robust' });
    expect(out.period).toMatchObject({ used: 12, source: 'detected' });
    if (out.decomposition.method === 'none') throw new Error('expected a decomposition');
    const { outliers, remainder } = out.decomposition;
    expect(outliers.indices).toContain(200);
    // each judged against the remainder at its own month of the year (remainderOutliers)
    for (const i of outliers.indices) expect(Math.abs(remainder[i] - outliers.phaseMedian[i % 12])).toBeGreaterThan(3 * outliers.phaseSpread[i % 12]);
  });

  it('the outlier rule’s median and MAD are the textbook order statistics (sorted middle values), for odd and even n', () => {
    const ref = find(STL.cases, (c) => c.name === 'co2-periodic');
    const sortedMedian = (a: ArrayLike<number>) => {
      const v = Array.from(a).sort((p, q) => p - q);
      const h = v.length >> 1;
      return v.length % 2 ? v[h] : (v[h - 1] + v[h]) / 2;
    };
    for (const input of [ref.input, ref.input.slice(0, ref.input.length - 1)]) {
      const out = channelDiagnostics(asReadings(input), { step: HOUR, agg: 'mean', period: 12, decomposition: 'stl' });
      if (out.decomposition.method === 'none') throw new Error('expected a decomposition');
      const { outliers, remainder } = out.decomposition;
      const median = sortedMedian(remainder);
      expect(outliers.median).toBe(median);
      // Hampel's 1.4826 · MAD (Rousseeuw & Croux 1993)
      expect(outliers.robustSd).toBe(1.4826 * sortedMedian(remainder.map((r) => Math.abs(r - median))));
    }
  });
});

describe('channelDiagnostics: gaps, differencing and bad input', () => {
  it('an empty cell stays missing for the ACF (na.pass) and is interpolated for STL', () => {
    const lh: number[] = R.series.lh;
    const out = channelDiagnostics(asReadings(lh, HOUR, new Set([10, 11, 30])), { step: HOUR, agg: 'mean', maxLag: 10, period: 4, decomposition: 'stl' });
    expect(out.grid).toMatchObject({ n: 48, missing: 3, readings: 45 });
    const withGaps = lh.map((v, i) => ([10, 11, 30].includes(i) ? NaN : v));
    expect(Array.from(out.acf)).toEqual(Array.from(acf(withGaps, { maxLag: 10 })));
    expect(Array.from(out.pacf)).toEqual(Array.from(pacf(withGaps, { maxLag: 10 })));
    if (out.decomposition.method === 'none') throw new Error('expected a decomposition');
    // The filled cell 10 lies a third of the way from cell 9 to cell 12.
    const filled10 = lh[9] + (lh[12] - lh[9]) / 3;
    const d = out.decomposition;
    expect(d.trend[10] + d.seasonal[10] + d.remainder[10]).toBeCloseTo(filled10, 10);
  });

  it('aggregates several readings per cell with the chosen statistic', () => {
    const readings = { timestamps: [0, 1, 2, HOUR, HOUR + 5], values: [1, 5, 3, 2, 8] };
    const many = { timestamps: [...readings.timestamps], values: [...readings.values] };
    for (let i = 2; i < 40; i++) {
      many.timestamps.push(i * HOUR);
      many.values.push(Math.sin(i));
    }
    const med = channelDiagnostics(many, { step: HOUR, agg: 'median', period: 'none', decomposition: 'none' });
    expect(med.grid.values[0]).toBe(3);
    expect(med.grid.values[1]).toBe(5);
    const last = channelDiagnostics(many, { step: HOUR, agg: 'last', period: 'none', decomposition: 'none' });
    expect(last.grid.values[0]).toBe(3);
    expect(last.grid.values[1]).toBe(8);
  });

  it('runs the correlation analysis on the differenced series', () => {
    const sun: number[] = R.series['sunspot.year'];
    const out = channelDiagnostics(asReadings(sun), {
      step: HOUR,
      agg: 'mean',
      difference: 1,
      period: 11,
      seasonalDifference: 1,
      decomposition: 'none',
      maxLag: 30,
    });
    const d1 = sun.slice(1).map((v, i) => v - sun[i]);
    const d11 = d1.slice(11).map((v, i) => v - d1[i]);
    expect(out.analysed.n).toBe(sun.length - 12);
    expect(Array.from(out.acf)).toEqual(Array.from(acf(d11, { maxLag: 30 })));
    const lb = ljungBox(d11, { lag: 22 });
    expect(out.ljungBox.find((b) => b.lag === 22)).toEqual({ lag: 22, ...lb });
  });

  it('leaves its inputs unchanged', () => {
    const input = asReadings(R.series.lh);
    const copy = { timestamps: [...input.timestamps], values: [...input.values] };
    channelDiagnostics(input, { step: HOUR, agg: 'mean', period: 4, decomposition: 'stl-robust' });
    expect(input).toEqual(copy);
  });

  it('refuses too little data and contradictory options with the engine’s messages', () => {
    const few = asReadings([1, 2, 3, 4, 5]);
    expect(() => channelDiagnostics(few, { step: HOUR, agg: 'mean' })).toThrow(AnalysisInputError);
    expect(() => channelDiagnostics(few, { step: HOUR, agg: 'mean' })).toThrow('channelDiagnostics requires readings in at least 8 cells of the grid (got 5)');
    const lh = asReadings(R.series.lh);
    expect(() => channelDiagnostics(lh, { step: HOUR, agg: 'mean', period: 'none', seasonalDifference: 1 })).toThrow(
      'seasonalDifference needs a seasonal period, and none was given or detected',
    );
    expect(() => channelDiagnostics(lh, { step: HOUR, agg: 'mean', period: 30 })).toThrow(
      'channelDiagnostics: period must be a whole number of steps from 2 to 24 for 48 cells (got 30)',
    );
    expect(() => channelDiagnostics({ timestamps: [], values: [] }, { step: HOUR, agg: 'mean' })).toThrow(
      'regularize requires at least 1 reading with a value (got 0)',
    );
  });
});
