import { z } from 'zod';

/**
 * Reasons every area's checks share, in plain words for a lab scientist or technician, and the
 * plain reason for any check a schema left without its own message (zod's default texts name
 * types and keys). Pure (zod only), so the client's forms read the same words.
 */
export const REASONS = {
  required: 'is required',
  notEmpty: 'must not be empty',
  text: 'must be text',
  number: 'must be a number',
  finite: 'must be an ordinary number (not infinite)',
  whole: 'must be a whole number',
  positive: 'must be above 0',
  yesNo: 'must be yes or no (true or false)',
  list: 'must be a list',
  object: 'must be a group of fields',
  email: 'must be a valid e-mail address',
  isoTime: 'must be a date and time with its zone, e.g. 2026-03-01T14:00:00+01:00',
  timeZone: 'must be a time zone such as Europe/Berlin or UTC',
  notAccepted: 'is not in a form Lagbook accepts',
  invalid: 'is not valid',
} as const;

/** `must be at most N characters`, the length limit of a text field. */
export const atMostChars = (n: number) => `must be at most ${n.toLocaleString('en-GB')} characters`;
/** `must be at least N characters`. */
export const atLeastChars = (n: number) => `must be at least ${n.toLocaleString('en-GB')} characters`;
/** `must be at most N` (with an optional unit: `must be at most 7 days`). */
export const atMost = (n: number, unit = '') => `must be at most ${n.toLocaleString('en-GB')}${unit ? ` ${unit}` : ''}`;
/** `must be at least N` (with an optional unit). */
export const atLeast = (n: number, unit = '') => `must be at least ${n.toLocaleString('en-GB')}${unit ? ` ${unit}` : ''}`;
/** `must be one of a, b or c`. */
export const oneOf = (values: readonly unknown[]) =>
  values.length <= 1 ? `must be ${String(values[0])}` : `must be one of ${values.slice(0, -1).map(String).join(', ')} or ${String(values.at(-1))}`;

/**
 * A key as people read it when no catalogue names it: `expectedIntervalS` → "expected interval s",
 * `snake_case` → "snake case". A last resort so that no identifier reaches a message.
 */
export function humanizeKey(key: string): string {
  const words = key
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[_.-]+/g, ' ')
    .trim()
    .toLowerCase();
  return words === '' ? 'field' : words;
}

type Issue = z.core.$ZodRawIssue;

const TYPE_REASONS: Record<string, string> = {
  string: REASONS.text,
  number: REASONS.number,
  int: REASONS.whole,
  bigint: REASONS.whole,
  boolean: REASONS.yesNo,
  array: REASONS.list,
  object: REASONS.object,
  record: REASONS.object,
  date: REASONS.isoTime,
};

function sizeReason(issue: Issue & { origin?: string }, bound: number, inclusive: boolean, side: 'max' | 'min'): string {
  const origin = issue.origin;
  if (origin === 'string') {
    if (side === 'min' && bound <= 1) return REASONS.notEmpty;
    return side === 'max' ? atMostChars(inclusive ? bound : bound - 1) : atLeastChars(inclusive ? bound : bound + 1);
  }
  if (origin === 'array' || origin === 'set') {
    if (side === 'min' && bound <= 1) return 'must list at least one item';
    return side === 'max' ? `must list at most ${bound.toLocaleString('en-GB')} items` : `must list at least ${bound.toLocaleString('en-GB')} items`;
  }
  if (side === 'max') return inclusive ? atMost(bound) : `must be below ${bound.toLocaleString('en-GB')}`;
  return inclusive ? atLeast(bound) : `must be above ${bound.toLocaleString('en-GB')}`;
}

/**
 * The plain reason for a check that has no message of its own, by the kind of check that
 * failed; installed as zod's global error text (`z.config`) so every schema answers in words.
 */
export function plainIssueReason(issue: Issue): string {
  switch (issue.code) {
    case 'invalid_type':
      if (issue.input === undefined) return REASONS.required;
      return TYPE_REASONS[String(issue.expected)] ?? REASONS.invalid;
    case 'too_big':
      return sizeReason(issue, Number(issue.maximum), issue.inclusive !== false, 'max');
    case 'too_small':
      return sizeReason(issue, Number(issue.minimum), issue.inclusive !== false, 'min');
    case 'invalid_format':
      if (issue.format === 'email') return REASONS.email;
      if (issue.format === 'datetime' || issue.format === 'date') return REASONS.isoTime;
      return REASONS.notAccepted;
    case 'invalid_value':
      return oneOf(issue.values);
    case 'not_multiple_of':
      return `must be a multiple of ${String(issue.divisor)}`;
    case 'unrecognized_keys':
      return `${issue.keys.length === 1 ? 'is not a field Lagbook knows' : 'are not fields Lagbook knows'}: ${issue.keys.map(humanizeKey).join(', ')}`;
    case 'invalid_union':
      return REASONS.notAccepted;
    case 'invalid_key':
    case 'invalid_element':
      return 'contains an entry that is not valid';
    default:
      return REASONS.invalid;
  }
}

z.config({ customError: (issue) => plainIssueReason(issue) });
