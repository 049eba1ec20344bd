import { formatCount } from './billing-format.ts';

/**
 * The last 30 days of stored readings as a small SVG line with the plan's limit as a dashed
 * rule, scaled so both fit. Days without a snapshot are simply absent (the line joins its neighbours).
 */
export function UsageSparkline({ points, limit }: { points: Array<{ day: string; readings: number }>; limit: number }) {
  if (points.length === 0) return <p className="text-sm text-ink-soft">The trend appears after the first daily usage count.</p>;
  const width = 320;
  const height = 72;
  const top = Math.max(limit, ...points.map((p) => p.readings)) * 1.05 || 1;
  const x = (i: number) => (points.length === 1 ? width / 2 : (i / (points.length - 1)) * width);
  const y = (v: number) => height - (v / top) * height;
  const line = points.map((p, i) => `${i === 0 ? 'M' : 'L'}${x(i).toFixed(1)},${y(p.readings).toFixed(1)}`).join(' ');
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
        {points.length === 1 && <circle cx={x(0)} cy={y(last.readings)} r={3} className="fill-lichen" />}
      </svg>
      <figcaption className="text-xs text-ink-soft">
        {points[0].day} – {last.day}; dashed: the plan’s limit ({formatCount(limit)})
      </figcaption>
    </figure>
  );
}
