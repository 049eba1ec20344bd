import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { buildLab, type TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const admin = DEV_ACCOUNTS.find((a) => a.role === 'admin')!;
// A fictional herbarium, named afresh on every run: a freezer logger gone quiet, an open alert, unreadable rows.
const run = Date.now().toString(36);
const loggerName = `Freezer bay ${run}`;
const ruleName = `Seed freezer too warm ${run}`;

const s = browserSuite();
let page: Page;
let lab: TestLab;
let emptyLab: TestLab;
let channelId = 0;

beforeAll(async () => {
  page = await s.freshPage();
  lab = await signInAsMemberOfNewLab(s.t, page, s.appUrl, admin, { name: `Quillmoor Herbarium ${run}`, role: 'admin' });
  const { logger, issued } = await createLoggersService({ db: s.t.db }).register({ ...lab, createdAt: new Date(), role: 'admin' }, null, {
    name: loggerName,
    timezone: 'UTC',
    expectedIntervalS: 60,
    channels: [{ key: 'freezer_t', label: 'Seed freezer temperature', unit: '°C', quantity: 'temperature' }],
  });
  channelId = logger.channels[0].id;
  // the logger reported until an hour ago (silent since), and sent three rows with unreadable times
  const hourAgo = Date.now() - 3_600_000;
  const res = await fetch(`${s.appUrl}/api/v1/ingest`, {
    method: 'POST',
    headers: { Authorization: `Bearer ${issued.key}`, 'Content-Type': 'application/json' },
    body: JSON.stringify({
      readings: [
        { channel: 'freezer_t', ts: hourAgo - 60_000, value: -19.5 },
        { channel: 'freezer_t', ts: hourAgo, value: -19.2 },
        ...[1, 2, 3].map((i) => ({ channel: 'freezer_t', ts: `yesterday ${i}`, value: -19 })),
      ],
    }),
  });
  expect(res.status).toBe(200);
  const ruleId = 910_000_000 + lab.id;
  await s.t.db('alert_rules').insert({
    tenant_id: lab.id,
    id: ruleId,
    name: ruleName,
    kind: 'bounds',
    channel_id: channelId,
    params: JSON.stringify({ low: null, high: -15, holdS: 0 }),
    // switched off, so the evaluator (run after each ingested batch) leaves the alert open as written here
    enabled: false,
    watching_since: Date.now(),
  });
  await s.t.db('alerts').insert({
    tenant_id: lab.id,
    id: ruleId + 1,
    rule_id: ruleId,
    open_rule_id: ruleId,
    rule_name: ruleName,
    kind: 'bounds',
    channel_id: channelId,
    opened_at: Date.now() - 600_000,
    opened_value: -12,
    opened_detail: '-12 is above the high limit -15',
    last_notified_at: Date.now() - 600_000,
  });
  // a second lab of the same admin, with nothing in it yet
  emptyLab = await buildLab(s.t.db, { name: `Quillmoor Annex ${run}` });
  const user = await s.t.db('users').where({ oidc_issuer: s.t.config.oidc.issuer, oidc_subject: admin.sub }).first();
  await s.t.db('memberships').insert({ tenant_id: emptyLab.id, user_id: user.id, role: 'admin' });
});

const attention = () => page.getByRole('list', { name: 'Needs attention' });

async function openOverview(slug: string) {
  await page.goto(`${s.appUrl}/labs/${slug}`);
}

describe('the lab overview in the browser', () => {
  it('lists an open alert, the silent freezer channel and the quarantined rows, most urgent first, with the safety caution', async () => {
    await page.setViewportSize({ width: 1280, height: 900 });
    await openOverview(lab.slug);
    await attention().waitFor();
    const kinds = await attention()
      .locator('a[data-kind]')
      .evaluateAll((links) => links.map((a) => a.getAttribute('data-kind')));
    expect(kinds).toEqual(['open-alerts', 'silent', 'quarantine']);
    expect(await attention().getByRole('link').nth(0).textContent()).toContain(`1 open alertNewest: ${ruleName} on Seed freezer temperature.`);
    expect(await attention().getByRole('link').nth(1).textContent()).toMatch(
      new RegExp(
        `Seed freezer temperature is silentNo reading from ${loggerName} for 6[01] minutes; one is expected every 1 minute\\.Watches something valuable`,
      ),
    );
    expect(await attention().getByRole('link').nth(2).textContent()).toContain('3 rows waiting in quarantineReason: Unreadable time.');
    expect(await page.getByRole('complementary', { name: 'Safety note' }).textContent()).toContain('Not an alarm system.');
    await keepScreenshot(page, 'lab-overview-attention');
    // the same page on a phone
    await page.setViewportSize({ width: 390, height: 844 });
    await attention().waitFor();
    const overflow = Number(await page.evaluate('document.documentElement.scrollWidth - document.documentElement.clientWidth'));
    expect(overflow).toBeLessThanOrEqual(0);
    await keepScreenshot(page, 'lab-overview-attention-390');
    await page.setViewportSize({ width: 1280, height: 900 });
  });

  it('each entry leads to where it is dealt with', async () => {
    await openOverview(lab.slug);
    await attention()
      .getByRole('link', { name: /open alert/ })
      .click();
    await page.waitForURL(`${s.appUrl}/labs/${lab.slug}/alerts`);
    await page.getByRole('list', { name: 'Open alerts' }).getByText(`Open: ${ruleName}`).waitFor();

    await openOverview(lab.slug);
    await attention()
      .getByRole('link', { name: /is silent/ })
      .click();
    await page.waitForURL(`${s.appUrl}/labs/${lab.slug}/channels/${channelId}`);
    await page
      .getByRole('heading', { name: /Seed freezer temperature/ })
      .first()
      .waitFor();

    await openOverview(lab.slug);
    await attention()
      .getByRole('link', { name: /waiting in quarantine/ })
      .click();
    await page.waitForURL(`${s.appUrl}/labs/${lab.slug}/quarantine?reason=bad_time`);
    await page.getByText('yesterday 1').first().waitFor();
  });

  it('a lab without loggers shows its first steps, each a link', async () => {
    await openOverview(emptyLab.slug);
    await page.getByRole('heading', { name: 'This lab has no loggers yet' }).waitFor();
    expect(await attention().count()).toBe(0);
    const steps = page.getByRole('region', { name: 'This lab has no loggers yet' });
    expect(await steps.getByRole('link').allTextContents()).toEqual(['Register a logger', 'Invite someone', 'Start with its logger']);
    await keepScreenshot(page, 'lab-overview-first-steps');
    await steps.getByRole('link', { name: 'Invite someone' }).click();
    await page.waitForURL(`${s.appUrl}/labs/${emptyLab.slug}/members`);
    await openOverview(emptyLab.slug);
    await page.getByRole('region', { name: 'This lab has no loggers yet' }).getByRole('link', { name: 'Register a logger' }).click();
    await page.waitForURL(`${s.appUrl}/labs/${emptyLab.slug}/loggers/new`);
  });
});
