/**
 * The early-warning projection (projectCrossing) against R 4.2.2 doing the same by hand on
 * datasets that ship with R: nottem and ldeaths (a 12-step cycle taken off with
 * `stl(x, "periodic", robust = TRUE)`, continued by repeating its last cycle), LakeHuron, Nile and nhtemp (no
 * cycle); then `arima(…, order = c(p, d, q), method = "ML")` with d = 0 and, for the level's changes, d = 1, `predict(fit, n.ahead = h)` plus the continued seasonal
 * part, the 80 % band ± qnorm(0.9)·se, and the chance of passing the limit from 20,000 of R's own
 * simulated future paths (forecast 8.20 `simulate(fit, nsim = h, future = TRUE)`). The fixture is
 * written by early-warning.R in this folder (each case carries its exact call).
 *
 * Tolerances: the seasonal part continued 1e-9 of the series' range (the same STL); the projection
 * and band within 2e-3 of R's one-step standard error (our fit and R's stop at slightly different
 * points of the same likelihood, as in forecast.reference.test.ts); the chance within four combined
 * Monte Carlo standard errors (20,000 paths each side).
 */
import { afterAll, describe, expect, it } from 'vitest';
import { projectCrossing } from '../../server/services/alerts/early-warning/project-crossing.ts';
import { loadReferenceFixture } from './reference-fixture.ts';

const R = loadReferenceFixture('early-warning-r.json');
const one = (v: number[] | number): number => (Array.isArray(v) ? v[0] : v);
const list = (v: number[] | number): number[] => (Array.isArray(v) ? v : [v]);

describe('fixture provenance', () => {
  it('names R 4.2.2, forecast 8.20, the script and every call', () => {
    expect(R.generator.tool).toMatch(/^R version 4\.2\.2/);
    expect(R.generator.script).toBe('tests/reference/early-warning.R');
    expect(R.generator.packages).toContain('forecast 8.20');
    expect(R.cases).toHaveLength(10);
    for (const c of R.cases) expect(c.call).toContain(`predict(fit, n.ahead = ${one(c.h)})`);
  });
});

const worst = { seasonal: 0, band: 0 };
describe('projectCrossing against R (stl + arima + predict, simulate)', () => {
  afterAll(() =>
    console.info(`early-warning vs R: seasonal ${worst.seasonal.toExponential(2)} of range, projection/band ${worst.band.toExponential(2)} of one-step se`),
  );
  for (const c of R.cases) {
    const period = one(c.period) > 0 ? one(c.period) : null;
    const h = one(c.h);
    const d = one(c.d) as 0 | 1;
    const name = d === 1 ? `ARIMA(${one(c.p)},1,${one(c.q)})` : `ARMA(${one(c.p)},${one(c.q)})`;
    it(`${c.name}${period ? ` (cycle of ${period})` : ''} ${name}, ${h} steps, limit ${one(c.limit)} ${c.side}`, () => {
      const x = list(c.x);
      const ours = projectCrossing(
        { values: x, lastAt: 0, stepMs: 1, limits: [{ limit: one(c.limit), side: c.side }], horizonSteps: h, period },
        { order: { p: one(c.p), q: one(c.q), d }, draws: 20_000 },
      );
      expect(ours.order).toEqual({ p: one(c.p), q: one(c.q), d });
      expect(ours.period).toBe(period);
      const range = Math.max(...x) - Math.min(...x);
      const continued = list(c.continued);
      const scale = list(c.se)[0];
      for (let k = 0; k < h; k++) {
        worst.seasonal = Math.max(worst.seasonal, Math.abs(ours.seasonalAhead[k] - continued[k]) / range);
        worst.band = Math.max(worst.band, Math.abs(ours.mean[k] - list(c.pred)[k]) / scale, Math.abs(ours.upper[k] - list(c.upper)[k]) / scale);
        expect(Math.abs(ours.seasonalAhead[k] - continued[k])).toBeLessThan(1e-9 * range);
        expect(Math.abs(ours.mean[k] - list(c.pred)[k])).toBeLessThan(2e-3 * scale);
        expect(Math.abs(ours.lower[k] - list(c.lower)[k])).toBeLessThan(2e-3 * scale);
        expect(Math.abs(ours.upper[k] - list(c.upper)[k])).toBeLessThan(2e-3 * scale);
      }
      const rChance = one(c.chance);
      const { chance } = ours.crossings[0];
      const se = Math.sqrt((rChance * (1 - rChance)) / 20_000 + (chance * (1 - chance)) / 20_000);
      expect(Math.abs(chance - rChance)).toBeLessThan(4 * se);
      expect(ours.model).toBe(`${name} ${period ? `on the remainder after the ${period}-step cycle` : 'on the readings'}`);
    });
  }
});
