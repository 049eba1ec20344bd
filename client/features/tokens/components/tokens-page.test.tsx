import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, waitFor, within } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { createPersonalTokenSchema, type PersonalToken } from '@shared/contract/tokens.ts';
import { TokensPage } from './tokens-page.tsx';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// Tokens, names and dates invented for the test; the token shape lbt_<12 hex>_<43 chars> is the API contract.
const BASE = '/api/v1/labs/fernhollow/tokens';
const future = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString();
const ACTIVE: PersonalToken = {
  id: 41,
  name: 'Soil notebook',
  prefix: 'c0ffee123456',
  createdAt: '2026-08-01T09:00:00Z',
  expiresAt: future(30),
  lastUsedAt: null,
  revokedAt: null,
};
const REVOKED: PersonalToken = {
  id: 40,
  name: 'Old script',
  prefix: 'abcdefabcdef',
  createdAt: '2026-07-01T09:00:00Z',
  expiresAt: future(10),
  lastUsedAt: '2026-07-02T09:00:00Z',
  revokedAt: '2026-07-03T09:00:00Z',
};
const NEW_TOKEN = 'lbt_9e8d7c6b5a49_Zx8wQ2mN4pL6kJ0hG7fD3sA1qW9eR5tY2uI8oP4aS6d';

function tokensApi(list: PersonalToken[]) {
  let tokens = [...list];
  return fakeApi({
    [`GET ${BASE}`]: () => ({ status: 200, body: { tokens } }),
    [`POST ${BASE}`]: (req) => {
      const body = req.body as { name: string; expiresInDays: number };
      const info: PersonalToken = {
        id: 42,
        name: body.name,
        prefix: '9e8d7c6b5a49',
        createdAt: new Date().toISOString(),
        expiresAt: future(body.expiresInDays),
        lastUsedAt: null,
        revokedAt: null,
      };
      tokens = [info, ...tokens];
      return { status: 201, body: { token: NEW_TOKEN, tokenInfo: info, shownOnce: true } };
    },
    [`DELETE ${BASE}/41`]: () => {
      tokens = tokens.map((t) => (t.id === 41 ? { ...t, revokedAt: new Date().toISOString() } : t));
      return { status: 204 };
    },
  });
}

const table = () => screen.getByRole('table', { name: 'Your personal API tokens in this lab' });

describe('personal tokens page', () => {
  it('lists the tokens with their state and offers Revoke only for a usable one', async () => {
    tokensApi([ACTIVE, REVOKED]);
    renderWithProviders(<TokensPage slug="fernhollow" origin="http://127.0.0.1:5310" />);
    const row = (await screen.findByText('Soil notebook')).closest('tr')!;
    expect(within(row).getByText('lbt_c0ffee123456_…')).toBeTruthy();
    expect(within(row).getByText('active')).toBeTruthy();
    expect(within(row).getByText('never')).toBeTruthy();
    const old = within(table()).getByText('Old script').closest('tr')!;
    expect(within(old).getByText(/revoked/)).toBeTruthy();
    expect(within(old).queryByRole('button', { name: 'Revoke' })).toBeNull();
    expect(within(row).getByRole('button', { name: 'Revoke' })).toBeTruthy();
  });

  it('makes a token with the form, shows it once with a copy button and a warning, then hides it for good', async () => {
    const api = tokensApi([]);
    renderWithProviders(<TokensPage slug="fernhollow" origin="http://127.0.0.1:5310" />);
    await screen.findByText('No tokens yet: make one for a notebook or a script.');
    fireEvent.change(screen.getByLabelText('What is it for?'), { target: { value: 'Bath notebook' } });
    fireEvent.change(screen.getByLabelText('Expires after (days)'), { target: { value: '14' } });
    fireEvent.click(screen.getByRole('button', { name: 'Make token' }));
    expect((await screen.findByTestId('issued-token')).textContent).toBe(NEW_TOKEN);
    expect(screen.getByText(/Lagbook keeps only a hash and cannot show it again/)).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Copy the personal token' })).toBeTruthy();
    const sent = api.requests.find((r) => r.method === 'POST');
    expect(sent?.body).toEqual({ name: 'Bath notebook', expiresInDays: 14 });
    // The body the form sent passes the server's own schema.
    expect(createPersonalTokenSchema.safeParse(sent?.body).success).toBe(true);
    await within(table()).findByText('Bath notebook');
    fireEvent.click(screen.getByRole('button', { name: 'I have copied it — hide the token' }));
    expect(screen.queryByTestId('issued-token')).toBeNull();
    expect(document.body.textContent).not.toContain(NEW_TOKEN.slice(17));
  });

  it('checks the input with the server’s schema before sending anything', async () => {
    const api = tokensApi([]);
    renderWithProviders(<TokensPage slug="fernhollow" origin="http://127.0.0.1:5310" />);
    await screen.findByText('No tokens yet: make one for a notebook or a script.');
    fireEvent.change(screen.getByLabelText('Expires after (days)'), { target: { value: '400' } });
    fireEvent.click(screen.getByRole('button', { name: 'Make token' }));
    expect(await screen.findByText('must not be empty')).toBeTruthy();
    expect(screen.getByText('must be at most 365 days')).toBeTruthy();
    expect(api.requests.filter((r) => r.method === 'POST')).toHaveLength(0);
  });

  it('shows a server refusal on the field it names', async () => {
    fakeApi({
      [`GET ${BASE}`]: () => ({ status: 200, body: { tokens: [] } }),
      [`POST ${BASE}`]: () => apiError(400, 'invalid_input', 'name: must be at most 80 characters'),
    });
    renderWithProviders(<TokensPage slug="fernhollow" origin="http://127.0.0.1:5310" />);
    fireEvent.change(await screen.findByLabelText('What is it for?'), { target: { value: 'x' } });
    fireEvent.click(screen.getByRole('button', { name: 'Make token' }));
    expect(await screen.findByText('must be at most 80 characters')).toBeTruthy();
  });

  it('revokes a token only after confirmation', async () => {
    const api = tokensApi([ACTIVE]);
    renderWithProviders(<TokensPage slug="fernhollow" origin="http://127.0.0.1:5310" />);
    const row = (await screen.findByText('Soil notebook')).closest('tr')!;
    fireEvent.click(within(row).getByRole('button', { name: 'Revoke' }));
    expect(api.requests.filter((r) => r.method === 'DELETE')).toHaveLength(0);
    fireEvent.click(within(row).getByRole('button', { name: 'Revoke lbt_c0ffee123456_…' }));
    await waitFor(() => expect(api.requests.filter((r) => r.method === 'DELETE').map((r) => r.path)).toEqual([`${BASE}/41`]));
    await waitFor(() => expect(within(table()).getByText('Soil notebook').closest('tr')!.textContent).toMatch(/revoked/));
  });

  it('fills the notebook examples with this lab’s read API at the page’s own origin', async () => {
    tokensApi([]);
    renderWithProviders(<TokensPage slug="fernhollow" origin="https://lagbook.fernhollow.example" />);
    const python = (await screen.findByTestId('notebook-python')).textContent!;
    expect(python).toContain('BASE = "https://lagbook.fernhollow.example/api/v1/labs/fernhollow"');
    expect(python).toContain('os.environ["LAGBOOK_TOKEN"]');
    const r = screen.getByTestId('notebook-r').textContent!;
    expect(r).toContain('base <- "https://lagbook.fernhollow.example/api/v1/labs/fernhollow"');
    expect(r).toContain('acf(readings$value)');
  });
});
