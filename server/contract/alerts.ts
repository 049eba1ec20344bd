import { z } from 'zod';
import { idParams, type IsoTime } from './common.ts';
import { rangeFields } from './channels.ts';
import { ALERT_REASONS } from './words/alerts.ts';
import { atLeast, atMost, REASONS } from './words/reasons.ts';

/**
 * Alert rules and alerts: the vocabulary shared by the HTTP layer, the alert services, the
 * repositories and the client's rule form (the kinds of rule, their parameters), the inputs of
 * every alert route and what each answers. Every layer may import it, and all give the same
 * `field: reason` messages.
 */

export const ALERT_RULE_KINDS = ['silence', 'bounds', 'rate', 'unusual'] as const;
export type AlertRuleKind = (typeof ALERT_RULE_KINDS)[number];

const num = (what = 'a number') => z.number({ error: `must be ${what}` }).refine(Number.isFinite, REASONS.finite);
const whole = (min: number, max: number, negative = 'must not be negative') =>
  z
    .number({ error: 'must be a number' })
    .int('must be a whole number')
    .min(min, min === 0 ? negative : atLeast(min))
    .max(max, atMost(max));
const id = z.number({ error: 'must be a number' }).int('must be a whole number').positive(REASONS.positive);

export const silenceParamsSchema = z.object({
  factor: z.number({ error: 'must be a number' }).min(1, ALERT_REASONS.factorMin).max(1000, 'must be at most 1000'),
});
/**
 * Opt-in early warning on a bounds rule: warn when the channel's fitted model gives at least
 * `chance` of crossing a limit within `horizonMin` minutes. Null (the default) is off.
 */
export const earlyWarningSchema = z.object({
  horizonMin: whole(5, 24 * 60).default(60),
  chance: z.number({ error: 'must be a number' }).min(0.5, 'must be at least 0.5').max(0.99, 'must be at most 0.99').default(0.8),
});
export type EarlyWarningParams = z.infer<typeof earlyWarningSchema>;

export const boundsParamsSchema = z
  .object({
    low: num().nullable().default(null),
    high: num().nullable().default(null),
    holdS: whole(0, 7 * 86_400, 'must not be negative (seconds)').default(0),
    earlyWarning: earlyWarningSchema.nullable().default(null),
  })
  .refine((p) => p.low !== null || p.high !== null, { path: ['high'], message: ALERT_REASONS.oneLimitAtLeast })
  .refine((p) => p.low === null || p.high === null || p.low < p.high, { path: ['low'], message: ALERT_REASONS.lowBelowHigh });
export const rateParamsSchema = z.object({
  maxPerMinute: z.number({ error: 'must be a number' }).gt(0, 'must be above 0').max(1e9, 'must be at most 1,000,000,000 a minute'),
  direction: z.enum(['rise', 'fall', 'either'], { error: ALERT_REASONS.direction }).default('either'),
});
export const unusualParamsSchema = z.object({
  periodH: z
    .number({ error: 'must be a number' })
    .gt(0, 'must be above 0 hours')
    .max(24 * 31, 'must be at most 744 hours (31 days)')
    .default(24),
  k: z.number({ error: 'must be a number' }).min(2, 'must be at least 2').max(50, 'must be at most 50').default(5),
  historyCycles: whole(3, 14).default(3),
});

/** The parameter schema of each kind of rule. */
export const PARAMS_SCHEMAS = {
  silence: silenceParamsSchema,
  bounds: boundsParamsSchema,
  rate: rateParamsSchema,
  unusual: unusualParamsSchema,
} as const;
export type AlertRuleParams = {
  silence: z.infer<typeof silenceParamsSchema>;
  bounds: z.infer<typeof boundsParamsSchema>;
  rate: z.infer<typeof rateParamsSchema>;
  unusual: z.infer<typeof unusualParamsSchema>;
};

const common = {
  name: z.string({ error: 'must be text' }).trim().min(1, 'must not be empty').max(80, 'must be at most 80 characters'),
  /** Minutes before the first reminder (and between reminders); null uses the lab's default; 0 sends none. */
  reminderAfterMin: whole(0, 10_080, 'must not be negative (minutes)').nullable().default(null),
  enabled: z.boolean({ error: 'must be true or false' }).default(true),
};
const onChannel = { channelId: id };

/** `POST …/alert-rules`: a value rule watches one channel; a silence rule a channel or a whole logger. */
export const createAlertRuleSchema = z.discriminatedUnion(
  'kind',
  [
    z
      .object({ ...common, kind: z.literal('silence'), channelId: id.optional(), loggerId: id.optional(), params: silenceParamsSchema })
      .refine((r) => (r.channelId === undefined) !== (r.loggerId === undefined), {
        path: ['channelId'],
        message: ALERT_REASONS.channelOrLogger,
      }),
    z.object({ ...common, kind: z.literal('bounds'), ...onChannel, params: boundsParamsSchema }),
    z.object({ ...common, kind: z.literal('rate'), ...onChannel, params: rateParamsSchema }),
    z.object({ ...common, kind: z.literal('unusual'), ...onChannel, params: unusualParamsSchema }),
  ],
  { error: ALERT_REASONS.kind },
);
export type CreateAlertRuleInput = z.infer<typeof createAlertRuleSchema>;

/** `PATCH …/alert-rules/:ruleId`: what may change (the kind and what is watched may not; make a new rule). */
export const updateAlertRuleSchema = z
  .object({
    name: common.name.optional(),
    reminderAfterMin: common.reminderAfterMin.unwrap().unwrap().nullable().optional(),
    enabled: z.boolean({ error: 'must be true or false' }).optional(),
    /** Checked against the rule's kind by the service. */
    params: z.record(z.string(), z.unknown(), { error: REASONS.object }).optional(),
  })
  .strict();
export type UpdateAlertRuleInput = z.infer<typeof updateAlertRuleSchema>;

/** `/alert-rules/:ruleId`. */
export const ruleIdParams = idParams('ruleId');
/** `/alerts/:alertId`. */
export const alertIdParams = idParams('alertId');

/** `POST …/alerts/:alertId/acknowledge`: an optional note (no body at all means no note). */
export const acknowledgeAlertSchema = z
  .object({
    note: z.string({ error: 'must be text' }).trim().max(500, 'must be at most 500 characters').default(''),
  })
  .prefault({});
export type AcknowledgeAlertInput = z.input<typeof acknowledgeAlertSchema>;

/** `GET …/alerts?status&days&channelId`: open alerts, or all opened in the last `days` days plus any still open. */
export const listAlertsQuery = z.object({
  status: z.enum(['open', 'all'], { error: ALERT_REASONS.status }).default('all'),
  days: z.coerce.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be at least 1').max(366, 'must be at most 366').default(7),
  channelId: z.coerce.number({ error: 'must be a number' }).int('must be a whole number').positive(REASONS.positive).optional(),
});
export type ListAlertsQuery = z.infer<typeof listAlertsQuery>;

/** `GET …/channels/:channelId/alerts?from&to`: alerts that overlapped the range (default: the 7 days up to now). */
export const channelAlertsQuery = z.object(rangeFields);

/** What a rule watches, named as the lab sees it (a silence rule on a whole logger has no channel). */
export interface AlertRuleWatched {
  channelId: number | null;
  loggerId: number;
  label: string;
  loggerName: string;
  unit: string;
}

/** Why a rule is not watching its channel right now (the silence rule reports silence as its alert, not here). */
export const RULE_BLIND_REASONS = ['no-readings', 'too-little-history', 'too-many-gaps', 'channel-retired', 'logger-silent'] as const;
export type RuleBlindReason = (typeof RULE_BLIND_REASONS)[number];

/** Whether a rule is watching: when it last judged a reading and, when it cannot, why and since when (epoch ms). */
export interface RuleHealth {
  /** Time of the last reading the rule judged; null before the first. */
  lastJudgedAt: number | null;
  /** Null while the rule watches. */
  notWatching: { reason: RuleBlindReason; detail: string; since: number } | null;
}

/** An alert rule as listed: what it watches and whether the viewer is subscribed (its evaluation memory stays on the server). */
export interface AlertRule {
  id: number;
  name: string;
  kind: AlertRuleKind;
  channelId: number | null;
  loggerId: number | null;
  params: Record<string, unknown>;
  reminderAfterMin: number | null;
  enabled: boolean;
  createdAt: IsoTime;
  updatedAt: IsoTime;
  watched: AlertRuleWatched;
  subscribed: boolean;
  openAlertId: number | null;
  health: RuleHealth;
}

/** `GET …/alert-rules`. */
export interface AlertRulesAnswer {
  rules: AlertRule[];
}

/** `POST …/alert-rules` and `PATCH …/alert-rules/:ruleId`. */
export interface AlertRuleAnswer {
  rule: AlertRule;
}

/** Who acknowledged an alert, when, and with what note. */
export interface AlertAcknowledgement {
  at: IsoTime;
  by: { name: string; email: string } | null;
  note: string | null;
}

/**
 * An alert's stage: 'crossed' — a limit or pattern was passed (every rule kind); 'expected' —
 * a bounds rule's early warning: the projection gives a high chance of crossing soon. Both may
 * be open at once for one rule; an expected-stage alert resolves itself when the projection
 * falls back.
 */
export const ALERT_STAGES = ['crossed', 'expected'] as const;
export type AlertStage = (typeof ALERT_STAGES)[number];

/** One projected step of an early warning: time (epoch ms), the projected value and the central band. */
export interface ProjectedStep {
  at: number;
  mean: number;
  lower: number;
  upper: number;
}

/** What an early warning was based on: the model, the chance and the interval at the horizon, and the projected path for the chart. */
export interface AlertProjection {
  /** The model in words, e.g. "ARMA(1,1) on the remainder after the daily cycle". */
  model: string;
  limit: number;
  side: 'high' | 'low';
  horizonMin: number;
  /** Chance of crossing the limit within the horizon (0–1). */
  chance: number;
  /** Median minutes to the first crossing among simulated paths that cross; null when none does. */
  medianMinutesToCross: number | null;
  /** The central interval of the projected value at the horizon. */
  interval: { level: number; lower: number; upper: number };
  /** Time of the last reading the projection starts from (epoch ms). */
  from: number;
  /** The channel's unit, for the numbers above. */
  unit: string;
  /** The projection step by step up to the horizon (central value and band). */
  path: ProjectedStep[];
}

/** One alert: when and why it opened, whether and when it resolved, and its acknowledgement. Reading times are epoch ms like the series. */
export interface Alert {
  id: number;
  ruleId: number;
  ruleName: string;
  kind: AlertRuleKind;
  stage: AlertStage;
  /** Set on an expected-stage alert. */
  projection: AlertProjection | null;
  channelId: number | null;
  loggerId: number | null;
  open: boolean;
  openedAt: number;
  openedValue: number | null;
  openedDetail: string;
  resolvedAt: number | null;
  resolvedValue: number | null;
  resolvedDetail: string | null;
  remindersSent: number;
  acknowledged: AlertAcknowledgement | null;
}

/** `GET …/alerts`: the alerts and the server's clock (epoch ms), for "open for 3 h". */
export interface AlertsAnswer {
  alerts: Alert[];
  now: number;
}

/** `POST …/alerts/:alertId/acknowledge`. */
export interface AlertAnswer {
  alert: Alert;
}

/** `GET …/channels/:channelId/alerts`: the range asked for (filled in) and the alerts overlapping it. */
export interface ChannelAlertsAnswer {
  channelId: number;
  from: number;
  to: number;
  alerts: Alert[];
}
