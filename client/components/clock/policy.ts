/**
 * Which zone a time is shown on: the one policy every page follows (issue #19 item 1).
 * Readings-related times (charts, readings tables, alerts, quarantine, uploads, notes,
 * diagnostics ranges, exports) are `readings`; everything else (audit, keys, tokens, members,
 * invitations, billing dates) is `account`.
 */
import type { ClockChoice } from '@shared/contract/me.ts';
import { isKnownTimeZone } from '@shared/policies/time-zones.ts';

export type { ClockChoice };

/** What kind of time is shown: tied to a logger's readings, or to the account and the lab. */
export type TimeKind = 'readings' | 'account';

/** The browser's own IANA zone, or UTC when the browser does not say (or says something unknown). */
export function browserTimeZone(): string {
  const zone = Intl.DateTimeFormat().resolvedOptions().timeZone;
  return zone && isKnownTimeZone(zone) ? zone : 'UTC';
}

/**
 * "My zone": the person's saved time zone when it is one the platform knows, else the
 * browser's, else UTC.
 */
export function myTimeZone(saved: string | null | undefined, browser: () => string = browserTimeZone): string {
  if (saved && isKnownTimeZone(saved)) return saved;
  const b = browser();
  return b && isKnownTimeZone(b) ? b : 'UTC';
}

/**
 * The IANA zone a time is shown on. `logger` (the default choice): readings-related times on the
 * logger's zone, everything else on the person's own; where no logger is involved (a lab-wide
 * list, an unknown or missing logger zone) the person's zone stands in, since there is no logger
 * clock to read. `mine`: the person's zone for everything. `utc`: UTC for everything.
 */
export function shownZone({ kind, choice, myZone, loggerZone }: { kind: TimeKind; choice: ClockChoice; myZone: string; loggerZone?: string | null }): string {
  if (choice === 'utc') return 'UTC';
  if (choice === 'logger' && kind === 'readings' && loggerZone && isKnownTimeZone(loggerZone)) return loggerZone;
  return myZone;
}
