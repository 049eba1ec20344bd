import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, within } from '@testing-library/react';
import { Outlet, type RouteObject } from 'react-router-dom';
import { ROLE_PERMISSIONS, type Role } from '@shared/policies/permissions.ts';
import { apiError, fakeApi, renderWithProviders } from '../../components/test-harness.tsx';
import type { Me } from '@shared/contract/me.ts';
import type { LoggerDetail, LoggerSummary } from '@shared/contract/loggers.ts';
import LabLayout from './lab-layout.tsx';
import LabLoggersRoute from './lab-loggers.tsx';
import LabLoggerNewRoute from './lab-logger-new.tsx';
import LabLoggerRoute from './lab-logger.tsx';
import { paths } from '../paths.ts';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// People from tenants/demo/people.ts; loggers, ids and dates invented for the test.
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
          { path: paths.labLoggers.path, element: <LabLoggersRoute /> },
          { path: paths.labLoggerNew.path, element: <LabLoggerNewRoute /> },
          { path: paths.labLogger.path, element: <LabLoggerRoute /> },
        ],
      },
    ],
  },
];

const labAs = (role: Role) => () => ({
  status: 200,
  body: { lab: { slug: 'fernhollow', name: 'Fernhollow Field Station', createdAt: '2026-01-02T09:00:00Z' }, role, permissions: [...ROLE_PERMISSIONS[role]] },
});

const HEDGE: LoggerSummary = {
  id: 5,
  name: 'Hedgerow mast',
  serial: 'FH-0042',
  site: 'North hedge',
  timezone: 'Europe/Berlin',
  expectedIntervalS: 600,
  createdAt: '2026-02-01T08:00:00Z',
  retiredAt: null,
  lastSeenAt: '2026-09-01T06:00:00Z',
  channelCount: 2,
};
const HEDGE_DETAIL: LoggerDetail = {
  ...HEDGE,
  channels: [
    {
      id: 11,
      loggerId: 5,
      key: 'air_t',
      label: 'Air temperature',
      unit: '°C',
      quantity: 'air temperature',
      validMin: -40,
      validMax: 60,
      expectedIntervalS: null,
      seasonalPeriodHint: 144,
      retiredAt: null,
    },
    {
      id: 12,
      loggerId: 5,
      key: 'rh',
      label: 'Relative humidity',
      unit: '%',
      quantity: null,
      validMin: 0,
      validMax: 100,
      expectedIntervalS: null,
      seasonalPeriodHint: null,
      retiredAt: null,
    },
  ],
  keys: [
    { id: 31, prefix: 'a1b2c3d4e5f6', createdAt: '2026-02-01T08:00:00Z', lastUsedAt: '2026-09-01T06:00:00Z', revokedAt: null },
    { id: 30, prefix: '0f0f0f0f0f0f', createdAt: '2026-01-20T08:00:00Z', lastUsedAt: null, revokedAt: '2026-02-01T08:00:00Z' },
  ],
};
const ISSUED = {
  id: 32,
  prefix: '9e8d7c6b5a49',
  createdAt: '2026-09-02T10:00:00Z',
  lastUsedAt: null,
  revokedAt: null,
  key: 'lbk_9e8d7c6b5a49_Zx8wQ2mN4pL6kJ0hG7fD3sA1qW9eR5tY2uI8oP4aS6d',
  shownOnce: true,
};

const navLinks = () => within(screen.getByRole('navigation', { name: 'Lab sections' })).getAllByRole('link');

describe('lab sections for loggers', () => {
  it.each([
    ['technician', ['Overview', 'Channels', 'Alerts', 'Notes', 'Loggers', 'Quarantine', 'Members', 'API tokens']],
    ['scientist', ['Overview', 'Channels', 'Alerts', 'Notes', 'Loggers', 'Members', 'API tokens']],
    ['guest', ['Overview', 'Channels', 'Alerts', 'Notes', 'Loggers']],
  ] as Array<[Role, string[]]>)('shows a %s the sections of the role', async (role, expected) => {
    fakeApi({ 'GET /api/v1/labs/fernhollow': labAs(role), 'GET /api/v1/labs/fernhollow/loggers': () => ({ status: 200, body: { loggers: [] } }) });
    renderWithProviders(routes, '/labs/fernhollow/loggers');
    await screen.findByText('No loggers yet.');
    expect(navLinks().map((a) => a.textContent)).toEqual(expected);
  });

  it('keeps Loggers current on a logger’s page', async () => {
    fakeApi({
      'GET /api/v1/labs/fernhollow': labAs('guest'),
      'GET /api/v1/labs/fernhollow/loggers/5': () => ({ status: 200, body: { logger: { ...HEDGE_DETAIL, keys: undefined } } }),
    });
    renderWithProviders(routes, '/labs/fernhollow/loggers/5');
    await screen.findByRole('heading', { name: 'Hedgerow mast' });
    expect(navLinks().find((a) => a.getAttribute('aria-current') === 'page')?.textContent).toBe('Loggers');
  });
});

describe('loggers list', () => {
  it('lists loggers with last-seen time, lists retired ones on request, and offers registration to technicians', async () => {
    const retired: LoggerSummary = { ...HEDGE, id: 6, name: 'Old pond buoy', retiredAt: '2026-05-01T00:00:00Z', lastSeenAt: null, channelCount: 1 };
    const api = fakeApi({
      'GET /api/v1/labs/fernhollow': labAs('technician'),
      'GET /api/v1/labs/fernhollow/loggers': (req) => ({
        status: 200,
        body: { loggers: req.path.includes('includeRetired=true') ? [HEDGE, retired] : [HEDGE] },
      }),
    });
    const { router } = renderWithProviders(routes, '/labs/fernhollow/loggers');
    const link = await screen.findByRole('link', { name: 'Hedgerow mast' });
    expect(link.getAttribute('href')).toBe('/labs/fernhollow/loggers/5');
    const row = screen.getAllByRole('row').find((r) => r.textContent?.includes('Hedgerow mast'))!;
    expect(within(row).getByText('10 min')).toBeTruthy();
    expect(within(row).getByText('North hedge')).toBeTruthy();
    expect(row.querySelector('time')?.getAttribute('dateTime')).toBe('2026-09-01T06:00:00Z');
    expect(screen.getByRole('link', { name: 'Register a logger' }).getAttribute('href')).toBe('/labs/fernhollow/loggers/new');

    fireEvent.click(screen.getByLabelText('Show retired loggers'));
    expect(await screen.findByText('Old pond buoy')).toBeTruthy();
    expect(router.state.location.search).toBe('?retired=1');
    expect(api.requests.map((r) => r.path)).toContain('/api/v1/labs/fernhollow/loggers?includeRetired=true');
    const oldRow = screen.getAllByRole('row').find((r) => r.textContent?.includes('Old pond buoy'))!;
    expect(within(oldRow).getByText('retired')).toBeTruthy();
    expect(within(oldRow).getByText('never')).toBeTruthy();
  });

  it('offers no registration to a scientist', async () => {
    fakeApi({ 'GET /api/v1/labs/fernhollow': labAs('scientist'), 'GET /api/v1/labs/fernhollow/loggers': () => ({ status: 200, body: { loggers: [HEDGE] } }) });
    renderWithProviders(routes, '/labs/fernhollow/loggers');
    await screen.findByRole('link', { name: 'Hedgerow mast' });
    expect(screen.queryByRole('link', { name: 'Register a logger' })).toBeNull();
  });
});

describe('registering a logger', () => {
  const fill = (label: string, value: string) => fireEvent.change(screen.getByLabelText(label), { target: { value } });

  it('sends the logger with its channels, then shows the key once with an example and a link to the logger', async () => {
    const api = fakeApi({
      'GET /api/v1/labs/fernhollow': labAs('technician'),
      'POST /api/v1/labs/fernhollow/loggers': ({ body }) => ({
        status: 201,
        body: { logger: { ...HEDGE_DETAIL, ...(body as object), id: 9, channels: HEDGE_DETAIL.channels }, ingestKey: ISSUED },
      }),
    });
    renderWithProviders(routes, '/labs/fernhollow/loggers/new');
    await screen.findByRole('form', { name: 'Register a logger' });
    fill('Name', ' Hedgerow mast ');
    fill('Site', 'North hedge');
    fireEvent.change(screen.getByLabelText('Time zone'), { target: { value: 'Europe/Berlin' } });
    fill('Expected time between readings in seconds', '600');
    fill('Channel key (1st channel)', 'air_t');
    fill('Label (1st channel)', 'Air temperature');
    fill('Unit (1st channel)', '°C');
    fill('Lowest valid value (1st channel)', '-40');
    fill('Highest valid value (1st channel)', '60');
    fill('Readings in one cycle (1st channel)', '144');
    fireEvent.click(screen.getByRole('button', { name: '+ Add a channel' }));
    fill('Channel key (2nd channel)', 'rh');
    fill('Label (2nd channel)', 'Relative humidity');
    fireEvent.click(screen.getByRole('button', { name: 'Register logger' }));

    const key = await screen.findByTestId('issued-key');
    expect(key.textContent).toBe(ISSUED.key);
    expect(api.requests.filter((r) => r.method === 'POST')).toEqual([
      {
        method: 'POST',
        path: '/api/v1/labs/fernhollow/loggers',
        body: {
          name: 'Hedgerow mast',
          serial: null,
          site: 'North hedge',
          timezone: 'Europe/Berlin',
          expectedIntervalS: 600,
          channels: [
            { key: 'air_t', label: 'Air temperature', unit: '°C', quantity: '', validMin: -40, validMax: 60, expectedIntervalS: null, seasonalPeriodHint: 144 },
            {
              key: 'rh',
              label: 'Relative humidity',
              unit: '',
              quantity: '',
              validMin: null,
              validMax: null,
              expectedIntervalS: null,
              seasonalPeriodHint: null,
            },
          ],
        },
      },
    ]);
    expect(screen.getByText(/Lagbook keeps only a hash and cannot show it again/)).toBeTruthy();
    const example = screen.getByTestId('ingest-example').textContent!;
    expect(example).toContain(`Authorization: Bearer ${ISSUED.key}`);
    expect(example).toContain('"channel":"air_t"');
    expect(screen.getByRole('link', { name: /open the logger/ }).getAttribute('href')).toBe('/labs/fernhollow/loggers/9');
  });

  it('checks the form with the server schema before sending, and puts the server’s refusal on the name', async () => {
    const api = fakeApi({
      'GET /api/v1/labs/fernhollow': labAs('technician'),
      'POST /api/v1/labs/fernhollow/loggers': () => apiError(409, 'logger_name_taken', 'name: this lab already has a logger with this name'),
    });
    renderWithProviders(routes, '/labs/fernhollow/loggers/new');
    await screen.findByRole('form', { name: 'Register a logger' });
    fill('Name', 'Hedgerow mast');
    fill('Expected time between readings in seconds', 'ten');
    fill('Channel key (1st channel)', 'air t');
    fill('Label (1st channel)', 'Air temperature');
    fill('Lowest valid value (1st channel)', '5');
    fill('Highest valid value (1st channel)', '1');
    fireEvent.click(screen.getByRole('button', { name: 'Register logger' }));
    // Messages from createLoggerSchema / channelInputSchema (server/contract/loggers.ts).
    expect(await screen.findByText('use 1 to 64 letters, digits, "_", "." or "-", starting with a letter or digit')).toBeTruthy();
    expect(screen.getByText('must be a number')).toBeTruthy();
    expect(screen.getByText('must be above the lowest valid value')).toBeTruthy();
    expect(api.requests.filter((r) => r.method === 'POST')).toHaveLength(0);

    fill('Expected time between readings in seconds', '600');
    fill('Channel key (1st channel)', 'air_t');
    fill('Highest valid value (1st channel)', '60');
    fireEvent.click(screen.getByRole('button', { name: 'Register logger' }));
    const name = screen.getByLabelText('Name');
    await vi.waitFor(() => expect(name.getAttribute('aria-invalid')).toBe('true'));
    expect(screen.getByText('this lab already has a logger with this name')).toBeTruthy();
    expect(screen.queryByTestId('issued-key')).toBeNull();
  });
});

describe('a logger’s page', () => {
  it('is read-only for a scientist: no editing, no keys, no retiring', async () => {
    const api = fakeApi({
      'GET /api/v1/labs/fernhollow': labAs('scientist'),
      'GET /api/v1/labs/fernhollow/loggers/5': () => ({ status: 200, body: { logger: { ...HEDGE_DETAIL, keys: undefined } } }),
    });
    renderWithProviders(routes, '/labs/fernhollow/loggers/5');
    await screen.findByRole('heading', { name: 'Hedgerow mast' });
    expect(screen.getByText('Europe/Berlin')).toBeTruthy();
    expect(within(screen.getByRole('table', { name: 'Channels of the logger' })).getByText('air_t')).toBeTruthy();
    for (const name of ['Edit details', '+ Add a channel', 'Edit air_t', 'Retire', 'Issue a new key', 'Rotate keys', 'Retire logger']) {
      expect(screen.queryByRole('button', { name })).toBeNull();
    }
    expect(screen.queryByRole('heading', { name: 'Ingest keys' })).toBeNull();
    expect(screen.queryByRole('link', { name: 'Upload historical data' })).toBeNull();
    expect(api.requests.every((r) => r.method === 'GET')).toBe(true);
  });

  it('lets a technician rotate keys only after confirming, shows the new key once, and revokes a key', async () => {
    const api = fakeApi({
      'GET /api/v1/labs/fernhollow': labAs('technician'),
      'GET /api/v1/labs/fernhollow/loggers/5': () => ({ status: 200, body: { logger: HEDGE_DETAIL } }),
      'POST /api/v1/labs/fernhollow/loggers/5/keys': () => ({ status: 201, body: { ingestKey: ISSUED } }),
      'DELETE /api/v1/labs/fernhollow/loggers/5/keys/31': () => ({ status: 204 }),
    });
    renderWithProviders(routes, '/labs/fernhollow/loggers/5');
    const keys = await screen.findByRole('table', { name: 'Ingest keys of the logger' });
    expect(within(keys).getAllByRole('button', { name: 'Revoke' })).toHaveLength(1);
    expect(within(keys).getByText('lbk_a1b2c3d4e5f6_…')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Upload historical data' }).getAttribute('href')).toBe('/labs/fernhollow/loggers/5/upload');

    fireEvent.click(screen.getByRole('button', { name: 'Rotate keys' }));
    expect(screen.getByRole('group', { name: /stop every other key of this logger at once/ })).toBeTruthy();
    expect(api.requests.filter((r) => r.method !== 'GET')).toHaveLength(0);
    fireEvent.click(screen.getByRole('button', { name: 'Rotate now' }));
    expect((await screen.findByTestId('issued-key')).textContent).toBe(ISSUED.key);
    expect(api.requests.filter((r) => r.method !== 'GET')).toEqual([
      { method: 'POST', path: '/api/v1/labs/fernhollow/loggers/5/keys', body: { rotate: true } },
    ]);
    fireEvent.click(screen.getByRole('button', { name: /hide the key/ }));
    expect(screen.queryByTestId('issued-key')).toBeNull();

    fireEvent.click(within(keys).getByRole('button', { name: 'Revoke' }));
    fireEvent.click(within(keys).getByRole('button', { name: 'Revoke lbk_a1b2c3d4e5f6' }));
    await vi.waitFor(() => expect(api.requests.some((r) => r.method === 'DELETE')).toBe(true));
    expect(api.requests.find((r) => r.method === 'DELETE')!.path).toBe('/api/v1/labs/fernhollow/loggers/5/keys/31');
  });

  it('edits a channel with the channel schema and shows a taken key on the key field', async () => {
    const api = fakeApi({
      'GET /api/v1/labs/fernhollow': labAs('technician'),
      'GET /api/v1/labs/fernhollow/loggers/5': () => ({ status: 200, body: { logger: HEDGE_DETAIL } }),
      'PATCH /api/v1/labs/fernhollow/loggers/5/channels/12': () => apiError(409, 'channel_key_taken', 'key: this logger already has a channel with this key'),
    });
    renderWithProviders(routes, '/labs/fernhollow/loggers/5');
    fireEvent.click(await screen.findByRole('button', { name: 'Edit rh' }));
    const form = screen.getByRole('form', { name: 'Edit channel rh' });
    fireEvent.change(within(form).getByLabelText('Channel key'), { target: { value: 'air_t' } });
    fireEvent.change(within(form).getByLabelText('Unit'), { target: { value: '% RH' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Save channel' }));
    expect(await within(form).findByText('this logger already has a channel with this key')).toBeTruthy();
    expect(api.requests.find((r) => r.method === 'PATCH')!.body).toEqual({
      key: 'air_t',
      label: 'Relative humidity',
      unit: '% RH',
      quantity: '',
      validMin: 0,
      validMax: 100,
      expectedIntervalS: null,
      seasonalPeriodHint: null,
    });
  });
});
