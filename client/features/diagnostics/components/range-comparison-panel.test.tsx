import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, within } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { dateTimeShown, typeDateTime } from '../../../components/date-time-input-typing.ts';
import type { ComparisonAnswer } from '@shared/contract/diagnostics.ts';
import { RangeComparisonPanel } from './range-comparison-panel.tsx';
import { comparisonParamsFromDraft } from './range-comparison-form.ts';
import { CCF, FROM, REPORT, TO } from './report-fixture.ts';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const PATH = 'GET /api/v1/labs/fernhollow/channels/5/comparison';
const MID = Date.parse('2026-06-04T12:00:00Z');

// A comparison answer in the API's documented shape; the numbers are invented (the panel only has
// to show them faithfully).
const ANSWER: ComparisonAnswer = {
  channel: REPORT.channel,
  other: null,
  a: { from: FROM, to: MID, n: 1008, mean: 21.3, sd: 0.82, effectiveN: 48.2, autocorrelationTime: 20.9 },
  b: { from: MID, to: TO, n: 1008, mean: 21.95, sd: 0.79, effectiveN: 51.7, autocorrelationTime: 19.5 },
  difference: 0.65,
  alpha: 0.05,
  dependent: { standardError: 0.1612, df: 97.6, interval: [0.33, 0.97] },
  welch: { standardError: 0.03587, df: 2012.4, interval: [0.5797, 0.7203] },
  caution: 'Invented caution: range A spans only 48 autocorrelation times.',
  sentence: 'Invented sentence: range B is 0.65 % higher than range A.',
  method: {
    stepS: 300,
    agg: 'mean',
    statement: 'Invented statement: standard errors from effective sample sizes.',
    excludedNotes: { a: [], b: [] },
    references: ['Invented reference A', 'Invented reference B'],
  },
};

function renderPanel() {
  return renderWithProviders(
    <RangeComparisonPanel
      slug="fernhollow"
      channelId={5}
      channelLabel="Soil moisture"
      timezone="UTC"
      chartRange={{ from: FROM, to: TO }}
      partners={[{ id: 9, label: 'Irrigation flow', loggerName: 'Pump house' }]}
    />,
  );
}

describe('RangeComparisonPanel', () => {
  it('defaults to the two halves of the chart’s range, sends the exact query, and shows both intervals, both ranges and the caution', async () => {
    const api = fakeApi({ [PATH]: () => ({ status: 200, body: ANSWER }) });
    renderPanel();
    expect(dateTimeShown('A from')).toBe('2026-06-01T00:00');
    expect(dateTimeShown('A to')).toBe('2026-06-04T12:00');
    expect(dateTimeShown('B from')).toBe('2026-06-04T12:00');
    expect(dateTimeShown('B to')).toBe('2026-06-08T00:00');
    fireEvent.change(screen.getByLabelText('Resampling step (s)'), { target: { value: '600' } });
    fireEvent.click(screen.getByRole('button', { name: 'Compare' }));

    expect((await screen.findByTestId('comparison-sentence')).textContent).toBe(ANSWER.sentence);
    expect(api.requests.map((r) => r.path)).toEqual([
      `/api/v1/labs/fernhollow/channels/5/comparison?aFrom=${FROM}&aTo=${MID}&bFrom=${MID}&bTo=${TO}&step=600&agg=mean&alpha=0.05`,
    ]);
    expect(screen.getByTestId('comparison-difference').textContent).toBe('mean(B) − mean(A) = 0.65 %');
    const cells = (testId: string) =>
      [within(screen.getByTestId(testId)).getByRole('rowheader'), ...within(screen.getByTestId(testId)).getAllByRole('cell')].map((c) => c.textContent);
    expect(cells('comparison-dependent')).toEqual(['allowing for autocorrelation (effective sample sizes)', '± 0.161', '97.6', '0.33 … 0.97 %']);
    expect(cells('comparison-welch')).toEqual(['assuming independent readings (Welch)', '± 0.0359', '2012', '0.5797 … 0.7203 %']);
    const rows = within(screen.getByTestId('comparison-ranges')).getAllByRole('row');
    expect(rows[1].textContent).toBe('A Soil moisture2026-06-01 00:00 to 2026-06-04 12:001,00848.220.9 (1 h 44 min)21.30.82');
    expect(rows[2].textContent).toBe('B Soil moisture2026-06-04 12:00 to 2026-06-08 00:001,00851.719.5 (1 h 37 min)21.950.79');
    expect(screen.getByRole('complementary', { name: 'Comparison caution' }).textContent).toBe(
      'Read with care. Invented caution: range A spans only 48 autocorrelation times.',
    );
    expect(screen.getByTestId('comparison-method').textContent).toBe(ANSWER.method.statement);
    expect(screen.getByText('Invented reference B')).toBeTruthy();
  });

  it('compares with another channel’s range when one is chosen, and shows no caution when none is given', async () => {
    const other = { ...ANSWER, other: CCF.with, caution: null };
    const api = fakeApi({ [PATH]: () => ({ status: 200, body: other }) });
    renderPanel();
    fireEvent.change(screen.getByLabelText('Range B is of'), { target: { value: '9' } });
    fireEvent.click(screen.getByRole('button', { name: 'Give B the same times as A' }));
    fireEvent.change(screen.getByLabelText('α (1 − confidence)'), { target: { value: '0.1' } });
    fireEvent.click(screen.getByRole('button', { name: 'Compare' }));
    await screen.findByTestId('comparison-result');
    expect(api.requests[0].path).toBe(
      `/api/v1/labs/fernhollow/channels/5/comparison?aFrom=${FROM}&aTo=${MID}&bFrom=${FROM}&bTo=${MID}&agg=mean&otherChannel=9&alpha=0.1`,
    );
    expect(within(screen.getByTestId('comparison-ranges')).getAllByRole('row')[2].textContent).toMatch(/^B Irrigation flow/);
    expect(screen.queryByTestId('comparison-caution')).toBeNull();
    expect(screen.getByText('Range B — Irrigation flow')).toBeTruthy();
  });

  it('shows the server’s message when the data cannot support a comparison', async () => {
    fakeApi({ [PATH]: () => apiError(422, 'analysis_input', 'Range A has 7 cells; a comparison needs at least 20. Choose a longer range.') });
    renderPanel();
    fireEvent.click(screen.getByRole('button', { name: 'Compare' }));
    expect((await screen.findByRole('alert')).textContent).toBe('Range A has 7 cells; a comparison needs at least 20. Choose a longer range.');
    expect(screen.queryByTestId('comparison-result')).toBeNull();
  });

  it('refuses a reversed range before asking the server, and the halves button puts the defaults back', () => {
    const api = fakeApi({});
    renderPanel();
    typeDateTime('B to', '2026-06-02T00:00');
    fireEvent.click(screen.getByRole('button', { name: 'Compare' }));
    expect(screen.getByRole('alert').textContent).toBe('Range B: “to” must be after “from”');
    expect(api.requests).toHaveLength(0);
    fireEvent.click(screen.getByRole('button', { name: 'Use the two halves of the chart’s range' }));
    expect(dateTimeShown('B to')).toBe('2026-06-08T00:00');
  });
});

describe('comparisonParamsFromDraft', () => {
  const ok = {
    aFrom: '2026-01-10T00:00',
    aTo: '2026-01-11T00:00',
    bFrom: '2026-01-12T00:00',
    bTo: '2026-01-13T00:00',
    other: '',
    step: '',
    agg: 'median' as const,
    alpha: '0.05',
  };

  it('reads wall-clock times in the logger’s zone', () => {
    // Europe/Berlin is UTC+01:00 in January (IANA time zone database).
    expect(comparisonParamsFromDraft(ok, 'Europe/Berlin')).toEqual({
      aFrom: Date.parse('2026-01-09T23:00:00Z'),
      aTo: Date.parse('2026-01-10T23:00:00Z'),
      bFrom: Date.parse('2026-01-11T23:00:00Z'),
      bTo: Date.parse('2026-01-12T23:00:00Z'),
      agg: 'median',
      alpha: 0.05,
    });
  });

  it('names the field that is wrong', () => {
    expect(comparisonParamsFromDraft({ ...ok, aFrom: '' }, 'UTC')).toBe('Range A from: Give a date.');
    expect(comparisonParamsFromDraft({ ...ok, bTo: '2026-02-29T00:00' }, 'UTC')).toBe('Range B to: 2026-02-29 is not a date.');
    expect(comparisonParamsFromDraft({ ...ok, step: '1.5' }, 'UTC')).toBe('Resampling step: a whole number of seconds from 1 to 2678400');
    expect(comparisonParamsFromDraft({ ...ok, alpha: '' }, 'UTC')).toBe('α: a number above 0 and at most 0.5');
  });
});
