import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { execFileSync } from 'node:child_process';

/**
 * Debian's Chromium driven by playwright-core (no browser download). Flags keep it off the
 * network: this machine has none beyond loopback, and Chromium's background services would
 * otherwise keep trying.
 */
export async function launchBrowser(): Promise<{ context: BrowserContext; close(): Promise<void> }> {
  const executablePath = process.env.CHROMIUM_PATH || execFileSync('sh', ['-c', 'command -v chromium'], { encoding: 'utf8' }).trim();
  const userDataDir = mkdtempSync(join(tmpdir(), 'lagbook-chromium-'));
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath,
    headless: true,
    viewport: { width: 1280, height: 800 },
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  return {
    context,
    async close() {
      await context.close();
      rmSync(userDataDir, { recursive: true, force: true });
    },
  };
}

/** Saves a screenshot as a test artifact under test-results/e2e/. */
export async function keepScreenshot(page: Page, name: string): Promise<string> {
  const dir = join(process.env.LAGBOOK_ARTIFACTS_DIR ?? 'test-results', 'e2e');
  mkdirSync(dir, { recursive: true });
  const file = join(dir, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** Fills and submits the identity provider stand-in's login form. */
export async function signInAtProvider(page: Page, account: { email: string; password: string }): Promise<void> {
  await page.locator('#email').fill(account.email);
  await page.locator('#password').fill(account.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/**
 * From Lagbook's sign-in page through the identity provider's login and consent, back into
 * Lagbook signed in (waits for the signed-in name in the app shell).
 */
export async function signInThroughLagbook(page: Page, appUrl: string, issuer: string, account: { email: string; password: string }): Promise<void> {
  await page.goto(`${appUrl}/sign-in`);
  await page.getByRole('link', { name: "Continue with your institution's account" }).click();
  await page.waitForURL((u) => u.href.startsWith(issuer));
  await signInAtProvider(page, account);
  await page.getByRole('button', { name: 'Allow' }).click();
  await page.getByTestId('signed-in-name').waitFor();
}
