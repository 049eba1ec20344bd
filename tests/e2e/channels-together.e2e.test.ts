import { beforeAll, describe, expect, it } from 'vitest';
import { readFile } from 'node:fs/promises';
import type { Page } from 'playwright-core';
import type { TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { ingestBatch, type IncomingReading } from '../../server/services/ingest/ingest-batch.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const scientist = DEV_ACCOUNTS.find((a) => a.role === 'scientist')!;

// A fictional salt-marsh station, named afresh on every run, with invented readings (a behaviour
// test, not a numeric one): a mast on the dyke (Europe/Lisbon) measuring air temperature and
// humidity, and a tide-pool buoy (America/Halifax) measuring water temperature, every 10 min for
// two days. Three channels, two units: the chart must draw two value axes.
const run = Date.now().toString(36);
const STEP_MS = 600_000;
const N = 288;
const end = Math.floor(Date.now() / STEP_MS) * STEP_MS - STEP_MS;
const start = end - (N - 1) * STEP_MS;
const t = (i: number) => start + i * STEP_MS;
const air = (i: number) => Math.round((11 + 4 * Math.sin((2 * Math.PI * i) / 144)) * 100) / 100;
const humidity = (i: number) => Math.round((78 - 12 * Math.sin((2 * Math.PI * i) / 144)) * 10) / 10;
const water = (i: number) => Math.round((9 + 1.5 * Math.sin((2 * Math.PI * (i - 20)) / 144)) * 100) / 100;

const DYKE = `Dyke mast ${run}`;
const POOL = `Tide-pool buoy ${run}`;
const LINES = [`${DYKE} · Air temperature (°C)`, `${DYKE} · Relative humidity (%)`, `${POOL} · Water temperature (°C)`];

const suite = browserSuite();
let page: Page;
let lab: TestLab;
const ids: number[] = [];

beforeAll(async () => {
  page = await suite.freshPage();
  lab = await signInAsMemberOfNewLab(suite.t, page, suite.appUrl, scientist, { name: `Saltings Marsh ${run}`, role: 'scientist' });
  const loggers = createLoggersService({ db: suite.t.db });
  const technician = { ...lab, createdAt: new Date(), role: 'technician' as const };
  const dyke = await loggers.register(technician, null, {
    name: DYKE,
    site: 'Seaward dyke',
    timezone: 'Europe/Lisbon',
    expectedIntervalS: 600,
    channels: [
      { key: 'air_t', label: 'Air temperature', unit: '°C' },
      { key: 'rh', label: 'Relative humidity', unit: '%' },
    ],
  });
  const pool = await loggers.register(technician, null, {
    name: POOL,
    site: 'Lower creek',
    timezone: 'America/Halifax',
    expectedIntervalS: 600,
    channels: [{ key: 'water_t', label: 'Water temperature', unit: '°C' }],
  });
  ids.push(...dyke.logger.channels.map((c) => c.id), pool.logger.channels[0].id);
  const dykeRows: IncomingReading[] = [];
  const poolRows: IncomingReading[] = [];
  for (let i = 0; i < N; i++) {
    dykeRows.push(
      { index: dykeRows.length, channel: 'air_t', ts: t(i), value: air(i) },
      { index: dykeRows.length + 1, channel: 'rh', ts: t(i), value: humidity(i) },
    );
    poolRows.push({ index: i, channel: 'water_t', ts: t(i), value: water(i) });
  }
  for (const [loggerId, rows] of [
    [dyke.logger.id, dykeRows],
    [pool.logger.id, poolRows],
  ] as const) {
    const outcome = await ingestBatch(suite.t.db, { tenantId: lab.id, loggerId }, rows, { source: 'api' });
    expect(outcome.quarantined).toEqual([]);
  }
});

const chartReady = () => page.locator('figure[data-chart-ready="true"]').waitFor({ timeout: 30_000 });
const linesList = () => page.getByRole('list', { name: 'Lines on the chart' }).locator('li').allTextContents();

describe('several channels on one chart', () => {
  let shownUrl = '';
  let caption = '';

  it('picks three channels of two loggers in the channels table and opens them together: two units, two axes', async () => {
    await page.goto(`${suite.appUrl}/labs/${lab.slug}/channels`);
    const table = page.getByRole('table', { name: 'Channels of the lab' });
    await table.getByRole('link', { name: 'Water temperature' }).waitFor();
    for (const name of [`${DYKE} · Air temperature`, `${DYKE} · Relative humidity`, `${POOL} · Water temperature`])
      await page.getByRole('checkbox', { name: `Choose ${name}` }).check();
    expect(await page.getByTestId('chosen-count').textContent()).toBe('3 of 6 chosen');
    await keepScreenshot(page, 'channels-together-chosen');
    await page.getByRole('link', { name: 'Open together' }).click();
    await page.waitForURL((u) => u.pathname.endsWith('/channels/together') && u.searchParams.has('from'));
    const url = new URL(page.url());
    expect(url.searchParams.get('channels')).toBe(ids.join(','));
    await chartReady();
    expect(await linesList()).toEqual([
      `${LINES[0]}(green, solid, circles; axis °C, left)`,
      `${LINES[1]}(red-brown, long dashes, squares; axis %, right)`,
      `${LINES[2]}(slate blue, dots, triangles; axis °C, left)`,
    ]);
    expect(await page.getByTestId('together-zone').textContent()).toMatch(
      new RegExp(`^Times are shown in Europe/Lisbon \\(UTC\\+0[01]:00 in the middle of the range\\), the clock of ${DYKE}\\.$`),
    );
    caption = (await page.locator('figcaption').textContent()) ?? '';
    expect(caption).toMatch(new RegExp(`${LINES[0].replace(/[()]/g, '\\$&')}: ${N} readings, lowest 7 °C, highest 15 °C`));
    expect(await page.getByRole('alert').count()).toBe(0);
    shownUrl = page.url();
    await keepScreenshot(page, 'channels-together');
    // back in the channels table the choice is still there
    await page.goBack();
    await page.getByRole('table', { name: 'Channels of the lab' }).waitFor();
    expect(await page.getByTestId('chosen-count').textContent()).toBe('3 of 6 chosen');
  });

  it('shows the same chart when the link is opened again (a fresh page load), and another clock from the URL', async () => {
    await page.goto(shownUrl);
    await chartReady();
    expect(page.url()).toBe(shownUrl);
    expect(await page.locator('figcaption').textContent()).toBe(caption);
    expect((await linesList()).length).toBe(3);
    await page.getByLabel('Show times in').selectOption('America/Halifax');
    await page.waitForURL((u) => u.searchParams.get('zone') === 'America/Halifax');
    await chartReady();
    // the page re-renders after the address changes; wait for the new clock before reading the sentence (a busy machine is slow)
    await page.getByTestId('together-zone').filter({ hasText: 'America/Halifax' }).waitFor({ timeout: 15_000 });
    expect(await page.getByTestId('together-zone').textContent()).toMatch(
      /^Times are shown in America\/Halifax \(UTC−0[34]:00 .*\), the clock of Tide-pool buoy/,
    );
  });

  it('downloads exactly the plotted points as CSV, and the chart as PNG', async () => {
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download what is shown (CSV)' }).click()]);
    expect(download.suggestedFilename()).toBe(`${lab.slug}-channels-together.csv`);
    const text = await readFile(await download.path(), 'utf8');
    const [head, ...rows] = text.split('\r\n').filter(Boolean);
    expect(head).toBe(['time on the clock of America/Halifax', 'time in UTC', ...LINES.map((l) => `${l} · raw readings`)].join(','));
    // Every seeded reading lies in the default range (the last 7 days) and is drawn raw: one row per instant.
    expect(rows).toHaveLength(N);
    rows.forEach((line, i) => {
      const cells = line.split(',');
      expect(cells[1]).toBe(new Date(t(i)).toISOString());
      expect(cells[0]).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:00-0[34]:00$/);
      expect(Date.parse(cells[0])).toBe(t(i));
      expect(cells.slice(2).map(Number)).toEqual([air(i), humidity(i), water(i)]);
    });
    const [png] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: /as PNG$/ }).click()]);
    expect(png.suggestedFilename()).toBe(`${lab.slug}-channels-together.png`);
    expect((await readFile(await png.path())).subarray(1, 4).toString('latin1')).toBe('PNG');
  });

  it('fits a 390 px wide screen without sideways scrolling', async () => {
    await page.setViewportSize({ width: 390, height: 844 });
    await page.reload();
    await chartReady();
    expect(await page.evaluate<number>('document.documentElement.scrollWidth')).toBeLessThanOrEqual(390);
    await keepScreenshot(page, 'channels-together-390px');
    await page.setViewportSize({ width: 1280, height: 800 });
  });

  it('says what a bad link left out and what it drew, never a blank page', async () => {
    const q = new URLSearchParams({ channels: `${ids[2]},nine,999999999,${ids[0]}`, from: 'soon', to: '5', zone: 'Mars/Olympus' });
    await page.goto(`${suite.appUrl}/labs/${lab.slug}/channels/together?${q}`);
    const alert = page.getByRole('alert');
    await page.getByTestId('together-kept').waitFor();
    const items = await alert.locator('li').allTextContents();
    expect(items).toEqual([
      'channels: “nine” is not a channel number; left out.',
      'from: “soon” is not a time in epoch milliseconds; showing the last 7 days instead.',
      'channels: this lab has no channel 999999999; left out.',
      'zone: “Mars/Olympus” is neither a zone of these channels’ loggers nor UTC; showing America/Halifax.',
    ]);
    expect(await page.getByTestId('together-kept').textContent()).toBe(`Drawn: ${LINES[2]}; ${LINES[0]}.`);
    await chartReady();
    await keepScreenshot(page, 'channels-together-bad-link');
  });
});
