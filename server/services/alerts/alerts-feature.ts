import type { Config } from '../../config.ts';
import type { Db } from '../../db/create-db.ts';
import type { Mailer } from '../../integrations/mail/create-mailer.ts';
import type { LogWriter } from '../../log-writer.ts';
import { createAlertEvaluator } from './alert-evaluator.ts';
import { createAlertRulesService } from './alert-rules.service.ts';
import { alertEvaluationJob, alertIngestNudge } from './alert-triggers.ts';

/**
 * Alerts wired together for createApp: the rules service for the routes, the evaluator (with
 * `runOnce(now)` for tests; it runs under the `alert-evaluator` lease and claims each cycle of
 * `LAGBOOK_ALERT_EVALUATE_EVERY_S` seconds in `job_runs`), its ingestion hook and its scheduled job.
 */
export function createAlertsFeature(deps: { db: Db; mailer: Mailer; logger: LogWriter; config: Pick<Config, 'publicUrl' | 'alerts'>; now?: () => number }) {
  const evaluator = createAlertEvaluator({
    db: deps.db,
    mailer: deps.mailer,
    logger: deps.logger,
    publicUrl: deps.config.publicUrl,
    reminderAfterMin: deps.config.alerts.reminderAfterMin,
    // a scheduled run claims the cycle of this length it falls in, once across all app servers
    cycleMs: deps.config.alerts.evaluateEveryS * 1000,
  });
  const nudge = alertIngestNudge({ evaluator, logger: deps.logger, now: deps.now });
  return {
    service: createAlertRulesService({ db: deps.db, now: deps.now }),
    evaluator,
    ingestHooks: nudge,
    /** Finishes the after-ingest runs in flight (at shutdown, so the evaluator's lease is released, not left to expire). */
    settleNudges: () => nudge.settle(),
    job: alertEvaluationJob({ evaluator, logger: deps.logger, everyS: deps.config.alerts.evaluateEveryS, now: deps.now }),
  };
}
