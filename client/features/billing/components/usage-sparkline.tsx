import { formatCount } from './billing-format.ts';

const DAY_MS = 86_400_000;

/** Whole days since the epoch of a 'YYYY-MM-DD' day (UTC calendar; the day strings carry no zone). */
const dayNumber = (day: string) => Math.round(Date.parse(`${day}T00:00:00Z`) / DAY_MS);

/**
 * The SVG path of a step line through one count per day: each day's count holds across that
 * day until the next day with a count (a day without a snapshot keeps the previous count), and
 * the last count runs to the end of its day — so a single day is a level line, not a dot.
 * `x` takes days since the first day (0 … span), `y` a count.
 */
export function usageStepPath(points: ReadonlyArray<{ day: string; readings: number }>, x: (days: number) => number, y: (v: number) => number): string {
  if (points.length === 0) return '';
  const first = dayNumber(points[0].day);
  const parts = [`M${x(0).toFixed(1)},${y(points[0].readings).toFixed(1)}`];
  for (let i = 1; i < points.length; i++) {
    parts.push(`H${x(dayNumber(points[i].day) - first).toFixed(1)}`, `V${y(points[i].readings).toFixed(1)}`);
  }
  parts.push(`H${x(dayNumber(points[points.length - 1].day) - first + 1).toFixed(1)}`);
  return parts.join(' ');
}

/**
 * The last 30 days of stored readings as a small SVG step line over the days (one count per
 * day, held until the next) with the plan's limit as a dashed rule, scaled so both fit.
 */
export function UsageSparkline({ points, limit }: { points: Array<{ day: string; readings: number }>; limit: number }) {
  if (points.length === 0) return <p className="text-sm text-ink-soft">The trend appears after the first daily usage count.</p>;
  const width = 320;
  const height = 72;
  const top = Math.max(limit, ...points.map((p) => p.readings)) * 1.05 || 1;
  const span = dayNumber(points[points.length - 1].day) - dayNumber(points[0].day) + 1;
  const x = (days: number) => (days / span) * width;
  const y = (v: number) => height - (v / top) * height;
  const line = usageStepPath(points, x, y);
  const last = points[points.length - 1];
  return (
    <figure className="grid gap-1">
      <svg
        viewBox={`0 0 ${width} ${height}`}
        width={width}
        height={height}
        role="img"
        aria-label={`Stored readings over ${points.length} day(s), latest ${formatCount(last.readings)}`}
        className="overflow-visible"
      >
        <line x1={0} x2={width} y1={y(limit)} y2={y(limit)} className="stroke-alert" strokeDasharray="4 4" strokeWidth={1} />
        <path d={line} fill="none" className="stroke-lichen" strokeWidth={2} />
      </svg>
      <figcaption className="text-xs text-ink-soft">
        {points[0].day} – {last.day}; dashed: the plan’s limit ({formatCount(limit)})
      </figcaption>
    </figure>
  );
}
