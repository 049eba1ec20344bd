/**
 * What a cluster run must have left behind, read from the database (the writer) and the mail
 * capture, compared with what the loggers were told. Each function returns findings (counts and
 * the first few offending items) rather than asserting, so the fault test can assert and the
 * benchmark can print them.
 */
import type { Db } from '../../server/db/create-db.ts';
import { fetchCapturedMail } from '../../docker-free-scripts/mail-capture/read-captured-mail.ts';
import { ALERT_HIGH, type ChamberLogger } from './cluster-workload.ts';
import { readingTs, readingValue, type LoggerRun, type LoggerSchedule } from './cluster-loggers.ts';

export interface StoredReadingsFindings {
  /** Readings of acknowledged batches. */
  acknowledged: number;
  /** Rows stored for the loggers' channels. */
  stored: number;
  /** Acknowledged readings with no row (lost). */
  missing: number;
  /** Rows whose value differs from what was sent. */
  wrongValue: number;
  /** Rows belonging to no batch the loggers sent. */
  unknown: number;
  /** Batches never acknowledged, and how they ended: wholly stored, not stored, or partly (a defect). */
  unacknowledged: { whole: number; absent: number; partial: number };
  /** Acknowledged batches whose 200 answer counted some but not all readings as duplicates (an earlier attempt stored part of it). */
  partlyDuplicateAnswers: number;
  /** Acknowledged batches answered "all duplicates" although no earlier attempt failed (stored twice?). */
  unexplainedDuplicates: number;
  /** Acknowledged batches whose failed attempts had in fact committed (the answer said all duplicates). */
  committedBeforeFailure: number;
  /** Up to 10 examples of any defect above. */
  examples: string[];
}

/** Findings with nothing counted yet. */
export function emptyStoredFindings(): StoredReadingsFindings {
  return {
    acknowledged: 0,
    stored: 0,
    missing: 0,
    wrongValue: 0,
    unknown: 0,
    unacknowledged: { whole: 0, absent: 0, partial: 0 },
    partlyDuplicateAnswers: 0,
    unexplainedDuplicates: 0,
    committedBeforeFailure: 0,
    examples: [],
  };
}

/**
 * Judges one logger's stored rows (`stored`: timestamp → value) against its ledgers in `runs`,
 * adding to `f`. Pure, so the fault test's checker can itself be tested on planted faults.
 */
export function judgeStoredRows(
  f: StoredReadingsFindings,
  loggerIndex: number,
  stored: ReadonlyMap<number, number>,
  runs: ReadonlyArray<{ run: Pick<LoggerRun, 'ledgers'>; schedule: LoggerSchedule }>,
): void {
  const example = (line: string) => void (f.examples.length < 10 && f.examples.push(line));
  const name = `chamber ${loggerIndex + 1}`;
  f.stored += stored.size;
  let explained = 0;
  for (const { run, schedule: s } of runs)
    for (const record of run.ledgers[loggerIndex]) {
      let present = 0;
      for (let k = 0; k < s.batchSize; k++) {
        const value = stored.get(readingTs(s, record.batch, k));
        if (value === undefined) continue;
        present++;
        if (value !== readingValue(s, loggerIndex, record.batch, k)) {
          f.wrongValue++;
          example(`${name} batch ${record.batch} reading ${k}: stored ${value}`);
        }
      }
      explained += present;
      if (record.acknowledged) {
        f.acknowledged += s.batchSize;
        f.missing += s.batchSize - present;
        if (present < s.batchSize) example(`${name} batch ${record.batch}: acknowledged, ${present} of ${s.batchSize} stored`);
        const a = record.answer!;
        if (a.duplicates > 0 && a.duplicates < s.batchSize) {
          f.partlyDuplicateAnswers++;
          example(`${name} batch ${record.batch}: answer ${JSON.stringify(a)}`);
        }
        if (a.duplicates === s.batchSize && record.failedAttempts === 0) {
          f.unexplainedDuplicates++;
          example(`${name} batch ${record.batch}: all duplicates on the first attempt`);
        }
        if (a.duplicates === s.batchSize && record.failedAttempts > 0) f.committedBeforeFailure++;
      } else if (present === 0) f.unacknowledged.absent++;
      else if (present === s.batchSize) f.unacknowledged.whole++;
      else {
        f.unacknowledged.partial++;
        example(`${name} batch ${record.batch}: not acknowledged, ${present} of ${s.batchSize} stored`);
      }
    }
  f.unknown += stored.size - explained;
  if (stored.size > explained) example(`${name}: ${stored.size - explained} rows from no batch that was sent`);
}

/**
 * Compares each logger's stored rows with its ledgers (see {@link StoredReadingsFindings}); `runs`
 * are the posting runs made on these channels, each with its schedule (their timestamps must not overlap).
 */
export async function compareStoredWithLedgers(
  db: Db,
  tenantId: number,
  chambers: ChamberLogger[],
  runs: Array<{ run: LoggerRun; schedule: LoggerSchedule }>,
): Promise<StoredReadingsFindings> {
  const f = emptyStoredFindings();
  for (const c of chambers) {
    const rows: Array<{ ts: number | string; value: number }> = await db('readings')
      .where({ tenant_id: tenantId, channel_id: c.channelId })
      .select('ts', 'value');
    judgeStoredRows(f, c.index, new Map(rows.map((r) => [Number(r.ts), Number(r.value)])), runs);
  }
  return f;
}

export interface CounterFindings {
  /** Rows in `readings` for the lab. */
  rows: number;
  /** Channels whose `stored_readings` differs from their row count: "channel id: counter vs rows". */
  channelMismatches: string[];
  /** The lab's usage counter (`lab_billing.readings_count`). */
  labCounter: number;
}

/** The per-channel counters and the lab's usage counter against the rows actually stored. */
export async function compareCounters(db: Db, tenantId: number): Promise<CounterFindings> {
  const counts: Array<{ channel_id: number; n: number | string }> = await db('readings')
    .where({ tenant_id: tenantId })
    .groupBy('channel_id')
    .select('channel_id')
    .count({ n: '*' });
  const byChannel = new Map(counts.map((r) => [Number(r.channel_id), Number(r.n)]));
  const channels: Array<{ id: number; stored_readings: number | string }> = await db('channels').where({ tenant_id: tenantId }).select('id', 'stored_readings');
  const channelMismatches = channels
    .filter((c) => Number(c.stored_readings) !== (byChannel.get(Number(c.id)) ?? 0))
    .map((c) => `channel ${c.id}: counter ${c.stored_readings} vs ${byChannel.get(Number(c.id)) ?? 0} rows`);
  const billing = await db('lab_billing').where({ tenant_id: tenantId }).first('readings_count');
  return { rows: [...byChannel.values()].reduce((a, b) => a + b, 0), channelMismatches, labCounter: Number(billing?.readings_count ?? NaN) };
}

export interface CycleFindings {
  /** Cycle periods (UTC start, ms) the run should have, outside the allowed window. */
  expected: number;
  /** Expected periods with no `job_runs` row. */
  missing: number[];
  /** Expected periods whose run never recorded its end. */
  unfinished: number[];
  /** Periods inside the allowed (failover) window that have no row — reported, not a defect. */
  missingInWindow: number[];
  /** Rows in the whole run (any period). */
  rows: number;
  /** Every row of the run, for the report: period start, holder, started and finished (ISO). */
  runs: Array<{ period: string; holder: string; started: string; finished: string | null }>;
}

/**
 * The alert evaluator's cycles in `job_runs` over [from, to) (epoch ms): one row per period of
 * `everyS` seconds; periods starting inside `allowed` (the failover) may be missing.
 */
export async function checkEvaluatorCycles(
  db: Db,
  range: { from: number; to: number },
  allowed: { from: number; to: number },
  everyS: number,
): Promise<CycleFindings> {
  const step = everyS * 1000;
  const rows: Array<{ period_start: Date; holder: string; started_at: Date; finished_at: Date | null }> = await db('job_runs')
    .where({ name: 'alert-evaluator' })
    .where('period_start', '>=', new Date(range.from - step))
    .where('period_start', '<', new Date(range.to + step))
    .orderBy('period_start')
    .select('period_start', 'holder', 'started_at', 'finished_at');
  const iso = (d: Date | null) => (d === null ? null : new Date(d).toISOString());
  return judgeCycles(
    rows.map((r) => ({ periodStart: new Date(r.period_start).getTime(), holder: r.holder, startedAt: iso(r.started_at)!, finishedAt: iso(r.finished_at) })),
    range,
    allowed,
    everyS,
  );
}

/**
 * Judges `job_runs` rows (period start in epoch ms) against the periods of `everyS` seconds that
 * lie wholly in `range`; periods overlapping `allowed` may be missing. Pure (tested on its own).
 */
export function judgeCycles(
  rows: ReadonlyArray<{ periodStart: number; holder: string; startedAt: string; finishedAt: string | null }>,
  range: { from: number; to: number },
  allowed: { from: number; to: number },
  everyS: number,
): CycleFindings {
  const step = everyS * 1000;
  const byPeriod = new Map(rows.map((r) => [r.periodStart, r]));
  const runs = rows.map((r) => ({ period: new Date(r.periodStart).toISOString(), holder: r.holder, started: r.startedAt, finished: r.finishedAt }));
  const f: CycleFindings = { expected: 0, missing: [], unfinished: [], missingInWindow: [], rows: rows.length, runs };
  for (let p = Math.ceil(range.from / step) * step; p + step <= range.to; p += step) {
    const inWindow = p + step > allowed.from && p < allowed.to;
    const row = byPeriod.get(p);
    if (inWindow) {
      if (!row) f.missingInWindow.push(p);
      continue;
    }
    f.expected++;
    if (!row) f.missing.push(p);
    else if (row.finishedAt === null) f.unfinished.push(p);
  }
  return f;
}

export interface AlertMailFindings {
  /** Warm episodes in chamber 1's stored readings (each must open one alert), and those followed by a normal reading (each must resolve it). */
  expectedOpened: number;
  expectedResolved: number;
  opened: number;
  resolved: number;
  /** Outbox rows for the lab and how many are marked sent. */
  outbox: number;
  outboxSent: number;
  /** Mails captured for the subscriber. */
  captured: number;
  /** Outbox rows whose mail arrived more than once, or never. */
  sentTwice: number;
  neverArrived: number;
  /** Captured mails that match no outbox row. */
  strays: number;
  /** Outbox rows not marked sent: their kind, attempts, claim, last error and whether the mail arrived anyway. */
  unsent: Array<{ kind: string; attempts: number; claimedUntil: number | null; lastError: string | null; arrived: boolean }>;
}

/** Warm episodes in chamber 1's stored readings, in time order. */
export async function warmEpisodes(db: Db, tenantId: number, channelId: number): Promise<{ opened: number; resolved: number }> {
  const rows: Array<{ value: number }> = await db('readings').where({ tenant_id: tenantId, channel_id: channelId }).orderBy('ts').select('value');
  let opened = 0;
  let resolved = 0;
  let warm = false;
  for (const r of rows) {
    const now = Number(r.value) > ALERT_HIGH;
    if (now && !warm) opened++;
    if (!now && warm) resolved++;
    warm = now;
  }
  return { opened, resolved };
}

/** The alerts of `ruleId` and their mail: each opening and resolution mailed exactly once. */
export async function checkAlertMail(
  db: Db,
  lab: { tenantId: number; ruleId: number; channelId: number; subscriber: string },
  mailCaptureUrl: string,
): Promise<AlertMailFindings> {
  const expected = await warmEpisodes(db, lab.tenantId, lab.channelId);
  const alerts: Array<{ resolved_at: number | null }> = await db('alerts').where({ tenant_id: lab.tenantId, rule_id: lab.ruleId }).select('resolved_at');
  const outbox: Array<{
    subject: string;
    body_text: string;
    sent_at: number | null;
    kind: string;
    attempts: number;
    claimed_until: number | null;
    last_error: string | null;
  }> = await db('notification_outbox')
    .where({ tenant_id: lab.tenantId })
    .select('subject', 'body_text', 'sent_at', 'kind', 'attempts', 'claimed_until', 'last_error');
  const mails = await fetchCapturedMail(mailCaptureUrl, { to: lab.subscriber });
  const keyOf = (subject: string, text: string) => `${subject}\n${text.trim()}`;
  const arrived = new Map<string, number>();
  for (const m of mails) arrived.set(keyOf(m.subject, m.text), (arrived.get(keyOf(m.subject, m.text)) ?? 0) + 1);
  const unsent = outbox
    .filter((r) => r.sent_at === null)
    .map((r) => ({
      kind: r.kind,
      attempts: Number(r.attempts),
      claimedUntil: r.claimed_until === null ? null : Number(r.claimed_until),
      lastError: r.last_error,
      arrived: arrived.has(keyOf(r.subject, r.body_text)),
    }));
  let sentTwice = 0;
  let neverArrived = 0;
  for (const row of outbox) {
    const key = keyOf(row.subject, row.body_text);
    const n = arrived.get(key) ?? 0;
    if (n === 0) neverArrived++;
    if (n > 1) sentTwice++;
    arrived.delete(key);
  }
  return {
    expectedOpened: expected.opened,
    expectedResolved: expected.resolved,
    opened: alerts.length,
    resolved: alerts.filter((a) => a.resolved_at !== null).length,
    outbox: outbox.length,
    outboxSent: outbox.filter((r) => r.sent_at !== null).length,
    captured: mails.length,
    sentTwice,
    neverArrived,
    strays: [...arrived.values()].reduce((a, b) => a + b, 0),
    unsent,
  };
}

/** Node `n`'s replication state and its row count for the lab, read on the node itself. */
export async function nodeView(db: Db, tenantId: number): Promise<{ state: string; rows: number }> {
  const [status] = (await db.raw("SHOW STATUS LIKE 'wsrep_local_state_comment'")) as [Array<{ Value: string }>];
  const [{ n }] = await db('readings').where({ tenant_id: tenantId }).count({ n: '*' });
  return { state: status[0]?.Value ?? 'unknown', rows: Number(n) };
}
