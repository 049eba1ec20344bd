import { useQuery } from '@tanstack/react-query';
import { meQueryOptions } from '../../features/auth/api/get-me.ts';
import { myTimeZone, shownZone, type ClockChoice, type TimeKind } from './policy.ts';

/** The signed-in person's clock: their choice, their zone, and the zone any time is shown on. */
export interface Clock {
  choice: ClockChoice;
  myZone: string;
  /** The IANA zone to show a time of this kind on (see {@link shownZone}). */
  zoneFor(kind: TimeKind, loggerZone?: string | null): string;
}

/**
 * The signed-in person's clock, read from the `GET /api/v1/me` answer the signed-in layout has
 * already loaded (this hook never fetches it itself, so a page adds no request); before that
 * answer is there, the default choice (`logger`) and the browser's zone.
 */
export function useClock(): Clock {
  const me = useQuery({ ...meQueryOptions(), enabled: false }).data;
  const choice: ClockChoice = me?.user.clock ?? 'logger';
  const myZone = myTimeZone(me?.user.timeZone);
  return { choice, myZone, zoneFor: (kind, loggerZone) => shownZone({ kind, choice, myZone, loggerZone }) };
}
