import { describe, expect, it } from 'vitest';
import { lagTimeLabel, lagWindowSteps } from './lag-window.ts';

// Unit arithmetic worked by hand: 12 h at 300 s steps = 43,200 / 300 = 144 steps.
describe('lag window in time units', () => {
  it('turns a time into whole steps of the grid', () => {
    expect(lagWindowSteps('12', 'h', 300)).toBe(144);
    expect(lagWindowSteps('1.5', 'd', 900)).toBe(144);
    expect(lagWindowSteps('7', 'min', 300)).toBe(1); // 420 s rounds to one step
    expect(lagWindowSteps('  ', 'h', 300)).toBeUndefined();
  });

  it('refuses what the server would refuse, naming the field', () => {
    expect(lagWindowSteps('-2', 'h', 300)).toBe('Lag window: a positive number');
    expect(lagWindowSteps('abc', 'h', 300)).toBe('Lag window: a positive number');
    expect(lagWindowSteps('1', 'min', 300)).toBe('Lag window: from 5 min to 34 d 17 h at steps of 5 min');
    expect(lagWindowSteps('40', 'd', 300)).toBe('Lag window: from 5 min to 34 d 17 h at steps of 5 min');
  });

  it('writes lags as signed time', () => {
    expect(lagTimeLabel(0, 300_000)).toBe('0');
    expect(lagTimeLabel(2, 300_000)).toBe('+10 min');
    expect(lagTimeLabel(-18, 300_000)).toBe('−1 h 30 min');
  });
});
