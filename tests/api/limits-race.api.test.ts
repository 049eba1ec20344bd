import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, testConfig, type TestApp } from '../support/test-app.ts';
import { buildLab, buildMember, sessionCookieFor, type TestLab } from '../support/factories.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import type { LabContext } from '../../server/services/lab-context.ts';

/**
 * Plan limits under races (issue 15, findings 5 and 6): 10 concurrent requests, 20 rounds, each
 * round on a new lab. Two app instances with their own connection pools stand for two app
 * processes; requests alternate between them, so nothing held in one process's memory can be
 * what keeps a limit.
 */
const ROUNDS = 20;
const PARALLEL = 10;
// The free plan's limits for this file: readings small enough that 10 batches of 150 pass it.
const READINGS_LIMIT = 1000;
const BATCH = 150;
const QUARANTINE_CAP = 5;

function catalogWithFreeLimits(limits: { readings: number; quarantinedRows: number }): string {
  const shipped = JSON.parse(readFileSync('tenants/plans.json', 'utf8')) as { plans: Array<{ priceLookupKey: string | null; limits: Record<string, number> }> };
  const free = shipped.plans.find((p) => p.priceLookupKey === null)!;
  free.limits = { ...free.limits, ...limits };
  const path = join(mkdtempSync(join(tmpdir(), 'lagbook-race-plans-')), 'plans.json');
  writeFileSync(path, JSON.stringify(shipped));
  return path;
}

let a: TestApp;
let b: TestApp;
const apps = () => [a, b];

beforeAll(async () => {
  const plansFile = catalogWithFreeLimits({ readings: READINGS_LIMIT, quarantinedRows: QUARANTINE_CAP });
  const base = testConfig();
  a = await buildTestApp({ stripe: { ...base.stripe, plansFile } });
  b = await buildTestApp({ stripe: { ...base.stripe, plansFile } });
});
afterAll(async () => {
  await a?.close();
  await b?.close();
});

const labContext = (lab: TestLab): LabContext => ({ ...lab, createdAt: new Date(), role: 'admin' });
const loggerBody = (name: string) => ({ name, timezone: 'UTC', expectedIntervalS: 60, channels: [{ key: 'air_t', label: 'Air temperature', unit: '°C' }] });

/** A new lab with `n` loggers registered through the service (no plan check), each with an ingest key. */
async function labWithLoggers(n: number): Promise<{ lab: TestLab; keys: string[] }> {
  const lab = await buildLab(a.db);
  const loggers = createLoggersService({ db: a.db });
  const keys: string[] = [];
  for (let i = 0; i < n; i++) keys.push((await loggers.register(labContext(lab), null, loggerBody(`Mast ${i + 1}`))).issued.key);
  return { lab, keys };
}

/** A new lab with PARALLEL loggers, each posting its own batch at the same moment, alternating between the two apps. */
async function raceBatches(batchOf: (i: number) => Array<{ channel: string; ts: number; value: number | string }>) {
  const { lab, keys } = await labWithLoggers(PARALLEL);
  const answers = await Promise.all(
    keys.map((key, i) =>
      request(apps()[i % 2].app)
        .post('/api/v1/ingest')
        .set('Authorization', `Bearer ${key}`)
        .send({ readings: batchOf(i) }),
    ),
  );
  return { lab, answers };
}

const countIn = async (table: 'readings' | 'quarantined_rows' | 'loggers', labId: number, where: object = {}) =>
  Number(
    (
      await a
        .db(table)
        .where({ tenant_id: labId, ...where })
        .count({ n: '*' })
        .first()
    )?.n,
  );

describe('logger limit under concurrent registrations (shipped free plan: 10 loggers)', () => {
  it(`a lab with 9 loggers gets exactly 1 of ${PARALLEL} parallel registrations, ${ROUNDS} rounds`, async () => {
    const limit = 10;
    for (let round = 0; round < ROUNDS; round++) {
      const { lab } = await labWithLoggers(limit - 1);
      const admin = await buildMember(a.db, lab, { role: 'admin' });
      const cookie = await sessionCookieFor(a.db, a.config.sessionSecret, admin.id);
      const answers = await Promise.all(
        Array.from({ length: PARALLEL }, (_, i) =>
          request(apps()[i % 2].app)
            .post(`/api/v1/labs/${lab.slug}/loggers`)
            .set('Cookie', cookie)
            .send(loggerBody(`Racer ${i}`)),
        ),
      );
      const statuses = answers.map((r) => r.status).sort();
      expect(statuses, `round ${round}`).toEqual([201, ...Array(PARALLEL - 1).fill(402)]);
      expect(answers.find((r) => r.status === 402)!.body.error.code).toBe('plan_limit_reached');
      expect(await countIn('loggers', lab.id, { retired_at: null })).toBe(limit);
    }
  });
});

describe('readings limit under concurrent batches (free plan here: 1,000 readings)', () => {
  it(`${PARALLEL} concurrent batches of ${BATCH} from different loggers never store past the limit, ${ROUNDS} rounds`, async () => {
    const t0 = Math.floor(Date.now() / 3_600_000) * 3_600_000 - 86_400_000;
    for (let round = 0; round < ROUNDS; round++) {
      const { lab, answers } = await raceBatches((i) =>
        Array.from({ length: BATCH }, (_, j) => ({ channel: 'air_t', ts: t0 + j * 1000, value: i + j / 1000 })),
      );
      expect(
        answers.every((r) => r.status === 200 || r.status === 402),
        `round ${round}: ${answers.map((r) => r.status)}`,
      ).toBe(true);
      const acknowledged = answers.filter((r) => r.status === 200).reduce((sum, r) => sum + r.body.accepted, 0);
      const stored = await countIn('readings', lab.id);
      // The guarantee: stored ≤ limit (the issue asks for at most one batch over; this holds with none over).
      expect(stored, `round ${round}`).toBeLessThanOrEqual(READINGS_LIMIT);
      expect(stored).toBe(Math.floor(READINGS_LIMIT / BATCH) * BATCH); // every batch that fits is taken: no refusal too many
      expect(acknowledged).toBe(stored); // every 200 is stored, every 402 stored nothing
      const counted = Number((await a.db('lab_billing').where({ tenant_id: lab.id }).first('readings_count')).readings_count);
      expect(counted).toBe(stored);
    }
  });
});

describe('quarantine cap under concurrent batches (free plan here: 5 quarantined rows)', () => {
  it(`${PARALLEL} concurrent batches of 2 bad rows and 1 good keep at most 5 quarantined rows and store nothing of a refused batch, ${ROUNDS} rounds`, async () => {
    const t0 = Math.floor(Date.now() / 3_600_000) * 3_600_000 - 86_400_000;
    for (let round = 0; round < ROUNDS; round++) {
      const { lab, answers } = await raceBatches((i) => [
        { channel: 'air_t', ts: t0 + i, value: i },
        { channel: 'soil_t', ts: t0, value: 1 },
        { channel: 'air_t', ts: t0, value: 'warm' },
      ]);
      const ok = answers.filter((r) => r.status === 200).length;
      expect(
        answers.every((r) => r.status === 200 || r.status === 402),
        `round ${round}`,
      ).toBe(true);
      expect(ok, `round ${round}`).toBe(Math.floor(QUARANTINE_CAP / 2));
      expect(await countIn('quarantined_rows', lab.id)).toBe(2 * ok);
      expect(await countIn('readings', lab.id)).toBe(ok);
      const counted = Number((await a.db('lab_billing').where({ tenant_id: lab.id }).first('quarantined_count')).quarantined_count);
      expect(counted).toBe(2 * ok);
    }
  });
});
