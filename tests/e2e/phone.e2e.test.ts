import { describe, expect, it } from 'vitest';
import { seriousAxeFindings, describeAxeFindings } from '../support/axe.ts';
import { MAIN_PAGE_NAMES, mainPagesWalk, sidewaysOverflow, smallTouchTargets, stackedRowProblems } from '../support/main-pages.ts';

/**
 * Every main page on a phone (390 × 844 CSS px, a common handset size): nothing scrolls
 * sideways, the channels and loggers tables keep name, status and last value in view, touch
 * targets in the main content are at least 44 × 44 px (WCAG 2.2 SC 2.5.5's size; the inline
 * link exception of SC 2.5.8), and axe-core finds no serious or critical problem. One lab
 * seeded once; pages visited in sequence; a screenshot of each kept (phone-<page>.png).
 */
const walk = mainPagesWalk({ width: 390, height: 844 }, 'phone');

describe('every main page on a 390 × 844 phone', () => {
  for (const name of MAIN_PAGE_NAMES) {
    it(`${name}: no sideways scrolling, touch targets of 44 px, no serious accessibility problem`, async () => {
      await walk.open(name);
      const overflow = await sidewaysOverflow(walk.page);
      const small = await smallTouchTargets(walk.page);
      const axe = await seriousAxeFindings(walk.page);
      const problems = [
        overflow.docWidth > overflow.viewport
          ? `page is ${overflow.docWidth} px wide on a ${overflow.viewport} px screen; widest:\n  ${overflow.culprits.join('\n  ')}`
          : '',
        small.length ? `${small.length} touch target(s) under 44 px:\n  ${small.join('\n  ')}` : '',
        axe.length ? `axe-core: ${axe.length} serious/critical rule(s):\n${describeAxeFindings(axe)}` : '',
      ].filter(Boolean);
      expect(problems.join('\n'), name).toBe('');
    }, 120_000);
  }

  it('the channels table keeps each channel’s name, status and last value in view, and sorts from its phone menu', async () => {
    const { page } = walk;
    await walk.open('channels');
    await page.getByRole('table', { name: 'Channels of the lab' }).getByRole('link', { name: 'Water-table depth' }).waitFor();
    expect(await stackedRowProblems(page, 'Channels of the lab', ['title', 'status', 'value'])).toEqual([]);
    const sort = page.getByLabel('Sort by');
    const first = () => page.locator('table tbody tr td[data-phone="title"] a').first().textContent();
    await sort.selectOption({ label: 'Channel, descending' });
    expect(await first()).toBe('Water-table depth');
    await sort.selectOption({ label: 'Channel, ascending' });
    expect(await first()).toBe('Peat temperature at 10 cm');
  });

  it('the loggers table keeps each logger’s name, status and last seen in view', async () => {
    await walk.open('loggers');
    expect(
      await walk.page
        .getByRole('table', { name: 'Loggers of the lab' })
        .getByRole('link', { name: `South transect mast ${walk.seeded.run}` })
        .count(),
    ).toBe(1);
    expect(await stackedRowProblems(walk.page, 'Loggers of the lab', ['title', 'status', 'value'])).toEqual([]);
  });
});
