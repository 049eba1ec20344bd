import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { useState } from 'react';
import { cleanup, fireEvent, screen } from '@testing-library/react';
import { fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { fakeEchartsModule, stubResizeObserver } from '../../../components/charts/fake-echarts.ts';
import type { ChannelDetail } from '@shared/contract/channels.ts';
import type { TimeRange } from '@shared/contract/channels.ts';
import type { RangePreset } from './range-presets.ts';
import { ReadingsPanel } from './readings-panel.tsx';

/** The series requests only (the panel also asks for the channel's test readings). */
const seriesAsked = (api: ReturnType<typeof fakeApi>) => api.requests.filter((r) => r.path.includes('/series?'));

const fake = vi.hoisted(() => ({ module: null as ReturnType<typeof fakeEchartsModule> | null }));
vi.mock(import('../../../components/charts/echarts-setup.ts'), async () => {
  const { fakeEchartsModule: make } = await import('../../../components/charts/fake-echarts.ts');
  fake.module = make();
  return { initChart: fake.module.initChart as never };
});

beforeEach(() => stubResizeObserver());
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// An invented channel of a demo field station; the API shapes are those of the channels README.
const T0 = Date.parse('2026-06-01T00:00:00Z');
const DAY = 86_400_000;
const CHANNEL = {
  id: 7,
  key: 'leaf_t',
  label: 'Leaf temperature',
  unit: '°C',
  validMin: -10,
  validMax: 45,
  logger: { id: 1, name: 'Canopy mast', site: null, timezone: 'Asia/Kolkata', expectedIntervalS: 60 },
} as ChannelDetail;

function Harness() {
  const [view, setView] = useState<{ range: TimeRange; preset: RangePreset | null }>({ range: { from: T0, to: T0 + DAY }, preset: '24h' });
  return (
    <ReadingsPanel slug="canopy" channel={CHANNEL} range={view.range} preset={view.preset} onRange={(range, preset) => setView({ range, preset })} canExport />
  );
}

describe('ReadingsPanel', () => {
  it('draws the range, offers the CSV of it, and fetches the zoomed range again', async () => {
    const api = fakeApi({
      'GET /api/v1/labs/canopy/channels/7/series': (req) => {
        const q = new URL(req.path, 'http://x').searchParams;
        const from = Number(q.get('from'));
        return {
          status: 200,
          body: { series: { shape: 'readings', source: 'raw', from, to: Number(q.get('to')), t: [from, from + 60_000], value: [20, 50] } },
        };
      },
    });
    renderWithProviders(<Harness />);
    const caption = await screen.findByText(/^2 readings from/);
    // Asia/Kolkata is UTC+05:30 all year (IANA tzdata): 00:00 UTC reads 05:30.
    expect(caption.textContent).toBe(
      '2 readings from 2026-06-01 05:30 to 2026-06-02 05:30 (Asia/Kolkata, UTC+05:30); lowest 20 °C, highest 50 °C; 1 outside the valid range.',
    );
    expect(seriesAsked(api)[0].path).toBe(`/api/v1/labs/canopy/channels/7/series?from=${T0}&to=${T0 + DAY}&points=2000`);
    expect(screen.getByRole('link', { name: 'Download readings of this range (CSV)' }).getAttribute('href')).toBe(
      `/api/v1/labs/canopy/channels/7/readings.csv?from=${T0}&to=${T0 + DAY}`,
    );
    await vi.waitFor(() => expect(document.querySelector('figure')?.dataset.chartReady).toBe('true'));

    // The slider reports percentages; the middle half of the day is asked for at full detail.
    fake.module!.emitters[0]('datazoom', { start: 25, end: 75 });
    await vi.waitFor(
      () => expect(seriesAsked(api).at(-1)!.path).toBe(`/api/v1/labs/canopy/channels/7/series?from=${T0 + DAY / 4}&to=${T0 + (3 * DAY) / 4}&points=2000`),
      { timeout: 5000 },
    );
    expect(screen.getByRole('button', { name: '24 h' }).getAttribute('aria-pressed')).toBe('false');
    expect((screen.getByLabelText('From date') as HTMLInputElement).value).toBe('2026-06-01');
    expect((screen.getByLabelText('From time') as HTMLInputElement).value).toBe('11:30');
  });

  it('applies a custom range typed on the logger’s clock and refuses a reversed one', async () => {
    const api = fakeApi({
      'GET /api/v1/labs/canopy/channels/7/series': () => ({
        status: 200,
        body: { series: { shape: 'readings', source: 'raw', from: 0, to: 1, t: [], value: [] } },
      }),
    });
    renderWithProviders(<Harness />);
    await screen.findByText(/^No readings from/);
    fireEvent.change(screen.getByLabelText('From date'), { target: { value: '2026-06-03' } });
    fireEvent.change(screen.getByLabelText('From time'), { target: { value: '05:30' } });
    fireEvent.change(screen.getByLabelText('To date'), { target: { value: '2026-06-03' } });
    fireEvent.change(screen.getByLabelText('To time'), { target: { value: '00:00' } });
    fireEvent.click(screen.getByRole('button', { name: 'Show range' }));
    expect(screen.getByRole('alert').textContent).toBe('“To” must be after “From”.');
    fireEvent.change(screen.getByLabelText('To date'), { target: { value: '2026-06-31' } });
    fireEvent.click(screen.getByRole('button', { name: 'Show range' }));
    expect(screen.getByRole('alert').textContent).toBe('To: 2026-06-31 is not a date.');
    fireEvent.change(screen.getByLabelText('To date'), { target: { value: '2026-06-04' } });
    fireEvent.change(screen.getByLabelText('To time'), { target: { value: '05:30' } });
    fireEvent.click(screen.getByRole('button', { name: 'Show range' }));
    await vi.waitFor(() =>
      expect(seriesAsked(api).at(-1)!.path).toBe(`/api/v1/labs/canopy/channels/7/series?from=${T0 + 2 * DAY}&to=${T0 + 3 * DAY}&points=2000`),
    );
  });

  it('says where the plan’s history window cut the range, and that older readings are kept', async () => {
    const cut = T0 + DAY / 2;
    fakeApi({
      'GET /api/v1/labs/canopy/channels/7/series': () => ({
        status: 200,
        body: { historyStartsAt: cut, series: { shape: 'readings', source: 'raw', from: cut, to: T0 + DAY, t: [], value: [] } },
      }),
    });
    renderWithProviders(<Harness />);
    const note = await screen.findByText(/plan shows readings from/);
    expect(note.textContent).toContain('from 2026-06-01 on; older readings are kept');
  });
});
