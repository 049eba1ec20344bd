import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Page } from 'playwright-core';
import { buildLab, buildMember, sessionCookieFor, type TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { ingestBatch } from '../../server/services/ingest/ingest-batch.ts';

/**
 * Test readings end to end in Debian's Chromium: a technician sends −99999 to a freezer channel
 * whose valid range is −40…60 °C, is asked first, keeps it as a test reading, sends a second one
 * and removes it again; the channel's chart then draws the test reading apart from the
 * readings, which stay exactly as the logger sent them.
 */
// A fictional lab, logger and freezer, named afresh on every run.
const run = Date.now().toString(36);

const suite = browserSuite();
let page: Page;
let lab: TestLab;
let loggerId: number;
let channelId: number;

beforeAll(async () => {
  lab = await buildLab(suite.t.db, { name: `Larchbrook Cell Lab ${run}` });
  const tech = await buildMember(suite.t.db, lab, { role: 'technician', displayName: 'Mina Okafor' });
  const cookie = await sessionCookieFor(suite.t.db, suite.t.config.sessionSecret, tech.id);
  const made = await request(suite.t.app)
    .post(`/api/v1/labs/${lab.slug}/loggers`)
    .set('Cookie', cookie)
    .send({
      name: `Freezer logger ${run}`,
      timezone: 'UTC',
      expectedIntervalS: 60,
      channels: [{ key: 'frz_t', label: 'Chest freezer air', unit: '°C', quantity: 'temperature', validMin: -40, validMax: 60 }],
    })
    .expect(201);
  loggerId = made.body.logger.id;
  channelId = made.body.logger.channels[0].id;
  // half an hour of the logger's own readings, a minute apart (invented demo values)
  const start = Math.floor(Date.now() / 60_000) * 60_000 - 30 * 60_000;
  const rows = Array.from({ length: 30 }, (_, i) => ({ index: i, channel: 'frz_t', ts: start + i * 60_000, value: -20 + (i % 5) * 0.25 }));
  await ingestBatch(suite.t.db, { tenantId: lab.id, loggerId }, rows, { source: 'api' });
  const [name, value] = [cookie.slice(0, cookie.indexOf('=')), cookie.slice(cookie.indexOf('=') + 1)];
  await suite.browser.context.addCookies([{ name, value, url: suite.appUrl }]);
  page = await suite.browser.context.newPage();
});

describe('test readings', () => {
  it('a value outside the valid range is asked about first, then kept as a test; a second one is removed by its sender', async () => {
    await page.goto(`${suite.appUrl}/labs/${lab.slug}/loggers/${loggerId}`);
    await page.getByRole('heading', { name: 'Send a test reading' }).waitFor();
    // a freezer: the page reminds that Lagbook is not an alarm system
    expect(await page.getByRole('complementary', { name: 'Safety note' }).textContent()).toContain('Not an alarm system.');
    await page.getByLabel('Value', { exact: true }).fill('-99999');
    await page.getByRole('button', { name: 'Send a test reading' }).click();
    const question = page.getByRole('alertdialog', { name: 'Confirm a value outside the valid range' });
    expect(await question.textContent()).toContain('-99999 °C is outside the valid range -40…60 °C');
    await keepScreenshot(page, 'test-reading-confirm');
    await question.getByRole('button', { name: 'Keep it as a test reading' }).click();
    expect(await page.getByTestId('would-get').textContent()).toBe('would be stored');
    const recent = page.getByRole('table', { name: 'Recent test readings' });
    await recent.getByText('(outside the valid range)').waitFor();

    await page.getByLabel('Value', { exact: true }).fill('5.5');
    await page.getByRole('button', { name: 'Send a test reading' }).click();
    await recent.getByRole('cell', { name: '5.5', exact: true }).waitFor();
    await keepScreenshot(page, 'test-reading-sent');
    await recent.getByRole('button', { name: 'Remove test reading frz_t = 5.5' }).click();
    await recent.getByRole('cell', { name: '5.5', exact: true }).waitFor({ state: 'detached' });
    const kept = await suite.t.db('test_readings').where({ tenant_id: lab.id, channel_id: channelId });
    expect(kept.map((r: { value: number; outside_range: number }) => [r.value, r.outside_range])).toEqual([[-99999, 1]]);
  });

  it('the channel chart draws the test reading apart, and the readings are the logger’s own 30', async () => {
    await page.goto(`${suite.appUrl}/labs/${lab.slug}/channels/${channelId}`);
    await page.locator('figure[data-chart-ready="true"]').first().waitFor();
    const caption = (await page.locator('figure[data-chart-ready="true"] figcaption').first().textContent())!;
    expect(caption).toContain('1 test reading (-99999 °C) drawn apart as hollow diamonds');
    expect(caption).not.toContain('outside the valid range;');
    await keepScreenshot(page, 'channel-test-reading');
    const readings = await suite.t.db('readings').where({ tenant_id: lab.id, channel_id: channelId });
    expect(readings).toHaveLength(30);
    expect(readings.every((r: { value: number }) => r.value > -21 && r.value < -18)).toBe(true);
  });
});
