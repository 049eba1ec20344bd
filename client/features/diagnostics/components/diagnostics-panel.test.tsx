import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, within } from '@testing-library/react';
import { fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { typeDateTime } from '../../../components/date-time-input-typing.ts';
import { stubResizeObserver } from '../../../components/charts/fake-echarts.ts';
import type { DiagnosticsAnswer } from '@shared/contract/diagnostics.ts';
import { DiagnosticsPanel } from './diagnostics-panel.tsx';
import { FROM, IDENTIFIED_MODEL, PROCESS_MODEL, REPORT, TO, TREND } from './report-fixture.ts';

vi.mock(import('../../../components/charts/echarts-setup.ts'), async () => {
  const { fakeEchartsModule } = await import('../../../components/charts/fake-echarts.ts');
  return { initChart: fakeEchartsModule().initChart as never };
});

beforeEach(() => stubResizeObserver());
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function renderPanel() {
  return renderWithProviders(
    <DiagnosticsPanel slug="fernhollow" channelId={5} channelKey="soil_vwc" timezone="UTC" chartRange={{ from: FROM, to: TO }} canExport />,
  );
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
    expect(screen.getByRole('link', { name: 'Download diagnostics (CSV)' }).getAttribute('href')).toBe(
      api.requests[0].path.replace('/diagnostics?', '/diagnostics.csv?'),
    );
    // Both correlograms are drawn, each with its text alternative.
    await vi.waitFor(() => expect(document.querySelectorAll('figure[data-chart-ready="true"]').length).toBe(2));
    expect(screen.getByRole('img', { name: 'Autocorrelation function (ACF)' })).toBeTruthy();
    expect(screen.getByText('ACF: 2 lags outside the 95% Bartlett band; strongest lag 1 (0.600), lag 2 (0.300).')).toBeTruthy();
  });

  it('shows the fitted process model with coefficients ± SE, marks the chosen candidate, and shows the trend with both intervals', async () => {
    if (!PROCESS_MODEL.available) throw new Error('fixture: the process model must be available');
    const model = PROCESS_MODEL;
    const withModel: DiagnosticsAnswer = {
      ...REPORT,
      identification: { ...REPORT.identification, model: IDENTIFIED_MODEL, fittedOn: 'remainder' },
      processModel: model,
      trend: TREND,
    };
    fakeApi({ 'GET /api/v1/labs/fernhollow/channels/5/diagnostics': () => ({ status: 200, body: withModel }) });
    renderPanel();
    fireEvent.click(screen.getByRole('button', { name: 'Analyse' }));

    expect((await screen.findByTestId('process-model-chosen')).textContent).toBe('AR(1)(1, 0)');
    expect(screen.getByTestId('verdict-model').textContent).toBe('remainder: AR(1): φ₁ = 0.821 ± 0.031');
    const coefs = screen.getByRole('table', { name: /Estimated coefficients/ });
    const coefRows = within(coefs)
      .getAllByRole('row')
      .map((r) => r.textContent);
    expect(coefRows[1]).toBe('φ₁ autoregressive, lag 10.8213± 0.0312');
    expect(coefRows[2]).toBe('μ mean21.42 %± 0.587');
    expect(coefRows[3]).toBe('σ² innovation variance0.0441');
    expect(screen.getByTestId('process-model-fitted-on').textContent).toBe(
      'Fitted on the remainder after the 1-day cycle (288 steps): 2,016 cells of 5 min, 2026-06-01 00:00 UTC to 2026-06-08 00:00 UTC. About 1 in 10.2 readings is independent information.',
    );
    const candidates = within(screen.getByTestId('process-model-candidates')).getAllByRole('row');
    const chosen = candidates.filter((r) => r.getAttribute('aria-current') === 'true');
    expect(chosen.map((r) => r.textContent)).toEqual(['AR(1)-1018.580-1005.4512.3chosen']);
    expect(candidates[2].textContent).toBe('AR(1)-1018.580-1005.4512.3chosen');
    // ΔAICc of ARMA(1, 1): −1016.6 − (−1018.58) = 1.98 (worked by hand)
    expect(candidates[3].textContent).toBe('ARMA(1, 1)-1016.61.98-999512.31');
    expect(candidates[4].textContent).toBe('ARMA(3, 3)————did not converge');
    expect(screen.getByTestId('process-model-residuals').textContent).toBe(
      'Ljung–Box on the residuals up to lag 20: Q = 18.7, df = 19, p = 0.4760 — no evidence of remaining autocorrelation at α = 0.05.',
    );
    expect(screen.getByTestId('process-model-sentence').textContent).toBe(PROCESS_MODEL.available ? PROCESS_MODEL.sentence : '');

    expect(screen.getByTestId('trend-sentence').textContent).toBe('Invented sentence: no drift that the autocorrelation cannot explain.');
    expect(screen.getByTestId('trend-hac').textContent).toBe('allowing for autocorrelation (Newey–West, lag 8)± 0.0114-0.0101 … 0.0347-3.687 … 12.67');
    expect(screen.getByTestId('trend-ols').textContent).toBe('assuming independent readings (ordinary least squares)± 0.002140.0081 … 0.01652.957 … 6.023');
  });

  it('draws a decomposition thinned by the server and says so under the chart', async () => {
    const note = 'Thinned for drawing: 3 of 4 cells (invented note for this test).';
    const thinned: DiagnosticsAnswer = {
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

  it('takes its own range typed on the logger’s clock, and names an impossible date before asking the server', async () => {
    const api = fakeApi({ 'GET /api/v1/labs/fernhollow/channels/5/diagnostics': () => ({ status: 200, body: REPORT }) });
    renderPanel();
    fireEvent.click(screen.getByLabelText('Same range as the chart'));
    typeDateTime('From', '2026-02-30T00:00');
    fireEvent.click(screen.getByRole('button', { name: 'Analyse' }));
    expect(screen.getByRole('alert').textContent).toBe('From: 2026-02-30 is not a date.');
    expect(api.requests).toHaveLength(0);
    typeDateTime('From', '2026-06-01T00:00');
    typeDateTime('To', '2026-06-02T12:00');
    fireEvent.click(screen.getByRole('button', { name: 'Analyse' }));
    await screen.findByTestId('verdict');
    expect(api.requests[0].path).toContain(`?from=${Date.parse('2026-06-01T00:00:00Z')}&to=${Date.parse('2026-06-02T12:00:00Z')}&`);
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
