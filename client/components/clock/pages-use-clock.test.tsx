import { afterEach, describe, expect, it } from 'vitest';
import { act, cleanup, screen, waitFor } from '@testing-library/react';
import type { AuditEntry } from '@shared/contract/audit.ts';
import type { Alert } from '@shared/contract/alerts.ts';
import type { ClockChoice, Me } from '@shared/contract/me.ts';
import { renderWithProviders } from '../test-harness.tsx';
import { meQueryOptions } from '../../features/auth/api/get-me.ts';
import { AuditTable } from '../../features/audit/components/audit-table.tsx';
import { AlertsList } from '../../features/alerts/components/alerts-list.tsx';

afterEach(cleanup);

// A fictional lab: a person in Berlin, a logger in Kolkata, one instant (2026-12-03 13:00 UTC).
// Wall clocks from the IANA tz database: Europe/Berlin UTC+1 in December, Asia/Kolkata UTC+5:30.
const AT = Date.parse('2026-12-03T13:00:00Z');
const me = (clock: ClockChoice): Me => ({
  user: { id: 3, email: 'ilse.varga@fernhollow.example', name: 'Ilse Varga', timeZone: 'Europe/Berlin', clock },
  labs: [],
});
const entry = {
  id: 1,
  at: new Date(AT).toISOString(),
  actor: { name: 'Ilse Varga', email: 'ilse.varga@fernhollow.example' },
  action: 'logger.updated',
  sentence: 'Changed the logger Greenhouse east.',
  summary: 'changed the logger Greenhouse east',
  details: null,
} as AuditEntry;
const alert: Alert = {
  id: 9,
  ruleId: 2,
  ruleName: 'Bench too warm',
  kind: 'bounds',
  stage: 'crossed',
  projection: null,
  channelId: 5,
  loggerId: 4,
  open: true,
  openedAt: AT,
  openedValue: 31,
  openedDetail: '31 °C is above the high limit 30 °C',
  resolvedAt: null,
  resolvedValue: null,
  resolvedDetail: null,
  remindersSent: 0,
  acknowledged: null,
};

function renderBoth() {
  const view = renderWithProviders(
    <>
      <AuditTable entries={[entry]} />
      <AlertsList slug="fernhollow" alerts={[alert]} channelHref={() => null} canAcknowledge={false} label="Open alerts" zoneOf={() => 'Asia/Kolkata'} />
    </>,
  );
  const choose = (clock: ClockChoice) => act(() => view.queryClient.setQueryData(meQueryOptions().queryKey, me(clock)));
  const shown = () => screen.getAllByText(/^2026-12-03 \d\d:\d\d/).map((t) => t.textContent);
  return { choose, shown };
}

describe('pages show times through the one clock', () => {
  it('the logger clock: the audit log on the person’s zone, the alert on its logger’s', async () => {
    const { choose, shown } = renderBoth();
    choose('logger');
    await waitFor(() => expect(shown()).toEqual(['2026-12-03 14:00 UTC+01:00', '2026-12-03 18:30 UTC+05:30']));
    // the exact instant stays machine-readable, the zone's name in the title
    const audit = screen.getByText('2026-12-03 14:00 UTC+01:00');
    expect(audit.tagName).toBe('TIME');
    expect(audit.getAttribute('dateTime')).toBe('2026-12-03T13:00:00.000Z');
    expect(audit.getAttribute('title')).toBe('Europe/Berlin, UTC+01:00');
  });

  it('switching to UTC changes both; "my clock" puts both on the person’s zone', async () => {
    const { choose, shown } = renderBoth();
    choose('utc');
    await waitFor(() => expect(shown()).toEqual(['2026-12-03 13:00 UTC', '2026-12-03 13:00 UTC']));
    choose('mine');
    await waitFor(() => expect(shown()).toEqual(['2026-12-03 14:00 UTC+01:00', '2026-12-03 14:00 UTC+01:00']));
  });
});
