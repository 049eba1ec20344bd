import { z } from 'zod';
import { idParams, pathId, type IsoTime } from './common.ts';
import type { IngestAnswer } from './ingest.ts';
import { timeZoneSchema } from './me.ts';

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
  .regex(/^[A-Za-z0-9][A-Za-z0-9_.-]{0,63}$/, 'use 1–64 letters, digits, "_", "." or "-", starting with a letter or digit');

const intervalSchema = z.number().int('must be a whole number of seconds').min(1, 'must be at least 1 second').max(604800, 'must be at most 7 days');

const channelFields = {
  key: channelKeySchema,
  label: z.string().trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters'),
  unit: z.string().trim().max(32, 'must be at most 32 characters').optional(),
  quantity: z.string().trim().max(64, 'must be at most 64 characters').optional(),
  validMin: z.number().finite().nullable().optional(),
  validMax: z.number().finite().nullable().optional(),
  expectedIntervalS: intervalSchema.nullable().optional(),
  seasonalPeriodHint: z.number().int('must be a whole number').min(2, 'must be at least 2').max(100000, 'must be at most 100000').nullable().optional(),
};

const rangeIsOrdered = (c: { validMin?: number | null; validMax?: number | null }) =>
  c.validMin === undefined || c.validMin === null || c.validMax === undefined || c.validMax === null || c.validMin < c.validMax;
const rangeMessage = { message: 'validMin must be below validMax', path: ['validMax'] };

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
  .object({ ...loggerFields, channels: z.array(channelInputSchema).max(64, 'at most 64 channels per logger').default([]) })
  .refine((l) => new Set(l.channels.map((c) => c.key)).size === l.channels.length, {
    message: 'channel keys must be unique within a logger',
    path: ['channels'],
  });
export type CreateLoggerBody = z.infer<typeof createLoggerSchema>;

/** `PATCH …/loggers/:loggerId`. */
export const loggerPatchSchema = z.object(loggerFields).partial();
export type LoggerPatch = z.output<typeof loggerPatchSchema>;

/** One reading sent by hand from a logger's page, stored "now" through the ingestion path. */
export const testReadingSchema = z.object({
  channel: channelKeySchema.describe("the channel's key on this logger"),
  value: z.number({ error: 'must be a number' }).finite('must be a finite number'),
});
export type TestReadingBody = z.infer<typeof testReadingSchema>;

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

/** `POST …/loggers/:loggerId/test-reading`: what was sent, what ingestion did, what the database now holds. */
export interface TestReadingResult {
  sent: { channel: string; ts: IsoTime; value: number };
  outcome: IngestAnswer;
  /** The value read back for that channel and time; null when nothing was stored. */
  storedValue: number | null;
  /** Wall time from handing the row to ingestion until it was read back, in milliseconds. */
  roundTripMs: number;
}
