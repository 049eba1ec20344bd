import type { Ref, SelectHTMLAttributes } from 'react';
import { SelectField } from './form-field.tsx';

/** The reader's own IANA time zone as the browser reports it (falls back to UTC); kept with the clock policy. */
export { browserTimeZone } from './clock/policy.ts';

/**
 * The IANA zones this browser knows, sorted, always including `UTC` (some engines list only
 * geographic zones) and any `extra` zone (e.g. a stored value the list lacks), so a form
 * never silently changes a saved zone.
 */
export function timeZoneChoices(...extra: Array<string | undefined>): string[] {
  const known = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : [];
  return [...new Set([...known, 'UTC', ...extra.filter((z): z is string => !!z)])].sort();
}

/** A labelled picker of IANA time zones; takes react-hook-form's `register()` result like {@link SelectField}. */
export function TimeZoneSelect({
  label,
  hint,
  error,
  current,
  ...select
}: {
  label: string;
  hint?: string;
  error?: string;
  /** A zone to offer even if the browser does not list it (the saved one). */
  current?: string;
} & SelectHTMLAttributes<HTMLSelectElement> & { ref?: Ref<HTMLSelectElement> }) {
  return (
    <SelectField label={label} hint={hint} error={error} {...select}>
      {timeZoneChoices(current).map((zone) => (
        <option key={zone} value={zone}>
          {zone.replaceAll('_', ' ')}
        </option>
      ))}
    </SelectField>
  );
}
