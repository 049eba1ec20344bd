import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { ingestBatch, type IncomingReading } from '../../server/services/ingest/ingest-batch.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const scientist = DEV_ACCOUNTS.find((a) => a.role === 'scientist')!;

// A fictional mangrove creek gauge, named afresh on every run, with simulated water level every
// 10 minutes for seven days (a behaviour test: a tidal-looking cycle). Its logger keeps the clock of
// Asia/Kolkata, UTC+05:30 all year (IANA time zone database), so a local midnight is 18:30 UTC and
// an axis ticking at UTC midnights would put its day marks at 05:30.
const run = Date.now().toString(36);
const STEP_MS = 600_000;
const N = 7 * 144;
const ZONE = 'Asia/Kolkata';
const OFFSET_MS = 5.5 * 3_600_000;
const DAY_MS = 86_400_000;

/** `YYYY-MM-DD` of the day `ms` falls on in Kolkata (fixed offset, so plain arithmetic is exact). */
const kolkataDay = (ms: number) => new Date(ms + OFFSET_MS).toISOString().slice(0, 10);

const suite = browserSuite();
let page: Page;
let lab: TestLab;
let channelId = 0;

beforeAll(async () => {
  page = await suite.freshPage();
  // every call ECharts makes to draw text on its canvas, with where it lands (CSS pixels of the canvas)
  await page.addInitScript(`(() => {
    window.__drawnText = [];
    const fillText = CanvasRenderingContext2D.prototype.fillText;
    CanvasRenderingContext2D.prototype.fillText = function (text, x, y, ...rest) {
      const m = this.getTransform();
      const dpr = window.devicePixelRatio || 1;
      window.__drawnText.push({ text: String(text), x: (m.a * x + m.c * y + m.e) / dpr });
      return fillText.call(this, text, x, y, ...rest);
    };
  })()`);
  lab = await signInAsMemberOfNewLab(suite.t, page, suite.appUrl, scientist, { name: `Creek mouth survey ${run}`, role: 'scientist' });
  await onLargestPlan(suite.t.db, lab.id);
  const { logger } = await createLoggersService({ db: suite.t.db }).register({ ...lab, createdAt: new Date(), role: 'technician' }, null, {
    name: `Creek gauge ${run}`,
    site: 'Mangrove creek, footbridge',
    timezone: ZONE,
    expectedIntervalS: 600,
    channels: [{ key: 'level', label: 'Water level', unit: 'cm', validMin: 0, validMax: 400 }],
  });
  channelId = logger.channels[0].id;
  const end = Math.floor(Date.now() / STEP_MS) * STEP_MS;
  const start = end - (N - 1) * STEP_MS;
  const rows: IncomingReading[] = Array.from({ length: N }, (_, i) => ({
    index: i,
    channel: 'level',
    ts: start + i * STEP_MS,
    value: Math.round((150 + 60 * Math.sin((2 * Math.PI * i) / 74.5)) * 10) / 10,
  }));
  const outcome = await ingestBatch(suite.t.db, { tenantId: lab.id, loggerId: logger.id }, rows, { source: 'api' });
  expect(outcome.quarantined).toEqual([]);
});

describe('the channel page’s own date-time input and the chart’s day ticks', () => {
  it('takes a range typed on the logger’s clock, names a date that does not exist, and the axis ticks at Kolkata midnights', async () => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.goto(`${suite.appUrl}/labs/${lab.slug}/channels/${channelId}`);
    const readings = page.getByRole('region', { name: 'Readings' });
    await expect.poll(async () => readings.locator('figure[data-chart-ready="true"]').count(), { timeout: 30_000 }).toBe(1);

    const form = page.getByRole('form', { name: 'Custom range' });
    // text fields of Lagbook's own, never the browser's pickers
    expect(await form.locator('input[type="date"], input[type="datetime-local"], input[type="time"]').count()).toBe(0);
    expect(await form.getByText(`${ZONE}, UTC+05:30`).count()).toBe(2);

    // from 12:00 five days ago to 06:00 yesterday, on the logger's clock: Kolkata midnights of the four days after the first
    const today = kolkataDay(Date.now());
    const dayBefore = (n: number) => kolkataDay(Date.parse(`${today}T12:00:00Z`) - n * DAY_MS);
    const fromDay = dayBefore(5);
    const toDay = dayBefore(1);

    // a day that does not exist is named once the field is left
    const fromDate = form.getByLabel('From date');
    await fromDate.fill(`${fromDay.slice(0, 4)}-02-30`);
    await form.getByLabel('From time').focus();
    await form.getByText(`${fromDay.slice(0, 4)}-02-30 is not a date.`).waitFor();
    expect(await fromDate.getAttribute('aria-invalid')).toBe('true');

    // arrow up on the day part steps the day: typed one day early, stepped to the day wanted
    await fromDate.fill(dayBefore(6));
    await fromDate.focus();
    await fromDate.evaluate('(el) => el.setSelectionRange(9, 9)');
    await page.keyboard.press('ArrowUp');
    expect(await fromDate.inputValue()).toBe(fromDay);
    await form.getByLabel('From time').fill('12:00');
    await form.getByLabel('To date').fill(toDay);
    await form.getByLabel('To time').fill('06:00');
    await page.evaluate('window.__drawnText = []');
    await form.getByRole('button', { name: 'Show range' }).click();

    // the chart follows: its caption names the typed range on the logger's clock
    await readings.locator('figcaption', { hasText: `from ${fromDay} 12:00 to ${toDay} 06:00 (${ZONE}, UTC+05:30)` }).waitFor({ timeout: 30_000 });
    await expect.poll(async () => readings.locator('figure[data-chart-ready="true"]').count(), { timeout: 30_000 }).toBe(1);

    // the axis labels its ticks with the dates of the Kolkata midnights (the year on the first)
    const midnights = [4, 3, 2, 1].map(dayBefore);
    const wanted = [midnights[0], ...midnights.slice(1).map((d) => d.slice(5))];
    const drawn = await page.evaluate<Array<{ text: string; x: number }>>('window.__drawnText');
    const labels = wanted.map((w) => drawn.filter((d) => d.text === w).at(-1));
    expect(labels.map((l) => l?.text)).toEqual(wanted);
    // no day label at 05:30, where a tick at UTC midnight would fall
    expect(drawn.some((d) => d.text === '05:30')).toBe(false);
    // evenly spaced a day apart, and the first half a day after the range's start (12:00 → 00:00),
    // measured from the plot's left edge (the readings chart's grid starts 56 px into its canvas)
    const xs = labels.map((l) => l!.x);
    const spacing = (xs[3] - xs[0]) / 3;
    for (let i = 1; i < 4; i++) expect(Math.abs(xs[i] - xs[i - 1] - spacing), `label x: ${xs.join(', ')}`).toBeLessThan(2);
    expect(Math.abs(xs[0] - 56 - spacing / 2), `label x: ${xs.join(', ')}`).toBeLessThan(3);

    await form.scrollIntoViewIfNeeded();
    await keepScreenshot(page, 'date-time-input-range-and-day-ticks');
  });

  it('on a phone the range fields wrap without sideways scrolling, and a day can be picked from the month', async () => {
    await page.setViewportSize({ width: 390, height: 844 });
    const form = page.getByRole('form', { name: 'Custom range' });
    await form.getByLabel('From date').waitFor();
    await form.getByRole('button', { name: 'Pick the day from a month' }).first().click();
    const month = form.getByRole('group', { name: 'From: pick a day' });
    const fromDay = await form.getByLabel('From date').inputValue();
    expect(await month.getByRole('button', { name: fromDay }).getAttribute('aria-pressed')).toBe('true');
    // a finger-sized day (WCAG 2.2 SC 2.5.5's 44 px)
    const box = await month.getByRole('button', { name: fromDay }).boundingBox();
    expect(Math.min(box!.width, box!.height)).toBeGreaterThanOrEqual(44);
    const widths = await page.evaluate<{ doc: number; view: number }>('({ doc: document.documentElement.scrollWidth, view: window.innerWidth })');
    expect(widths.doc).toBeLessThanOrEqual(widths.view);
    await month.scrollIntoViewIfNeeded();
    await keepScreenshot(page, 'date-time-input-phone-month');
    // the first of the shown month, picked with the keyboard from the chosen day
    const first = `${fromDay.slice(0, 8)}01`;
    await month.getByRole('button', { name: fromDay }).focus();
    for (let i = Number(fromDay.slice(8)); i > 1; i--) await page.keyboard.press('ArrowLeft');
    await page.keyboard.press('Enter');
    expect(await form.getByLabel('From date').inputValue()).toBe(first);
    expect(await month.count()).toBe(0);
    await page.setViewportSize({ width: 1440, height: 900 });
  });
});
