import { TEST_READING_REMOVABLE_MS, type TestReading } from '../../contract/loggers.ts';
import type { StoredTestReading } from '../../db/test-readings.repo.ts';

/**
 * A stored test reading as the API shows it (`source: 'test'`), with how long the asking member
 * (`viewerId`) may still remove it at `nowMs` on the service clock: 0 unless they sent it.
 */
export function presentTestReading(r: StoredTestReading, viewerId: number, nowMs: number): TestReading {
  const until = r.sentAt + TEST_READING_REMOVABLE_MS;
  return {
    id: r.id,
    source: 'test',
    loggerId: r.loggerId,
    channelId: r.channelId,
    channel: r.channelKey,
    ts: r.ts,
    time: new Date(r.ts).toISOString(),
    value: r.value,
    outsideRange: r.outsideRange,
    sentBy: r.sentBy,
    sentAt: new Date(r.sentAt).toISOString(),
    removableUntil: new Date(until).toISOString(),
    removableByYouForMs: r.sentBy?.id === viewerId ? Math.max(0, until - nowMs) : 0,
  };
}
