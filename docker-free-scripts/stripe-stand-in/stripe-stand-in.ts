import { createServer } from 'node:http';
import express, { type NextFunction, type Request, type Response } from 'express';
import { listenHttpServer } from '../shared/listen-http-server.ts';
import { createCustomersRouter } from './customers.router.ts';
import { createPricesRouter } from './prices.router.ts';
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
}

/** A running Stripe stand-in. */
export interface RunningStripeStandIn {
  /** Base URL, e.g. `http://127.0.0.1:12111`; point the SDK at it with host, port and protocol 'http'. */
  url: string;
  port: number;
  close(): Promise<void>;
}

function tagRequest(_req: Request, res: Response, next: NextFunction): void {
  res.set('Request-Id', stripeId('req'));
  next();
}

/**
 * Starts a small in-memory fake of the parts of Stripe's HTTP API that Lagbook uses (for now
 * customers and prices), so the official SDK can run against it in development and tests.
 * It answers Stripe-shaped JSON and errors and binds 127.0.0.1 unless told otherwise; it is
 * never wired into production code paths.
 */
export async function startStripeStandIn(opts: StripeStandInOptions): Promise<RunningStripeStandIn> {
  const host = opts.host ?? '127.0.0.1';
  const state: StandInState = { customers: new Map(), products: new Map(), prices: new Map() };
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
  app.use('/v1', (req, _res, next) => {
    next(new StripeApiError(404, 'invalid_request_error', `Unrecognized request URL (${req.method}: ${req.originalUrl}). The Stripe stand-in does not implement it yet.`));
  });
  app.use(renderStripeError);

  const { url, port, close } = await listenHttpServer(createServer(app), opts.port, host);
  return { url, port, close };
}
