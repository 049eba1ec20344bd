import { z } from 'zod';
import { idParams, pathId, type IsoTime } from './common.ts';
import { rangeFields, resolveRange } from './channels.ts';
import { timeZoneSchema } from './me.ts';
import { LOGGER_REASONS } from './words/loggers.ts';
import { atLeast, atMost, REASONS } from './words/reasons.ts';

/**
 * Loggers, their channels and ingest keys, and the test reading: the input schemas (shared with
 * the client's forms), the answers of every route, and the answer types the client reads.
 */

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `must be at most ${max} characters`)
    .transform((s) => (s === '' ? null : s))
    .nullable()
    .optional();

export const channelKeySchema = z
  .string()
  .trim()
  .regex(/^[A-Za-z0-9][A-Za-z0-9_.-]{0,63}$/, LOGGER_REASONS.channelKey);

const intervalSchema = z.number().int(LOGGER_REASONS.intervalWhole).min(1, LOGGER_REASONS.intervalMin).max(604800, LOGGER_REASONS.intervalMax);

const channelFields = {
  key: channelKeySchema,
  label: z.string().trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters'),
  unit: z.string().trim().max(32, 'must be at most 32 characters').optional(),
  quantity: z.string().trim().max(64, 'must be at most 64 characters').optional(),
  validMin: z.number().finite().nullable().optional(),
  validMax: z.number().finite().nullable().optional(),
  expectedIntervalS: intervalSchema.nullable().optional(),
  seasonalPeriodHint: z.number().int('must be a whole number').min(2, atLeast(2)).max(100000, atMost(100000)).nullable().optional(),
};

const rangeIsOrdered = (c: { validMin?: number | null; validMax?: number | null }) =>
  c.validMin === undefined || c.validMin === null || c.validMax === undefined || c.validMax === null || c.validMin < c.validMax;
const rangeMessage = { message: LOGGER_REASONS.validRangeOrder, path: ['validMax'] };

/** `POST …/loggers/:loggerId/channels`, and each channel of a new logger. */
export const channelInputSchema = z.object(channelFields).refine(rangeIsOrdered, rangeMessage);
export type ChannelInputBody = z.infer<typeof channelInputSchema>;

/** `PATCH …/loggers/:loggerId/channels/:channelId`. */
export const channelPatchSchema = z.object(channelFields).partial().refine(rangeIsOrdered, rangeMessage);
export type ChannelPatch = z.output<typeof channelPatchSchema>;

const loggerFields = {
  name: z.string().trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters'),
  serial: optionalText(120),
  site: optionalText(120),
  timezone: timeZoneSchema,
  expectedIntervalS: intervalSchema,
};

/** `POST …/loggers` (and the operator command `register-logger`). */
export const createLoggerSchema = z
  .object({ ...loggerFields, channels: z.array(channelInputSchema).max(64, LOGGER_REASONS.channelsMax).default([]) })
  .refine((l) => new Set(l.channels.map((c) => c.key)).size === l.channels.length, {
    message: LOGGER_REASONS.channelKeysUnique,
    path: ['channels'],
  });
export type CreateLoggerBody = z.infer<typeof createLoggerSchema>;

/** `PATCH …/loggers/:loggerId`. */
export const loggerPatchSchema = z.object(loggerFields).partial();
export type LoggerPatch = z.output<typeof loggerPatchSchema>;

/** Largest magnitude a test reading may have: beyond it the value is a typing slip, not a measurement. */
export const TEST_READING_MAX_ABS = 1e12;
/** How long the sender may remove a test reading after sending it (10 minutes, on the service clock). */
export const TEST_READING_REMOVABLE_MS = 10 * 60_000;

/**
 * One reading sent by hand from a logger's page: checked as a logger's reading would be, then kept
 * as a test reading (never in the channel's readings). A value outside the channel's valid range
 * is stored only with `confirmOutsideRange: true`.
 */
export const testReadingSchema = z.object({
  channel: channelKeySchema.describe("the channel's key on this logger"),
  value: z
    .number({ error: 'must be a number' })
    .finite(REASONS.finite)
    .min(-TEST_READING_MAX_ABS, LOGGER_REASONS.testValueRange)
    .max(TEST_READING_MAX_ABS, LOGGER_REASONS.testValueRange),
  confirmOutsideRange: z.boolean({ error: 'must be true or false' }).default(false).describe("true stores a value outside the channel's valid range"),
});
export type TestReadingBody = z.input<typeof testReadingSchema>;

/** `/loggers/:loggerId/test-readings/:testReadingId`. */
export const testReadingParams = z.object({ loggerId: pathId(), testReadingId: pathId() });

/** `GET …/channels/:channelId/test-readings?from&to`: the range (default: the 7 days up to now), as the series route reads it. */
export const testReadingsRangeQuery = (now: () => number = Date.now) => z.object(rangeFields).transform((q, ctx) => resolveRange(q, ctx, now));

/** `/loggers/:loggerId…`. */
export const loggerParams = idParams('loggerId');
/** `/loggers/:loggerId/channels/:channelId…`. */
export const channelParams = z.object({ loggerId: pathId(), channelId: pathId() });
/** `/loggers/:loggerId/keys/:keyId`. */
export const keyParams = z.object({ loggerId: pathId(), keyId: pathId() });

/** `GET …/loggers[?includeRetired=true]`. */
export const loggersQuerySchema = z.object({ includeRetired: z.enum(['true', 'false']).optional() });

/** `POST …/loggers/:loggerId/keys`: with `rotate`, every other key of the logger stops working (no body: no rotation). */
export const issueKeySchema = z.object({ rotate: z.boolean().default(false) }).prefault({});

/** A logger as the API shows it. Instants are ISO 8601 strings; `null` means never / not retired. */
export interface LoggerInfo {
  id: number;
  name: string;
  serial: string | null;
  site: string | null;
  timezone: string;
  expectedIntervalS: number;
  createdAt: IsoTime;
  retiredAt: IsoTime | null;
  lastSeenAt: IsoTime | null;
}

/** A logger as the lab's list shows it, with its number of channels. */
export interface LoggerSummary extends LoggerInfo {
  channelCount: number;
}

export interface Channel {
  id: number;
  loggerId: number;
  key: string;
  label: string;
  unit: string | null;
  quantity: string | null;
  validMin: number | null;
  validMax: number | null;
  expectedIntervalS: number | null;
  seasonalPeriodHint: number | null;
  retiredAt: IsoTime | null;
}

/** Metadata of an ingest key; the key itself is never sent again after it was issued. */
export interface IngestKeyInfo {
  id: number;
  prefix: string;
  createdAt: IsoTime;
  lastUsedAt: IsoTime | null;
  revokedAt: IsoTime | null;
}

/** A freshly issued ingest key: the one answer that carries the whole key. */
export interface IssuedKey extends IngestKeyInfo {
  key: string;
  shownOnce: true;
}

/** One logger with its channels, and its keys for roles that manage keys. */
export interface LoggerDetail extends LoggerInfo {
  channels: Channel[];
  keys?: IngestKeyInfo[];
}

/** `GET …/loggers`. */
export interface LoggersAnswer {
  loggers: LoggerSummary[];
}

/** `GET …/loggers/:loggerId`. */
export interface LoggerAnswer {
  logger: LoggerDetail;
}

/** `POST …/loggers` (201): the logger and its first ingest key, shown once. */
export interface RegisteredLoggerAnswer {
  logger: LoggerDetail;
  ingestKey: IssuedKey;
}

/** `PATCH …/loggers/:loggerId`. */
export interface UpdatedLoggerAnswer {
  logger: LoggerInfo;
}

/** `POST …/loggers/:loggerId/channels` (201) and `PATCH …/channels/:channelId`. */
export interface ChannelAnswer {
  channel: Channel;
}

/** `POST …/loggers/:loggerId/keys` (201). */
export interface IssuedKeyAnswer {
  ingestKey: IssuedKey;
}

/** A test reading as the API shows it: never one of the channel's readings (`source` is always `test`). */
export interface TestReading {
  id: number;
  source: 'test';
  loggerId: number;
  channelId: number;
  /** The channel's key on the logger. */
  channel: string;
  /** The reading's time (epoch ms) and the same instant in ISO 8601 UTC. */
  ts: number;
  time: IsoTime;
  value: number;
  /** True when the value lay outside the channel's valid range and the sender confirmed it. */
  outsideRange: boolean;
  /** Who sent it (null once the account is gone). */
  sentBy: { id: number; name: string } | null;
  sentAt: IsoTime;
  /** Until when its sender may remove it. */
  removableUntil: IsoTime;
  /** Milliseconds the asking member has left to remove it: 0 when it is not theirs or the time is up. */
  removableByYouForMs: number;
}

/** What a logger's reading with the same channel, time and value would get from ingestion. */
export type TestReadingVerdict = { outcome: 'stored' } | { outcome: 'quarantined'; code: string; reason: string };

/** `POST …/loggers/:loggerId/test-reading`: what was sent, what a logger's reading would get, and the test reading kept (if any). */
export interface TestReadingResult {
  sent: { channel: string; ts: IsoTime; value: number };
  /** Ingestion's own checks on the row; a quarantined verdict means nothing was kept. */
  wouldGet: TestReadingVerdict;
  /** The test reading as kept, or null when a logger's reading would have been quarantined. */
  testReading: TestReading | null;
  /** The logger's time zone, to show the time on the logger's clock. */
  timezone: string;
}

/** `GET …/loggers/:loggerId/test-readings`: the logger's latest test readings, newest first. */
export interface LoggerTestReadingsAnswer {
  testReadings: TestReading[];
  timezone: string;
}

/** `GET …/channels/:channelId/test-readings?from&to`: the channel's test readings in the range, oldest first. */
export interface ChannelTestReadingsAnswer {
  channelId: number;
  from: number;
  to: number;
  testReadings: TestReading[];
}
