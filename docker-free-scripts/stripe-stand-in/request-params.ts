import { parameterInvalid, parameterUnknown } from './stripe-api-error.ts';

/** Parsed form or query parameters as `qs` (Express's extended parser) returns them. */
export type StripeParams = Record<string, unknown>;

/** Rejects any top-level parameter the endpoint does not take, as Stripe does, so client bugs surface early. */
export function rejectUnknownParams(params: StripeParams, allowed: readonly string[]): void {
  for (const key of Object.keys(params)) {
    if (!allowed.includes(key)) throw parameterUnknown(key);
  }
}

/** A string parameter or undefined when absent; anything else is a 400. */
export function optionalString(params: StripeParams, name: string): string | undefined {
  const value = params[name];
  if (value === undefined) return undefined;
  if (typeof value !== 'string') throw parameterInvalid(name, `Invalid string: ${name} must be a string`);
  return value;
}

/**
 * A list parameter such as `lookup_keys[]`. The SDK sends indexed keys (`lookup_keys[0]`); qs
 * turns those into an array, or into an object past its array limit, so both are accepted.
 */
export function optionalStringList(params: StripeParams, name: string): string[] | undefined {
  const value = params[name];
  if (value === undefined) return undefined;
  const items = typeof value === 'string' ? [value] : typeof value === 'object' && value !== null ? Object.values(value) : null;
  if (!items || !items.every((item): item is string => typeof item === 'string')) {
    throw parameterInvalid(name, `Invalid array: ${name} must be a list of strings`);
  }
  return items;
}

/** A `metadata` hash of string values; absent gives undefined. */
export function optionalMetadata(params: StripeParams): Record<string, string> | undefined {
  const value = params.metadata;
  if (value === undefined) return undefined;
  if (value === '') return {};
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw parameterInvalid('metadata', 'Invalid hash: metadata must be a hash of strings');
  }
  const entries = Object.entries(value);
  if (!entries.every((entry): entry is [string, string] => typeof entry[1] === 'string')) {
    throw parameterInvalid('metadata', 'Invalid hash: metadata values must be strings');
  }
  return Object.fromEntries(entries);
}
