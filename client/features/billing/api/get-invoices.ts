import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import { billingRootKey } from './get-billing.ts';

/** One invoice (amounts in the currency's smallest unit). */
export interface Invoice {
  id: string;
  number: string | null;
  status: string | null;
  currency: string;
  amountDue: number;
  amountPaid: number;
  created: string;
  hostedUrl: string | null;
  pdfUrl: string | null;
}

export function getInvoices(slug: string): Promise<{ invoices: Invoice[] }> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/billing/invoices`);
}

export const invoicesQueryOptions = (slug: string) => queryOptions({ queryKey: [...billingRootKey(slug), 'invoices'], queryFn: () => getInvoices(slug) });

/** The lab's invoices, newest first. */
export function useInvoices(slug: string) {
  return useQuery(invoicesQueryOptions(slug));
}
