/**
 * Test-only scenario (fictional, our own): a walk-in cold room read once a minute, whose air runs
 * about 4 °C at night and warms towards 7 °C in the working day as its door is opened (a daily
 * cycle), with persistent wander around it (seeded AR(1), φ = 0.97 a minute, innovations 0.05 °C).
 * A fault (a door left ajar, a failing compressor) starts `warmingMin` minutes before the newest
 * reading: the room drifts up by `warmingBy` °C over its first `rampMin` minutes (default all of
 * them) and stays that much warmer, so towards the afternoon peak it heads for an 8 °C limit.
 * Values carry two decimals, as a logger sends them. Nothing in the product imports this file.
 */
export interface ColdRoomOptions {
  /** Epoch ms of the newest reading. */
  endAt: number;
  /** Days of readings (default 3). */
  days?: number;
  seed?: number;
  warmingMin?: number;
  warmingBy?: number;
  rampMin?: number;
  /** A time of the afternoon peak (epoch ms; its time of day counts): default 14:00 UTC. */
  peakAt?: number;
}

/** Mulberry32 uniforms (Tommy Ettinger, public domain, 2017) turned normal by Box–Muller. */
function normals(seed: number): () => number {
  let state = seed >>> 0;
  const uniform = () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

/** The usual temperature at a time: 7 °C at the afternoon peak (default 14:00 UTC), 4 °C twelve hours from it. */
export function coldRoomUsual(ms: number, peakAt = 14 * 3_600_000): number {
  const hours = (ms - peakAt) / 3_600_000;
  return 5.5 + 1.5 * Math.cos((2 * Math.PI * hours) / 24);
}

/** One reading a minute ending at `endAt`, oldest first. */
export function coldRoomReadings(o: ColdRoomOptions): { ts: number[]; values: number[] } {
  const n = (o.days ?? 3) * 1440;
  const e = normals(o.seed ?? 11);
  const ts: number[] = [];
  const values: number[] = [];
  let d = 0;
  for (let i = 0; i < n; i++) {
    const at = o.endAt - (n - 1 - i) * 60_000;
    d = 0.97 * d + 0.05 * e();
    const minutesLeft = n - 1 - i;
    const since = (o.warmingMin ?? 0) - minutesLeft;
    const ramp = o.rampMin ?? o.warmingMin ?? 1;
    const warming = since > 0 ? Math.min(1, since / ramp) * (o.warmingBy ?? 0) : 0;
    ts.push(at);
    values.push(Math.round((coldRoomUsual(at, o.peakAt) + d + warming) * 100) / 100);
  }
  return { ts, values };
}
