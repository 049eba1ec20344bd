import type { Db } from '../db/create-db.ts';
import { inLab } from '../db/tenant-scope.ts';
import { loggersRepo } from '../db/loggers.repo.ts';
import { channelsRepo, type Channel } from '../db/channels.repo.ts';
import { testReadingsRepo, type StoredTestReading } from '../db/test-readings.repo.ts';
import { auditRepo } from '../db/audit.repo.ts';
import { ForbiddenError, NotFoundError } from '../errors.ts';
import { ConflictError, fieldConflict } from './service-errors.ts';
import { checkRows } from './ingest/check-rows.ts';
import { TEST_READING_REMOVABLE_MS, type TestReadingVerdict } from '../contract/loggers.ts';
import type { TimeRange } from '../contract/channels.ts';
import type { Actor, LabContext } from './lab-context.ts';
import { TEST_READING_LABELS } from '../contract/words/loggers.ts';

/** How many test readings the logger page lists. */
export const RECENT_TEST_READINGS = 10;
/** The most test readings one channel range answers (a chart needs no more). */
export const MAX_TEST_READINGS_IN_RANGE = 1000;

/** What sending a test reading did: what was sent, what a logger's reading would get, and what was kept. */
export interface SentTestReading {
  sent: { channel: string; ts: number; value: number };
  wouldGet: TestReadingVerdict;
  testReading: StoredTestReading | null;
  timezone: string;
}

const fmt = (v: number, unit: string) => `${v}${unit ? ` ${unit}` : ''}`;

/**
 * Why `value` lies outside the channel's valid range, in words (`null` when it lies inside, or the
 * channel has no range). The bounds themselves are valid, as ingestion's range status counts them.
 */
export function outsideRangeReason(value: number, channel: Pick<Channel, 'validMin' | 'validMax' | 'unit'>): string | null {
  const { validMin: min, validMax: max } = channel;
  const below = min !== null && value < min;
  const above = max !== null && value > max;
  if (!below && !above) return null;
  const unit = channel.unit ?? '';
  if (min !== null && max !== null) return `${fmt(value, unit)} is outside the valid range ${min}…${fmt(max, unit)}`;
  return below ? `${fmt(value, unit)} is below the valid minimum ${fmt(min!, unit)}` : `${fmt(value, unit)} is above the valid maximum ${fmt(max!, unit)}`;
}

/**
 * "Send a test reading" from a logger's page. The row is checked by ingestion's own pure checks
 * (`checkRows`), so the sender learns what a logger's reading with that channel and value would
 * get (stored, or the quarantine reason), but nothing goes into `readings` or `quarantined_rows`:
 * a reading that would be stored is kept in `test_readings` instead, where rollups, diagnostics,
 * usage and alerts never look. Its sender may remove it for 10 minutes (service clock).
 */
export function createTestReadingService(deps: { db: Db; now?: () => number }) {
  const now = deps.now ?? Date.now;

  async function activeLogger(labId: number, loggerId: number) {
    const logger = await loggersRepo(inLab(deps.db, labId)).find(loggerId);
    if (!logger) throw new NotFoundError('No such logger in this lab.');
    return logger;
  }

  return {
    /**
     * Checks `value` for `channel` of the logger at "now" as a logger's reading, keeps it as a test
     * reading when it would be stored (a value outside the valid range only with
     * `confirmOutsideRange`), and audit-logs the attempt.
     */
    async send(
      lab: LabContext,
      actor: Actor,
      loggerId: number,
      input: { channel: string; value: number; confirmOutsideRange: boolean },
    ): Promise<SentTestReading> {
      const scope = inLab(deps.db, lab.id);
      const logger = await activeLogger(lab.id, loggerId);
      if (logger.retiredAt) throw new ConflictError('logger_retired', 'This logger is retired: it accepts no new readings.');
      const channels = new Map((await channelsRepo(scope).listForLogger(loggerId, { includeRetired: true })).map((c) => [c.key, c]));

      const ts = now();
      const row = { index: 0, channel: input.channel, ts, value: input.value };
      const checked = await checkRows([row], channels, { now: ts });
      const refused = checked.rejected[0];
      const sent = { channel: input.channel, ts, value: input.value };
      const audit = auditRepo(scope);
      if (refused) {
        await audit.record({
          actorUserId: actor.id,
          action: 'logger.test-reading',
          targetType: 'logger',
          targetId: loggerId,
          summary: `${actor.displayName} sent a test reading of "${input.channel}" to "${logger.name}"; a logger's reading would be quarantined (${refused.code}), so nothing was kept`,
          details: { channel: input.channel, ts, value: input.value, wouldGet: refused.code },
        });
        return { sent, wouldGet: { outcome: 'quarantined', code: refused.code, reason: refused.reason }, testReading: null, timezone: logger.timezone };
      }

      const channel = channels.get(input.channel.trim())!;
      const outside = outsideRangeReason(input.value, channel);
      if (outside && !input.confirmOutsideRange) {
        throw fieldConflict(
          'outside_valid_range',
          'value',
          TEST_READING_LABELS.value,
          `${outside}; send again with confirmation to store it as a test reading`,
        );
      }
      const testReading = await testReadingsRepo(scope).insert({
        loggerId,
        channelId: channel.id,
        ts,
        value: input.value,
        outsideRange: outside !== null,
        sentBy: actor.id,
        sentAt: ts,
      });
      await audit.record({
        actorUserId: actor.id,
        action: 'logger.test-reading',
        targetType: 'logger',
        targetId: loggerId,
        summary: `${actor.displayName} sent a test reading of "${channel.key}" to "${logger.name}"${outside ? ` (confirmed: ${outside})` : ''}`,
        details: { channel: channel.key, ts, value: input.value, wouldGet: 'stored', testReadingId: testReading.id, outsideRange: outside !== null },
      });
      return { sent, wouldGet: { outcome: 'stored' }, testReading, timezone: logger.timezone };
    },

    /** The logger's latest test readings (newest first) and its time zone. */
    async recentForLogger(lab: LabContext, loggerId: number): Promise<{ testReadings: StoredTestReading[]; timezone: string }> {
      const logger = await activeLogger(lab.id, loggerId);
      return { testReadings: await testReadingsRepo(inLab(deps.db, lab.id)).recentForLogger(loggerId, RECENT_TEST_READINGS), timezone: logger.timezone };
    },

    /** A channel's test readings in `range` (oldest first, at most 1,000), for drawing on its chart. */
    async inRange(lab: LabContext, channelId: number, range: TimeRange): Promise<StoredTestReading[]> {
      const scope = inLab(deps.db, lab.id);
      if (!(await channelsRepo(scope).find(channelId))) throw new NotFoundError('No such channel in this lab.');
      return testReadingsRepo(scope).inRange(channelId, range, MAX_TEST_READINGS_IN_RANGE);
    },

    /**
     * Removes a test reading: only within 10 minutes of sending (service clock), and only by the
     * person who sent it. Audit-logged.
     */
    async remove(lab: LabContext, actor: Actor, loggerId: number, id: number): Promise<void> {
      const scope = inLab(deps.db, lab.id);
      const logger = await activeLogger(lab.id, loggerId);
      const repo = testReadingsRepo(scope);
      const reading = await repo.find(loggerId, id);
      if (!reading) throw new NotFoundError('No such test reading of this logger.');
      const age = now() - reading.sentAt;
      if (age >= TEST_READING_REMOVABLE_MS) {
        throw new ConflictError(
          'removal_window_closed',
          `A test reading can be removed only within 10 minutes of sending; this one was sent ${Math.floor(age / 60_000)} minutes ago and stays, marked as a test.`,
        );
      }
      if (reading.sentBy?.id !== actor.id) {
        throw new ForbiddenError(
          `Only the person who sent a test reading may remove it${reading.sentBy ? ` (this one was sent by ${reading.sentBy.name})` : ''}.`,
        );
      }
      await repo.remove(loggerId, id);
      await auditRepo(scope).record({
        actorUserId: actor.id,
        action: 'logger.test-reading-removed',
        targetType: 'logger',
        targetId: loggerId,
        summary: `${actor.displayName} removed their test reading of "${reading.channelKey}" on "${logger.name}" (${reading.value} at ${new Date(reading.ts).toISOString()})`,
        details: { testReadingId: id, channel: reading.channelKey, ts: reading.ts, value: reading.value },
      });
    },

    /** The service clock (epoch ms), for presenting how long a test reading stays removable. */
    now,
  };
}

export type TestReadingService = ReturnType<typeof createTestReadingService>;
