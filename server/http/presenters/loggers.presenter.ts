import type { Logger } from '../../db/loggers.repo.ts';
import type { Channel } from '../../db/channels.repo.ts';
import type { IngestKeyInfo } from '../../db/ingest-keys.repo.ts';
import type { QuarantinedRow } from '../../db/quarantine.repo.ts';
import type { LoggerDetail, IssuedKey } from '../../services/loggers.service.ts';
import type {
  Channel as ChannelAnswer,
  IngestKeyInfo as KeyInfoAnswer,
  IssuedKeyAnswer,
  LoggerDetail as LoggerDetailAnswer,
  LoggerInfo,
  LoggerSummary,
} from '../../contract/loggers.ts';
import {
  encodeQuarantineCursor,
  type QuarantinedRow as QuarantinedRowAnswer,
  type QuarantinePage,
  type ResubmitOutcome,
  type ResubmitRow,
} from '../../contract/quarantine.ts';
import type { IngestAnswer } from '../../contract/ingest.ts';
import type { QuarantineService } from '../../services/quarantine.service.ts';
import { isoTime } from './iso-time.ts';

/** A logger as the API shows it (times as ISO 8601). */
export function presentLogger(l: Logger): LoggerInfo {
  return {
    id: l.id,
    name: l.name,
    serial: l.serial,
    site: l.site,
    timezone: l.timezone,
    expectedIntervalS: l.expectedIntervalS,
    createdAt: isoTime(l.createdAt),
    retiredAt: isoTime(l.retiredAt),
    lastSeenAt: l.lastSeenAt === null ? null : new Date(l.lastSeenAt).toISOString(),
  };
}

/** A logger of the lab's list, with its number of channels. */
export function presentLoggerSummary(l: Logger & { channelCount: number }): LoggerSummary {
  return { ...presentLogger(l), channelCount: l.channelCount };
}

/** A channel as the API shows it. */
export function presentChannel(c: Channel): ChannelAnswer {
  return {
    id: c.id,
    loggerId: c.loggerId,
    key: c.key,
    label: c.label,
    unit: c.unit,
    quantity: c.quantity,
    validMin: c.validMin,
    validMax: c.validMax,
    expectedIntervalS: c.expectedIntervalS,
    seasonalPeriodHint: c.seasonalPeriodHint,
    retiredAt: isoTime(c.retiredAt),
  };
}

/** Key metadata only: the key itself is never shown again after it is issued. */
export function presentKeyInfo(k: IngestKeyInfo): KeyInfoAnswer {
  return { id: k.id, prefix: k.prefix, createdAt: isoTime(k.createdAt), lastUsedAt: isoTime(k.lastUsedAt), revokedAt: isoTime(k.revokedAt) };
}

/** A logger with its channels, and its keys' metadata for those who manage keys. */
export function presentLoggerDetail(d: LoggerDetail, opts: { includeKeys: boolean }): LoggerDetailAnswer {
  return {
    ...presentLogger(d),
    channels: d.channels.map(presentChannel),
    ...(opts.includeKeys ? { keys: d.keys.map(presentKeyInfo) } : {}),
  };
}

/** The one response that carries a whole key, with the reminder that it is shown once. */
export function presentIssuedKey(k: IssuedKey): IssuedKeyAnswer {
  return { ingestKey: { ...presentKeyInfo(k.info), key: k.key, shownOnce: true as const } };
}

/** A quarantined row with the fields as they arrived. */
export function presentQuarantinedRow(r: QuarantinedRow): QuarantinedRowAnswer {
  return {
    id: r.id,
    loggerId: r.loggerId,
    source: r.source,
    rowIndex: r.rowIndex,
    reasonCode: r.reasonCode,
    reason: r.reason,
    channel: r.channelKey,
    ts: r.tsRaw,
    value: r.valueRaw,
    raw: r.raw,
    receivedAt: isoTime(r.receivedAt),
  };
}

/** One keyset page of quarantined rows, with the cursor of the next page (null on the last). */
export function presentQuarantinePage(page: Awaited<ReturnType<QuarantineService['list']>>, pageSize: number): QuarantinePage {
  return {
    rows: page.rows.map(presentQuarantinedRow),
    total: page.total,
    totalAtLeast: page.totalAtLeast,
    pageSize,
    nextCursor: page.nextCursor ? encodeQuarantineCursor(page.nextCursor) : null,
  };
}

/** What a batch of readings did: stored, already there, and the rows sent to quarantine with their reasons. */
export function presentIngestOutcome(outcome: IngestAnswer): IngestAnswer {
  return {
    accepted: outcome.accepted,
    duplicates: outcome.duplicates,
    quarantined: outcome.quarantined.map((q) => ({ index: q.index, code: q.code, reason: q.reason })),
  };
}

/** A re-submit's outcome; the rows that failed again are named by the id they had in quarantine. */
export function presentResubmitOutcome(outcome: IngestAnswer & { resubmitted: number }, rows: ResubmitRow[]): ResubmitOutcome {
  return {
    resubmitted: outcome.resubmitted,
    accepted: outcome.accepted,
    duplicates: outcome.duplicates,
    quarantined: outcome.quarantined.map((q) => ({ id: rows[q.index].id, code: q.code, reason: q.reason })),
  };
}
