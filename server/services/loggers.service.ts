import type { Db } from '../db/create-db.ts';
import { inLab } from '../db/tenant-scope.ts';
import { loggersRepo, type Logger, type LoggerInput } from '../db/loggers.repo.ts';
import { channelsRepo, type Channel, type ChannelInput } from '../db/channels.repo.ts';
import { ingestKeysRepo, type IngestKeyInfo } from '../db/ingest-keys.repo.ts';
import { auditRepo } from '../db/audit.repo.ts';
import { labsRepo } from '../db/labs.repo.ts';
import { NotFoundError } from '../errors.ts';
import { ConflictError, isDuplicateKey, fieldConflict } from './service-errors.ts';
import { newIngestKey } from './ingest-key-format.ts';
import type { Actor, LabContext } from './lab-context.ts';
import type { PlanLimitGuard } from './billing/plan-limits.ts';
import { CHANNEL_LABELS, LOGGER_LABELS, LOGGER_REASONS } from '../contract/words/loggers.ts';
import { createRollupLevelsService, raiseFloorsOnEdit } from './rollup-levels.service.ts';

export interface LoggerDetail extends Logger {
  channels: Channel[];
  keys: IngestKeyInfo[];
}

/** A key as shown once, right after it is made. */
export interface IssuedKey {
  key: string;
  info: IngestKeyInfo;
}

/**
 * Loggers, their channels and ingest keys: register, edit, retire (history kept), issue,
 * rotate and revoke keys. Every change is one transaction and leaves an audit event.
 */
export function createLoggersService(deps: { db: Db; now?: () => Date; planLimits?: PlanLimitGuard }) {
  const now = deps.now ?? (() => new Date());
  const rollupLevels = createRollupLevelsService({ db: deps.db });
  const duplicateName = (err: unknown): never => {
    if (isDuplicateKey(err)) {
      const msg = String((err as Error).message);
      if (msg.includes('channels_key_unique'))
        throw fieldConflict('channel_key_taken', 'key', CHANNEL_LABELS.key, 'this logger already has a channel with this key');
      throw fieldConflict('logger_name_taken', 'name', LOGGER_LABELS.name, 'this lab already has a logger with this name');
    }
    throw err;
  };

  async function requireLogger(scope: ReturnType<typeof inLab>, id: number, lock = false): Promise<Logger> {
    const logger = await loggersRepo(scope).find(id, { lock });
    if (!logger) throw new NotFoundError('No such logger in this lab.');
    return logger;
  }

  return {
    async list(lab: LabContext, opts: { includeRetired?: boolean } = {}): Promise<Array<Logger & { channelCount: number }>> {
      const scope = inLab(deps.db, lab.id);
      const loggers = await loggersRepo(scope).list(opts);
      const channels = await channelsRepo(scope).list();
      return loggers.map((l) => ({ ...l, channelCount: channels.filter((c) => c.loggerId === l.id).length }));
    },

    async detail(lab: LabContext, id: number): Promise<LoggerDetail> {
      const scope = inLab(deps.db, lab.id);
      const logger = await requireLogger(scope, id);
      const [channels, keys] = await Promise.all([channelsRepo(scope).listForLogger(id, { includeRetired: true }), ingestKeysRepo(scope).listForLogger(id)]);
      return { ...logger, channels, keys };
    },

    /**
     * Registers a logger with its channels and issues its first ingest key (shown once). The
     * lab's row is locked first, so concurrent registrations in one lab check the plan's logger
     * limit one after another and never pass it together.
     */
    async register(
      lab: LabContext,
      actor: Actor | null,
      input: LoggerInput & { channels: ChannelInput[] },
    ): Promise<{ logger: LoggerDetail; issued: IssuedKey }> {
      try {
        return await deps.db.transaction(async (trx) => {
          const scope = inLab(trx, lab.id);
          await labsRepo(trx).lock(lab.id);
          await deps.planLimits?.assertRoomFor(trx, lab.id, 'loggers');
          const id = await loggersRepo(scope).insert(input);
          for (const c of input.channels) await channelsRepo(scope).insert(id, c);
          const made = newIngestKey();
          const keyId = await ingestKeysRepo(scope).insert({ loggerId: id, prefix: made.prefix, keyHash: made.hash, createdBy: actor?.id ?? null });
          await auditRepo(scope).record({
            actorUserId: actor?.id ?? null,
            action: 'logger.registered',
            targetType: 'logger',
            targetId: id,
            summary: `${actor?.displayName ?? 'An operator'} registered the logger "${input.name}" with ${input.channels.length} channel(s)`,
            details: { channels: input.channels.map((c) => c.key), keyPrefix: made.prefix },
          });
          const logger = (await loggersRepo(scope).find(id))!;
          const channels = await channelsRepo(scope).listForLogger(id);
          const info = (await ingestKeysRepo(scope).find(keyId))!;
          return { logger: { ...logger, channels, keys: [info] }, issued: { key: made.key, info } };
        });
      } catch (err) {
        return duplicateName(err);
      }
    },

    /**
     * Edits a logger. A new reporting interval changes which rollup levels its channels keep:
     * levels no longer kept stop being read as the edit commits; newly kept ones are built from
     * the readings before they are read (see rollup-levels.service.ts).
     */
    async update(lab: LabContext, actor: Actor, id: number, patch: Partial<LoggerInput>): Promise<Logger> {
      let updated: Logger;
      try {
        updated = await deps.db.transaction(async (trx) => {
          const scope = inLab(trx, lab.id);
          const before = await requireLogger(scope, id, true);
          await loggersRepo(scope).update(id, patch);
          if (patch.expectedIntervalS !== undefined) await raiseFloorsOnEdit(scope, { loggerId: id });
          await auditRepo(scope).record({
            actorUserId: actor.id,
            action: 'logger.updated',
            targetType: 'logger',
            targetId: id,
            summary: `${actor.displayName} edited the logger "${before.name}"`,
            details: { ...patch },
          });
          return (await loggersRepo(scope).find(id))!;
        });
      } catch (err) {
        return duplicateName(err);
      }
      if (patch.expectedIntervalS !== undefined) await rollupLevels.settle(lab.id, { loggerId: id });
      return updated;
    },

    /** Retires a logger: its keys stop working, its readings stay. */
    async retire(lab: LabContext, actor: Actor, id: number): Promise<void> {
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const logger = await requireLogger(scope, id, true);
        if (logger.retiredAt) return;
        await loggersRepo(scope).retire(id, now());
        await ingestKeysRepo(scope).revokeAllForLogger(id, now());
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'logger.retired',
          targetType: 'logger',
          targetId: id,
          summary: `${actor.displayName} retired the logger "${logger.name}"`,
        });
      });
    },

    async addChannel(lab: LabContext, actor: Actor, loggerId: number, input: ChannelInput): Promise<Channel> {
      try {
        return await deps.db.transaction(async (trx) => {
          const scope = inLab(trx, lab.id);
          const logger = await requireLogger(scope, loggerId, true);
          const id = await channelsRepo(scope).insert(loggerId, input);
          await auditRepo(scope).record({
            actorUserId: actor.id,
            action: 'channel.added',
            targetType: 'channel',
            targetId: id,
            summary: `${actor.displayName} added the channel "${input.key}" to "${logger.name}"`,
          });
          return (await channelsRepo(scope).find(id))!;
        });
      } catch (err) {
        return duplicateName(err);
      }
    },

    /** Edits a channel; a new reporting interval changes its rollup levels as for a logger's (see `update`). */
    async updateChannel(lab: LabContext, actor: Actor, loggerId: number, channelId: number, patch: Partial<ChannelInput>): Promise<Channel> {
      let updated: Channel;
      try {
        updated = await deps.db.transaction(async (trx) => {
          const scope = inLab(trx, lab.id);
          await requireLogger(scope, loggerId, true);
          const channel = await channelsRepo(scope).find(channelId);
          if (!channel || channel.loggerId !== loggerId) throw new NotFoundError('No such channel on this logger.');
          const merged = { validMin: channel.validMin, validMax: channel.validMax, ...patch };
          if (
            merged.validMin !== null &&
            merged.validMax !== null &&
            merged.validMin !== undefined &&
            merged.validMax !== undefined &&
            merged.validMin >= merged.validMax
          ) {
            throw fieldConflict('invalid_range', 'validMax', CHANNEL_LABELS.validMax, LOGGER_REASONS.validRangeOrder);
          }
          await channelsRepo(scope).update(channelId, patch);
          if (patch.expectedIntervalS !== undefined) await raiseFloorsOnEdit(scope, { channelIds: [channelId] });
          await auditRepo(scope).record({
            actorUserId: actor.id,
            action: 'channel.updated',
            targetType: 'channel',
            targetId: channelId,
            summary: `${actor.displayName} edited the channel "${channel.key}"`,
            details: { ...patch },
          });
          return (await channelsRepo(scope).find(channelId))!;
        });
      } catch (err) {
        return duplicateName(err);
      }
      if (patch.expectedIntervalS !== undefined) await rollupLevels.settle(lab.id, { channelIds: [channelId] });
      return updated;
    },

    async retireChannel(lab: LabContext, actor: Actor, loggerId: number, channelId: number): Promise<void> {
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        await requireLogger(scope, loggerId, true);
        const channel = await channelsRepo(scope).find(channelId);
        if (!channel || channel.loggerId !== loggerId) throw new NotFoundError('No such channel on this logger.');
        if (channel.retiredAt) return;
        await channelsRepo(scope).retire(channelId, now());
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'channel.retired',
          targetType: 'channel',
          targetId: channelId,
          summary: `${actor.displayName} retired the channel "${channel.key}"`,
        });
      });
    },

    /** Issues a new key; with `rotate`, every other key of the logger stops working at once. */
    async issueKey(lab: LabContext, actor: Actor | null, loggerId: number, opts: { rotate: boolean }): Promise<IssuedKey> {
      return deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const logger = await requireLogger(scope, loggerId, true);
        if (logger.retiredAt) throw new ConflictError('logger_retired', 'This logger is retired; it cannot get new keys.');
        if (opts.rotate) await ingestKeysRepo(scope).revokeAllForLogger(loggerId, now());
        const made = newIngestKey();
        const keyId = await ingestKeysRepo(scope).insert({ loggerId, prefix: made.prefix, keyHash: made.hash, createdBy: actor?.id ?? null });
        await auditRepo(scope).record({
          actorUserId: actor?.id ?? null,
          action: opts.rotate ? 'ingest-key.rotated' : 'ingest-key.issued',
          targetType: 'logger',
          targetId: loggerId,
          summary: `${actor?.displayName ?? 'An operator'} ${opts.rotate ? 'rotated the keys of' : 'issued a key for'} "${logger.name}" (key ${made.prefix}…)`,
          details: { keyPrefix: made.prefix },
        });
        return { key: made.key, info: (await ingestKeysRepo(scope).find(keyId))! };
      });
    },

    async revokeKey(lab: LabContext, actor: Actor, loggerId: number, keyId: number): Promise<void> {
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const logger = await requireLogger(scope, loggerId, true);
        const key = await ingestKeysRepo(scope).find(keyId);
        if (!key || key.loggerId !== loggerId) throw new NotFoundError('No such key on this logger.');
        if (key.revokedAt) return;
        await ingestKeysRepo(scope).revoke(keyId, now());
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'ingest-key.revoked',
          targetType: 'logger',
          targetId: loggerId,
          summary: `${actor.displayName} revoked key ${key.prefix}… of "${logger.name}"`,
          details: { keyPrefix: key.prefix },
        });
      });
    },
  };
}

export type LoggersService = ReturnType<typeof createLoggersService>;
