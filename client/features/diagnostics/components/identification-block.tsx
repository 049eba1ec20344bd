import type { DiagnosticsReport } from '@shared/contract/diagnostics.ts';
import { durationWords } from '@shared/contract/words/diagnostics.ts';
import { armaOneLine } from './arma-notation.ts';

const VERDICTS: Record<DiagnosticsReport['identification']['verdict'], string> = {
  'white-noise': 'White noise — no structure left to model',
  ar: 'Autoregressive (persistence)',
  ma: 'Moving average (short-lived disturbances)',
  arma: 'Mixed autoregressive–moving average',
  'needs-differencing': 'Not stationary — difference it first',
  seasonal: 'Seasonal cycle dominates',
};

const list = (v: unknown) => (Array.isArray(v) && v.length ? v.join(', ') : 'none');

/** "288 steps (1 day)". */
const stepsWords = (steps: number, stepS: number) => `${steps} steps (${durationWords(steps * stepS)})`;

/**
 * The engine's process identification: the verdict with its order, the plain-language
 * explanation and the evidence behind it. A seasonal verdict names `usedPeriod`, the one period
 * every section of the report used (the report's `period.used`), so the heading never shows a
 * second figure beside it.
 */
export function IdentificationBlock({
  identification: id,
  stepS,
  usedPeriod,
}: {
  identification: DiagnosticsReport['identification'];
  stepS: number;
  usedPeriod: number | null;
}) {
  const cycle = usedPeriod ?? id.period ?? null;
  const order =
    id.verdict === 'ar'
      ? `AR(${id.p})`
      : id.verdict === 'ma'
        ? `MA(${id.q})`
        : id.verdict === 'arma'
          ? `ARMA(${id.p}, ${id.q})`
          : id.verdict === 'seasonal'
            ? `cycle of ${cycle === null ? 'unknown length' : stepsWords(cycle, stepS)}`
            : null;
  const e = id.evidence;
  const unitRoot = e.unitRoot;
  return (
    <section aria-labelledby="identification-heading" className="grid gap-2">
      <h4 id="identification-heading" className="text-sm font-semibold">
        Process identification
      </h4>
      <p className="text-lg font-semibold" data-testid="verdict">
        {VERDICTS[id.verdict]}
        {order && <span className="ml-2 font-mono text-base text-lichen-dark">{order}</span>}
      </p>
      {id.model && (
        <p className="font-mono text-sm text-lichen-dark" data-testid="verdict-model">
          {id.fittedOn === 'remainder' ? 'remainder: ' : ''}
          {armaOneLine(id.model)}
        </p>
      )}
      <p>{id.explanation}</p>
      <details className="text-sm">
        <summary className="cursor-pointer font-medium">Evidence</summary>
        <dl className="mt-2 grid gap-1 sm:grid-cols-2">
          <dt className="text-ink-soft">Values analysed (n), lags examined</dt>
          <dd className="font-mono">
            {String(e.n)}, {String(e.maxLag)}
          </dd>
          <dt className="text-ink-soft">ACF outside Bartlett band at lags</dt>
          <dd className="font-mono">{list(e.significantAcfLags)}</dd>
          <dt className="text-ink-soft">PACF outside white-noise band at lags</dt>
          <dd className="font-mono">{list(e.significantPacfLags)}</dd>
          <dt className="text-ink-soft">ACF / PACF pattern (cut-off lag)</dt>
          <dd className="font-mono">
            {String(e.acfPattern)} ({String(e.acfCutoff)}) / {String(e.pacfPattern)} ({String(e.pacfCutoff)})
          </dd>
          <dt className="text-ink-soft">Augmented Dickey–Fuller</dt>
          <dd className="font-mono">
            {unitRoot
              ? `t = ${unitRoot.statistic.toFixed(3)} (5% critical ${unitRoot.criticalValues['5%'].toFixed(3)}); ${unitRoot.rejectsUnitRoot ? 'unit root rejected' : 'unit root not rejected'}`
              : 'series too short'}
          </dd>
          <dt className="text-ink-soft">Cycle length checked</dt>
          <dd className="font-mono">{e.period === null ? 'none' : stepsWords(Number(e.period), stepS)}</dd>
        </dl>
        {id.gapsFilled && <p className="mt-1 text-ink-soft">Gaps in the grid were filled by linear interpolation before identification.</p>}
      </details>
    </section>
  );
}
