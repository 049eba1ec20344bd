import type { DbOrTrx } from './tenant-scope.ts';

/** Data access for `stripe_events` (global: the ids of the Stripe events already applied), on `db`. */
export function stripeEventsRepo(db: DbOrTrx) {
  return {
    /**
     * Records a Stripe event as processed, in the caller's transaction. Returns false when the
     * event id was already recorded (a redelivery), so the caller applies nothing twice; the
     * primary key decides, so two deliveries racing each other cannot both win.
     */
    async claim(event: { id: string; type: string; created: number; tenantId: number | null }): Promise<boolean> {
      try {
        await db('stripe_events').insert({ id: event.id, type: event.type, created: event.created, tenant_id_seen: event.tenantId });
        return true;
      } catch (err) {
        if ((err as { code?: string } | null)?.code === 'ER_DUP_ENTRY') return false;
        throw err;
      }
    },
  };
}
