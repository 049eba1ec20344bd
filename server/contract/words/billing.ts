/** Words of the billing area (plans and payment): field labels and reasons. */

/** Fields of starting a checkout and of changing plans. */
export const BILLING_LABELS = {
  plan: 'Plan',
  acknowledgeLimits: 'Switch although the lab uses more than the plan allows',
} as const;

/** Reasons the billing area's own checks give. */
export const BILLING_REASONS = {
  planRequired: 'choose a plan',
  unknownPlan: 'is not a plan Lagbook offers',
} as const;
