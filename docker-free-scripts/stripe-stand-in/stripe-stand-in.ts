import { createServer } from 'node:http';
import express, { type NextFunction, type Request, type Response } from 'express';
import { listenHttpServer } from '../shared/listen-http-server.ts';
import { createCustomersRouter } from './customers.router.ts';
import { createPricesRouter } from './prices.router.ts';
import { createCheckoutRouter } from './checkout.router.ts';
import { createPortalRouter } from './portal.router.ts';
import { createInvoicesRouter, createSubscriptionsRouter } from './subscriptions.router.ts';
import { createHostedPagesRouter } from './hosted-pages.router.ts';
import { createBillingActions, type BillingActions } from './billing-actions.ts';
import { createWebhookSender, type WebhookSender, type WebhookTarget } from './webhook-sender.ts';
import { requireTestKey } from './require-test-key.ts';
import { seedPrices } from './seed-prices.ts';
import { StripeApiError, renderStripeError } from './stripe-api-error.ts';
import { stripeId } from './stripe-objects.ts';
import type { StandInPriceSeed, StandInState } from './stand-in-state.ts';

/** Options of {@link startStripeStandIn}. */
export interface StripeStandInOptions {
  host?: string;
  /** 0 picks a free ephemeral port; the returned object tells the real one. */
  port: number;
  prices?: StandInPriceSeed[];
  /** Where to deliver signed webhooks; without it events are built but not sent. */
  webhook?: WebhookTarget;
  /** Waits between delivery attempts (ms); tests shorten them. */
  webhookBackoffMs?: number[];
}

/** A running Stripe stand-in. */
export interface RunningStripeStandIn {
  /** Base URL, e.g. `http://127.0.0.1:12111`; point the SDK at it with host, port and protocol 'http'. */
  url: string;
  port: number;
  /** Events sent and their delivery attempts (for tests and logs). */
  webhooks: WebhookSender;
  /** What the hosted pages do, callable directly by tests. */
  actions: BillingActions;
  close(): Promise<void>;
}

function tagRequest(_req: Request, res: Response, next: NextFunction): void {
  res.set('Request-Id', stripeId('req'));
  next();
}

/**
 * Starts a small in-memory fake of the parts of Stripe's HTTP API that Lagbook uses (customers,
 * prices, Checkout and billing-portal sessions, subscriptions, invoices), so the official SDK can
 * run against it in development and tests; its own checkout, portal and invoice pages stand in
 * for Stripe's hosted ones, and what happens there is sent to the app as signed webhooks.
 * It answers Stripe-shaped JSON and errors and binds 127.0.0.1 unless told otherwise; it is
 * never wired into production code paths.
 */
export async function startStripeStandIn(opts: StripeStandInOptions): Promise<RunningStripeStandIn> {
  const host = opts.host ?? '127.0.0.1';
  const state: StandInState = {
    customers: new Map(),
    products: new Map(),
    prices: new Map(),
    checkoutSessions: new Map(),
    portalSessions: new Map(),
    subscriptions: new Map(),
    invoices: new Map(),
  };
  let baseUrl = '';
  const base = () => baseUrl;
  const webhooks = createWebhookSender(opts.webhook, { backoffMs: opts.webhookBackoffMs });
  const actions = createBillingActions(state, webhooks, base);
  seedPrices(state, opts.prices ?? []);

  const app = express();
  app.disable('x-powered-by');
  app.set('query parser', 'extended');
  app.get('/healthz', (_req, res) => {
    res.json({ ok: true });
  });
  app.use('/v1', tagRequest, requireTestKey, express.urlencoded({ extended: true, limit: '1mb' }));
  app.use('/v1/customers', createCustomersRouter(state));
  app.use('/v1/prices', createPricesRouter(state));
  app.use('/v1/checkout/sessions', createCheckoutRouter(state, base));
  app.use('/v1/billing_portal/sessions', createPortalRouter(state, base));
  app.use('/v1/subscriptions', createSubscriptionsRouter(state, actions));
  app.use('/v1/invoices', createInvoicesRouter(state));
  app.use('/v1', (req, _res, next) => {
    next(
      new StripeApiError(
        404,
        'invalid_request_error',
        `Unrecognized request URL (${req.method}: ${req.originalUrl}). The Stripe stand-in does not implement it yet.`,
      ),
    );
  });
  app.use(createHostedPagesRouter(state, actions));
  app.use(renderStripeError);

  const { url, port, close } = await listenHttpServer(createServer(app), opts.port, host);
  baseUrl = url;
  return { url, port, webhooks, actions, close };
}
