import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import type { DiagnosticsAnswer } from '@shared/contract/diagnostics.ts';
import { DiagnosticsResults, seriesSummary } from './diagnostics-results.tsx';
import { IdentificationBlock } from './identification-block.tsx';
import { REPORT } from './report-fixture.ts';

afterEach(cleanup);

/** The fixture as an hourly week with a detected daily cycle (invented figures, display only). */
const HOURLY: DiagnosticsAnswer = {
  ...REPORT,
  method: { ...REPORT.method, resolved: { ...REPORT.method.resolved, stepS: 3_600, period: 24, periodSource: 'detected', seasonalDifference: 1 } },
  series: { ...REPORT.series, stepMs: 3_600_000, n: 169, missing: 3, readings: 2_016 },
  analysed: { n: 145, missing: 0 },
  period: {
    used: 24,
    source: 'detected',
    rawEstimate: 24.3,
    statement:
      "Period used everywhere in this report: 24 steps (1 day), detected (the spectral peak's raw estimate, 24.3 steps, lies within one frequency step of a day and is reported as exactly that).",
    candidates: [],
  },
};

describe('seriesSummary', () => {
  it('says the steps with their length in words, the readings and what was analysed', () => {
    expect(seriesSummary(HOURLY)).toBe('169 hourly steps from 2,016 readings; 3 steps without a reading. 145 values analysed after differencing.');
  });

  it('names a 5-minute step and a full grid without mentioning differencing that was not done', () => {
    expect(seriesSummary(REPORT)).toBe('4 5-minute steps from 4 readings; every step has a reading. 4 values analysed.');
  });
});

describe('DiagnosticsResults', () => {
  it('states the one period used and never prints the raw step size in seconds', () => {
    render(<DiagnosticsResults report={HOURLY} timezone="UTC" pngPrefix="lab-soil" />);
    expect(screen.getByTestId('series-summary').textContent).toContain('169 hourly steps');
    expect(screen.getByTestId('period-statement').textContent).toBe(HOURLY.period.statement);
    expect(screen.getByTestId('diagnostics-results').textContent).not.toMatch(/steps of \d+ s\b/);
  });
});

describe('IdentificationBlock', () => {
  it('names the period the report used in the seasonal verdict, not the identification’s own figure', () => {
    const seasonal = { ...REPORT.identification, verdict: 'seasonal' as const, period: 289 };
    render(<IdentificationBlock identification={seasonal} stepS={300} usedPeriod={288} />);
    const verdict = screen.getByTestId('verdict').textContent!;
    expect(verdict).toContain('cycle of 288 steps (1 day)');
    expect(verdict).not.toContain('289');
  });
});
