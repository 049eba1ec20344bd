/**
 * Words of the alerts area (alert rules, alerts, acknowledging): field labels as the rule form
 * names them and the reasons its checks give. Shared by the contract, the alert services and
 * the client (`@shared/contract/words/alerts.ts`).
 */

/** Fields of an alert rule (`POST/PATCH …/alert-rules`), the parameters of each kind included. */
export const ALERT_RULE_LABELS = {
  name: 'Rule name',
  kind: 'Kind of rule',
  channelId: 'Channel',
  loggerId: 'Logger',
  reminderAfterMin: 'Remind after (minutes)',
  enabled: 'Rule on',
  params: 'Rule settings',
  factor: 'Silent for (expected intervals)',
  low: 'Low limit',
  high: 'High limit',
  holdS: 'Outside the limits for at least (seconds)',
  maxPerMinute: 'Largest change per minute',
  direction: 'Direction of change',
  periodH: 'Length of one cycle (hours)',
  k: 'How unusual (robust spreads)',
  historyCycles: 'Cycles of history compared',
  ruleId: 'Alert rule',
} as const;

/** Fields of the alert list and of acknowledging an alert. */
export const ALERT_LABELS = {
  note: 'Note',
  status: 'Which alerts',
  days: 'Days back',
  channelId: 'Channel',
  alertId: 'Alert',
} as const;

/** Reasons the alerts area's own checks give. */
export const ALERT_REASONS = {
  kind: 'must be silence, bounds, rate or unusual',
  direction: 'must be rise, fall or either',
  status: 'must be open or all',
  oneLimitAtLeast: 'set a low limit, a high limit or both',
  lowBelowHigh: 'must be below the high limit',
  channelOrLogger: 'choose either a channel or a whole logger to watch, not both',
  channelChosen: 'choose a channel to watch',
  factorMin: 'must be at least 1 (one expected interval)',
  paramsNotForKind: 'are not settings of this kind of rule',
} as const;

/**
 * Why a rule is not watching, in plain words (the rule list, the channel page and the
 * not-watching mail): completes "Not watching since … — …".
 */
export const RULE_BLIND_WORDS = {
  'no-readings': 'no reading has arrived yet',
  'too-little-history': 'too little history to learn the usual pattern',
  'too-many-gaps': 'too much of the history is missing',
  'channel-retired': 'the channel is retired',
  'logger-silent': 'the logger has gone quiet',
} as const;
