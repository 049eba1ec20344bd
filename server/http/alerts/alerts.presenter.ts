import type { AlertRecord } from '../../db/alerts.repo.ts';
import type { AlertRuleView } from '../../services/alerts/alert-rules.service.ts';
import type { Alert, AlertRule } from '../../contract/alerts.ts';
import { isoTime } from '../presenters/iso-time.ts';

/** A rule as the API shows it (its evaluation memory stays on the server). */
export function presentAlertRule(r: AlertRuleView): AlertRule {
  return {
    id: r.id,
    name: r.name,
    kind: r.kind,
    channelId: r.channelId,
    loggerId: r.loggerId,
    params: r.params,
    reminderAfterMin: r.reminderAfterMin,
    enabled: r.enabled,
    createdAt: isoTime(r.createdAt),
    updatedAt: isoTime(r.updatedAt),
    watched: r.watched,
    subscribed: r.subscribed,
    openAlertId: r.openAlertId,
    // silence rules have no health of their own: a silent target is their alert
    health: r.kind === 'silence' ? { lastJudgedAt: null, notWatching: null } : { lastJudgedAt: r.health.lastJudgedAt, notWatching: r.health.notWatching },
  };
}

/** An alert as the API shows it; times of readings are epoch ms like the series. */
export function presentAlert(a: AlertRecord): Alert {
  return {
    id: a.id,
    ruleId: a.ruleId,
    ruleName: a.ruleName,
    kind: a.kind,
    stage: a.stage,
    projection: a.projection,
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
    acknowledged: a.acknowledgedAt ? { at: isoTime(a.acknowledgedAt), by: a.acknowledgedBy, note: a.acknowledgementNote } : null,
  };
}
