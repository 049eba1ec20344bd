import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import type { PeriodCandidate } from '@shared/contract/diagnostics.ts';
import { PeriodCandidates } from './period-candidates.tsx';

afterEach(cleanup);

/** Invented figures shaped like the engine's answer for a daylight-shaped day on five days of record (a display test, not a numeric one). */
const DAY: PeriodCandidate = {
  period: 288,
  periodS: 86_400,
  exactPeriod: 287.2,
  calendar: 'day',
  acf: 0.64,
  backgroundAcf: 0.15,
  acfBand: 0.7,
  peakRatio: 14.2,
  backgroundOrder: 2,
  pValue: 0.0014,
  sources: ['periodogram', 'harmonics'],
  significant: true,
  harmonicOf: null,
  note: '288 steps = 1 day (raw estimate 287.2, within the spectral resolution of 1/n cycles per step); its harmonics stand out too, which backs a cycle seen only a few times',
};
const HALF: PeriodCandidate = {
  ...DAY,
  period: 144,
  periodS: 43_200,
  exactPeriod: 143.4,
  calendar: 'hours',
  acf: -0.42,
  backgroundAcf: 0.38,
  sources: ['periodogram'],
  significant: false,
  harmonicOf: 288,
  note: '144 steps = 12 hours (raw estimate 143.4, within the spectral resolution of 1/n cycles per step); a harmonic of the 288-step cycle (part of its shape, not a cycle of its own)',
};

describe('PeriodCandidates', () => {
  it('marks a harmonic as part of the longer cycle and names the harmonics as support for the day', () => {
    render(<PeriodCandidates period={{ used: 288, source: 'detected', candidates: [DAY, HALF] }} stepS={300} />);
    const rows = screen.getAllByRole('row').slice(1);
    expect(rows[0].textContent).toContain('periodogram and harmonics · significant');
    expect(rows[1].textContent).toContain('part of the 288-step cycle');
    expect(rows[1].textContent).not.toContain('significant');
    expect(screen.getByText(/A harmonic of a longer cycle/)).toBeTruthy();
  });

  it('states the period used with its length in words and labels the detector’s unrounded figure as the raw estimate', () => {
    render(<PeriodCandidates period={{ used: 288, source: 'detected', rawEstimate: 287.2, candidates: [DAY, HALF] }} stepS={300} />);
    expect(screen.getByTestId('period-used').textContent).toBe('Used in every section: 288 steps (1 day), found in the readings');
    const raw = screen.getByTestId('period-raw-estimate').textContent!;
    expect(raw).toMatch(/^Raw estimate from the spectrum: 287\.2 steps/);
    expect(raw).toContain('not a second period');
  });

  it('shows no raw estimate for a period set by hand', () => {
    render(<PeriodCandidates period={{ used: 24, source: 'manual', rawEstimate: null, candidates: [] }} stepS={3_600} />);
    expect(screen.getByTestId('period-used').textContent).toBe('Used in every section: 24 steps (1 day), set by hand');
    expect(screen.queryByTestId('period-raw-estimate')).toBeNull();
  });
});
