import type { DiagnosticsReport } from '@shared/contract/diagnostics.ts';
import { fmtStat } from './format-number.ts';

/**
 * The mean of the channel with two confidence intervals side by side: the naive one that treats
 * readings as independent (mean ± z·s/√n) and the engine's autocorrelation-corrected one
 * (mean ± z·s·√(τ/n)), with the effective sample size n/τ (Brockwell & Davis 2016, §2.4 — section cited from memory). The
 * naive standard error is the engine's divided by √τ, so both rest on the same s.
 */
export function MeanBlock({ ess, z, unit }: { ess: DiagnosticsReport['effectiveSampleSize']; z: number; unit: string | null }) {
  const naiveSe = ess.standardError / Math.sqrt(ess.tau);
  const naive: [number, number] = [ess.mean - z * naiveSe, ess.mean + z * naiveSe];
  const u = unit ? ` ${unit}` : '';
  const level = `${Math.round((1 - ess.alpha) * 1000) / 10}%`;
  return (
    <section aria-labelledby="mean-heading" className="grid gap-2">
      <h4 id="mean-heading" className="text-sm font-semibold">
        Mean and effective sample size
      </h4>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-ink-soft">Values (n)</dt>
        <dd className="font-mono">{ess.n.toLocaleString('en')}</dd>
        <dt className="text-ink-soft">Effective sample size (n/τ)</dt>
        <dd className="font-mono" data-testid="ess">
          {fmtStat(ess.ess)}{' '}
          <span className="font-sans text-ink-soft">
            (τ = {fmtStat(ess.tau)}, lags 1–{ess.lagsUsed})
          </span>
        </dd>
        <dt className="text-ink-soft">Mean</dt>
        <dd className="font-mono">
          {fmtStat(ess.mean, 6)}
          {u}
        </dd>
        <dt className="text-ink-soft">{level} interval, corrected for autocorrelation</dt>
        <dd className="font-mono">
          {fmtStat(ess.confidenceInterval[0], 6)} … {fmtStat(ess.confidenceInterval[1], 6)}
          {u}
        </dd>
        <dt className="text-ink-soft">{level} interval if readings were independent</dt>
        <dd className="font-mono text-ink-soft">
          {fmtStat(naive[0], 6)} … {fmtStat(naive[1], 6)}
          {u} <span className="font-sans">(too narrow when τ &gt; 1)</span>
        </dd>
      </dl>
    </section>
  );
}
