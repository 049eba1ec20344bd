import { stripeId, unixNow } from './stripe-objects.ts';
import type { StandInPriceSeed, StandInState, StripeProduct } from './stand-in-state.ts';

/**
 * Creates one product per distinct product name and one active recurring price per seed, so
 * the app can look prices up by `lookup_key` as it would in a Stripe test account.
 */
export function seedPrices(state: StandInState, seeds: readonly StandInPriceSeed[]): void {
  const productsByName = new Map<string, StripeProduct>();
  const created = unixNow();
  for (const seed of seeds) {
    let product = productsByName.get(seed.productName);
    if (!product) {
      product = { id: stripeId('prod'), object: 'product', created, livemode: false, active: true, name: seed.productName, metadata: {} };
      productsByName.set(seed.productName, product);
      state.products.set(product.id, product);
    }
    const id = stripeId('price');
    state.prices.set(id, {
      id,
      object: 'price',
      created,
      livemode: false,
      active: true,
      currency: seed.currency.toLowerCase(),
      lookup_key: seed.lookupKey,
      metadata: {},
      nickname: null,
      product: product.id,
      type: 'recurring',
      billing_scheme: 'per_unit',
      unit_amount: seed.unitAmount,
      unit_amount_decimal: String(seed.unitAmount),
      recurring: { interval: seed.interval, interval_count: 1, usage_type: 'licensed' },
    });
  }
}
