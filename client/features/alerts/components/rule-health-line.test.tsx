import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, screen } from '@testing-library/react';
import { fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import type { AlertRule } from '@shared/contract/alerts.ts';
import { RuleHealthLine } from './rule-health-line.tsx';
import { ChannelAlertsPanel } from './channel-alerts-panel.tsx';

afterEach(cleanup);

// Rules invented for the test; the JSON shape is the API contract (server/contract/alerts.ts).
const since = Date.UTC(2026, 11, 4, 9, 15);
const WATCHING: AlertRule = {
  id: 41,
  name: 'Bench air odd',
  kind: 'unusual',
  channelId: 12,
  loggerId: null,
  params: { periodH: 24, k: 5, historyCycles: 3 },
  reminderAfterMin: null,
  enabled: true,
  createdAt: '2026-12-01T08:00:00.000Z',
  updatedAt: '2026-12-01T08:00:00.000Z',
  watched: { channelId: 12, loggerId: 4, label: 'Air temperature', loggerName: 'Bench logger', unit: '°C' },
  subscribed: true,
  openAlertId: null,
  health: { lastJudgedAt: since - 3_600_000, notWatching: null },
};
const BLIND: AlertRule = {
  ...WATCHING,
  id: 42,
  name: 'Bench air warm',
  kind: 'bounds',
  params: { low: null, high: 30, holdS: 0, earlyWarning: null },
  health: {
    lastJudgedAt: since - 7 * 60_000,
    notWatching: { reason: 'logger-silent', detail: 'No reading for more than 3 expected intervals (the channel reports every 60 seconds).', since },
  },
};

describe('RuleHealthLine', () => {
  it('a watching rule says when it last judged, on the logger’s clock', () => {
    renderWithProviders(<RuleHealthLine rule={WATCHING} loggerZone="Europe/Berlin" />);
    const note = screen.getByRole('note', { name: 'Health of Bench air odd' });
    expect(note.textContent).toBe('Watching — last judged 2026-12-04 09:15 UTC+01:00');
  });

  it('a watching rule that judged nothing yet says so', () => {
    renderWithProviders(<RuleHealthLine rule={{ ...WATCHING, health: { lastJudgedAt: null, notWatching: null } }} loggerZone="UTC" />);
    expect(screen.getByRole('note').textContent).toBe('Watching — last judged no reading judged yet');
  });

  it('a blind rule: since when, the reason in plain words, the detail and what it means', () => {
    renderWithProviders(<RuleHealthLine rule={BLIND} loggerZone="Europe/Berlin" />);
    const note = screen.getByRole('note', { name: 'Health of Bench air warm' });
    expect(note.textContent).toContain('Not watching since 2026-12-04 10:15 UTC+01:00 — the logger has gone quiet');
    expect(note.textContent).toContain('No reading for more than 3 expected intervals');
    expect(note.textContent).toContain('raises no alert');
    expect(note.querySelector('time')?.getAttribute('dateTime')).toBe(new Date(since).toISOString());
  });

  it('shows nothing for silence rules and rules turned off', () => {
    const { container } = renderWithProviders(
      <>
        <RuleHealthLine rule={{ ...BLIND, kind: 'silence' }} />
        <RuleHealthLine rule={{ ...BLIND, enabled: false }} />
      </>,
    );
    expect(container.textContent).toBe('');
  });
});

describe('ChannelAlertsPanel', () => {
  it('lists the rules on the channel of the page with their health, not those of other channels', async () => {
    fakeApi({
      'GET /api/v1/labs/marrowgate/alert-rules': () => ({
        status: 200,
        body: { rules: [WATCHING, BLIND, { ...BLIND, id: 43, name: 'Other channel', channelId: 13 }] },
      }),
    });
    renderWithProviders(
      [{ path: '/labs/:lab/channels/:channelId', element: <ChannelAlertsPanel slug="marrowgate" alerts={[]} canAcknowledge={false} loggerZone="UTC" /> }],
      '/labs/marrowgate/channels/12',
    );
    const list = await screen.findByRole('list', { name: 'Rules watching this channel' });
    expect(screen.getByRole('note', { name: 'Health of Bench air warm' }).textContent).toContain('Not watching since 2026-12-04 09:15 UTC');
    expect(list.textContent).toContain('Bench air odd');
    expect(list.textContent).not.toContain('Other channel');
  });
});
