/**
 * A stored time as the API shows it (ISO 8601, UTC), null staying null. Overloaded so that a
 * time that is always there is typed as a string in the answer.
 */
export function isoTime(d: Date): string;
export function isoTime(d: Date | null): string | null;
export function isoTime(d: Date | null): string | null {
  return d ? d.toISOString() : null;
}
