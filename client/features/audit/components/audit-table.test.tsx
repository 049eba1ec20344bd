import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, screen } from '@testing-library/react';
import type { AuditEntry } from '@shared/contract/audit.ts';
import { renderWithProviders } from '../../../components/test-harness.tsx';
import { AuditTable } from './audit-table.tsx';

afterEach(cleanup);

// An entry shaped as the server presents it (server/http/presenters/labs.presenter.ts): the
// sentence from server/contract/words/audit.ts, the summary and details as recorded.
const PAID: AuditEntry = {
  id: 7,
  at: '2026-11-24T13:00:00.000Z',
  actor: null,
  action: 'billing.plan-changed',
  sentence: 'Plan changed from Seedling to Transect after payment.',
  summary: 'Plan changed from Seedling to Transect (Stripe invoice.paid)',
  details: { from: 'seedling', to: 'transect', event: 'evt_1' },
};

describe('AuditTable', () => {
  it("shows our sentence, and the payment service's event only in the recorded event on demand", () => {
    renderWithProviders(<AuditTable entries={[PAID]} />);
    expect(screen.getAllByText('Plan changed from Seedling to Transect after payment.').length).toBeGreaterThan(0);
    const disclosure = screen.getAllByText('Show the recorded event')[0].closest('details')!;
    expect(disclosure.open).toBe(false);
    fireEvent.click(screen.getAllByText('Show the recorded event')[0]);
    expect(disclosure.open).toBe(true);
    // inside the disclosure: the raw action, the summary as recorded and the details as JSON
    expect(disclosure.textContent).toContain('billing.plan-changed');
    expect(disclosure.textContent).toContain('(Stripe invoice.paid)');
    expect(disclosure.textContent).toContain('"event": "evt_1"');
    // outside it, no raw event name
    const outside = document.body.cloneNode(true) as HTMLElement;
    outside.querySelectorAll('details').forEach((d) => d.remove());
    expect(outside.textContent).not.toMatch(/invoice\.paid|Stripe/);
  });

  it('leaves out the details part when nothing was recorded beyond the summary', () => {
    renderWithProviders(<AuditTable entries={[{ ...PAID, id: 8, details: null }]} />);
    const disclosure = screen.getAllByText('Show the recorded event')[0].closest('details')!;
    expect(disclosure.textContent).not.toContain('Details');
  });
});
