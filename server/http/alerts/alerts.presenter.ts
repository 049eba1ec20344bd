import type { AlertRecord } from '../../db/alerts.repo.ts';
import type { AlertRuleView } from '../../services/alerts/alert-rules.service.ts';

/** A rule as the API shows it (its evaluation memory stays on the server). */
export function presentAlertRule(r: AlertRuleView) {
  return {
    id: r.id,
    name: r.name,
    kind: r.kind,
    channelId: r.channelId,
    loggerId: r.loggerId,
    params: r.params,
    reminderAfterMin: r.reminderAfterMin,
    enabled: r.enabled,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
    watched: r.watched,
    subscribed: r.subscribed,
    openAlertId: r.openAlertId,
  };
}

/** An alert as the API shows it; times of readings are epoch ms like the series. */
export function presentAlert(a: AlertRecord) {
  return {
    id: a.id,
    ruleId: a.ruleId,
    ruleName: a.ruleName,
    kind: a.kind,
    channelId: a.channelId,
    loggerId: a.loggerId,
    open: a.resolvedAt === null,
    openedAt: a.openedAt,
    openedValue: a.openedValue,
    openedDetail: a.openedDetail,
    resolvedAt: a.resolvedAt,
    resolvedValue: a.resolvedValue,
    resolvedDetail: a.resolvedDetail,
    remindersSent: a.remindersSent,
    acknowledged: a.acknowledgedAt ? { at: a.acknowledgedAt.toISOString(), by: a.acknowledgedBy, note: a.acknowledgementNote } : null,
  };
}
