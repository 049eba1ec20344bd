import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { CreateLabForm } from './create-lab-form.tsx';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const nameInput = () => screen.getByLabelText('Lab name') as HTMLInputElement;
const slugInput = () => screen.getByLabelText('Address') as HTMLInputElement;

describe('CreateLabForm', () => {
  it("derives the address from the name with the server's slugFromName, and posts both", async () => {
    const api = fakeApi({
      'POST /api/v1/labs': () => ({
        status: 201,
        body: { lab: { slug: 'fernhollow-field-station', name: 'Fernhollow Field Station', role: 'admin' }, requestedSlug: 'fernhollow-field-station' },
      }),
    });
    const onCreated = vi.fn();
    renderWithProviders(<CreateLabForm onCreated={onCreated} />);
    fireEvent.change(nameInput(), { target: { value: 'Fernhollow Field Station' } });
    // Expected value: the example in slugFromName's own doc comment (server/policies/lab-slug.ts).
    expect(slugInput().value).toBe('fernhollow-field-station');
    expect(screen.getByText('/labs/fernhollow-field-station')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Create lab' }));
    await waitFor(() => expect(onCreated).toHaveBeenCalledWith({ slug: 'fernhollow-field-station', name: 'Fernhollow Field Station', role: 'admin' }));
    expect(api.requests).toEqual([{ method: 'POST', path: '/api/v1/labs', body: { name: 'Fernhollow Field Station', slug: 'fernhollow-field-station' } }]);
  });

  it('stops following the name once the address is edited by hand', () => {
    fakeApi({});
    renderWithProviders(<CreateLabForm onCreated={vi.fn()} />);
    fireEvent.change(nameInput(), { target: { value: 'Saltmarsh Survey' } });
    fireEvent.change(slugInput(), { target: { value: 'marsh' } });
    fireEvent.change(nameInput(), { target: { value: 'Saltmarsh Survey Group' } });
    expect(slugInput().value).toBe('marsh');
  });

  it("refuses invalid input with the schema's messages and sends nothing", async () => {
    const api = fakeApi({});
    renderWithProviders(<CreateLabForm onCreated={vi.fn()} />);
    fireEvent.change(nameInput(), { target: { value: 'X' } });
    fireEvent.change(slugInput(), { target: { value: 'Bad Slug' } });
    fireEvent.click(screen.getByRole('button', { name: 'Create lab' }));
    // Messages from createLabSchema / labSlugSchema in server/contract/labs.ts.
    expect(await screen.findByText('must be at least 2 characters')).toBeTruthy();
    expect(screen.getByText('use lowercase letters, digits and single hyphens')).toBeTruthy();
    expect(nameInput().getAttribute('aria-invalid')).toBe('true');
    expect(api.requests).toHaveLength(0);
  });

  it('says which address the lab got when the one asked for was not available, then opens it', async () => {
    fakeApi({
      'POST /api/v1/labs': () => ({
        status: 201,
        body: { lab: { slug: 'tarnbeck-institute-2', name: 'Tarnbeck Institute', role: 'admin' }, requestedSlug: 'tarnbeck-institute' },
      }),
    });
    const onCreated = vi.fn();
    renderWithProviders(<CreateLabForm onCreated={onCreated} />);
    fireEvent.change(nameInput(), { target: { value: 'Tarnbeck Institute' } });
    fireEvent.click(screen.getByRole('button', { name: 'Create lab' }));
    const notice = await screen.findByRole('status');
    expect(notice.textContent).toBe('Tarnbeck Institute is ready. Its address is /labs/tarnbeck-institute-2: /labs/tarnbeck-institute was not available.');
    expect(onCreated).not.toHaveBeenCalled();
    fireEvent.click(screen.getByRole('button', { name: 'Open the lab' }));
    expect(onCreated).toHaveBeenCalledWith({ slug: 'tarnbeck-institute-2', name: 'Tarnbeck Institute', role: 'admin' });
  });

  it("shows the account's lab limit on the form", async () => {
    const message = 'You have created 3 labs; one account may create at most 3. Admins of a lab on a paid plan may create up to 10.';
    fakeApi({ 'POST /api/v1/labs': () => apiError(403, 'lab_limit_reached', message) });
    renderWithProviders(<CreateLabForm onCreated={vi.fn()} />);
    fireEvent.change(nameInput(), { target: { value: 'Tarnbeck Institute' } });
    fireEvent.click(screen.getByRole('button', { name: 'Create lab' }));
    expect((await screen.findByRole('alert')).textContent).toBe(message);
    expect(slugInput().getAttribute('aria-invalid')).not.toBe('true');
  });
});
