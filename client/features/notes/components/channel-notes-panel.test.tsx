import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { typeDateTime } from '../../../components/date-time-input-typing.ts';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import type { NoteKind } from '@shared/contract/notes.ts';
import { ChannelNotesPanel } from './channel-notes-panel.tsx';

afterEach(cleanup);

// Kinds and channel invented for the test; the JSON shapes are the API contract (server/contract/notes.ts).
const KINDS: NoteKind[] = [
  { id: 7, name: 'maintenance', retired: false, notes: 0 },
  { id: 8, name: 'old kind', retired: true, notes: 2 },
  { id: 9, name: 'calibration', retired: false, notes: 0 },
];
const CHANNEL = { id: 12, label: 'Water temperature', logger: { id: 4, name: 'Pond buoy', timezone: 'Europe/Berlin' } };
const RANGE = { from: Date.parse('2026-12-01T00:00:00Z'), to: Date.parse('2026-12-02T00:00:00Z') };
const BASE = '/api/v1/labs/alderpool';

function show(canEdit = true) {
  renderWithProviders(
    <ChannelNotesPanel slug="alderpool" channel={CHANNEL} range={RANGE} notes={[]} loading={false} error={null} canEdit={canEdit} canExport />,
  );
}

describe('adding a note from the channel page', () => {
  it('offers the kinds in use, reads the times on the logger’s clock and sends a note on this channel', async () => {
    const api = fakeApi({
      [`GET ${BASE}/note-kinds`]: () => ({ status: 200, body: { kinds: KINDS } }),
      [`POST ${BASE}/notes`]: () => ({ status: 201, body: {} }),
    });
    show();
    fireEvent.click(screen.getByRole('button', { name: 'Add a note' }));
    await screen.findByRole('form', { name: 'Add a note' });
    const kinds = Array.from((screen.getByLabelText('Kind') as HTMLSelectElement).options).map((o) => o.textContent);
    expect(kinds).toEqual(['maintenance', 'calibration']);
    fireEvent.change(screen.getByLabelText('Kind'), { target: { value: '9' } });
    fireEvent.change(screen.getByLabelText('What happened'), { target: { value: 'Probe checked against the reference thermometer' } });
    // 09:00–09:30 in Berlin in December (UTC+01:00) is 08:00–08:30 UTC
    typeDateTime('Starts', '2026-12-01T09:00');
    typeDateTime('Ends', '2026-12-01T09:30');
    fireEvent.click(screen.getByLabelText(/Leave out of analysis/));
    fireEvent.click(screen.getByRole('button', { name: 'Add the note' }));
    await waitFor(() => expect(screen.queryByRole('form', { name: 'Add a note' })).toBeNull());
    expect(api.requests.find((r) => r.method === 'POST')?.body).toEqual({
      channelId: 12,
      kindId: 9,
      text: 'Probe checked against the reference thermometer',
      start: Date.parse('2026-12-01T08:00:00Z'),
      end: Date.parse('2026-12-01T08:30:00Z'),
      excludeFromAnalysis: true,
    });
  });

  it('sends a whole-logger note with the logger’s id, refuses an end before the start without asking the server, and puts the server’s refusal on its field', async () => {
    const api = fakeApi({
      [`GET ${BASE}/note-kinds`]: () => ({ status: 200, body: { kinds: KINDS } }),
      [`POST ${BASE}/notes`]: () => apiError(400, 'invalid_input', 'loggerId: the logger "Pond buoy" is retired (notes go on loggers in use)'),
    });
    show();
    fireEvent.click(screen.getByRole('button', { name: 'Add a note' }));
    await screen.findByRole('form', { name: 'Add a note' });
    fireEvent.change(screen.getByLabelText('What happened'), { target: { value: 'Buoy towed ashore' } });
    typeDateTime('Starts', '2026-12-01T10:00');
    typeDateTime('Ends', '2026-12-01T09:00');
    fireEvent.click(screen.getByLabelText('every channel of Pond buoy'));
    fireEvent.click(screen.getByRole('button', { name: 'Add the note' }));
    expect(await screen.findByText('must be after the start')).toBeTruthy();
    expect(api.requests.some((r) => r.method === 'POST')).toBe(false);
    typeDateTime('Ends', '2026-12-01T11:00');
    fireEvent.click(screen.getByRole('button', { name: 'Add the note' }));
    expect(await screen.findByText('loggerId: the logger "Pond buoy" is retired (notes go on loggers in use)')).toBeTruthy();
    expect(api.requests.find((r) => r.method === 'POST')?.body).toMatchObject({ loggerId: 4, kindId: 7 });
    expect(api.requests.find((r) => r.method === 'POST')?.body).not.toHaveProperty('channelId');
  });

  it('offers no “Add a note” to a role that may not edit loggers', () => {
    fakeApi({ [`GET ${BASE}/note-kinds`]: () => ({ status: 200, body: { kinds: KINDS } }) });
    show(false);
    expect(screen.queryByRole('button', { name: 'Add a note' })).toBeNull();
    expect(screen.getByText('No notes in this range.')).toBeTruthy();
  });
});
