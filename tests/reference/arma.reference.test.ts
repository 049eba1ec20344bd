/**
 * Lagbook's ARMA engine (fitArma, selectArma) against R 4.2.2 `stats::arima(method = "ML")` and
 * `Box.test` on datasets that ship with R (lh, LakeHuron, Nile, log10(lynx), sqrt(sunspot.year),
 * presidents, diff(LakeHuron)) and seeded `arima.sim` series. The fixture (series, exact calls,
 * R version) is written by arma.R in this folder; see README.md to regenerate it. A live check
 * against a running R follows when Rscript is on PATH.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fitArma, selectArma } from '../../server/analysis/index.ts';
import { simulateArma } from '../../server/analysis/seeded-simulation.testkit.ts';
import { loadReferenceFixture, type ReferenceJson as Json } from './reference-fixture.ts';

const R = loadReferenceFixture('arma-r.json');
/** R's NA is stored as null; the engine's missing value is NaN. */
const seriesOf = (name: string): number[] => R.series[name].map((v: number | null) => (v === null ? NaN : v));
/** arma.R stores scalars as one-element arrays. */
const one = (v: number[] | number | boolean): number => (Array.isArray(v) ? v[0] : (v as number));

const TOL = { logLik: 1e-4, coef: 2e-3, seRel: 0.03, sigma2Rel: 1e-3 };

/**
 * Fits where R's own optimiser stopped short (optim code ≠ 0): only the likelihoods are compared,
 * ours must be at least R's − 1e-4. log10(lynx) ARMA(2,1): R 4.2.2 warns "possible convergence
 * problem: optim gave code = 1" and stops at loglik 5.7476; the maximum is 7.8059 (φ ≈ 1.475,
 * −0.817, θ ≈ −0.228), which Lagbook reaches from its conditional-sum-of-squares start.
 */
const rStoppedShort = (fit: Json): boolean => one(fit.optimCode) !== 0;

describe('fixture provenance', () => {
  it('names R 4.2.2, the script and every call', () => {
    expect(R.generator.tool).toMatch(/^R version 4\.2\.2/);
    expect(R.generator.script).toBe('tests/reference/arma.R');
    for (const fit of R.fits) expect(fit.call).toMatch(/^arima\(x, order = c\(\d, 0, \d\), include\.mean = (TRUE|FALSE), method = "ML"\)$/);
    expect(Object.keys(R.simulations)).toHaveLength(6);
  });
});

describe('fitArma against R\'s arima(x, order = c(p, 0, q), method = "ML")', () => {
  for (const fit of R.fits as Json[]) {
    const p = one(fit.p);
    const q = one(fit.q);
    const includeMean = fit.includeMean === true || one(fit.includeMean) === 1;
    const label = `${fit.series}: ARMA(${p},${q})${includeMean ? '' : ' without mean'} — R 4.2.2 ${fit.call}`;
    it(label, () => {
      const x = seriesOf(fit.series);
      const ours = fitArma(x, { p, q, includeMean });
      expect(ours.converged).toBe(true);
      const rLogLik = one(fit.loglik);
      if (rStoppedShort(fit)) {
        expect(ours.logLik).toBeGreaterThanOrEqual(rLogLik - TOL.logLik);
        return;
      }
      expect(Math.abs(ours.logLik - rLogLik), `loglik ${ours.logLik} vs R ${rLogLik}`).toBeLessThanOrEqual(TOL.logLik);
      expect(Math.abs(ours.aic - one(fit.aic))).toBeLessThanOrEqual(2 * TOL.logLik);
      const pairs: [string, number, number, number][] = [];
      fit.ar.forEach((v: number, i: number) => pairs.push([`ar${i + 1}`, ours.ar[i], v, ours.standardErrors.ar[i] / fit.seAr[i]]));
      fit.ma.forEach((v: number, i: number) => pairs.push([`ma${i + 1}`, ours.ma[i], v, ours.standardErrors.ma[i] / fit.seMa[i]]));
      if (includeMean) pairs.push(['mean', ours.mean!, one(fit.mean), ours.standardErrors.mean! / one(fit.seMean)]);
      for (const [name, mine, theirs, seRatio] of pairs) {
        // The mean is in the series' units: its tolerance is 2e-3 of R's standard error for it, plus 2e-3.
        const tol = name === 'mean' ? TOL.coef * (1 + one(fit.seMean)) : TOL.coef;
        expect(Math.abs(mine - theirs), `${name}: ${mine} vs R ${theirs}`).toBeLessThanOrEqual(tol);
        expect(Math.abs(seRatio - 1), `se ${name}: ratio to R ${seRatio}`).toBeLessThanOrEqual(TOL.seRel);
      }
      expect(Math.abs(ours.sigma2 / one(fit.sigma2) - 1)).toBeLessThanOrEqual(TOL.sigma2Rel);
      // Residuals (R's residuals(fit)): within 1 % of σ, NaN where R has NA.
      const sigma = Math.sqrt(one(fit.sigma2));
      fit.residuals.forEach((v: number | null, t: number) => {
        if (v === null) expect(Number.isNaN(ours.residuals[t])).toBe(true);
        else expect(Math.abs(ours.residuals[t] - v), `residual ${t}`).toBeLessThanOrEqual(0.01 * sigma);
      });
    });
  }
});

/**
 * Selection candidates where R 4.2.2's arima(method = "ML") converges (optim code 0) to a lower
 * local maximum than Lagbook's (seen while writing this test; Lagbook's loglik is higher by
 * 0.19 and 0.087 on LakeHuron ARMA(3,1) and ARMA(3,2), 0.29 on log10(lynx) ARMA(3,1), 0.17 and
 * 0.52 on the simulated ARMA(1,1) series' ARMA(3,2) and ARMA(3,3)). Everywhere else both agree
 * to 1e-4, apart from candidates where R reports a non-zero optim code.
 */
const R_LOCAL_MAXIMUM: Record<string, string[]> = {
  LakeHuron: ['3,1', '3,2'],
  'log10.lynx': ['3,1'],
  'sim.arma11.300': ['3,2', '3,3'],
};

describe('selectArma against an AICc table over p, q ≤ 3 from R 4.2.2 arima(method = "ML")', () => {
  for (const sel of R.selections as Json[]) {
    it(`${sel.series}: same candidates' likelihoods (ours ≥ R's − 1e-4), same choice, same Box.test`, () => {
      const ours = selectArma(seriesOf(sel.series), { maxP: 3, maxQ: 3 });
      for (const rc of sel.candidates as Json[]) {
        const mine = ours.candidates.find((c) => c.p === one(rc.p) && c.q === one(rc.q))!;
        if (rc.loglik[0] === null) continue; // R's arima stopped with an error for this candidate
        const key = `${one(rc.p)},${one(rc.q)}`;
        expect(mine.logLik, `ARMA(${key})`).toBeGreaterThanOrEqual(one(rc.loglik) - TOL.logLik);
        if (one(rc.optimCode) === 0 && !(R_LOCAL_MAXIMUM[sel.series] ?? []).includes(key)) {
          expect(Math.abs(mine.logLik - one(rc.loglik)), `ARMA(${key}) loglik`).toBeLessThanOrEqual(TOL.logLik);
          expect(Math.abs(mine.aicc - one(rc.aicc)), `ARMA(${key}) AICc`).toBeLessThanOrEqual(2 * TOL.logLik);
        }
      }
      expect([ours.p, ours.q]).toEqual([one(sel.chosenP), one(sel.chosenQ)]);
      expect(ours.residualTest.df).toBe(one(sel.boxDf));
      expect(sel.boxCall).toContain(`lag = ${ours.residualTest.lag},`);
      expect(Math.abs(ours.residualTest.statistic / one(sel.boxStatistic) - 1)).toBeLessThanOrEqual(0.01);
      expect(Math.abs(ours.residualTest.pValue - one(sel.boxPValue))).toBeLessThanOrEqual(0.005);
    });
  }
});

const hasRscript = spawnSync('sh', ['-c', 'command -v Rscript'], { stdio: 'ignore' }).status === 0;

describe.skipIf(!hasRscript)('live: R on a series simulated here', () => {
  it('fitArma\'s ARMA(1,1) log-likelihood equals R\'s arima(method = "ML") to 1e-4', () => {
    const x = Array.from(simulateArma({ ar: [0.7], ma: [-0.4] }, 400, 20261203), (v) => v + 12);
    const dir = mkdtempSync(join(tmpdir(), 'lagbook-arma-live-'));
    try {
      const file = join(dir, 'x.txt');
      writeFileSync(file, x.map((v) => v.toPrecision(17)).join('\n'));
      const script = `x <- scan(${JSON.stringify(file)}, quiet = TRUE); f <- arima(x, order = c(1, 0, 1), method = "ML"); cat(sprintf("%.12f", c(f$loglik, coef(f))))`;
      const out = execFileSync('Rscript', ['--vanilla', '-e', script], { encoding: 'utf8' }).trim().split(/\s+/).map(Number);
      const ours = fitArma(x, { p: 1, q: 1 });
      expect(Math.abs(ours.logLik - out[0])).toBeLessThanOrEqual(1e-4);
      expect(Math.abs(ours.ar[0] - out[1])).toBeLessThanOrEqual(2e-3);
      expect(Math.abs(ours.ma[0] - out[2])).toBeLessThanOrEqual(2e-3);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
