import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, screen } from '@testing-library/react';
import { fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { AlertRuleForm, type RuleTarget } from './alert-rule-form.tsx';

afterEach(cleanup);

// Channels invented for the test (a fictional cold room).
const TARGETS: RuleTarget[] = [{ id: 12, label: 'Room temperature', unit: '°C', loggerId: 4, loggerName: 'Cold room' }];

describe('the new alert rule form with no channel chosen', () => {
  it('asks for the channel to watch in words, names no field key and sends nothing', async () => {
    const api = fakeApi({});
    renderWithProviders(<AlertRuleForm slug="marrowgate" targets={TARGETS} />);
    fireEvent.change(screen.getByLabelText('Name'), { target: { value: 'Cold room too warm' } });
    fireEvent.change(screen.getByLabelText(/^High limit/), { target: { value: '6' } });
    fireEvent.click(screen.getByRole('button', { name: 'Make rule' }));
    const watch = screen.getByLabelText('Watch');
    expect(await screen.findByText('Choose the channel to watch')).toBeTruthy();
    expect(watch.getAttribute('aria-invalid')).toBe('true');
    const form = screen.getByRole('form', { name: 'New alert rule' });
    expect(form.textContent).not.toMatch(/must be a number|channelId|loggerId/);
    expect(api.requests).toEqual([]);
  });

  it('puts the server’s refusals on their fields by key, and one the form has no field for on the form with its label', async () => {
    const fields = [
      { field: 'params.holdS', label: 'Outside the limits for at least (seconds)', reason: 'must be at most 604,800' },
      { field: 'enabled', label: 'Rule on', reason: 'must be yes or no (true or false)' },
    ];
    fakeApi({
      'POST /api/v1/labs/marrowgate/alert-rules': () => ({
        status: 400,
        body: {
          error: {
            code: 'invalid_input',
            message: 'Outside the limits for at least (seconds): must be at most 604,800. Rule on: must be yes or no (true or false).',
            fields,
          },
        },
      }),
    });
    renderWithProviders(<AlertRuleForm slug="marrowgate" targets={TARGETS} initialChannelId={12} />);
    fireEvent.change(screen.getByLabelText('Name'), { target: { value: 'Cold room too warm' } });
    fireEvent.change(screen.getByLabelText(/^High limit/), { target: { value: '6' } });
    fireEvent.click(screen.getByRole('button', { name: 'Make rule' }));
    expect(await screen.findByText('must be at most 604,800')).toBeTruthy();
    expect(screen.getByText('Rule on: must be yes or no (true or false).')).toBeTruthy();
    expect(screen.getByRole('form', { name: 'New alert rule' }).textContent).not.toMatch(/holdS|enabled/);
  });
});
