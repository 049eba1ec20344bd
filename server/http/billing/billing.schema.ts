import { z } from 'zod';

/** `POST /billing/checkout-session`: the paid plan to subscribe to (a key from tenants/plans.json). */
export const startCheckoutSchema = z.object({
  plan: z.string().trim().min(1, 'required').max(40, 'at most 40 characters'),
});

export type StartCheckoutInput = z.infer<typeof startCheckoutSchema>;

/** `POST /billing/plan-change`: the paid plan to move the subscription to. */
export const changePlanSchema = z.object({
  plan: z.string().trim().min(1, 'required').max(40, 'at most 40 characters'),
  /** Switch even though the lab already uses more than the plan allows (after a 409 plan_too_small). */
  acknowledgeLimits: z.boolean().default(false),
});

export type ChangePlanInput = z.input<typeof changePlanSchema>;
