import { describe, expect, it } from 'vitest';
import { warningGrid } from './early-warning-grid.ts';

describe('warningGrid', () => {
  it('keeps the channel interval when the horizon is at most 120 steps of it', () => {
    expect(warningGrid(60, 40)).toEqual({ stepMs: 60_000, horizonSteps: 40, historyMs: 3 * 86_400_000 });
  });
  it('coarsens a fast channel and caps its history at 4,320 cells', () => {
    expect(warningGrid(5, 60)).toEqual({ stepMs: 30_000, horizonSteps: 120, historyMs: 4320 * 30_000 });
  });
  it('coarsens for a day-long horizon', () => {
    expect(warningGrid(60, 1440)).toEqual({ stepMs: 720_000, horizonSteps: 120, historyMs: 3 * 86_400_000 });
  });
});
