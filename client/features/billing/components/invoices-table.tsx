import { Instant } from '../../../components/clock/instant.tsx';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { useInvoices } from '../api/get-invoices.ts';
import { formatMoney } from './billing-format.ts';

/** The lab's invoices: number, date, amount, status and a link to each. */
export function InvoicesTable({ slug }: { slug: string }) {
  const invoices = useInvoices(slug);
  if (invoices.isPending) return <LoadingNote what="Loading invoices…" />;
  if (invoices.isError) return <Notice tone="alert">{invoices.error.message}</Notice>;
  if (invoices.data.invoices.length === 0) return <p className="text-sm text-ink-soft">No invoices yet.</p>;
  return (
    <table className="w-full text-sm">
      <thead>
        <tr className="border-b border-rule text-left">
          <th className="py-1.5 pr-3">Invoice</th>
          <th className="py-1.5 pr-3">Date</th>
          <th className="py-1.5 pr-3 text-right">Amount</th>
          <th className="py-1.5 pr-3">Status</th>
        </tr>
      </thead>
      <tbody>
        {invoices.data.invoices.map((i) => (
          <tr key={i.id} className="border-b border-rule/60">
            <td className="py-1.5 pr-3">
              {i.hostedUrl ? (
                <a className="text-lichen-dark underline" href={i.hostedUrl}>
                  {i.number ?? i.id}
                </a>
              ) : (
                (i.number ?? i.id)
              )}
            </td>
            <td className="py-1.5 pr-3">
              <Instant at={i.created} kind="account" part="date" />
            </td>
            <td className="py-1.5 pr-3 text-right tabular-nums">{formatMoney(i.amountDue, i.currency)}</td>
            <td className="py-1.5 pr-3">{i.status === 'paid' ? 'paid' : i.status === 'open' ? 'awaiting payment' : (i.status ?? '—')}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
