import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { fakeEchartsModule, stubResizeObserver } from '../../../components/charts/fake-echarts.ts';
import { ChannelsTogether } from './channels-together.tsx';
import { BOARDWALK, fenChannel, FEN_NOW, WEIR } from './together-fixture.ts';

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

const BASE = '/api/v1/labs/fen/channels';
const CHANNELS = [
  fenChannel(11, 'Air temperature', '°C', WEIR),
  fenChannel(12, 'Relative humidity', '%', WEIR),
  fenChannel(13, 'Water temperature', '°C', BOARDWALK),
  fenChannel(14, 'Water level', 'cm', BOARDWALK),
  fenChannel(15, 'Outflow', 'L/s', WEIR),
];
const FROM = FEN_NOW - 3_600_000;
const TO = FEN_NOW;

function api(extra: Record<string, () => { status: number; body?: unknown }> = {}) {
  const series = (id: number) => () => ({
    status: 200,
    body: {
      channelId: id,
      historyStartsAt: null,
      series: { shape: 'readings', source: 'raw', from: FROM, to: TO, t: [FROM, FROM + 600_000], value: [id, id + 1] },
    },
  });
  return fakeApi({
    [`GET ${BASE}`]: () => ({ status: 200, body: { channels: CHANNELS, now: FEN_NOW } }),
    ...Object.fromEntries(CHANNELS.map((c) => [`GET ${BASE}/${c.id}/series`, series(c.id)])),
    ...extra,
  });
}

type Drawn = { yAxis: Array<{ name: string }>; series: Array<{ name: string; yAxisIndex: number }> };
/** The option last handed to the chart, once it has `lines` lines (options of earlier tests stay in the list). */
async function drawnWith(lines: number): Promise<Drawn> {
  await waitFor(() => expect((fake.module?.options.at(-1) as Drawn | undefined)?.series.length).toBe(lines));
  return fake.module!.options.at(-1) as Drawn;
}
const at = (q: string) => `/labs/fen/channels/together?${q}`;

describe('ChannelsTogether', () => {
  it('draws three channels of two units on two axes, one series request each, on the first channel’s clock', async () => {
    const { requests } = api();
    renderWithProviders(<ChannelsTogether slug="fen" canExport />, at(`channels=11,12,13&from=${FROM}&to=${TO}`));
    await screen.findByText(/^From 2026-03-29/);
    const option = await drawnWith(3);
    expect(option.yAxis.map((a) => a.name)).toEqual(['°C', '%']);
    expect(option.series.map((s) => [s.name, s.yAxisIndex])).toEqual([
      ['Weir mast · Air temperature (°C)', 0],
      ['Weir mast · Relative humidity (%)', 1],
      ['Boardwalk box · Water temperature (°C)', 0],
    ]);
    expect(requests.filter((r) => r.path.includes('/series')).map((r) => r.path.split('?')[0])).toEqual([11, 12, 13].map((id) => `${BASE}/${id}/series`));
    expect(screen.getByTestId('together-zone').textContent).toBe(
      'Times are shown in Europe/Berlin (UTC+02:00 in the middle of the range), the clock of Weir mast.',
    );
    expect(screen.queryByRole('alert')).toBeNull();
    expect(screen.getByRole('button', { name: 'Download what is shown (CSV)' })).toBeTruthy();
  });

  it('switches the clock through the URL and writes the default range into a link that has none', async () => {
    api();
    const { router } = renderWithProviders(<ChannelsTogether slug="fen" canExport={false} />, at('channels=13,11'));
    await screen.findByText(/^From /);
    await waitFor(() => expect(new URLSearchParams(router.state.location.search).get('from')).toMatch(/^\d+$/));
    expect(screen.getByTestId('together-zone').textContent).toMatch(
      /^Times are shown in America\/New_York \(UTC−0[45]:00 in the middle of the range\), the clock of Boardwalk box\.$/,
    ); // EDT or EST, as today falls
    expect([...(screen.getByLabelText('Show times in') as HTMLSelectElement).options].map((o) => o.value)).toEqual([
      'America/New_York',
      'Europe/Berlin',
      'UTC',
    ]);
    fireEvent.change(screen.getByLabelText('Show times in'), { target: { value: 'UTC' } });
    await waitFor(() => expect(new URLSearchParams(router.state.location.search).get('zone')).toBe('UTC'));
    expect(screen.getByTestId('together-zone').textContent).toMatch(
      /^Times are shown in UTC \(UTC\+00:00 in the middle of the range\), Coordinated Universal Time\.$/,
    );
    expect(screen.queryByRole('button', { name: /CSV/ })).toBeNull(); // the role may not export
  });

  it('names every bad part of the link and what it kept: not numbers, unknown and other-lab ids, a retired channel, a fourth unit, a foreign zone', async () => {
    api({
      [`GET ${BASE}/99`]: () => apiError(404, 'not_found', 'No such channel in this lab.'),
      [`GET ${BASE}/16`]: () => ({
        status: 200,
        body: { channel: { ...fenChannel(16, 'Old probe', '°C', WEIR, { retiredAt: '2026-02-01T09:00:00.000Z' }), firstReading: null, readingCount: 0 } },
      }),
      [`GET ${BASE}/16/series`]: () => ({
        status: 200,
        body: { historyStartsAt: null, series: { shape: 'readings', source: 'raw', from: FROM, to: TO, t: [], value: [] } },
      }),
    });
    renderWithProviders(<ChannelsTogether slug="fen" canExport />, at(`channels=11,abc,99,16,12,14,15&from=${FROM}&to=${TO}&zone=Mars/Olympus`));
    const alert = await screen.findByRole('alert');
    await waitFor(() => expect(screen.getByTestId('together-kept')).toBeTruthy());
    const items = [...alert.querySelectorAll('li')].map((li) => li.textContent);
    expect(items).toHaveLength(5);
    expect(items).toContain('channels: “abc” is not a channel number; left out.');
    expect(items).toContain('channels: this lab has no channel 99; left out.');
    expect(items).toContain('channels: Weir mast · Old probe [16] was retired on 2026-02-01: its stored readings are still drawn, no new ones arrive.');
    expect(items).toContain(
      'channels: one chart has at most 3 value axes (one per unit: °C, %, cm); not drawn: Weir mast · Outflow (L/s) [15]. Open it on a chart of its own.',
    );
    expect(items).toContain('zone: “Mars/Olympus” is neither a zone of these channels’ loggers nor UTC; showing Europe/Berlin.');
    expect(screen.getByTestId('together-kept').textContent).toBe(
      'Drawn: Weir mast · Air temperature (°C); Weir mast · Old probe (°C); Weir mast · Relative humidity (%); Boardwalk box · Water level (cm).',
    );
    await screen.findByText(/^From /);
    expect((await drawnWith(4)).yAxis.map((a) => a.name)).toEqual(['°C', '%', 'cm']);
  });

  it('never shows a blank page: nothing drawable, or nothing chosen', async () => {
    api({ [`GET ${BASE}/98`]: () => apiError(404, 'not_found', 'No such channel in this lab.') });
    renderWithProviders(<ChannelsTogether slug="fen" canExport />, at('channels=98,x'));
    await screen.findByText(/No channel of this link can be drawn/);
    expect(screen.getByTestId('together-kept').textContent).toBe('Nothing could be drawn from this link.');
    cleanup();
    renderWithProviders(<ChannelsTogether slug="fen" canExport />, at(''));
    expect(screen.getByText(/No channels chosen yet/)).toBeTruthy();
  });
});
