import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, within } from '@testing-library/react';
import { fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import type { QuarantinedRow } from '@shared/contract/quarantine.ts';
import { QuarantineReview } from './quarantine-review.tsx';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// Quarantined rows of a fictional logger (demo data, invented); reasons worded as the server words them.
const BAD_VALUE: QuarantinedRow = {
  id: 801,
  loggerId: 5,
  source: 'upload',
  rowIndex: 4321,
  reasonCode: 'bad_value',
  reason: 'value: must be a finite number',
  channel: 'air_t',
  ts: '2026-09-01T00:10:00+03:00',
  value: 'n/a',
  raw: '2026-09-01T00:10:00+03:00;n/a;81;3.61',
  receivedAt: '2026-09-02T10:00:00Z',
};
const UNKNOWN: QuarantinedRow = {
  ...BAD_VALUE,
  id: 802,
  reasonCode: 'unknown_channel',
  reason: 'channel: no channel "soil_t" on this logger',
  channel: 'soil_t',
  value: '9.5',
  source: 'api',
  raw: null,
};
const LOGGERS = [{ id: 5, name: 'Hedgerow mast' }];

const pageOf = (rows: QuarantinedRow[], total = rows.length, nextCursor: string | null = null) => ({
  status: 200,
  body: { rows, total, totalAtLeast: false, pageSize: 50, nextCursor },
});

describe('QuarantineReview', () => {
  it('reads logger, reason and cursor from the URL, sends them to the API, and keeps filter changes in the URL', async () => {
    const api = fakeApi({ 'GET /api/v1/labs/fernhollow/quarantine': () => pageOf([BAD_VALUE], 120, '1790000000000.4321.801') });
    const { router } = renderWithProviders(<QuarantineReview slug="fernhollow" loggers={LOGGERS} />, '/q?loggerId=5&reason=bad_value&cursor=1790000000000.1.9');
    await screen.findByText('n/a');
    // a stored reason that starts with a part key shows the part's label instead
    expect(screen.getByText('Value: must be a finite number')).toBeTruthy();
    expect(screen.queryByText(/^value:/)).toBeNull();
    expect(api.requests[0].path).toBe('/api/v1/labs/fernhollow/quarantine?loggerId=5&reason=bad_value&cursor=1790000000000.1.9&pageSize=50');
    expect((screen.getByLabelText('Logger') as HTMLSelectElement).value).toBe('5');
    expect(screen.getByText('1 row shown · 120 matching')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Download CSV' }).getAttribute('href')).toBe(
      '/api/v1/labs/fernhollow/quarantine/export.csv?loggerId=5&reason=bad_value',
    );

    fireEvent.change(screen.getByLabelText('Reason'), { target: { value: 'unknown_channel' } });
    await vi.waitFor(() => expect(router.state.location.search).toBe('?loggerId=5&reason=unknown_channel'));
    await vi.waitFor(() => expect(api.requests.at(-1)!.path).toBe('/api/v1/labs/fernhollow/quarantine?loggerId=5&reason=unknown_channel&pageSize=50'));
  });

  it('pages by cursor: Older follows nextCursor, Newer goes back the way it came', async () => {
    const api = fakeApi({
      'GET /api/v1/labs/fernhollow/quarantine': (req) =>
        req.path.includes('cursor=1790000000000.0.801') ? pageOf([UNKNOWN], 2) : pageOf([BAD_VALUE], 2, '1790000000000.0.801'),
    });
    const { router } = renderWithProviders(<QuarantineReview slug="fernhollow" loggers={LOGGERS} />, '/q');
    await screen.findByText('n/a');
    const button = (name: string) => screen.getByRole('button', { name }) as HTMLButtonElement;
    expect([button('⇤ Newest').disabled, button('← Newer').disabled, button('Older →').disabled]).toEqual([true, true, false]);
    fireEvent.click(button('Older →'));
    await screen.findByText('soil_t');
    expect(router.state.location.search).toBe('?cursor=1790000000000.0.801');
    expect(api.requests.at(-1)!.path).toBe('/api/v1/labs/fernhollow/quarantine?cursor=1790000000000.0.801&pageSize=50');
    expect([button('⇤ Newest').disabled, button('← Newer').disabled, button('Older →').disabled]).toEqual([false, false, true]);
    fireEvent.click(button('← Newer'));
    await screen.findByText('n/a');
    expect(router.state.location.search).toBe('');
  });

  it('fixes one row and re-submits it, then says whether it was stored', async () => {
    let rows = [BAD_VALUE, UNKNOWN];
    const api = fakeApi({
      'GET /api/v1/labs/fernhollow/quarantine': () => pageOf(rows),
      'POST /api/v1/labs/fernhollow/quarantine/resubmit': () => {
        rows = [UNKNOWN];
        return { status: 200, body: { resubmitted: 1, accepted: 1, duplicates: 0, quarantined: [] } };
      },
    });
    renderWithProviders(<QuarantineReview slug="fernhollow" loggers={LOGGERS} />, '/q?loggerId=5');
    fireEvent.click(await screen.findByRole('button', { name: 'Fix the reading of “air_t” at “2026-09-01T00:10:00+03:00”' }));
    const form = screen.getByRole('form', { name: 'Fix the reading of “air_t” at “2026-09-01T00:10:00+03:00”' });
    expect((within(form).getByLabelText('Time') as HTMLInputElement).value).toBe('2026-09-01T00:10:00+03:00');
    fireEvent.change(within(form).getByLabelText('Value'), { target: { value: ' 12.3 ' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Re-submit' }));

    expect((await screen.findByText(/Re-submitted 1 row:/)).textContent).toBe('Re-submitted 1 row: 1 stored, 0 already stored, 0 quarantined again.');
    expect(api.requests.find((r) => r.method === 'POST')!.body).toEqual({
      rows: [{ id: 801, channel: 'air_t', ts: '2026-09-01T00:10:00+03:00', value: '12.3' }],
    });
    await vi.waitFor(() => expect(screen.queryByText('n/a')).toBeNull());
  });

  it('warns that a time without offset will fail again, and shows the new reason when it does', async () => {
    const local = { ...BAD_VALUE, ts: '2026-09-01 00:10:00' };
    fakeApi({
      'GET /api/v1/labs/fernhollow/quarantine': () => pageOf([local]),
      'POST /api/v1/labs/fernhollow/quarantine/resubmit': () => ({
        status: 200,
        body: {
          resubmitted: 1,
          accepted: 0,
          duplicates: 0,
          quarantined: [{ id: 801, code: 'bad_time', reason: 'ts: "2026-09-01 00:10:00" has no UTC offset (add Z or ±hh:mm, or send epoch milliseconds)' }],
        },
      }),
    });
    renderWithProviders(<QuarantineReview slug="fernhollow" loggers={LOGGERS} />, '/q');
    fireEvent.click(await screen.findByRole('button', { name: 'Fix the reading of “air_t” at “2026-09-01 00:10:00”' }));
    expect(screen.getByText(/No UTC offset/)).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Value'), { target: { value: '12.3' } });
    fireEvent.click(screen.getByRole('button', { name: 'Re-submit' }));
    // the reading is named by what arrived (logger, channel and time as received, value), not by its row id
    const outcome = await screen.findByText(/^Back in quarantine:/);
    expect(outcome.textContent).toBe(
      'Back in quarantine: Hedgerow mast, channel “air_t” as received, time “2026-09-01 00:10:00”, value “12.3”. Why: Time: "2026-09-01 00:10:00" has no UTC offset (add Z or ±hh:mm, or send epoch milliseconds).',
    );
    expect(outcome.textContent).not.toMatch(/801/);
    expect(outcome.closest('[role="alert"]')).not.toBeNull();
  });

  it('discards the selected rows only after confirmation, and re-submits a selection as it is', async () => {
    const api = fakeApi({
      'GET /api/v1/labs/fernhollow/quarantine': () => pageOf([BAD_VALUE, UNKNOWN]),
      'POST /api/v1/labs/fernhollow/quarantine/discard': () => ({ status: 200, body: { discarded: 2 } }),
      'POST /api/v1/labs/fernhollow/quarantine/resubmit': () => ({ status: 200, body: { resubmitted: 1, accepted: 0, duplicates: 1, quarantined: [] } }),
    });
    renderWithProviders(<QuarantineReview slug="fernhollow" loggers={LOGGERS} />, '/q');
    await screen.findByText('soil_t');
    expect((screen.getByRole('button', { name: 'Re-submit selected' }) as HTMLButtonElement).disabled).toBe(true);

    fireEvent.click(screen.getByLabelText('Select the reading of “soil_t” at “2026-09-01T00:10:00+03:00”'));
    fireEvent.click(screen.getByRole('button', { name: 'Re-submit selected' }));
    await screen.findByText(/0 stored, 1 already stored/);
    expect(api.requests.find((r) => r.path.endsWith('/resubmit'))!.body).toEqual({
      rows: [{ id: 802, channel: 'soil_t', ts: '2026-09-01T00:10:00+03:00', value: '9.5' }],
    });

    fireEvent.click(screen.getByLabelText('Select every row on this page'));
    expect(screen.getByText('2 selected')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Discard selected' }));
    expect(api.requests.some((r) => r.path.endsWith('/discard'))).toBe(false);
    fireEvent.click(screen.getByRole('button', { name: 'Discard' }));
    expect(await screen.findByText('Discarded 2 rows.')).toBeTruthy();
    expect(api.requests.find((r) => r.path.endsWith('/discard'))!.body).toEqual({ ids: [801, 802] });
  });

  it('repairs every matching row in bulk: preview first, then a run followed until it says what became of the rows', async () => {
    const preview = {
      selected: 120,
      stored: 119,
      alreadyStored: 0,
      stillQuarantined: 1,
      discarded: 0,
      reasons: [{ code: 'bad_time', count: 1, example: 'ts: "31.02.2026 00:00" is not a valid date' }],
      sample: [
        {
          id: 801,
          before: { channel: 'air_t', ts: '01.09.2026 00:10', value: '4.5', reasonCode: 'bad_time' },
          after: { outcome: 'stored', channel: 'air_t', ts: '2026-08-31T21:10:00.000Z' },
        },
      ],
    };
    const run = (state: 'running' | 'done', done: number) => ({
      status: state === 'running' && done === 0 ? 202 : 200,
      body: {
        id: 77,
        state,
        action: { kind: 'reread', timeFormat: 'day-first-dot' },
        selection: { filter: { reason: 'bad_time' } },
        done,
        total: 120,
        counts: state === 'done' ? { ...preview, sample: undefined } : null,
        error: null,
        startedBy: 'Tech',
        startedAt: '2026-09-02T10:00:00Z',
        finishedAt: null,
      },
    });
    let polls = 0;
    const api = fakeApi({
      'GET /api/v1/labs/fernhollow/quarantine': () => (polls < 2 ? pageOf([BAD_VALUE], 120, '1790000000000.4321.801') : pageOf([], 0)),
      'POST /api/v1/labs/fernhollow/quarantine/bulk/preview': () => ({ status: 200, body: preview }),
      'POST /api/v1/labs/fernhollow/quarantine/bulk/runs': () => run('running', 0),
      'GET /api/v1/labs/fernhollow/quarantine/bulk/runs/77': () => (++polls === 1 ? run('running', 60) : run('done', 120)),
    });
    renderWithProviders(<QuarantineReview slug="fernhollow" loggers={LOGGERS} />, '/q?reason=bad_time');
    await screen.findByText('n/a');
    fireEvent.click(screen.getByRole('button', { name: 'Select all 120 matching' }));
    expect(screen.getByText('All 120 matching rows selected')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Repair in bulk…' }));
    const panel = screen.getByRole('region', { name: 'Repair in bulk' });
    // the form checks before asking: a pattern needs its text
    fireEvent.change(within(panel).getByLabelText('Time layout'), { target: { value: 'pattern' } });
    fireEvent.click(within(panel).getByRole('button', { name: 'Preview' }));
    expect(within(panel).getByText('Pattern of the times: must not be empty.')).toBeTruthy();
    fireEvent.change(within(panel).getByLabelText('Time layout'), { target: { value: 'day-first-dot' } });
    fireEvent.click(within(panel).getByRole('button', { name: 'Preview' }));
    await within(panel).findByText(/Nothing has changed yet/);
    expect(api.requests.find((r) => r.path.endsWith('/bulk/preview'))!.body).toEqual({
      selection: { filter: { reason: 'bad_time' } },
      action: { kind: 'reread', timeFormat: 'day-first-dot' },
    });
    expect(within(panel).getByText('01.09.2026 00:10')).toBeTruthy();
    expect(within(panel).getByText('2026-08-31T21:10:00Z')).toBeTruthy();
    expect(within(panel).getByText(/1 row would stay for “Unreadable time”/)).toBeTruthy();
    fireEvent.click(within(panel).getByRole('button', { name: 'Apply to 120 rows' }));
    expect(await within(panel).findByText(/Repair done: 120 rows/, {}, { timeout: 5000 })).toBeTruthy();
    expect(polls).toBe(2);
    expect(within(panel).getByText('Still in quarantine').nextSibling!.textContent).toBe('1');
    // the list is asked again once the run has ended: the repaired rows are gone
    expect(await screen.findByText('No rows match the filter now')).toBeTruthy();
    expect((screen.getByRole('button', { name: 'Repair in bulk…' }) as HTMLButtonElement).disabled).toBe(true);
  });
});
