/**
 * A scripted data logger for fault tests: it posts numbered batches in order and re-sends a
 * batch until it is acknowledged (200), waiting briefly after a 503 — what a well-behaved
 * logger does. It records every answer so a test can check what the server said on the way.
 */
export interface PostingRecord {
  /** How many answers of each HTTP status it received. */
  statuses: Record<number, number>;
  /** 503 answers that lacked a usable Retry-After header. */
  unavailableWithoutRetryAfter: number;
  /** Requests that got no HTTP answer at all (the server was not there). */
  networkErrors: number;
  /** Batches acknowledged with 200, in order. */
  acknowledged: number;
}

export const T0 = Date.UTC(2026, 3, 1);

/** The JSON body of batch `b`: `size` readings a second apart, value derived from the time. */
export function batchBody(b: number, size: number, channel = 'air_t'): string {
  return JSON.stringify({ readings: Array.from({ length: size }, (_, i) => ({ channel, ts: T0 + (b * size + i) * 1000, value: b + i / 1000 })) });
}

export function newRecord(): PostingRecord {
  return { statuses: {}, unavailableWithoutRetryAfter: 0, networkErrors: 0, acknowledged: 0 };
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** One JSON batch posted to `POST /api/v1/ingest` with a logger's key. */
export function postBatch(url: string, key: string, body: string): Promise<Response> {
  return fetch(`${url}/api/v1/ingest`, { method: 'POST', headers: { authorization: `Bearer ${key}`, 'content-type': 'application/json' }, body });
}

/**
 * Posts one batch until it is acknowledged; throws on any answer other than 200 or 503, or
 * when `deadline` (epoch ms) passes. `retryMs` is how long it waits before re-sending (kept
 * short in tests instead of honouring the full Retry-After).
 */
export async function postUntilAcknowledged(url: string, key: string, body: string, record: PostingRecord, deadline: number, retryMs = 200): Promise<void> {
  for (;;) {
    if (Date.now() > deadline) throw new Error('the batch was not acknowledged before the deadline');
    let res: Response;
    try {
      res = await postBatch(url, key, body);
    } catch {
      record.networkErrors++;
      await sleep(retryMs);
      continue;
    }
    record.statuses[res.status] = (record.statuses[res.status] ?? 0) + 1;
    const text = await res.text();
    if (res.status === 200) {
      record.acknowledged++;
      return;
    }
    if (res.status !== 503) throw new Error(`unexpected answer ${res.status}: ${text}`);
    const retryAfter = Number(res.headers.get('retry-after'));
    if (!(Number.isInteger(retryAfter) && retryAfter > 0)) record.unavailableWithoutRetryAfter++;
    await sleep(retryMs);
  }
}
