import type { z } from 'zod';
import { AppError, ValidationError } from '../../errors.ts';
import { problemsMessage, problemsOfIssues } from '../../contract/words/fields.ts';

/**
 * A well-formed alert rule that cannot work on what it watches (an unusual-reading cycle shorter
 * than two of the channel's expected intervals, too much history to keep): 422 `invalid_rule`,
 * messages read `field: reason`. Input that fails its schema is not this: it answers 400.
 */
export class InvalidAlertRuleError extends AppError {
  constructor(message: string, details?: unknown) {
    super(422, 'invalid_rule', message, details);
  }
}

/**
 * Parses part of a rule's input with its zod schema where only the service knows the schema (a
 * PATCH's new `params`, checked against the stored rule's kind). Failures are invalid input like
 * any other: a {@link ValidationError} (400 `invalid_input`) listing every field under `prefix`,
 * labelled as the rule form names it.
 */
export function parseRuleInput<S extends z.ZodType>(schema: S, input: unknown, prefix = ''): z.infer<S> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const issues = result.error.issues.map((i) => ({ ...i, path: prefix ? [prefix, ...i.path] : i.path }));
  const fields = problemsOfIssues(issues, '/alert-rules');
  throw new ValidationError(problemsMessage(fields), fields);
}
