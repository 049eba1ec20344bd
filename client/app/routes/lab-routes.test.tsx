import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, within } from '@testing-library/react';
import { Outlet, type RouteObject } from 'react-router-dom';
import { ROLE_PERMISSIONS, type Role } from '@shared/policies/permissions.ts';
import { apiError, fakeApi, renderWithProviders } from '../../components/test-harness.tsx';
import type { Me } from '@shared/contract/me.ts';
import LabLayout from './lab-layout.tsx';
import LabHomeRoute from './lab-home.tsx';
import LabMembersRoute from './lab-members.tsx';
import LabAuditRoute from './lab-audit.tsx';
import { paths } from '../paths.ts';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const ME: Me = {
  user: { id: 7, email: 'tobiah.quarrie@fernhollow.example', name: 'Tobiah Quarrie', timeZone: null, clock: 'logger' },
  labs: [{ slug: 'fernhollow', name: 'Fernhollow Field Station', role: 'technician' }],
};

const routes: RouteObject[] = [
  {
    element: <Outlet context={ME} />,
    children: [
      {
        path: paths.lab.path,
        element: <LabLayout />,
        children: [
          { index: true, element: <LabHomeRoute /> },
          { path: paths.labMembers.path, element: <LabMembersRoute /> },
          { path: paths.labAudit.path, element: <LabAuditRoute /> },
        ],
      },
    ],
  },
];

// The permission lists come from the server's own role table, as GET /api/v1/labs/:lab sends them.
const labAs = (role: Role) => () => ({
  status: 200,
  body: { lab: { slug: 'fernhollow', name: 'Fernhollow Field Station', createdAt: '2026-01-02T09:00:00Z' }, role, permissions: [...ROLE_PERMISSIONS[role]] },
});
const noMembers = () => ({ status: 200, body: { members: [] } });

const auditPage = (page: number, total = 60) => ({
  status: 200,
  body: {
    entries: [
      {
        id: page,
        at: '2026-01-05T10:00:00Z',
        actor: { name: 'Odalys Brennick', email: 'odalys.brennick@fernhollow.example' },
        action: 'invitation.accepted',
        summary: `entry on page ${page}`,
        details: { role: 'technician' },
      },
    ],
    total,
    page,
    pageSize: 25,
  },
});

describe('lab pages', () => {
  it('shows one page for an unknown lab and a lab without access', async () => {
    fakeApi({ 'GET /api/v1/labs/elsewhere': () => apiError(404, 'not_found', 'Not found.') });
    renderWithProviders(routes, '/labs/elsewhere');
    expect((await screen.findByRole('heading', { level: 1 })).textContent).toBe('Lab not found or no access');
  });

  it('shows a technician the role and only the sections the role includes', async () => {
    const api = fakeApi({ 'GET /api/v1/labs/fernhollow': labAs('technician'), 'GET /api/v1/labs/fernhollow/members': noMembers });
    renderWithProviders(routes, '/labs/fernhollow/members');
    expect((await screen.findByTestId('lab-role')).textContent).toBe('Your role: Technician');
    const nav = screen.getByRole('navigation', { name: 'Lab sections' });
    expect(
      within(nav)
        .getAllByRole('link')
        .map((a) => a.textContent),
    ).toEqual(['Overview', 'Channels', 'Alerts', 'Notes', 'Loggers', 'Quarantine', 'Members', 'API tokens']);
    expect(within(nav).getByRole('link', { name: 'Members' }).getAttribute('aria-current')).toBe('page');
    await screen.findByText('No members.');
    expect(screen.queryByRole('form', { name: 'Invite someone' })).toBeNull();
    expect(screen.getByRole('button', { name: 'Leave this lab' })).toBeTruthy();
    expect(api.requests.map((r) => r.path)).not.toContain('/api/v1/labs/fernhollow/invitations');
  });

  it('tells a guest the member list is not part of the role, without asking the API for it', async () => {
    const api = fakeApi({ 'GET /api/v1/labs/fernhollow': labAs('guest') });
    renderWithProviders(routes, '/labs/fernhollow/members');
    expect((await screen.findByText(/does not include the member list/)).getAttribute('role')).toBe('status');
    expect(api.requests.map((r) => r.path)).toEqual(['/api/v1/labs/fernhollow']);
  });

  it('gives an admin the invite form and pending invitations', async () => {
    fakeApi({
      'GET /api/v1/labs/fernhollow': labAs('admin'),
      'GET /api/v1/labs/fernhollow/members': noMembers,
      'GET /api/v1/labs/fernhollow/invitations': () => ({ status: 200, body: { invitations: [] } }),
    });
    renderWithProviders(routes, '/labs/fernhollow/members');
    expect(await screen.findByRole('form', { name: 'Invite someone' })).toBeTruthy();
    expect(await screen.findByText('No invitations are waiting for an answer.')).toBeTruthy();
  });

  it('keeps audit filters and the page in the URL and sends them to the API', async () => {
    const api = fakeApi({
      'GET /api/v1/labs/fernhollow': labAs('admin'),
      'GET /api/v1/labs/fernhollow/audit': (req) => auditPage(Number(new URL(req.path, 'http://x').searchParams.get('page'))),
    });
    const { router } = renderWithProviders(routes, '/labs/fernhollow/audit?action=invitation.accepted&page=2');
    expect(await screen.findByText('entry on page 2')).toBeTruthy();
    expect(api.requests.at(-1)!.path).toBe('/api/v1/labs/fernhollow/audit?action=invitation.accepted&page=2&pageSize=25');
    expect((screen.getByLabelText('Action') as HTMLSelectElement).value).toBe('invitation.accepted');
    expect(screen.getByText(/Entries 26–50 of 60/)).toBeTruthy();

    fireEvent.click(screen.getByRole('button', { name: 'Next →' }));
    expect(await screen.findByText('entry on page 3')).toBeTruthy();
    expect(router.state.location.search).toBe('?action=invitation.accepted&page=3');
    expect((screen.getByRole('button', { name: 'Next →' }) as HTMLButtonElement).disabled).toBe(true);

    fireEvent.change(screen.getByLabelText('Done by'), { target: { value: ' brennick ' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    await vi.waitFor(() => expect(router.state.location.search).toBe('?action=invitation.accepted&actor=brennick'));
    expect(await screen.findByText('entry on page 1')).toBeTruthy();
    expect(api.requests.at(-1)!.path).toBe('/api/v1/labs/fernhollow/audit?action=invitation.accepted&actor=brennick&page=1&pageSize=25');
  });

  it('refuses a reversed date range without leaving the page', async () => {
    const api = fakeApi({ 'GET /api/v1/labs/fernhollow': labAs('admin'), 'GET /api/v1/labs/fernhollow/audit': () => auditPage(1) });
    const { router } = renderWithProviders(routes, '/labs/fernhollow/audit');
    await screen.findByText('entry on page 1');
    fireEvent.change(screen.getByLabelText('From day'), { target: { value: '2026-01-09' } });
    fireEvent.change(screen.getByLabelText('To day'), { target: { value: '2026-01-05' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    expect(await screen.findByText('The last day must be on or after the first day.')).toBeTruthy();
    expect(router.state.location.search).toBe('');
    expect(api.requests.filter((r) => r.path.includes('/audit'))).toHaveLength(1);
  });
});
