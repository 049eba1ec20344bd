import { describe, expect, it } from 'vitest';
import { clampToHistory, OutsidePlanHistoryError } from './plan-history.ts';

// Times invented for the test: a 30-day window starting 2026-11-02T12:00:00Z.
const window = { earliestMs: Date.parse('2026-11-02T12:00:00Z'), historyDays: 30 };
const at = (iso: string) => Date.parse(iso);

describe('clampToHistory', () => {
  it('passes a range inside the window unchanged, the window start itself included', () => {
    const q = { from: window.earliestMs, to: at('2026-11-10T00:00:00Z'), extra: 'kept' };
    const out = clampToHistory(window, q);
    expect(out.range).toBe(q);
    expect(out.cutAtMs).toBeNull();
  });

  it('moves the start of a range that begins before the window to the window start and says where', () => {
    const q = { from: at('2026-10-01T00:00:00Z'), to: at('2026-11-10T00:00:00Z'), extra: 'kept' };
    const out = clampToHistory(window, q);
    expect(out.range).toEqual({ from: window.earliestMs, to: q.to, extra: 'kept' });
    expect(out.cutAtMs).toBe(window.earliestMs);
    expect(q.from).toBe(at('2026-10-01T00:00:00Z'));
  });

  it('refuses with 402 a range that ends at or before the window start', () => {
    for (const to of [window.earliestMs, at('2026-10-15T00:00:00Z')]) {
      const attempt = () => clampToHistory(window, { from: at('2026-10-01T00:00:00Z'), to });
      expect(attempt).toThrow(OutsidePlanHistoryError);
      expect(attempt).toThrow(/shows the last 30 days \(from 2026-11-02T12:00:00\.000Z\)/);
    }
    let caught: unknown = null;
    try {
      clampToHistory(window, { from: 0, to: 1 });
    } catch (e) {
      caught = e;
    }
    expect(caught).toMatchObject({ status: 402, code: 'outside_plan_history' });
  });

  it('says older readings are kept only when the plan keeps them', () => {
    const refuse = (removesOlder: boolean) => () => clampToHistory({ ...window, removesOlder }, { from: 0, to: 1 });
    expect(refuse(false)).toThrow(/Older readings are kept, not deleted/);
    expect(refuse(true)).toThrow(/removes older readings from storage/);
    expect(refuse(true)).not.toThrow(/kept, not deleted/);
  });
});
