import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvoicesAnswer } from '@shared/contract/billing.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { billingRootKey } from './get-billing.ts';

/** `GET /api/v1/labs/:lab/billing/invoices`: newest first. */
export function getInvoices(slug: string): Promise<InvoicesAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/billing/invoices`);
}

export const invoicesQueryOptions = (slug: string) => queryOptions({ queryKey: [...billingRootKey(slug), 'invoices'], queryFn: () => getInvoices(slug) });

/** The lab's invoices, newest first. */
export function useInvoices(slug: string) {
  return useQuery(invoicesQueryOptions(slug));
}
