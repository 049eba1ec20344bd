import { sparklinePath } from './sparkline-path.ts';

/**
 * The last 24 hourly means of a channel as a tiny line (gaps left open), with a text
 * alternative giving the range of the means for screen readers.
 */
export function Sparkline({ means, unit }: { means: ReadonlyArray<number | null>; unit: string | null }) {
  const width = 96;
  const height = 24;
  const { d, dots } = sparklinePath(means, width, height);
  const present = means.filter((v): v is number => v !== null);
  const text =
    present.length === 0
      ? 'No readings in the last 24 hours'
      : `Hourly means over the last 24 hours from ${fmt(Math.min(...present))} to ${fmt(Math.max(...present))}${unit ? ` ${unit}` : ''}; ${means.length - present.length} hours without readings`;
  return (
    <svg viewBox={`0 0 ${width} ${height}`} width={width} height={height} role="img" aria-label={text} className="text-lichen">
      <title>{text}</title>
      <line x1="0" x2={width} y1={height - 0.5} y2={height - 0.5} stroke="var(--color-rule)" strokeWidth="1" />
      {d && <path d={d} fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round" strokeLinecap="round" />}
      {dots.map(([x, y]) => (
        <circle key={`${x}-${y}`} cx={x} cy={y} r="1.5" fill="currentColor" />
      ))}
    </svg>
  );
}

const fmt = (v: number) => (Math.abs(v) >= 1000 ? v.toFixed(0) : Number(v.toPrecision(3)).toString());
