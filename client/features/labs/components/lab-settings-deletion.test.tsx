import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { LabSettingsDeletion } from './lab-settings-deletion.tsx';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const lab = { slug: 'gorse-ridge-trial', name: 'Gorse ridge trial' };
const confirmButton = () => screen.getByRole('button', { name: 'Delete the lab for good' }) as HTMLButtonElement;
const typeName = (value: string) => fireEvent.change(screen.getByLabelText(/Type the lab’s name/), { target: { value } });

describe('LabSettingsDeletion', () => {
  it('offers the export first, and deletes only once the lab’s name is typed exactly', async () => {
    const api = fakeApi({
      'POST /api/v1/labs/gorse-ridge-trial/deletion': () => ({
        status: 202,
        body: { deletion: { labSlug: lab.slug, labName: lab.name, requestedAt: '2026-12-03T20:00:00.000Z', subscriptionCancelled: false } },
      }),
    });
    const onDeleted = vi.fn();
    renderWithProviders(<LabSettingsDeletion lab={lab} onDeleted={onDeleted} />);
    expect(screen.getByRole('link', { name: 'Download the full export first' }).getAttribute('href')).toBe('/api/v1/labs/gorse-ridge-trial/export.zip');
    fireEvent.click(screen.getByRole('button', { name: 'Delete this lab…' }));
    typeName('gorse ridge trial');
    expect(confirmButton().disabled).toBe(true);
    fireEvent.click(confirmButton());
    expect(api.requests).toHaveLength(0);
    typeName('Gorse ridge trial');
    expect(confirmButton().disabled).toBe(false);
    fireEvent.click(confirmButton());
    await waitFor(() => expect(onDeleted).toHaveBeenCalledTimes(1));
    expect(api.requests).toEqual([{ method: 'POST', path: '/api/v1/labs/gorse-ridge-trial/deletion', body: { confirmName: 'Gorse ridge trial' } }]);
  });

  it('shows the server’s refusal (an unpaid invoice) and stays on the page', async () => {
    const message =
      'This lab has an unpaid invoice, so it cannot be deleted yet. Pay the invoice, or cancel the subscription, under Billing; then delete the lab.';
    fakeApi({ 'POST /api/v1/labs/gorse-ridge-trial/deletion': () => apiError(409, 'unpaid_invoice', message) });
    const onDeleted = vi.fn();
    renderWithProviders(<LabSettingsDeletion lab={lab} onDeleted={onDeleted} />);
    fireEvent.click(screen.getByRole('button', { name: 'Delete this lab…' }));
    typeName('Gorse ridge trial');
    fireEvent.click(confirmButton());
    expect((await screen.findByRole('alert')).textContent).toBe(message);
    expect(onDeleted).not.toHaveBeenCalled();
  });
});
