import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Stripe from 'stripe';

/**
 * Billing test helpers: a plan catalog with tiny limits (the shipped catalog's price lookup
 * keys, so the Stripe stand-in started by dev-services sells them), signed webhook bodies, and
 * polling until a webhook delivered out of band has landed.
 */
export const TEST_LIMITS = {
  free: { readings: 10, loggers: 2, members: 4, historyDays: 30, quarantinedRows: 3 },
  paid: { readings: 25, loggers: 4, members: 8, historyDays: 400, quarantinedRows: 6 },
};

/** Writes a copy of tenants/plans.json whose limits are TEST_LIMITS (first paid plan) and returns its path. */
export function writeTestPlanCatalog(): string {
  const shipped = JSON.parse(readFileSync('tenants/plans.json', 'utf8')) as { plans: Array<{ priceLookupKey: string | null; limits: object }> };
  let firstPaid = true;
  for (const plan of shipped.plans) {
    if (plan.priceLookupKey === null) plan.limits = TEST_LIMITS.free;
    else if (firstPaid) {
      plan.limits = TEST_LIMITS.paid;
      firstPaid = false;
    } else plan.limits = { readings: 1000, loggers: 50, members: 50, historyDays: 4000, quarantinedRows: 100 };
  }
  const path = join(mkdtempSync(join(tmpdir(), 'lagbook-plans-')), 'plans.json');
  writeFileSync(path, JSON.stringify(shipped));
  return path;
}

const signer = new Stripe('sk_test_signer_for_tests');

/** A Stripe event envelope around `object`, signed like the stand-in signs it. */
export function signedEvent(secret: string, event: { id: string; type: string; created: number; object: unknown }): { body: string; signature: string } {
  const body = JSON.stringify({
    id: event.id,
    object: 'event',
    api_version: Stripe.API_VERSION,
    created: event.created,
    livemode: false,
    pending_webhooks: 1,
    request: { id: null, idempotency_key: null },
    type: event.type,
    data: { object: event.object },
  });
  return { body, signature: signer.webhooks.generateTestHeaderString({ payload: body, secret }) };
}

/** Polls `probe` until it returns a truthy value (or throws after `timeoutMs`, with the last value seen). */
export async function eventually<T>(probe: () => Promise<T>, timeoutMs = 8000): Promise<NonNullable<T>> {
  const deadline = Date.now() + timeoutMs;
  let last: T;
  for (;;) {
    last = await probe();
    if (last) return last as NonNullable<T>;
    if (Date.now() > deadline) throw new Error(`condition not met within ${timeoutMs} ms (last value: ${JSON.stringify(last)})`);
    await new Promise((r) => setTimeout(r, 60));
  }
}
