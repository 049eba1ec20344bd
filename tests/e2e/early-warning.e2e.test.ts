import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { ingestBatch } from '../../server/services/ingest/ingest-batch.ts';
import { evaluateEarlyWarnings } from '../../server/services/alerts/early-warning/evaluate-early-warnings.ts';
import { coldRoomReadings } from '../../server/services/alerts/early-warning/cold-room-scenario.testkit.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

/**
 * Early warning in the browser (issue #22 item 3): a technician makes a bounds rule on a cold
 * room with the warning ticked; the room (the fictional scenario of cold-room-scenario.testkit.ts:
 * three days of one-minute readings, warming for the last three hours, 1.5 h before its afternoon
 * peak) heads for 8 °C; after the early warnings are evaluated (called directly, with the real
 * clock) the alerts page shows the warning as "Expected to cross" with its model and interval, and
 * the channel's chart draws the projection. Screenshots are kept.
 */
const technician = DEV_ACCOUNTS.find((a) => a.role === 'technician')!;
const run = Date.now().toString(36);
const ruleName = `Cold room 3 warm ${run}`;

const s = browserSuite();
let page: Page;
let lab: TestLab;
let channelId = 0;
let loggerId = 0;

beforeAll(async () => {
  page = await s.freshPage();
  lab = await signInAsMemberOfNewLab(s.t, page, s.appUrl, technician, { name: `Heathfield Plant Store ${run}`, role: 'technician' });
  const { logger } = await createLoggersService({ db: s.t.db }).register({ ...lab, createdAt: new Date(), role: 'technician' }, null, {
    name: `Cold room 3 ${run}`,
    timezone: 'UTC',
    expectedIntervalS: 60,
    channels: [{ key: 'room_t', label: 'Room temperature', unit: '°C' }],
  });
  channelId = logger.channels[0].id;
  loggerId = logger.id;
  const endAt = Math.floor(Date.now() / 60_000) * 60_000 - 60_000;
  const r = coldRoomReadings({ endAt, warmingMin: 180, rampMin: 60, warmingBy: 1.0, peakAt: endAt + 1.5 * 3_600_000 });
  const rows = r.values.map((value, i) => ({ index: i, channel: 'room_t', ts: r.ts[i], value }));
  await ingestBatch(s.t.db, { tenantId: lab.id, loggerId }, rows, { source: 'api' });
});

describe('early warning in the browser', () => {
  it('ticks the warning on a bounds rule, then sees "Expected to cross" with model and interval, and the projection on the chart', async () => {
    await page.goto(`${s.appUrl}/labs/${lab.slug}/alerts`);
    const form = page.getByRole('form', { name: 'New alert rule' });
    await form.waitFor();
    await form.getByLabel('Name').fill(ruleName);
    await form.getByLabel('Watch').selectOption({ label: `Cold room 3 ${run} · Room temperature` });
    await form.getByLabel('High limit (°C)').fill('8');
    await form.getByLabel(/^Hold time/).fill('0');
    await form.getByLabel('Warn before the limit is reached').check();
    await form.getByLabel('Look ahead (minutes)').fill('60');
    // out of range first: refused in the box's own unit
    await form.getByLabel('Warn at a chance of at least (%)').fill('30');
    await form.getByRole('button', { name: 'Make rule' }).click();
    await form.getByText('must be a percentage from 50 to 99').waitFor();
    await form.getByLabel('Warn at a chance of at least (%)').fill('50');
    expect(await form.textContent()).toContain('not a safety system');
    await keepScreenshot(page, 'early-warning-rule-form');
    await form.getByRole('button', { name: 'Make rule' }).click();
    await form.getByText(`The rule “${ruleName}” watches Room temperature now`).waitFor();
    await page.getByRole('list', { name: 'Alert rules' }).getByText('warns when a crossing within 1 hour is at least 50 % likely').waitFor();

    const counts = await evaluateEarlyWarnings({
      db: s.t.db,
      tenantId: lab.id,
      lab: { name: lab.name, slug: lab.slug },
      publicUrl: s.t.config.publicUrl,
      now: Date.now(),
    });
    expect(counts).toMatchObject({ opened: 1, notProjected: [] });

    await page.reload();
    const open = page.getByRole('list', { name: 'Open alerts' });
    await open.getByText(`Open: ${ruleName} Expected to cross`).waitFor({ timeout: 15_000 });
    const item = open.locator('li[data-stage="expected"]');
    const text = (await item.textContent()) ?? '';
    expect(text).toContain('on the remainder after the daily cycle');
    expect(text).toMatch(/80 % interval \d+(\.\d+)?–\d+(\.\d+)? °C in 1 hour/);
    expect(text).toMatch(/p ≈ 0\.\d\d of rising above 8 °C within 1 hour/);
    expect(text).toContain('not a safety system');
    await keepScreenshot(page, 'early-warning-alerts-page');

    await page.goto(`${s.appUrl}/labs/${lab.slug}/channels/${channelId}`);
    const readings = page.getByRole('region', { name: 'Readings' });
    await expect.poll(async () => readings.locator('figure[data-chart-ready="true"]').count(), { timeout: 30_000 }).toBe(1);
    await readings
      .getByText(/Early warning: projected 60 minutes ahead \(ARIMA\(\d,\d,\d\) on the remainder after the daily cycle\)/)
      .waitFor({ timeout: 15_000 });
    // the last day, so the hour ahead is wide enough to see: the week's 11-minute cells give way to the day's readings
    await readings.getByRole('button', { name: '24 h' }).click();
    const caption = readings.locator('figure figcaption');
    await expect.poll(async () => (await caption.textContent()) ?? '', { timeout: 30_000 }).not.toContain('11-minute');
    await expect.poll(async () => readings.locator('figure[data-chart-ready="true"]').count(), { timeout: 30_000 }).toBe(1);
    expect(await caption.textContent()).toContain('Early warning: projected 60 minutes ahead');
    await keepScreenshot(page, 'early-warning-channel-chart');
  });
});
