const UNITS: Array<[Intl.RelativeTimeFormatUnit, number]> = [
  ['year', 365 * 86_400_000],
  ['month', 30 * 86_400_000],
  ['week', 7 * 86_400_000],
  ['day', 86_400_000],
  ['hour', 3_600_000],
  ['minute', 60_000],
  ['second', 1000],
];
const ABSOLUTE = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/**
 * How long ago (or ahead) `iso` is from `now`, in the largest whole unit that fits, worded by
 * the platform's `Intl.RelativeTimeFormat` ("5 minutes ago", "yesterday", "in 2 hours").
 * Months count as 30 days and years as 365: close enough for "last seen", never for sums.
 */
export function relativeTimeText(iso: string, now: number, locale?: string): string {
  const diff = Date.parse(iso) - now;
  if (Number.isNaN(diff)) return iso;
  const format = new Intl.RelativeTimeFormat(locale, { numeric: 'auto' });
  for (const [unit, ms] of UNITS) {
    if (Math.abs(diff) >= ms) return format.format(Math.trunc(diff / ms), unit);
  }
  return format.format(0, 'second');
}

/**
 * An instant shown both ways: relative ("12 minutes ago") for a quick look, with the exact
 * local date and time beside it and the ISO value in `<time dateTime>`. `never` is shown
 * when there is no instant.
 */
export function RelativeTime({ iso, never = 'never', now = Date.now() }: { iso: string | null; never?: string; now?: number }) {
  if (!iso) return <span className="text-ink-soft">{never}</span>;
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return <span>{iso}</span>;
  return (
    <time dateTime={iso} className="inline-flex flex-col">
      <span>{relativeTimeText(iso, now)}</span>
      <span className="text-xs text-ink-soft">{ABSOLUTE.format(date)}</span>
    </time>
  );
}
