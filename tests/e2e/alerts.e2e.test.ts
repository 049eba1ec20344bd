import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { waitForMail } from '../../docker-free-scripts/mail-capture/read-captured-mail.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const technician = DEV_ACCOUNTS.find((a) => a.role === 'technician')!;
// A fictional seed bank, named afresh on every run; its cold room must stay at or below 6 °C.
const run = Date.now().toString(36);
const ruleName = `Cold room above 6 °C ${run}`;

const s = browserSuite();
let page: Page;
let lab: TestLab;
let channelId = 0;
let ingestKey = '';

beforeAll(async () => {
  page = await s.freshPage();
  lab = await signInAsMemberOfNewLab(s.t, page, s.appUrl, technician, { name: `Marrowgate Seed Bank ${run}`, role: 'technician' });
  const { logger, issued } = await createLoggersService({ db: s.t.db }).register({ ...lab, createdAt: new Date(), role: 'technician' }, null, {
    name: `Cold room ${run}`,
    timezone: 'UTC',
    expectedIntervalS: 60,
    channels: [{ key: 'room_t', label: 'Room temperature', unit: '°C' }],
  });
  channelId = logger.channels[0].id;
  ingestKey = issued.key;
});

describe('alerts in the browser', () => {
  it('makes a rule beside the caution, sees the alert after readings break it, and the mail links to the channel at that time', async () => {
    await page.goto(`${s.appUrl}/labs/${lab.slug}`);
    await page.getByRole('navigation', { name: 'Lab sections' }).getByRole('link', { name: 'Alerts' }).click();
    const form = page.getByRole('form', { name: 'New alert rule' });
    await form.waitFor();
    expect(await page.getByRole('complementary', { name: 'Alert caution' }).textContent()).toContain('no replacement for a certified alarm system');

    // invalid first: low above high is refused on the field, with the server schema's words
    await form.getByLabel('Name').fill(ruleName);
    await form.getByLabel('Watch').selectOption({ label: `Cold room ${run} · Room temperature` });
    await form.getByLabel('Low limit (°C)').fill('9');
    await form.getByLabel('High limit (°C)').fill('6');
    await form.getByLabel(/^Hold time/).fill('0');
    await form.getByRole('button', { name: 'Make rule' }).click();
    await form.getByText('must be below the high limit').waitFor();
    await form.getByLabel('Low limit (°C)').fill('');
    await form.getByRole('button', { name: 'Make rule' }).click();
    await form.getByText(`The rule “${ruleName}” watches Room temperature now`).waitFor();
    await page.getByRole('list', { name: 'Alert rules' }).getByText(ruleName).waitFor();
    await keepScreenshot(page, 'alerts-rule-made');

    // a logger posts readings with its real ingest key: 4.8 °C, then 7.5 °C
    const now = Date.now();
    const res = await fetch(`${s.appUrl}/api/v1/ingest`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${ingestKey}`, 'Content-Type': 'application/json' },
      body: JSON.stringify({
        readings: [
          { channel: 'room_t', ts: now - 120_000, value: 4.8 },
          { channel: 'room_t', ts: now - 60_000, value: 7.5 },
        ],
      }),
    });
    expect(res.status).toBe(200);

    const mail = await waitForMail(process.env.LAGBOOK_MAIL_CAPTURE_URL!, (m) => m.to.includes(technician.email) && m.subject.includes(ruleName), 15_000);
    expect(mail.subject).toBe(`[Marrowgate Seed Bank ${run}] Alert: ${ruleName} — Cold room ${run} · Room temperature`);
    expect(mail.text).toContain('Reading: 7.5 °C at');
    const link = /See the channel at that time: (\S+)/.exec(mail.text)![1];
    expect(link).toBe(`${s.t.config.publicUrl}/labs/${lab.slug}/channels/${channelId}?from=${now - 60_000 - 6 * 3_600_000}&to=${now - 60_000 + 3_600_000}`);

    await page.reload();
    const open = page.getByRole('list', { name: 'Open alerts' });
    await open.getByText(`Open: ${ruleName}`).waitFor({ timeout: 15_000 });
    expect(await open.getByText('7.5 °C is above the high limit 6 °C').count()).toBe(1);
    await keepScreenshot(page, 'alerts-open');

    // the mail's link opens the channel on the alert's time range, with the alert listed (and shaded: screenshot)
    await page.goto(link.replace(s.t.config.publicUrl, s.appUrl));
    const panel = page.getByRole('region', { name: /Alerts in this range/ });
    await panel.getByText(`Open: ${ruleName}`).waitFor();
    await expect
      .poll(async () => page.getByRole('region', { name: 'Readings' }).locator('figure[data-chart-ready="true"]').count(), { timeout: 30_000 })
      .toBe(1);
    await keepScreenshot(page, 'alerts-channel-band');

    // acknowledge with a note from the alert centre
    await page.goto(`${s.appUrl}/labs/${lab.slug}/alerts`);
    const ack = page.getByRole('form', { name: `Acknowledge ${ruleName}` });
    await ack.getByLabel('Note').fill('Door was propped open; closed it.');
    await ack.getByRole('button', { name: 'Acknowledge' }).click();
    await page.getByText('“Door was propped open; closed it.”').waitFor();
  });
});
