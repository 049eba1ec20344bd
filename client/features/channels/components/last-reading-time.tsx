import { relativeTimeText } from '../../../components/relative-time.tsx';
import { formatZoned, zoneOffsetLabel } from '../../../components/zoned-time.ts';

/** When the last reading arrived: relative to the server's `now`, and exact on the logger's clock with its offset. */
export function LastReadingTime({ reading, timezone, now }: { reading: { ts: number; time: string } | null; timezone: string; now: number }) {
  if (!reading) return <span className="text-ink-soft">never</span>;
  return (
    <time dateTime={reading.time} className="inline-flex flex-col">
      <span>{relativeTimeText(reading.time, now)}</span>
      <span className="whitespace-nowrap font-mono text-xs text-ink-soft">
        {formatZoned(reading.ts, timezone)} {zoneOffsetLabel(reading.ts, timezone)}
      </span>
    </time>
  );
}
