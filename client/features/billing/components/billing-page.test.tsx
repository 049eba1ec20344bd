import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import type { BillingOverview, BillingPlan } from '@shared/contract/billing.ts';
import { BillingPage } from './billing-page.tsx';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// Plans and numbers invented for the test; the JSON shape is the API contract (server/contract/billing.ts).
const BASE = '/api/v1/labs/fernhollow/billing';
const FREE: BillingPlan = {
  key: 'seedling',
  name: 'Seedling',
  summary: '',
  monthlyAmount: 0,
  paid: false,
  limits: { readings: 1000, loggers: 3, members: 5, historyDays: 90, quarantinedRows: 200 },
};
const PAID: BillingPlan = {
  key: 'transect',
  name: 'Transect',
  summary: 'More room.',
  monthlyAmount: 4900,
  paid: true,
  limits: { readings: 50000, loggers: 30, members: 25, historyDays: 1095, quarantinedRows: 2000 },
};
const overview = (over: Partial<BillingOverview> = {}): BillingOverview => ({
  plan: FREE,
  subscribedPlanKey: 'seedling',
  status: 'none',
  graceUntil: null,
  usage: { readings: 850, loggers: 1, members: 2, quarantinedRows: 150 },
  limits: FREE.limits,
  ingestionRefused: false,
  historyStartsAt: '2026-09-03T00:00:00.000Z',
  trend: [
    { day: '2026-11-30', readings: 700, loggers: 1, members: 2 },
    { day: '2026-12-01', readings: 850, loggers: 1, members: 2 },
  ],
  currency: 'eur',
  plans: [FREE, PAID],
  ...over,
});

describe('billing page', () => {
  it('shows the plan, usage bars against the limits, the trend and the catalog with prices', async () => {
    fakeApi({ [`GET ${BASE}`]: () => ({ status: 200, body: overview() }), [`GET ${BASE}/invoices`]: () => ({ status: 200, body: { invoices: [] } }) });
    renderWithProviders(<BillingPage slug="fernhollow" returned={null} />);
    expect(await screen.findByTestId('current-plan')).toHaveProperty('textContent', 'Seedling');
    const meter = screen.getByRole('meter', { name: 'Stored readings' });
    expect(meter.getAttribute('aria-valuenow')).toBe('850');
    expect(meter.getAttribute('aria-valuemax')).toBe('1000');
    expect(screen.getByText('850 of 1,000 (85%)')).toBeTruthy();
    const quarantine = screen.getByRole('meter', { name: 'Rows in quarantine' });
    expect([quarantine.getAttribute('aria-valuenow'), quarantine.getAttribute('aria-valuemax')]).toEqual(['150', '200']);
    expect(screen.getByText('150 of 200 (75%)')).toBeTruthy();
    expect(screen.getByRole('img', { name: 'Stored readings over 2 day(s), latest 850' })).toBeTruthy();
    expect(screen.getByText('€49.00 / month')).toBeTruthy();
    expect(await screen.findByText('No invoices yet.')).toBeTruthy();
  });

  it('starts checkout for a paid plan and leaves for the URL the server answered', async () => {
    const assign = vi.fn();
    vi.stubGlobal('location', { ...window.location, assign });
    const api = fakeApi({
      [`GET ${BASE}`]: () => ({ status: 200, body: overview() }),
      [`GET ${BASE}/invoices`]: () => ({ status: 200, body: { invoices: [] } }),
      [`POST ${BASE}/checkout-session`]: () => ({ status: 201, body: { url: 'http://127.0.0.1:5412/checkout/cs_test_1' } }),
    });
    renderWithProviders(<BillingPage slug="fernhollow" returned={null} />);
    fireEvent.click(await screen.findByRole('button', { name: 'Choose Transect' }));
    await waitFor(() => expect(assign).toHaveBeenCalledWith('http://127.0.0.1:5412/checkout/cs_test_1'));
    expect(api.requests.find((r) => r.method === 'POST')?.body).toEqual({ plan: 'transect' });
  });

  it('after checkout, says it waits for confirmation and polls until the webhook changed the plan', async () => {
    let calls = 0;
    fakeApi({
      [`GET ${BASE}`]: () => ({
        status: 200,
        body: ++calls < 2 ? overview() : overview({ plan: PAID, subscribedPlanKey: 'transect', status: 'active', limits: PAID.limits }),
      }),
      [`GET ${BASE}/invoices`]: () => ({ status: 200, body: { invoices: [] } }),
    });
    renderWithProviders(<BillingPage slug="fernhollow" returned="complete" />);
    // the payment service is named by its job, not by its product
    expect((await screen.findByText(/waiting for confirmation/)).textContent).toBe(
      'Payment received — waiting for confirmation from the payment service. This page updates by itself.',
    );
    expect(await screen.findByText('Payment confirmed: the lab is now on the Transect plan.', undefined, { timeout: 8000 })).toBeTruthy();
    expect(screen.getByTestId('current-plan').textContent).toBe('Transect');
  });

  it('switches an active subscription to another paid plan, asks first when the lab is over the new limits, and polls until confirmed', async () => {
    const BIG: BillingPlan = {
      key: 'watershed',
      name: 'Watershed',
      summary: '',
      monthlyAmount: 18900,
      paid: true,
      limits: { readings: 900000, loggers: 300, members: 150, historyDays: 7300, quarantinedRows: 20000 },
    };
    const onBig = overview({
      plan: BIG,
      subscribedPlanKey: 'watershed',
      status: 'active',
      limits: BIG.limits,
      usage: { readings: 60000, loggers: 4, members: 3, quarantinedRows: 0 },
      plans: [FREE, PAID, BIG],
    });
    let switched = false;
    const api = fakeApi({
      [`GET ${BASE}`]: () => ({ status: 200, body: switched ? { ...onBig, plan: PAID, subscribedPlanKey: 'transect', limits: PAID.limits } : onBig }),
      [`GET ${BASE}/invoices`]: () => ({ status: 200, body: { invoices: [] } }),
      [`POST ${BASE}/plan-change`]: (req) => {
        if (!(req.body as { acknowledgeLimits?: boolean }).acknowledgeLimits) {
          return apiError(409, 'plan_too_small', 'The Transect plan allows 50,000 stored readings and the lab has 60,000. Confirm to switch anyway.');
        }
        switched = true;
        return {
          status: 202,
          body: { plan: 'transect', message: 'The switch to the Transect plan is sent; the plan changes as soon as the payment service confirms it.' },
        };
      },
    });
    renderWithProviders(<BillingPage slug="fernhollow" returned={null} />);
    // a subscribed lab switches instead of checking out again; the free plan is reached by cancelling
    expect(screen.queryByRole('button', { name: 'Choose Transect' })).toBeNull();
    fireEvent.click(await screen.findByRole('button', { name: 'Switch to Transect' }));
    expect(await screen.findByText(/allows 50,000 stored readings and the lab has 60,000/)).toBeTruthy();
    expect(screen.getByTestId('current-plan').textContent).toBe('Watershed');
    fireEvent.click(screen.getByRole('button', { name: 'Switch to Transect anyway' }));
    expect(await screen.findByText('Switch confirmed: the lab is now on the Transect plan.', undefined, { timeout: 8000 })).toBeTruthy();
    expect(screen.getByTestId('current-plan').textContent).toBe('Transect');
    expect(api.requests.filter((r) => r.method === 'POST').map((r) => r.body)).toEqual([
      { plan: 'transect', acknowledgeLimits: false },
      { plan: 'transect', acknowledgeLimits: true },
    ]);
  });

  it('offers no switch while a payment is overdue', async () => {
    const BIG: BillingPlan = { key: 'watershed', name: 'Watershed', summary: '', monthlyAmount: 18900, paid: true, limits: PAID.limits };
    fakeApi({
      [`GET ${BASE}`]: () => ({
        status: 200,
        body: overview({
          plan: PAID,
          subscribedPlanKey: 'transect',
          status: 'past_due',
          graceUntil: '2026-12-20T00:00:00.000Z',
          limits: PAID.limits,
          plans: [FREE, PAID, BIG],
        }),
      }),
      [`GET ${BASE}/invoices`]: () => ({ status: 200, body: { invoices: [] } }),
    });
    renderWithProviders(<BillingPage slug="fernhollow" returned={null} />);
    expect(await screen.findByText('Settle the overdue payment under “Manage payment” to switch')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Switch to Watershed' })).toBeNull();
  });

  it('shows the grace period when a payment failed, and a clear message when the payment service is down', async () => {
    fakeApi({
      [`GET ${BASE}`]: () => ({ status: 200, body: overview({ plan: PAID, status: 'past_due', graceUntil: '2026-12-09T10:00:00.000Z', limits: PAID.limits }) }),
      [`GET ${BASE}/invoices`]: () => ({ status: 200, body: { invoices: [] } }),
      [`POST ${BASE}/portal-session`]: () => apiError(503, 'billing_unavailable', 'The payment service cannot be reached right now; your plan is unchanged.'),
    });
    renderWithProviders(<BillingPage slug="fernhollow" returned={null} />);
    expect(await screen.findByText(/A payment failed. The Transect plan keeps working until/)).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Manage payment' }));
    expect(await screen.findByText('The payment service cannot be reached right now; your plan is unchanged.')).toBeTruthy();
  });
});
