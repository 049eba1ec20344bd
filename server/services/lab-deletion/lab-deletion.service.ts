import type Stripe from 'stripe';
import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { labsRepo } from '../../db/labs.repo.ts';
import { labBillingRepo } from '../../db/lab-billing.repo.ts';
import { labDeletionsRepo } from '../../db/lab-deletions.repo.ts';
import { AppError, NotFoundError } from '../../errors.ts';
import { BillingUnavailableError } from '../billing/billing-errors.ts';
import type { Actor, LabContext } from '../lab-context.ts';
import type { DeleteLabInput, LabDeletionStarted } from '../../contract/labs.ts';
import { LAB_LABELS } from '../../contract/words/labs.ts';
import { fieldRefusal } from '../service-errors.ts';

/** The lab owes an invoice (its subscription is past due): it cannot be deleted until that is settled. */
export class UnpaidInvoiceError extends AppError {
  constructor() {
    super(
      409,
      'unpaid_invoice',
      'This lab has an unpaid invoice, so it cannot be deleted yet. Pay the invoice, or cancel the subscription, under Billing; then delete the lab. Nothing was changed.',
    );
  }
}

/** Whether a Stripe SDK error says the object does not exist (a subscription already removed on Stripe's side). */
function isMissingOnStripe(err: unknown): boolean {
  return (err as { code?: string } | null)?.code === 'resource_missing';
}

/**
 * Deleting a lab (admins, `lab.manage`). The request does everything that must happen at once
 * and nothing that can wait: checks the typed name, refuses while an invoice is unpaid, then —
 * in one small transaction — marks the lab deleted (from that moment the guard, the lab lists,
 * invitation links, ingest keys and Stripe webhooks skip it) and records the deletion in
 * `lab_deletions`, outside the lab; then cancels the Stripe subscription (official SDK) and
 * hands the record to the deletion job, which removes the rows in batches (`onRequested`
 * starts it). Stripe failing reopens the lab as it was and answers 503: nothing half-applied.
 */
/** A request still unfinished after this long died on its way (the Stripe SDK gives up after about 20 s). */
export const STALLED_AFTER_MS = 15 * 60_000;

export function createLabDeletionService(deps: { db: Db; stripe: Stripe; now?: () => Date; onRequested?: () => void }) {
  const now = deps.now ?? (() => new Date());

  /** Cancels the subscription unless it is already cancelled or gone; returns its id when one was cancelled. */
  async function cancelSubscription(subscriptionId: string): Promise<string | null> {
    try {
      const sub = await deps.stripe.subscriptions.retrieve(subscriptionId);
      if (sub.status === 'canceled') return null;
      await deps.stripe.subscriptions.cancel(subscriptionId);
      return subscriptionId;
    } catch (err) {
      if (isMissingOnStripe(err)) return null;
      throw new BillingUnavailableError(
        'The payment service cannot be reached right now, so the subscription could not be cancelled; the lab was not deleted. Try again in a few minutes.',
      );
    }
  }

  return {
    /**
     * Finishes deletions whose request died between closing the lab and handing it to the job
     * (a crash while Stripe was asked): cancels the subscription if it is still running, then
     * hands the record to the job. Stripe still failing leaves it for the next run. The deletion
     * job calls this before each run.
     */
    async settleStalled(): Promise<number> {
      let settled = 0;
      for (const record of await labDeletionsRepo(deps.db).stalled(new Date(now().getTime() - STALLED_AFTER_MS))) {
        const billing = await labBillingRepo(inLab(deps.db, record.labId)).get();
        let cancelled: string | null;
        try {
          cancelled = billing?.stripeSubscriptionId && billing.status !== 'canceled' ? await cancelSubscription(billing.stripeSubscriptionId) : null;
        } catch {
          continue;
        }
        await labDeletionsRepo(deps.db).markReady(record.id, now(), cancelled);
        settled++;
      }
      return settled;
    },

    /** Deletes the lab for `actor` after checking `input.confirmName` against its name (see the factory's comment). */
    async request(lab: LabContext, actor: Actor, input: DeleteLabInput): Promise<LabDeletionStarted> {
      const current = await labsRepo(deps.db).findById(lab.id);
      if (!current) throw new NotFoundError('No lab at this address, or you are not a member of it.');
      if (input.confirmName.trim() !== current.name) {
        throw fieldRefusal('confirmName', LAB_LABELS.confirmName, `type the lab's name exactly as it is written ("${current.name}") to confirm the deletion`);
      }
      const at = now();
      // Closed first, so nothing reaches the lab while Stripe is asked (its cancellation webhook
      // included); the job waits for `ready_at`, so a Stripe failure can still reopen the lab untouched.
      // The billing row is read locked in the same transaction: a payment failing meanwhile cannot slip past.
      const { recordId, billing } = await deps.db.transaction(async (trx) => {
        const labs = labsRepo(trx);
        await labs.lock(lab.id);
        const billing = await labBillingRepo(inLab(trx, lab.id)).get({ lock: true });
        if (billing?.status === 'past_due') throw new UnpaidInvoiceError();
        if (!(await labs.markDeleted(lab.id, at))) throw new NotFoundError('No lab at this address, or you are not a member of it.');
        const recordId = await labDeletionsRepo(trx).insert({
          labId: lab.id,
          labSlug: current.slug,
          labName: current.name,
          requestedByUserId: actor.id,
          requestedByName: actor.displayName,
          requestedByEmail: actor.email,
          requestedAt: at,
        });
        return { recordId, billing };
      });
      let cancelled: string | null;
      try {
        cancelled = billing?.stripeSubscriptionId && billing.status !== 'canceled' ? await cancelSubscription(billing.stripeSubscriptionId) : null;
      } catch (err) {
        await deps.db.transaction(async (trx) => {
          await labDeletionsRepo(trx).withdraw(recordId);
          await labsRepo(trx).unmarkDeleted(lab.id);
        });
        throw err;
      }
      await labDeletionsRepo(deps.db).markReady(recordId, now(), cancelled);
      deps.onRequested?.();
      return { deletion: { labSlug: current.slug, labName: current.name, requestedAt: at.toISOString(), subscriptionCancelled: cancelled !== null } };
    },
  };
}

export type LabDeletionService = ReturnType<typeof createLabDeletionService>;
