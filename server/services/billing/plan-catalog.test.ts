import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadPlanCatalog, parsePlanCatalog } from './plan-catalog.ts';
import { ConfigError } from '../../errors.ts';

const free = {
  key: 'seedling',
  name: 'Seedling',
  monthlyAmount: 0,
  priceLookupKey: null,
  limits: { readings: 10, loggers: 1, members: 2, historyDays: 30, quarantinedRows: 5 },
};
const paid = {
  key: 'transect',
  name: 'Transect',
  monthlyAmount: 4900,
  priceLookupKey: 'lagbook-transect-monthly',
  limits: { readings: 100, loggers: 5, members: 9, historyDays: 365, quarantinedRows: 50 },
};

describe('plan catalog', () => {
  it('loads the shipped tenants/plans.json with one free plan and paid plans that have lookup keys', () => {
    const catalog = loadPlanCatalog('tenants/plans.json');
    expect(catalog.free.priceLookupKey).toBeNull();
    expect(catalog.free.monthlyAmount).toBe(0);
    const paidPlans = catalog.plans.filter((p) => p !== catalog.free);
    expect(paidPlans.length).toBeGreaterThan(0);
    for (const p of paidPlans) {
      expect(catalog.byLookupKey(p.priceLookupKey!)).toBe(p);
      expect(p.limits.readings).toBeGreaterThan(catalog.free.limits.readings);
    }
  });

  it('finds plans by key and by price lookup key', () => {
    const catalog = parsePlanCatalog({ currency: 'eur', plans: [free, paid] });
    expect(catalog.byKey('transect')?.name).toBe('Transect');
    expect(catalog.byLookupKey('lagbook-transect-monthly')?.key).toBe('transect');
    expect(catalog.byKey('nope')).toBeUndefined();
  });

  it('refuses a catalog without exactly one free plan, with the path and reason', () => {
    expect(() => parsePlanCatalog({ currency: 'eur', plans: [paid, { ...paid, key: 'other', priceLookupKey: 'other-key' }] })).toThrow(
      'Invalid plan catalog plan catalog: plans: needs exactly one free plan (priceLookupKey null), found 0',
    );
  });

  it('refuses duplicate keys, a priced free plan and a negative limit', () => {
    expect(() => parsePlanCatalog({ currency: 'eur', plans: [free, paid, { ...paid }] })).toThrow(/plans\.2\.key: "transect" is used twice/);
    expect(() => parsePlanCatalog({ currency: 'eur', plans: [{ ...free, monthlyAmount: 5 }, paid] })).toThrow(/plans\.0\.monthlyAmount: the free plan costs 0/);
    expect(() => parsePlanCatalog({ currency: 'eur', plans: [free, { ...paid, limits: { ...paid.limits, readings: -1 } }] })).toThrow(
      /plans\.1\.limits\.readings/,
    );
  });

  it('requires a positive quarantine cap on every plan', () => {
    const { quarantinedRows: _dropped, ...withoutCap } = paid.limits;
    expect(() => parsePlanCatalog({ currency: 'eur', plans: [free, { ...paid, limits: withoutCap }] })).toThrow(/plans\.1\.limits\.quarantinedRows/);
    expect(() => parsePlanCatalog({ currency: 'eur', plans: [{ ...free, limits: { ...free.limits, quarantinedRows: 0 } }, paid] })).toThrow(
      /plans\.0\.limits\.quarantinedRows/,
    );
    expect(loadPlanCatalog('tenants/plans.json').free.limits.quarantinedRows).toBeGreaterThan(0);
  });

  it('ships every plan with an explicit removal policy that removes nothing', () => {
    const shipped = JSON.parse(readFileSync('tenants/plans.json', 'utf8')) as { plans: Array<{ key: string; readingRemoval?: unknown }> };
    for (const p of shipped.plans) expect(p.readingRemoval, p.key).toEqual({ enabled: false, exportDays: 30 });
    for (const p of loadPlanCatalog('tenants/plans.json').plans) expect(p.readingRemoval.enabled).toBe(false);
  });

  it('reads a plan without a removal policy as keeping every reading, and refuses a malformed one', () => {
    const catalog = parsePlanCatalog({ currency: 'eur', plans: [free, { ...paid, readingRemoval: { enabled: true, exportDays: 0 } }] });
    expect(catalog.free.readingRemoval).toEqual({ enabled: false, exportDays: 30 });
    expect(catalog.byKey('transect')?.readingRemoval).toEqual({ enabled: true, exportDays: 0 });
    expect(() => parsePlanCatalog({ currency: 'eur', plans: [free, { ...paid, readingRemoval: { enabled: true, exportDays: -1 } }] })).toThrow(
      /plans\.1\.readingRemoval\.exportDays/,
    );
    expect(() => parsePlanCatalog({ currency: 'eur', plans: [free, { ...paid, readingRemoval: { enabled: 'yes', exportDays: 5 } }] })).toThrow(
      /plans\.1\.readingRemoval\.enabled/,
    );
    expect(() => parsePlanCatalog({ currency: 'eur', plans: [free, { ...paid, readingRemoval: { exportDays: 5 } }] })).toThrow(
      /plans\.1\.readingRemoval\.enabled/,
    );
  });

  it('turns a missing or malformed file into one ConfigError line', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plans-'));
    const broken = join(dir, 'plans.json');
    writeFileSync(broken, '{ "currency": ');
    expect(() => loadPlanCatalog(broken)).toThrow(ConfigError);
    expect(() => loadPlanCatalog(broken)).toThrow(/not valid JSON/);
    expect(() => loadPlanCatalog(join(dir, 'missing.json'))).toThrow(/cannot read it \(ENOENT\)/);
  });
});
