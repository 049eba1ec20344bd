import { describe, expect, it } from 'vitest';
import { effectivePlan, historyStart } from './effective-plan.ts';
import { billingRow, testCatalog } from './billing-test-fixtures.ts';

const catalog = testCatalog;
const now = new Date('2026-12-02T12:00:00Z');
const row = billingRow;

describe('effectivePlan', () => {
  it('is the free plan without a billing row or a subscription', () => {
    expect(effectivePlan(null, catalog, now).key).toBe('seedling');
    expect(effectivePlan(row({ status: 'none' }), catalog, now).key).toBe('seedling');
    expect(effectivePlan(row({ status: 'canceled' }), catalog, now).key).toBe('seedling');
  });

  it('is the paid plan while active, and while past due inside the grace period only', () => {
    expect(effectivePlan(row({}), catalog, now).key).toBe('transect');
    expect(effectivePlan(row({ status: 'past_due', graceUntil: new Date(now.getTime() + 1000) }), catalog, now).key).toBe('transect');
    expect(effectivePlan(row({ status: 'past_due', graceUntil: now }), catalog, now).key).toBe('seedling');
    expect(effectivePlan(row({ status: 'past_due', graceUntil: null }), catalog, now).key).toBe('seedling');
  });

  it('falls back to the free plan for a plan key the catalog no longer has', () => {
    expect(effectivePlan(row({ planKey: 'retired-plan' }), catalog, now).key).toBe('seedling');
  });
});

describe('historyStart', () => {
  it('is historyDays × 86,400,000 ms before now', () => {
    expect(historyStart(catalog.free, now.getTime())).toBe(Date.parse('2026-11-02T12:00:00Z'));
  });
});
