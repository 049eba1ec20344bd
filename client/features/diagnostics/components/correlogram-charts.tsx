import { useMemo } from 'react';
import { EChart } from '../../../components/charts/echart.tsx';
import type { DiagnosticsReport } from '@shared/contract/diagnostics.ts';
import { lagsOutsideBand, stemChartOption, stemSummary } from './stem-chart-option.ts';

/**
 * ACF (with the white-noise and Bartlett bands) and PACF (with the white-noise band) of the
 * analysed series as stem charts, each with a summary in words.
 */
export function CorrelogramCharts({ report, pngPrefix }: { report: DiagnosticsReport; pngPrefix: string }) {
  const { acf, pacf, bands } = report;
  const step = `Lag (steps of ${report.method.resolved.stepS} s)`;
  const acfOption = useMemo(
    () => stemChartOption({ name: 'ACF', lags: acf.lags, values: acf.values, whiteNoise: bands.whiteNoise, bartlett: [null, ...bands.bartlett], xName: step }),
    [acf, bands, step],
  );
  const pacfOption = useMemo(
    () => stemChartOption({ name: 'PACF', lags: pacf.lags, values: pacf.values, whiteNoise: bands.whiteNoise, xName: step }),
    [pacf, bands, step],
  );
  // lag 0 (always 1) is not a finding; Bartlett's band starts at lag 1
  const acfOut = lagsOutsideBand(acf.lags.slice(1), acf.values.slice(1), (i) => bands.bartlett[i] ?? null);
  const pacfOut = lagsOutsideBand(pacf.lags, pacf.values, () => bands.whiteNoise);
  const level = `${Math.round((1 - bands.alpha) * 1000) / 10}%`;
  return (
    <div className="grid gap-4 lg:grid-cols-2" data-testid="correlograms">
      <EChart
        option={acfOption}
        label="Autocorrelation function (ACF)"
        summary={stemSummary('ACF', acfOut, `${level} Bartlett band`)}
        pngName={`${pngPrefix}-acf`}
      />
      <EChart
        option={pacfOption}
        label="Partial autocorrelation function (PACF)"
        summary={stemSummary('PACF', pacfOut, `${level} white-noise band ±${bands.whiteNoise.toFixed(3)}`)}
        pngName={`${pngPrefix}-pacf`}
      />
    </div>
  );
}
