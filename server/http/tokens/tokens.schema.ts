import { z } from 'zod';

/**
 * Input schemas of the personal token routes. Pure zod: the client's "new token" form imports
 * the same schema.
 */
export const createPersonalTokenSchema = z.object({
  name: z.string({ error: 'must be text' }).trim().min(1, 'must not be empty').max(80, 'must be at most 80 characters'),
  expiresInDays: z
    .number({ error: 'must be a number' })
    .int('must be a whole number')
    .min(1, 'must be at least 1')
    .max(365, 'must be at most 365'),
});
export type CreatePersonalTokenInput = z.infer<typeof createPersonalTokenSchema>;

export const tokenIdParams = z.object({ tokenId: z.coerce.number().int('must be a whole number').positive('must be a positive number') });
