import { z } from 'zod';
import { idParams, type IsoTime } from './common.ts';
import { TOKEN_REASONS } from './words/tokens.ts';

/**
 * A member's personal API tokens in a lab (read-only access for notebooks and scripts): the inputs
 * of the token routes and what they answer. Shared by the routes, the ops CLI and the client's
 * "new token" form.
 */

/** `POST …/tokens`: a name to recognise the token by and how many days it works. */
export const createPersonalTokenSchema = z.object({
  name: z.string({ error: 'must be text' }).trim().min(1, 'must not be empty').max(80, 'must be at most 80 characters'),
  expiresInDays: z.number({ error: 'must be a number' }).int('must be a whole number').min(1, TOKEN_REASONS.expiresMin).max(365, TOKEN_REASONS.expiresMax),
});
export type CreatePersonalTokenInput = z.infer<typeof createPersonalTokenSchema>;

/** `/tokens/:tokenId`. */
export const tokenIdParams = idParams('tokenId');

/** A personal token as listed: metadata only, never the secret. */
export interface PersonalToken {
  id: number;
  name: string;
  /** The token's first characters, to tell tokens apart (`lbt_…`). */
  prefix: string;
  createdAt: IsoTime;
  expiresAt: IsoTime;
  lastUsedAt: IsoTime | null;
  revokedAt: IsoTime | null;
}

/** `GET …/tokens`: the signed-in member's own tokens in this lab. */
export interface PersonalTokensAnswer {
  tokens: PersonalToken[];
}

/** `POST …/tokens`: the whole token, shown this once, and its metadata. */
export interface IssuedToken {
  token: string;
  tokenInfo: PersonalToken;
  shownOnce: true;
}
