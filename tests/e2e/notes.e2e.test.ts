import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { ingestBatch, type IncomingReading } from '../../server/services/ingest/ingest-batch.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const technician = DEV_ACCOUNTS.find((a) => a.role === 'technician')!;

// A fictional pond station, named afresh on every run. Simulated water temperature every 10
// minutes for three days (a behaviour test): a daily cycle, and a spike of +12 °C for half an
// hour while the probe was lifted out for cleaning.
const run = Date.now().toString(36);
const STEP_MS = 600_000;
const N = 3 * 144;
const ZONE = 'Europe/Berlin';

/** The `YYYY-MM-DDTHH:mm` wall-clock text for instant `ms` on the wall clock of `zone` (`2026-12-02T06:50`), from the platform's IANA data. */
function toZonedInput(ms: number, zone: string): string {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-GB', {
      timeZone: zone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    })
      .formatToParts(ms)
      .map((p) => [p.type, p.value]),
  );
  return `${parts.year}-${parts.month}-${parts.day}T${parts.hour}:${parts.minute}`;
}

const suite = browserSuite();
let page: Page;
let lab: TestLab;
let channelId = 0;
let cleaningFrom = 0;

beforeAll(async () => {
  page = await suite.freshPage();
  lab = await signInAsMemberOfNewLab(suite.t, page, suite.appUrl, technician, { name: `Alderpool Station ${run}`, role: 'technician' });
  const { logger } = await createLoggersService({ db: suite.t.db }).register({ ...lab, createdAt: new Date(), role: 'technician' }, null, {
    name: `Pond buoy ${run}`,
    site: 'Alder pool, jetty',
    timezone: ZONE,
    expectedIntervalS: 600,
    channels: [{ key: 'water_t', label: 'Water temperature', unit: '°C', validMin: -5, validMax: 40 }],
  });
  channelId = logger.channels[0].id;
  const end = Math.floor(Date.now() / STEP_MS) * STEP_MS;
  const start = end - (N - 1) * STEP_MS;
  cleaningFrom = start + 200 * STEP_MS;
  const rows: IncomingReading[] = Array.from({ length: N }, (_, i) => ({
    index: i,
    channel: 'water_t',
    ts: start + i * STEP_MS,
    value: Math.round((14 + 2 * Math.sin((2 * Math.PI * i) / 144) + (i >= 200 && i < 203 ? 12 : 0)) * 100) / 100,
  }));
  const outcome = await ingestBatch(suite.t.db, { tenantId: lab.id, loggerId: logger.id }, rows, { source: 'api' });
  expect(outcome.quarantined).toEqual([]);
});

describe('a note on a time range, through the browser', () => {
  it('a technician notes the cleaning from the channel page; the chart shades it with its words and diagnostics list it as left out', async () => {
    await page.goto(`${suite.appUrl}/labs/${lab.slug}/channels/${channelId}`);
    const readings = page.getByRole('region', { name: 'Readings' });
    await expect.poll(async () => readings.locator('figure[data-chart-ready="true"]').count(), { timeout: 30_000 }).toBe(1);
    await readings.getByText('No notes in this range.').waitFor();

    await readings.getByRole('button', { name: 'Add a note' }).click();
    const form = page.getByRole('form', { name: 'Add a note' });
    await form.getByLabel('Kind').selectOption({ label: 'maintenance' });
    await form.getByLabel('What happened').fill('Probe lifted out and cleaned');
    // Lagbook's own date-time input: a date field and a 24-hour time field per end of the span
    const [startDay, startTime] = toZonedInput(cleaningFrom, ZONE).split('T');
    const [endDay, endTime] = toZonedInput(cleaningFrom + 3 * STEP_MS, ZONE).split('T');
    await form.getByLabel('Starts date').fill(startDay);
    await form.getByLabel('Starts time').fill(startTime);
    await form.getByLabel('Ends date').fill(endDay);
    await form.getByLabel('Ends time').fill(endTime);
    await form.getByLabel(/Leave out of analysis/).check();
    await keepScreenshot(page, 'notes-add-form');
    await form.getByRole('button', { name: 'Add the note' }).click();

    const list = readings.getByRole('list', { name: 'Notes' });
    await list.getByText('Probe lifted out and cleaned').waitFor();
    expect(await list.getByText('left out of analysis').count()).toBe(1);
    // the chart is drawn again with the note shaded, and says so in its caption
    await readings.getByText('Shaded: 1 note (maintenance, left out: Probe lifted out and cleaned).').waitFor();
    await expect.poll(async () => readings.locator('figure[data-chart-ready="true"]').count(), { timeout: 30_000 }).toBe(1);
    await readings.scrollIntoViewIfNeeded();
    await keepScreenshot(page, 'notes-shaded-on-chart');

    // diagnostics leave the noted span out and say so in their method section
    const diagnostics = page.getByRole('region', { name: 'Diagnostics' });
    // the daily cycle as the season (144 steps of 10 minutes), so there is a decomposition to shade
    await diagnostics.getByLabel('Seasonal period').selectOption('manual');
    await diagnostics.getByLabel('Period (steps)').fill('144');
    await diagnostics.getByRole('button', { name: 'Analyse' }).click();
    await diagnostics.getByTestId('diagnostics-results').waitFor({ timeout: 60_000 });
    const applied = diagnostics.getByTestId('excluded-note');
    expect(await applied.count()).toBe(1);
    expect(await applied.textContent()).toContain('Probe lifted out and cleaned');
    // the decomposition shades the span too, and says so under the chart
    await diagnostics.getByText('Shaded: 1 span left out of the analysis (maintenance).', { exact: false }).waitFor();
    await applied.scrollIntoViewIfNeeded();
    await keepScreenshot(page, 'notes-in-diagnostics-method');

    // the same note in the database, on the channel, marked to be left out
    const rows = await suite.t.db('notes').where({ tenant_id: lab.id });
    expect(rows.map((r) => [Number(r.channel_id), Number(r.start_ts), Number(r.end_ts), Boolean(r.exclude_from_analysis)])).toEqual([
      [channelId, cleaningFrom, cleaningFrom + 3 * STEP_MS, true],
    ]);
  });
});
