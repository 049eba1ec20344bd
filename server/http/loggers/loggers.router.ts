import { z } from 'zod';
import { actorOf, labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { can } from '../../policies/permissions.ts';
import { channelInputSchema, channelPatchSchema, createLoggerSchema, loggerPatchSchema, testReadingSchema } from './loggers.schema.ts';
import { presentChannel, presentIssuedKey, presentLogger, presentLoggerDetail } from '../presenters/loggers.presenter.ts';
import type { LoggersService } from '../../services/loggers.service.ts';
import type { TestReadingService } from '../../services/test-reading.service.ts';
import type { LabRoute } from '../lab-routes.ts';

const id = () => z.coerce.number().int('must be a whole number').positive('must be a positive number');
const loggerParam = z.object({ loggerId: id() });
const channelParam = z.object({ loggerId: id(), channelId: id() });
const keyParam = z.object({ loggerId: id(), keyId: id() });
const issueKeySchema = z.object({ rotate: z.boolean().default(false) });
const listQuery = z.object({ includeRetired: z.enum(['true', 'false']).optional() });

/** Loggers, channels and ingest keys of a lab (read: every member; change: technicians and admins). */
export function loggerRoutes(deps: { loggers: LoggersService; testReadings: TestReadingService }): LabRoute[] {
  const { loggers, testReadings } = deps;
  return [
    {
      method: 'get',
      path: '/loggers',
      permission: 'loggers.read',
      summary: 'List the loggers of the lab.',
      query: listQuery,
      handle: async (req, res) => {
        const q = parseInput(listQuery, req.query);
        const list = await loggers.list(labOf(res), { includeRetired: q.includeRetired === 'true' });
        res.json({ loggers: list.map(presentLogger) });
      },
    },
    {
      method: 'post',
      path: '/loggers',
      permission: 'loggers.manage',
      summary: 'Register a logger with its channels; its first ingest key is shown once.',
      body: createLoggerSchema,
      handle: async (req, res) => {
        const input = parseInput(createLoggerSchema, req.body);
        const { logger, issued } = await loggers.register(labOf(res), actorOf(req), input);
        res.status(201).json({ logger: presentLoggerDetail(logger, { includeKeys: true }), ...presentIssuedKey(issued) });
      },
    },
    {
      method: 'get',
      path: '/loggers/:loggerId',
      permission: 'loggers.read',
      summary: 'A logger with its channels (and key metadata for those who manage keys).',
      handle: async (req, res) => {
        const { loggerId } = parseInput(loggerParam, req.params);
        const lab = labOf(res);
        const detail = await loggers.detail(lab, loggerId);
        res.json({ logger: presentLoggerDetail(detail, { includeKeys: can(lab.role, 'ingest-keys.manage') }) });
      },
    },
    {
      method: 'patch',
      path: '/loggers/:loggerId',
      permission: 'loggers.manage',
      summary: "Edit a logger's name, site, serial, time zone or interval.",
      body: loggerPatchSchema,
      handle: async (req, res) => {
        const { loggerId } = parseInput(loggerParam, req.params);
        const patch = parseInput(loggerPatchSchema, req.body);
        res.json({ logger: presentLogger(await loggers.update(labOf(res), actorOf(req), loggerId, patch)) });
      },
    },
    {
      method: 'post',
      path: '/loggers/:loggerId/retire',
      permission: 'loggers.manage',
      summary: 'Retire a logger: its keys stop working, its readings stay.',
      handle: async (req, res) => {
        const { loggerId } = parseInput(loggerParam, req.params);
        await loggers.retire(labOf(res), actorOf(req), loggerId);
        res.status(204).end();
      },
    },
    {
      method: 'post',
      path: '/loggers/:loggerId/test-reading',
      permission: 'loggers.manage',
      summary: 'Store one reading of a channel now, through the ingestion path, and read it back.',
      body: testReadingSchema,
      handle: async (req, res) => {
        const { loggerId } = parseInput(loggerParam, req.params);
        const input = parseInput(testReadingSchema, req.body);
        res.json(await testReadings.send(labOf(res), actorOf(req), loggerId, input));
      },
    },
    {
      method: 'post',
      path: '/loggers/:loggerId/channels',
      permission: 'loggers.manage',
      summary: 'Add a channel to a logger.',
      body: channelInputSchema,
      handle: async (req, res) => {
        const { loggerId } = parseInput(loggerParam, req.params);
        const input = parseInput(channelInputSchema, req.body);
        res.status(201).json({ channel: presentChannel(await loggers.addChannel(labOf(res), actorOf(req), loggerId, input)) });
      },
    },
    {
      method: 'patch',
      path: '/loggers/:loggerId/channels/:channelId',
      permission: 'loggers.manage',
      summary: 'Edit a channel.',
      body: channelPatchSchema,
      handle: async (req, res) => {
        const { loggerId, channelId } = parseInput(channelParam, req.params);
        const patch = parseInput(channelPatchSchema, req.body);
        res.json({ channel: presentChannel(await loggers.updateChannel(labOf(res), actorOf(req), loggerId, channelId, patch)) });
      },
    },
    {
      method: 'post',
      path: '/loggers/:loggerId/channels/:channelId/retire',
      permission: 'loggers.manage',
      summary: 'Retire a channel (its readings stay).',
      handle: async (req, res) => {
        const { loggerId, channelId } = parseInput(channelParam, req.params);
        await loggers.retireChannel(labOf(res), actorOf(req), loggerId, channelId);
        res.status(204).end();
      },
    },
    {
      method: 'post',
      path: '/loggers/:loggerId/keys',
      permission: 'ingest-keys.manage',
      summary: 'Issue an ingest key (shown once); with rotate, every other key stops working.',
      body: issueKeySchema,
      handle: async (req, res) => {
        const { loggerId } = parseInput(loggerParam, req.params);
        const { rotate } = parseInput(issueKeySchema, req.body ?? {});
        res.status(201).json(presentIssuedKey(await loggers.issueKey(labOf(res), actorOf(req), loggerId, { rotate })));
      },
    },
    {
      method: 'delete',
      path: '/loggers/:loggerId/keys/:keyId',
      permission: 'ingest-keys.manage',
      summary: 'Revoke an ingest key.',
      handle: async (req, res) => {
        const { loggerId, keyId } = parseInput(keyParam, req.params);
        await loggers.revokeKey(labOf(res), actorOf(req), loggerId, keyId);
        res.status(204).end();
      },
    },
  ];
}
