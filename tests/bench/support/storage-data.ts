/**
 * Seeded synthetic readings for `npm run bench:storage`: one-minute readings of `channels`
 * channels over `days` days, each channel a daily cycle plus a yearly cycle plus AR(1) noise
 * (x_t = φ x_{t−1} + e_t, φ = 0.8), rounded to 2 or 3 decimals as real sensors report. The
 * figures stand in for a fictional field station's loggers; nothing here is measured data.
 *
 * Readings come in batches as a logger sends them: 250 consecutive minutes of every channel,
 * i.e. 5,000 rows for 20 channels (the batch size ingestion is tuned for). Two generators built
 * with the same options yield exactly the same rows, so both schemas of the benchmark store the
 * same readings.
 */
import { seededRandom, type Random } from '../../../tenants/demo/random.ts';

export const MINUTE_MS = 60_000;
export const DAY_MS = 86_400_000;
/** Minutes of each channel per batch (5,000 rows a batch at 20 channels). */
export const MINUTES_PER_BATCH = 250;
/** AR(1) coefficient per minute of the noise (the brief asks for φ ≈ 0.8). */
const PHI = 0.8;

export interface StorageDataOptions {
  channels: number;
  days: number;
  /** First reading's time (epoch ms UTC, a whole minute). */
  startMs: number;
  seed: number;
}

/** One batch in columns, channel-major (each channel's minutes in time order). */
export interface ReadingBatch {
  length: number;
  /** Channel index (0 … channels − 1) of each row. */
  channel: Uint16Array;
  ts: Float64Array;
  value: Float64Array;
}

/** What one channel measures: a level, its two cycles and its noise, and how it rounds. */
interface ChannelProfile {
  level: number;
  dailyAmplitude: number;
  dailyPhase: number;
  yearlyAmplitude: number;
  yearlyPhase: number;
  /** Standard deviation of the AR(1) innovations. */
  noiseSd: number;
  decimals: 2 | 3;
}

/** A fictional station's kinds of channel: air and soil temperature (°C), humidity (%), pressure (hPa), a conductivity probe (mS/cm). */
const KINDS: Array<Omit<ChannelProfile, 'dailyPhase' | 'yearlyPhase'>> = [
  { level: 11.5, dailyAmplitude: 4.2, yearlyAmplitude: 8.5, noiseSd: 0.12, decimals: 2 },
  { level: 9.8, dailyAmplitude: 0.9, yearlyAmplitude: 6.1, noiseSd: 0.03, decimals: 3 },
  { level: 71, dailyAmplitude: 12, yearlyAmplitude: 9, noiseSd: 0.6, decimals: 2 },
  { level: 1009.4, dailyAmplitude: 0.8, yearlyAmplitude: 3.5, noiseSd: 0.05, decimals: 2 },
  { level: 1.342, dailyAmplitude: 0.04, yearlyAmplitude: 0.21, noiseSd: 0.004, decimals: 3 },
];

function profiles(channels: number, random: Random): ChannelProfile[] {
  return Array.from({ length: channels }, (_, c) => {
    const kind = KINDS[c % KINDS.length];
    const spread = 1 + 0.2 * (random.next() - 0.5);
    return {
      ...kind,
      level: kind.level * spread,
      dailyPhase: 2 * Math.PI * random.next(),
      yearlyPhase: 2 * Math.PI * random.next(),
    };
  });
}

/** Number of batches and rows the options describe. */
export function dataShape(opts: StorageDataOptions): { minutes: number; batches: number; rows: number } {
  const minutes = opts.days * 1440;
  return { minutes, batches: Math.ceil(minutes / MINUTES_PER_BATCH), rows: minutes * opts.channels };
}

/** The batches in time order; each channel's AR(1) state carries over from one batch to the next. */
export function* readingBatches(opts: StorageDataOptions): Generator<ReadingBatch> {
  const random = seededRandom(opts.seed);
  const chans = profiles(opts.channels, random);
  // start each channel's noise from its stationary distribution (variance σ²/(1 − φ²))
  const noise = chans.map((p) => (random.normal() * p.noiseSd) / Math.sqrt(1 - PHI * PHI));
  const { minutes } = dataShape(opts);
  const yearMs = 365.25 * DAY_MS;
  for (let first = 0; first < minutes; first += MINUTES_PER_BATCH) {
    const span = Math.min(MINUTES_PER_BATCH, minutes - first);
    const length = span * opts.channels;
    const batch: ReadingBatch = { length, channel: new Uint16Array(length), ts: new Float64Array(length), value: new Float64Array(length) };
    let i = 0;
    for (let c = 0; c < opts.channels; c++) {
      const p = chans[c];
      const scale = 10 ** p.decimals;
      for (let m = first; m < first + span; m++, i++) {
        const ts = opts.startMs + m * MINUTE_MS;
        noise[c] = PHI * noise[c] + p.noiseSd * random.normal();
        const daily = p.dailyAmplitude * Math.sin((2 * Math.PI * (ts % DAY_MS)) / DAY_MS + p.dailyPhase);
        const yearly = p.yearlyAmplitude * Math.sin((2 * Math.PI * ts) / yearMs + p.yearlyPhase);
        batch.channel[i] = c;
        batch.ts[i] = ts;
        batch.value[i] = Math.round((p.level + daily + yearly + noise[c]) * scale) / scale;
      }
    }
    yield batch;
  }
}
