import request from 'supertest';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, expect } from 'vitest';
import type { Page } from 'playwright-core';
import type { TestApp } from './test-app.ts';
import { keepScreenshot } from './browser.ts';
import { browserSuite } from './browser-suite.ts';
import { buildLab, buildMember, sessionCookieFor, type TestLab } from './factories.ts';
import { onLargestPlan } from './largest-plan.ts';
import { ingestBatch, type IncomingReading } from '../../server/services/ingest/ingest-batch.ts';

/**
 * A fictional lab for the whole-app browser walks (phone layout, accessibility), named afresh
 * on every run: a peat-bog station with one mast logging water-table depth and peat
 * temperature every 10 minutes for four days (simulated, for layout only — no numeric check
 * rests on it), three rows with unreadable times in quarantine, a bounds rule with an open
 * alert, a note, a personal token, a pending invitation and a second member.
 */
export interface SeededLab {
  lab: TestLab;
  /** The admin's session cookie (`name=value`). */
  cookie: string;
  loggerId: number;
  channelId: number;
  run: string;
}

const STEP_MS = 600_000;
const N = 4 * 144;

/** Seeds {@link SeededLab} through the app's own API and services (admin role: every page is visible). */
export async function seedMainPagesLab(t: TestApp): Promise<SeededLab> {
  const run = Date.now().toString(36);
  const lab = await buildLab(t.db, { name: `Marrowfen Peat Station ${run}` });
  await onLargestPlan(t.db, lab.id);
  const admin = await buildMember(t.db, lab, { role: 'admin', displayName: 'Oona Threlkeld' });
  await buildMember(t.db, lab, { role: 'technician', displayName: 'Bram Kellaway' });
  const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, admin.id);
  const api = (method: 'post' | 'get', path: string) => request(t.app)[method](`/api/v1/labs/${lab.slug}${path}`).set('Cookie', cookie);

  const made = await api('post', '/loggers')
    .send({
      name: `South transect mast ${run}`,
      site: 'Marrowfen, south transect, dipwell 4',
      timezone: 'Europe/Dublin',
      expectedIntervalS: 600,
      channels: [
        { key: 'wt_depth', label: 'Water-table depth', unit: 'cm', validMin: -80, validMax: 10 },
        { key: 'peat_t10', label: 'Peat temperature at 10 cm', unit: '°C', validMin: -10, validMax: 35 },
      ],
    })
    .expect(201);
  const logger = made.body.logger as { id: number; channels: { id: number; key: string }[] };
  const key: unknown = made.body.ingestKey?.key;
  const channelId = logger.channels.find((c) => c.key === 'wt_depth')!.id;

  const end = Math.floor(Date.now() / STEP_MS) * STEP_MS;
  const start = end - (N - 1) * STEP_MS;
  const rows: IncomingReading[] = [];
  for (let i = 0; i < N; i++) {
    const day = Math.sin((2 * Math.PI * i) / 144);
    rows.push({ index: rows.length, channel: 'wt_depth', ts: start + i * STEP_MS, value: Math.round((-22 - 0.02 * i + 1.5 * day) * 100) / 100 });
    rows.push({ index: rows.length, channel: 'peat_t10', ts: start + i * STEP_MS, value: Math.round((6 + 2.2 * day) * 100) / 100 });
  }
  const outcome = await ingestBatch(t.db, { tenantId: lab.id, loggerId: logger.id }, rows, { source: 'api' });
  expect(outcome.quarantined).toEqual([]);
  await api('post', '/alert-rules')
    .send({ name: `Water table too deep ${run}`, kind: 'bounds', channelId, params: { low: -34, high: null, holdS: 0 } })
    .expect(201);
  if (typeof key === 'string') {
    // one reading below the rule's low limit (the evaluator opens an alert) and three rows whose times nobody can read (quarantine)
    await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${key}`)
      .send({
        readings: [
          { channel: 'wt_depth', ts: end + STEP_MS, value: -34.2 },
          ...[1, 2, 3].map((i) => ({ channel: 'wt_depth', ts: `after the storm ${i}`, value: -20 })),
        ],
      })
      .expect(200);
  }

  const kinds = await api('get', '/note-kinds').expect(200);
  const kindList = (kinds.body.kinds ?? kinds.body) as { id: number; name: string }[];
  await api('post', '/notes')
    .send({ channelId, kindId: kindList[0].id, text: 'Dipwell cleared of sphagnum', start: start + 100 * STEP_MS, end: start + 104 * STEP_MS })
    .expect(201);
  await api('post', '/tokens').send({ name: 'Field tablet notebook', expiresInDays: 30 }).expect(201);
  await api('post', '/invitations')
    .send({ email: `field.assistant.${run}@example.org`, role: 'technician' })
    .expect(201);
  return { lab, cookie, loggerId: logger.id, channelId, run };
}

/** Signs the browser in with a session cookie (`name=value`) for `appUrl`. */
export async function useSessionCookie(page: Page, appUrl: string, cookie: string): Promise<void> {
  const at = cookie.indexOf('=');
  await page.context().clearCookies();
  await page.context().addCookies([{ name: cookie.slice(0, at), value: cookie.slice(at + 1), url: appUrl }]);
}

/** One main page of the app: its name (for messages and screenshots), its path and how to tell it has loaded. */
export interface MainPage {
  name: string;
  path: string;
  /** Waits until the page shows its content; may act on it (e.g. run the diagnostics). */
  ready: (page: Page) => Promise<void>;
  /** Keep a screenshot of the first screen only (the page is many screens long). */
  firstScreenOnly?: boolean;
}

const chartsReady = async (page: Page, count: number) =>
  expect.poll(async () => page.locator('figure[data-chart-ready="true"]').count(), { timeout: 30_000, interval: 250 }).toBeGreaterThanOrEqual(count);

/** The main content has rendered: a level-2 heading or more inside `main`, and no request in flight. */
async function settled(page: Page): Promise<void> {
  await page.locator('main h1, main h2').first().waitFor();
  await page.waitForLoadState('networkidle');
}

/** The names of {@link mainPages}, in their order (known before the lab is seeded, so tests can be declared per page). */
export const MAIN_PAGE_NAMES = [
  'lab-overview',
  'loggers',
  'logger',
  'upload',
  'channels',
  'channel',
  'diagnostics',
  'channels-together',
  'alerts',
  'notes',
  'quarantine',
  'members',
  'audit',
  'tokens',
  'billing',
  'settings',
  'account',
  'api-reference',
] as const;

/**
 * A walk over the main pages at one window size: the app and one browser (browserSuite), the
 * seeded lab (once per file), one page signed in as its admin. `open(name)` loads a main page,
 * waits until it is ready and keeps a screenshot named `<shots>-<name>`.
 */
export function mainPagesWalk(viewport: { width: number; height: number }, shots: string) {
  const suite = browserSuite();
  const walk = {
    suite,
    page: undefined as unknown as Page,
    seeded: undefined as unknown as SeededLab,
    async open(name: (typeof MAIN_PAGE_NAMES)[number]): Promise<void> {
      const target = mainPages(walk.seeded).find((p) => p.name === name)!;
      await walk.page.goto(`${suite.appUrl}${target.path}`);
      await target.ready(walk.page);
      if (target.firstScreenOnly) {
        // a very long page: a full-page capture of it runs past the screenshot timeout on a busy machine
        const dir = join(process.env.LAGBOOK_ARTIFACTS_DIR ?? 'test-results', 'e2e');
        mkdirSync(dir, { recursive: true });
        await walk.page.screenshot({ path: join(dir, `${shots}-${name}.png`) });
      } else await keepScreenshot(walk.page, `${shots}-${name}`);
    },
  };
  beforeAll(async () => {
    walk.seeded = await seedMainPagesLab(suite.t);
    walk.page = await suite.freshPage();
    await walk.page.setViewportSize(viewport);
    await useSessionCookie(walk.page, suite.appUrl, walk.seeded.cookie);
  }, 120_000);
  return walk;
}

/** Every main page of the lab, in the order a person would walk them, as the seeded admin sees them. */
export function mainPages(s: SeededLab): MainPage[] {
  const lab = `/labs/${s.lab.slug}`;
  return [
    { name: 'lab-overview', path: lab, ready: settled },
    { name: 'loggers', path: `${lab}/loggers`, ready: async (p) => (await settled(p), await p.getByRole('table', { name: 'Loggers of the lab' }).waitFor()) },
    { name: 'logger', path: `${lab}/loggers/${s.loggerId}`, ready: settled },
    { name: 'upload', path: `${lab}/loggers/${s.loggerId}/upload`, ready: settled },
    {
      name: 'channels',
      path: `${lab}/channels`,
      ready: async (p) => (await settled(p), await p.getByRole('table', { name: 'Channels of the lab' }).waitFor()),
    },
    { name: 'channel', path: `${lab}/channels/${s.channelId}`, ready: async (p) => (await settled(p), await chartsReady(p, 1)) },
    {
      name: 'diagnostics',
      path: `${lab}/channels/${s.channelId}`,
      ready: async (p) => {
        await settled(p);
        const panel = p.getByRole('region', { name: 'Diagnostics' });
        await panel.getByRole('button', { name: 'Analyse' }).click();
        await panel.getByTestId('diagnostics-results').waitFor({ timeout: 60_000 });
        await chartsReady(p, 3);
        await panel.scrollIntoViewIfNeeded();
      },
    },
    {
      name: 'channels-together',
      path: `${lab}/channels/together?channels=${s.channelId},${s.channelId + 1}`,
      ready: async (p) => (await settled(p), await chartsReady(p, 1)),
    },
    { name: 'alerts', path: `${lab}/alerts`, ready: settled },
    { name: 'notes', path: `${lab}/notes`, ready: settled },
    { name: 'quarantine', path: `${lab}/quarantine`, ready: settled },
    { name: 'members', path: `${lab}/members`, ready: settled },
    { name: 'audit', path: `${lab}/audit`, ready: settled },
    { name: 'tokens', path: `${lab}/tokens`, ready: settled },
    { name: 'billing', path: `${lab}/billing`, ready: settled },
    { name: 'settings', path: `${lab}/settings`, ready: settled },
    { name: 'account', path: '/account', ready: settled },
    { name: 'api-reference', path: '/api-reference', ready: settled, firstScreenOnly: true },
  ];
}

/**
 * Elements whose right edge passes the viewport (the page would scroll sideways), widest
 * overrun first, each as `tag#id.class [data-testid] right=… width=…`; empty when the
 * document fits. Children of an element that already overruns are listed too, so the
 * deepest culprit is visible.
 */
export async function sidewaysOverflow(page: Page): Promise<{ docWidth: number; viewport: number; culprits: string[] }> {
  return page.evaluate(`(() => {
    const viewport = window.innerWidth;
    const docWidth = document.documentElement.scrollWidth;
    const found = [];
    for (const el of document.body.querySelectorAll('*')) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 || r.right <= viewport + 0.5) continue;
      // an element inside a box that scrolls sideways by itself is that box's business
      let inScroller = false;
      for (let a = el.parentElement; a && a !== document.body; a = a.parentElement) {
        const ox = getComputedStyle(a).overflowX;
        if (ox === 'auto' || ox === 'scroll' || ox === 'hidden' || ox === 'clip') { inScroller = true; break; }
      }
      if (inScroller) continue;
      const cls = typeof el.className === 'string' ? el.className.split(/\\s+/).filter(Boolean).slice(0, 4).join('.') : '';
      const tid = el.getAttribute('data-testid');
      const text = (el.textContent || '').trim().slice(0, 40);
      found.push({ right: r.right, label: el.tagName.toLowerCase() + (el.id ? '#' + el.id : '') + (cls ? '.' + cls : '') + (tid ? ' [data-testid=' + tid + ']' : '') + ' right=' + Math.round(r.right) + ' width=' + Math.round(r.width) + (text ? ' "' + text + '"' : '') });
    }
    found.sort((a, b) => b.right - a.right);
    return { docWidth, viewport, culprits: found.slice(0, 12).map((f) => f.label) };
  })()`);
}

/**
 * Interactive elements inside `main` smaller than `min` px in height or width (touch
 * targets), as readable lines. A checkbox or radio counts with the label around it; links
 * inside running text are exempt (WCAG 2.2 SC 2.5.8 "inline" exception), as are hidden ones.
 */
export async function smallTouchTargets(page: Page, min = 44): Promise<string[]> {
  return page.evaluate(`(() => {
    const min = ${min};
    const out = [];
    const sel = 'a[href], button, input:not([type=hidden]), select, textarea, summary, [role=button], [role=tab], [role=checkbox], [tabindex]:not([tabindex="-1"])';
    for (const el of document.querySelectorAll('main ' + sel.split(', ').join(', main '))) {
      const style = getComputedStyle(el);
      if (style.visibility === 'hidden' || style.display === 'none') continue;
      let r = el.getBoundingClientRect();
      if (r.width <= 1 || r.height <= 1) continue; // visually hidden (sr-only)
      if (el.closest('[aria-hidden="true"]')) continue;
      if ((el.type === 'checkbox' || el.type === 'radio') && el.closest('label')) r = el.closest('label').getBoundingClientRect();
      if (el.tagName === 'A' && style.display === 'inline') {
        const parent = el.parentElement;
        const own = (el.textContent || '').trim();
        const around = (parent && parent.textContent || '').trim();
        if (around.length > own.length + 3) continue; // a link inside a sentence
      }
      if (r.height + 0.5 >= min && r.width + 0.5 >= min) continue;
      const name = (el.getAttribute('aria-label') || el.textContent || el.getAttribute('name') || el.id || '').trim().replace(/\\s+/g, ' ').slice(0, 40);
      out.push(el.tagName.toLowerCase() + (el.type ? '[' + el.type + ']' : '') + ' "' + name + '" ' + Math.round(r.width) + '×' + Math.round(r.height));
    }
    return out;
  })()`);
}

/**
 * For the table captioned `tableName`: every body row must show a cell of each phone role in
 * `roles` (`td[data-phone=…]`, set by the client's TableView), visible and wholly inside the
 * viewport. Returns the problems as readable lines (empty when all is well).
 */
export async function stackedRowProblems(page: Page, tableName: string, roles: string[]): Promise<string[]> {
  return page.evaluate(`(() => {
    const tableName = ${JSON.stringify(tableName)};
    const roles = ${JSON.stringify(roles)};
    const table = [...document.querySelectorAll('table')].find((t) => t.querySelector('caption')?.textContent === tableName);
    if (!table) return ['no table named ' + tableName];
    const problems = [];
    const rows = [...table.querySelectorAll('tbody tr')];
    if (rows.length === 0) problems.push('no rows');
    rows.forEach((tr, i) => {
      for (const role of roles) {
        const cell = tr.querySelector('td[data-phone="' + role + '"]');
        const r = cell && cell.getBoundingClientRect();
        if (!r || r.width === 0 || r.height === 0) problems.push('row ' + (i + 1) + ': no visible ' + role + ' cell');
        else if (r.left < 0 || r.right > window.innerWidth + 0.5) problems.push('row ' + (i + 1) + ': ' + role + ' cell spans ' + Math.round(r.left) + '–' + Math.round(r.right) + ' px');
      }
    });
    return problems;
  })()`);
}
