import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, within } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { MembersTable } from './members-table.tsx';
import type { Member } from '@shared/contract/members.ts';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// Demo people (tenants/demo/people.ts); ids and dates invented for the test.
const MEMBERS: Member[] = [
  { userId: 1, name: 'Odalys Brennick', email: 'odalys.brennick@fernhollow.example', role: 'admin', joinedAt: '2026-01-02T09:00:00Z' },
  { userId: 2, name: 'Tobiah Quarrie', email: 'tobiah.quarrie@fernhollow.example', role: 'technician', joinedAt: '2026-01-04T09:00:00Z' },
  { userId: 3, name: 'Maren Olowe', email: 'maren.olowe@fernhollow.example', role: 'scientist', joinedAt: '2026-01-03T09:00:00Z' },
];

const names = () =>
  screen
    .getAllByRole('row')
    .slice(1)
    .map((row) => within(row).getAllByRole('cell')[0].textContent);

describe('MembersTable', () => {
  it('sorts by name first and re-sorts by a clicked column, announcing the order', () => {
    fakeApi({});
    renderWithProviders(<MembersTable slug="fernhollow" members={MEMBERS} currentUserId={3} canManage={false} />);
    expect(names()).toEqual(['Maren Olowe(you)', 'Odalys Brennick', 'Tobiah Quarrie']);
    expect(screen.getByRole('columnheader', { name: /Name/ }).getAttribute('aria-sort')).toBe('ascending');

    fireEvent.click(screen.getByRole('button', { name: /Joined/ }));
    const joinedHeader = screen.getByRole('columnheader', { name: /Joined/ });
    const firstOrder = names();
    fireEvent.click(screen.getByRole('button', { name: /Joined/ }));
    expect(names()).toEqual([...firstOrder].reverse());
    // Whatever the first direction, the two clicks cover both and the header says which.
    expect(['ascending', 'descending']).toContain(joinedHeader.getAttribute('aria-sort'));
    expect(screen.getByRole('columnheader', { name: /Name/ }).getAttribute('aria-sort')).toBe('none');

    fireEvent.click(screen.getByRole('button', { name: /Role/ }));
    expect(names()).toEqual(['Odalys Brennick', 'Tobiah Quarrie', 'Maren Olowe(you)']);
  });

  it('gives non-admins no role picker and no Remove', () => {
    fakeApi({});
    renderWithProviders(<MembersTable slug="fernhollow" members={MEMBERS} currentUserId={3} canManage={false} />);
    // the only combobox is the table's phone sort menu, no role picker
    expect(screen.queryByRole('combobox', { name: /^Role of/ })).toBeNull();
    expect(screen.getAllByRole('combobox').map((c) => c.getAttribute('id') && document.querySelector(`label[for="${c.id}"]`)?.textContent)).toEqual([
      'Sort by',
    ]);
    expect(screen.queryByRole('button', { name: 'Remove' })).toBeNull();
    expect(screen.getByText('Technician')).toBeTruthy();
  });

  it('lets an admin stage and save a role, and shows the server refusal in that row', async () => {
    const api = fakeApi({
      'PATCH /api/v1/labs/fernhollow/members/1': () => apiError(409, 'last_admin', 'The lab must keep at least one admin.'),
      'PATCH /api/v1/labs/fernhollow/members/2': ({ body }) => ({ status: 200, body: { member: { ...MEMBERS[1], ...(body as object) } } }),
      'GET /api/v1/labs/fernhollow/members': () => ({ status: 200, body: { members: MEMBERS } }),
    });
    const onChanged = vi.fn();
    renderWithProviders(<MembersTable slug="fernhollow" members={MEMBERS} currentUserId={1} canManage onChanged={onChanged} />);

    fireEvent.change(screen.getByLabelText('Role of Tobiah Quarrie'), { target: { value: 'scientist' } });
    expect(api.requests).toHaveLength(0);
    fireEvent.click(screen.getByRole('button', { name: 'Save role' }));
    await vi.waitFor(() => expect(onChanged).toHaveBeenCalledTimes(1));
    expect(api.requests[0]).toEqual({ method: 'PATCH', path: '/api/v1/labs/fernhollow/members/2', body: { role: 'scientist' } });
    // Saved: nothing is staged any more.
    expect(screen.queryByRole('button', { name: 'Save role' })).toBeNull();

    fireEvent.change(screen.getByLabelText('Role of Odalys Brennick'), { target: { value: 'guest' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save role' }));
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toBe('The lab must keep at least one admin.');
    const odalysRow = screen.getAllByRole('row').find((row) => row.textContent?.includes('Odalys Brennick'))!;
    expect(within(odalysRow).getByRole('alert')).toBe(alert);
  });

  it('removes a member only after confirmation, and never offers Remove on your own row', async () => {
    const api = fakeApi({
      'DELETE /api/v1/labs/fernhollow/members/3': () => ({ status: 204 }),
      'GET /api/v1/labs/fernhollow/members': () => ({ status: 200, body: { members: MEMBERS } }),
    });
    renderWithProviders(<MembersTable slug="fernhollow" members={MEMBERS} currentUserId={1} canManage />);
    expect(screen.getAllByRole('button', { name: 'Remove' })).toHaveLength(2);

    const marenRow = screen.getAllByRole('row').find((row) => row.textContent?.includes('Maren Olowe'))!;
    fireEvent.click(within(marenRow).getByRole('button', { name: 'Remove' }));
    expect(api.requests).toHaveLength(0);
    const confirm = within(marenRow).getByRole('button', { name: 'Remove Maren Olowe' });
    expect(document.activeElement).toBe(confirm);
    fireEvent.keyDown(confirm, { key: 'Escape' });
    expect(within(marenRow).queryByRole('button', { name: 'Remove Maren Olowe' })).toBeNull();

    fireEvent.click(within(marenRow).getByRole('button', { name: 'Remove' }));
    fireEvent.click(within(marenRow).getByRole('button', { name: 'Remove Maren Olowe' }));
    await vi.waitFor(() => expect(api.requests[0]).toEqual({ method: 'DELETE', path: '/api/v1/labs/fernhollow/members/3', body: undefined }));
  });
});
