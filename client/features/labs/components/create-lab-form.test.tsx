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
  it('derives the address from the name with the server\'s slugFromName, and posts both', async () => {
    const api = fakeApi({ 'POST /api/v1/labs': () => ({ status: 201, body: { lab: { slug: 'fernhollow-field-station', name: 'Fernhollow Field Station', role: 'admin' } } }) });
    const onCreated = vi.fn();
    renderWithProviders(<CreateLabForm onCreated={onCreated} />);
    fireEvent.change(nameInput(), { target: { value: 'Fernhollow Field Station' } });
    // Expected value: the example in slugFromName's own doc comment (server/http/labs/labs.schema.ts).
    expect(slugInput().value).toBe('fernhollow-field-station');
    expect(screen.getByText('/labs/fernhollow-field-station')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Create lab' }));
    await waitFor(() => expect(onCreated).toHaveBeenCalledWith({ slug: 'fernhollow-field-station', name: 'Fernhollow Field Station', role: 'admin' }));
    expect(api.requests).toEqual([
      { method: 'POST', path: '/api/v1/labs', body: { name: 'Fernhollow Field Station', slug: 'fernhollow-field-station' } },
    ]);
  });

  it('stops following the name once the address is edited by hand', () => {
    fakeApi({});
    renderWithProviders(<CreateLabForm onCreated={vi.fn()} />);
    fireEvent.change(nameInput(), { target: { value: 'Saltmarsh Survey' } });
    fireEvent.change(slugInput(), { target: { value: 'marsh' } });
    fireEvent.change(nameInput(), { target: { value: 'Saltmarsh Survey Group' } });
    expect(slugInput().value).toBe('marsh');
  });

  it('refuses invalid input with the schema\'s messages and sends nothing', async () => {
    const api = fakeApi({});
    renderWithProviders(<CreateLabForm onCreated={vi.fn()} />);
    fireEvent.change(nameInput(), { target: { value: 'X' } });
    fireEvent.change(slugInput(), { target: { value: 'Bad Slug' } });
    fireEvent.click(screen.getByRole('button', { name: 'Create lab' }));
    // Messages from createLabSchema / labSlugSchema in server/http/labs/labs.schema.ts.
    expect(await screen.findByText('must be at least 2 characters')).toBeTruthy();
    expect(screen.getByText('use lowercase letters, digits and single hyphens')).toBeTruthy();
    expect(nameInput().getAttribute('aria-invalid')).toBe('true');
    expect(api.requests).toHaveLength(0);
  });

  it('shows a taken address on the address field', async () => {
    fakeApi({ 'POST /api/v1/labs': () => apiError(409, 'slug_taken', 'slug: this address is already taken') });
    renderWithProviders(<CreateLabForm onCreated={vi.fn()} />);
    fireEvent.change(nameInput(), { target: { value: 'Tarnbeck Institute' } });
    fireEvent.click(screen.getByRole('button', { name: 'Create lab' }));
    expect(await screen.findByText('this address is already taken')).toBeTruthy();
    expect(slugInput().getAttribute('aria-invalid')).toBe('true');
    expect(slugInput().getAttribute('aria-describedby')).toContain('-error');
  });
});
