import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, screen } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import type { RetentionAnswer } from '@shared/contract/retention.ts';
import { RetentionPanel } from './retention-panel.tsx';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// Invented figures; the JSON shape is the API contract (server/contract/retention.ts). Times at
// midday UTC, so their date is the same on any clock from UTC−11 to UTC+11.
const URL = '/api/v1/labs/fernhollow/billing/retention';
const removes = (over: Partial<Extract<RetentionAnswer, { removes: true }>> = {}): RetentionAnswer => ({
  removes: true,
  planName: 'Transect',
  historyDays: 60,
  exportDays: 30,
  horizon: '2026-09-05T12:00:00.000Z',
  oldestReading: '2025-03-14T12:00:00.000Z',
  readingsBeforeHorizon: 120_000,
  nextRemovalAt: '2026-12-05T12:00:00.000Z',
  sentence: 'not shown by the page',
  ...over,
});

describe('retention panel', () => {
  it('says which readings go and from when, how many, and links to the lab export to take first', async () => {
    fakeApi({ [`GET ${URL}`]: () => ({ status: 200, body: removes() }) });
    renderWithProviders(<RetentionPanel slug="fernhollow" />);
    const panel = await screen.findByTestId('retention');
    expect(panel.textContent).toContain(
      'Readings before 2026-09-05 are removed from 2026-12-05 (about 120,000 readings). Export them first: download the lab’s full export.',
    );
    expect(panel.textContent).toContain('The Transect plan keeps readings for its 60 days of history and 30 days more for exporting them');
    expect(panel.textContent).toContain('The oldest stored reading is from 2025-03-14.');
    expect(screen.getByRole('link', { name: 'download the lab’s full export' }).getAttribute('href')).toBe('/api/v1/labs/fernhollow/export.zip');
    // dates go through the clock component (machine-readable instant kept)
    expect(panel.querySelector('time[datetime="2026-09-05T12:00:00.000Z"]')).not.toBeNull();
    expect(panel.textContent).not.toContain('not shown by the page');
    // records that protect samples or people may have to be kept longer: the lab's own rules decide
    expect(screen.getByTestId('retention-caution').textContent).toContain('may have to be kept longer under your lab’s own rules or local regulations');
  });

  it('says when nothing is stored before the horizon yet, and says one reading in the singular', async () => {
    fakeApi({ [`GET ${URL}`]: () => ({ status: 200, body: removes({ readingsBeforeHorizon: 0, oldestReading: null }) }) });
    renderWithProviders(<RetentionPanel slug="fernhollow" />);
    const panel = await screen.findByTestId('retention');
    expect(panel.textContent).toContain('Readings before 2026-09-05 are removed; none is stored before that date now. The next removal runs on 2026-12-05.');
    expect(panel.textContent).not.toContain('oldest stored reading');
    cleanup();
    fakeApi({ [`GET ${URL}`]: () => ({ status: 200, body: removes({ readingsBeforeHorizon: 1 }) }) });
    renderWithProviders(<RetentionPanel slug="fernhollow" />);
    expect((await screen.findByTestId('retention')).textContent).toContain('(about 1 reading).');
  });

  it('says a plan that keeps everything never removes readings, with no export prompt', async () => {
    fakeApi({
      [`GET ${URL}`]: () => ({ status: 200, body: { removes: false, planName: 'Seedling', historyDays: 90, sentence: 'x' } satisfies RetentionAnswer }),
    });
    renderWithProviders(<RetentionPanel slug="fernhollow" />);
    expect((await screen.findByTestId('retention')).textContent).toBe(
      'The Seedling plan never removes readings: readings older than its 90 days of history stay stored.',
    );
    expect(screen.queryByRole('link')).toBeNull();
    expect(screen.queryByTestId('retention-caution')).toBeNull();
  });

  it('shows the refusal when the answer cannot be loaded', async () => {
    fakeApi({ [`GET ${URL}`]: () => apiError(503, 'service_unavailable', 'The database cannot be reached; try again in a minute.') });
    renderWithProviders(<RetentionPanel slug="fernhollow" />);
    expect((await screen.findByRole('alert')).textContent).toContain('The database cannot be reached; try again in a minute.');
  });
});
