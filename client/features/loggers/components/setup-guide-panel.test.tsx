import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { readingsFromJson } from '../../../../server/services/ingest/readings-from-body.ts';
import { testReadingSchema, type Channel, type LoggerDetail } from '@shared/contract/loggers.ts';
import { LoggerPage } from './logger-page.tsx';
import { SetupGuidePanel } from './setup-guide-panel.tsx';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// Logger, channels and values invented for the test.
const channel = (id: number, key: string, label: string, validMin: number | null, validMax: number | null, retiredAt: string | null = null): Channel => ({
  id,
  loggerId: 9,
  key,
  label,
  unit: null,
  quantity: null,
  validMin,
  validMax,
  expectedIntervalS: null,
  seasonalPeriodHint: null,
  retiredAt,
});
const CHANNELS = [channel(21, 'bath_t', 'Water bath', 10, 40), channel(22, 'lid.open', 'Lid switch', 0, 1)];
const TEST_URL = '/api/v1/labs/fernhollow/loggers/9/test-reading';
const TEST_LIST_URL = '/api/v1/labs/fernhollow/loggers/9/test-readings';

function renderPanel(canSendTest = true) {
  return renderWithProviders(
    <SetupGuidePanel slug="fernhollow" loggerId={9} timezone="Europe/Berlin" channels={CHANNELS} origin="http://127.0.0.1:5310" canSendTest={canSendTest} />,
  );
}

describe('logger set-up guide', () => {
  it('shows the endpoint and this logger’s channel keys, and every example uses those keys and the key placeholder', () => {
    fakeApi({});
    renderPanel();
    expect(screen.getByTestId('ingest-endpoint').textContent).toBe('POST http://127.0.0.1:5310/api/v1/ingest');
    expect(screen.getByTestId('setup-channel-keys').textContent).toContain('bath_t');
    for (const id of ['setup-curl', 'setup-python', 'setup-http', 'setup-microcontroller']) {
      const text = screen.getByTestId(id).textContent!;
      expect(text, id).toContain('bath_t');
      expect(text, id).toContain('lid.open');
      expect(text, id).not.toMatch(/lbk_[0-9a-f]{12}_/);
    }
    expect(screen.getByTestId('setup-curl').textContent).toContain('Bearer $LAGBOOK_INGEST_KEY');
    // the C example is named for what it is, in the guide's own words
    expect(screen.getByText('C program for a microcontroller logger (any TCP client)')).toBeTruthy();
    expect(document.body.textContent).not.toMatch(/sketch/i);
    // The curl body is one the server's ingest parser reads, with the sample values inside the valid ranges.
    const body = /-d '([^']*)'/.exec(screen.getByTestId('setup-curl').textContent!)![1];
    expect(readingsFromJson(JSON.parse(body)).map((r) => [r.channel, r.value])).toEqual([
      ['bath_t', 25],
      ['lid.open', 0.5],
    ]);
  });

  it('sends a test reading with the server’s body schema and shows what a logger’s reading would get and when it was kept', async () => {
    const api = fakeApi({
      [`GET ${TEST_LIST_URL}`]: () => ({ status: 200, body: { testReadings: [], timezone: 'Europe/Berlin' } }),
      [`POST ${TEST_URL}`]: (req) => {
        const body = req.body as { channel: string; value: number };
        return {
          status: 200,
          body: {
            sent: { ...body, ts: '2026-09-01T06:30:00.000Z' },
            wouldGet: { outcome: 'stored' },
            testReading: {
              id: 5,
              source: 'test',
              loggerId: 9,
              channelId: 21,
              channel: body.channel,
              ts: Date.UTC(2026, 8, 1, 6, 30),
              time: '2026-09-01T06:30:00.000Z',
              value: body.value,
              outsideRange: false,
              sentBy: { id: 1, name: 'Tove' },
              sentAt: '2026-09-01T06:30:00.000Z',
              removableUntil: '2026-09-01T06:40:00.000Z',
              removableByYouForMs: 600_000,
            },
            timezone: 'Europe/Berlin',
          },
        };
      },
    });
    renderPanel();
    fireEvent.change(screen.getByLabelText('Value'), { target: { value: '31.5' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send a test reading' }));
    expect((await screen.findByTestId('would-get')).textContent).toBe('would be stored');
    const result = screen.getByTestId('test-reading-result').textContent!;
    expect(result).toContain('bath_t = 31.5');
    // 06:30 UTC is 08:30 in Berlin in September (CEST, UTC+2; IANA tz database)
    expect(screen.getByTestId('kept-at').textContent).toBe('at 2026-09-01 08:30:00 UTC+02:00');
    expect(screen.getByRole('button', { name: 'Remove test reading bath_t = 31.5' }).textContent).toBe('Remove (10:00 left)');
    const sent = api.requests.find((r) => r.path === TEST_URL)!.body;
    expect(sent).toEqual({ channel: 'bath_t', value: 31.5 });
    expect(testReadingSchema.safeParse(sent).success).toBe(true);
  });

  it('shows the quarantine reason a logger’s reading would get, and a server refusal as an alert', async () => {
    fakeApi({
      [`GET ${TEST_LIST_URL}`]: () => ({ status: 200, body: { testReadings: [], timezone: 'Europe/Berlin' } }),
      [`POST ${TEST_URL}`]: () => ({
        status: 200,
        body: {
          sent: { channel: 'lid.open', ts: '2026-09-01T06:30:00.000Z', value: 0.5 },
          wouldGet: { outcome: 'quarantined', code: 'retired_channel', reason: 'channel: "lid.open" is retired' },
          testReading: null,
          timezone: 'Europe/Berlin',
        },
      }),
    });
    renderPanel();
    fireEvent.change(screen.getByLabelText('Channel'), { target: { value: 'lid.open' } });
    expect((screen.getByLabelText('Value') as HTMLInputElement).value).toBe('0.5');
    fireEvent.click(screen.getByRole('button', { name: 'Send a test reading' }));
    // the server's reason, without the reason code (retired_channel) it comes with
    await waitFor(() =>
      expect(screen.getByRole('alert').textContent).toBe(
        'A logger’s reading of “lid.open” would go to quarantine: channel: "lid.open" is retired. Nothing was kept.',
      ),
    );

    cleanup();
    fakeApi({
      [`GET ${TEST_LIST_URL}`]: () => ({ status: 200, body: { testReadings: [], timezone: 'Europe/Berlin' } }),
      [`POST ${TEST_URL}`]: () => apiError(409, 'logger_retired', 'This logger is retired: it accepts no new readings.'),
    });
    renderPanel();
    fireEvent.click(screen.getByRole('button', { name: 'Send a test reading' }));
    expect((await screen.findByRole('alert')).textContent).toBe('This logger is retired: it accepts no new readings.');
  });

  it('refuses a value that is not a number without calling the server', async () => {
    const api = fakeApi({});
    renderPanel();
    fireEvent.change(screen.getByLabelText('Value'), { target: { value: 'warm' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send a test reading' }));
    expect(await screen.findByText('Enter the value as a number, e.g. 21.5')).toBeTruthy();
    // only the list of recent test readings was asked for: nothing was sent
    expect(api.requests.filter((r) => r.method !== 'GET')).toHaveLength(0);
  });

  it('on the logger page: shown with active channels only; the test reading only for those who manage loggers', () => {
    fakeApi({});
    const logger: LoggerDetail = {
      id: 9,
      name: 'Bath logger',
      serial: null,
      site: null,
      timezone: 'UTC',
      expectedIntervalS: 60,
      createdAt: '2026-01-01T00:00:00Z',
      retiredAt: null,
      lastSeenAt: null,
      channels: [...CHANNELS, channel(23, 'old_probe', 'Old probe', null, null, '2026-05-01T00:00:00Z')],
    };
    renderWithProviders(<LoggerPage slug="fernhollow" logger={logger} rights={{ manage: false, keys: false, upload: false, quarantine: false }} />);
    expect(screen.getByRole('heading', { name: 'Set up this logger' })).toBeTruthy();
    expect(screen.getByTestId('setup-curl').textContent).not.toContain('old_probe');
    expect(screen.queryByRole('button', { name: 'Send a test reading' })).toBeNull();
    cleanup();
    renderWithProviders(<LoggerPage slug="fernhollow" logger={logger} rights={{ manage: true, keys: false, upload: false, quarantine: false }} />);
    expect(screen.getByRole('button', { name: 'Send a test reading' })).toBeTruthy();
  });
});
