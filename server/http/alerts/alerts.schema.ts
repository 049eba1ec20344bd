import { z } from 'zod';
import { timeParam } from '../channels/channels.schema.ts';

/**
 * Input schemas of the alert routes that are not shared with the other layers: path parameters
 * and list queries. The rule kinds, parameters and create/update inputs live in
 * `server/contract/alerts.ts`, which services, repositories and the client import too.
 */

export const ruleIdParams = z.object({ ruleId: z.coerce.number().int('must be a whole number').positive('must be a positive number') });
export const alertIdParams = z.object({ alertId: z.coerce.number().int('must be a whole number').positive('must be a positive number') });

/** `POST …/alerts/:alertId/acknowledge`. */
export const acknowledgeAlertSchema = z.object({
  note: z.string({ error: 'must be text' }).trim().max(500, 'must be at most 500 characters').default(''),
});

/** `GET …/alerts?status&days&channelId`: open alerts, or all opened in the last `days` days plus any still open. */
export const listAlertsQuery = z.object({
  status: z.enum(['open', 'all'], { error: 'must be open or all' }).default('all'),
  days: z.coerce.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be at least 1').max(366, 'must be at most 366').default(7),
  channelId: z.coerce.number({ error: 'must be a number' }).int('must be a whole number').positive('must be a positive number').optional(),
});

/** `GET …/channels/:channelId/alerts?from&to`: alerts that overlapped the range (default: the last 7 days). */
export const channelAlertsQuery = z.object({ from: timeParam.optional(), to: timeParam.optional() });
