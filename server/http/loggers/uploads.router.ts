import { z } from 'zod';
import { labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { uploadOptionsSchema } from './loggers.schema.ts';
import { AppError } from '../../errors.ts';
import type { UploadsService } from '../../services/uploads.service.ts';
import type { LabRoute } from '../lab-routes.ts';
import type { Logger } from '../../logger.ts';

const loggerParam = z.object({ loggerId: z.coerce.number().int('must be a whole number').positive('must be a positive number') });
const optionsParam = z.object({ options: z.string().min(2, 'must be the upload options as JSON') });

/** Largest upload accepted (bytes); the file is streamed, so this bounds time, not memory. */
export const MAX_UPLOAD_BYTES = 2 * 1024 ** 3;

/**
 * `POST /api/v1/labs/:lab/loggers/:loggerId/uploads?options=<json>` — a historical export
 * file as the raw request body (text/csv). The answer streams NDJSON: `progress` lines after
 * each stored batch, then one `summary` (or `error`) line.
 */
export function uploadRoutes(deps: { uploads: UploadsService; logger: Logger }): LabRoute[] {
  return [
    {
      method: 'post',
      path: '/loggers/:loggerId/uploads',
      permission: 'uploads.create',
      summary: "Upload a logger's historical export file (text/csv); progress and a summary stream back as NDJSON.",
      query: optionsParam,
      body: z.string(),
      bodyMediaType: 'text/csv',
      handle: async (req, res) => {
        const { loggerId } = parseInput(loggerParam, req.params);
        const { options } = parseInput(optionsParam, req.query);
        let json: unknown;
        try {
          json = JSON.parse(options);
        } catch {
          throw new AppError(400, 'invalid_input', 'options: not valid JSON');
        }
        const layout = parseInput(uploadOptionsSchema, json);
        const target = await deps.uploads.targetFor(labOf(res), loggerId);
        if (!req.is(['text/csv', 'text/plain', 'application/octet-stream'])) {
          throw new AppError(415, 'unsupported_media_type', 'Upload the export file as text/csv.');
        }
        const declared = Number(req.get('content-length') ?? 0);
        if (declared > MAX_UPLOAD_BYTES) throw new AppError(413, 'payload_too_large', 'The file is larger than 2 GB; split it and upload the parts.');

        res.status(200).set('Content-Type', 'application/x-ndjson; charset=utf-8').set('Cache-Control', 'no-store');
        res.flushHeaders();
        const line = (o: object) => res.write(`${JSON.stringify(o)}\n`);
        try {
          const summary = await deps.uploads.run(target, req, layout, (p) => line({ type: 'progress', ...p }));
          line({ type: 'summary', ...summary });
        } catch (err) {
          const e = err as AppError;
          if (!(err instanceof AppError)) deps.logger.warn('upload failed', { loggerId, reason: (err as Error).message });
          line({ type: 'error', code: e.code ?? 'upload_failed', message: err instanceof AppError ? e.message : 'The upload stopped: what was stored before this point is kept; send the file again to finish (stored rows count as duplicates).' });
          req.unpipe();
          req.resume();
        }
        res.end();
      },
    },
  ];
}
