import { describe, expect, it } from 'vitest';
import { browserSuite } from '../support/browser-suite.ts';
import { buildLab, buildMember, sessionCookieFor } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { loadPlanCatalog } from '../../server/services/billing/plan-catalog.ts';

/**
 * Upgrading in the browser (Debian's Chromium, the real app, the Stripe stand-in started by
 * dev-services): an admin opens Billing, chooses a paid plan, pays on the stand-in's checkout
 * page, comes back to "waiting for confirmation" and sees the new plan and raised limits once
 * the signed webhook has landed, then switches to the larger plan in place. The admin signs in by a session cookie (sign-in itself is
 * covered by sign-in.e2e.test.ts).
 */
const s = browserSuite();
const catalog = loadPlanCatalog('tenants/plans.json');
const paid = catalog.plans.find((p) => p.priceLookupKey !== null)!;
const larger = catalog.plans.filter((p) => p.priceLookupKey !== null)[1];
const grouped = (n: number) => n.toLocaleString('en-GB');

describe('billing in the browser', () => {
  it('upgrades through the checkout page, shows the confirmed plan with its limits, then switches to a larger plan', async () => {
    const run = Date.now().toString(36);
    const lab = await buildLab(s.t.db, { name: `Brackenfold Peat Station ${run}` });
    const admin = await buildMember(s.t.db, lab, { role: 'admin', displayName: 'Tamsin Oyelaran' });
    const cookie = await sessionCookieFor(s.t.db, s.t.config.sessionSecret, admin.id);
    const page = await s.freshPage();
    await s.browser.context.addCookies([{ name: cookie.slice(0, cookie.indexOf('=')), value: cookie.slice(cookie.indexOf('=') + 1), url: s.appUrl }]);

    await page.goto(`${s.appUrl}/labs/${lab.slug}`);
    await page.getByRole('link', { name: 'Billing' }).first().click();
    await page.waitForURL(`**/labs/${lab.slug}/billing`);
    await expect.poll(() => page.getByTestId('current-plan').textContent()).toBe(catalog.free.name);
    await expect.poll(() => page.getByRole('meter', { name: 'Stored readings' }).getAttribute('aria-valuemax')).toBe(String(catalog.free.limits.readings));
    await keepScreenshot(page, 'billing-free-plan');

    await page.getByRole('button', { name: `Choose ${paid.name}` }).click();
    await page.waitForURL((u) => u.href.startsWith(process.env.STRIPE_API_BASE!));
    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toContain(paid.name);
    await keepScreenshot(page, 'billing-stand-in-checkout');
    await page.getByRole('button', { name: 'Pay with the test card' }).click();

    await page.waitForURL(`**/labs/${lab.slug}/billing?checkout=complete`);
    // either still waiting, or already confirmed when the webhook beat the page
    await expect.poll(() => page.getByText(/waiting for confirmation|Payment confirmed/).count()).toBeGreaterThan(0);
    await expect.poll(() => page.getByText(`Payment confirmed: the lab is now on the ${paid.name} plan.`).count(), { timeout: 15_000 }).toBe(1);
    expect(await page.getByTestId('current-plan').textContent()).toBe(paid.name);
    expect(await page.getByRole('meter', { name: 'Stored readings' }).getAttribute('aria-valuemax')).toBe(String(paid.limits.readings));
    await expect.poll(() => page.getByText(`0 of ${grouped(paid.limits.loggers)}`).count()).toBe(1);
    await expect.poll(() => page.getByRole('link', { name: /^LBSI-/ }).count()).toBe(1);
    await keepScreenshot(page, 'billing-upgraded');

    // a subscribed lab switches plans in place (the stand-in moves the subscription's price)
    await page.getByRole('button', { name: `Switch to ${larger.name}` }).click();
    await expect.poll(() => page.getByText(`Switch confirmed: the lab is now on the ${larger.name} plan.`).count(), { timeout: 15_000 }).toBe(1);
    expect(await page.getByTestId('current-plan').textContent()).toBe(larger.name);
    // the checkout's own confirmation still names the plan that was paid for
    expect(await page.getByText(`Payment confirmed: the lab is now on the ${paid.name} plan.`).count()).toBe(1);
    expect(await page.getByRole('meter', { name: 'Stored readings' }).getAttribute('aria-valuemax')).toBe(String(larger.limits.readings));
    await keepScreenshot(page, 'billing-switched');
    await page.close();
  });
});
