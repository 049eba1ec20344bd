import { z } from 'zod';
import type { Role } from '../policies/permissions.ts';
import { isKnownTimeZone } from '../policies/time-zones.ts';

/** The signed-in person: who they are, their labs, their own settings. Shared by the routes and the client. */

/** An IANA time zone name the platform knows ("Europe/Berlin", "UTC"); loggers use it too. */
export const timeZoneSchema = z.string().trim().refine(isKnownTimeZone, 'must be an IANA time zone such as Europe/Berlin or UTC');

/** `PATCH /api/v1/me`: the person's own settings. `timeZone` null clears it. */
export const updateMeSchema = z.object({
  timeZone: timeZoneSchema.nullable(),
});
export type UpdateMeInput = z.infer<typeof updateMeSchema>;

/** `GET /api/v1/me` and `PATCH /api/v1/me`: no provider ids, no internal flags. */
export interface Me {
  /** `timeZone`: the person's own IANA zone for alert mails, null when not set. */
  user: { id: number; email: string; name: string; timeZone: string | null };
  labs: Array<{ slug: string; name: string; role: Role }>;
}
