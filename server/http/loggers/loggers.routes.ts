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
  testReadingSchema,
  type ChannelAnswer,
  type IssuedKeyAnswer,
  type LoggerAnswer,
  type LoggersAnswer,
  type RegisteredLoggerAnswer,
  type TestReadingResult,
  type UpdatedLoggerAnswer,
} from '../../contract/loggers.ts';
import { presentChannel, presentIssuedKey, presentLogger, presentLoggerDetail, presentLoggerSummary } from '../presenters/loggers.presenter.ts';
import type { LoggersService } from '../../services/loggers.service.ts';
import type { TestReadingService } from '../../services/test-reading.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';

const NAME_TAKEN = '`logger_name_taken`: the lab already has a logger with this name (message `name: …`).';
const KEY_TAKEN = '`channel_key_taken`: the logger already has a channel with this key (message `key: …`).';
const PLAN_LIMIT = "`plan_limit_reached`: the lab's plan allows no more loggers; nothing was saved (Retry-After 3600 s; a lab admin can raise the plan).";
const READINGS_LIMIT =
  "`plan_limit_reached`: the reading would take the lab past its plan's stored readings or quarantined rows; nothing was saved (Retry-After 3600 s).";

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
      summary: 'Store one reading of a channel now, through the ingestion path, and read it back.',
      params: loggerParams,
      body: testReadingSchema,
      response: { status: 200, description: 'What was sent, what ingestion did with it, and the value read back.' },
      errors: { 402: READINGS_LIMIT, 409: '`logger_retired`: the logger is retired and accepts no new readings.' },
      handle: async ({ lab, actor, params, body }): Promise<TestReadingResult> => testReadings.send(lab, actor, params.loggerId, body),
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
