import { beforeAll, describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import type { Page } from 'playwright-core';
import type { TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const technician = DEV_ACCOUNTS.find((a) => a.role === 'technician')!;

// A fictional logger at a fictional station, named afresh on every run.
const run = Date.now().toString(36);
const loggerName = `Reedbank mast ${run}`;

/**
 * A wide export of the fictional mast: a time column with a UTC offset, two channel columns
 * and a battery column that is not a channel, one reading every 10 minutes. One air
 * temperature cell reads "ERR" (a sensor fault), which must be quarantined with its line.
 */
const ROWS = 3000;
const BAD_ROW = 1234; // 0-based data row; the file line is BAD_ROW + 2 (1-based, after the header)
const START = Date.parse('2026-09-01T00:00:00+03:00');
function exportFile(): string {
  const lines = ['Timestamp,AirTemp_C,RH_pct,Batt_V'];
  for (let i = 0; i < ROWS; i++) {
    const local = new Date(START + i * 600_000 + 3 * 3600_000).toISOString().slice(0, 19);
    const air = i === BAD_ROW ? 'ERR' : (14 + 6 * Math.sin((2 * Math.PI * i) / 144)).toFixed(2);
    const rh = (70 + 15 * Math.cos((2 * Math.PI * i) / 144)).toFixed(1);
    lines.push(`${local}+03:00,${air},${rh},${(3.7 - i * 0.00002).toFixed(3)}`);
  }
  return `${lines.join('\n')}\n`;
}

const suite = browserSuite();
let page: Page;
let lab: TestLab;
let loggerId = 0;

beforeAll(async () => {
  page = await suite.freshPage();
  // Sign in once through the provider, so Lagbook creates the technician's user row; then
  // make that person a technician of a fresh lab.
  lab = await signInAsMemberOfNewLab(suite.t, page, suite.appUrl, technician, { name: `Reedbank Wetland Station ${run}`, role: 'technician' });
});

const digits = async (id: string) => Number(((await page.getByTestId(`summary-${id}`).textContent()) ?? '').replace(/\D/g, ''));

describe('registering a logger and uploading its history through the browser', () => {
  it('a technician registers a logger with two channels and sees its key once, with a command that works', async () => {
    await page.goto(`${suite.appUrl}/labs/${lab.slug}`);
    expect(await page.getByTestId('lab-role').textContent()).toBe('Your role: Technician');
    await page.getByRole('navigation', { name: 'Lab sections' }).getByRole('link', { name: 'Loggers' }).click();
    await page.getByText('No loggers yet.').waitFor();
    await page.getByRole('link', { name: 'Register a logger' }).click();
    await page.waitForURL(`${suite.appUrl}/labs/${lab.slug}/loggers/new`);

    await page.getByLabel('Name', { exact: true }).fill(loggerName);
    await page.getByLabel('Site').fill('Reed bed, north transect');
    await page.getByLabel('Time zone').selectOption('Africa/Nairobi');
    await page.getByLabel('Expected time between readings in seconds', { exact: true }).fill('600');
    await page.getByLabel('Channel key (1st channel)').fill('air_t');
    await page.getByLabel('Label (1st channel)').fill('Air temperature');
    await page.getByLabel('Unit (1st channel)').fill('°C');
    await page.getByLabel('Lowest valid value (1st channel)').fill('-40');
    await page.getByLabel('Highest valid value (1st channel)').fill('60');
    await page.getByRole('button', { name: '+ Add a channel' }).click();
    await page.getByLabel('Channel key (2nd channel)').fill('rh');
    await page.getByLabel('Label (2nd channel)').fill('Relative humidity');
    await page.getByLabel('Unit (2nd channel)').fill('%');
    await keepScreenshot(page, 'upload-register-logger');
    await page.getByRole('button', { name: 'Register logger' }).click();

    const key = (await page.getByTestId('issued-key').textContent())!;
    expect(key).toMatch(/^lbk_[0-9a-f]{12}_[A-Za-z0-9_-]{43}$/);
    await page.getByText('Lagbook keeps only a hash and cannot show it again').waitFor();
    await keepScreenshot(page, 'upload-key-shown-once');

    // The example command, as shown, stores one reading with the new key.
    const command = (await page.getByTestId('ingest-example').textContent())!;
    expect(command).toContain(`Bearer ${key}`);
    // Asynchronously: the app answers from this very process, so a blocking call would wait on itself.
    const { stdout } = await promisify(execFile)('bash', ['-c', command], { encoding: 'utf8', timeout: 20_000 });
    const answer = JSON.parse(stdout);
    expect(answer).toEqual({ accepted: 1, duplicates: 0, quarantined: [] });

    await page.getByRole('link', { name: /open the logger/ }).click();
    await page.waitForURL(/\/loggers\/\d+$/);
    loggerId = Number(new URL(page.url()).pathname.split('/').pop());
    await page.getByRole('heading', { name: loggerName, exact: true }).waitFor();
    // Shown once: the logger's page lists the key by its prefix only.
    const keysTable = page.getByRole('table', { name: 'Ingest keys of the logger' });
    await keysTable.waitFor();
    expect(await page.getByTestId('issued-key').count()).toBe(0);
    expect(await keysTable.getByText(`${key.slice(0, 17)}…`, { exact: true }).count()).toBe(1); // lbk_<prefix>_…
    expect(await keysTable.getByText(key).count()).toBe(0);
  });

  it('uploads a wide export, maps its columns, and gets the counts and the quarantined line', async () => {
    expect(loggerId).toBeGreaterThan(0);
    await page.getByRole('link', { name: 'Upload historical data' }).click();
    await page.waitForURL(`${suite.appUrl}/labs/${lab.slug}/loggers/${loggerId}/upload`);
    await page
      .getByLabel('Export file (CSV, up to 2 GB)')
      .setInputFiles({ name: 'reedbank-mast-2026-09.csv', mimeType: 'text/csv', buffer: Buffer.from(exportFile()) });
    await page.getByRole('table', { name: /First 10 rows of reedbank-mast-2026-09\.csv/ }).waitFor();
    expect(await page.getByLabel('Delimiter').inputValue()).toBe(',');
    expect(await page.getByLabel('Time column', { exact: true }).inputValue()).toBe('Timestamp');
    expect(await page.getByLabel('Time zone of times without offset').inputValue()).toBe('Africa/Nairobi');
    // None of the file's column names is a channel key: map two, skip the battery column.
    await page.getByLabel('Column “AirTemp_C”').selectOption('air_t');
    await page.getByLabel('Column “RH_pct”').selectOption('rh');
    expect(await page.getByLabel('Column “Batt_V”').inputValue()).toBe('');
    await keepScreenshot(page, 'upload-mapping');
    await page.getByRole('button', { name: 'Start the upload' }).click();

    await page.getByRole('region', { name: 'Import finished' }).waitFor({ timeout: 60_000 });
    expect({
      lines: await digits('lines'),
      readings: await digits('readings'),
      stored: await digits('stored'),
      duplicates: await digits('duplicates'),
      quarantined: await digits('quarantined'),
    }).toEqual({ lines: ROWS, readings: 2 * ROWS, stored: 2 * ROWS - 1, duplicates: 0, quarantined: 1 });
    const quarantinedRow = page.getByRole('region', { name: 'Import finished' }).getByRole('row').nth(1);
    expect(await quarantinedRow.getByRole('cell').allTextContents()).toEqual([String(BAD_ROW + 2), 'value: must be a finite number']);
    await keepScreenshot(page, 'upload-summary');
  });

  it('opens the quarantine filtered to the logger, fixes the bad row, re-submits it and sees it stored', async () => {
    await page.getByRole('link', { name: 'Review the quarantined rows' }).click();
    await page.waitForURL(`${suite.appUrl}/labs/${lab.slug}/quarantine?loggerId=${loggerId}`);
    expect(await page.getByLabel('Logger').inputValue()).toBe(String(loggerId));
    const table = page.getByRole('table', { name: 'Quarantined rows, newest first' });
    await table.getByText('ERR', { exact: true }).waitFor();
    expect(await table.getByRole('row').count()).toBe(2); // header + the one bad row
    const badTime = new Date(START + BAD_ROW * 600_000 + 3 * 3600_000).toISOString().slice(0, 19) + '+03:00';
    // A time that was read is kept in quarantine as ISO 8601 UTC (the line as sent stays in `raw`).
    const badTimeUtc = new Date(Date.parse(badTime)).toISOString();
    expect(await table.getByText(badTimeUtc, { exact: true }).count()).toBe(1);

    await table.getByRole('button', { name: /^Fix the reading of / }).click();
    const form = page.getByRole('form', { name: /^Fix the reading of / });
    await form.getByLabel('Value').fill('16.8');
    await keepScreenshot(page, 'upload-quarantine-fix');
    await form.getByRole('button', { name: 'Re-submit' }).click();

    await page.getByText('Re-submitted 1 row: 1 stored, 0 already stored, 0 quarantined again.').waitFor();
    await table.getByText('Nothing in quarantine here.').waitFor();
    await keepScreenshot(page, 'upload-quarantine-resubmitted');

    // The fixed reading is in the readings table at the instant of its line.
    const channel = await suite.t.db('channels').where({ tenant_id: lab.id, logger_id: loggerId, channel_key: 'air_t' }).first();
    const stored = await suite.t
      .db('readings')
      .where({ tenant_id: lab.id, channel_id: channel.id, ts: Date.parse(badTime) })
      .first();
    expect(stored?.value).toBe(16.8);
    const [{ n }] = await suite.t.db('readings').where({ tenant_id: lab.id }).count({ n: '*' });
    // 2 × 3000 cells − 1 bad + 1 fixed, plus the reading the example command sent.
    expect(Number(n)).toBe(2 * ROWS + 1);
  });

  it('uploads a day-first export after taking the layout the time preview recognises: nothing quarantined', async () => {
    // The same fictional mast's export as another program writes it: semicolons, day-first local times.
    const lines = ['Datum;AirTemp_C;RH_pct'];
    for (let i = 0; i < 96; i++) {
      const minutes = i * 15;
      lines.push(
        `24.11.2026 ${String(Math.floor(minutes / 60)).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')};${(9 + (i % 12) / 4).toFixed(2)};${80 - (i % 9)}`,
      );
    }
    await page.goto(`${suite.appUrl}/labs/${lab.slug}/loggers/${loggerId}/upload`);
    await page
      .getByLabel('Export file (CSV, up to 2 GB)')
      .setInputFiles({ name: 'reedbank-mast-2026-11.csv', mimeType: 'text/csv', buffer: Buffer.from(`${lines.join('\n')}\n`) });
    const times = page.getByRole('region', { name: 'How the times will be stored' });
    await times.getByText(/recognised from the first rows/).waitFor();
    await times.getByRole('button', { name: 'Read the times as day first, dd.mm.yyyy HH:mm[:ss]' }).click();
    expect(await page.getByLabel('Time format').inputValue()).toBe('day-first-dot');
    // Africa/Nairobi is UTC+3 all year (IANA tz database): 00:00 local is 21:00 UTC the day before.
    const firstRow = times.getByRole('row').nth(1);
    await firstRow.getByText('2026-11-23 21:00:00 UTC').waitFor();
    expect(await firstRow.getByRole('cell').allTextContents()).toEqual(['1', '24.11.2026 00:00', '2026-11-24 00:00:00', '2026-11-23 21:00:00 UTC', '']);
    await page.getByLabel('Column “AirTemp_C”').selectOption('air_t');
    await page.getByLabel('Column “RH_pct”').selectOption('rh');
    await keepScreenshot(page, 'upload-day-first-layout');
    await page.getByRole('button', { name: 'Start the upload' }).click();

    await page.getByRole('region', { name: 'Import finished' }).waitFor({ timeout: 60_000 });
    expect({ lines: await digits('lines'), stored: await digits('stored'), quarantined: await digits('quarantined') }).toEqual({
      lines: 96,
      stored: 192,
      quarantined: 0,
    });
    const channel = await suite.t.db('channels').where({ tenant_id: lab.id, logger_id: loggerId, channel_key: 'rh' }).first();
    const first = await suite.t
      .db('readings')
      .where({ tenant_id: lab.id, channel_id: channel.id })
      .where('ts', '>=', Date.UTC(2026, 10, 23, 21))
      .orderBy('ts')
      .first();
    expect(Number(first.ts)).toBe(Date.UTC(2026, 10, 23, 21, 0));
  });
});
