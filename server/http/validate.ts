import type { z } from 'zod';
import { zodToValidationError } from './middleware/error-handler.ts';

/** Parses input with a zod schema; failures become a 400 whose message reads `field: reason`. */
export function parseInput<S extends z.ZodType>(schema: S, input: unknown): z.infer<S> {
  const result = schema.safeParse(input);
  if (!result.success) throw zodToValidationError(result.error);
  return result.data;
}
