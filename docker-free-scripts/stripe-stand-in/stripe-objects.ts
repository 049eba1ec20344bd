import { randomBytes } from 'node:crypto';

const ID_ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';

/** A Stripe-like object id: the resource prefix (`cus`, `price`, `prod`, `req`) and 24 random characters. */
export function stripeId(prefix: string): string {
  const bytes = randomBytes(24);
  let suffix = '';
  for (const byte of bytes) suffix += ID_ALPHABET[byte % ID_ALPHABET.length];
  return `${prefix}_${suffix}`;
}

/** Current Unix time in seconds, the unit of Stripe's `created` fields. */
export function unixNow(): number {
  return Math.floor(Date.now() / 1000);
}

/** Stripe's list envelope: `{ object: 'list', data, has_more, url }`. */
export interface StripeList<T> {
  object: 'list';
  data: T[];
  has_more: boolean;
  url: string;
}

/** Wraps one page of results in Stripe's list envelope. */
export function stripeList<T>(url: string, data: T[], hasMore: boolean): StripeList<T> {
  return { object: 'list', data, has_more: hasMore, url };
}
