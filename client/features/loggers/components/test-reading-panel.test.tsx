import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, waitFor, within } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import type { Channel, TestReading } from '@shared/contract/loggers.ts';
import { countdownText, TestReadingPanel } from './test-reading-panel.tsx';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// Channels, people and values invented for the test.
const freezer: Channel = {
  id: 31,
  loggerId: 4,
  key: 'frz_t',
  label: 'Freezer temperature',
  unit: '°C',
  quantity: 'temperature',
  validMin: -40,
  validMax: 60,
  expectedIntervalS: null,
  seasonalPeriodHint: null,
  retiredAt: null,
};
const BASE = '/api/v1/labs/fernhollow/loggers/4';
const reading = (over: Partial<TestReading>): TestReading => ({
  id: 1,
  source: 'test',
  loggerId: 4,
  channelId: 31,
  channel: 'frz_t',
  ts: Date.UTC(2026, 0, 10, 9, 0),
  time: '2026-01-10T09:00:00.000Z',
  value: -20,
  outsideRange: false,
  sentBy: { id: 7, name: 'Ola' },
  sentAt: '2026-01-10T09:00:00.000Z',
  removableUntil: '2026-01-10T09:10:00.000Z',
  removableByYouForMs: 0,
  ...over,
});

const render = () => renderWithProviders(<TestReadingPanel slug="fernhollow" loggerId={4} channels={[freezer]} />);

describe('test reading panel', () => {
  it('asks before keeping a value outside the valid range, and sends it again confirmed', async () => {
    const api = fakeApi({
      [`GET ${BASE}/test-readings`]: () => ({ status: 200, body: { testReadings: [], timezone: 'UTC' } }),
      [`POST ${BASE}/test-reading`]: (req) =>
        (req.body as { confirmOutsideRange?: boolean }).confirmOutsideRange
          ? {
              status: 200,
              body: {
                sent: { channel: 'frz_t', ts: '2026-01-10T09:00:00.000Z', value: -99999 },
                wouldGet: { outcome: 'stored' },
                testReading: reading({ value: -99999, outsideRange: true, removableByYouForMs: 600_000 }),
                timezone: 'UTC',
              },
            }
          : apiError(
              409,
              'outside_valid_range',
              'value: -99999 °C is outside the valid range -40…60 °C; send again with confirmation to store it as a test reading',
            ),
    });
    render();
    fireEvent.change(screen.getByLabelText('Value'), { target: { value: '-99999' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send a test reading' }));
    const question = await screen.findByRole('alertdialog', { name: 'Confirm a value outside the valid range' });
    expect(question.textContent).toContain('-99999 °C is outside the valid range -40…60 °C');
    fireEvent.click(within(question).getByRole('button', { name: 'Keep it as a test reading' }));
    expect((await screen.findByTestId('would-get')).textContent).toBe('would be stored');
    expect(screen.getByTestId('test-reading-result').textContent).toContain('Outside the channel’s valid range (you confirmed it).');
    const posts = api.requests.filter((r) => r.method === 'POST').map((r) => r.body);
    expect(posts).toEqual([
      { channel: 'frz_t', value: -99999 },
      { channel: 'frz_t', value: -99999, confirmOutsideRange: true },
    ]);
  });

  it('shows the safety caution on a freezer channel and says test readings are left out of diagnostics and alerts', () => {
    fakeApi({ [`GET ${BASE}/test-readings`]: () => ({ status: 200, body: { testReadings: [], timezone: 'UTC' } }) });
    render();
    expect(screen.getByRole('complementary', { name: 'Safety note' }).textContent).toContain('Not an alarm system.');
    expect(screen.getByText(/left out of diagnostics and alerts/)).toBeTruthy();
  });

  it('lists recent test readings; only one’s own, while removable, has Remove, which calls the server', async () => {
    const api = fakeApi({
      [`GET ${BASE}/test-readings`]: () => ({
        status: 200,
        body: {
          testReadings: [reading({ id: 2, value: 3.5, removableByYouForMs: 125_000 }), reading({ id: 1, value: -20, sentBy: { id: 8, name: 'Per' } })],
          timezone: 'UTC',
        },
      }),
      [`DELETE ${BASE}/test-readings/2`]: () => ({ status: 204 }),
    });
    render();
    const table = await screen.findByRole('table', { name: 'Recent test readings' });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows.map((r) => within(r).getAllByRole('cell')[2].textContent)).toEqual(['3.5', '-20']);
    expect(within(rows[1]).queryByRole('button')).toBeNull();
    const remove = within(rows[0]).getByRole('button', { name: 'Remove test reading frz_t = 3.5' });
    expect(remove.textContent).toMatch(/^Remove \(2:0[45] left\)$/);
    fireEvent.click(remove);
    await waitFor(() => expect(api.requests.some((r) => r.method === 'DELETE' && r.path === `${BASE}/test-readings/2`)).toBe(true));
  });

  it('counts down in minutes and seconds, never below zero', () => {
    expect(countdownText(600_000)).toBe('10:00');
    expect(countdownText(61_001)).toBe('1:02');
    expect(countdownText(-5)).toBe('0:00');
  });
});
