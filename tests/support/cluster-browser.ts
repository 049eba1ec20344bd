/**
 * The "browser side" of a cluster run: signed-in people reading chart series of channels being
 * written to and the diagnostics of the reference channel, in a loop, through the app (whose
 * lag-tolerant reads go to the reader listener). It records every answer's status and the
 * latency of each successful read, per kind.
 */
import { performance } from 'node:perf_hooks';
import type { WorkloadLab } from './cluster-workload.ts';

export type ReadKind = 'series' | 'diagnostics';

export interface BrowseTally {
  statuses: Record<ReadKind, Record<number, number>>;
  /** Latency (ms) of each 200 answer, per kind. */
  latenciesMs: Record<ReadKind, number[]>;
  networkErrors: number;
  /** The first few answers other than 200 or 503. */
  samples: string[];
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** p-th percentile by the nearest-rank method (NaN for no values). */
export function percentile(values: readonly number[], p: number): number {
  if (!values.length) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.max(0, Math.ceil((p / 100) * sorted.length) - 1)];
}

/**
 * Starts `people` browsing loops against `urls` (person p uses urls[p mod n]) with `pauseMs`
 * between requests; series windows cover `seriesFrom` … +1 h. `stop()` ends them after the
 * requests in flight.
 */
export function startBrowsing(
  lab: WorkloadLab,
  urls: string[],
  opts: { people: number; pauseMs: number; seriesFrom: number },
): { stop(): Promise<BrowseTally>; tally: BrowseTally } {
  const tally: BrowseTally = { statuses: { series: {}, diagnostics: {} }, latenciesMs: { series: [], diagnostics: [] }, networkErrors: 0, samples: [] };
  let stopping = false;
  const base = `/api/v1/labs/${lab.slug}/channels`;
  const { from, to } = lab.referenceRange;
  const diagnosticsPath = `${base}/${lab.referenceChannelId}/diagnostics?from=${from}&to=${to}&step=60`;

  async function read(kind: ReadKind, url: string): Promise<void> {
    const start = performance.now();
    try {
      const res = await fetch(url, { headers: { cookie: lab.cookie }, signal: AbortSignal.timeout(30_000) });
      const text = await res.text();
      tally.statuses[kind][res.status] = (tally.statuses[kind][res.status] ?? 0) + 1;
      if (res.status === 200) tally.latenciesMs[kind].push(performance.now() - start);
      else if (res.status !== 503 && tally.samples.length < 10) tally.samples.push(`${kind} ${res.status}: ${text.slice(0, 300)}`);
    } catch (err) {
      tally.networkErrors++;
      if (tally.samples.length < 10) tally.samples.push(`${kind}: no answer: ${(err as Error).message}`);
    }
  }

  const loops = Array.from({ length: opts.people }, async (_, p) => {
    const url = urls[p % urls.length];
    for (let n = 0; !stopping; n++) {
      const channel = lab.chambers[(p + n) % lab.chambers.length].channelId;
      await read('series', `${url}${base}/${channel}/series?from=${opts.seriesFrom}&to=${opts.seriesFrom + 3_600_000}&points=500`);
      await sleep(opts.pauseMs);
      if (stopping) break;
      await read('diagnostics', `${url}${diagnosticsPath}`);
      await sleep(opts.pauseMs);
    }
  });

  return {
    tally,
    async stop() {
      stopping = true;
      await Promise.all(loops);
      return tally;
    },
  };
}
