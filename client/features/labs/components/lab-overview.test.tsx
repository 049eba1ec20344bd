import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, screen, within } from '@testing-library/react';
import { ROLE_PERMISSIONS, type Role } from '@shared/policies/permissions.ts';
import type { LabDetail } from '@shared/contract/labs.ts';
import type { LabOverviewAnswer } from '@shared/contract/overview.ts';
import { renderWithProviders } from '../../../components/test-harness.tsx';
import { LabOverview, type OverviewHelpers } from './lab-overview.tsx';

afterEach(cleanup);

const detail = (role: Role, extra: Partial<LabDetail['lab']> = {}): LabDetail => ({
  lab: { slug: 'fernhollow', name: 'Fernhollow Field Station', description: '', createdAt: '2026-01-02T09:00:00Z', ...extra },
  role,
  permissions: [...ROLE_PERMISSIONS[role]],
});

const helpers: OverviewHelpers = {
  reasonLabel: (r) => r,
  needsCaution: (c) => /freezer/i.test(c.label),
  CautionNote: () => <aside aria-label="Safety note">caution</aside>,
};

const empty = (steps: LabOverviewAnswer['firstSteps']): LabOverviewAnswer => ({
  now: '2026-11-24T12:00:00.000Z',
  loggerCount: 0,
  empty: true,
  firstSteps: steps,
  channels: { total: 0, counts: { live: 0, silent: 0, 'out-of-range': 0, 'no-data': 0 }, silent: [], outOfRange: [] },
  alerts: { openCount: 0, recent: [] },
});

describe('LabOverview', () => {
  it('an empty lab shows the first steps the answer offers as links, and no panels', () => {
    renderWithProviders(
      <LabOverview detail={detail('admin')} overview={empty(['register-logger', 'invite-colleague', 'upload-history'])} failed={false} helpers={helpers} />,
    );
    const steps = screen.getByRole('region', { name: 'This lab has no loggers yet' });
    expect(
      within(steps)
        .getAllByRole('link')
        .map((a) => [a.textContent, a.getAttribute('href')]),
    ).toEqual([
      ['Register a logger', '/labs/fernhollow/loggers/new'],
      ['Invite someone', '/labs/fernhollow/members'],
      ['Start with its logger', '/labs/fernhollow/loggers/new'],
    ]);
    expect(screen.queryByRole('list', { name: 'Needs attention' })).toBeNull();
    expect(screen.queryByText('Open alerts')).toBeNull();
  });

  it('a guest in an empty lab is told who can start it, with no step links', () => {
    renderWithProviders(<LabOverview detail={detail('guest')} overview={empty([])} failed={false} helpers={helpers} />);
    const steps = screen.getByRole('region', { name: 'This lab has no loggers yet' });
    expect(within(steps).queryAllByRole('link')).toEqual([]);
    expect(steps.textContent).toContain('Once an admin or technician registers a logger');
  });

  it("shows the lab's description among its facts when the lab has one", () => {
    renderWithProviders(
      <LabOverview
        detail={detail('scientist', { description: 'Soil and air along the north transect.' })}
        overview={undefined}
        failed={false}
        helpers={helpers}
      />,
    );
    expect(screen.getByText('About')).toBeTruthy();
    expect(screen.getByText('Soil and air along the north transect.')).toBeTruthy();
    expect(screen.getByRole('status').textContent).toBe('Looking at what needs attention…');
  });

  it('says when the overview could not be loaded, and still shows the facts', () => {
    renderWithProviders(<LabOverview detail={detail('admin')} overview={undefined} failed helpers={helpers} />);
    expect(screen.getByRole('alert').textContent).toContain('could not be loaded');
    expect(screen.getByText('/labs/fernhollow')).toBeTruthy();
    expect(screen.queryByText('About')).toBeNull();
  });

  it('adds the safety caution once when a channel in the list watches something valuable', () => {
    const o: LabOverviewAnswer = {
      ...empty([]),
      empty: false,
      loggerCount: 1,
      channels: {
        total: 2,
        counts: { live: 0, silent: 2, 'out-of-range': 0, 'no-data': 0 },
        silent: ['Freezer B', 'Air temperature'].map((label, i) => ({
          id: i + 1,
          key: `k${i}`,
          label,
          quantity: 'temperature',
          unit: '°C',
          logger: { id: 9, name: 'Bay' },
          status: 'silent' as const,
          intervalS: 60,
          lastReading: { time: '2026-11-24T11:00:00.000Z', value: -20 },
          validMin: null,
          validMax: null,
        })),
        outOfRange: [],
      },
    };
    renderWithProviders(<LabOverview detail={detail('admin')} overview={o} failed={false} helpers={helpers} />);
    const list = screen.getByRole('list', { name: 'Needs attention' });
    expect(
      within(list)
        .getAllByRole('link')
        .map((a) => a.getAttribute('href')),
    ).toEqual(['/labs/fernhollow/channels/1', '/labs/fernhollow/channels/2']);
    expect(screen.getAllByRole('complementary', { name: 'Safety note' })).toHaveLength(1);
    expect(within(list).getAllByText(/Watches something valuable/)).toHaveLength(1);
  });
});
