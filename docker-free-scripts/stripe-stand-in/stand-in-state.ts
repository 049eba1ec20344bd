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

/** A Checkout Session in subscription mode (the subset of Stripe's object Lagbook sends and reads). */
export interface StripeCheckoutSession {
  id: string;
  object: 'checkout.session';
  created: number;
  livemode: false;
  mode: 'subscription';
  status: 'open' | 'complete' | 'expired';
  payment_status: 'paid' | 'unpaid';
  customer: string;
  client_reference_id: string | null;
  metadata: Record<string, string>;
  subscription: string | null;
  success_url: string;
  cancel_url: string | null;
  url: string | null;
  amount_total: number;
  currency: string;
  /** Not part of Stripe's object: what the page sells, kept to build the subscription. */
  line_price: string;
  subscription_metadata: Record<string, string>;
}

/** A billing-portal session. */
export interface StripePortalSession {
  id: string;
  object: 'billing_portal.session';
  created: number;
  livemode: false;
  customer: string;
  return_url: string | null;
  url: string;
}

/** A subscription with one item (the subset of Stripe's Subscription object Lagbook reads). */
export interface StripeSubscription {
  id: string;
  object: 'subscription';
  created: number;
  livemode: false;
  customer: string;
  status: 'active' | 'past_due' | 'canceled';
  metadata: Record<string, string>;
  cancel_at_period_end: boolean;
  canceled_at: number | null;
  items: {
    object: 'list';
    data: Array<{ id: string; object: 'subscription_item'; price: StripePrice; quantity: number; current_period_start: number; current_period_end: number }>;
    has_more: false;
    url: string;
  };
}

/** An invoice of a subscription (the subset of Stripe's Invoice object Lagbook reads). */
export interface StripeInvoice {
  id: string;
  object: 'invoice';
  created: number;
  livemode: false;
  customer: string;
  number: string;
  status: 'open' | 'paid';
  currency: string;
  amount_due: number;
  amount_paid: number;
  amount_remaining: number;
  hosted_invoice_url: string;
  invoice_pdf: string | null;
  parent: { type: 'subscription_details'; quote_details: null; subscription_details: { subscription: string; metadata: Record<string, string> } };
}

/** Everything the stand-in remembers; lives only as long as the process. */
export interface StandInState {
  customers: Map<string, StripeCustomer>;
  products: Map<string, StripeProduct>;
  prices: Map<string, StripePrice>;
  checkoutSessions: Map<string, StripeCheckoutSession>;
  portalSessions: Map<string, StripePortalSession>;
  subscriptions: Map<string, StripeSubscription>;
  invoices: Map<string, StripeInvoice>;
}

/** A price offered at start, as the plan catalog describes it. */
export interface StandInPriceSeed {
  lookupKey: string;
  productName: string;
  unitAmount: number;
  currency: string;
  interval: 'month' | 'year';
}
