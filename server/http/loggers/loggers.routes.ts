import { can } from '../../policies/permissions.ts';
import {
  channelInputSchema,
  channelParams,
  channelPatchSchema,
  createLoggerSchema,
  issueKeySchema,
  keyParams,
  loggerParams,
  loggerPatchSchema,
  loggersQuerySchema,
  testReadingParams,
  testReadingSchema,
  testReadingsRangeQuery,
  type ChannelAnswer,
  type ChannelTestReadingsAnswer,
  type IssuedKeyAnswer,
  type LoggerAnswer,
  type LoggersAnswer,
  type LoggerTestReadingsAnswer,
  type RegisteredLoggerAnswer,
  type TestReadingResult,
  type UpdatedLoggerAnswer,
} from '../../contract/loggers.ts';
import { presentChannel, presentIssuedKey, presentLogger, presentLoggerDetail, presentLoggerSummary } from '../presenters/loggers.presenter.ts';
import type { LoggersService } from '../../services/loggers.service.ts';
import type { TestReadingService } from '../../services/test-reading.service.ts';
import { channelParams as channelIdParams } from '../../contract/channels.ts';
import { presentTestReading } from './test-readings.presenter.ts';
import { defineRoute, type Route } from '../routes/route.ts';

const NAME_TAKEN = '`logger_name_taken`: the lab already has a logger with this name (message `name: …`).';
const KEY_TAKEN = '`channel_key_taken`: the logger already has a channel with this key (message `key: …`).';
const PLAN_LIMIT = "`plan_limit_reached`: the lab's plan allows no more loggers; nothing was saved (Retry-After 3600 s; a lab admin can raise the plan).";
const OUTSIDE_RANGE =
  "`outside_valid_range`: the value lies outside the channel's valid range; nothing was kept — send again with `confirmOutsideRange: true` to keep it as a test reading.";

/** Loggers, channels and ingest keys of a lab (read: every member; change: technicians and admins). */
export function loggerRoutes(deps: { loggers: LoggersService; testReadings: TestReadingService }): Route[] {
  const { loggers, testReadings } = deps;
  return [
    defineRoute({
      method: 'get',
      path: '/loggers',
      auth: { permission: 'loggers.read' },
      summary: 'List the loggers of the lab.',
      query: loggersQuerySchema,
      response: { status: 200, description: 'The loggers with their channel counts (retired ones with includeRetired=true).' },
      handle: async ({ lab, query }): Promise<LoggersAnswer> => ({
        loggers: (await loggers.list(lab, { includeRetired: query.includeRetired === 'true' })).map(presentLoggerSummary),
      }),
    }),
    defineRoute({
      method: 'post',
      path: '/loggers',
      auth: { permission: 'loggers.manage' },
      summary: 'Register a logger with its channels; its first ingest key is shown once.',
      body: createLoggerSchema,
      response: { status: 201, description: 'The logger with its channels, and its first ingest key (shown once).' },
      errors: { 402: PLAN_LIMIT, 409: `${NAME_TAKEN} \`channel_key_taken\`: two channels with one key.` },
      handle: async ({ lab, actor, body }): Promise<RegisteredLoggerAnswer> => {
        const { logger, issued } = await loggers.register(lab, actor, body);
        return { logger: presentLoggerDetail(logger, { includeKeys: true }), ...presentIssuedKey(issued) };
      },
    }),
    defineRoute({
      method: 'get',
      path: '/loggers/:loggerId',
      auth: { permission: 'loggers.read' },
      summary: 'A logger with its channels (and key metadata for those who manage keys).',
      params: loggerParams,
      response: { status: 200, description: 'The logger with its channels; `keys` only for roles that manage ingest keys.' },
      handle: async ({ lab, params }): Promise<LoggerAnswer> => ({
        logger: presentLoggerDetail(await loggers.detail(lab, params.loggerId), { includeKeys: can(lab.role, 'ingest-keys.manage') }),
      }),
    }),
    defineRoute({
      method: 'patch',
      path: '/loggers/:loggerId',
      auth: { permission: 'loggers.manage' },
      summary: "Edit a logger's name, site, serial, time zone or interval.",
      params: loggerParams,
      body: loggerPatchSchema,
      response: { status: 200, description: 'The logger as saved.' },
      errors: { 409: NAME_TAKEN },
      handle: async ({ lab, actor, params, body }): Promise<UpdatedLoggerAnswer> => ({
        logger: presentLogger(await loggers.update(lab, actor, params.loggerId, body)),
      }),
    }),
    defineRoute({
      method: 'post',
      path: '/loggers/:loggerId/retire',
      auth: { permission: 'loggers.manage' },
      summary: 'Retire a logger: its keys stop working, its readings stay.',
      params: loggerParams,
      response: { status: 204, description: 'Retired.' },
      handle: async ({ lab, actor, params }) => loggers.retire(lab, actor, params.loggerId),
    }),
    defineRoute({
      method: 'post',
      path: '/loggers/:loggerId/test-reading',
      auth: { permission: 'loggers.manage' },
      summary: "Check one reading of a channel now as a logger's reading would be checked, and keep it as a test reading (never among the channel's readings).",
      params: loggerParams,
      body: testReadingSchema,
      response: {
        status: 200,
        description:
          "What was sent, what a logger's reading would get (stored, or its quarantine reason), and the test reading kept (null when it would be quarantined).",
      },
      errors: { 409: `\`logger_retired\`: the logger is retired and accepts no new readings. ${OUTSIDE_RANGE}` },
      handle: async ({ lab, actor, params, body }): Promise<TestReadingResult> => {
        const result = await testReadings.send(lab, actor, params.loggerId, body);
        return {
          sent: { ...result.sent, ts: new Date(result.sent.ts).toISOString() },
          wouldGet: result.wouldGet,
          testReading: result.testReading && presentTestReading(result.testReading, actor.id, testReadings.now()),
          timezone: result.timezone,
        };
      },
    }),
    defineRoute({
      method: 'get',
      path: '/loggers/:loggerId/test-readings',
      auth: { permission: 'loggers.read' },
      summary: "The logger's 10 latest test readings, newest first.",
      params: loggerParams,
      response: {
        status: 200,
        description: 'The test readings (`source: test`) with how long the asking member may still remove each, and the logger’s time zone.',
      },
      handle: async ({ lab, callerId, params }): Promise<LoggerTestReadingsAnswer> => {
        const { testReadings: rows, timezone } = await testReadings.recentForLogger(lab, params.loggerId);
        const at = testReadings.now();
        return { testReadings: rows.map((r) => presentTestReading(r, callerId, at)), timezone };
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/loggers/:loggerId/test-readings/:testReadingId',
      auth: { permission: 'loggers.manage' },
      summary: 'Remove a test reading: only its sender, only within 10 minutes of sending.',
      params: testReadingParams,
      response: { status: 204, description: 'Removed (audit-logged).' },
      errors: {
        403: 'The role does not allow this (`forbidden`), or someone other than the sender asked (`forbidden`, the message names the sender).',
        409: '`removal_window_closed`: more than 10 minutes have passed since it was sent; it stays, marked as a test.',
      },
      handle: async ({ lab, actor, params }) => testReadings.remove(lab, actor, params.loggerId, params.testReadingId),
    }),
    defineRoute({
      method: 'get',
      path: '/channels/:channelId/test-readings',
      auth: { permission: 'channels.read' },
      summary: "A channel's test readings in a time range (default: the 7 days up to now), to draw apart from its readings.",
      params: channelIdParams,
      query: testReadingsRangeQuery(testReadings.now),
      response: { status: 200, description: 'The test readings with from <= ts < to, oldest first (at most 1,000).' },
      handle: async ({ lab, callerId, params, query }): Promise<ChannelTestReadingsAnswer> => {
        const rows = await testReadings.inRange(lab, params.channelId, query);
        const at = testReadings.now();
        return { channelId: params.channelId, from: query.from, to: query.to, testReadings: rows.map((r) => presentTestReading(r, callerId, at)) };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/loggers/:loggerId/channels',
      auth: { permission: 'loggers.manage' },
      summary: 'Add a channel to a logger.',
      params: loggerParams,
      body: channelInputSchema,
      response: { status: 201, description: 'The new channel.' },
      errors: { 409: KEY_TAKEN },
      handle: async ({ lab, actor, params, body }): Promise<ChannelAnswer> => ({
        channel: presentChannel(await loggers.addChannel(lab, actor, params.loggerId, body)),
      }),
    }),
    defineRoute({
      method: 'patch',
      path: '/loggers/:loggerId/channels/:channelId',
      auth: { permission: 'loggers.manage' },
      summary: 'Edit a channel.',
      params: channelParams,
      body: channelPatchSchema,
      response: { status: 200, description: 'The channel as saved.' },
      errors: { 409: `${KEY_TAKEN} \`invalid_range\`: the saved validMin and the new validMax (or the other way round) are not in order.` },
      handle: async ({ lab, actor, params, body }): Promise<ChannelAnswer> => ({
        channel: presentChannel(await loggers.updateChannel(lab, actor, params.loggerId, params.channelId, body)),
      }),
    }),
    defineRoute({
      method: 'post',
      path: '/loggers/:loggerId/channels/:channelId/retire',
      auth: { permission: 'loggers.manage' },
      summary: 'Retire a channel (its readings stay).',
      params: channelParams,
      response: { status: 204, description: 'Retired.' },
      handle: async ({ lab, actor, params }) => loggers.retireChannel(lab, actor, params.loggerId, params.channelId),
    }),
    defineRoute({
      method: 'post',
      path: '/loggers/:loggerId/keys',
      auth: { permission: 'ingest-keys.manage' },
      summary: 'Issue an ingest key (shown once); with rotate, every other key stops working.',
      params: loggerParams,
      body: issueKeySchema,
      response: { status: 201, description: 'The new key (shown once) with its metadata.' },
      errors: { 409: '`logger_retired`: a retired logger gets no new keys.' },
      handle: async ({ lab, actor, params, body }): Promise<IssuedKeyAnswer> =>
        presentIssuedKey(await loggers.issueKey(lab, actor, params.loggerId, { rotate: body.rotate })),
    }),
    defineRoute({
      method: 'delete',
      path: '/loggers/:loggerId/keys/:keyId',
      auth: { permission: 'ingest-keys.manage' },
      summary: 'Revoke an ingest key.',
      params: keyParams,
      response: { status: 204, description: 'Revoked; the key stops working at once.' },
      handle: async ({ lab, actor, params }) => loggers.revokeKey(lab, actor, params.loggerId, params.keyId),
    }),
  ];
}
