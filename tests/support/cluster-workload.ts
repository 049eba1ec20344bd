/**
 * The lab a cluster run works on (a fictional plant-growth facility): `chambers` growth-chamber
 * loggers with one air-temperature channel each, a reference logger whose soil temperature has
 * two days of one-minute readings (for diagnostics), a technician signed in to browse (and to make the rule), and —
 * when asked — a bounds rule on chamber 1 that the loggers' readings cross from time to time.
 * Everything is made through the app's own services and HTTP API on the target's writer.
 */
import { randomBytes } from 'node:crypto';
import { labsRepo } from '../../server/db/labs.repo.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { onLargestPlan } from './largest-plan.ts';
import { buildMember, sessionCookieFor, type TestUser } from './factories.ts';
import type { LoadTarget } from './cluster-stack.ts';

const MINUTE = 60_000;
/** One-minute readings seeded on the reference channel (a little over two days). */
export const REFERENCE_MINUTES = 3_000;
/** The chamber-1 rule's high limit (°C); the loggers' warm batches read above it. */
export const ALERT_HIGH = 30;

export interface ChamberLogger {
  /** 0-based; chamber 1 is index 0. */
  index: number;
  key: string;
  loggerId: number;
  channelId: number;
}

export interface WorkloadLab {
  tenantId: number;
  slug: string;
  chambers: ChamberLogger[];
  referenceChannelId: number;
  /** [from, to) of the seeded reference readings (epoch ms). */
  referenceRange: { from: number; to: number };
  /** The person browsing (technician: may also make alert rules) and their session cookie. */
  viewer: TestUser;
  cookie: string;
  /** The chamber-1 bounds rule, when one was made. */
  alertRuleId: number | null;
}

/** Posts one JSON batch to `url` with a logger key and fails on anything but 200. */
async function postOrFail(url: string, key: string, readings: Array<{ channel: string; ts: number; value: number }>): Promise<void> {
  const res = await fetch(`${url}/api/v1/ingest`, {
    method: 'POST',
    headers: { authorization: `Bearer ${key}`, 'content-type': 'application/json' },
    body: JSON.stringify({ readings }),
  });
  if (res.status !== 200) throw new Error(`seeding the reference channel: ${res.status} ${await res.text()}`);
}

/** Builds the lab on `target` (see the file comment). */
export async function setUpWorkloadLab(target: LoadTarget, opts: { chambers: number; alertRule: boolean }): Promise<WorkloadLab> {
  const { db } = target;
  const suffix = randomBytes(3).toString('hex');
  const lab = await labsRepo(db).insert({ slug: `growth-facility-${suffix}`, name: `Growth facility ${suffix}` });
  await onLargestPlan(db, lab.id);
  const loggers = createLoggersService({ db });
  const context = { ...lab, role: 'admin' as const };
  const chambers: ChamberLogger[] = [];
  for (let i = 0; i < opts.chambers; i++) {
    const { logger, issued } = await loggers.register(context, null, {
      name: `Growth chamber ${i + 1}`,
      timezone: 'UTC',
      expectedIntervalS: 1,
      channels: [{ key: 'air_t', label: 'Air temperature', unit: '°C' }],
    });
    chambers.push({ index: i, key: issued.key, loggerId: logger.id, channelId: logger.channels[0].id });
  }
  const { logger: reference, issued: referenceKey } = await loggers.register(context, null, {
    name: 'Reference bed',
    timezone: 'UTC',
    expectedIntervalS: 60,
    channels: [{ key: 'soil_t', label: 'Soil temperature', unit: '°C' }],
  });
  // a daily cycle with a slow drift, deterministic (demo data)
  const to = Math.floor(Date.now() / MINUTE) * MINUTE - 10 * MINUTE;
  const from = to - REFERENCE_MINUTES * MINUTE;
  const minutes = Array.from({ length: REFERENCE_MINUTES }, (_, m) => ({
    channel: 'soil_t',
    ts: from + m * MINUTE,
    value: Math.round((14 + 2.5 * Math.sin((2 * Math.PI * m) / 1440) + 0.3 * Math.sin(m / 97)) * 100) / 100,
  }));
  for (let i = 0; i < minutes.length; i += 1000) await postOrFail(target.ingestUrls[0], referenceKey.key, minutes.slice(i, i + 1000));

  const viewer = await buildMember(db, lab, { role: 'technician', email: `grower-${suffix}@growth-facility.example` });
  const cookie = await sessionCookieFor(db, target.sessionSecret, viewer.id);
  let alertRuleId: number | null = null;
  if (opts.alertRule) {
    const url = target.browseUrls[0];
    const res = await fetch(`${url}/api/v1/labs/${lab.slug}/alert-rules`, {
      method: 'POST',
      headers: { cookie, origin: url, 'content-type': 'application/json' },
      body: JSON.stringify({ name: 'Chamber 1 too warm', kind: 'bounds', channelId: chambers[0].channelId, params: { high: ALERT_HIGH, holdS: 0 } }),
    });
    if (res.status !== 201) throw new Error(`creating the alert rule: ${res.status} ${await res.text()}`);
    alertRuleId = Number(((await res.json()) as { rule: { id: number } }).rule.id);
  }
  return {
    tenantId: lab.id,
    slug: lab.slug,
    chambers,
    referenceChannelId: reference.channels[0].id,
    referenceRange: { from, to: from + REFERENCE_MINUTES * MINUTE },
    viewer,
    cookie,
    alertRuleId,
  };
}
