import type { Logger } from '../../db/loggers.repo.ts';
import type { Channel } from '../../db/channels.repo.ts';
import type { IngestKeyInfo } from '../../db/ingest-keys.repo.ts';
import type { QuarantinedRow } from '../../db/quarantine.repo.ts';
import type { LoggerDetail, IssuedKey } from '../../services/loggers.service.ts';
import { isoTime } from './iso-time.ts';

export function presentLogger(l: Logger & { channelCount?: number }) {
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
    ...(l.channelCount !== undefined ? { channelCount: l.channelCount } : {}),
  };
}

export function presentChannel(c: Channel) {
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
export function presentKeyInfo(k: IngestKeyInfo) {
  return { id: k.id, prefix: k.prefix, createdAt: isoTime(k.createdAt), lastUsedAt: isoTime(k.lastUsedAt), revokedAt: isoTime(k.revokedAt) };
}

export function presentLoggerDetail(d: LoggerDetail, opts: { includeKeys: boolean }) {
  return {
    ...presentLogger(d),
    channels: d.channels.map(presentChannel),
    ...(opts.includeKeys ? { keys: d.keys.map(presentKeyInfo) } : {}),
  };
}

/** The one response that carries a whole key, with the reminder that it is shown once. */
export function presentIssuedKey(k: IssuedKey) {
  return { ingestKey: { ...presentKeyInfo(k.info), key: k.key, shownOnce: true as const } };
}

export function presentQuarantinedRow(r: QuarantinedRow) {
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
