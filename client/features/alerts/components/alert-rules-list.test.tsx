import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import type { AlertRule } from '@shared/contract/alerts.ts';
import { AlertRulesList } from './alert-rules-list.tsx';

afterEach(cleanup);

// A rule invented for the test; the JSON shape is the API contract (server/contract/alerts.ts).
const RULE: AlertRule = {
  id: 31,
  name: 'Cold room too warm',
  kind: 'bounds',
  channelId: 12,
  loggerId: null,
  params: { low: null, high: 6, holdS: 300 },
  reminderAfterMin: null,
  enabled: true,
  createdAt: '2026-12-01T08:00:00.000Z',
  updatedAt: '2026-12-01T08:00:00.000Z',
  watched: { channelId: 12, loggerId: 4, label: 'Room temperature', loggerName: 'Cold room', unit: '°C' },
  subscribed: true,
  openAlertId: null,
  health: { lastJudgedAt: null, notWatching: null },
};
const PATH = '/api/v1/labs/marrowgate/alert-rules/31';

describe('changing an alert rule', () => {
  it('opens the rule’s fields filled in, sends only what may change, and closes when saved', async () => {
    const api = fakeApi({ [`PATCH ${PATH}`]: () => ({ status: 200, body: { rule: { ...RULE, params: { low: null, high: 5, holdS: 120 } } } }) });
    renderWithProviders(<AlertRulesList slug="marrowgate" rules={[RULE]} canManage canSubscribe />);
    fireEvent.click(screen.getByRole('button', { name: 'Change' }));
    const form = screen.getByRole('form', { name: 'Change the rule Cold room too warm' });
    expect(form.textContent).toContain('watches Cold room · Room temperature');
    expect((screen.getByLabelText('High limit (°C)') as HTMLInputElement).value).toBe('6');
    fireEvent.change(screen.getByLabelText('High limit (°C)'), { target: { value: '5' } });
    fireEvent.change(screen.getByLabelText(/^Hold time/), { target: { value: '120' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save changes' }));
    await waitFor(() => expect(screen.queryByRole('form', { name: 'Change the rule Cold room too warm' })).toBeNull());
    expect(api.requests.find((r) => r.method === 'PATCH')?.body).toEqual({
      name: 'Cold room too warm',
      reminderAfterMin: null,
      params: { low: null, high: 5, holdS: 120, earlyWarning: null },
    });
  });

  it('refuses a change the server schema would refuse without sending it, and shows the server’s own refusals on their field', async () => {
    const api = fakeApi({ [`PATCH ${PATH}`]: () => apiError(400, 'invalid_input', 'params.holdS: must be at most 86400 (seconds)') });
    renderWithProviders(<AlertRulesList slug="marrowgate" rules={[RULE]} canManage canSubscribe />);
    fireEvent.click(screen.getByRole('button', { name: 'Change' }));
    fireEvent.change(screen.getByLabelText('Low limit (°C)'), { target: { value: '9' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save changes' }));
    expect(await screen.findByText('must be below the high limit')).toBeTruthy();
    expect(api.requests.filter((r) => r.method === 'PATCH')).toHaveLength(0);

    fireEvent.change(screen.getByLabelText('Low limit (°C)'), { target: { value: '' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save changes' }));
    expect(await screen.findByText('must be at most 86400 (seconds)')).toBeTruthy();
    expect(screen.getByRole('form', { name: 'Change the rule Cold room too warm' })).toBeTruthy();
  });

  it('offers no change to people who may not manage rules', () => {
    fakeApi({});
    renderWithProviders(<AlertRulesList slug="marrowgate" rules={[RULE]} canManage={false} canSubscribe />);
    expect(screen.queryByRole('button', { name: 'Change' })).toBeNull();
  });
});
