import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { ingestBatch, type IncomingReading } from '../../server/services/ingest/ingest-batch.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';
import { onLargestPlan } from '../support/largest-plan.ts';

const scientist = DEV_ACCOUNTS.find((a) => a.role === 'scientist')!;

// A fictional orchard plot, named afresh on every run. Simulated data (for a behaviour test, not
// a numeric one): drip irrigation runs in short random pulses; soil moisture answers each pulse
// exactly 24 steps (2 h) later on top of a daily drying cycle, so its cross-correlation with the
// flow peaks at lag +24.
const run = Date.now().toString(36);
const STEP_MS = 300_000;
const DAYS = 4;
const N = (DAYS * 86_400_000) / STEP_MS;
const LAG_STEPS = 24;

/** A seeded linear congruential generator (Numerical Recipes constants), so every run sees the same data. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

function simulate(): { flow: number[]; moisture: number[] } {
  const rnd = lcg(20260512);
  const flow = Array.from({ length: N }, () => (rnd() < 0.06 ? 80 + 120 * rnd() : 0));
  const moisture = flow.map((_, i) => {
    const daily = -2.5 * Math.sin((2 * Math.PI * i) / 288);
    const pulse = i >= LAG_STEPS ? 0.06 * flow[i - LAG_STEPS] : 0;
    return 28 + daily + pulse + 0.4 * (rnd() - 0.5);
  });
  return { flow, moisture };
}

const suite = browserSuite();
let page: Page;
let lab: TestLab;
let soilId = 0;

beforeAll(async () => {
  page = await suite.freshPage();
  // First sign-in creates the scientist's user row; then make that person a scientist of a fresh lab.
  lab = await signInAsMemberOfNewLab(suite.t, page, suite.appUrl, scientist, { name: `Quincewood Orchard ${run}`, role: 'scientist' });
  await onLargestPlan(suite.t.db, lab.id); // a year of readings: more history than the free plan shows

  // the logger is registered as a technician would (the scientist only reads)
  const { logger } = await createLoggersService({ db: suite.t.db }).register({ ...lab, createdAt: new Date(), role: 'technician' }, null, {
    name: `Row 7 mast ${run}`,
    site: 'Quince rows, east block',
    timezone: 'Europe/Lisbon',
    expectedIntervalS: 300,
    channels: [
      { key: 'drip_flow', label: 'Drip irrigation flow', unit: 'L/h', validMin: 0, validMax: 400 },
      { key: 'soil_vwc', label: 'Soil moisture', unit: '%', validMin: 0, validMax: 60 },
    ],
  });
  soilId = logger.channels.find((c) => c.key === 'soil_vwc')!.id;
  const { flow, moisture } = simulate();
  const end = Math.floor(Date.now() / STEP_MS) * STEP_MS;
  const start = end - (N - 1) * STEP_MS;
  const rows: IncomingReading[] = [];
  for (let i = 0; i < N; i++) {
    rows.push({ index: rows.length, channel: 'drip_flow', ts: start + i * STEP_MS, value: Math.round(flow[i] * 100) / 100 });
    rows.push({ index: rows.length, channel: 'soil_vwc', ts: start + i * STEP_MS, value: Math.round(moisture[i] * 1000) / 1000 });
  }
  for (let i = 0; i < rows.length; i += 1000) {
    const outcome = await ingestBatch(suite.t.db, { tenantId: lab.id, loggerId: logger.id }, rows.slice(i, i + 1000), { source: 'api' });
    expect(outcome.quarantined).toEqual([]);
  }
});

const chartsReady = (scope: ReturnType<Page['locator']>, count: number) =>
  expect.poll(async () => scope.locator('figure[data-chart-ready="true"]').count(), { timeout: 30_000, interval: 250 }).toBeGreaterThanOrEqual(count);

describe('browsing channels and reading their diagnostics', () => {
  it('lists the channels with status and sparkline, and opens one from the keyboard with visible focus', async () => {
    await page.goto(`${suite.appUrl}/labs/${lab.slug}`);
    await page.getByRole('navigation', { name: 'Lab sections' }).getByRole('link', { name: 'Channels' }).click();
    const table = page.getByRole('table', { name: 'Channels of the lab' });
    await table.getByRole('link', { name: 'Soil moisture' }).waitFor();
    expect(await table.getByRole('row').count()).toBe(3); // header + two channels
    expect(await table.locator('[data-status="live"]').count()).toBe(4); // two rows, two badges
    expect(await table.getByRole('img', { name: /Hourly means over the last 24 hours/ }).count()).toBe(2);
    await keepScreenshot(page, 'channels-table');

    // Keyboard: from the search field, Tab until a channel link has focus; it must show its focus ring.
    await page.getByLabel('Find').focus();
    let onLink = false;
    for (let i = 0; i < 30 && !onLink; i++) {
      await page.keyboard.press('Tab');
      // evaluated in the page (a string keeps DOM types out of the server-side type-check)
      onLink = await page.evaluate<boolean>("document.activeElement?.textContent === 'Soil moisture' && document.activeElement.tagName === 'A'");
    }
    expect(onLink).toBe(true);
    const focus = await page.evaluate<{ visible: boolean; outline: string; width: string }>(`(() => {
      const el = document.activeElement;
      const style = getComputedStyle(el);
      return { visible: el.matches(':focus-visible'), outline: style.outlineStyle, width: style.outlineWidth };
    })()`);
    expect(focus).toEqual({ visible: true, outline: 'solid', width: '3px' });
    await keepScreenshot(page, 'channels-keyboard-focus');
    await page.keyboard.press('Enter');
    await page.waitForURL(`${suite.appUrl}/labs/${lab.slug}/channels/${soilId}`);
  });

  it('draws the readings chart in the logger’s time zone', async () => {
    await page.getByRole('heading', { name: 'Soil moisture', level: 2 }).waitFor();
    expect(await page.getByText(/Europe\/Lisbon, UTC\+0[01]:00 now/).count()).toBe(1);
    const readings = page.getByRole('region', { name: 'Readings' });
    await chartsReady(readings, 1);
    expect(await readings.locator('figcaption').textContent()).toMatch(/^\d+ readings from .* \(Europe\/Lisbon, UTC\+0[01]:00\); lowest .* %, highest .* %\.$/);
    await keepScreenshot(page, 'channel-readings');
  });

  it('runs the diagnostics and shows the ACF, PACF and the decomposition', async () => {
    const panel = page.getByRole('region', { name: 'Diagnostics' });
    await panel.getByRole('button', { name: 'Analyse' }).click();
    await panel.getByTestId('diagnostics-results').waitFor({ timeout: 60_000 });
    await chartsReady(panel, 3); // ACF, PACF, decomposition
    expect(await panel.getByRole('img', { name: 'Autocorrelation function (ACF)' }).count()).toBe(1);
    expect(await panel.getByRole('img', { name: /^Seasonal decomposition \(STL, period \d+ steps\)/ }).count()).toBe(1);
    expect(
      await panel
        .getByRole('table', { name: /Ljung–Box tests/ })
        .getByRole('row')
        .count(),
    ).toBeGreaterThan(1);
    expect(await panel.getByTestId('verdict').textContent()).not.toBe('');
    expect(await panel.getByText('Method and parameters').count()).toBe(1);
    // the STL settings in plain words with the paper's symbols (Cleveland et al. 1990)
    const stl = panel.getByTestId('stl-settings');
    expect(await stl.textContent()).toMatch(/n\(p\)Cycle length\d+ steps.*n\(s\)Seasonal smoothing window/);
    await keepScreenshot(page, 'channel-diagnostics');
    // the process model fitted to what is left after the daily cycle, and the trend with both intervals
    const model = panel.getByTestId('process-model');
    await model.scrollIntoViewIfNeeded();
    expect(await model.getByTestId('process-model-chosen').textContent()).toMatch(/(AR|MA|ARMA)\(\d(,\d)?\)|white noise/i);
    expect(await model.getByTestId('process-model-candidates').getByRole('row').count()).toBeGreaterThan(10);
    expect(await model.getByTestId('process-model-sentence').textContent()).toMatch(/independent information about the mean\.$/);
    await keepScreenshot(page, 'channel-process-model');
    const trend = panel.getByTestId('trend');
    await trend.scrollIntoViewIfNeeded();
    expect(await trend.getByTestId('trend-sentence').textContent()).toMatch(/^Allowing for autocorrelation, Soil moisture/);
    expect(await trend.getByTestId('trend-hac').textContent()).toMatch(/Newey–West, lag \d+/);
    expect(await trend.getByTestId('trend-ols').count()).toBe(1);
    await keepScreenshot(page, 'channel-trend');
  });

  it('cross-correlates with the irrigation flow and states the lag in words', async () => {
    const panel = page.getByRole('region', { name: 'Cross-correlation' });
    expect(await panel.getByLabel('Compare with').inputValue()).not.toBe('');
    await panel.getByRole('button', { name: 'Cross-correlate' }).click();
    const sentence = panel.getByTestId('ccf-sentence');
    await sentence.waitFor({ timeout: 60_000 });
    expect(await sentence.textContent()).toMatch(
      /^After both channels were filtered by the AR\(\d+\) model of Drip irrigation flow .* at lag 24 \(2 h\), lies beyond the ±[0-9.]+ band that holds for all \d+ lags together \(Šidák over \d+ lags\): Soil moisture follows Drip irrigation flow by about 2 h, and the two move in the same direction\./,
    );
    await chartsReady(panel, 1);
    await keepScreenshot(page, 'channel-cross-correlation');
    await panel.getByLabel('Show the raw cross-correlation beside it').check();
    await panel.getByTestId('ccf-raw').waitFor();
    await chartsReady(panel, 2);
    await keepScreenshot(page, 'channel-cross-correlation-raw');
  });

  it('compares the mean of two ranges with an interval that allows for autocorrelation, beside Welch’s', async () => {
    const panel = page.getByRole('region', { name: 'Before and after' });
    await panel.scrollIntoViewIfNeeded();
    await panel.getByRole('button', { name: 'Compare' }).click();
    const result = panel.getByTestId('comparison-result');
    await result.waitFor({ timeout: 60_000 });
    expect(await panel.getByTestId('comparison-sentence').textContent()).toMatch(/^The mean of range b differs from Soil moisture in range a by /);
    expect(await panel.getByTestId('comparison-dependent').textContent()).not.toBe('');
    expect(await panel.getByTestId('comparison-welch').textContent()).not.toBe('');
    await keepScreenshot(page, 'channel-before-after');
  });
});
