/**
 * Growth-chamber loggers posting continuously for cluster runs. Each logger posts numbered
 * batches of readings with timestamps no other batch uses, re-sends a batch until it is
 * acknowledged (as a well-behaved logger does), and keeps a ledger of every batch: whether it
 * was acknowledged, after how many failed attempts, and what the acknowledging answer said
 * (`accepted` / `duplicates`), so a test can tell exactly which readings must be stored.
 *
 * A 503 is re-sent after `retryMs` (shorter than the Retry-After seconds the server asks for,
 * so the measured failover gap is the server's, not the logger's wait); the header's presence
 * is still checked and counted.
 */
import { performance } from 'node:perf_hooks';
import { ALERT_HIGH, type ChamberLogger } from './cluster-workload.ts';

export interface LoggerSchedule {
  /** Readings per batch. */
  batchSize: number;
  /** Milliseconds between consecutive readings of one logger. */
  stepMs: number;
  /** Timestamp of every logger's first reading (epoch ms). */
  startTs: number;
  /** Pause after an acknowledged batch. */
  pauseMs: number;
  /** Wait before re-sending a batch that was not acknowledged. */
  retryMs: number;
  /** Chamber 1's every `warmEvery`-th batch reads above the alert limit (0: never). */
  warmEvery: number;
}

/** Timestamp of reading `k` of batch `b` (unique per logger: batches never overlap). */
export const readingTs = (s: LoggerSchedule, b: number, k: number) => s.startTs + (b * s.batchSize + k) * s.stepMs;

/** Whether batch `b` of logger `index` is a warm one (only chamber 1, index 0). */
export const isWarmBatch = (s: LoggerSchedule, index: number, b: number) => index === 0 && s.warmEvery > 0 && b % s.warmEvery === s.warmEvery - 1;

/** Value of reading `k` of batch `b` of logger `index`: 18–22 °C, or above the alert limit in a warm batch. */
export function readingValue(s: LoggerSchedule, index: number, b: number, k: number): number {
  if (isWarmBatch(s, index, b)) return ALERT_HIGH + 5 + k / 1000;
  return Math.round((20 + 2 * Math.sin((b * s.batchSize + k) / 500 + index)) * 1000) / 1000;
}

/** One batch as the ledger keeps it. */
export interface BatchRecord {
  batch: number;
  acknowledged: boolean;
  /** Attempts that got no 200 (503, another status, or no answer). */
  failedAttempts: number;
  /** The 200 answer's counts, when acknowledged. */
  answer?: { accepted: number; duplicates: number; quarantined: number };
}

/** What all loggers saw, together. */
export interface PostingTally {
  /** Answers by HTTP status. */
  statuses: Record<number, number>;
  /** 503 answers without a positive whole-second Retry-After. */
  unavailableWithoutRetryAfter: number;
  /** Requests that got no HTTP answer (connection refused or reset, or no answer within 20 s). */
  networkErrors: number;
  /** The first few answers that were neither 200 nor 503, and network errors' messages. */
  samples: string[];
  /** Each acknowledged request: when it was sent and answered (performance.now() ms). */
  acks: Array<{ sentAt: number; answeredAt: number }>;
  /** Each 503: when it was answered. */
  unavailableAt: number[];
}

export interface LoggerRun {
  tally: PostingTally;
  ledgers: BatchRecord[][];
  /** performance.now() when posting started and stopped. */
  startedAt: number;
  stoppedAt: number;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * Starts every logger posting to `urls` (logger i to urls[i mod n]); `stop()` lets each finish
 * the request in flight, starts no new one, and resolves with what they saw.
 */
export function startLoggers(chambers: ChamberLogger[], urls: string[], s: LoggerSchedule): { stop(): Promise<LoggerRun>; tally: PostingTally } {
  const tally: PostingTally = { statuses: {}, unavailableWithoutRetryAfter: 0, networkErrors: 0, samples: [], acks: [], unavailableAt: [] };
  const ledgers: BatchRecord[][] = chambers.map(() => []);
  let stopping = false;
  const startedAt = performance.now();

  async function attempt(url: string, key: string, body: string, record: BatchRecord): Promise<boolean> {
    const sentAt = performance.now();
    let res: Response;
    try {
      res = await fetch(`${url}/api/v1/ingest`, {
        method: 'POST',
        headers: { authorization: `Bearer ${key}`, 'content-type': 'application/json' },
        body,
        signal: AbortSignal.timeout(20_000),
      });
    } catch (err) {
      tally.networkErrors++;
      if (tally.samples.length < 10) tally.samples.push(`no answer: ${(err as Error).message}`);
      return false;
    }
    const text = await res.text().catch(() => '');
    tally.statuses[res.status] = (tally.statuses[res.status] ?? 0) + 1;
    if (res.status === 200) {
      const json = JSON.parse(text) as { accepted: number; duplicates: number; quarantined: unknown[] };
      record.answer = { accepted: json.accepted, duplicates: json.duplicates, quarantined: json.quarantined.length };
      tally.acks.push({ sentAt, answeredAt: performance.now() });
      return true;
    }
    if (res.status === 503) {
      tally.unavailableAt.push(performance.now());
      const retryAfter = Number(res.headers.get('retry-after'));
      if (!(Number.isInteger(retryAfter) && retryAfter > 0)) tally.unavailableWithoutRetryAfter++;
    } else if (tally.samples.length < 10) tally.samples.push(`${res.status}: ${text.slice(0, 300)}`);
    return false;
  }

  const loops = chambers.map(async (c, i) => {
    const url = urls[i % urls.length];
    await sleep((i * Math.max(s.pauseMs, 50)) / chambers.length); // spread the first posts
    for (let b = 0; !stopping; b++) {
      const readings = Array.from({ length: s.batchSize }, (_, k) => ({ channel: 'air_t', ts: readingTs(s, b, k), value: readingValue(s, c.index, b, k) }));
      const body = JSON.stringify({ readings });
      const record: BatchRecord = { batch: b, acknowledged: false, failedAttempts: 0 };
      ledgers[i].push(record);
      while (!stopping && !record.acknowledged) {
        if (await attempt(url, c.key, body, record)) record.acknowledged = true;
        else {
          record.failedAttempts++;
          await sleep(s.retryMs);
        }
      }
      if (record.acknowledged) await sleep(s.pauseMs);
    }
  });

  return {
    tally,
    async stop() {
      stopping = true;
      await Promise.all(loops);
      return { tally, ledgers, startedAt, stoppedAt: performance.now() };
    },
  };
}

/** Readings acknowledged by all loggers together. */
export const acknowledgedReadings = (run: LoggerRun, s: LoggerSchedule) => run.ledgers.flat().filter((r) => r.acknowledged).length * s.batchSize;

/**
 * The failover gap: from `killAt` to the first acknowledgement of a request sent after it
 * (performance.now() ms; null when none came).
 */
export function firstAcceptedAfter(tally: PostingTally, killAt: number): number | null {
  const after = tally.acks.filter((a) => a.sentAt >= killAt).map((a) => a.answeredAt);
  return after.length ? Math.min(...after) : null;
}

/** Longest stretch without any acknowledgement between `from` and `to` (ms). */
export function longestSilence(tally: PostingTally, from: number, to: number): number {
  const times = [from, ...tally.acks.map((a) => a.answeredAt).filter((t) => t > from && t < to), to].sort((a, b) => a - b);
  let longest = 0;
  for (let i = 1; i < times.length; i++) longest = Math.max(longest, times[i] - times[i - 1]);
  return longest;
}
