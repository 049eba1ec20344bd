import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { TestApp } from '../support/test-app.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { keepScreenshot, signInAtProvider } from '../support/browser.ts';
import { DEV_ACCOUNTS, type DevAccount } from '../../tenants/demo/people.ts';
import { waitForMail } from '../../docker-free-scripts/mail-capture/read-captured-mail.ts';
import { slugFromName } from '../../server/contract/labs.ts';

const admin = DEV_ACCOUNTS.find((a) => a.role === 'admin')!;
const newcomer = DEV_ACCOUNTS.find((a) => a.role === 'none')!;

// A fictional lab, named afresh on every run so the test never collides with an earlier one.
const labName = `Quillmere Bog Station ${Date.now().toString(36)}`;
const slug = slugFromName(labName);

const suite = browserSuite();
let t: TestApp;
let appUrl: string;
beforeAll(() => {
  ({ t, appUrl } = suite);
});

const freshPage = () => suite.freshPage();

/** From Lagbook's sign-in page through the provider's login and consent, back into Lagbook. */
async function signInThroughProvider(page: Page, account: DevAccount): Promise<void> {
  await page.getByRole('link', { name: "Continue with your institution's account" }).click();
  await page.waitForURL((u) => u.href.startsWith(t.config.oidc.issuer));
  await signInAtProvider(page, account);
  await page.getByRole('button', { name: 'Allow' }).click();
  await page.waitForURL((u) => u.href.startsWith(appUrl) && !u.pathname.startsWith('/auth/'));
}

let joinLink = '';

describe('inviting someone into a new lab through the browser', () => {
  it('an admin creates a lab and invites the newcomer as technician; the mail carries the link', async () => {
    const page = await freshPage();
    await page.goto(`${appUrl}/`);
    await page.waitForURL(/\/sign-in/);
    await signInThroughProvider(page, admin);
    await page.getByTestId('signed-in-name').waitFor();

    // The lab switcher in the top band names the start page (no lab is open) and offers "Create a lab".
    await page.getByRole('button', { name: /^Start page (No lab yet|Go to a lab)/ }).click();
    await page.getByRole('link', { name: '+ Create a lab' }).click();
    await page.waitForURL(`${appUrl}/labs/new`);
    await page.getByLabel('Lab name').fill(labName);
    expect(await page.getByLabel('Address').inputValue()).toBe(slug);
    await keepScreenshot(page, 'invitation-create-lab');
    await page.getByRole('button', { name: 'Create lab' }).click();

    await page.waitForURL(`${appUrl}/labs/${slug}`);
    await page.getByRole('heading', { level: 1, name: labName }).waitFor();
    expect(await page.getByTestId('lab-role').textContent()).toBe('Your role: Admin');

    await page.getByRole('navigation', { name: 'Lab sections' }).getByRole('link', { name: 'Members' }).click();
    await page.waitForURL(`${appUrl}/labs/${slug}/members`);
    await page.getByLabel('E-mail address').fill(newcomer.email);
    await page.getByLabel('Role', { exact: true }).selectOption('technician');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText(`Invitation sent to ${newcomer.email}.`).waitFor();
    const pendingRow = page.getByRole('row').filter({ hasText: newcomer.email });
    await pendingRow.waitFor();
    expect(await pendingRow.getByRole('cell').nth(1).textContent()).toBe('Technician');
    await keepScreenshot(page, 'invitation-sent');

    const mail = await waitForMail(
      process.env.LAGBOOK_MAIL_CAPTURE_URL!,
      (m) => m.to.includes(newcomer.email) && m.subject === `Join ${labName} on Lagbook`,
      10_000,
    );
    const match = new RegExp(`${appUrl.replace(/[.:/]/g, '\\$&')}/join/${slug}/[A-Za-z0-9_-]+`).exec(mail.text ?? '');
    expect(match, `no join link in the mail text:\n${mail.text}`).not.toBeNull();
    joinLink = match![0];

    // Still signed in as the admin, the link is refused for this account with a way out.
    await page.goto(joinLink);
    await page.getByRole('heading', { name: `Join ${labName}` }).waitFor();
    expect(await page.getByRole('alert').textContent()).toContain(`This invitation was sent to ${newcomer.email}`);
    expect(await page.getByRole('button', { name: /^Accept/ }).count()).toBe(0);
    await page.getByRole('button', { name: `Sign out and use ${newcomer.email}` }).waitFor();
    await keepScreenshot(page, 'invitation-wrong-account');

    // "Sign out and use …" signs out of Lagbook and asks the provider for a fresh login, even
    // though the provider still remembers the admin.
    await page.getByRole('button', { name: `Sign out and use ${newcomer.email}` }).click();
    await page.waitForURL((u) => u.href.startsWith(t.config.oidc.issuer));
    await page.locator('#password').waitFor();
    await keepScreenshot(page, 'invitation-switch-account');
    await page.close();
  });

  it('the newcomer opens the link signed out, signs in at the provider, accepts and lands in the lab as Technician', async () => {
    expect(joinLink).not.toBe('');
    const page = await freshPage();
    await page.goto(joinLink);
    const joinPath = new URL(joinLink).pathname;
    await page.waitForURL(`${appUrl}/sign-in?returnTo=${encodeURIComponent(joinPath)}`);
    await signInThroughProvider(page, newcomer);
    await page.waitForURL(joinLink);

    await page.getByRole('heading', { name: `Join ${labName}` }).waitFor();
    const main = page.getByRole('main');
    expect(await main.getByText(admin.name, { exact: true }).isVisible()).toBe(true);
    expect(await main.getByText('Technician', { exact: true }).isVisible()).toBe(true);
    await keepScreenshot(page, 'invitation-accept');
    // The provider vouches for the newcomer's address (email_verified), so no wrong-account offer may appear.
    expect(
      await main.getByRole('button', { name: /^Sign out and use/ }).count(),
      'the invitation was not matched to the signed-in newcomer: the server saw no verified e-mail for them',
    ).toBe(0);
    await page.getByRole('button', { name: `Accept and join ${labName}` }).click();

    await page.waitForURL(`${appUrl}/labs/${slug}`);
    await page.getByRole('heading', { level: 1, name: labName }).waitFor();
    expect(await page.getByTestId('lab-role').textContent()).toBe('Your role: Technician');
    // A technician sees no audit log section.
    const sections = page.getByRole('navigation', { name: 'Lab sections' }).getByRole('link');
    expect(await sections.allTextContents()).toEqual(['Overview', 'Channels', 'Alerts', 'Notes', 'Loggers', 'Quarantine', 'Members', 'API tokens']);
    await keepScreenshot(page, 'invitation-joined-as-technician');

    // The link is single use.
    await page.goto(joinLink);
    await page.getByRole('heading', { name: 'This invitation has already been used' }).waitFor();
    await page.close();
  });

  it('the admin sees the acceptance in the audit log and the newcomer among the members', async () => {
    const page = await freshPage();
    await page.goto(`${appUrl}/labs/${slug}/audit?action=invitation.accepted`);
    await page.waitForURL(/\/sign-in\?returnTo=/);
    await signInThroughProvider(page, admin);
    await page.waitForURL(`${appUrl}/labs/${slug}/audit?action=invitation.accepted`);

    const rows = page.getByRole('table', { name: 'Audit log entries, newest first' }).getByRole('row').filter({ hasText: 'Invitation accepted' });
    await rows.first().waitFor();
    expect(await rows.count()).toBe(1);
    expect(await rows.first().textContent()).toContain(newcomer.name);
    expect(await page.getByLabel('Action').inputValue()).toBe('invitation.accepted');
    await keepScreenshot(page, 'invitation-audit-log');

    await page.getByRole('navigation', { name: 'Lab sections' }).getByRole('link', { name: 'Members' }).click();
    expect(await page.getByLabel(`Role of ${newcomer.name}`).inputValue()).toBe('technician');
    await page.close();
  });
});
