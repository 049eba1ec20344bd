import type { DbOrTrx } from './tenant-scope.ts';
import { inLab } from './tenant-scope.ts';
import { LAB_COLUMNS, labsRepo, toLab, type Lab, type LabMembershipSummary, type LabRow } from './labs.repo.ts';
import { invitationsRepo, type Invitation } from './invitations.repo.ts';
import type { Role } from '../policies/permissions.ts';

/** What the ingest endpoint learns from a key's prefix. */
export interface IngestKeyMatch {
  tenantId: number;
  keyId: number;
  loggerId: number;
  keyHash: string;
  revoked: boolean;
  loggerRetired: boolean;
  lastUsedAt: Date | null;
}

/** What the lab guard learns from a personal token's prefix. */
export interface PersonalTokenMatch {
  tenantId: number;
  tokenId: number;
  userId: number;
  tokenHash: string;
  expiresAt: Date;
  revokedAt: Date | null;
  lastUsedAt: Date | null;
}

/** The plan columns of one lab's billing row (plan, status, grace), as plan rules read them. */
export interface PlanState {
  planKey: string;
  status: string;
  graceUntil: Date | null;
}

/**
 * Every lookup made before a lab is known, in one place: the statements that read lab-owned
 * tables without a lab scope, because what they start from — a slug and a person, a key or
 * token prefix, an invitation link, a Stripe customer, a person's own id, a walk over every
 * lab — is what tells which lab it is. Each returns ids and the few fields needed to decide;
 * everything after goes through `inLab`. The `labs` and `users` tables are not lab-owned and
 * keep their own repos (labs.repo.ts, users.repo.ts).
 */
export function crossLabRepo(db: DbOrTrx) {
  return {
    /**
     * The lab at `slug` with `userId`'s role in it, or null when there is no such lab OR the
     * person is not a member: one statement (the lab joined to that person's membership) that
     * returns nothing in both cases, so the lab guard runs the same statements and the same
     * code for someone else's lab as for a lab that does not exist.
     */
    async labForMember(slug: string, userId: number): Promise<(Lab & { role: Role }) | null> {
      const row = await db<LabRow>('labs')
        .join('memberships', function ownMembership() {
          this.on('memberships.tenant_id', '=', 'labs.id').andOn('memberships.user_id', '=', db.raw('?', [userId]));
        })
        .where('labs.slug', slug)
        // a lab being deleted is closed to everyone from the moment an admin deleted it
        .whereNull('labs.deleted_at')
        .first(...LAB_COLUMNS, 'memberships.role');
      return row ? { ...toLab(row), role: (row as LabRow & { role: Role }).role } : null;
    },

    /**
     * A logger presents only its key. Matching on the random public prefix yields the lab and
     * logger; the caller then compares the full key's hash in constant time.
     */
    async ingestKeyByPrefix(prefix: string): Promise<IngestKeyMatch | null> {
      const row = await db('ingest_keys')
        .join('loggers', function joinLogger() {
          this.on('loggers.tenant_id', '=', 'ingest_keys.tenant_id').andOn('loggers.id', '=', 'ingest_keys.logger_id');
        })
        .join('labs', 'labs.id', 'ingest_keys.tenant_id')
        .where('ingest_keys.prefix', prefix)
        // a deleted lab's keys are dead at once: nothing new is stored while its rows are removed
        .whereNull('labs.deleted_at')
        .first(
          'ingest_keys.tenant_id as tenantId',
          'ingest_keys.id as keyId',
          'ingest_keys.logger_id as loggerId',
          'ingest_keys.key_hash as keyHash',
          'ingest_keys.revoked_at as revokedAt',
          'ingest_keys.last_used_at as lastUsedAt',
          'loggers.retired_at as loggerRetiredAt',
        );
      if (!row) return null;
      return {
        tenantId: Number(row.tenantId),
        keyId: Number(row.keyId),
        loggerId: Number(row.loggerId),
        keyHash: row.keyHash,
        revoked: row.revokedAt !== null,
        loggerRetired: row.loggerRetiredAt !== null,
        lastUsedAt: row.lastUsedAt ?? null,
      };
    },

    /**
     * A script presents only its personal token. The random public prefix yields the lab and
     * owner; the caller compares the full token's hash in constant time and checks the lab
     * against the URL's.
     */
    async personalTokenByPrefix(prefix: string): Promise<PersonalTokenMatch | null> {
      const row = await db('personal_tokens')
        .where('personal_tokens.prefix', prefix)
        .first(
          'tenant_id as tenantId',
          'id as tokenId',
          'user_id as userId',
          'token_hash as tokenHash',
          'expires_at as expiresAt',
          'revoked_at as revokedAt',
          'last_used_at as lastUsedAt',
        );
      if (!row) return null;
      return {
        tenantId: Number(row.tenantId),
        tokenId: Number(row.tokenId),
        userId: Number(row.userId),
        tokenHash: row.tokenHash,
        expiresAt: row.expiresAt,
        revokedAt: row.revokedAt ?? null,
        lastUsedAt: row.lastUsedAt ?? null,
      };
    },

    /**
     * An invitation link names a lab slug and carries a secret: the lab by its slug, then the
     * invitation by the secret's hash within that lab (`lock`: row-locked for acceptance).
     * `tokenHash` null (a malformed secret) still looks the lab up, so a bad link costs the
     * same statements as a wrong one; the answer is null then, as for any unknown lab or secret.
     */
    async invitationByToken(slug: string, tokenHash: string | null, opts: { lock?: boolean } = {}): Promise<{ lab: Lab; invitation: Invitation } | null> {
      const lab = await labsRepo(db).findBySlug(slug);
      if (!lab || tokenHash === null) return null;
      const invitation = await invitationsRepo(inLab(db, lab.id)).findByTokenHash(tokenHash, opts);
      return invitation ? { lab, invitation } : null;
    },

    /** A Stripe webhook names only the customer: the lab id the customer was created for, or null. */
    async labIdForStripeCustomer(customerId: string): Promise<number | null> {
      const row = await db('lab_billing')
        .join('labs', 'labs.id', 'lab_billing.tenant_id')
        .where('lab_billing.stripe_customer_id', customerId)
        .whereNull('labs.deleted_at')
        .first('lab_billing.tenant_id as tenantId');
      return row ? Number(row.tenantId) : null;
    },

    /** The labs one person belongs to, with their role in each (keyed by the signed-in person's own id). */
    async labsOf(userId: number): Promise<LabMembershipSummary[]> {
      const rows = await db('memberships')
        .join('labs', 'labs.id', 'memberships.tenant_id')
        .where('memberships.user_id', userId)
        .whereNull('labs.deleted_at')
        .orderBy('labs.name')
        .select('labs.id as labId', 'labs.slug', 'labs.name', 'memberships.role');
      return rows.map((r: LabMembershipSummary) => ({ ...r, labId: Number(r.labId) }));
    },

    /**
     * The billing rows (plan, status, grace) of the labs this person administers, keyed by the
     * person's own id like labsOf; labs without a row are on the free plan and not listed.
     */
    async adminPlansOf(userId: number): Promise<PlanState[]> {
      return db('memberships')
        .join('lab_billing', 'lab_billing.tenant_id', 'memberships.tenant_id')
        .where('memberships.user_id', userId)
        .where('memberships.role', 'admin')
        .select('lab_billing.plan_key as planKey', 'lab_billing.status', 'lab_billing.grace_until as graceUntil');
    },

    /** Every lab's id, slug and name, for jobs that visit each lab in turn (the usage job); labs being deleted are skipped. */
    async allLabs(): Promise<Array<{ id: number; slug: string; name: string }>> {
      return (await db('labs').whereNull('deleted_at').orderBy('id').select('id', 'slug', 'name')).map((r: { id: number; slug: string; name: string }) => ({
        id: Number(r.id),
        slug: r.slug,
        name: r.name,
      }));
    },

    /**
     * Labs with enabled alert rules or mail waiting: the alert evaluator's and outbox sender's
     * walk (lab ids only). Small tables: rules are few per lab, sent mail may be pruned.
     */
    async labsWithAlertWork(): Promise<number[]> {
      const rows = await db.raw(
        'SELECT id FROM labs WHERE deleted_at IS NULL AND id IN (SELECT tenant_id FROM alert_rules WHERE enabled = 1 UNION SELECT tenant_id FROM notification_outbox WHERE sent_at IS NULL)',
      );
      return (rows[0] as Array<{ id: unknown }>).map((r) => Number(r.id));
    },
  };
}

export type CrossLabRepo = ReturnType<typeof crossLabRepo>;
