import { beforeAll, describe, expect, it } from 'vitest';
import type { TestApp } from '../support/test-app.ts';
import { browserSuite } from '../support/browser-suite.ts';
import { keepScreenshot, signInAtProvider } from '../support/browser.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const admin = DEV_ACCOUNTS.find((a) => a.role === 'admin')!;
const newcomer = DEV_ACCOUNTS.find((a) => a.role === 'none')!;

const suite = browserSuite();
let t: TestApp;
let appUrl: string;
beforeAll(() => {
  ({ t, appUrl } = suite);
});

const freshPage = () => suite.freshPage();

describe('signing in through the browser', () => {
  it('a signed-out visitor is sent to sign-in, signs in at the provider and sees their name', async () => {
    const page = await freshPage();
    await page.goto(`${appUrl}/`);
    await page.waitForURL(/\/sign-in/);
    await expect(page.getByRole('heading', { name: 'Sign in to your lab' }).isVisible()).resolves.toBe(true);
    await keepScreenshot(page, 'sign-in-page');

    await page.getByRole('link', { name: "Continue with your institution's account" }).click();
    await page.waitForURL((u) => u.href.startsWith(t.config.oidc.issuer));
    await keepScreenshot(page, 'provider-login');
    await signInAtProvider(page, admin);
    await page.getByRole('button', { name: 'Allow' }).click();

    await page.waitForURL(`${appUrl}/`);
    const name = page.getByTestId('signed-in-name');
    await name.waitFor();
    expect(await name.textContent()).toBe(admin.name);
    expect(await page.getByRole('heading', { name: `Welcome, ${admin.name}` }).isVisible()).toBe(true);
    await keepScreenshot(page, 'signed-in-home');

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in\?signedOut=1/);
    expect(await page.getByRole('status').textContent()).toContain('You are signed out.');
    await page.close();
  });

  it('a wrong password is refused at the provider with a clear message', async () => {
    const page = await freshPage();
    await page.goto(`${appUrl}/sign-in`);
    await page.getByRole('link', { name: "Continue with your institution's account" }).click();
    await signInAtProvider(page, { email: admin.email, password: 'wrong-password' });
    await page.getByText('That e-mail and password do not match a dev account.').waitFor();
    await keepScreenshot(page, 'provider-wrong-password');
    await page.close();
  });

  it('cancelled consent returns to Lagbook with a clear message and no account', async () => {
    await t.db('users').where({ email: newcomer.email }).delete();
    const page = await freshPage();
    await page.goto(`${appUrl}/sign-in`);
    await page.getByRole('link', { name: "Continue with your institution's account" }).click();
    await signInAtProvider(page, newcomer);
    await page.getByRole('button', { name: 'Deny' }).click();
    await page.waitForURL(`${appUrl}/sign-in?error=cancelled`);
    const alert = page.getByRole('alert');
    await alert.waitFor();
    expect(await alert.textContent()).toContain('Sign-in was cancelled at your identity provider');
    await keepScreenshot(page, 'sign-in-cancelled');
    const [{ n }] = await t.db('users').where({ email: newcomer.email }).count({ n: '*' });
    expect(Number(n)).toBe(0);
    await page.close();
  });
});
