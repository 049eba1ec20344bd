import { cleanup, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import type { ResolvedParameters } from '@shared/contract/diagnostics.ts';
import { RESOLVED_PARAMETER_LABELS } from '@shared/contract/words/diagnostics.ts';
import { MethodBlock } from './method-block.tsx';
import { methodRows, SHOWN_APART } from './method-rows.ts';
import { REPORT } from './report-fixture.ts';

afterEach(cleanup);

describe('MethodBlock', () => {
  // The settings R 4.2.2 stats::stl(x, s.window = "periodic", robust = TRUE) fills in for a
  // period of 288 on 2016 values (periodic: s.window = 10·2016 + 1, degree 0; t.window =
  // nextodd(ceiling(1.5·288 / (1 − 1.5/20161))) = 433; l.window = nextodd(288) = 289; jumps
  // ceiling(window/10); robust: inner 1, outer 15), worked by hand from its formulas.
  const stl = {
    period: 288,
    periodic: true,
    seasonalWindow: 20_161,
    seasonalDegree: 0,
    seasonalJump: 2017,
    trendWindow: 433,
    trendDegree: 1,
    trendJump: 44,
    lowpassWindow: 289,
    lowpassDegree: 1,
    lowpassJump: 29,
    inner: 1,
    outer: 15,
  };

  it('names the STL settings in plain words with the paper’s symbols, never as raw field names', () => {
    render(
      <MethodBlock method={{ ...REPORT.method, resolved: { ...REPORT.method.resolved, decomposition: 'stl-robust', stl } }} cached={false} timezone="UTC" />,
    );
    const list = screen.getByTestId('stl-settings');
    const text = list.textContent!;
    expect(text).toContain('n(p)Cycle length288 steps');
    expect(text).toContain('n(o)Robustness passes15');
    expect(text).toContain('n(t)Trend window433 steps, local straight line, fitted at every 44th value');
    expect(text).toContain('n(l)Low-pass window289 steps');
    expect(within(list).getByText('Seasonal smoothing window')).toBeTruthy();
    // the settings object is not dumped as JSON among the other parameters
    expect(document.body.textContent).not.toMatch(/seasonalWindow|lowpassJump|"inner"/);
  });

  it('shows no STL list when no STL was run', () => {
    render(<MethodBlock method={REPORT.method} cached timezone="UTC" />);
    expect(screen.queryByTestId('stl-settings')).toBeNull();
  });

  /** Every parameter set (none null), on a week of 10-minute steps in Berlin winter time (invented for display only). */
  const FULL: ResolvedParameters = {
    from: Date.parse('2026-11-19T23:00:00Z'),
    to: Date.parse('2026-11-26T23:00:00Z'),
    stepS: 600,
    agg: 'median',
    source: { kind: 'rollups', resolutionS: 600 },
    difference: 1,
    seasonalDifference: 1,
    period: 144,
    periodSource: 'detected',
    maxLag: 288,
    alpha: 0.05,
    decomposition: 'stl',
    stl: null,
    outlierRule: 'beyond 3 robust standard deviations of the remainder at the same point of the cycle',
    ljungBoxLags: [10, 20],
    ccfMaxLag: 72,
    modelCells: 1000,
    trendLag: 6,
  };
  const method = { ...REPORT.method, resolved: FULL };

  it('shows each resolved parameter as a plain label with its value and unit', () => {
    render(<MethodBlock method={method} cached={false} timezone="Europe/Berlin" />);
    const rows = [...screen.getByTestId('method-parameters').querySelectorAll('dt')].map((dt) => `${dt.textContent}: ${dt.nextElementSibling?.textContent}`);
    expect(rows).toContain('Step: 10 minutes');
    expect(rows).toContain('Seasonal difference: once, at 144 steps (1 day)');
    expect(rows).toContain('Ljung–Box test lags: 10, 20');
    // Berlin is on UTC+01:00 after the last Sunday of October (EU Directive 2000/84/EC)
    expect(rows).toContain('Range: 2026-11-20 00:00 UTC+01:00 – 2026-11-27 00:00 UTC+01:00 (Europe/Berlin)');
    expect(rows).toContain('Values read from: stored 10-minute summaries of the readings');
    expect(rows).toContain('Longest lag between the channels: 72 steps (12 hours)');
  });

  it('names each end of a range across a daylight-saving change with its own offset', () => {
    // 2026-10-25 01:00 UTC: Berlin leaves UTC+02:00 for UTC+01:00 (EU Directive 2000/84/EC, last Sunday of October)
    const rows = methodRows({ ...FULL, from: Date.parse('2026-10-19T22:00:00Z'), to: Date.parse('2026-10-26T23:00:00Z') }, 'Europe/Berlin');
    expect(rows.find((r) => r.label === 'Range')?.value).toBe('2026-10-20 00:00 UTC+02:00 – 2026-10-27 00:00 UTC+01:00 (Europe/Berlin)');
  });

  it('never shows a resolved key raw or an ISO time, and every key has a label and a place', () => {
    render(<MethodBlock method={method} cached={false} timezone="Europe/Berlin" />);
    const text = screen.getByTestId('method-parameters').textContent!;
    // keys that are not also plain words (from, to, period, source … may well appear in a sentence)
    const identifiers = Object.keys(FULL).filter((k) => /[A-Z]/.test(k) || k === 'agg' || k === 'stl');
    expect(identifiers.length).toBeGreaterThan(8);
    for (const key of identifiers) expect(text, key).not.toMatch(new RegExp(`\\b${key}\\b`));
    expect(text).not.toMatch(/\d{4}-\d\d-\d\dT\d\d|Z\b|\{|"/);
    const shown = new Set([...methodRows(FULL, 'UTC').flatMap((r) => r.keys), ...SHOWN_APART]);
    for (const key of Object.keys(FULL) as Array<keyof ResolvedParameters>) {
      expect(shown.has(key), `${key} has no place in the method section`).toBe(true);
      expect(RESOLVED_PARAMETER_LABELS[key], `${key} has no label`).toBeTruthy();
    }
  });

  it('leaves out a parameter this client has no words for instead of printing its key', () => {
    const newer = { ...FULL, futureSetting: 3 } as ResolvedParameters;
    render(<MethodBlock method={{ ...method, resolved: newer }} cached={false} timezone="UTC" />);
    expect(screen.getByTestId('method-parameters').textContent).not.toContain('futureSetting');
  });
});
