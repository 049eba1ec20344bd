import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, screen } from '@testing-library/react';
import { Outlet, type RouteObject } from 'react-router-dom';
import { ROLE_PERMISSIONS, type Role } from '@shared/policies/permissions.ts';
import { fakeApi, renderWithProviders } from '../../components/test-harness.tsx';
import type { Me } from '@shared/contract/me.ts';
import LabLayout from './lab-layout.tsx';
import LabBillingRoute from './lab-billing.tsx';
import { paths } from '../paths.ts';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// People and lab invented for the test; permissions come from the server's own role table.
const me = (role: Role): Me => ({
  user: { id: 7, email: 'odalys.brennick@fernhollow.example', name: 'Odalys Brennick', timeZone: null, clock: 'logger' },
  labs: [{ slug: 'fernhollow', name: 'Fernhollow Field Station', role }],
});
const routes = (role: Role): RouteObject[] => [
  {
    element: <Outlet context={me(role)} />,
    children: [{ path: paths.lab.path, element: <LabLayout />, children: [{ path: paths.labBilling.path, element: <LabBillingRoute /> }] }],
  },
];
const labAs = (role: Role) => () => ({
  status: 200,
  body: { lab: { slug: 'fernhollow', name: 'Fernhollow Field Station', createdAt: '2026-01-02T09:00:00Z' }, role, permissions: [...ROLE_PERMISSIONS[role]] },
});
const free = {
  key: 'seedling',
  name: 'Seedling',
  summary: '',
  monthlyAmount: 0,
  paid: false,
  limits: { readings: 100, loggers: 2, members: 3, historyDays: 30, quarantinedRows: 20 },
};
const overview = {
  plan: free,
  subscribedPlanKey: 'seedling',
  status: 'none',
  graceUntil: null,
  usage: { readings: 0, loggers: 0, members: 1, quarantinedRows: 0 },
  limits: free.limits,
  ingestionRefused: false,
  historyStartsAt: '2026-11-02T00:00:00Z',
  trend: [],
  currency: 'eur',
  plans: [free],
};

describe('/labs/:lab/billing', () => {
  it('shows the billing page to an admin, with Billing then Lab settings last in the lab navigation', async () => {
    fakeApi({
      'GET /api/v1/labs/fernhollow': labAs('admin'),
      'GET /api/v1/labs/fernhollow/billing': () => ({ status: 200, body: overview }),
      'GET /api/v1/labs/fernhollow/billing/invoices': () => ({ status: 200, body: { invoices: [] } }),
    });
    renderWithProviders(routes('admin'), '/labs/fernhollow/billing?checkout=cancelled');
    expect(await screen.findByText('Checkout was cancelled; nothing was charged and the plan is unchanged.')).toBeTruthy();
    const links = screen.getAllByRole('link').map((a) => a.textContent);
    expect(links.slice(-2)).toEqual(['Billing', 'Lab settings']);
  });

  it('tells a technician billing is not theirs, without asking the server for it', async () => {
    const api = fakeApi({ 'GET /api/v1/labs/fernhollow': labAs('technician') });
    renderWithProviders(routes('technician'), '/labs/fernhollow/billing');
    expect(await screen.findByText(/billing/i)).toBeTruthy();
    expect(screen.queryByTestId('current-plan')).toBeNull();
    expect(api.requests.some((r) => r.path.includes('/billing'))).toBe(false);
  });
});
