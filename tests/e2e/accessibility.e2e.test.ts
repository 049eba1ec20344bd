import { describe, expect, it } from 'vitest';
import { keepScreenshot } from '../support/browser.ts';
import { seriousAxeFindings, describeAxeFindings } from '../support/axe.ts';
import { MAIN_PAGE_NAMES, mainPagesWalk } from '../support/main-pages.ts';

/**
 * Every main page at desktop size (1440 × 900): axe-core finds no serious or critical
 * problem, and a screenshot of each page is kept (desktop-<page>.png), the restyled controls
 * among them (the readings chart's zoom slider and the range's date-time inputs on the channel
 * page, the API reference). The phone pass is phone.e2e.test.ts.
 */
const walk = mainPagesWalk({ width: 1440, height: 900 }, 'desktop');

describe('every main page at 1440 × 900', () => {
  for (const name of MAIN_PAGE_NAMES) {
    it(`${name}: no serious or critical accessibility problem`, async () => {
      await walk.open(name);
      expect(describeAxeFindings(await seriousAxeFindings(walk.page)), name).toBe('');
    }, 120_000);
  }

  it('keeps a close-up of the readings panel: range controls, date-time inputs and the zoom slider', async () => {
    await walk.open('channel');
    const readings = walk.page.getByRole('region', { name: 'Readings' });
    expect(await readings.locator('figure[data-chart-ready="true"] canvas').count()).toBeGreaterThan(0);
    // the whole page, and the panel alone beside it
    const full = await keepScreenshot(walk.page, 'desktop-readings-controls');
    await readings.screenshot({ path: full.replace(/\.png$/, '-close-up.png') });
  });
});
