import { describe, expect, it } from 'vitest';
import { render } from '@testing-library/react';
import { UsageSparkline, usageStepPath } from './usage-sparkline.tsx';

const identity = (v: number) => v;

describe('usage step line', () => {
  it('holds each day’s count until the next day with a count, and runs the last to the end of its day', () => {
    const path = usageStepPath(
      [
        { day: '2026-11-01', readings: 10 },
        { day: '2026-11-02', readings: 20 },
        { day: '2026-11-05', readings: 15 }, // 3 and 4 November had no count: 20 holds
      ],
      identity,
      identity,
    );
    expect(path).toBe('M0.0,10.0 H1.0 V20.0 H4.0 V15.0 H5.0');
  });

  it('draws a single day as a level line across the chart, not a dot', () => {
    const { container } = render(<UsageSparkline points={[{ day: '2026-12-03', readings: 850 }]} limit={1000} />);
    const path = container.querySelector('path');
    expect(container.querySelector('circle')).toBeNull();
    const d = path?.getAttribute('d') ?? '';
    const [start, end] = [/^M([\d.]+),([\d.]+)/.exec(d), /H([\d.]+)$/.exec(d)];
    expect(Number(start?.[1])).toBe(0);
    expect(Number(end?.[1])).toBe(320); // the full width of the chart
    expect(d).not.toContain('V'); // one count: no step
  });

  it('spreads days over the width by date, a month of daily counts reaching the right edge', () => {
    const points = Array.from({ length: 30 }, (_, i) => ({ day: `2026-11-${String(i + 1).padStart(2, '0')}`, readings: 100 * (i + 1) }));
    const { container } = render(<UsageSparkline points={points} limit={5000} />);
    const d = container.querySelector('path')?.getAttribute('d') ?? '';
    expect(d.split(' ').filter((p) => p.startsWith('H'))).toHaveLength(30);
    expect(d.endsWith('H320.0')).toBe(true);
    expect(d).toContain(`H${((1 / 30) * 320).toFixed(1)}`); // 2 November starts one thirtieth across
  });
});
