import type { ColumnDef } from '@tanstack/react-table';
import { DataTable } from '../../../components/data-table.tsx';
import type { Invoice } from '@shared/contract/billing.ts';
import { Instant } from '../../../components/clock/instant.tsx';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { useInvoices } from '../api/get-invoices.ts';
import { formatMoney } from './billing-format.ts';

// Invoice number (a link to it) as the row's name, date and amount, status top right on a phone.
const INVOICE_COLUMNS: ColumnDef<Invoice>[] = [
  {
    id: 'number',
    header: 'Invoice',
    meta: { phone: 'title' },
    cell: ({ row: { original: i } }) =>
      i.hostedUrl ? (
        <a className="text-lichen-dark underline" href={i.hostedUrl}>
          {i.number ?? i.id}
        </a>
      ) : (
        (i.number ?? i.id)
      ),
  },
  { id: 'date', header: 'Date', cell: ({ row }) => <Instant at={row.original.created} kind="account" part="date" /> },
  {
    id: 'amount',
    header: 'Amount',
    meta: { phone: 'value' },
    cell: ({ row: { original: i } }) => <span className="tabular-nums">{formatMoney(i.amountDue, i.currency)}</span>,
  },
  {
    id: 'status',
    header: 'Status',
    meta: { phone: 'status' },
    cell: ({ row: { original: i } }) => (i.status === 'paid' ? 'paid' : i.status === 'open' ? 'awaiting payment' : (i.status ?? '—')),
  },
];

/** The lab's invoices (newest first, as Stripe lists them): number, date, amount, status and a link to each; stacked rows on a phone. */
export function InvoicesTable({ slug }: { slug: string }) {
  const invoices = useInvoices(slug);
  if (invoices.isPending) return <LoadingNote what="Loading invoices…" />;
  if (invoices.isError) return <Notice tone="alert">{invoices.error.message}</Notice>;
  if (invoices.data.invoices.length === 0) return <p className="text-sm text-ink-soft">No invoices yet.</p>;
  return (
    <DataTable
      caption="Invoices of the lab"
      columns={INVOICE_COLUMNS}
      data={invoices.data.invoices}
      getRowId={(i) => i.id}
      sortable={false}
      empty="No invoices yet."
    />
  );
}
