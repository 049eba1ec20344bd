const DATE_TIME = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });
const DATE_ONLY = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });

/**
 * An instant from the API (ISO 8601) shown in the reader's locale and time zone, with the
 * exact value kept machine-readable in `<time dateTime>`.
 */
export function DateTime({ iso, dateOnly = false }: { iso: string; dateOnly?: boolean }) {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return <span>{iso}</span>;
  return <time dateTime={iso}>{(dateOnly ? DATE_ONLY : DATE_TIME).format(date)}</time>;
}
