import type { z } from 'zod';

/**
 * Number inputs for react-hook-form with the server's zod schemas. A text box holds a
 * string; these turn it into what the schema expects: an empty optional box becomes `null`
 * ("not set"), an empty required box or text that is no number becomes NaN, which the
 * schema refuses with {@link numberMessages}' wording.
 */
export function optionalNumber(value: unknown): number | null {
  if (value === null || value === undefined) return null;
  const text = String(value).trim();
  return text === '' ? null : Number(text);
}

/** A required number box: empty or non-numeric text becomes NaN (refused as "must be a number"). */
export function requiredNumber(value: unknown): number {
  const text = value === null || value === undefined ? '' : String(value).trim();
  return text === '' ? Number.NaN : Number(text);
}

/**
 * Parse options for `zodResolver(schema, numberMessages)`: the schemas' own messages stay
 * ("must be at least 1 second"); only zod's generic wording for a missing or non-numeric
 * number is replaced by the house style "must be a number".
 */
export const numberMessages: Partial<z.core.ParseContext<z.core.$ZodIssue>> = {
  error: (issue) => (issue.code === 'invalid_type' && issue.expected === 'number' ? 'must be a number' : undefined),
};
