import type Stripe from 'stripe';
import type { Db } from '../../db/create-db.ts';
import { inLab, type DbOrTrx } from '../../db/tenant-scope.ts';
import { labBillingRepo } from '../../db/lab-billing.repo.ts';
import { stripeEventsRepo } from '../../db/stripe-events.repo.ts';
import { crossLabRepo } from '../../db/cross-lab.repo.ts';
import { labsRepo } from '../../db/labs.repo.ts';
import { auditRepo } from '../../db/audit.repo.ts';
import { AppError } from '../../errors.ts';
import type { Mailer } from '../../integrations/mail/create-mailer.ts';
import type { LogWriter } from '../../log-writer.ts';
import { billingChange, eventParties } from './billing-change.ts';
import { paymentFailedMail } from './billing-mail.ts';
import { mailLabAdmins } from './notify-admins.ts';
import type { PlanCatalog } from './plan-catalog.ts';

/** What happened to one delivered event. */
export type WebhookOutcome = 'applied' | 'unchanged' | 'duplicate' | 'unknown-lab';

/** A webhook whose Stripe-Signature does not verify (wrong secret, tampered body, too old). */
export class BadWebhookSignatureError extends AppError {
  constructor() {
    super(400, 'bad_signature', 'The payment event’s signature does not match this endpoint’s secret (or the event is too old).');
  }
}

async function resolveLab(db: DbOrTrx, event: Stripe.Event): Promise<number | null> {
  const { customerId, labIdHint } = eventParties(event);
  if (customerId) {
    const byCustomer = await crossLabRepo(db).labIdForStripeCustomer(customerId);
    if (byCustomer) return byCustomer;
  }
  const hinted = Number(labIdHint);
  if (!Number.isSafeInteger(hinted) || hinted <= 0) return null;
  return (await labsRepo(db).findById(hinted)) ? hinted : null;
}

/**
 * Receives Stripe webhooks: verifies the signature on the raw body
 * (`stripe.webhooks.constructEvent`), then, in one transaction, records the event id (a
 * redelivery stops there) and applies what it changes to the lab's billing row, with audit
 * events for plan and status changes. Admins are mailed after commit when a payment failed.
 */
export function createStripeWebhooks(deps: {
  db: Db;
  stripe: Stripe;
  catalog: PlanCatalog;
  mailer: Mailer;
  logger: LogWriter;
  webhookSecret: string;
  graceDays: number;
  publicUrl: string;
}) {
  const { db, catalog } = deps;

  return {
    async receive(payload: Buffer, signature: string | undefined): Promise<WebhookOutcome> {
      let event: Stripe.Event;
      try {
        event = deps.stripe.webhooks.constructEvent(payload, signature ?? '', deps.webhookSecret);
      } catch {
        throw new BadWebhookSignatureError();
      }
      const labId = await resolveLab(db, event);
      const result = await db.transaction(async (trx) => {
        if (!(await stripeEventsRepo(trx).claim({ id: event.id, type: event.type, created: event.created, tenantId: labId })))
          return { outcome: 'duplicate' as const };
        if (labId === null) return { outcome: 'unknown-lab' as const };
        const scope = inLab(trx, labId);
        const billing = labBillingRepo(scope);
        const before = await billing.getOrCreate(catalog.free.key, { lock: true });
        const patch = billingChange(event, before, { catalog, graceDays: deps.graceDays });
        if (!patch) return { outcome: 'unchanged' as const };
        await billing.patch(patch, catalog.free.key);
        const after = { ...before, ...patch };
        const audit = auditRepo(scope);
        const name = (key: string) => catalog.byKey(key)?.name ?? key;
        if (after.planKey !== before.planKey) {
          await audit.record({
            actorUserId: null,
            action: 'billing.plan-changed',
            targetType: 'lab',
            targetId: labId,
            summary: `Plan changed from ${name(before.planKey)} to ${name(after.planKey)} (Stripe ${event.type})`,
            details: { from: before.planKey, to: after.planKey, event: event.id },
          });
        }
        if (after.status !== before.status) {
          await audit.record({
            actorUserId: null,
            action: 'billing.status-changed',
            targetType: 'lab',
            targetId: labId,
            summary: `Subscription status changed from ${before.status} to ${after.status} (Stripe ${event.type})`,
            details: { from: before.status, to: after.status, event: event.id, graceUntil: after.graceUntil?.toISOString() ?? null },
          });
        }
        const enteredPastDue =
          after.status === 'past_due' && before.status !== 'past_due' && after.graceUntil ? { planKey: after.planKey, graceUntil: after.graceUntil } : null;
        return { outcome: 'applied' as const, enteredPastDue };
      });
      if (result.outcome === 'applied' && result.enteredPastDue && labId !== null) {
        const { planKey, graceUntil } = result.enteredPastDue;
        const lab = (await labsRepo(db).findById(labId))!;
        const link = `${deps.publicUrl}/labs/${encodeURIComponent(lab.slug)}/billing`;
        // the event is already applied: a mail failure is logged, not answered as an error
        await mailLabAdmins(db, deps.mailer, labId, (to) =>
          paymentFailedMail({ to, labName: lab.name, planName: catalog.byKey(planKey)?.name ?? planKey, graceUntil, link }),
        ).catch((err: unknown) => deps.logger.warn('payment-failed mail not sent', { labId, err: String(err) }));
      }
      return result.outcome;
    },
  };
}

export type StripeWebhooks = ReturnType<typeof createStripeWebhooks>;
