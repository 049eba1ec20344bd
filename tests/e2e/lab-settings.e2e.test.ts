import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { buildLab, type TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { signInAsMemberOfNewLab } from '../support/browser-lab-member.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const admin = DEV_ACCOUNTS.find((a) => a.role === 'admin')!;
// Fictional labs, named afresh on every run: a lichen survey, and a copy of it made by mistake.
const run = Date.now().toString(36);

const s = browserSuite();
let page: Page;
let lab: TestLab;
let mistaken: TestLab;

beforeAll(async () => {
  page = await s.freshPage();
  lab = await signInAsMemberOfNewLab(s.t, page, s.appUrl, admin, { name: `Crag lichen survey ${run}`, role: 'admin' });
  mistaken = await buildLab(s.t.db, { name: `Crag lichen survey copy ${run}` });
  const user = await s.t.db('users').where({ oidc_subject: admin.sub }).first('id');
  await s.t.db('memberships').insert({ tenant_id: mistaken.id, user_id: user.id, role: 'admin' });
});

describe('lab settings in the browser', () => {
  it('an admin renames a lab and describes it; the address stays', async () => {
    await page.goto(`${s.appUrl}/labs/${lab.slug}`);
    await page.getByRole('navigation', { name: 'Lab sections' }).getByRole('link', { name: 'Lab settings' }).click();
    await page.waitForURL(`${s.appUrl}/labs/${lab.slug}/settings`);
    await page.getByText(`stays /labs/${lab.slug} when you rename it`).waitFor();
    await page.getByLabel('Lab name').fill(`Crag and scree lichen survey ${run}`);
    await page.getByLabel('Description', { exact: true }).fill('Lichen cover and rock temperature on the north crag.\nLoggers in the scree hut.');
    await page.getByRole('button', { name: 'Save name and description' }).click();
    await page.getByText('Saved.').waitFor();
    await keepScreenshot(page, 'lab-settings-renamed');
    const row = await s.t.db('labs').where({ id: lab.id }).first('slug', 'name', 'description');
    expect(row).toEqual({
      slug: lab.slug,
      name: `Crag and scree lichen survey ${run}`,
      description: 'Lichen cover and rock temperature on the north crag.\nLoggers in the scree hut.',
    });
    // a name that is too short is refused on the field, nothing saved
    await page.getByLabel('Lab name').fill('C');
    await page.getByRole('button', { name: 'Save name and description' }).click();
    await page.getByText('must be at least 2 characters').waitFor();
    expect((await s.t.db('labs').where({ id: lab.id }).first('name')).name).toBe(`Crag and scree lichen survey ${run}`);
  });

  it('an admin deletes the mistaken lab by typing its name, after being offered the export, and lands on the labs list', async () => {
    await page.goto(`${s.appUrl}/labs/${mistaken.slug}/settings`);
    const exportLink = page.getByRole('link', { name: 'Download the full export first' });
    expect(await exportLink.getAttribute('href')).toBe(`/api/v1/labs/${mistaken.slug}/export.zip`);
    const zip = await page.request.get(`${s.appUrl}/api/v1/labs/${mistaken.slug}/export.zip`);
    expect(zip.status()).toBe(200);
    expect((await zip.body()).subarray(0, 2).toString('latin1')).toBe('PK');

    await page.getByRole('button', { name: 'Delete this lab…' }).click();
    const confirm = page.getByRole('button', { name: 'Delete the lab for good' });
    await page.getByLabel('Type the lab’s name').fill(`Crag lichen survey ${run}`);
    expect(await confirm.isDisabled()).toBe(true);
    await page.getByLabel('Type the lab’s name').fill(mistaken.name);
    expect(await confirm.isDisabled()).toBe(false);
    await keepScreenshot(page, 'lab-settings-delete-confirm');
    await confirm.click();

    await page.waitForURL(`${s.appUrl}/`);
    await page.getByText(`The lab ${mistaken.name} was deleted.`).waitFor();
    await page.getByRole('link', { name: `Crag and scree lichen survey ${run}` }).waitFor();
    expect(await page.getByRole('link', { name: mistaken.name }).count()).toBe(0);
    await keepScreenshot(page, 'lab-settings-deleted-notice');
    expect((await s.t.db('labs').where({ id: mistaken.id }).first('deleted_at')).deleted_at).not.toBeNull();
    expect(await s.t.db('lab_deletions').where({ lab_id: mistaken.id }).first('lab_name')).toEqual({ lab_name: mistaken.name });

    // its address no longer opens
    await page.goto(`${s.appUrl}/labs/${mistaken.slug}`);
    await page.getByText('Lab not found or no access').waitFor();
  });
});
