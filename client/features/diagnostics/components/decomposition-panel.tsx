import { useMemo } from 'react';
import { EChart } from '../../../components/charts/echart.tsx';
import { formatInstant } from '../../../components/clock/format.ts';
import type { DiagnosticsReport } from '@shared/contract/diagnostics.ts';
import { decompositionChartOption } from './decomposition-chart-option.ts';
import { withLeftOutSpans } from './left-out-spans.ts';
import { outlierRule } from './outlier-rule.ts';

const METHOD_NAMES = { stl: 'STL', 'stl-robust': 'robust STL', classical: 'classical additive decomposition' } as const;

/** The seasonal decomposition as stacked panels, or why there is none. */
export function DecompositionPanel({ report, timezone, pngPrefix }: { report: DiagnosticsReport; timezone: string; pngPrefix: string }) {
  const d = report.decomposition;
  const option = useMemo(
    () => (d.method === 'none' ? null : withLeftOutSpans(decompositionChartOption(d, report.series, timezone), report.method.excludedNotes, report.channel.id)),
    [d, report.series, report.method.excludedNotes, report.channel.id, timezone],
  );
  if (d.method === 'none' || !option) {
    return (
      <p className="text-sm text-ink-soft" data-testid="no-decomposition">
        No decomposition: {d.method === 'none' ? d.reason : ''}
      </p>
    );
  }
  const o = d.outliers;
  const outliers =
    o.indices.length === 0
      ? 'no remainder outliers'
      : `${o.indices.length} remainder outlier${o.indices.length === 1 ? '' : 's'} (${outlierRule(o)}), first at ${formatInstant(o.times[0], timezone)}`;
  const own = report.method.excludedNotes.filter((n) => n.removedFrom === report.channel.id);
  const leftOut = own.length
    ? ` Shaded: ${own.length} span${own.length === 1 ? '' : 's'} left out of the analysis (${own.map((n) => n.kind).join(', ')}).`
    : '';
  return (
    <div data-testid="decomposition">
      <EChart
        option={option}
        label={`Seasonal decomposition (${METHOD_NAMES[d.method]}, period ${d.period} steps): observed, trend, seasonal and remainder`}
        summary={`${METHOD_NAMES[d.method]} with a period of ${d.period} steps; ${outliers}.${leftOut} Times in ${timezone.replaceAll('_', ' ')}.`}
        height={560}
        pngName={`${pngPrefix}-decomposition`}
      />
      {d.thinned && (
        <p className="mt-1 text-xs text-ink-soft" data-testid="decomposition-thinned">
          {d.thinned.note}
        </p>
      )}
    </div>
  );
}
