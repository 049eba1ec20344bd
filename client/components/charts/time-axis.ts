/**
 * Tick instants and labels for a chart's time axis read on the clock of a named zone (IANA
 * name). ECharts places time-axis ticks at UTC boundaries, so a day tick sits at 01:00 in
 * Berlin; here the ticks are computed on the zone's wall clock instead (local midnights, whole
 * local hours, Mondays, the first of a month) and handed to ECharts as `customValues`. A day
 * of 23 or 25 hours on a daylight-saving change still gets its tick at 00:00 local, and hour
 * ticks follow the wall clock (a skipped hour is left out, a repeated one drawn once).
 */
import { formatZoned } from '../clock/format.ts';
import { instantAtWallClock, wallClockAt } from '../date-time-input-wall-clock.ts';
import { PALETTE } from './zoom-slider.ts';

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;
const DAY = 24 * HOUR;

/** One way of spacing ticks: its wall-clock step and roughly how long that is, for choosing. */
interface TickStep {
  /** `minutes`/`hours`/`days`: every `size` of them on the wall clock; the others by calendar. */
  unit: 'minutes' | 'hours' | 'days' | 'weeks' | 'half-months' | 'months' | 'years';
  size: number;
  approxMs: number;
}

// Steps below a day only serve ranges up to two days; longer ranges get day ticks and coarser.
const STEPS: TickStep[] = [
  { unit: 'minutes', size: 10, approxMs: 10 * MINUTE },
  { unit: 'minutes', size: 30, approxMs: 30 * MINUTE },
  { unit: 'hours', size: 1, approxMs: HOUR },
  { unit: 'hours', size: 3, approxMs: 3 * HOUR },
  { unit: 'hours', size: 6, approxMs: 6 * HOUR },
  { unit: 'hours', size: 12, approxMs: 12 * HOUR },
  { unit: 'days', size: 1, approxMs: DAY },
  { unit: 'days', size: 2, approxMs: 2 * DAY },
  { unit: 'weeks', size: 1, approxMs: 7 * DAY },
  { unit: 'half-months', size: 1, approxMs: 15 * DAY },
  { unit: 'months', size: 1, approxMs: 30 * DAY },
  { unit: 'months', size: 3, approxMs: 91 * DAY },
  { unit: 'years', size: 1, approxMs: 365 * DAY },
];

/** Ranges up to this long may get ticks at whole hours; longer ones start at local midnights. */
const HOURLY_UP_TO = 2 * DAY;

/** The ticks of one time axis: their instants (ascending) and each one's label. */
export interface TimeAxisTicks {
  /** The step chosen, e.g. `{ unit: 'hours', size: 6 }`. */
  step: { unit: TickStep['unit']; size: number };
  ticks: number[];
  labels: Map<number, string>;
}

/** A wall-clock reading held as if it were a UTC instant (`Date.UTC` of the clock's fields). */
type Wall = number;

/** The first wall-clock tick of `step` at or before `wall`. */
function floorWall(wall: Wall, step: TickStep): Wall {
  const d = new Date(wall);
  const y = d.getUTCFullYear();
  const m = d.getUTCMonth();
  const midnight = Date.UTC(y, m, d.getUTCDate());
  switch (step.unit) {
    case 'minutes':
      return Math.floor(wall / (step.size * MINUTE)) * step.size * MINUTE;
    case 'hours':
      return midnight + Math.floor((wall - midnight) / (step.size * HOUR)) * step.size * HOUR;
    case 'days':
      // odd days of the month for two-day steps, so the 1st always carries a tick
      return Date.UTC(y, m, d.getUTCDate() - ((d.getUTCDate() - 1) % step.size));
    case 'weeks':
      // back to Monday (ISO 8601 weeks start on Monday)
      return midnight - ((d.getUTCDay() + 6) % 7) * DAY;
    case 'half-months':
      return Date.UTC(y, m, d.getUTCDate() >= 16 ? 16 : 1);
    case 'months':
      return Date.UTC(y, m - (m % step.size), 1);
    case 'years':
      return Date.UTC(y, 0, 1);
  }
}

/** The wall-clock tick after `wall` for `step`. */
function nextWall(wall: Wall, step: TickStep): Wall {
  const d = new Date(wall);
  const y = d.getUTCFullYear();
  const m = d.getUTCMonth();
  switch (step.unit) {
    case 'minutes':
      return wall + step.size * MINUTE;
    case 'hours':
      return wall + step.size * HOUR;
    case 'days': {
      const next = Date.UTC(y, m, d.getUTCDate() + step.size);
      // a two-day step restarts at the 1st of each month
      const first = Date.UTC(y, m + 1, 1);
      return next > first ? first : next;
    }
    case 'weeks':
      return wall + 7 * DAY;
    case 'half-months':
      return d.getUTCDate() === 1 ? Date.UTC(y, m, 16) : Date.UTC(y, m + 1, 1);
    case 'months':
      return Date.UTC(y, m + step.size, 1);
    case 'years':
      return Date.UTC(y + 1, 0, 1);
  }
}

/** The finest step giving at most `maxTicks` ticks over `spanMs` (hours only up to two days). */
function chooseStep(spanMs: number, maxTicks: number): TickStep {
  const allowed = STEPS.filter((s) => s.approxMs >= DAY || spanMs <= HOURLY_UP_TO);
  return allowed.find((s) => spanMs / s.approxMs <= maxTicks) ?? STEPS[STEPS.length - 1];
}

/**
 * The label of each tick, ISO-like and 24-hour. On an axis of minutes or hours: `06:00`, with
 * the date instead at a local midnight and before the time on the first tick (`12-03 06:00`),
 * so the day is always named. On an axis of days and longer: the date, `12-03` (a day whose
 * midnight the clock skips starts at 01:00 and still carries its date), with the year
 * (`2026-12-03`) on the first label and wherever the year changes; `2027` on a yearly axis.
 */
function tickLabels(ticks: number[], step: TickStep, timeZone: string): Map<number, string> {
  const labels = new Map<number, string>();
  const withinDay = step.unit === 'minutes' || step.unit === 'hours';
  let lastYear = '';
  ticks.forEach((t, i) => {
    const [date, time] = formatZoned(t, timeZone).split(' '); // `2026-12-03`, `06:00`
    const year = date.slice(0, 4);
    const day = year !== lastYear ? date : date.slice(5);
    let label: string;
    if (step.unit === 'years') label = year;
    else if (!withinDay || time === '00:00') label = day;
    else label = i === 0 ? `${date.slice(5)} ${time}` : time;
    lastYear = year;
    labels.set(t, label);
  });
  return labels;
}

/**
 * The ticks of a time axis from `from` to `to` (epoch ms) on the clock of `timeZone`: whole
 * local minutes or hours (10 min, 30 min, 1 h, 3 h, 6 h, 12 h) for ranges of up to two days,
 * otherwise local midnights every day or second day, Mondays, the 1st and 16th, the 1st of a
 * month or quarter, or New Year — the finest spacing that gives at most `maxTicks` ticks.
 * Local times are turned into instants with the zone's rules (IANA time zone database through
 * `Intl.DateTimeFormat`), so each tick is at the named wall-clock time on every day, including
 * the days the clocks change.
 */
export function timeAxisTicks(from: number, to: number, timeZone: string, maxTicks = 8): TimeAxisTicks {
  const step = chooseStep(Math.max(0, to - from), maxTicks);
  const ticks: number[] = [];
  if (Number.isFinite(from) && Number.isFinite(to) && to >= from) {
    // walk the wall clock from the tick at or before `from`; the cap only guards against a loop
    for (let wall = floorWall(wallClockAt(from, timeZone), step), n = 0; n < 1000; wall = nextWall(wall, step), n++) {
      const t = instantAtWallClock(wall, timeZone).ms;
      if (t > to) break;
      if (t >= from && ticks[ticks.length - 1] !== t) ticks.push(t);
    }
  }
  return { step: { unit: step.unit, size: step.size }, ticks, labels: tickLabels(ticks, step, timeZone) };
}

/**
 * The parts of an ECharts time axis (`xAxis`) that place ticks, labels and vertical grid lines
 * at {@link timeAxisTicks}: `axisTick.customValues` (which `splitLine` follows) and
 * `axisLabel.customValues` with a formatter that writes each tick's label. `axisLabel` extras
 * (shown or not, line height) are merged in.
 */
export function zonedTimeAxis(from: number, to: number, timeZone: string, axisLabel: { show?: boolean; lineHeight?: number } = {}) {
  const { ticks, labels } = timeAxisTicks(from, to, timeZone);
  return {
    axisTick: { customValues: ticks },
    splitLine: { show: true, lineStyle: { color: PALETTE.rule, opacity: 0.6 } },
    axisLabel: {
      hideOverlap: true,
      ...axisLabel,
      customValues: ticks,
      formatter: (v: number) => labels.get(v) ?? timeLabel(v, timeZone),
    },
  };
}

/**
 * A single instant in the axis's wording, `2026-12-03 14:00` on the zone's clock: for the zoom
 * slider's end labels and any label ECharts asks for that is not one of the ticks.
 */
export function timeLabel(ms: number, timeZone: string): string {
  return formatZoned(ms, timeZone);
}
