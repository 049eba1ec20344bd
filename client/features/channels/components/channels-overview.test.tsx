import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, within } from '@testing-library/react';
import { renderWithProviders } from '../../../components/test-harness.tsx';
import type { ChannelOverviewRow, ChannelStatus } from '@shared/contract/channels.ts';
import { ChannelsOverview } from './channels-overview.tsx';
import { MAX_TOGETHER } from './together-url.ts';

afterEach(() => cleanup());

// Channels of an invented field station (demo data), in the overview's documented shape.
const NOW = Date.parse('2026-06-10T12:00:00Z');
function row(id: number, label: string, status: ChannelStatus, logger: { id: number; name: string }, value: number | null = 1): ChannelOverviewRow {
  return {
    id,
    loggerId: logger.id,
    key: `ch_${id}`,
    label,
    unit: '°C',
    quantity: null,
    validMin: null,
    validMax: null,
    expectedIntervalS: null,
    seasonalPeriodHint: null,
    retiredAt: null,
    logger: { ...logger, site: 'Hazel copse', timezone: 'Europe/Berlin', expectedIntervalS: 60 },
    status,
    statusIntervalS: 60,
    lastReading: value === null ? null : { ts: NOW - 120_000, time: new Date(NOW - 120_000).toISOString(), value },
    dataVersion: 1,
    sparkline: { startHour: NOW - 23 * 3600_000, stepS: 3600, means: Array.from({ length: 24 }, (_, i) => (i === 5 ? null : i)) },
  };
}
const MAST = { id: 1, name: 'Copse mast' };
const POND = { id: 2, name: 'Pond buoy' };
const ROWS = [
  row(10, 'Air temperature', 'live', MAST, 21.5),
  row(11, 'Leaf wetness', 'silent', MAST),
  row(12, 'Water temperature', 'out-of-range', POND, 41),
  row(13, 'Pond level', 'no-data', POND, null),
];

const bodyLabels = () =>
  within(screen.getByRole('table', { name: 'Channels of the lab' }))
    .getAllByRole('row')
    .slice(1)
    .map((r) => within(r).getAllByRole('cell')[0].querySelector('a')?.textContent);

describe('ChannelsOverview', () => {
  it('lists every channel with link, status mark, last value and sparkline, by logger', () => {
    renderWithProviders(<ChannelsOverview slug="hazel" rows={ROWS} now={NOW} />);
    expect(bodyLabels()).toEqual(['Air temperature', 'Leaf wetness', 'Pond level', 'Water temperature']);
    expect(screen.getByRole('link', { name: 'Water temperature' }).getAttribute('href')).toBe('/labs/hazel/channels/12');
    expect(screen.getByText('41')).toBeTruthy();
    // 14:00 CEST = 12:00 UTC − 2 min (Europe/Berlin is UTC+2 in June, IANA tzdata)
    expect(screen.getAllByText('2026-06-10 13:58 UTC+02:00')).toHaveLength(3);
    expect(screen.getAllByRole('img', { name: /Hourly means over the last 24 hours from 0 to 23 °C; 1 hours without readings/ })).toHaveLength(4);
    expect(screen.getByText('no reading for more than 3 × the expected interval')).toBeTruthy();
  });

  it('filters by text, status and logger through the URL', async () => {
    const { router } = renderWithProviders(<ChannelsOverview slug="hazel" rows={ROWS} now={NOW} />, '/c');
    fireEvent.change(screen.getByLabelText('Find'), { target: { value: 'temp' } });
    await vi.waitFor(() => expect(bodyLabels()).toEqual(['Air temperature', 'Water temperature']));
    expect(router.state.location.search).toBe('?q=temp');
    fireEvent.change(screen.getByLabelText('Logger'), { target: { value: '2' } });
    await vi.waitFor(() => expect(bodyLabels()).toEqual(['Water temperature']));
    expect(screen.getByText('1 of 4 channels match')).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Status'), { target: { value: 'live' } });
    await vi.waitFor(() => expect(screen.getByText('No channel matches.')).toBeTruthy());
    expect(router.state.location.search).toBe('?q=temp&logger=2&status=live');
  });

  it('sorts by status with the channels that need a look first, and pages 25 at a time', async () => {
    const many = [...ROWS, ...Array.from({ length: 26 }, (_, i) => row(100 + i, `Probe ${String(i).padStart(2, '0')}`, 'live', MAST))];
    renderWithProviders(<ChannelsOverview slug="hazel" rows={many} now={NOW} />);
    fireEvent.click(screen.getByRole('button', { name: /Status/ }));
    await vi.waitFor(() => expect(bodyLabels().slice(0, 3)).toEqual(['Water temperature', 'Leaf wetness', 'Pond level']));
    expect(bodyLabels()).toHaveLength(25);
    expect(screen.getByText(/Channels 1–25 of 30 · page 1 of 2/)).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Next →' }));
    await vi.waitFor(() => expect(bodyLabels()).toHaveLength(5));
  });
});

const tick = (name: string) => fireEvent.click(screen.getByRole('checkbox', { name: `Choose ${name}` }));
// Seven channels of two loggers, all live, for choosing (invented, like the rows above).
const UPPER = { id: 3, name: 'Upper terrace' };
const LOWER = { id: 4, name: 'Lower terrace' };
const CHOICES = [
  row(21, 'Leaf temperature', 'live', UPPER),
  row(22, 'Soil temperature', 'live', UPPER),
  row(23, 'Air temperature', 'live', UPPER),
  row(24, 'Leaf temperature', 'live', LOWER),
  row(25, 'Soil temperature', 'live', LOWER),
  row(26, 'Air temperature', 'live', LOWER),
  row(27, 'Berry temperature', 'live', LOWER),
];

describe('choosing channels to open together', () => {
  it('counts the chosen channels across loggers and filters, and links to them in the order chosen', () => {
    const { router } = renderWithProviders(<ChannelsOverview slug="vines" rows={CHOICES} now={NOW} />, '/c');
    expect(screen.getByTestId('chosen-count').textContent).toBe(`0 of ${MAX_TOGETHER} chosen`);
    expect(screen.queryByRole('link', { name: 'Open together' })).toBeNull();
    tick('Lower terrace · Soil temperature');
    fireEvent.change(screen.getByLabelText('Logger'), { target: { value: '3' } });
    tick('Upper terrace · Air temperature');
    tick('Upper terrace · Leaf temperature');
    expect(screen.getByTestId('chosen-count').textContent).toBe('3 of 6 chosen');
    expect(screen.getByRole('link', { name: 'Open together' }).getAttribute('href')).toBe('/labs/vines/channels/together?channels=25,23,21');
    tick('Upper terrace · Air temperature'); // untick
    expect(screen.getByRole('link', { name: 'Open together' }).getAttribute('href')).toBe('/labs/vines/channels/together?channels=25,21');
    expect(screen.getByText('Chosen: Lower terrace · Soil temperature; Upper terrace · Leaf temperature')).toBeTruthy();
    expect(router.state.location.search).toBe('?pick=25%2C21&logger=3');
  });

  it('keeps the choice in the page’s address, so coming back from the chart finds it again', () => {
    renderWithProviders(<ChannelsOverview slug="vines" rows={CHOICES} now={NOW} />, '/c?pick=22,999,22,26');
    expect(screen.getByTestId('chosen-count').textContent).toBe('2 of 6 chosen');
    expect((screen.getByRole('checkbox', { name: 'Choose Lower terrace · Air temperature' }) as HTMLInputElement).checked).toBe(true);
  });

  it('refuses a seventh channel with a plain message and keeps the six', () => {
    renderWithProviders(<ChannelsOverview slug="vines" rows={CHOICES} now={NOW} />, '/c');
    for (const r of CHOICES.slice(0, 6)) tick(`${r.logger.name} · ${r.label}`);
    expect(screen.getByTestId('chosen-count').textContent).toBe('6 of 6 chosen');
    tick('Lower terrace · Berry temperature');
    expect(screen.getByRole('alert').textContent).toBe(
      'One chart takes at most 6 channels: Lower terrace · Berry temperature was not added. Untick one of the 6 to choose it instead.',
    );
    expect((screen.getByRole('checkbox', { name: 'Choose Lower terrace · Berry temperature' }) as HTMLInputElement).checked).toBe(false);
    expect(screen.getByRole('link', { name: 'Open together' }).getAttribute('href')).toBe('/labs/vines/channels/together?channels=21,22,23,24,25,26');
    fireEvent.click(screen.getByRole('button', { name: 'Clear the choice' }));
    expect(screen.getByTestId('chosen-count').textContent).toBe('0 of 6 chosen');
    expect(screen.queryByRole('alert')).toBeNull();
  });
});
