import express, { type Response, type Router } from 'express';
import type { BillingActions } from './billing-actions.ts';
import type { StandInState, StripeInvoice } from './stand-in-state.ts';

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
const money = (amount: number, currency: string) => `${(amount / 100).toFixed(2)} ${currency.toUpperCase()}`;

/** The page frame: plain, clearly marked as a local test stand-in, no scripts. */
function page(res: Response, title: string, body: string, status = 200): void {
  res.status(status).type('html').send(`<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)} · payment stand-in</title>
<style>
body{font:15px/1.5 system-ui,sans-serif;background:#f3f1ea;color:#1d2a22;margin:0}
main{max-width:34rem;margin:3rem auto;background:#fff;border:2px dashed #7a8f55;border-radius:6px;padding:1.5rem 2rem}
.tag{display:inline-block;font-size:12px;letter-spacing:.08em;text-transform:uppercase;background:#7a8f55;color:#fff;padding:2px 8px;border-radius:3px}
h1{font-size:1.3rem;margin:.6rem 0 1rem}
button{font:inherit;padding:.45rem 1rem;margin:.3rem .4rem .3rem 0;border-radius:4px;border:1px solid #41512d;background:#41512d;color:#fff;cursor:pointer}
button.quiet{background:#fff;color:#41512d}
.error{background:#fbe3dc;border-left:4px solid #b4441f;padding:.5rem .8rem}
table{border-collapse:collapse;width:100%}td,th{text-align:left;padding:.3rem .4rem;border-bottom:1px solid #e3e0d4}
</style></head><body><main><span class="tag">Local payment stand-in — no real money</span>${body}</main></body></html>`);
}

function invoiceRows(invoices: StripeInvoice[]): string {
  if (invoices.length === 0) return '<p>No invoices yet.</p>';
  return `<table><tr><th>Invoice</th><th>Amount</th><th>Status</th></tr>${invoices
    .map((i) => `<tr><td><a href="${esc(i.hosted_invoice_url)}">${esc(i.number)}</a></td><td>${money(i.amount_due, i.currency)}</td><td>${i.status}</td></tr>`)
    .join('')}</table>`;
}

/**
 * The stand-in's own hosted pages: a checkout page (pay with the test card, or have it
 * declined), a billing portal (cancel, make the next renewal fail, pay open invoices) and an
 * invoice page. Their buttons post forms; each action sends the matching webhooks.
 */
export function createHostedPagesRouter(state: StandInState, actions: BillingActions): Router {
  const router = express.Router();
  router.use(express.urlencoded({ extended: false, limit: '8kb' }));

  const checkoutPage = (res: Response, id: string, error?: string) => {
    const session = state.checkoutSessions.get(id);
    if (!session) return page(res, 'Not found', '<h1>This checkout link is not valid.</h1>', 404);
    if (session.status !== 'open')
      return page(res, 'Done', `<h1>This checkout is complete.</h1><p><a href="${esc(session.success_url)}">Back to Lagbook</a></p>`);
    const price = state.prices.get(session.line_price)!;
    const product = state.products.get(price.product)!;
    const customer = state.customers.get(session.customer);
    page(
      res,
      'Checkout',
      `<h1>Subscribe to ${esc(product.name)}</h1>
<p><strong>${money(price.unit_amount, price.currency)}</strong> per ${price.recurring.interval}, for ${esc(customer?.name ?? 'your lab')}.</p>
${error ? `<p class="error" role="alert">${esc(error)}</p>` : ''}
<p>Test card <code>4242 4242 4242 4242</code>, any future date, any code.</p>
<form method="post" action="/checkout/${esc(id)}/pay"><button type="submit">Pay with the test card</button></form>
<form method="post" action="/checkout/${esc(id)}/decline"><button class="quiet" type="submit">Use a card that is declined</button></form>
${session.cancel_url ? `<p><a href="${esc(session.cancel_url)}">Cancel and go back</a></p>` : ''}`,
    );
  };

  router.get('/checkout/:id', (req, res) => checkoutPage(res, req.params.id));
  router.post('/checkout/:id/decline', (req, res) => checkoutPage(res, req.params.id, 'The card was declined. Nothing was charged; try the test card.'));
  router.post('/checkout/:id/pay', (req, res) => {
    if (!state.checkoutSessions.get(req.params.id)) return checkoutPage(res, req.params.id);
    res.redirect(303, actions.completeCheckout(req.params.id));
  });

  router.get('/portal/:id', (req, res) => {
    const session = state.portalSessions.get(req.params.id);
    if (!session) return page(res, 'Not found', '<h1>This portal link is not valid.</h1>', 404);
    const customer = state.customers.get(session.customer);
    const subs = [...state.subscriptions.values()].filter((s) => s.customer === session.customer && s.status !== 'canceled');
    const invoices = [...state.invoices.values()].filter((i) => i.customer === session.customer).reverse();
    const action = (sub: string, what: string, label: string, quiet = false) =>
      `<form method="post" action="/portal/${esc(session.id)}/${what}" style="display:inline"><input type="hidden" name="subscription" value="${esc(sub)}"><button${quiet ? ' class="quiet"' : ''} type="submit">${label}</button></form>`;
    const subBlocks = subs.length
      ? subs
          .map((s) => {
            const price = s.items.data[0].price;
            const product = state.products.get(price.product);
            return `<section><h2>${esc(product?.name ?? price.id)} — ${s.status === 'past_due' ? 'payment overdue' : 'active'}</h2>
<p>${money(price.unit_amount, price.currency)} per ${price.recurring.interval}; card ending 4242.</p>
${s.status === 'past_due' ? action(s.id, 'pay-open', 'Pay the open invoice') : action(s.id, 'fail-renewal', 'Make the next renewal fail', true)}
${action(s.id, 'cancel', 'Cancel the subscription', true)}</section>`;
          })
          .join('')
      : '<p>No active subscription.</p>';
    page(
      res,
      'Billing portal',
      `<h1>Billing for ${esc(customer?.name ?? session.customer)}</h1>${subBlocks}<h2>Invoices</h2>${invoiceRows(invoices)}
${session.return_url ? `<p><a href="${esc(session.return_url)}">Return to Lagbook</a></p>` : ''}`,
    );
  });

  const portalAction = (what: string, run: (subscriptionId: string) => void) =>
    router.post(`/portal/:id/${what}`, (req, res) => {
      const session = state.portalSessions.get(req.params.id);
      const subscription = typeof req.body?.subscription === 'string' ? req.body.subscription : '';
      const sub = state.subscriptions.get(subscription);
      if (!session || !sub || sub.customer !== session.customer) return page(res, 'Not found', '<h1>No such subscription here.</h1>', 404);
      run(sub.id);
      res.redirect(303, `/portal/${session.id}`);
    });
  portalAction('cancel', (id) => actions.cancel(id));
  portalAction('fail-renewal', (id) => actions.failRenewal(id));
  portalAction('pay-open', (id) => actions.payOpenInvoices(id));

  router.get('/invoices/:id', (req, res) => {
    const invoice = state.invoices.get(req.params.id);
    if (!invoice) return page(res, 'Not found', '<h1>No such invoice.</h1>', 404);
    page(res, `Invoice ${invoice.number}`, `<h1>Invoice ${esc(invoice.number)}</h1><p>${money(invoice.amount_due, invoice.currency)} — ${invoice.status}</p>`);
  });
  return router;
}
