import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { createAlertRulesService } from '../../server/services/alerts/alert-rules.service.ts';
import { createAlertEvaluator } from '../../server/services/alerts/alert-evaluator.ts';
import { createMailer } from '../../server/integrations/mail/create-mailer.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { ingestBatch } from '../../server/services/ingest/ingest-batch.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const technician = DEV_ACCOUNTS.find((a) => a.role === 'technician')!;
// A fictional herbarium whose drying room logger went quiet half an hour ago; named afresh on every run.
const run = Date.now().toString(36);
const ruleName = `Drying room above 30 °C ${run}`;

const s = browserSuite();
let page: Page;
let lab: TestLab;
let channelId = 0;

beforeAll(async () => {
  page = await s.freshPage();
  lab = await signInAsMemberOfNewLab(s.t, page, s.appUrl, technician, { name: `Fenwick Herbarium ${run}`, role: 'technician' });
  const { logger } = await createLoggersService({ db: s.t.db }).register({ ...lab, createdAt: new Date(), role: 'technician' }, null, {
    name: `Drying room ${run}`,
    timezone: 'Europe/Berlin',
    expectedIntervalS: 60,
    channels: [{ key: 'room_t', label: 'Room temperature', unit: '°C' }],
  });
  channelId = logger.channels[0].id;
  const lastHeard = Date.now() - 30 * 60_000;
  await ingestBatch(
    s.t.db,
    { tenantId: lab.id, loggerId: logger.id },
    [24.6, 24.8, 24.7].map((value, i) => ({ index: i, channel: 'room_t', ts: lastHeard - (2 - i) * 60_000, value })),
    { source: 'api' },
  );
  const user = await s.t.db('users').where({ email: technician.email }).first();
  await createAlertRulesService({ db: s.t.db }).create(
    { ...lab, createdAt: new Date(), role: 'technician' },
    { id: Number(user.id), email: technician.email, emailVerified: true, displayName: String(user.display_name) },
    { name: ruleName, kind: 'bounds', channelId, params: { low: null, high: 30, holdS: 0, earlyWarning: null }, reminderAfterMin: null, enabled: true },
  );
  const mailer = createMailer(s.t.config.smtp);
  await createAlertEvaluator({ db: s.t.db, mailer, logger: createLogWriter({ silent: true }), publicUrl: s.t.config.publicUrl, reminderAfterMin: 0 }).runOnce(
    Date.now(),
  );
  mailer.close();
});

describe('rule health in the browser', () => {
  it('a rule whose logger went quiet says it is not watching, since when and why, on the alerts page and the channel page', async () => {
    await page.setViewportSize({ width: 1280, height: 900 });
    await page.goto(`${s.appUrl}/labs/${lab.slug}/alerts`);
    const rules = page.getByRole('list', { name: 'Alert rules' });
    const health = rules.getByRole('note', { name: `Health of ${ruleName}` });
    await health.waitFor();
    const text = (await health.textContent()) ?? '';
    expect(text).toMatch(/^Not watching since \d{4}-\d\d-\d\d \d\d:\d\d UTC\+01:00 — the logger has gone quiet/);
    expect(text).toContain('No reading for more than 3 expected intervals (the channel reports every 60 seconds).');
    expect(await rules.getByText('not watching', { exact: true }).count()).toBe(1);
    await keepScreenshot(page, 'alert-rule-health-alerts-page');

    await page.goto(`${s.appUrl}/labs/${lab.slug}/channels/${channelId}`);
    const panel = page.getByRole('region', { name: /Alerts in this range/ });
    const onChannel = panel.getByRole('list', { name: 'Rules watching this channel' }).getByRole('note', { name: `Health of ${ruleName}` });
    await onChannel.waitFor();
    expect(await onChannel.textContent()).toContain('the logger has gone quiet');
    await keepScreenshot(page, 'alert-rule-health-channel-page');

    // on a phone the warning wraps inside the page instead of widening it
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto(`${s.appUrl}/labs/${lab.slug}/alerts`);
    await health.waitFor();
    expect(await page.evaluate<number>('document.documentElement.scrollWidth')).toBeLessThanOrEqual(390);
    await keepScreenshot(page, 'alert-rule-health-phone');
  });
});
