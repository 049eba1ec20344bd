import { Button } from '../../../components/button.tsx';
import { Notice } from '../../../components/notice.tsx';
import type { BillingOverview } from '../api/get-billing.ts';
import { useStartCheckout } from '../api/open-billing-session.ts';
import { formatCount, formatMoney } from './billing-format.ts';

/** The catalog side by side; a paid plan the lab is not subscribed to can be started through Checkout. */
export function PlanChoices({ slug, overview }: { slug: string; overview: BillingOverview }) {
  const checkout = useStartCheckout(slug);
  const subscribed = overview.status === 'active' || overview.status === 'past_due';
  return (
    <section aria-labelledby="plans-heading" className="grid gap-3">
      <h3 id="plans-heading" className="text-lg font-semibold">
        Plans
      </h3>
      <ul className="grid gap-3 md:grid-cols-3">
        {overview.plans.map((plan) => {
          const current = plan.key === overview.plan.key;
          return (
            <li key={plan.key} className={`grid gap-2 rounded-lg border p-4 ${current ? 'border-lichen bg-card' : 'border-rule bg-card'}`} aria-label={`${plan.name} plan`}>
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
              </ul>
              {current ? (
                <span className="text-sm font-medium text-lichen-dark">Your plan</span>
              ) : plan.paid && !subscribed ? (
                <Button tone="primary" disabled={checkout.isPending} onClick={() => checkout.mutate({ plan: plan.key })}>
                  Choose {plan.name}
                </Button>
              ) : (
                <span className="text-sm text-ink-soft">{plan.paid ? 'To switch, cancel under “Manage payment”, then choose it' : 'Cancel the subscription to return here'}</span>
              )}
            </li>
          );
        })}
      </ul>
      {checkout.isError && <Notice tone="alert">{checkout.error.message}</Notice>}
    </section>
  );
}
