import { formatInstant } from '../../../components/clock/format.ts';
import type { ProcessModel } from '@shared/contract/diagnostics.ts';
import { BlockSection } from './block-section.tsx';
import { ARMA_SIGNS, armaName, coefficientRows } from './arma-notation.ts';
import { fmtP, fmtSeconds, fmtStat } from './format-number.ts';
import { noModel } from '../messages.ts';

const TH = 'py-1 pr-3';

/** "1-day", "12-hour", "30-minute" for whole units, else the two largest units ("7 h 45 min"). */
export function cycleLength(seconds: number): string {
  for (const [unit, size] of [
    ['week', 604_800],
    ['day', 86_400],
    ['hour', 3600],
    ['minute', 60],
  ] as const) {
    if (seconds >= size && seconds % size === 0) return `${seconds / size}-${unit}`;
  }
  return fmtSeconds(seconds);
}

/**
 * The ARMA model the server chose for the series, or for the remainder after its seasonal
 * component: coefficients ± standard errors, what it was fitted on, the table of candidates with
 * their AICc (Hurvich & Tsai 1989; the lowest is named when the server chose another), Ljung–Box on the residuals (Ljung & Box 1978, df = lag − p − q) and
 * the server's sentence. When no model could be fitted, the server's reason.
 */
export function ProcessModelBlock({
  model,
  stepS,
  alpha,
  unit,
  timezone,
}: {
  model: ProcessModel;
  stepS: number;
  alpha: number;
  unit: string | null;
  timezone: string;
}) {
  if (!model.available) {
    return <BlockSection id="process-model-heading" title="Process model" missing={{ text: noModel(model.reason), testId: 'process-model-unavailable' }} />;
  }
  const m = model.chosen;
  const u = unit ? ` ${unit}` : '';
  const fittedOn =
    model.fittedOn === 'remainder'
      ? `the remainder after the ${model.period === null ? 'seasonal' : `${cycleLength(model.period * stepS)} cycle (${model.period} steps)`}`
      : 'the series';
  const finite = model.candidates.map((c) => c.aicc).filter((a): a is number => a !== null && Number.isFinite(a));
  const best = finite.length ? Math.min(...finite) : null;
  const rt = model.residualTest;
  return (
    <BlockSection id="process-model-heading" title="Process model" testId="process-model">
      <p className="text-lg font-semibold" data-testid="process-model-chosen">
        {armaName(m.p, m.q)}
        <span className="ml-2 font-mono text-base text-lichen-dark">
          ({m.p}, {m.q})
        </span>
      </p>
      <p data-testid="process-model-sentence">{model.sentence}</p>
      <p className="text-sm text-ink-soft" data-testid="process-model-fitted-on">
        Fitted on {fittedOn}: {model.cells.toLocaleString('en')} cells of {fmtSeconds(stepS)}, {formatInstant(model.fittedFrom, timezone)} to{' '}
        {formatInstant(model.fittedTo, timezone)}.{' '}
        {model.readingsPerIndependent === null
          ? 'The model sits at the edge of a wandering level, so it gives no figure for the independent information; see the effective sample size.'
          : model.readingsPerIndependent < 1.05
            ? 'Each reading counts as independent information.'
            : `About 1 in ${fmtStat(model.readingsPerIndependent, 3)} readings is independent information.`}
      </p>
      <div className="grid items-start gap-6 lg:grid-cols-2">
        <table className="w-full border-collapse text-left text-sm">
          <caption className="mb-1 text-left text-sm font-semibold">
            Estimated coefficients (± standard error)
            {m.p + m.q > 0 && (
              <span className="block text-xs font-normal text-ink-soft" data-testid="process-model-signs">
                {ARMA_SIGNS}
              </span>
            )}
          </caption>
          <thead className="border-b border-rule text-xs uppercase tracking-wide text-ink-soft">
            <tr>
              <th scope="col" className={TH}>
                Parameter
              </th>
              <th scope="col" className={TH}>
                Estimate
              </th>
              <th scope="col" className="py-1">
                ± SE
              </th>
            </tr>
          </thead>
          <tbody>
            {coefficientRows(m).map((r) => (
              <tr key={r.symbol} className="border-b border-rule/60 last:border-b-0">
                <th scope="row" className={`${TH} font-normal`}>
                  <span className="font-mono">{r.symbol}</span> <span className="text-ink-soft">{r.name}</span>
                </th>
                <td className={`${TH} font-mono`}>
                  {fmtStat(r.estimate, 6)}
                  {r.symbol === 'μ' ? u : ''}
                </td>
                <td className="py-1 font-mono">± {fmtStat(r.standardError, 3)}</td>
              </tr>
            ))}
            <tr className="border-b border-rule/60 last:border-b-0">
              <th scope="row" className={`${TH} font-normal`}>
                <span className="font-mono">σ²</span> <span className="text-ink-soft">innovation variance</span>
              </th>
              <td className={`${TH} font-mono`}>{fmtStat(m.sigma2, 6)}</td>
              <td className="py-1" />
            </tr>
          </tbody>
        </table>
        <table className="w-full border-collapse text-left text-sm" data-testid="process-model-candidates">
          <caption className="mb-1 text-left text-sm font-semibold">Candidate models, their AICc and BIC (chosen: lowest BIC among admissible fits)</caption>
          <thead className="border-b border-rule text-xs uppercase tracking-wide text-ink-soft">
            <tr>
              <th scope="col" className={TH}>
                Model
              </th>
              <th scope="col" className={TH}>
                AICc
              </th>
              <th scope="col" className={TH}>
                ΔAICc
              </th>
              <th scope="col" className={TH}>
                BIC
              </th>
              <th scope="col" className={TH}>
                Log-likelihood
              </th>
              <th scope="col" className="py-1">
                Note
              </th>
            </tr>
          </thead>
          <tbody className="font-mono">
            {model.candidates.map((c) => {
              const chosen = c.p === m.p && c.q === m.q;
              return (
                <tr
                  key={`${c.p}-${c.q}`}
                  aria-current={chosen ? 'true' : undefined}
                  className={`border-b border-rule/60 last:border-b-0 ${chosen ? 'bg-lichen/10 font-semibold' : ''}`}
                >
                  <td className={`${TH} font-sans`}>{armaName(c.p, c.q)}</td>
                  <td className={TH}>{fmtStat(c.aicc, 6)}</td>
                  <td className={TH}>{c.aicc === null || best === null ? '—' : fmtStat(c.aicc - best, 3)}</td>
                  <td className={TH}>{fmtStat(c.bic, 6)}</td>
                  <td className={TH}>{fmtStat(c.logLik, 6)}</td>
                  <td className="py-1 font-sans">
                    {[
                      chosen ? 'chosen' : null,
                      !chosen && c.aicc !== null && c.aicc === best ? 'lowest AICc' : null,
                      c.converged ? (c.admissible ? null : 'root too close to the unit circle') : 'did not converge',
                    ]
                      .filter(Boolean)
                      .join(' · ')}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {model.criterionNote && (
        <p className="text-sm" data-testid="process-model-criterion">
          {model.criterionNote}
        </p>
      )}
      {model.note && (
        <p className="text-sm" data-testid="process-model-note">
          {model.note}
        </p>
      )}
      <p className="text-sm" data-testid="process-model-residuals">
        Ljung–Box on the residuals up to lag {rt.lag}: Q = {fmtStat(rt.statistic, 5)}, df = {rt.df}, p = {fmtP(rt.pValue)} —{' '}
        {rt.pValue < alpha
          ? `autocorrelation remains at α = ${alpha}; the model misses some structure.`
          : `no evidence of remaining autocorrelation at α = ${alpha}.`}
      </p>
      <p className="text-xs text-ink-soft">
        Exact Gaussian maximum likelihood; standard errors from the observed information. Log-likelihood {fmtStat(m.logLik, 6)}, AICc {fmtStat(m.aicc, 6)}
        {m.converged ? '' : '; the optimiser did not report convergence, so treat these estimates with care'}.
      </p>
    </BlockSection>
  );
}
