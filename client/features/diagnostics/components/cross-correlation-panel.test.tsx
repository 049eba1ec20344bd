import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen } from '@testing-library/react';
import { fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { stubResizeObserver } from '../../../components/charts/fake-echarts.ts';
import type { DiagnosticsAnswer } from '@shared/contract/diagnostics.ts';
import { CrossCorrelationPanel } from './cross-correlation-panel.tsx';
import { CCF, FROM, REPORT, TO } from './report-fixture.ts';

const charts = vi.hoisted(() => ({ options: [] as unknown[] }));
vi.mock(import('../../../components/charts/echarts-setup.ts'), async () => {
  const { fakeEchartsModule: make } = await import('../../../components/charts/fake-echarts.ts');
  const fake = make();
  charts.options = fake.options;
  return { initChart: fake.initChart as never };
});

beforeEach(() => {
  stubResizeObserver();
  charts.options.length = 0;
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

type DrawnOption = { legend: { data: string[] }; xAxis: { data: string[]; name: string }; series: Array<{ name: string; data: unknown[] }> };
const PATH = 'GET /api/v1/labs/fernhollow/channels/5/diagnostics';

function renderPanel() {
  return renderWithProviders(
    <CrossCorrelationPanel
      slug="fernhollow"
      channelId={5}
      channelLabel="Soil moisture"
      chartRange={{ from: FROM, to: TO }}
      partners={[{ id: 9, label: 'Irrigation flow', loggerName: 'Pump house' }]}
      stepS={300}
    />,
  );
}

// The CCF answer is invented (report-fixture.ts); the panel only has to show it faithfully.
describe('CrossCorrelationPanel', () => {
  it('sends the lag window in steps, says the CCF is prewhitened, and draws the per-lag and all-lag bands with lags in time', async () => {
    const api = fakeApi({ [PATH]: () => ({ status: 200, body: { ...REPORT, crossCorrelation: CCF } satisfies DiagnosticsAnswer }) });
    renderPanel();
    fireEvent.change(screen.getByLabelText('Lag window ±'), { target: { value: '12' } });
    fireEvent.change(screen.getByLabelText('Lag window unit'), { target: { value: 'h' } });
    fireEvent.click(screen.getByRole('button', { name: 'Cross-correlate' }));

    expect((await screen.findByTestId('ccf-sentence')).textContent).toBe(CCF.explanation);
    // 12 h at 300 s steps = 144 steps (worked by hand)
    expect(api.requests[0].path).toBe(
      `/api/v1/labs/fernhollow/channels/5/diagnostics?from=${FROM}&to=${TO}&agg=mean&difference=0&seasonalDifference=0&period=none&decomposition=none&alpha=0.05&ccfWith=9&ccfMaxLag=144`,
    );
    expect(screen.getByTestId('ccf-method').textContent).toBe(
      'Prewhitened: both series were filtered with the AR(2) model fitted to Irrigation flow (φ₁ = 1.200, φ₂ = -0.350), so the persistence of either series cannot make a relation appear.',
    );
    expect(screen.getByTestId('ccf-facts').textContent).toBe(
      'Strongest at lag 2 steps (+10 min), r = 0.310, beyond the band over all lags; band ±0.044 per lag, ±0.071 over all lags (Šidák over 5 lags); 2,016 paired steps. Positive lags mean this channel follows Irrigation flow.',
    );
    expect(screen.getByRole('img', { name: 'Prewhitened cross-correlation of Soil moisture with Irrigation flow' })).toBeTruthy();
    expect(screen.getByText('Prewhitened CCF: 1 lag outside the band over all lags ±0.071; strongest lag 2 (0.310).')).toBeTruthy();
    await vi.waitFor(() => expect(charts.options).toHaveLength(1));
    const drawn = charts.options[0] as DrawnOption;
    expect(drawn.legend.data).toEqual(['Prewhitened CCF', 'Band per lag ±z/√pairs', 'Band over all lags (Šidák over 5 lags)']);
    expect(drawn.series.filter((s) => s.name === 'Band over all lags (Šidák over 5 lags)').map((s) => s.data[0])).toEqual([0.0712, -0.0712]);
    expect(drawn.series.filter((s) => s.name === 'Band per lag ±z/√pairs').map((s) => s.data[0])).toEqual([0.0437, -0.0437]);
    expect(drawn.xAxis.data).toEqual(['−10 min', '−5 min', '0', '+5 min', '+10 min']);

    // The raw CCF only on request, labelled as no test.
    expect(screen.queryByTestId('ccf-raw')).toBeNull();
    fireEvent.click(screen.getByLabelText('Show the raw cross-correlation beside it'));
    const raw = screen.getByTestId('ccf-raw');
    expect(raw.textContent).toMatch(/^Raw cross-correlation — not a test of a relation between autocorrelated series/);
    expect(screen.getByRole('img', { name: 'Raw cross-correlation of Soil moisture with Irrigation flow (not a test)' })).toBeTruthy();
    expect(screen.getByText('Raw CCF: largest at 0 (lag 0), r = -0.640; not evidence of a relation.')).toBeTruthy();
    await vi.waitFor(() => expect(charts.options).toHaveLength(2));
    expect((charts.options[1] as DrawnOption).series[0].data).toEqual(CCF.raw.values);
    fireEvent.click(screen.getByLabelText('Show the raw cross-correlation beside it'));
    expect(screen.queryByTestId('ccf-raw')).toBeNull();
  });

  it('leaves the lag window to the server when empty, and refuses one outside the server’s bounds', async () => {
    const api = fakeApi({ [PATH]: () => ({ status: 200, body: { ...REPORT, crossCorrelation: CCF } }) });
    renderPanel();
    fireEvent.change(screen.getByLabelText('Lag window ±'), { target: { value: '1' } });
    fireEvent.change(screen.getByLabelText('Lag window unit'), { target: { value: 'min' } });
    fireEvent.click(screen.getByRole('button', { name: 'Cross-correlate' }));
    expect(screen.getByRole('alert').textContent).toBe('Lag window: from 5 min to 34 d 17 h at steps of 5 min');
    expect(api.requests).toHaveLength(0);
    fireEvent.change(screen.getByLabelText('Lag window ±'), { target: { value: '' } });
    fireEvent.click(screen.getByRole('button', { name: 'Cross-correlate' }));
    await screen.findByTestId('ccf-sentence');
    expect(api.requests[0].path).not.toContain('ccfMaxLag');
    expect(api.requests[0].path).toContain('ccfWith=9');
  });

  it('labels a CCF the server could not prewhiten as raw and offers no second chart', async () => {
    const raw = { ...CCF, method: 'raw' as const, prewhitening: null };
    fakeApi({ [PATH]: () => ({ status: 200, body: { ...REPORT, crossCorrelation: raw } }) });
    renderPanel();
    fireEvent.click(screen.getByRole('button', { name: 'Cross-correlate' }));
    expect((await screen.findByTestId('ccf-method')).textContent).toBe(
      'Raw cross-correlation (not prewhitened): it is not a test of a relation between autocorrelated series.',
    );
    expect(screen.getByRole('img', { name: 'Raw cross-correlation of Soil moisture with Irrigation flow' })).toBeTruthy();
    expect(screen.queryByLabelText('Show the raw cross-correlation beside it')).toBeNull();
  });
});
