import { formatInstant, instantMs, relativeText, zoneCaption, type InstantPart } from './format.ts';
import type { TimeKind } from './policy.ts';
import { useClock } from './use-clock.ts';

/**
 * One instant on a page, on the clock the person chose for its kind: `2026-12-03 14:00 UTC+01:00`
 * in `<time dateTime>` (the exact ISO value kept machine-readable), the zone's IANA name in the
 * `title`. With `relative`, "12 minutes ago" first and the absolute time beneath. `never` is
 * shown when there is no instant; unreadable text is shown as it came.
 */
export function Instant({
  at,
  kind,
  loggerZone,
  relative = false,
  seconds = false,
  part = 'datetime',
  never = 'never',
  now,
}: {
  at: string | number | null | undefined;
  kind: TimeKind;
  /** The logger's IANA zone, for readings-related times. */
  loggerZone?: string | null;
  relative?: boolean;
  seconds?: boolean;
  part?: InstantPart;
  never?: string;
  /** The clock `relative` counts from (default: now). */
  now?: number;
}) {
  const { zoneFor } = useClock();
  if (at === null || at === undefined || at === '') return <span className="text-ink-soft">{never}</span>;
  const ms = instantMs(at);
  if (ms === null) return <span>{String(at)}</span>;
  const zone = zoneFor(kind, loggerZone);
  const text = formatInstant(ms, zone, { seconds, part });
  // the API's own ISO text when it sent one, else the instant in ISO 8601 (UTC)
  const iso = typeof at === 'string' ? at : new Date(ms).toISOString();
  if (!relative) {
    return (
      <time dateTime={iso} title={zoneCaption(ms, zone)}>
        {text}
      </time>
    );
  }
  return (
    <time dateTime={iso} title={zoneCaption(ms, zone)} className="inline-flex flex-col">
      <span>{relativeText(ms, now ?? Date.now())}</span>
      <span className="text-xs text-ink-soft">{text}</span>
    </time>
  );
}
