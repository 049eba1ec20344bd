import { cleanup, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { MethodBlock } from './method-block.tsx';
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
    render(<MethodBlock method={{ ...REPORT.method, resolved: { ...REPORT.method.resolved, decomposition: 'stl-robust', stl } }} cached={false} />);
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
    render(<MethodBlock method={REPORT.method} cached />);
    expect(screen.queryByTestId('stl-settings')).toBeNull();
  });
});
