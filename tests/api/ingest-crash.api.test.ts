import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { startAppProcess } from '../support/app-process.ts';

/**
 * Crash safety: the server is killed with SIGKILL while several loggers post. Every batch
 * that was acknowledged (2xx) must be stored completely; no batch may be stored in part;
 * after a restart, re-sending the unacknowledged batches stores every reading exactly once.
 */
const LOGGERS = 3;
const BATCH = 400;
const T0 = Date.UTC(2026, 2, 1);

let t: TestApp;
let port: number;
const fixtures: LabWithEverything[] = [];
beforeAll(async () => {
  t = await buildTestApp();
  port = Number(execFileSync('node', ['docker-free-scripts/free-ports.mjs', '1'], { encoding: 'utf8' }).trim());
  for (let i = 0; i < LOGGERS; i++) fixtures.push(await buildLabWithEverything(t.db));
});
afterAll(async () => t.close());

function batchBody(b: number) {
  return JSON.stringify({ readings: Array.from({ length: BATCH }, (_, i) => ({ channel: 'air_t', ts: T0 + (b * BATCH + i) * 1000, value: b + i / 1000 })) });
}

async function storedTimes(f: LabWithEverything): Promise<Set<number>> {
  const rows = await t.db('readings').where({ tenant_id: f.lab.id, channel_id: f.ids.channelId }).select('ts');
  return new Set(rows.map((r: { ts: number }) => Number(r.ts)));
}

describe('SIGKILL during ingestion', () => {
  it('keeps every acknowledged reading, never part of a batch, and stores each reading once after retries', async () => {
    const app = await startAppProcess(t.config.db, port, t.config.sessionSecret);
    const acknowledged: Array<Set<number>> = fixtures.map(() => new Set());
    const attempted: number[] = fixtures.map(() => 0);
    let killed = false;
    const posters = fixtures.map(async (f, l) => {
      for (let b = 0; !killed || b < 2; b++) {
        attempted[l] = b + 1;
        try {
          const res = await fetch(`${app.url}/api/v1/ingest`, {
            method: 'POST',
            headers: { authorization: `Bearer ${f.ingestKey}`, 'content-type': 'application/json' },
            body: batchBody(b),
          });
          if (res.status === 200) acknowledged[l].add(b);
        } catch {
          return; // the server is gone
        }
        if (b > 500) return;
      }
    });
    await new Promise((r) => setTimeout(r, 1500));
    killed = true;
    app.child.kill('SIGKILL');
    await app.stopped;
    await Promise.all(posters);

    for (let l = 0; l < LOGGERS; l++) {
      expect(acknowledged[l].size, `logger ${l} got some acknowledgements before the kill`).toBeGreaterThan(0);
      const times = await storedTimes(fixtures[l]);
      for (let b = 0; b < attempted[l]; b++) {
        const present = Array.from({ length: BATCH }, (_, i) => times.has(T0 + (b * BATCH + i) * 1000)).filter(Boolean).length;
        if (acknowledged[l].has(b)) expect(present, `acknowledged batch ${b} of logger ${l}`).toBe(BATCH);
        else expect([0, BATCH], `batch ${b} of logger ${l} stored in part`).toContain(present);
      }
    }

    // Restart and let every logger re-send everything it attempted: each reading ends up stored once.
    const again = await startAppProcess(t.config.db, port, t.config.sessionSecret);
    try {
      for (let l = 0; l < LOGGERS; l++) {
        for (let b = 0; b < attempted[l]; b++) {
          const res = await fetch(`${again.url}/api/v1/ingest`, {
            method: 'POST',
            headers: { authorization: `Bearer ${fixtures[l].ingestKey}`, 'content-type': 'application/json' },
            body: batchBody(b),
          });
          expect(res.status).toBe(200);
        }
        const [{ n }] = await t.db('readings').where({ tenant_id: fixtures[l].lab.id, channel_id: fixtures[l].ids.channelId }).count({ n: '*' });
        expect(Number(n)).toBe(attempted[l] * BATCH);
      }
    } finally {
      again.child.kill('SIGTERM');
      await again.stopped;
    }
  });
});
