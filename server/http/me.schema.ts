import { z } from 'zod';
import { timeZoneSchema } from './time-zone.schema.ts';

/** `PATCH /api/v1/me`: the person's own settings. `timeZone` null clears it. */
export const updateMeSchema = z.object({
  timeZone: timeZoneSchema.nullable(),
});

export type UpdateMeInput = z.infer<typeof updateMeSchema>;
