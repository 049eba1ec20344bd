import type { RetentionAnswer } from '../../contract/retention.ts';
import { RETENTION_SENTENCES } from '../../contract/words/retention.ts';
import type { RetentionView, RetentionViewService } from '../../services/retention/retention-view.ts';
import { defineRoute, type Route } from '../routes/route.ts';

/** The retention answer's JSON: times as ISO text, with a sentence for people reading it directly. */
export function presentRetention(v: RetentionView): RetentionAnswer {
  const { plan } = v;
  if (!v.removes) {
    return {
      removes: false,
      planName: plan.name,
      historyDays: plan.limits.historyDays,
      sentence: RETENTION_SENTENCES.keepsEverything(plan.name, plan.limits.historyDays),
    };
  }
  const { historyDays } = plan.limits;
  const { exportDays } = plan.readingRemoval;
  return {
    removes: true,
    planName: plan.name,
    historyDays,
    exportDays,
    horizon: new Date(v.horizonMs).toISOString(),
    oldestReading: v.oldestReadingMs === null ? null : new Date(v.oldestReadingMs).toISOString(),
    readingsBeforeHorizon: v.readingsBeforeHorizon,
    nextRemovalAt: new Date(v.nextRemovalMs).toISOString(),
    sentence: RETENTION_SENTENCES.removes(plan.name, historyDays, exportDays, v.readingsBeforeHorizon),
  };
}

/** What the lab's plan removes from storage and when (admins only: `billing.manage`). */
export function retentionRoutes(deps: { retention: RetentionViewService }): Route[] {
  return [
    defineRoute({
      method: 'get',
      path: '/billing/retention',
      auth: { permission: 'billing.manage' },
      summary:
        "Whether the lab's plan ever removes readings from storage; if it does, the horizon before which readings go, the oldest stored reading, how many lie before the horizon now and when the next removal runs.",
      response: { status: 200, description: 'The retention of the lab under its current plan.' },
      handle: async ({ lab }): Promise<RetentionAnswer> => presentRetention(await deps.retention.forLab(lab)),
    }),
  ];
}
