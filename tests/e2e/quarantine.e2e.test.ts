import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const technician = DEV_ACCOUNTS.find((a) => a.role === 'technician')!;

// A fictional logger at a fictional station, named afresh on every run.
const run = Date.now().toString(36);
const loggerName = `Alder copse mast ${run}`;

/**
 * The export of the case: semicolons, one channel column, day-first wall-clock times in
 * the logger's zone, one reading every 15 minutes of 24 November 2026 (96 rows).
 */
function dayFirstExport(): string {
  const lines = ['Datum;Lufttemp'];
  for (let i = 0; i < 96; i++) {
    const minutes = i * 15;
    lines.push(`24.11.2026 ${String(Math.floor(minutes / 60)).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')};${(3 + (i % 16) / 8).toFixed(2)}`);
  }
  return `${lines.join('\n')}\n`;
}

const suite = browserSuite();
let page: Page;
let lab: TestLab;
let loggerId = 0;

/** A JSON request from inside the signed-in page (same origin, the session cookie), as the app's own client sends it. */
async function inPage(path: string, method: string, body: string, contentType: string): Promise<{ status: number; text: string }> {
  return page.evaluate(
    async ({ path, method, body, contentType }) => {
      const res = await fetch(path, { method, body, headers: { 'Content-Type': contentType }, credentials: 'same-origin' });
      return { status: res.status, text: await res.text() };
    },
    { path, method, body, contentType },
  );
}

beforeAll(async () => {
  page = await suite.freshPage();
  lab = await signInAsMemberOfNewLab(suite.t, page, suite.appUrl, technician, { name: `Alder Copse Field Station ${run}`, role: 'technician' });
  await page.goto(`${suite.appUrl}/labs/${lab.slug}`);
  // Berlin: UTC+1 in November (IANA tz database)
  const created = await inPage(
    `/api/v1/labs/${lab.slug}/loggers`,
    'POST',
    JSON.stringify({ name: loggerName, timezone: 'Europe/Berlin', expectedIntervalS: 900, channels: [{ key: 'air_t', label: 'Air temperature', unit: '°C' }] }),
    'application/json',
  );
  expect(created.status).toBe(201);
  loggerId = JSON.parse(created.text).logger.id;
  // Uploaded with the wrong layout (ISO 8601 / epoch, the default reading): every row lands in quarantine.
  const options = { format: 'wide', delimiter: ';', timeColumn: 'Datum', columns: { Lufttemp: 'air_t' }, timeFormat: 'auto' };
  const upload = await inPage(
    `/api/v1/labs/${lab.slug}/loggers/${loggerId}/uploads?options=${encodeURIComponent(JSON.stringify(options))}`,
    'POST',
    dayFirstExport(),
    'text/csv',
  );
  expect(upload.status).toBe(200);
  const quarantined = await suite.t.db('quarantined_rows').where({ tenant_id: lab.id, logger_id: loggerId, reason_code: 'bad_time' }).count({ n: '*' });
  expect(Number(quarantined[0].n)).toBe(96);
});

describe('repairing a quarantine in bulk through the browser', () => {
  it('re-reads all 96 day-first rows in one repair: all stored, the quarantine empty', async () => {
    await page.goto(`${suite.appUrl}/labs/${lab.slug}/quarantine?loggerId=${loggerId}&reason=bad_time`);
    const table = page.getByRole('table', { name: 'Quarantined rows, newest first' });
    await table.getByText('24.11.2026 00:00', { exact: true }).waitFor();
    await page.getByText('50 rows shown · 96 matching').waitFor();

    await page.getByRole('button', { name: 'Select all 96 matching' }).click();
    await page.getByText('All 96 matching rows selected').waitFor();
    await page.getByRole('button', { name: 'Repair in bulk…' }).click();
    const panel = page.getByRole('region', { name: 'Repair in bulk' });
    await panel.getByLabel('Repair').selectOption('reread');
    await panel.getByLabel('Time layout').selectOption('day-first-dot');
    expect(await panel.getByLabel('Zone of the times').inputValue()).toBe('');
    await panel.getByRole('button', { name: 'Preview' }).click();

    await panel.getByText(/Nothing has changed yet/).waitFor();
    expect(await panel.getByText('Would be stored').locator('..').locator('dd').textContent()).toBe('96');
    expect(await panel.getByText('Would stay in quarantine').locator('..').locator('dd').textContent()).toBe('0');
    // Europe/Berlin is UTC+1 in November: 24.11.2026 00:00 there is 23:00 UTC the day before
    const firstRow = panel.getByRole('row').filter({ hasText: '24.11.2026 00:00' });
    await firstRow.getByText('2026-11-23T23:00:00Z').waitFor();
    await keepScreenshot(page, 'quarantine-bulk-preview');

    await panel.getByRole('button', { name: 'Apply to 96 rows' }).click();
    await panel.getByText('Repair done: 96 rows, all at once.').waitFor({ timeout: 60_000 });
    expect(await panel.getByText('Stored', { exact: true }).locator('..').locator('dd').textContent()).toBe('96');
    await table.getByText('Nothing in quarantine here.').waitFor();
    await keepScreenshot(page, 'quarantine-bulk-done');

    const channel = await suite.t.db('channels').where({ tenant_id: lab.id, logger_id: loggerId, channel_key: 'air_t' }).first();
    const stored = await suite.t.db('readings').where({ tenant_id: lab.id, channel_id: channel.id }).orderBy('ts').select('ts', 'value');
    expect(stored.map((r) => Number(r.ts))).toEqual(Array.from({ length: 96 }, (_, i) => Date.UTC(2026, 10, 23, 23, 0) + i * 15 * 60_000));
    expect(stored.map((r) => Number(r.value))).toEqual(Array.from({ length: 96 }, (_, i) => Number((3 + (i % 16) / 8).toFixed(2))));
    const left = await suite.t.db('quarantined_rows').where({ tenant_id: lab.id }).count({ n: '*' });
    expect(Number(left[0].n)).toBe(0);
    const audit = await suite.t.db('audit_events').where({ tenant_id: lab.id, action: 'quarantine.bulk-reread' });
    expect(audit).toHaveLength(1);
  });
});
