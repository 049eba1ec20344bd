import type { DiagnosticsAnswer } from '@shared/contract/diagnostics.ts';
import { countWords, stepAdjective } from '@shared/contract/words/diagnostics.ts';
import { CorrelogramCharts } from './correlogram-charts.tsx';
import { DecompositionPanel } from './decomposition-panel.tsx';
import { IdentificationBlock } from './identification-block.tsx';
import { LjungBoxTable } from './ljung-box-table.tsx';
import { MeanBlock } from './mean-block.tsx';
import { MethodBlock } from './method-block.tsx';
import { PeriodCandidates } from './period-candidates.tsx';
import { ProcessModelBlock } from './process-model-block.tsx';
import { TrendBlock } from './trend-block.tsx';

/** "n values" / "1 value" with thousands separators. */
function counted(n: number, one: string, many: string): string {
  return `${countWords(n)} ${n === 1 ? one : many}`;
}

/**
 * The series in one plain sentence, units in words: "169 hourly steps from 2,016 readings;
 * 3 steps without a reading. 168 values analysed after differencing."
 */
export function seriesSummary(report: DiagnosticsAnswer): string {
  const s = report.series;
  const steps = `${countWords(s.n)} ${stepAdjective(report.method.resolved.stepS)} ${s.n === 1 ? 'step' : 'steps'}`;
  const empty = s.missing === 0 ? 'every step has a reading' : `${counted(s.missing, 'step', 'steps')} without a reading`;
  const differenced = report.method.resolved.difference + report.method.resolved.seasonalDifference > 0;
  return `${steps} from ${counted(s.readings, 'reading', 'readings')}; ${empty}. ${counted(report.analysed.n, 'value', 'values')} analysed${differenced ? ' after differencing' : ''}.`;
}

/** Everything one diagnostics answer holds, laid out for reading top to bottom. */
export function DiagnosticsResults({ report, timezone, pngPrefix }: { report: DiagnosticsAnswer; timezone: string; pngPrefix: string }) {
  return (
    <div className="grid gap-6" data-testid="diagnostics-results">
      <div className="grid gap-1 text-sm">
        <p className="text-ink-soft" data-testid="series-summary">
          {seriesSummary(report)}
        </p>
        {report.period.statement && <p data-testid="period-statement">{report.period.statement}</p>}
      </div>
      <IdentificationBlock identification={report.identification} stepS={report.method.resolved.stepS} usedPeriod={report.period.used} />
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
      <PeriodCandidates period={report.period} stepS={report.method.resolved.stepS} />
      <section aria-labelledby="decomposition-heading" className="grid gap-2">
        <h4 id="decomposition-heading" className="text-sm font-semibold">
          Seasonal decomposition
        </h4>
        <DecompositionPanel report={report} timezone={timezone} pngPrefix={pngPrefix} />
      </section>
      <MethodBlock method={report.method} cached={report.cached} timezone={timezone} />
    </div>
  );
}
