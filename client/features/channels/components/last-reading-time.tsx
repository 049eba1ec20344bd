import { Instant } from '../../../components/clock/instant.tsx';

/** When the last reading arrived: relative to the server's `now`, and exact on the clock the person chose (the logger's by default). */
export function LastReadingTime({ reading, timezone, now }: { reading: { ts: number; time: string } | null; timezone: string; now: number }) {
  return <Instant at={reading?.ts} kind="readings" loggerZone={timezone} relative now={now} />;
}
