import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { ingestBatch } from '../../server/services/ingest/ingest-batch.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const person = DEV_ACCOUNTS.find((a) => a.role === 'technician')!;

// A fictional field station with one logger on Asia/Kolkata time (UTC+05:30 all year, no
// daylight saving: IANA tz database), named afresh on every run, and one reading.
const run = Date.now().toString(36);
const READING = Math.floor(Date.now() / 60_000) * 60_000 - 3_600_000;
/** `YYYY-MM-DD HH:MM` of `ms` shifted by `offsetMin` minutes, by plain UTC arithmetic (independent of the app's formatter). */
const wall = (ms: number, offsetMin: number) => new Date(ms + offsetMin * 60_000).toISOString().slice(0, 16).replace('T', ' ');

const suite = browserSuite();
let page: Page;
let lab: TestLab;
let channelId = 0;

beforeAll(async () => {
  page = await suite.freshPage();
  lab = await signInAsMemberOfNewLab(suite.t, page, suite.appUrl, person, { name: `Teak Ridge Station ${run}`, role: 'admin' });
  const { logger } = await createLoggersService({ db: suite.t.db }).register({ ...lab, createdAt: new Date(), role: 'admin' }, null, {
    name: `Ridge mast ${run}`,
    site: 'Teak ridge, upper plot',
    timezone: 'Asia/Kolkata',
    expectedIntervalS: 600,
    channels: [{ key: 'soil_t', label: 'Soil temperature', unit: '°C', validMin: -10, validMax: 60 }],
  });
  channelId = logger.channels[0].id;
  const outcome = await ingestBatch(suite.t.db, { tenantId: lab.id, loggerId: logger.id }, [{ index: 0, channel: 'soil_t', ts: READING, value: 24.5 }], {
    source: 'api',
  });
  expect(outcome.quarantined).toEqual([]);
});

/** Chooses a clock (and a zone of one's own) in Your account and saves. */
async function chooseClock(radio: RegExp, zone?: string) {
  await page.goto(`${suite.appUrl}/account`);
  await page.getByRole('heading', { level: 1, name: 'Your account' }).waitFor();
  if (zone) await page.getByLabel('Your time zone').selectOption(zone);
  await page.getByRole('radio', { name: radio }).check();
  await page.getByRole('button', { name: 'Save' }).click();
  await page.getByText('Saved.').waitFor();
}

/** The first-reading time in the channel page's header. */
async function channelHeaderTime(): Promise<string> {
  await page.goto(`${suite.appUrl}/labs/${lab.slug}/channels/${channelId}`);
  const time = page.locator('header time').first();
  await time.waitFor();
  return (await time.textContent()) ?? '';
}

/** The time of the newest audit entry. */
async function auditTime(): Promise<string> {
  await page.goto(`${suite.appUrl}/labs/${lab.slug}/audit`);
  const time = page.locator('table time').first();
  await time.waitFor();
  return (await time.textContent()) ?? '';
}

describe('one clock the person chooses, through the browser', () => {
  it('the logger clock by default: the reading on the logger’s time, the audit log on the person’s zone', async () => {
    await chooseClock(/The logger's clock/, 'America/St_Johns');
    expect(await channelHeaderTime()).toBe(`${wall(READING, 330)} UTC+05:30`);
    // St John's (Newfoundland) is UTC−03:30 in winter and UTC−02:30 in summer (IANA tz database)
    expect(await auditTime()).toMatch(/^\d{4}-\d\d-\d\d \d\d:\d\d UTC−0[23]:30$/);
  });

  it('switching to UTC puts the channel page and the audit log on UTC; switching back restores the logger’s clock', async () => {
    await chooseClock(/^UTC/);
    expect(await channelHeaderTime()).toBe(`${wall(READING, 0)} UTC`);
    await keepScreenshot(page, 'clock-channel-utc');
    expect(await auditTime()).toMatch(/^\d{4}-\d\d-\d\d \d\d:\d\d UTC$/);
    await keepScreenshot(page, 'clock-audit-utc');

    await chooseClock(/The logger's clock/);
    await keepScreenshot(page, 'clock-account');
    expect(await channelHeaderTime()).toBe(`${wall(READING, 330)} UTC+05:30`);
    expect(await auditTime()).toMatch(/UTC−0[23]:30$/);
  });
});
