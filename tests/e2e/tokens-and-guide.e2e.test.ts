import { beforeAll, describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import request from 'supertest';
import type { Page } from 'playwright-core';
import { buildLab, buildMember, sessionCookieFor, type TestLab } from '../support/factories.ts';
import { keepScreenshot } from '../support/browser.ts';
import { browserSuite } from '../support/browser-suite.ts';

/**
 * Personal tokens and the logger set-up guide, end to end in Debian's Chromium against the real
 * app and database: a scientist makes a token in the UI and a script uses it (reads: yes,
 * writes: no); a technician sends a test reading from a logger's set-up panel and sees it read
 * back; the curl example printed on that panel, run by bash with a real key, stores readings.
 * People sign in by a session cookie made for them (the OIDC sign-in itself is covered by
 * sign-in.e2e.test.ts).
 */
// A fictional lab and logger, named afresh on every run.
const run = Date.now().toString(36);

const suite = browserSuite();
let page: Page;
let lab: TestLab;
let techCookie: string;
let loggerId: number;

/** Signs the browser in as `cookie` (a `name=value` session cookie), replacing whoever was signed in. */
async function signInAs(cookie: string) {
  const [name, value] = [cookie.slice(0, cookie.indexOf('=')), cookie.slice(cookie.indexOf('=') + 1)];
  await suite.browser.context.clearCookies();
  await suite.browser.context.addCookies([{ name, value, url: suite.appUrl }]);
}

beforeAll(async () => {
  lab = await buildLab(suite.t.db, { name: `Quillmere Aquatics Lab ${run}` });
  const tech = await buildMember(suite.t.db, lab, { role: 'technician', displayName: 'Ines Varga' });
  techCookie = await sessionCookieFor(suite.t.db, suite.t.config.sessionSecret, tech.id);
  const made = await request(suite.t.app)
    .post(`/api/v1/labs/${lab.slug}/loggers`)
    .set('Cookie', techCookie)
    .send({
      name: `Tank room logger ${run}`,
      timezone: 'Europe/Berlin',
      expectedIntervalS: 60,
      channels: [
        { key: 'tank_t', label: 'Tank water temperature', unit: '°C', validMin: 0, validMax: 40 },
        { key: 'do.sat', label: 'Dissolved oxygen saturation', unit: '%', validMin: 0, validMax: 150 },
      ],
    })
    .expect(201);
  loggerId = made.body.logger.id;
  page = await suite.browser.context.newPage();
});

describe('personal tokens in the browser', () => {
  it('a scientist makes a token; a script reads the channels with it and is refused a write', async () => {
    const scientist = await buildMember(suite.t.db, lab, { role: 'scientist', displayName: 'Oren Malick' });
    await signInAs(await sessionCookieFor(suite.t.db, suite.t.config.sessionSecret, scientist.id));
    await page.goto(`${suite.appUrl}/labs/${lab.slug}`);
    await page.getByRole('navigation', { name: 'Lab sections' }).getByRole('link', { name: 'API tokens' }).click();
    await page.waitForURL(`${suite.appUrl}/labs/${lab.slug}/tokens`);
    await page.getByText('No tokens yet: make one for a notebook or a script.').waitFor();
    await page.getByLabel('What is it for?').fill('Tank notebook');
    await page.getByLabel('Expires after (days)').fill('30');
    await page.getByRole('button', { name: 'Make token' }).click();
    const token = (await page.getByTestId('issued-token').textContent())!;
    expect(token).toMatch(/^lbt_[0-9a-f]{12}_[A-Za-z0-9_-]{43}$/);
    await page.getByRole('table', { name: 'Your personal API tokens in this lab' }).getByText('Tank notebook').waitFor();
    expect(await page.getByTestId('lab-api-base').textContent()).toBe(`${suite.appUrl}/api/v1/labs/${lab.slug}`);
    expect(await page.getByTestId('notebook-python').textContent()).toContain(`BASE = "${suite.appUrl}/api/v1/labs/${lab.slug}"`);
    await keepScreenshot(page, 'tokens-made-once');

    // No cookie: only the token.
    const read = await fetch(`${suite.appUrl}/api/v1/labs/${lab.slug}/channels`, { headers: { Authorization: `Bearer ${token}` } });
    expect(read.status).toBe(200);
    expect(((await read.json()) as { channels: Array<{ key: string }> }).channels.map((c) => c.key).sort()).toEqual(['do.sat', 'tank_t']);
    const write = await fetch(`${suite.appUrl}/api/v1/labs/${lab.slug}/loggers`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
      body: JSON.stringify({ name: 'Sneaky', timezone: 'UTC', expectedIntervalS: 60 }),
    });
    expect(write.status).toBe(403);
    expect(((await write.json()) as { error: { code: string } }).error.code).toBe('token_not_allowed');

    // Hidden for good once dismissed.
    await page.getByRole('button', { name: 'I have copied it — hide the token' }).click();
    expect(await page.getByTestId('issued-token').count()).toBe(0);
    expect(await page.content()).not.toContain(token.slice(17));
  });

  it('the header’s API link opens the reference built from the server’s own document', async () => {
    await page.getByRole('link', { name: 'API', exact: true }).click();
    await page.waitForURL(`${suite.appUrl}/api-reference`);
    await page.getByRole('heading', { level: 1, name: 'Lagbook API' }).waitFor();
    // our own layout: a plain title per operation, its method and path as one monospace line, fields as definition lists
    const op = page.getByRole('article', { name: 'Send a test reading' });
    expect(await op.getByTestId('api-request-line').textContent()).toBe('POST /api/v1/labs/{lab}/loggers/{loggerId}/test-reading');
    expect(await op.getByTestId('api-who').textContent()).toContain('the permission loggers.manage');
    await op.getByTestId('api-details').locator('summary').click();
    expect(await op.locator('[data-testid="api-field"] code', { hasText: /^channel$/ }).count()).toBe(1);
    expect(await page.getByRole('link', { name: '/api/v1/openapi.json' }).getAttribute('href')).toBe('/api/v1/openapi.json');
    await keepScreenshot(page, 'api-reference');
    // at phone width the page stacks and never scrolls sideways
    const desktop = page.viewportSize()!;
    await page.setViewportSize({ width: 390, height: 844 });
    try {
      await op.scrollIntoViewIfNeeded();
      const widths = (await page.evaluate('({ doc: document.documentElement.scrollWidth, view: window.innerWidth })')) as { doc: number; view: number };
      expect(widths.doc).toBeLessThanOrEqual(widths.view);
      await keepScreenshot(page, 'api-reference-phone');
    } finally {
      await page.setViewportSize(desktop);
    }
    // A full page load of the reference reaches the client too.
    await page.reload();
    await page.getByRole('heading', { level: 1, name: 'Lagbook API' }).waitFor();
  });
});

describe('the logger set-up panel', () => {
  it('a technician sends a test reading and sees it kept as a test, apart from the channel’s readings', async () => {
    await signInAs(techCookie);
    await page.goto(`${suite.appUrl}/labs/${lab.slug}/loggers/${loggerId}`);
    await page.getByRole('heading', { name: 'Set up this logger' }).waitFor();
    expect(await page.getByTestId('ingest-endpoint').textContent()).toBe(`POST ${suite.appUrl}/api/v1/ingest`);
    await page.getByLabel('Channel', { exact: true }).selectOption('do.sat');
    await page.getByLabel('Value', { exact: true }).fill('87.25');
    await page.getByRole('button', { name: 'Send a test reading' }).click();
    expect(await page.getByTestId('would-get').textContent()).toBe('would be stored');
    expect(await page.getByTestId('kept-at').textContent()).toMatch(/^at \d{4}-\d\d-\d\d \d\d:\d\d:\d\d (UTC|UTC[+−]\d\d:\d\d)$/);
    await page.getByRole('button', { name: 'Remove test reading do.sat = 87.25' }).first().waitFor();
    await page.getByRole('table', { name: 'Recent test readings' }).waitFor();
    await keepScreenshot(page, 'logger-test-reading');
    const channel = await suite.t.db('channels').where({ tenant_id: lab.id, logger_id: loggerId, channel_key: 'do.sat' }).first();
    expect(await suite.t.db('readings').where({ tenant_id: lab.id, channel_id: channel.id })).toEqual([]);
    const kept = await suite.t.db('test_readings').where({ tenant_id: lab.id, channel_id: channel.id });
    expect(kept.map((r: { value: number }) => r.value)).toEqual([87.25]);
  });

  it('the curl example on the page, run as printed with a real key in $LAGBOOK_INGEST_KEY, stores a reading per channel', async () => {
    const issued = await request(suite.t.app)
      .post(`/api/v1/labs/${lab.slug}/loggers/${loggerId}/keys`)
      .set('Cookie', techCookie)
      .send({ rotate: false })
      .expect(201);
    const key: string = issued.body.ingestKey.key;
    const command = (await page.getByTestId('setup-curl').textContent())!;
    expect(command).toContain('$LAGBOOK_INGEST_KEY');
    expect(command).not.toContain(key);
    // Asynchronously: the app answers from this very process, so a blocking call would wait on itself.
    const { stdout } = await promisify(execFile)('bash', ['-c', command], {
      encoding: 'utf8',
      timeout: 20_000,
      env: { PATH: process.env.PATH ?? '', LAGBOOK_INGEST_KEY: key },
    });
    expect(JSON.parse(stdout)).toEqual({ accepted: 2, duplicates: 0, quarantined: [] });
    const ts = Date.parse(JSON.parse(/-d '([^']*)'/.exec(command)![1]).readings[0].ts);
    const rows = await suite.t
      .db('readings')
      .join('channels', function () {
        this.on('channels.tenant_id', 'readings.tenant_id').andOn('channels.id', 'readings.channel_id');
      })
      .where({ 'readings.tenant_id': lab.id, 'readings.ts': ts, 'channels.logger_id': loggerId })
      .select('channels.channel_key as key', 'readings.value as value');
    expect(rows.map((r: { key: string; value: number }) => [r.key, r.value]).sort()).toEqual([
      ['do.sat', 75],
      ['tank_t', 20],
    ]);
  });
});
