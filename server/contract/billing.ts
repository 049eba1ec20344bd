import { z } from 'zod';
import type { IsoTime } from './common.ts';
import { BILLING_REASONS } from './words/billing.ts';

/**
 * A lab's plan, usage and payment: the inputs of the billing routes, what they answer, and what
 * the payment service's webhook answers. Shared by the routes and the client's billing page.
 * Amounts are in the currency's smallest unit (cents).
 */

const planKey = z.string({ error: BILLING_REASONS.planRequired }).trim().min(1, BILLING_REASONS.planRequired).max(40, BILLING_REASONS.unknownPlan);

/** `POST …/billing/checkout-session`: the paid plan to subscribe to (a key from tenants/plans.json). */
export const startCheckoutSchema = z.object({ plan: planKey });
export type StartCheckoutInput = z.infer<typeof startCheckoutSchema>;

/** `POST …/billing/plan-change`: the paid plan to move the subscription to. */
export const changePlanSchema = z.object({
  plan: planKey,
  /** Switch even though the lab already uses more than the plan allows (after a 409 plan_too_small). */
  acknowledgeLimits: z.boolean().default(false),
});
/** What the client sends (`acknowledgeLimits` may be left out). */
export type ChangePlanInput = z.input<typeof changePlanSchema>;

/** The state of a lab's subscription as the payment service last confirmed it. */
export type BillingStatus = 'none' | 'active' | 'past_due' | 'canceled';

/** A plan's limits, as in tenants/plans.json. */
export interface PlanLimits {
  /** Readings the lab may keep stored. */
  readings: number;
  /** Loggers registered and not retired. */
  loggers: number;
  /** Members plus pending invitations. */
  members: number;
  /** How many days back the lab may browse and analyse. */
  historyDays: number;
  /** Rows the lab may keep in quarantine. */
  quarantinedRows: number;
}

/** A plan of the catalog. */
export interface BillingPlan {
  key: string;
  name: string;
  summary: string;
  /** Per month, in the currency's smallest unit. */
  monthlyAmount: number;
  paid: boolean;
  limits: PlanLimits;
}

/** One UTC day of the usage trend (`day` is `YYYY-MM-DD`). */
export interface UsageDay {
  day: string;
  readings: number;
  loggers: number;
  members: number;
}

/** `GET …/billing`: plan, status, usage against limits, 30-day trend and the plans on offer. */
export interface BillingOverview {
  /** The plan whose limits apply now. */
  plan: BillingPlan;
  /** The plan the payment service last confirmed (differs from `plan` once a grace period is over). */
  subscribedPlanKey: string;
  status: BillingStatus;
  graceUntil: IsoTime | null;
  usage: { readings: number; loggers: number; members: number; quarantinedRows: number };
  limits: PlanLimits;
  /** True when stored readings are at or over the limit: ingestion is refused. */
  ingestionRefused: boolean;
  historyStartsAt: IsoTime;
  trend: UsageDay[];
  currency: string;
  plans: BillingPlan[];
}

/** One invoice (amounts in the currency's smallest unit). */
export interface Invoice {
  id: string;
  number: string | null;
  status: string | null;
  currency: string;
  amountDue: number;
  amountPaid: number;
  created: IsoTime;
  hostedUrl: string | null;
  pdfUrl: string | null;
}

/** `GET …/billing/invoices`: newest first. */
export interface InvoicesAnswer {
  invoices: Invoice[];
}

/** `POST …/billing/checkout-session` and `…/portal-session`: the payment service's page to open. */
export interface BillingSessionAnswer {
  url: string;
}

/** `POST …/billing/plan-change` (202): the plan asked for; it applies when the payment service confirms. */
export interface PlanChangeAnswer {
  plan: string;
  message: string;
}

/** The envelope of a Stripe event, for the API document only: the route verifies the raw bytes and never parses them with this. */
export const stripeEventBody = z
  .object({ id: z.string(), type: z.string(), created: z.number().int(), data: z.object({ object: z.record(z.string(), z.unknown()) }) })
  .describe('a Stripe event, signed in the Stripe-Signature header over the exact bytes');

/** What happened to one delivered webhook event. */
export type WebhookOutcome = 'applied' | 'unchanged' | 'duplicate' | 'unknown-lab';

/** `POST /api/v1/billing/stripe-webhooks`: the event was applied or known already. */
export interface StripeWebhookAnswer {
  received: true;
  outcome: WebhookOutcome;
}
