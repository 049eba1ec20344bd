import type { Db } from '../db/create-db.ts';
import { inLab } from '../db/tenant-scope.ts';
import { personalTokensRepo, type PersonalTokenInfo } from '../db/personal-tokens.repo.ts';
import { crossLabRepo } from '../db/cross-lab.repo.ts';
import { auditRepo } from '../db/audit.repo.ts';
import { AppError, NotFoundError } from '../errors.ts';
import { newPersonalToken, personalTokenMatches, personalTokenPrefix } from './personal-token-format.ts';
import type { Actor, LabContext } from './lab-context.ts';

/** A token as shown once, right after it is made. */
export interface IssuedPersonalToken {
  token: string;
  info: PersonalTokenInfo;
}

/** Who a valid personal token speaks for (the lab guard still checks lab and membership). */
export interface PersonalTokenHolder {
  tenantId: number;
  tokenId: number;
  userId: number;
  lastUsedAt: Date | null;
}

/** The presented personal token is malformed, unknown, expired or revoked. */
export class InvalidTokenError extends AppError {
  constructor(message: string) {
    super(401, 'invalid_token', message);
  }
}

const DAY_MS = 86_400_000;
/** last_used_at is written at most this often per token, so reads do not become writes. */
const TOUCH_INTERVAL_MS = 60_000;

/**
 * Personal API tokens: a member makes, lists and revokes their own tokens in one lab; scripts
 * present them as `Authorization: Bearer lbt_…` on read routes. Made and revoked with an audit
 * event; the secret is shown once and only its SHA-256 is kept.
 */
export function createPersonalTokensService(deps: { db: Db; now?: () => Date }) {
  const now = deps.now ?? (() => new Date());

  return {
    /** The acting person's own tokens in this lab, newest first (revoked and expired included). */
    async listOwn(lab: LabContext, actor: Pick<Actor, 'id'>): Promise<PersonalTokenInfo[]> {
      return personalTokensRepo(inLab(deps.db, lab.id)).listForUser(actor.id);
    },

    /** Makes a token for the acting person in this lab, valid `expiresInDays` days (shown once). */
    async create(lab: LabContext, actor: Actor, input: { name: string; expiresInDays: number }): Promise<IssuedPersonalToken> {
      return deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const made = newPersonalToken();
        const createdAt = now();
        const expiresAt = new Date(createdAt.getTime() + input.expiresInDays * DAY_MS);
        const id = await personalTokensRepo(scope).insert({
          userId: actor.id,
          name: input.name,
          prefix: made.prefix,
          tokenHash: made.hash,
          createdAt,
          expiresAt,
        });
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'token.created',
          targetType: 'personal-token',
          targetId: id,
          summary: `${actor.displayName} created the personal token "${input.name}" (${made.prefix}…), valid ${input.expiresInDays} day(s)`,
          details: { tokenPrefix: made.prefix, expiresAt: expiresAt.toISOString() },
        });
        return { token: made.token, info: (await personalTokensRepo(scope).find(id))! };
      });
    },

    /** Revokes one of the acting person's own tokens; someone else's answers 404 like a missing one. */
    async revokeOwn(lab: LabContext, actor: Actor, tokenId: number): Promise<void> {
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const token = await personalTokensRepo(scope).find(tokenId);
        if (!token || token.userId !== actor.id) throw new NotFoundError('No such personal token of yours in this lab.');
        if (token.revokedAt) return;
        await personalTokensRepo(scope).revoke(tokenId, now());
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'token.revoked',
          targetType: 'personal-token',
          targetId: tokenId,
          summary: `${actor.displayName} revoked the personal token "${token.name}" (${token.prefix}…)`,
          details: { tokenPrefix: token.prefix },
        });
      });
    },

    /**
     * Checks a presented token: well-formed, known (by prefix, then a constant-time hash
     * compare), not revoked, not expired. The caller then checks that the token's lab is the
     * URL's and that its owner is still a member, and calls `recordUse`.
     */
    async authenticate(presented: string): Promise<PersonalTokenHolder> {
      const prefix = personalTokenPrefix(presented);
      const match = prefix ? await crossLabRepo(deps.db).personalTokenByPrefix(prefix) : null;
      if (!match || !personalTokenMatches(presented, match.tokenHash)) throw new InvalidTokenError('This personal token is not valid.');
      if (match.revokedAt) throw new InvalidTokenError('This personal token has been revoked.');
      if (match.expiresAt.getTime() <= now().getTime()) throw new InvalidTokenError('This personal token has expired.');
      return { tenantId: match.tenantId, tokenId: match.tokenId, userId: match.userId, lastUsedAt: match.lastUsedAt };
    },

    /** Records that a token was used, at most once a minute, so reads do not all become writes. */
    async recordUse(holder: PersonalTokenHolder): Promise<void> {
      const at = now();
      if (holder.lastUsedAt && at.getTime() - holder.lastUsedAt.getTime() < TOUCH_INTERVAL_MS) return;
      await personalTokensRepo(inLab(deps.db, holder.tenantId)).touch(holder.tokenId, at);
    },
  };
}

export type PersonalTokensService = ReturnType<typeof createPersonalTokensService>;
