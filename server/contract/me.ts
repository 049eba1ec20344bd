import { z } from 'zod';
import type { Role } from '../policies/permissions.ts';
import { isKnownTimeZone } from '../policies/time-zones.ts';
import { REASONS } from './words/reasons.ts';

/** The signed-in person: who they are, their labs, their own settings. Shared by the routes and the client. */

/** An IANA time zone name the platform knows ("Europe/Berlin", "UTC"); loggers use it too. */
export const timeZoneSchema = z.string().trim().refine(isKnownTimeZone, REASONS.timeZone);

/**
 * Which clock a person reads times on: `logger` (the default) shows readings-related times
 * (charts, readings, alerts, quarantine, uploads, notes, exports) on the logger's clock and
 * everything else on the person's own; `mine` shows everything on the person's own zone; `utc`
 * shows everything in UTC. Alert mails follow the same choice.
 */
export const CLOCK_CHOICES = ['logger', 'mine', 'utc'] as const;
export const clockChoiceSchema = z.enum(CLOCK_CHOICES);
export type ClockChoice = z.infer<typeof clockChoiceSchema>;

/**
 * `PATCH /api/v1/me`: the person's own settings; each is optional (only what is sent changes),
 * at least one must be sent. `timeZone` null clears it.
 */
export const updateMeSchema = z
  .object({
    timeZone: timeZoneSchema.nullable().optional(),
    clock: clockChoiceSchema.optional(),
  })
  .strict()
  .refine((v) => v.timeZone !== undefined || v.clock !== undefined, 'send a time zone, a clock choice or both');
export type UpdateMeInput = z.infer<typeof updateMeSchema>;

/** `GET /api/v1/me` and `PATCH /api/v1/me`: no provider ids, no internal flags. */
export interface Me {
  /**
   * `timeZone`: the person's own IANA zone, null when not set (the browser's zone stands in);
   * `clock`: which clock times are shown on, in the app and in alert mails.
   */
  user: { id: number; email: string; name: string; timeZone: string | null; clock: ClockChoice };
  labs: Array<{ slug: string; name: string; role: Role }>;
}
