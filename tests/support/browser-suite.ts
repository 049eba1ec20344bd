import { afterAll, beforeAll } from 'vitest';
import type { Page } from 'playwright-core';
import { buildTestApp, type TestApp } from './test-app.ts';
import { launchBrowser } from './browser.ts';

/**
 * The set-up every browser test file shares: the real app listening on the configured port
 * and one Debian Chromium, both started before the file's tests and closed after them.
 * Call at the top of a test file; read the fields inside hooks and tests.
 */
export function browserSuite() {
  const suite = {} as {
    t: TestApp;
    appUrl: string;
    browser: Awaited<ReturnType<typeof launchBrowser>>;
    /** A page in a browser with no cookies at all (neither Lagbook's nor the provider's). */
    freshPage(): Promise<Page>;
  };
  suite.freshPage = async () => {
    await suite.browser.context.clearCookies();
    return suite.browser.context.newPage();
  };
  beforeAll(async () => {
    suite.t = await buildTestApp();
    suite.appUrl = await suite.t.listen();
    suite.browser = await launchBrowser();
  });
  afterAll(async () => {
    await suite.browser?.close();
    await suite.t?.close();
  });
  return suite;
}
