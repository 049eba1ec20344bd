import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, screen, within } from '@testing-library/react';
import { renderWithProviders } from '../../../components/test-harness.tsx';
import type { Alert } from '@shared/contract/alerts.ts';
import { AlertsList } from './alerts-list.tsx';

afterEach(cleanup);

// Alerts invented for the test (a fictional cold room); the JSON shape is the API contract (server/contract/alerts.ts).
const CROSSED: Alert = {
  id: 1,
  ruleId: 31,
  ruleName: 'Cold room 3 warm',
  kind: 'bounds',
  stage: 'crossed',
  projection: null,
  channelId: 12,
  loggerId: 4,
  open: true,
  openedAt: Date.UTC(2026, 11, 3, 12, 40),
  openedValue: 8.1,
  openedDetail: '8.1 °C is above the high limit 8 °C',
  resolvedAt: null,
  resolvedValue: null,
  resolvedDetail: null,
  remindersSent: 0,
  acknowledged: null,
};
const EXPECTED: Alert = {
  ...CROSSED,
  id: 2,
  stage: 'expected',
  openedAt: Date.UTC(2026, 11, 3, 12, 30),
  openedValue: 7.77,
  openedDetail: 'Cold room 3 · Air is likely (p ≈ 0.62) to rise above 8 °C within 60 minutes at its present course',
  projection: {
    model: 'ARIMA(0,1,0) on the remainder after the daily cycle',
    limit: 8,
    side: 'high',
    horizonMin: 60,
    chance: 0.6213,
    medianMinutesToCross: 23,
    interval: { level: 0.8, lower: 7.1842, upper: 8.3311 },
    from: Date.UTC(2026, 11, 3, 12, 30),
    unit: '°C',
    path: [],
  },
};

describe('the alerts list', () => {
  it('tells an early warning from a crossing in words and outline, with its model, chance and interval', () => {
    renderWithProviders(
      <AlertsList slug="marrowgate" alerts={[CROSSED, EXPECTED]} channelHref={() => null} canAcknowledge={false} label="Alerts" unitOf={() => '°C'} />,
    );
    const [crossed, expected] = within(screen.getByRole('list', { name: 'Alerts' })).getAllByRole('listitem');
    expect(crossed.textContent).toContain('Open: Cold room 3 warm Crossed');
    expect(crossed.textContent).not.toContain('Model');
    expect(expected.textContent).toContain('Open: Cold room 3 warm Expected to cross');
    expect(expected.className).toContain('border-dashed');
    expect(crossed.className).not.toContain('border-dashed');
    expect(expected.textContent).toContain('ModelARIMA(0,1,0) on the remainder after the daily cycle');
    expect(expected.textContent).toContain('p ≈ 0.62 of rising above 8 °C within 1 hour (typically after about 23 minutes)');
    expect(expected.textContent).toContain('80 % interval 7.2–8.3 °C in 1 hour');
    expect(expected.textContent).toContain('not a safety system');
  });

  it('takes the unit stored with the projection when the list is given none', () => {
    const stored = { ...EXPECTED, projection: { ...EXPECTED.projection!, unit: '°C' } as Alert['projection'] };
    renderWithProviders(<AlertsList slug="marrowgate" alerts={[stored]} channelHref={() => null} canAcknowledge={false} label="Alerts" />);
    expect(screen.getByRole('list', { name: 'Alerts' }).textContent).toContain('80 % interval 7.2–8.3 °C in 1 hour');
  });
});
