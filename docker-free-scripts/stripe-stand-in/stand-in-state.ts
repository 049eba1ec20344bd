/** A customer as the stand-in stores and returns it (the subset of Stripe's Customer object Lagbook reads). */
export interface StripeCustomer {
  id: string;
  object: 'customer';
  created: number;
  livemode: false;
  email: string | null;
  name: string | null;
  description: string | null;
  phone: string | null;
  metadata: Record<string, string>;
  balance: number;
  currency: string | null;
  delinquent: boolean;
  preferred_locales: string[];
  invoice_settings: { default_payment_method: string | null };
}

/** A product, created from each configured price so that `price.product` points at something real. */
export interface StripeProduct {
  id: string;
  object: 'product';
  created: number;
  livemode: false;
  active: boolean;
  name: string;
  metadata: Record<string, string>;
}

/** A recurring price (the subset of Stripe's Price object Lagbook reads). */
export interface StripePrice {
  id: string;
  object: 'price';
  created: number;
  livemode: false;
  active: boolean;
  currency: string;
  lookup_key: string | null;
  metadata: Record<string, string>;
  nickname: string | null;
  product: string;
  type: 'recurring';
  billing_scheme: 'per_unit';
  unit_amount: number;
  unit_amount_decimal: string;
  recurring: { interval: 'month' | 'year'; interval_count: number; usage_type: 'licensed' };
}

/** Everything the stand-in remembers; lives only as long as the process. */
export interface StandInState {
  customers: Map<string, StripeCustomer>;
  products: Map<string, StripeProduct>;
  prices: Map<string, StripePrice>;
}

/** A price offered at start, as the plan catalog describes it. */
export interface StandInPriceSeed {
  lookupKey: string;
  productName: string;
  unitAmount: number;
  currency: string;
  interval: 'month' | 'year';
}
