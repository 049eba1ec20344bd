import type { z } from 'zod';
import { AppError } from '../../errors.ts';

/** An alert rule that cannot work (negative durations, low above high …): 422, messages read `field: reason`. */
export class InvalidAlertRuleError extends AppError {
  constructor(message: string, details?: unknown) {
    super(422, 'invalid_rule', message, details);
  }
}

/** Parses rule input with its zod schema; failures become {@link InvalidAlertRuleError} listing every field. */
export function parseRuleInput<S extends z.ZodType>(schema: S, input: unknown, prefix = ''): z.infer<S> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const issues = result.error.issues.map((i) => ({ path: [prefix, ...i.path.map(String)].filter(Boolean).join('.') || 'body', message: i.message }));
  throw new InvalidAlertRuleError(issues.map((i) => `${i.path}: ${i.message}`).join('; '), issues);
}
