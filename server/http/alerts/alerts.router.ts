import { actorOf, labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { channelParams } from '../channels/channels.schema.ts';
import { createAlertRuleSchema, updateAlertRuleSchema } from '../../contract/alerts.ts';
import { acknowledgeAlertSchema, alertIdParams, channelAlertsQuery, listAlertsQuery, ruleIdParams } from './alerts.schema.ts';
import { presentAlert, presentAlertRule } from './alerts.presenter.ts';
import { parseRuleInput } from '../../services/alerts/alert-errors.ts';
import type { AlertRulesService } from '../../services/alerts/alert-rules.service.ts';
import type { LabRoute } from '../lab-routes.ts';

const WEEK_MS = 7 * 86_400_000;

/**
 * Alert rules and alerts of a lab. Invalid rules answer 422 with `field: reason` messages
 * (the rule is well-formed JSON but cannot work); another lab's channel answers 404.
 */
export function alertRoutes(deps: { alerts: AlertRulesService; now?: () => number }): LabRoute[] {
  const { alerts } = deps;
  const now = deps.now ?? Date.now;
  return [
    {
      method: 'get',
      path: '/alert-rules',
      permission: 'alerts.read',
      summary: 'Every alert rule of the lab, with what it watches and whether you are subscribed.',
      handle: async (req, res) => {
        res.json({ rules: (await alerts.list(labOf(res), actorOf(req))).map(presentAlertRule) });
      },
    },
    {
      method: 'post',
      path: '/alert-rules',
      permission: 'alerts.manage',
      summary: 'Make an alert rule (silence, bounds, rate or unusual reading); you are subscribed to it.',
      body: createAlertRuleSchema,
      handle: async (req, res) => {
        const input = parseRuleInput(createAlertRuleSchema, req.body);
        res.status(201).json({ rule: presentAlertRule(await alerts.create(labOf(res), actorOf(req), input)) });
      },
    },
    {
      method: 'patch',
      path: '/alert-rules/:ruleId',
      permission: 'alerts.manage',
      summary: "Change an alert rule's name, parameters, reminder delay, or turn it off and on.",
      body: updateAlertRuleSchema,
      handle: async (req, res) => {
        const { ruleId } = parseInput(ruleIdParams, req.params);
        const input = parseRuleInput(updateAlertRuleSchema, req.body);
        res.json({ rule: presentAlertRule(await alerts.update(labOf(res), actorOf(req), ruleId, input)) });
      },
    },
    {
      method: 'delete',
      path: '/alert-rules/:ruleId',
      permission: 'alerts.manage',
      summary: 'Delete an alert rule (its past alerts stay in the history).',
      handle: async (req, res) => {
        const { ruleId } = parseInput(ruleIdParams, req.params);
        await alerts.remove(labOf(res), actorOf(req), ruleId);
        res.status(204).end();
      },
    },
    ...([
      ['put', true, "Receive a rule's alert mail (opened, reminders, resolved)."],
      ['delete', false, "Stop receiving a rule's alert mail."],
    ] as const).map(
      ([method, on, summary]): LabRoute => ({
        method,
        path: '/alert-rules/:ruleId/subscription',
        permission: 'alerts.subscribe',
        summary,
        handle: async (req, res) => {
          const { ruleId } = parseInput(ruleIdParams, req.params);
          await alerts.setSubscribed(labOf(res), actorOf(req), ruleId, on);
          res.status(204).end();
        },
      }),
    ),
    {
      method: 'get',
      path: '/alerts',
      permission: 'alerts.read',
      summary: 'Open alerts, and recent ones (opened in the last `days` days), newest first.',
      query: listAlertsQuery,
      handle: async (req, res) => {
        const q = parseInput(listAlertsQuery, req.query);
        res.json({ alerts: (await alerts.alerts(labOf(res), q)).map(presentAlert), now: now() });
      },
    },
    {
      method: 'post',
      path: '/alerts/:alertId/acknowledge',
      permission: 'alerts.manage',
      summary: 'Acknowledge an alert with a note; no more reminders are sent for it.',
      body: acknowledgeAlertSchema,
      handle: async (req, res) => {
        const { alertId } = parseInput(alertIdParams, req.params);
        const { note } = parseInput(acknowledgeAlertSchema, req.body ?? {});
        res.json({ alert: presentAlert(await alerts.acknowledge(labOf(res), actorOf(req), alertId, note)) });
      },
    },
    {
      method: 'get',
      path: '/channels/:channelId/alerts',
      permission: 'alerts.read',
      summary: "A channel's alerts that overlap a time range, for the bands on its chart.",
      query: channelAlertsQuery,
      handle: async (req, res) => {
        const { channelId } = parseInput(channelParams, req.params);
        const q = parseInput(channelAlertsQuery, req.query);
        const to = q.to ?? now();
        const from = q.from ?? to - WEEK_MS;
        res.json({ channelId, from, to, alerts: (await alerts.channelAlerts(labOf(res), channelId, from, to)).map(presentAlert) });
      },
    },
  ];
}
