import { useSearchParams } from 'react-router-dom';
import { BillingPage, type CheckoutReturn } from '../../features/billing/components/billing-page.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { useLabContext } from './lab-context.ts';

/** `/labs/:lab/billing`: plan, usage and payment (admins); Stripe Checkout returns here with `?checkout=`. */
export default function LabBillingRoute() {
  const { detail } = useLabContext();
  const [params] = useSearchParams();
  if (!detail.permissions.includes('billing.manage')) return <MissingPermission what="billing" />;
  const flag = params.get('checkout');
  const returned: CheckoutReturn = flag === 'complete' || flag === 'cancelled' ? flag : null;
  return <BillingPage slug={detail.lab.slug} returned={returned} />;
}
