import { z } from 'zod';

/** `POST /billing/checkout-session`: the paid plan to subscribe to (a key from tenants/plans.json). */
export const startCheckoutSchema = z.object({
  plan: z.string().trim().min(1, 'required').max(40, 'at most 40 characters'),
});

export type StartCheckoutInput = z.infer<typeof startCheckoutSchema>;
