import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, within } from '@testing-library/react';
import { fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { stubResizeObserver } from '../../../components/charts/fake-echarts.ts';
import type { DiagnosticsReport } from '../api/get-diagnostics.ts';
import { DiagnosticsPanel } from './diagnostics-panel.tsx';

vi.mock(import('../../../components/charts/echarts-setup.ts'), async () => {
  const { fakeEchartsModule } = await import('../../../components/charts/fake-echarts.ts');
  return { initChart: fakeEchartsModule().initChart as never };
});

beforeEach(() => stubResizeObserver());
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// A diagnostics answer in the API's documented shape. The numbers are invented for this UI test
// (they only have to be shown faithfully); z = 1.959964 is the standard normal 97.5% quantile
// (R: qnorm(0.975)).
const FROM = Date.parse('2026-06-01T00:00:00Z');
const TO = Date.parse('2026-06-08T00:00:00Z');
const REPORT: DiagnosticsReport = {
  cached: true,
  channel: { id: 5, key: 'soil_vwc', label: 'Soil moisture', unit: '%', quantity: null, logger: { id: 2, name: 'Row 7 mast', site: null, timezone: 'UTC' } },
  method: {
    parameters: {},
    resolved: { from: FROM, to: TO, stepS: 300, maxLag: 4, alpha: 0.05, period: null, periodSource: 'none', agg: 'mean' },
    notes: ['Readings were put on a regular grid of 300 s cells.'],
    references: ['Ljung & Box (1978), Biometrika 65:297–303 — portmanteau test'],
  },
  series: { start: FROM, stepMs: 300_000, n: 4, missing: 0, readings: 4, emptyCells: [] },
  analysed: { n: 4, missing: 0 },
  period: { used: null, source: 'none', candidates: [] },
  acf: { lags: [0, 1, 2, 3, 4], values: [1, 0.6, 0.3, 0.1, 0] },
  pacf: { lags: [1, 2, 3, 4], values: [0.6, -0.1, 0, 0.05] },
  bands: { alpha: 0.05, z: 1.959964, whiteNoise: 0.2, bartlett: [0.2, 0.25, 0.26, 0.26] },
  ljungBox: [{ lag: 5, statistic: 12.5, df: 5, pValue: 0.0285 }],
  identification: {
    verdict: 'ar',
    p: 1,
    explanation: 'The PACF cuts off after lag 1 while the ACF dies down: an AR(1) process.',
    evidence: { n: 4, maxLag: 4, significantAcfLags: [1, 2], significantPacfLags: [1], acfCutoff: 2, pacfCutoff: 1, acfPattern: 'tails-off', pacfPattern: 'cuts-off', unitRoot: null, period: null },
    gapsFilled: false,
  },
  effectiveSampleSize: { n: 2016, ess: 504, tau: 4, lagsUsed: 10, mean: 10, standardError: 0.5, confidenceInterval: [9.020018, 10.979982], alpha: 0.05 },
  decomposition: { method: 'none', reason: 'no seasonal period' },
  crossCorrelation: null,
};

function renderPanel() {
  return renderWithProviders(<DiagnosticsPanel slug="fernhollow" channelId={5} channelKey="soil_vwc" timezone="UTC" chartRange={{ from: FROM, to: TO }} canExport />);
}

describe('DiagnosticsPanel', () => {
  it('sends the chosen parameters with the chart’s range and shows every part of the answer', async () => {
    const api = fakeApi({ 'GET /api/v1/labs/fernhollow/channels/5/diagnostics': () => ({ status: 200, body: REPORT }) });
    renderPanel();
    fireEvent.change(screen.getByLabelText('Differencing'), { target: { value: '1' } });
    fireEvent.change(screen.getByLabelText('Decomposition'), { target: { value: 'stl-robust' } });
    fireEvent.change(screen.getByLabelText('Seasonal period'), { target: { value: 'manual' } });
    fireEvent.change(screen.getByLabelText('Period (steps)'), { target: { value: '288' } });
    fireEvent.click(screen.getByRole('button', { name: 'Analyse' }));

    expect((await screen.findByTestId('verdict')).textContent).toBe('Autoregressive (persistence)AR(1)');
    expect(api.requests[0].path).toBe(
      `/api/v1/labs/fernhollow/channels/5/diagnostics?from=${FROM}&to=${TO}&agg=mean&difference=1&seasonalDifference=0&period=288&decomposition=stl-robust&alpha=0.05`,
    );
    expect(screen.getByText(/The PACF cuts off after lag 1/)).toBeTruthy();
    const lb = screen.getByRole('table', { name: /Ljung–Box/ });
    expect(within(lb).getAllByRole('row')[1].textContent).toBe('512.550.0285autocorrelated');
    // Naive interval: 10 ± 1.959964 × 0.5/√4 = 9.51001 … 10.48999 (worked by hand).
    expect(screen.getByText(/9\.51001 … 10\.49/)).toBeTruthy();
    expect(screen.getByText(/9\.02002 … 10\.98/)).toBeTruthy();
    expect(screen.getByTestId('ess').textContent).toContain('504');
    expect(screen.getByTestId('no-decomposition').textContent).toBe('No decomposition: no seasonal period');
    expect(screen.getByTestId('cached').textContent).toMatch(/result cache/);
    expect(screen.getByRole('link', { name: 'Download diagnostics (CSV)' }).getAttribute('href')).toBe(api.requests[0].path.replace('/diagnostics?', '/diagnostics.csv?'));
    // Both correlograms are drawn, each with its text alternative.
    await vi.waitFor(() => expect(document.querySelectorAll('figure[data-chart-ready="true"]').length).toBe(2));
    expect(screen.getByRole('img', { name: 'Autocorrelation function (ACF)' })).toBeTruthy();
    expect(screen.getByText('ACF: 2 lags outside the 95% Bartlett band; strongest lag 1 (0.600), lag 2 (0.300).')).toBeTruthy();
  });

  it('draws a decomposition thinned by the server and says so under the chart', async () => {
    const note = 'Thinned for drawing: 3 of 4 cells (invented note for this test).';
    const thinned: DiagnosticsReport = {
      ...REPORT,
      decomposition: {
        method: 'stl',
        period: 2,
        cells: [0, 1, 3],
        thinned: { cells: 3, of: 4, bucketCells: 2, note },
        trend: [10, 10.5, 11],
        seasonal: [1, -1, -1],
        remainder: [0, 0.2, 0.1],
        weights: null,
        outliers: { threshold: 3, median: 0, robustSd: 0.1, indices: [], times: [], values: [] },
      },
    };
    fakeApi({ 'GET /api/v1/labs/fernhollow/channels/5/diagnostics': () => ({ status: 200, body: thinned }) });
    renderPanel();
    fireEvent.click(screen.getByRole('button', { name: 'Analyse' }));
    expect((await screen.findByTestId('decomposition-thinned')).textContent).toBe(note);
    await vi.waitFor(() => expect(document.querySelectorAll('figure[data-chart-ready="true"]').length).toBe(3));
    expect(screen.getByRole('img', { name: /^Seasonal decomposition \(STL, period 2 steps\)/ })).toBeTruthy();
  });

  it('refuses a bad α before asking the server', () => {
    const api = fakeApi({});
    renderPanel();
    fireEvent.change(screen.getByLabelText('α (1 − confidence)'), { target: { value: '0.7' } });
    fireEvent.click(screen.getByRole('button', { name: 'Analyse' }));
    expect(screen.getByRole('alert').textContent).toBe('α: a number above 0 and at most 0.5');
    expect(api.requests).toHaveLength(0);
  });

  it('shows progress with the elapsed time while running, and Cancel aborts the request', async () => {
    const api = fakeApi({ 'GET /api/v1/labs/fernhollow/channels/5/diagnostics': () => new Promise(() => undefined) });
    renderPanel();
    fireEvent.click(screen.getByRole('button', { name: 'Analyse' }));
    const progress = await screen.findByRole('status');
    expect(progress.textContent).toMatch(/Analysing · 0 s/);
    expect((screen.getByRole('button', { name: 'Analyse' }) as HTMLButtonElement).disabled).toBe(true);
    const signal = (api.fetchMock.mock.calls[0][1] as RequestInit).signal!;
    expect(signal.aborted).toBe(false);
    fireEvent.click(screen.getByRole('button', { name: 'Cancel' }));
    await vi.waitFor(() => expect(signal.aborted).toBe(true));
    await vi.waitFor(() => expect(screen.queryByRole('status')).toBeNull());
    expect((screen.getByRole('button', { name: 'Analyse' }) as HTMLButtonElement).disabled).toBe(false);
  });
});
