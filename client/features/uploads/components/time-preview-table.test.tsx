import { describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen, within } from '@testing-library/react';
import type { TimePreviewAnswer } from '@shared/contract/uploads.ts';
import { TimePreviewTable } from './time-preview-table.tsx';

// An answer shaped as POST …/uploads/time-preview gives it (server/contract/uploads.ts); the
// instants follow the IANA tz rule for Europe/Berlin in November (UTC+1).
const DAY_FIRST: TimePreviewAnswer = {
  timeZone: 'Europe/Berlin',
  layout: 'day-first-dot',
  guess: { chosen: 'day-first-dot', candidates: ['day-first-dot'], ambiguousRows: [], reason: null },
  rows: [
    { row: 1, text: '24.11.2026 00:00', utc: '2026-11-23T23:00:00.000Z', local: '2026-11-24 00:00:00', problem: null, ambiguous: false },
    { row: 2, text: '24.11.2026 00:15', utc: '2026-11-23T23:15:00.000Z', local: '2026-11-24 00:15:00', problem: null, ambiguous: false },
  ],
  readable: true,
};

describe('TimePreviewTable', () => {
  it('shows each time as received, as stored in the zone and in UTC', () => {
    render(<TimePreviewTable answer={DAY_FIRST} asked="day-first-dot" onUseLayout={vi.fn()} />);
    const rows = within(screen.getByRole('table')).getAllByRole('row');
    expect(rows[1].textContent).toBe('124.11.2026 00:002026-11-24 00:00:002026-11-23 23:00:00 UTC');
    expect(screen.getByText(/Read as day first, dd\.mm\.yyyy HH:mm\[:ss\], in Europe\/Berlin\./)).toBeTruthy();
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it('with auto, says which layout read the rows and offers it', () => {
    const onUseLayout = vi.fn();
    render(<TimePreviewTable answer={DAY_FIRST} asked="auto" onUseLayout={onUseLayout} />);
    expect(screen.getByText(/recognised from the first rows/)).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Read the times as day first, dd.mm.yyyy HH:mm[:ss]' }));
    expect(onUseLayout).toHaveBeenCalledWith('day-first-dot');
  });

  it('names the rows a chosen layout cannot read, flags ambiguous ones, and offers the layout the rows suggest', () => {
    const answer: TimePreviewAnswer = {
      timeZone: 'UTC',
      layout: 'month-first-slash',
      guess: { chosen: 'day-first-slash', candidates: ['day-first-slash'], ambiguousRows: [], reason: null },
      rows: [
        { row: 1, text: '03/04/2026 08:00', utc: '2026-03-04T08:00:00.000Z', local: '2026-03-04 08:00:00', problem: null, ambiguous: true },
        { row: 2, text: '13/04/2026 08:00', utc: null, local: null, problem: 'ts: "13/04/2026 08:00" is not a valid date', ambiguous: false },
      ],
      readable: false,
    };
    const onUseLayout = vi.fn();
    render(<TimePreviewTable answer={answer} asked="month-first-slash" onUseLayout={onUseLayout} />);
    expect(screen.getByText('could be read day first or month first')).toBeTruthy();
    expect(screen.getByText('ts: "13/04/2026 08:00" is not a valid date')).toBeTruthy();
    expect(screen.getByRole('alert').textContent).toMatch(/cannot be read as month first/);
    fireEvent.click(screen.getByRole('button', { name: /Read the times as day first, dd\/mm\/yyyy/ }));
    expect(onUseLayout).toHaveBeenCalledWith('day-first-slash');
  });
});
