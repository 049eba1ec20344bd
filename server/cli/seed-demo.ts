import type { Db } from '../db/create-db.ts';
import { labsRepo } from '../db/labs.repo.ts';
import { usersRepo } from '../db/users.repo.ts';
import { inLab } from '../db/tenant-scope.ts';
import { membershipsRepo } from '../db/memberships.repo.ts';
import { loggersRepo } from '../db/loggers.repo.ts';
import { auditRepo } from '../db/audit.repo.ts';
import { createLoggersService } from '../services/loggers.service.ts';
import { ingestBatch, type IncomingReading } from '../services/ingest/ingest-batch.ts';
import { DEMO_BAD_ROWS, DEMO_DAYS, DEMO_LAB, DEMO_LOGGERS, DEMO_SEED } from '../../tenants/demo/scenario.ts';
import { generateLogger } from '../../tenants/demo/generate.ts';
import { seededRandom } from '../../tenants/demo/random.ts';
import type { Role } from '../policies/permissions.ts';
import { labBillingRepo } from '../db/lab-billing.repo.ts';
import { loadPlanCatalog } from '../services/billing/plan-catalog.ts';

export interface DemoPerson {
  email: string;
  name: string;
  /** The identity provider's subject for this person (the local provider's dev accounts). */
  subject: string;
}

export interface SeedDemoResult {
  seeded: boolean;
  readings: number;
  quarantined: number;
  text: string;
}

const DAY = 24 * 3600_000;

/**
 * Loads the demo lab (tenants/demo) into the database: the lab, its members (as the local
 * identity provider knows them, so signing in as a dev account lands in the lab), five loggers
 * with thirteen channels and ninety days of generated readings ending at `end`, and a few
 * quarantined rows. Idempotent: a database that already has the demo lab is left as it is.
 * Readings go through the same ingestion path as a logger's, so rollups and quarantine are real.
 */
export async function seedDemo(db: Db, opts: { issuer: string; people: DemoPerson[]; end?: number; log?: (line: string) => void }): Promise<SeedDemoResult> {
  const log = opts.log ?? (() => undefined);
  const existing = await labsRepo(db).findBySlug(DEMO_LAB.slug);
  if (existing) return { seeded: false, readings: 0, quarantined: 0, text: `The demo lab "${existing.name}" is already there; nothing changed.` };

  const lab = await labsRepo(db).insert({ slug: DEMO_LAB.slug, name: DEMO_LAB.name });
  const ctx = { ...lab, role: 'admin' as Role };
  const users = usersRepo(db);
  for (const member of DEMO_LAB.members) {
    const person = opts.people.find((p) => p.email === member.email);
    if (!person) throw new Error(`seedDemo: no identity for the demo member ${member.email}`);
    const user = await users.upsertFromIdentity({
      issuer: opts.issuer,
      subject: person.subject,
      email: person.email,
      emailVerified: true,
      displayName: person.name,
    });
    await membershipsRepo(inLab(db, lab.id)).add(user.id, member.role as Role);
  }

  const rnd = seededRandom(DEMO_SEED);
  const service = createLoggersService({ db });
  const end = opts.end ?? Math.floor(Date.now() / 300_000) * 300_000;
  let readings = 0;
  let quarantined = 0;
  for (const spec of DEMO_LOGGERS) {
    const { logger } = await service.register(ctx, null, {
      name: spec.name,
      serial: spec.serial,
      site: spec.site,
      timezone: spec.timezone,
      expectedIntervalS: spec.intervalS,
      channels: spec.channels.map(({ model: _model, ...c }) => c),
    });
    const step = spec.intervalS * 1000;
    const start = end - DEMO_DAYS * DAY;
    const times: number[] = [];
    for (let t = start; t <= end; t += step) times.push(t);
    const series = generateLogger(spec, times, rnd);
    const lastTime = end - (spec.silentForDays ?? 0) * DAY;
    const rows: IncomingReading[] = [];
    const flush = async () => {
      if (!rows.length) return;
      const outcome = await ingestBatch(db, { tenantId: lab.id, loggerId: logger.id }, rows.splice(0), { source: 'upload', now: () => end });
      readings += outcome.accepted;
    };
    for (let i = 0; i < times.length && times[i] <= lastTime; i++) {
      for (const c of spec.channels) rows.push({ index: rows.length, channel: c.key, ts: times[i], value: series.get(c.key)![i] });
      if (rows.length >= 5000) await flush();
    }
    await flush();
    await loggersRepo(inLab(db, lab.id)).markSeen(logger.id, Math.min(lastTime, times[times.length - 1]));
    if (spec.name === 'North plot soil station') {
      // a firmware hiccup two weeks before the end: these rows cannot be stored and are kept in quarantine
      const at = end - 14 * DAY;
      const bad = DEMO_BAD_ROWS.map((r, index) => ({ index, channel: r.channel, ts: r.ts ?? at + index * step, value: r.value }));
      const outcome = await ingestBatch(db, { tenantId: lab.id, loggerId: logger.id }, bad, { source: 'api', now: () => end });
      quarantined += outcome.quarantined.length;
    }
    log(`  ${spec.name}: ${spec.channels.length} channel(s)`);
  }
  // The plan's usage meter counts what was just stored (seeding bypasses the ingestion hooks),
  // so the billing page is right at once rather than after the next usage reconciliation.
  await labBillingRepo(inLab(db, lab.id)).setReadings(readings, new Date(), loadPlanCatalog(process.env.LAGBOOK_PLANS_FILE ?? 'tenants/plans.json').free.key);
  await auditRepo(inLab(db, lab.id)).record({
    actorUserId: null,
    action: 'demo.seeded',
    summary: `The demo scenario was loaded (${readings} readings, seed ${DEMO_SEED})`,
  });
  return {
    seeded: true,
    readings,
    quarantined,
    text: `Loaded the demo lab "${lab.name}" (/labs/${lab.slug}): ${DEMO_LOGGERS.length} loggers, ${readings.toLocaleString('en')} readings, ${quarantined} quarantined rows.`,
  };
}
