import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, render, screen } from '@testing-library/react';
import { ProcessModelBlock, cycleLength } from './process-model-block.tsx';
import { PROCESS_MODEL, TREND } from './report-fixture.ts';
import { TrendBlock } from './trend-block.tsx';

afterEach(cleanup);

// Invented answers (report-fixture.ts); the blocks only have to show them faithfully.
describe('process model and trend blocks', () => {
  it('gives the server’s reason when no model or trend could be fitted', () => {
    render(
      <>
        <ProcessModelBlock model={{ available: false, reason: 'fewer than 3·(p+q+1) + 10 cells' }} stepS={300} alpha={0.05} unit="°C" timezone="UTC" />
        <TrendBlock trend={{ available: false, reason: 'the series is constant' }} />
      </>,
    );
    expect(screen.getByTestId('process-model-unavailable').textContent).toBe('No model fitted: fewer than 3·(p+q+1) + 10 cells');
    expect(screen.getByTestId('trend-unavailable').textContent).toBe('No trend estimated: the series is constant');
    expect(screen.queryByRole('table')).toBeNull();
  });

  it('says when the residuals are still autocorrelated and when the fit was on the whole series', () => {
    if (!PROCESS_MODEL.available) throw new Error('fixture');
    render(
      <ProcessModelBlock
        model={{
          ...PROCESS_MODEL,
          fittedOn: 'series',
          period: null,
          residualTest: { lag: 10, statistic: 31.2, df: 9, pValue: 0.00028 },
          readingsPerIndependent: 1,
        }}
        stepS={60}
        alpha={0.05}
        unit={null}
        timezone="UTC"
      />,
    );
    expect(screen.getByTestId('process-model-residuals').textContent).toMatch(/p = 0\.0003 — autocorrelation remains at α = 0\.05/);
    expect(screen.getByTestId('process-model-fitted-on').textContent).toMatch(
      /^Fitted on the series: 2,016 cells of 1 min,.*Each reading counts as independent information\.$/,
    );
  });

  it('names the lowest-AICc candidate when the server chose another model', () => {
    if (!PROCESS_MODEL.available) throw new Error('fixture');
    const arma11 = { ...PROCESS_MODEL.chosen, p: 1, q: 1, ma: [0.05], standardErrors: { ar: [0.04], ma: [0.06], mean: 0.6 }, aicc: -1016.6 };
    const criterionNote = 'Invented note: the lowest AICc was ARMA(1,0); the verdict follows the lowest BIC.';
    render(<ProcessModelBlock model={{ ...PROCESS_MODEL, chosen: arma11, criterionNote }} stepS={300} alpha={0.05} unit="%" timezone="UTC" />);
    expect(screen.getByTestId('process-model-criterion').textContent).toBe(criterionNote);
    expect(screen.queryByTestId('process-model-note')).toBeNull();
    const notes = screen
      .getAllByRole('row')
      .filter((r) => r.closest('[data-testid="process-model-candidates"]'))
      .map((r) => r.lastElementChild?.textContent);
    expect(notes).toEqual(['Note', '', 'lowest AICc', 'chosen', 'did not converge']);
    expect(screen.getByTestId('process-model-chosen').textContent).toBe('ARMA(1, 1)(1, 1)');
    // the sign convention is stated in the page's own words, naming no statistics language
    const signs = screen.getByTestId('process-model-signs').textContent!;
    expect(signs).toContain('xₜ − μ = φ₁(xₜ₋₁ − μ) + … + eₜ + θ₁eₜ₋₁');
    expect(signs).not.toMatch(/\bR\b|arima/);
  });

  it('names cycles in whole units where it can', () => {
    expect(cycleLength(288 * 300)).toBe('1-day');
    expect(cycleLength(12 * 3600)).toBe('12-hour');
    expect(cycleLength(7 * 86_400)).toBe('1-week');
    expect(cycleLength(5400)).toBe('90-minute');
    expect(cycleLength(45)).toBe('45 s');
  });

  it('shows the trend unit per day and per year, and marks the naive row', () => {
    render(<TrendBlock trend={TREND} />);
    expect(screen.getByText(/^Slope/).textContent).toBe('Slope 0.0123 %/day = 4.493 %/year, from 2,016 values; p = 0.2821 allowing for autocorrelation.');
    expect(screen.getByTestId('trend-ols').className).toMatch(/text-ink-soft/);
    expect(screen.getByTestId('trend-hac').className).not.toMatch(/text-ink-soft/);
  });
});
