import { useState } from 'react';
import { Button } from '../../../components/button.tsx';
import { Notice } from '../../../components/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useChangePlan } from '../api/change-plan.ts';
import type { BillingOverview, BillingPlan } from '@shared/contract/billing.ts';
import { useBilling } from '../api/get-billing.ts';
import { useStartCheckout } from '../api/open-billing-session.ts';
import { formatCount, formatMoney } from './billing-format.ts';
import { BILLING_NOTICES, planConfirmed } from '../messages.ts';

/**
 * The catalog side by side. Without a subscription a paid plan starts through Checkout; with an
 * active one, another paid plan is a switch (prorated by Stripe) — when the lab already uses
 * more than that plan allows, the server's refusal lists what is over and the admin can
 * confirm. After a switch the page polls until Stripe's confirmation has changed the plan.
 */
export function PlanChoices({ slug, overview }: { slug: string; overview: BillingOverview }) {
  const checkout = useStartCheckout(slug);
  const change = useChangePlan(slug);
  const [target, setTarget] = useState<BillingPlan | null>(null);
  useBilling(slug, { untilPlan: change.isSuccess ? target?.key : null });
  const subscribed = overview.status === 'active' || overview.status === 'past_due';
  const tooSmall = change.error instanceof ApiError && change.error.code === 'plan_too_small';
  const switchTo = (plan: BillingPlan, acknowledgeLimits = false) => {
    setTarget(plan);
    change.mutate({ plan: plan.key, acknowledgeLimits });
  };

  function action(plan: BillingPlan) {
    if (plan.key === overview.plan.key) return <span className="text-sm font-medium text-lichen-dark">Your plan</span>;
    if (plan.paid && !subscribed) {
      return (
        <Button tone="primary" disabled={checkout.isPending} onClick={() => checkout.mutate({ plan: plan.key })}>
          Choose {plan.name}
        </Button>
      );
    }
    if (plan.paid && overview.status === 'active') {
      return (
        <Button tone="primary" disabled={change.isPending} onClick={() => switchTo(plan)}>
          Switch to {plan.name}
        </Button>
      );
    }
    const hint = plan.paid ? BILLING_NOTICES.settleFirst : BILLING_NOTICES.cancelFirst;
    return <span className="text-sm text-ink-soft">{hint}</span>;
  }

  return (
    <section aria-labelledby="plans-heading" className="grid gap-3">
      <h3 id="plans-heading" className="text-lg font-semibold">
        Plans
      </h3>
      <ul className="grid gap-3 md:grid-cols-3">
        {overview.plans.map((plan) => {
          const current = plan.key === overview.plan.key;
          return (
            <li
              key={plan.key}
              className={`grid gap-2 rounded-lg border p-4 ${current ? 'border-lichen bg-card' : 'border-rule bg-card'}`}
              aria-label={`${plan.name} plan`}
            >
              <div className="flex items-baseline justify-between">
                <span className="text-lg font-semibold">{plan.name}</span>
                <span className="tabular-nums">{plan.paid ? `${formatMoney(plan.monthlyAmount, overview.currency)} / month` : 'free'}</span>
              </div>
              {plan.summary && <p className="text-sm text-ink-soft">{plan.summary}</p>}
              <ul className="text-sm">
                <li>{formatCount(plan.limits.readings)} stored readings</li>
                <li>{formatCount(plan.limits.loggers)} loggers</li>
                <li>{formatCount(plan.limits.members)} members</li>
                <li>{formatCount(plan.limits.historyDays)} days of history to browse</li>
                <li>{formatCount(plan.limits.quarantinedRows)} rows kept in quarantine</li>
              </ul>
              {action(plan)}
            </li>
          );
        })}
      </ul>
      {checkout.isError && <Notice tone="alert">{checkout.error.message}</Notice>}
      {tooSmall && target ? (
        <Notice tone="alert">
          <p>{change.error?.message}</p>
          <div className="mt-2 flex flex-wrap gap-2">
            <Button tone="primary" onClick={() => switchTo(target, true)}>
              Switch to {target.name} anyway
            </Button>
            <Button onClick={() => change.reset()}>Keep the current plan</Button>
          </div>
        </Notice>
      ) : (
        change.isError && <Notice tone="alert">{change.error.message}</Notice>
      )}
      {change.isSuccess &&
        target &&
        (overview.subscribedPlanKey === target.key ? (
          <Notice tone="status">{planConfirmed(target.name, 'switch')}</Notice>
        ) : (
          <Notice tone="status">
            {change.data.message} {BILLING_NOTICES.updatesItself}
          </Notice>
        ))}
    </section>
  );
}
