import { useRef } from 'react';
import { Button } from '../../../components/button.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import type { BillingOverview } from '@shared/contract/billing.ts';
import { isConfirmed, useBilling } from '../api/get-billing.ts';
import { useOpenPortal } from '../api/open-billing-session.ts';
import { InvoicesTable } from './invoices-table.tsx';
import { PlanChoices } from './plan-choices.tsx';
import { UsageBar } from './usage-bar.tsx';
import { UsageSparkline } from './usage-sparkline.tsx';
import { RetentionPanel } from './retention-panel.tsx';
import { BILLING_NOTICES, PLAN_STATE_WORDS, planConfirmed } from '../messages.ts';

/** How the page was reached: straight, or back from Stripe Checkout (`?checkout=complete|cancelled`). */
export type CheckoutReturn = 'complete' | 'cancelled' | null;

function StatusNotice({ overview }: { overview: BillingOverview }) {
  if (overview.status === 'past_due' && overview.graceUntil) {
    return (
      <Notice tone="alert">
        A payment failed. The {overview.plan.name} plan keeps working until <Instant at={overview.graceUntil} kind="account" part="date" />; after that the lab
        falls back to the free plan’s limits (no data is deleted). Pay the open invoice under “Manage payment”.
      </Notice>
    );
  }
  if (overview.status === 'past_due') return <Notice tone="alert">{BILLING_NOTICES.graceOver}</Notice>;
  if (overview.status === 'canceled') return <Notice tone="status">{BILLING_NOTICES.cancelled}</Notice>;
  return null;
}

function CheckoutNotice({ returned, overview }: { returned: CheckoutReturn; overview: BillingOverview }) {
  // The plan the checkout confirmed, kept: a later switch on this page must not rename it.
  const confirmedPlan = useRef<string | null>(null);
  if (confirmedPlan.current === null && isConfirmed(overview)) confirmedPlan.current = overview.plan.name;
  if (returned === 'cancelled') return <Notice tone="status">{BILLING_NOTICES.checkoutCancelled}</Notice>;
  if (returned !== 'complete') return null;
  if (confirmedPlan.current !== null) return <Notice tone="status">{planConfirmed(confirmedPlan.current, 'payment')}</Notice>;
  return <Notice tone="status">{BILLING_NOTICES.paymentWaiting}</Notice>;
}

/**
 * The lab's billing, for admins: plan and status (with the grace period when a payment
 * failed), usage against the plan's limits with the 30-day trend, the plans on offer
 * (upgrade through Stripe Checkout), the billing portal and the invoices. After a checkout
 * it polls until Stripe's webhook has changed the plan — the page itself never changes it.
 */
export function BillingPage({ slug, returned }: { slug: string; returned: CheckoutReturn }) {
  const billing = useBilling(slug, { untilConfirmed: returned === 'complete' });
  const portal = useOpenPortal(slug);
  const data = billing.data;
  return (
    <div className="grid gap-8">
      <section aria-labelledby="billing-heading" className="grid gap-3">
        <h2 id="billing-heading" className="text-2xl font-semibold">
          Billing
        </h2>
        {billing.isPending && <LoadingNote what="Loading the plan and usage…" />}
        {billing.isError && <Notice tone="alert">{billing.error.message}</Notice>}
        {data && (
          <>
            <CheckoutNotice returned={returned} overview={data} />
            <div className="flex flex-wrap items-center justify-between gap-3 rounded-lg border border-rule bg-card p-4">
              <p>
                Plan: <strong data-testid="current-plan">{data.plan.name}</strong>
                <span className="ml-2 text-sm text-ink-soft">{PLAN_STATE_WORDS[data.status]}</span>
              </p>
              <Button disabled={portal.isPending} onClick={() => portal.mutate()}>
                Manage payment
              </Button>
            </div>
            {portal.isError && <Notice tone="alert">{portal.error.message}</Notice>}
            <StatusNotice overview={data} />
            {data.ingestionRefused && <Notice tone="alert">{BILLING_NOTICES.storageFull}</Notice>}
          </>
        )}
      </section>
      {data && (
        <>
          <section aria-labelledby="usage-heading" className="grid gap-4">
            <h3 id="usage-heading" className="text-lg font-semibold">
              Usage
            </h3>
            <div className="grid max-w-xl gap-4">
              <UsageBar
                label="Stored readings"
                used={data.usage.readings}
                allowed={data.limits.readings}
                note="Counted as batches arrive; recounted exactly every 15 minutes."
              />
              <UsageBar label="Loggers" used={data.usage.loggers} allowed={data.limits.loggers} />
              <UsageBar label="Members and pending invitations" used={data.usage.members} allowed={data.limits.members} />
              <UsageBar
                label="Rows in quarantine"
                used={data.usage.quarantinedRows}
                allowed={data.limits.quarantinedRows}
                note="Rows that could not be stored, kept for review. At the limit, batches carrying more such rows are refused until a technician discards or re-submits some."
              />
            </div>
            <p className="text-sm text-ink-soft">
              Browsing and analysis reach back to <Instant at={data.historyStartsAt} kind="account" part="date" /> ({data.limits.historyDays} days). Whether
              older readings stay stored is said just below.
            </p>
            <RetentionPanel slug={slug} />
            <UsageSparkline points={data.trend} limit={data.limits.readings} />
          </section>
          <PlanChoices slug={slug} overview={data} />
          <section aria-labelledby="invoices-heading" className="grid gap-3">
            <h3 id="invoices-heading" className="text-lg font-semibold">
              Invoices
            </h3>
            <InvoicesTable slug={slug} />
          </section>
        </>
      )}
    </div>
  );
}
