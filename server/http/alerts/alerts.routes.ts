import { channelParams } from '../../contract/channels.ts';
import {
  acknowledgeAlertSchema,
  alertIdParams,
  channelAlertsQuery,
  createAlertRuleSchema,
  listAlertsQuery,
  ruleIdParams,
  updateAlertRuleSchema,
  type AlertAnswer,
  type AlertRuleAnswer,
  type AlertRulesAnswer,
  type AlertsAnswer,
  type ChannelAlertsAnswer,
} from '../../contract/alerts.ts';
import { presentAlert, presentAlertRule } from './alerts.presenter.ts';
import type { AlertRulesService } from '../../services/alerts/alert-rules.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';

const WEEK_MS = 7 * 86_400_000;

/**
 * The one refusal of a well-formed rule: it is valid input but cannot work on the channel it
 * watches (the service checks it against the channel's reporting interval).
 */
const RULE_CANNOT_WORK = {
  422: "`invalid_rule`: the rule cannot work on this channel: an unusual-reading cycle shorter than two of the channel's expected intervals, or more than 60,000 readings of history (`params.periodH: …`, `params.historyCycles: …`).",
} as const;

/**
 * Alert rules and alerts of a lab. Invalid input answers 400 `invalid_input` with `field: reason`
 * messages like every route (a PATCH's new `params` are checked against the rule's kind by the
 * service, with the same answer); a rule that cannot work on its channel answers 422; another
 * lab's channel, logger, rule or alert answers 404.
 */
export function alertRoutes(deps: { alerts: AlertRulesService; now?: () => number }): Route[] {
  const { alerts } = deps;
  const now = deps.now ?? Date.now;
  return [
    defineRoute({
      method: 'get',
      path: '/alert-rules',
      auth: { permission: 'alerts.read' },
      summary: 'Every alert rule of the lab, with what it watches and whether you are subscribed.',
      response: { status: 200, description: 'The rules, each with what it watches and your subscription.' },
      handle: async ({ lab, actor }): Promise<AlertRulesAnswer> => ({ rules: (await alerts.list(lab, actor)).map(presentAlertRule) }),
    }),
    defineRoute({
      method: 'post',
      path: '/alert-rules',
      auth: { permission: 'alerts.manage' },
      summary: 'Make an alert rule (silence, bounds, rate or unusual reading); you are subscribed to it.',
      body: createAlertRuleSchema,
      response: { status: 201, description: 'The new rule; its maker is subscribed.' },
      errors: RULE_CANNOT_WORK,
      handle: async ({ lab, actor, body }): Promise<AlertRuleAnswer> => ({ rule: presentAlertRule(await alerts.create(lab, actor, body)) }),
    }),
    defineRoute({
      method: 'patch',
      path: '/alert-rules/:ruleId',
      auth: { permission: 'alerts.manage' },
      summary: "Change an alert rule's name, parameters, reminder delay, or turn it off and on.",
      params: ruleIdParams,
      body: updateAlertRuleSchema,
      response: { status: 200, description: 'The changed rule.' },
      errors: RULE_CANNOT_WORK,
      handle: async ({ lab, actor, params, body }): Promise<AlertRuleAnswer> => ({
        rule: presentAlertRule(await alerts.update(lab, actor, params.ruleId, body)),
      }),
    }),
    defineRoute({
      method: 'delete',
      path: '/alert-rules/:ruleId',
      auth: { permission: 'alerts.manage' },
      summary: 'Delete an alert rule (its past alerts stay in the history).',
      params: ruleIdParams,
      response: { status: 204, description: 'Deleted.' },
      handle: async ({ lab, actor, params }) => alerts.remove(lab, actor, params.ruleId),
    }),
    ...(
      [
        ['put', true, "Receive a rule's alert mail (opened, reminders, resolved).", 'Subscribed.'],
        ['delete', false, "Stop receiving a rule's alert mail.", 'Unsubscribed.'],
      ] as const
    ).map(([method, on, summary, description]) =>
      defineRoute({
        method,
        path: '/alert-rules/:ruleId/subscription',
        auth: { permission: 'alerts.subscribe' },
        summary,
        params: ruleIdParams,
        response: { status: 204, description },
        handle: async ({ lab, actor, params }) => alerts.setSubscribed(lab, actor, params.ruleId, on),
      }),
    ),
    defineRoute({
      method: 'get',
      path: '/alerts',
      auth: { permission: 'alerts.read' },
      summary: 'Open alerts, and recent ones (opened in the last `days` days), newest first.',
      query: listAlertsQuery,
      response: { status: 200, description: "The alerts, newest first, and the server's clock (`now`, epoch ms)." },
      handle: async ({ lab, query }): Promise<AlertsAnswer> => ({ alerts: (await alerts.alerts(lab, query)).map(presentAlert), now: now() }),
    }),
    defineRoute({
      method: 'post',
      path: '/alerts/:alertId/acknowledge',
      auth: { permission: 'alerts.manage' },
      summary: 'Acknowledge an alert with a note; no more reminders are sent for it.',
      params: alertIdParams,
      body: acknowledgeAlertSchema,
      response: { status: 200, description: 'The alert with its acknowledgement.' },
      handle: async ({ lab, actor, params, body }): Promise<AlertAnswer> => ({
        alert: presentAlert(await alerts.acknowledge(lab, actor, params.alertId, body.note)),
      }),
    }),
    defineRoute({
      method: 'get',
      path: '/channels/:channelId/alerts',
      auth: { permission: 'alerts.read' },
      tag: 'alerts',
      summary: "A channel's alerts that overlap a time range, for the bands on its chart.",
      params: channelParams,
      query: channelAlertsQuery,
      response: { status: 200, description: 'The range (filled in: the 7 days up to now by default) and the alerts overlapping it.' },
      handle: async ({ lab, params, query }): Promise<ChannelAlertsAnswer> => {
        const to = query.to ?? now();
        const from = query.from ?? to - WEEK_MS;
        return { channelId: params.channelId, from, to, alerts: (await alerts.channelAlerts(lab, params.channelId, from, to)).map(presentAlert) };
      },
    }),
  ];
}
