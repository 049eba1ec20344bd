import type { Random } from './random.ts';
import type { DemoLogger } from './scenario.ts';

const HOUR = 3600_000;
const DAY = 24 * HOUR;

/** Local solar hour at the station (about 10° E: UTC + 40 min), 0–24. */
function solarHour(t: number): number {
  return ((((t + 40 * 60_000) % DAY) + DAY) % DAY) / HOUR;
}

/** Day of week in local time, 0 = Monday. */
function weekday(t: number): number {
  return (Math.floor((t + HOUR) / DAY) + 3) % 7;
}

const isWorkingHours = (t: number) => weekday(t) < 5 && solarHour(t) >= 8 && solarHour(t) < 17;

/** AR(1) noise e[i] = φ e[i−1] + σ√(1−φ²) z[i]: stationary with standard deviation σ. */
function ar1(n: number, phi: number, sigma: number, rnd: Random): Float64Array {
  const out = new Float64Array(n);
  const innov = sigma * Math.sqrt(1 - phi * phi);
  let e = sigma * rnd.normal();
  for (let i = 0; i < n; i++) {
    e = phi * e + innov * rnd.normal();
    out[i] = e;
  }
  return out;
}

/** Daylight 0…1: a rounded arch between sunrise and sunset, which move later/earlier through autumn. */
function daylight(t: number, start: number): number {
  const progress = (t - start) / (90 * DAY); // 0 at the start (September) … 1 (December)
  const rise = 6.5 + 2.2 * progress;
  const set = 19.5 - 3.6 * progress;
  const h = solarHour(t);
  if (h <= rise || h >= set) return 0;
  return Math.pow(Math.sin((Math.PI * (h - rise)) / (set - rise)), 1.3);
}

const round = (v: number, digits: number) => Math.round(v * 10 ** digits) / 10 ** digits;

/**
 * Generates every channel of one demo logger at the given times (epoch ms, equally spaced).
 * Channels of one logger share their drivers (door openings move the cold-room temperature;
 * irrigation pulses wet the soil), as real sensors on one site do.
 */
export function generateLogger(logger: DemoLogger, times: number[], rnd: Random): Map<string, Float64Array> {
  const n = times.length;
  const start = times[0];
  const out = new Map<string, Float64Array>();
  const stepMs = logger.intervalS * 1000;
  const make = (key: string, f: (i: number) => number, digits = 2) => {
    const a = new Float64Array(n);
    for (let i = 0; i < n; i++) a[i] = round(f(i), digits);
    out.set(key, a);
  };
  switch (logger.name) {
    case 'Glasshouse 2 climate': {
      const noise = ar1(n, 0.9, 0.35, rnd);
      const clouds = ar1(n, 0.995, 0.25, rnd);
      const air = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        const t = times[i];
        const season = -3.5 * ((t - start) / (90 * DAY));
        const sun = daylight(t, start) * (0.8 + clouds[i]);
        const vents = isWorkingHours(t) ? -1.1 : 0; // vents opened while people work in the house
        air[i] = 17.5 + season + 7.5 * Math.max(0, sun) + vents + noise[i];
      }
      make('air_t', (i) => air[i]);
      const rhNoise = ar1(n, 0.85, 2.0, rnd);
      make('rh', (i) => Math.min(99, Math.max(25, 78 - 2.2 * (air[i] - 17.5) + rhNoise[i])), 1);
      make('par', (i) => Math.max(0, 1250 * daylight(times[i], start) * Math.max(0.15, 0.8 + clouds[i]) + 15 * rnd.normal() * daylight(times[i], start)), 0);
      const co2Noise = ar1(n, 0.8, 8, rnd);
      make(
        'co2',
        (i) => {
          const t = times[i];
          const night = daylight(t, start) === 0 ? 55 : 0;
          const drawdown = -45 * daylight(t, start);
          const people = isWorkingHours(t) ? 35 : 0;
          return 425 + night + drawdown + people + co2Noise[i];
        },
        0,
      );
      break;
    }
    case 'North plot soil station': {
      // Irrigation: 30 minutes at 12 L/min every other morning at 06:00, some cycles skipped after rain.
      const flow = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        const t = times[i];
        const dayIndex = Math.floor((t + HOUR) / DAY);
        const h = solarHour(t);
        const skipped = (dayIndex * 2654435761) % 7 === 0;
        flow[i] = dayIndex % 2 === 0 && h >= 6 && h < 6.5 && !skipped ? 12 + 0.4 * rnd.normal() : 0;
      }
      make('irrigation', (i) => Math.max(0, flow[i]), 1);
      // Water reaches the 10 cm probe 2–6 hours later (a delay spread like a gamma kernel), then drains.
      const lagSteps = Math.round((3.5 * HOUR) / stepMs);
      const spread = Math.max(1, Math.round((1.2 * HOUR) / stepMs));
      const kernel: number[] = [];
      for (let k = 0; k <= lagSteps + 4 * spread; k++) {
        const x = k / (lagSteps || 1);
        kernel.push(Math.pow(x, 4) * Math.exp(-4 * (x - 1)));
      }
      const ksum = kernel.reduce((a, b) => a + b, 0);
      const moisture = new Float64Array(n);
      const noise = ar1(n, 0.7, 0.12, rnd);
      let level = 19;
      const drain = Math.exp(-stepMs / (22 * HOUR));
      for (let i = 0; i < n; i++) {
        let input = 0;
        for (let k = 0; k < kernel.length && k <= i; k++) input += flow[i - k] * kernel[k];
        // each watering (≈ 72 L over 30 min) raises the probe by about 8 % vol in total, spread by the kernel
        level = 17 + (level - 17) * drain + (0.11 * input) / ksum;
        moisture[i] = level + noise[i];
      }
      make('soil_moisture', (i) => moisture[i]);
      // Soil temperature: the daily swing of outdoor air, damped and about three hours late, and persistent.
      const persistence = ar1(n, 0.995, 0.6, rnd);
      make('soil_t', (i) => {
        const t = times[i];
        const season = 11 - 6 * ((t - start) / (90 * DAY));
        const daily = 1.6 * Math.sin((2 * Math.PI * (solarHour(t) - 9 - 3)) / 24);
        return season + daily + persistence[i];
      });
      break;
    }
    case 'Cold room 3': {
      // Door openings: a few an hour in working hours, rare otherwise; each adds warm air that is
      // gone within a few readings (a moving-average-like response), seconds open per interval.
      const door = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        const rate = isWorkingHours(times[i]) ? 0.22 : 0.015;
        if (rnd.next() < rate) door[i] = Math.min(110, 10 + 40 * rnd.next());
      }
      make('door', (i) => door[i], 0);
      const noise = ar1(n, 0.3, 0.12, rnd);
      const driftStart = times[n - 1] - 10 * DAY;
      make('air_t', (i) => {
        const opened = (k: number) => (i - k >= 0 ? door[i - k] / 40 : 0);
        const disturbance = 0.9 * opened(0) + 0.5 * opened(1) + 0.2 * opened(2);
        const drift = times[i] > driftStart ? (5.2 * (times[i] - driftStart)) / (10 * DAY) : 0;
        return 4.0 + disturbance + drift + noise[i];
      });
      break;
    }
    case 'Water bath B': {
      const e = ar1(n, 0.96, 0.18, rnd);
      make('bath_t', (i) => 37.0 + e[i], 3);
      break;
    }
    case 'Fern Brook gauge': {
      // Base flow receding slowly, rain events that rise within an hour and recede over a day or two.
      const level = new Float64Array(n);
      let storm = 0;
      for (let i = 0; i < n; i++) {
        if (rnd.next() < 0.0015) storm += 15 + 35 * rnd.next();
        storm *= Math.exp(-stepMs / (20 * HOUR));
        level[i] = 38 - (8 * (times[i] - start)) / (90 * DAY) + storm;
      }
      const noise = ar1(n, 0.6, 0.3, rnd);
      make('level', (i) => level[i] + noise[i], 1);
      const oxNoise = ar1(n, 0.85, 0.15, rnd);
      make('do', (i) => 10.2 + 1.1 * Math.sin((2 * Math.PI * (solarHour(times[i]) - 9)) / 24) - 0.02 * (level[i] - 38) + oxNoise[i]);
      break;
    }
    default:
      throw new Error(`no signal model for the demo logger "${logger.name}"`);
  }
  return out;
}
