import { AnalysisInputError } from './analysis-input-error.ts';

/**
 * Checks that an option is a whole number in [min, max] and returns it, so every engine
 * function reports a bad lag or order the same way, e.g.
 * `acf: maxLag must be a whole number from 0 to 119 (got 500)`.
 *
 * Cost: O(1).
 */
export function integerOption(fn: string, name: string, value: number, min: number, max = Infinity): number {
  if (!Number.isInteger(value) || value < min || value > max) {
    const range = max === Infinity ? `at least ${min}` : `from ${min} to ${max}`;
    throw new AnalysisInputError(`${fn}: ${name} must be a whole number ${range} (got ${value})`);
  }
  return value;
}
