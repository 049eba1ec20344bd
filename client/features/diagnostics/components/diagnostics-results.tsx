import type { DiagnosticsAnswer } from '@shared/contract/diagnostics.ts';
import { CorrelogramCharts } from './correlogram-charts.tsx';
import { DecompositionPanel } from './decomposition-panel.tsx';
import { IdentificationBlock } from './identification-block.tsx';
import { LjungBoxTable } from './ljung-box-table.tsx';
import { MeanBlock } from './mean-block.tsx';
import { MethodBlock } from './method-block.tsx';
import { PeriodCandidates } from './period-candidates.tsx';
import { ProcessModelBlock } from './process-model-block.tsx';
import { TrendBlock } from './trend-block.tsx';

/** Everything one diagnostics answer holds, laid out for reading top to bottom. */
export function DiagnosticsResults({ report, timezone, pngPrefix }: { report: DiagnosticsAnswer; timezone: string; pngPrefix: string }) {
  const s = report.series;
  return (
    <div className="grid gap-6" data-testid="diagnostics-results">
      <p className="text-sm text-ink-soft">
        {s.n.toLocaleString('en')} steps of {report.method.resolved.stepS} s from {s.readings.toLocaleString('en')} readings; {s.missing.toLocaleString('en')}{' '}
        empty steps. Analysed after differencing: {report.analysed.n.toLocaleString('en')} values.
      </p>
      <IdentificationBlock identification={report.identification} stepS={report.method.resolved.stepS} />
      <ProcessModelBlock
        model={report.processModel}
        stepS={report.method.resolved.stepS}
        alpha={report.bands.alpha}
        unit={report.channel.unit}
        timezone={timezone}
      />
      <CorrelogramCharts report={report} pngPrefix={pngPrefix} />
      <div className="grid gap-6 lg:grid-cols-2">
        <LjungBoxTable rows={report.ljungBox} alpha={report.bands.alpha} />
        <MeanBlock ess={report.effectiveSampleSize} z={report.bands.z} unit={report.channel.unit} />
      </div>
      <TrendBlock trend={report.trend} />
      <PeriodCandidates period={report.period} />
      <section aria-labelledby="decomposition-heading" className="grid gap-2">
        <h4 id="decomposition-heading" className="text-sm font-semibold">
          Seasonal decomposition
        </h4>
        <DecompositionPanel report={report} timezone={timezone} pngPrefix={pngPrefix} />
      </section>
      <MethodBlock method={report.method} cached={report.cached} />
    </div>
  );
}
